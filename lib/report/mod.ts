/**
 * The static HTML report.
 *
 * @module
 */
export * from "./escape.ts";
export * from "./report_data.ts";
export * from "./render_report.ts";

/**
 * The static HTML report, rendered from results alone.
 *
 * @module
 */
export * from "./escape.ts";
export * from "./report_data.ts";
export * from "./report_input.ts";
export * from "./render_report.ts";
export * from "./marks.ts";

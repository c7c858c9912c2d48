/**
 * Dopant levels and target colour.
 *
 * @module
 */
export * from "./target.ts";

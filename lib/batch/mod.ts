/**
 * Batch runs over folders of exports, with a worker pool, a result cache and atomic outputs.
 *
 * @module
 */
export * from "./atomic_write.ts";
export * from "./hash.ts";
export * from "./manifest.ts";
export * from "./plan_inputs.ts";
export * from "./settings_schema.ts";
export * from "./read_settings.ts";
export * from "./sample_settings_from_sheet.ts";
export * from "./run_batch.ts";
export * from "./report_from_results.ts";
export * from "./read_limited.ts";
export * from "./output_lock.ts";
export * from "./output_error.ts";
export * from "./batch_limits.ts";
export * from "./settings_shape.ts";
export * from "./watch_folder.ts";
export * from "./escape_controls.ts";

/**
 * crystint's version.
 *
 * @module
 */
import config from "../deno.json" with { type: "json" };

/** crystint's version, from deno.json; part of every cache key and results file. */
export const VERSION: string = config.version;

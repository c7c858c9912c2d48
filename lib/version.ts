/** crystint's version, from deno.json; part of every cache key and results file. */
import config from "../deno.json" with { type: "json" };

export const VERSION: string = config.version;

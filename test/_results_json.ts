/**
 * results.json as the tests read it: parsed and unpacked (`unpackResults`), loosely typed.
 *
 * @module
 */
import { unpackResults } from "../lib/analysis/results_packing.ts";

/** The results document at `path`, its samples unpacked. */
// deno-lint-ignore no-explicit-any
export async function readResultsJson(path: string): Promise<any> {
  return unpackResults(JSON.parse(await Deno.readTextFile(path)));
}

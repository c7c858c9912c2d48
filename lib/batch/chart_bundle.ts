/**
 * Source of chart.js's UMD bundle from the installed npm package, for inlining in reports.
 *
 * @module
 */

/** Reads `chart.js/dist/chart.umd.min.js` from the installed package. */
export async function readChartBundle(): Promise<string> {
  const url = new URL("./chart.umd.min.js", import.meta.resolve("chart.js"));
  return await Deno.readTextFile(url);
}

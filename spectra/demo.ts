/**
 * `deno task demo`: the colour table of the invented demo lot in spectra/demo/ (see
 * spectra/generate_demo.ts for the scenario).
 *
 * @module
 */
import { main } from "../cli/main.ts";

const dir = new URL("./demo/", import.meta.url);
const files: string[] = [];
for await (const entry of Deno.readDir(dir)) {
  if (entry.isFile && entry.name !== "manifest.csv") {
    files.push(decodeURIComponent(new URL(entry.name, dir).pathname));
  }
}
files.sort();
const code = await main(["color", ...files, "--illuminant", "D65,A", "--observer", "2"]);
// The lot includes two deliberately damaged files, so exit code 2 is the expected outcome.
Deno.exit(code === 2 ? 0 : code);

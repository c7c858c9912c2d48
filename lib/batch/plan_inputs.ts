/**
 * Expands batch inputs — files, folders (recursively) and glob patterns — into a sorted list
 * of files, skipping hidden entries and the batch's own outputs.
 *
 * @module
 */
import picomatch from "picomatch";

/** Files a batch never treats as spectra. */
const NOT_SPECTRA =
  /^(manifest|samples|settings|results)\.(csv|json|ya?ml)$|\.(md|html|json|ya?ml|png|pdf)$/i;

async function walk(dir: string, out: string[], skip: Set<string>): Promise<void> {
  const entries: Deno.DirEntry[] = [];
  for await (const e of Deno.readDir(dir)) entries.push(e);
  entries.sort((a, b) => (a.name < b.name ? -1 : 1));
  for (const e of entries) {
    if (e.name.startsWith(".")) continue;
    const path = `${dir.replace(/\/$/, "")}/${e.name}`;
    if (skip.has(path)) continue;
    if (e.isDirectory) await walk(path, out, skip);
    else if (e.isFile && !NOT_SPECTRA.test(e.name)) out.push(path);
  }
}

/** Result of expanding the inputs. */
export interface InputPlan {
  files: string[];
  /** Inputs that matched nothing or do not exist. */
  missing: string[];
}

/**
 * Lists the spectrum files named by batch inputs.
 *
 * @param inputs Files, folders or glob patterns (`*`, `**`, `?`, `[…]`, `{a,b}`).
 * @param skip Paths to leave out (e.g. the output folder, the manifest).
 */
export async function planInputs(inputs: string[], skip: string[] = []): Promise<InputPlan> {
  const skipSet = new Set(skip.map((p) => p.replace(/\/$/, "")));
  const files: string[] = [];
  const missing: string[] = [];
  for (const input of inputs) {
    if (picomatch.scan(input).isGlob) {
      const { base, glob } = picomatch.scan(input);
      const match = picomatch(glob, { dot: false });
      const found: string[] = [];
      try {
        await walk(base || ".", found, skipSet);
      } catch {
        // an unreadable base is reported as missing below
      }
      const hits = found.filter((f) => match(f.slice((base || ".").replace(/\/$/, "").length + 1)));
      if (hits.length === 0) missing.push(input);
      files.push(...hits);
      continue;
    }
    try {
      const info = await Deno.stat(input);
      if (info.isDirectory) await walk(input, files, skipSet);
      else files.push(input);
    } catch {
      missing.push(input);
    }
  }
  return { files: [...new Set(files)], missing };
}

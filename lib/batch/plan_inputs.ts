/**
 * Expands batch inputs — files, folders (recursively) and glob patterns — into a sorted list
 * of files, skipping hidden entries and the batch's own outputs (compared by real path, so
 * `--out ./in/report` or an absolute spelling of it is never read as input). Symbolic links
 * are followed once when they point inside the input tree (loops detected); the others are
 * listed as skipped.
 *
 * @module
 */
import picomatch from "picomatch";

/** Files a batch never treats as spectra. */
const NOT_SPECTRA =
  /^(manifest|samples|settings|results)\.(csv|json|ya?ml)$|\.(md|html|json|ya?ml|png|pdf)$/i;

/** Result of expanding the inputs. */
export interface InputPlan {
  files: string[];
  /** Inputs that matched nothing or do not exist. */
  missing: string[];
  /** Each file's path relative to the folder (or glob base) it was found under. */
  relative: Map<string, string>;
  /** Symbolic links not followed, with the reason. */
  skipped: string[];
}

async function realOrUndefined(path: string): Promise<string | undefined> {
  try {
    return await Deno.realPath(path);
  } catch {
    return undefined;
  }
}

interface Walk {
  out: string[];
  relative: Map<string, string>;
  skipped: string[];
  skipReal: Set<string>;
  /** Real paths of the folders walked (loop detection). */
  visited: Set<string>;
  /** Real path of each regular file found. */
  realFiles: Set<string>;
  /** Files reached through a link, with their real path. */
  linked: { path: string; real: string }[];
}

function inside(real: string, root: string): boolean {
  return real === root || real.startsWith(root.endsWith("/") ? root : `${root}/`);
}

async function walk(dir: string, rel: string, rootReal: string, w: Walk): Promise<void> {
  const real = await realOrUndefined(dir);
  if (real === undefined) return;
  if (w.skipReal.has(real)) return;
  if (w.visited.has(real)) return;
  w.visited.add(real);
  const entries: Deno.DirEntry[] = [];
  for await (const e of Deno.readDir(dir)) entries.push(e);
  entries.sort((a, b) => (a.name < b.name ? -1 : 1));
  for (const e of entries) {
    if (e.name.startsWith(".")) continue;
    const path = `${dir.replace(/\/$/, "")}/${e.name}`;
    if (e.name.includes("\uFFFD") && !(await Deno.lstat(path).then(() => true, () => false))) {
      // the system gave a name that is not UTF-8; it cannot be opened under this spelling
      w.skipped.push(`${path}: file name is not valid UTF-8, rename it to include it (skipped)`);
      continue;
    }
    const relPath = rel ? `${rel}/${e.name}` : e.name;
    let isDirectory = e.isDirectory, isFile = e.isFile;
    if (e.isSymlink) {
      const target = await realOrUndefined(path);
      if (target === undefined) {
        w.skipped.push(`${path}: symbolic link to nothing (skipped)`);
        continue;
      }
      if (!inside(target, rootReal)) {
        w.skipped.push(`${path}: symbolic link out of the input folder (skipped)`);
        continue;
      }
      const info = await Deno.stat(path).catch(() => undefined);
      if (info?.isDirectory && w.visited.has(target)) {
        w.skipped.push(`${path}: symbolic link loop (skipped)`);
        continue;
      }
      isDirectory = info?.isDirectory ?? false;
      isFile = info?.isFile ?? false;
    }
    if (isDirectory) await walk(path, relPath, rootReal, w);
    else if (isFile && !NOT_SPECTRA.test(e.name)) {
      const fileReal = e.isSymlink ? await realOrUndefined(path) : `${real}/${e.name}`;
      if (fileReal === undefined || w.skipReal.has(fileReal)) continue;
      if (e.isSymlink) w.linked.push({ path, real: fileReal });
      else w.realFiles.add(fileReal);
      w.out.push(path);
      w.relative.set(path, relPath);
    } else if (!isFile && !isDirectory) {
      w.skipped.push(`${path}: not a regular file (skipped)`);
    }
  }
}

/**
 * Lists the spectrum files named by batch inputs.
 *
 * @param inputs Files, folders or glob patterns (`*`, `**`, `?`, `[…]`, `{a,b}`).
 * @param skip Paths to leave out (e.g. the output folder, the manifest).
 */
export async function planInputs(inputs: string[], skip: string[] = []): Promise<InputPlan> {
  const skipReal = new Set<string>();
  for (const p of skip) {
    const r = await realOrUndefined(p);
    if (r !== undefined) skipReal.add(r);
  }
  const files: string[] = [];
  const missing: string[] = [];
  const relative = new Map<string, string>();
  const skipped: string[] = [];
  const realFiles = new Set<string>();
  const linked: { path: string; real: string }[] = [];
  const start = (): Walk => ({
    out: [],
    relative,
    skipped,
    skipReal,
    visited: new Set(),
    realFiles,
    linked,
  });
  for (const input of inputs) {
    if (picomatch.scan(input).isGlob) {
      const { base, glob } = picomatch.scan(input);
      const match = picomatch(glob, { dot: false });
      const w = start();
      const root = base || ".";
      try {
        await walk(root, "", (await realOrUndefined(root)) ?? root, w);
      } catch {
        // an unreadable base is reported as missing below
      }
      const hits = w.out.filter((f) => match(relative.get(f)!));
      if (hits.length === 0) missing.push(input);
      for (const f of hits) files.push(f);
      continue;
    }
    try {
      const info = await Deno.stat(input);
      if (info.isDirectory) {
        const w = start();
        await walk(input, "", (await realOrUndefined(input)) ?? input, w);
        for (const f of w.out) files.push(f);
      } else {
        files.push(input);
        if (!relative.has(input)) relative.set(input, input.split(/[\\/]/).pop()!);
      }
    } catch {
      missing.push(input);
    }
  }
  // a link to a file that is also reached directly (or by another link) is read once
  const drop = new Set<string>();
  const seenLinked = new Set<string>();
  for (const l of linked) {
    if (realFiles.has(l.real) || seenLinked.has(l.real)) {
      drop.add(l.path);
      skipped.push(`${l.path}: symbolic link to a file already in the batch (skipped)`);
    }
    seenLinked.add(l.real);
  }
  return { files: [...new Set(files)].filter((f) => !drop.has(f)), missing, relative, skipped };
}

/**
 * Atomic file output: write a temporary file beside the target, then rename it over the
 * target, so a reader (or a crash) never sees a half-written file.
 *
 * @module
 */

/** Prefix of temporary files; stale ones are removed by {@linkcode removeStaleTemporaries}. */
export const TEMP_PREFIX = ".crystint-tmp-";

function tempPathFor(path: string): string {
  const slash = Math.max(path.lastIndexOf("/"), path.lastIndexOf("\\"));
  const dir = slash >= 0 ? path.slice(0, slash + 1) : "";
  const name = path.slice(slash + 1);
  return `${dir}${TEMP_PREFIX}${name}-${crypto.randomUUID()}`;
}

/** Writes text to `path` atomically. */
export async function writeTextAtomic(path: string, text: string): Promise<void> {
  const tmp = tempPathFor(path);
  try {
    await Deno.writeTextFile(tmp, text);
    await Deno.rename(tmp, path);
  } catch (e) {
    await Deno.remove(tmp).catch(() => {});
    throw e;
  }
}

/** Writes a stream of text chunks to `path` atomically (for outputs too large to build in memory). */
export async function writeChunksAtomic(
  path: string,
  chunks: AsyncIterable<string> | Iterable<string>,
): Promise<void> {
  const tmp = tempPathFor(path);
  const file = await Deno.open(tmp, { write: true, create: true, truncate: true });
  const encoder = new TextEncoder();
  try {
    for await (const chunk of chunks) {
      const bytes = encoder.encode(chunk);
      let written = 0;
      while (written < bytes.length) written += await file.write(bytes.subarray(written));
    }
    file.close();
    await Deno.rename(tmp, path);
  } catch (e) {
    try {
      file.close();
    } catch { /* already closed */ }
    await Deno.remove(tmp).catch(() => {});
    throw e;
  }
}

/** Removes temporary files left in a folder by an interrupted run. */
export async function removeStaleTemporaries(dir: string): Promise<number> {
  let removed = 0;
  try {
    for await (const entry of Deno.readDir(dir)) {
      if (entry.isFile && entry.name.startsWith(TEMP_PREFIX)) {
        await Deno.remove(`${dir}/${entry.name}`).catch(() => {});
        removed++;
      }
    }
  } catch (e) {
    if (!(e instanceof Deno.errors.NotFound)) throw e;
  }
  return removed;
}

/**
 * Atomic file output: write a temporary file beside the target, then rename it over the
 * target, so a reader (or a crash) never sees a half-written file. Temporary names carry the
 * writer's pid, so a cleanup only removes what a dead run left.
 *
 * @module
 */
import { processAlive } from "./process_alive.ts";

/** Prefix of temporary files; stale ones are removed by {@linkcode removeStaleTemporaries}. */
export const TEMP_PREFIX = ".crystint-tmp-";

/** A temporary path beside `path`, owned by this process. */
export function tempPathFor(path: string): string {
  const slash = Math.max(path.lastIndexOf("/"), path.lastIndexOf("\\"));
  const dir = slash >= 0 ? path.slice(0, slash + 1) : "";
  const name = path.slice(slash + 1);
  return `${dir}${TEMP_PREFIX}${Deno.pid}-${name}-${crypto.randomUUID()}`;
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

/**
 * Writes a stream of text chunks to a new temporary file beside `path` and returns its name;
 * on failure the temporary is removed and the error rethrown.
 */
/** A temporary file beside `path`, written in pieces; `finish` returns its name. */
export interface TempWriter {
  /** Appends text. */
  write(text: string): Promise<void>;
  /** Flushes and closes; returns the temporary file's path. */
  finish(): Promise<string>;
  /** Closes and removes the temporary file (after a failure). */
  abandon(): Promise<void>;
}

/** Opens a temporary file beside `path` for writing in pieces. */
export async function openTemp(path: string): Promise<TempWriter> {
  const tmp = tempPathFor(path);
  const file = await Deno.open(tmp, { write: true, createNew: true });
  const encoder = new TextEncoder();
  let open = true;
  const close = () => {
    if (open) file.close();
    open = false;
  };
  return {
    async write(text) {
      const bytes = encoder.encode(text);
      let written = 0;
      while (written < bytes.length) written += await file.write(bytes.subarray(written));
    },
    async finish() {
      await file.syncData().catch(() => {});
      close();
      return tmp;
    },
    async abandon() {
      try {
        close();
      } catch { /* already closed */ }
      await Deno.remove(tmp).catch(() => {});
    },
  };
}

export async function writeChunksToTemp(
  path: string,
  chunks: AsyncIterable<string> | Iterable<string>,
): Promise<string> {
  const tmp = tempPathFor(path);
  let file: Deno.FsFile | undefined;
  const encoder = new TextEncoder();
  try {
    file = await Deno.open(tmp, { write: true, createNew: true });
    for await (const chunk of chunks) {
      const bytes = encoder.encode(chunk);
      let written = 0;
      while (written < bytes.length) written += await file.write(bytes.subarray(written));
    }
    await file.syncData().catch(() => {});
    file.close();
    file = undefined;
    return tmp;
  } catch (e) {
    try {
      file?.close();
    } catch { /* already closed */ }
    await Deno.remove(tmp).catch(() => {});
    throw e;
  }
}

/** Writes a stream of text chunks to `path` atomically (for outputs too large to build in memory). */
export async function writeChunksAtomic(
  path: string,
  chunks: AsyncIterable<string> | Iterable<string>,
): Promise<void> {
  const tmp = await writeChunksToTemp(path, chunks);
  try {
    await Deno.rename(tmp, path);
  } catch (e) {
    await Deno.remove(tmp).catch(() => {});
    throw e;
  }
}

/** The pid in a temporary file's name, or undefined for a name without one (older runs). */
export function tempOwner(name: string): number | undefined {
  const m = /^(\d+)-/.exec(name.slice(TEMP_PREFIX.length));
  return m ? Number(m[1]) : undefined;
}

/**
 * Removes temporary files left in a folder by runs that are no longer alive; temporaries of a
 * live process (this one, or another where /proc shows it) are left alone. Call it only while
 * holding the folder's lock (output_lock.ts).
 */
export async function removeStaleTemporaries(dir: string): Promise<number> {
  let removed = 0;
  try {
    for await (const entry of Deno.readDir(dir)) {
      if (!entry.isFile || !entry.name.startsWith(TEMP_PREFIX)) continue;
      const owner = tempOwner(entry.name);
      if (owner !== undefined && processAlive(owner)) continue;
      await Deno.remove(`${dir}/${entry.name}`).catch(() => {});
      removed++;
    }
  } catch (e) {
    if (!(e instanceof Deno.errors.NotFound)) throw e;
  }
  return removed;
}

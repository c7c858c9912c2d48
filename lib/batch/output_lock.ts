/**
 * One writer per output folder: OUT/.crystint-lock holds the owner's pid. A lock left by a
 * process that no longer runs is taken over; a live owner makes the second run stop with a
 * clear message. The owning process may take the lock again (a watch runs batch after batch).
 *
 * @module
 */
import { processAlive } from "./process_alive.ts";

/** Name of the lock file in an output folder. */
export const LOCK_NAME = ".crystint-lock";

/** The output folder is being written by another live crystint process. */
export class OutputLockedError extends Error {
  readonly path: string;
  readonly pid: number;
  constructor(path: string, pid: number) {
    super(`${path}: output folder in use by crystint process ${pid} (lock file ${LOCK_NAME})`);
    this.name = "OutputLockedError";
    this.path = path;
    this.pid = pid;
  }
}

/** A held lock; `release` removes the lock file when this call created it. */
export interface OutputLock {
  release(): Promise<void>;
}

function ownerOf(text: string): number {
  const m = /"pid"\s*:\s*(\d+)/.exec(text);
  return m ? Number(m[1]) : NaN;
}

/**
 * Takes the lock of an output folder (which must exist).
 *
 * @throws {OutputLockedError} When a live process other than this one holds it.
 */
export async function lockOutput(outDir: string): Promise<OutputLock> {
  const path = `${outDir}/${LOCK_NAME}`;
  const body = JSON.stringify({ pid: Deno.pid, started: new Date().toISOString() }) + "\n";
  for (let attempt = 0; attempt < 5; attempt++) {
    try {
      const f = await Deno.open(path, { write: true, createNew: true });
      try {
        await f.write(new TextEncoder().encode(body));
      } finally {
        f.close();
      }
      return {
        async release() {
          const text = await Deno.readTextFile(path).catch(() => "");
          if (ownerOf(text) === Deno.pid) await Deno.remove(path).catch(() => {});
        },
      };
    } catch (e) {
      if (!(e instanceof Deno.errors.AlreadyExists)) throw e;
    }
    const text = await Deno.readTextFile(path).catch(() => undefined);
    if (text === undefined) continue; // removed meanwhile: try again
    const pid = ownerOf(text);
    if (pid === Deno.pid) return { async release() {} };
    if (Number.isFinite(pid) && processAlive(pid)) throw new OutputLockedError(outDir, pid);
    if (!Number.isFinite(pid)) {
      // a lock being written this instant has no pid yet; an old one without a pid is stale
      const info = await Deno.stat(path).catch(() => undefined);
      if (info?.mtime && Date.now() - info.mtime.getTime() < 2000) {
        await new Promise((r) => setTimeout(r, 100));
        continue;
      }
    }
    // stale: take it over by replacing it, then check that our claim is the one that stuck
    const claim = `${path}.${Deno.pid}`;
    await Deno.writeTextFile(claim, body);
    const again = await Deno.readTextFile(path).catch(() => undefined);
    if (again !== undefined && again !== text) {
      await Deno.remove(claim).catch(() => {});
      continue;
    }
    await Deno.rename(claim, path);
    await new Promise((r) => setTimeout(r, 20));
    const now = await Deno.readTextFile(path).catch(() => "");
    if (ownerOf(now) === Deno.pid) {
      return {
        async release() {
          const text = await Deno.readTextFile(path).catch(() => "");
          if (ownerOf(text) === Deno.pid) await Deno.remove(path).catch(() => {});
        },
      };
    }
  }
  const text = await Deno.readTextFile(path).catch(() => "");
  throw new OutputLockedError(outDir, ownerOf(text));
}

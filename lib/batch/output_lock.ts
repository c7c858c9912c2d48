/**
 * One writer per output folder: OUT/.crystint-lock is held with an exclusive advisory file
 * lock (flock) for the whole run and records the owner's pid. The system drops the lock when
 * its process dies, so a lock left by a killed run is simply taken over; a live owner makes a
 * second run stop with a clear message. The owning process may take the lock again (a watch
 * runs batch after batch). The file itself stays (emptied): removing it would let two runs
 * lock two different files.
 *
 * @module
 */

/** Name of the lock file in an output folder. */
export const LOCK_NAME = ".crystint-lock";

/** The output folder is being written by another live crystint process. */
export class OutputLockedError extends Error {
  readonly path: string;
  readonly pid: number;
  constructor(path: string, pid: number) {
    super(
      `${path}: output folder in use by crystint process ${
        Number.isFinite(pid) ? pid : "(unknown)"
      } (lock file ${LOCK_NAME})`,
    );
    this.name = "OutputLockedError";
    this.path = path;
    this.pid = pid;
  }
}

/** A held lock; `release` frees it. */
export interface OutputLock {
  release(): Promise<void>;
}

/** Folders whose lock this process holds, with the number of holders. */
const held = new Map<string, number>();

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
  const key = await Deno.realPath(outDir).catch(() => outDir);
  const count = held.get(key);
  if (count !== undefined) {
    held.set(key, count + 1);
    return { release: () => Promise.resolve(drop(key)) };
  }
  const path = `${outDir}/${LOCK_NAME}`;
  const file = await Deno.open(path, { read: true, write: true, create: true });
  let locked = false;
  try {
    locked = await file.tryLock(true);
  } catch (e) {
    file.close();
    throw e;
  }
  if (!locked) {
    file.close();
    const text = await Deno.readTextFile(path).catch(() => "");
    throw new OutputLockedError(outDir, ownerOf(text));
  }
  const body = JSON.stringify({ pid: Deno.pid, started: new Date().toISOString() }) + "\n";
  await file.truncate(0);
  await file.write(new TextEncoder().encode(body));
  held.set(key, 1);
  let released = false;
  return {
    async release() {
      if (released) return;
      released = true;
      held.delete(key);
      await file.truncate(0).catch(() => {});
      await file.unlock().catch(() => {});
      file.close();
    },
  };
}

function drop(key: string) {
  const n = held.get(key);
  if (n !== undefined && n > 1) held.set(key, n - 1);
}

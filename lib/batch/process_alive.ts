/**
 * Whether a process id belongs to a running process, from the Linux /proc file system when
 * the run may read it. Without that, every other pid counts as gone: callers ask only while
 * holding the output folder's lock, when no other live run can be writing there.
 *
 * @module
 */

/** True when `pid` is this process or (where /proc is readable) a running one. */
export function processAlive(pid: number): boolean {
  if (pid === Deno.pid) return true;
  if (!Number.isInteger(pid) || pid <= 0) return false;
  try {
    const stat = Deno.readTextFileSync(`/proc/${pid}/stat`);
    // field 3, after the parenthesised command name, is the state; Z = zombie, X = dead
    const state = stat.slice(stat.lastIndexOf(")") + 2, stat.lastIndexOf(")") + 3);
    return state !== "Z" && state !== "X";
  } catch {
    return false;
  }
}

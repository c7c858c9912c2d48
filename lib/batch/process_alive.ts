/**
 * Whether a process id belongs to a running process, from the Linux /proc file system; on
 * systems without it a process is assumed alive (so nothing of another run is ever removed).
 *
 * @module
 */

/** True when `pid` is this process or a running one (a zombie counts as dead). */
export function processAlive(pid: number): boolean {
  if (pid === Deno.pid) return true;
  if (!Number.isInteger(pid) || pid <= 0) return false;
  try {
    const stat = Deno.readTextFileSync(`/proc/${pid}/stat`);
    // field 3, after the parenthesised command name, is the state; Z = zombie, X = dead
    const state = stat.slice(stat.lastIndexOf(")") + 2, stat.lastIndexOf(")") + 3);
    return state !== "Z" && state !== "X";
  } catch (e) {
    if (e instanceof Deno.errors.NotFound) return !procAvailable();
    return true;
  }
}

let hasProc: boolean | undefined;
function procAvailable(): boolean {
  if (hasProc === undefined) {
    try {
      Deno.statSync(`/proc/${Deno.pid}`);
      hasProc = true;
    } catch {
      hasProc = false;
    }
  }
  return hasProc;
}

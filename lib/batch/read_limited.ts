/**
 * Bounded reads for everything a batch opens (inputs, sample sheet, settings, calibrations,
 * target spectra): regular files only — FIFOs, devices and folders are refused before they
 * are opened — and never more than a size cap, checked again while reading in case the file
 * grows.
 *
 * @module
 */

/** Default cap on any file a batch reads, bytes (64 MiB, as `crystint color` applies). */
export const DEFAULT_MAX_FILE_BYTES = 64 * 1024 * 1024;

/** Why a bounded read was refused or failed. */
export type ReadRefusal = "not-regular" | "too-large" | "unreadable";

/** A file that could not be read within the limits; the message names the file. */
export class LimitedReadError extends Error {
  readonly file: string;
  readonly reason: ReadRefusal;
  constructor(file: string, reason: ReadRefusal, detail: string) {
    super(`${file}: ${detail}`);
    this.name = "LimitedReadError";
    this.file = file;
    this.reason = reason;
  }
}

function kind(info: Deno.FileInfo): string {
  if (info.isDirectory) return "a folder";
  if (info.isFifo) return "a FIFO";
  if (info.isCharDevice) return "a character device";
  if (info.isBlockDevice) return "a block device";
  if (info.isSocket) return "a socket";
  return "not a regular file";
}

/** The cause of a failed file-system call, without any of the file's contents. */
export function causeOf(e: unknown): string {
  if (e instanceof Deno.errors.NotFound) return "no such file or folder";
  if (e instanceof Deno.errors.PermissionDenied) return "permission denied";
  if (e instanceof Deno.errors.NotCapable) return "not allowed by the run's permissions";
  const message = (e as Error)?.message ?? String(e);
  return message.replace(/,\s*(open|stat|read|write|rename|mkdir|remove)\s+'.*$/s, "");
}

/**
 * Reads a regular file of at most `maxBytes` bytes.
 *
 * @throws {LimitedReadError} For a FIFO, device or folder, a file over the cap, or a failed read.
 */
export async function readFileLimited(
  path: string,
  maxBytes: number = DEFAULT_MAX_FILE_BYTES,
): Promise<Uint8Array<ArrayBuffer>> {
  let info: Deno.FileInfo;
  try {
    info = await Deno.stat(path);
  } catch (e) {
    throw new LimitedReadError(path, "unreadable", `cannot read: ${causeOf(e)}`);
  }
  if (!info.isFile) {
    throw new LimitedReadError(path, "not-regular", `refused: ${kind(info)}, not a regular file`);
  }
  if (info.size > maxBytes) {
    throw new LimitedReadError(
      path,
      "too-large",
      `refused: ${info.size} bytes, more than the limit of ${maxBytes}`,
    );
  }
  let file: Deno.FsFile;
  try {
    file = await Deno.open(path, { read: true });
  } catch (e) {
    throw new LimitedReadError(path, "unreadable", `cannot read: ${causeOf(e)}`);
  }
  try {
    // one byte beyond the cap tells a file that grew after the stat
    const buffer = new Uint8Array(Math.min(maxBytes, info.size) + 1);
    let length = 0;
    while (true) {
      if (length === buffer.length) {
        throw new LimitedReadError(
          path,
          "too-large",
          `refused: grew while being read (over ${buffer.length - 1} bytes)`,
        );
      }
      const n = await file.read(buffer.subarray(length));
      if (n === null) break;
      length += n;
    }
    return buffer.slice(0, length);
  } catch (e) {
    if (e instanceof LimitedReadError) throw e;
    throw new LimitedReadError(path, "unreadable", `cannot read: ${causeOf(e)}`);
  } finally {
    file.close();
  }
}

/** Reads a regular UTF-8 text file of at most `maxBytes` bytes (see {@linkcode readFileLimited}). */
export async function readTextLimited(
  path: string,
  maxBytes: number = DEFAULT_MAX_FILE_BYTES,
): Promise<string> {
  const bytes = await readFileLimited(path, maxBytes);
  try {
    return new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    throw new LimitedReadError(path, "unreadable", "cannot read: not UTF-8 text");
  }
}

/**
 * File-system entry point of the reader (the only place in lib/io that touches Deno): regular
 * files only, read no further than the size cap.
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import { InputError } from "./input_error.ts";
import { DEFAULT_READ_LIMITS, type ReadLimits, resolveReadLimits } from "./read_limits.ts";
import { type ReadOptions, readSpectraFromBytes } from "./read_spectra.ts";
import type { ByteSource } from "./byte_source.ts";

/** Largest file accepted by default, in bytes (see {@linkcode DEFAULT_READ_LIMITS}). */
export const MAX_FILE_BYTES = DEFAULT_READ_LIMITS.maxBytes;

/**
 * The bytes of one input file (export, sheet, settings, calibration), refusing anything that is
 * not a regular file (a FIFO, a device, a folder) and anything larger than `maxBytes`, without
 * reading past the cap even when the file grows while it is read.
 *
 * @throws {InputError} `not-a-file`, `too-large`, or `unreadable` with the system's reason.
 */
export async function readInputBytes(
  path: string,
  limits: Partial<ReadLimits> = {},
): Promise<Uint8Array> {
  const { maxBytes } = resolveReadLimits(limits);
  let info: Deno.FileInfo;
  try {
    info = await Deno.stat(path);
  } catch (e) {
    throw new InputError("unreadable", path, undefined, `Cannot read file: ${reason(e)}`);
  }
  if (!info.isFile) {
    throw new InputError(
      "not-a-file",
      path,
      undefined,
      `Cannot read file: not a regular file (${
        info.isDirectory ? "a folder" : "a device or pipe"
      })`,
    );
  }
  if (info.size > maxBytes) throw tooLarge(path, maxBytes);
  let file: Deno.FsFile;
  try {
    file = await Deno.open(path, { read: true });
  } catch (e) {
    throw new InputError("unreadable", path, undefined, `Cannot read file: ${reason(e)}`);
  }
  try {
    const opened = await file.stat();
    if (!opened.isFile) {
      throw new InputError("not-a-file", path, undefined, "Cannot read file: not a regular file");
    }
    const size = Math.min(opened.size, maxBytes);
    let buffer = new Uint8Array(size + 1);
    let length = 0;
    for (;;) {
      if (length === buffer.length) {
        if (length > maxBytes) throw tooLarge(path, maxBytes);
        const grown = new Uint8Array(Math.min(buffer.length * 2, maxBytes + 1));
        grown.set(buffer);
        buffer = grown;
      }
      const n = await file.read(buffer.subarray(length));
      if (n === null) break;
      length += n;
      if (length > maxBytes) throw tooLarge(path, maxBytes);
    }
    return buffer.subarray(0, length);
  } catch (e) {
    if (e instanceof InputError) throw e;
    throw new InputError("unreadable", path, undefined, `Cannot read file: ${reason(e)}`);
  } finally {
    file.close();
  }
}

/** A {@linkcode ByteSource} on an open file, to be closed when done. */
export interface FileSource extends ByteSource {
  /** Closes the file. */
  close(): void;
}

/**
 * Opens a regular file to be read in pieces (see `indexSourceLines`), with the checks of
 * {@linkcode readInputBytes}; bytes past the size it had when opened are never read.
 *
 * @throws {InputError} `not-a-file`, `too-large`, or `unreadable` with the system's reason.
 */
export async function openInputSource(
  path: string,
  limits: Partial<ReadLimits> = {},
): Promise<FileSource> {
  const { maxBytes } = resolveReadLimits(limits);
  let file: Deno.FsFile;
  try {
    file = await Deno.open(path, { read: true });
  } catch (e) {
    throw new InputError("unreadable", path, undefined, `Cannot read file: ${reason(e)}`);
  }
  const info = await file.stat().catch((e) => {
    file.close();
    throw new InputError("unreadable", path, undefined, `Cannot read file: ${reason(e)}`);
  });
  if (!info.isFile || info.size > maxBytes) {
    file.close();
    if (info.size > maxBytes) throw tooLarge(path, maxBytes);
    throw new InputError("not-a-file", path, undefined, "Cannot read file: not a regular file");
  }
  const size = info.size;
  return {
    size,
    readAt(position: number, into: Uint8Array): number {
      const room = Math.min(into.length, size - position);
      if (room <= 0) return 0;
      file.seekSync(position, Deno.SeekMode.Start);
      return file.readSync(into.subarray(0, room)) ?? 0;
    },
    close: () => file.close(),
  };
}

function tooLarge(path: string, maxBytes: number): InputError {
  return new InputError(
    "too-large",
    path,
    undefined,
    `Cannot read file: larger than ${maxBytes} bytes`,
  );
}

function reason(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}

/**
 * Reads every spectrum in an export file.
 *
 * @throws {InputError} `unreadable`, `not-a-file` or `too-large` when the file cannot be
 *   taken, else any reading error.
 */
export async function readSpectrumFile(
  path: string,
  options: ReadOptions = {},
): Promise<Spectrum[]> {
  return readSpectraFromBytes(await readInputBytes(path, options.limits), path, options);
}

/**
 * File-system entry point of the reader (the only place in lib/io that touches Deno).
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import { InputError } from "./input_error.ts";
import { type ReadOptions, readSpectraFromBytes } from "./read_spectra.ts";

/** Largest file accepted, in bytes (a text export of a million points is far below it). */
export const MAX_FILE_BYTES = 64 * 1024 * 1024;

/**
 * Reads every spectrum in an export file.
 *
 * @throws {InputError} `unreadable` when the file cannot be opened, else any reading error.
 */
export async function readSpectrumFile(
  path: string,
  options: ReadOptions = {},
): Promise<Spectrum[]> {
  let bytes: Uint8Array;
  try {
    const info = await Deno.stat(path);
    if (!info.isFile) throw new Error("not a regular file");
    if (info.size > MAX_FILE_BYTES) throw new Error(`larger than ${MAX_FILE_BYTES} bytes`);
    bytes = await Deno.readFile(path);
  } catch (e) {
    throw new InputError(
      "unreadable",
      path,
      undefined,
      `Cannot read file: ${(e as Error).message}`,
    );
  }
  return readSpectraFromBytes(bytes, path, options);
}

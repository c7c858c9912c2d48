/**
 * Reads the spectra in one export's bytes: decodes the text and sends it to the JCAMP-DX or
 * the delimited-table reader.
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import { checkAsciiText, decodeText } from "./decode_text.ts";
import { readJcamp } from "./read_jcamp.ts";
import { asciiText, readTextTable, type TableReadOptions } from "./read_table.ts";
import { InputError } from "./input_error.ts";
import { resolveReadLimits } from "./read_limits.ts";
import { type ReadOptions, spectraFromTable } from "./spectra_from_table.ts";

export type { ReadOptions };

/**
 * Reads all spectra in the bytes of one export file (delimited text or JCAMP-DX).
 *
 * @param bytes File content.
 * @param file The file's name, used in errors and as the default sample name.
 * @throws {InputError} For any problem with the content, naming file and line (`too-large`
 *   past a cap of `options.limits`).
 */
export function readSpectraFromBytes(
  bytes: Uint8Array,
  file: string,
  options: ReadOptions = {},
): Spectrum[] {
  const limits = resolveReadLimits(options.limits);
  if (bytes.length > limits.maxBytes) {
    throw new InputError(
      "too-large",
      file,
      undefined,
      `Cannot read file: larger than ${limits.maxBytes} bytes`,
    );
  }
  // An ASCII table is read from its bytes (no decoded copy of the file, no string per line);
  // the general reader, JCAMP-DX and any other text go through the decoded text.
  const body = bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf
    ? bytes.subarray(3)
    : bytes;
  const ascii = options.tableReader === "general" || bytes.length === 0
    ? undefined
    : asciiText(body);
  if (ascii) {
    checkAsciiText(body, ascii.scan, file);
    if (!looksLikeJcamp(HEAD.decode(body.subarray(0, 2000)))) {
      return spectraFromTable(readTextTable(ascii, file, { limits }), file, options);
    }
  }
  return readSpectraFromText(decodeText(bytes, file), file, options);
}

const HEAD = new TextDecoder();

/** Whether the text opens like a JCAMP-DX file (a `##TITLE=` line in its first 2,000 characters). */
export function looksLikeJcamp(head: string): boolean {
  return /^\s*##TITLE\s*=/im.test(head);
}

/**
 * Reads all spectra in the decoded text of one export file (delimited text or JCAMP-DX).
 *
 * @param text File content as text (see `decodeText`).
 * @param file The file's name, used in errors and as the default sample name.
 * @throws {InputError} For any problem with the content, naming file and line.
 */
export function readSpectraFromText(
  text: string,
  file: string,
  options: ReadOptions = {},
): Spectrum[] {
  const limits = resolveReadLimits(options.limits);
  if (looksLikeJcamp(text.slice(0, 2000))) {
    const spectra = readJcamp(text, file, options);
    // decadic α (A = α·d) into the natural α of the model: α = α₁₀ · ln 10
    return options.alphaBase === "10"
      ? spectra.map((s) =>
        s.quantity === "alpha" ? { ...s, values: s.values.map((v) => v * Math.LN10) } : s
      )
      : spectra;
  }
  const tableOptions: TableReadOptions = { limits };
  if (options.tableReader) tableOptions.tableReader = options.tableReader;
  return spectraFromTable(readTextTable(text, file, tableOptions), file, options);
}

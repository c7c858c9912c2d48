/**
 * Reads the spectra in one export's bytes: decodes the text and sends it to the JCAMP-DX or
 * the delimited-table reader.
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import { decodeText } from "./decode_text.ts";
import { readJcamp } from "./read_jcamp.ts";
import { readTextTable, type TableReadOptions } from "./read_table.ts";
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
  return readSpectraFromText(decodeText(bytes, file), file, options);
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
  if (/^\s*##TITLE\s*=/im.test(text.slice(0, 2000))) {
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

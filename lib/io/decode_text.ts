/**
 * Turns file bytes into text: UTF-8 with or without BOM, UTF-16 LE/BE with BOM; anything that
 * looks binary is refused rather than guessed at.
 *
 * @module
 */
import { InputError } from "./input_error.ts";

/**
 * Decodes the bytes of a text export.
 *
 * @throws {InputError} `empty` for no content, `binary` for data that is not text,
 *   `encoding` for invalid UTF-8 without a BOM.
 */
export function decodeText(bytes: Uint8Array, file: string): string {
  if (bytes.length === 0) throw new InputError("empty", file, undefined, "File is empty");
  let text: string;
  if (bytes[0] === 0xff && bytes[1] === 0xfe) {
    text = new TextDecoder("utf-16le").decode(bytes.subarray(2));
  } else if (bytes[0] === 0xfe && bytes[1] === 0xff) {
    text = new TextDecoder("utf-16be").decode(bytes.subarray(2));
  } else {
    const body = bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf
      ? bytes.subarray(3)
      : bytes;
    if (body.includes(0)) {
      throw new InputError(
        "binary",
        file,
        undefined,
        "File is binary (contains NUL bytes), not a text export",
      );
    }
    try {
      text = new TextDecoder("utf-8", { fatal: true }).decode(body);
    } catch {
      text = new TextDecoder("windows-1252").decode(body);
    }
  }
  // control characters other than tab, LF, FF, CR, and replacement characters (one regex
  // scan: a loop over a 30 MB string costs several times more)
  // deno-lint-ignore no-control-regex
  const controlChar = /[\x00-\x08\x0b\x0e-\x1f\ufffd]/g;
  const tolerated = Math.max(4, text.length * 0.01);
  let control = 0;
  while (controlChar.exec(text) !== null && ++control <= tolerated);
  if (control > tolerated) {
    throw new InputError(
      "binary",
      file,
      undefined,
      "File is binary (control characters), not a text export",
    );
  }
  if (!/\S/.test(text)) throw new InputError("empty", file, undefined, "File holds no data");
  return text;
}

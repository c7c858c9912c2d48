/**
 * Turns file bytes into text: UTF-8 with or without BOM, UTF-16 LE/BE with BOM; anything that
 * looks binary is refused rather than guessed at.
 *
 * @module
 */
import { InputError } from "./input_error.ts";
import type { AsciiScan } from "./ascii_scan.ts";

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
    if (body.includes(0)) throw nulError(file);
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
  if (control > tolerated) throw controlError(file);
  if (!/\S/.test(text)) throw noDataError(file);
  return text;
}

/**
 * The checks of {@linkcode decodeText} on bytes that are 7-bit ASCII (so need no decoding): the
 * same refusals, in the same order, as decoding them would give.
 *
 * @param body The bytes after any UTF-8 BOM, every one below 0x80.
 * @param scan What `scanAscii` found in them.
 * @throws {InputError} `empty` or `binary`, as {@linkcode decodeText}.
 */
export function checkAsciiText(body: Uint8Array, scan: AsciiScan, file: string): void {
  if (scan.nul) throw nulError(file);
  if (scan.control > Math.max(4, body.length * 0.01)) throw controlError(file);
  // \S: anything but tab, LF, VT, FF, CR and space (found at once in any real export)
  let visible = false;
  for (let i = 0; i < body.length && !visible; i++) {
    const c = body[i]!;
    visible = c !== 32 && !(c >= 9 && c <= 13);
  }
  if (!visible) throw noDataError(file);
}

function nulError(file: string): InputError {
  return new InputError(
    "binary",
    file,
    undefined,
    "File is binary (contains NUL bytes), not a text export",
  );
}

function controlError(file: string): InputError {
  return new InputError(
    "binary",
    file,
    undefined,
    "File is binary (control characters), not a text export",
  );
}

function noDataError(file: string): InputError {
  return new InputError("empty", file, undefined, "File holds no data");
}

/**
 * One pass over an export's bytes that tells whether it is plain 7-bit ASCII text a table can be
 * read from without decoding, and counts what `decodeText` refuses (NUL, control characters).
 * Four bytes are looked at at once: a word has a byte ≥ 0x80 when w & 0x80808080 ≠ 0, and, all
 * bytes being below 0x80, a byte below 0x20 exactly when (w − 0x20202020) & ~w & 0x80808080 ≠ 0
 * (the "has less than" test, S. E. Anderson, Bit Twiddling Hacks); only such words are looked
 * into byte by byte.
 *
 * @module
 */

/** What {@linkcode scanAscii} found. */
export interface AsciiScan {
  /** Every byte is below 0x80 (when false, the other counts cover only the bytes before it). */
  ascii: boolean;
  /** A NUL byte occurs. */
  nul: boolean;
  /** A CR occurs that does not end a line as CR LF. */
  loneCr: boolean;
  /** Control bytes other than tab, LF, FF and CR. */
  control: number;
}

/**
 * Scans bytes for non-ASCII, NUL, lone CR and control bytes; stops at the first byte ≥ 0x80.
 *
 * @example CR LF line ends are plain; a lone CR is not
 * ```ts
 * import { scanAscii } from "./ascii_scan.ts";
 * const text = (s: string) => new TextEncoder().encode(s);
 * if (scanAscii(text("400,0.5\r\n410,0.6\r\n")).loneCr) throw new Error("CR LF is plain");
 * if (!scanAscii(text("400,0.5\r410,0.6")).loneCr) throw new Error("a lone CR");
 * if (scanAscii(text("µm,T")).ascii) throw new Error("µ is not ASCII");
 * ```
 */
export function scanAscii(bytes: Uint8Array): AsciiScan {
  const scan: AsciiScan = { ascii: true, nul: false, loneCr: false, control: 0 };
  const head = Math.min(bytes.length, (4 - (bytes.byteOffset & 3)) & 3);
  const words = new Int32Array(bytes.buffer, bytes.byteOffset + head, (bytes.length - head) >> 2);
  if (!lookInto(bytes, 0, head, scan)) return scan;
  for (let k = 0; k < words.length; k++) {
    const w = words[k]!;
    if ((w & 0x80808080) !== 0 || (((w - 0x20202020) | 0) & ~w & 0x80808080) !== 0) {
      if (!lookInto(bytes, head + 4 * k, head + 4 * k + 4, scan)) return scan;
    }
  }
  lookInto(bytes, head + 4 * words.length, bytes.length, scan);
  return scan;
}

/** Looks at bytes from … to − 1 one by one; false at a byte ≥ 0x80 (the scan ends there). */
function lookInto(bytes: Uint8Array, from: number, to: number, scan: AsciiScan): boolean {
  for (let j = from; j < to; j++) {
    const c = bytes[j]!;
    if (c >= 0x80) {
      scan.ascii = false;
      return false;
    }
    if (c >= 32 || c === 9 || c === 10 || c === 12) continue;
    if (c === 13) {
      if (bytes[j + 1] !== 10) scan.loneCr = true;
    } else {
      if (c === 0) scan.nul = true;
      scan.control++;
    }
  }
  return true;
}

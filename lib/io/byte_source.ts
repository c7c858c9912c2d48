/**
 * An export read in pieces instead of whole: a random-access source of its bytes, and one pass
 * over it that finds its lines and scans it as `scanAscii` scans a whole file, holding no more
 * than one piece (and the longest line) at a time.
 *
 * @module
 */
import { type AsciiScan, scanAscii } from "./ascii_scan.ts";

/** Random access to the bytes of one file. */
export interface ByteSource {
  /** Size in bytes when opened. */
  readonly size: number;
  /** Reads bytes from `position` into `into`; returns how many (0 at the end). */
  readAt(position: number, into: Uint8Array): number;
}

/** The lines of an ASCII export held as their places in a {@linkcode ByteSource}. */
export interface SourceText {
  readonly source: ByteSource;
  /** Byte offset of each line's first byte. */
  readonly starts: Float64Array;
  /** Byte offset just past each line's last byte (before its CR LF or LF). */
  readonly ends: Float64Array;
  /** Each line's first byte (NaN for an empty line). */
  readonly firsts: Float64Array;
  /** What the scan found (as `scanAscii` on the whole file). */
  readonly scan: AsciiScan;
  /** The first bytes of the file (up to 2,000), to tell JCAMP-DX from a table. */
  readonly head: Uint8Array;
  /** Whether some byte is not a blank (the `\S` of `decodeText`). */
  readonly visible: boolean;
}

/** Bytes read at a time (our choice: large enough for few reads, small beside any table). */
const PIECE = 1 << 20;

/**
 * Finds the lines (ended by LF or CR LF) of a source in one pass, a piece at a time, and scans
 * the bytes for non-ASCII, NUL, lone CR and control bytes; undefined as soon as a byte is not
 * ASCII or more than `maxLines` lines are found (such a file is better read whole).
 *
 * @example Two lines, the second ended by CR LF
 * ```ts
 * import { indexSourceLines } from "./byte_source.ts";
 * const bytes = new TextEncoder().encode("a,b\n1,2\r\n");
 * const source = { size: bytes.length, readAt: (p: number, into: Uint8Array) => {
 *   const part = bytes.subarray(p, p + into.length);
 *   into.set(part);
 *   return part.length;
 * } };
 * const text = indexSourceLines(source, 10)!;
 * if (text.starts.length !== 3 || text.ends[1] !== 7 || text.scan.loneCr) throw new Error();
 * ```
 */
export function indexSourceLines(source: ByteSource, maxLines: number): SourceText | undefined {
  const starts: number[] = [], ends: number[] = [], firsts: number[] = [];
  const scan: AsciiScan = { ascii: true, nul: false, loneCr: false, control: 0 };
  let buffer = new Uint8Array(Math.min(PIECE, source.size + 1));
  let head = new Uint8Array(0);
  let visible = false;
  // bytes buffer[0 … kept − 1] are the unfinished line that starts at file offset `base`
  let base = 0, kept = 0;
  for (;;) {
    if (kept === buffer.length) {
      const grown = new Uint8Array(buffer.length * 2);
      grown.set(buffer);
      buffer = grown;
    }
    const n = source.readAt(base + kept, buffer.subarray(kept));
    const filled = kept + n;
    if (head.length < 2000 && base === 0) head = buffer.slice(0, Math.min(2000, filled));
    // scan whole lines only, so a CR before an LF is never split from it
    const last = n === 0 ? filled : buffer.lastIndexOf(10, filled - 1) + 1;
    if (last > 0 || n === 0) {
      const part = scanAscii(buffer.subarray(0, last));
      if (!part.ascii) return undefined;
      if (part.nul) scan.nul = true;
      if (part.loneCr) scan.loneCr = true;
      scan.control += part.control;
      for (let i = 0; i < last && !visible; i++) {
        const c = buffer[i]!;
        visible = c !== 32 && !(c >= 9 && c <= 13);
      }
      let start = 0;
      while (start < last || (n === 0 && start === last)) {
        const lf = buffer.indexOf(10, start);
        const stop = lf < 0 || lf >= last ? last : lf;
        const end = stop > start && buffer[stop - 1] === 13 ? stop - 1 : stop;
        starts.push(base + start);
        ends.push(base + end);
        firsts.push(start < end ? buffer[start]! : NaN);
        if (starts.length > maxLines) return undefined;
        if (lf < 0 || lf >= last) break;
        start = lf + 1;
      }
    }
    if (n === 0) break;
    buffer.copyWithin(0, last, filled);
    base += last;
    kept = filled - last;
  }
  return {
    source,
    starts: Float64Array.from(starts),
    ends: Float64Array.from(ends),
    firsts: Float64Array.from(firsts),
    scan,
    head,
    visible,
  };
}

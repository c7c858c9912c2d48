/**
 * The fast path of the table reader: one delimited line of plain decimal numbers parsed
 * straight from its bytes (ASCII) into typed columns, without a string per cell. Values equal
 * `Number(cell)` bit for bit: a mantissa of at most 15 digits scaled by an exact power of ten
 * ≤ 10²² is one correctly rounded IEEE operation (Clinger, "How to read floating point numbers
 * accurately", PLDI 1990); anything else is left to the general reader.
 *
 * @module
 */

/** 10⁰ … 10²², every one exactly representable as a double. */
const POW10 = [
  1e0,
  1e1,
  1e2,
  1e3,
  1e4,
  1e5,
  1e6,
  1e7,
  1e8,
  1e9,
  1e10,
  1e11,
  1e12,
  1e13,
  1e14,
  1e15,
  1e16,
  1e17,
  1e18,
  1e19,
  1e20,
  1e21,
  1e22,
];

/** Marks the whitespace-delimited layout (cells separated by runs of spaces or tabs). */
export const WHITESPACE_DELIMITER = -1;

const SPACE = 32, TAB = 9, PLUS = 43, MINUS = 45, DOT = 46, COMMA = 44, ZERO = 48, NINE = 57;

/** Scratch for {@linkcode parseNumericLine}: a text line's UTF-8 bytes (grown as needed). */
let scratch = new Uint8Array(1024);
const encoder = new TextEncoder();

/**
 * Parses one data line of exactly `columns.length` numbers into `columns[k][row]`.
 *
 * @param delimiter The delimiter's char code, or {@linkcode WHITESPACE_DELIMITER}.
 * @param decimalComma Whether `,` is accepted as the decimal mark (never with a comma delimiter).
 * @returns false, writing nothing useful, for any line the general reader must judge: quotes,
 *   other characters, empty or missing cells, more than 15 significant digits, large exponents.
 *
 * @example One semicolon-separated line with decimal commas
 * ```ts
 * import { parseNumericLine } from "./parse_numeric_line.ts";
 * const columns = [new Float64Array(1), new Float64Array(1)];
 * if (!parseNumericLine("360,0;76,821", 59, true, columns, 0)) throw new Error("declined");
 * if (columns[1]![0] !== Number("76.821")) throw new Error(String(columns[1]![0]));
 * ```
 */
export function parseNumericLine(
  line: string,
  delimiter: number,
  decimalComma: boolean,
  columns: Float64Array[],
  row: number,
): boolean {
  // any character outside ASCII becomes bytes ≥ 0x80, which the byte parser declines, as the
  // character itself would be
  if (scratch.length < 3 * line.length) scratch = new Uint8Array(3 * line.length + 1024);
  const { written } = encoder.encodeInto(line, scratch);
  return parseNumericBytes(scratch, 0, written, delimiter, decimalComma, columns, row);
}

/**
 * {@linkcode parseNumericLine} on the bytes `bytes[start … end − 1]` of one line (no line end).
 *
 * @example A tab-separated line inside a larger buffer
 * ```ts
 * import { parseNumericBytes } from "./parse_numeric_line.ts";
 * const bytes = new TextEncoder().encode("head\n400\t0.25\n");
 * const columns = [new Float64Array(1), new Float64Array(1)];
 * if (!parseNumericBytes(bytes, 5, 13, 9, false, columns, 0)) throw new Error("declined");
 * if (columns[1]![0] !== 0.25) throw new Error(String(columns[1]![0]));
 * ```
 */
export function parseNumericBytes(
  bytes: Uint8Array,
  start: number,
  end: number,
  delimiter: number,
  decimalComma: boolean,
  columns: Float64Array[],
  row: number,
): boolean {
  const n = end;
  const width = columns.length;
  const ws = delimiter === WHITESPACE_DELIMITER;
  const tabIsBlank = delimiter !== TAB;
  let i = start;
  let c = 0;
  for (;;) {
    let ch = at(bytes, i, n);
    while (i < n && (ch === SPACE || (ch === TAB && tabIsBlank))) ch = at(bytes, ++i, n);
    if (i >= n || (!ws && ch === delimiter)) {
      // an empty cell: fine only as trailing delimiters after the last value
      if (c === 0) return false;
      while (i < n && ((ch === SPACE || (ch === TAB && tabIsBlank)) || ch === delimiter)) {
        ch = at(bytes, ++i, n);
      }
      return i >= n && c === width;
    }
    if (c === width) return false;
    let negative = false;
    if (ch === PLUS || ch === MINUS) {
      negative = ch === MINUS;
      ch = at(bytes, ++i, n);
    }
    let mantissa = 0, digits = 0, exponent = 0, seen = false;
    while (ch >= ZERO && ch <= NINE) {
      seen = true;
      if (mantissa !== 0 || ch !== ZERO) {
        if (digits === 15) return false;
        mantissa = mantissa * 10 + (ch - ZERO);
        digits++;
      }
      ch = at(bytes, ++i, n);
    }
    if (ch === DOT || (decimalComma && ch === COMMA)) {
      // ",5" opens no data row for the general reader (it is not a numeric-looking first cell)
      if (ch === COMMA && c === 0 && !seen) return false;
      ch = at(bytes, ++i, n);
      while (ch >= ZERO && ch <= NINE) {
        seen = true;
        if (mantissa !== 0 || ch !== ZERO) {
          if (digits === 15) return false;
          mantissa = mantissa * 10 + (ch - ZERO);
          digits++;
        }
        exponent--;
        ch = at(bytes, ++i, n);
      }
    }
    if (!seen) return false;
    if (ch === 101 || ch === 69) {
      ch = at(bytes, ++i, n);
      let sign = 1;
      if (ch === PLUS || ch === MINUS) {
        sign = ch === MINUS ? -1 : 1;
        ch = at(bytes, ++i, n);
      }
      if (!(ch >= ZERO && ch <= NINE)) return false;
      let e = 0;
      while (ch >= ZERO && ch <= NINE) {
        if (e < 1000) e = e * 10 + (ch - ZERO);
        ch = at(bytes, ++i, n);
      }
      exponent += sign * e;
    }
    let value: number;
    if (mantissa === 0) value = 0;
    else if (exponent === 0) value = mantissa;
    else if (exponent > 0 && exponent <= 22) value = mantissa * POW10[exponent]!;
    else if (exponent < 0 && exponent >= -22) value = mantissa / POW10[-exponent]!;
    else return false;
    columns[c]![row] = negative ? -value : value;
    c++;
    const cellEnd = i;
    while (i < n && (ch === SPACE || (ch === TAB && tabIsBlank))) ch = at(bytes, ++i, n);
    if (i >= n) return c === width;
    if (ws) {
      if (i === cellEnd) return false; // "1.5-2" is one cell to the general reader
      continue;
    }
    if (ch !== delimiter) return false;
    i++;
  }
}

/** The byte at i, or −2 past the end: a code no test matches, as NaN from `charCodeAt` would. */
function at(bytes: Uint8Array, i: number, end: number): number {
  return i < end ? bytes[i]! : -2;
}

/**
 * The fast path of the table reader: one delimited line of plain decimal numbers parsed
 * straight from its characters into typed columns, without a string per cell. Values equal
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
  const n = line.length;
  const width = columns.length;
  const ws = delimiter === WHITESPACE_DELIMITER;
  const tabIsBlank = delimiter !== TAB;
  let i = 0;
  let c = 0;
  for (;;) {
    let ch = line.charCodeAt(i);
    while (i < n && (ch === SPACE || (ch === TAB && tabIsBlank))) ch = line.charCodeAt(++i);
    if (i >= n || (!ws && ch === delimiter)) {
      // an empty cell: fine only as trailing delimiters after the last value
      if (c === 0) return false;
      while (i < n && ((ch === SPACE || (ch === TAB && tabIsBlank)) || ch === delimiter)) {
        ch = line.charCodeAt(++i);
      }
      return i >= n && c === width;
    }
    if (c === width) return false;
    let negative = false;
    if (ch === PLUS || ch === MINUS) {
      negative = ch === MINUS;
      ch = line.charCodeAt(++i);
    }
    let mantissa = 0, digits = 0, exponent = 0, seen = false;
    while (ch >= ZERO && ch <= NINE) {
      seen = true;
      if (mantissa !== 0 || ch !== ZERO) {
        if (digits === 15) return false;
        mantissa = mantissa * 10 + (ch - ZERO);
        digits++;
      }
      ch = line.charCodeAt(++i);
    }
    if (ch === DOT || (decimalComma && ch === COMMA)) {
      // ",5" opens no data row for the general reader (it is not a numeric-looking first cell)
      if (ch === COMMA && c === 0 && !seen) return false;
      ch = line.charCodeAt(++i);
      while (ch >= ZERO && ch <= NINE) {
        seen = true;
        if (mantissa !== 0 || ch !== ZERO) {
          if (digits === 15) return false;
          mantissa = mantissa * 10 + (ch - ZERO);
          digits++;
        }
        exponent--;
        ch = line.charCodeAt(++i);
      }
    }
    if (!seen) return false;
    if (ch === 101 || ch === 69) {
      ch = line.charCodeAt(++i);
      let sign = 1;
      if (ch === PLUS || ch === MINUS) {
        sign = ch === MINUS ? -1 : 1;
        ch = line.charCodeAt(++i);
      }
      if (!(ch >= ZERO && ch <= NINE)) return false;
      let e = 0;
      while (ch >= ZERO && ch <= NINE) {
        if (e < 1000) e = e * 10 + (ch - ZERO);
        ch = line.charCodeAt(++i);
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
    const end = i;
    while (i < n && (ch === SPACE || (ch === TAB && tabIsBlank))) ch = line.charCodeAt(++i);
    if (i >= n) return c === width;
    if (ws) {
      if (i === end) return false; // "1.5-2" is one cell to the general reader
      continue;
    }
    if (ch !== delimiter) return false;
    i++;
  }
}

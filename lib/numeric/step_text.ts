/**
 * Whole numbers written as short text. Each number is zig-zag mapped to a non-negative one
 * (0, −1, 1, −2 … → 0, 1, 2, 3 …) and written in a fixed number of bits w, chosen for the list
 * so the text is shortest; a number too large for w bits is written as w one-bits, then the
 * bit length of the rest in 6 bits, then the rest. The bits go six to a character of the
 * URL-safe base-64 alphabet (`A`–`Z`, `a`–`z`, `0`–`9`, `-`, `_`), the first character giving w,
 * the last one filled up with one-bits. The text needs no escaping in JSON or HTML. Our
 * encoding (the zig-zag map as in Protocol Buffers' sint fields).
 *
 * @module
 */

/** The 64 characters, each carrying 6 bits. */
const ALPHABET = "ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_";

/** Character code → alphabet index (−1 for a character outside it). */
const INDEX = (() => {
  const table = new Int8Array(128).fill(-1);
  for (let i = 0; i < ALPHABET.length; i++) table[ALPHABET.charCodeAt(i)] = i;
  return table;
})();

/** Bits of the length field of a number written past its escape. */
const LENGTH_BITS = 6;

/** Widest fixed width tried (our choice: wider lists are rare and still written exactly). */
const MAX_WIDTH = 24;

/** 2^k for k = 0 … 53 (a table: a power with a variable exponent is a call). */
const POW2 = Float64Array.from({ length: 54 }, (_, k) => 2 ** k);

/** Bit length of a non-negative safe integer (0 for 0). */
function bitLength(z: number): number {
  if (z < 2147483648) return 32 - Math.clz32(z);
  return 31 + bitLength(Math.floor(z / 2147483648));
}

/**
 * The width that makes the list shortest, and its bits, in one pass over the list: a number
 * of L bits takes w bits at every width w > L; at w = L it is the escape itself when all its
 * bits are ones (then its rest is 0, of 0 bits); below, it is escaped, and its rest
 * z − (2^w − 1) is r + 1 at w = L − 1 (r: z without its top bit), and at w ≤ L − 2 has L − 1
 * bits when r + 1 < 2^w, else L. The escapes' bits are summed per width by differences.
 */
function bestWidth(zigzag: number[]): { width: number; bits: number } {
  let longest = 1;
  for (const z of zigzag) longest = Math.max(longest, bitLength(z));
  const top = Math.min(MAX_WIDTH, longest);
  // escape bits at each width: `ranges` by differences (added over w = from … to), `at` one width
  const ranges = new Float64Array(top + 2), at = new Float64Array(top + 1);
  for (const z of zigzag) {
    const length = bitLength(z);
    if (length === 0) continue;
    if (length <= top && z === POW2[length]! - 1) at[length] = at[length]! + LENGTH_BITS;
    if (length < 2) continue;
    const rPlus1 = z - POW2[length - 1]! + 1, restBits = bitLength(rPlus1);
    if (length - 1 <= top) at[length - 1] = at[length - 1]! + LENGTH_BITS + restBits;
    const last = Math.min(length - 2, top);
    if (last < 1) continue;
    ranges[1] = ranges[1]! + LENGTH_BITS + length;
    ranges[last + 1] = ranges[last + 1]! - (LENGTH_BITS + length);
    // from width restBits on, the rest has one bit fewer
    if (restBits <= last) {
      ranges[restBits] = ranges[restBits]! - 1;
      ranges[last + 1] = ranges[last + 1]! + 1;
    }
  }
  let width = 1, bits = Infinity, escapes = 0;
  for (let w = 1; w <= top; w++) {
    escapes += ranges[w]!;
    const b = w * zigzag.length + escapes + at[w]!;
    if (b < bits) [width, bits] = [w, b];
  }
  return { width, bits };
}

/** The zig-zag numbers of safe integers. */
function zigzagOf(values: ArrayLike<number>): number[] {
  const zigzag: number[] = [];
  for (let i = 0; i < values.length; i++) {
    const v = values[i]!;
    const z = v >= 0 ? 2 * v : -2 * v - 1;
    if (!Number.isSafeInteger(v) || !Number.isSafeInteger(z)) {
      throw new RangeError(`Cannot write ${v} as text: not a safe integer`);
    }
    zigzag.push(z);
  }
  return zigzag;
}

/**
 * How many characters {@linkcode integersToText} writes for the values (to choose between
 * forms without writing each).
 *
 * @throws {RangeError} When a value is not a safe integer.
 */
export function textLengthOf(values: ArrayLike<number>): number {
  return 1 + Math.ceil(bestWidth(zigzagOf(values)).bits / 6);
}

/** The alphabet's character codes. */
const CODES = Uint8Array.from(ALPHABET, (c) => c.charCodeAt(0));

/** Character codes to text (every code of the alphabet is below 128, so one byte a character). */
const LATIN1 = new TextDecoder("latin1");

/** Bits into alphabet characters, six a character; fewer than six are held between writes. */
class BitWriter {
  readonly #codes: Uint8Array;
  #written = 0;
  #acc = 0;
  #pending = 0;
  /** @param characters The exact length of the text, in characters. */
  constructor(characters: number) {
    this.#codes = new Uint8Array(characters);
  }
  /** Writes a value of at most 24 bits in `bits` bits (acc stays below 2³⁰). */
  putSmall(value: number, bits: number): void {
    const acc = (this.#acc << bits) | value;
    let pending = this.#pending + bits;
    while (pending >= 6) {
      pending -= 6;
      this.#codes[this.#written++] = CODES[(acc >> pending) & 63]!;
    }
    this.#acc = acc & ((1 << pending) - 1);
    this.#pending = pending;
  }
  /** Writes a value in `bits` bits, any number up to 63. */
  put(value: number, bits: number): void {
    for (; bits > 24; bits -= 24) {
      const high = Math.floor(value / POW2[bits - 24]!);
      this.putSmall(high, 24);
      value -= high * POW2[bits - 24]!;
    }
    this.putSmall(value, bits);
  }
  /** Fills the last character with one-bits and gives the text, which must be the length said. */
  finish(): string {
    if (this.#pending > 0) this.putSmall(POW2[6 - this.#pending]! - 1, 6 - this.#pending);
    if (this.#written !== this.#codes.length) {
      throw new Error(
        `step text: ${this.#written} characters written, ${this.#codes.length} counted`,
      );
    }
    return LATIN1.decode(this.#codes);
  }
}

/**
 * Safe integers as text (see the module note).
 *
 * @throws {RangeError} When a value is not a safe integer or its zig-zag form exceeds 2⁵³.
 * @example
 * ```ts
 * import { integersToText, textToIntegers } from "./step_text.ts";
 * const text = integersToText([0, -1, 15, 16, -300]);
 * if (textToIntegers(text).join() !== "0,-1,15,16,-300") throw new Error(text);
 * ```
 */
export function integersToText(values: ArrayLike<number>): string {
  const zigzag = zigzagOf(values);
  const { width, bits } = bestWidth(zigzag);
  const writer = new BitWriter(1 + Math.ceil(bits / 6));
  writer.putSmall(width, 6);
  const escape = POW2[width]! - 1;
  for (const z of zigzag) {
    if (z < escape) writer.putSmall(z, width);
    else {
      const rest = z - escape, length = bitLength(rest);
      writer.put(escape, width);
      writer.putSmall(length, LENGTH_BITS);
      writer.put(rest, length);
    }
  }
  return writer.finish();
}

/**
 * The integers written by {@linkcode integersToText}.
 *
 * @throws {SyntaxError} When the text holds a character outside the alphabet or ends mid-number.
 */
export function textToIntegers(text: string): number[] {
  const digits = new Uint8Array(text.length);
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    const k = c < 128 ? INDEX[c]! : -1;
    if (k < 0) {
      throw new SyntaxError(`Cannot read step text: character ${JSON.stringify(text[i])} at ${i}`);
    }
    digits[i] = k;
  }
  if (digits.length === 0) return [];
  const width = digits[0]!;
  if (width < 1 || width > 53) throw new SyntaxError(`Cannot read step text: width ${width}`);
  const reader = new BitReader(digits);
  const escape = POW2[width]! - 1;
  const out: number[] = [];
  while (reader.left() >= width) {
    let z = width <= 24 ? reader.takeSmall(width) : reader.take(width);
    if (z === escape) {
      if (reader.left() < LENGTH_BITS) break; // the fill of the last character
      const length = reader.takeSmall(LENGTH_BITS);
      if (reader.left() < length) {
        throw new SyntaxError("Cannot read step text: it ends mid-number");
      }
      z += reader.take(length);
    }
    out.push(z % 2 === 0 ? z / 2 : -(z + 1) / 2);
  }
  return out;
}

/** Alphabet indices (after the width character) read back as bits. */
class BitReader {
  readonly #digits: Uint8Array;
  readonly #total: number;
  /** Bits read ahead, held in acc. */
  #acc = 0;
  #held = 0;
  #next = 1;
  constructor(digits: Uint8Array) {
    this.#digits = digits;
    this.#total = 6 * (digits.length - 1);
  }
  /** Bits not yet taken. */
  left(): number {
    return this.#total - (6 * (this.#next - 1) - this.#held);
  }
  /** The next `bits` bits, at most 24 (acc stays below 2³⁰). */
  takeSmall(bits: number): number {
    let acc = this.#acc, held = this.#held;
    while (held < bits) {
      acc = (acc << 6) | this.#digits[this.#next++]!;
      held += 6;
    }
    held -= bits;
    const v = (acc >> held) & ((1 << bits) - 1);
    this.#acc = acc & ((1 << held) - 1);
    this.#held = held;
    return v;
  }
  /** The next `bits` bits, any number up to 63. */
  take(bits: number): number {
    let v = 0;
    for (; bits > 24; bits -= 24) v = v * POW2[24]! + this.takeSmall(24);
    return v * POW2[bits]! + this.takeSmall(bits);
  }
}

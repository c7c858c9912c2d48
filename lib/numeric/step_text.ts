/**
 * Whole numbers written as short text: each number zig-zag mapped to a non-negative one
 * (0, −1, 1, −2 … → 0, 1, 2, 3 …) and written in base-32 digits, lowest first, one character
 * per digit from the URL-safe base-64 alphabet: the 32 characters `A`–`Z`, `a`–`f` end a number,
 * the 32 characters `g`–`z`, `0`–`9`, `-`, `_` carry a digit with more to follow. A step of
 * less than 16 either way takes one character, of less than 512 two. The text needs no escaping
 * in JSON or HTML. Our encoding (the zig-zag map as in Protocol Buffers' sint fields, the
 * digit-with-continuation idea of their varints).
 *
 * @module
 */

/** The 64 characters: index < 32 ends a number, index ≥ 32 carries a digit and continues. */
const ALPHABET = "ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_";

/** Character code → alphabet index (−1 for a character outside it). */
const INDEX = (() => {
  const table = new Int8Array(128).fill(-1);
  for (let i = 0; i < ALPHABET.length; i++) table[ALPHABET.charCodeAt(i)] = i;
  return table;
})();

/**
 * Safe integers as text (see the module note); throws for a number that is not a safe integer.
 *
 * @throws {RangeError} When a value is not a safe integer (or its zig-zag form exceeds 2⁵³).
 * @example
 * ```ts
 * import { integersToText, textToIntegers } from "./step_text.ts";
 * const text = integersToText([0, -1, 15, 16, -300]);
 * if (textToIntegers(text).join() !== "0,-1,15,16,-300") throw new Error(text);
 * ```
 */
export function integersToText(values: ArrayLike<number>): string {
  let out = "";
  for (let i = 0; i < values.length; i++) {
    const v = values[i]!;
    let z = v >= 0 ? 2 * v : -2 * v - 1;
    if (!Number.isSafeInteger(v) || !Number.isSafeInteger(z)) {
      throw new RangeError(`Cannot write ${v} as text: not a safe integer`);
    }
    while (z >= 32) {
      out += ALPHABET[32 + (z % 32)];
      z = Math.floor(z / 32);
    }
    out += ALPHABET[z];
  }
  return out;
}

/**
 * The integers written by {@linkcode integersToText}.
 *
 * @throws {SyntaxError} When the text holds a character outside the alphabet or ends mid-number.
 */
export function textToIntegers(text: string): number[] {
  const out: number[] = [];
  let z = 0, scale = 1;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    const k = c < 128 ? INDEX[c]! : -1;
    if (k < 0) {
      throw new SyntaxError(`Cannot read step text: character ${JSON.stringify(text[i])} at ${i}`);
    }
    if (k >= 32) {
      z += (k - 32) * scale;
      scale *= 32;
      continue;
    }
    z += k * scale;
    out.push(z % 2 === 0 ? z / 2 : -(z + 1) / 2);
    z = 0;
    scale = 1;
  }
  if (scale !== 1) throw new SyntaxError("Cannot read step text: it ends inside a number");
  return out;
}

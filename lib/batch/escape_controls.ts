/**
 * Text for a terminal or log line: control characters (C0, DEL, C1, and the Unicode line and
 * bidirectional-override separators) shown as escapes, so a file name cannot start a new line,
 * move the cursor or forge a summary.
 *
 * @module
 */

// deno-lint-ignore no-control-regex
const CONTROL = /[\u0000-\u001f\u007f-\u009f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g;

const NAMED: Record<string, string> = { "\n": "\\n", "\r": "\\r", "\t": "\\t" };

/** Escapes control characters as `\n`, `\r`, `\t` or `\u{…}`. */
export function escapeControls(text: string): string {
  return text.replace(
    CONTROL,
    (c) => NAMED[c] ?? `\\u{${c.codePointAt(0)!.toString(16).padStart(2, "0")}}`,
  );
}

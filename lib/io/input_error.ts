/**
 * The one error type for bad user input: it names the file, the line and the problem.
 *
 * @module
 */

/** What was wrong with an input, for programs that react to it. */
export type InputProblem =
  | "empty"
  | "binary"
  | "encoding"
  | "malformed"
  | "non-numeric"
  | "non-finite"
  | "duplicate-x"
  | "non-monotonic"
  | "too-few-points"
  | "out-of-range"
  | "ambiguous-ordinate"
  | "ambiguous-axis"
  | "too-large"
  | "not-a-file"
  | "unreadable";

/** What a caller could supply to settle the problem (the reader never names CLI flags). */
export interface InputHint {
  /** What the caller should state. */
  need: "axis" | "ordinate" | "thickness";
  /** Values that would be accepted, e.g. `["nm", "um", "cm-1", "ev"]`. */
  choices?: string[];
}

/** A problem with one input file, located to a line where possible. */
export class InputError extends Error {
  /** The file. */
  readonly file: string;
  /** The line, when known (1-based). */
  readonly line: number | undefined;
  /** The kind of problem. */
  readonly problem: InputProblem;
  /** What would settle the problem, when the file leaves a value undetermined. */
  readonly hint: InputHint | undefined;

  /**
   * Locates a problem in an input file; the message reads `file:line: detail`.
   *
   * @param problem The kind of problem.
   * @param file The file.
   * @param line The 1-based line, when known.
   * @param detail What is wrong, in sentence case, with the bad value quoted.
   * @param hint What would settle it, when the file leaves a value undetermined.
   */
  constructor(
    problem: InputProblem,
    file: string,
    line: number | undefined,
    detail: string,
    hint?: InputHint,
  ) {
    super(`${file}${line === undefined ? "" : `:${line}`}: ${detail}`);
    this.name = "InputError";
    this.problem = problem;
    this.file = file;
    this.line = line;
    this.hint = hint;
  }
}

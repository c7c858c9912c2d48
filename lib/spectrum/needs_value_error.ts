/**
 * An error for a computation that lacks a value only the caller can supply (the thickness, an
 * axis unit…). It carries a machine hint, `need`, which a front end turns into its own wording
 * (the CLI names its option).
 *
 * @module
 */

/** What a computation may need from its caller. */
export type NeededValue = "thickness" | "axis" | "ordinate" | "path" | "host";

/** A computation cannot go on without a value the caller must give. */
export class NeedsValueError extends RangeError {
  /** The value that is missing. */
  readonly need: NeededValue;

  /**
   * Says what could not be done and which value would let it go on.
   *
   * @param message What could not be done, in sentence case, without a final period.
   * @param need The value that is missing.
   */
  constructor(message: string, need: NeededValue) {
    super(message);
    this.name = "NeedsValueError";
    this.need = need;
  }
}

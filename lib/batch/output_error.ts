/**
 * An environment error while writing a batch's outputs (read-only folder, disk full, denied
 * permission): one line naming the path and the cause, for exit code 1.
 *
 * @module
 */
import { causeOf } from "./read_limited.ts";

/** Writing to `path` failed; `message` is one line with the path and the cause. */
export class OutputError extends Error {
  readonly path: string;
  constructor(path: string, cause: unknown) {
    super(`${path}: cannot write: ${causeOf(cause)}`);
    this.name = "OutputError";
    this.path = path;
  }
}

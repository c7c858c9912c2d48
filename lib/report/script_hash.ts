/**
 * Content-Security-Policy source for an inline script: 'sha256-…' of its exact text
 * (W3C CSP Level 3, §8.3 hash-source; SHA-256 per FIPS 180-4).
 *
 * @module
 */
import { createHash } from "node:crypto";

/** The CSP hash source of an inline script's text, e.g. `'sha256-…='`. */
export function scriptHash(source: string): string {
  return `'sha256-${createHash("sha256").update(source, "utf8").digest("base64")}'`;
}

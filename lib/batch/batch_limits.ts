/**
 * The per-file limits of a batch: the size cap on every file it reads and the time budget of
 * one file's analysis, from the settings' `limits` block or the defaults.
 *
 * @module
 */
import { DEFAULT_MAX_FILE_BYTES } from "./read_limited.ts";
import type { BatchSettings } from "./settings_schema.ts";
import { DEFAULT_MAX_RSS_BYTES } from "./pool.ts";

/** Default time budget of one file's analysis, seconds. */
export const DEFAULT_FILE_TIMEOUT_SECONDS = 60;

/** Limits in the units the code uses. */
export interface BatchLimits {
  /** Largest file read, bytes. */
  maxFileBytes: number;
  /** Longest analysis of one file, milliseconds. */
  fileTimeoutMs: number;
  /** Resident size of the process past which the pool's memory guard acts, bytes. */
  maxRssBytes: number;
}

/** The limits a batch's settings ask for. */
export function batchLimits(settings: BatchSettings | undefined): BatchLimits {
  const l = settings?.limits ?? {};
  return {
    maxFileBytes: l.maxFileMb === undefined
      ? DEFAULT_MAX_FILE_BYTES
      : Math.floor(l.maxFileMb * 1024 * 1024),
    fileTimeoutMs: (l.fileTimeoutSeconds ?? DEFAULT_FILE_TIMEOUT_SECONDS) * 1000,
    maxRssBytes: l.maxMemoryMb === undefined
      ? DEFAULT_MAX_RSS_BYTES
      : Math.floor(l.maxMemoryMb * 1024 * 1024),
  };
}

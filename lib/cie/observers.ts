/**
 * The CIE standard colorimetric observers on the 1 nm grid (CIE 15:2018 Tables 1 and 2).
 *
 * @module
 */
import { table as cie1931 } from "./data/cie_1931_2deg.ts";
import { table as cie1964 } from "./data/cie_1964_10deg.ts";
import { GRID_LENGTH, GRID_START_NM } from "./grid.ts";
import type { SpectralTable } from "./data/_table.ts";

/** Observer field size: `"2"` is CIE 1931, `"10"` is CIE 1964. */
export type ObserverName = "2" | "10";

/** Colour-matching functions x̄, ȳ, z̄ on the 360–830 nm 1 nm grid. */
export interface Observer {
  readonly name: ObserverName;
  readonly label: string;
  readonly x: Float64Array<ArrayBuffer>;
  readonly y: Float64Array<ArrayBuffer>;
  readonly z: Float64Array<ArrayBuffer>;
}

function onGrid(table: SpectralTable, name: ObserverName, label: string): Observer {
  if (table.startNm !== GRID_START_NM || table.stepNm !== 1) {
    throw new RangeError(`Cannot use observer table ${label}: not on the 1 nm grid`);
  }
  const col = (k: string) => table.columns[k]!.slice(0, GRID_LENGTH);
  return { name, label, x: col("x"), y: col("y"), z: col("z") };
}

const OBSERVERS: Record<ObserverName, Observer> = {
  "2": onGrid(cie1931, "2", "CIE 1931 2°"),
  "10": onGrid(cie1964, "10", "CIE 1964 10°"),
};

/**
 * The standard observer for a field size.
 *
 * @param name `"2"` (CIE 1931) or `"10"` (CIE 1964); `"1931"`, `"1964"`, `"2deg"`, `"10deg"` also accepted.
 * @throws {RangeError} For any other name.
 */
export function getObserver(name: string): Observer {
  const key = String(name).trim().toLowerCase().replace(/°|deg(ree)?s?$/g, "");
  const resolved = key === "1931" ? "2" : key === "1964" ? "10" : key;
  const observer = OBSERVERS[resolved as ObserverName];
  if (!observer) throw new RangeError(`Unknown observer "${name}": use 2 or 10`);
  return observer;
}

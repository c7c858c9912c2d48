/**
 * Reader for JCAMP-DX 4.24 spectra (McDonald & Wilks, Appl. Spectrosc. 42, 151 (1988)):
 * labelled data records, `##XYDATA=(X++(Y..Y))` in AFFN or the ASDF compressed forms
 * (SQZ, DIF, DUP) and `##XYPOINTS=(XY..XY)`, scaled by XFACTOR / YFACTOR.
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import { InputError } from "./input_error.ts";
import type { ReadOptions } from "./spectra_from_table.ts";
import { spectraFromTable } from "./spectra_from_table.ts";
import type { TextTable } from "./read_table.ts";
import type { OrdinateKind } from "./header_units.ts";
import type { AxisUnit } from "../spectrum/axis.ts";
import { resolveReadLimits } from "./read_limits.ts";

const SQZ: Record<string, number> = { "@": 0 };
const DIF: Record<string, number> = { "%": 0 };
const DUP: Record<string, number> = {};
"ABCDEFGHI".split("").forEach((c, i) => (SQZ[c] = i + 1));
"abcdefghi".split("").forEach((c, i) => (SQZ[c] = -(i + 1)));
"JKLMNOPQR".split("").forEach((c, i) => (DIF[c] = i + 1));
"jklmnopqr".split("").forEach((c, i) => (DIF[c] = -(i + 1)));
"STUVWXYZs".split("").forEach((c, i) => (DUP[c] = i + 1));

/**
 * Decodes one line of ASDF/AFFN values; returns the numbers and whether it ended in DIF form.
 *
 * @param maxValues Most values the line may expand to; a DUP count beyond it is refused before
 *   anything is expanded.
 * @throws {InputError} For a bad character or count (`too-large` past `maxValues`).
 */
export function decodeAsdfLine(
  line: string,
  file: string,
  lineNo: number,
  maxValues: number = Infinity,
): { values: number[]; endsInDif: boolean } {
  const values: number[] = [];
  let lastWasDif = false;
  let i = 0;
  const s = line.replace(/\$\$.*$/, "");
  while (i < s.length) {
    const ch = s[i]!;
    if (ch === " " || ch === "," || ch === "\t" || ch === ";") {
      i++;
      continue;
    }
    let j = i + 1;
    if (values.length >= maxValues && !(ch in DUP)) {
      throw new InputError(
        "too-large",
        file,
        lineNo,
        `Line holds more than the ${maxValues} values expected`,
      );
    }
    if (ch in SQZ || ch in DIF || ch in DUP) {
      while (j < s.length && /[0-9.]/.test(s[j]!)) j++;
      const digits = s.slice(i + 1, j);
      if (ch in DUP) {
        const count = Number(String(DUP[ch]) + digits);
        const prev = values[values.length - 1];
        if (prev === undefined) {
          throw new InputError("malformed", file, lineNo, "DUP count with no value before it");
        }
        if (!(Number.isSafeInteger(count) && count >= 1)) {
          throw new InputError(
            "malformed",
            file,
            lineNo,
            `DUP count "${ch}${digits}" is not a count`,
          );
        }
        if (values.length + count - 1 > maxValues) {
          throw new InputError(
            "too-large",
            file,
            lineNo,
            `DUP count ${count} expands past the ${maxValues} values this line may hold`,
          );
        }
        const step = lastWasDif && values.length >= 2 ? prev - values[values.length - 2]! : 0;
        for (let k = 1; k < count; k++) values.push(values[values.length - 1]! + step);
      } else if (ch in SQZ) {
        const d = SQZ[ch]!;
        values.push(Number(`${d < 0 ? "-" : ""}${Math.abs(d)}${digits}`));
        lastWasDif = false;
      } else {
        const d = DIF[ch]!;
        const prev = values[values.length - 1];
        if (prev === undefined) {
          throw new InputError("malformed", file, lineNo, "DIF value with no value before it");
        }
        values.push(prev + Number(`${d < 0 ? "-" : ""}${Math.abs(d)}${digits}`));
        lastWasDif = true;
      }
      i = j;
      continue;
    }
    if (/[+\-0-9.]/.test(ch)) {
      // AFFN: an E is an exponent only when a sign and digits follow (McDonald & Wilks 1988
      // §5.3); otherwise it is the SQZ pseudo-digit +5 (e: −5) that starts the next value.
      while (j < s.length && /[0-9.]/.test(s[j]!)) j++;
      if (/^[eE][+-]\d/.test(s.slice(j, j + 3))) {
        j += 2;
        while (j < s.length && /[0-9]/.test(s[j]!)) j++;
      }
      const v = Number(s.slice(i, j));
      if (!Number.isFinite(v)) {
        throw new InputError(
          "non-numeric",
          file,
          lineNo,
          `Value "${s.slice(i, j)}" is not a number`,
        );
      }
      values.push(v);
      lastWasDif = false;
      i = j;
      continue;
    }
    if (ch === "?") {
      throw new InputError("non-finite", file, lineNo, "Missing value (?) in JCAMP-DX data");
    }
    throw new InputError(
      "non-numeric",
      file,
      lineNo,
      `Unexpected character "${ch}" in JCAMP-DX data`,
    );
  }
  return { values, endsInDif: lastWasDif };
}

function ordinateOf(yUnits: string): OrdinateKind | undefined {
  const u = yUnits.toUpperCase();
  if (u.includes("ABSORBANCE")) return "absorbance";
  if (u.includes("REFLECTANCE")) {
    return u.includes("%") || u.includes("PERCENT") ? "percent-reflectance" : "reflectance";
  }
  if (u.includes("%") || u.includes("PERCENT")) return "percent";
  if (u.includes("TRANSMITTANCE")) return "transmittance";
  return undefined;
}

function axisOf(xUnits: string): AxisUnit | undefined {
  const u = xUnits.toUpperCase();
  if (u.includes("1/CM")) return "cm-1";
  if (u.includes("MICROMETERS")) return "um";
  if (u.includes("NANOMETERS")) return "nm";
  return undefined;
}

/**
 * Reads the first spectrum block of a JCAMP-DX file.
 *
 * @throws {InputError} For a missing data table, bad values or inconsistent point counts.
 */
export function readJcamp(text: string, file: string, options: ReadOptions = {}): Spectrum[] {
  const limits = resolveReadLimits(options.limits);
  const lines = text.split(/\r\n|\n|\r/);
  const fields: Record<string, string> = {};
  const rows: number[][] = [];
  const rowLines: number[] = [];
  let mode: "none" | "xydata" | "xypoints" = "none";
  let dataLine = 0;
  let prevLastY: number | undefined;
  let prevEndsInDif = false;
  // more points than the file declares is malformed; more than the reader's cap is too large
  const tooMany = (declared: number, cap: number, line: number) =>
    declared === cap
      ? new InputError(
        "malformed",
        file,
        line,
        `The table holds more than the ${declared} points NPOINTS says`,
      )
      : new InputError(
        "too-large",
        file,
        line,
        `The table holds more than ${cap} points; at most ${limits.maxPoints} are read`,
      );
  const num = (k: string, fallback: number) => {
    const v = Number((fields[k] ?? "").replace(",", "."));
    return Number.isFinite(v) && fields[k] !== undefined && fields[k] !== "" ? v : fallback;
  };
  for (let n = 0; n < lines.length; n++) {
    const line = lines[n]!;
    const m = /^\s*##([^=]*)=\s*(.*)$/.exec(line);
    if (m) {
      const label = m[1]!.trim().toUpperCase().replace(/[\s_\-/]/g, "");
      const value = m[2]!.replace(/\$\$.*$/, "").trim();
      if (label === "END") break;
      if (label === "XYDATA") {
        if (!/\(X\+\+\(Y\.\.Y\)\)/i.test(value)) {
          throw new InputError("malformed", file, n + 1, `Unsupported XYDATA form "${value}"`);
        }
        mode = "xydata";
        dataLine = n + 1;
      } else if (label === "XYPOINTS" || label === "PEAKTABLE") {
        mode = "xypoints";
        dataLine = n + 1;
      } else {
        mode = "none";
        fields[m[1]!.trim()] = value;
        fields[label] = value;
      }
      continue;
    }
    if (mode === "none" || line.trim() === "") continue;
    const xFactor = num("XFACTOR", 1), yFactor = num("YFACTOR", 1);
    const declared = num("NPOINTS", NaN);
    const cap = Number.isFinite(declared) && declared >= 0
      ? Math.min(declared, limits.maxPoints)
      : limits.maxPoints;
    // at the declared count only a DIF line's closing Y-check line may follow
    if (rows.length >= cap && !(mode === "xydata" && prevEndsInDif)) {
      throw tooMany(declared, cap, n + 1);
    }
    // room for the rest of the points, the leading X and a repeated check value
    const room = mode === "xypoints" ? 2 * (cap - rows.length) : cap - rows.length + 2;
    const { values, endsInDif } = decodeAsdfLine(line, file, n + 1, room);
    if (mode === "xypoints") {
      for (let k = 0; k + 1 < values.length; k += 2) {
        rows.push([values[k]! * xFactor, values[k + 1]! * yFactor]);
        rowLines.push(n + 1);
      }
      if (rows.length > cap) {
        throw tooMany(declared, cap, n + 1);
      }
      continue;
    }
    if (values.length < 2) continue;
    const firstX = num("FIRSTX", NaN), lastX = num("LASTX", NaN), npoints = num("NPOINTS", NaN);
    const deltaX = num("DELTAX", (lastX - firstX) / (npoints - 1));
    let ys = values.slice(1);
    if (prevEndsInDif && prevLastY !== undefined && rows.length > 0) {
      // DIF form: a line's first ordinate repeats the last one of the line before (Y-check)
      if (Math.abs(ys[0]! - prevLastY) >= 1e-9 * Math.max(1, Math.abs(prevLastY))) {
        throw new InputError(
          "malformed",
          file,
          n + 1,
          `Y-check value ${ys[0]} does not repeat ${prevLastY}, the last value of the line before`,
        );
      }
      ys = ys.slice(1);
      const x0 = values[0]! * xFactor;
      ys.forEach((y, k) => {
        rows.push([x0 + (k + 1) * deltaX, y * yFactor]);
        rowLines.push(n + 1);
      });
    } else {
      const x0 = values[0]! * xFactor;
      ys.forEach((y, k) => {
        rows.push([x0 + k * deltaX, y * yFactor]);
        rowLines.push(n + 1);
      });
    }
    if (rows.length > cap) {
      throw tooMany(declared, cap, n + 1);
    }
    prevLastY = values[values.length - 1];
    prevEndsInDif = endsInDif;
  }
  if (rows.length === 0) {
    throw new InputError(
      "empty",
      file,
      dataLine || undefined,
      "JCAMP-DX file has no XYDATA or XYPOINTS table",
    );
  }
  const npoints = num("NPOINTS", NaN);
  if (Number.isFinite(npoints) && mode !== "xypoints" && rows.length !== npoints) {
    throw new InputError(
      "malformed",
      file,
      dataLine,
      `NPOINTS says ${npoints} but the table holds ${rows.length} points`,
    );
  }
  const table: TextTable = {
    delimiter: "whitespace",
    decimalComma: false,
    header: [fields["XUNITS"] ?? "", fields["YUNITS"] ?? ""],
    columns: [
      Float64Array.from(rows, (r) => r[0]!),
      Float64Array.from(rows, (r) => r[1]!),
    ],
    rowLines,
    fields,
    comments: [],
  };
  if (dataLine) table.headerLine = dataLine;
  const fromFile: ReadOptions = {};
  const ordinate = ordinateOf(fields["YUNITS"] ?? ""), axis = axisOf(fields["XUNITS"] ?? "");
  if (ordinate) fromFile.ordinate = ordinate;
  if (axis) fromFile.axis = axis;
  const spectra = spectraFromTable(table, file, { ...fromFile, ...options });
  for (const s of spectra) if (fields["TITLE"]) s.meta.sample = fields["TITLE"];
  return spectra;
}

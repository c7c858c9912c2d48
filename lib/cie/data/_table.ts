/** A spectral reference table: a uniform wavelength grid and named value columns. */
export interface SpectralTable {
  readonly startNm: number;
  readonly stepNm: number;
  readonly endNm: number;
  readonly columns: Readonly<Record<string, Float64Array<ArrayBuffer>>>;
}

/**
 * Parses the CSV text of a generated reference table (first column nm, uniform step).
 *
 * @throws {SyntaxError} When the grid is not uniform or a row has the wrong width.
 */
export function parseSpectralTable(csv: string): SpectralTable {
  const lines = csv.trim().split("\n");
  const names = (lines[0] ?? "").split(",").slice(1);
  const rows = lines.slice(1).map((line) => line.split(",").map(Number));
  const columns: Record<string, Float64Array<ArrayBuffer>> = {};
  names.forEach((name, c) => {
    columns[name] = Float64Array.from(rows, (row) => row[c + 1] ?? NaN);
  });
  const startNm = rows[0]?.[0] ?? NaN;
  const stepNm = (rows[1]?.[0] ?? NaN) - startNm;
  rows.forEach((row, i) => {
    if (row.length !== names.length + 1 || row.some((v) => !Number.isFinite(v))) {
      throw new SyntaxError(`Cannot parse reference table: row ${i + 1} is malformed`);
    }
    if (Math.abs((row[0] ?? NaN) - (startNm + i * stepNm)) > 1e-9) {
      throw new SyntaxError(`Cannot parse reference table: row ${i + 1} breaks the uniform grid`);
    }
  });
  return { startNm, stepNm, endNm: startNm + (rows.length - 1) * stepNm, columns };
}

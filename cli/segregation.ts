/**
 * `crystint segregation`: effective distribution coefficient along a boule (Scheil fit).
 *
 * @module
 */
import { parse } from "csv-parse/sync";
import { fitScheil, fractionFromPosition, type SegregationPoint } from "../lib/dopant/scheil.ts";
import { EXIT, parseCommandArgs, positiveNumber, round, toTable, UsageError } from "./_shared.ts";

export const SEGREGATION_HELP =
  `crystint segregation — k_eff and melt concentration from a boule profile

Usage:
  crystint segregation PROFILE.csv [--length MM] [--json]

PROFILE.csv columns: fraction (solidified, 0…1) or position_mm (from the seed end, with
--length for a cylindrical boule), concentration, optional sigma. Fits the Scheil relation
C_s = k·C₀·(1 − g)^(k − 1) by least squares (weighted by 1/σ² when every row has σ).

Example:
  crystint segregation boule-B26.csv --length 80 --json
`;

/** Runs the command; returns the exit code. */
export async function segregationCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs(args, {
    length: { type: "string" },
    json: { type: "boolean" },
    help: { type: "boolean", short: "h" },
  });
  if (values.help) {
    console.log(SEGREGATION_HELP);
    return EXIT.ok;
  }
  if (positionals.length !== 1) throw new UsageError("Give exactly one profile table");
  const length = positiveNumber(values.length, "length");
  let records: Record<string, string>[];
  try {
    records = parse(await Deno.readTextFile(positionals[0]!), {
      columns: (h: string[]) => h.map((x) => x.trim().toLowerCase()),
      bom: true,
      trim: true,
      skip_empty_lines: true,
    });
  } catch (e) {
    throw new UsageError(`Cannot read ${positionals[0]}: ${(e as Error).message}`);
  }
  const points: SegregationPoint[] = records.map((r, i) => {
    const line = i + 2;
    const c = Number(r["concentration"]);
    let g: number;
    if (r["fraction"] !== undefined && r["fraction"] !== "") g = Number(r["fraction"]);
    else if (r["position_mm"] !== undefined) {
      if (length === undefined) {
        throw new UsageError(`${positionals[0]}:${line}: positions need --length MM`);
      }
      try {
        g = fractionFromPosition(Number(r["position_mm"]), length);
      } catch (e) {
        throw new UsageError(`${positionals[0]}:${line}: ${(e as Error).message}`);
      }
    } else throw new UsageError(`${positionals[0]}:${line}: needs a fraction or position_mm`);
    if (!Number.isFinite(c) || !Number.isFinite(g)) {
      throw new UsageError(`${positionals[0]}:${line}: non-numeric value`);
    }
    const p: SegregationPoint = { fraction: g, concentration: c };
    if (r["sigma"]) p.sigma = Number(r["sigma"]);
    return p;
  });
  let fit;
  try {
    fit = fitScheil(points);
  } catch (e) {
    throw new UsageError((e as Error).message);
  }
  if (values.json) console.log(JSON.stringify(fit, null, 2));
  else {console.log(
      toTable([{
        k: `${round(fit.k, 4)} ± ${round(fit.kSigma, 4)}`,
        C0: `${round(fit.c0, 5)} ± ${round(fit.c0Sigma, 5)}`,
        points: fit.n,
        rms: round(fit.residualRms, 5),
      }], ["k", "C0", "points", "rms"]),
    );}
  return EXIT.ok;
}

/**
 * `crystint segregation`: effective distribution coefficient along a boule (Scheil fit).
 *
 * @module
 */
import { parse } from "csv-parse/sync";
import { fitScheil, fractionFromPosition, type SegregationPoint } from "../lib/dopant/scheil.ts";
import type { CommandSpec, ParsedArgs } from "./_command.ts";
import {
  EXIT,
  outputFormat,
  positiveNumber,
  round,
  toCsv,
  toTable,
  UsageError,
  writeStdout,
} from "./_shared.ts";
import { OUTPUT_OPTIONS } from "./_options.ts";

/** The command table of `crystint segregation`. */
export const SEGREGATION_COMMAND: CommandSpec = {
  name: "segregation",
  summary: "Scheil fit of k_eff and C0 along a boule",
  usage: ["PROFILE.csv [--length MM] [--json|--csv]"],
  positionals: "PROFILE.csv columns: fraction (solidified, 0…1) or position_mm (from the seed " +
    "end, with --length for a cylindrical boule), concentration, optional sigma.",
  options: [
    {
      name: "length",
      type: "string",
      arg: "MM",
      help: "boule length, to turn position_mm into the solidified fraction",
    },
    ...OUTPUT_OPTIONS,
  ],
  notes: [
    "Fits the Scheil relation C_s = k·C₀·(1 − g)^(k − 1) by least squares (weighted by 1/σ² " +
    "when every row has σ). --csv prints one row: k, kSigma, c0, c0Sigma, n, residualRms.",
  ],
  examples: ["boule-B26.csv --length 80 --json"],
  run: segregationCommand,
};

/** Runs the command; returns the exit code. */
async function segregationCommand(args: ParsedArgs): Promise<number> {
  const positionals = args.positionals;
  const format = outputFormat(args.flag("json"), args.flag("csv"));
  if (positionals.length !== 1) throw new UsageError("Give exactly one profile table");
  const length = positiveNumber(args.string("length"), "length");
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
  if (format === "json") console.log(JSON.stringify(fit, null, 2));
  else if (format === "csv") {
    writeStdout(toCsv([fit as unknown as Record<string, unknown>], [
      "k",
      "kSigma",
      "c0",
      "c0Sigma",
      "n",
      "residualRms",
    ]));
  } else {
    console.log(
      toTable([{
        k: `${round(fit.k, 4)} ± ${round(fit.kSigma, 4)}`,
        C0: `${round(fit.c0, 5)} ± ${round(fit.c0Sigma, 5)}`,
        points: fit.n,
        rms: round(fit.residualRms, 5),
      }], ["k", "C0", "points", "rms"]),
    );
  }
  return EXIT.ok;
}

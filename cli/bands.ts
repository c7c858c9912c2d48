/**
 * `crystint bands`: detect and fit absorption bands, suggest their assignment, and (with
 * --edge) analyse the absorption edge. Parses options and prints; the work is done by
 * lib/bands/analyse_bands.ts.
 *
 * @module
 */
import {
  analyseBands,
  type BandAnalysis,
  type BandAnalysisOptions,
} from "../lib/bands/analyse_bands.ts";
import { getHost, hostIndex } from "../lib/optics/refractive_index.ts";
import { densityFromBand } from "../lib/dopant/smakula_dexter.ts";
import { figureOfMerit } from "../lib/bands/figure_of_merit.ts";
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
import { ALPHA_NOTE, OUTPUT_OPTIONS, READING_OPTIONS } from "./_options.ts";
import { forEachFile } from "./_spectrum_options.ts";

/** The command table of `crystint bands`. */
export const BANDS_COMMAND: CommandSpec = {
  name: "bands",
  summary: "detect and fit absorption bands in wavenumber, with assignment hints",
  usage: ["FILE… [--host NAME] [--range-nm FROM-TO] [--json|--csv] [options]"],
  positionals: "FILE… spectrum exports (absorbance, transmittance or α).",
  options: [
    {
      name: "host",
      type: "string",
      arg: "NAME",
      help: "host for the assignment hints (corundum, spinel, yag, chrysoberyl, beryl)",
    },
    {
      name: "range-nm",
      type: "string",
      arg: "A-B",
      help: "fit only this wavelength range, e.g. 330-900",
    },
    {
      name: "floor-t",
      type: "string",
      arg: "T",
      help: "transmittance (fraction) below which readings are left out as carrying no information",
      default: "10× the noise of the transmittance reading, estimated from the data",
    },
    {
      name: "max-absorbance",
      type: "string",
      arg: "A",
      help: "the instrument's absorbance limit; readings above it are left out",
    },
    {
      name: "resolution-nm",
      type: "string",
      arg: "NM",
      help: "instrument resolution (FWHM); no band is fitted narrower",
      default: "two grid steps",
    },
    ...READING_OPTIONS,
    {
      name: "oscillator-strength",
      type: "string",
      arg: "F",
      help: "add a Smakula–Dexter density estimate N per band (cm⁻³) for the oscillator " +
        "strength F you supply (needs α: an α file or --thickness, and --host or --n for the " +
        "index); an order-of-magnitude estimate",
    },
    {
      name: "n",
      type: "string",
      arg: "VALUE",
      help: "refractive index for the estimate when no host is named",
    },
    {
      name: "merit",
      type: "string",
      arg: "PUMP,RES",
      help: "figure of merit α(PUMP nm)/α(RES nm), e.g. 490,820 for Ti:sapphire (common practice)",
    },
    {
      name: "edge",
      type: "string",
      arg: "direct|indirect",
      help: "Tauc gap and Urbach energy of the absorption edge (from A·ln 10 when no thickness " +
        "is known: neither depends on the scale)",
    },
    ...OUTPUT_OPTIONS,
  ],
  notes: [
    "Bands are Gaussian in energy (Lorentzian for lines narrower than 150 cm⁻¹), fitted on the " +
    "usable range (stretches below the photometric floor, above the absorbance limit or clipped " +
    "are left out and listed) with a baseline b0 + b1·ν̃ + scatter·ν̃⁴, plus an Urbach-type edge " +
    "term where the absorption edge reaches in, by variable projection weighted by the " +
    "photometric noise; where the residual shows structure a band is added or split and kept " +
    "when BIC prefers it. ± are 1σ standard errors; a width held at a bound has none (held). " +
    "The fitted ordinate is decadic absorbance as measured, or α for α files; with a thickness " +
    "the bands are also given as α (natural, cm⁻¹). Assignments are hints. --csv gives one row " +
    "per band.",
    ALPHA_NOTE,
  ],
  examples: ["slabs/TCW-R03.csv --host corundum --range-nm 330-900 --json"],
  run: bandsCommand,
};

/** One printed result: the analysis plus file and the optional estimates. */
type BandsRow = Omit<BandAnalysis, "curve"> & {
  file: string;
  densityEstimates?: {
    centerNm: number;
    densityPerCm3: number;
    oscillatorStrength: number;
    n: number;
  }[];
  figureOfMerit?: number;
};

function rangeOption(value: string | undefined, name: string): [number, number] | undefined {
  if (value === undefined) return undefined;
  const m = /^\s*(\d+(?:\.\d+)?)\s*[-:,]\s*(\d+(?:\.\d+)?)\s*$/.exec(value);
  if (!m || !(Number(m[2]) > Number(m[1]))) {
    throw new UsageError(`Option --${name} needs FROM-TO in nm, got "${value}"`);
  }
  return [Number(m[1]), Number(m[2])];
}

function plusMinus(value: number, sigma: number | null, digits: number): string {
  const v = String(round(value, digits));
  if (sigma === null) return `${v} (held)`;
  if (!Number.isFinite(sigma)) return `${v} ± ?`;
  return `${v} ± ${round(sigma, digits)}`;
}

/** Runs the command; returns the exit code. */
async function bandsCommand(args: ParsedArgs): Promise<number> {
  const positionals = args.positionals;
  const values = {
    host: args.string("host"),
    "range-nm": args.string("range-nm"),
    "floor-t": args.string("floor-t"),
    "max-absorbance": args.string("max-absorbance"),
    "resolution-nm": args.string("resolution-nm"),
    "oscillator-strength": args.string("oscillator-strength"),
    n: args.string("n"),
    merit: args.string("merit"),
    edge: args.string("edge"),
  };
  const format = outputFormat(args.flag("json"), args.flag("csv"));
  if (positionals.length === 0) {
    throw new UsageError("No input files: give one or more spectrum files");
  }
  const options: BandAnalysisOptions = {};
  if (values.host !== undefined) {
    try {
      options.host = getHost(values.host).name;
    } catch (e) {
      throw new UsageError((e as Error).message);
    }
  }
  const rangeNm = rangeOption(values["range-nm"], "range-nm");
  if (rangeNm) options.rangeNm = rangeNm;
  const floor = positiveNumber(values["floor-t"], "floor-t");
  if (floor !== undefined) {
    if (floor >= 1) {
      throw new UsageError(`Option --floor-t needs a fraction below 1, got "${floor}"`);
    }
    options.floorTransmittance = floor;
  }
  const maxA = positiveNumber(values["max-absorbance"], "max-absorbance");
  if (maxA !== undefined) options.maxAbsorbance = maxA;
  const resolution = positiveNumber(values["resolution-nm"], "resolution-nm");
  if (resolution !== undefined) options.resolutionNm = resolution;
  const f = positiveNumber(values["oscillator-strength"], "oscillator-strength");
  const nConst = positiveNumber(values.n, "n");
  if (f !== undefined && !options.host && nConst === undefined) {
    throw new UsageError("--oscillator-strength needs --host NAME or --n VALUE");
  }
  let merit: [number, number] | undefined;
  if (values.merit !== undefined) {
    const m = /^(\d+(?:\.\d+)?),(\d+(?:\.\d+)?)$/.exec(values.merit);
    if (!m) throw new UsageError(`Option --merit needs PUMP,RES in nm, got "${values.merit}"`);
    merit = [Number(m[1]), Number(m[2])];
  }
  if (values.edge !== undefined) {
    if (values.edge !== "direct" && values.edge !== "indirect") {
      throw new UsageError(`Option --edge takes direct or indirect, got "${values.edge}"`);
    }
    options.tauc = values.edge;
  }
  const results: BandsRow[] = [];
  const failed = await forEachFile(positionals, args, (spectra, file) => {
    for (const s of spectra) {
      const { curve: _curve, ...analysis } = analyseBands(s, options);
      const row: BandsRow = { ...analysis, file };
      if (f !== undefined) {
        if (!analysis.bandsAlpha) {
          throw new RangeError(
            `Cannot estimate densities for "${s.meta.sample}": α needs the thickness`,
          );
        }
        row.densityEstimates = analysis.bandsAlpha.map((b) => {
          const n = options.host ? hostIndex(getHost(options.host), b.centerNm).n : nConst!;
          return {
            centerNm: b.centerNm,
            densityPerCm3: densityFromBand(b.height, b.fwhmCm1, n, f),
            oscillatorStrength: f,
            n,
          };
        });
      }
      if (merit) row.figureOfMerit = figureOfMerit(s, merit[0], merit[1]);
      results.push(row);
    }
  });
  const rows = results.flatMap((r) =>
    r.bands.map((b, i) => ({
      sample: r.sample,
      file: r.file,
      band: i + 1,
      ...b,
      held: (b.held ?? []).join(" "),
      assignment:
        r.assignments.filter((a) => a.bandIndex === i).map((a) => `${a.ion} ${a.transition}`)[0] ??
          "",
    }))
  );
  if (format === "json") {
    // the JSON contract puts sample and file first
    console.log(
      JSON.stringify(
        results.map(({ sample, file, ...rest }) => ({ sample, file, ...rest })),
        null,
        2,
      ),
    );
  } else if (format === "csv") {
    const cols = [
      "sample",
      "file",
      "band",
      "shape",
      "centerCm1",
      "centerCm1Sigma",
      "centerNm",
      "centerNmSigma",
      "fwhmCm1",
      "fwhmCm1Sigma",
      "height",
      "heightSigma",
      "area",
      "areaSigma",
      "assignment",
    ];
    writeStdout(toCsv(rows, cols));
  } else {
    const shown = rows.map((r) => ({
      sample: r.sample,
      band: r.band,
      "centre (nm)": plusMinus(r.centerNm, r.centerNmSigma, 1),
      "centre (cm⁻¹)": plusMinus(r.centerCm1, r.centerCm1Sigma, 0),
      "FWHM (cm⁻¹)": plusMinus(r.fwhmCm1, r.fwhmCm1Sigma, 0),
      height: plusMinus(r.height, r.heightSigma, 4),
      assignment: r.assignment,
    }));
    console.log(
      toTable(shown, [
        "sample",
        "band",
        "centre (nm)",
        "centre (cm⁻¹)",
        "FWHM (cm⁻¹)",
        "height",
        "assignment",
      ]),
    );
    for (const r of results) {
      if (r.edge) {
        const e = r.edge;
        const gap = e.gapEv === null
          ? e.message ?? "no gap"
          : `gap ${plusMinus(e.gapEv, e.gapEvSigma, 3)} eV (Tauc ${e.exponent}, ${
            e.fromEv!.toFixed(2)
          }–${e.toEv!.toFixed(2)} eV)`;
        const urbach = e.urbachEv === null ? "no Urbach tail found" : `Urbach energy ${
          plusMinus(
            e.urbachEv * 1000,
            e.urbachEvSigma === null ? null : e.urbachEvSigma * 1000,
            0,
          )
        } meV`;
        console.log(`${r.sample}: ${gap}; ${urbach}`);
      }
      for (const w of r.warnings) console.error(`crystint: ${r.sample}: ${w}`);
    }
  }
  return failed > 0 ? EXIT.someFailed : EXIT.ok;
}

/**
 * `crystint bands`: detect and fit absorption bands, and suggest their assignment.
 *
 * @module
 */
import { type BandFit, fitSpectrumBands } from "../lib/bands/fit_bands.ts";
import { assignBands, type BandAssignment } from "../lib/bands/assign_bands.ts";
import { getHost, hostIndex } from "../lib/optics/refractive_index.ts";
import { densityFromBand } from "../lib/dopant/smakula_dexter.ts";
import { alphaOf } from "../lib/dopant/response_metric.ts";
import { figureOfMerit } from "../lib/bands/figure_of_merit.ts";
import { taucGap, urbachEnergy } from "../lib/bands/absorption_edge.ts";
import { nmToEv } from "../lib/spectrum/axis.ts";
import { EXIT, parseCommandArgs, round, toCsv, toTable, UsageError } from "./_shared.ts";
import { forEachFile, readOptionsFrom } from "./_spectrum_options.ts";

export const BANDS_HELP = `crystint bands — absorption bands fitted in wavenumber

Usage:
  crystint bands FILE… [--host NAME] [--range-nm FROM-TO] [--json|--csv] [options]

Options:
  --host NAME         host for the assignment hints (corundum, spinel, yag, chrysoberyl, beryl)
  --range-nm A-B      fit only this wavelength range, e.g. 330-900
  --baseline-nm LIST  band-free windows for the starting baseline, e.g. 330-340,740-780
                      (default: found automatically outside the detected bands)
  --ordinate KIND     transmittance | percent | absorbance | alpha (default: from the file)
  --axis UNIT         nm | um | cm-1 | ev (default: from the file)
  --thickness MM      measured thickness, mm (only used for α files)
  --oscillator-strength F   add a Smakula–Dexter density estimate N per band (cm⁻³) for the
                      oscillator strength F you supply (needs α: an α file or --thickness, and
                      --host or --n for the index); an order-of-magnitude estimate
  --n VALUE           refractive index for the estimate when no host is named
  --merit PUMP,RES    figure of merit α(PUMP nm)/α(RES nm), e.g. 490,820 for Ti:sapphire
                      (common practice)
  --edge direct|indirect   Tauc gap and Urbach energy of the absorption edge (needs α)
  --json | --csv      machine-readable output on stdout
  -h, --help          show this help

Bands are Gaussian in energy (Lorentzian for lines narrower than 150 cm⁻¹), fitted with a
baseline b0 + b1·ν̃ + scatter·ν̃⁴ by Levenberg–Marquardt; ± are 1σ standard errors. The
fitted ordinate is decadic absorbance as measured, or α for α files. Assignments are hints.

Example:
  crystint bands slabs/TCW-R03.csv --host corundum --range-nm 330-900 --json
`;

/** Runs the command; returns the exit code. */
export async function bandsCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs(args, {
    ordinate: { type: "string" },
    axis: { type: "string" },
    thickness: { type: "string" },
    host: { type: "string" },
    "range-nm": { type: "string" },
    "baseline-nm": { type: "string" },
    "oscillator-strength": { type: "string" },
    n: { type: "string" },
    merit: { type: "string" },
    edge: { type: "string" },
    json: { type: "boolean" },
    csv: { type: "boolean" },
    help: { type: "boolean", short: "h" },
  });
  if (values.help) {
    console.log(BANDS_HELP);
    return EXIT.ok;
  }
  if (positionals.length === 0) {
    throw new UsageError("No input files: give one or more spectrum files");
  }
  let host: string | undefined;
  if (values.host !== undefined) {
    try {
      host = getHost(values.host).name;
    } catch (e) {
      throw new UsageError((e as Error).message);
    }
  }
  let rangeNm: [number, number] | undefined;
  if (values["range-nm"] !== undefined) {
    const m = /^\s*(\d+(?:\.\d+)?)\s*[-:,]\s*(\d+(?:\.\d+)?)\s*$/.exec(values["range-nm"]);
    if (!m || !(Number(m[2]) > Number(m[1]))) {
      throw new UsageError(`Option --range-nm needs FROM-TO in nm, got "${values["range-nm"]}"`);
    }
    rangeNm = [Number(m[1]), Number(m[2])];
  }
  interface SampleBands {
    sample: string;
    file: string;
    ordinate: BandFit["ordinate"];
    bands: BandFit["bands"];
    baseline: BandFit["baseline"];
    residualRms: number;
    noiseSigma: number;
    converged: boolean;
    assignments: BandAssignment[];
    densityEstimates?: {
      centerNm: number;
      densityPerCm3: number;
      oscillatorStrength: number;
      n: number;
    }[];
    figureOfMerit?: number;
    edge?: {
      gapEv: number;
      exponent: string;
      fromEv: number;
      toEv: number;
      urbachEv: number | null;
    };
  }
  let windowsCm1: [number, number][] | undefined;
  if (values["baseline-nm"] !== undefined) {
    windowsCm1 = values["baseline-nm"].split(",").map((w) => {
      const m = /^\s*(\d+(?:\.\d+)?)\s*-\s*(\d+(?:\.\d+)?)\s*$/.exec(w);
      if (!m || !(Number(m[2]) > Number(m[1]))) {
        throw new UsageError(`Option --baseline-nm needs FROM-TO windows, got "${w}"`);
      }
      return [1e7 / Number(m[2]), 1e7 / Number(m[1])] as [number, number];
    });
  }
  const fitOptions = {
    ...(rangeNm ? { rangeNm } : {}),
    ...(windowsCm1 ? { baselineWindowsCm1: windowsCm1 } : {}),
  };
  const results: SampleBands[] = [];
  const f = values["oscillator-strength"] === undefined
    ? undefined
    : Number(values["oscillator-strength"]);
  if (f !== undefined && !(f > 0)) {
    throw new UsageError("Option --oscillator-strength needs a positive number");
  }
  const nConst = values.n === undefined ? undefined : Number(values.n);
  if (f !== undefined && !host && !(nConst! > 0)) {
    throw new UsageError("--oscillator-strength needs --host NAME or --n VALUE");
  }
  let merit: [number, number] | undefined;
  if (values.merit !== undefined) {
    const m = /^(\d+(?:\.\d+)?),(\d+(?:\.\d+)?)$/.exec(values.merit);
    if (!m) throw new UsageError(`Option --merit needs PUMP,RES in nm, got "${values.merit}"`);
    merit = [Number(m[1]), Number(m[2])];
  }
  if (values.edge !== undefined && !["direct", "indirect"].includes(values.edge)) {
    throw new UsageError(`Option --edge takes direct or indirect, got "${values.edge}"`);
  }
  const failed = await forEachFile(positionals, readOptionsFrom(values), (spectra, file) => {
    for (const s of spectra) {
      const fit = fitSpectrumBands(s, fitOptions);
      const extra: Partial<SampleBands> = {};
      if (f !== undefined) {
        const alphaFit = s.quantity === "alpha" ? fit : fitSpectrumBands(
          { ...s, quantity: "alpha", values: alphaOf(s) },
          rangeNm ? { rangeNm } : {},
        );
        extra.densityEstimates = alphaFit.bands.map((b) => {
          const n = host ? hostIndex(getHost(host), b.centerNm).n : nConst!;
          return {
            centerNm: b.centerNm,
            densityPerCm3: densityFromBand(b.height, b.fwhmCm1, n, f),
            oscillatorStrength: f,
            n,
          };
        });
      }
      if (merit) extra.figureOfMerit = figureOfMerit(s, merit[0], merit[1]);
      if (values.edge) {
        const alpha = alphaOf(s);
        const ev = [...s.wavelengthNm].map(nmToEv);
        const t = taucGap(ev, alpha, values.edge as "direct" | "indirect");
        if (t) {
          const u = urbachEnergy(ev, alpha, t.gapEv);
          extra.edge = {
            gapEv: t.gapEv,
            exponent: t.exponent,
            fromEv: t.region.fromEv,
            toEv: t.region.toEv,
            urbachEv: u?.urbachEv ?? null,
          };
        }
      }
      results.push({
        ...extra,
        sample: s.meta.sample,
        file,
        ordinate: fit.ordinate,
        bands: fit.bands,
        baseline: fit.baseline,
        residualRms: fit.residualRms,
        noiseSigma: fit.noiseSigma,
        converged: fit.converged,
        assignments: assignBands(fit.bands, host),
      });
    }
  });
  const rows = results.flatMap((r) =>
    r.bands.map((b, i) => ({
      sample: r.sample,
      file: r.file,
      band: i + 1,
      ...b,
      assignment:
        r.assignments.filter((a) => a.bandIndex === i).map((a) => `${a.ion} ${a.transition}`)[0] ??
          "",
    }))
  );
  if (values.json) console.log(JSON.stringify(results, null, 2));
  else if (values.csv) {
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
    Deno.stdout.writeSync(new TextEncoder().encode(toCsv(rows, cols)));
  } else {
    const shown = rows.map((r) => ({
      sample: r.sample,
      band: r.band,
      "centre (nm)": `${round(r.centerNm, 1)} ± ${round(r.centerNmSigma, 1)}`,
      "centre (cm⁻¹)": `${round(r.centerCm1, 0)} ± ${round(r.centerCm1Sigma, 0)}`,
      "FWHM (cm⁻¹)": `${round(r.fwhmCm1, 0)} ± ${round(r.fwhmCm1Sigma, 0)}`,
      height: `${round(r.height, 4)} ± ${round(r.heightSigma, 4)}`,
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
  }
  return failed > 0 ? EXIT.someFailed : EXIT.ok;
}

/**
 * One readable CSV header (with its unit) per JSON key, for every writer of rows: the CLI's
 * `--csv`, its terminal tables and batch's results.csv. JSON keys follow shared/DESIGN.md.
 *
 * @module
 */

/** Headers of the colour quantities, by JSON key (CIE 15:2018 symbols, units in brackets). */
const COLOR: Record<string, string> = {
  X: "X",
  Y: "Y",
  Z: "Z",
  x: "x",
  y: "y",
  uPrime: "u'",
  vPrime: "v'",
  L: "L*",
  a: "a*",
  b: "b*",
  C: "C*ab",
  h: "h_ab (deg)",
  srgb: "sRGB",
  p3: "P3",
};

/** Suffixes of colour keys that name a state: `L1`/`L2` (change), `Lo`/`Le`/`Lu` (pleochroism). */
const STATES: Record<string, string> = {
  "1": " (from)",
  "2": " (to)",
  o: " (o)",
  e: " (e)",
  u: " (unpolarised)",
  O: " (o)",
  E: " (e)",
  U: " (unpolarised)",
};

/** Headers of every other key that a row writer emits. */
export const CSV_HEADERS: Readonly<Record<string, string>> = {
  sample: "sample",
  file: "file",
  illuminant: "illuminant",
  observer: "observer",
  pathMm: "path (mm)",
  thicknessMm: "thickness (mm)",
  ...COLOR,
  whiteX: "white X",
  whiteY: "white Y",
  whiteZ: "white Z",
  dominantNm: "dominant or complementary (nm)",
  complementary: "complementary",
  purity: "excitation purity",
  srgbOutOfGamut: "outside sRGB",
  p3OutOfGamut: "outside P3",
  method: "interpolation",
  extrapolated: "extrapolated",
  from: "from illuminant",
  to: "to illuminant",
  adapt: "adaptation",
  dE00: "dE00",
  dEab: "dE*ab",
  dL: "dL*",
  dC: "dC*ab",
  dh: "dh_ab (deg)",
  LSd: "L* sd",
  aSd: "a* sd",
  bSd: "b* sd",
  CSd: "C*ab sd",
  hSd: "h_ab sd (deg)",
  dE00Sd: "dE00 sd",
  changeDE00Sd: "change dE00 sd",
  passProbability: "pass probability",
  verdict: "verdict",
  sampleO: "sample (o)",
  sampleE: "sample (e)",
  dE00oe: "dE00 o-e",
  sample1: "sample 1",
  sample2: "sample 2",
  reference: "reference illuminant",
  test: "test illuminant",
  mismatchReference: "dE00 at reference",
  indexAb: "metamerism index dE*ab",
  index00: "metamerism index dE00",
  maxChromaPathMm: "max C*ab path (mm)",
  maxChroma: "max C*ab",
  targetLightnessPathMm: "target L* path (mm)",
  dopant: "dopant",
  level: "level",
  levelUnit: "level unit",
  sensitivity: "dE00 per unit level",
  reachable: "reachable",
  band: "band",
  shape: "shape",
  centerCm1: "centre (cm-1)",
  centerCm1Sigma: "centre sigma (cm-1)",
  centerNm: "centre (nm)",
  centerNmSigma: "centre sigma (nm)",
  fwhmCm1: "FWHM (cm-1)",
  fwhmCm1Sigma: "FWHM sigma (cm-1)",
  height: "height",
  heightSigma: "height sigma",
  area: "area (cm-1)",
  areaSigma: "area sigma (cm-1)",
  assignment: "assignment",
  ordinate: "ordinate",
  response: "response",
  responseSigma: "response sigma",
  concentration: "concentration",
  concentrationSigma: "concentration sigma",
  halfWidth95: "95% half-width",
  unit: "unit",
  outsideRange: "outside calibrated range",
  metric: "metric",
  mode: "mode",
  slope: "slope",
  intercept: "intercept",
  slopeSigma: "slope sigma",
  interceptSigma: "intercept sigma",
  r2: "r2",
  syx: "s_y/x",
  lod: "LOD",
  loq: "LOQ",
  alphaBase: "alpha base",
  k: "k_eff",
  kSigma: "k_eff sigma",
  c0: "C0",
  c0Sigma: "C0 sigma",
  n: "points",
  residualRms: "residual rms",
};

/**
 * The CSV header of a JSON key; colour keys with a state suffix (`L1`, `Co`, `srgbE`) get the
 * colour header plus the state, and an unknown key is its own header.
 */
export function csvHeader(key: string): string {
  const direct = CSV_HEADERS[key];
  if (direct !== undefined) return direct;
  const m = /^(L|a|b|C|h|srgb)([12oeuOEU])$/.exec(key);
  if (m) return COLOR[m[1]!]! + STATES[m[2]!]!;
  return key;
}

/**
 * Writes the demo exports in spectra/demo/ from band models with a fixed seed.
 *
 * Invented scenario (all names made up): Tallowmere Crystal Works grows chromium-doped
 * corundum boules by flame fusion and a chromium-doped chrysoberyl-type colour-change crystal
 * by the flux method, and sends a lot of cut stones, boule slabs and analysed standards to the
 * Brackenfield gem laboratory for colour reports. The band positions and widths are typical
 * literature figures (from memory, used only to make plausible demo data — never as check
 * values); concentrations, thicknesses, noise and file layouts are invented.
 *
 * Run: deno run --allow-write=spectra/demo spectra/generate_demo.ts
 *
 * @module
 */

/** mulberry32: a small seeded PRNG so the demo files are the same on every run. */
function prng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
const random = prng(20261202);
const gauss = () => Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());

/** A band Gaussian in wavenumber: centre cm⁻¹, FWHM cm⁻¹, α at the peak per unit level. */
type Band = [centreCm1: number, fwhmCm1: number, alphaPerUnit: number];

/** α in cm⁻¹ per wt% Cr2O3 (corundum, E⊥c) and per wt% Cr (chrysoberyl-type, two axes). */
const HOSTS: Record<string, { bands: Band[]; scatter: number }> = {
  "corundum-cr": { bands: [[18000, 3000, 14], [24400, 4200, 24], [14405, 25, 6]], scatter: 0.04 },
  "chrysoberyl-cr-a": {
    bands: [[17600, 2400, 40], [24000, 3400, 40], [14690, 30, 4]],
    scatter: 0.05,
  },
  "chrysoberyl-cr-c": {
    bands: [[18100, 2700, 9], [24300, 3000, 18], [14690, 30, 3]],
    scatter: 0.05,
  },
};

function alphaAt(nm: number, host: string, level: number): number {
  const nu = 1e7 / nm;
  const { bands, scatter } = HOSTS[host]!;
  let a = scatter * (500 / nm) ** 4;
  for (const [c, w, k] of bands) {
    const s = w / (2 * Math.sqrt(2 * Math.LN2));
    a += level * k * Math.exp(-0.5 * ((nu - c) / s) ** 2);
  }
  return a;
}

/** Measured T of a polished slab: internal α·d plus two surfaces (n ≈ 1.76), with noise. */
function measuredT(
  nm: number,
  host: string,
  level: number,
  thicknessMm: number,
  noise: number,
): number {
  const n = 1.76, r = ((n - 1) / (n + 1)) ** 2;
  const x = Math.exp(-alphaAt(nm, host, level) * thicknessMm / 10);
  const t = ((1 - r) ** 2 * x) / (1 - r * r * x * x);
  return t + noise * gauss();
}

const grid = (start: number, end: number, step: number) =>
  Array.from({ length: Math.round((end - start) / step) + 1 }, (_, i) => start + i * step);

interface Stone {
  id: string;
  host: string;
  level: number;
  thicknessMm: number;
  pathMm: number;
  polarisation: string;
  layout: "comma-percent" | "semicolon-preamble" | "tab-absorbance" | "jcamp";
  notes: string;
}

const stones: Stone[] = [];
const layouts: Stone["layout"][] = ["comma-percent", "semicolon-preamble", "tab-absorbance"];
for (let i = 1; i <= 14; i++) {
  stones.push({
    id: `TCW-R${String(i).padStart(2, "0")}`,
    host: "corundum-cr",
    level: Number((0.02 + 0.035 * i * (0.8 + 0.4 * random())).toFixed(3)),
    thicknessMm: Number((1.2 + 2.2 * random()).toFixed(2)),
    pathMm: Number((3.5 + 4 * random()).toFixed(1)),
    polarisation: "o",
    layout: layouts[i % 3]!,
    notes: i === 7 ? "slight silk seen under the microscope" : "",
  });
}
for (let i = 1; i <= 8; i++) {
  for (const axis of ["a", "c"]) {
    stones.push({
      id: `TCW-X${String(i).padStart(2, "0")}${axis}`,
      host: `chrysoberyl-cr-${axis}`,
      level: Number((0.08 + 0.05 * i).toFixed(3)),
      thicknessMm: 2.5,
      pathMm: 5.0,
      polarisation: axis === "a" ? "E||a" : "E||c",
      layout: layouts[(i + (axis === "c" ? 1 : 0)) % 3]!,
      notes: "colour-change lot 26-11",
    });
  }
}
stones[3]!.layout = "jcamp";

const outDir = new URL("./demo/", import.meta.url);
await Deno.mkdir(outDir, { recursive: true });
const fmt = (v: number, d: number) => v.toFixed(d);
const manifest = [
  "sample,file,host,thickness_mm,path_mm,polarisation,target,calibration,notes,lot",
];

/** One sample-sheet line; the thickness is left out where the export's preamble carries it. */
function row(s: Stone, file: string, thickness: string): string {
  const corundum = s.host === "corundum-cr";
  const target = corundum ? "pink-sapphire" : "";
  const calibration = corundum ? "cr-corundum" : "";
  const lot = corundum ? "boule B-26-04" : "flux run F-26-11";
  const host = s.host.split("-")[0];
  return [s.id, file, host, thickness, s.pathMm, s.polarisation, target, calibration, s.notes, lot]
    .join(",");
}

for (const s of stones) {
  const noise = 0.0015;
  if (s.layout === "comma-percent") {
    const rows = grid(300, 900, 1).map((nm) =>
      `${nm},${fmt(100 * measuredT(nm, s.host, s.level, s.thicknessMm, noise), 3)}`
    );
    const file = `${s.id}.csv`;
    await Deno.writeTextFile(
      new URL(file, outDir),
      `Wavelength (nm),${s.id} %T\n${rows.join("\n")}\n`,
    );
    manifest.push(row(s, file, String(s.thicknessMm)));
  } else if (s.layout === "semicolon-preamble") {
    const rows = grid(350, 850, 2).map((nm) =>
      `${fmt(nm, 1)};${fmt(measuredT(nm, s.host, s.level, s.thicknessMm, noise), 5)}`.replace(
        /\./g,
        ",",
      )
    );
    const file = `${s.id}_scan.txt`;
    const preamble = [
      `Sample;${s.id}`,
      `Thickness (mm);${String(s.thicknessMm).replace(".", ",")}`,
      `Polarisation;${s.polarisation}`,
      "Operator;M. Okonkwo-Lind",
      "Slit (nm);1,0",
      "",
      "Wavelength (nm);T",
    ];
    await Deno.writeTextFile(
      new URL(file, outDir),
      `${preamble.join("\r\n")}\r\n${rows.join("\r\n")}\r\n`,
    );
    manifest.push(row(s, file, ""));
  } else if (s.layout === "tab-absorbance") {
    const rows = grid(320, 880, 0.5).reverse().map((nm) =>
      `${fmt(nm, 1)}\t${
        fmt(-Math.log10(Math.max(1e-6, measuredT(nm, s.host, s.level, s.thicknessMm, noise))), 5)
      }`
    );
    const file = `${s.id}.tsv`;
    await Deno.writeTextFile(
      new URL(file, outDir),
      `# descending scan\nnm\tAbsorbance\n${rows.join("\n")}\n`,
    );
    manifest.push(row(s, file, String(s.thicknessMm)));
  } else {
    const xs = grid(350, 850, 5);
    const ys = xs.map((nm) =>
      Math.round(10000 * measuredT(nm, s.host, s.level, s.thicknessMm, noise))
    );
    const lines = [];
    for (let i = 0; i < xs.length; i += 10) lines.push(`${xs[i]} ${ys.slice(i, i + 10).join(" ")}`);
    const file = `${s.id}.jdx`;
    await Deno.writeTextFile(
      new URL(file, outDir),
      [
        `##TITLE=${s.id}`,
        "##JCAMP-DX=4.24",
        "##DATA TYPE=UV/VIS SPECTRUM",
        "##ORIGIN=Brackenfield gem laboratory",
        `##$THICKNESS MM=${s.thicknessMm}`,
        "##XUNITS=NANOMETERS",
        "##YUNITS=TRANSMITTANCE",
        "##XFACTOR=1",
        "##YFACTOR=0.0001",
        `##FIRSTX=${xs[0]}`,
        `##LASTX=${xs[xs.length - 1]}`,
        `##NPOINTS=${xs.length}`,
        "##XYDATA=(X++(Y..Y))",
        ...lines,
        "##END=",
      ].join("\n") + "\n",
    );
    manifest.push(row(s, file, String(s.thicknessMm)));
  }
}

// Two deliberately damaged exports: a truncated upload with a garbled row, and a file that is
// not a spectrum at all (a photo saved with the wrong extension).
const good = grid(380, 780, 5).map((nm) =>
  `${nm},${fmt(100 * measuredT(nm, "corundum-cr", 0.2, 2, 0.0015), 3)}`
);
good.splice(40, 1, "580,8#.2");
await Deno.writeTextFile(
  new URL("TCW-R99_damaged.csv", outDir),
  `Wavelength (nm),%T\n${good.join("\n")}\n`,
);
await Deno.writeFile(
  new URL("TCW-R98_photo.csv", outDir),
  Uint8Array.from([
    0xff,
    0xd8,
    0xff,
    0xe0,
    0,
    16,
    74,
    70,
    73,
    70,
    0,
    1,
    ...Array.from({ length: 200 }, (_, i) => (i * 37) % 256),
  ]),
);
manifest.push(
  "TCW-R99,TCW-R99_damaged.csv,corundum,2,6,o,pink-sapphire,cr-corundum,upload was interrupted,boule B-26-04",
);
manifest.push(
  "TCW-R98,TCW-R98_photo.csv,corundum,2,6,o,pink-sapphire,cr-corundum,wrong file attached,boule B-26-04",
);
manifest.push(
  "TCW-R50,TCW-R50.csv,corundum,2.0,6,o,pink-sapphire,cr-corundum,stone listed but its export is missing,boule B-26-04",
);
await Deno.writeTextFile(new URL("manifest.csv", outDir), manifest.join("\n") + "\n");
await Deno.writeTextFile(
  new URL("settings.yaml", outDir),
  `# Demo batch settings (invented scenario). Targets are the workshop's own colour goals.
illuminants: [D65, A]
observers: ["2", "10"]
change: { from: D65, to: A, observer: "10" }
reflection: host
calibrations:
  cr-corundum: ../../reports/demo/cr-calibration.json
targets:
  pink-sapphire: { under: { D65: [45, 15, 6], A: [47, 27, 4] }, observer: "10", toleranceDE00: 3 }
# standard uncertainties: photometric noise estimated per spectrum, the workshop's gauge and cut
uncertainty: { thicknessSdMm: 0.01, pathSdMm: 0.05 }
report:
  title: Colour statement, lot TCW-26-11
  lab: Tessel Creek gem laboratory (invented)
  audience: internal
  note: Invented demonstration lot; the numbers are measurement aids, not a grading.
`,
);
// Analysed standards (invented values: Cr2O3 by an outside laboratory, with its uncertainty),
// 2.00 mm slabs measured like the lot; the calibration the batch uses is made from them.
const lab = new URL("./standards/", import.meta.url);
await Deno.mkdir(lab, { recursive: true });
const standards = [[0.05, 0.004], [0.1, 0.006], [0.2, 0.01], [0.35, 0.015], [0.5, 0.02]];
const sheet = ["sample,Cr2O3 (wt%),concentration_sigma,file,thickness_mm"];
for (const [i, [level, sigma]] of standards.entries()) {
  const id = `STD-${i + 1}`;
  const rows = grid(350, 850, 1).map((nm) =>
    `${nm},${fmt(measuredT(nm, "corundum-cr", level! * (1 + 0.02 * gauss()), 2, 0.0015), 5)}`
  );
  await Deno.writeTextFile(new URL(`${id}.csv`, lab), `Wavelength (nm),T\n${rows.join("\n")}\n`);
  sheet.push(`${id},${level},${sigma},${id}.csv,2.00`);
}
await Deno.writeTextFile(new URL("standards.csv", lab), sheet.join("\n") + "\n");

// Unit absorption spectra for "crystint aim": α per wt% of each dopant (the Ti band is an
// invented model of the same kind), and a measured Cr profile along boule B-26-04.
const unit = new URL("./unit/", import.meta.url);
await Deno.mkdir(unit, { recursive: true });
const alphaFile = (f: (nm: number) => number) =>
  `Wavelength (nm),alpha (cm-1)\n${
    grid(360, 830, 2).map((nm) => `${nm},${fmt(f(nm), 5)}`).join("\n")
  }\n`;
await Deno.writeTextFile(
  new URL("cr_in_corundum.csv", unit),
  alphaFile((nm) => alphaAt(nm, "corundum-cr", 1) - 0.04 * (500 / nm) ** 4),
);
const tiBand = (nm: number) =>
  8 * Math.exp(-0.5 * ((1e7 / nm - 20300) / (5000 / (2 * Math.sqrt(2 * Math.LN2)))) ** 2);
await Deno.writeTextFile(new URL("ti_in_corundum.csv", unit), alphaFile(tiBand));
const profile = ["position_mm,concentration,sigma"];
for (let mm = 5; mm <= 75; mm += 7) {
  const c = 0.3 * 0.62 * (1 - mm / 80) ** (0.62 - 1);
  profile.push(`${mm},${fmt(c * (1 + 0.02 * gauss()), 4)},${fmt(0.02 * c, 4)}`);
}
await Deno.writeTextFile(new URL("boule_B-26-04_profile.csv", unit), profile.join("\n") + "\n");
console.log(`wrote ${stones.length + 2} exports and manifest.csv to spectra/demo/`);

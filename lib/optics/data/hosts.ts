/**
 * Refractive-index fits of common host crystals (λ in µm). One entry per host; uniaxial hosts
 * give `o` and `e`, biaxial chrysoberyl gives its three principal axes.
 * Forms: "sellmeier-c" n² − 1 = Σ Bᵢλ²/(λ² − Cᵢ²) (Cᵢ in µm);
 *        "sellmeier-a" n² = A + Σ Bᵢλ²/(λ² − Cᵢ) (Cᵢ in µm²);
 *        "sellmeier-d" n² = A + Bλ²/(λ² − C) − Dλ² (C in µm², D in µm⁻²);
 *        "constant" n independent of λ.
 *
 * @module
 */

/** One dispersion formula with its coefficients. */
export type Dispersion =
  | { form: "sellmeier-c"; b: number[]; c: number[] }
  | { form: "sellmeier-a"; a: number; b: number[]; c: number[] }
  | { form: "sellmeier-d"; a: number; b: number; c: number; d: number }
  | { form: "constant"; n: number };

/** A host crystal and the source of its indices. */
export interface HostEntry {
  /** Host name. */
  name: string;
  /** Other names it is known by. */
  aliases: string[];
  /** Chemical formula. */
  formula: string;
  /** Optical class. */
  optics: "isotropic" | "uniaxial" | "biaxial";
  /** Principal directions: `n` (isotropic), `o`/`e` (uniaxial), `a`/`b`/`c` (biaxial). */
  axes: Record<string, Dispersion>;
  /** Wavelength range of the dispersion fit, µm. */
  validUm: [number, number];
  /** Published source of the dispersion formula. */
  source: string;
}

export const HOSTS: HostEntry[] = [
  {
    name: "corundum",
    aliases: ["sapphire", "ruby", "al2o3", "alumina"],
    formula: "Al2O3",
    optics: "uniaxial",
    axes: {
      o: {
        form: "sellmeier-c",
        b: [1.4313493, 0.65054713, 5.3414021],
        c: [0.0726631, 0.1193242, 18.028251],
      },
      e: {
        form: "sellmeier-c",
        b: [1.5039759, 0.55069141, 6.5927379],
        c: [0.0740288, 0.1216529, 20.072248],
      },
    },
    validUm: [0.2, 5.0],
    source:
      "Malitson & Dodge, J. Opt. Soc. Am. 62, 1405 (1972); equation as given by Dodge in CRC Handbook of Laser Science and Technology IV (1986)",
  },
  {
    name: "yag",
    aliases: ["garnet", "y3al5o12", "yttrium aluminium garnet"],
    formula: "Y3Al5O12",
    optics: "isotropic",
    axes: { n: { form: "sellmeier-a", a: 1, b: [2.282, 3.27644], c: [0.01185, 282.734] } },
    validUm: [0.4, 5.0],
    source: "Zelmon, Small & Page, Appl. Opt. 37, 4933 (1998)",
  },
  {
    name: "spinel",
    aliases: ["mgal2o4"],
    formula: "MgAl2O4",
    optics: "isotropic",
    axes: { n: { form: "sellmeier-c", b: [1.8938, 3.0755], c: [0.09942, 15.826] } },
    validUm: [0.35, 5.5],
    source: "Tropf & Thomas, in Palik (ed.), Handbook of Optical Constants of Solids II (1991)",
  },
  {
    name: "chrysoberyl",
    aliases: ["alexandrite", "beal2o4"],
    formula: "BeAl2O4",
    optics: "biaxial",
    axes: {
      a: { form: "sellmeier-d", a: 1.78522, b: 1.21202, c: 0.01262, d: 0.01681 },
      b: { form: "sellmeier-d", a: 1.58829, b: 1.42711, c: 0.01113, d: 0.01696 },
      c: { form: "sellmeier-d", a: 1.7069, b: 1.28477, c: 0.01169, d: 0.0176 },
    },
    validUm: [0.25, 2.6],
    source:
      "Loiko & Major, Opt. Mater. Express 6, 2177 (2016), fit to the indices of Walling et al., IEEE J. Quantum Electron. 16, 1302 (1980)",
  },
  {
    name: "quartz",
    aliases: ["sio2", "crystal quartz"],
    formula: "SiO2",
    optics: "uniaxial",
    axes: {
      o: {
        form: "sellmeier-a",
        a: 1.28604141,
        b: [1.07044083, 1.10202242],
        c: [1.00585997e-2, 100],
      },
      e: {
        form: "sellmeier-a",
        a: 1.28851804,
        b: [1.09509924, 1.15662475],
        c: [1.02101864e-2, 100],
      },
    },
    validUm: [0.198, 2.05],
    source: "Ghosh, Opt. Commun. 163, 95 (1999)",
  },
  {
    name: "beryl",
    aliases: ["emerald", "aquamarine", "be3al2si6o18"],
    formula: "Be3Al2Si6O18",
    optics: "uniaxial",
    axes: { o: { form: "constant", n: 1.577 }, e: { form: "constant", n: 1.571 } },
    validUm: [0.2, 3.0],
    source:
      "No published Sellmeier fit found; constant typical indices n_o 1.577, n_e 1.571 (from memory, gemmological handbooks give 1.56–1.60)",
  },
];

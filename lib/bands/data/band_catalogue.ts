/**
 * Known absorption bands of dopant ions in oxide hosts (room temperature, approximate).
 * Every entry carries its source; `status` says whether the position was confirmed in public
 * material ("published": the source was read for this entry, 2026-12-02) or is recalled
 * ("from memory, unverified"). Widths are rough in every case. Positions and widths are for
 * assignment hints, never check values; an unverified entry never makes a hint on its own
 * (see assign_bands.ts).
 *
 * @module
 */

/** One catalogue band. */
export interface CatalogueBand {
  /** Ion. */
  ion: string;
  /** Host crystal. */
  host: string;
  /** Transition or band name. */
  transition: string;
  /** Centre, cm⁻¹. */
  centerCm1: number;
  /** Typical width, cm⁻¹. */
  fwhmCm1: number;
  /** Polarisation behaviour in words (E⊥c = ordinary ray, E∥c = extraordinary). */
  polarisation: string;
  /** When the position holds for one polarisation only: "o" (E⊥c) or "e" (E∥c). */
  ray?: "o" | "e";
  /** A component seen only beside another band of the same ion: that band's transition. */
  requires?: string;
  /** Where the figures come from. */
  source: string;
  /** published, or from memory (unverified). */
  status: "published" | "from memory, unverified";
}

export const BAND_CATALOGUE: CatalogueBand[] = [
  {
    ion: "Cr3+",
    host: "corundum",
    transition: "4A2→4T2 (U band)",
    centerCm1: 18300,
    fwhmCm1: 2800,
    polarisation: "E⊥c ≈ 555 nm, E∥c ≈ 565 nm, stronger E⊥c (from memory)",
    source:
      "U band assigned to 4T2, E(4T2) = 10Dq with Dq 1830 cm⁻¹ fitted to the observed bands: Reddy & Rama Moorthy, Pramana 19, 449 (1982); width from memory",
    status: "published",
  },
  {
    ion: "Cr3+",
    host: "corundum",
    transition: "4A2→4T1 (Y band)",
    centerCm1: 24600,
    fwhmCm1: 3200,
    polarisation: "E⊥c ≈ 407 nm, E∥c ≈ 400 nm",
    source: "Reddy & Rama Moorthy, Pramana 19, 449 (1982)",
    status: "from memory, unverified",
  },
  {
    ion: "Cr3+",
    host: "corundum",
    transition: "4A2→2E (R1, R2 lines)",
    centerCm1: 14410,
    fwhmCm1: 15,
    polarisation: "R1 694.3 nm, R2 692.9 nm",
    source: "ruby R lines (textbook values)",
    status: "from memory, unverified",
  },
  {
    ion: "Cr3+",
    host: "corundum",
    transition: "4A2→2T2 (B1, B2 lines)",
    centerCm1: 21030,
    fwhmCm1: 40,
    polarisation: "B1 20,993 cm⁻¹, B2 21,068 cm⁻¹ (at 2 K); width from memory",
    source:
      "Magnetic- and electric-field effects of the B1 and B2 lines in ruby, Phys. Rev. 135, A950 (1964)",
    status: "published",
  },
  {
    ion: "Ti3+",
    host: "corundum",
    transition: "2T2→2E (Jahn–Teller split)",
    centerCm1: 20400,
    fwhmCm1: 5000,
    polarisation: "π (E∥c) ≈ 2× σ (from memory); shoulder near 560 nm",
    source:
      "pump band peaking at 490 nm: Moulton et al., Opt. Mater. Express 9, 2216 (2019); width from memory",
    status: "published",
  },
  {
    ion: "Ti3+",
    host: "corundum",
    transition: "2T2→2E upper component",
    centerCm1: 17860,
    fwhmCm1: 4000,
    polarisation: "shoulder of the 490 nm band, near 560 nm",
    requires: "2T2→2E (Jahn–Teller split)",
    source:
      "peaks at 485 and 560 nm typical of Ti3+ in corundum, as cited from Gems & Gemology (after McClure 1962; Townsend 1968); width from memory",
    status: "published",
  },
  {
    ion: "Ti3+ (pairs)",
    host: "corundum",
    transition: "residual near-infrared absorption",
    centerCm1: 12500,
    fwhmCm1: 4000,
    polarisation: "limits the laser figure of merit",
    source:
      "weak broad absorption peaking near 800 nm, lower limit set by Ti3+ pairs: Moulton et al., Opt. Mater. Express 9, 2216 (2019); width from memory",
    status: "published",
  },
  {
    ion: "Ti3+ (pairs)",
    host: "corundum",
    transition: "pair absorption ∝ [Ti3+]²",
    centerCm1: 23500,
    fwhmCm1: 4000,
    polarisation: "",
    source:
      "absorption centred around 400–450 nm growing as the square of the Ti3+ level: Moulton et al., Opt. Mater. Express 9, 2216 (2019); width from memory",
    status: "published",
  },
  {
    ion: "Fe3+",
    host: "corundum",
    transition: "6A1→4A1,4E (sharp)",
    centerCm1: 26500,
    fwhmCm1: 500,
    polarisation: "weak dichroism",
    source: "Ferguson & Fielding, Aust. J. Chem. 25, 1371 (1972)",
    status: "from memory, unverified",
  },
  {
    ion: "Fe3+",
    host: "corundum",
    transition: "Fe3+–Fe3+ pair band",
    centerCm1: 25800,
    fwhmCm1: 600,
    polarisation: "weak dichroism",
    source: "Ferguson & Fielding, Aust. J. Chem. 25, 1371 (1972)",
    status: "from memory, unverified",
  },
  {
    ion: "Fe3+",
    host: "corundum",
    transition: "6A1→4T2",
    centerCm1: 22200,
    fwhmCm1: 1500,
    polarisation: "weak dichroism",
    source: "Ferguson & Fielding, Aust. J. Chem. 25, 1371 (1972)",
    status: "from memory, unverified",
  },
  {
    ion: "Fe3+",
    host: "corundum",
    transition: "Fe3+–Fe3+ pair band",
    centerCm1: 17600,
    fwhmCm1: 1500,
    polarisation: "",
    source: "after Ferguson & Fielding (1972)",
    status: "published",
  },
  {
    ion: "Fe2+–Ti4+",
    host: "corundum",
    transition: "intervalence charge transfer",
    centerCm1: 17760,
    fwhmCm1: 4500,
    polarisation: "unpolarised or E⊥c; E∥c lies lower, see the two entries below",
    source:
      "broad band at 563 nm from Fe2+–Ti4+ charge transfer in heat-treated sapphire (study on low-temperature heat treatment of purplish red sapphire); first explained by Townsend, Solid State Commun. 6, 81 (1968); width from memory",
    status: "published",
  },
  {
    ion: "Fe2+–Ti4+",
    host: "corundum",
    transition: "intervalence charge transfer, E⊥c",
    centerCm1: 17400,
    fwhmCm1: 4500,
    polarisation: "E⊥c ≈ 565–580 nm",
    ray: "o",
    source: "Townsend, Solid State Commun. 6, 81 (1968)",
    status: "from memory, unverified",
  },
  {
    ion: "Fe2+–Ti4+",
    host: "corundum",
    transition: "intervalence charge transfer, E∥c",
    centerCm1: 14100,
    fwhmCm1: 4500,
    polarisation: "E∥c ≈ 700–720 nm",
    ray: "e",
    source: "Townsend, Solid State Commun. 6, 81 (1968)",
    status: "from memory, unverified",
  },
  {
    ion: "V3+",
    host: "corundum",
    transition: "d–d band near 418 nm",
    centerCm1: 23920,
    fwhmCm1: 3000,
    polarisation: "",
    source:
      "absorption peak at 418 nm from V3+ d–d transitions: blue sapphires of the Baw-Mar mine, Mogok, Crystals (2021); width from memory",
    status: "published",
  },
  {
    ion: "Ni2+",
    host: "corundum",
    transition: "band near 946 nm",
    centerCm1: 10570,
    fwhmCm1: 2500,
    polarisation: "",
    source:
      "946 nm absorption from Ni2+: blue sapphires of the Baw-Mar mine, Mogok, Crystals (2021); width from memory",
    status: "published",
  },
  {
    ion: "V3+",
    host: "corundum",
    transition: "3T1→3T2",
    centerCm1: 17400,
    fwhmCm1: 2800,
    polarisation: "",
    source: "McClure, J. Chem. Phys. 36, 2757 (1962)",
    status: "from memory, unverified",
  },
  {
    ion: "V3+",
    host: "corundum",
    transition: "3T1→3T1(P)",
    centerCm1: 25200,
    fwhmCm1: 3000,
    polarisation: "",
    source: "McClure, J. Chem. Phys. 36, 2757 (1962)",
    status: "from memory, unverified",
  },
  {
    ion: "Cr3+",
    host: "chrysoberyl",
    transition: "4A2→4T2",
    centerCm1: 17500,
    fwhmCm1: 2800,
    polarisation: "strongly pleochroic",
    source: "Farrell & Newnham, Am. Mineral. 50, 1972 (1965)",
    status: "from memory, unverified",
  },
  {
    ion: "Cr3+",
    host: "chrysoberyl",
    transition: "4A2→4T1",
    centerCm1: 23800,
    fwhmCm1: 3200,
    polarisation: "strongly pleochroic",
    source: "Farrell & Newnham, Am. Mineral. 50, 1972 (1965)",
    status: "from memory, unverified",
  },
  {
    ion: "Cr3+",
    host: "chrysoberyl",
    transition: "R lines",
    centerCm1: 14690,
    fwhmCm1: 20,
    polarisation: "680 / 678 nm",
    source: "Farrell & Newnham (1965)",
    status: "from memory, unverified",
  },
  {
    ion: "Cr3+",
    host: "beryl",
    transition: "4A2→4T2",
    centerCm1: 16500,
    fwhmCm1: 2600,
    polarisation: "",
    source: "Wood & Nassau, Am. Mineral. 53, 777 (1968)",
    status: "from memory, unverified",
  },
  {
    ion: "Cr3+",
    host: "beryl",
    transition: "4A2→4T1",
    centerCm1: 23300,
    fwhmCm1: 3200,
    polarisation: "",
    source: "Wood & Nassau, Am. Mineral. 53, 777 (1968)",
    status: "from memory, unverified",
  },
  {
    ion: "Co2+ (tetrahedral)",
    host: "spinel",
    transition: "4A2→4T1(P), three components",
    centerCm1: 18000,
    fwhmCm1: 900,
    polarisation: "isotropic host",
    source: "D'Ippolito et al., Phys. Chem. Minerals 42, 431 (2015)",
    status: "published",
  },
  {
    ion: "Co2+ (tetrahedral)",
    host: "spinel",
    transition: "4A2→4T1(P)",
    centerCm1: 17000,
    fwhmCm1: 900,
    polarisation: "isotropic host",
    source: "D'Ippolito et al., Phys. Chem. Minerals 42, 431 (2015)",
    status: "published",
  },
  {
    ion: "Co2+ (tetrahedral)",
    host: "spinel",
    transition: "4A2→4T1(P)",
    centerCm1: 16000,
    fwhmCm1: 900,
    polarisation: "isotropic host",
    source: "D'Ippolito et al., Phys. Chem. Minerals 42, 431 (2015)",
    status: "published",
  },
  {
    ion: "Cr3+",
    host: "spinel",
    transition: "4A2→4T2",
    centerCm1: 18500,
    fwhmCm1: 2600,
    polarisation: "isotropic host",
    source: "Wood et al., J. Chem. Phys. 48, 5255 (1968)",
    status: "from memory, unverified",
  },
  {
    ion: "Cr3+",
    host: "spinel",
    transition: "4A2→4T1",
    centerCm1: 25000,
    fwhmCm1: 3000,
    polarisation: "isotropic host",
    source: "Wood et al., J. Chem. Phys. 48, 5255 (1968)",
    status: "from memory, unverified",
  },
  {
    ion: "Nd3+",
    host: "yag",
    transition: "4I9/2→4F5/2,2H9/2 (808 nm pump band)",
    centerCm1: 12370,
    fwhmCm1: 30,
    polarisation: "isotropic host",
    source: "laser handbook value, mean σ 3.4e-20 cm²",
    status: "published",
  },
  {
    ion: "Mn3+",
    host: "corundum",
    transition: "5E→5T2",
    centerCm1: 20000,
    fwhmCm1: 4000,
    polarisation: "",
    source: "general crystal-field literature",
    status: "from memory, unverified",
  },
  {
    ion: "Ni2+",
    host: "spinel",
    transition: "3A2→3T1(P) (octahedral)",
    centerCm1: 26000,
    fwhmCm1: 3000,
    polarisation: "",
    source: "general crystal-field literature",
    status: "from memory, unverified",
  },
];

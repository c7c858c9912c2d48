#!/usr/bin/python3
"""Writes test/fixtures/colour/*.csv and argyll_reference.json.

Each fixture is a synthetic transmittance spectrum of a stated shape (bands Gaussian in
wavenumber, edges, notches, ripple) on a stated grid. The reference XYZ come from Argyll CMS
`spec2cie` (Debian package argyll), fed the same analytic spectrum sampled at 1 nm over the
fixture's range. For 1 nm fixtures both tools see identical samples; for the coarser and the
irregular grids the check is that crystint's interpolation (Sprague, Lagrange, PCHIP) of the
samples reproduces the colour of the underlying curve. (spec2cie itself interpolates coarse
data linearly, which is why it is given the 1 nm curve rather than the coarse samples.)
Run: /usr/bin/python3 tools/make_colour_fixtures.py   (needs argyll installed)
"""
import json, math, pathlib, subprocess, tempfile

root = pathlib.Path(__file__).resolve().parent.parent
out = root / "test" / "fixtures" / "colour"


def band(nm, centre_nm, fwhm_cm1, peak):
    """Absorbance of a band Gaussian in wavenumber."""
    nu, nu0 = 1e7 / nm, 1e7 / centre_nm
    s = fwhm_cm1 / (2 * math.sqrt(2 * math.log(2)))
    return peak * math.exp(-0.5 * ((nu - nu0) / s) ** 2)


def from_abs(*bands, base=0.0):
    return lambda nm: 10 ** -(base + sum(band(nm, *b) for b in bands))


def edge(at, width, lo, hi):
    return lambda nm: lo + (hi - lo) / (1 + math.exp(-(nm - at) / width))


def grid(start, end, step):
    n = int(round((end - start) / step))
    return [start + i * step for i in range(n + 1)]


def pixel_grid(start, end):
    """An instrument-like irregular grid: pixel spacing drifting from 0.42 to 0.61 nm."""
    xs, x, i = [], start, 0
    while x <= end:
        xs.append(round(x, 4))
        x += 0.42 + 0.19 * (x - start) / (end - start) + 0.013 * math.sin(i * 0.7)
        i += 1
    return xs


def sparse_grid(start, end):
    """An irregular grid with steps between 0.7 and 3.3 nm."""
    xs, x, i = [], start, 0
    while x <= end:
        xs.append(round(x, 3))
        x += 2.0 + 1.3 * math.sin(i * 1.3)
        i += 1
    return xs


FIXTURES = [
    ("cr_corundum_1nm", grid(360, 830, 1), from_abs((555, 2800, 0.9), (407, 3200, 1.2), base=0.05)),
    ("cr_corundum_5nm", grid(360, 830, 5), from_abs((555, 2800, 0.9), (407, 3200, 1.2), base=0.05)),
    ("r_line_1nm", grid(360, 830, 1), from_abs((694.3, 30, 1.5), (560, 2600, 0.4))),
    ("cutoff_550_1nm", grid(360, 830, 1), edge(550, 2, 0.001, 0.92)),
    ("cutoff_450_2nm", grid(360, 830, 2), edge(450, 3, 0.0, 0.9)),
    ("ti_blue_2nm", grid(360, 830, 2), from_abs((490, 4500, 1.1), (560, 3000, 0.4))),
    ("co_spinel_1nm", grid(360, 830, 1), from_abs((555, 900, 0.8), (588, 800, 1.0), (625, 900, 0.9))),
    ("neutral_grey_5nm", grid(360, 830, 5), lambda nm: 0.3),
    ("notch_589_5nm", grid(360, 830, 5), from_abs((589, 300, 1.5))),
    ("uv_edge_band_5nm_380_780", grid(380, 780, 5), lambda nm: edge(400, 8, 0.02, 0.9)(nm) * from_abs((600, 3000, 0.5))(nm)),
    ("pixels_broad", pixel_grid(350.0, 850.0), from_abs((560, 2600, 0.8), (410, 3000, 1.0))),
    ("pixels_narrow", pixel_grid(350.0, 850.0), from_abs((694.3, 40, 1.2), (480, 600, 0.7))),
    ("red_edge_1nm", grid(360, 830, 1), edge(610, 6, 0.01, 0.88)),
    ("dark_stone_1nm", grid(360, 830, 1), from_abs((560, 5000, 1.8), base=1.0)),
    ("pale_1nm", grid(360, 830, 1), from_abs((575, 3000, 0.05), base=0.02)),
    ("fe_triplet_1nm", grid(360, 830, 1), from_abs((377, 500, 1.0), (388, 400, 0.8), (450, 450, 0.6))),
    ("ramp_2nm", grid(360, 830, 2), lambda nm: 0.05 + 0.9 * (nm - 360) / 470),
    ("fringes_1nm", grid(360, 830, 1), lambda nm: 0.8 + 0.1 * math.cos(2 * math.pi * 2 * 1.76 * 0.05e7 / nm)),
    ("colour_change_5nm", grid(360, 830, 5), from_abs((580, 2600, 1.3), (420, 3000, 1.4))),
    ("green_beryl_2nm", grid(360, 830, 2), from_abs((610, 2400, 0.9), (430, 3000, 0.8))),
    ("broad_10nm", grid(360, 830, 10), from_abs((560, 3000, 0.7), (420, 3500, 0.9))),
    ("broad_20nm", grid(360, 820, 20), from_abs((540, 7000, 0.6))),
    ("sparse_edge", sparse_grid(360.0, 830.0), edge(520, 5, 0.05, 0.85)),
    ("visible_only_1nm_400_700", grid(400, 700, 1), from_abs((530, 2800, 0.6))),
]


def write_sp(path, xs, vals):
    n = len(xs)
    names = " ".join(f"SPEC_{int(round(x))}" for x in xs)
    path.write_text(
        "SPECT\n\nDESCRIPTOR \"fixture\"\nORIGINATOR \"crystint\"\n"
        "KEYWORD \"MEAS_TYPE\"\nMEAS_TYPE \"TRANSMISSIVE\"\n"
        f"KEYWORD \"SPECTRAL_BANDS\"\nSPECTRAL_BANDS \"{n}\"\n"
        f"KEYWORD \"SPECTRAL_START_NM\"\nSPECTRAL_START_NM \"{xs[0]:f}\"\n"
        f"KEYWORD \"SPECTRAL_END_NM\"\nSPECTRAL_END_NM \"{xs[-1]:f}\"\n"
        "KEYWORD \"SPECTRAL_NORM\"\nSPECTRAL_NORM \"1.0\"\n"
        f"NUMBER_OF_FIELDS {n}\nBEGIN_DATA_FORMAT\n{names}\nEND_DATA_FORMAT\n\n"
        "NUMBER_OF_SETS 1\nBEGIN_DATA\n" + " ".join(f"{v:.9f}" for v in vals) + "\nEND_DATA\n")


def argyll_xyz(xs, vals, illuminant, observer):
    with tempfile.TemporaryDirectory() as d:
        src, dst = pathlib.Path(d) / "in.sp", pathlib.Path(d) / "out.sp"
        write_sp(src, xs, vals)
        subprocess.run(["spec2cie", "-n", "-i", illuminant, "-o", observer, str(src), str(dst)],
                       check=True, capture_output=True)
        body = dst.read_text().split("BEGIN_DATA\n")[1].split("END_DATA")[0].split()
        return [round(float(v) * 100, 5) for v in body[:3]]


reference = {}
for name, xs, f in FIXTURES:
    values = [f(x) for x in xs]
    (out / f"{name}.csv").write_text(
        "wavelength_nm,T\n" + "".join(f"{x:g},{v:.8f}\n" for x, v in zip(xs, values)))
    ax = grid(math.ceil(xs[0]), math.floor(xs[-1]), 1)
    av = [f(x) for x in ax]
    reference[name] = {
        f"{il}/{ob}": argyll_xyz(ax, av, il, o)
        for il in ("D65", "A") for ob, o in (("2", "1931_2"), ("10", "1964_10"))
    }
    reference[name]["argyllInput"] = f"analytic curve at 1 nm, {ax[0]}-{ax[-1]} nm"

whites = {
    f"{il}/{ob}": argyll_xyz(grid(360, 830, 1), [1.0] * 471, il, o)
    for il in ("D65", "A") for ob, o in (("2", "1931_2"), ("10", "1964_10"))
}
version = subprocess.run(["dpkg-query", "-W", "-f=${Version}", "argyll"], capture_output=True, text=True).stdout
(out / "argyll_reference.json").write_text(json.dumps({
    "tool": f"Argyll CMS spec2cie (Debian argyll {version})",
    "options": "spec2cie -n -i <D65|A> -o <1931_2|1964_10>; XYZ scaled x100 (Y = 100 for T = 1)",
    "whites": whites,
    "fixtures": reference,
}, indent=1) + "\n")
print(len(reference), "fixtures")

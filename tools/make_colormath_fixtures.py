#!/usr/bin/python3
"""Writes test/fixtures/colormath/reference.json from Debian's python3-colormath.

Holds (a) colormath's 10 nm CIE observer and illuminant tables, an independent copy
used to check crystint's stored tables, and (b) ΔE*ab, CIE94 and CMC(l:c) values colormath
computes for a fixed set of CIELAB pairs.
Run: /usr/bin/python3 tools/make_colormath_fixtures.py   (needs python3-colormath installed)
"""
import json, pathlib, random, subprocess
import numpy

if not hasattr(numpy, "asscalar"):  # colormath 3.0 calls numpy.asscalar, removed in numpy 1.23
    numpy.asscalar = lambda a: a.item()
import colormath.spectral_constants as sc
from colormath.color_objects import LabColor
from colormath.color_diff import delta_e_cie1976, delta_e_cie1994, delta_e_cmc

root = pathlib.Path(__file__).resolve().parent.parent
wl = list(range(340, 831, 10))
tables = {
    "observer2": {"x": list(map(float, sc.STDOBSERV_X2)), "y": list(map(float, sc.STDOBSERV_Y2)), "z": list(map(float, sc.STDOBSERV_Z2))},
    "observer10": {"x": list(map(float, sc.STDOBSERV_X10)), "y": list(map(float, sc.STDOBSERV_Y10)), "z": list(map(float, sc.STDOBSERV_Z10))},
    "illuminants": {k: list(map(float, getattr(sc, f"REFERENCE_ILLUM_{k}"))) for k in ["A", "C", "D50", "D65", "F2", "F7", "F11"]},
}
rng = random.Random(20261202)
pairs = []
for _ in range(40):
    l1 = [rng.uniform(5, 95), rng.uniform(-80, 80), rng.uniform(-80, 80)]
    l2 = [l1[0] + rng.uniform(-8, 8), l1[1] + rng.uniform(-10, 10), l1[2] + rng.uniform(-10, 10)]
    c1, c2 = LabColor(*l1), LabColor(*l2)
    pairs.append({
        "lab1": l1, "lab2": l2,
        "dE76": float(delta_e_cie1976(c1, c2)),
        "dE94": float(delta_e_cie1994(c1, c2)),
        "cmc21": float(delta_e_cmc(c1, c2, pl=2, pc=1)),
        "cmc11": float(delta_e_cmc(c1, c2, pl=1, pc=1)),
    })
version = subprocess.run(["dpkg-query", "-W", "-f=${Version}", "python3-colormath"], capture_output=True, text=True).stdout
out = root / "test" / "fixtures" / "colormath" / "reference.json"
out.write_text(json.dumps({"tool": f"python3-colormath {version} (Debian)", "wavelengthNm": wl, **tables, "pairs": pairs}, indent=1) + "\n")
print("written", out)

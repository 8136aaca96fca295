"""A notebook-style tour of the tensorsieve Python module (plain Python: run it
cell by cell in a notebook, or as a script).

1. write a few invented perovskite-like structures as mCIF files,
2. screen them for the anomalous Hall effect and the linear magnetoelectric
   effect, in the bulk and as (001) films,
3. take one allowed form as sympy expressions, evaluate an angle dependence
   (with numpy arrays when numpy is installed, plain lists without) and plot it
   with matplotlib if that is installed.

The structures are invented for this example: a cubic ABO3 cell (a = 3.9 A)
with a moment on B, once ferromagnetic along [001], once ferromagnetic along
[111], and once as a two-sublattice antiferromagnet in a doubled cell.
"""

import math
import os
import tempfile

import sympy

import tensorsieve as ts

# %% 1. invented structures
CELL = """data_{name}
_cell_length_a 3.9
_cell_length_b 3.9
_cell_length_c {c}
_cell_angle_alpha 90
_cell_angle_beta 90
_cell_angle_gamma 90
loop_
_atom_site_label
_atom_site_type_symbol
_atom_site_fract_x
_atom_site_fract_y
_atom_site_fract_z
{atoms}
loop_
_atom_site_moment.label
_atom_site_moment.crystalaxis_x
_atom_site_moment.crystalaxis_y
_atom_site_moment.crystalaxis_z
{moments}
"""
ONE_CELL = "A1 A 0 0 0\nB1 B 0.5 0.5 0.5\nO1 O 0.5 0.5 0\nO2 O 0.5 0 0.5\nO3 O 0 0.5 0.5"
TWO_CELLS = ("A1 A 0 0 0\nA2 A 0 0 0.5\nB1 B 0.5 0.5 0.25\nB2 B 0.5 0.5 0.75\n"
             "O1 O 0.5 0.5 0\nO2 O 0.5 0.5 0.5\nO3 O 0.5 0 0.25\nO4 O 0.5 0 0.75\nO5 O 0 0.5 0.25\nO6 O 0 0.5 0.75")
structures = {
    "fm-001": CELL.format(name="fm_001", c=3.9, atoms=ONE_CELL, moments="B1 0 0 3"),
    "fm-111": CELL.format(name="fm_111", c=3.9, atoms=ONE_CELL, moments="B1 1.7 1.7 1.7"),
    "afm-001": CELL.format(name="afm_001", c=7.8, atoms=TWO_CELLS, moments="B1 0 0 3\nB2 0 0 -3"),
}
folder = tempfile.mkdtemp(prefix="tensorsieve-example-")
for name, text in structures.items():
    with open(os.path.join(folder, name + ".mcif"), "w") as f:
        f.write(text)

# %% 2. screening: one dict per file
rows = ts.screen([folder], ["anomalous-hall", "linear-magnetoelectric"], cuts=["(001)"])
for row in rows:
    bulk = row["responses"]
    film = row["cuts"][0]
    print(f"{os.path.basename(row['file']):12} {row['point_group']:9} BNS {row['bns_number']:8} "
          f"AHE {bulk['anomalous-hall']['independent']}  ME {bulk['linear-magnetoelectric']['independent']}  "
          f"(001) film {film['point_group']}: AHE {film['responses']['anomalous-hall']['independent']}")

# %% 3. an angle dependence from an exact form
# Second-harmonic generation in a 4m'm' film (the (001) film of the first
# structure): P_i(2w) = d_ijk E_j E_k, with the field polarised in the xz
# plane at angle phi to the film plane, E = (cos phi, 0, sin phi) (idealised:
# refraction and Fresnel factors left out). SHG measurements use pulsed,
# often class-4 lasers: follow your local laser-safety rules and trained staff.
film_group = rows[[os.path.basename(r["file"]) for r in rows].index("fm-001.mcif")]["cuts"][0]["point_group"]
form = ts.form(film_group, "d_ijk: polar, sym(jk)")
print("allowed in", film_group, ":", ts.components(form))
phi = sympy.Symbol("phi")
E = [sympy.cos(phi), 0, sympy.sin(phi)]
d = {c["index"]: ts.expr(c["value"]) for c in form["components"]}  # sympy expressions
P = [sum(d.get(i + j + k, d.get(i + k + j, 0)) * E["xyz".index(j)] * E["xyz".index(k)]
         for j in "xyz" for k in "xyz") for i in "xyz"]
print("P(2w) =", [sympy.simplify(p) for p in P])
# Pick invented values for the parameters to draw the curve, and evaluate the
# intensity at 361 angles: a numpy array when numpy is installed, a list without.
intensity = sum(p**2 for p in P)
names = sorted(str(s) for s in intensity.free_symbols - {phi})
values = dict(zip(names, [1.0, 0.4, 0.7]))
print("invented values:", values)
try:
    import numpy as np
    angles = np.linspace(0, 2 * np.pi, 361)
except ImportError:
    angles = [2 * math.pi * k / 360 for k in range(361)]
curve = ts.evaluate(intensity, phi=angles, **values)
for deg in (0, 30, 90):
    print(f"phi = {deg:3d} deg: |P|^2 = {curve[deg]:.3f}")
try:
    import matplotlib
    matplotlib.use("Agg")
    import matplotlib.pyplot as plt
    plt.polar(angles, curve)
    plt.title(f"|P(2w)|^2 in {film_group}, invented parameters")
    plt.savefig(os.path.join(folder, "shg.png"))
    print("plot written to", os.path.join(folder, "shg.png"))
except ImportError:
    print("(matplotlib is not installed: no plot)")

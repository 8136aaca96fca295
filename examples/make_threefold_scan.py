#!/usr/bin/env python3
"""Writes threefold-film-scan.csv: an INVENTED transverse 2ω scan for the example
threefold-film-scan.toml. Nothing here was measured. The invented truth is a film
on (111) whose threefold axis is broken by a mirror-preserving distortion:
Y = -1.20 cos 3φ + 0.25 cos φ (µV), Gaussian noise σ = 0.05 µV, 36 bar angles,
seed 2026 (Python's random module, so the file is reproducible)."""
import math
import random

random.seed(2026)
lines = ["# INVENTED data for the example threefold-film-scan.toml (not a measurement):",
         "# Y = -1.20 cos 3phi + 0.25 cos phi (uV) + Gaussian noise, sigma 0.05 uV, seed 2026",
         "phi_deg, Y_uV, sigma_uV"]
for i in range(36):
    phi = 10.0 * i
    p = math.radians(phi)
    y = -1.20 * math.cos(3 * p) + 0.25 * math.cos(p) + random.gauss(0.0, 0.05)
    lines.append(f"{phi:.0f}, {y:.4f}, 0.05")
with open("threefold-film-scan.csv", "w") as f:
    f.write("\n".join(lines) + "\n")

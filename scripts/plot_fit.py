#!/usr/bin/env python3
"""Draw a rheometer fit: data and fitted curves (shear stress and viscosity
against shear rate, log-log) and the best law's residuals.

usage: plot_fit.py TABLE.csv IMAGE.png [TITLE]
TABLE.csv is written by `lentus fit`:
    kind,law,temperature [K],shear rate [1/s],shear stress [Pa],viscosity [Pa s],residual [%]
kind "data": a measured point (residual of the best law); kind "curve": a point of a
fitted law's curve. The first law named is the best.
"""
import csv
import math
import sys

import matplotlib

matplotlib.use("Agg")
import matplotlib.pyplot as plt  # noqa: E402

# Colour-blind-safe palette (Okabe & Ito) for temperatures; line styles for laws.
COLOURS = ["#0072B2", "#E69F00", "#009E73", "#D55E00", "#CC79A7", "#56B4E9", "#F0E442", "#000000"]
STYLES = ["-", "--", ":", "-."]


def main(argv):
    if len(argv) < 3:
        sys.stderr.write(__doc__)
        return 2
    table, image = argv[1], argv[2]
    title = argv[3] if len(argv) > 3 else "Fit"
    data, curves, laws, temperatures = [], [], [], []
    with open(table, newline="") as handle:
        rows = csv.reader(handle)
        next(rows)
        for kind, law, temperature, rate, stress, viscosity, residual in rows:
            t = float(temperature)
            key = None if math.isnan(t) else t
            if key not in temperatures:
                temperatures.append(key)
            if law not in laws:
                laws.append(law)
            point = (law, key, float(rate), float(stress), float(viscosity))
            if kind == "data":
                data.append(point + (float(residual),))
            else:
                curves.append(point)
    temperatures.sort(key=lambda t: -1 if t is None else t)

    figure, (stress_axis, viscosity_axis, residual_axis) = plt.subplots(
        3, 1, figsize=(6.4, 9.0), dpi=110, sharex=True, gridspec_kw={"height_ratios": [3, 3, 1.6]})
    for index, temperature in enumerate(temperatures):
        colour = COLOURS[index % len(COLOURS)]
        label = "" if temperature is None else " %.2f K" % temperature
        points = [p for p in data if p[1] == temperature]
        stress_axis.loglog([p[2] for p in points], [p[3] for p in points], "o", color=colour, mfc="none",
                           label="data" + label)
        viscosity_axis.loglog([p[2] for p in points], [p[4] for p in points], "o", color=colour, mfc="none")
        residual_axis.semilogx([p[2] for p in points], [p[5] for p in points], "o", color=colour, mfc="none")
        for law_index, law in enumerate(laws):
            line = [c for c in curves if c[0] == law and c[1] == temperature]
            if not line:
                continue
            style = STYLES[law_index % len(STYLES)]
            width = 2.0 if law_index == 0 else 1.2
            name = law + (" (best)" if law_index == 0 else "")
            stress_axis.loglog([c[2] for c in line], [c[3] for c in line], style, color=colour, lw=width,
                               label=name if index == 0 else None)
            viscosity_axis.loglog([c[2] for c in line], [c[4] for c in line], style, color=colour, lw=width)
    residual_axis.axhline(0.0, color="grey", lw=1)
    stress_axis.set_ylabel("shear stress [Pa]")
    viscosity_axis.set_ylabel("viscosity [Pa s]")
    residual_axis.set_ylabel("data / %s - 1 [%%]" % laws[0] if laws else "residual [%]", fontsize=8)
    residual_axis.set_xlabel("shear rate [1/s]")
    for axis in (stress_axis, viscosity_axis, residual_axis):
        axis.grid(True, which="both", alpha=0.3)
    stress_axis.legend(fontsize=8, loc="best")
    stress_axis.set_title(title + "\n(model estimates: check against measurements)", fontsize=10)
    figure.tight_layout()
    figure.savefig(image, format="png")
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv))

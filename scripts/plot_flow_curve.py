#!/usr/bin/env python3
"""Draw a flow curve: shear stress and viscosity against shear rate, log-log.

usage: plot_flow_curve.py DATA.csv IMAGE.png [TITLE]
DATA.csv has the header written by `lentus flow-curve`:
    shear rate [1/s],shear stress [Pa],viscosity [Pa s]
"""
import csv
import sys

import matplotlib

matplotlib.use("Agg")
import matplotlib.pyplot as plt  # noqa: E402


def main(argv):
    if len(argv) < 3:
        sys.stderr.write(__doc__)
        return 2
    data, image = argv[1], argv[2]
    title = argv[3] if len(argv) > 3 else "Flow curve"
    rate, stress, viscosity = [], [], []
    with open(data, newline="") as handle:
        rows = csv.reader(handle)
        next(rows)
        for row in rows:
            rate.append(float(row[0]))
            stress.append(float(row[1]))
            viscosity.append(float(row[2]))

    figure, stress_axis = plt.subplots(figsize=(6.4, 4.4), dpi=120)
    viscosity_axis = stress_axis.twinx()
    # Colour-blind-safe pair (blue, orange) and distinct line styles.
    stress_line = stress_axis.loglog(rate, stress, color="#0072B2", lw=2, label="shear stress")[0]
    viscosity_line = viscosity_axis.loglog(rate, viscosity, color="#E69F00", lw=2, ls="--", label="viscosity")[0]
    stress_axis.set_xlabel("shear rate [1/s]")
    stress_axis.set_ylabel("shear stress [Pa]", color="#0072B2")
    viscosity_axis.set_ylabel("viscosity [Pa s]", color="#E69F00")
    stress_axis.grid(True, which="both", alpha=0.3)
    stress_axis.legend(handles=[stress_line, viscosity_line], loc="lower center")
    stress_axis.set_title(title)
    figure.tight_layout()
    figure.savefig(image, format="png")
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv))

#!/usr/bin/env python3
"""Draw one design number of a sweep against a swept key, one curve per value of a
second swept key, from the results table `lentus sweep` writes.

usage: plot_sweep.py RESULTS.csv --number NAME --against KEY [--curves KEY] --output IMAGE.png

NAME is a design-number column without its unit ("pressure drop inlet to outlet"),
KEY a varied key as written in the sweep file ("Boundary conditions/Inflow rates").
Converged cases are filled markers; cases that did not converge are hollow markers
(their last iterate); bad-input and crashed cases have no numbers and are left out.
Logarithmic axes are chosen when positive values span a factor of 10 (x) or 20 (y) or more.
The picture carries the caution of the table's "caution" column (the full caution of
solver/report/caution.h), drawn under the axes and in the PNG's Description.
"""
import argparse
import csv
import sys
import textwrap

import matplotlib

matplotlib.use("Agg")
import matplotlib.pyplot as plt  # noqa: E402

# Colour-blind-safe palette (Okabe & Ito) and marker shapes, so curves differ in print too.
COLOURS = ["#0072B2", "#E69F00", "#009E73", "#D55E00", "#CC79A7", "#56B4E9", "#F0E442", "#000000"]
MARKERS = ["o", "s", "^", "D", "v", "P", "X", "*"]


def column(header, wanted):
    """Index of the column named `wanted`, with or without its ' [unit]'."""
    for index, name in enumerate(header):
        if name == wanted or name.split(" [")[0] == wanted:
            return index
    choices = ", ".join(name.split(" [")[0] for name in header)
    sys.exit(f"plot_sweep.py: no column '{wanted}' in the results table; columns: {choices}")


def number(text):
    try:
        return float(text)
    except ValueError:
        return None


def main():
    parser = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    parser.add_argument("table")
    parser.add_argument("--number", required=True)
    parser.add_argument("--against", required=True)
    parser.add_argument("--curves")
    parser.add_argument("--output", required=True)
    options = parser.parse_args()

    with open(options.table, newline="") as handle:
        rows = list(csv.reader(handle))
    header, rows = rows[0], rows[1:]
    y_column = column(header, options.number)
    x_column = column(header, options.against)
    c_column = column(header, options.curves) if options.curves else None
    status_column = column(header, "status")
    if not rows:
        sys.exit("plot_sweep.py: the results table has no rows")
    caution = "Caution: " + rows[0][column(header, "caution")]

    curves = {}
    for row in rows:
        y = number(row[y_column])
        if y is None or row[status_column] not in ("converged", "not converged"):
            continue
        key = row[c_column] if c_column is not None else ""
        curves.setdefault(key, []).append((row[x_column], y, row[status_column] == "converged"))

    xs_numeric = all(number(x) is not None for points in curves.values() for x, _, _ in points)
    figure, axis = plt.subplots(figsize=(6.4, 4.6), dpi=120)
    categories = []
    if not xs_numeric:
        for points in curves.values():
            for x, _, _ in points:
                if x not in categories:
                    categories.append(x)
    ordered = sorted(curves, key=lambda k: (number(k) is None, number(k) or 0.0, k))
    for i, key in enumerate(ordered):
        points = sorted(curves[key], key=lambda p: number(p[0]) if xs_numeric else categories.index(p[0]))
        x = [number(p[0]) if xs_numeric else categories.index(p[0]) for p in points]
        y = [p[1] for p in points]
        colour, marker = COLOURS[i % len(COLOURS)], MARKERS[i % len(MARKERS)]
        label = f"{header[c_column]} = {key}" if c_column is not None else None
        axis.plot(x, y, color=colour, lw=1.5, label=label)
        for xi, yi, p in zip(x, y, points):
            axis.plot([xi], [yi], marker=marker, color=colour, markersize=6,
                      markerfacecolor=colour if p[2] else "white")
    all_x = [number(x) for points in curves.values() for x, _, _ in points] if xs_numeric else []
    all_y = [y for points in curves.values() for _, y, _ in points]
    if all_x and min(all_x) > 0 and max(all_x) / min(all_x) >= 10:
        axis.set_xscale("log")
    if all_y and min(all_y) > 0 and max(all_y) / min(all_y) > 20:
        axis.set_yscale("log")
    if categories:
        axis.set_xticks(range(len(categories)))
        axis.set_xticklabels(categories, rotation=30, ha="right")
    axis.set_xlabel(header[x_column])
    axis.set_ylabel(header[y_column])
    axis.grid(True, which="both", alpha=0.3)
    if c_column is not None:
        axis.legend(fontsize=8)
    hollow = any(not p[2] for points in curves.values() for p in points)
    axis.set_title(options.number + (" (hollow: not converged)" if hollow else ""), fontsize=10)
    # The full caution under the axes, wrapped to the figure's width (about 125 characters at 6.5 pt).
    lines = textwrap.wrap(caution, 125)
    figure.text(0.01, 0.008, "\n".join(lines), fontsize=6.5, color="#333333", va="bottom", ha="left")
    figure.tight_layout(rect=(0, 0.03 + 0.028 * len(lines), 1, 1))
    figure.savefig(options.output, format="png", metadata={"Description": caution})
    return 0


if __name__ == "__main__":
    sys.exit(main())

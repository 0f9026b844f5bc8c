#!/usr/bin/env python3
"""Draw one design number of a sweep against a swept key, one curve per value of a
second swept key, from the results table `lentus sweep` writes; or, for a sweep over a
fitted fluid's samples, the spread of design numbers over the samples.

usage: plot_sweep.py RESULTS.csv --number NAME --against KEY [--curves KEY] --output IMAGE.png
       plot_sweep.py RESULTS.csv --fluid FLUID_UNCERTAINTY.csv --number NAME [--number NAME ...] --output IMAGE.png

NAME is a design-number column without its unit ("pressure drop inlet to outlet"),
KEY a varied key as written in the sweep file ("Boundary conditions/Inflow rates").
Converged cases are filled markers; cases that did not converge are hollow markers
(their last iterate); bad-input and crashed cases have no numbers and are left out.
Logarithmic axes are chosen when positive values span a factor of 10 (x) or 20 (y) or more.
The picture carries the caution of the table's "caution" column (the full caution of
solver/report/caution.h), drawn under the axes and in the PNG's Description.

With --fluid (the fluid_uncertainty.csv a sweep with `fluid samples` writes), one panel per
NAME: for each group of cases (one per value of the sweep's other keys) the converged
samples' values as a strip of points, the 2.5-97.5% span from the table as a band, and the
fitted case's value with its error bar (mesh + regularization). The span is read from the
table, never computed here.
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


def read_table(path):
    with open(path, newline="") as handle:
        rows = list(csv.reader(handle))
    if not rows:
        sys.exit(f"plot_sweep.py: {path} is empty")
    return rows[0], rows[1:]


def draw_caution(figure, caution, lines_width=125):
    """The full caution under the axes, wrapped to the figure's width (about 125 characters at 6.5 pt)."""
    lines = textwrap.wrap(caution, lines_width)
    figure.text(0.01, 0.008, "\n".join(lines), fontsize=6.5, color="#333333", va="bottom", ha="left")
    return lines


def fluid_plot(options):
    """The spread of each NAME over the fluid samples, group by group (see the module's text)."""
    header, rows = read_table(options.table)
    f_header, f_rows = read_table(options.fluid)
    if not f_rows:
        sys.exit("plot_sweep.py: the fluid uncertainty table has no rows")
    name_column = f_header.index("design number")
    group_columns = f_header[:name_column]  # the sweep's other keys, headed as in results.csv
    fitted_ids = {row[f_header.index("fitted case")].split(" (")[0] for row in f_rows}
    status_column = column(header, "status")
    caution = "Caution: " + f_rows[0][f_header.index("caution")]
    label = f_rows[0][f_header.index("uncertainty")]

    groups = []  # group values in table order
    for row in f_rows:
        values = tuple(row[:name_column])
        if values not in groups:
            groups.append(values)
    panels = len(options.number)
    height = 1.2 + 2.6 * panels
    figure, axes = plt.subplots(panels, 1, figsize=(6.4, height), dpi=120, squeeze=False)
    for axis, wanted in zip(axes[:, 0], options.number):
        entries = {tuple(row[:name_column]): row for row in f_rows if row[name_column] == wanted}
        if not entries:
            sys.exit(f"plot_sweep.py: no design number '{wanted}' in {options.fluid}")
        y_column = column(header, wanted)
        unit = next(iter(entries.values()))[f_header.index("unit")]
        rough = False
        for x, values in enumerate(groups):
            entry = entries.get(values)
            if entry is None:
                continue
            low, high = number(entry[f_header.index("2.5% quantile")]), number(entry[f_header.index("97.5% quantile")])
            fitted = number(entry[f_header.index("fitted value")])
            error = number(entry[f_header.index("fitted error (mesh + regularization)")])
            rough = rough or "rough" in entry[f_header.index("note")]
            samples = [number(row[y_column]) for row in rows
                       if row[status_column] == "converged" and row[0] not in fitted_ids
                       and all(row[header.index(c)] == v for c, v in zip(group_columns, values))
                       and number(row[y_column]) is not None]
            first = x == 0
            if low is not None and high is not None:
                axis.fill_between([x - 0.3, x + 0.3], [low] * 2, [high] * 2, color="#56B4E9", alpha=0.35, lw=0,
                                  label="2.5-97.5% span of the samples" if first else None)
            if samples:  # sorted along the left of the band, the fitted case to their right
                offsets = [-0.1] if len(samples) == 1 else [-0.25 + 0.3 * i / (len(samples) - 1)
                                                             for i in range(len(samples))]
                axis.plot([x + o for o in offsets], sorted(samples), "o", color="#0072B2", markersize=4,
                          label="converged samples" if first else None)
            if fitted is not None:
                axis.errorbar([x + 0.17], [fitted], yerr=[[error or 0.0], [error or 0.0]], fmt="D", color="#D55E00",
                              markersize=7, capsize=5, zorder=5,
                              label="fitted case" + (" +/- mesh + regularization error" if error else "")
                              if first else None)
        axis.set_xticks(range(len(groups)))
        if group_columns:
            axis.set_xticklabels(["\n".join(f"{c.split(' [')[0]} = {v}" for c, v in zip(group_columns, values))
                                  for values in groups], fontsize=7)
        else:
            axis.set_xticklabels(["fluid samples"])
        axis.set_xlim(-0.7, len(groups) - 0.3)
        axis.set_ylabel(f"{wanted} [{unit}]", fontsize=8)
        axis.grid(True, axis="y", alpha=0.3)
        axis.set_title(wanted + (" (rough span: few samples)" if rough else ""), fontsize=9)
        axis.legend(fontsize=7, loc="best")
    figure.suptitle(label[0].upper() + label[1:], fontsize=10)
    lines = draw_caution(figure, caution)
    # The caution's height as in the single plot (4.6 in high), as a fraction of this one.
    figure.tight_layout(rect=(0, (0.03 + 0.028 * len(lines)) * 4.6 / height, 1, 1))
    figure.savefig(options.output, format="png", metadata={"Description": caution})
    return 0


def main():
    parser = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    parser.add_argument("table")
    parser.add_argument("--number", action="append", required=True)
    parser.add_argument("--against")
    parser.add_argument("--curves")
    parser.add_argument("--fluid")
    parser.add_argument("--output", required=True)
    options = parser.parse_args()
    if options.fluid:
        return fluid_plot(options)
    if options.against is None or len(options.number) != 1:
        parser.error("a plot of a number against a key needs one --number and --against")
    options.number = options.number[0]

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
    lines = draw_caution(figure, caution)
    figure.tight_layout(rect=(0, 0.03 + 0.028 * len(lines), 1, 1))
    figure.savefig(options.output, format="png", metadata={"Description": caution})
    return 0


if __name__ == "__main__":
    sys.exit(main())

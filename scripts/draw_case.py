#!/usr/bin/env python3
"""Pictures and a one-page report of a Lentus case folder.

usage: draw_case.py FOLDER

Writes into FOLDER (each file complete or not at all):
  flow_map.png      speed with streamlines; unyielded and dead zones hatched and outlined
  pressure.png      pressure field
  shear_rate.png    shear rate, log colour scale
  viscosity.png     viscosity, log colour scale
  swirl_speed.png   swirl speed |u_theta| and the cavern outline (swirling cases)
  die_profiles.png  pressure along the axis or centreline and wall shear stress along the wall
                    (cases with exit_profile.csv: dies and pipes)
  temperature.png   temperature with streamlines and yield outlines (cases with the energy equation)
  temperature_profiles.png  temperature along the axis or centreline and along the wall (dies and
                    pipes with the energy equation)
  mesh.png          the cell edges of the final mesh, coloured by cell size: where it is fine
  flow_curve.png    the fluid's flow curve, the shear rates that occur in the case shaded
  convergence.png   residual and step length against nonlinear iteration (summary.json's solves)
  report.html       the cautions, the key design numbers, every design number with its symbol
                    and unit, the numerics (meshes and solves as tables), the pictures and
                    the case inputs
Axisymmetric cases are drawn mirrored about the axis (r -> -r) so the part looks whole.
The flow curve is evaluated by `lentus flow-curve` ($LENTUS_EXECUTABLE, else ../build/lentus
next to this script, else lentus on PATH).

Exit codes: 0 all drawn; 1 some picture failed (the report says which); 2 the folder cannot be
read; 4 matplotlib is missing (apt-get install python3-matplotlib).
"""
import os
import shutil
import subprocess
import sys
import traceback

import numpy

import case_folder
import case_report
from case_view import View, draw_streamlines, draw_yield_overlay, log_limits, save

INSTALL_HINT = ("pictures need Python 3 with matplotlib: run scripts/setup, or "
                "apt-get install python3-matplotlib (or point LENTUS_PYTHON at a Python that has it)")


# Design numbers drawn into the pictures, chosen by their symbol in summary.json: the developed
# wall shear stresses of a die's sections (outer wall, or mandrel and outer wall of an annulus)
# and the shear rates that mark the flow curve (true wall shear rates, the Metzner-Otto rate).
WALL_STRESS_SYMBOLS = ("tau_w", "tau_w,i", "tau_w,o")
SHEAR_RATE_SYMBOLS = ("gamma_w", "gamma_MO")

# The mesh picture draws the cell edges of meshes up to this many cells (about 5 s of drawing).
MESH_EDGES_UP_TO = 100000


class Case:
    """Everything the pictures need from the folder."""

    def __init__(self, folder):
        self.folder = folder
        self.summary = case_folder.read_summary(folder)
        self.inputs, self.changed_inputs = case_folder.read_case(folder)
        self.solves = case_folder.solves(self.summary)
        self.exit_profile = case_folder.read_exit_profile(folder)
        self.fields = case_folder.read_fields(folder)
        self.numbers = self.summary.get("design numbers", {})
        self.axisymmetric = case_folder.is_axisymmetric(self.summary)
        self.swirl = self.fields is not None and self.fields.has("swirl_velocity")
        # The law's yield stress at the case temperature (0 without one).
        self.yield_stress = float(self.summary.get("yield stress [Pa]") or 0.)
        # Dead zones are drawn where the case reports them (vessels), with its speed fraction (else null).
        fraction = self.summary.get("dead-zone speed fraction")
        self.dead_fraction = float(fraction) if fraction is not None else None

    def real(self, key, default):
        """A real value of case.prm by its full key (Section/Subsection/Key)."""
        try:
            return float(self.inputs[key])
        except (KeyError, ValueError):
            return default

    def with_symbol(self, symbols):
        """(name, entry) of every design number whose symbol is one of `symbols`, in summary.json's order."""
        return [(name, entry) for name, entry in self.numbers.items() if entry.get("symbol") in symbols]

    def value(self, name):
        """The value of the design number called `name` (its exact name), or None."""
        entry = self.numbers.get(name)
        if entry is None or entry.get("value") is None:
            return None
        return float(entry["value"])


def picture_flow_map(case, view, path):
    fields = case.fields
    speed = view.scalar(fields["speed"])
    figure, axes = view.figure("Flow map: speed |u| with streamlines")
    mappable = view.image(axes, speed, cmap="viridis", alpha=0.75)  # washed: black streamlines read on it
    view.colorbar(figure, axes, mappable, "speed |u| [m/s]")
    drew_lines = draw_streamlines(view, axes, fields["velocity"])
    handles = []
    drawn = draw_yield_overlay(case, view, axes, handles)
    if handles:
        view.legend_above(axes, handles)
    save(figure, path)
    caption = "Speed with streamlines of the in-plane flow" if drew_lines else \
        "Speed (no in-plane flow to draw streamlines of)"
    if "cavern outline" in drawn:
        caption += ("; cross-hatched: unyielded (|tau| < tau_y); black line: the yield surface |tau| = tau_y "
                    "(cavern outline), from the regularized law")
    if "dead zone" in drawn:
        caption += "; dashed: dead-zone outline (unyielded or slower than the case's speed fraction)"
    if case.yield_stress > 0. and "cavern outline" not in drawn:
        caption += "; the whole fluid is yielded (|tau| > tau_y everywhere)"
    return caption


def picture_scalar(case, view, path, name, title, label, colour_map, logarithmic):
    from matplotlib.colors import LogNorm
    values = view.scalar(case.fields[name])
    figure, axes = view.figure(title)
    if logarithmic:
        limits = log_limits(values)
        if limits is None:
            raise ValueError("%s has no positive values to draw on a log scale" % name)
        clipped = numpy.clip(values, limits[0], limits[1])
        mappable = view.image(axes, clipped, cmap=colour_map, norm=LogNorm(vmin=limits[0], vmax=limits[1]))
    else:
        mappable = view.image(axes, values, cmap=colour_map)
        if numpy.ptp(values) > 1e-12 * max(numpy.abs(values).max(), 1e-300):
            axes.tricontour(view.triangulation, values, levels=12, colors="white", linewidths=0.5, alpha=0.6)
    view.colorbar(figure, axes, mappable, label)
    handles = []
    drawn = draw_yield_overlay(case, view, axes, handles) if name == "swirl_speed" else []
    if handles:
        view.legend_above(axes, handles)
    save(figure, path)
    return drawn


def picture_temperature(case, view, path):
    values = view.scalar(case.fields["temperature"])
    figure, axes = view.figure("Temperature T")
    mappable = view.image(axes, values, cmap="coolwarm")
    if numpy.ptp(values) > 1e-12 * numpy.abs(values).max():
        axes.tricontour(view.triangulation, values, levels=12, colors="white", linewidths=0.5, alpha=0.6)
    view.colorbar(figure, axes, mappable, "temperature T [K]")
    drew_lines = draw_streamlines(view, axes, case.fields["velocity"])
    handles = []
    drawn = draw_yield_overlay(case, view, axes, handles)
    if handles:
        view.legend_above(axes, handles)
    save(figure, path)
    caption = "Temperature from the energy equation (white lines: isotherms"
    caption += "; black: streamlines)" if drew_lines else ")"
    if "cavern outline" in drawn:
        caption += "; black line: the yield surface; hatched: unyielded"
    hottest = case.value("maximum temperature")
    if hottest is not None:
        caption += "; hottest point %.5g K" % hottest
    return caption


def picture_temperature_profiles(case, path):
    import matplotlib.pyplot as pyplot
    fields = case.fields
    axial_name, axial, centre, where, walls, exit_position = die_lines(case)
    temperature = fields["temperature"]
    figure, axes = pyplot.subplots(figsize=(8.0, 4.2), dpi=110, layout="constrained")
    axes.plot(fields.points[centre, axial], temperature[centre], color="#D55E00", lw=1.8,
              label="temperature " + where)
    for index, wall in enumerate(walls):
        axes.plot(fields.points[wall, axial], temperature[wall], color="#0072B2", lw=1.6, marker=".", ms=3,
                  label="temperature at the wall" if index == 0 else None)
    # The hottest point of each slice across the flow (200 slices): where viscous heating peaks, often
    # just inside the wall of the land.
    positions = fields.points[:, axial]
    edges = numpy.linspace(positions.min(), positions.max(), 201)
    slices = numpy.clip(numpy.digitize(positions, edges) - 1, 0, 199)
    hottest = numpy.full(200, -numpy.inf)
    numpy.maximum.at(hottest, slices, temperature)
    filled = numpy.isfinite(hottest)
    axes.plot(0.5 * (edges[:-1] + edges[1:])[filled], hottest[filled], color="#CC79A7", lw=1.2, ls="-.",
              label="hottest across the flow")
    mean = case.value("mean temperature at 'outlet'")
    if mean is not None:
        axes.axhline(mean, color="black", lw=1.0, ls="--", label="flow-weighted mean at the exit: %.5g K" % mean)
    axes.axvline(exit_position, color="0.4", lw=0.8, ls=":")
    axes.set_xlabel("axial position %s (exit at %.4g m)" % (axial_name, exit_position))
    axes.set_ylabel("temperature T [K]")
    axes.set_title("Temperature %s, along the wall and hottest across the flow" % where, fontsize=10)
    axes.grid(True, alpha=0.3)
    axes.legend(fontsize=8, loc="best")
    save(figure, path)
    return ("Temperature %s, along the outer die wall, and the hottest point of each slice across the flow; "
            "dashed: the flow-weighted (cup-mixing) mean temperature at the exit" % where)


def picture_swirl(case, view, path):
    case.fields.values["swirl_speed"] = numpy.abs(case.fields["swirl_velocity"])
    drawn = picture_scalar(case, view, path, "swirl_speed", "Swirl speed |u_theta|", "swirl speed |u_theta| [m/s]",
                           "viridis", False)
    caption = "Swirl speed |u_theta| (the fluid turning about the axis)"
    if "cavern outline" in drawn:
        caption += "; black line: cavern outline, the yield surface |tau| = tau_y; hatched: unyielded"
    return caption


def picture_pressure(case, view, path):
    picture_scalar(case, view, path, "pressure", "Pressure p", "pressure p [Pa]", "viridis", False)
    return "Pressure field (white lines: isobars)"


def picture_shear_rate(case, view, path):
    picture_scalar(case, view, path, "shear_rate", "Shear rate (log colour scale)", "shear rate [1/s]", "viridis",
                   True)
    return "Shear rate on a log colour scale (the lowest 1% of the values drawn in the lowest colour)"


def picture_viscosity(case, view, path):
    picture_scalar(case, view, path, "viscosity", "Viscosity (log colour scale)", "viscosity [Pa s]", "cividis",
                   True)
    return "Viscosity on a log colour scale (the lowest 1% of the values drawn in the lowest colour)"


def picture_mesh(case, view, path):
    from matplotlib.collections import LineCollection
    from matplotlib.colors import LogNorm, Normalize
    from matplotlib.ticker import LogFormatterSciNotation, LogLocator
    fields = case.fields
    n_cells = fields.n_cells()
    if n_cells is None:
        raise ValueError("the field files do not hold one patch per cell: the cell edges are not known")
    # The size of a cell: the square root of its area in the section (the sum of its quadrilaterals').
    corners = fields.points[fields.quads]
    x, y = corners[..., 0], corners[..., 1]
    area = 0.5 * numpy.abs(numpy.sum(x * numpy.roll(y, -1, axis=1) - numpy.roll(x, -1, axis=1) * y, axis=1))
    size = numpy.sqrt(numpy.bincount(fields.cells, weights=area))
    low, high = float(size.min()), float(size.max())
    # The cell edges, unless most of the part would turn black: cells under 2 pixels wide (110 dpi, as
    # View.figure) covering more than half of it; thin lines where the smallest cells are a few pixels
    # wide (they blacken that part, which shows it is fine). Lines cost about 0.5 s per 10000 cells.
    pixels_per_metre = 110. * min(view.axes_size[0] / max(view.width, 1e-300),
                                  view.axes_size[1] / max(view.height, 1e-300))
    visible = numpy.sum(size[size * pixels_per_metre >= 2.] ** 2) >= 0.5 * numpy.sum(size ** 2)
    edges_drawn = visible and n_cells <= MESH_EDGES_UP_TO
    title = "Final mesh: %d cells (colour: cell size)" % n_cells
    if not edges_drawn:
        title += "\n(edges not drawn: %s)" % ("the cells are too small" if not visible else "too many cells")
    figure, axes = view.figure(title)
    # A log scale when the sizes span more than a factor 10, else linear (a log bar over less than a
    # decade labels its ticks poorly); cells of (nearly) one size get a bar of some width around it.
    if high > 10. * low:
        norm = LogNorm(vmin=low, vmax=high)
    else:
        norm = Normalize(vmin=low, vmax=high) if high > 1.1 * low else Normalize(vmin=0.9 * low, vmax=1.1 * high)
    values = view.sample_per_triangle(view.per_triangle(size[fields.cells]))
    mappable = axes.imshow(values, origin="lower", extent=view.extent, interpolation="nearest", cmap="cividis",
                           norm=norm, alpha=0.6, aspect="equal" if view.to_scale else "auto", zorder=1)
    if edges_drawn:
        axes.add_collection(LineCollection(view.segments(fields.points, fields.cell_edges), colors="black",
                                           linewidths=0.5 if low * pixels_per_metre >= 8. else 0.25, zorder=5))
    axes.add_collection(LineCollection(view.outline, colors="black", linewidths=0.8, zorder=6))
    bar = view.colorbar(figure, axes, mappable, "cell size sqrt(area) [m]")
    if isinstance(norm, LogNorm) and numpy.floor(numpy.log10(high)) - numpy.ceil(numpy.log10(low)) < 1.:
        # One power of 10 on the bar: 2 and 5 times the powers labelled too.
        bar.minorlocator = LogLocator(subs=(2., 5.))
        bar.minorformatter = LogFormatterSciNotation(labelOnlyBase=False, minor_thresholds=(numpy.inf, numpy.inf))
    save(figure, path)
    caption = "The final mesh: %d cells, the ones the design numbers come from; " % n_cells
    if edges_drawn:
        caption += "black lines: the cell edges; "
    elif not visible:
        caption += "the cells are too small at this size to draw their edges; "
    else:
        caption += "the cell edges are not drawn above %d cells; " % MESH_EDGES_UP_TO
    return caption + "colour: the cell size sqrt(area) (%.3g to %.3g m)" % (low, high)


def die_lines(case):
    """Axial direction, centreline and wall of a die from its exit profile and mesh:
    the exit lies across the flow; the centreline (axis, symmetry plane or mandrel) is the
    least transverse coordinate; the wall is the rest of the boundary without inlet and exit."""
    header, rows = case.exit_profile
    fields = case.fields
    axial = 0 if numpy.ptp(rows[:, 0]) < numpy.ptp(rows[:, 1]) else 1
    transverse = 1 - axial
    points = fields.points
    size = max(numpy.ptp(points[:, 0]), numpy.ptp(points[:, 1]))
    tolerance = 1e-7 * size
    exit_position = float(rows[0, axial])
    low, high = points[:, axial].min(), points[:, axial].max()
    inlet_position = low if abs(high - exit_position) < abs(low - exit_position) else high
    # The axis, or a symmetry plane at the least transverse coordinate; else (a channel from
    # wall to wall) the points nearest to the middle of the exit.
    centre = points[:, transverse].min()
    if not case.axisymmetric and not case.inputs.get("Boundary conditions/Symmetry", "").strip():
        middle = 0.5 * (rows[:, transverse].min() + rows[:, transverse].max())
        distance = numpy.abs(points[:, transverse] - middle)
        on_centre = numpy.where(distance <= distance.min() + tolerance)[0]
        where = "on the centreline %s = %.4g m" % (header[transverse].split(" ")[0], middle)
    else:
        on_centre = numpy.where(points[:, transverse] <= centre + tolerance)[0]
        if case.axisymmetric and centre > tolerance:  # a mandrel on the axis (tube die)
            where = "along the mandrel r = %.4g m" % centre
        else:
            where = "on the axis r = 0" if case.axisymmetric else "on the symmetry plane"
    on_centre = on_centre[numpy.argsort(points[on_centre, axial])]
    edges = fields.boundary_edges()
    first, second = points[edges[:, 0]], points[edges[:, 1]]

    def on_line(coordinate, value):
        return (numpy.abs(first[:, coordinate] - value) <= tolerance) & (numpy.abs(second[:, coordinate] - value)
                                                                        <= tolerance)
    keep = ~(on_line(transverse, centre) | on_line(axial, exit_position) | on_line(axial, inlet_position))
    along = numpy.abs(second[:, axial] - first[:, axial])
    across = numpy.abs(second[:, transverse] - first[:, transverse])
    keep &= along > 1e-6 * across  # faces across the flow (an abrupt step) have no axial extent
    # Connected pieces of the wall (the step face left out splits barrel and land), each
    # ordered along the flow.
    parent = {}

    def root(node):
        while parent.setdefault(node, node) != node:
            parent[node] = parent[parent[node]]
            node = parent[node]
        return node
    for first_node, second_node in edges[keep]:
        parent[root(first_node)] = root(second_node)
    pieces = {}
    for node in numpy.unique(edges[keep].reshape(-1)):
        pieces.setdefault(root(node), []).append(node)
    walls = [numpy.array(sorted(piece, key=lambda node: points[node, axial])) for piece in pieces.values()]
    walls.sort(key=lambda piece: points[piece[0], axial])
    return header[axial], axial, on_centre, where, walls, exit_position


def picture_die_profiles(case, path):
    import matplotlib.pyplot as pyplot
    fields = case.fields
    axial_name, axial, centre, where, walls, exit_position = die_lines(case)
    figure, (top, bottom) = pyplot.subplots(2, 1, figsize=(8.0, 6.4), dpi=110, sharex=True, layout="constrained")
    top.plot(fields.points[centre, axial], fields["pressure"][centre], color="#0072B2", lw=1.8,
             label="pressure " + where)
    top.set_ylabel("pressure p [Pa]")
    top.set_title("Pressure " + where, fontsize=10)
    # At a wall the stress magnitude |tau| = eta gamma_dot = sqrt(tau:tau / 2) is the wall shear stress.
    stress = fields["stress_magnitude"]
    for index, wall in enumerate(walls):
        bottom.plot(fields.points[wall, axial], stress[wall], color="#D55E00", lw=1.6, marker=".", ms=3,
                    label="stress magnitude at the wall: |tau| = eta gamma_dot" if index == 0 else None)
    styles = ["--", ":", "-.", (0, (5, 1, 1, 1))]
    for index, (name, entry) in enumerate(case.with_symbol(WALL_STRESS_SYMBOLS)):
        if entry.get("value") is not None:
            bottom.axhline(float(entry["value"]), color="black", lw=1.0, ls=styles[index % len(styles)],
                           label="%s: %.4g %s" % (name, float(entry["value"]), entry.get("unit", "")))
    bottom.set_ylabel("wall shear stress [Pa]")
    bottom.set_xlabel("axial position %s (exit at %.4g m)" % (axial_name, exit_position))
    bottom.set_title("Wall shear stress along the wall (the step face across the flow left out)", fontsize=10)
    for axes in (top, bottom):
        axes.axvline(exit_position, color="0.4", lw=0.8, ls=":")
        axes.grid(True, alpha=0.3)
        axes.legend(fontsize=8, loc="best")
    save(figure, path)
    return ("Pressure %s and wall shear stress along the outer die wall; dashed: developed-flow "
            "values of the design numbers" % where)


def lentus_executable():
    chosen = os.environ.get("LENTUS_EXECUTABLE")
    if chosen and os.path.exists(chosen):
        return chosen
    beside = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "build", "lentus")
    if os.path.exists(beside):
        return beside
    return shutil.which("lentus")


def picture_flow_curve(case, path):
    import matplotlib.pyplot as pyplot
    from matplotlib.ticker import NullLocator
    rates = case.fields["shear_rate"] if case.fields is not None else numpy.array([])
    occurring = log_limits(rates) if rates.size else None
    low, high = (occurring[0] / 10., occurring[1] * 10.) if occurring else (1e-3, 1e3)
    executable = lentus_executable()
    if executable is None:
        raise RuntimeError("the lentus program was not found (set LENTUS_EXECUTABLE)")
    command = [executable, "flow-curve", os.path.join(case.folder, "case.prm"), "--from", "%.6g" % low, "--to",
               "%.6g" % high, "--points", "81"]
    result = subprocess.run(command, capture_output=True, text=True, check=False)
    if result.returncode != 0:
        raise RuntimeError("lentus flow-curve failed: " + result.stderr.strip())
    rows = [line.split(",") for line in result.stdout.strip().splitlines()[1:]]
    curve = numpy.array(rows, dtype=float)
    figure, (stress_axes, viscosity_axes) = pyplot.subplots(1, 2, figsize=(10.0, 4.2), dpi=110, layout="constrained")
    stress_axes.loglog(curve[:, 0], curve[:, 1], color="#0072B2", lw=2)
    viscosity_axes.loglog(curve[:, 0], curve[:, 2], color="#0072B2", lw=2)
    stress_axes.set_ylabel("shear stress [Pa]")
    viscosity_axes.set_ylabel("viscosity [Pa s]")
    temperature = case.real("Operating point/Temperature", None)
    for axes in (stress_axes, viscosity_axes):
        axes.set_xlabel("shear rate [1/s]")
        axes.grid(True, which="major", alpha=0.3)
        axes.xaxis.set_minor_locator(NullLocator())  # minor ticks over many decades cost seconds
        axes.yaxis.set_minor_locator(NullLocator())
        if occurring:
            axes.axvspan(occurring[0], occurring[1], color="#E69F00", alpha=0.25,
                         label="shear rates in this case: %.3g to %.3g 1/s" % occurring)
    rates = case.with_symbol(SHEAR_RATE_SYMBOLS)
    for index, (name, entry) in enumerate(rates[:4]):
        if entry.get("value") is not None and float(entry["value"]) > 0.:
            stress_axes.axvline(float(entry["value"]), color="black", lw=0.9, ls=["--", ":", "-.", "--"][index],
                                label="%s: %.3g 1/s" % (name, float(entry["value"])))
    if case.yield_stress > 0.:
        stress_axes.axhline(case.yield_stress, color="#CC79A7", lw=1.0, ls="--",
                            label="yield stress %g Pa" % case.yield_stress)
    if stress_axes.get_legend_handles_labels()[0]:
        stress_axes.legend(fontsize=7, loc="best")
    law = case.summary.get("viscosity law", "")
    figure.suptitle("Flow curve of the fluid: %s%s" % (law, ", T = %g K" % temperature if temperature else ""),
                    fontsize=11)
    save(figure, path)
    caption = "Flow curve of the fluid (lentus flow-curve)"
    if occurring:
        caption += "; shaded: the shear rates that occur in this case (%.3g to %.3g 1/s, lowest 1%% left out)" % (
            occurring)
    return caption


def real(value):
    """A number of summary.json as a float: null (not finite when written) becomes NaN."""
    return float("nan") if value is None else float(value)


def picture_convergence(case, path):
    import matplotlib.pyplot as pyplot
    if not case.solves:
        raise ValueError("summary.json lists no nonlinear solves (numerics/solves)")
    figure, (top, bottom) = pyplot.subplots(2, 1, figsize=(8.0, 5.6), dpi=110, sharex=True,
                                            gridspec_kw={"height_ratios": [3, 1.3]}, layout="constrained")
    index = 0
    markers = {"Picard": ("o", "white"), "Newton": ("s", "#0072B2")}
    labelled = set()
    relative = case.real("Nonlinear solver/Relative tolerance", None)
    absolute = case.real("Nonlinear solver/Absolute tolerance", 0.) or 0.
    several_meshes = len(case_folder.meshes(case.summary)) > 1
    for solve_number, solve in enumerate(case.solves):
        iterations = solve.get("iterations", [])
        xs = [index] + [index + k + 1 for k in range(len(iterations))]
        ys = [real(solve["initial residual"])] + [real(iteration["residual"]) for iteration in iterations]
        top.semilogy(xs, ys, color="0.35", lw=1.0)
        for k, iteration in enumerate(iterations):
            kind, residual, step = iteration["kind"], real(iteration["residual"]), real(iteration["step"])
            marker, face = markers.get(kind, ("^", "0.5"))
            label = None if kind in labelled else kind + " step"
            labelled.add(kind)
            top.semilogy(xs[k + 1], residual, marker=marker, mfc=face, mec="#0072B2", ls="none", label=label)
            bottom.plot(xs[k + 1], step, marker=marker, mfc=face, mec="#0072B2", ls="none")
        if relative is not None:
            target = max(relative * real(solve["initial residual"]), absolute)
            top.hlines(target, xs[0], xs[-1], color="#D55E00", lw=1.0, ls="--",
                       label="target (tolerances)" if solve_number == 0 else None)
        if len(case.solves) > 1:
            top.axvline(index, color="0.6", lw=0.7, ls=":")
            label = solve.get("label", "")
            if several_meshes:
                label = "mesh %d: %s" % (solve.get("mesh", 0) + 1, label)
            top.text(index, 0.98, " " + label, fontsize=7, rotation=90, va="top",
                     transform=top.get_xaxis_transform())
        index = xs[-1] + 1
    status = case.summary.get("status", "")
    top.set_ylabel("residual norm [%s]" % ("N/rad" if case.axisymmetric else "N/m"))
    top.set_title("Convergence of the nonlinear solve: %s" % status, fontsize=10)
    top.grid(True, which="both", alpha=0.3)
    top.legend(fontsize=8, loc="best")
    bottom.set_ylabel("step length [-]")
    bottom.set_xlabel("nonlinear iteration (each solve starts with its initial residual)")
    bottom.set_ylim(0., 1.1)
    bottom.grid(True, alpha=0.3)
    save(figure, path)
    return "Residual and line-search step length at every Picard and Newton step of every solve"


def draw_all(case):
    """Draws every picture the folder supports; returns (pictures, failures)."""
    pictures, failures = [], []

    def attempt(file_name, title, function, *arguments):
        try:
            caption = function(*arguments, os.path.join(case.folder, file_name))
            pictures.append((file_name, title, caption))
        except Exception as error:  # one failed picture must not stop the others
            traceback.print_exc(file=sys.stderr)
            failures.append("%s: %s" % (file_name, error))

    if case.fields is not None:
        view = View(case)
        attempt("flow_map.png", "Flow map", picture_flow_map, case, view)
        if case.swirl:
            attempt("swirl_speed.png", "Swirl speed and cavern", picture_swirl, case, view)
        attempt("pressure.png", "Pressure", picture_pressure, case, view)
        attempt("shear_rate.png", "Shear rate", picture_shear_rate, case, view)
        viscosity = case.fields["viscosity"]
        if numpy.ptp(viscosity) > 1e-9 * numpy.abs(viscosity).max():
            attempt("viscosity.png", "Viscosity", picture_viscosity, case, view)
        if case.exit_profile is not None:
            attempt("die_profiles.png", "Along the die", picture_die_profiles, case)
        if case.fields.has("temperature"):
            attempt("temperature.png", "Temperature", picture_temperature, case, view)
            if case.exit_profile is not None:
                attempt("temperature_profiles.png", "Temperature along the die", picture_temperature_profiles, case)
        attempt("mesh.png", "Mesh", picture_mesh, case, view)
    attempt("flow_curve.png", "Flow curve", picture_flow_curve, case)
    attempt("convergence.png", "Convergence", picture_convergence, case)
    return pictures, failures


def main(argv):
    if len(argv) != 2 or argv[1] in ("-h", "--help"):
        sys.stderr.write(__doc__)
        return 2
    folder = argv[1]
    try:
        import matplotlib
    except ImportError:
        sys.stderr.write("lentus: no pictures: %s\n" % INSTALL_HINT)
        return 4
    matplotlib.use("Agg")
    try:
        case = Case(folder)
    except (OSError, ValueError, KeyError) as error:
        sys.stderr.write("draw_case.py: cannot read the case folder %s: %s\n" % (folder, error))
        return 2
    pictures, failures = draw_all(case)
    case_report.write_report(case, pictures, failures)
    for failure in failures:
        sys.stderr.write("draw_case.py: picture not drawn: %s\n" % failure)
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main(sys.argv))

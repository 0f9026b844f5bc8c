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
  flow_curve.png    the fluid's flow curve, the shear rates that occur in the case shaded
  convergence.png   residual and step length against nonlinear iteration (from log.txt)
  report.html       the case inputs, every design number with its unit, mesh and
                    convergence facts, cautions and the pictures
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

INSTALL_HINT = ("pictures need Python 3 with matplotlib: run scripts/setup, or "
                "apt-get install python3-matplotlib (or point LENTUS_PYTHON at a Python that has it)")


class Case:
    """Everything the pictures need from the folder."""

    def __init__(self, folder):
        self.folder = folder
        self.summary = case_folder.read_summary(folder)
        self.inputs, self.changed_inputs = case_folder.read_case(folder)
        self.log_lines, self.solves = case_folder.read_log(folder)
        self.exit_profile = case_folder.read_exit_profile(folder)
        self.fields = case_folder.read_fields(folder)
        self.numbers = self.summary.get("design numbers", {})
        self.axisymmetric = str(self.summary.get("formulation", "")).startswith("axisymmetric")
        self.swirl = self.fields is not None and self.fields.has("swirl_velocity")
        law = self.inputs.get("Rheology/Viscosity law", self.summary.get("viscosity law", ""))
        self.yield_stress = self.real("Rheology/%s/Yield stress" % law, 0.)
        # Dead zones are drawn where the case reports them (vessels), with its speed fraction.
        self.dead_fraction = None
        reports_dead_zones = any("dead-zone" in name for name in self.numbers)
        for key in self.inputs:
            if reports_dead_zones and "dead" in key.lower() and "fraction" in key.lower():
                fraction = self.real(key, None)
                if fraction is not None and 0. < fraction < 1.:
                    self.dead_fraction = fraction

    def real(self, key, default):
        try:
            return float(self.inputs[key])
        except (KeyError, ValueError):
            return default

    def number(self, words):
        """The first design number whose name contains every word in `words`."""
        for name, entry in self.numbers.items():
            if all(word in name for word in words) and entry.get("value") is not None:
                return name, float(entry["value"]), entry.get("unit", "")
        return None


class View:
    """Maps the mesh to the picture: axisymmetric meshes mirrored about the axis; long
    parts (length above 1.5 times the width) laid on their side, axis horizontal."""

    def __init__(self, case):
        from matplotlib.tri import Triangulation
        fields = case.fields
        self.mirror = case.axisymmetric
        names = ("r", "z") if case.axisymmetric else ("x", "y")
        points, triangles = fields.points, fields.triangles()
        self.n = len(points)
        self.copy = None
        if self.mirror:
            # Points on the axis are shared by both halves: the triangulation must not repeat them.
            off_axis = points[:, 0] > 1e-9 * max(numpy.ptp(points[:, 0]), numpy.ptp(points[:, 1]))
            self.copy = numpy.where(off_axis)[0]
            image = numpy.arange(self.n)
            image[self.copy] = self.n + numpy.arange(len(self.copy))
            points = numpy.concatenate([points, points[self.copy] * [-1., 1.]])
            triangles = numpy.concatenate([triangles, image[triangles][:, ::-1]])
        width, height = numpy.ptp(points[:, 0]), numpy.ptp(points[:, 1])
        self.transpose = height > 1.5 * width
        if self.transpose:
            points = points[:, ::-1]
            names = names[::-1]
        mirrored = " (mirrored about the axis)" if self.mirror else ""
        self.xlabel = "%s [m]%s" % (names[0], "" if self.transpose else mirrored)
        self.ylabel = "%s [m]%s" % (names[1], mirrored if self.transpose else "")
        self.points = points
        self.triangulation = Triangulation(points[:, 0], points[:, 1], triangles)
        self.width, self.height = numpy.ptp(points[:, 0]), numpy.ptp(points[:, 1])
        ratio = self.height / max(self.width, 1e-300)
        self.to_scale = 1. / 6. <= ratio <= 6.
        self.horizontal_colorbar = ratio < 0.9
        if self.to_scale:
            axes_height = min(max(6.0 * ratio, 1.6), 7.0)
            self.axes_size = (min(axes_height / ratio, 7.5), axes_height)
        else:
            self.axes_size = (7.5, 2.4) if ratio < 1. else (3.0, 7.0)
        self.grid, self.extent, self.finder = None, None, None
        # Room above the part for the legend of the unyielded and dead-zone overlays.
        self.legend_rows = (2 if case.yield_stress > 0. else 0) + (2 if case.dead_fraction is not None else 0)
        edges = fields.boundary_edges()
        if self.mirror:  # the axis lies inside the mirrored picture
            size = max(numpy.ptp(fields.points[:, 0]), numpy.ptp(fields.points[:, 1]))
            on_axis = numpy.abs(fields.points[:, 0]) <= 1e-9 * size
            edges = edges[~(on_axis[edges[:, 0]] & on_axis[edges[:, 1]])]
        outline = numpy.stack([fields.points[edges[:, 0]], fields.points[edges[:, 1]]], axis=1)
        if self.mirror:
            outline = numpy.concatenate([outline, outline * [-1., 1.]])
        self.outline = outline[:, :, ::-1] if self.transpose else outline

    def sample(self, values, pixels=520):
        """Values interpolated linearly onto a regular grid of about `pixels` along the
        longer side of the axes, masked outside the part (for imshow: quick and smooth)."""
        from matplotlib.tri import LinearTriInterpolator
        if self.grid is None:
            long_side, short_side = pixels, max(60, int(pixels * min(self.axes_size) / max(self.axes_size)))
            n_x, n_y = (long_side, short_side) if self.axes_size[0] >= self.axes_size[1] else (short_side, long_side)
            x0, x1 = self.points[:, 0].min(), self.points[:, 0].max()
            y0, y1 = self.points[:, 1].min(), self.points[:, 1].max()
            self.grid = numpy.meshgrid(numpy.linspace(x0, x1, n_x), numpy.linspace(y0, y1, n_y))
            self.extent = (x0, x1, y0, y1)
        return LinearTriInterpolator(self.triangulation, values, trifinder=self.trifinder())(*self.grid)

    def trifinder(self):
        if self.finder is None:
            self.finder = self.triangulation.get_trifinder()
        return self.finder

    def image(self, axes, values, **options):
        """A scalar field as an image; the outline of the part drawn over it."""
        from matplotlib.collections import LineCollection
        mappable = axes.imshow(self.sample(values), origin="lower", extent=self.extent, interpolation="bilinear",
                               aspect="equal" if self.to_scale else "auto", zorder=1, **options)
        axes.add_collection(LineCollection(self.outline, colors="black", linewidths=0.8, zorder=6))
        return mappable

    def scalar(self, values):
        return numpy.concatenate([values, values[self.copy]]) if self.mirror else values

    def vector(self, values):
        """Mesh components (x or r, y or z) as the picture's (horizontal, vertical)."""
        first, second = values[:, 0], values[:, 1]
        if self.mirror:
            first = numpy.concatenate([first, -first[self.copy]])
            second = numpy.concatenate([second, second[self.copy]])
        return (second, first) if self.transpose else (first, second)

    def figure(self, title):
        """A figure with the part's axes and room for a colour bar, laid out by hand
        in inches (an automatic layout costs about a second per picture)."""
        import matplotlib.pyplot as pyplot
        ratio = self.height / max(self.width, 1e-300)
        axes_width, axes_height = self.axes_size
        left, bottom, top = 0.95, 0.6, 0.7 + 0.19 * self.legend_rows
        below, beside = (0.85, 0.0) if self.horizontal_colorbar else (0.0, 1.3)
        width, height = left + axes_width + 0.3 + beside, bottom + below + axes_height + top
        figure = pyplot.figure(figsize=(width, height), dpi=110)
        axes = figure.add_axes([left / width, (bottom + below) / height, axes_width / width, axes_height / height])
        if self.horizontal_colorbar:
            self.colorbar_box = [(left + 0.1 * axes_width) / width, 0.45 / height, 0.8 * axes_width / width,
                                 0.14 / height]
        else:
            self.colorbar_box = [(left + axes_width + 0.25) / width, (bottom + 0.1 * axes_height) / height,
                                 0.16 / width, 0.8 * axes_height / height]
        axes.set_xlabel(self.xlabel)
        axes.set_ylabel(self.ylabel)
        if self.to_scale:
            axes.set_aspect("equal")
        else:
            shown = axes_height / axes_width
            title += "\n(not to scale: the short direction stretched %.1f times)" % (
                shown / ratio if ratio < 1. else ratio / shown)
        axes.set_title(title, fontsize=10)
        axes.set_xlim(self.points[:, 0].min(), self.points[:, 0].max())
        axes.set_ylim(self.points[:, 1].min(), self.points[:, 1].max())
        if self.mirror:
            line = axes.axhline if self.transpose else axes.axvline
            line(0., color="0.5", lw=0.8, ls="-.", zorder=5)
        return figure, axes

    def legend_above(self, axes, handles):
        """The overlay legend between the title and the part: it hides nothing."""
        axes.legend(handles=handles, fontsize=8, loc="lower center", bbox_to_anchor=(0.5, 1.0), frameon=False,
                    borderaxespad=0.2)
        axes.set_title(axes.get_title(), fontsize=10, pad=4 + 13 * len(handles))

    def colorbar(self, figure, axes, mappable, label):
        bar = figure.colorbar(mappable, cax=figure.add_axes(self.colorbar_box),
                              orientation="horizontal" if self.horizontal_colorbar else "vertical")
        bar.set_label(label)
        return bar

def save(figure, path):
    """PNG written under a temporary name and renamed: complete or absent."""
    import matplotlib.pyplot as pyplot
    temporary = os.path.join(os.path.dirname(path), "." + os.path.basename(path) + ".tmp.png")
    figure.savefig(temporary, format="png")
    pyplot.close(figure)
    os.replace(temporary, path)


def stroked(width=2.2, colour="white"):
    from matplotlib import patheffects
    return [patheffects.withStroke(linewidth=width, foreground=colour)]


def log_limits(values):
    positive = values[numpy.isfinite(values) & (values > 0.)]
    if positive.size == 0:
        return None
    top = float(positive.max())
    bottom = max(float(numpy.percentile(positive, 1.)), top * 1e-6)
    if bottom >= top:
        bottom = top / 1.01
    return bottom, top


def draw_yield_overlay(case, view, axes, handles):
    """Unyielded (|tau| < tau_y) hatched with its outline, the |tau| = tau_y contour;
    with a dead-zone speed fraction, also the dead zone (unyielded or slow)."""
    from matplotlib.patches import Patch
    from matplotlib.lines import Line2D
    fields, drawn = case.fields, []
    if case.yield_stress > 0. and fields.has("von_Mises_stress"):
        stress = view.scalar(fields["von_Mises_stress"])
        if stress.min() < case.yield_stress:
            axes.tricontourf(view.triangulation, stress, levels=[-1., case.yield_stress], colors=["#d9d9d9"],
                             alpha=0.45, zorder=3)
            axes.tricontourf(view.triangulation, stress, levels=[-1., case.yield_stress], colors="none",
                             hatches=["xx"], zorder=3)
            handles.append(Patch(facecolor="#d9d9d9", hatch="xx", edgecolor="black",
                                 label="unyielded: |tau| < tau_y = %g Pa" % case.yield_stress))
        if stress.min() < case.yield_stress < stress.max():
            contour = axes.tricontour(view.triangulation, stress, levels=[case.yield_stress], colors="black",
                                      linewidths=1.4, zorder=4)
            for collection in contour.collections:
                collection.set_path_effects(stroked())
            handles.append(Line2D([], [], color="black", lw=1.4,
                                  label="yield surface (cavern outline): |tau| = tau_y"))
            drawn.append("cavern outline")
    if case.dead_fraction is not None and fields.has("speed"):
        reference = case.number(["tip speed"])
        speed = view.scalar(fields["speed"])
        reference_speed = reference[1] if reference else float(speed.max())
        slow = (speed < case.dead_fraction * reference_speed).astype(float)
        dead = slow
        if case.yield_stress > 0. and fields.has("von_Mises_stress"):
            unyielded = (view.scalar(fields["von_Mises_stress"]) < case.yield_stress).astype(float)
            dead = numpy.maximum(slow, unyielded)
            slow = slow * (1. - unyielded)  # dotted only where not hatched already
        if dead.max() > 0.5:
            if slow.max() > 0.5:
                axes.tricontourf(view.triangulation, slow, levels=[0.5, 1.5], colors="none", hatches=["...."],
                                 zorder=3)
            axes.tricontour(view.triangulation, dead, levels=[0.5], colors="black", linewidths=1.0,
                            linestyles="dashed", zorder=4)
            handles.append(Line2D([], [], color="black", lw=1.0, ls="--",
                                  label="dead zone outline: unyielded or slower than %g of %s" % (
                                      case.dead_fraction, "the tip speed" if reference else "the maximum speed")))
            if slow.max() > 0.5:
                handles.append(Patch(facecolor="none", hatch="....", edgecolor="black",
                                     label="dotted: yielded but slow (dead)"))
            drawn.append("dead zone")
    return drawn


def draw_streamlines(view, axes, velocity):
    """Streamlines of the in-plane velocity on a regular grid (linear interpolation)."""
    from matplotlib.tri import LinearTriInterpolator
    horizontal, vertical = view.vector(velocity)
    if max(numpy.abs(horizontal).max(), numpy.abs(vertical).max()) <= 0.:
        return False
    x0, x1 = view.points[:, 0].min(), view.points[:, 0].max()
    y0, y1 = view.points[:, 1].min(), view.points[:, 1].max()
    n_x = 200 if view.width >= view.height else max(40, int(200 * view.width / view.height))
    n_y = 200 if view.height > view.width else max(40, int(200 * view.height / view.width))
    if not view.to_scale:
        n_x, n_y = (240, 60) if view.width > view.height else (60, 240)
    grid_x, grid_y = numpy.meshgrid(numpy.linspace(x0, x1, n_x), numpy.linspace(y0, y1, n_y))
    u = LinearTriInterpolator(view.triangulation, horizontal, trifinder=view.trifinder())(grid_x, grid_y)
    v = LinearTriInterpolator(view.triangulation, vertical, trifinder=view.trifinder())(grid_x, grid_y)
    speed = numpy.ma.sqrt(u * u + v * v)
    if speed.count() == 0 or float(speed.max()) <= 0.:
        return False
    # Line width grows with the speed: slow (dead) regions get hairlines.
    width = 0.25 + 1.2 * (speed / float(speed.max())).filled(0.)
    axes.streamplot(grid_x[0], grid_y[:, 0], u.filled(numpy.nan), v.filled(numpy.nan), color="black",
                            linewidth=width, density=1.3 if view.to_scale else (2.2, 0.8), arrowsize=0.8,
                            zorder=2, broken_streamlines=True)
    return True


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


def die_lines(case):
    """Axial direction, centreline and wall of a die from its exit profile and mesh:
    the exit lies across the flow; the centreline (axis or symmetry plane) is the least
    transverse coordinate; the wall is the rest of the boundary without inlet and exit."""
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
    stress = fields["von_Mises_stress"] if fields.has("von_Mises_stress") else \
        fields["viscosity"] * fields["shear_rate"]
    for index, wall in enumerate(walls):
        bottom.plot(fields.points[wall, axial], stress[wall], color="#D55E00", lw=1.6, marker=".", ms=3,
                    label="computed at the wall: |tau| = eta gamma_dot" if index == 0 else None)
    styles = ["--", ":", "-.", (0, (5, 1, 1, 1))]
    for index, (name, entry) in enumerate(n for n in case.numbers.items() if "wall shear stress" in n[0]):
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
    return ("Pressure along the %s and wall shear stress along the die wall; dashed: developed-flow "
            "values of the design numbers" % ("axis" if case.axisymmetric else "centreline"))


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
    rates = [n for n in case.numbers.items() if n[1].get("unit") == "1/s" and "apparent" not in n[0]]
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


def picture_convergence(case, path):
    import matplotlib.pyplot as pyplot
    if not case.solves:
        raise ValueError("log.txt holds no nonlinear iterations")
    figure, (top, bottom) = pyplot.subplots(2, 1, figsize=(8.0, 5.6), dpi=110, sharex=True,
                                            gridspec_kw={"height_ratios": [3, 1.3]}, layout="constrained")
    index = 0
    markers = {"Picard": ("o", "white"), "Newton": ("s", "#0072B2")}
    labelled = set()
    relative = case.real("Nonlinear solver/Relative tolerance", None)
    absolute = case.real("Nonlinear solver/Absolute tolerance", 0.) or 0.
    for solve_number, solve in enumerate(case.solves):
        xs = [index] + [index + k + 1 for k in range(len(solve["iterations"]))]
        ys = [solve["initial"]] + [step[1] for step in solve["iterations"]]
        top.semilogy(xs, ys, color="0.35", lw=1.0)
        for k, (kind, residual, step, _) in enumerate(solve["iterations"]):
            marker, face = markers.get(kind, ("^", "0.5"))
            label = None if kind in labelled else kind + " step"
            labelled.add(kind)
            top.semilogy(xs[k + 1], residual, marker=marker, mfc=face, mec="#0072B2", ls="none", label=label)
            bottom.plot(xs[k + 1], step, marker=marker, mfc=face, mec="#0072B2", ls="none")
        if relative is not None:
            target = max(relative * solve["initial"], absolute)
            top.hlines(target, xs[0], xs[-1], color="#D55E00", lw=1.0, ls="--",
                       label="target (tolerances)" if solve_number == 0 else None)
        if len(case.solves) > 1:
            top.axvline(index, color="0.6", lw=0.7, ls=":")
            top.text(index, 0.98, " " + solve["label"], fontsize=7, rotation=90, va="top",
                     transform=top.get_xaxis_transform())
        index = xs[-1] + 1
    status = case.summary.get("status", "")
    top.set_ylabel("residual norm")
    top.set_title("Convergence of the nonlinear solve: %s" % status, fontsize=10)
    top.grid(True, which="both", alpha=0.3)
    top.legend(fontsize=8, loc="best")
    bottom.set_ylabel("step length")
    bottom.set_xlabel("nonlinear iteration (each solve starts with its initial residual)")
    bottom.set_ylim(0., 1.1)
    bottom.grid(True, alpha=0.3)
    save(figure, path)
    return "Residual and line-search step length at every Picard and Newton step (from log.txt)"


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

"""How a case's mesh is drawn: the View (axisymmetric parts mirrored about the axis,
long parts laid on their side, fields sampled onto an image) and the overlays of the
flow map (unyielded zones, yield surface or cavern outline, dead zones, streamlines).
Used by draw_case.py.
"""
import os

import numpy


class View:
    """Maps the mesh to the picture: axisymmetric meshes mirrored about the axis; long
    parts (length above 1.5 times the width) laid on their side, axis horizontal."""

    def __init__(self, case):
        from matplotlib.tri import Triangulation
        fields = case.fields
        self.mirror = case.axisymmetric
        names = ("r", "z") if case.axisymmetric else ("x", "y")
        points, triangles = fields.points, fields.triangles()
        self.triangle_quads = fields.triangle_quads()
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
        self.outline = self.segments(fields.points, edges)

    def segments(self, points, edges):
        """Edges between mesh points (pairs of indices) as line segments of the picture: mirrored
        about the axis and laid on their side as the part is."""
        lines = numpy.stack([points[edges[:, 0]], points[edges[:, 1]]], axis=1)
        if self.mirror:
            lines = numpy.concatenate([lines, lines * [-1., 1.]])
        return lines[:, :, ::-1] if self.transpose else lines

    def per_triangle(self, values):
        """Values per quadrilateral of the mesh as values per triangle of the picture (each
        quadrilateral is two triangles or more; the mirrored half repeats them)."""
        values = numpy.asarray(values)[self.triangle_quads]
        return numpy.concatenate([values, values]) if self.mirror else values

    def sample(self, values, pixels=520):
        """Values interpolated linearly onto a regular grid of about `pixels` along the
        longer side of the axes, masked outside the part (for imshow: quick and smooth)."""
        from matplotlib.tri import LinearTriInterpolator
        self.make_grid(pixels)
        return LinearTriInterpolator(self.triangulation, values, trifinder=self.trifinder())(*self.grid)

    def sample_per_triangle(self, values, pixels=520):
        """Values per triangle of the picture onto the same grid (constant in each triangle), masked
        outside the part."""
        self.make_grid(pixels)
        triangle = self.trifinder()(*self.grid)
        return numpy.ma.masked_array(numpy.asarray(values)[triangle], mask=triangle < 0)

    def make_grid(self, pixels):
        if self.grid is None:
            long_side, short_side = pixels, max(60, int(pixels * min(self.axes_size) / max(self.axes_size)))
            n_x, n_y = (long_side, short_side) if self.axes_size[0] >= self.axes_size[1] else (short_side, long_side)
            x0, x1 = self.points[:, 0].min(), self.points[:, 0].max()
            y0, y1 = self.points[:, 1].min(), self.points[:, 1].max()
            self.grid = numpy.meshgrid(numpy.linspace(x0, x1, n_x), numpy.linspace(y0, y1, n_y))
            self.extent = (x0, x1, y0, y1)

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
    with a dead-zone speed fraction, also the dead zone (unyielded or slow). |tau| is the
    field stress_magnitude = eta gamma_dot = sqrt(tau:tau / 2). Every region is a contour of
    a continuous field, so its outline follows the fields between the mesh points instead of
    running along whole cells."""
    from matplotlib.patches import Patch
    from matplotlib.lines import Line2D
    fields, drawn = case.fields, []
    if case.yield_stress > 0. and fields.has("stress_magnitude"):
        stress = view.scalar(fields["stress_magnitude"])
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
    margins = dead_zone_margins(case, view)
    if margins is not None:
        dead, slow_yielded = margins
        if dead.min() < 0.:
            if slow_yielded.min() < 0.:
                axes.tricontourf(view.triangulation, slow_yielded, levels=[slow_yielded.min() - 1., 0.],
                                 colors="none", hatches=["...."], zorder=3)
            axes.tricontour(view.triangulation, dead, levels=[0.], colors="black", linewidths=1.0,
                            linestyles="dashed", zorder=4)
            tip_speed = case.value("impeller tip speed")
            handles.append(Line2D([], [], color="black", lw=1.0, ls="--",
                                  label="dead zone outline: unyielded or slower than %g of %s" % (
                                      case.dead_fraction, "the tip speed" if tip_speed else "the maximum speed")))
            if slow_yielded.min() < 0.:
                handles.append(Patch(facecolor="none", hatch="....", edgecolor="black",
                                     label="dotted: yielded but slow (dead)"))
            drawn.append("dead zone")
    return drawn


def dead_zone_margins(case, view):
    """The dead zone as continuous fields on the view's points, or None when the case reports none:
    (dead, slow_yielded), where dead = min(|tau|/tau_y - 1, |u|/(f U_ref) - 1) is negative in the dead
    zone (unyielded or slower than the fraction f of U_ref; without a yield stress only the speed
    term) and slow_yielded = max(|u|/(f U_ref) - 1, 1 - |tau|/tau_y) is negative where the fluid is
    yielded but slow (the part of the dead zone not hatched as unyielded). U_ref is the impeller tip
    speed pi N D (the case's definition), else the largest speed in the fields."""
    fields = case.fields
    if case.dead_fraction is None or not fields.has("speed"):
        return None
    tip_speed = case.value("impeller tip speed")
    speed = view.scalar(fields["speed"])
    threshold = case.dead_fraction * (tip_speed if tip_speed else float(speed.max()))
    # Nothing is slower than a threshold of zero: the speed term then never makes the fluid dead.
    slow = speed / threshold - 1. if threshold > 0. else None
    yielded = None
    if case.yield_stress > 0. and fields.has("stress_magnitude"):
        yielded = view.scalar(fields["stress_magnitude"]) / case.yield_stress - 1.
    if slow is None and yielded is None:
        return None
    if slow is None:
        return yielded, numpy.ones_like(yielded)
    if yielded is None:
        return slow, slow
    return numpy.minimum(yielded, slow), numpy.maximum(slow, -yielded)


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

"""Reading a Lentus case folder: summary.json (every result and the numerics: the pictures
and the report read their facts from it, never from log.txt), case.prm, exit_profile.csv and
the fields (fields.pvd -> .pvtu -> .vtu pieces, ASCII or base64, zlib or not).

Only the standard library and numpy: the folder can be read without matplotlib.
"""
import base64
import csv
import json
import os
import xml.etree.ElementTree as ElementTree
import zlib

import numpy

_VTK_TYPES = {"Float32": "<f4", "Float64": "<f8", "Int8": "<i1", "UInt8": "<u1", "Int16": "<i2",
              "UInt16": "<u2", "Int32": "<i4", "UInt32": "<u4", "Int64": "<i8", "UInt64": "<u8"}


def read_summary(folder):
    with open(os.path.join(folder, "summary.json"), encoding="utf-8") as handle:
        return json.load(handle)


def read_case(folder):
    """case.prm as {"Section/Subsection/Key": value} and the list of keys set to a
    value other than the default (deal.II marks those with '# default: ...')."""
    values, changed, stack = {}, [], []
    path = os.path.join(folder, "case.prm")
    if not os.path.exists(path):
        return values, changed
    with open(path, encoding="utf-8") as handle:
        for line in handle:
            text = line.strip()
            if not text or text.startswith("#"):
                continue
            if text.startswith("subsection "):
                stack.append(text[len("subsection "):].split("#")[0].strip())
            elif text == "end" or text.startswith("end "):
                if stack:
                    stack.pop()
            elif text.startswith("set "):
                key, _, rest = text[4:].partition("=")
                value, _, comment = rest.partition("#")
                name = "/".join(stack + [key.strip()])
                values[name] = value.strip()
                if comment.strip().startswith("default:"):
                    changed.append(name)
    return values, changed


def velocity_components(summary):
    """summary.json's "velocity components" as a list: ["x", "y"], ["r", "z"] or ["r", "z", "theta"]."""
    return str(summary.get("velocity components", "")).split()


def is_axisymmetric(summary):
    """Axisymmetric cases solve for the radial and axial components (r z, or r z theta with swirl)."""
    components = velocity_components(summary)
    return bool(components) and components[0] == "r"


def meshes(summary):
    """numerics/meshes of summary.json: one dict per mesh, coarsest first, the last is the final mesh."""
    return list(summary.get("numerics", {}).get("meshes", []) or [])


def solves(summary):
    """numerics/solves of summary.json: every nonlinear solve in order (one per mesh, several under
    continuation); a solve is a dict with "mesh" (index into meshes), "label", "initial residual"
    and "iterations" (dicts with "kind", "residual", "step", "linear iterations", "seconds")."""
    return list(summary.get("numerics", {}).get("solves", []) or [])


def read_exit_profile(folder):
    """exit_profile.csv as (header, array) or None."""
    path = os.path.join(folder, "exit_profile.csv")
    if not os.path.exists(path):
        return None
    with open(path, newline="", encoding="utf-8") as handle:
        rows = list(csv.reader(handle))
    if len(rows) < 2:
        return None
    return rows[0], numpy.array([[float(value) for value in row] for row in rows[1:] if row], dtype=float)


def _decode_binary(text, dtype, compressed, header_type):
    """One base64 DataArray of the VTK XML format, with or without zlib blocks."""
    header_size = numpy.dtype(header_type).itemsize
    text = "".join(text.split())
    if not compressed:
        raw = base64.b64decode(text)
        n_bytes = int(numpy.frombuffer(raw[:header_size], dtype=header_type)[0])
        return numpy.frombuffer(raw[header_size:header_size + n_bytes], dtype=dtype)
    # The header (number of blocks, block size, last block size, compressed sizes) is encoded
    # on its own; its first three entries fill a whole number of base64 quanta when 4-byte.
    first = base64.b64decode(text[:4 * ((3 * header_size + 2) // 3)])
    n_blocks = int(numpy.frombuffer(first[:header_size], dtype=header_type)[0])
    header_bytes = (3 + n_blocks) * header_size
    header_chars = 4 * ((header_bytes + 2) // 3)
    header = numpy.frombuffer(base64.b64decode(text[:header_chars])[:header_bytes], dtype=header_type)
    sizes = [int(size) for size in header[3:3 + n_blocks]]
    try:
        data = base64.b64decode(text[header_chars:])
    except ValueError:
        data = base64.b64decode(text)[header_bytes:]  # header and data encoded together
    blocks, offset = [], 0
    for size in sizes:
        blocks.append(zlib.decompress(data[offset:offset + size]))
        offset += size
    return numpy.frombuffer(b"".join(blocks), dtype=dtype)


def _data_array(element, compressed, header_type):
    dtype = _VTK_TYPES[element.get("type", "Float32")]
    components = int(element.get("NumberOfComponents", "1"))
    form = element.get("format", "ascii")
    if form == "ascii":
        values = numpy.array((element.text or "").split(), dtype=float).astype(dtype)
    elif form == "binary":
        values = _decode_binary(element.text or "", dtype, compressed, header_type)
    else:
        raise ValueError("VTU data format '%s' is not read here (ascii or binary only)" % form)
    return values.reshape(-1, components) if components > 1 else values


def _read_piece(path):
    root = ElementTree.parse(path).getroot()
    compressed = root.get("compressor", "") != ""
    header_type = _VTK_TYPES[root.get("header_type", "UInt32")]
    piece = root.find("UnstructuredGrid/Piece")
    points = _data_array(piece.find("Points/DataArray"), compressed, header_type)
    cells = {array.get("Name"): _data_array(array, compressed, header_type) for array in piece.find("Cells")}
    fields = {}
    point_data = piece.find("PointData")
    if point_data is not None:
        for array in point_data:
            fields[array.get("Name")] = _data_array(array, compressed, header_type).astype(float)
    offsets = cells["offsets"].astype(int)
    types = cells["types"].astype(int)
    connectivity = cells["connectivity"].astype(int)
    if not numpy.all(types == 9) or not numpy.all(numpy.diff(numpy.concatenate(([0], offsets))) == 4):
        raise ValueError("%s: only quadrilateral cells (VTK type 9) are drawn" % path)
    return points[:, :2].astype(float), connectivity.reshape(-1, 4), fields


def _piece_files(folder):
    pvd = os.path.join(folder, "fields.pvd")
    if not os.path.exists(pvd):
        return []
    records = [element.get("file") for element in ElementTree.parse(pvd).getroot().iter("DataSet")]
    pieces = []
    for record in records[-1:]:
        path = os.path.join(folder, record)
        if record.endswith(".pvtu"):
            for piece in ElementTree.parse(path).getroot().iter("Piece"):
                pieces.append(os.path.join(os.path.dirname(path), piece.get("Source")))
        else:
            pieces.append(path)
    return pieces


def _patches(n_points, quads):
    """deal.II's DataOut writes each cell as a patch: n x n quadrilaterals on (n + 1)^2 points of
    its own (n: the subdivisions of build_patches), patch after patch. The cell index of every
    quadrilateral when a piece is laid out so, else None (points shared between cells)."""
    for n in range(1, 17):
        if len(quads) % (n * n) or n_points != len(quads) // (n * n) * (n + 1) ** 2:
            continue
        cells = numpy.arange(len(quads)) // (n * n)
        if numpy.all(quads // (n + 1) ** 2 == cells[:, None]):
            return cells
    return None


def _unique_edges(edges, n_points):
    """Edges (pairs of point indices, either order) once each, and how often each occurs."""
    pairs = numpy.sort(edges, axis=1).astype(numpy.int64)
    keys, counts = numpy.unique(pairs[:, 0] * n_points + pairs[:, 1], return_counts=True)
    return numpy.stack([keys // n_points, keys % n_points], axis=1), counts


def _quad_edges(quads):
    return numpy.concatenate([quads[:, [i, (i + 1) % 4]] for i in range(4)])


def _single_edges(n_points, quads):
    """Edges of the quadrilaterals that belong to one quadrilateral only: the boundary, and where
    the mesh has hanging points, both sides of the edges there."""
    edges, counts = _unique_edges(_quad_edges(quads), n_points)
    return edges[counts == 1]


def _hanging_points(points, single):
    """Where a cell meets two finer ones, the finer side has points in the middle of the coarser
    side's edges (hanging points; at most one level apart, one point per edge). Returns (a, b, p):
    the edge a-b of the coarser side and its hanging point p. Such edges and the two halves a-p,
    p-b are `single` edges (of one quadrilateral each), like the edges of the boundary; p has no
    other single edge, and it lies on a-b."""
    n_points = len(points)
    degree = numpy.bincount(single.reshape(-1), minlength=n_points)
    ends = numpy.concatenate([single, single[:, ::-1]])  # (point, neighbour), both ways
    ends = ends[degree[ends[:, 0]] == 2]
    ends = ends[numpy.argsort(ends[:, 0], kind="stable")]
    p, a, b = ends[0::2, 0], ends[0::2, 1], ends[1::2, 1]
    pair = numpy.sort(numpy.stack([a, b], axis=1), axis=1)
    joined = numpy.isin(pair[:, 0] * n_points + pair[:, 1], single[:, 0] * n_points + single[:, 1])
    length = lambda i, j: numpy.linalg.norm(points[i] - points[j], axis=1)
    on_edge = length(a, p) + length(p, b) <= (1. + 1e-9) * length(a, b)
    keep = joined & on_edge
    return a[keep], b[keep], p[keep]


def _conforming_triangles(points, quads):
    """Two triangles per quadrilateral ([0, 1, 2] and [0, 2, 3]); a triangle with a hanging point
    on an edge is split in two there, so that the triangles meet edge to edge (matplotlib's
    triangle finder, behind the sampled images and the streamlines, refuses them otherwise).
    Returns the triangles and the quadrilateral of each."""
    n_points, n_quads = len(points), len(quads)
    triangles = numpy.concatenate([quads[:, [0, 1, 2]], quads[:, [0, 2, 3]]]).astype(numpy.int64)
    owners = numpy.concatenate([numpy.arange(n_quads), numpy.arange(n_quads)])
    a, b, p = _hanging_points(points, _single_edges(n_points, quads))
    while len(p):  # a triangle with hanging points on two edges is split once per pass
        # The triangle holding each edge a-b (an edge of one quadrilateral: of one triangle).
        ends = numpy.sort(numpy.stack([triangles, numpy.roll(triangles, -1, axis=1)], axis=2), axis=2)
        keys = (ends[..., 0] * n_points + ends[..., 1]).reshape(-1)
        order = numpy.argsort(keys, kind="stable")
        wanted = numpy.minimum(a, b) * n_points + numpy.maximum(a, b)
        found = order[numpy.minimum(numpy.searchsorted(keys[order], wanted), len(keys) - 1)]
        if not numpy.all(keys[found] == wanted):
            raise ValueError("a hanging point's edge is no triangle's")
        index, turn = found // 3, found % 3
        now = numpy.zeros(len(p), dtype=bool)
        now[numpy.unique(index, return_index=True)[1]] = True
        index, turn, split = index[now], turn[now], p[now]
        rows = triangles[index]
        start = rows[numpy.arange(len(rows)), turn]
        end = rows[numpy.arange(len(rows)), (turn + 1) % 3]
        opposite = rows[numpy.arange(len(rows)), (turn + 2) % 3]
        triangles[index] = numpy.stack([start, split, opposite], axis=1)  # the same sense of rotation
        triangles = numpy.concatenate([triangles, numpy.stack([split, end, opposite], axis=1)])
        owners = numpy.concatenate([owners, owners[index]])
        a, b, p = a[~now], b[~now], p[~now]
    return triangles, owners


class Fields:
    """The fields of a case on one quadrilateral mesh with every point once
    (points shared by neighbouring patches merged, their values averaged). When the files
    hold one patch per cell (deal.II's DataOut), `cells` gives the cell of every
    quadrilateral and `cell_edges` the edges of the cells (else both are None)."""

    def __init__(self, points, quads, values, cells=None, cell_edges=None):
        self.points, self.quads, self.values = points, quads, values
        self.cells, self.cell_edges = cells, cell_edges
        self._triangles = self._triangle_quads = None

    def has(self, name):
        return name in self.values

    def __getitem__(self, name):
        return self.values[name]

    def n_cells(self):
        """The number of cells (None when the files do not say which quadrilaterals form a cell)."""
        if self.cells is None:
            return None
        return int(self.cells.max()) + 1 if len(self.cells) else 0

    def triangles(self):
        """Two triangles per quadrilateral, edge to edge where the mesh has hanging points (see
        _conforming_triangles); triangle_quads() gives the quadrilateral of each."""
        if self._triangles is None:
            self._triangles, self._triangle_quads = _conforming_triangles(self.points, self.quads)
        return self._triangles

    def triangle_quads(self):
        """The quadrilateral each triangle of triangles() lies in."""
        self.triangles()
        return self._triangle_quads

    def boundary_edges(self):
        """Edges of the quadrilaterals on the boundary of the part: those that belong to one
        quadrilateral only, without the edges on either side of hanging points."""
        n_points = len(self.points)
        single = _single_edges(n_points, self.quads)
        a, b, p = _hanging_points(self.points, single)
        inner = numpy.sort(numpy.stack([numpy.concatenate([a, a, p]), numpy.concatenate([b, p, b])], axis=1), axis=1)
        keys = single[:, 0] * n_points + single[:, 1]
        return single[~numpy.isin(keys, inner[:, 0] * n_points + inner[:, 1])]


def read_fields(folder):
    """The fields of the last record of fields.pvd, or None if there are none."""
    pieces = _piece_files(folder)
    if not pieces:
        return None
    return read_pieces(pieces)


def read_pieces(pieces):
    """The .vtu files `pieces` (the pieces of one mesh, one per rank) as one Fields."""
    all_points, all_quads, all_values, offset = [], [], {}, 0
    all_cells, outlines, n_cells = [], [], 0
    for path in pieces:
        points, quads, values = _read_piece(path)
        cells = _patches(len(points), quads)
        if cells is None or all_cells is None:
            all_cells = None
        else:
            all_cells.append(cells + n_cells)
            n_cells += int(cells[-1]) + 1 if len(cells) else 0
            # The patches share no points in the file: the edges of a piece's quadrilaterals that no
            # other one shares are the outlines of its cells (each cell edge in n pieces).
            outlines.append(_single_edges(len(points), quads) + offset)
        all_points.append(points)
        all_quads.append(quads + offset)
        offset += len(points)
        for name, value in values.items():
            all_values.setdefault(name, []).append(value)
    points = numpy.concatenate(all_points)
    quads = numpy.concatenate(all_quads)
    values = {name: numpy.concatenate(parts) for name, parts in all_values.items()}
    # Merge coincident points (a tolerance of 1e-9 of the extent).
    extent = max(float(numpy.ptp(points[:, 0])), float(numpy.ptp(points[:, 1])), 1e-300)
    keys = numpy.round((points - points.min(axis=0)) / (extent * 1e-9)).astype(numpy.int64)
    _, first, inverse = numpy.unique(keys, axis=0, return_index=True, return_inverse=True)
    inverse = inverse.reshape(-1)
    counts = numpy.bincount(inverse)
    merged = {}
    for name, value in values.items():
        if value.ndim == 1:
            merged[name] = numpy.bincount(inverse, weights=value) / counts
        else:
            merged[name] = numpy.stack([numpy.bincount(inverse, weights=value[:, c]) / counts
                                        for c in range(value.shape[1])], axis=1)
    cells = cell_edges = None
    if all_cells is not None:
        cells = numpy.concatenate(all_cells)
        # An edge between two cells comes once from each: kept once.
        cell_edges = _unique_edges(inverse[numpy.concatenate(outlines)], len(first))[0]
    return Fields(points[first], inverse[quads], merged, cells, cell_edges)


def design_number_text(value):
    """A design number as the report prints it: 6 significant digits."""
    if value is None:
        return "not computed"
    return "%.6g" % value


#!/usr/bin/env python3
"""Checks of the picture step of `lentus run` (label: pictures).

  check_pictures.py folder FOLDER [--swirl-outline]
      The pictures a case folder supports exist and are not blank, every picture the
      report shows exists, and report.html holds every design number of summary.json
      (name, symbol, value to its 6 printed digits, unit; the key ones also as cards at the
      top), every numerics entry, a row per mesh and per solve, the status, the caution
      and the case cautions; the mesh picture's caption names as many cells as summary.json's
      final mesh has. --swirl-outline: also the swirl-speed picture with a cavern outline.
  check_pictures.py mesh FOLDER PREVIEW
      The cell edges mesh.png draws (from FOLDER's fields, several patches per cell) are the
      edges of the cells of `lentus mesh` for the same case (PREVIEW/mesh_cells.vtu, one
      quadrilateral per cell): as many cells, the same total edge length, every cell corner
      an end of a drawn edge.
  check_pictures.py hanging WORK
      A mesh with hanging points (cells next to finer ones, as adaptive refinement leaves
      them), written into WORK as DataOut lays out its patches (2 x 2 per cell, points of
      their own): the triangles of the pictures meet edge to edge, cover the part once and
      matplotlib's triangle finder takes them; the outline is the boundary alone; the mesh
      picture's edges are the cells' edges; mesh.png and pressure.png are drawn.
  check_pictures.py browser FOLDER [--width PX] [--screenshot PNG]
      report.html in headless Chromium at PX (1280) px wide: no horizontal overflow, every
      design number's row and key card inside the window and visible, no name wrapped onto
      more than two lines, every picture loaded and inside the window. Exit 77 (skipped) when
      chromium is not installed.
The runs themselves are lentus_cli_test()s (tests/CMakeLists.txt).
"""
import argparse
import html
import json
import os
import re
import shutil
import subprocess
import sys
import tempfile

SKIP = 77  # ctest's SKIP_RETURN_CODE of the browser checks

# The drawing scripts' reader of case folders (the mesh check asks it which edges mesh.png draws).
SCRIPTS = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "..", "scripts")

# Not blank: the variance of the grey levels (0..1) of a picture must be above a floor.
# Floors (common practice: set from a measurement, not a published value): a white page
# has 0; an empty set of axes with labels measured 0.008 here, with a colour bar 0.015;
# drawn pictures measured 0.017-0.024 (line plots) and 0.04-0.12 (field maps).
LINE_PLOT_FLOOR = 0.012
FIELD_MAP_FLOOR = 0.025
FIELD_MAPS = ("flow_map.png", "pressure.png", "shear_rate.png", "viscosity.png", "swirl_speed.png", "mesh.png")


def fail(message):
    sys.stderr.write("FAILED: %s\n" % message)
    sys.exit(1)


def grey_variance(path):
    import matplotlib.image
    image = matplotlib.image.imread(path)
    if image.ndim == 3:
        image = image[..., :3].mean(axis=2)
    if image.shape[0] < 200 or image.shape[1] < 300:
        fail("%s: only %dx%d pixels" % (path, image.shape[1], image.shape[0]))
    return float(image.var())


def expected_pictures(folder):
    names = ["flow_curve.png", "convergence.png"]
    pvtu = [name for name in os.listdir(folder) if name.endswith(".pvtu") or name.endswith(".vtu")]
    if pvtu:
        names += ["flow_map.png", "pressure.png", "shear_rate.png", "mesh.png"]
        with open(os.path.join(folder, sorted(pvtu)[0]), encoding="utf-8", errors="replace") as handle:
            head = handle.read(4000)
        if 'Name="swirl_velocity"' in head:
            names.append("swirl_speed.png")
    if pvtu and os.path.exists(os.path.join(folder, "exit_profile.csv")):
        names.append("die_profiles.png")
    return names


def check_folder(folder, swirl_outline):
    with open(os.path.join(folder, "summary.json"), encoding="utf-8") as handle:
        summary = json.load(handle)
    report_path = os.path.join(folder, "report.html")
    if not os.path.exists(report_path):
        fail("no report.html in %s" % folder)
    with open(report_path, encoding="utf-8") as handle:
        report = handle.read()

    shown = re.findall(r'<img src="([^"]+)"', report)
    for name in sorted(set(expected_pictures(folder)) | set(shown)):
        path = os.path.join(folder, name)
        if not os.path.exists(path):
            fail("picture %s missing" % path)
        if name not in shown:
            fail("report.html does not show %s" % name)
        variance = grey_variance(path)
        floor = FIELD_MAP_FLOOR if name in FIELD_MAPS else LINE_PLOT_FLOOR
        if not variance > floor:
            fail("%s looks blank: grey-level variance %.4f, floor %.4f" % (path, variance, floor))
        print("%-18s variance %.4f (floor %.3f)" % (name, variance, floor))

    # The mesh picture is of the final mesh: its caption names summary.json's number of cells.
    if "mesh.png" in shown:
        caption = re.search(r'<img src="mesh.png"[^>]*><figcaption>(.*?)</figcaption>', report, re.S)
        drawn = re.search(r"The final mesh: (\d+) cells", caption.group(1)) if caption else None
        cells = summary.get("numerics", {}).get("cells")
        if drawn is None or int(drawn.group(1)) != cells:
            fail("mesh.png: the caption names %s cells, summary.json's final mesh has %s" % (
                drawn.group(1) if drawn else "no number of", cells))
        print("mesh.png draws the %d cells of the final mesh" % cells)

    # Every design number: its row holds the name, the symbol, the value to its 6 printed digits
    # and the unit; every key number also has its card at the top.
    rows = {}
    for name, cells in re.findall(r'<tr class="number[^"]*" data-design-number="([^"]*)">(.*?)</tr>', report):
        cell = dict((kind, html.unescape(text)) for kind, text in re.findall(r'<td class="(\w+)">([^<]*)</td>', cells))
        rows[html.unescape(name)] = cell
    cards = {html.unescape(name) for name in re.findall(r'data-key-number="([^"]*)"', report)}
    numbers = summary["design numbers"]
    if not numbers:
        fail("summary.json has no design numbers")
    for name, entry in numbers.items():
        if name not in rows:
            fail("report.html lacks the design number '%s'" % name)
        row = rows[name]
        for field in ("unit", "symbol"):
            if row.get(field, "") != entry.get(field, ""):
                fail("'%s': %s '%s' in the report, '%s' in summary.json" % (name, field, row.get(field),
                                                                          entry.get(field)))
        if entry.get("key", False) != (name in cards):
            fail("'%s': key %s in summary.json, %s the key numbers of the report" % (
                name, entry.get("key", False), "among" if name in cards else "not among"))
        value, text = entry["value"], row.get("value")
        if value is None:
            if text != "not computed":
                fail("'%s' is null in summary.json but '%s' in the report" % (name, text))
            continue
        # Printed with 6 significant digits: relative rounding error at most 5e-6.
        if abs(float(text) - value) > 5.1e-6 * abs(value) + 1e-300:
            fail("'%s': %s in the report, %r in summary.json" % (name, text, value))
    if len(rows) != len(numbers):
        fail("report.html shows %d design numbers, summary.json has %d" % (len(rows), len(numbers)))
    print("%d design numbers (%d key) found in report.html" % (len(numbers), len(cards)))
    numerics = summary.get("numerics", {})
    for key, value in numerics.items():
        if isinstance(value, (list, dict)):
            continue
        if 'data-numerics="%s"' % html.escape(key) not in report:
            fail("report.html lacks the numerics entry '%s'" % key)
    for table, records in (("meshes", numerics.get("meshes", [])), ("solves", numerics.get("solves", []))):
        match = re.search(r'<table class="%s">(.*?)</table>' % table, report, re.S)
        n_rows = len(re.findall(r"<tr>", match.group(1))) - 1 if match else 0
        if n_rows != len(records):
            fail("report.html's %s table has %d rows, summary.json lists %d" % (table, n_rows, len(records)))
    caution = summary["caution"]
    if "fail and hurt people" not in caution:
        fail("summary.json's caution is not the full one: %s" % caution)
    for text in [caution] + list(summary.get("case cautions", [])):
        if html.escape(text) not in report:
            fail("report.html lacks the caution of summary.json: %s" % text)
    status = "Converged" if summary["converged"] else "NOT CONVERGED"
    if status not in report:
        fail("report.html lacks the status '%s'" % status)
    if swirl_outline:
        if "swirl_speed.png" not in shown:
            fail("no swirl speed picture in the report")
        if "cavern outline" not in report:
            fail("the report does not mention the cavern outline")


def check_mesh(folder, preview):
    """The cell edges mesh.png draws against the cells of `lentus mesh` (one quadrilateral per cell)."""
    import numpy
    sys.path.insert(0, SCRIPTS)
    import case_folder
    fields = case_folder.read_fields(folder)
    if fields is None or fields.cell_edges is None:
        fail("%s: no fields, or the fields do not tell the cells apart" % folder)
    cells = case_folder.read_pieces([os.path.join(preview, "mesh_cells.vtu")])
    if fields.n_cells() != len(cells.quads):
        fail("mesh.png draws %s cells, lentus mesh has %d" % (fields.n_cells(), len(cells.quads)))
    # The preview's cell edges, each once, from its quadrilaterals.
    edges = numpy.sort(numpy.concatenate([cells.quads[:, [i, (i + 1) % 4]] for i in range(4)]), axis=1)
    edges = numpy.unique(edges, axis=0)

    def length(points, pairs):
        return float(numpy.linalg.norm(points[pairs[:, 0]] - points[pairs[:, 1]], axis=1).sum())
    drawn, expected = length(fields.points, fields.cell_edges), length(cells.points, edges)
    # Points are written in single precision: lengths agree to some 1e-7 relative.
    if abs(drawn - expected) > 1e-5 * expected:
        fail("mesh.png draws cell edges of total length %.9g m, the cells of lentus mesh have %.9g m" % (
            drawn, expected))
    size = max(numpy.ptp(cells.points[:, 0]), numpy.ptp(cells.points[:, 1]))
    ends = {tuple(point) for point in numpy.round(fields.points[fields.cell_edges.reshape(-1)] / (1e-6 * size))}
    corners = [tuple(point) for point in numpy.round(cells.points / (1e-6 * size))]
    missing = sum(1 for corner in corners if corner not in ends)
    if missing:
        fail("%d of the %d cell corners of lentus mesh are no end of an edge mesh.png draws" % (missing, len(corners)))
    print("mesh.png draws the %d cells of lentus mesh: %d edges, %.6g m of edges, every corner" % (
        len(cells.quads), len(edges), drawn))


# The mesh of the hanging-point check: 2 x 2 unit cells on [0, 2]^2; the lower left and the upper right
# refined once, the upper right child of the upper right again: 2 + 4 + 3 + 4 = 13 cells. The upper left
# cell has finer neighbours on two sides, so one of its triangles has hanging points on two edges.
def hanging_cells():
    def split(x, y, size):
        half = size / 2.
        return [(x, y, half), (x + half, y, half), (x, y + half, half), (x + half, y + half, half)]
    lower_left, upper_right = split(0., 0., 1.), split(1., 1., 1.)
    return [(1., 0., 1.), (0., 1., 1.)] + lower_left + upper_right[:3] + split(1.5, 1.5, .5)


def write_patches(path, cells, subdivisions):
    """An ASCII .vtu of square cells (x, y, size) laid out as deal.II's DataOut writes patches: per
    cell (n + 1)^2 points of its own, x running fastest, then n^2 quadrilaterals; a field
    pressure = x + 2 y."""
    n = subdivisions
    points, quads = [], []
    for x, y, size in cells:
        base = len(points)
        points += [(x + size * i / n, y + size * j / n) for j in range(n + 1) for i in range(n + 1)]
        quads += [(base + j * (n + 1) + i, base + j * (n + 1) + i + 1, base + (j + 1) * (n + 1) + i + 1,
                   base + (j + 1) * (n + 1) + i) for j in range(n) for i in range(n)]
    text = " ".join
    with open(path, "w", encoding="utf-8") as handle:
        handle.write('<?xml version="1.0"?>\n'
                     '<VTKFile type="UnstructuredGrid" version="0.1" byte_order="LittleEndian">\n'
                     '<UnstructuredGrid><Piece NumberOfPoints="%d" NumberOfCells="%d">\n' % (len(points), len(quads)))
        handle.write('<Points><DataArray type="Float64" NumberOfComponents="3" format="ascii">%s</DataArray>'
                     '</Points>\n' % text("%r %r 0" % point for point in points))
        handle.write('<Cells><DataArray type="Int32" Name="connectivity" format="ascii">%s</DataArray>\n'
                     '<DataArray type="Int32" Name="offsets" format="ascii">%s</DataArray>\n'
                     '<DataArray type="UInt8" Name="types" format="ascii">%s</DataArray></Cells>\n' % (
                         text("%d %d %d %d" % quad for quad in quads),
                         text(str(4 * (k + 1)) for k in range(len(quads))), text("9" for quad in quads)))
        handle.write('<PointData><DataArray type="Float64" Name="pressure" format="ascii">%s</DataArray></PointData>\n'
                     '</Piece></UnstructuredGrid></VTKFile>\n' % text("%r" % (x + 2. * y) for x, y in points))


def check_hanging(work):
    """Pictures of a mesh with hanging points (hanging_cells)."""
    import numpy
    sys.path.insert(0, SCRIPTS)
    import matplotlib
    matplotlib.use("Agg")
    from matplotlib.tri import Triangulation
    import case_folder
    import draw_case
    from case_view import View
    cells = hanging_cells()
    folder = os.path.join(work, "hanging_mesh")
    os.makedirs(folder, exist_ok=True)
    write_patches(os.path.join(folder, "fields_00.0.vtu"), cells, 2)
    with open(os.path.join(folder, "fields.pvd"), "w", encoding="utf-8") as handle:
        handle.write('<?xml version="1.0"?>\n<VTKFile type="Collection" version="0.1"><Collection>'
                     '<DataSet timestep="0" part="0" file="fields_00.0.vtu"/></Collection></VTKFile>\n')
    with open(os.path.join(folder, "summary.json"), "w", encoding="utf-8") as handle:
        json.dump({"velocity components": "x y", "design numbers": {}}, handle)
    fields = case_folder.read_fields(folder)
    points = fields.points
    if fields.n_cells() != len(cells):
        fail("hanging points: %s cells read, %d written" % (fields.n_cells(), len(cells)))

    # The triangles: one sense of rotation, the area of the part (4 m^2) once, every edge inside the
    # part shared by exactly two triangles (edge to edge), and matplotlib's triangle finder takes them.
    triangles = fields.triangles()
    corner = points[triangles]
    signed = 0.5 * ((corner[:, 1, 0] - corner[:, 0, 0]) * (corner[:, 2, 1] - corner[:, 0, 1]) -
                    (corner[:, 2, 0] - corner[:, 0, 0]) * (corner[:, 1, 1] - corner[:, 0, 1]))
    if not (numpy.all(signed > 0.) or numpy.all(signed < 0.)):
        fail("hanging points: the triangles do not all turn the same way")
    if abs(numpy.abs(signed).sum() - 4.) > 1e-12:
        fail("hanging points: the triangles cover %.15g m^2 of a part of 4 m^2" % numpy.abs(signed).sum())
    edges = numpy.sort(numpy.concatenate([triangles[:, [0, 1]], triangles[:, [1, 2]], triangles[:, [2, 0]]]), axis=1)
    edges, counts = numpy.unique(edges, axis=0, return_counts=True)
    middle = 0.5 * (points[edges[:, 0]] + points[edges[:, 1]])
    on_boundary = numpy.any((numpy.abs(middle) < 1e-12) | (numpy.abs(middle - 2.) < 1e-12), axis=1)
    if numpy.any(counts[~on_boundary] != 2) or numpy.any(counts[on_boundary] != 1):
        fail("hanging points: %d triangle edges inside the part are not shared by two triangles" % numpy.sum(
            counts[~on_boundary] != 2))
    Triangulation(points[:, 0], points[:, 1], triangles).get_trifinder()

    # The outline: the boundary of the part alone, its whole length 8 m.
    outline = fields.boundary_edges()
    middle = 0.5 * (points[outline[:, 0]] + points[outline[:, 1]])
    if not numpy.all(numpy.any((numpy.abs(middle) < 1e-12) | (numpy.abs(middle - 2.) < 1e-12), axis=1)):
        fail("hanging points: the outline has edges inside the part")
    length = float(numpy.linalg.norm(points[outline[:, 0]] - points[outline[:, 1]], axis=1).sum())
    if abs(length - 8.) > 1e-12:
        fail("hanging points: the outline is %.15g m long, the boundary 8 m" % length)

    # The cell edges: every drawn edge lies on the outline of a cell and inside none; every cell's
    # outline is drawn all round (its perimeter covered by drawn edges lying on it).
    drawn = fields.cell_edges
    start, end = points[drawn[:, 0]], points[drawn[:, 1]]
    middle = 0.5 * (start + end)
    for x, y, size in cells:
        inside = ((middle[:, 0] > x + 1e-12) & (middle[:, 0] < x + size - 1e-12) & (middle[:, 1] > y + 1e-12) &
                  (middle[:, 1] < y + size - 1e-12))
        if numpy.any(inside):
            fail("hanging points: an edge is drawn through the cell at (%g, %g)" % (x, y))
        along = numpy.zeros(len(drawn), dtype=bool)
        for coordinate, value, low, high in ((0, x, y, y + size), (0, x + size, y, y + size), (1, y, x, x + size),
                                            (1, y + size, x, x + size)):
            other = 1 - coordinate
            along |= ((numpy.abs(start[:, coordinate] - value) < 1e-12)
                      & (numpy.abs(end[:, coordinate] - value) < 1e-12)
                      & (numpy.minimum(start[:, other], end[:, other]) >= low - 1e-12)
                      & (numpy.maximum(start[:, other], end[:, other]) <= high + 1e-12))
        covered = float(numpy.linalg.norm(end[along] - start[along], axis=1).sum())
        if covered < 4. * size - 1e-12:
            fail("hanging points: %.6g m of the %.6g m outline of the cell at (%g, %g) drawn" % (
                covered, 4. * size, x, y))

    # The pictures themselves.
    case = draw_case.Case(folder)
    view = View(case)
    caption = draw_case.picture_mesh(case, view, os.path.join(folder, "mesh.png"))
    draw_case.picture_pressure(case, view, os.path.join(folder, "pressure.png"))
    if ("The final mesh: %d cells" % len(cells)) not in caption or "black lines: the cell edges" not in caption:
        fail("hanging points: mesh.png's caption: %s" % caption)
    for name in ("mesh.png", "pressure.png"):
        variance = grey_variance(os.path.join(folder, name))
        if not variance > FIELD_MAP_FLOOR:
            fail("hanging points: %s looks blank: grey-level variance %.4f" % (name, variance))
    print("hanging points: %d cells, %d triangles edge to edge, outline 8 m, cell edges all round; mesh.png and "
          "pressure.png drawn" % (len(cells), len(triangles)))


# The layout check run in the page (headless Chromium): the page must not be wider than the window,
# every design number's row (and key card) must lie inside the window and be visible, and no name may
# wrap onto more than two lines. The verdict is written into the DOM as JSON for --dump-dom.
LAYOUT_SCRIPT = """
<script>
window.addEventListener("load", function () {
  var root = document.documentElement, width = root.clientWidth, problems = [], checked = [];
  if (root.scrollWidth > width)
    problems.push("the page is " + root.scrollWidth + " px wide in a window of " + width + " px");
  var all = document.body.getElementsByTagName("*"), wide = [];
  for (var i = 0; i < all.length && wide.length < 5; ++i) {
    var box = all[i].getBoundingClientRect();
    if (box.right > width + 0.5 && !all[i].closest(".scroll"))
      wide.push(all[i].tagName.toLowerCase() + (all[i].className ? "." + all[i].className : "") + " ends at " +
                Math.round(box.right) + " px");
  }
  if (wide.length) problems.push("beyond the right edge: " + wide.join("; "));
  document.querySelectorAll(".scroll, pre").forEach(function (element) {
    if (element.scrollWidth > element.clientWidth + 1)
      problems.push(element.tagName.toLowerCase() + "." + element.className + " needs scrolling sideways (" +
                    element.scrollWidth + " px of content in " + element.clientWidth + " px)");
  });
  function visible(element, what) {
    var box = element.getBoundingClientRect();
    if (box.width <= 0 || box.height <= 0) return what + ": no size";
    if (box.left < -0.5 || box.right > width + 0.5) return what + ": outside the window (" + Math.round(box.left) +
      " to " + Math.round(box.right) + " px)";
    if (element.checkVisibility && !element.checkVisibility({checkOpacity: true, checkVisibilityCSS: true}))
      return what + ": hidden";
    return "";
  }
  function lines(element) {  // text boxes whose tops differ by more than half a line start new lines
    var range = document.createRange(), tops = [], count = 0, last = -1e9;
    range.selectNodeContents(element);
    var boxes = range.getClientRects(), half = 0.5 * parseFloat(getComputedStyle(element).fontSize);
    for (var k = 0; k < boxes.length; ++k) tops.push(boxes[k].top);
    tops.sort(function (a, b) { return a - b; });
    tops.forEach(function (top) { if (top - last > half) { ++count; last = top; } });
    return count;
  }
  document.querySelectorAll("[data-design-number], [data-key-number]").forEach(function (element) {
    var name = element.getAttribute("data-design-number") || element.getAttribute("data-key-number");
    var where = element.hasAttribute("data-key-number") ? "key card" : "row";
    var cells = element.tagName === "TR" ? element.children : [element];
    for (var c = 0; c < cells.length; ++c) {
      var problem = visible(cells[c], "'" + name + "' (" + where + ")");
      if (problem) problems.push(problem);
    }
    var label = element.querySelector(".name") || element;
    if (lines(label) > 2) problems.push("'" + name + "' (" + where + "): the name wraps onto " + lines(label) +
                                        " lines");
    checked.push([where, name]);
  });
  document.querySelectorAll("figure img").forEach(function (image) {
    var name = image.getAttribute("src");
    if (!image.complete || image.naturalWidth === 0) problems.push("picture " + name + " did not load");
    else {
      var problem = visible(image, "picture " + name);
      if (problem) problems.push(problem);
    }
    checked.push(["picture", name]);
  });
  var verdict = document.createElement("pre");
  verdict.id = "layout-verdict";
  verdict.textContent = JSON.stringify({width: width, scrollWidth: root.scrollWidth, problems: problems,
                                        checked: checked});
  document.body.appendChild(verdict);
});
</script>
"""


def chromium():
    for name in ("chromium", "chromium-browser", "google-chrome"):
        path = shutil.which(name)
        if path:
            return path
    return None


def run_chromium(browser, width, profile, extra):
    command = [browser, "--headless", "--no-sandbox", "--disable-gpu", "--user-data-dir=" + profile,
               "--window-size=%d,2000" % width, "--virtual-time-budget=10000"] + extra
    result = subprocess.run(command, capture_output=True, text=True, check=False, timeout=180)
    if result.returncode != 0:
        fail("%s exited with %d: %s" % (" ".join(command), result.returncode, result.stderr[-2000:]))
    return result.stdout


def check_browser(folder, width, screenshot):
    """report.html of FOLDER in headless Chromium at WIDTH px: no horizontal overflow, every design
    number of summary.json (and every key number) inside the window and visible."""
    browser = chromium()
    if browser is None:
        print("SKIPPED: chromium is not installed (apt-get install chromium): report.html layout not checked")
        sys.exit(SKIP)
    with open(os.path.join(folder, "summary.json"), encoding="utf-8") as handle:
        summary = json.load(handle)
    with open(os.path.join(folder, "report.html"), encoding="utf-8") as handle:
        page = handle.read()
    if "</body>" not in page:
        fail("report.html has no </body>")
    probe = os.path.join(folder, ".report_layout_check.html")  # beside report.html: the pictures load
    with open(probe, "w", encoding="utf-8") as handle:
        handle.write(page.replace("</body>", LAYOUT_SCRIPT + "</body>"))
    profile = tempfile.mkdtemp(prefix="lentus_chromium_")
    try:
        dom = run_chromium(browser, width, profile, ["--dump-dom", "file://" + os.path.abspath(probe)])
        if screenshot:
            run_chromium(browser, width, profile, ["--screenshot=" + os.path.abspath(screenshot),
                                                   "file://" + os.path.abspath(os.path.join(folder, "report.html"))])
            print("screenshot: %s" % screenshot)
    finally:
        shutil.rmtree(profile, ignore_errors=True)
        os.remove(probe)
    match = re.search(r'<pre id="layout-verdict">(.*?)</pre>', dom, re.S)
    if not match:
        fail("the layout check did not run in Chromium (no verdict in the page)")
    verdict = json.loads(html.unescape(match.group(1)))
    print("window %d px (%d px inside the scroll bar), page %d px wide; %d rows, cards and pictures checked" % (
        width, verdict["width"], verdict["scrollWidth"], len(verdict["checked"])))
    rows = {name for where, name in verdict["checked"] if where == "row"}
    cards = {name for where, name in verdict["checked"] if where == "key card"}
    pictures = {name for where, name in verdict["checked"] if where == "picture"}
    numbers = summary["design numbers"]
    missing = [name for name in numbers if name not in rows]
    missing += ["%s (key card)" % name for name, entry in numbers.items() if entry.get("key") and name not in cards]
    missing += ["picture %s" % name for name in re.findall(r'<img src="([^"]+)"', page) if name not in pictures]
    problems = verdict["problems"] + ["'%s' is not in the page" % name for name in missing]
    if problems:
        fail("report.html at %d px:\n  %s" % (width, "\n  ".join(problems)))
    print("%d design numbers (%d key) and %d pictures inside the %d px window and visible; no horizontal overflow" % (
        len(rows), len(cards), len(pictures), verdict["width"]))


def main():
    parser = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    commands = parser.add_subparsers(dest="command", required=True)
    folder = commands.add_parser("folder")
    folder.add_argument("folder")
    folder.add_argument("--swirl-outline", action="store_true")
    mesh = commands.add_parser("mesh")
    mesh.add_argument("folder")
    mesh.add_argument("preview")
    hanging = commands.add_parser("hanging")
    hanging.add_argument("work")
    browser = commands.add_parser("browser")
    browser.add_argument("folder")
    browser.add_argument("--width", type=int, default=1280)
    browser.add_argument("--screenshot")
    arguments = parser.parse_args()
    if arguments.command == "folder":
        check_folder(arguments.folder, arguments.swirl_outline)
    elif arguments.command == "mesh":
        check_mesh(arguments.folder, arguments.preview)
    elif arguments.command == "hanging":
        check_hanging(arguments.work)
    else:
        check_browser(arguments.folder, arguments.width, arguments.screenshot)
    print("passed")
    return 0


if __name__ == "__main__":
    sys.exit(main())

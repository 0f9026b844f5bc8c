"""The one-page report of a Lentus case folder (report.html), every fact from summary.json:
status and cautions first, then the few design numbers a user came for (the "key" ones), every
design number (name, symbol, value, unit and the error estimate when there is one), the pictures,
the numerics (scalars, meshes and solves as tables) and the case inputs.

Laid out for a browser window of 1280 px and wider (scripts' pictures tests check it with
headless Chromium: no horizontal overflow, every design number inside the window and visible).
"""
import datetime
import html
import os

import case_folder

STYLE = """
* { box-sizing: border-box; }
body { font-family: sans-serif; margin: 1.2em auto; padding: 0 16px; max-width: 1250px; color: #111;
       font-size: 14px; line-height: 1.35; }
h1 { font-size: 1.5em; margin-bottom: 0.2em; } h2 { font-size: 1.2em; margin: 1.1em 0 0.4em; }
h3 { font-size: 1.0em; margin: 0.9em 0 0.3em; }
.overview { color: #333; }
.status { padding: 0.4em 0.7em; font-weight: bold; border-radius: 4px; }
.converged { background: #e3eef8; border-left: 6px solid #0072B2; }
.failed { background: #fbe5d6; border-left: 6px solid #D55E00; font-size: 1.1em; }
.caution { background: #fff4d6; border: 1px solid #E69F00; border-left: 8px solid #E69F00; padding: 0.5em 0.9em;
           margin: 0.7em 0; }
.caution h2 { margin: 0.2em 0 0.3em; }
.caution-text { font-weight: bold; margin: 0.3em 0; }
.caution ul { margin: 0.3em 0; padding-left: 1.3em; }
.caution h3 { font-size: 0.95em; margin: 0.6em 0 0.1em; }
.key-numbers { display: grid; grid-template-columns: repeat(auto-fill, minmax(230px, 1fr)); gap: 0.7em; }
.key-number { border: 1px solid #bcd; border-top: 4px solid #0072B2; border-radius: 4px; padding: 0.45em 0.7em;
              background: #f7fafd; }
.key-number .name { font-size: 0.95em; color: #222; }
.key-number .figure { font-family: monospace; font-size: 1.45em; font-weight: bold; margin-top: 0.2em;
                      white-space: nowrap; }
.key-number .unit { font-size: 0.75em; font-weight: normal; }
.key-number .symbol, td.symbol { font-family: monospace; color: #555; }
.key-number .error { font-family: monospace; font-size: 0.9em; color: #555; }
table { border-collapse: collapse; } td, th { padding: 3px 8px; border-bottom: 1px solid #ddd; text-align: left;
vertical-align: top; } th { background: #f0f0f0; }
table.wide { width: 100%; }
table.design-numbers { min-width: 60%; }
td.value, td.error, td.number { text-align: right; font-family: monospace; white-space: nowrap; }
td.error .parts { color: #555; font-size: 85%; }
th.number { text-align: right; }
td.unit { white-space: nowrap; }
tr.key td.name { font-weight: bold; }
tr.group th { background: #e8e8e8; font-weight: bold; }
.numerics { display: flex; flex-wrap: wrap; gap: 0 2.5em; align-items: flex-start; }
td.label { white-space: nowrap; }
.scroll { overflow-x: auto; max-width: 100%; }
.pictures { display: grid; grid-template-columns: 1fr 1fr; gap: 1em; }
figure { margin: 0; } figure img { max-width: 100%; height: auto; border: 1px solid #ccc; }
figcaption { font-size: 0.9em; }
pre { background: #f6f6f6; padding: 0.6em; font-size: 12px; overflow-x: auto; max-height: 30em; }
details { margin: 0.5em 0; } summary { cursor: pointer; }
.note { color: #444; font-size: 0.9em; }
@media print { .pictures { grid-template-columns: 1fr 1fr 1fr; } pre { max-height: none; } }
"""

GROUP_TITLES = {"flow": "Flow", "die": "Die", "vessel": "Vessel", "energy": "Energy", "regions": "Regions", "heat": "Heat"}


def _escape(value):
    return html.escape(str(value))


def _numeric_text(value):
    """A value of the numerics: integers as they are, reals to 6 significant digits."""
    if isinstance(value, bool):
        return "yes" if value else "no"
    if isinstance(value, float):
        return "%.6g" % value
    if value is None:
        return "-"
    return str(value)


def _error_text(entry):
    """The error bar of a design number (mesh + regularization error) with its parts, or "" when
    none was estimated."""
    parts = []
    for key, what in (("mesh error", "mesh"), ("regularization error", "regularization")):
        value = entry.get(key)
        if value is not None:
            parts.append("%s %s" % (what, _escape("%.2g" % abs(float(value)))))
    if not parts:
        return ""
    total = entry.get("error")
    if total is None:
        total = sum(abs(float(entry[key])) for key in ("mesh error", "regularization error") if entry.get(key) is not None)
    return "&plusmn; %s <span class=\"parts\">(%s)</span>" % (_escape("%.2g" % abs(float(total))), ", ".join(parts))


def _accuracy(summary):
    """How the error bars were obtained: the target, the regularization check, the meshes."""
    accuracy = summary.get("accuracy")
    if not isinstance(accuracy, dict):
        return ""
    rows = []
    if accuracy.get("target") not in (None, "none"):
        rows.append(("target relative error", "%g" % accuracy.get("target relative error")))
        rows.append(("target", accuracy.get("target status", "")))
    check = accuracy.get("regularization check", "")
    if accuracy.get("regularization factor"):
        check = "solved again at %g x M" % accuracy["regularization factor"]
    rows.append(("regularization check", check))
    meshes = accuracy.get("meshes") or []
    rows.append(("meshes for the mesh error", ", ".join("%d cells" % mesh.get("cells", 0) for mesh in meshes) or "one"))
    body = "\n".join('<tr><td class="label">%s</td><td>%s</td></tr>' % (_escape(name), _escape(value))
                     for name, value in rows)
    return ('<h2>Accuracy</h2>\n<p class="note">%s</p>\n<table class="accuracy">\n%s\n</table>' % (
        _escape(accuracy.get("error", "")), body))


def _has_errors(numbers):
    return any(entry.get("mesh error") is not None or entry.get("regularization error") is not None
               for entry in numbers.values())


def _key_numbers(numbers):
    cards = []
    for name, entry in numbers.items():
        if not entry.get("key", False):
            continue
        symbol = entry.get("symbol", "")
        error = _error_text(entry)
        cards.append('<div class="key-number" data-key-number="%s"><div class="name">%s%s</div>'
                     '<div class="figure">%s <span class="unit">%s</span></div>%s</div>' % (
                         _escape(name), _escape(name),
                         ' <span class="symbol">%s</span>' % _escape(symbol) if symbol else "",
                         _escape(case_folder.design_number_text(entry.get("value"))), _escape(entry.get("unit", "")),
                         '<div class="error">%s</div>' % error if error else ""))
    if not cards:
        return '<p class="note">summary.json marks no design number as a key number: see the full list.</p>'
    return '<div class="key-numbers">\n%s\n</div>' % "\n".join(cards)


def _number_table(numbers):
    """Every design number, grouped (flow, die, vessel, energy, regions) in summary.json's order."""
    errors = _has_errors(numbers)
    groups = []
    for entry in numbers.values():
        if entry.get("group", "") not in groups:
            groups.append(entry.get("group", ""))
    header = "<tr><th>design number</th><th>symbol</th><th class=\"number\">value</th>%s<th>unit</th></tr>" % (
        '<th class="number">&plusmn; error</th>' if errors else "")
    columns = 5 if errors else 4
    rows = [header]
    for group in groups:
        if len(groups) > 1 or group:
            rows.append('<tr class="group"><th colspan="%d">%s</th></tr>' % (
                columns, _escape(GROUP_TITLES.get(group, group or "other"))))
        for name, entry in numbers.items():
            if entry.get("group", "") != group:
                continue
            value = case_folder.design_number_text(entry.get("value"))
            rows.append('<tr class="number%s" data-design-number="%s"><td class="name">%s</td>'
                        '<td class="symbol">%s</td><td class="value">%s</td>%s<td class="unit">%s</td></tr>' % (
                            " key" if entry.get("key", False) else "", _escape(name), _escape(name),
                            _escape(entry.get("symbol", "")), _escape(value),
                            '<td class="error">%s</td>' % _error_text(entry) if errors else "",
                            _escape(entry.get("unit", ""))))
    return '<table class="design-numbers">\n%s\n</table>' % "\n".join(rows)


def _record_table(records, columns, first_column=None, css=""):
    """A list of dicts as a table: one row per record, one column per key (numbers right-aligned)."""
    head = ("<th>%s</th>" % _escape(first_column[0]) if first_column else "") + "".join(
        '<th class="number">%s</th>' % _escape(column) if column != "label" else "<th>%s</th>" % _escape(column)
        for column in columns)
    rows = ["<tr>%s</tr>" % head]
    for index, record in enumerate(records):
        cells = '<td class="number">%s</td>' % _escape(first_column[1](index, record)) if first_column else ""
        for column in columns:
            value = record.get(column)
            if column == "label":
                cells += '<td class="label">%s</td>' % _escape(_numeric_text(value))
            else:
                cells += '<td class="number">%s</td>' % _escape(_numeric_text(value))
        rows.append("<tr>%s</tr>" % cells)
    return '<div class="scroll"><table class="%s">\n%s\n</table></div>' % (css, "\n".join(rows))


def _columns(records, skip=()):
    columns = []
    for record in records:
        for key in record:
            if key not in columns and key not in skip and not isinstance(record[key], (list, dict)):
                columns.append(key)
    return columns


def _solve_rows(solves):
    """One row per nonlinear solve: its mesh, label, iterations and residuals."""
    rows = []
    for solve in solves:
        iterations = solve.get("iterations", [])
        initial = solve.get("initial residual")
        final = iterations[-1].get("residual") if iterations else initial
        three = lambda value: float("%.3g" % value) if value is not None else None  # residuals: 3 digits
        initial, final = three(initial), three(final)
        rows.append({"mesh": solve.get("mesh", 0) + 1, "label": solve.get("label", ""),
                     "Picard steps": sum(1 for step in iterations if step.get("kind") == "Picard"),
                     "Newton steps": sum(1 for step in iterations if step.get("kind") == "Newton"),
                     "initial residual": initial, "final residual": final,
                     "reduction": three(final / initial) if initial and final is not None else None,
                     "linear iterations": sum(step.get("linear iterations", 0) for step in iterations),
                     "seconds": sum(step.get("seconds", 0.) for step in iterations)})
    return rows


def _numerics(summary):
    numerics = summary.get("numerics", {})
    scalars = "\n".join('<tr data-numerics="%s"><td>%s</td><td class="number">%s</td></tr>' % (
        _escape(key), _escape(key), _escape(_numeric_text(value)))
        for key, value in numerics.items() if not isinstance(value, (list, dict)))
    meshes = case_folder.meshes(summary)
    solves = case_folder.solves(summary)
    parts = ['<div class="numerics"><div><h3>Final mesh and totals</h3>\n<table class="numerics-scalars">\n'
             '<tr><th>numerics</th><th class="number">value</th></tr>\n%s\n</table></div>' % scalars]
    if meshes:
        parts.append("<div><h3>Meshes (coarsest first; the last is the final mesh)</h3>\n%s</div>" % _record_table(
            meshes, _columns(meshes), ("mesh", lambda index, record: index + 1), "meshes"))
    parts.append("</div>")
    if solves:
        rows = _solve_rows(solves)
        parts.append("<h3>Nonlinear solves</h3>\n" + _record_table(rows, list(rows[0].keys()), None, "solves"))
    if solves:
        steps = []
        for number, solve in enumerate(solves):
            for index, step in enumerate(solve.get("iterations", [])):
                record = {"solve": number + 1, "step": index + 1}
                record.update({key: value for key, value in step.items() if key != "step"})
                record["step length"] = step.get("step")
                steps.append(record)
        if steps:
            parts.append("<details><summary>Every nonlinear iteration (%d)</summary>\n%s</details>" % (
                len(steps), _record_table(steps, _columns(steps), None, "iterations")))
    phases = numerics.get("seconds by phase")
    if isinstance(phases, dict) and phases:
        # The run's wall time by phase, largest first, and each mesh's beside it.
        order = sorted(phases, key=lambda name: -(phases[name] or 0.))
        by_mesh = [mesh.get("seconds by phase", {}) for mesh in meshes]
        records = [dict([("phase", name), ("run [s]", phases[name])] +
                        [("mesh %d [s]" % (index + 1), mesh.get(name)) for index, mesh in enumerate(by_mesh) if mesh])
                   for name in order]
        parts.append("<h3>Seconds by phase</h3>\n" + _record_table(
            records, [column for column in records[0] if column != "phase"],
            ("phase", lambda index, record: record["phase"]), "phases"))
    for key, value in numerics.items():  # any other list or object of the numerics
        if key in ("meshes", "solves", "seconds by phase"):
            continue
        if isinstance(value, list) and all(isinstance(record, dict) for record in value) and value:
            parts.append("<h3>%s</h3>\n%s" % (_escape(key), _record_table(value, _columns(value))))
        elif isinstance(value, (list, dict)):
            parts.append("<h3>%s</h3>\n<pre>%s</pre>" % (_escape(key), _escape(value)))
    return "\n".join(parts)


def _cautions(summary):
    """summary.json's caution, in full, and its case cautions."""
    caution = summary.get("caution")
    text = _escape(caution) if caution else ("summary.json carries no caution (written by an older Lentus?): "
                                             "treat every number below as unchecked.")
    items = "\n".join("<li>%s</li>" % _escape(item) for item in summary.get("case cautions", []) or [])
    return '<p class="caution-text">%s</p>%s' % (
        text, "\n<h3>For this case</h3>\n<ul class=\"case-cautions\">\n%s\n</ul>" % items if items else "")


def _checks(case, failures):
    """What the user should check before relying on the numbers (the report's own advice)."""
    summary = case.summary
    items = []
    if not summary.get("converged", False):
        items.append("<strong>The solve did not converge</strong>: the numbers and pictures are of the last "
                     "iterate and must not be used. Reason: %s" % _escape(summary.get("reason", "")))
    accuracy = summary.get("accuracy") if isinstance(summary.get("accuracy"), dict) else {}
    meshes = accuracy.get("meshes") or []
    cells = summary.get("numerics", {}).get("cells")
    if len(meshes) >= 2:
        items.append("Mesh: the &plusmn; error bars come from the %d meshes this run solved on (%s cells; see "
                     "Accuracy below). They are estimates (Grid Convergence Index), not bounds; a bar that matters "
                     "to a decision deserves a run on a finer mesh or more Accuracy/Adaptive cycles." % (
                         len(meshes), _escape(", ".join(str(mesh.get("cells", "?")) for mesh in meshes))))
    else:
        items.append("Mesh: %s cells, and no mesh error was estimated (one mesh). Set Accuracy/Coarser meshes = 2 or "
                     "repeat the case with a larger Geometry/Refinement and compare the design numbers." % _escape(cells))
    if accuracy.get("target") == "not met":
        items.append("<strong>Accuracy target not met</strong>: %s." % _escape(accuracy.get("target status", "")))
    if case.yield_stress > 0.:
        exponent = case.inputs.get("Rheology/%s/Regularization exponent" % summary.get("viscosity law", ""), "?")
        if accuracy.get("regularization factor"):
            items.append("The unyielded region and the cavern come from a regularized law (Papanastasiou exponent M = "
                         "%s s); the regularization errors in the table come from a second solve at %g M. They "
                         "assume the numbers approach the ideal fluid's steadily as M grows." % (
                             _escape(exponent), accuracy["regularization factor"]))
        else:
            items.append("The unyielded region and the cavern come from a regularized law (Papanastasiou exponent M = "
                         "%s s) and no regularization check was made (%s): they approach the true ones as M grows; "
                         "compare two values of M before relying on them." % (
                             _escape(exponent), _escape(accuracy.get("regularization check", "not made"))))
    items.append("The shaded shear-rate range of the flow curve should lie within the shear rates measured on the "
                 "rheometer; outside it the viscosity law is extrapolated.")
    if case.axisymmetric:
        items.append("Axisymmetric case: totals (flow rates, forces, torques, power) include the factor 2 pi; the "
                     "pictures show the meridional section mirrored about the axis.")
    else:
        items.append("Planar case: totals are per metre of depth.")
    for failure in failures:
        items.append("Picture not drawn: %s" % _escape(failure))
    return "\n".join("<li>%s</li>" % item for item in items)


def _inputs(case):
    rows = ["<tr><td>%s</td><td>%s</td></tr>" % (_escape(key), _escape(case.inputs[key]))
            for key in case.changed_inputs]
    return "\n".join(rows)


def _solve_facts(summary):
    """One line on the work done: meshes, solves, iterations and the last residual reduction."""
    numerics = summary.get("numerics", {})
    meshes, solves = case_folder.meshes(summary), case_folder.solves(summary)
    facts = ["final mesh: %s cells, %s unknowns" % (_escape(numerics.get("cells", "?")),
                                                    _escape(numerics.get("unknowns", "?")))]
    if len(meshes) > 1:
        facts.append("%d meshes (mesh sequencing)" % len(meshes))
    if solves:
        iterations = sum(len(solve.get("iterations", [])) for solve in solves)
        last = _solve_rows(solves[-1:])[0]
        facts.append("%d nonlinear iterations in %d solve(s)" % (iterations, len(solves)))
        if last["initial residual"] and last["final residual"] is not None:
            facts.append("last solve: residual %.3g from %.3g" % (last["final residual"], last["initial residual"]))
    if "wall time [s]" in numerics:
        facts.append("wall time %s s" % _escape(_numeric_text(numerics["wall time [s]"])))
    return "; ".join(facts)


def write_report(case, pictures, failures):
    """Writes report.html into the case folder (under a temporary name, then renamed)."""
    summary = case.summary
    numbers = summary.get("design numbers", {})
    name = os.path.basename(os.path.normpath(case.folder))
    converged = bool(summary.get("converged", False))
    status = "Converged" if converged else "NOT CONVERGED: " + summary.get("reason", "")
    figures = "\n".join(
        '<figure><img src="%s" alt="%s"><figcaption><strong>%s.</strong> %s</figcaption></figure>' % (
            _escape(file_name), _escape(title), _escape(title), _escape(caption))
        for file_name, title, caption in pictures)
    case_text = ""
    case_path = os.path.join(case.folder, "case.prm")
    if os.path.exists(case_path):
        with open(case_path, encoding="utf-8") as handle:
            case_text = handle.read()
    overview = [("case file", summary.get("case", "")), ("velocity components", summary.get("velocity components", "")),
                ("viscosity law", summary.get("viscosity law", "")), ("shape", case.inputs.get("Geometry/Shape", "")),
                ("Lentus version", summary.get("lentus version", "")),
                ("report written", datetime.datetime.now().strftime("%Y-%m-%d %H:%M"))]
    page = """<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Lentus case report: {name}</title><style>{style}</style></head>
<body>
<h1>Case {name}</h1>
<p class="overview">{overview}</p>
<p class="status {status_class}">{status}</p>
<section class="caution" id="caution"><h2>Caution</h2>
{cautions}
<h3>Check before relying on the numbers</h3>
<ul class="checks">
{checks}
</ul></section>
<section id="key-numbers"><h2>Key results{key_status}</h2>
{key_numbers}
</section>
<section id="design-numbers"><h2>All design numbers</h2>
{numbers}
{accuracy}
</section>
<section id="pictures"><h2>Pictures</h2>
<div class="pictures">
{figures}
</div>
<p class="note">|tau| in the pictures is the stress magnitude eta gamma_dot = sqrt(tau:tau / 2) (the field
stress_magnitude of fields.pvd): at a wall it is the wall shear stress, and the fluid is unyielded where it is
below the yield stress tau_y. It is 1/sqrt(3) of the von Mises equivalent stress of structural codes.</p>
</section>
<section id="numerics"><h2>Numerics</h2>
<p>{solve_facts}</p>
{numerics}
</section>
<section id="inputs"><h2>Case inputs (keys set in the case file)</h2>
<table>
{inputs}
</table>
<details><summary>The complete case file as solved (case.prm, every key)</summary>
<pre>{case_text}</pre></details></section>
<p class="note">Fields for ParaView: fields.pvd; iteration log: log.txt; machine-readable numbers: summary.json.</p>
</body></html>
""".format(name=_escape(name), style=STYLE,
           overview=" &middot; ".join("%s: <strong>%s</strong>" % (_escape(k), _escape(v))
                                      for k, v in overview if v != ""),
           status_class="converged" if converged else "failed", status=_escape(status),
           key_status="" if converged else " (NOT CONVERGED: the last iterate, not to be used)",
           cautions=_cautions(summary), checks=_checks(case, failures), key_numbers=_key_numbers(numbers),
           numbers=_number_table(numbers), accuracy=_accuracy(summary), figures=figures or "<p>No pictures.</p>",
           solve_facts=_solve_facts(summary), numerics=_numerics(summary), inputs=_inputs(case),
           case_text=_escape(case_text))
    path = os.path.join(case.folder, "report.html")
    temporary = os.path.join(case.folder, ".report.html.tmp")
    with open(temporary, "w", encoding="utf-8") as handle:
        handle.write(page)
    os.replace(temporary, path)
    return path

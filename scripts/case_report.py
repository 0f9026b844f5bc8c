"""The one-page report of a Lentus case folder (report.html): status, cautions, every
design number with its unit, mesh and convergence facts, the pictures and the case inputs.
"""
import datetime
import html
import os

import case_folder

CAUTION = ("Results are estimates from a model of an idealized fluid and geometry: check them against "
           "measurements on the real material and equipment. They never replace pressure-relief devices, local "
           "pressure-equipment and machinery codes, or review by a licensed engineer. Die pressures and vessel "
           "loads feed equipment that can fail and hurt people.")

STYLE = """
body { font-family: sans-serif; margin: 1.2em auto; max-width: 1250px; color: #111; font-size: 14px; }
h1 { font-size: 1.5em; margin-bottom: 0.2em; } h2 { font-size: 1.15em; margin: 0.9em 0 0.3em; }
.status { padding: 0.4em 0.7em; font-weight: bold; border-radius: 4px; }
.converged { background: #e3eef8; border-left: 6px solid #0072B2; }
.failed { background: #fbe5d6; border-left: 6px solid #D55E00; }
.caution { background: #fff4d6; border-left: 6px solid #E69F00; padding: 0.5em 0.8em; margin: 0.6em 0; }
.columns { display: grid; grid-template-columns: 1fr 1fr; gap: 1.5em; }
table { border-collapse: collapse; width: 100%; } td, th { padding: 2px 6px; border-bottom: 1px solid #ddd;
text-align: left; vertical-align: top; } td.value { text-align: right; font-family: monospace; white-space: nowrap; }
.pictures { display: grid; grid-template-columns: 1fr 1fr; gap: 1em; }
figure { margin: 0; } figure img { width: 100%; border: 1px solid #ccc; } figcaption { font-size: 0.9em; }
pre { background: #f6f6f6; padding: 0.6em; font-size: 12px; overflow-x: auto; max-height: 30em; }
ul { margin: 0.2em 0; }
@media print { .pictures { grid-template-columns: 1fr 1fr 1fr; } pre { max-height: none; } }
"""


def _number_rows(numbers):
    rows = []
    for name, entry in numbers.items():
        value = entry.get("value") if isinstance(entry, dict) else entry
        unit = entry.get("unit", "") if isinstance(entry, dict) else ""
        rows.append('<tr><td>%s</td><td class="value">%s</td><td>%s</td></tr>' % (
            html.escape(name), html.escape(case_folder.design_number_text(value)), html.escape(unit)))
    return "\n".join(rows)


def _numerics_rows(numerics):
    rows = []
    for name, value in numerics.items():
        if isinstance(value, float):
            text = "%.6g" % value
        else:
            text = str(value)
        rows.append('<tr><td>%s</td><td class="value">%s</td></tr>' % (html.escape(name), html.escape(text)))
    return "\n".join(rows)


def _cautions(case, failures):
    """The cautions of this case: always the model caution, then what applies."""
    items = [html.escape(case.summary.get("caution", CAUTION))]
    if not case.summary.get("converged", False):
        items.append("<strong>The solve did not converge</strong>: the numbers and pictures are of the last "
                     "iterate and must not be used. Reason: %s" % html.escape(case.summary.get("reason", "")))
    refinement = case.inputs.get("Geometry/Refinement")
    cells = case.summary.get("numerics", {}).get("cells")
    if refinement is not None:
        items.append("Mesh: %s cells at Geometry/Refinement = %s. Repeat the case with Refinement = %d and compare "
                     "the design numbers; a change you cannot accept means this mesh is too coarse (common "
                     "practice)." % (cells, html.escape(refinement), int(float(refinement)) + 1))
    if case.yield_stress > 0.:
        exponent = case.inputs.get("Rheology/%s/Regularization exponent" % case.inputs.get("Rheology/Viscosity law"),
                                   "?")
        items.append("The unyielded region and the cavern come from a regularized law (Papanastasiou exponent M = "
                     "%s s): they approach the true ones as M grows; compare two values of M before relying on "
                     "them." % html.escape(exponent))
    items.append("The shaded shear-rate range of the flow curve should lie within the shear rates measured on the "
                 "rheometer; outside it the viscosity law is extrapolated.")
    if case.axisymmetric:
        items.append("Axisymmetric case: totals (flow rates, forces, torques, power) include the factor 2 pi; the "
                     "pictures show the meridional section mirrored about the axis.")
    elif case.fields is not None:
        items.append("Planar case: totals are per metre of depth.")
    for failure in failures:
        items.append("Picture not drawn: %s" % html.escape(failure))
    return "\n".join("<li>%s</li>" % item for item in items)


def _inputs(case):
    rows = ["<tr><td>%s</td><td>%s</td></tr>" % (html.escape(key), html.escape(case.inputs[key]))
            for key in case.changed_inputs]
    return "\n".join(rows)


def _mesh_facts(case):
    facts = [line for line in case.log_lines if line.startswith(("Mesh:", "Nonlinear solve:", "Fluid:",
                                                                 "Continuation in"))]
    facts += [line.strip() for line in case.log_lines if "attempt failed" in line]
    if case.solves:
        iterations = sum(len(solve["iterations"]) for solve in case.solves)
        last = case.solves[-1]
        final = last["iterations"][-1][1] if last["iterations"] else last["initial"]
        facts.append("%d nonlinear iterations in %d solve(s); last solve: residual %.3g from %.3g (ratio %.2g)" % (
            iterations, len(case.solves), final, last["initial"], final / last["initial"] if last["initial"] else 0.))
    return "\n".join("<li>%s</li>" % html.escape(fact) for fact in facts)


def write_report(case, pictures, failures):
    """Writes report.html into the case folder (under a temporary name, then renamed)."""
    summary = case.summary
    name = os.path.basename(os.path.normpath(case.folder))
    converged = bool(summary.get("converged", False))
    status = "Converged" if converged else "NOT CONVERGED: " + summary.get("reason", "")
    figures = "\n".join(
        '<figure><img src="%s" alt="%s"><figcaption><strong>%s.</strong> %s</figcaption></figure>' % (
            html.escape(file_name), html.escape(title), html.escape(title), html.escape(caption))
        for file_name, title, caption in pictures)
    case_text = ""
    case_path = os.path.join(case.folder, "case.prm")
    if os.path.exists(case_path):
        with open(case_path, encoding="utf-8") as handle:
            case_text = handle.read()
    overview = [("case file", summary.get("case", "")), ("formulation", summary.get("formulation", "")),
                ("viscosity law", summary.get("viscosity law", "")), ("shape", case.inputs.get("Geometry/Shape", "")),
                ("Lentus version", summary.get("lentus version", "")),
                ("report written", datetime.datetime.now().strftime("%Y-%m-%d %H:%M"))]
    page = """<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8"><title>Lentus case report: {name}</title><style>{style}</style></head>
<body>
<h1>Case {name}</h1>
<p>{overview}</p>
<p class="status {status_class}">{status}</p>
<div class="caution"><strong>Cautions</strong><ul>
{cautions}
</ul></div>
<div class="columns">
<div><h2>Design numbers</h2>
<table><tr><th>design number</th><th>value</th><th>unit</th></tr>
{numbers}
</table></div>
<div><h2>Mesh and convergence</h2>
<ul>
{mesh}
</ul>
<table><tr><th>numerics</th><th>value</th></tr>
{numerics}
</table>
<h2>Case inputs (keys set in the case file)</h2>
<table>
{inputs}
</table>
</div>
</div>
<h2>Pictures</h2>
<div class="pictures">
{figures}
</div>
<details><summary>The complete case file as solved (case.prm, every key)</summary>
<pre>{case_text}</pre></details>
<p>Fields for ParaView: fields.pvd; iteration log: log.txt; machine-readable numbers: summary.json.</p>
</body></html>
""".format(name=html.escape(name), style=STYLE,
           overview=" &middot; ".join("%s: <strong>%s</strong>" % (html.escape(k), html.escape(str(v)))
                                      for k, v in overview if v != ""),
           status_class="converged" if converged else "failed", status=html.escape(status),
           cautions=_cautions(case, failures), numbers=_number_rows(summary.get("design numbers", {})),
           mesh=_mesh_facts(case), numerics=_numerics_rows(summary.get("numerics", {})), inputs=_inputs(case),
           figures=figures or "<p>No pictures.</p>", case_text=html.escape(case_text))
    path = os.path.join(case.folder, "report.html")
    temporary = os.path.join(case.folder, ".report.html.tmp")
    with open(temporary, "w", encoding="utf-8") as handle:
        handle.write(page)
    os.replace(temporary, path)
    return path

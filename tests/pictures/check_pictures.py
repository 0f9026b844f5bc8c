#!/usr/bin/env python3
"""Checks of the picture step of `lentus run` (label: pictures).

  check_pictures.py folder FOLDER [--swirl-outline]
      The pictures a case folder supports exist and are not blank, every picture the
      report shows exists, and report.html holds every design number of summary.json
      (name, value to its 6 printed digits, unit), every numerics entry, the status and
      the caution. --swirl-outline: also the swirl-speed picture with a cavern outline.
The runs themselves are lentus_cli_test()s (tests/CMakeLists.txt).
"""
import argparse
import html
import json
import os
import re
import sys

# Not blank: the variance of the grey levels (0..1) of a picture must be above a floor.
# Floors (common practice: set from a measurement, not a published value): a white page
# has 0; an empty set of axes with labels measured 0.008 here, with a colour bar 0.015;
# drawn pictures measured 0.017-0.024 (line plots) and 0.04-0.12 (field maps).
LINE_PLOT_FLOOR = 0.012
FIELD_MAP_FLOOR = 0.025
FIELD_MAPS = ("flow_map.png", "pressure.png", "shear_rate.png", "viscosity.png", "swirl_speed.png")


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
        names += ["flow_map.png", "pressure.png", "shear_rate.png"]
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

    # Every design number: its row holds the name, the value to 6 significant digits and the unit.
    rows = {html.unescape(name): (html.unescape(value), html.unescape(unit)) for name, value, unit in re.findall(
        r'<tr><td>([^<]*)</td><td class="value">([^<]*)</td><td>([^<]*)</td></tr>', report)}
    numbers = summary["design numbers"]
    if not numbers:
        fail("summary.json has no design numbers")
    for name, entry in numbers.items():
        if name not in rows:
            fail("report.html lacks the design number '%s'" % name)
        text, unit = rows[name]
        if unit != entry["unit"]:
            fail("'%s': unit '%s' in the report, '%s' in summary.json" % (name, unit, entry["unit"]))
        value = entry["value"]
        if value is None:
            if text != "not computed":
                fail("'%s' is null in summary.json but '%s' in the report" % (name, text))
            continue
        # Printed with 6 significant digits: relative rounding error at most 5e-6.
        if abs(float(text) - value) > 5.1e-6 * abs(value) + 1e-300:
            fail("'%s': %s in the report, %r in summary.json" % (name, text, value))
    print("%d design numbers found in report.html" % len(numbers))
    for key in summary.get("numerics", {}):
        if ">%s</td>" % html.escape(key) not in report:
            fail("report.html lacks the numerics entry '%s'" % key)
    if html.escape(summary["caution"]) not in report:
        fail("report.html lacks the caution of summary.json")
    status = "Converged" if summary["converged"] else "NOT CONVERGED"
    if status not in report:
        fail("report.html lacks the status '%s'" % status)
    if swirl_outline:
        if "swirl_speed.png" not in shown:
            fail("no swirl speed picture in the report")
        if "cavern outline" not in report:
            fail("the report does not mention the cavern outline")


def main():
    parser = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    commands = parser.add_subparsers(dest="command", required=True)
    folder = commands.add_parser("folder")
    folder.add_argument("folder")
    folder.add_argument("--swirl-outline", action="store_true")
    arguments = parser.parse_args()
    check_folder(arguments.folder, arguments.swirl_outline)
    print("passed")
    return 0


if __name__ == "__main__":
    sys.exit(main())

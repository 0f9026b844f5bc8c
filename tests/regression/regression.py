#!/usr/bin/env python3
"""Regression tests of the demos (label: regression).

  regression.py check LENTUS CASE_OR_SWEEP REFERENCE.csv TOLERANCES WORKDIR
      Runs the demo into WORKDIR/result (a case file with `lentus run CASE --no-pictures`,
      a sweep file with `lentus sweep SWEEP`), reads every design number of its summary.json
      (of a sweep: of every case's cases/<id>/summary.json) and compares them with the
      reference: the same names, the same units, values within the tolerances. Any missing,
      extra or different number fails the test.
  regression.py reference FOLDER OUT.csv
      Writes the reference file of a results folder (a run's or a sweep's), for a deliberate
      change of the answers: rerun, look at the difference, then replace the reference.

Reference files: CSV with the header `name,unit,value` (a sweep's: `case,name,unit,value`),
one design number a row, values as written in summary.json (null: no value). The tolerance
file says how close is close enough and why (see tolerances.txt).
"""
import csv
import json
import math
import os
import resource
import shutil
import subprocess
import sys
import time


def fail(message):
    sys.stderr.write("FAILED: %s\n" % message)
    sys.exit(1)


def design_numbers(summary_path):
    """{name: (unit, value)} of one summary.json."""
    with open(summary_path, encoding="utf-8") as handle:
        summary = json.load(handle)
    if "design numbers" not in summary:
        fail("%s holds no \"design numbers\"" % summary_path)
    numbers = {}
    for name, entry in summary["design numbers"].items():
        numbers[name] = (entry["unit"], entry["value"])
    return numbers


def folder_numbers(folder):
    """{(case, name): (unit, value)} of a run's folder (case "") or a sweep's (every case)."""
    if os.path.exists(os.path.join(folder, "summary.json")):
        return {("", name): number for name, number in design_numbers(os.path.join(folder, "summary.json")).items()}
    table = os.path.join(folder, "results.jsonl")
    if not os.path.exists(table):
        fail("%s holds neither summary.json nor results.jsonl" % folder)
    numbers = {}
    with open(table, encoding="utf-8") as handle:
        for line in handle:
            if not line.strip():
                continue
            row = json.loads(line)
            case = row["case"]
            if row["status"] != "converged":
                fail("sweep case %s: status %s (%s)" % (case, row["status"], row.get("reason", "")))
            for name, number in design_numbers(os.path.join(folder, "cases", case, "summary.json")).items():
                numbers[(case, name)] = number
    return numbers


def write_reference(folder, path):
    numbers = folder_numbers(folder)
    sweep = any(case for case, _ in numbers)
    with open(path, "w", encoding="utf-8", newline="") as handle:
        writer = csv.writer(handle, lineterminator="\n")
        writer.writerow((["case"] if sweep else []) + ["name", "unit", "value"])
        for (case, name), (unit, value) in numbers.items():
            text = "null" if value is None else repr(float(value))
            writer.writerow(([case] if sweep else []) + [name, unit, text])
    print("%d design numbers written to %s" % (len(numbers), path))


def read_reference(path):
    if not os.path.exists(path):
        fail("no reference %s: write it with `regression.py reference FOLDER %s` from a run of the demo"
             % (path, os.path.basename(path)))
    numbers = {}
    with open(path, encoding="utf-8", newline="") as handle:
        rows = csv.reader(handle)
        header = next(rows)
        if header not in (["name", "unit", "value"], ["case", "name", "unit", "value"]):
            fail("%s: header %s; allowed: name,unit,value or case,name,unit,value" % (path, ",".join(header)))
        for line, row in enumerate(rows, start=2):
            if len(row) != len(header):
                fail("%s:%d: %d fields, expected %d" % (path, line, len(row), len(header)))
            fields = dict(zip(header, row))
            key = (fields.get("case", ""), fields["name"])
            if key in numbers:
                fail("%s:%d: %s appears twice" % (path, line, fields["name"]))
            value = None if fields["value"] == "null" else float(fields["value"])
            numbers[key] = (fields["unit"], value)
    return numbers


def read_tolerances(path):
    """(relative, scale, {unit: absolute floor}) from `relative = X`, `scale = X`, `floor UNIT = X` lines."""
    relative, scale, floors = None, None, {}
    with open(path, encoding="utf-8") as handle:
        for line_number, line in enumerate(handle, start=1):
            line = line.split("#", 1)[0].strip()
            if not line:
                continue
            key, separator, value = line.partition("=")
            key = key.strip()
            if not separator:
                fail("%s:%d: not KEY = VALUE" % (path, line_number))
            if key == "relative":
                relative = float(value)
            elif key == "scale":
                scale = float(value)
            elif key.startswith("floor "):
                floors[key[len("floor "):].strip()] = float(value)
            else:
                fail("%s:%d: %s; allowed: relative, scale, floor UNIT" % (path, line_number, key))
    if relative is None or scale is None:
        fail("%s: needs a `relative = ...` and a `scale = ...` line" % path)
    return relative, scale, floors


def compare(computed, reference, relative, scale, floors):
    """Messages for every difference (empty when the computed numbers match), and the count compared."""
    problems = []
    # The largest magnitude of each unit in each run (case) of the reference.
    largest = {}
    for (case, _), (unit, value) in reference.items():
        if value is not None:
            largest[(case, unit)] = max(largest.get((case, unit), 0.), abs(value))
    label = lambda key: ("case %s: " % key[0] if key[0] else "") + key[1]
    for key in reference:
        if key not in computed:
            problems.append("missing: %s (reference %s %s)" % (label(key), reference[key][1], reference[key][0]))
    for key in computed:
        if key not in reference:
            problems.append("extra: %s = %s %s (not in the reference)" % (label(key), computed[key][1], computed[key][0]))
    compared = 0
    for key in reference:
        if key not in computed:
            continue
        (unit, value), (reference_unit, reference_value) = computed[key], reference[key]
        if unit != reference_unit:
            problems.append("%s: unit %s, reference %s" % (label(key), unit, reference_unit))
            continue
        if value is None or reference_value is None:
            if value is not None or reference_value is not None:
                problems.append("%s: %s, reference %s" % (label(key), value, reference_value))
            continue
        value = float(value)
        allowed = max(relative * abs(reference_value), scale * largest[(key[0], unit)], floors.get(unit, 0.))
        compared += 1
        if not math.isfinite(value) or abs(value - reference_value) > allowed:
            problems.append("%s: %.17g %s, reference %.17g, difference %.3g > allowed %.3g (relative %.3g)"
                            % (label(key), value, unit, reference_value, abs(value - reference_value), allowed,
                               abs(value - reference_value) / abs(reference_value) if reference_value else math.inf))
    return problems, compared


def check(lentus, demo, reference_path, tolerance_path, workdir):
    reference = read_reference(reference_path)
    relative, scale, floors = read_tolerances(tolerance_path)
    # A fresh folder: a sweep would resume from rows left by an earlier run and solve nothing.
    result = os.path.join(workdir, "result")
    shutil.rmtree(result, ignore_errors=True)
    os.makedirs(workdir, exist_ok=True)
    if demo.endswith(".sweep"):
        command = [lentus, "sweep", demo, "--output", result]
    else:
        command = [lentus, "run", demo, "--no-pictures", "--output", result]
    print("$ " + " ".join(command), flush=True)
    start = time.time()
    completed = subprocess.run(command, cwd=workdir, stdout=subprocess.PIPE, stderr=subprocess.PIPE,
                               universal_newlines=True)
    usage = resource.getrusage(resource.RUSAGE_CHILDREN)
    print(completed.stdout[-4000:])
    print("%s: %.1f s wall, %.1f s CPU" % (os.path.basename(demo), time.time() - start, usage.ru_utime + usage.ru_stime))
    sys.stderr.write(completed.stderr)
    if completed.returncode != 0:
        fail("exit code %d" % completed.returncode)
    computed = folder_numbers(result)
    problems, compared = compare(computed, reference, relative, scale, floors)
    if problems:
        fail("%d of %d design numbers differ from %s:\n  %s"
             % (len(problems), len(reference), reference_path, "\n  ".join(problems)))
    print("all %d design numbers match %s (%d values compared; relative %g, scale %g: %s)"
          % (len(reference), os.path.basename(reference_path), compared, relative, scale,
             os.path.basename(tolerance_path)))


def main():
    arguments = sys.argv[1:]
    if len(arguments) == 6 and arguments[0] == "check":
        check(*arguments[1:])
    elif len(arguments) == 3 and arguments[0] == "reference":
        write_reference(arguments[1], arguments[2])
    else:
        sys.stderr.write(__doc__)
        sys.exit(2)


if __name__ == "__main__":
    main()

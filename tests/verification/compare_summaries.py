#!/usr/bin/env python3
"""Compare the design numbers of two summary.json files.

usage: compare_summaries.py A/summary.json B/summary.json TOLERANCE
Fails (exit 1) if a design number differs by more than TOLERANCE relative
(absolute below 1e-12 times the largest number of its unit), if the runs
solved on meshes of different cell counts, or if either run did not converge.
"""
import json
import sys


def main(argv):
    first, second = (json.load(open(path)) for path in argv[1:3])
    tolerance = float(argv[3])
    ok = first["converged"] and second["converged"]
    if not ok:
        print("a run did not converge")
    scale = {}
    for name, entry in first["design numbers"].items():
        scale[entry["unit"]] = max(scale.get(entry["unit"], 0.0), abs(entry["value"]))
    for name, entry in first["design numbers"].items():
        a, b = entry["value"], second["design numbers"][name]["value"]
        floor = 1e-12 * scale[entry["unit"]]
        difference = abs(a - b)
        if difference > max(tolerance * abs(a), floor):
            print(f"{name}: {a!r} vs {b!r} (relative difference {difference / max(abs(a), 1e-300):.2e})")
            ok = False
    # The same meshes (adaptive cycles flag the same cells on any number of ranks).
    cells = [[mesh["cells"] for mesh in summary["numerics"]["meshes"]] for summary in (first, second)]
    if cells[0] != cells[1]:
        print(f"meshes differ: cells {cells[0]} vs {cells[1]}")
        ok = False
    print("ranks", first["numerics"]["ranks"], "vs", second["numerics"]["ranks"], ":", "same" if ok else "DIFFERENT")
    return 0 if ok else 1


if __name__ == "__main__":
    sys.exit(main(sys.argv))

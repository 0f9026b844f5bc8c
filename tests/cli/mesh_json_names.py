#!/usr/bin/env python3
"""mesh.json holds any case-file name as it is: a name with a tab, a newline, quotes and a
backslash is written escaped and reads back unchanged with Python's json module (RFC 8259,
2017, section 7: control characters must be escaped). Also: the velocity components are
named under "velocity components", and the legend's keys are the ones the help lists.

usage: mesh_json_names.py LENTUS SOURCE_DIR WORKDIR
"""
import json
import os
import shutil
import subprocess
import sys


def main():
    lentus, source, work = sys.argv[1:4]
    shutil.rmtree(work, ignore_errors=True)
    os.makedirs(work)
    name = 'pipe\t"odd" \\ name\nsecond line.prm'
    case = os.path.join(work, name)
    shutil.copy(os.path.join(source, "tests", "verification", "cases", "carreau_pipe.prm"), case)
    finished = subprocess.run([lentus, "mesh", case, "--output", "preview", "--set", "Geometry/Refinement=0"],
                              cwd=work, stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
    sys.stdout.write(finished.stdout + finished.stderr)
    if finished.returncode != 0:
        sys.exit(f"FAILED: lentus mesh exited {finished.returncode}")
    with open(os.path.join(work, "preview", "mesh.json"), encoding="utf-8") as handle:
        text = handle.read()
    if any(ord(c) < 0x20 and c != "\n" for c in text) or "\nsecond line" in text:
        sys.exit("FAILED: mesh.json holds a raw control character")
    mesh = json.loads(text)
    if mesh["case"] != case:
        sys.exit(f"FAILED: case name read back as {mesh['case']!r}, expected {case!r}")
    if mesh.get("velocity components") is None or "formulation" in mesh:
        sys.exit(f"FAILED: keys {list(mesh)}: expected 'velocity components' and no 'formulation'")
    names = sorted(role["name"] for role in mesh["roles"])
    if names != ["axis", "inlet", "outlet", "wall"]:
        sys.exit(f"FAILED: roles {names}")
    if not all(set(role) == {"id", "name", "sides", "length [m]", "area [m^2]"} for role in mesh["roles"]):
        sys.exit(f"FAILED: role keys {[list(role) for role in mesh['roles']]}")
    print("passed: mesh.json reads back the odd case name")


if __name__ == "__main__":
    main()

#!/usr/bin/env python3
"""Checks that a design number settled over a run's last two meshes.

usage: last_cycles.py SUMMARY.json NAME TOLERANCE
Fails (exit 1) unless the run converged on at least two meshes (accuracy.meshes of summary.json) and
|value on the last - value on the one before| <= TOLERANCE x |value on the last|.
"""
import json
import sys


def main(argv):
    with open(argv[1], encoding="utf-8") as handle:
        summary = json.load(handle)
    name, tolerance = argv[2], float(argv[3])
    meshes = summary.get("accuracy", {}).get("meshes", [])
    if not summary.get("converged") or len(meshes) < 2:
        print("FAILED: %s: not converged on two meshes or more" % argv[1])
        return 1
    before, last = (mesh["design numbers"][name] for mesh in meshes[-2:])
    change = abs(last - before) / abs(last)
    print("%s: %.6g -> %.6g on %d -> %d cells, change %.2g%% (allowed %.2g%%)" % (
        name, before, last, meshes[-2]["cells"], meshes[-1]["cells"], 100. * change, 100. * tolerance))
    return 0 if change <= tolerance else 1


if __name__ == "__main__":
    sys.exit(main(sys.argv))

#!/usr/bin/env python3
"""The caution of solver/report/caution.h, for tests that check an output carries it whole.

usage: caution.py [--file PATH] [--cwd DIR] -- LENTUS ARGS...
  Runs the command (exit code 0 expected) and checks that its standard output, or the file
  PATH it wrote, holds the full caution. Line breaks, indentation and comment markers ('#')
  between the words do not count; every word and its order do.
Exits 1 with a message on failure.
"""
import os
import re
import subprocess
import sys

ROOT = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))


def caution_text():
    """The caution as the C++ header holds it (its string literals joined)."""
    with open(os.path.join(ROOT, "solver", "report", "caution.h")) as handle:
        source = handle.read()
    body = source.split("caution =", 1)[1].split(";", 1)[0]
    text = "".join(re.findall(r'"((?:[^"\\]|\\.)*)"', body))
    if len(text) < 100:
        sys.exit("caution.py: could not read the caution from solver/report/caution.h")
    return text


def words(text):
    """The text as single-spaced words, without comment markers at line starts."""
    return " ".join(re.sub(r"^\s*#+", " ", line) for line in text.splitlines()).split()


def holds_caution(text):
    wanted, found = words(caution_text()), words(text)
    return any(found[i:i + len(wanted)] == wanted for i in range(len(found) - len(wanted) + 1))


def main():
    arguments = sys.argv[1:]
    path, cwd = None, None
    while arguments and arguments[0] != "--":
        option, value = arguments[0], arguments[1]
        if option == "--file":
            path = value
        elif option == "--cwd":
            cwd = value
        else:
            sys.exit(__doc__)
        arguments = arguments[2:]
    command = arguments[1:]
    if cwd:
        os.makedirs(cwd, exist_ok=True)
    finished = subprocess.run(command, stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True, cwd=cwd)
    sys.stdout.write(finished.stdout + finished.stderr)
    if finished.returncode != 0:
        sys.exit(f"FAILED: exit code {finished.returncode}: {' '.join(command)}")
    if path:
        with open(os.path.join(cwd or ".", path)) as handle:
            text, where = handle.read(), path
    else:
        text, where = finished.stdout, "standard output"
    if not holds_caution(text):
        sys.exit(f"FAILED: {where} does not hold the full caution of solver/report/caution.h:\n{caution_text()}")
    print(f"passed: {where} holds the full caution")


if __name__ == "__main__":
    main()

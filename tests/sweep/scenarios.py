#!/usr/bin/env python3
"""Behaviour of `lentus sweep` and `lentus collect` that needs several runs.

usage: scenarios.py SCENARIO LENTUS MPIEXEC WORKDIR
  ranks    the 6-case sweep on 1 rank and on 2 ranks gives identical tables
  failures a sweep with an invalid and a non-converging case completes the others
  resume   a sweep killed with SIGKILL after some cases resumes; every case once
  resume2  the same on 2 ranks (the whole process group is killed)
  array    --case-index (and SLURM_ARRAY_TASK_ID) then collect gives the runner's table
  slurm    scripts/slurm_sweep.sbatch: array tasks, collect, then the one-job form
  attempts a case runs died on --attempts times is recorded as crashed; a held lock refuses a runner
  fluid    lentus fit's samples of the demo paste swept over the demo pipe: fluid_uncertainty.csv
  warm     warm start = nearest: the same answers as from rest in fewer nonlinear steps, on 1 rank and
           on groups of 2 ranks
Exits 1 with a message on the first failed check.
"""
import csv
import json
import os
import struct
import shutil
import signal
import subprocess
import sys
import time

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, os.path.join(os.path.dirname(HERE), "cli"))
from caution import caution_text, holds_caution  # noqa: E402
MPI_FLAGS = ["--allow-run-as-root", "--oversubscribe"]


def fail(message):
    sys.stderr.write("FAILED: " + message + "\n")
    sys.exit(1)


def check(condition, message):
    if not condition:
        fail(message)


def run(command, expect=0, env=None):
    finished = subprocess.run(command, stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True, env=env)
    sys.stdout.write("$ " + " ".join(command) + "\n" + finished.stdout + finished.stderr)
    if expect is not None and finished.returncode != expect:
        fail(f"exit code {finished.returncode}, expected {expect}: {' '.join(command)}")
    return finished


def table(folder):
    with open(os.path.join(folder, "results.csv"), newline="") as handle:
        rows = list(csv.reader(handle))
    return rows[0], rows[1:]


def without_time(header, rows):
    """The table without the columns that differ between runs (wall time) or by design (folder, ranks)."""
    dropped = {header.index(name) for name in ("wall time [s]", "folder") if name in header}
    return [[cell for i, cell in enumerate(row) if i not in dropped] for row in [header] + rows]


def each_case_once(folder, total):
    header, rows = table(folder)
    ids = [row[0] for row in rows]
    check(len(ids) == total, f"{len(ids)} rows in {folder}/results.csv, expected {total}")
    check(len(set(ids)) == total, f"a case appears twice: {ids}")
    with open(os.path.join(folder, "results.jsonl")) as handle:
        lines = handle.read().splitlines()
    check(len(lines) == total, f"{len(lines)} JSON lines, expected {total}")
    leftovers = [os.path.join(root, name) for root, dirs, files in os.walk(folder) for name in dirs + files
                 if ".partial" in name or ".tmp-" in name]
    check(not leftovers, f"half-written files left: {leftovers}")
    check(not os.listdir(os.path.join(folder, "claims")), "claims left after the sweep finished")
    # Every row of both tables carries the full caution of solver/report/caution.h.
    caution = caution_text()
    check(header[-1] == "caution" and all(row[-1] == caution for row in rows),
          f"{folder}/results.csv: not every row ends with the full caution")
    check(all(json.loads(line)["caution"] == caution for line in lines),
          f"{folder}/results.jsonl: not every line carries the full caution")
    return header, rows


def png_text(path):
    """The tEXt chunks of a PNG file (keyword -> text), read without extra packages."""
    with open(path, "rb") as handle:
        data = handle.read()
    check(data[:8] == b"\x89PNG\r\n\x1a\n", f"{path} is not a PNG file")
    chunks, at = {}, 8
    while at < len(data):
        length, kind = struct.unpack(">I4s", data[at:at + 8])
        if kind == b"tEXt":
            keyword, _, text = data[at + 8:at + 8 + length].partition(b"\0")
            chunks[keyword.decode("latin-1")] = text.decode("latin-1")
        at += 12 + length
    return chunks


def scenario_ranks(lentus, mpiexec, work):
    sweep = os.path.join(HERE, "six_cases.sweep")
    one, two = os.path.join(work, "one"), os.path.join(work, "two")
    out = run([lentus, "sweep", sweep, "--output", one]).stdout
    check("6 cases (3 x 2 grid)" in out, "the number of cases is not printed first")
    check(holds_caution(out), "the sweep's output does not end with the full caution")
    # The plot carries the caution, drawn and in the PNG's Description (read from results.csv).
    picture = os.path.join(one, "plot.png")
    check(os.path.exists(picture), "no plot.png")
    check(holds_caution(png_text(picture).get("Description", "")), "plot.png does not carry the full caution")
    check("[6/6]" in out and "failures 0" in out, "no progress lines with done/total and failures")
    run([mpiexec] + MPI_FLAGS + ["-np", "2", lentus, "sweep", sweep, "--output", two])
    h1, r1 = each_case_once(one, 6)
    h2, r2 = each_case_once(two, 6)
    check(all(row[h1.index("status")] == "converged" for row in r1), "not every case converged")
    check("flow rate out through outlet [m^3/s]" in h1, f"design numbers with units missing from {h1}")
    check("Boundary conditions/Pressure values [Pa]" in h1, f"varied key with unit missing from {h1}")
    check(without_time(h1, r1) == without_time(h2, r2), "tables on 1 and 2 ranks differ")
    # Each case solved by one group of 2 ranks: the same design numbers to 1e-8 relative (the
    # tolerance of the solver's own 1-vs-2-rank test, tests/CMakeLists.txt).
    pair = os.path.join(work, "pair")
    run([mpiexec] + MPI_FLAGS + ["-np", "2", lentus, "sweep", sweep, "--output", pair, "--ranks-per-case", "2"])
    h3, r3 = each_case_once(pair, 6)
    check(h3 == h1 and all(row[h3.index("ranks")] == "2" for row in r3), "cases not solved on 2 ranks each")
    for a, b in zip(r1, r3):
        for column in range(h1.index("reason") + 1, h1.index("Newton iterations")):
            x, y = float(a[column]), float(b[column])
            check(abs(x - y) <= 1e-8 * max(abs(x), abs(y)) + 1e-12, f"{a[0]} {h1[column]}: {x} vs {y} on 2 ranks")
    # A larger pressure drop drives more flow through the same pipe. Source: the Rabinowitsch-Mooney
    # relation Q = pi R^3 / tau_w^3 * integral_0^tau_w tau^2 gamma_dot(tau) dtau with tau_w = R dp / (2 L)
    # grows with tau_w whenever the flow curve is increasing (capillary rheometry, e.g. Macosko 1994,
    # Rheology: Principles, Measurements and Applications, ch. 5; section from memory).
    q = {(row[1], row[2]): float(row[h1.index("flow rate out through outlet [m^3/s]")]) for row in r1}
    for n in ("0.4", "0.7"):
        check(q[("100, 0", n)] < q[("200, 0", n)] < q[("400, 0", n)], f"flow rate not increasing with pressure, n={n}")


def scenario_failures(lentus, mpiexec, work):
    sweep = os.path.join(HERE, "with_failures.sweep")
    folder = os.path.join(work, "out")
    finished = run([lentus, "sweep", sweep, "--output", folder])
    check("1 case(s) are invalid" in finished.stdout, "the invalid case is not announced before running")
    check("with_failures.sweep:10: case-0001 (impossible): Boundary conditions/Pressure values = 200, 0, 5: "
          "more values than roles under Pressure" in finished.stdout,
          "the invalid case's message lacks file, line and key")
    header, rows = each_case_once(folder, 4)
    status = {row[1]: row[header.index("status")] for row in rows}
    check(status == {"thin": "converged", "impossible": "bad input", "starved": "not converged", "thick": "converged"},
          f"statuses: {status}")
    reason = {row[1]: row[header.index("reason")] for row in rows}
    check("more values than roles" in reason["impossible"], "no reason recorded for the bad case")
    check(reason["starved"] != "", "no reason recorded for the case that did not converge")
    check(os.path.exists(os.path.join(folder, "cases", "case-0003", "summary.json")),
          "the case after the failures was not solved")
    # Array mode validates its own case: the invalid one gives exit code 2 and a bad-input row.
    single = os.path.join(work, "single")
    finished = run([lentus, "sweep", sweep, "--output", single, "--case-index", "1"], expect=2)
    check("case-0001 (impossible): bad input" in finished.stdout, "array task did not record the bad case")
    run([lentus, "sweep", sweep, "--output", single, "--case-index", "2"], expect=3)
    # check refuses the same file: the invalid case with file, line and key, exit code 2.
    finished = run([lentus, "check", sweep], expect=2)
    check("with_failures.sweep:10: case-0001 (impossible): Boundary conditions/Pressure values" in finished.stderr,
          "check does not point at the invalid case")


def wait_for_rows(folder, count, process, timeout=60):
    rows = os.path.join(folder, "rows")
    start = time.time()
    while time.time() - start < timeout:
        if os.path.isdir(rows) and len([f for f in os.listdir(rows) if f.endswith(".txt")]) >= count:
            return
        if process.poll() is not None:
            fail("the sweep ended before it could be killed")
        time.sleep(0.01)
    fail("no rows appeared")


def descendants(pid):
    """Every process below `pid`, from /proc."""
    children = {}
    for entry in os.listdir("/proc"):
        if entry.isdigit():
            try:
                with open(f"/proc/{entry}/stat") as handle:
                    fields = handle.read().rsplit(")", 1)[1].split()
                children.setdefault(int(fields[1]), []).append(int(entry))
            except (OSError, IndexError):
                pass
    found, queue = [], [pid]
    while queue:
        for child in children.get(queue.pop(), []):
            found.append(child)
            queue.append(child)
    return found


def scenario_resume(lentus, mpiexec, work, ranks=1):
    sweep = os.path.join(HERE, "eight_cases.sweep")
    folder = os.path.join(work, "out")
    command = [lentus, "sweep", sweep, "--output", folder]
    if ranks > 1:
        command = [mpiexec] + MPI_FLAGS + ["-np", str(ranks)] + command
    process = subprocess.Popen(command, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL, start_new_session=True)
    wait_for_rows(folder, 3, process)
    # The runner and every rank, without warning (MPI ranks may sit in process groups of their own).
    for pid in [process.pid] + descendants(process.pid):
        try:
            os.kill(pid, signal.SIGKILL)
        except ProcessLookupError:
            pass
    process.wait()
    time.sleep(0.2)
    rows_folder = os.path.join(folder, "rows")
    kept = {name: open(os.path.join(rows_folder, name)).read() for name in os.listdir(rows_folder)
            if name.endswith(".txt")}
    check(3 <= len(kept) < 8, f"{len(kept)} rows after the kill; the test needs a sweep stopped half-way")
    finished = run(command)
    check(f"Resuming: {len(kept)} case(s) done earlier are kept" in finished.stdout, "no resume message")
    header, rows = each_case_once(folder, 8)
    check(all(row[header.index("status")] == "converged" for row in rows), "not every case converged")
    for name, text in kept.items():
        check(open(os.path.join(rows_folder, name)).read() == text, f"{name} was solved again")
    # Started once more: nothing is left to do and nothing changes.
    finished = run(command)
    check("Resuming: 8 case(s) done earlier are kept" in finished.stdout, "a finished sweep ran cases again")


def scenario_array(lentus, mpiexec, work):
    sweep = os.path.join(HERE, "six_cases.sweep")
    runner, array = os.path.join(work, "runner"), os.path.join(work, "array")
    run([lentus, "sweep", sweep, "--output", runner])
    check(run([lentus, "sweep", sweep, "--count"]).stdout.strip() == "6", "--count does not print 6")
    for index in range(5):
        out = run([lentus, "sweep", sweep, "--output", array, "--case-index", str(index)]).stdout
        check(holds_caution(out), f"array task {index} does not print the full caution")
    finished = run([lentus, "collect", sweep, "--output", array], expect=1)
    check("Missing 1 case(s) without a result: case-0005" in finished.stdout, "collect does not list the missing case")
    environment = dict(os.environ, SLURM_ARRAY_TASK_ID="5")
    run([lentus, "sweep", sweep, "--output", array], env=environment)
    finished = run([lentus, "sweep", sweep, "--output", array, "--case-index", "5"])
    check("done earlier" in finished.stdout, "an array task solved a finished case again")
    run([lentus, "sweep", sweep, "--output", array, "--case-index", "6"], expect=2)
    run([lentus, "collect", sweep, "--output", array])
    h1, r1 = each_case_once(runner, 6)
    h2, r2 = each_case_once(array, 6)
    check(without_time(h1, r1) == without_time(h2, r2), "array tasks and the runner give different tables")


def scenario_attempts(lentus, mpiexec, work):
    """A case on which runs died --attempts times is recorded as crashed; a held lock refuses a second runner."""
    import fcntl
    sweep = os.path.join(HERE, "six_cases.sweep")
    folder = os.path.join(work, "out")
    for sub in ("claims", "attempts"):
        os.makedirs(os.path.join(folder, sub))
    # As a runner that died twice before on case-0002 and once more now would leave it.
    open(os.path.join(folder, "claims", "case-0002"), "w").close()
    with open(os.path.join(folder, "attempts", "case-0002"), "w") as handle:
        handle.write("2\n")
    with open(os.path.join(folder, "runner.lock"), "w") as lock:
        fcntl.flock(lock, fcntl.LOCK_EX)
        finished = run([lentus, "sweep", sweep, "--output", folder], expect=2)
        check("another sweep runner is working in it" in finished.stderr, "a second runner was not refused")
    finished = run([lentus, "sweep", sweep, "--output", folder])
    check("1 case(s) were being solved when a run stopped" in finished.stdout, "the stale claim was not noticed")
    header, rows = each_case_once(folder, 6)
    status = [row[header.index("status")] for row in rows]
    check(status == ["converged", "converged", "crashed", "converged", "converged", "converged"], f"statuses {status}")
    check("stopped while solving this case 3 times" in rows[2][header.index("reason")], "no reason for the crash")


def scenario_slurm(lentus, mpiexec, work):
    """scripts/slurm_sweep.sbatch as array tasks, then its collect step, with srun standing in as a plain exec."""
    root = os.path.dirname(os.path.dirname(HERE))
    bin_folder = os.path.join(work, "bin")
    os.makedirs(bin_folder)
    with open(os.path.join(bin_folder, "srun"), "w") as handle:
        handle.write('#!/bin/sh\nexec "$@"\n')
    os.chmod(os.path.join(bin_folder, "srun"), 0o755)
    results = os.path.join(work, "out")
    environment = dict(os.environ, PATH=bin_folder + os.pathsep + os.environ["PATH"], SLURM_SUBMIT_DIR=root,
                       SWEEP=os.path.join(HERE, "six_cases.sweep"), RESULTS=results, LENTUS=lentus)
    template = os.path.join(root, "scripts", "slurm_sweep.sbatch")
    for index in range(6):
        run(["bash", template], env=dict(environment, SLURM_ARRAY_TASK_ID=str(index)))
    finished = run(["bash", template], env=dict(environment, MODE="collect"))
    check("6 of 6 cases" in finished.stdout, "the collect step did not merge the six cases")
    each_case_once(results, 6)
    # The one-job form on the same folder finds everything done.
    finished = run(["bash", template], env=environment)
    check("Resuming: 6 case(s) done earlier are kept" in finished.stdout, "the MPI form did not resume")


def scenario_fluid(lentus, mpiexec, work):
    """The samples `lentus fit` writes, swept over the paste pipe demo at a coarse mesh: the spread of
    every design number over the samples beside its fitted value, in a table, the output and a picture."""
    import numpy
    root = os.path.dirname(os.path.dirname(HERE))
    fit = os.path.join(work, "fit")
    run([lentus, "fit", os.path.join(root, "cases", "demo_paste_flow_curve.csv"), "--samples", "5", "--no-plot",
         "--output", fit])
    samples = os.path.join(fit, "samples.sweep")
    with open(samples) as handle:
        check("\nfluid samples = fitted\n" in handle.read(), "samples.sweep is not marked as fluid samples")
    folder = os.path.join(work, "out")
    command = [lentus, "sweep", samples, "--base", os.path.join(root, "cases", "demo_paste_pipe.prm"),
               "--set", "Geometry/Refinement=1", "--output", folder]
    out = run(command).stdout
    header, rows = each_case_once(folder, 6)
    check(all(row[header.index("status")] == "converged" for row in rows), "not every case converged")

    # The short table at the end of the output, right above the full caution.
    at = out.find("Uncertainty from the fluid (fit's confidence region), key numbers")
    check(at >= 0, "the sweep does not print the fluid's uncertainty")
    check("pressure drop inlet to outlet" in out[at:] and "5 of 5" in out[at:], "the printed table lacks the numbers")
    check(holds_caution(out[at:]), "the full caution does not follow the printed uncertainty")

    path = os.path.join(folder, "fluid_uncertainty.csv")
    with open(path, newline="") as handle:
        table = list(csv.reader(handle))
    f_header, f_rows = table[0], table[1:]
    caution = caution_text()
    check(f_header[-1] == "caution" and all(row[-1] == caution for row in f_rows),
          "fluid_uncertainty.csv: not every row ends with the full caution")
    check(all(row[f_header.index("uncertainty")] == "uncertainty from the fluid (fit's confidence region)"
              for row in f_rows), "fluid_uncertainty.csv: rows not labelled as the uncertainty from the fluid")
    with open(os.path.join(folder, "fluid_uncertainty.jsonl")) as handle:
        lines = [json.loads(line) for line in handle.read().splitlines()]
    check(len(lines) == len(f_rows) and all(line["caution"] == caution for line in lines),
          "fluid_uncertainty.jsonl: not one line per row, each with the full caution")
    entry = {row[f_header.index("design number")]: row for row in f_rows}["pressure drop inlet to outlet"]

    def cell(name):
        return float(entry[f_header.index(name)])

    name_column, dp_column = header.index("name"), header.index("pressure drop inlet to outlet [Pa]")
    fitted = [float(row[dp_column]) for row in rows if row[name_column] == "fitted"]
    values = [float(row[dp_column]) for row in rows if row[name_column] != "fitted"]
    check(entry[f_header.index("converged samples")] == "5" and cell("fitted value") == fitted[0],
          "the fitted value or the count of samples differs from results.csv")
    # Source: NumPy's percentile with its default method "linear" is definition 7 of Hyndman & Fan
    # (1996, The American Statistician 50, 361-365), the method the table states; an implementation
    # other than ours. results.csv holds 10 digits, hence the tolerance.
    low, high = numpy.percentile(values, [2.5, 97.5])
    for name, expected in (("2.5% quantile", low), ("97.5% quantile", high), ("minimum", min(values)),
                           ("maximum", max(values))):
        check(abs(cell(name) - expected) <= 1e-8 * abs(expected), f"{name}: {cell(name)}, NumPy gives {expected}")
    # The pressure drop a Herschel-Bulkley fluid needs at a set flow rate is close to linear in the fitted
    # parameters over their confidence region, and a Latin hypercube puts one sample in each of N
    # equal-probability strata of every parameter (McKay, Beckman & Conover 1979, Technometrics 21, 239),
    # so samples lie on both sides of the fitted case and their span holds its value.
    check(cell("2.5% quantile") < cell("fitted value") < cell("97.5% quantile"),
          f"the span {cell('2.5% quantile')} to {cell('97.5% quantile')} Pa misses the fitted {cell('fitted value')}")
    check("rough" in entry[f_header.index("note")], "5 samples are not called rough")

    picture = os.path.join(folder, "fluid_uncertainty.png")
    check(os.path.exists(picture), "no fluid_uncertainty.png")
    check(holds_caution(png_text(picture).get("Description", "")), "fluid_uncertainty.png does not carry the caution")

    # Resumed, and merged by collect: the same table.
    with open(path) as handle:
        first = handle.read()
    finished = run(command)
    check("Resuming: 6 case(s) done earlier are kept" in finished.stdout, "no resume")
    os.remove(path)
    run([lentus, "collect", samples, "--base", os.path.join(root, "cases", "demo_paste_pipe.prm"),
         "--set", "Geometry/Refinement=1", "--output", folder])
    with open(path) as handle:
        check(handle.read() == first, "collect wrote another fluid_uncertainty.csv than the sweep")


def nonlinear_steps(folder):
    """Nonlinear steps of every solve of one case (summary.json numerics/solves)."""
    with open(os.path.join(folder, "summary.json"), encoding="utf-8") as handle:
        solves = json.load(handle)["numerics"]["solves"]
    return sum(len(solve["iterations"]) for solve in solves)


def same_numbers(header, a, b, relative, what):
    """Each design number of row b within `relative` of row a, measured against the larger of the
    two values and the largest magnitude of the same unit in the row (a number that is zero up to
    round-off, such as the mean pressure on an outlet held at 0 Pa, has no relative size of its own)."""
    first, last = header.index("reason") + 1, header.index("Newton iterations")
    scale = {}
    values = {}
    for column in range(first, last):
        try:
            values[column] = (float(a[column]), float(b[column]))
        except ValueError:
            continue
        unit = header[column][header[column].rfind("["):]
        scale[unit] = max(scale.get(unit, 0.), abs(values[column][0]), abs(values[column][1]))
    for column, (x, y) in values.items():
        unit = header[column][header[column].rfind("["):]
        check(abs(x - y) <= relative * max(abs(x), abs(y), scale[unit]) + 1e-300,
              f"{a[0]} {header[column]}: {x} from rest, {y} {what}")


def scenario_warm(lentus, mpiexec, work):
    warm_sweep = os.path.join(HERE, "warm_start.sweep")
    cold_sweep = os.path.join(work, "cold.sweep")  # the same cases, every one from rest
    with open(warm_sweep, encoding="utf-8") as handle:
        text = handle.read()
    check("warm start = nearest" in text, "warm_start.sweep does not ask for warm starts")
    text = text.replace("warm start = nearest", "warm start = none").replace(
        "../../cases/", os.path.join(os.path.dirname(os.path.dirname(HERE)), "cases") + "/")
    with open(cold_sweep, "w", encoding="utf-8") as handle:
        handle.write(text)
    cold, warm, pair = (os.path.join(work, name) for name in ("cold", "warm", "pair"))
    run([lentus, "sweep", cold_sweep, "--output", cold])
    run([lentus, "sweep", warm_sweep, "--output", warm])
    hc, rc = each_case_once(cold, 12)
    hw, rw = each_case_once(warm, 12)
    status, refinement = hc.index("status"), hc.index("Geometry/Refinement")
    check(all(row[status] == "converged" for row in rc + rw), "not every case converged")
    by_id = {row[0]: row for row in rw}
    steps = {"cold": 0, "warm": 0}
    started_warm = 0
    for name, folder in (("cold", cold), ("warm", warm)):
        for case_id in sorted(os.listdir(os.path.join(folder, "cases"))):
            steps[name] += nonlinear_steps(os.path.join(folder, "cases", case_id))
    for case_id in sorted(by_id):
        with open(os.path.join(warm, "cases", case_id, "log.txt"), encoding="utf-8") as handle:
            log = handle.read()
        # A warm start comes only from a case on the same mesh (its file names that case).
        for line in log.splitlines():
            if line.startswith("Warm start from "):
                neighbour = os.path.basename(line[len("Warm start from "):].strip())
                check(neighbour in by_id and neighbour != case_id, f"{case_id}: warm start from '{neighbour}'")
                check(by_id[neighbour][refinement] == by_id[case_id][refinement],
                      f"{case_id}: warm start from {neighbour}, solved on another mesh")
                started_warm += 1
                break
    # On 1 rank the cases run in order: all but the first on each mesh find a finished neighbour.
    check(started_warm == 10, f"{started_warm} of 12 cases started warm; expected 10 (all but the first per mesh)")
    # The same answers: each design number within 1e-6 relative of the one from rest, the nonlinear
    # solver's tolerance leaving the converged iterate about 1e-8 relative from the discrete solution
    # (common practice: answers from two starts agree to the solver's tolerance).
    for a, b in zip(rc, rw):
        same_numbers(hc, a, b, 1e-6, "warm")
    print(f"nonlinear steps of all 12 cases: {steps['cold']} from rest, {steps['warm']} warm "
          f"(ratio {steps['cold'] / steps['warm']:.2f})")
    check(steps["warm"] < steps["cold"], "warm starts took no fewer nonlinear steps")
    # Groups of 2 ranks save and read one file per rank.
    run([mpiexec] + MPI_FLAGS + ["-np", "2", lentus, "sweep", warm_sweep, "--output", pair, "--ranks-per-case", "2"])
    hp, rp = each_case_once(pair, 12)
    check(all(row[hp.index("status")] == "converged" for row in rp), "not every case converged on 2 ranks")
    started = 0
    for case_id in os.listdir(os.path.join(pair, "cases")):
        with open(os.path.join(pair, "cases", case_id, "log.txt"), encoding="utf-8") as handle:
            started += "Warm start from " in handle.read()
    check(started == 10, f"{started} of 12 cases started warm on 2 ranks; expected 10")
    # The kept solutions are not results: removed once every case has its row.
    check(not os.path.exists(os.path.join(pair, "warm")), "the warm-start solutions were left in the results folder")
    for a, b in zip(rc, rp):
        same_numbers(hc, a, b, 1e-6, "warm on 2 ranks")


def main():
    if len(sys.argv) != 5:
        fail(__doc__)
    scenario, lentus, mpiexec, work = sys.argv[1:]
    os.environ.pop("SLURM_ARRAY_TASK_ID", None)  # inside a cluster's array job, lentus sweep would solve one case
    shutil.rmtree(work, ignore_errors=True)
    os.makedirs(work)
    if scenario == "ranks":
        scenario_ranks(lentus, mpiexec, work)
    elif scenario == "failures":
        scenario_failures(lentus, mpiexec, work)
    elif scenario == "resume":
        scenario_resume(lentus, mpiexec, work)
    elif scenario == "resume2":
        scenario_resume(lentus, mpiexec, work, ranks=2)
    elif scenario == "attempts":
        scenario_attempts(lentus, mpiexec, work)
    elif scenario == "slurm":
        scenario_slurm(lentus, mpiexec, work)
    elif scenario == "array":
        scenario_array(lentus, mpiexec, work)
    elif scenario == "fluid":
        scenario_fluid(lentus, mpiexec, work)
    elif scenario == "warm":
        scenario_warm(lentus, mpiexec, work)
    else:
        fail("unknown scenario " + scenario)
    print("passed: " + scenario)


if __name__ == "__main__":
    main()

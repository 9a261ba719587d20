"""Start-up benchmark: a whole-process `tablegen value` lookup against a bare interpreter.

As a user has it: tablegen installed non-editable (``pip install --target`` of
this checkout, with its generated ``tablegen`` script) into a fresh virtual
environment without the editable-install hook, bytecode cached after a warm-up
(PYTHONDONTWRITEBYTECODE is removed from the environment).  Each round runs
``python -c pass`` and then every other command once; a command's ratio in a
round is its time over that round's bare interpreter, so a drift of the
machine's speed hits both.  Prints the median ratio over the rounds (the
figure to quote) and the ratio of the best times; the target is a lookup at
most 1.5x ``python -c pass``.

Two floors are timed beside the lookups, because no lookup can be faster:
``import re`` (the first line of the script pip generates for a console
entry point) and a minimal argparse command line (``import re, argparse``,
one parser with a sub-command, four options, parsed once: what "plain
argparse" costs before tablegen does anything).  Also reports whether a
lookup imported sympy, jinja2 or mpmath (it must not).

    python3 tests/benchmarks/startup.py [--runs 30]
"""

from __future__ import annotations

import argparse
import os
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

REPO = Path(__file__).resolve().parents[2]
LOOKUPS = {
    "cg": ["value", "cg", "3/2", "1/2", "1", "-1", "5/2", "-1/2"],
    "6j --latex": ["value", "6j", "2", "3", "3", "2", "3", "3", "--latex"],
    "9j --json": ["value", "9j", "1", "1", "1", "1", "1", "1", "1", "1", "0", "--json"],
    "d --beta": ["value", "d", "3/2", "1/2", "-1/2", "--beta", "pi/3"],
    "Y function": ["value", "Y", "3", "-2"],
}
TARGET = 1.5

#: The floor of any argparse command line run through a generated console script.
ARGPARSE_FLOOR = """
import re, argparse
p = argparse.ArgumentParser(prog="t", allow_abbrev=False)
s = p.add_subparsers(dest="command")
v = s.add_parser("value", allow_abbrev=False)
v.add_argument("kind"); v.add_argument("args", nargs="*"); v.add_argument("--digits", default="15")
v.add_argument("--latex", action="store_true"); v.add_argument("--json", action="store_true")
v.add_argument("--max-j", default=None)
p.parse_args(["value", "6j", "2", "3", "3", "2", "3", "3", "--latex"])
"""


def _once(cmd: list[str], env: dict) -> float:
    started = time.perf_counter()
    subprocess.run(cmd, env=env, check=True, stdout=subprocess.DEVNULL)
    return time.perf_counter() - started


def _paired(cmds: dict[str, list[str]], runs: int, env: dict) -> tuple[dict[str, list[float]], dict[str, list[float]]]:
    """Per command: its times, and its ratio to the bare interpreter of the same round."""
    times: dict[str, list[float]] = {name: [] for name in cmds}
    ratios: dict[str, list[float]] = {name: [] for name in cmds if name != "bare"}
    for _ in range(runs):
        bare = _once(cmds["bare"], env)
        times["bare"].append(bare)
        for name, cmd in cmds.items():
            if name != "bare":
                t = _once(cmd, env)
                times[name].append(t)
                ratios[name].append(t / bare)
    return times, ratios


def _install(work: Path) -> tuple[str, str, dict]:
    """A fresh venv (no pip, no editable hook) and a non-editable install of this checkout."""
    venv = work / "venv"
    subprocess.run([sys.executable, "-m", "venv", "--without-pip", str(venv)], check=True)
    target = work / "lib"
    subprocess.run(
        [sys.executable, "-m", "pip", "install", "--quiet", "--no-deps", "--target", str(target), str(REPO)],
        check=True,
    )
    python = str(venv / "bin" / "python")
    env = {k: v for k, v in os.environ.items() if k not in ("PYTHONDONTWRITEBYTECODE", "PYTHONPATH")}
    env["PYTHONPATH"] = str(target)
    return python, str(target / "bin" / "tablegen"), env


def main() -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--runs", type=int, default=30)
    args = ap.parse_args()
    with tempfile.TemporaryDirectory(prefix="tablegen-startup-") as tmp:
        python, script, env = _install(Path(tmp))
        floor = Path(tmp) / "argparse_floor.py"
        floor.write_text(ARGPARSE_FLOOR)
        subprocess.run([python, "-m", "py_compile", str(floor)], env=env, check=True)
        for argv in LOOKUPS.values():  # warm-up: writes the bytecode cache
            subprocess.run([python, script, *argv], env=env, check=True, stdout=subprocess.DEVNULL)
        cmds = {
            "bare": [python, "-c", "pass"],
            "floor: import re": [python, "-c", "import re"],
            "floor: argparse CLI": [python, str(floor)],
        }
        cmds.update({f"tablegen {name}": [python, script, *argv] for name, argv in LOOKUPS.items()})
        times, ratios = _paired(cmds, args.runs, env)
        bare = statistics.median(times["bare"])
        print(f"python -c pass: median {bare * 1000:.1f} ms ({args.runs} rounds, non-editable install, bytecode cached)")
        print(f"{'command':<28} {'median ms':>9} {'median ratio':>12} {'best/best':>9}")
        for name, rs in ratios.items():
            ratio = statistics.median(rs)
            best = min(times[name]) / min(times["bare"])
            verdict = "" if name.startswith("floor") else f"  target <= {TARGET}x: {'PASS' if ratio <= TARGET else 'MISS'}"
            print(f"{name:<28} {statistics.median(times[name]) * 1000:9.1f} {ratio:11.2f}x {best:8.2f}x{verdict}")
        probe = (
            "import sys; from tablegen.cli import main; main(" + repr(LOOKUPS["6j --latex"]) + ");"
            "print('imported:', [m for m in ('sympy', 'jinja2', 'mpmath') if m in sys.modules] or 'none of sympy, jinja2, mpmath')"
        )
        out = subprocess.run([python, "-c", probe], env=env, capture_output=True, text=True, check=True)
        print(out.stdout.strip().splitlines()[-1])
    return 0


if __name__ == "__main__":
    sys.exit(main())

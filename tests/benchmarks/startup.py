"""Start-up benchmark: a whole-process `tablegen value` lookup against a bare interpreter.

As a user has it: tablegen installed non-editable (``pip install --target`` of
this checkout, with its generated ``tablegen`` script) into a fresh virtual
environment without the editable-install hook, bytecode cached after a warm-up
(PYTHONDONTWRITEBYTECODE is removed from the environment).  Times the lookups,
``python -c pass`` and ``python -c "import argparse"`` (the floor of any
argparse command line) alternately in the same run, best of N each, and
prints the ratios; the target is a lookup at most 1.5x ``python -c pass``.
Also reports whether a lookup imported sympy, jinja2 or mpmath (it must not).

    python3 tests/benchmarks/startup.py [--runs 20]
"""

from __future__ import annotations

import argparse
import os
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


def _once(cmd: list[str], env: dict) -> float:
    started = time.perf_counter()
    subprocess.run(cmd, env=env, check=True, stdout=subprocess.DEVNULL)
    return time.perf_counter() - started


def _best_interleaved(cmds: dict[str, list[str]], runs: int, env: dict) -> dict[str, float]:
    """Best time of each command, taking them in turn so that drifts hit all alike."""
    best = dict.fromkeys(cmds, float("inf"))
    for _ in range(runs):
        for name, cmd in cmds.items():
            best[name] = min(best[name], _once(cmd, env))
    return best


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
    ap.add_argument("--runs", type=int, default=20)
    args = ap.parse_args()
    with tempfile.TemporaryDirectory(prefix="tablegen-startup-") as tmp:
        python, script, env = _install(Path(tmp))
        for argv in LOOKUPS.values():  # warm-up: writes the bytecode cache
            subprocess.run([python, script, *argv], env=env, check=True, stdout=subprocess.DEVNULL)
        cmds = {"bare": [python, "-c", "pass"], "argparse": [python, "-c", "import argparse"]}
        cmds.update({name: [python, script, *argv] for name, argv in LOOKUPS.items()})
        best = _best_interleaved(cmds, args.runs, env)
        bare = best.pop("bare")
        print(f"python -c pass: {bare * 1000:.1f} ms (best of {args.runs}, runs interleaved, non-editable install)")
        for name, t in best.items():
            ratio = t / bare
            label = "python -c 'import argparse'" if name == "argparse" else f"tablegen {name}"
            verdict = "" if name == "argparse" else f"  target <= {TARGET}x: {'PASS' if ratio <= TARGET else 'MISS'}"
            print(f"{label:<28} {t * 1000:6.1f} ms  ratio {ratio:4.2f}x{verdict}")
        probe = (
            "import sys; from tablegen.cli import main; main(" + repr(LOOKUPS["6j --latex"]) + ");"
            "print('imported:', [m for m in ('sympy', 'jinja2', 'mpmath') if m in sys.modules] or 'none of sympy, jinja2, mpmath')"
        )
        out = subprocess.run([python, "-c", probe], env=env, capture_output=True, text=True, check=True)
        print(out.stdout.strip().splitlines()[-1])
    return 0


if __name__ == "__main__":
    sys.exit(main())

"""Start-up benchmark: a whole-process one-value lookup against a bare interpreter.

Times `python -m tablegen value ...` and `python -c pass` alternately in the
same run (best of N each, to damp the noise of a shared machine) and prints
the ratio; the target is at most 2x.  Also reports whether the lookup
imported sympy or jinja2 (it must not).

    python3 tests/benchmarks/startup.py [--runs 15]
"""

from __future__ import annotations

import argparse
import os
import subprocess
import sys
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


def main() -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--runs", type=int, default=15)
    args = ap.parse_args()
    # as on a user's machine: bytecode cached after the first run (some shells here
    # set PYTHONDONTWRITEBYTECODE, which would recompile tablegen on every start)
    env = {k: v for k, v in os.environ.items() if k != "PYTHONDONTWRITEBYTECODE"}
    env["PYTHONPATH"] = str(REPO)
    for argv in LOOKUPS.values():  # warm-up: writes the bytecode cache
        subprocess.run([sys.executable, "-m", "tablegen", *argv], env=env, check=True, stdout=subprocess.DEVNULL)
    cmds = {"bare": [sys.executable, "-c", "pass"]}
    cmds.update({name: [sys.executable, "-m", "tablegen", *argv] for name, argv in LOOKUPS.items()})
    best = _best_interleaved(cmds, args.runs, env)
    bare = best.pop("bare")
    print(f"python -c pass: {bare * 1000:.0f} ms (best of {args.runs}, runs interleaved)")
    for name, t in best.items():
        ratio = t / bare
        print(f"tablegen {name:<12} {t * 1000:6.0f} ms  ratio {ratio:4.2f}x  target <= 2x: {'PASS' if ratio <= 2 else 'MISS'}")
    probe = (
        "import sys; from tablegen.cli import main; main(" + repr(LOOKUPS["6j --latex"]) + ");"
        "print('imported:', [m for m in ('sympy', 'jinja2') if m in sys.modules] or 'neither sympy nor jinja2')"
    )
    out = subprocess.run([sys.executable, "-c", probe], env=env, capture_output=True, text=True, check=True)
    print(out.stdout.strip().splitlines()[-1])
    return 0


if __name__ == "__main__":
    sys.exit(main())

"""Build-speed benchmark: three recipe sizes, the classic range and the default recipe.

Each build runs as a separate process (``python -m tablegen build``) so that
wall time and the peak memory of the whole process tree (the build and its
worker processes, sampled from /proc) are measured as a user would see them.

Printed per build: values, seconds, values per second, peak memory (MB), and
the cost per value relative to the smallest of the three sizes measured in the
same run (1.0 means perfectly linear growth).  Targets from the issue are
printed beside the classic range and the default recipe.

    python3 tests/benchmarks/build.py            # everything (about 3 minutes)
    python3 tests/benchmarks/build.py --quick    # the three sizes and the default only
"""

from __future__ import annotations

import argparse
import json
import os
import subprocess
import sys
import tempfile
import time
from pathlib import Path

REPO = Path(__file__).resolve().parents[2]

SIZES = {
    "small": "[cg]\nmax_j = 2\n[3j]\nmax_j = 2\n[6j]\nmax_j = 2\n[9j]\nmax_j = 1\n",
    "medium": "[cg]\nmax_j = 4\n[3j]\nmax_j = 4\n[6j]\nmax_j = 4\n[9j]\nmax_j = 2\n",
    "large": "[cg]\nmax_j = 6\n[3j]\nmax_j = 6\n[6j]\nmax_j = 6\n[9j]\nmax_j = \"5/2\"\n",
}
CLASSIC = "[cg]\nmax_j = 8\n[3j]\nmax_j = 8\n[6j]\nmax_j = 8\n[9j]\nmax_j = 3\n"


def _tree_rss_kb(root_pid: int) -> int:
    """Sum of VmRSS over a process and all its descendants (Linux /proc)."""
    parents: dict[int, int] = {}
    rss: dict[int, int] = {}
    for entry in os.listdir("/proc"):
        if not entry.isdigit():
            continue
        try:
            with open(f"/proc/{entry}/status") as fh:
                fields = dict(line.split(":", 1) for line in fh if ":" in line)
        except OSError:
            continue
        pid = int(entry)
        parents[pid] = int(fields.get("PPid", "0").strip())
        rss[pid] = int(fields.get("VmRSS", "0 kB").split()[0]) if "VmRSS" in fields else 0
    total, stack = 0, [root_pid]
    while stack:
        pid = stack.pop()
        total += rss.get(pid, 0)
        stack.extend(child for child, parent in parents.items() if parent == pid)
    return total


def run_build(recipe_text: str | None, workdir: Path) -> dict:
    out = workdir / "site"
    cmd = [sys.executable, "-m", "tablegen", "build", "--out", str(out), "--quiet"]
    if recipe_text is not None:
        recipe = workdir / "recipe.toml"
        recipe.write_text(recipe_text)
        cmd += ["--recipe", str(recipe)]
    env = dict(os.environ, PYTHONPATH=str(REPO))
    started = time.perf_counter()
    proc = subprocess.Popen(cmd, env=env, cwd=workdir)
    peak = 0
    while proc.poll() is None:
        peak = max(peak, _tree_rss_kb(proc.pid))
        time.sleep(0.05)
    seconds = time.perf_counter() - started
    if proc.returncode:
        raise SystemExit(f"build failed with status {proc.returncode}")
    manifest = json.loads((out / "manifest.json").read_text())
    values = sum(manifest["counts"].values())
    size = sum(p.stat().st_size for p in out.rglob("*") if p.is_file())
    return {"values": values, "seconds": seconds, "peak_mb": peak / 1024, "site_mb": size / 1e6}


def main() -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--quick", action="store_true", help="skip the classic range")
    args = ap.parse_args()
    rows = []
    with tempfile.TemporaryDirectory() as tmp:
        for name, text in SIZES.items():
            d = Path(tmp) / name
            d.mkdir()
            rows.append((name, run_build(text, d)))
        base = rows[0][1]["seconds"] / rows[0][1]["values"]
        print(f"{'build':<10}{'values':>10}{'seconds':>10}{'values/s':>11}{'peak MB':>10}{'site MB':>10}{'cost/value vs small':>22}")
        for name, r in rows:
            ratio = (r["seconds"] / r["values"]) / base
            print(f"{name:<10}{r['values']:>10,}{r['seconds']:>10.1f}{r['values'] / r['seconds']:>11,.0f}"
                  f"{r['peak_mb']:>10.0f}{r['site_mb']:>10.1f}{ratio:>22.2f}")
        d = Path(tmp) / "default"
        d.mkdir()
        r = run_build(None, d)
        verdict = "PASS" if r["seconds"] < 20 else "MISS"
        print(f"\ndefault recipe: {r['values']:,} values in {r['seconds']:.1f} s "
              f"(target < 20 s: {verdict}; {r['seconds'] / 20:.2f} of the budget), "
              f"peak {r['peak_mb']:.0f} MB, site {r['site_mb']:.1f} MB")
        if not args.quick:
            d = Path(tmp) / "classic"
            d.mkdir()
            r = run_build(CLASSIC, d)
            ok = r["seconds"] < 120 and r["peak_mb"] < 1024
            print(f"classic range (CG, 3j, 6j j <= 8; 9j j <= 3): {r['values']:,} values in {r['seconds']:.1f} s "
                  f"({r['seconds'] / 120:.2f} of the 120 s budget), peak {r['peak_mb']:.0f} MB "
                  f"({r['peak_mb'] / 1024:.2f} of 1 GB), site {r['site_mb']:.0f} MB: {'PASS' if ok else 'MISS'}")
    return 0


if __name__ == "__main__":
    sys.exit(main())

"""Engine speed against sympy.physics.wigner, measured in the same run.

    python3 tests/benchmarks/engine.py           # full run (a few minutes: sympy is slow)
    python3 tests/benchmarks/engine.py --quick   # sampled sweeps, no j = 1000 reference

Each line times tablegen and the reference on the same inputs and prints the
ratio (reference time / tablegen time) beside its target with PASS or MISS.
tablegen's caches are cleared before every timed run, so its numbers are
cold-cache numbers; the reference has no value cache.  Every value is then
checked to be identical to the reference's (outside the timed region).
Finally the cache bounds, the caches' sizes after the run and the peak memory
of the tablegen part (tracemalloc, in a separate untimed pass) are printed.

Not a test: speed targets are reported, never asserted.
"""

from __future__ import annotations

import argparse
import gc
import resource
import sys
import time
import tracemalloc
from fractions import Fraction
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[2]))

import sympy  # noqa: E402
from sympy.physics import wigner  # noqa: E402

import tablegen  # noqa: E402
import tablegen.intmath  # noqa: E402
from tablegen import coefficients  # noqa: E402
from tablegen.kinds import ninej as k9, sixj as k6, threej as k3  # noqa: E402

TOP = 10  # 2 * 5: every j <= 5


def _half(t: int):
    """t/2 as tablegen's callers would pass it: an int or a Fraction."""
    return t // 2 if t % 2 == 0 else Fraction(t, 2)


def _rational(t: int) -> sympy.Rational:
    return sympy.Rational(t, 2)


def cg_inputs() -> list[tuple[int, ...]]:
    """Doubled (j1, m1, j2, m2, J, M) for every CG with j1, j2 <= 5 and |M| <= J."""
    out = []
    for tj1 in range(TOP + 1):
        for tj2 in range(TOP + 1):
            for tJ in range(abs(tj1 - tj2), tj1 + tj2 + 1, 2):
                for tm1 in range(-tj1, tj1 + 1, 2):
                    for tm2 in range(-tj2, tj2 + 1, 2):
                        if abs(tm1 + tm2) <= tJ:
                            out.append((tj1, tm1, tj2, tm2, tJ, tm1 + tm2))
    return out


def _triad(a: int, b: int, c: int) -> bool:
    return (a + b + c) % 2 == 0 and abs(a - b) <= c <= a + b


def sixj_inputs() -> list[tuple[int, ...]]:
    """Doubled arguments of every 6j with all j <= 5 whose four triads are allowed."""
    rng = range(TOP + 1)
    out = []
    for a in rng:
        for b in rng:
            for c in rng:
                if not _triad(a, b, c):
                    continue
                for d in rng:
                    for e in rng:
                        if not _triad(d, e, c):
                            continue
                        for f in rng:
                            if _triad(a, e, f) and _triad(d, b, f):
                                out.append((a, b, c, d, e, f))
    return out


def clear_caches() -> None:
    k3._threej_square_cached.cache_clear()
    k6._sixj_value_cached.cache_clear()
    k9._ninej_square.cache_clear()
    k9._racah_part_cached.cache_clear()


def cache_sizes() -> str:
    """Current entries of the three value caches."""
    infos = {
        "3j/CG": k3._threej_square_cached.cache_info(),
        "6j": k6._sixj_value_cached.cache_info(),
        "9j": k9._ninej_square.cache_info(),
        "9j inner 6j": k9._racah_part_cached.cache_info(),
    }
    return ", ".join(f"{k} {v.currsize}" for k, v in infos.items())


def timed(func, runs: int = 1, cold: bool = True) -> tuple[float, object]:
    """Best wall time of `runs` runs (GC off) and the last result; cold clears tablegen's caches first."""
    best, result = float("inf"), None
    for _ in range(runs):
        if cold:
            clear_caches()
        gc.collect()
        gc.disable()
        try:
            start = time.perf_counter()
            result = func()
            elapsed = time.perf_counter() - start
        finally:
            gc.enable()
        best = min(best, elapsed)
    return best, result


def identical(value: tablegen.Surd, reference) -> bool:
    """Exact equality of a Surd and a sympy number (structural, else by signed squares)."""
    reference = sympy.sympify(reference)
    if not value:
        return reference == 0
    if value.to_sympy() == reference:
        return True
    square = sympy.Rational(value.p, value.q)
    return sympy.expand(reference**2) == square and bool(reference > 0) == (value.sign > 0)


class Report:
    def __init__(self) -> None:
        self.rows: list[tuple] = []
        self.mismatches = 0

    def add(self, name: str, n: int, ours: float, ref: float | None, target: float | None, note: str = "") -> None:
        self.rows.append((name, n, ours, ref, target, note))

    def check(self, name: str, values, references) -> None:
        bad = [i for i, (v, r) in enumerate(zip(values, references)) if not identical(v, r)]
        if len(values) != len(references):
            bad.append(-1)
        self.mismatches += len(bad)
        status = "all identical" if not bad else f"{len(bad)} DIFFER (first at index {bad[0]})"
        print(f"  check {name}: {len(values)} values, {status}", flush=True)

    def print(self) -> None:
        head = f"{'case':<34} {'n':>6} {'tablegen s':>11} {'sympy s':>9} {'ratio':>8} {'target':>7}  result"
        print()
        print(head)
        print("-" * len(head))
        for name, n, ours, ref, target, note in self.rows:
            if ref is None:
                ratio_text, target_text, verdict = "-", "-", note or "skipped"
            else:
                ratio = ref / ours
                ratio_text = f"{ratio:,.0f}x" if ratio >= 10 else f"{ratio:.1f}x"
                target_text = f">={target:g}x" if target else "-"
                verdict = ("PASS" if ratio >= target else "MISS") if target else "info"
                verdict = f"{verdict} {note}".rstrip()
            ref_text = "-" if ref is None else f"{ref:9.3f}"
            print(f"{name:<34} {n:>6} {ours:>11.4f} {ref_text:>9} {ratio_text:>8} {target_text:>7}  {verdict}")


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--quick", action="store_true", help="sample the sweeps (every 10th symbol) and skip the j=1000 reference")
    parser.add_argument("--runs", type=int, default=3, help="cold runs of tablegen per case, best kept (default 3)")
    ns = parser.parse_args(argv)
    step = 10 if ns.quick else 1
    report = Report()
    print(f"python {sys.version.split()[0]}, sympy {sympy.__version__}, tablegen {tablegen.__version__}"
          f"{', quick mode' if ns.quick else ''}")

    # --- every CG with j1, j2 <= 5 -------------------------------------------------
    doubled = cg_inputs()[::step]
    ours_args = [tuple(_half(t) for t in x) for x in doubled]
    ref_args = [
        (_rational(a), _rational(b), _rational(J), _rational(ma), _rational(mb), _rational(M))
        for a, ma, b, mb, J, M in doubled
    ]
    cg, cg2, sympy_cg = tablegen.cg, coefficients.cg2, wigner.clebsch_gordan
    t_ours, ours = timed(lambda: [cg(*x) for x in ours_args], ns.runs)
    sizes_cg = cache_sizes()
    t_dbl, dbl = timed(lambda: [cg2(*x) for x in doubled], ns.runs)
    print(f"CG sweep: {len(doubled)} symbols, tablegen done; sympy running ...", flush=True)
    t_ref, ref = timed(lambda: [sympy_cg(*x) for x in ref_args], cold=False)
    report.check("CG", ours, ref)
    report.check("CG (cg2)", dbl, ref)
    label = "every CG, j1,j2 <= 5" + (" (1/10)" if ns.quick else "")
    report.add(label, len(doubled), t_ours, t_ref, 50)
    report.add("  same, doubled ints (cg2)", len(doubled), t_dbl, t_ref, None)

    # --- every 6j with all j <= 5 --------------------------------------------------
    doubled = sixj_inputs()[::step]
    ours_args = [tuple(_half(t) for t in x) for x in doubled]
    ref_args = [tuple(_rational(t) for t in x) for x in doubled]
    sixj, sixj2, sympy_6j = tablegen.sixj, coefficients.sixj2, wigner.wigner_6j
    t_ours, ours = timed(lambda: [sixj(*x) for x in ours_args], ns.runs)
    sizes_6j = cache_sizes()
    t_dbl, dbl = timed(lambda: [sixj2(*x) for x in doubled], ns.runs)
    print(f"6j sweep: {len(doubled)} symbols, tablegen done; sympy running ...", flush=True)
    t_ref, ref = timed(lambda: [sympy_6j(*x) for x in ref_args], cold=False)
    report.check("6j", ours, ref)
    report.check("6j (sixj2)", dbl, ref)
    label = "every 6j, all j <= 5" + (" (1/10)" if ns.quick else "")
    report.add(label, len(doubled), t_ours, t_ref, 50)
    report.add("  same, doubled ints (sixj2)", len(doubled), t_dbl, t_ref, None)

    # --- single large symbols ------------------------------------------------------
    # One call each (no value cache applies above CACHE_MAX_J); both sides build
    # their factorial tables on the way, which is part of a first call's cost.
    singles = [
        ("3j(1000 1000 1000; 0 0 0)", tablegen.threej, (1000, 1000, 1000, 0, 0, 0), wigner.wigner_3j, 30, True),
        ("6j{1000 x6}", tablegen.sixj, (1000,) * 6, wigner.wigner_6j, 30, True),
        ("9j{10 x9}", tablegen.ninej, (10,) * 9, wigner.wigner_9j, 10, False),
    ]
    for name, ours_f, args, ref_f, target, slow in singles:
        t_ours, value = timed(lambda: ours_f(*args))
        if slow and ns.quick:
            report.add(name, 1, t_ours, None, target, "skipped (--quick)")
            continue
        print(f"{name}: tablegen done; sympy running ...", flush=True)
        t_ref, reference = timed(lambda: ref_f(*args), cold=False)
        report.check(name, [value], [reference])
        report.add(name, 1, t_ours, t_ref, target)

    report.print()

    # --- cache bounds and memory ---------------------------------------------------
    print()
    print(f"cache bounds: CACHE_ENTRIES = {coefficients.CACHE_ENTRIES} per family, "
          f"CACHE_MAX_J = {coefficients.CACHE_MAX_J}")
    print(f"cache entries after the cold CG sweep: {sizes_cg}; after the cold 6j sweep: {sizes_6j}")

    # peak memory of the tablegen part alone, in an untimed pass under tracemalloc
    cg_args = [tuple(_half(t) for t in x) for x in cg_inputs()[::step]]
    sixj_args = [tuple(_half(t) for t in x) for x in sixj_inputs()[::step]]
    clear_caches()
    tracemalloc.start()
    kept = [cg(*x) for x in cg_args] + [sixj(*x) for x in sixj_args]
    kept += [tablegen.threej(1000, 1000, 1000, 0, 0, 0), tablegen.sixj(*(1000,) * 6), tablegen.ninej(*(10,) * 9)]
    _, peak = tracemalloc.get_traced_memory()
    tracemalloc.stop()
    print(f"tablegen part (all cases in one untimed pass from empty caches): peak traced memory "
          f"{peak / 2**20:.1f} MiB for {len(kept)} values; cache entries after it: {cache_sizes()}")
    table = tablegen.intmath.factorials_upto(0)
    table_bytes = sum(sys.getsizeof(x) for x in table)
    print(f"factorial table (kept across runs, not in the peak above): {len(table)} entries, "
          f"{table_bytes / 2**20:.1f} MiB")
    rss = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss  # KiB on Linux
    print(f"whole process (sympy included): max RSS {rss / 1024:.0f} MiB")
    print(f"value identity: {'all identical' if not report.mismatches else f'{report.mismatches} MISMATCHES'}")
    return 1 if report.mismatches else 0


if __name__ == "__main__":
    sys.exit(main())

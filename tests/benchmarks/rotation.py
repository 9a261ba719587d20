"""Rotation-function speed against sympy, as ratios measured in the same run.

    python3 tests/benchmarks/rotation.py [--budget SECONDS]

1. every d^j_{m'm}(beta) as a function, j <= 10 (steps of 1/2): tablegen's d2 (caches
   cleared) against sympy.physics.wigner.wigner_d_small(J, beta) with a symbol beta;
2. every d^50_{m'm}(pi/2) exactly: tablegen's d_at_cos2 against wigner_d_small(50, pi/2);
3. Y_l^m for l <= 20: tablegen's y2 against sympy.Ynm(l, m, theta, phi).expand(func=True).
sympy gets a time budget per part; if it runs out, both sides are compared on the
subset sympy finished (printed), and the part says so.
"""

from __future__ import annotations

import argparse
import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[2]))

from tablegen.kinds import harmonics, rotation  # noqa: E402


def clear() -> None:
    rotation._d2_cached.cache_clear()
    rotation._binomial_poly.cache_clear()
    harmonics._legendre_derivative.cache_clear()


def ours_d(tjs) -> float:
    clear()
    t = time.perf_counter()
    for tj in tjs:
        rotation.d_matrix2(tj)  # every element of the matrix, as sympy's wigner_d_small gives it
    return time.perf_counter() - t


def sympy_parts(items, run, budget):
    """Run run(item) for items in order until the budget is spent; (items done, seconds)."""
    done, t0 = [], time.perf_counter()
    for it in items:
        if time.perf_counter() - t0 > budget:
            break
        run(it)
        done.append(it)
    return done, time.perf_counter() - t0


def main(argv=None) -> int:
    ap = argparse.ArgumentParser()
    ap.add_argument("--budget", type=float, default=120.0)
    budget = ap.parse_args(argv).budget
    import sympy
    from sympy.physics.wigner import wigner_d_small

    beta = sympy.Symbol("beta", real=True)

    # 1. functions, j <= 10
    done, t_sym = sympy_parts(list(range(0, 21)), lambda tj: wigner_d_small(sympy.Rational(tj, 2), beta), budget)
    t_ours = ours_d(done)
    n = sum((tj + 1) ** 2 for tj in done)
    print(f"d functions, j <= {sympy.Rational(done[-1], 2)} ({n} elements{'' if len(done) == 21 else ', sympy budget ran out before j = 10'}):"
          f" tablegen {t_ours:.3f} s, sympy {t_sym:.3f} s, ratio {t_sym / t_ours:.0f}x")

    # 2. exact values at pi/2, j = 50
    from fractions import Fraction

    t = time.perf_counter()
    rotation.d_matrix_at_cos2(100, Fraction(0))
    t_ours = time.perf_counter() - t
    done, t_sym = sympy_parts([100], lambda tj: wigner_d_small(sympy.Integer(50), sympy.pi / 2), budget)
    if done:
        print(f"d^50(pi/2), 10201 exact values: tablegen {t_ours:.3f} s, sympy {t_sym:.3f} s, ratio {t_sym / t_ours:.0f}x")
    else:  # pragma: no cover - depends on sympy's speed
        print(f"d^50(pi/2): tablegen {t_ours:.3f} s; sympy did not finish within {budget:.0f} s")

    # 3. spherical harmonics, l <= 20
    th, ph = sympy.symbols("theta phi")
    pairs = [(l, m) for l in range(21) for m in range(-l, l + 1)]
    done, t_sym = sympy_parts(pairs, lambda lm: sympy.Ynm(lm[0], lm[1], th, ph).expand(func=True), budget)
    clear()
    t = time.perf_counter()
    for l, m in done:
        harmonics.y2(2 * l, 2 * m)
    t_ours = time.perf_counter() - t
    print(f"Y_l^m, {len(done)} of {len(pairs)} functions (l <= {done[-1][0]}): tablegen {t_ours:.4f} s,"
          f" sympy {t_sym:.3f} s, ratio {t_sym / t_ours:.0f}x")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())

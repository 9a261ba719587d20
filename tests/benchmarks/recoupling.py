"""Recoupling speed, measured in one run: ratios against a brute-force reference.

    python3 tests/benchmarks/recoupling.py            # full run (about four minutes: 1.26 million values)
    python3 tests/benchmarks/recoupling.py --quick    # fewer leaf values

1. Every 4-leaf recoupling coefficient with leaves <= 2: tree 1 is each of
   the two coupling shapes (((a b) c) d) and ((a b)(c d)), tree 2 each of the
   15 unordered trees over a b c d (every pair up to renaming the leaves;
   reordering inside a node is a phase), all leaves in {1/2, 1, 3/2, 2}, every
   total and every allowed intermediate.  tablegen computes them all through
   the public ``recoupling`` (caches cleared first).  The reference, the sum
   over all m of products of sympy.physics.wigner.clebsch_gordan along both
   trees, is timed on an evenly spaced sample of the same coefficients (it
   needs tens of milliseconds each) and compared value by value; the ratio
   is (reference time per coefficient) / (tablegen time per coefficient).
2. One 6-leaf coefficient with leaves 3, cold (path search included) and warm.

Not a test: the targets are reported, never asserted.
"""

from __future__ import annotations

import argparse
import itertools
import sys
import time
from fractions import Fraction
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[2]))

import sympy  # noqa: E402
from sympy.physics.wigner import clebsch_gordan  # noqa: E402

from tablegen.recoupling import recoupling  # noqa: E402
from tablegen.recoupling import coefficient, moves, paths  # noqa: E402
from tablegen.recoupling.matrix import assignments  # noqa: E402
from tablegen.recoupling.trees import Leaf, leaves, parse_tree  # noqa: E402
from tablegen.kinds import ninej as ninej_kind  # noqa: E402
from tablegen.kinds import sixj as sixj_kind  # noqa: E402

SHAPES_1 = ["(((a b)e c)f d)J", "((a b)e (c d)f)J"]


def _unordered_trees() -> list[str]:
    """The 15 unordered coupling trees over a b c d, one ordering each, inner names g, h."""
    out = []
    for x, y, z, w in itertools.permutations("abcd"):  # combs ((x y) z) w, x < y
        if x < y:
            out.append(f"((({x} {y})g {z})h {w})J")
    for x, y, z, w in [("a", "b", "c", "d"), ("a", "c", "b", "d"), ("a", "d", "b", "c")]:
        out.append(f"(({x} {y})g ({z} {w})h)J")
    return out


def _half(t: int):
    return t // 2 if t % 2 == 0 else Fraction(t, 2)


def _clear_caches() -> None:
    for f in (moves.reassociate, moves.four_leaf, paths.plan_path, coefficient._pair_cached, coefficient._triads,
              sixj_kind._sixj_value_cached, ninej_kind._ninej_square):
        f.cache_clear()


def all_coefficients(leaf_tj: tuple[int, ...]) -> list[tuple[str, str, dict[str, int]]]:
    """(tree1, tree2, doubled values) for every coefficient of part 1."""
    out = []
    for t1, t2 in itertools.product(SHAPES_1, _unordered_trees()):
        p1, p2 = parse_tree(t1), parse_tree(t2)
        for lv in itertools.product(leaf_tj, repeat=4):
            tj = dict(zip("abcd", lv))
            top = sum(lv)
            for tJ in range(top & 1, top + 1, 2):
                tj["J"] = tJ
                for r in assignments(p1, tj):
                    for c in assignments(p2, tj):
                        out.append((t1, t2, {**tj, **dict(r), **dict(c)}))
    return out


def reference(t1: str, t2: str, tj: dict[str, int]):
    """sum over m of products of sympy CG along both trees, at M = J."""
    h = lambda x: sympy.Rational(x, 2)  # noqa: E731

    def amp(t, tm):
        if isinstance(t, Leaf):
            return sympy.Integer(1), tm[t.name]
        vl, ml = amp(t.left, tm)
        vr, mr = amp(t.right, tm)
        if not vl or not vr:
            return sympy.Integer(0), ml + mr
        c = clebsch_gordan(h(tj[t.left.name]), h(tj[t.right.name]), h(tj[t.name]), h(ml), h(mr), h(ml + mr))
        return vl * vr * c, ml + mr

    a, b = parse_tree(t1), parse_tree(t2)
    names = [leaf.name for leaf in leaves(a)]
    total = sympy.Integer(0)
    for ms in itertools.product(*(range(-tj[n], tj[n] + 1, 2) for n in names)):
        if sum(ms) != tj["J"]:
            continue
        tm = dict(zip(names, ms))
        x = amp(a, tm)[0]
        if x:
            total += x * amp(b, tm)[0]
    return sympy.nsimplify(total)


def part1(quick: bool) -> None:
    leaf_tj = (1, 2, 3) if quick else (1, 2, 3, 4)
    cases = all_coefficients(leaf_tj)
    _clear_caches()
    t0 = time.perf_counter()
    values = [recoupling(t1, t2, **{k: _half(v) for k, v in tj.items()}) for t1, t2, tj in cases]
    ours = time.perf_counter() - t0
    step = max(1, len(cases) // (40 if quick else 150))
    sample = list(range(0, len(cases), step))
    t0 = time.perf_counter()
    refs = [reference(*cases[i]) for i in sample]
    theirs = time.perf_counter() - t0
    for i, ref in zip(sample, refs):
        assert sympy.simplify(values[i].to_sympy() - ref) == 0, cases[i]
    per_ours, per_ref = ours / len(cases), theirs / len(sample)
    ratio = per_ref / per_ours
    print(f"4-leaf coefficients, leaves <= {_half(max(leaf_tj))}: {len(cases)} coefficients "
          f"({sum(1 for v in values if v)} non-zero) in {ours:.2f} s = {per_ours * 1e6:.1f} us each")
    print(f"  reference (sympy CG sums) on {len(sample)} of them: {per_ref * 1e3:.2f} ms each, all equal")
    print(f"  ratio {ratio:.0f}x  (target >= 100x)  {'PASS' if ratio >= 100 else 'MISS'}")


def part2() -> None:
    t1 = "(((((a b)e1 c)e2 d)e3 e)e4 f)J"
    t2 = "((f (c a)g1)g2 ((e b)g3 d)g4)J"
    vals = dict(a=3, b=3, c=3, d=3, e=3, f=3, e1=4, e2=3, e3=4, e4=3, J=4, g1=4, g2=3, g3=2, g4=4)
    _clear_caches()
    t0 = time.perf_counter()
    v = recoupling(t1, t2, **vals)
    cold = time.perf_counter() - t0
    t0 = time.perf_counter()
    v2 = recoupling(t1, t2, **{**vals, "J": 3})
    warm = time.perf_counter() - t0
    plan = paths.plan_path(coefficient.pair_of(t1, t2))
    kinds = [s.kind for s in plan.steps if s.kind != "exchange"]
    print(f"6-leaf coefficient, leaves 3, {len(kinds)} moves ({', '.join(kinds)}), {len(plan.summed)} summed:")
    print(f"  cold {cold * 1e3:.1f} ms (path search included), warm {warm * 1e3:.1f} ms"
          f"  (target < 50 ms)  {'PASS' if cold < 0.05 else 'MISS'}   value {v}, next {v2}")


def main() -> None:
    parser = argparse.ArgumentParser()
    parser.add_argument("--quick", action="store_true")
    args = parser.parse_args()
    part1(args.quick)
    part2()


if __name__ == "__main__":
    main()

"""A private, minimal exact sum of Surds (to be replaced by the shared exact-sum type).

Why this suffices here: a 6j is a rational times the root of the product of
its four triangle factors Delta(x y z) (Racah's formula; Edmonds 1957, eq.
6.3.7), and a 9j a rational times the root of its six row and column
triangle factors.  Along a path of moves every coupling created and later
destroyed enters two symbols with the same triads, so its triangle factors
and its 2x+1 appear squared; the square class of every term of one
recoupling coefficient therefore depends only on the two end trees.  All
terms share one class, and the sum is (sum of rationals) * one root.

The code still groups by square class, as a check: a second live class is a
bug and raises AssertionError.  TODO(merge): use the shared ExactSum here.
"""

from __future__ import annotations

from fractions import Fraction
from math import isqrt

from ..values.surd import Surd

__all__ = ["surd_sum"]


def _rational_root(n: int, d: int) -> Fraction | None:
    f = Fraction(n, d)
    n, d = f.numerator, f.denominator
    rn, rd = isqrt(n), isqrt(d)
    return Fraction(rn, rd) if rn * rn == n and rd * rd == d else None


def surd_sum(terms) -> Surd:
    """The exact sum of Surd terms that share one square class."""
    classes: list[list] = []  # [p, q, coefficient]: coefficient * sqrt(p/q)
    for t in terms:
        if not t:
            continue
        for entry in classes:
            root = _rational_root(t.p * entry[1], t.q * entry[0])  # sqrt(t^2 / (p/q))
            if root is not None:
                entry[2] += t.sign * root
                break
        else:
            classes.append([t.p, t.q, Fraction(t.sign)])
    live = [e for e in classes if e[2]]
    if not live:
        return Surd._trusted(0, 0, 1)
    assert len(live) == 1, f"a recoupling sum mixes square classes: {live}"
    p, q, c = live[0]
    return Surd(1 if c > 0 else -1, c.numerator ** 2 * p, c.denominator ** 2 * q)

"""The public functions: quantum numbers in any accepted form in, exact value out.

Condon-Shortley phase convention.  Each function parses its arguments with
the kind's parser (spins.py rules; a bad argument raises QuantumNumberError
naming it) and calls the kind's function on doubled arguments.  The formulas
live in tablegen/kinds/: threej.py (3j, CG), sixj.py (6j, W), ninej.py (9j).
"""

from __future__ import annotations

from .kinds import kind
from .kinds.ninej import NINEJ, ninej2
from .kinds.sixj import RACAH_W, SIXJ, racah_w2, sixj2
from .kinds.threej import CACHE_ENTRIES, CACHE_MAX_J, CG, THREEJ, cg2, threej2
from .values import Surd

__all__ = [
    "cg",
    "threej",
    "sixj",
    "racah_w",
    "ninej",
    "why_zero",
    "cg2",
    "threej2",
    "sixj2",
    "racah_w2",
    "ninej2",
    "CACHE_ENTRIES",
    "CACHE_MAX_J",
]


def cg(j1, m1, j2, m2, J, M, *, max_j: int | None = None) -> Surd:
    """Clebsch-Gordan coefficient <j1 m1; j2 m2 | J M>, Condon-Shortley phase.

    >>> cg(1, 1, 1, -1, 0, 0)
    Surd(1, 1, 3)
    """
    return cg2(*CG.parse((j1, m1, j2, m2, J, M), max_j))


def threej(j1, j2, j3, m1, m2, m3, *, max_j: int | None = None) -> Surd:
    """Wigner 3j symbol (j1 j2 j3; m1 m2 m3), Condon-Shortley phase."""
    return threej2(*THREEJ.parse((j1, j2, j3, m1, m2, m3), max_j))


def sixj(j1, j2, j3, j4, j5, j6, *, max_j: int | None = None) -> Surd:
    """Wigner 6j symbol {j1 j2 j3; j4 j5 j6}."""
    return sixj2(*SIXJ.parse((j1, j2, j3, j4, j5, j6), max_j))


def racah_w(a, b, c, d, e, f, *, max_j: int | None = None) -> Surd:
    """Racah W(a b c d; e f) = (-1)**(a+b+c+d) {a b e; d c f}."""
    return racah_w2(*RACAH_W.parse((a, b, c, d, e, f), max_j))


def ninej(j11, j12, j13, j21, j22, j23, j31, j32, j33, *, max_j: int | None = None) -> Surd:
    """Wigner 9j symbol with rows (j11 j12 j13), (j21 j22 j23), (j31 j32 j33)."""
    return ninej2(*NINEJ.parse((j11, j12, j13, j21, j22, j23, j31, j32, j33), max_j))


def why_zero(kind_key: str, *values, max_j: int | None = None) -> str | None:
    """Why a coefficient is zero, or None if it is not.

    ``kind_key`` is one of "cg", "3j", "6j", "w", "9j"; the values are given
    in the same order as to the function of that kind.  The answer starts
    with the rule's short name ("triangle", "triad-sum", "m-sum", "m-range",
    "parity", "symmetry", "cancellation") followed by a colon.
    """
    k = kind(kind_key)
    rule = k.zero_rule(k.parse(values, max_j))
    return None if rule is None else str(rule)


def why_zero_doubled(kind_key: str, t: tuple[int, ...]) -> str | None:
    """Which rule makes a symbol zero (doubled arguments), or None if it is not zero."""
    rule = kind(kind_key).zero_rule(tuple(t))
    return None if rule is None else str(rule)

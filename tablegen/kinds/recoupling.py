"""Recoupling coefficients as kinds: three and four angular momenta, on fixed pairs of trees.

Two kinds, each a recoupling coefficient between two fixed coupling trees,
computed by the recoupling engine (tablegen.recoupling: a path of moves,
summed exactly), not by a closed formula here:

* ``recouple3``  <((j1 j2)j12 j3)J | (j1 (j2 j3)j23)J>
  = (-1)^(j1+j2+j3+J) sqrt((2j12+1)(2j23+1)) {j1 j2 j12; j3 J j23}
  (Edmonds 1957, eq. 6.1.5), its 6j given by :func:`sixj_of_recouple3`;
* ``recouple4``  <((j1 j2)j12 (j3 j4)j34)J | ((j1 j3)j13 (j2 j4)j24)J>
  = sqrt((2j12+1)(2j34+1)(2j13+1)(2j24+1)) {j1 j2 j12; j3 j4 j34; j13 j24 J}
  (Edmonds 1957, eq. 6.4.2), its 9j given by :func:`ninej_of_recouple4`.

Both are real and the matrices they fill (rows: intermediates of the first
tree, columns: of the second) are orthogonal.  The engine is imported on
first use, so a one-value lookup of another kind stays light.
"""

from __future__ import annotations

from functools import lru_cache

from ..values import Surd
from . import Kind, Notation, Selection, ZeroRule
from .common import first_triad_zero, parse_js

__all__ = ["RECOUPLE3", "RECOUPLE4", "recouple3", "recouple4", "sixj_of_recouple3", "ninej_of_recouple4",
           "TREES3", "TREES4"]

#: The two trees of each kind, in the engine's notation (names are the kind's arguments).
TREES3 = ("((j1 j2)j12 j3)J", "(j1 (j2 j3)j23)J")
TREES4 = ("((j1 j2)j12 (j3 j4)j34)J", "((j1 j3)j13 (j2 j4)j24)J")

_ARGS3 = ("j1", "j2", "j3", "J", "j12", "j23")
_ARGS4 = ("j1", "j2", "j3", "j4", "J", "j12", "j34", "j13", "j24")
# couplings of both trees, as argument positions
_TRIADS3 = ((0, 1, 4), (4, 2, 3), (1, 2, 5), (0, 5, 3))
_TRIADS4 = ((0, 1, 5), (2, 3, 6), (5, 6, 4), (0, 2, 7), (1, 3, 8), (7, 8, 4))
_ZERO = Surd._trusted(0, 0, 1)


@lru_cache(maxsize=4)
def _plan(trees: tuple[str, str]):
    from ..recoupling.coefficient import pair_of
    from ..recoupling.paths import plan_path

    return plan_path(pair_of(*trees))


def _engine(trees: tuple[str, str], names: tuple[str, ...], triads, t: tuple[int, ...]) -> Surd:
    if first_triad_zero(t, names, triads):
        return _ZERO
    from ..recoupling.coefficient import evaluate

    return evaluate(_plan(trees), dict(zip(names, t)))


def recouple3(tj1: int, tj2: int, tj3: int, tJ: int, tj12: int, tj23: int) -> Surd:
    """<((j1 j2)j12 j3)J | (j1 (j2 j3)j23)J> from doubled arguments."""
    return _engine(TREES3, _ARGS3, _TRIADS3, (tj1, tj2, tj3, tJ, tj12, tj23))


def recouple4(tj1: int, tj2: int, tj3: int, tj4: int, tJ: int, tj12: int, tj34: int, tj13: int, tj24: int) -> Surd:
    """<((j1 j2)j12 (j3 j4)j34)J | ((j1 j3)j13 (j2 j4)j24)J> from doubled arguments."""
    return _engine(TREES4, _ARGS4, _TRIADS4, (tj1, tj2, tj3, tj4, tJ, tj12, tj34, tj13, tj24))


def sixj_of_recouple3(t: tuple[int, ...]) -> tuple[int, ...]:
    """The 6j {j1 j2 j12; j3 J j23} a recouple3 coefficient is made of (doubled arguments)."""
    j1, j2, j3, J, j12, j23 = t
    return (j1, j2, j12, j3, J, j23)


def ninej_of_recouple4(t: tuple[int, ...]) -> tuple[int, ...]:
    """The 9j {j1 j2 j12; j3 j4 j34; j13 j24 J} a recouple4 coefficient is made of (doubled arguments)."""
    j1, j2, j3, j4, J, j12, j34, j13, j24 = t
    return (j1, j2, j12, j3, j4, j34, j13, j24, J)


_CANCELLATION = ZeroRule("cancellation", "every coupling of both trees is allowed, but the sum is exactly 0")


def _zero3(t):
    return first_triad_zero(t, _ARGS3, _TRIADS3) or (None if recouple3(*t) else _CANCELLATION)


def _zero4(t):
    return first_triad_zero(t, _ARGS4, _TRIADS4) or (None if recouple4(*t) else _CANCELLATION)


RECOUPLE3 = Kind(
    key="recouple3",
    convention="Condon-Shortley phase along both coupling trees",
    max_j=5000,  # all j = 5000: ~0.5 s (measured); time grows about like j**2
    cost_power=2,
    seconds_at_max_j=0.5,
    title="recoupling coefficient of three angular momenta",
    arguments=_ARGS3,
    j_positions=tuple(range(6)),
    parse=lambda values, max_j=None: parse_js("recouple3", _ARGS3, values, max_j),
    doubled=recouple3,
    zero_rule=_zero3,
    notation=Notation("function", ((0, 1, 2), (3,), (4, 5)), name="R3"),
    selection=Selection(triads=_TRIADS3),
)

RECOUPLE4 = Kind(
    key="recouple4",
    convention="Condon-Shortley phase along both coupling trees",
    max_j=200,  # all j = 200: ~0.8 s (measured, a 9j underneath); time grows about like j**3
    cost_power=3,
    seconds_at_max_j=0.8,
    title="recoupling coefficient of four angular momenta",
    arguments=_ARGS4,
    j_positions=tuple(range(9)),
    parse=lambda values, max_j=None: parse_js("recouple4", _ARGS4, values, max_j),
    doubled=recouple4,
    zero_rule=_zero4,
    notation=Notation("function", ((0, 1, 2, 3), (4,), (5, 6), (7, 8)), name="R4"),
    selection=Selection(triads=_TRIADS4),
)

"""Coupled states of three angular momenta in the product basis, as a kind.

    <j1 m1; j2 m2; j3 m3 | (j1 j2)j12, j3; J M>
      = <j1 m1; j2 m2 | j12 m1+m2> <j12 m1+m2; j3 m3 | J M>

the coefficient of the product state |j1,m1>|j2,m2>|j3,m3> in the coupled
state of the tree ((j1 j2)j12 j3)J (common practice: coupling one pair after
the other, Condon-Shortley phase).  For fixed (j1, j2, j3, M) the coefficients
form a real orthogonal matrix, rows the coupled states (j12, J), columns the
product states (m1, m2, m3): a row is a coupled state written in product
states, a column a product state written in coupled states.
"""

from __future__ import annotations

from ..values import Surd
from . import Kind, Notation, Selection
from .common import first_triad_zero, projection_zero

__all__ = ["STATE3", "state3"]

_ARGS = ("j1", "j2", "j3", "j12", "J", "M", "m1", "m2", "m3")
_TRIADS = ((0, 1, 3), (3, 2, 4))
_ZERO = Surd._trusted(0, 0, 1)


def _zero(t: tuple[int, ...]):
    j1, j2, j3, j12, J, M, m1, m2, m3 = t
    return (first_triad_zero(t, _ARGS, _TRIADS)
            or projection_zero(((j1, m1, "m1"), (j2, m2, "m2"), (j3, m3, "m3"), (J, M, "M"), (j12, m1 + m2, "m1 + m2")),
                               m1 + m2 + m3 - M, "m1 + m2 + m3 differs from M"))


def state3(tj1: int, tj2: int, tj3: int, tj12: int, tJ: int, tM: int, tm1: int, tm2: int, tm3: int) -> Surd:
    """<j1 m1; j2 m2; j3 m3 | (j1 j2)j12, j3; J M> from doubled arguments: two CG coefficients."""
    if _zero((tj1, tj2, tj3, tj12, tJ, tM, tm1, tm2, tm3)):
        return _ZERO
    from .threej import cg2

    return cg2(tj1, tm1, tj2, tm2, tj12, tm1 + tm2) * cg2(tj12, tm1 + tm2, tj3, tm3, tJ, tM)


def _zero_rule(t):
    rule = _zero(t)
    if rule is None and not state3(*t):
        from . import ZeroRule

        return ZeroRule("cancellation", "every rule holds, but a CG coefficient of the tree is exactly 0")
    return rule


STATE3 = Kind(
    key="state3",
    max_j=5000,  # all j = 5000: ~0.6 s (measured, CG products)
    cost_power=2,
    seconds_at_max_j=0.6,
    title="coefficient of a product state in a coupled state of three angular momenta",
    arguments=_ARGS,
    j_positions=(0, 1, 2, 3, 4),
    parse=lambda values, max_j=None: _parse(values, max_j),
    doubled=state3,
    zero_rule=_zero_rule,
    notation=Notation("braket", ((0, 6), (1, 7), (2, 8), (3, 4, 5))),
    selection=Selection(triads=_TRIADS, projections=((0, 6), (1, 7), (2, 8), (4, 5)), m_sum=(0, 0, 0, 0, 0, -1, 1, 1, 1)),
)


def _parse(values, max_j=None) -> tuple[int, ...]:
    """Doubled arguments: the j's first, then each m against its j."""
    from ..spins import parse_j, parse_m
    from .common import check_count

    check_count("state3", _ARGS, values)
    t = [parse_j(values[i], _ARGS[i], max_j) for i in range(5)]
    for i, (name, j) in zip(range(5, 9), (("M", 4), ("m1", 0), ("m2", 1), ("m3", 2))):
        t.append(parse_m(values[i], name, t[j], _ARGS[j], max_j))
    return tuple(t)

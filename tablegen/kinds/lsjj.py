"""Two-particle LS <-> jj coefficients as kinds, for the site's per-configuration pages.

    <(l1 s1)j1, (l2 s2)j2; J | (l1 l2)L, (s1 s2)S; J>,   s1 = s2 = 1/2, each particle coupled as (l s)j,

computed by the recoupling engine (tablegen.recoupling.lsjj.lsjj_entry, a
9j with its factors).  One kind, ``lsjj``, whose first argument says how
many shells the two particles occupy: shells = 2, particles in different
shells (every term); shells = 1, equivalent particles (l1 = l2): antisymmetric
normalised jj states, j1 <= j2, and only Pauli-allowed terms (L + S even)
and pairs (J even when j1 = j2); anything else is zero by the "pauli" rule.  Arguments are doubled like every j (l = 1 is 2); the site
tabulates whole l (a half-integer l is accepted and recoupled all the same).
"""

from __future__ import annotations

from ..errors import QuantumNumberError
from ..values import Surd
from . import Kind, Notation, Selection, ZeroRule
from .common import first_triad_zero, parse_js

__all__ = ["LSJJ", "lsjj2", "ninej_of_lsjj"]

_ARGS = ("shells", "l1", "l2", "j1", "j2", "J", "L", "S")
# the couplings with s = 1/2 are checked in _spin_zero; these are the positional ones
_TRIADS = ((3, 4, 5), (1, 2, 6), (6, 7, 5))
_ZERO = Surd._trusted(0, 0, 1)


def _parse(values, max_j=None) -> tuple[int, ...]:
    t = parse_js("lsjj", _ARGS, values, max_j)
    if t[0] not in (2, 4):
        raise QuantumNumberError("shells", values[0], "must be 1 (equivalent particles) or 2 (two shells)")
    return t


def _spin_zero(t: tuple[int, ...]) -> "ZeroRule | None":
    _, l1, l2, j1, j2, J, L, S = t
    if abs(j1 - l1) != 1:
        return ZeroRule("triangle", "j1 is not l1 ± 1/2")
    if abs(j2 - l2) != 1:
        return ZeroRule("triangle", "j2 is not l2 ± 1/2")
    if S not in (0, 2):
        return ZeroRule("triangle", "S of two spins 1/2 is 0 or 1")
    return first_triad_zero(t, _ARGS, _TRIADS)


def _pauli_zero(t: tuple[int, ...]) -> "ZeroRule | None":
    shells, l1, l2, j1, j2, J, L, S = t
    if shells != 2:
        return None
    if l1 != l2:
        return ZeroRule("pauli", "equivalent particles have l1 = l2")
    if (L + S) % 4:
        return ZeroRule("pauli", "L + S is odd: the LS term is not antisymmetric")
    if j1 > j2:
        return ZeroRule("pauli", "the antisymmetric pair is written with j1 <= j2")
    if j1 == j2 and J % 4:
        return ZeroRule("pauli", "J is odd for j1 = j2: the jj pair is not antisymmetric")
    return None


def lsjj2(*t: int) -> Surd:
    """The coefficient from doubled arguments (shells l1 l2 j1 j2 J L S); zero where a rule says so."""
    if _spin_zero(t) or _pauli_zero(t):
        return _ZERO
    from ..recoupling.lsjj import lsjj_entry

    return lsjj_entry(*t[1:], equivalent=t[0] == 2)


def ninej_of_lsjj(t: tuple[int, ...]) -> tuple[int, ...]:
    """The 9j {l1 1/2 j1; l2 1/2 j2; L S J} an entry is made of (doubled arguments)."""
    _, l1, l2, j1, j2, J, L, S = t
    return (l1, 1, j1, l2, 1, j2, L, S, J)


_CANCELLATION = ZeroRule("cancellation", "every coupling is allowed, but the 9j is exactly 0")


def _zero_rule(t: tuple[int, ...]) -> "ZeroRule | None":
    return _spin_zero(t) or _pauli_zero(t) or (None if lsjj2(*t) else _CANCELLATION)


LSJJ = Kind(
    key="lsjj",
    convention="Condon-Shortley phase; each particle coupled in the order (l s)j",
    max_j=200,  # a 9j underneath: the 9j limit
    cost_power=3,
    seconds_at_max_j=0.5,
    title="LS-jj coefficient of two particles",
    arguments=_ARGS,
    j_positions=tuple(range(1, 8)),
    parse=_parse,
    doubled=lsjj2,
    zero_rule=_zero_rule,
    notation=Notation("function", ((0,), (1, 2), (3, 4), (6, 7), (5,)), name="LSjj"),
    selection=Selection(triads=_TRIADS),
)

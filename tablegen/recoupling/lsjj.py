"""Two-particle LS <-> jj transformation matrices, one per total J, via the 9j.

For particles with orbital l1, l2 and spin 1/2 each, the entry is

    <(l1 s1)j1, (l2 s2)j2; J | (l1 l2)L, (s1 s2)S; J>
      = sqrt((2j1+1)(2j2+1)(2L+1)(2S+1)) {l1 s1 j1; l2 s2 j2; L S J}

(Edmonds 1957, eq. 6.4.2), computed here as the recoupling between the trees
``((l1 s1)j1 (l2 s2)j2)J`` and ``((l1 l2)L (s1 s2)S)J``.  Rows are (j1, j2),
columns the term symbols ^{2S+1}L_J.  With order="sl" each particle couples
as (s l)j instead, which multiplies row (j1, j2) by (-1)^(l1+l2+1-j1-j2).

Equivalent particles (l^2): only the antisymmetric states are kept, the
Pauli-allowed terms (L + S even) and the jj pairs j1 <= j2 with J even when
j1 = j2.  Normalisation: the antisymmetric jj state for j1 < j2 is
[|j1 j2; J> - (-1)^(j1+j2-J) |j2 j1; J>]/sqrt(2), and for j1 = j2 it is
|j j; J> itself (de-Shalit and Talmi, Nuclear Shell Theory, 1963, ch. 1);
its overlap with an allowed LS term is therefore sqrt(2) times the 9j entry
for j1 < j2, and the entry itself for j1 = j2.  The matrices stay orthogonal.
"""

from __future__ import annotations

from typing import NamedTuple


from ..errors import QuantumNumberError
from ..spins import half_text
from ..values.surd import Surd
from functools import lru_cache

from .coefficient import evaluate, pair_of, tree_allowed
from .paths import plan_path

__all__ = ["LsJjMatrix", "lsjj_matrices", "lsjj_entry", "lsjj_labels", "term_symbol", "ORBITAL_LETTERS"]

#: Spectroscopic letters for L = 0, 1, 2, ... (J is skipped by convention).
ORBITAL_LETTERS = "SPDFGHIKLMNOQRTUV"

_JJ = {"ls": "((l1 s1)j1 (l2 s2)j2)J", "sl": "((s1 l1)j1 (s2 l2)j2)J"}
_LS = "((l1 l2)L (s1 s2)S)J"


def term_symbol(L: int, S2: int, J: int, latex: bool = False) -> str:
    """'3P2' or '{}^{3}\\mathrm{P}_{2}' for L, 2S and J (ints, J whole)."""
    letter = ORBITAL_LETTERS[L] if L < len(ORBITAL_LETTERS) else f"[L={L}]"
    if latex:
        return f"{{}}^{{{S2 + 1}}}\\mathrm{{{letter}}}_{{{J}}}"
    return f"{S2 + 1}{letter}{J}"


class LsJjMatrix(NamedTuple):
    """One J: rows (j1, j2) doubled, columns (L, 2S), exact entries."""

    l1: int
    l2: int
    J: int
    order: str
    equivalent: bool
    rows: tuple[tuple[int, int], ...]
    columns: tuple[tuple[int, int], ...]
    entries: tuple[tuple[Surd, ...], ...]

    def row_labels(self) -> tuple[str, ...]:
        return tuple(f"({half_text(a)}, {half_text(b)})" for a, b in self.rows)

    def column_labels(self, latex: bool = False) -> tuple[str, ...]:
        return tuple(term_symbol(L, S2, self.J, latex) for L, S2 in self.columns)

    def convention(self) -> str:
        """The coupling order and normalisation, to be stated beside the matrix."""
        each = "(l s)j" if self.order == "ls" else "(s l)j"
        text = f"each particle coupled as {each}; rows <j1 j2; J|, columns |L S; J>"
        if self.equivalent:
            text += "; antisymmetric normalised states, Pauli-allowed terms only"
        return text


def _check_l(value: object, name: str) -> int:
    if type(value) is not int or value < 0:
        raise QuantumNumberError(name, value, "an orbital l must be a whole number >= 0")
    return value


def lsjj_matrices(l1: int, l2: int, *, equivalent: bool = False, order: str = "ls") -> tuple[LsJjMatrix, ...]:
    """The LS<->jj matrices for every J of two spin-1/2 particles with orbital l1, l2."""
    l1, l2 = _check_l(l1, "l1"), _check_l(l2, "l2")
    if order not in _JJ:
        raise QuantumNumberError("order", order, "must be 'ls' for (l s)j or 'sl' for (s l)j")
    if equivalent and l1 != l2:
        raise QuantumNumberError("l2", l2, f"equivalent particles need l2 = l1 = {l1}")
    out = []
    for J in range(0, l1 + l2 + 2):
        rows, cols = lsjj_labels(l1, l2, J, equivalent)
        if not rows:
            continue
        entries = []
        for a, b in rows:
            entries.append(tuple(lsjj_entry(2 * l1, 2 * l2, a, b, 2 * J, 2 * L, S2, equivalent, order)
                                 for L, S2 in cols))
        out.append(LsJjMatrix(l1, l2, J, order, equivalent, tuple(rows), tuple(cols), tuple(entries)))
    return tuple(out)


def lsjj_labels(l1: int, l2: int, J: int, equivalent: bool) -> tuple[list[tuple[int, int]], list[tuple[int, int]]]:
    """Rows (doubled j1, j2) and columns (L, doubled S) of one J (l1, l2, J, L whole numbers)."""
    rows = [(a, b) for a in _js(l1) for b in _js(l2) if abs(a - b) <= 2 * J <= a + b]
    cols = [(L, S2) for L in range(abs(l1 - l2), l1 + l2 + 1) for S2 in (0, 2) if abs(L - S2 // 2) <= J <= L + S2 // 2]
    if equivalent:
        rows = [(a, b) for a, b in rows if a < b or (a == b and J % 2 == 0)]
        cols = [(L, S2) for L, S2 in cols if (L + S2 // 2) % 2 == 0]
    return rows, cols


def lsjj_entry(tl1: int, tl2: int, tj1: int, tj2: int, tJ: int, tL: int, tS: int, equivalent: bool = False,
               order: str = "ls") -> Surd:
    """One entry <(l1 s1)j1, (l2 s2)j2; J | (l1 l2)L, (s1 s2)S; J> from doubled values (s1 = s2 = 1/2).

    With ``equivalent`` the row is the antisymmetric normalised state (j1 < j2: sqrt(2) times the
    9j entry; j1 = j2: the entry itself); the caller keeps to Pauli-allowed rows and columns.
    """
    pair = pair_of(_JJ[order], _LS)
    env = {"l1": tl1, "l2": tl2, "s1": 1, "s2": 1, "j1": tj1, "j2": tj2, "L": tL, "S": tS, "J": tJ}
    if not tree_allowed(pair, env):
        return Surd._trusted(0, 0, 1)
    v = evaluate(_plan(order), env)
    return v * Surd._trusted(1, 2, 1) if equivalent and tj1 != tj2 else v


@lru_cache(maxsize=2)
def _plan(order: str):
    return plan_path(pair_of(_JJ[order], _LS))


def _js(l: int) -> tuple[int, ...]:
    """Doubled j = l - 1/2, l + 1/2 (only 1/2 for l = 0)."""
    return (1,) if l == 0 else (2 * l - 1, 2 * l + 1)

"""Clebsch-Gordan coefficients rebuilt from the angular-momentum algebra alone.

Common practice, no source: the textbook construction of coupled states.

1. For each j, the matrices of J+, J-, Jz on |j m> come from
   J+-|j m> = sqrt(j(j+1) - m(m+-1)) |j m+-1> and Jz|j m> = m|j m>
   (exact sympy matrices); they satisfy [Jx, Jy] = i Jz and J^2 = j(j+1).
2. In the basis e_m = (J-)^(j-m) |j j> (the same states, not normalised) the
   ladder matrices and the metric <e_m|e_m> are rational; they are obtained
   here from the matrices of step 1 by the diagonal change of basis, and the
   rest of the construction is exact rational arithmetic (Fraction).
3. On the product space J = J(1) + J(2).  For J = j1 + j2, j1 + j2 - 1, ...,
   the top state |J J> is the part of e_j1 (x) f_(J-j1) orthogonal to every
   higher-J state with M = J (Condon-Shortley phase: <j1 j1; j2 J-j1 | J J> > 0);
   lowering with J- gives |J M> for every M.
4. Normalising gives <j1 m1; j2 m2 | J M>**2 (a rational number) and its sign,
   compared with tablegen's cg() for all j1, j2 <= 7/2.
"""

from __future__ import annotations

import itertools
from fractions import Fraction

import pytest
import sympy
from sympy import I, Rational, sqrt

from tablegen import cg

MAX_TJ = 7  # doubled j up to 7/2 (the construction is cheap; 5/2 is the minimum asked)


# ---------------------------------------------------------------------------
# step 1: exact matrices on |j m>, rows and columns ordered m = j, j-1, ..., -j
# ---------------------------------------------------------------------------
def projections(tj: int) -> list[Rational]:
    return [Rational(tj - 2 * k, 2) for k in range(tj + 1)]


def spin_matrices(tj: int):
    """(J+, J-, Jz) as exact sympy matrices."""
    j = Rational(tj, 2)
    ms = projections(tj)
    n = tj + 1
    jp, jm = sympy.zeros(n, n), sympy.zeros(n, n)
    for col, m in enumerate(ms):
        if col > 0:  # J+ |j m> = sqrt(j(j+1) - m(m+1)) |j m+1>, one row up
            jp[col - 1, col] = sqrt(j * (j + 1) - m * (m + 1))
        if col < n - 1:  # J- |j m> = sqrt(j(j+1) - m(m-1)) |j m-1>, one row down
            jm[col + 1, col] = sqrt(j * (j + 1) - m * (m - 1))
    return jp, jm, sympy.diag(*ms)


def is_zero_matrix(m) -> bool:
    return all(sympy.expand(x) == 0 for x in m)


@pytest.mark.parametrize("tj", range(0, MAX_TJ + 1))
def test_spin_matrices_obey_the_algebra(tj):
    jp, jm, jz = spin_matrices(tj)
    j = Rational(tj, 2)
    jx = (jp + jm) / 2
    jy = (jp - jm) / (2 * I)
    n = tj + 1
    assert jm == jp.T  # J- is the adjoint of J+ (real matrices)
    assert is_zero_matrix(jx * jy - jy * jx - I * jz)  # [Jx, Jy] = i Jz
    assert is_zero_matrix(jy * jz - jz * jy - I * jx)  # [Jy, Jz] = i Jx
    assert is_zero_matrix(jz * jx - jx * jz - I * jy)  # [Jz, Jx] = i Jy
    assert is_zero_matrix(jx * jx + jy * jy + jz * jz - j * (j + 1) * sympy.eye(n))  # J^2
    if tj:
        assert not is_zero_matrix(jp)  # the checks above are not about zero matrices


# ---------------------------------------------------------------------------
# step 2: the rational basis e_m = (J-)^(j-m) |j j> = c_m |j m>
# ---------------------------------------------------------------------------
def as_fraction(x) -> Fraction:
    assert x.is_Rational, x
    return Fraction(int(x.p), int(x.q))


def rational_spin(tj: int):
    """(lower, raise, metric) in the basis e_m, as Fractions.

    lower[a][b] and raise_[a][b] are matrix elements (row a, column b);
    metric[a] = <e_m|e_m> with m the a-th projection.
    """
    jp, jm, _ = spin_matrices(tj)
    n = tj + 1
    c = [sympy.Integer(1)]
    for col in range(n - 1):  # e_(m-1) = J- e_m, so c_(m-1) = c_m * <m-1|J-|m>
        c.append(c[-1] * jm[col + 1, col])
    C = sympy.diag(*c)
    Cinv = sympy.diag(*[1 / x for x in c])
    lower = [[as_fraction(sympy.expand(x)) for x in row] for row in (Cinv * jm * C).tolist()]
    raise_ = [[as_fraction(sympy.expand(x)) for x in row] for row in (Cinv * jp * C).tolist()]
    metric = [as_fraction(sympy.expand(x * x)) for x in c]
    return lower, raise_, metric


@pytest.mark.parametrize("tj", range(0, MAX_TJ + 1))
def test_rational_basis_is_what_the_construction_assumes(tj):
    lower, raise_, metric = rational_spin(tj)
    n = tj + 1
    j = Fraction(tj, 2)
    for a, b in itertools.product(range(n), repeat=2):
        # J- e_m = e_(m-1): a unit subdiagonal
        assert lower[a][b] == (1 if a == b + 1 else 0)
        # J+ e_(m-1) = J+ J- e_m = (j(j+1) - m(m-1)) e_m
        m = j - b + 1  # column b is e_(m-1) with m - 1 = j - b
        assert raise_[a][b] == (j * (j + 1) - m * (m - 1) if a == b - 1 else 0)
    assert metric[0] == 1 and all(g > 0 for g in metric)


# ---------------------------------------------------------------------------
# step 3: coupled states on the product space, all in Fractions
# ---------------------------------------------------------------------------
class ProductSpace:
    """Vectors are dicts {(a1, a2): Fraction} over the basis e_(m1) (x) f_(m2)."""

    def __init__(self, tj1: int, tj2: int) -> None:
        self.tj1, self.tj2 = tj1, tj2
        self.spin1, self.spin2 = rational_spin(tj1), rational_spin(tj2)

    def tm(self, a1: int, a2: int) -> tuple[int, int]:
        """Doubled (m1, m2) of basis index (a1, a2)."""
        return self.tj1 - 2 * a1, self.tj2 - 2 * a2

    def metric(self, a1: int, a2: int) -> Fraction:
        return self.spin1[2][a1] * self.spin2[2][a2]

    def inner(self, u: dict, v: dict) -> Fraction:
        return sum((x * v[k] * self.metric(*k) for k, x in u.items() if k in v), Fraction(0))

    def _apply(self, which: int, u: dict) -> dict:
        """The total J- (which=0) or J+ (which=1) on u."""
        m1, m2 = self.spin1[which], self.spin2[which]
        out: dict = {}
        for (a1, a2), x in u.items():
            for b1 in range(self.tj1 + 1):
                if m1[b1][a1]:
                    out[(b1, a2)] = out.get((b1, a2), 0) + m1[b1][a1] * x
            for b2 in range(self.tj2 + 1):
                if m2[b2][a2]:
                    out[(a1, b2)] = out.get((a1, b2), 0) + m2[b2][a2] * x
        return {k: x for k, x in out.items() if x}

    def lower(self, u: dict) -> dict:
        return self._apply(0, u)

    def raise_(self, u: dict) -> dict:
        return self._apply(1, u)

    def jz(self, u: dict) -> dict:
        return {k: x * Fraction(sum(self.tm(*k)), 2) for k, x in u.items() if sum(self.tm(*k))}

    def j_squared(self, u: dict) -> dict:
        """J^2 = J- J+ + Jz^2 + Jz."""
        out: dict = {}
        for part in (self.lower(self.raise_(u)), self.jz(self.jz(u)), self.jz(u)):
            for k, x in part.items():
                out[k] = out.get(k, 0) + x
        return {k: x for k, x in out.items() if x}

    def coupled_states(self) -> dict[int, list[dict]]:
        """{doubled J: [|J J>, |J J-1>, ..., |J -J>]}, unnormalised."""
        tj1, tj2 = self.tj1, self.tj2
        states: dict[int, list[dict]] = {}
        for tJ in range(tj1 + tj2, abs(tj1 - tj2) - 1, -2):
            # e_j1 (x) f_(J - j1): basis index a1 = 0, a2 from m2 = J - j1
            start = {(0, (tj2 - (tJ - tj1)) // 2): Fraction(1)}
            top = dict(start)
            for tK, ladder in states.items():
                higher = ladder[(tK - tJ) // 2]  # |K J>, K > J
                factor = self.inner(higher, start) / self.inner(higher, higher)
                for k, x in higher.items():
                    top[k] = top.get(k, 0) - factor * x
            top = {k: x for k, x in top.items() if x}
            assert top, (tj1, tj2, tJ)
            # Condon-Shortley phase: the component along e_j1 (x) f_(J-j1) is positive
            assert top[next(iter(start))] > 0
            ladder = [top]
            for _ in range(tJ):
                ladder.append(self.lower(ladder[-1]))
            states[tJ] = ladder
        return states


def scaled(u: dict, factor: Fraction) -> dict:
    return {k: factor * x for k, x in u.items()} if factor else {}


PAIRS = list(itertools.product(range(MAX_TJ + 1), repeat=2))


@pytest.mark.parametrize("tj1,tj2", PAIRS)
def test_coupled_states_reproduce_cg(tj1, tj2):
    space = ProductSpace(tj1, tj2)
    states = space.coupled_states()
    compared = 0
    for tJ, ladder in states.items():
        J = Fraction(tJ, 2)
        assert space.raise_(ladder[0]) == {}  # |J J> is a top state
        assert space.lower(ladder[-1]) == {}  # and J- |J -J> = 0
        for step, state in enumerate(ladder):
            tM = tJ - 2 * step
            assert state, (tJ, tM)
            # eigenstate of J^2 and Jz with J(J+1) and M
            assert space.j_squared(state) == scaled(state, J * (J + 1))
            assert space.jz(state) == scaled(state, Fraction(tM, 2))
            # orthogonal to the other J with the same M
            for tK, other in states.items():
                if tK > tJ:
                    assert space.inner(state, other[(tK - tM) // 2]) == 0
            norm = space.inner(state, state)
            for a1, a2 in itertools.product(range(tj1 + 1), range(tj2 + 1)):
                tm1, tm2 = space.tm(a1, a2)
                if tm1 + tm2 != tM:
                    continue
                x = state.get((a1, a2), Fraction(0))
                expected = x * x * space.metric(a1, a2) / norm * (1 if x >= 0 else -1)
                got = cg(Fraction(tj1, 2), Fraction(tm1, 2), Fraction(tj2, 2), Fraction(tm2, 2), J, Fraction(tM, 2))
                assert got.sign * got.squared() == expected, (tj1, tm1, tj2, tm2, tJ, tM, got, expected)
                compared += 1
    # every (m1, m2) is compared once for each J reaching M = m1 + m2
    per_m = [0] * (tj1 + tj2 + 1)
    for a1, a2 in itertools.product(range(tj1 + 1), range(tj2 + 1)):
        per_m[a1 + a2] += 1
    assert compared == sum(d * d for d in per_m)

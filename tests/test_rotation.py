"""Wigner rotation functions d^j_{m'm}(beta) and D^j_{m'm}(alpha, beta, gamma).

Sources, beside each check:
* the angular-momentum algebra itself (common practice, no source): J_y from the
  ladder operators, d(0) = 1, d'(beta) = -i J_y d(beta), d d^T = 1, d(pi), exp(-i beta J_y);
* sympy's rotation functions (a general-purpose library used as a reference);
* handbook closed forms (the d-function table of the particle-data review, "Clebsch-Gordan
  coefficients, spherical harmonics, and d functions"; written here from memory);
* the Clebsch-Gordan series (Edmonds 1957, eq. 4.3.1, written here in the d form).
"""

from __future__ import annotations

import random
from fractions import Fraction as F

import mpmath
import pytest

from tablegen import QuantumNumberError, cg, rotation_D, rotation_d, rotation_d_matrix
from tablegen.intmath import split_square
from tablegen.kinds.rotation import ROTATION_D_SMALL, d2, d_at_cos2, d_matrix2
from tablegen.values.surd import Surd
from tablegen.values.phased import PhasedSurd
from tablegen.values.trig_poly import TrigPoly

TJS = range(0, 9)  # j = 0 ... 4 in steps of 1/2


def ms(tj):
    return list(range(tj, -tj - 1, -2))


# ---------------------------------------------------------------------------
# the algebra (common practice, no source)
# ---------------------------------------------------------------------------
def minus_i_jy(tj):
    """-i J_y = -(J+ - J-)/2 as a real matrix of Surds, rows/columns m = j ... -j.

    J+|j m> = sqrt(j(j+1) - m(m+1)) |j m+1>, J-|j m> = sqrt(j(j+1) - m(m-1)) |j m-1>,
    with j(j+1) - m(m+1) = (tj(tj+2) - tm(tm+2))/4 in doubled integers."""
    idx = ms(tj)
    n = len(idx)
    K = [[Surd(0)] * n for _ in range(n)]
    for col, tm in enumerate(idx):
        if col > 0:  # J+ raises: row col-1
            K[col - 1][col] = Surd.from_square(F(tj * (tj + 2) - tm * (tm + 2), 4)) * F(-1, 2)
        if col < n - 1:  # J- lowers: row col+1
            K[col + 1][col] = Surd.from_square(F(tj * (tj + 2) - tm * (tm - 2), 4)) * F(1, 2)
    return K


def class_sum(terms):
    """Exact sum of TrigPolys grouped by the square class of their factors; returns the non-zero groups."""
    groups = {}
    for t in terms:
        if not t:
            continue
        key = (split_square(t.factor.p * t.factor.q)[1], t.half)
        groups[key] = groups[key] + t if key in groups else t
    return [g for g in groups.values() if g]


@pytest.mark.parametrize("tj", TJS)
def test_d_at_zero_is_the_identity(tj):
    for a in ms(tj):
        for b in ms(tj):
            assert d2(tj, a, b).at_cos(F(1)) == (1 if a == b else 0)


@pytest.mark.parametrize("tj", TJS)
def test_derivative_is_minus_i_jy_times_d(tj):
    """d'(beta) = -i J_y d(beta), an exact identity of polynomials in cos beta."""
    K = minus_i_jy(tj)
    idx = ms(tj)
    for r, a in enumerate(idx):
        for b in idx:
            rhs = class_sum([d2(tj, idx[k], b) * K[r][k] for k in range(len(idx)) if K[r][k]])
            lhs = d2(tj, a, b).derivative()
            assert rhs == ([lhs] if lhs else []), (tj, a, b)
    if tj:
        assert any(d2(tj, a, b).derivative() for a in idx for b in idx)


@pytest.mark.parametrize("tj", TJS)
def test_d_is_orthogonal(tj):
    """d(beta) d(beta)^T = 1 as exact functions."""
    idx = ms(tj)
    for a in idx:
        for b in idx:
            total = class_sum([d2(tj, a, k) * d2(tj, b, k) for k in idx])
            assert total == ([TrigPoly(1, [1])] if a == b else []), (tj, a, b)


@pytest.mark.parametrize("tj", TJS)
def test_d_at_pi(tj):
    """Derived from Wigner's formula: only a = 2j-2k+m-m' = 0 survives at cos(pi/2) = 0, which forces
    m = -m' and gives d^j_{m'm}(pi) = (-1)^(j+m') delta_{m',-m}."""
    for a in ms(tj):
        for b in ms(tj):
            want = (-1) ** ((tj + a) // 2) if a == -b else 0
            assert rotation_d(F(tj, 2), F(a, 2), F(b, 2), beta="pi") == want


@pytest.mark.slow
@pytest.mark.parametrize("tj", range(0, 7))
def test_matches_matrix_exponential_at_40_digits(tj):
    """d(beta) = expm(-i beta J_y) (mpmath at 50 digits), compared to 40 digits at several beta."""
    K = minus_i_jy(tj)
    n = tj + 1
    with mpmath.workdps(50):
        Km = mpmath.matrix([[mpmath.mpf(x.sign) * mpmath.sqrt(mpmath.mpf(x.p) / x.q) for x in row] for row in K])
        for beta in (F(1, 7), F(3, 2), F(5, 2), F(-2, 3)):
            E = mpmath.expm(Km * (mpmath.mpf(beta.numerator) / beta.denominator))
            for r, a in enumerate(ms(tj)):
                for c, b in enumerate(ms(tj)):
                    text = rotation_d(F(tj, 2), F(a, 2), F(b, 2), beta=beta, digits=40)
                    assert abs(mpmath.mpf(text) - E[r, c]) <= mpmath.mpf(10) ** -38 * max(1, abs(E[r, c])), (tj, a, b)
    assert n == len(ms(tj))


# ---------------------------------------------------------------------------
# sympy's rotation functions (reference library)
# sympy.physics.quantum.spin.Rotation.d(j, m, mp, beta) is <j m| exp(-i beta Jy) |j mp>: the same
#   definition and the same index order as tablegen's d^j_{m'm} with (m', m) = (m, mp).
# sympy.physics.wigner.wigner_d_small(J, beta)[J-m', J-m] is defined with exp(+i beta Jy), i.e. it is
#   tablegen's d(-beta) = d(beta)^T: element [J-m', J-m] equals tablegen's d^J_{m m'}(beta).
# ---------------------------------------------------------------------------
@pytest.mark.slow
@pytest.mark.parametrize("tj", range(0, 7))
def test_sympy_at_half_pi_exactly(tj):
    import sympy
    from sympy.physics.quantum.spin import Rotation
    from sympy.physics.wigner import wigner_d_small

    J = sympy.Rational(tj, 2)
    small = wigner_d_small(J, sympy.pi / 2)
    for r, a in enumerate(ms(tj)):
        for c, b in enumerate(ms(tj)):
            ours = rotation_d(F(tj, 2), F(a, 2), F(b, 2), beta="pi/2")
            assert isinstance(ours, Surd)
            ref = Rotation.d(J, sympy.Rational(a, 2), sympy.Rational(b, 2), sympy.pi / 2).doit()
            assert sympy.simplify(ours.to_sympy() - ref) == 0, (tj, a, b)
            assert sympy.simplify(rotation_d(F(tj, 2), F(b, 2), F(a, 2), beta="pi/2").to_sympy() - small[r, c]) == 0


@pytest.mark.slow
def test_sympy_at_random_angles_30_digits():
    import sympy
    from sympy.physics.quantum.spin import Rotation

    rng = random.Random(20261202)
    beta_s = sympy.Symbol("beta")
    for tj in range(0, 7):
        for a in ms(tj):
            for b in ms(tj):
                expr = Rotation.d(sympy.Rational(tj, 2), sympy.Rational(a, 2), sympy.Rational(b, 2), beta_s).doit()
                x = F(rng.randint(-3000, 3000), 1000)
                ours = mpmath.mpf(rotation_d(F(tj, 2), F(a, 2), F(b, 2), beta=x, digits=30))
                ref = sympy.N(expr.subs(beta_s, sympy.Rational(x.numerator, x.denominator)), 40)
                assert abs(ours - mpmath.mpf(str(ref))) <= mpmath.mpf(10) ** -29 * max(1, abs(ours))


# ---------------------------------------------------------------------------
# handbook closed forms (particle-data review d-function table; from memory).
# With c = cos(beta), h = half-angle factor; the remaining elements follow from
# d^j_{m'm} = (-1)^(m-m') d^j_{mm'} = d^j_{-m,-m'} (same table's footnote).
# ---------------------------------------------------------------------------
H = F(1, 2)
HANDBOOK = {
    (1, 1, 1): TrigPoly(1, [1], "cos/2"),
    (1, 1, -1): TrigPoly(-1, [1], "sin/2"),
    (2, 2, 2): TrigPoly(H, [1, 1]),
    (2, 2, 0): TrigPoly(-Surd(1, 1, 2), [1], "sin"),
    (2, 2, -2): TrigPoly(H, [1, -1]),
    (2, 0, 0): TrigPoly(1, [0, 1]),
    (3, 3, 3): TrigPoly(H, [1, 1], "cos/2"),
    (3, 3, 1): TrigPoly(-Surd(1, 3, 4), [1, 1], "sin/2"),
    (3, 3, -1): TrigPoly(Surd(1, 3, 4), [1, -1], "cos/2"),
    (3, 3, -3): TrigPoly(-H, [1, -1], "sin/2"),
    (3, 1, 1): TrigPoly(H, [-1, 3], "cos/2"),
    (3, 1, -1): TrigPoly(-H, [1, 3], "sin/2"),
    (4, 4, 4): TrigPoly(F(1, 4), [1, 2, 1]),
    (4, 4, 2): TrigPoly(-H, [1, 1], "sin"),
    (4, 4, 0): TrigPoly(Surd(1, 6, 16), [1, 0, -1]),
    (4, 4, -2): TrigPoly(-H, [1, -1], "sin"),
    (4, 4, -4): TrigPoly(F(1, 4), [1, -2, 1]),
    (4, 2, 2): TrigPoly(H, [-1, 1, 2]),
    (4, 2, 0): TrigPoly(-Surd(1, 3, 2), [0, 1], "sin"),
    (4, 2, -2): TrigPoly(H, [1, 1, -2]),
    (4, 0, 0): TrigPoly(1, [F(-1, 2), 0, F(3, 2)]),
}


@pytest.mark.parametrize("tj", [1, 2, 3, 4])
def test_handbook_closed_forms(tj):
    table = {}
    for (t, a, b), f in HANDBOOK.items():
        if t != tj:
            continue
        s = -1 if ((b - a) // 2) % 2 else 1
        for key, val in (((a, b), f), ((b, a), f * s), ((-b, -a), f), ((-a, -b), f * s)):
            table.setdefault(key, val)
    assert len(table) == (tj + 1) ** 2
    for (a, b), f in table.items():
        assert d2(tj, a, b) == f, (tj, a, b, str(d2(tj, a, b)), str(f))


# ---------------------------------------------------------------------------
# the Clebsch-Gordan series (Edmonds 1957, eq. 4.3.1, in the d form):
# d^{j1}_{m1'm1} d^{j2}_{m2'm2} = sum_J <j1 m1'; j2 m2'|J M'> <j1 m1; j2 m2|J M> d^J_{M'M}
# ---------------------------------------------------------------------------
@pytest.mark.slow
def test_clebsch_gordan_series():
    checked = 0
    for t1 in range(0, 5):
        for t2 in range(0, 5):
            for a1 in ms(t1):
                for b1 in ms(t1):
                    for a2 in ms(t2):
                        for b2 in ms(t2):
                            lhs = d2(t1, a1, b1) * d2(t2, a2, b2)
                            terms = []
                            for tJ in range(abs(t1 - t2), t1 + t2 + 1, 2):
                                c = (cg(F(t1, 2), F(a1, 2), F(t2, 2), F(a2, 2), F(tJ, 2), F(a1 + a2, 2))
                                     * cg(F(t1, 2), F(b1, 2), F(t2, 2), F(b2, 2), F(tJ, 2), F(b1 + b2, 2)))
                                terms.append(d2(tJ, a1 + a2, b1 + b2) * c)
                            assert class_sum(terms) == [lhs], (t1, t2, a1, b1, a2, b2)
                            checked += 1
    assert checked == 55 * 55


# ---------------------------------------------------------------------------
# exact values, D, API, value types
# ---------------------------------------------------------------------------
def test_exact_values_agree_with_the_function():
    """at_cos on the polynomial and the direct sum agree at every rational cosine of the issue."""
    for tj in TJS:
        for a in ms(tj):
            for b in ms(tj):
                f = d2(tj, a, b)
                for c in (F(1), F(1, 2), F(0), F(-1, 2), F(-1), F(1, 3)):
                    assert d_at_cos2(tj, a, b, c) == f.at_cos(c)
                    assert rotation_d(F(tj, 2), F(a, 2), F(b, 2), cos_beta=c) == f.at_cos(c)


def test_matrix_rows_run_from_j_down():
    m = rotation_d_matrix(1)
    assert m[0][2] == d2(2, 2, -2) and m[2][0] == d2(2, -2, 2) and m[0][1] == d2(2, 2, 0)
    assert rotation_d_matrix(F(1, 2), beta="pi/2")[0][1] == Surd(-1, 1, 2)  # -sin(pi/4)


def test_beyond_pi_half_angle_signs():
    """d^{1/2}_{1/2 1/2}(beta) = cos(beta/2) changes sign past beta = pi (common practice, no source)."""
    assert rotation_d(F(1, 2), F(1, 2), F(1, 2), beta="4*pi/3") == Surd(-1, 1, 4)
    assert rotation_d(F(1, 2), F(1, 2), F(1, 2), beta="-2*pi/3") == Surd(1, 1, 4)
    assert rotation_d(F(1, 2), F(-1, 2), F(1, 2), beta="-2*pi/3") == Surd(-1, 3, 4)


def test_D_exact_and_decimal():
    """D = exp(-i m' alpha) d exp(-i m gamma) (the definition used here)."""
    v = rotation_D(1, 1, 0, alpha="pi/3", beta="pi/2", gamma="pi")
    assert v == PhasedSurd(Surd(-1, 1, 2), F(-1, 6))
    assert rotation_D(1, 0, 0, alpha="pi/3", cos_beta=F(1, 3)) == F(1, 3)
    text = rotation_D(1, 1, -1, alpha=F(3, 10), beta=F(1, 2), gamma=F(7, 10), digits=25)
    with mpmath.workdps(40):
        ref = mpmath.exp(-1j * mpmath.mpf(3) / 10) * (1 - mpmath.cos(mpmath.mpf(1) / 2)) / 2 * mpmath.exp(1j * mpmath.mpf(7) / 10)
        re, im = text.replace("*I", "").split(" + ")
        assert abs(mpmath.mpf(re) - ref.real) < 1e-24 and abs(mpmath.mpf(im) - ref.imag) < 1e-24
    f = rotation_D(1, 1, 0)
    import sympy

    a, b, g = sympy.symbols("alpha beta gamma")
    from sympy.physics.quantum.spin import Rotation

    syms = {"alpha": a, "beta": b, "gamma": g}  # without locals, sympify reads beta and gamma as functions
    point = {a: sympy.Rational(3, 10), b: sympy.Rational(7, 10), g: sympy.Rational(11, 10)}
    for j, mp, m in ((1, 1, 0), (F(3, 2), F(1, 2), F(-3, 2)), (2, -1, 2)):
        ours = sympy.sympify(str(rotation_D(j, mp, m)), locals=syms)
        ref = Rotation.D(sympy.nsimplify(j), sympy.nsimplify(mp), sympy.nsimplify(m), a, b, g).doit()
        assert abs(sympy.N((ours - ref).subs(point), 50)) < 1e-45, (j, mp, m)
        assert abs(sympy.N(ref.subs(point), 50)) > 1e-3  # not a comparison of zeros


def test_str_reads_back_and_decimals_are_correctly_rounded():
    import sympy

    beta = sympy.Symbol("beta")
    for tj in range(0, 7):
        for a in ms(tj):
            for b in ms(tj):
                f = d2(tj, a, b)
                assert sympy.simplify(sympy.sympify(str(f), locals={"beta": beta}) - f.to_sympy()) == 0
                assert hash(f) == hash(TrigPoly(f.factor, f.coeffs, f.half, f.var))
    # reference: mpmath at 80 digits rounded to `digits` (these values are far from rounding ties)
    with mpmath.workdps(80):
        for x in ("pi/4", F(1, 3), 2.5):
            ref = mpmath.cos(mpmath.pi / 4 if x == "pi/4" else mpmath.mpf(F(x).numerator) / F(x).denominator)
            for digits in (1, 5, 20, 50):
                assert rotation_d(1, 0, 0, beta=x, digits=digits) == mpmath.nstr(ref, digits, strip_zeros=False)


def test_phased_surd_protocol():
    import sympy

    for t in (F(0), F(1, 2), F(1, 3), F(3, 4), F(-1, 12)):
        v = PhasedSurd(Surd(1, 2, 3), t)
        assert sympy.simplify(sympy.sympify(str(v)) - v.to_sympy()) == 0
        assert v == PhasedSurd(Surd(-1, 2, 3), t + F(1, 2))
        assert hash(v) == hash(PhasedSurd(Surd(-1, 2, 3), t + F(1, 2)))
    assert PhasedSurd(Surd(1, 1, 4), F(1, 2)) == F(-1, 2) and hash(PhasedSurd(Surd(1, 1, 4), F(1, 2))) == hash(F(-1, 2))


@pytest.mark.parametrize("call, argument", [
    (lambda: rotation_d(1, F(1, 2), 0), "mp"),
    (lambda: rotation_d(-1, 0, 0), "j"),
    (lambda: rotation_d(1, 0, 0, beta="pie/3"), "beta"),
    (lambda: rotation_d(1, 0, 0, cos_beta=0.5), "cos_beta"),
    (lambda: rotation_d(1, 0, 0, cos_beta=F(3, 2)), "cos_beta"),
    (lambda: rotation_d(1, 0, 0, beta="pi", cos_beta=1), "cos_beta"),
    (lambda: rotation_D(1, 0, 0, alpha="x"), "alpha"),
])
def test_bad_input_one_line_errors(call, argument):
    with pytest.raises(QuantumNumberError) as e:
        call()
    assert "\n" not in str(e.value) and e.value.argument == argument


def test_kind_record():
    assert ROTATION_D_SMALL.value(1, 1, 0) == d2(2, 2, 0)
    assert ROTATION_D_SMALL.zero_rule((2, 4, 0)).id == "m-range" and not d2(2, 4, 0)
    for t in ((4, 2, -2), (3, 1, 3)):
        for member, sign in ROTATION_D_SMALL.members(*t):
            assert d2(*member) == d2(*t) * sign
    assert d_matrix2(0) == ((TrigPoly(1, [1]),),)


@pytest.mark.parametrize("tj", TJS)
def test_matrix_by_symmetry_equals_the_formula_everywhere(tj):
    """d_matrix2 fills three quarters of the matrix by symmetry; every entry must equal Wigner's sum."""
    from tablegen.kinds.rotation import _d2

    for r, a in enumerate(ms(tj)):
        for c, b in enumerate(ms(tj)):
            assert d_matrix2(tj)[r][c] == _d2(tj, a, b)


def test_exact_matrix_at_rational_cosine():
    """The exact matrix (filled by symmetry) equals the function evaluated entry by entry."""
    from tablegen.kinds.rotation import d_matrix_at_cos2

    for tj in TJS:
        for c in (F(0), F(1, 3), F(-1, 2)):
            m = d_matrix_at_cos2(tj, c)
            for r, a in enumerate(ms(tj)):
                for k, b in enumerate(ms(tj)):
                    assert m[r][k] == d2(tj, a, b).at_cos(c)


def test_values_at_a_rational_cosine_with_phases_in_radians():
    """Regressions: a rational cos(beta) or cos(theta) with an azimuth in radians, and a zero at an
    exact angle, once raised AttributeError / ArithmeticError.  References: sympy's Rotation.D and
    Ynm (same definitions as here, see their docstrings)."""
    import sympy
    from sympy.physics.quantum.spin import Rotation

    from tablegen import spherical_y

    assert rotation_D(1, 0, 0, alpha=0.5, cos_beta=0) == 0  # d^1_00 = cos(beta) (Edmonds 1957, ch. 4)
    assert spherical_y(1, 0, theta="pi/2") == "0"  # Y_1^0 is proportional to cos(theta)
    text = rotation_D(2, 1, -1, alpha=F(3, 10), cos_beta=F(1, 3), gamma=F(-1, 5), digits=30)
    ref = Rotation.D(2, 1, -1, sympy.Rational(3, 10), sympy.acos(sympy.Rational(1, 3)), sympy.Rational(-1, 5)).doit()
    assert abs(sympy.N(sympy.sympify(text) - ref, 40)) < sympy.Float(10) ** -28
    text = spherical_y(3, -2, cos_theta=F(-1, 4), phi=F(7, 10), digits=30)
    ref = sympy.Ynm(3, -2, sympy.acos(sympy.Rational(-1, 4)), sympy.Rational(7, 10)).expand(func=True)
    assert abs(sympy.N(sympy.sympify(text) - ref, 40)) < sympy.Float(10) ** -28


def test_inline_latex_of_rotation_functions_has_no_built_up_fractions():
    # d^1_{11} = (1 + cos beta)/2, d^{1/2}_{1/2 1/2} = cos(beta/2) (Edmonds 1957, table 4.1 -- from memory)
    assert rotation_d(1, 1, 1).latex("inline") == "(\\cos \\beta + 1)/2"
    assert rotation_d("1/2", "1/2", "1/2").latex("inline") == "\\cos(\\beta/2)"
    assert rotation_d(1, 1, 1).latex("root") == "\\frac{\\cos \\beta + 1}{2}"  # the display style is unchanged
    for tj in range(0, 7):
        for tmp in range(-tj, tj + 1, 2):
            for tm in range(-tj, tj + 1, 2):
                f = rotation_d(F(tj, 2), F(tmp, 2), F(tm, 2))
                assert "\\frac" not in f.latex("inline"), (tj, tmp, tm)

"""Spherical harmonics Y_l^m(theta, phi), Condon-Shortley phase.

Sources, beside each check:
* orthonormality on the sphere (mpmath quadrature, 30 digits) and the addition theorem
  sum_m Y_l^m(n1) conj(Y_l^m(n2)) = (2l+1)/(4 pi) P_l(n1.n2) (Edmonds 1957, eq. 4.6.6; P_l from mpmath.legendre);
* sympy.Ynm (general-purpose library; it uses the Condon-Shortley phase, its docstring says);
* Y_l^m(theta, phi) = sqrt((2l+1)/(4 pi)) conj(D^l_{m0}(phi, theta, 0)) (Edmonds 1957, eq. 4.1.25,
  in this module's D convention).
"""

from __future__ import annotations

import random
from fractions import Fraction as F

import mpmath
import pytest

from tablegen import QuantumNumberError, rotation_D, spherical_y
from tablegen.kinds.harmonics import SPHERICAL_Y, y2
from tablegen.kinds.rotation import d2
from tablegen.values.surd import Surd
from tablegen.values.pi_power import PiPower


def y_mp(y, theta, phi):
    """Y at mpmath angles, from the exact form (not from the decimal API)."""
    t = y.theta_part
    c = mpmath.cos(theta)
    h = {"1": 1, "sin": mpmath.sin(theta)}[t.half]
    p = sum(a * c**k for k, a in enumerate(t.coeffs))
    f = t.factor.sign * mpmath.sqrt(mpmath.mpf(t.factor.p) / t.factor.q)
    return f * p * h / mpmath.sqrt(mpmath.pi) * mpmath.expj(y.m * phi)


def parse_complex(text):
    text = text.replace(" ", "")
    if "*I" not in text:
        return mpmath.mpc(text)
    body = text.replace("*I", "")
    for k in range(len(body) - 1, 0, -1):
        if body[k] in "+-" and body[k - 1] != "e":
            return mpmath.mpc(body[:k], body[k:])
    return mpmath.mpc(0, body)


@pytest.mark.slow
def test_orthonormal_on_the_sphere_30_digits():
    ys = [y2(2 * l, 2 * m) for l in range(5) for m in range(-l, l + 1)]
    with mpmath.workdps(40):
        for i, a in enumerate(ys):
            for b in ys[i:]:
                if a.m == b.m:  # the phi integral of exp(i(m-m')phi) is 2 pi
                    v = 2 * mpmath.pi * mpmath.quad(
                        lambda t: (y_mp(a, t, 0) * mpmath.conj(y_mp(b, t, 0))).real * mpmath.sin(t), [0, mpmath.pi])
                    assert abs(v - (1 if a == b else 0)) < mpmath.mpf(10) ** -30
        # the full two-dimensional integral for a few pairs with m != m'
        for a, b in ((ys[3], ys[1]), (ys[8], ys[6]), (ys[20], ys[18]), (ys[15], ys[24])):
            v = mpmath.quad(lambda t, p: y_mp(a, t, p) * mpmath.conj(y_mp(b, t, p)) * mpmath.sin(t),
                            [0, mpmath.pi], [0, 2 * mpmath.pi])
            assert abs(v) < mpmath.mpf(10) ** -30


def test_addition_theorem_at_random_points():
    rng = random.Random(4661)
    with mpmath.workdps(40):
        for _ in range(6):
            t1, p1, t2, p2 = (F(rng.randint(1, 3000), 1000) for _ in range(4))
            n1n2 = (mpmath.cos(t1.numerator / mpmath.mpf(t1.denominator)) * mpmath.cos(t2.numerator / mpmath.mpf(t2.denominator))
                    + mpmath.sin(t1.numerator / mpmath.mpf(t1.denominator)) * mpmath.sin(t2.numerator / mpmath.mpf(t2.denominator))
                    * mpmath.cos((p1 - p2).numerator / mpmath.mpf((p1 - p2).denominator)))
            for l in range(6):
                total = sum(parse_complex(spherical_y(l, m, theta=t1, phi=p1, digits=32))
                            * mpmath.conj(parse_complex(spherical_y(l, m, theta=t2, phi=p2, digits=32)))
                            for m in range(-l, l + 1))
                ref = (2 * l + 1) / (4 * mpmath.pi) * mpmath.legendre(l, n1n2)
                assert abs(total - ref) < mpmath.mpf(10) ** -29


@pytest.mark.slow
def test_agrees_with_sympy_ynm():
    import sympy

    th, ph = sympy.symbols("theta phi")
    rng = random.Random(7)
    for l in range(6):
        for m in range(-l, l + 1):
            ours = sympy.sympify(str(spherical_y(l, m)), locals={"theta": th, "phi": ph})
            ref = sympy.Ynm(l, m, th, ph).expand(func=True)
            for _ in range(2):  # exact algebraic points: cos theta rational, phi a rational multiple of pi
                c = sympy.Rational(rng.randint(-9, 9), 10)
                pt = {th: sympy.acos(c), ph: sympy.pi * sympy.Rational(rng.randint(0, 11), 6)}
                diff = sympy.nsimplify(sympy.expand(sympy.simplify((ours - ref).subs(pt))))
                assert diff == 0, (l, m)
            assert ours.subs({th: 1, ph: 0}) != 0 or l == 0


def test_relation_to_D():
    """Y_l^m = sqrt((2l+1)/(4 pi)) conj(D^l_{m0}(phi, theta, 0)) = sqrt((2l+1)/(4 pi)) e^{i m phi} d^l_{m0}(theta)."""
    for l in range(9):
        for m in range(-l, l + 1):
            y, d = y2(2 * l, 2 * m), d2(2 * l, 2 * m, 0)
            assert y.m == m and y.theta_part.coeffs == d.coeffs and y.theta_part.half == d.half
            assert y.coefficient == PiPower(d.factor * Surd(1, 2 * l + 1, 4), -1)
    with mpmath.workdps(40):
        for l, m, th, ph in ((2, 1, F(7, 10), F(3, 10)), (3, -2, F(1, 5), F(12, 5))):
            D = parse_complex(rotation_D(l, m, 0, alpha=ph, beta=th, gamma=0, digits=35))
            Y = parse_complex(spherical_y(l, m, theta=th, phi=ph, digits=35))
            assert abs(Y - mpmath.sqrt((2 * l + 1) / (4 * mpmath.pi)) * mpmath.conj(D)) < mpmath.mpf(10) ** -33


def test_condon_shortley_sign_and_text():
    """Y_1^1 = -sqrt(3/(8 pi)) sin(theta) e^{i phi} (common practice, no source: the textbook l = 1 harmonics)."""
    assert str(spherical_y(1, 1)) == "-sqrt(3/(8*pi))*sin(theta)*exp(I*phi)"
    assert str(spherical_y(1, -1)) == "sqrt(3/(8*pi))*sin(theta)*exp(-I*phi)"
    assert str(spherical_y(0, 0)) == "sqrt(1/(4*pi))"
    assert spherical_y(2, 0).latex() == "\\sqrt{\\frac{5}{16\\pi}}\\,\\left(3\\cos^{2} \\theta - 1\\right)"
    assert not spherical_y(1, 2).theta_part and spherical_y(1, 2, theta=1) == "0"


def test_pi_power_protocol():
    import sympy

    with mpmath.workdps(60):
        for e in (-3, -1, 1, 2):
            v = PiPower(Surd(-1, 3, 4), e)
            assert sympy.simplify(sympy.sympify(str(v)) - v.to_sympy()) == 0
            ref = -mpmath.sqrt(mpmath.mpf(3) / 4 * mpmath.pi**e)
            for digits in (3, 7, 30):  # (mpmath writes one digit as "2.", tablegen as "2")
                assert v.decimal(digits) == mpmath.nstr(ref, digits, strip_zeros=False)
    assert PiPower(Surd(1, 1, 4), 0) == F(1, 2) and hash(PiPower(Surd(1, 1, 4), 0)) == hash(F(1, 2))
    assert PiPower(Surd(1, 1, 4), -1) != F(1, 2)


@pytest.mark.parametrize("args, argument", [((F(1, 2), F(1, 2)), "l"), ((1, F(1, 2)), "m"), ((-1, 0), "l")])
def test_bad_input(args, argument):
    with pytest.raises(QuantumNumberError) as e:
        spherical_y(*args)
    assert e.value.argument == argument and "\n" not in str(e.value)
    with pytest.raises(QuantumNumberError):
        spherical_y(1, 0, theta="x")
    assert SPHERICAL_Y.value(2, 1) == y2(4, 2)


def test_inline_latex_of_harmonics_has_no_built_up_fractions():
    # Y_0^0 = 1/sqrt(4 pi), Y_1^0 = sqrt(3/(4 pi)) cos(theta) (common practice, no source)
    assert spherical_y(0, 0).latex("inline") == "\\sqrt{1/(4\\pi)}"
    assert spherical_y(1, 0).latex("inline").startswith("\\sqrt{3/(4\\pi)}")
    assert spherical_y(0, 0).latex("root") == "\\sqrt{\\frac{1}{4\\pi}}"  # the display style is unchanged
    for l in range(0, 5):
        for m in range(-l, l + 1):
            assert "\\frac" not in spherical_y(l, m).latex("inline"), (l, m)

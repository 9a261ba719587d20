"""Public API for rotation functions and spherical harmonics.

    rotation_d(j, mp, m)                      the exact function d^j_{m'm}(beta) (a TrigPoly)
    rotation_d(j, mp, m, cos_beta="1/3")      its exact value, a Surd (beta = arccos in [0, pi])
    rotation_d(j, mp, m, beta="pi/3")         exact (a Surd) where cos(beta) is rational,
                                              else correctly rounded decimal text (digits=...)
    rotation_D(j, mp, m, alpha=..., beta=..., gamma=...)   D^j_{m'm}; exact: a PhasedSurd
    rotation_d_matrix(j, ...)                 rows m' = j ... -j, columns m = j ... -j
    spherical_y(l, m)                         Y_l^m(theta, phi), Condon–Shortley phase
    spherical_y(l, m, theta=..., phi=...)     decimal text 'x + y*I'

Angles: text with pi ("pi/3", "2*pi/3", "-pi/2") or an exact multiple of pi
(beta_over_pi=Fraction(1, 3)) or radians (0.5, "0.5", Fraction(1, 2)).  Missing
angles of D and Y default to 0 once any angle is given.  mpmath is imported
only on the decimal path.
"""

from __future__ import annotations

from fractions import Fraction

from .angles import cos_of_pi_multiple, half_angle_signs, parse_angle, parse_cosine, parse_exact_rational
from .errors import QuantumNumberError
from .spins import parse_j, parse_m

from .values.rounding import check_digits, decided_decimal, interval_bounds

__all__ = ["rotation_d", "rotation_D", "rotation_d_matrix", "spherical_y"]


# The engine modules are imported on first use: `import tablegen` (the one-value lookup)
# must not pay for the Kind records' dataclasses.
def _rot():
    from .kinds import rotation

    return rotation


def _harm():
    from .kinds import harmonics

    return harmonics


def _phased():
    from .values import phased as module

    return module


def _angle(name: str, value: object, over_pi: object, default: "tuple[str, Fraction] | None"):
    """('pi', r) or ('rad', x) from either keyword, the default if neither is given."""
    if value is not None and over_pi is not None:
        raise QuantumNumberError(f"{name}_over_pi", over_pi, f"give {name} or {name}_over_pi, not both")
    if over_pi is not None:
        return "pi", parse_exact_rational(over_pi, f"{name}_over_pi")
    if value is not None:
        return parse_angle(value, name)
    return default


def _beta(beta, beta_over_pi, cos_beta, default=None):
    """('cos', c, signs) for an exact cosine, else ('pi'|'rad', x) for decimals, or default."""
    if cos_beta is not None:
        if beta is not None or beta_over_pi is not None:
            raise QuantumNumberError("cos_beta", cos_beta, "give one of beta, beta_over_pi, cos_beta")
        return "cos", parse_cosine(cos_beta), (1, 1)
    a = _angle("beta", beta, beta_over_pi, default)
    if a is None:
        return None
    if a[0] == "pi":
        c = cos_of_pi_multiple(a[1])
        if c is not None:
            return "cos", c, half_angle_signs(a[1])
    return a


def _radians(kind: str, x: Fraction, iv):
    return iv.pi * x.numerator / x.denominator if kind == "pi" else iv.mpf(x.numerator) / x.denominator


def _bounds(interval_fn):
    return interval_bounds(interval_fn)


def _complex_text(re: str, im: str) -> str:
    if im == "0":
        return re
    if re == "0":
        return f"{im}*I"
    return f"{re} - {im[1:]}*I" if im.startswith("-") else f"{re} + {im}*I"


def _parse_jmm(j, mp, m, max_j) -> tuple[int, int, int]:
    tj = parse_j(j, "j", max_j)
    return tj, parse_m(mp, "mp", tj, "j", max_j), parse_m(m, "m", tj, "j", max_j)


def rotation_d(j, mp, m, *, beta=None, beta_over_pi=None, cos_beta=None, digits: int = 15, max_j=None):
    """d^j_{m'm}(beta) = <j m'| exp(-i beta Jy) |j m>: the function, an exact Surd, or decimal text."""
    t = _parse_jmm(j, mp, m, max_j)
    b = _beta(beta, beta_over_pi, cos_beta)
    if b is None:
        return _rot().d2(*t)
    if b[0] == "cos":
        return _rot().d_at_cos2(*t, b[1], b[2])
    check_digits(digits)
    f = _rot().d2(*t)
    if f == f.factor:  # a constant function (d^0_00 = 1): exact at every angle
        return f.factor.decimal(digits)
    return decided_decimal(_bounds(lambda iv: f.interval(_radians(b[0], b[1], iv), iv)), digits)


def rotation_d_matrix(j, *, beta=None, beta_over_pi=None, cos_beta=None, digits: int = 15, max_j=None):
    """The whole matrix d^j, rows m' = j, j-1, ..., -j and columns m in the same order (tuples)."""
    tj = parse_j(j, "j", max_j)
    if beta is None and beta_over_pi is None and cos_beta is None:
        return _rot().d_matrix2(tj)
    b = _beta(beta, beta_over_pi, cos_beta)
    if b[0] == "cos":
        return _rot().d_matrix_at_cos2(tj, b[1], b[2])
    ms = [Fraction(k, 2) for k in range(tj, -tj - 1, -2)]
    return tuple(tuple(rotation_d(Fraction(tj, 2), a, c, beta=beta, beta_over_pi=beta_over_pi,
                                  cos_beta=cos_beta, digits=digits, max_j=max_j) for c in ms) for a in ms)


def rotation_D(j, mp, m, *, alpha=None, beta=None, gamma=None, alpha_over_pi=None, beta_over_pi=None,
               gamma_over_pi=None, cos_beta=None, digits: int = 15, max_j=None):
    """D^j_{m'm}(alpha, beta, gamma) = exp(-i m' alpha) d^j_{m'm}(beta) exp(-i m gamma).

    No angle: the function (RotationD).  Alpha, gamma exact multiples of pi and
    cos(beta) rational: a PhasedSurd.  Otherwise decimal text 'x + y*I'.
    """
    tj, tmp, tm = _parse_jmm(j, mp, m, max_j)
    zero = ("pi", Fraction(0))
    given = [v for v in (alpha, beta, gamma, alpha_over_pi, beta_over_pi, gamma_over_pi, cos_beta) if v is not None]
    if not given:
        return _rot().RotationD(tmp, tm, _rot().d2(tj, tmp, tm))
    a = _angle("alpha", alpha, alpha_over_pi, zero)
    g = _angle("gamma", gamma, gamma_over_pi, zero)
    b = _beta(beta, beta_over_pi, cos_beta, ("cos", Fraction(1), (1, 1)))
    if a[0] == g[0] == "pi":
        turn = -(tmp * a[1] + tm * g[1]) / 4  # exp(-i m' alpha - i m gamma) = exp(2 pi i turn)
        if b[0] == "cos":
            return _phased().PhasedSurd(_rot().d_at_cos2(tj, tmp, tm, b[1], b[2]), turn)
        d_text = rotation_d(Fraction(tj, 2), Fraction(tmp, 2), Fraction(tm, 2), beta=_as_text(b), digits=digits)
        return _phased_decimal(d_text, turn, lambda iv: _rot().d2(tj, tmp, tm).interval(_radians(b[0], b[1], iv), iv), digits)
    check_digits(digits)
    f = _rot().d2(tj, tmp, tm)

    def part(fn):
        def interval(iv):
            d = 1 if b[0] == "cos" and f == f.factor else (
                f.interval(iv.acos(iv.mpf(b[1].numerator) / b[1].denominator), iv) if b[0] == "cos"
                else f.interval(_radians(b[0], b[1], iv), iv))
            phase = -(tmp * _radians(a[0], a[1], iv) + tm * _radians(g[0], g[1], iv)) / 2
            return (f.factor.sign * iv.sqrt(iv.mpf(f.factor.p) / f.factor.q) if d == 1 else d) * fn(iv, phase)
        return interval

    if not f:
        return "0"
    return _complex_text(decided_decimal(_bounds(part(lambda iv, x: iv.cos(x))), digits),
                         decided_decimal(_bounds(part(lambda iv, x: iv.sin(x))), digits))


def _as_text(b) -> object:
    return f"{b[1]}*pi" if b[0] == "pi" else b[1]


def _phased_decimal(real_text: str, turn: Fraction, interval_fn, digits: int) -> str:
    """value * exp(2 pi i turn) for a real value known by interval: exact zero parts at quarter turns."""
    t = turn % 1
    if t in (0, Fraction(1, 2)):
        return real_text if t == 0 else (real_text[1:] if real_text.startswith("-") else "-" + real_text)
    if t in (Fraction(1, 4), Fraction(3, 4)):
        im = real_text if t == Fraction(1, 4) else (real_text[1:] if real_text.startswith("-") else "-" + real_text)
        return _complex_text("0", im)

    def part(fn):
        return _bounds(lambda iv: interval_fn(iv) * fn(2 * iv.pi * t.numerator / t.denominator))

    from mpmath import iv as _iv

    return _complex_text(decided_decimal(part(_iv.cos), digits), decided_decimal(part(_iv.sin), digits))


def spherical_y(l, m, *, theta=None, phi=None, theta_over_pi=None, phi_over_pi=None, cos_theta=None,
                digits: int = 15, max_j=None):
    """Y_l^m(theta, phi), Condon–Shortley phase ((-1)^m in Y, not in P_l^m): the function or decimal text."""
    t = _harm().SPHERICAL_Y.parse((l, m), max_j)
    y = _harm().y2(*t)
    given = [v for v in (theta, phi, theta_over_pi, phi_over_pi, cos_theta) if v is not None]
    if not given:
        return y
    check_digits(digits)
    if not y.theta_part:
        return "0"
    zero = ("pi", Fraction(0))
    p = _angle("phi", phi, phi_over_pi, zero)
    if cos_theta is not None:
        if theta is not None or theta_over_pi is not None:
            raise QuantumNumberError("cos_theta", cos_theta, "give one of theta, theta_over_pi, cos_theta")
        c = parse_cosine(cos_theta, "cos_theta")
        th = lambda iv: iv.acos(iv.mpf(c.numerator) / c.denominator)  # noqa: E731
    else:
        k = _angle("theta", theta, theta_over_pi, zero)
        th = lambda iv: _radians(k[0], k[1], iv)  # noqa: E731
    mag = lambda iv: y.theta_part.interval(th(iv), iv) / iv.sqrt(iv.pi)  # noqa: E731
    if p[0] == "pi":
        real_text = decided_decimal(_bounds(mag), digits)
        return _phased_decimal(real_text, y.m * p[1] / 2, mag, digits)
    re = decided_decimal(_bounds(lambda iv: mag(iv) * iv.cos(y.m * _radians(p[0], p[1], iv))), digits)
    im = decided_decimal(_bounds(lambda iv: mag(iv) * iv.sin(y.m * _radians(p[0], p[1], iv))), digits)
    return _complex_text(re, im)




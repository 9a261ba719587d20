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
    t = _parse_jmm(j, mp, m, max_j)
    given = [v for v in (alpha, beta, gamma, alpha_over_pi, beta_over_pi, gamma_over_pi, cos_beta) if v is not None]
    if not given:
        return _rot().RotationD(t[1], t[2], _rot().d2(*t))
    angles = {"alpha": _angle("alpha", alpha, alpha_over_pi, None), "gamma": _angle("gamma", gamma, gamma_over_pi, None)}
    if cos_beta is not None:
        if beta is not None or beta_over_pi is not None:
            raise QuantumNumberError("cos_beta", cos_beta, "give one of beta, beta_over_pi, cos_beta")
        angles["cos_beta"] = cos_beta
    else:
        angles["beta"] = _angle("beta", beta, beta_over_pi, None)
    value = _at("D", t, angles, digits)
    return _phased().PhasedSurd(value, 0) if not isinstance(value, (str, _phased().PhasedSurd)) else value


def spherical_y(l, m, *, theta=None, phi=None, theta_over_pi=None, phi_over_pi=None, cos_theta=None,
                digits: int = 15, max_j=None):
    """Y_l^m(theta, phi), Condon–Shortley phase ((-1)^m in Y, not in P_l^m): the function or decimal text."""
    t = _harm().SPHERICAL_Y.parse((l, m), max_j)
    given = [v for v in (theta, phi, theta_over_pi, phi_over_pi, cos_theta) if v is not None]
    if not given:
        return _harm().y2(*t)
    angles = {"phi": _angle("phi", phi, phi_over_pi, None)}
    if cos_theta is not None:
        if theta is not None or theta_over_pi is not None:
            raise QuantumNumberError("cos_theta", cos_theta, "give one of theta, theta_over_pi, cos_theta")
        angles["cos_theta"] = cos_theta
    else:
        angles["theta"] = _angle("theta", theta, theta_over_pi, None)
    check_digits(digits)
    from .kinds.angular import function_kind

    return function_kind("Y").at(t, _given(angles), digits).decimal


def _given(angles: dict) -> dict:
    """Parsed angles back to what the records read: 'r*pi' text or exact radians (None dropped)."""
    out = {}
    for name, a in angles.items():
        if a is None:
            continue
        if isinstance(a, tuple):
            out[name] = f"{a[1]}*pi" if a[0] == "pi" else a[1]
        else:
            out[name] = a
    return out


def _at(key: str, t: tuple[int, ...], angles: dict, digits: int):
    """The exact value at these angles, else its decimal text (the records in kinds/angular.py)."""
    check_digits(digits)
    from .kinds.angular import function_kind

    ev = function_kind(key).at(t, _given(angles), digits)
    return ev.exact if ev.exact is not None else ev.decimal

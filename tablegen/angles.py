"""Angles for rotation functions: exact multiples of pi, exact cosines, or radians.

An angle is either ("pi", r) for r*pi with r an exact rational, or ("rad", x)
for x radians (x the exact rational value of what was given; a float counts
as its exact binary value).  Texts: "pi/3", "2*pi/3", "-pi/2", "3pi/4", "π",
"0" (multiples of pi) and plain numbers such as "0.5" (radians).  Niven's
theorem says cos(r*pi) is rational only for cos in {0, +-1/2, +-1}, so the
exact path needs r with denominator 1, 2 or 3 (or a rational cosine given
directly).  Errors are one-line QuantumNumberErrors naming the argument.
"""

from __future__ import annotations

import numbers
import re
from fractions import Fraction

from .errors import QuantumNumberError

__all__ = ["parse_angle", "parse_exact_rational", "parse_cosine", "cos_of_pi_multiple", "half_angle_signs"]

_PI_TEXT = re.compile(r"^([+-]?)(\d+(?:/\d+)?)?\*?pi(?:/(\d+))?$")


def parse_exact_rational(value: object, argument: str) -> Fraction:
    """An exact rational (int, Fraction, numbers.Rational or text '1/3'); floats are refused."""
    if isinstance(value, bool) or isinstance(value, float):
        raise QuantumNumberError(argument, value, "must be exact (int, Fraction or text such as '1/3'), not a float")
    if isinstance(value, int):
        return Fraction(value)
    if isinstance(value, numbers.Rational):
        return Fraction(int(value.numerator), int(value.denominator))
    if isinstance(value, str):
        try:
            return Fraction(value.strip().replace("\u2212", "-"))
        except (ValueError, ZeroDivisionError):
            raise QuantumNumberError(argument, value, "not an exact rational number") from None
    raise QuantumNumberError(argument, value, "not an exact rational number")


def parse_cosine(value: object, argument: str = "cos_beta") -> Fraction:
    c = parse_exact_rational(value, argument)
    if not -1 <= c <= 1:
        raise QuantumNumberError(argument, value, "a cosine must lie in [-1, 1]")
    return c


def parse_angle(value: object, argument: str) -> tuple[str, Fraction]:
    """("pi", r) for r*pi given as text with pi, else ("rad", exact radians)."""
    if isinstance(value, bool):
        raise QuantumNumberError(argument, value, "not an angle")
    if isinstance(value, str):
        text = value.strip().replace(" ", "").replace("π", "pi").replace("\u2212", "-")
        m = _PI_TEXT.match(text)
        if m:
            if m.group(3) is not None and int(m.group(3)) == 0 or (m.group(2) or "").endswith("/0"):
                raise QuantumNumberError(argument, value, "division by zero in the angle")
            r = Fraction(m.group(2) or 1) / int(m.group(3) or 1)
            return "pi", -r if m.group(1) == "-" else r
        try:
            x = Fraction(text)
        except (ValueError, ZeroDivisionError):
            raise QuantumNumberError(argument, value, "not an angle (write e.g. pi/3, 2*pi/3 or radians such as 0.5)") from None
        return ("pi", Fraction(0)) if x == 0 else ("rad", x)
    if isinstance(value, numbers.Real):
        try:
            x = Fraction(value)  # a float is its exact binary value
        except (ValueError, OverflowError, TypeError):
            raise QuantumNumberError(argument, value, "NaN or infinity is not an angle") from None
        return ("pi", Fraction(0)) if x == 0 else ("rad", x)
    raise QuantumNumberError(argument, value, "not an angle")


def cos_of_pi_multiple(r: Fraction) -> Fraction | None:
    """cos(r*pi) when it is rational (Niven: denominators 1, 2, 3), else None."""
    r = r % 2
    table = {Fraction(0): 1, Fraction(1, 3): Fraction(1, 2), Fraction(1, 2): 0, Fraction(2, 3): Fraction(-1, 2),
             Fraction(1): -1, Fraction(4, 3): Fraction(-1, 2), Fraction(3, 2): 0, Fraction(5, 3): Fraction(1, 2)}
    v = table.get(r)
    return None if v is None else Fraction(v)


def half_angle_signs(r: Fraction) -> tuple[int, int]:
    """(sign of cos(beta/2), sign of sin(beta/2)) for beta = r*pi, as +1/-1 (0 where the value is 0 counts as +1)."""
    q = r % 4  # beta/2 = q*pi/2 in [0, 2 pi)
    s_cos = 1 if (q <= 1 or q >= 3) else -1
    s_sin = 1 if q <= 2 else -1
    return s_cos, s_sin

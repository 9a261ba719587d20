"""The exact value type: sign x sqrt(p/q).

Every Clebsch-Gordan coefficient and every 3j, 6j and 9j symbol is a real
number whose square is rational, so it is stored as a sign in {-1, 0, 1} and a
reduced fraction p/q (p, q >= 1 coprime; zero is sign 0 with p = 0, q = 1).
The value is canonical at construction, so ``==`` and ``hash`` compare the
stored parts; a value that happens to be rational equals, and hashes like, the
same ``int`` or ``Fraction``.

``str()`` and ``repr()`` are part of the data format (they are written into
checksummed files): change them only on purpose.
"""

from __future__ import annotations

import numbers
from fractions import Fraction
from math import gcd, isqrt

from . import intmath

__all__ = ["Surd"]

_LATEX_STYLES = ("root", "rational")


def _as_fraction(x: object) -> Fraction | None:
    """int, Fraction or any numbers.Rational (sympy's too) as a Fraction."""
    if isinstance(x, Fraction):
        return x
    if isinstance(x, int):
        return Fraction(x)
    if isinstance(x, numbers.Rational):
        return Fraction(int(x.numerator), int(x.denominator))
    return None


class Surd:
    """An exact real number sign * sqrt(p/q); immutable and hashable."""

    __slots__ = ("_sign", "_p", "_q")

    def __new__(cls, sign: int = 0, p: int = 0, q: int = 1) -> "Surd":
        """Build sign*sqrt(p/q) from ints, reducing p/q; zero if sign or p is 0."""
        for name, v in (("sign", sign), ("p", p), ("q", q)):
            if not isinstance(v, int) or isinstance(v, bool):
                raise TypeError(f"Surd {name} must be an int, got {type(v).__name__}")
        if sign not in (-1, 0, 1):
            raise ValueError(f"Surd sign must be -1, 0 or 1, got {sign}")
        if p < 0 or q <= 0:
            raise ValueError(f"Surd needs p >= 0 and q > 0, got p={p}, q={q}")
        if sign == 0 or p == 0:
            return cls._trusted(0, 0, 1)
        g = gcd(p, q)
        return cls._trusted(sign, p // g, q // g)

    @classmethod
    def _trusted(cls, sign: int, p: int, q: int) -> "Surd":
        """Hot-path constructor: the caller guarantees a reduced, canonical triple."""
        self = _new_object(cls)
        _set_sign(self, sign)
        _set_p(self, p)
        _set_q(self, q)
        return self

    @classmethod
    def from_rational(cls, x: object) -> "Surd":
        """The Surd equal to a rational number (int, Fraction, sympy Rational)."""
        f = _as_fraction(x)
        if f is None:
            raise TypeError(f"cannot make a Surd from {type(x).__name__}")
        n, d = f.numerator, f.denominator
        return cls._trusted((n > 0) - (n < 0), n * n, d * d) if n else cls._trusted(0, 0, 1)

    @classmethod
    def from_signed_square(cls, s: object) -> "Surd":
        """The Surd x with sign(x) * x**2 == s, for a rational s."""
        f = _as_fraction(s)
        if f is None:
            raise TypeError(f"cannot make a Surd from {type(s).__name__}")
        n, d = f.numerator, f.denominator
        return cls._trusted((n > 0) - (n < 0), abs(n), d) if n else cls._trusted(0, 0, 1)

    def __setattr__(self, name: str, value: object) -> None:
        raise AttributeError("Surd is immutable")

    def __reduce__(self):
        return (Surd, (self._sign, self._p, self._q))

    # -- parts ---------------------------------------------------------------
    @property
    def sign(self) -> int:
        """-1, 0 or 1."""
        return self._sign

    @property
    def p(self) -> int:
        """Numerator of the (unsigned) square."""
        return self._p

    @property
    def q(self) -> int:
        """Denominator of the (unsigned) square."""
        return self._q

    def squared(self) -> Fraction:
        """The signed square sign * p/q, as a Fraction."""
        return Fraction(self._sign * self._p, self._q)

    def is_rational(self) -> bool:
        """True when sqrt(p/q) is rational (p and q are both perfect squares)."""
        p, q = self._p, self._q
        rp, rq = isqrt(p), isqrt(q)
        return rp * rp == p and rq * rq == q

    def as_fraction(self) -> Fraction:
        """The value as a Fraction; ValueError if it is irrational."""
        if not self.is_rational():
            raise ValueError(f"{self} is irrational")
        return Fraction(self._sign * isqrt(self._p), isqrt(self._q))

    # -- comparison and hashing ------------------------------------------------
    def __eq__(self, other: object) -> bool:
        if isinstance(other, Surd):
            return (self._sign, self._p, self._q) == (other._sign, other._p, other._q)
        if isinstance(other, float):
            # a finite float is an exact binary rational; compare exactly
            return other == other and abs(other) != float("inf") and self == Fraction(other)
        f = _as_fraction(other)
        if f is None:
            return NotImplemented
        return self.is_rational() and self.as_fraction() == f

    def __hash__(self) -> int:
        if self.is_rational():
            return hash(self.as_fraction())
        return hash(("Surd", self._sign, self._p, self._q))

    def _order_key(self, other: object) -> tuple[Fraction, Fraction] | None:
        # sign(x) * x**2 is strictly increasing, so comparing signed squares
        # compares the values themselves without any square root.
        if isinstance(other, Surd):
            return self.squared(), other.squared()
        f = _as_fraction(other)
        if f is None:
            return None
        return self.squared(), (f * abs(f))

    def __lt__(self, other: object) -> bool:
        k = self._order_key(other)
        return NotImplemented if k is None else k[0] < k[1]

    def __le__(self, other: object) -> bool:
        k = self._order_key(other)
        return NotImplemented if k is None else k[0] <= k[1]

    def __gt__(self, other: object) -> bool:
        k = self._order_key(other)
        return NotImplemented if k is None else k[0] > k[1]

    def __ge__(self, other: object) -> bool:
        k = self._order_key(other)
        return NotImplemented if k is None else k[0] >= k[1]

    def __bool__(self) -> bool:
        return self._sign != 0

    # -- arithmetic (closed under *, /, integer powers; + is not closed) -------
    def _coerce(self, other: object) -> "Surd | None":
        if isinstance(other, Surd):
            return other
        f = _as_fraction(other)
        return None if f is None else Surd.from_rational(f)

    def __neg__(self) -> "Surd":
        return Surd._trusted(-self._sign, self._p, self._q)

    def __pos__(self) -> "Surd":
        return self

    def __abs__(self) -> "Surd":
        return Surd._trusted(abs(self._sign), self._p, self._q)

    def __mul__(self, other: object) -> "Surd":
        o = self._coerce(other)
        if o is None:
            return NotImplemented
        sign = self._sign * o._sign
        if not sign:
            return Surd._trusted(0, 0, 1)
        # cross-reduce: p1/q1 and p2/q2 are already reduced
        g1, g2 = gcd(self._p, o._q), gcd(o._p, self._q)
        return Surd._trusted(
            sign, (self._p // g1) * (o._p // g2), (self._q // g2) * (o._q // g1)
        )

    __rmul__ = __mul__

    def _inverse(self) -> "Surd":
        if not self._sign:
            raise ZeroDivisionError("division by an exact zero")
        return Surd._trusted(self._sign, self._q, self._p)

    def __truediv__(self, other: object) -> "Surd":
        o = self._coerce(other)
        if o is None:
            return NotImplemented
        return self * o._inverse()

    def __rtruediv__(self, other: object) -> "Surd":
        o = self._coerce(other)
        if o is None:
            return NotImplemented
        return o * self._inverse()

    def __pow__(self, n: object) -> "Surd":
        if not isinstance(n, int) or isinstance(n, bool):
            return NotImplemented
        base = self if n >= 0 else self._inverse()
        k = abs(n)
        sign = base._sign**k if k else 1
        return Surd._trusted(sign, base._p**k, base._q**k) if sign else Surd._trusted(0, 0, 1)

    # -- conversions -------------------------------------------------------------
    def __float__(self) -> float:
        import mpmath

        with mpmath.workprec(113):
            return float(self._sign * mpmath.sqrt(mpmath.mpf(self._p) / self._q))

    def __str__(self) -> str:
        if not self._sign:
            return "0"
        minus = "-" if self._sign < 0 else ""
        text = intmath.int_text
        if self.is_rational():
            rp, rq = isqrt(self._p), isqrt(self._q)
            return f"{minus}{text(rp)}" if rq == 1 else f"{minus}{text(rp)}/{text(rq)}"
        inner = text(self._p) if self._q == 1 else f"{text(self._p)}/{text(self._q)}"
        return f"{minus}sqrt({inner})"

    def __repr__(self) -> str:
        text = intmath.int_text
        return f"Surd({self._sign}, {text(self._p)}, {text(self._q)})"

    def to_sympy(self):
        """The same number as a sympy expression (imports sympy)."""
        import sympy

        return self._sign * sympy.sqrt(sympy.Rational(self._p, self._q))

    def decimal(self, digits: int = 15) -> str:
        """The value to `digits` significant digits, correctly rounded (half to even).

        mpmath gives the digits; an exact integer test then confirms (or
        corrects) the rounding, so the result never depends on a binary
        approximation being close enough.
        """
        from .decimals import surd_decimal

        return surd_decimal(self._sign, self._p, self._q, digits)

    def latex(self, style: str = "root", wrap: bool = False) -> str:
        """LaTeX for the value.

        style="root" writes sqrt of a fraction (-\\sqrt{\\frac{5}{14}}),
        style="rational" rationalises the denominator (-\\frac{\\sqrt{70}}{14}).
        Integers and plain fractions are written as such.  With wrap=True a
        negative value or a fraction is put in \\left( \\right) so that it can
        be raised to a power.
        """
        if style not in _LATEX_STYLES:
            raise ValueError(f"argument style = {style!r}: must be one of {', '.join(_LATEX_STYLES)}")
        if not self._sign:
            return "0"
        t = intmath.int_text
        if self.is_rational():
            rp, rq = t(isqrt(self._p)), t(isqrt(self._q))
            body = rp if rq == "1" else f"\\frac{{{rp}}}{{{rq}}}"
        elif style == "root":
            p, q = t(self._p), t(self._q)
            body = f"\\sqrt{{{p}}}" if q == "1" else f"\\sqrt{{\\frac{{{p}}}{{{q}}}}}"
        else:
            # sqrt(p/q) = sqrt(p*q)/q = a*sqrt(b)/q with p*q = a^2 b, b square-free
            a, b = intmath.split_square(self._p * self._q)
            g = gcd(a, self._q)
            a, den = a // g, self._q // g
            top = f"\\sqrt{{{t(b)}}}" if a == 1 else f"{t(a)}\\sqrt{{{t(b)}}}"
            body = top if den == 1 else f"\\frac{{{top}}}{{{t(den)}}}"
        text = f"-{body}" if self._sign < 0 else body
        if wrap and (self._sign < 0 or "\\frac" in body):
            return f"\\left({text}\\right)"
        return text

    def prime_form(self) -> tuple[int, tuple[tuple[int, int], ...]]:
        """(sign, ((prime, exponent), ...)) with p/q = prod(prime**exponent)."""
        if not self._sign:
            return 0, ()
        exps = dict(intmath.prime_exponents(self._p))
        for prime, e in intmath.prime_exponents(self._q).items():
            exps[prime] = exps.get(prime, 0) - e
        return self._sign, tuple(sorted(exps.items()))

    def prime_string(self) -> str:
        """Compact exact notation of p/q by prime exponents, e.g. '-[2^-1 5 7^-1]^(1/2)'."""
        sign, items = self.prime_form()
        if not sign:
            return "0"
        parts = " ".join(str(p) if e == 1 else f"{p}^{e}" for p, e in items) or "1"
        return f"{'-' if sign < 0 else ''}[{parts}]^(1/2)"


# Slot setters bound once: the trusted constructor is on every hot path.
_new_object = object.__new__
_set_sign = Surd._sign.__set__  # type: ignore[attr-defined]
_set_p = Surd._p.__set__  # type: ignore[attr-defined]
_set_q = Surd._q.__set__  # type: ignore[attr-defined]

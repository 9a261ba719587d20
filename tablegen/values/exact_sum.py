"""ExactSum: a rational combination of square roots of square-free integers.

    x = c_1 sqrt(r_1) + c_2 sqrt(r_2) + ...,   c_k Fraction != 0,
                                               1 <= r_1 < r_2 < ... square-free

is the one canonical form.  Square roots of distinct square-free integers are
linearly independent over the rationals (Besicovitch 1940), so two sums are
equal exactly when their terms are equal, and a sum is zero exactly when it
has no term: ``==`` and ``hash`` compare the stored terms.  Sums, products,
matrix products and orthogonality checks of Surd values stay exact:
``Surd + Surd`` is an ExactSum (always, whatever the result; one term or none
makes it equal, and hash, like the Surd, int or Fraction of the same value).

Order and decimals come from integer bounds of each term (``math.isqrt`` on
scaled integers), tightened until they decide; nothing is rounded on the way.
"""

from __future__ import annotations

import numbers
from fractions import Fraction
from functools import lru_cache
from math import gcd, isqrt

from ..intmath import int_text, split_square
from .surd import Surd

__all__ = ["ExactSum"]


@lru_cache(maxsize=1 << 14)
def _surd_term(p: int, q: int) -> tuple[int, Fraction]:
    """sqrt(p/q) = (a/q) * sqrt(b): (b, a/q) with p*q = a**2 * b, b square-free."""
    a, b = split_square(p * q)
    return b, Fraction(a, q)


class ExactSum:
    """An exact sum of surds in canonical form; immutable and hashable."""

    __slots__ = ("_terms",)

    def __init__(self, terms: "object" = ()) -> None:
        """From (radicand, coefficient) pairs: sum of coefficient * sqrt(radicand).

        A radicand is any int >= 0 (its square part is moved into the
        coefficient), a coefficient any int or Fraction.  ``ExactSum()`` is 0.
        """
        acc: dict[int, Fraction] = {}
        for r, c in terms:  # type: ignore[attr-defined]
            if not isinstance(r, int) or isinstance(r, bool) or r < 0:
                raise ValueError(f"ExactSum radicand must be an int >= 0, got {r!r}")
            f = _rational(c)
            if f is None:
                raise TypeError(f"ExactSum coefficient must be int or Fraction, got {type(c).__name__}")
            if r and f:
                a, b = split_square(r)
                acc[b] = acc.get(b, 0) + f * a
        object.__setattr__(self, "_terms", tuple(sorted((r, c) for r, c in acc.items() if c)))

    @classmethod
    def _from_sorted(cls, terms: tuple[tuple[int, Fraction], ...]) -> "ExactSum":
        """Trusted constructor: terms already canonical."""
        self = object.__new__(cls)
        object.__setattr__(self, "_terms", terms)
        return self

    @classmethod
    def _of(cls, s: Surd) -> "ExactSum":
        if not s.sign:
            return _ZERO
        b, c = _surd_term(s.p, s.q)
        return cls._from_sorted(((b, c if s.sign > 0 else -c),))

    @classmethod
    def _coerce(cls, x: object) -> "ExactSum | None":
        if isinstance(x, ExactSum):
            return x
        if isinstance(x, Surd):
            return cls._of(x)
        f = _rational(x)
        if f is None:
            return None
        return cls._from_sorted(((1, f),)) if f else _ZERO

    def __setattr__(self, name: str, value: object) -> None:
        raise AttributeError("ExactSum is immutable")

    def __reduce__(self):
        return (ExactSum, (self._terms,))

    # -- parts -----------------------------------------------------------------
    @property
    def terms(self) -> tuple[tuple[int, Fraction], ...]:
        """((radicand, coefficient), ...), radicands square-free and ascending."""
        return self._terms

    def as_surd(self) -> Surd:
        """The value as a Surd; ValueError if it has two terms or more (then it is no surd)."""
        if not self._terms:
            return Surd._trusted(0, 0, 1)
        if len(self._terms) > 1:
            raise ValueError(f"{self} is not a single surd")
        ((r, c),) = self._terms
        return Surd((c > 0) - (c < 0), c.numerator * c.numerator * r, c.denominator * c.denominator)

    def is_rational(self) -> bool:
        return not self._terms or (len(self._terms) == 1 and self._terms[0][0] == 1)

    # -- comparison and hashing ------------------------------------------------
    def __eq__(self, other: object) -> bool:
        if isinstance(other, ExactSum):
            return self._terms == other._terms
        if isinstance(other, float):
            return other == other and abs(other) != float("inf") and self == Fraction(other)
        o = ExactSum._coerce(other)
        return NotImplemented if o is None else self._terms == o._terms

    def __hash__(self) -> int:
        if len(self._terms) <= 1:
            return hash(self.as_surd())  # like the Surd, int or Fraction it equals
        return hash(("ExactSum", self._terms))

    def sign(self) -> int:
        """-1, 0 or 1, decided exactly from integer bounds."""
        if not self._terms:
            return 0
        if len(self._terms) == 1:
            return 1 if self._terms[0][1] > 0 else -1
        k = 0
        for _ in range(10_000):  # a non-zero sum is decided once the bounds are tight enough
            lo, hi = _signed_bounds(self._terms, 2, k)
            if lo > 0:
                return 1
            if hi < 0:
                return -1
            k = 2 * k + 16
        raise ArithmeticError("sign did not settle")  # pragma: no cover

    def _compare(self, other: object) -> "int | None":
        if isinstance(other, float):
            if other != other:
                return None
            if abs(other) == float("inf"):
                return -1 if other > 0 else 1
            other = Fraction(other)
        o = ExactSum._coerce(other)
        return None if o is None else (self - o).sign()

    def __lt__(self, other: object) -> bool:
        c = self._compare(other)
        return NotImplemented if c is None and not _is_nan(other) else c == -1

    def __le__(self, other: object) -> bool:
        c = self._compare(other)
        return NotImplemented if c is None and not _is_nan(other) else c in (-1, 0)

    def __gt__(self, other: object) -> bool:
        c = self._compare(other)
        return NotImplemented if c is None and not _is_nan(other) else c == 1

    def __ge__(self, other: object) -> bool:
        c = self._compare(other)
        return NotImplemented if c is None and not _is_nan(other) else c in (0, 1)

    def __bool__(self) -> bool:
        return bool(self._terms)

    # -- arithmetic --------------------------------------------------------------
    def __neg__(self) -> "ExactSum":
        return ExactSum._from_sorted(tuple((r, -c) for r, c in self._terms))

    def __pos__(self) -> "ExactSum":
        return self

    def __abs__(self) -> "ExactSum":
        return -self if self.sign() < 0 else self

    def __add__(self, other: object) -> "ExactSum":
        o = ExactSum._coerce(other)
        if o is None:
            return NotImplemented
        acc = dict(self._terms)
        for r, c in o._terms:
            acc[r] = acc.get(r, 0) + c
        return ExactSum._from_sorted(tuple(sorted((r, c) for r, c in acc.items() if c)))

    __radd__ = __add__

    def __sub__(self, other: object) -> "ExactSum":
        o = ExactSum._coerce(other)
        return NotImplemented if o is None else self + (-o)

    def __rsub__(self, other: object) -> "ExactSum":
        o = ExactSum._coerce(other)
        return NotImplemented if o is None else o + (-self)

    def __mul__(self, other: object) -> "ExactSum":
        o = ExactSum._coerce(other)
        if o is None:
            return NotImplemented
        # sqrt(r1)*sqrt(r2) = g*sqrt((r1/g)*(r2/g)), g = gcd(r1, r2); the product
        # of the coprime square-free cofactors is square-free: nothing to factor
        acc: dict[int, Fraction] = {}
        for r1, c1 in self._terms:
            for r2, c2 in o._terms:
                g = gcd(r1, r2)
                r = (r1 // g) * (r2 // g)
                acc[r] = acc.get(r, 0) + c1 * c2 * g
        return ExactSum._from_sorted(tuple(sorted((r, c) for r, c in acc.items() if c)))

    __rmul__ = __mul__

    def __truediv__(self, other: object) -> "ExactSum":
        """Division by a non-zero rational, Surd or one-term sum (a sum of several terms is refused)."""
        o = ExactSum._coerce(other)
        if o is None:
            return NotImplemented
        if len(o._terms) != 1:
            if not o._terms:
                raise ZeroDivisionError("division by an exact zero")
            raise TypeError("ExactSum divides only by a single surd, not by a sum of several")
        ((r, c),) = o._terms
        # 1/(c sqrt r) = sqrt(r) / (c r)
        return self * ExactSum._from_sorted(((r, 1 / (c * r)),))

    def __pow__(self, n: object) -> "ExactSum":
        if not isinstance(n, int) or isinstance(n, bool) or n < 0:
            return NotImplemented
        out = ExactSum._from_sorted(((1, Fraction(1)),))
        for _ in range(n):
            out = out * self
        return out

    # -- the value protocol ------------------------------------------------------
    def __str__(self) -> str:
        """'1/2 + 3*sqrt(2) - 2/5*sqrt(7)': sympy reads it back as the same number."""
        if not self._terms:
            return "0"
        parts = []
        for i, (r, c) in enumerate(self._terms):
            mag = abs(c)
            num = int_text(mag.numerator) if mag.denominator == 1 else f"{int_text(mag.numerator)}/{int_text(mag.denominator)}"
            body = num if r == 1 else (f"sqrt({int_text(r)})" if mag == 1 else f"{num}*sqrt({int_text(r)})")
            sign = ("-" if c < 0 else "") if i == 0 else (" - " if c < 0 else " + ")
            parts.append(sign + body)
        return "".join(parts)

    def __repr__(self) -> str:
        return f"ExactSum({[(r, c) for r, c in self._terms]!r})"

    def to_sympy(self):
        """The same number as a sympy expression (imports sympy)."""
        import sympy

        return sympy.Add(*(sympy.Rational(c.numerator, c.denominator) * sympy.sqrt(r) for r, c in self._terms))

    def latex(self, style: str = "root", wrap: bool = False) -> str:
        """LaTeX: each term as its Surd is written in ``style``, joined by + and -."""
        from .latex import sum_latex

        return sum_latex([_term_surd(r, c) for r, c in self._terms], style, wrap)

    def decimal(self, digits: int = 15) -> str:
        """The value to ``digits`` significant digits, correctly rounded (half to even)."""
        from .decimals import bounded_decimal, check_digits

        check_digits(digits)
        if len(self._terms) <= 1:  # a surd or a rational: the exact surd path
            return self.as_surd().decimal(digits)
        sign = self.sign()
        bounds = _abs_bounds(self._terms, sign)
        return bounded_decimal(sign, bounds, _log10_top(self._terms), digits)

    def __float__(self) -> float:
        if len(self._terms) <= 1:
            return float(self.as_surd())
        from .decimals import bounded_float

        sign = self.sign()
        return bounded_float(sign, _abs_bounds(self._terms, sign), _log2_top(self._terms))


_ZERO = ExactSum._from_sorted(())


def _rational(x: object) -> "Fraction | None":
    if isinstance(x, Fraction):
        return x
    if isinstance(x, int):
        return Fraction(x)
    if isinstance(x, numbers.Rational):
        return Fraction(int(x.numerator), int(x.denominator))
    return None


def _is_nan(x: object) -> bool:
    return isinstance(x, float) and x != x


def _term_surd(r: int, c: Fraction) -> tuple[int, int, int]:
    """(sign, p, q) of c*sqrt(r), reduced."""
    n, d = c.numerator, c.denominator
    p, q = n * n * r, d * d
    g = gcd(p, q)
    return (1 if n > 0 else -1), p // g, q // g


def _signed_bounds(terms, base: int, s: int) -> tuple[int, int]:
    """Integers lo <= value * base**s <= hi: each term floored and ceiled separately."""
    lo = hi = 0
    for r, c in terms:
        n, d = abs(c.numerator), c.denominator
        if s >= 0:
            f = isqrt(n * n * r * base ** (2 * s)) // d
        else:
            f = isqrt(n * n * r) // (d * base ** (-s))
        if c > 0:
            lo, hi = lo + f, hi + f + 1
        else:
            lo, hi = lo - f - 1, hi - f
    return lo, hi


def _abs_bounds(terms, sign: int):
    def bounds(base: int, s: int) -> tuple[int, int]:
        lo, hi = _signed_bounds(terms, base, s)
        return (lo, hi) if sign > 0 else (-hi, -lo)

    return bounds


def _log2_top(terms) -> int:
    """About log2 of the largest term (a starting guess for the bounds)."""
    return max(abs(c.numerator).bit_length() - c.denominator.bit_length() + r.bit_length() // 2 for r, c in terms)


def _log10_top(terms) -> int:
    return _log2_top(terms) * 30103 // 100000

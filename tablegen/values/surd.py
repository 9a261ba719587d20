"""The exact value type: sign x sqrt(p/q) (the protocol it keeps: values/__init__.py).

Every Clebsch-Gordan coefficient and every 3j, 6j and 9j symbol is a real
number whose square is rational, so it is stored as a sign in {-1, 0, 1} and a
reduced fraction p/q (p, q >= 1 coprime; zero is sign 0 with p = 0, q = 1).
The value is canonical at construction, so ``==`` and ``hash`` compare the
stored parts; a value that happens to be rational equals, and hashes like, the
same ``int`` or ``Fraction``.

Products, quotients and integer powers stay Surds; a sum or difference is an
:class:`~tablegen.values.exact_sum.ExactSum` (always that type; it equals
the Surd when it has a single term).

``str()`` and ``repr()`` are part of the data format (they are written into
checksummed files): change them only on purpose.
"""

from __future__ import annotations

from math import gcd, isqrt

from .. import intmath

__all__ = ["Surd"]

TYPE_CHECKING = False
if TYPE_CHECKING:  # pragma: no cover
    from fractions import Fraction

# numbers and fractions (with the decimal module it loads) are imported where they are used,
# not here: a one-value lookup builds and prints a Surd without either (start-up time).


def _as_fraction(x: object) -> "Fraction | None":
    """int, Fraction or any numbers.Rational (sympy's too) as a Fraction."""
    import numbers

    if not isinstance(x, numbers.Rational):  # int, Fraction and sympy's Rational all are
        return None
    from fractions import Fraction

    if isinstance(x, Fraction):
        return x
    if isinstance(x, int):
        return Fraction(x)
    return Fraction(int(x.numerator), int(x.denominator))


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
    def from_square(cls, square: object, sign: int = 1) -> "Surd":
        """sign * sqrt(square) for a rational square >= 0 and a sign in {-1, 0, 1}."""
        f = _as_fraction(square)
        if f is None:
            raise TypeError(f"cannot make a Surd from {type(square).__name__}")
        if f < 0:
            raise ValueError(f"argument square = {square}: must be >= 0")
        if sign not in (-1, 0, 1) or isinstance(sign, bool):
            raise ValueError(f"argument sign = {sign!r}: must be -1, 0 or 1")
        n, d = f.numerator, f.denominator
        return cls._trusted(sign, n, d) if n and sign else cls._trusted(0, 0, 1)

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

    def squared(self) -> "Fraction":
        """The square of the value, p/q >= 0, as a Fraction (the sign is ``sign``)."""
        from fractions import Fraction

        return Fraction(self._p, self._q) if self._sign else Fraction(0)

    def _order_value(self) -> "Fraction":
        """sign * p/q: strictly increasing in the value, for ordering without roots."""
        from fractions import Fraction

        return Fraction(self._sign * self._p, self._q)

    def is_rational(self) -> bool:
        """True when sqrt(p/q) is rational (p and q are both perfect squares)."""
        p, q = self._p, self._q
        rp, rq = isqrt(p), isqrt(q)
        return rp * rp == p and rq * rq == q

    def as_fraction(self) -> "Fraction":
        """The value as a Fraction; ValueError if it is irrational."""
        from fractions import Fraction

        if not self.is_rational():
            raise ValueError(f"{self} is irrational")
        return Fraction(self._sign * isqrt(self._p), isqrt(self._q))

    # -- comparison and hashing ------------------------------------------------
    def __eq__(self, other: object) -> bool:
        if isinstance(other, Surd):
            return (self._sign, self._p, self._q) == (other._sign, other._p, other._q)
        if isinstance(other, float):
            # a finite float is an exact binary rational; compare exactly
            from fractions import Fraction

            return other == other and abs(other) != float("inf") and self == Fraction(other)
        f = _as_fraction(other)
        if f is None:
            return NotImplemented
        return self.is_rational() and self.as_fraction() == f

    def __hash__(self) -> int:
        if self.is_rational():
            return hash(self.as_fraction())
        return hash(("Surd", self._sign, self._p, self._q))

    def _order_key(self, other: object) -> "tuple[Fraction, Fraction | float] | None":
        # sign(x) * x**2 is strictly increasing, so comparing signed squares
        # compares the values themselves without any square root.  A finite
        # float is an exact binary rational and is compared as one, so ordering
        # agrees with ==; an infinity or NaN compares as itself.
        if isinstance(other, Surd):
            return self._order_value(), other._order_value()
        if isinstance(other, float):
            if other != other or abs(other) == float("inf"):
                return self._order_value(), other
            from fractions import Fraction

            other = Fraction(other)
        f = _as_fraction(other)
        if f is None:
            return None
        return self._order_value(), (f * abs(f))

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

    # -- arithmetic (closed under *, /, integer powers; + and - give an ExactSum) --
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
        """The nearest float, from integers only (see values/decimals.py)."""
        from .decimals import surd_float

        return surd_float(self._sign, self._p, self._q)

    # -- sums: always an ExactSum (one result type for every sum, whatever its terms) --
    def __add__(self, other: object):
        """self + other as an ExactSum (equal to a Surd when it has one term)."""
        from .exact_sum import ExactSum

        o = ExactSum._coerce(other)
        return NotImplemented if o is None else ExactSum._of(self) + o

    __radd__ = __add__

    def __sub__(self, other: object):
        from .exact_sum import ExactSum

        o = ExactSum._coerce(other)
        return NotImplemented if o is None else ExactSum._of(self) - o

    def __rsub__(self, other: object):
        from .exact_sum import ExactSum

        o = ExactSum._coerce(other)
        return NotImplemented if o is None else o - ExactSum._of(self)

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

        Integer square roots give the digits and an exact integer test decides
        the last one (values/decimals.py); no binary approximation is involved.
        """
        from .decimals import surd_decimal

        return surd_decimal(self._sign, self._p, self._q, digits)

    def latex(self, style: str = "root", wrap: bool = False) -> str:
        """LaTeX for the value (see values/latex.py for the styles "root", "rational" and "inline").

        With wrap=True a negative value or a fraction is put in \\left( \\right)
        so that it can be raised to a power.
        """
        from .latex import surd_latex

        return surd_latex(self._sign, self._p, self._q, style, wrap)

    def prime_exponents(self) -> dict[int, int]:
        """The square p/q factorised: {prime: exponent}, primes ascending, no zero exponents.

        The value is ``sign * sqrt(prod(prime**exponent))``; a negative exponent
        is a prime of q.  Example: -sqrt(5/14) gives {2: -1, 5: 1, 7: -1}.  Zero
        and one both give {} (tell them apart by ``sign``).  Factorising a large
        p or q takes time: this is for callers who want the data, no page uses it.
        """
        if not self._sign:
            return {}
        exps = dict(intmath.prime_exponents(self._p))
        for prime, e in intmath.prime_exponents(self._q).items():
            exps[prime] = exps.get(prime, 0) - e
        return dict(sorted(exps.items()))


# Slot setters bound once: the trusted constructor is on every hot path.
_new_object = object.__new__
_set_sign = Surd._sign.__set__  # type: ignore[attr-defined]
_set_p = Surd._p.__set__  # type: ignore[attr-defined]
_set_q = Surd._q.__set__  # type: ignore[attr-defined]

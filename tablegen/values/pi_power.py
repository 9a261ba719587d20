"""A surd times an exact power of pi: sign * sqrt(p/q) * pi**(e/2), e an int.

The normalisation of a spherical harmonic is sqrt((2l+1)/(4 pi) ...): a surd
times pi**(-1/2).  Keeping the power of pi exactly (as a doubled exponent)
keeps products exact (Gaunt coefficients multiply three of them).  Canonical:
the Surd part is canonical and e = 0 for zero, so ``==``/``hash`` compare
(surd, e); with e = 0 the value equals, and hashes like, its Surd.
"""

from __future__ import annotations

from fractions import Fraction

from .surd import Surd

__all__ = ["PiPower"]


class PiPower:
    """surd * pi**(half_exponent/2); immutable and hashable."""

    __slots__ = ("_surd", "_e")

    def __new__(cls, surd: object, half_exponent: int = 0) -> "PiPower":
        s = surd if isinstance(surd, Surd) else Surd.from_rational(surd)
        if not isinstance(half_exponent, int) or isinstance(half_exponent, bool):
            raise TypeError(f"argument half_exponent = {half_exponent!r}: must be an int")
        self = object.__new__(cls)
        object.__setattr__(self, "_surd", s)
        object.__setattr__(self, "_e", half_exponent if s else 0)
        return self

    def __setattr__(self, name: str, value: object) -> None:
        raise AttributeError("PiPower is immutable")

    def __reduce__(self):
        return (PiPower, (self._surd, self._e))

    surd = property(lambda self: self._surd, doc="the algebraic part")
    half_exponent = property(lambda self: self._e, doc="twice the power of pi")

    def __eq__(self, other: object) -> bool:
        if isinstance(other, PiPower):
            return (self._surd, self._e) == (other._surd, other._e)
        if isinstance(other, (Surd, int, Fraction)):
            return self._e == 0 and self._surd == other
        return NotImplemented

    def __hash__(self) -> int:
        return hash(self._surd) if self._e == 0 else hash(("PiPower", self._surd, self._e))

    def __mul__(self, other: object) -> "PiPower":
        if isinstance(other, PiPower):
            return PiPower(self._surd * other._surd, self._e + other._e)
        if isinstance(other, (Surd, int, Fraction)) and not isinstance(other, bool):
            return PiPower(self._surd * other, self._e)
        return NotImplemented

    __rmul__ = __mul__

    def __neg__(self) -> "PiPower":
        return PiPower(-self._surd, self._e)

    def __abs__(self) -> "PiPower":
        return PiPower(abs(self._surd), self._e)

    def __str__(self) -> str:
        """sqrt(3/(4*pi)) for e = -1, sqrt(2*pi) for e = 1, else surd*pi**k or surd*pi**(e/2)."""
        s, e = self._surd, self._e
        if e == 0 or not s:
            return str(s)
        minus = "-" if s.sign < 0 else ""
        if e in (-1, 1):
            p, q = s.p, s.q
            num = "pi" if (e == 1 and p == 1) else (f"{p}*pi" if e == 1 else str(p))
            den = "" if (e == 1 and q == 1) else (f"/{q}" if e == 1 else ("/pi" if q == 1 else f"/({q}*pi)"))
            return f"{minus}sqrt({num}{den})"
        power = f"pi**{e // 2}" if e % 2 == 0 else f"pi**({e}/2)"
        mag = str(abs(s))
        return minus + (power if mag == "1" else f"{mag}*{power}")

    def __repr__(self) -> str:
        return f"PiPower({self._surd!r}, {self._e})"

    def latex(self, style: str = "root") -> str:
        s, e = self._surd, self._e
        if e == 0 or not s:
            return s.latex(style)
        minus = "-" if s.sign < 0 else ""
        if e in (-1, 1) and style in ("root", "inline"):
            p, q = s.p, s.q
            num = ("\\pi" if p == 1 else f"{p}\\pi") if e == 1 else str(p)
            den = (str(q) if e == 1 else ("\\pi" if q == 1 else f"{q}\\pi"))
            if den == "1":
                return f"{minus}\\sqrt{{{num}}}"
            if style == "inline":  # running text: sqrt(3/(4 pi)) slashed
                slashed = f"({den})" if den.endswith("\\pi") and den != "\\pi" else den
                return f"{minus}\\sqrt{{{num}/{slashed}}}"
            return f"{minus}\\sqrt{{\\frac{{{num}}}{{{den}}}}}"
        power = f"\\pi^{{{e // 2}}}" if e % 2 == 0 else f"\\pi^{{{e}/2}}"
        factor = abs(s).latex(style, wrap=style == "inline")  # a slashed factor in parentheses
        return f"{factor if abs(s) != 1 else ''}{power}".join([minus, ""])

    def to_sympy(self):
        import sympy

        return self._surd.to_sympy() * sympy.pi ** sympy.Rational(self._e, 2)

    def interval(self, iv):
        """An mpmath interval (context iv) containing the value."""
        s = self._surd
        return s.sign * iv.sqrt(iv.mpf(s.p) / s.q * iv.pi ** self._e)

    def decimal(self, digits: int = 15) -> str:
        """Correctly rounded: pi**(e/2) with e != 0 is transcendental, so no rounding tie exists."""
        if self._e == 0 or not self._surd:
            return self._surd.decimal(digits)
        from .rounding import decided_decimal, interval_bounds

        bounds = interval_bounds(self.interval)
        return decided_decimal(bounds, digits)

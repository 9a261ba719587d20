"""A root of unity times a surd: r * exp(2*pi*i*t), r = sqrt(p/q) >= 0, t rational in [0, 1).

The exact value of a rotation function D^j_{m'm}(alpha, beta, gamma) at
alpha, gamma rational multiples of pi and a rational cos(beta).  Canonical:
the sign of the surd is folded into the turn t (a minus sign is t + 1/2), so
``==`` and ``hash`` compare (r, t); a value with t in {0, 1/2} is real and
equals, and hashes like, the same Surd (and int or Fraction).
"""

from __future__ import annotations

from fractions import Fraction

from .surd import Surd

__all__ = ["PhasedSurd"]


class PhasedSurd:
    """modulus * exp(2 pi i turn); immutable and hashable."""

    __slots__ = ("_modulus", "_turn")

    def __new__(cls, value: object, turn: object = 0) -> "PhasedSurd":
        """value (a Surd, int or Fraction, any sign) times exp(2 pi i turn), turn an exact rational."""
        s = value if isinstance(value, Surd) else Surd.from_rational(value)
        if isinstance(turn, (float, bool)) or not isinstance(turn, (int, Fraction)):
            raise TypeError(f"argument turn = {turn!r}: must be an int or Fraction")
        t = Fraction(turn) + (Fraction(1, 2) if s.sign < 0 else 0)
        self = object.__new__(cls)
        object.__setattr__(self, "_modulus", abs(s))
        object.__setattr__(self, "_turn", t - (t.numerator // t.denominator) if s else Fraction(0))
        return self

    def __setattr__(self, name: str, value: object) -> None:
        raise AttributeError("PhasedSurd is immutable")

    def __reduce__(self):
        return (PhasedSurd, (self._modulus, self._turn))

    modulus = property(lambda self: self._modulus, doc="|value| as a Surd")
    turn = property(lambda self: self._turn, doc="argument / (2 pi), in [0, 1)")

    def real_surd(self) -> Surd | None:
        """The value as a Surd when it is real, else None."""
        if self._turn == 0:
            return self._modulus
        if self._turn == Fraction(1, 2):
            return -self._modulus
        return None

    def __eq__(self, other: object) -> bool:
        if isinstance(other, PhasedSurd):
            return (self._modulus, self._turn) == (other._modulus, other._turn)
        if isinstance(other, (Surd, int, Fraction)):
            r = self.real_surd()
            return r is not None and r == other
        return NotImplemented

    def __hash__(self) -> int:
        r = self.real_surd()
        return hash(r) if r is not None else hash(("PhasedSurd", self._modulus, self._turn))

    def __mul__(self, other: object) -> "PhasedSurd":
        if isinstance(other, PhasedSurd):
            return PhasedSurd(self._modulus * other._modulus, self._turn + other._turn)
        if isinstance(other, (Surd, int, Fraction)) and not isinstance(other, bool):
            return PhasedSurd(self._modulus * other, self._turn)
        return NotImplemented

    __rmul__ = __mul__

    def conjugate(self) -> "PhasedSurd":
        return PhasedSurd(self._modulus, -self._turn)

    def _phase_text(self) -> tuple[str, str]:
        """(sign, factor) for the phase: '', '-' and 'I', '-I' at quarter turns, else exp(...)."""
        t = self._turn
        quarter = {Fraction(0): ("", ""), Fraction(1, 2): ("-", ""), Fraction(1, 4): ("", "I"),
                   Fraction(3, 4): ("-", "I")}
        if t in quarter:
            return quarter[t]
        a = 2 * t  # exp(2 pi i t) = exp(i pi a), a in (0, 2): write it in (-1, 1]
        a = a - 2 if a > 1 else a
        sign = "-" if a < 0 else ""
        n, d = abs(a).numerator, abs(a).denominator
        return "", f"exp({sign}{'' if n == 1 else f'{n}*'}I*pi/{d})"

    def __str__(self) -> str:
        """Reads back with sympy.sympify as the same number."""
        if not self._modulus:
            return "0"
        sign, phase = self._phase_text()
        mod = str(self._modulus)
        if not phase:
            return sign + mod
        return sign + (phase if mod == "1" else f"{mod}*{phase}")

    def __repr__(self) -> str:
        return f"PhasedSurd({self._modulus!r}, Fraction({self._turn.numerator}, {self._turn.denominator}))"

    def latex(self, style: str = "root") -> str:
        if not self._modulus:
            return "0"
        sign, phase = self._phase_text()
        mod = self._modulus.latex(style)
        if phase == "I":
            tex = "i" if mod == "1" else f"{mod}\\,i"
        elif phase:
            a = 2 * self._turn
            a = a - 2 if a > 1 else a
            n, d = abs(a).numerator, abs(a).denominator
            e = f"{'-' if a < 0 else ''}{'' if n == 1 else n}\\pi i/{d}"
            tex = f"e^{{{e}}}" if mod == "1" else f"{mod}\\,e^{{{e}}}"
        else:
            tex = mod
        return sign + tex

    def to_sympy(self):
        import sympy

        return self._modulus.to_sympy() * sympy.exp(2 * sympy.pi * sympy.I * sympy.Rational(
            self._turn.numerator, self._turn.denominator))

    def decimal(self, digits: int = 15) -> str:
        """'x' for a real value, else 'x + y*I' with each part correctly rounded."""
        r = self.real_surd()
        if r is not None:
            return r.decimal(digits)
        from .rounding import decided_decimal, interval_bounds

        m, t = self._modulus, self._turn

        def part(fn):
            return interval_bounds(lambda iv: iv.sqrt(iv.mpf(m.p) / m.q) * fn(2 * iv.pi * iv.mpf(t.numerator) / t.denominator))

        # the real (imaginary) part is exactly zero at quarter turns only, handled above
        t4 = 4 * self._turn
        re = "0" if t4 in (1, 3) else decided_decimal(part(lambda x: _iv().cos(x)), digits)
        im = decided_decimal(part(lambda x: _iv().sin(x)), digits)
        return im + "*I" if re == "0" else (f"{re} - {im[1:]}*I" if im.startswith("-") else f"{re} + {im}*I")


def _iv():
    from mpmath import iv

    return iv

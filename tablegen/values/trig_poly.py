"""Exact functions of one angle x: sqrt(rational) * P(cos x) * h(x).

P is a polynomial with integer coefficients and h is one of 1, sin x,
cos(x/2), sin(x/2).  Every Wigner d-function d^j_{m'm}(beta) and the theta part
of every spherical harmonic has this form (for integer j a polynomial in
cos beta, or sin beta times one; for half-integer j, cos(beta/2) or
sin(beta/2) times one).  The form is canonical: P is primitive (coefficient
gcd 1) with a positive leading coefficient, so the whole rational and surd
part sits in one Surd factor; ``==`` and ``hash`` compare the stored parts.

The set is closed under * (products of the h's reduce with the half-angle
formulas) and under + within one square class of the factor; a sum that would
mix square classes raises ValueError.  ``str()`` is a data format that
``sympy.sympify`` reads back (symbol named by ``var``).
"""

from __future__ import annotations

from fractions import Fraction
from math import gcd, lcm

TYPE_CHECKING = False  # typing is not imported: it would slow the start-up of `value d|D|Y`
if TYPE_CHECKING:  # pragma: no cover
    from collections.abc import Sequence

from .surd import Surd

__all__ = ["TrigPoly", "HALVES"]

#: h codes: the factor that is not a polynomial in cos x
HALVES = ("1", "sin", "cos/2", "sin/2")
_F = Fraction
# h1 * h2 = h * Q(cos x): half-angle formulas cos^2(x/2) = (1+c)/2, sin^2(x/2) = (1-c)/2,
# sin x = 2 sin(x/2) cos(x/2), so sin x cos(x/2) = sin(x/2)(1+c), sin x sin(x/2) = cos(x/2)(1-c)
_PRODUCT = {
    ("sin", "sin"): ("1", (_F(1), _F(0), _F(-1))),
    ("cos/2", "cos/2"): ("1", (_F(1, 2), _F(1, 2))),
    ("sin/2", "sin/2"): ("1", (_F(1, 2), _F(-1, 2))),
    ("cos/2", "sin/2"): ("sin", (_F(1, 2),)),
    ("sin", "cos/2"): ("sin/2", (_F(1), _F(1))),
    ("sin", "sin/2"): ("cos/2", (_F(1), _F(-1))),
}
# the square of h as a polynomial in c (for values at a rational cosine)
_SQUARE = {"1": (1,), "sin": (1, 0, -1), "cos/2": (_F(1, 2), _F(1, 2)), "sin/2": (_F(1, 2), _F(-1, 2))}


def poly_mul(a: Sequence, b: Sequence) -> list:
    """Product of two coefficient lists (ascending powers)."""
    if not a or not b:
        return []
    out = [0] * (len(a) + len(b) - 1)
    for i, x in enumerate(a):
        if x:
            for k, y in enumerate(b):
                out[i + k] += x * y
    return out


def poly_eval(a: Sequence, x):
    """Horner's rule (works for ints, Fractions and mpmath intervals)."""
    v = 0
    for c in reversed(a):
        v = v * x + c
    return v


class TrigPoly:
    """factor * P(cos x) * h(x), canonical; immutable and hashable."""

    __slots__ = ("_factor", "_coeffs", "_half", "_var")

    def __new__(cls, factor: object, coeffs: Sequence, half: str = "1", var: str = "beta") -> "TrigPoly":
        """Build from any Surd/rational factor and rational coefficients (ascending powers of cos x)."""
        if half not in HALVES:
            raise ValueError(f"argument half = {half!r}: must be one of {', '.join(HALVES)}")
        if not isinstance(var, str) or not var.isidentifier():
            raise ValueError(f"argument var = {var!r}: must be a symbol name")
        f = factor if isinstance(factor, Surd) else Surd.from_rational(factor)
        if all(type(c) is int for c in coeffs):  # the engine's hot path: integer coefficients
            ints, den = list(coeffs), 1
        else:
            fr = [Fraction(c) for c in coeffs]
            den = lcm(*(c.denominator for c in fr)) if fr else 1
            ints = [int(c * den) for c in fr]
        while ints and not ints[-1]:
            ints.pop()
        if not ints or not f:
            return cls._trusted(Surd(0), (), "1", var)
        g = gcd(*ints) * (1 if ints[-1] > 0 else -1)
        return cls._trusted(f * Fraction(g, den), tuple(c // g for c in ints), half, var)

    @classmethod
    def _trusted(cls, factor: Surd, coeffs: tuple, half: str, var: str) -> "TrigPoly":
        self = object.__new__(cls)
        for name, v in (("_factor", factor), ("_coeffs", coeffs), ("_half", half), ("_var", var)):
            object.__setattr__(self, name, v)
        return self

    def __setattr__(self, name: str, value: object) -> None:
        raise AttributeError("TrigPoly is immutable")

    def __reduce__(self):
        return (TrigPoly, (self._factor, self._coeffs, self._half, self._var))

    # -- parts -------------------------------------------------------------
    factor = property(lambda self: self._factor, doc="the Surd in front")
    coeffs = property(lambda self: self._coeffs, doc="primitive integer coefficients, ascending powers of cos x")
    half = property(lambda self: self._half, doc="h: '1', 'sin', 'cos/2' or 'sin/2'")
    var = property(lambda self: self._var, doc="the angle's symbol name")

    def __bool__(self) -> bool:
        return bool(self._factor)

    def __eq__(self, other: object) -> bool:
        if isinstance(other, TrigPoly):
            return (self._factor, self._coeffs, self._half, self._var) == (
                other._factor, other._coeffs, other._half, other._var)
        if isinstance(other, (int, Fraction, Surd)):  # a constant function
            if not self:
                return other == 0
            return self._half == "1" and self._coeffs == (1,) and self._factor == other
        return NotImplemented

    def __hash__(self) -> int:
        if not self._factor or (self._half == "1" and self._coeffs == (1,)):
            return hash(self._factor)
        return hash(("TrigPoly", self._factor, self._coeffs, self._half, self._var))

    # -- arithmetic ------------------------------------------------------------
    def __neg__(self) -> "TrigPoly":
        return TrigPoly._trusted(-self._factor, self._coeffs, self._half, self._var)

    def __add__(self, other: object) -> "TrigPoly":
        """Exact sum; ValueError if the two factors are in different square classes."""
        if not isinstance(other, TrigPoly):
            return NotImplemented
        if other._var != self._var:
            raise ValueError(f"cannot add functions of {self._var} and {other._var}")
        if not other:
            return self
        if not self:
            return other
        if other._half != self._half:
            raise ValueError(f"sum of {self._half} and {other._half} terms leaves the form")
        ratio = self._factor / other._factor
        if not ratio.is_rational():
            raise ValueError("sum mixes square classes: not of the form sqrt(rational) * polynomial")
        r = ratio.as_fraction()
        a, b = self._coeffs, other._coeffs
        n = max(len(a), len(b))
        s = [r * (a[k] if k < len(a) else 0) + (b[k] if k < len(b) else 0) for k in range(n)]
        return TrigPoly(other._factor, s, self._half, self._var)

    def __sub__(self, other: object) -> "TrigPoly":
        if not isinstance(other, TrigPoly):
            return NotImplemented
        return self + (-other)

    def __mul__(self, other: object) -> "TrigPoly":
        """Product with a constant (Surd, int, Fraction) or another function of the same angle."""
        if isinstance(other, TrigPoly):
            if other._var != self._var:
                raise ValueError(f"cannot multiply functions of {self._var} and {other._var}")
            coeffs = poly_mul(self._coeffs, other._coeffs)
            pair = (self._half, other._half)
            if "1" in pair:
                half = other._half if self._half == "1" else self._half
            else:
                half, q = _PRODUCT.get(pair) or _PRODUCT[pair[::-1]]
                coeffs = poly_mul(coeffs, q)
            return TrigPoly(self._factor * other._factor, coeffs, half, self._var)
        if isinstance(other, (Surd, int, Fraction)) and not isinstance(other, bool):
            f = self._factor * other
            return TrigPoly._trusted(f, self._coeffs, self._half, self._var) if f else TrigPoly(0, (), "1", self._var)
        return NotImplemented

    __rmul__ = __mul__

    def derivative(self) -> "TrigPoly":
        """d/dx, exactly: with c = cos x, dP(c)/dx = -sin x P'(c), and
        (sin x P)' = c P - (1-c^2) P', (cos(x/2) P)' = sin(x/2) (-P/2 - (1+c) P'),
        (sin(x/2) P)' = cos(x/2) (P/2 - (1-c) P')."""
        p = list(self._coeffs)
        dp = [k * p[k] for k in range(1, len(p))]
        h = self._half
        if h == "1":
            return TrigPoly(-self._factor, dp, "sin", self._var) if dp else TrigPoly(0, (), "1", self._var)
        if h == "sin":
            new, rest = poly_mul([0, 1], p), poly_mul([1, 0, -1], dp)
            half = "1"
        elif h == "cos/2":
            new, rest = [Fraction(-c, 2) for c in p], poly_mul([1, 1], dp)
            half = "sin/2"
        else:
            new, rest = [Fraction(c, 2) for c in p], poly_mul([1, -1], dp)
            half = "cos/2"
        n = max(len(new), len(rest))
        s = [(new[k] if k < len(new) else 0) - (rest[k] if k < len(rest) else 0) for k in range(n)]
        return TrigPoly(self._factor, s, half, self._var)

    # -- values ---------------------------------------------------------------
    def at_cos(self, c: Fraction, h_sign: int = 1) -> Surd:
        """The exact value where cos x = c (rational, |c| <= 1); h_sign is the sign of h(x)
        (+1 for x in [0, pi], where sin x, cos(x/2), sin(x/2) are all >= 0)."""
        c = Fraction(c)
        p = poly_eval(self._coeffs, c)
        h2 = poly_eval(_SQUARE[self._half], c)
        return self._factor * Surd.from_rational(p) * Surd.from_square(h2, h_sign)

    def interval(self, x, iv):
        """An mpmath interval containing the value at the interval x (radians), using the context iv."""
        c = iv.cos(x)
        h = {"1": 1, "sin": iv.sin(x), "cos/2": iv.cos(x / 2), "sin/2": iv.sin(x / 2)}[self._half]
        f = self._factor
        return f.sign * iv.sqrt(iv.mpf(f.p) / f.q) * poly_eval(self._coeffs, c) * h

    # -- text --------------------------------------------------------------------
    def _pieces(self, cos_text, power, h_text) -> tuple[str, list[str]]:
        """(sign, [polynomial, h]) texts shared by str and LaTeX."""
        terms = []
        for k in range(len(self._coeffs) - 1, -1, -1):
            a = self._coeffs[k]
            if not a:
                continue
            mono = "" if k == 0 else power(cos_text, k)
            mag = str(abs(a))
            body = mag if not mono else (mono if mag == "1" else f"{mag}{'*' if power is _py_power else ''}{mono}")
            terms.append(("-" if a < 0 else "+", body))
        text = terms[0][1] if terms[0][0] == "+" else "-" + terms[0][1]
        for s, b in terms[1:]:
            text += f" {s} {b}"
        return text, len(terms)

    def __str__(self) -> str:
        if not self:
            return "0"
        v = self._var
        cos_text = f"cos({v})"
        h_text = {"1": "", "sin": f"sin({v})", "cos/2": f"cos({v}/2)", "sin/2": f"sin({v}/2)"}[self._half]
        poly, n = self._pieces(cos_text, _py_power, h_text)
        parts = [f"({poly})" if n > 1 else poly]
        if h_text:
            parts = [h_text] if parts == ["1"] else parts + [h_text]
        f = abs(self._factor)
        if f != 1:
            parts.insert(0, str(f))
        return ("-" if self._factor.sign < 0 else "") + "*".join(parts)

    def __repr__(self) -> str:
        return f"TrigPoly({self._factor!r}, {self._coeffs}, {self._half!r}, {self._var!r})"

    def latex(self, style: str = "root") -> str:
        """As a handbook prints it: \\frac{1}{2}(1+...) as \\frac{\\cos\\beta + 1}{2}, half angles only if needed.

        The "inline" style slashes instead: (\\cos\\beta + 1)/2, \\cos(\\beta/2).
        """
        if not self:
            return "0"
        v = "\\" + self._var if self._var in ("beta", "theta", "alpha", "gamma", "phi") else self._var
        half = f"({v}/2)" if style == "inline" else f"\\frac{{{v}}}{{2}}"  # running text: no built-up fraction
        h_text = {"1": "", "sin": f"\\sin {v}", "cos/2": f"\\cos{half}", "sin/2": f"\\sin{half}"}[self._half]
        poly, n = self._pieces(v, _tex_power, h_text)
        body = f"\\left({poly}\\right)" if n > 1 and (h_text or not self._factor.is_rational()) else poly
        if h_text:
            body = h_text if body == "1" else f"{body}\\,{h_text}"
        f = abs(self._factor)
        sign = "-" if self._factor.sign < 0 else ""
        if f == 1:
            return sign + body
        if f.is_rational():
            fr = f.as_fraction()
            num = fr.numerator
            top = body if num == 1 else (str(num) if body == "1" else f"{num}\\,{body}")
            if fr.denominator == 1:
                return sign + top
            if style == "inline":
                grouped = f"({top})" if (" + " in top or " - " in top) and not top.startswith("\\left(") else top
                return f"{sign}{grouped}/{fr.denominator}"
            return sign + f"\\frac{{{top}}}{{{fr.denominator}}}"
        return f"{sign}{f.latex(style)}" + ("" if body == "1" else f"\\,{body}")

    def to_sympy(self):
        """The same function as a sympy expression in Symbol(var) (imports sympy)."""
        import sympy

        x = sympy.Symbol(self._var)
        h = {"1": 1, "sin": sympy.sin(x), "cos/2": sympy.cos(x / 2), "sin/2": sympy.sin(x / 2)}[self._half]
        return self._factor.to_sympy() * sum(a * sympy.cos(x) ** k for k, a in enumerate(self._coeffs)) * h


def _py_power(base: str, k: int) -> str:
    return base if k == 1 else f"{base}**{k}"


def _tex_power(v: str, k: int) -> str:
    return f"\\cos {v}" if k == 1 else f"\\cos^{{{k}}} {v}"

"""Wigner's rotation functions d^j_{m'm}(beta) and D^j_{m'm}(alpha, beta, gamma), exactly.

Definition (active rotation, Condon–Shortley phase):
    D^j_{m'm}(alpha, beta, gamma) = <j m'| exp(-i alpha Jz) exp(-i beta Jy) exp(-i gamma Jz) |j m>
                                  = exp(-i m' alpha) d^j_{m'm}(beta) exp(-i m gamma),
    d^j_{m'm}(beta) = <j m'| exp(-i beta Jy) |j m>, row index m' first.
Wigner's formula, with C(n, k) binomials, gives
    d = sqrt((j+m')!(j-m')! / ((j+m)!(j-m)!)) * sum_k (-1)^(k+m'-m) C(j+m, k) C(j-m, k+m'-m)
        * cos(beta/2)^(2j-2k+m-m') * sin(beta/2)^(2k+m'-m),
evaluated here on doubled integers (tj = 2j, ...) with integers only.  With
cos^2(beta/2) = (1+c)/2 and sin^2(beta/2) = (1-c)/2 (c = cos beta) every term
is h(beta) * (1+c)^a (1-c)^b / 2^(tj//2), with the same h for every k.
"""

from __future__ import annotations

from fractions import Fraction
from functools import lru_cache
from math import comb

from ..spins import half_text
from ..values.surd import Surd
from ..values.trig_poly import TrigPoly, poly_mul
from . import Kind, Notation, Selection, ZeroRule

__all__ = ["d2", "d_at_cos2", "d_matrix2", "d_matrix_at_cos2", "RotationD", "d_zero_rule", "D2", "ROTATION_D_SMALL",
           "ROTATION_D_BIG", "CACHE_MAX_TJ"]

CACHE_MAX_TJ = 40  # functions for j <= 20 are cached; larger ones are rebuilt on demand
_HALF = {(0, 0): "1", (1, 1): "sin", (1, 0): "cos/2", (0, 1): "sin/2"}


def d_zero_rule(t: tuple[int, ...]) -> ZeroRule | None:
    """|m'| > j or |m| > j makes d^j_{m'm} identically zero (the one rule of this kind)."""
    tj, tmp, tm = t
    if abs(tmp) > tj or abs(tm) > tj:
        return ZeroRule("m-range", "|m'| <= j and |m| <= j are required")
    return None


@lru_cache(maxsize=None)
def _binomial_poly(a: int, b: int) -> tuple[int, ...]:
    """(1+c)^a (1-c)^b as integer coefficients, ascending powers of c."""
    p = [1]
    for _ in range(a):
        p = poly_mul(p, (1, 1))
    for _ in range(b):
        p = poly_mul(p, (1, -1))
    return tuple(p)


def _terms(tj: int, tmp: int, tm: int):
    """(k-sign * integer weight, cos(beta/2) exponent, sin(beta/2) exponent) for each k."""
    A, B = (tj + tm) // 2, (tj - tm) // 2
    dlt = (tmp - tm) // 2
    for k in range(max(0, -dlt), min(A, (tj - tmp) // 2) + 1):
        w = comb(A, k) * comb(B, k + dlt)
        yield (-w if (k + dlt) & 1 else w), tj - 2 * k - dlt, 2 * k + dlt


def _prefactor(tj: int, tmp: int, tm: int) -> Surd:
    from ..intmath import factorial as f

    return Surd(1, f((tj + tmp) // 2) * f((tj - tmp) // 2), f((tj + tm) // 2) * f((tj - tm) // 2))


def _d2(tj: int, tmp: int, tm: int) -> TrigPoly:
    if d_zero_rule((tj, tmp, tm)) is not None:
        return TrigPoly(0, ())
    total: list[int] = []
    half = "1"
    for w, a, b in _terms(tj, tmp, tm):
        half = _HALF[(a & 1, b & 1)]
        p = _binomial_poly(a // 2, b // 2)
        if len(p) > len(total):
            total.extend([0] * (len(p) - len(total)))
        for i, c in enumerate(p):
            total[i] += w * c
    return TrigPoly(_prefactor(tj, tmp, tm) / 2 ** (tj // 2), total, half, "beta")


_d2_cached = lru_cache(maxsize=None)(_d2)


def d2(tj: int, tmp: int, tm: int) -> TrigPoly:
    """d^j_{m'm}(beta) as an exact function, from doubled j, m', m (parity already checked)."""
    return _d2_cached(tj, tmp, tm) if tj <= CACHE_MAX_TJ else _d2(tj, tmp, tm)


def d_at_cos2(tj: int, tmp: int, tm: int, c: Fraction, signs: tuple[int, int] = (1, 1)) -> Surd:
    """d^j_{m'm}(beta) exactly where cos beta = c, without building the polynomial.

    signs = (sign of cos(beta/2), sign of sin(beta/2)); (1, 1) for beta = arccos(c) in [0, pi].
    """
    if d_zero_rule((tj, tmp, tm)) is not None:
        return Surd(0)
    # with c = n/e: cos^2(beta/2) = (e+n)/(2e), sin^2(beta/2) = (e-n)/(2e); the exponents of a term
    # add up to a constant, so the sum is an integer over (2e)^const: no Fraction inside the loop
    n, e = c.numerator, c.denominator
    x, y = e + n, e - n
    total = 0
    ea = eb = 0
    top = None
    for w, a, b in _terms(tj, tmp, tm):
        ea, eb = a & 1, b & 1
        total += w * x ** (a // 2) * y ** (b // 2)
        top = (a // 2) + (b // 2)
    h_sign = (signs[0] if ea else 1) * (signs[1] if eb else 1)
    # value^2 = prefactor^2 * (total / (2e)^top)^2 * x^ea y^eb / (2e)^(ea+eb)
    den = (2 * e) ** top
    value = _prefactor(tj, tmp, tm) * Surd.from_rational(Fraction(total, den))
    return value * Surd.from_square(Fraction((x if ea else 1) * (y if eb else 1), (2 * e) ** (ea + eb)), h_sign)


def d_matrix_at_cos2(tj: int, c: Fraction, signs: tuple[int, int] = (1, 1)) -> tuple[tuple[Surd, ...], ...]:
    """The exact matrix d^j at cos(beta) = c, rows m' = j ... -j; three quarters by symmetry."""
    ms = range(tj, -tj - 1, -2)
    cache: dict = {}

    def one(a: int, b: int) -> Surd:
        if (a, b) not in cache:
            cache[(a, b)] = d_at_cos2(tj, a, b, c, signs)
        return cache[(a, b)]

    def entry(a: int, b: int) -> Surd:
        s = -1 if ((b - a) // 2) & 1 else 1
        if abs(a) >= abs(b):
            return one(a, b) if a >= 0 else one(-a, -b) * s
        return one(b, a) * s if b > 0 else one(-b, -a)

    return tuple(tuple(entry(a, b) for b in ms) for a in ms)


def d_matrix2(tj: int) -> tuple[tuple[TrigPoly, ...], ...]:
    """The matrix d^j(beta): rows m' = j, j-1, ..., -j, columns m in the same order."""
    ms = range(tj, -tj - 1, -2)
    return tuple(tuple(_by_symmetry(tj, a, b) for b in ms) for a in ms)


def _by_symmetry(tj: int, a: int, b: int) -> TrigPoly:
    """d(a, b) from the member with the largest first index: d_{m'm} = d_{-m,-m'} and
    d_{mm'} = d_{-m',-m} = (-1)^(m-m') d_{m'm} (Edmonds 1957, eq. 4.2.6); a quarter of the work."""
    if abs(a) >= abs(b):
        return d2(tj, a, b) if a >= 0 else _signed(d2(tj, -a, -b), (b - a) // 2)
    return _signed(d2(tj, b, a), (b - a) // 2) if b > 0 else d2(tj, -b, -a)


def _signed(f: TrigPoly, power: int) -> TrigPoly:
    return -f if power & 1 else f


class RotationD:
    """D^j_{m'm}(alpha, beta, gamma) = exp(-i m' alpha) d^j_{m'm}(beta) exp(-i m gamma), as a function."""

    __slots__ = ("_tmp", "_tm", "_d")

    def __new__(cls, tmp: int, tm: int, d: TrigPoly) -> "RotationD":
        self = object.__new__(cls)
        for name, v in (("_tmp", tmp), ("_tm", tm), ("_d", d)):
            object.__setattr__(self, name, v)
        return self

    def __setattr__(self, name: str, value: object) -> None:
        raise AttributeError("RotationD is immutable")

    d = property(lambda self: self._d, doc="the real part d^j_{m'm}(beta)")
    doubled_m = property(lambda self: (self._tmp, self._tm), doc="(2m', 2m)")

    def __eq__(self, other: object) -> bool:
        if isinstance(other, RotationD):
            return (self._tmp, self._tm, self._d) == (other._tmp, other._tm, other._d) or (
                not self._d and not other._d)
        return NotImplemented

    def __hash__(self) -> int:
        return hash(("RotationD", self._tmp, self._tm, self._d)) if self._d else hash(0)

    @staticmethod
    def _phase(tm: int, angle: str) -> str:
        if tm == 0:
            return ""
        sign = "-" if tm > 0 else ""  # exp(-i m angle)
        n = abs(tm)
        if n % 2:
            return f"exp({sign}I*{angle}/2)" if n == 1 else f"exp({sign}{n}*I*{angle}/2)"
        return f"exp({sign}I*{angle})" if n == 2 else f"exp({sign}{n // 2}*I*{angle})"

    def __str__(self) -> str:
        """Reads back with sympy.sympify in the symbols alpha, beta, gamma."""
        if not self._d:
            return "0"
        parts = [p for p in (self._phase(self._tmp, "alpha"), f"({self._d})", self._phase(self._tm, "gamma")) if p]
        return "*".join(parts)

    def latex(self, style: str = "root") -> str:
        if not self._d:
            return "0"

        def ph(tm: int, angle: str) -> str:
            if tm == 0:
                return ""
            m = half_text(abs(tm))
            m = "" if m == "1" else (f"\\frac{{{abs(tm)}}}{{2}}" if tm % 2 else m)
            return f"e^{{{'-' if tm > 0 else ''}i{m}\\{angle}}}"

        body = self._d.latex(style)
        return "\\,".join(p for p in (ph(self._tmp, "alpha"), f"\\left({body}\\right)", ph(self._tm, "gamma")) if p)

    def to_sympy(self):
        import sympy

        a, g = sympy.Symbol("alpha"), sympy.Symbol("gamma")
        return (sympy.exp(-sympy.I * sympy.Rational(self._tmp, 2) * a) * self._d.to_sympy()
                * sympy.exp(-sympy.I * sympy.Rational(self._tm, 2) * g))


def _d_parse(values, max_j=None) -> tuple[int, ...]:
    from ..spins import parse_j, parse_m

    j, mp, m = values
    tj = parse_j(j, "j", max_j)
    return tj, parse_m(mp, "mp", tj, "j", max_j), parse_m(m, "m", tj, "j", max_j)


def _d_members(tj: int, tmp: int, tm: int) -> list[tuple[tuple[int, ...], int]]:
    """d^j_{m'm} = (-1)^(m-m') d^j_{mm'} = (-1)^(m-m') d^j_{-m',-m} = d^j_{-m,-m'} (Edmonds 1957, eq. 4.2.6)."""
    s = -1 if ((tm - tmp) // 2) & 1 else 1
    seen = {}
    for t, sign in (((tj, tmp, tm), 1), ((tj, tm, tmp), s), ((tj, -tmp, -tm), s), ((tj, -tm, -tmp), 1)):
        seen.setdefault(t, sign)
    return sorted(seen.items(), reverse=True)


#: The Kind record for d^j_{m'm}(beta); the site tabulates it (kinds/tabulated_functions.py).
ROTATION_D_SMALL = Kind(
    key="d",
    title="Wigner rotation function d",
    arguments=("j", "mp", "m"),
    j_positions=(0,),
    parse=_d_parse,
    doubled=d2,  # returns a TrigPoly, not a Surd: the record's type hint needs widening
    zero_rule=d_zero_rule,
    notation=Notation("function", ((0,), (1, 2)), name="d", tex="d^{{{0}}}_{{{1},{2}}}(\\beta)"),
    members=_d_members,
    selection=Selection(projections=((0, 1), (0, 2))),  # each of m', m belongs to j
    # a site's size guard: the function at j = 40 takes about 7 ms (measured, all m), growing like j^3
    max_j=200, cost_power=3, seconds_at_max_j=1.0,
)


def D2(tj: int, tmp: int, tm: int) -> RotationD:
    """D^j_{m'm}(alpha, beta, gamma) as an exact function, from doubled j, m', m."""
    return RotationD(tmp, tm, d2(tj, tmp, tm))


#: The Kind record for D^j_{m'm}(alpha, beta, gamma); not tabulated by the site (d is, with D = phases times d).
ROTATION_D_BIG = Kind(
    key="D",
    title="Wigner rotation function D",
    arguments=("j", "mp", "m"),
    j_positions=(0,),
    parse=_d_parse,
    doubled=D2,  # returns a RotationD
    zero_rule=d_zero_rule,
    notation=Notation("function", ((0,), (1, 2)), name="D"),
)

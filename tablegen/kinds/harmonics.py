"""Spherical harmonics Y_l^m(theta, phi), Condon–Shortley phase, as exact functions.

    Y_l^m(theta, phi) = (-1)^m sqrt((2l+1)/(4 pi) (l-m)!/(l+m)!) P_l^m(cos theta) e^{i m phi},  m >= 0,
    Y_l^{-m} = (-1)^m conj(Y_l^m),
where P_l^m(x) = (1-x^2)^(m/2) d^m/dx^m P_l(x) is the associated Legendre
function WITHOUT the (-1)^m (Ferrers' / Hobson's sign): here the Condon–Shortley
(-1)^m sits in Y, not in P.  (If your P_l^m already contains (-1)^m, as
sympy's assoc_legendre does, drop the (-1)^m above.)  Equivalently
Y_l^m(theta, phi) = sqrt((2l+1)/(4 pi)) conj(D^l_{m0}(phi, theta, 0)).
P_l(x) = 2^-l sum_k (-1)^k C(l, k) C(2l-2k, l) x^(l-2k) (Rodrigues' formula expanded), so
everything below is integer arithmetic; the theta part is a TrigPoly in theta.
"""

from __future__ import annotations

from functools import lru_cache
from math import comb

from ..intmath import factorial
from ..values.surd import Surd
from ..values.pi_power import PiPower
from ..values.trig_poly import TrigPoly, poly_mul
from . import Kind, Notation, Selection, ZeroRule

__all__ = ["SphericalHarmonic", "y2", "y_zero_rule", "SPHERICAL_Y"]


def y_zero_rule(t: tuple[int, ...]) -> ZeroRule | None:
    tl, tm = t
    if abs(tm) > tl:
        return ZeroRule("m-range", "|m| <= l is required")
    return None


class SphericalHarmonic:
    """norm * theta_part(theta) * exp(i m phi), norm = a surd times pi**(-1/2)."""

    __slots__ = ("_theta", "_m")

    def __new__(cls, theta_part: TrigPoly, m: int) -> "SphericalHarmonic":
        self = object.__new__(cls)
        object.__setattr__(self, "_theta", theta_part)
        object.__setattr__(self, "_m", m if theta_part else 0)
        return self

    def __setattr__(self, name: str, value: object) -> None:
        raise AttributeError("SphericalHarmonic is immutable")

    def __reduce__(self):  # a build's worker processes send values back pickled
        return (SphericalHarmonic, (self._theta, self._m))

    theta_part = property(lambda self: self._theta, doc="the function of theta, without the 1/sqrt(pi)")
    m = property(lambda self: self._m)

    @property
    def coefficient(self) -> PiPower:
        """The constant in front: the theta part's Surd times pi**(-1/2)."""
        return PiPower(self._theta.factor, -1)

    def __eq__(self, other: object) -> bool:
        if isinstance(other, SphericalHarmonic):
            return (self._theta, self._m) == (other._theta, other._m)
        return NotImplemented

    def __hash__(self) -> int:
        return hash(("Y", self._theta, self._m))

    def _unit(self) -> TrigPoly:
        t = self._theta
        return TrigPoly._trusted(Surd(1, 1, 1), t.coeffs, t.half, t.var)

    def __str__(self) -> str:
        """Reads back with sympy.sympify in the symbols theta and phi."""
        if not self._theta:
            return "0"
        parts = [str(self.coefficient)]
        u = str(self._unit())
        if u != "1":
            parts.append(u)
        if self._m:
            parts.append({1: "exp(I*phi)", -1: "exp(-I*phi)"}.get(self._m, f"exp({self._m}*I*phi)"))
        return "*".join(parts)

    def latex(self, style: str = "root") -> str:
        if not self._theta:
            return "0"
        parts = [self.coefficient.latex(style)]
        u = self._unit().latex(style)
        if u != "1":
            terms = sum(1 for c in self._theta.coeffs if c)  # a single power of cos needs no brackets
            parts.append(f"\\left({u}\\right)" if terms > 1 and self._theta.half == "1" else u)
        if self._m:
            parts.append("e^{i\\phi}" if self._m == 1 else f"e^{{{'-' if self._m < 0 else ''}"
                         f"{'' if abs(self._m) == 1 else abs(self._m)}i\\phi}}")
        return "\\,".join(parts)

    def to_sympy(self):
        import sympy

        return (self._theta.to_sympy() / sympy.sqrt(sympy.pi)
                * sympy.exp(sympy.I * self._m * sympy.Symbol("phi")))

    def interval(self, theta, phi, iv):
        """(real, imaginary) mpmath intervals at interval angles (radians), context iv."""
        r = self._theta.interval(theta, iv) / iv.sqrt(iv.pi)
        return r * iv.cos(self._m * phi), r * iv.sin(self._m * phi)


@lru_cache(maxsize=256)
def _legendre_derivative(l: int, m: int) -> tuple[int, ...]:
    """2^l * d^m/dx^m P_l(x), integer coefficients, ascending powers."""
    p = [0] * (l + 1)
    for k in range(l // 2 + 1):
        p[l - 2 * k] = (-1) ** k * comb(l, k) * comb(2 * l - 2 * k, l)
    for _ in range(m):
        p = [i * p[i] for i in range(1, len(p))]
    return tuple(p)


def y2(tl: int, tm: int) -> SphericalHarmonic:
    """Y_l^m from doubled l and m (l an integer: tl even, tm even)."""
    if y_zero_rule((tl, tm)) is not None:
        return SphericalHarmonic(TrigPoly(0, (), "1", "theta"), 0)
    l, m = tl // 2, tm // 2
    a = abs(m)
    poly = list(_legendre_derivative(l, a))
    for _ in range(a // 2):  # sin^a = (1 - c^2)^(a/2), times sin theta if a is odd
        poly = poly_mul(poly, (1, 0, -1))
    sign = -1 if (m > 0 and m & 1) else 1  # the Condon–Shortley (-1)^m, for m > 0 only
    norm = Surd(sign, (2 * l + 1) * factorial(l - a), 4 * factorial(l + a) * 4**l)  # 2^-l of P_l inside
    return SphericalHarmonic(TrigPoly(norm, poly, "sin" if a & 1 else "1", "theta"), m)


def _y_parse(values, max_j=None) -> tuple[int, ...]:
    from ..errors import QuantumNumberError
    from ..spins import parse_j, parse_m

    l, m = values
    tl = parse_j(l, "l", max_j)
    if tl & 1:
        raise QuantumNumberError("l", l, "l must be a whole number for a spherical harmonic")
    return tl, parse_m(m, "m", tl, "l", max_j)


#: The Kind record for Y_l^m; the site tabulates it (kinds/tabulated_functions.py).
SPHERICAL_Y = Kind(
    key="Y",
    title="spherical harmonic",
    arguments=("l", "m"),
    j_positions=(0,),
    parse=_y_parse,
    doubled=y2,  # returns a SphericalHarmonic: the record's type hint needs widening
    zero_rule=y_zero_rule,
    notation=Notation("function", ((0, 1),), name="Y", tex="Y_{{{0}}}^{{{1}}}(\\theta, \\phi)"),
    selection=Selection(projections=((0, 1),)),  # m belongs to l
)

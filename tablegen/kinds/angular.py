"""Function-valued kinds (d, D, Y): one record each, and their values at given angles.

The coupling symbols (kinds.KINDS) are numbers; these kinds are functions of
angles, so beside the Kind record (arguments, parser, function, zero rule)
each needs to know its angles and how to evaluate at them.  The list
:data:`FUNCTION_KINDS` is explicit; code loops over it.

Every value is  polar(beta or theta) * [pi^(-1/2) for Y] * exp(i * phase),
phase = -(m' alpha + m gamma) for D, m phi for Y, none for d.  It is exact
whenever the algebra allows: the polar part is a Surd when its cosine is
rational (then cos, sin and the half angles are square roots of rationals),
and the phase is a root of unity when the azimuthal angles are rational
multiples of pi.  Otherwise the decimal is correctly rounded from mpmath
intervals, imported only then.  A part known to be exactly zero is never
sent to the rounding (which could not decide it).
"""

from __future__ import annotations

from collections import namedtuple
from fractions import Fraction

from ..angles import cos_of_pi_multiple, half_angle_signs, parse_angle, parse_cosine
from ..values.surd import Surd
from . import Kind, ZeroRule, _Record
from .harmonics import SPHERICAL_Y
from .rotation import ROTATION_D_BIG, ROTATION_D_SMALL, d2, d_at_cos2

__all__ = ["FunctionKind", "Evaluation", "Polar", "FUNCTION_KINDS", "FUNCTION_KEYS", "function_kind",
           "PhasedPiPower"]


# Records here are named tuples from collections and slotted _Record classes, not typing.NamedTuple
# or dataclasses: those import typing, inspect and ast, which would double the start-up of `value d`.


class Polar(namedtuple("Polar", "form x signs", defaults=(None,))):
    """The polar angle: ('cos', c, signs) with a rational cosine c and the signs of
    cos, sin of the half angle; ('pi', r, None) for r*pi; ('rad', x, None) for x radians."""

    __slots__ = ()


class Phase(namedtuple("Phase", "pi_part rad_part", defaults=(Fraction(0), Fraction(0)))):
    """An angle pi_part * pi + rad_part (radians), both exact rationals."""

    __slots__ = ()

    def __add__(self, other: "Phase") -> "Phase":  # type: ignore[override]
        return Phase(self.pi_part + other.pi_part, self.rad_part + other.rad_part)


class Evaluation(namedtuple("Evaluation", "exact decimal zero_rule")):
    """A value at given angles: the exact value (None if not exact here), its decimal, why it is zero (a ZeroRule)."""

    __slots__ = ()


class FunctionKind(_Record):
    """A kind whose value is a function of angles.

    kind: the Kind record (key, arguments, parse, function on doubled arguments, zero rule).
    angles: every angle, in the order of the function's arguments.
    polar: the angle that may also be given by its cosine ("beta", "theta").
    azimuths: the angles that enter only through the phase exp(i sum_k factor_k * angle_k / 2),
        with phase_factors(t) the doubled projections factor_k (-2m', -2m for D; 2m for Y).
    polar_part(t): the real function of the polar angle (a TrigPoly).
    pi_power: the value carries pi**(pi_power/2) (Y: -1).
    symbol: format of the symbol in plain text, with the argument names as fields.
    convention: the definition, stated wherever a value is shown.
    """

    __slots__ = ("kind", "angles", "polar", "azimuths", "phase_factors", "symbol", "convention", "polar_part",
                 "pi_power")
    _fields = __slots__
    _defaults = {"pi_power": 0}

    @property
    def key(self) -> str:
        return self.kind.key

    def symbol_text(self, t: tuple[int, ...], shown: dict[str, str]) -> str:
        """'d^{1}_{1,0}(beta)', or with angle values 'd^{1}_{1,0}(pi/2)'."""
        from ..spins import half_text

        head = self.symbol.format(**{n: half_text(v) for n, v in zip(self.kind.arguments, t)})
        return f"{head}({', '.join(shown.get(a, a) for a in self.angles)})"

    def function(self, t: tuple[int, ...]):
        return self.kind.doubled(*t)

    def at(self, t: tuple[int, ...], given: dict[str, object], digits: int) -> Evaluation:
        """The value at the angles in ``given`` (name -> text; 'cos_<polar>' for a cosine); missing angles are 0."""
        rule = self.kind.zero_rule(t)
        if rule is not None:
            return Evaluation(Surd(0), "0", rule)
        polar = read_polar(self.polar, given)
        phase = Phase()
        for name, factor in zip(self.azimuths, self.phase_factors(t)):
            if given.get(name) is not None:
                form, x = parse_angle(given[name], name)
                phase = phase + (Phase(x * factor / 2) if form == "pi" else Phase(Fraction(0), x * factor / 2))
        f = self.polar_part(t)
        if polar.form == "cos" or f == f.factor:  # exact polar part
            h_sign = 1 if polar.signs is None else _h_sign(f.half, polar.signs)
            real = f.factor if f == f.factor else f.at_cos(polar.x, h_sign)
            if not real:
                return Evaluation(Surd(0), "0", _angle_zero(f, polar.x, self.polar))
            return _combine(real, phase, self.pi_power, digits)
        return Evaluation(None, _complex_decimal(_polar_interval(f, polar), phase, self.pi_power, digits), None)


def _h_sign(half: str, signs: tuple[int, int]) -> int:
    """The sign of h(x) from the signs of cos(x/2), sin(x/2); sin x = 2 sin(x/2) cos(x/2)."""
    c, s = signs
    return {"1": 1, "sin": c * s, "cos/2": c, "sin/2": s}[half]


def read_polar(name: str, given: dict[str, object]) -> Polar:
    """The polar angle from 'name' or 'cos_name' (QuantumNumberError if both or malformed); 0 if neither."""
    from ..errors import QuantumNumberError

    angle, cosine = given.get(name), given.get(f"cos_{name}")
    if angle is not None and cosine is not None:
        raise QuantumNumberError(f"cos_{name}", cosine, f"give {name} or cos_{name}, not both")
    if cosine is not None:
        return Polar("cos", parse_cosine(cosine, f"cos_{name}"), (1, 1))
    if angle is None:
        return Polar("cos", Fraction(1), (1, 1))
    form, x = parse_angle(angle, name)
    if form == "pi":
        c = cos_of_pi_multiple(x)
        if c is not None:
            return Polar("cos", c, half_angle_signs(x))
    return Polar(form, x)


def _angle_zero(f, c: Fraction, name: str) -> ZeroRule:
    """Why a function that is not identically zero vanishes where cos(name) = c."""
    h = {"sin": (f"sin({name}) = 0", (1, -1)), "cos/2": (f"cos({name}/2) = 0", (-1,)),
         "sin/2": (f"sin({name}/2) = 0", (1,))}.get(f.half)
    if h is not None and c in h[1]:
        return ZeroRule("angle", f"{h[0]} at this angle (no selection rule)")
    return ZeroRule("angle", f"its polynomial in cos({name}) has a root at cos({name}) = {c} (no selection rule)")


# -- combining the parts ---------------------------------------------------------------
def _combine(real: Surd, phase: Phase, pi_power: int, digits: int) -> Evaluation:
    """real * pi**(pi_power/2) * exp(i phase) for an exact non-zero real part."""
    from ..values.phased import PhasedSurd

    if phase.rad_part:  # a phase at radians: no exact form, but the decimal needs no zero test
        return Evaluation(None, _complex_decimal(lambda iv: _surd_iv(real, iv), phase, pi_power, digits), None)
    turn = phase.pi_part / 2
    if pi_power:
        value = PhasedPiPower(real, turn, pi_power)
        return Evaluation(value, value.decimal(digits), None)
    value = PhasedSurd(real, turn)
    r = value.real_surd()
    if r is not None:
        return Evaluation(r, r.decimal(digits), None)
    if (4 * value.turn).denominator == 1:  # +-i times a surd: integers only, no mpmath
        im = value.modulus.decimal(digits)
        return Evaluation(value, complex_text("0", im if value.turn == Fraction(1, 4) else _negated(im)), None)
    return Evaluation(value, value.decimal(digits), None)


def _surd_iv(s: Surd, iv):
    return s.sign * iv.sqrt(iv.mpf(s.p) / s.q)


def _polar_interval(f, polar: Polar):
    def interval(iv):
        x = iv.pi * polar.x.numerator / polar.x.denominator if polar.form == "pi" else (
            iv.mpf(polar.x.numerator) / polar.x.denominator)
        return f.interval(x, iv)

    return interval


def _negated(text: str) -> str:
    return text[1:] if text.startswith("-") else ("0" if text == "0" else "-" + text)


def complex_text(re: str, im: str) -> str:
    """'x', 'y*I' or 'x + y*I' (sympify reads it back)."""
    if im == "0":
        return re
    if re == "0":
        return f"{im}*I"
    return f"{re} - {im[1:]}*I" if im.startswith("-") else f"{re} + {im}*I"


def _complex_decimal(real_iv, phase: Phase, pi_power: int, digits: int) -> str:
    """Correctly rounded parts of real * pi**(pi_power/2) * exp(i phase); real known to be non-zero.

    A part is exactly zero only at a multiple of pi/2 with no radian part (cos and sin of a
    non-zero rational number of radians, or of r*pi plus one, never vanish: Lindemann).
    """
    from ..values.rounding import decided_decimal, interval_bounds

    def magnitude(iv):
        v, root_pi = real_iv(iv), iv.sqrt(iv.pi)
        return v * root_pi ** pi_power if pi_power >= 0 else v / root_pi ** -pi_power

    if not phase.rad_part and (2 * phase.pi_part).denominator == 1:
        quarter = int(2 * phase.pi_part) % 4  # exp(i k pi/2) = 1, i, -1, -i
        real = decided_decimal(interval_bounds(magnitude), digits)
        return {0: real, 1: complex_text("0", real), 2: _negated(real), 3: complex_text("0", _negated(real))}[quarter]

    def angle(iv):
        p, x = phase
        return iv.pi * p.numerator / p.denominator + iv.mpf(x.numerator) / x.denominator

    re = decided_decimal(interval_bounds(lambda iv: magnitude(iv) * iv.cos(angle(iv))), digits)
    im = decided_decimal(interval_bounds(lambda iv: magnitude(iv) * iv.sin(angle(iv))), digits)
    return complex_text(re, im)


class PhasedPiPower:
    """real * pi**(e/2) * exp(2 pi i turn): the exact value of Y at exact angles (e = -1).

    Canonical through PhasedSurd (the sign folds into the turn); ``str`` reads back
    with sympy.sympify, e.g. 'sqrt(3/(8*pi))*exp(-I*pi/3)'.
    """

    __slots__ = ("_phased", "_e")

    def __init__(self, real: Surd, turn: Fraction, half_exponent: int) -> None:
        from ..values.phased import PhasedSurd

        self._phased = PhasedSurd(real, turn)
        self._e = half_exponent

    def _parts(self):
        from ..values.phased import PhasedSurd
        from ..values.pi_power import PiPower

        return PiPower(self._phased.modulus, self._e), PhasedSurd(1, self._phased.turn)

    def __eq__(self, other: object) -> bool:
        if isinstance(other, PhasedPiPower):
            return (self._phased, self._e) == (other._phased, other._e)
        return NotImplemented

    def __hash__(self) -> int:
        return hash(("PhasedPiPower", self._phased, self._e))

    def __str__(self) -> str:
        mod, unit = self._parts()
        if not self._phased.modulus:
            return "0"
        u = str(unit)
        sign, u = ("-", u[1:]) if u.startswith("-") else ("", u)
        return sign + (str(mod) if u == "1" else f"{u}*{mod}" if u == "I" else f"{mod}*{u}")

    def latex(self, style: str = "root") -> str:
        mod, unit = self._parts()
        if not self._phased.modulus:
            return "0"
        u = unit.latex(style)
        sign, u = ("-", u[1:]) if u.startswith("-") else ("", u)
        return sign + (mod.latex(style) if u == "1" else f"{u}\\,{mod.latex(style)}" if u == "i"
                       else f"{mod.latex(style)}\\,{u}")

    def to_sympy(self):
        return self._parts()[0].to_sympy() * self._parts()[1].to_sympy()

    def decimal(self, digits: int = 15) -> str:
        if not self._phased.modulus:
            return "0"
        m = self._phased.modulus
        return _complex_decimal(lambda iv: _surd_iv(m, iv), Phase(2 * self._phased.turn), self._e, digits)


def _d_factors(t: tuple[int, ...]) -> tuple[int, ...]:
    return (-t[1], -t[2])  # exp(-i m' alpha) exp(-i m gamma)


def _y_factors(t: tuple[int, ...]) -> tuple[int, ...]:
    return (t[1],)  # exp(i m phi)


_D_CONVENTION = ("D^j_{m'm}(alpha, beta, gamma) = <j m'| exp(-i alpha Jz) exp(-i beta Jy) exp(-i gamma Jz) |j m>"
                 " = exp(-i m' alpha) d^j_{m'm}(beta) exp(-i m gamma): active rotation, Condon-Shortley phase")

FUNCTION_KINDS: tuple[FunctionKind, ...] = (
    FunctionKind(
        kind=ROTATION_D_SMALL, angles=("beta",), polar="beta", azimuths=(), phase_factors=lambda t: (),
        symbol="d^{{{j}}}_{{{mp},{m}}}",
        convention="d^j_{m'm}(beta) = <j m'| exp(-i beta Jy) |j m>: active rotation, Condon-Shortley phase, "
                   "row index m' first",
        polar_part=lambda t: d2(*t)),
    FunctionKind(
        kind=ROTATION_D_BIG, angles=("alpha", "beta", "gamma"), polar="beta", azimuths=("alpha", "gamma"), phase_factors=_d_factors,
        symbol="D^{{{j}}}_{{{mp},{m}}}", convention=_D_CONVENTION, polar_part=lambda t: d2(*t)),
    FunctionKind(
        kind=SPHERICAL_Y, angles=("theta", "phi"), polar="theta", azimuths=("phi",), phase_factors=_y_factors,
        symbol="Y_{{{l}}}^{{{m}}}",
        convention="Y_l^m(theta, phi), Condon-Shortley phase: (-1)^m sits in Y, not in P_l^m; "
                   "Y_l^m = sqrt((2l+1)/(4 pi)) conj(D^l_{m0}(phi, theta, 0))",
        polar_part=lambda t: SPHERICAL_Y.doubled(*t).theta_part, pi_power=-1),
)

FUNCTION_KEYS = tuple(f.key for f in FUNCTION_KINDS)
_BY_KEY = {f.key: f for f in FUNCTION_KINDS}


def function_kind(key: str) -> FunctionKind:
    try:
        return _BY_KEY[key]
    except KeyError:
        raise ValueError(f"argument kind = {key!r}: must be one of {', '.join(FUNCTION_KEYS)}") from None

"""The function-valued kinds a site tabulates: d^j(beta), its exact values at two angles, Y_l^m.

The coupling symbols (registry.KINDS) are numbers; the rotation family of the
site shows each d^j_{m'm}(beta) as a function and, under it, its exact values
at beta = pi/2 and pi/3 (cos beta = 0 and 1/2: every value is +-sqrt(p/q)).
Each of those values is a kind of its own, with the arguments of d, so that
values.txt, the data files and verify treat it like any other value.  The
angle is read by the same code as the API and the CLI (angular.read_polar).
"""

from __future__ import annotations

from functools import partial

from ..values.surd import Surd
from . import Kind, Notation
from .harmonics import SPHERICAL_Y
from .rotation import ROTATION_D_SMALL, d_at_cos2

__all__ = ["D_AT_HALF_PI", "D_AT_THIRD_PI", "TABULATED_FUNCTIONS",
           "d_at_angle"]


def d_at_angle(angle: str, tj: int, tmp: int, tm: int) -> Surd:
    """d^j_{m'm} at ``angle`` (text such as 'pi/2' whose cosine is rational), exactly."""
    from .angular import read_polar

    polar = read_polar("beta", {"beta": angle})
    if polar.form != "cos":
        raise ValueError(f"argument angle = {angle!r}: its cosine must be rational")
    return d_at_cos2(tj, tmp, tm, polar.x, polar.signs)


def _d_at(key: str, angle: str, title: str, tex: str) -> Kind:
    return Kind(
        key=key,
        title=title,
        arguments=ROTATION_D_SMALL.arguments,
        j_positions=ROTATION_D_SMALL.j_positions,
        parse=ROTATION_D_SMALL.parse,
        doubled=partial(d_at_angle, angle),
        zero_rule=ROTATION_D_SMALL.zero_rule,
        # plain text names the angle ('d(pi/2)(1; 1 0)'); LaTeX writes it as handbooks do, d^{1}_{1,0}(\pi/2)
        notation=Notation("function", ((0,), (1, 2)), name=key, tex="d^{{{0}}}_{{{1},{2}}}(" + tex + ")"),
        selection=ROTATION_D_SMALL.selection,
    )


D_AT_HALF_PI = _d_at("d(pi/2)", "pi/2", "Wigner rotation function d at beta = pi/2", "\\pi/2")
D_AT_THIRD_PI = _d_at("d(pi/3)", "pi/3", "Wigner rotation function d at beta = pi/3", "\\pi/3")

#: In the order of values.txt, after the coupling symbols.
TABULATED_FUNCTIONS: tuple[Kind, ...] = (ROTATION_D_SMALL, D_AT_HALF_PI, D_AT_THIRD_PI, SPHERICAL_Y)

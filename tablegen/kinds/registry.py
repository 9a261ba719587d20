"""The explicit lists of kinds, in the order they appear everywhere (values.txt, data, pages).

KINDS: the kinds whose values are numbers (coupling symbols, recoupling coefficients).
TABULATED_FUNCTIONS: the function-valued kinds the site tabulates (d^j(beta), its
values at fixed angles, Y_l^m), after them.
"""

from __future__ import annotations

from . import Kind
from .lsjj import LSJJ
from .ninej import NINEJ
from .recoupling import RECOUPLE3, RECOUPLE4
from .sixj import RACAH_W, SIXJ
from .states import STATE3, STATE4
from .threej import CG, THREEJ

KINDS: tuple[Kind, ...] = (CG, THREEJ, SIXJ, RACAH_W, NINEJ, RECOUPLE3, RECOUPLE4, LSJJ, STATE3, STATE4)


def tabulated_functions() -> tuple[Kind, ...]:
    """The function-valued kinds shown by the site (rotation and harmonics families), after KINDS.

    A function, not a constant: importing them is left to the first caller (see kinds._all_kinds).
    """
    from .tabulated_functions import TABULATED_FUNCTIONS

    return TABULATED_FUNCTIONS

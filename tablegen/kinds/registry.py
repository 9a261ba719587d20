"""The explicit lists of kinds, in the order they appear everywhere (values.txt, data, pages).

KINDS: the coupling symbols (numbers).  TABULATED_FUNCTIONS: the function-valued
kinds the site tabulates (d^j(beta), its values at fixed angles, Y_l^m), after them.
"""

from __future__ import annotations

from . import Kind
from .ninej import NINEJ
from .sixj import RACAH_W, SIXJ
from .threej import CG, THREEJ

KINDS: tuple[Kind, ...] = (CG, THREEJ, SIXJ, RACAH_W, NINEJ)

# -- function-valued kinds shown by the site (rotation and harmonics families) --
from .tabulated_functions import TABULATED_FUNCTIONS  # noqa: E402

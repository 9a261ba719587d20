"""The explicit list of kinds, in the order they appear everywhere (values.txt, data, pages)."""

from __future__ import annotations

from . import Kind
from .lsjj import LSJJ
from .ninej import NINEJ
from .recoupling import RECOUPLE3, RECOUPLE4
from .sixj import RACAH_W, SIXJ
from .states import STATE3, STATE4
from .threej import CG, THREEJ

KINDS: tuple[Kind, ...] = (CG, THREEJ, SIXJ, RACAH_W, NINEJ, RECOUPLE3, RECOUPLE4, LSJJ, STATE3, STATE4)

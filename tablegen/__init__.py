"""tablegen: exact angular-momentum coupling coefficients and reference tables.

Condon-Shortley phase convention throughout.  Every function returns a
:class:`Surd`, an exact number sign * sqrt(p/q); sums of them are
:class:`ExactSum` values, and :func:`phase` gives (-1)**x as an int.
"""

from .coefficients import cg, ninej, racah_w, sixj, threej, why_zero
from .errors import QuantumNumberError, TablegenError, TreeError
from .values import ExactSum, Surd, phase
from .recoupling import lsjj_matrices, recoupling, recoupling_matrix, recoupling_working
from .rotations import rotation_D, rotation_d, rotation_d_matrix, spherical_y

__version__ = "0.1.0"
#: The year this version was released: the year a citation of a build names (never the clock).
RELEASE_YEAR = 2026

__all__ = [
    "cg",
    "threej",
    "sixj",
    "racah_w",
    "ninej",
    "why_zero",
    "recoupling", "recoupling_matrix", "recoupling_working", "lsjj_matrices", "TreeError",
    "Surd",
    "ExactSum",
    "phase",
    "rotation_d",
    "rotation_D",
    "rotation_d_matrix",
    "spherical_y",
    "TablegenError",
    "QuantumNumberError",
    "__version__",
    "RELEASE_YEAR",
]

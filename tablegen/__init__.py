"""tablegen: exact angular-momentum coupling coefficients and reference tables.

Condon-Shortley phase convention throughout.  Every function returns a
:class:`Surd`, an exact number sign * sqrt(p/q).
"""

from .coefficients import cg, ninej, racah_w, sixj, threej, why_zero
from .errors import QuantumNumberError, TablegenError, TreeError
from .recoupling import lsjj_matrices, recoupling, recoupling_matrix, recoupling_working
from .surd import Surd

__version__ = "0.1.0"

__all__ = [
    "cg",
    "threej",
    "sixj",
    "racah_w",
    "ninej",
    "why_zero",
    "recoupling", "recoupling_matrix", "recoupling_working", "lsjj_matrices", "TreeError",
    "Surd",
    "TablegenError",
    "QuantumNumberError",
    "__version__",
]

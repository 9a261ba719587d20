"""tablegen: exact angular-momentum coupling coefficients and reference tables.

Condon-Shortley phase convention throughout.  Every function returns a
:class:`Surd`, an exact number sign * sqrt(p/q); sums of them are
:class:`ExactSum` values, and :func:`phase` gives (-1)**x as an int.

The public names are imported on first use (PEP 562), so that the command
line, which imports this package first, pays only for what it runs.
"""

__version__ = "0.1.0"
#: The year this version was released: the year a citation of a build names (never the clock).
RELEASE_YEAR = 2026

# light (its functions import their modules on first call), and eager on purpose: the
# function recoupling must win over the subpackage of the same name as an attribute
from .recoupling import lsjj_matrices, recoupling, recoupling_matrix, recoupling_working

#: public name -> the module that defines it
_PUBLIC = {
    "cg": "coefficients", "threej": "coefficients", "sixj": "coefficients", "racah_w": "coefficients",
    "ninej": "coefficients", "why_zero": "coefficients",
    "QuantumNumberError": "errors", "TablegenError": "errors", "TreeError": "errors",
    "ExactSum": "values", "Surd": "values", "phase": "values",
    "rotation_D": "rotations", "rotation_d": "rotations", "rotation_d_matrix": "rotations",
    "spherical_y": "rotations",
}

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


def __getattr__(name: str):
    module = _PUBLIC.get(name)
    if module is None:
        raise AttributeError(f"module 'tablegen' has no attribute {name!r}")
    from importlib import import_module

    value = getattr(import_module(f".{module}", __name__), name)
    globals()[name] = value  # later lookups skip this function
    return value


def __dir__() -> list[str]:
    return sorted(set(globals()) | set(__all__))

"""The explicit lists of kinds, in the order they appear everywhere (values.txt, data, pages).

KIND_PLACES: the kinds whose values are numbers (coupling symbols, recoupling
coefficients), each line a key, the module that defines its record and the
record's name there.  A module is imported when one of its kinds is first
asked for (:func:`tablegen.kinds.kind`), so a one-value lookup loads the one
kind module it needs, not all of them; :data:`tablegen.kinds.KINDS` loads all.
A test checks that every record's own key is the key written here.
TABULATED_FUNCTIONS (:func:`tabulated_functions`): the function-valued kinds
the site tabulates (d^j(beta), its values at fixed angles, Y_l^m), after them.
"""

from __future__ import annotations

#: (key, module in tablegen.kinds, name of the Kind record in that module)
KIND_PLACES: tuple[tuple[str, str, str], ...] = (
    ("cg", "threej", "CG"),
    ("3j", "threej", "THREEJ"),
    ("6j", "sixj", "SIXJ"),
    ("w", "sixj", "RACAH_W"),
    ("9j", "ninej", "NINEJ"),
    ("recouple3", "recoupling", "RECOUPLE3"),
    ("recouple4", "recoupling", "RECOUPLE4"),
    ("lsjj", "lsjj", "LSJJ"),
    ("state3", "states", "STATE3"),
    ("state4", "states", "STATE4"),
)


def tabulated_functions() -> tuple:
    """The function-valued kinds shown by the site (rotation and harmonics families), after the numbers.

    A function, not a constant: importing them is left to the first caller (see kinds._all_kinds).
    """
    from .tabulated_functions import TABULATED_FUNCTIONS

    return TABULATED_FUNCTIONS

"""Families of tables: one record per recipe section (cg, 3j, 6j, 9j), in one explicit list.

A :class:`Family` says what the site shows for one recipe section: the kinds
it tabulates (by :mod:`tablegen.kinds` key), companions shown beside a value
(Racah W beside each 6j, replacing the special-cased ``Entry.w_form``), its
title, short navigation label, layout, data columns, convention line and the
folder its pages go to.  Layouts are records too: :class:`GridLayout` (CG, 3j),
:class:`ClassesLayout` (6j, 9j symmetry classes) and :class:`MatrixLayout`
(rows and columns labelled by quantum numbers, for later recoupling tables).

Stage 1 of issue 6: the records exist and are tested against the behaviour
of today's plan and renderers; plan.py and the renderers do not read them yet.
Nothing registers itself on import: :data:`FAMILIES` is the registry.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Callable

__all__ = [
    "Companion",
    "GridLayout",
    "ClassesLayout",
    "MatrixLayout",
    "Family",
    "FAMILIES",
    "FAMILY_KEYS",
    "family",
    "sixj_to_w",
]


def sixj_to_w(t: tuple[int, ...]) -> tuple[tuple[int, ...], int]:
    """Doubled 6j {a b e; d c f} -> (doubled W(a b c d; e f), sign) with W = sign * 6j.

    W(a b c d; e f) = (-1)^(a+b+c+d) {a b e; d c f} (Racah 1942; Edmonds 1957, eq. 6.2.6).
    """
    a, b, e, d, c, f = t
    return (a, b, c, d, e, f), -1 if ((a + b + c + d) // 2) & 1 else 1


@dataclass(frozen=True, slots=True)
class Companion:
    """Another kind shown beside each value: its key and key -> (its doubled arguments, sign)."""

    kind: str
    mapping: Callable[[tuple[int, ...]], tuple[tuple[int, ...], int]]


@dataclass(frozen=True, slots=True)
class GridLayout:
    """A coupling j1 x j2 per page, a section per third j, grid rows by the third projection, columns m1."""

    name = "grid"
    third: str  # "J" or "j3"
    row: str  # "M" or "m3"
    row_tag: str  # prefix of row anchors: "ket" or "row"
    twin: str  # the family holding the same numbers in the other convention


@dataclass(frozen=True, slots=True)
class ClassesLayout:
    """Symmetry classes, one page per largest j of the canonical form."""

    name = "classes"
    class_size: int  # forms a generic class holds (144 for 6j, 72 for 9j)


@dataclass(frozen=True, slots=True)
class MatrixLayout:
    """Rows and columns labelled by quantum numbers, each cell one value (recoupling tables)."""

    name = "matrix"
    row_label: str
    column_label: str


Layout = GridLayout | ClassesLayout | MatrixLayout


@dataclass(frozen=True, slots=True)
class Family:
    """One recipe section and everything the site needs to show it."""

    key: str  # recipe key, folder of its pages, prefix of its table ids
    kind: str  # the kind of value tabulated (a tablegen.kinds key)
    title: str
    nav_label: str
    layout: Layout
    convention: str
    extra_columns: tuple[str, ...] = ()  # data columns after arguments, exact, square, decimal
    companions: tuple[Companion, ...] = ()

    @property
    def kinds(self) -> tuple[str, ...]:
        """Every kind of value the family's pages show (the main one first)."""
        return (self.kind,) + tuple(c.kind for c in self.companions)


FAMILIES: tuple[Family, ...] = (
    Family(
        key="cg",
        kind="cg",
        title="Clebsch–Gordan coefficients",
        nav_label="CG",
        layout=GridLayout(third="J", row="M", row_tag="ket", twin="3j"),
        convention="Condon–Shortley phase. ⟨j1 m1; j2 m2 | J M⟩ = (−1)^(j1−j2+M) √(2J+1) (j1 j2 J; m1 m2 −M). "
        "Coupling order j1 ⊗ j2; the reversed order differs by (−1)^(j1+j2−J).",
    ),
    Family(
        key="3j",
        kind="3j",
        title="Wigner 3j symbols",
        nav_label="3j",
        layout=GridLayout(third="j3", row="m3", row_tag="row", twin="cg"),
        convention="Condon–Shortley phase. (j1 j2 j3; m1 m2 m3) = (−1)^(j1−j2−m3) ⟨j1 m1; j2 m2 | j3 −m3⟩ / √(2j3+1).",
    ),
    Family(
        key="6j",
        kind="6j",
        title="Wigner 6j symbols and Racah W",
        nav_label="6j & W",
        layout=ClassesLayout(class_size=144),
        convention="Condon–Shortley phase. W(a b c d; e f) = (−1)^(a+b+c+d) {a b e; d c f}. "
        "All forms of a class (tetrahedral and Regge symmetries) are equal.",
        extra_columns=("forms", "w", "w_sign"),
        companions=(Companion("w", sixj_to_w),),
    ),
    Family(
        key="9j",
        kind="9j",
        title="Wigner 9j symbols",
        nav_label="9j",
        layout=ClassesLayout(class_size=72),
        convention="Rows in the order written, {j1 j2 j12; j3 j4 j34; j13 j24 J}. An odd permutation of rows or "
        "columns multiplies it by (−1)^(sum of all nine j); transposing leaves it unchanged.",
        extra_columns=("forms",),
    ),
)

FAMILY_KEYS = tuple(f.key for f in FAMILIES)
_BY_KEY = {f.key: f for f in FAMILIES}


def family(key: str) -> Family:
    """The Family named ``key``, or ValueError naming the argument and the choices."""
    try:
        return _BY_KEY[key]
    except (KeyError, TypeError):
        raise ValueError(f"argument family = {key!r}: must be one of {', '.join(FAMILY_KEYS)}") from None

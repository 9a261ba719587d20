"""Families of tables: one record per recipe section, in one explicit list.

A :class:`Family` says what the site shows for one recipe section: the kind
of value it tabulates (a :mod:`tablegen.kinds` key), companions shown beside
each value (Racah W beside each 6j), its title and navigation label, its
layout record (:mod:`tablegen.layouts`: grid, classes or matrix), and its
convention line.  Its data columns and the names the jump box needs follow
from those.  plan.py, compute.py and the renderers loop over these records;
per-family prose lives in templates/html/prose/<key>.html.

Nothing registers itself on import: :data:`FAMILIES` is the registry.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from functools import cached_property, partial
from typing import Callable

from .kinds import Kind, kind
from .kinds.sixj import w_of_sixj
from .layouts import ClassesLayout, Exchange, GridLayout, Layout, MatrixBlock, MatrixLayout
from .symmetry import ninej_members, sixj_tetrahedral_members

__all__ = ["Companion", "Alongside", "Family", "FAMILIES", "FAMILY_KEYS", "family", "named_symbol", "GridLayout",
           "ClassesLayout", "MatrixLayout"]

#: Columns of every data row after the arguments: the exact text, then the value
#: sign*sqrt(p/q) as its three integers (p/q reduced; zero is 0, 0, 1), then the decimal.
VALUE_COLUMNS = ("exact", "sign", "p", "q", "decimal")


@dataclass(frozen=True, slots=True)
class Companion:
    """Another kind shown beside each value: its key, a label, and key -> (its doubled arguments, sign).

    value(companion at the mapped arguments) = sign * value(the family's value).
    """

    kind: str
    label: str
    mapping: Callable[[tuple[int, ...]], tuple[tuple[int, ...], int]] = field(repr=False)  # no addresses in reprs


@dataclass(frozen=True, slots=True)
class Alongside:
    """Another kind tabulated at the same arguments as the family's own, shown in full (exact, sign, p, q,
    decimal) in a matrix of its own under each of the family's: d^j(beta) at beta = pi/2 under d^j(beta)."""

    kind: str
    label: str  # what distinguishes it, as the page prints it: "β = π/2"
    tex_label: str  # the same in LaTeX: "\\beta = \\pi/2"


@dataclass(frozen=True)
class Family:
    """One recipe section and everything the site needs to show it."""

    key: str  # recipe key, folder of its pages, prefix of its table ids
    kind: str  # the kind of value tabulated (a tablegen.kinds key)
    title: str
    nav_label: str
    layout: Layout
    convention: str
    companions: tuple[Companion, ...] = ()
    alongside: tuple[Alongside, ...] = ()
    range_name: str = "j"  # the recipe's range keys: max_<range_name>, min_<range_name>
    range_step: int = 1  # doubled step of the range: 1 allows half-integers, 2 whole numbers only
    convention_text: str = ""  # a section of the conventions page and sheets (templates/text/<name>.md), if any
    # bytes on disk per value for the range's largest doubled j, where the layout's rate (diskweight) is far off:
    # a function's text grows with j
    bytes_per_value: "Callable[[int], int] | None" = field(default=None, repr=False)

    @cached_property
    def kind_record(self) -> Kind:
        return kind(self.kind)

    @property
    def kinds(self) -> tuple[str, ...]:
        """Every kind of value the family's pages show (the main one first)."""
        return (self.kind,) + tuple(c.kind for c in self.companions) + tuple(a.kind for a in self.alongside)

    @property
    def data_columns(self) -> tuple[str, ...]:
        """Header of its CSV files: arguments, value forms, then layout and companion columns."""
        extra = ("forms",) if self.layout.name == "classes" else ()
        for c in self.companions:
            extra += (c.kind, f"{c.kind}_sign")
        for a in self.alongside:  # the kind's own value columns, prefixed: d(pi/2), d(pi/2)_sign, ...
            extra += tuple(a.kind if column == "exact" else f"{a.kind}_{column}" for column in VALUE_COLUMNS)
        return self.kind_record.arguments + VALUE_COLUMNS + extra

    @property
    def heading(self) -> str:
        """Title with the symbol written in argument names: 'Wigner 3j symbols (j1 j2 j3; m1 m2 m3)'."""
        return f"{self.title} {named_symbol(self.kind_record)}"


def named_symbol(k: Kind, values: "tuple[str, ...] | None" = None) -> str:
    """A symbol written with text in place of numbers (argument names by default): '⟨j1 m1; j2 m2 | J M⟩'."""
    v = values or k.arguments
    n = k.notation
    parts = [" ".join(v[i] for i in g) for g in n.groups]
    if n.style == "braket":
        return f"⟨{'; '.join(parts[:-1])} | {parts[-1]}⟩"
    if n.style == "function":
        return f"{n.name}({'; '.join(parts)})"
    return f"{n.brackets[0]}{'; '.join(parts)}{n.brackets[1]}"


# -- recoupling families (issue 10): matrices between two coupling trees, cells linked to their symbol ---------
from .kinds.lsjj import ninej_of_lsjj  # noqa: E402
from .kinds.recoupling import ninej_of_recouple4, sixj_of_recouple3  # noqa: E402
from .kinds.states import TREE3, TREE4  # noqa: E402
from .recoupling import tables as _rt  # noqa: E402
from .recoupling.tables import recouple3_blocks, recouple3_count, recouple4_blocks, recouple4_count  # noqa: E402

_LSJJ_CONVENTION = (
    "⟨(l1 s1)j1, (l2 s2)j2; J | (l1 l2)L, (s1 s2)S; J⟩ = √((2j1+1)(2j2+1)(2L+1)(2S+1)) "
    "{l1 1/2 j1; l2 1/2 j2; L S J}, s1 = s2 = 1/2. Each particle is coupled in the order (l s)j; the order "
    "(s l)j multiplies row (j1, j2) by (−1)^(l1+l2+1−j1−j2). Rows (j1, j2), columns the terms ^(2S+1)L_J."
)

# the pages file l1 <= l2; exchanging the two particles (l1 <-> l2, j1 <-> j2) in both couplings costs
# (-1)^(j1+j2-J) on the jj side and (-1)^(l1+l2-L) (-1)^(1-S) on the LS side (common practice, no source)
_LSJJ_EXCHANGE = Exchange(when=("l1", "l2"), pairs=(("l1", "l2"), ("j1", "j2")),
                          phase=("l1", "l2", "j1", "j2", "L", "S", "J"), constant=1)

RECOUPLING_FAMILIES: tuple[Family, ...] = (
    Family(
        key="recouple3",
        kind="recouple3",
        title="Recoupling of three angular momenta",
        nav_label="Recoupling 3",
        layout=MatrixLayout(block=("j1", "j2", "j3", "J"), row="j12", column="j23", blocks=recouple3_blocks,
                            count=recouple3_count, source="6j", source_key=sixj_of_recouple3,
                            ranged=("j1", "j2", "j3")),
        convention="⟨(j1 j2)j12, j3; J | j1, (j2 j3)j23; J⟩ = (−1)^(j1+j2+j3+J) √((2j12+1)(2j23+1)) "
        "{j1 j2 j12; j3 J j23}, Condon–Shortley phase; rows j12 (coupled first), columns j23. "
        "Real and orthogonal: the inverse matrix is the transpose.",
        convention_text="recoupling",
    ),
    Family(
        key="recouple4",
        kind="recouple4",
        title="Recoupling of four angular momenta",
        nav_label="Recoupling 4",
        layout=MatrixLayout(block=("j1", "j2", "j3", "j4", "J"), row=("j12", "j34"), column=("j13", "j24"),
                            blocks=recouple4_blocks, count=recouple4_count, source="9j",
                            source_key=ninej_of_recouple4, ranged=("j1", "j2", "j3", "j4")),
        convention="⟨(j1 j2)j12, (j3 j4)j34; J | (j1 j3)j13, (j2 j4)j24; J⟩ = "
        "√((2j12+1)(2j34+1)(2j13+1)(2j24+1)) {j1 j2 j12; j3 j4 j34; j13 j24 J}, Condon–Shortley phase; "
        "rows (j12, j34), columns (j13, j24). Real and orthogonal: the inverse matrix is the transpose.",
        convention_text="recoupling",
    ),
    Family(
        key="lsjj",
        kind="lsjj",
        title="LS–jj transformation of two particles",
        nav_label="LS–jj",
        layout=MatrixLayout(block=("shells", "l1", "l2", "J"), row=("j1", "j2"), column=("L", "S"),
                            blocks=_rt.lsjj_blocks, count=_rt.lsjj_count, source="9j", source_key=ninej_of_lsjj,
                            page_params=3, page_name=_rt.configuration, ranged=("l1", "l2"),
                            exchange=_LSJJ_EXCHANGE),
        convention=_LSJJ_CONVENTION + " Two shells (shells = 2: sp, pd, pp′ …): every term. Equivalent particles "
        "(shells = 1: p², d² …): only the Pauli-allowed terms (L + S even) and pairs (j1 ≤ j2, J even when "
        "j1 = j2); the jj state for j1 < j2 is the antisymmetric normalised [|j1 j2; J⟩ − (−1)^(j1+j2−J) "
        "|j2 j1; J⟩]/√2, so its row is √2 times the 9j expression.",
        convention_text="recoupling",
    ),
    Family(
        key="state3",
        kind="state3",
        title="Coupled states of three angular momenta",
        nav_label="States of 3",
        layout=MatrixLayout(block=("j1", "j2", "j3", "M"), row=("j12", "J"), column=("m1", "m2", "m3"),
                            blocks=partial(_rt.states_blocks, TREE3), count=partial(_rt.states_count, TREE3),
                            page_params=3, row_ket=partial(_rt.coupled_ket, TREE3),
                            column_ket=partial(_rt.product_ket, TREE3), ranged=("j1", "j2", "j3")),
        convention="Tree ((j1 j2)j12 j3)J, Condon–Shortley phase: ⟨j1 m1; j2 m2; j3 m3 | (j1 j2)j12, j3; J M⟩ = "
        "⟨j1 m1; j2 m2 | j12 m1+m2⟩ ⟨j12 m1+m2; j3 m3 | J M⟩. Coupled states are written |(j1 j2)j12, j3; J, M⟩, "
        "product states |j1, m1⟩|j2, m2⟩|j3, m3⟩. Rows: coupled states in product states; columns: product "
        "states in coupled states (the matrix is real and orthogonal, its inverse the transpose).",
        convention_text="recoupling",
    ),
    Family(
        key="state4",
        kind="state4",
        title="Coupled states of four angular momenta",
        nav_label="States of 4",
        layout=MatrixLayout(block=("j1", "j2", "j3", "j4", "M"), row=("j12", "j34", "J"),
                            column=("m1", "m2", "m3", "m4"), blocks=partial(_rt.states_blocks, TREE4),
                            count=partial(_rt.states_count, TREE4), page_params=4,
                            row_ket=partial(_rt.coupled_ket, TREE4), column_ket=partial(_rt.product_ket, TREE4),
                            ranged=("j1", "j2", "j3", "j4")),
        convention="Tree ((j1 j2)j12, (j3 j4)j34)J (two pairs, the rows of the four-leaf recoupling), "
        "Condon–Shortley phase: ⟨j1 m1; j2 m2; j3 m3; j4 m4 | (j1 j2)j12, (j3 j4)j34; J M⟩ = "
        "⟨j1 m1; j2 m2 | j12 m1+m2⟩ ⟨j3 m3; j4 m4 | j34 m3+m4⟩ ⟨j12 m1+m2; j34 m3+m4 | J M⟩. Coupled states are "
        "written |(j1 j2)j12, (j3 j4)j34; J, M⟩, product states |j1, m1⟩|j2, m2⟩|j3, m3⟩|j4, m4⟩. Rows: coupled "
        "states in product states; columns: product states in coupled states (the matrix is real and "
        "orthogonal, its inverse the transpose).",
        convention_text="recoupling",
    ),
)
# -- end of the recoupling families ---------------------------------------------------------------------------

# -- rotation functions and spherical harmonics (issue 9) -----------------------------------------------------
def _rotation_blocks(lo: int, hi: int):
    """One matrix per j in [lo, hi] (halves): rows m' and columns m from j down to -j."""
    for tj in range(lo, hi + 1):
        ms = tuple(range(tj, -tj - 1, -2))
        yield MatrixBlock((("j", tj),), ms, ms, partial(_d_key, tj))


def _d_key(tj: int, tmp: int, tm: int) -> tuple[int, ...]:
    return (tj, tmp, tm)


def _rotation_count(lo: int, hi: int) -> int:
    """Cells of the d^j matrices for 2j in [lo, hi]: (2j+1)^2 each, summed in closed form (sum of squares)."""
    squares = lambda n: n * (n + 1) * (2 * n + 1) // 6  # noqa: E731  1^2 + ... + n^2
    return squares(hi + 1) - squares(lo) if hi >= lo else 0


def _whole(lo: int, hi: int) -> range:
    """The doubled whole numbers l in [lo, hi]."""
    return range(lo + lo % 2, hi + 1, 2)


def _harmonics_blocks(lo: int, hi: int):
    """One matrix on one page: rows m from l_max down to -l_max, columns l (whole numbers in [lo, hi])."""
    ls = tuple(_whole(lo, hi))
    top = ls[-1] if ls else 0
    yield MatrixBlock((), tuple(range(top, -top - 1, -2)), ls, _y_key)


def _y_key(tm: int, tl: int) -> "tuple[int, ...] | None":
    return (tl, tm) if abs(tm) <= tl else None


def _harmonics_count(lo: int, hi: int) -> int:
    """Cells of the harmonics matrix: 2l+1 for each whole l in [lo, hi], in closed form ((l+1)^2 up to l)."""
    below = (lo + lo % 2) // 2  # the smallest whole l in range
    top = hi // 2
    return (top + 1) ** 2 - below**2 if top >= below else 0


_ROTATION_CONVENTION = (
    "Active rotation, Condon–Shortley phase: d^j_{m′m}(β) = ⟨j m′| exp(−iβJ_y) |j m⟩, row m′ (bra), column m (ket); "
    "D^j_{m′m}(α, β, γ) = e^{−im′α} d^j_{m′m}(β) e^{−imγ}. Passive rotation: D^j_{m′m}(−γ, −β, −α) = "
    "conj(D^j_{mm′}(α, β, γ)); conjugate tables: conj(D^j_{m′m}) = (−1)^{m′−m} D^j_{−m′,−m}; "
    "e^{+iβJ_y} instead: d^j_{m′m}(−β) = d^j_{mm′}(β)."
)
_HARMONICS_CONVENTION = (
    "Condon–Shortley phase, with the (−1)^m in Y: Y_l^m(θ, φ) = (−1)^m √((2l+1)/(4π)·(l−m)!/(l+m)!) "
    "P_l^m(cos θ) e^{imφ} for m ≥ 0 with P_l^m(x) = (1−x²)^{m/2} d^m P_l/dx^m (no (−1)^m in P), "
    "Y_l^{−m} = (−1)^m conj(Y_l^m); Y_l^m(θ, φ) = √((2l+1)/(4π)) conj(D^l_{m0}(φ, θ, 0))."
)

FUNCTION_FAMILIES: tuple[Family, ...] = (
    Family(
        key="rotation",
        kind="d",
        title="Wigner rotation functions",
        nav_label="d(β)",
        layout=MatrixLayout(block=("j",), row="mp", column="m", blocks=_rotation_blocks, count=_rotation_count,
                            count_closed=True, count_noun="functions", tex_list=True),
        convention=_ROTATION_CONVENTION,
        bytes_per_value=lambda tj: 600 + 90 * tj,  # measured: 2.4 kB per function at j <= 10, 4.2 kB at j <= 20
        alongside=(Alongside("d(pi/2)", "β = π/2", "\\beta = \\pi/2"),
                   Alongside("d(pi/3)", "β = π/3", "\\beta = \\pi/3")),
        convention_text="rotations",
    ),
    Family(
        key="harmonics",
        kind="Y",
        title="Spherical harmonics",
        nav_label="Y(θ, φ)",
        layout=MatrixLayout(block=(), row="m", column="l", blocks=_harmonics_blocks, count=_harmonics_count,
                            count_closed=True, count_noun="functions", tex_list=True, ranged=("l",)),
        convention=_HARMONICS_CONVENTION,
        bytes_per_value=lambda tl: 600 + 40 * tl,  # measured: 3.0 kB per function at l <= 30
        range_name="l",
        range_step=2,
        convention_text="rotations",
    ),
)
# -- end of rotation functions and spherical harmonics -------------------------------------------------------

FAMILIES: tuple[Family, ...] = (
    Family(
        key="cg",
        kind="cg",
        title="Clebsch–Gordan coefficients",
        nav_label="CG",
        layout=GridLayout(
            third="J", row="M", row_tag="ket", m_sum_sign=1, twin="3j", row_states=True,
            page_title="⟨{j1} m1; {j2} m2 | J M⟩: every J from j1 = {j1} and j2 = {j2}", page_label="j1 = {j1}, j2 = {j2}",
        ),
        convention="Condon–Shortley phase. ⟨j1 m1; j2 m2 | J M⟩ = (−1)^(j1−j2+M) √(2J+1) (j1 j2 J; m1 m2 −M). "
        "Coupling order j1 ⊗ j2; the reversed order differs by (−1)^(j1+j2−J).",
    ),
    Family(
        key="3j",
        kind="3j",
        title="Wigner 3j symbols",
        nav_label="3j",
        layout=GridLayout(
            third="j3", row="m3", row_tag="row", m_sum_sign=-1, twin="cg",
            page_title="3j symbols ({j1} {j2} j3; m1 m2 m3)", page_label="3j {j1}, {j2}",
        ),
        convention="Condon–Shortley phase. (j1 j2 j3; m1 m2 m3) = (−1)^(j1−j2−m3) ⟨j1 m1; j2 m2 | j3 −m3⟩ / √(2j3+1).",
    ),
    Family(
        key="6j",
        kind="6j",
        title="Wigner 6j symbols and Racah W",
        nav_label="6j & W",
        layout=ClassesLayout(class_size=24, filed_by=sixj_tetrahedral_members, has_partners=True),
        convention="No phase choice of its own: once the Clebsch–Gordan phase is fixed, the recoupling of three "
        "angular momenta fixes the 6j, sign included. W(a b c d; e f) = (−1)^(a+b+c+d) {a b e; d c f} "
        "fixes the sign of W. All forms of a class (tetrahedral and Regge symmetries) are equal.",
        companions=(Companion("w", "Racah W", w_of_sixj),),
    ),
    Family(
        key="9j",
        kind="9j",
        title="Wigner 9j symbols",
        nav_label="9j",
        layout=ClassesLayout(class_size=72, filed_by=ninej_members),
        convention="No phase choice of its own: the recoupling of four angular momenta fixes it, sign included. "
        "Rows in the order written, {j1 j2 j12; j3 j4 j34; j13 j24 J}. An odd permutation of rows or "
        "columns multiplies it by (−1)^(sum of all nine j); transposing leaves it unchanged.",
    ),
) + RECOUPLING_FAMILIES + FUNCTION_FAMILIES

FAMILY_KEYS = tuple(f.key for f in FAMILIES)
_BY_KEY = {f.key: f for f in FAMILIES}


def family(key: str) -> Family:
    """The Family named ``key``, or ValueError naming the argument and the choices."""
    try:
        return _BY_KEY[key]
    except (KeyError, TypeError):
        raise ValueError(f"argument family = {key!r}: must be one of {', '.join(FAMILY_KEYS)}") from None

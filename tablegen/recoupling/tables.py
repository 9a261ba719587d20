"""Which recoupling matrices a site shows: the blocks of the recoupling families, and their exact sizes.

Pure combinatorics on doubled ints (the triad rule), no values: the matrix
layout (tablegen.layouts.matrix) turns the blocks into pages, the recipe's
size guard uses the counts.  A block holds every allowed intermediate of
both trees, so each matrix is square and orthogonal.
"""

from __future__ import annotations

from typing import Iterator

from ..layouts import MatrixBlock
from ..triads import is_triad

__all__ = ["recouple3_blocks", "recouple3_count", "recouple4_blocks", "recouple4_count",
           "lsjj_blocks", "lsjj_count", "configuration",
           "states_blocks", "states_count", "coupled_ket", "product_ket"]


def _between(ta: int, tb: int) -> range:
    """Doubled values coupling ta and tb can reach."""
    return range(abs(ta - tb), ta + tb + 1, 2)


def _recouple3_shapes(lo: int, hi: int) -> Iterator[tuple[int, int, int, int, tuple[int, ...], tuple[int, ...]]]:
    js = range(lo, hi + 1)
    for j1 in js:
        for j2 in js:
            for j3 in js:
                totals = sorted({tJ for t12 in _between(j1, j2) for tJ in _between(t12, j3)})
                for tJ in totals:
                    rows = tuple(t for t in _between(j1, j2) if is_triad(t, j3, tJ))
                    cols = tuple(t for t in _between(j2, j3) if is_triad(j1, t, tJ))
                    yield j1, j2, j3, tJ, rows, cols


def recouple3_blocks(lo: int, hi: int) -> Iterator[MatrixBlock]:
    """A block per (j1, j2, j3, J) with leaves in [lo, hi] (doubled): rows j12, columns j23."""
    for j1, j2, j3, tJ, rows, cols in _recouple3_shapes(lo, hi):
        yield MatrixBlock((("j1", j1), ("j2", j2), ("j3", j3), ("J", tJ)), rows, cols,
                          lambda t12, t23, a=(j1, j2, j3, tJ): a + (t12, t23))


def recouple3_count(lo: int, hi: int) -> int:
    """Exact number of cells of recouple3_blocks(lo, hi)."""
    return sum(len(rows) * len(cols) for *_, rows, cols in _recouple3_shapes(lo, hi))


def _recouple4_shapes(lo: int, hi: int):
    js = range(lo, hi + 1)
    for j1 in js:
        for j2 in js:
            for j3 in js:
                for j4 in js:
                    pairs12 = [(a, b) for a in _between(j1, j2) for b in _between(j3, j4)]
                    pairs13 = [(a, b) for a in _between(j1, j3) for b in _between(j2, j4)]
                    totals = sorted({tJ for a, b in pairs12 for tJ in _between(a, b)})
                    for tJ in totals:
                        rows = tuple(p for p in pairs12 if is_triad(p[0], p[1], tJ))
                        cols = tuple(p for p in pairs13 if is_triad(p[0], p[1], tJ))
                        yield j1, j2, j3, j4, tJ, rows, cols


def recouple4_blocks(lo: int, hi: int) -> Iterator[MatrixBlock]:
    """A block per (j1, j2, j3, j4, J) with leaves in [lo, hi] (doubled): rows (j12, j34), columns (j13, j24)."""
    for j1, j2, j3, j4, tJ, rows, cols in _recouple4_shapes(lo, hi):
        yield MatrixBlock((("j1", j1), ("j2", j2), ("j3", j3), ("j4", j4), ("J", tJ)), rows, cols,
                          lambda r, c, a=(j1, j2, j3, j4, tJ): a + r + c)


def recouple4_count(lo: int, hi: int) -> int:
    """Exact number of cells of recouple4_blocks(lo, hi), without listing them (the size guard asks first).

    A block's rows are the pairs (j12, j34) coupling to J and its columns the pairs (j13, j24): the cells
    are the sum over J of the two pair counts multiplied, and a pair count depends only on the two pairs
    of leaves, whatever their order."""
    cache: dict = {}

    def pairs(a: int, b: int, c: int, d: int) -> dict[int, int]:
        """{2J: number of (x, y), x from a and b, y from c and d, coupling to J}."""
        key = tuple(sorted((tuple(sorted((a, b))), tuple(sorted((c, d))))))
        if key not in cache:
            out: dict[int, int] = {}
            for x in _between(a, b):
                for y in _between(c, d):
                    for tJ in _between(x, y):
                        out[tJ] = out.get(tJ, 0) + 1
            cache[key] = out
        return cache[key]

    js = range(lo, hi + 1)
    total = 0
    for j1 in js:
        for j2 in js:
            for j3 in js:
                for j4 in js:
                    rows, cols = pairs(j1, j2, j3, j4), pairs(j1, j3, j2, j4)
                    total += sum(n * cols.get(tJ, 0) for tJ, n in rows.items())
    return total


# -- two-particle LS <-> jj: a page per configuration (shells, l1, l2), a block per J -----------------------
def _lsjj_shapes(lo: int, hi: int):
    """(shells, l1, l2, J, rows, columns): equivalent l^2 (shells 1) after the two-shell l l' (shells 2)."""
    from .lsjj import lsjj_labels

    ls = [t // 2 for t in range(lo, hi + 1) if t % 2 == 0]  # whole l in the range
    for l1 in ls:
        for l2 in ls:
            for shells in ((2, 1) if l1 == l2 else (2,) if l2 > l1 else ()):
                for J in range(0, l1 + l2 + 2):
                    rows, cols = lsjj_labels(l1, l2, J, shells == 1)
                    if rows:
                        yield shells, l1, l2, J, tuple(rows), tuple((2 * L, S2) for L, S2 in cols)


def lsjj_blocks(lo: int, hi: int) -> Iterator[MatrixBlock]:
    """l1 <= l2 with whole l in [lo, hi] (doubled), each l^2 also as equivalent particles: rows (j1, j2),
    columns (L, S) labelled by their term symbols."""
    from .lsjj import term_symbol

    for shells, l1, l2, J, rows, cols in _lsjj_shapes(lo, hi):
        tex = tuple(term_symbol(tL // 2, tS, J, latex=True) for tL, tS in cols)
        head = (2 * shells, 2 * l1, 2 * l2)
        yield MatrixBlock((("shells", 2 * shells), ("l1", 2 * l1), ("l2", 2 * l2), ("J", 2 * J)), rows, cols,
                          lambda r, c, a=head, tJ=2 * J: a + r + (tJ,) + c, column_tex=tex)


def lsjj_count(lo: int, hi: int) -> int:
    """Exact number of cells of lsjj_blocks(lo, hi)."""
    return sum(len(r) * len(c) for *_, r, c in _lsjj_shapes(lo, hi))


def configuration(params: tuple[tuple[str, int], ...]) -> str:
    """'pd', 'pp′' (two shells) or 'p²' (one shell) for page parameters shells, l1, l2."""
    from .lsjj import ORBITAL_LETTERS

    shells, l1, l2 = (v // 2 for _, v in params[:3])
    a, b = (ORBITAL_LETTERS[l].lower() if l < len(ORBITAL_LETTERS) else f"[l={l}]" for l in (l1, l2))
    if shells == 1:
        return f"{a}²"
    return f"{a}{b}′" if l1 == l2 else f"{a}{b}"


# -- coupled states in product states, one tree per family (kinds/states.py: TREE3, TREE4) --------------------
def _inner_values(tree, js: tuple[int, ...]) -> Iterator[tuple[int, ...]]:
    """Every allowed (intermediates..., J) of ``tree`` over doubled leaves ``js``, in order."""

    def walk(at: int, values: list[int]):
        if at == len(tree.nodes):
            yield tuple(values[tree.leaves:])
            return
        left, right, _ = tree.nodes[at]
        for t in _between(values[left], values[right]):
            yield from walk(at + 1, values + [t])

    yield from walk(0, list(js))


def _products(js: tuple[int, ...], tM: int) -> Iterator[tuple[int, ...]]:
    """Every (m1, ..., mn) with |mi| <= ji summing to M, from the largest m1 down."""
    if len(js) == 1:
        if abs(tM) <= js[0] and (js[0] - tM) % 2 == 0:
            yield (tM,)
        return
    for m in range(js[0], -js[0] - 1, -2):
        for rest in _products(js[1:], tM - m):
            yield (m,) + rest


def _states_shapes(tree, lo: int, hi: int):
    js_range = range(lo, hi + 1)

    def leaves(n):
        return [()] if n == 0 else [(j,) + rest for j in js_range for rest in leaves(n - 1)]

    for js in leaves(tree.leaves):
        inner = tuple(_inner_values(tree, js))
        top = sum(js)
        for tM in range(top, -top - 1, -2):
            rows = tuple(r for r in inner if r[-1] >= abs(tM))
            yield js, tM, rows, tuple(_products(js, tM))


def states_blocks(tree, lo: int, hi: int) -> Iterator[MatrixBlock]:
    """A block per (j1, ..., jn, M), leaves in [lo, hi] (doubled): rows the coupled states (intermediates, J),
    columns the product states (m1, ..., mn) with m1 + ... + mn = M."""
    names = tuple(f"j{i + 1}" for i in range(tree.leaves)) + ("M",)
    for js, tM, rows, cols in _states_shapes(tree, lo, hi):
        yield MatrixBlock(tuple(zip(names, js + (tM,))), rows, cols, lambda r, c, a=js, tM=tM: a + r + (tM,) + c)


def states_count(tree, lo: int, hi: int) -> int:
    """Exact number of cells of states_blocks(tree, lo, hi), without listing them (the size guard asks first).

    Each block is square: for leaves js and projection M there are as many coupled states as product states
    with m1 + ... + mn = M, n_M; so the cells are the sum over leaf sets of the sum over M of n_M squared,
    and n_M, which depends only on the multiset of leaves, comes from multiplying the leaves' m-polynomials.
    """
    from collections import Counter
    from itertools import combinations_with_replacement
    from math import factorial

    total = 0
    for js in combinations_with_replacement(range(lo, hi + 1), tree.leaves):
        counts = {0: 1}
        for j in js:
            step: dict[int, int] = {}
            for m, n in counts.items():
                for tm in range(-j, j + 1, 2):
                    step[m + tm] = step.get(m + tm, 0) + n
            counts = step
        orders = factorial(tree.leaves)  # the leaf sets with this multiset of leaves
        for n in Counter(js).values():
            orders //= factorial(n)
        total += orders * sum(n * n for n in counts.values())
    return total


def _tex(t: int) -> str:
    """A quantum number inside a ket, in LaTeX: 1/2 slashed (kets of many spins stay one line high and short)."""
    from ..spins import half_text

    return half_text(t)


def coupled_ket(tree, params: tuple[tuple[str, int], ...], row: tuple[int, ...]) -> tuple[str, str]:
    """(text, LaTeX) of the coupled ket of ``tree``: |(j1 j2)j12, j3; J, M>, |(j1 j2)j12, (j3 j4)j34; J, M>.

    Inside a part the two coupled values are separated by a space, the root's two parts by a comma, and the
    total J and M follow a semicolon, so a coupled ket never reads as a product of |j, m> kets."""
    from ..spins import half_text as h

    p = dict(params)
    js = [p[f"j{i + 1}"] for i in range(tree.leaves)] + list(row)

    def part(at: int, form):
        if at < tree.leaves:
            return form(js[at])
        left, right, _ = next(n for n in tree.nodes if n[2] == at)
        sep = " " if form is h else "\\,"
        return f"({part(left, form)}{sep}{part(right, form)}){form(js[at])}"

    left, right, root = tree.nodes[-1]
    text = f"|{part(left, h)}, {part(right, h)}; {h(js[root])}, {h(p['M'])}⟩"
    tex = (f"\\vert {part(left, _tex)},\\,{part(right, _tex)};\\,"
           f"{_tex(js[root])},\\,{_tex(p['M'])}\\rangle")
    return text, tex


def product_ket(tree, params: tuple[tuple[str, int], ...], column: tuple[int, ...]) -> tuple[str, str]:
    """(text, LaTeX) of the product ket |j1, m1>|j2, m2>...|jn, mn>."""
    from ..spins import half_text as h

    p = dict(params)
    pairs = tuple(zip((p[f"j{i + 1}"] for i in range(tree.leaves)), column))
    text = "".join(f"|{h(j)}, {h(m)}⟩" for j, m in pairs)
    tex = "".join(f"\\vert {_tex(j)},\\,{_tex(m)}\\rangle" for j, m in pairs)
    return text, tex

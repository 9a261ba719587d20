"""The matrix layout: one matrix per block of parameters, rows and columns labelled by quantum numbers.

Made for the tables that are matrices by nature: a recoupling matrix
<(j1 j2) j12, j3; J | j1, (j2 j3) j23; J> for fixed (j1, j2, j3, J), rows j12
and columns j23; a rotation matrix d^j(beta) for fixed j (and angle), rows m'
and columns m.  The family supplies ``blocks``: for a range of j, the blocks
in order, each with its parameters, its row and column labels and the key of
each cell (None where no value exists).  Blocks that share their first
parameter go onto one page; a layout with no block parameters (``block=()``)
puts its one matrix on one page, ``{key}/all.html``, with cell anchors
``row=..,column=..`` (the harmonics: rows m, columns l).  The names of the block parameters, of the row
and of the column are argument names of the family's kind, so that a value's
page and anchor follow from its arguments alone (the jump box relies on it).
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import TYPE_CHECKING, Callable, Iterable

from ..sitemodel import Entry, Link, Page, Section, Table, chain, half, half_for_file_name, table_files

if TYPE_CHECKING:  # pragma: no cover
    from ..families import Family
    from ..recipe import FamilyRange

__all__ = ["MatrixLayout", "MatrixBlock", "Exchange"]


@dataclass(frozen=True, slots=True)
class Exchange:
    """Values the site files under another form: the two particles of an LS-jj coefficient in the other order.

    When argument ``when[0]`` exceeds ``when[1]``, the value equals the one with the arguments of each pair
    in ``pairs`` exchanged, times (-1)^(constant + the sum of the arguments named in ``phase``), and only that
    form has a page.  The jump box reads this record (render/jumpdata.py) to land on the filed form.
    """

    when: tuple[str, str]
    pairs: tuple[tuple[str, str], ...]
    phase: tuple[str, ...]
    constant: int = 0

    def filed(self, names: tuple[str, ...], key: tuple[int, ...]) -> "tuple[tuple[int, ...], int] | None":
        """(the filed key, sign) of doubled ``key`` if it is filed under another form, else None."""
        at = dict(zip(names, key))
        if at[self.when[0]] <= at[self.when[1]]:
            return None
        power = self.constant + sum(at[n] for n in self.phase) // 2
        for a, b in self.pairs:
            at[a], at[b] = at[b], at[a]
        return tuple(at[n] for n in names), -1 if power % 2 else 1


@dataclass(frozen=True, slots=True)
class MatrixBlock:
    """One matrix: doubled parameters, row and column labels (doubled), and the key of a cell.

    A label is one doubled value, or a tuple of them when the layout names several arguments.
    """

    params: tuple[tuple[str, int], ...]
    rows: tuple[int, ...]
    columns: tuple[int, ...]
    key: Callable[[int, int], "tuple[int, ...] | None"] = field(repr=False)
    column_tex: tuple[str, ...] = ()  # a LaTeX label per column (a term symbol) instead of the numbers


@dataclass(frozen=True, slots=True)
class MatrixLayout:
    """Rows and columns labelled by quantum numbers; each cell one value."""

    block: tuple[str, ...]  # kind argument names fixed per matrix ("j1", "j2", "j3", "J")
    row: "str | tuple[str, ...]"  # kind argument(s) labelling the rows ("j12", "mp"; ("j12", "j34"))
    column: "str | tuple[str, ...]"  # kind argument(s) labelling the columns ("j23", "m"; ("j13", "j24"))
    blocks: Callable[[int, int], Iterable[MatrixBlock]] = field(repr=False)  # (min 2j, max 2j) -> blocks in order
    count_noun: str = "values"
    # the family whose value each cell is made of (the 6j of a recoupling coefficient), and the map from a
    # cell's key to that value's key: a cell links to it where that family's layout tabulates it in this build
    count: "Callable[[int, int], int] | None" = field(default=None, repr=False)  # exact cells for (min 2j, max 2j)
    count_closed: bool = False  # ``count`` is a closed form, fast for any range: the size guard never extrapolates it
    source: str = ""
    source_key: "Callable[[tuple[int, ...]], tuple[int, ...]] | None" = field(default=None, repr=False)
    page_params: int = 1  # how many leading block parameters a page is named by
    ranged: tuple[str, ...] = ()  # the block parameters the recipe's range bounds (all of them when empty)
    page_name: "Callable[[tuple[tuple[str, int], ...]], str] | None" = field(default=None, repr=False)  # 'pd'
    # rows and columns that are states: (block params, label) -> (text, LaTeX) of the ket; with both set, the
    # page writes each row out in the column states and each column in the row states (a real orthogonal matrix)
    row_ket: "Callable[[tuple, object], tuple[str, str]] | None" = field(default=None, repr=False)
    column_ket: "Callable[[tuple, object], tuple[str, str]] | None" = field(default=None, repr=False)
    exchange: "Exchange | None" = None  # values filed under another form (l1 > l2 of LS-jj under l1 < l2)
    tex_list: bool = False  # LaTeX lists the values (symbol = value, one a line): functions too wide for a row

    name = "matrix"

    def page_path(self, key: str, *values: int) -> str:
        """'key/j1-1.5.html'; with two page parameters 'key/l1-1_l2-2.html'."""
        if not self.block:
            return f"{key}/all.html"
        return f"{key}/" + "_".join(f"{n}-{half_for_file_name(v)}" for n, v in zip(self.block, values)) + ".html"

    @staticmethod
    def block_anchor(params: tuple[tuple[str, int], ...]) -> str:
        return ",".join(f"{n}={half(v)}" for n, v in params)

    @property
    def row_names(self) -> tuple[str, ...]:
        return (self.row,) if isinstance(self.row, str) else tuple(self.row)

    @property
    def column_names(self) -> tuple[str, ...]:
        return (self.column,) if isinstance(self.column, str) else tuple(self.column)

    @staticmethod
    def label(value: "int | tuple[int, ...]") -> str:
        """A row or column label as text: '3/2', or '(1, 3/2)' for a label of two arguments."""
        return half(value) if isinstance(value, int) else f"({', '.join(half(v) for v in value)})"

    @staticmethod
    def _assign(names: tuple[str, ...], value: "int | tuple[int, ...]") -> str:
        values = (value,) if isinstance(value, int) else value
        return ",".join(f"{n}={half(v)}" for n, v in zip(names, values))

    def anchor(self, block: str, tr: "int | tuple[int, ...]", tc: "int | tuple[int, ...]") -> str:
        cell = f"{self._assign(self.row_names, tr)},{self._assign(self.column_names, tc)}"
        return f"{block};{cell}" if self.block else cell

    def row_anchor(self, block: str, tr: "int | tuple[int, ...]") -> str:
        return f"row:{block};{self._assign(self.row_names, tr)}"

    def page_pattern(self, key: str) -> str:
        """The page path with argument names in braces (the jump box fills them in)."""
        if not self.block:
            return f"{key}/all.html"
        return f"{key}/" + "_".join(f"{n}-{{{n}}}" for n in self.block[: self.page_params]) + ".html"

    def anchor_pattern(self) -> str:
        block = ",".join(f"{n}={{{n}}}" for n in self.block)
        cell = ",".join(f"{n}={{{n}}}" for n in self.row_names + self.column_names)
        return f"{block};{cell}" if self.block else cell

    @property
    def params(self) -> tuple[str, ...]:
        """Block parameters that must lie in the family's range (the jump box checks them)."""
        return self.ranged or self.block

    def locate(self, fam: "Family", f: "FamilyRange", key: tuple[int, ...]) -> "str | None":
        """'page#anchor' of the value with doubled ``key`` if this family's range holds it, else None."""
        k = fam.kind_record
        at = dict(zip(k.arguments, key))
        if not all(f.min_tj <= key[i] <= f.max_tj for i in k.j_positions):
            return None
        pick = lambda names: at[names[0]] if len(names) == 1 else tuple(at[n] for n in names)  # noqa: E731
        anchor = self.anchor(self.block_anchor(tuple((n, at[n]) for n in self.block)), pick(self.row_names),
                             pick(self.column_names))
        return f"{self.page_path(fam.key, *(at[n] for n in self.block[: self.page_params]))}#{anchor}"

    def plan(self, fam: "Family", f: "FamilyRange", lookup: Callable) -> tuple[list[Page], list[Table]]:
        source = lookup(self.source) if self.source else None
        by_page: dict[tuple[str, int], list[MatrixBlock]] = {}
        for block in self.blocks(f.min_tj, f.max_tj):
            if tuple(n for n, _ in block.params) != self.block:
                raise AssertionError(f"plan: a {fam.key} block has parameters {block.params}, not {self.block}")
            by_page.setdefault(block.params[: self.page_params], []).append(block)
        pages, tables = [], []
        for named, blocks in by_page.items():
            sections = []
            for block in blocks:
                anchor = self.block_anchor(block.params) or "all"
                grid, entries = [], []
                for tr in block.rows:
                    line = []
                    for tc in block.columns:
                        key = block.key(tr, tc)
                        if key is None:
                            e = None
                        else:
                            link = source[0].layout.locate(source[0], source[1], self.source_key(key)) if source else None
                            e = Entry(key, self.anchor(anchor, tr, tc), None, 0, fam.kind, link)
                        line.append(e)
                        if e is not None:
                            entries.append(e)
                    grid.append(tuple(line))
                sections.append(Section(
                    title=", ".join(f"{n} = {half(v)}" for n, v in block.params) or fam.title,
                    anchor=anchor,
                    entries=tuple(entries),
                    rows=block.rows,
                    columns=block.columns,
                    grid=tuple(grid),
                    row_anchors=tuple(self.row_anchor(anchor, tr) for tr in block.rows),
                    params=block.params,
                    column_tex=block.column_tex,
                ))
            tid = f"{fam.key}-" + ("_".join(f"{n}-{half_for_file_name(v)}" for n, v in named) or "all")
            words = ", ".join(f"{n} = {half(v)}" for n, v in named)
            if self.page_name:
                words = f"{self.page_name(named)} ({words})"
            title = f"{fam.title} for {words}" if words else fam.title  # no block parameters: the one page
            path = self.page_path(fam.key, *(v for _, v in named))
            tables.append(Table(id=tid, family=fam.key, title=title, page=path, sections=tuple(sections),
                                params=named, kind=fam.kind, **table_files(tid)))
            index = Link(f"all {fam.nav_label} pages", f"index.html#{fam.key}")
            label = f"{fam.nav_label}, {words}" if words else fam.nav_label
            pages.append(Page(path, title, fam.key, (tid,), related=(index,), label=label))
        return chain(pages), tables

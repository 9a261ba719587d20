"""The matrix layout: one matrix per block of parameters, rows and columns labelled by quantum numbers.

Made for the tables that are matrices by nature: a recoupling matrix
<(j1 j2) j12, j3; J | j1, (j2 j3) j23; J> for fixed (j1, j2, j3, J), rows j12
and columns j23; a rotation matrix d^j(beta) for fixed j (and angle), rows m'
and columns m.  The family supplies ``blocks``: for a range of j, the blocks
in order, each with its parameters, its row and column labels and the key of
each cell (None where no value exists).  Blocks that share their first
parameter go onto one page; a layout with no block parameters (``block=()``)
puts its one matrix on one page, ``{key}/all.html``.  The names of the block parameters, of the row
and of the column are argument names of the family's kind, so that a value's
page and anchor follow from its arguments alone (the jump box relies on it).
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import TYPE_CHECKING, Callable, Iterable

from ..sitemodel import Entry, Link, Page, Section, Table, chain, file_code, half, table_files

if TYPE_CHECKING:  # pragma: no cover
    from ..families import Family
    from ..recipe import FamilyRange

__all__ = ["MatrixLayout", "MatrixBlock"]


@dataclass(frozen=True, slots=True)
class MatrixBlock:
    """One matrix: doubled parameters, row and column labels (doubled), and the key of a cell."""

    params: tuple[tuple[str, int], ...]
    rows: tuple[int, ...]
    columns: tuple[int, ...]
    key: Callable[[int, int], "tuple[int, ...] | None"] = field(repr=False)


@dataclass(frozen=True, slots=True)
class MatrixLayout:
    """Rows and columns labelled by quantum numbers; each cell one value."""

    block: tuple[str, ...]  # kind argument names fixed per matrix ("j1", "j2", "j3", "J")
    row: str  # kind argument labelling the rows ("j12", "mp")
    column: str  # kind argument labelling the columns ("j23", "m")
    blocks: Callable[[int, int], Iterable[MatrixBlock]] = field(repr=False)  # (min 2j, max 2j) -> blocks in order
    count_noun: str = "values"
    tex_list: bool = False  # LaTeX lists the values (symbol = value, one a line): functions too wide for a row


    name = "matrix"

    def page_path(self, key: str, value: "int | None" = None) -> str:
        return f"{key}/{self.block[0]}-{file_code(value)}.html" if self.block else f"{key}/all.html"

    @staticmethod
    def block_anchor(params: tuple[tuple[str, int], ...]) -> str:
        return ",".join(f"{n}={half(v)}" for n, v in params) or "all"

    def anchor(self, block: str, tr: int, tc: int) -> str:
        cell = f"{self.row}={half(tr)},{self.column}={half(tc)}"
        return f"{block};{cell}" if self.block else cell

    def page_pattern(self, key: str) -> str:
        """The page path with argument names in braces (the jump box fills them in)."""
        return f"{key}/{self.block[0]}-{{{self.block[0]}}}.html" if self.block else f"{key}/all.html"

    def anchor_pattern(self) -> str:
        block = ",".join(f"{n}={{{n}}}" for n in self.block)
        cell = f"{self.row}={{{self.row}}},{self.column}={{{self.column}}}"
        return f"{block};{cell}" if self.block else cell

    @property
    def params(self) -> tuple[str, ...]:
        return self.block

    def plan(self, fam: "Family", f: "FamilyRange", lookup: Callable) -> tuple[list[Page], list[Table]]:
        by_page: dict[tuple[str, int], list[MatrixBlock]] = {}
        for block in self.blocks(f.min_tj, f.max_tj):
            if tuple(n for n, _ in block.params) != self.block:
                raise AssertionError(f"plan: a {fam.key} block has parameters {block.params}, not {self.block}")
            by_page.setdefault(block.params[0] if block.params else None, []).append(block)
        pages, tables = [], []
        for first, blocks in by_page.items():
            sections = []
            for block in blocks:
                anchor = self.block_anchor(block.params)
                grid, entries = [], []
                for tr in block.rows:
                    line = []
                    for tc in block.columns:
                        key = block.key(tr, tc)
                        e = None if key is None else Entry(key, self.anchor(anchor, tr, tc), None, 0, fam.kind)
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
                    row_anchors=tuple(f"row:{anchor};{self.row}={half(tr)}" for tr in block.rows),
                    params=block.params,
                ))
            if first is None:  # no block parameters: the family's one page
                tid, title, path, label = f"{fam.key}-all", fam.title, self.page_path(fam.key), fam.nav_label
            else:
                name, value = first
                tid = f"{fam.key}-{name}-{file_code(value)}"
                title = f"{fam.title} for {name} = {half(value)}"
                path, label = self.page_path(fam.key, value), f"{fam.nav_label}, {name} = {half(value)}"
            tables.append(Table(id=tid, family=fam.key, title=title, page=path, sections=tuple(sections),
                                params=(first,) if first else (), kind=fam.kind, **table_files(tid)))
            index = Link(f"all {fam.nav_label} pages", f"index.html#{fam.key}")
            pages.append(Page(path, title, fam.key, (tid,), related=(index,), label=label))
        return chain(pages), tables

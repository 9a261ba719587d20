"""The grid layout: one pair (j1, j2) per page, a section per third j, a grid per section.

Rows are the third projection r (M for CG, m3 for 3j), columns m1, and m2
follows from the projection sum m1 + m2 = m_sum_sign * r.  A value's key is
assembled by argument name in its kind's order, so the layout needs no
knowledge of which family it serves.
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import lru_cache
from typing import TYPE_CHECKING, Callable

from ..sitemodel import Entry, Link, Page, Section, Table, chain, half, half_for_file_name, table_files

if TYPE_CHECKING:  # pragma: no cover
    from ..families import Family
    from ..recipe import FamilyRange

__all__ = ["GridLayout"]


@dataclass(frozen=True, slots=True)
class GridLayout:
    """Options of a grid: names of the third j and its projection, row ids, the twin family."""

    third: str  # name of the third j: "J" or "j3"
    row: str  # name of the third projection: "M" or "m3"
    row_tag: str  # prefix of row ids: "ket" (rows are coupled states) or "row"
    m_sum_sign: int  # m1 + m2 = m_sum_sign * row  (+1 for CG, -1 for 3j)
    twin: str = ""  # the family holding the same numbers in another convention
    row_states: bool = False  # rows are coupled states |third row>, written out as ket expansions
    page_title: str = "{title} for j1 = {j1}, j2 = {j2}"  # pattern: {j1} {j2} {title}
    page_label: str = "j1 = {j1}, j2 = {j2}"
    count_noun: str = "values"
    page_cells: int = 4000  # values on one page at most (about 0.4 kB each): a larger pair gets a page per third j

    name = "grid"
    params = ("j1", "j2")

    # -- names (shared with the jump box through page_pattern / anchor_pattern) --
    def page_path(self, key: str, tj1: int, tj2: int, tk: int | None = None) -> str:
        """'cg/j1-1-j2-0.5.html': both j named, in the file-name form of :func:`half_for_file_name`.

        A pair too large for one page (:meth:`split`) has a page per third j:
        'cg/j1-10-j2-10-J-7.html'; ``tk`` names it (the first one without it).
        """
        if not self.split(tj1, tj2):
            return f"{key}/j1-{half_for_file_name(tj1)}-j2-{half_for_file_name(tj2)}.html"
        tk = tj1 + tj2 if tk is None else tk
        return f"{key}/j1-{half_for_file_name(tj1)}-j2-{half_for_file_name(tj2)}-{self.third}-{half_for_file_name(tk)}.html"

    def split(self, tj1: int, tj2: int) -> bool:
        """Whether the pair holds more than page_cells values."""
        return pair_size(tj1, tj2) > self.page_cells

    def split_pattern(self, key: str) -> str:
        """The page path of a split pair, with argument names in braces."""
        return f"{key}/j1-{{j1}}-j2-{{j2}}-{self.third}-{{{self.third}}}.html"

    def anchor(self, tk: int, tr: int, tm1: int) -> str:
        return f"{self.third}={half(tk)},{self.row}={half(tr)},m1={half(tm1)}"

    def page_pattern(self, key: str) -> str:
        """The page path with argument names in braces (the jump box fills them in)."""
        return f"{key}/j1-{{j1}}-j2-{{j2}}.html"

    def twin_anchor_pattern(self, tk: int, sign: int, row_name: str) -> str:
        """This layout's anchor for a twin's cell, filled from the twin's cell id (see cellpattern).

        ``row_name`` is the twin's name for the projection, ``sign`` relates the two: ours = sign * theirs.
        """
        return f"{self.third}={half(tk)},{self.row}=@{'-' if sign < 0 else ''}{row_name}@,m1=@m1@"

    def anchor_pattern(self) -> str:
        return f"{self.third}={{{self.third}}},{self.row}={{{self.row}}},m1={{m1}}"

    # -- planning --------------------------------------------------------------------
    def plan(self, fam: "Family", f: "FamilyRange", lookup: Callable[[str], "tuple[Family, FamilyRange] | None"]):
        """(pages, tables) of the family: one page per (j1, j2) in the range."""
        twin = lookup(self.twin) if self.twin else None
        arguments = fam.kind_record.arguments
        js = range(f.min_tj, f.max_tj + 1)
        pages, tables = [], []
        for tj1 in js:
            for tj2 in js:
                table = self._table(fam, arguments, tj1, tj2, twin)
                related = []
                if twin and _within(twin[1], tj1, tj2):
                    tfam = twin[0]
                    related.append(Link(f"{tfam.nav_label} with the same j1 and j2",
                                        tfam.layout.page_path(tfam.key, tj1, tj2)))
                if tj1 != tj2:
                    related.append(Link(f"j1 and j2 swapped (j1 = {half(tj2)}, j2 = {half(tj1)})", self.page_path(fam.key, tj2, tj1)))
                for d1, d2 in ((-1, 0), (1, 0), (0, -1), (0, 1)):
                    a, b = tj1 + d1, tj2 + d2
                    if _within(f, a, b):
                        related.append(Link(f"j1 = {half(a)}, j2 = {half(b)}", self.page_path(fam.key, a, b)))
                names = {"j1": half(tj1), "j2": half(tj2), "title": fam.title}
                title, label = self.page_title.format(**names), self.page_label.format(**names)
                parts = [table] if not self.split(tj1, tj2) else [self._part(table, s) for s in table.sections]
                if len(parts) > 1:  # each part links to the others: the pair stays one click away
                    related += [Link(s.title, f"{self.page_path(fam.key, tj1, tj2, s.params[0][1])}#{s.anchor}")
                                for s in table.sections]
                for part in parts:
                    what = "" if len(parts) == 1 else f", {part.sections[0].title}"
                    mine = tuple(r for r in related if not r.path.startswith(part.page + "#"))
                    pages.append(Page(part.page, title + what, fam.key, (part.id,), related=mine, label=label + what))
                    tables.append(part)
        return chain(pages), tables

    def _part(self, table: Table, section: Section) -> Table:
        """One section of a split pair as a table (and page) of its own."""
        tk = section.params[0][1]
        tid = f"{table.id}-{self.third}-{half_for_file_name(tk)}"
        return Table(id=tid, family=table.family, title=f"{table.title}, {section.title}",
                     page=self.page_path(table.family, table.param("j1"), table.param("j2"), tk),
                     sections=(section,), params=table.params, kind=table.kind, **table_files(tid))

    def _table(self, fam: "Family", arguments, tj1: int, tj2: int, twin) -> Table:
        twin_sign = tfam = None
        if twin and _within(twin[1], tj1, tj2):
            tfam = twin[0]
            twin_sign = self.m_sum_sign * tfam.layout.m_sum_sign  # its row value is twin_sign * ours
        order = [("j1", "j2", self.third, "m1", "m2", self.row).index(a) for a in arguments]
        cols = tuple(range(tj1, -tj1 - 1, -2))
        sections = []
        for tk in range(tj1 + tj2, abs(tj1 - tj2) - 1, -2):
            rows = tuple(range(tk, -tk - 1, -2))
            twin_page = tfam.layout.page_path(tfam.key, tj1, tj2, tk) if tfam else None
            grid, entries = [], []
            for tr in rows:
                line = []
                for tm1 in cols:
                    tm2 = self.m_sum_sign * tr - tm1
                    if abs(tm2) > tj2:
                        line.append(None)
                        continue
                    by_name = (tj1, tj2, tk, tm1, tm2, tr)
                    twin_id = f"{twin_page}#{tfam.layout.anchor(tk, twin_sign * tr, tm1)}" if tfam else None
                    e = Entry(tuple(by_name[i] for i in order), self.anchor(tk, tr, tm1), twin_id, 0, fam.kind)
                    line.append(e)
                    entries.append(e)
                grid.append(tuple(line))
            third = f"{self.third}={half(tk)}"
            sections.append(Section(
                title=f"{self.third} = {half(tk)}",
                anchor=third,
                entries=tuple(entries),
                rows=rows,
                columns=cols,
                grid=tuple(grid),
                row_anchors=tuple(f"{self.row_tag}:{third},{self.row}={half(tr)}" for tr in rows),
                params=((self.third, tk),),
                twin=f"{twin_page}#{tfam.layout.twin_anchor_pattern(tk, twin_sign, self.row)}" if tfam else None,
            ))
        tid = f"{fam.key}-j1-{half_for_file_name(tj1)}-j2-{half_for_file_name(tj2)}"
        return Table(
            id=tid,
            family=fam.key,
            title=f"{fam.title} for j1 = {half(tj1)}, j2 = {half(tj2)}",
            page=self.page_path(fam.key, tj1, tj2),  # the first part's page when the pair is split
            sections=tuple(sections),
            params=(("j1", tj1), ("j2", tj2)),
            kind=fam.kind,
            **table_files(tid),
        )


@lru_cache(maxsize=4096)
def pair_size(tj1: int, tj2: int) -> int:
    """Values of one pair (j1, j2): every (m1, m2, third j) with |m1 + m2| <= third j (triangle rule)."""
    total = 0
    for tm1 in range(-tj1, tj1 + 1, 2):
        for tm2 in range(-tj2, tj2 + 1, 2):
            total += (tj1 + tj2 - max(abs(tj1 - tj2), abs(tm1 + tm2))) // 2 + 1
    return total


def _within(f: "FamilyRange | None", *tjs: int) -> bool:
    return f is not None and all(f.min_tj <= t <= f.max_tj for t in tjs)

"""The records a site plan is made of: links, entries, sections, tables, pages.

Pure data, shared by the planner (plan.py and the layouts) and the renderers.
Paths are relative to the site root and use '/'.  Half-integers appear in file
names in decimal form ("cg/j1-1.5-j2-1.html", :func:`half_for_file_name`) and in
anchors as fractions ("J=5/2,M=-1/2,m1=1", :func:`half`).
"""

from __future__ import annotations

from dataclasses import dataclass, field
from functools import lru_cache
from typing import TYPE_CHECKING, Callable

from .spins import half_text

if TYPE_CHECKING:  # pragma: no cover
    from .families import Family
    from .recipe import Recipe

__all__ = ["Link", "Entry", "Section", "Table", "Page", "SitePlan", "half_for_file_name", "half", "table_files",
           "chain"]

#: spins.half_text, remembered: called for every anchor and label
half = lru_cache(maxsize=4096)(half_text)


def half_for_file_name(t: int) -> str:
    """A doubled j as it appears in file names: 4 -> '2', 3 -> '1.5'."""
    return str(t // 2) if t % 2 == 0 else f"{t // 2}.5"


@dataclass(frozen=True, slots=True)
class Link:
    """A labelled link to a page (path) or to a place on it (path#anchor)."""

    label: str
    path: str


@dataclass(frozen=True, slots=True)
class Entry:
    """One tabulated value.

    key: doubled arguments in the order of its kind's arguments.
    anchor: HTML id, unique on its page.
    twin: path#anchor of the same number in another family (CG <-> 3j), if tabulated.
    forms: classes layout only: how many distinct symbols the class holds (see ``members``).
    kind: the kinds.Kind key of the value.
    partners: classes layout only: path#anchor of each other class of the same value
        (Regge partners) on the site.
    beyond: classes layout only: how many forms of the same value have a j beyond the range.
    source: path#anchor of the value this one is made of (the 6j of a recoupling coefficient), if tabulated.
    """

    key: tuple[int, ...]
    anchor: str
    twin: str | None = None
    forms: int = 0
    kind: str = ""
    source: str | None = None
    partners: tuple[str, ...] = ()
    beyond: int = 0
    filed_by: "Callable | None" = field(default=None, repr=False, compare=False)  # classes: the class's symmetries

    @property
    def members(self) -> tuple[tuple[tuple[int, ...], int], ...]:
        """Classes only: every symbol of the class with its sign, value(member) = sign * value(key).

        The class is the one the layout files the symbol under (``filed_by``, the
        ordinary symmetries), else every symmetry of its kind.  Derived from the
        key on demand (the key is the class's canonical form, listed first)
        rather than stored: a large build has millions of forms.
        """
        if not self.forms:
            return ()
        if self.filed_by is not None:
            return tuple(self.filed_by(*self.key))
        from .kinds import kind

        return tuple(kind(self.kind).members(*self.key))


@dataclass(frozen=True, slots=True)
class Section:
    """A block of a table.

    grid layout: one value of the third j, rows by its projection, columns m1.
    classes layout: a list of classes (grid empty).
    matrix layout: one matrix, rows and columns labelled by quantum numbers.
    grid[r][c] is the Entry at row r, column c, or None where no value exists.
    row_anchors: per row, an id for the row.
    """

    title: str
    anchor: str
    entries: tuple[Entry, ...]
    rows: tuple = ()
    columns: tuple = ()
    grid: tuple[tuple[Entry | None, ...], ...] = ()
    row_anchors: tuple[str, ...] = ()
    params: tuple[tuple[str, int], ...] = ()
    column_tex: tuple[str, ...] = ()  # matrix layout: a LaTeX label per column when numbers do not say it
    twin: str | None = None  # grid layout: path#anchor of each entry's twin, @name@ from the entry's anchor


@dataclass(frozen=True, slots=True)
class Table:
    """One table: what a page shows and what one data file and one LaTeX sheet hold."""

    id: str
    family: str
    title: str
    page: str
    sections: tuple[Section, ...]
    params: tuple[tuple[str, int], ...]
    csv: str
    json: str
    tex: str
    tex_sheet: str
    kind: str = ""

    @property
    def entries(self) -> tuple[Entry, ...]:
        return tuple(e for s in self.sections for e in s.entries)

    def param(self, name: str) -> int:
        """A doubled parameter of the table by name (e.g. "j1", "jmax")."""
        return dict(self.params)[name]


@dataclass(frozen=True, slots=True)
class Page:
    """One HTML page; ``kind`` is index, conventions, methods, cite or a family key."""

    path: str
    title: str
    kind: str
    tables: tuple[str, ...] = ()
    prev: Link | None = None
    next: Link | None = None
    related: tuple[Link, ...] = ()
    label: str = ""  # short name for navigation links (the title when empty)
    anchors: tuple[str, ...] = ()  # ids on the page besides those of its tables


@dataclass(frozen=True, slots=True)
class SitePlan:
    recipe: "Recipe"
    pages: tuple[Page, ...]
    tables: tuple[Table, ...]
    family_pages: tuple[tuple[str, tuple[str, ...]], ...] = field(default=())
    booklet: str = "latex/booklet.tex"
    families: tuple["Family", ...] = ()  # the records of the families in this build, in order

    def table(self, table_id: str) -> Table:
        for t in self.tables:
            if t.id == table_id:
                return t
        raise KeyError(table_id)

    def tables_of(self, family: str) -> tuple[Table, ...]:
        return tuple(t for t in self.tables if t.family == family)

    def family(self, key: str) -> "Family":
        for f in self.families:
            if f.key == key:
                return f
        raise KeyError(key)


def table_files(table_id: str) -> dict[str, str]:
    """The data and LaTeX files of one table."""
    return {
        "csv": f"data/{table_id}.csv",
        "json": f"data/{table_id}.json",
        "tex": f"latex/{table_id}.tex",
        "tex_sheet": f"latex/{table_id}-sheet.tex",
    }


def chain(pages: list[Page]) -> list[Page]:
    """Set prev/next links along a family's page order."""
    out = []
    for i, p in enumerate(pages):
        before, after = (pages[i - 1] if i else None), (pages[i + 1] if i + 1 < len(pages) else None)
        prev = Link(before.label or before.title, before.path) if before else None
        nxt = Link(after.label or after.title, after.path) if after else None
        out.append(Page(p.path, p.title, p.kind, p.tables, prev, nxt, p.related, p.label, p.anchors))
    return out

"""The site plan: every page, table, anchor and URL, as pure data.

Planning happens before anything is computed or rendered, so a cross-link can
only point at something the plan contains.  Nothing here does I/O, imports
Jinja or computes a coefficient value; the only maths is combinatorics
(which symbols a range holds, and their symmetry classes).

Paths are relative to the site root and use '/'.  Half-integers appear in
file names in decimal form ("cg/1.5x2.html") and in anchors as fractions
("J=5/2,M=-1/2,m1=1"); site.js builds the same names from typed numbers.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from functools import lru_cache
from typing import Callable

from .recipe import FamilyRange, Recipe
from .spins import half_text
from .symmetry import ninej_members, sixj_members

__all__ = [
    "Link",
    "Entry",
    "Section",
    "Table",
    "Page",
    "SitePlan",
    "plan_site",
    "file_code",
    "cg_page_path",
    "threej_page_path",
    "sixj_page_path",
    "ninej_page_path",
]


@dataclass(frozen=True, slots=True)
class Link:
    """A labelled link to a page (path) or to a place on it (path#anchor)."""

    label: str
    path: str


@dataclass(frozen=True, slots=True)
class Entry:
    """One tabulated value.

    key: doubled arguments in the family's argument order
         (cg: j1 m1 j2 m2 J M; 3j: j1 j2 j3 m1 m2 m3; 6j: six; 9j: nine in rows).
    anchor: HTML id, unique on its page.
    twin: path#anchor of the same number in the other convention (CG <-> 3j), if tabulated.
    forms: 6j/9j only: how many distinct symbols the class holds (see ``members``).
    w_form: 6j only: (W arguments, sign) with W = sign * this 6j.
    """

    key: tuple[int, ...]
    anchor: str
    twin: str | None = None
    forms: int = 0
    w_form: tuple[tuple[int, ...], int] | None = None

    @property
    def members(self) -> tuple[tuple[tuple[int, ...], int], ...]:
        """6j/9j: every symbol of the class with its sign, value(member) = sign * value(key).

        Derived from the key on demand (the key is the class's canonical form,
        listed first) rather than stored: a large build has millions of forms.
        """
        if not self.forms:
            return ()
        members_of = sixj_members if len(self.key) == 6 else ninej_members
        return tuple(members_of(*self.key))


@dataclass(frozen=True, slots=True)
class Section:
    """A block of a table.

    CG: one J, laid out as a grid with rows M and columns m1 (m2 = M - m1).
    3j: one j3, grid with rows m3 and columns m1 (m2 = -m1 - m3).
    6j/9j: a list of classes (grid empty).
    grid[r][c] is the Entry at row r, column c, or None where no value exists.
    row_anchors: per row, an id for the row (CG: the ket expansion of |J M>).
    """

    title: str
    anchor: str
    entries: tuple[Entry, ...]
    rows: tuple[int, ...] = ()
    columns: tuple[int, ...] = ()
    grid: tuple[tuple[Entry | None, ...], ...] = ()
    row_anchors: tuple[str, ...] = ()
    params: tuple[tuple[str, int], ...] = ()


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

    @property
    def entries(self) -> tuple[Entry, ...]:
        return tuple(e for s in self.sections for e in s.entries)

    def param(self, name: str) -> int:
        """A doubled parameter of the table by name (e.g. "j1", "jmax")."""
        return dict(self.params)[name]


@dataclass(frozen=True, slots=True)
class Page:
    """One HTML page."""

    path: str
    title: str
    kind: str  # index, conventions, methods, cite, cg, 3j, 6j, 9j
    tables: tuple[str, ...] = ()
    prev: Link | None = None
    next: Link | None = None
    related: tuple[Link, ...] = ()
    label: str = ""  # short name for navigation links (the title when empty)


@dataclass(frozen=True, slots=True)
class SitePlan:
    recipe: Recipe
    pages: tuple[Page, ...]
    tables: tuple[Table, ...]
    family_pages: tuple[tuple[str, tuple[str, ...]], ...] = field(default=())
    booklet: str = "latex/booklet.tex"

    def table(self, table_id: str) -> Table:
        for t in self.tables:
            if t.id == table_id:
                return t
        raise KeyError(table_id)

    def tables_of(self, family: str) -> tuple[Table, ...]:
        return tuple(t for t in self.tables if t.family == family)


# -- names -------------------------------------------------------------------
def file_code(t: int) -> str:
    """A doubled j as it appears in file names: 4 -> '2', 3 -> '1.5'."""
    return str(t // 2) if t % 2 == 0 else f"{t // 2}.5"


def cg_page_path(tj1: int, tj2: int) -> str:
    return f"cg/{file_code(tj1)}x{file_code(tj2)}.html"


def threej_page_path(tj1: int, tj2: int) -> str:
    return f"3j/{file_code(tj1)}x{file_code(tj2)}.html"


def sixj_page_path(top: int) -> str:
    return f"6j/jmax-{file_code(top)}.html"


def ninej_page_path(top: int) -> str:
    return f"9j/jmax-{file_code(top)}.html"


_h = lru_cache(maxsize=4096)(half_text)  # called for every anchor and label


def cg_anchor(tJ: int, tM: int, tm1: int) -> str:
    return f"J={_h(tJ)},M={_h(tM)},m1={_h(tm1)}"


def threej_anchor(tj3: int, tm3: int, tm1: int) -> str:
    return f"j3={_h(tj3)},m3={_h(tm3)},m1={_h(tm1)}"


def symbol_anchor(key: tuple[int, ...], row: int) -> str:
    """'1,1,1;1,1,1' for a 6j (row=3), '1,1,0;1,1,1;0,1,1' for a 9j."""
    parts = [",".join(_h(x) for x in key[i : i + row]) for i in range(0, len(key), row)]
    return ";".join(parts)


def _table_files(table_id: str) -> dict[str, str]:
    return {
        "csv": f"data/{table_id}.csv",
        "json": f"data/{table_id}.json",
        "tex": f"latex/{table_id}.tex",
        "tex_sheet": f"latex/{table_id}-sheet.tex",
    }


def _chain(pages: list[Page]) -> list[Page]:
    """Set prev/next links along a family's page order."""
    out = []
    for i, p in enumerate(pages):
        before, after = (pages[i - 1] if i else None), (pages[i + 1] if i + 1 < len(pages) else None)
        prev = Link(before.label or before.title, before.path) if before else None
        nxt = Link(after.label or after.title, after.path) if after else None
        out.append(Page(p.path, p.title, p.kind, p.tables, prev, nxt, p.related, p.label))
    return out


def _in(f: FamilyRange | None, *tjs: int) -> bool:
    return f is not None and all(f.min_tj <= t <= f.max_tj for t in tjs)


# -- CG and 3j -----------------------------------------------------------------
@dataclass(frozen=True)
class _PairLayout:
    """How one of the two pair families (CG, 3j) lays out its grid.

    Both tabulate a coupling (j1, j2) in sections by the third j (J or j3),
    grid rows by the third projection r (M or m3) and columns by m1.
    """

    family: str
    third: str  # name of the third j: "J" or "j3"
    row: str  # name of the third projection: "M" or "m3"
    row_tag: str  # prefix of row anchors: "ket" (CG rows are ket expansions) or "row"
    title: str
    page_path: Callable[[int, int], str]
    anchor: Callable[[int, int, int], str]  # (third, r, m1) -> id on this page
    twin_page_path: Callable[[int, int], str]
    twin_anchor: Callable[[int, int, int], str]  # (third, -r, m1) -> id on the twin page
    m2: Callable[[int, int], int]  # (r, m1) -> m2
    key: Callable[[int, int, int, int, int, int], tuple[int, ...]]  # (j1, j2, k, m1, m2, r)


_PAIR_LAYOUTS = {
    "cg": _PairLayout(
        "cg", "J", "M", "ket", "Clebsch–Gordan coefficients",
        cg_page_path, cg_anchor, threej_page_path, threej_anchor,
        m2=lambda r, m1: r - m1,  # m1 + m2 = M
        key=lambda j1, j2, k, m1, m2, r: (j1, m1, j2, m2, k, r),
    ),
    "3j": _PairLayout(
        "3j", "j3", "m3", "row", "Wigner 3j symbols",
        threej_page_path, threej_anchor, cg_page_path, cg_anchor,
        m2=lambda r, m1: -m1 - r,  # m1 + m2 + m3 = 0
        key=lambda j1, j2, k, m1, m2, r: (j1, j2, k, m1, m2, r),
    ),
}


def _pair_table(layout: _PairLayout, tj1: int, tj2: int, other: FamilyRange | None) -> Table:
    """The table of one coupling j1 x j2: a section per third j, a grid per section."""
    twin_page = layout.twin_page_path(tj1, tj2) if _in(other, tj1, tj2) else None
    cols = tuple(range(tj1, -tj1 - 1, -2))
    sections = []
    for tk in range(tj1 + tj2, abs(tj1 - tj2) - 1, -2):
        rows = tuple(range(tk, -tk - 1, -2))
        grid, entries = [], []
        for tr in rows:
            line = []
            for tm1 in cols:
                tm2 = layout.m2(tr, tm1)
                if abs(tm2) > tj2:
                    line.append(None)
                    continue
                twin = f"{twin_page}#{layout.twin_anchor(tk, -tr, tm1)}" if twin_page else None
                e = Entry(layout.key(tj1, tj2, tk, tm1, tm2, tr), layout.anchor(tk, tr, tm1), twin)
                line.append(e)
                entries.append(e)
            grid.append(tuple(line))
        third = f"{layout.third}={_h(tk)}"
        sections.append(
            Section(
                title=f"{layout.third} = {_h(tk)}",
                anchor=third,
                entries=tuple(entries),
                rows=rows,
                columns=cols,
                grid=tuple(grid),
                row_anchors=tuple(f"{layout.row_tag}:{third},{layout.row}={_h(tr)}" for tr in rows),
                params=((layout.third, tk),),
            )
        )
    tid = f"{layout.family}-{file_code(tj1)}x{file_code(tj2)}"
    return Table(
        id=tid,
        family=layout.family,
        title=f"{layout.title} for j1 = {_h(tj1)}, j2 = {_h(tj2)}",
        page=layout.page_path(tj1, tj2),
        sections=tuple(sections),
        params=(("j1", tj1), ("j2", tj2)),
        **_table_files(tid),
    )


def _pair_pages(recipe: Recipe, family: str) -> tuple[list[Page], list[Table]]:
    f = recipe.family(family)
    other_name = "3j" if family == "cg" else "cg"
    other = recipe.family(other_name)
    layout = _PAIR_LAYOUTS[family]
    path_of, other_path = layout.page_path, layout.twin_page_path
    js = range(f.min_tj, f.max_tj + 1)
    pages, tables = [], []
    for tj1 in js:
        for tj2 in js:
            table = _pair_table(layout, tj1, tj2, other)
            related = []
            if _in(other, tj1, tj2):
                related.append(Link(f"{other_name.upper() if other_name == 'cg' else other_name} "
                                    f"for {_h(tj1)} ⊗ {_h(tj2)}", other_path(tj1, tj2)))
            if tj1 != tj2:
                related.append(Link(f"reversed order {_h(tj2)} ⊗ {_h(tj1)}", path_of(tj2, tj1)))
            for d1, d2 in ((-1, 0), (1, 0), (0, -1), (0, 1)):
                a, b = tj1 + d1, tj2 + d2
                if _in(f, a, b):
                    related.append(Link(f"{_h(a)} ⊗ {_h(b)}", path_of(a, b)))
            title = (
                f"⟨{_h(tj1)} m1; {_h(tj2)} m2 | J M⟩ — coupling {_h(tj1)} ⊗ {_h(tj2)}"
                if family == "cg"
                else f"3j symbols ({_h(tj1)} {_h(tj2)} j3; m1 m2 m3)"
            )
            label = f"{_h(tj1)} ⊗ {_h(tj2)}" if family == "cg" else f"3j {_h(tj1)}, {_h(tj2)}"
            pages.append(Page(table.page, title, family, (table.id,), related=tuple(related), label=label))
            tables.append(table)
    return _chain(pages), tables


# -- 6j and 9j -------------------------------------------------------------------
from .triads import is_triad as _triangle  # noqa: E402  (the one triad rule)


def sixj_symbols(f: FamilyRange):
    """Every 6j with all j in the range and all four triads allowed, in order."""
    js = range(f.min_tj, f.max_tj + 1)
    for a in js:
        for b in js:
            for c in js:
                if not _triangle(a, b, c):
                    continue
                for d in js:
                    for e in js:
                        if not _triangle(d, e, c):
                            continue
                        for g in js:
                            if _triangle(a, e, g) and _triangle(d, b, g):
                                yield (a, b, c, d, e, g)


def ninej_symbols(f: FamilyRange):
    """Every 9j with all j in the range and all six triads allowed, in order."""
    js = range(f.min_tj, f.max_tj + 1)
    rows = [(a, b, c) for a in js for b in js for c in js if _triangle(a, b, c)]
    for r1 in rows:
        for r2 in rows:
            for r3 in rows:
                if _triangle(r1[0], r2[0], r3[0]) and _triangle(r1[1], r2[1], r3[1]) and _triangle(
                    r1[2], r2[2], r3[2]
                ):
                    yield r1 + r2 + r3


def _classes(symbols, members_of):
    """Group symbols into classes; each class keyed by its canonical (largest) form."""
    seen: set[tuple[int, ...]] = set()
    classes = []
    for s in symbols:
        if s in seen:
            continue
        members = members_of(*s)  # sorted descending: members[0] is the canonical form
        canon, canon_sign = members[0]
        seen.update(m for m, _ in members)
        classes.append((canon, len(members)))
    classes.sort(key=lambda c: c[0])
    return classes


def _symbol_pages(recipe: Recipe, family: str) -> tuple[list[Page], list[Table]]:
    f = recipe.family(family)
    if family == "6j":
        classes = _classes(sixj_symbols(f), sixj_members)
        path_of, row = sixj_page_path, 3
    else:
        classes = _classes(ninej_symbols(f), ninej_members)
        path_of, row = ninej_page_path, 3
    by_top: dict[int, list] = {}
    for canon, forms in classes:
        by_top.setdefault(canon[0], []).append((canon, forms))
    pages, tables = [], []
    for top in sorted(by_top):
        entries = []
        for canon, forms in by_top[top]:
            w_form = None
            if family == "6j":
                a, b, e, d, c, g = canon  # {a b e; d c f} = (-1)^(a+b+c+d) W(a b c d; e f)
                w_form = ((a, b, c, d, e, g), -1 if ((a + b + c + d) // 2) & 1 else 1)
            entries.append(Entry(canon, symbol_anchor(canon, row), None, forms, w_form))
        tid = f"{family}-jmax-{file_code(top)}"
        label, forms = ("6j", 144) if family == "6j" else ("9j", 72)
        title = f"{label} classes whose largest j, over all {forms} equivalent forms, is {_h(top)}"
        section = Section(title=title, anchor=f"jmax={_h(top)}", entries=tuple(entries))
        tables.append(
            Table(
                id=tid,
                family=family,
                title=title,
                page=path_of(top),
                sections=(section,),
                params=(("jmax", top),),
                **_table_files(tid),
            )
        )
        index = Link(f"all {label} pages", f"index.html#{family}")
        pages.append(Page(path_of(top), title, family, (tid,), related=(index,), label=f"{label}, largest j {_h(top)}"))
    return _chain(pages), tables


# -- the whole site ---------------------------------------------------------------
def plan_site(recipe: Recipe) -> SitePlan:
    """Every page and table of the site the recipe asks for."""
    pages: list[Page] = [
        Page("index.html", recipe.title, "index"),
        Page("conventions.html", "Conventions", "conventions"),
        Page("methods.html", "How the values are computed and checked", "methods"),
        Page("cite.html", "How to cite this build", "cite"),
    ]
    tables: list[Table] = []
    family_pages = []
    for f in recipe.families:
        if f.family in ("cg", "3j"):
            fp, ft = _pair_pages(recipe, f.family)
        else:
            fp, ft = _symbol_pages(recipe, f.family)
        pages += fp
        tables += ft
        family_pages.append((f.family, tuple(p.path for p in fp)))
    _check_unique(pages, tables)
    return SitePlan(recipe, tuple(pages), tuple(tables), tuple(family_pages))


def _check_unique(pages: list[Page], tables: list[Table]) -> None:
    paths = [p.path for p in pages]
    if len(set(paths)) != len(paths):
        raise AssertionError("plan: two pages share a path")
    for t in tables:
        anchors = [s.anchor for s in t.sections] + [e.anchor for s in t.sections for e in s.entries]
        anchors += [a for s in t.sections for a in s.row_anchors]
        if len(set(anchors)) != len(anchors):
            raise AssertionError(f"plan: duplicate anchor on {t.page}")


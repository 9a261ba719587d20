"""Family pages by layout: grid, classes and matrix, and each layout's part of the index.

One page builder per layout name (:data:`PAGES`) and one index builder
(:data:`INDEX_PARTS`); both read only the plan, the family record and the
ValueBook.  Every piece of MathML comes from mathml.py.  The page templates
are grid.html, classes.html and matrix.html; per-family prose is
prose/<family key>.html (prose/default.html when a family has none).
"""

from __future__ import annotations

from dataclasses import dataclass, replace
from typing import TYPE_CHECKING

from markupsafe import Markup

from ..families import Family
from ..kinds import kind
from ..sitemodel import Entry, Page, Section
from ..spins import half_text
from . import mathml
from .links import relative_url

if TYPE_CHECKING:  # pragma: no cover
    from .html import _Site

__all__ = ["PAGES", "INDEX_PARTS", "Cell", "Row", "ClassRow"]


def _dash(text: str) -> str:
    """Plain text with typographic minus signs."""
    return text.replace("-", "−")


def _qn(t: int) -> str:
    return _dash(half_text(t))


@dataclass(frozen=True)
class Cell:
    """One value in a grid or matrix, ready to print."""

    anchor: str
    tex: str
    math: Markup
    decimal: str
    note: str  # the quantum number not given by row and column (grid: m2)
    twin: str | None  # relative link to the same number in the twin family
    zero: bool


@dataclass(frozen=True)
class Term:
    """One term of a ket expansion."""

    sign: str  # '', '+', '−'
    math: Markup  # MathML content: |coefficient| (omitted when it is 1) and the product ket


@dataclass(frozen=True)
class Row:
    label: str
    anchor: str
    cells: tuple[Cell | None, ...]
    ket: Markup | None = None  # rows that are coupled states: MathML of '|third row> ='
    terms: tuple[Term, ...] = ()


@dataclass(frozen=True)
class Companion:
    """A companion value beside a class (Racah W beside a 6j)."""

    math: Markup
    tex: str
    negative: bool


@dataclass(frozen=True)
class ClassRow:
    """One symmetry class of a classes page."""

    anchor: str
    symbol: Markup
    tex: str
    math: Markup
    decimal: str
    plus: tuple[str, ...]  # forms equal to the value
    minus: tuple[str, ...]  # forms equal to minus the value
    companions: tuple[Companion, ...] = ()
    zero: bool = False


def _cell(site: "_Site", page: Page, kind: str, entry: Entry, note: str) -> Cell:
    s = site.shown(kind, entry.key)
    return Cell(
        anchor=entry.anchor,
        tex=s.tex,
        math=Markup(mathml.value_inner(s.tex)),
        decimal=s.decimal,
        note=note,
        twin=relative_url(page.path, entry.twin) if entry.twin else None,
        zero=not s.value,
    )


# -- grid ----------------------------------------------------------------------------
def _grid_rows(site: "_Site", page: Page, fam: Family, section: Section) -> list[Row]:
    layout, args = fam.layout, fam.kind_record.arguments
    at = {name: args.index(name) for name in ("j1", "j2", "m1", "m2")}
    third = section.params[0][1]
    rows = []
    for r, tr in enumerate(section.rows):
        cells, terms = [], []
        for entry in section.grid[r]:
            if entry is None:
                cells.append(None)
                continue
            cells.append(_cell(site, page, fam.kind, entry, _qn(entry.key[at["m2"]])))
            if not layout.row_states:
                continue
            s = site.shown(fam.kind, entry.key)
            if not s.value:
                continue
            sign = ("" if not terms else "+") if s.value.sign > 0 else "−"
            kets = mathml.ket_product((entry.key[at["j1"]], entry.key[at["m1"]]), (entry.key[at["j2"]], entry.key[at["m2"]]))
            coeff = "" if s.tex_abs == "1" else mathml.value_inner(s.tex_abs)
            terms.append(Term(sign, Markup(coeff + kets)))
        ket = Markup(mathml.equation(mathml.ket_product((third, tr)), "")) if layout.row_states else None
        rows.append(Row(label=_qn(tr), anchor=section.row_anchors[r], cells=tuple(cells), ket=ket, terms=tuple(terms)))
    return rows


def _grid_page(site: "_Site", page: Page) -> bytes:
    table = site.plan.table(page.tables[0])
    fam = site.plan.family(table.family)
    sections = [
        {
            "title": s.title,
            "anchor": s.anchor,
            "value": _qn(s.params[0][1]),
            "columns": [_qn(c) for c in s.columns],
            "rows": _grid_rows(site, page, fam, s),
        }
        for s in table.sections
    ]
    twin = site.plan.family(fam.layout.twin) if fam.layout.twin in site.keys else None
    return site.render(
        "grid.html",
        page,
        table=table,
        fam=fam,
        layout=fam.layout,
        twin_label=twin.nav_label if twin else "",
        j1=half_text(table.param("j1")),
        j2=half_text(table.param("j2")),
        sections=sections,
        files=site.files(page, table),
        count=len(table.entries),
    )


def _grid_index(site: "_Site", page: Page, fam: Family) -> dict:
    """The j1 × j2 table of links to the family's pages."""
    links = {(t.param("j1"), t.param("j2")): relative_url(page.path, t.page) for t in site.plan.tables_of(fam.key)}
    js = sorted({a for a, _ in links} | {b for _, b in links})
    return {
        "js": [half_text(t) for t in js],
        "rows": [(half_text(a), [(half_text(b), links.get((a, b))) for b in js]) for a in js],
    }


# -- classes ------------------------------------------------------------------------------
def _class_row(site: "_Site", fam: Family, entry: Entry) -> ClassRow:
    k = fam.kind_record
    s = site.shown(fam.kind, entry.key)
    companions = []
    for c in fam.companions:
        args, sign = c.mapping(entry.key)
        other = site.shown(c.kind, args)
        math = mathml.equation(mathml.symbol(kind(c.kind).notation, args), mathml.value_inner(other.tex))
        companions.append(Companion(Markup(math), other.tex, sign < 0))
    return ClassRow(
        anchor=entry.anchor,
        symbol=Markup(mathml.symbol(k.notation, entry.key)),
        tex=s.tex,
        math=Markup(mathml.value_inner(s.tex)),
        decimal=s.decimal,
        plus=tuple(k.text(m) for m, sign in entry.members if sign > 0),
        minus=tuple(k.text(m) for m, sign in entry.members if sign < 0),
        companions=tuple(companions),
        zero=not s.value,
    )


def _classes_page(site: "_Site", page: Page) -> bytes:
    table = site.plan.table(page.tables[0])
    fam = site.plan.family(table.family)
    classes = [_class_row(site, fam, e) for e in table.entries]
    return site.render(
        "classes.html",
        page,
        table=table,
        fam=fam,
        section=table.sections[0],
        classes=classes,
        forms=sum(len(c.plus) + len(c.minus) for c in classes),
        files=site.files(page, table),
    )


def _pages_index(site: "_Site", page: Page, fam: Family) -> dict:
    """A list of the family's pages with their counts (classes and matrix layouts)."""
    items = []
    for t in site.plan.tables_of(fam.key):
        (name, value), = t.params or ((fam.title, None),)  # a matrix layout without blocks: one page
        items.append({
            "name": name,
            "label": None if value is None else _qn(value),
            "href": relative_url(page.path, t.page),
            "count": len(t.entries),
            "forms": sum(e.forms for e in t.entries),
        })
    return {"pages": items}


# -- matrix -------------------------------------------------------------------------------
def _matrix_rows(site: "_Site", page: Page, s: Section, kind_key: str, suffix: str) -> list[Row]:
    """A section's matrix of values of one kind; ids get ``suffix`` (a kind shown alongside: ';d(pi/2)')."""
    rows = []
    for r, tr in enumerate(s.rows):
        cells = []
        for e in s.grid[r]:
            cell = None if e is None else _cell(site, page, kind_key, e, "")
            cells.append(cell if cell is None or not suffix else replace(cell, anchor=cell.anchor + suffix))
        rows.append(Row(label=_qn(tr), anchor=s.row_anchors[r] + suffix, cells=tuple(cells)))
    return rows


def _matrix_page(site: "_Site", page: Page) -> bytes:
    table = site.plan.table(page.tables[0])
    fam = site.plan.family(table.family)
    sections = []
    for s in table.sections:
        alongside = [{"label": a.label, "rows": _matrix_rows(site, page, s, a.kind, f";{a.kind}")}
                     for a in fam.alongside]
        sections.append({"title": s.title, "anchor": s.anchor, "columns": [_qn(c) for c in s.columns],
                         "rows": _matrix_rows(site, page, s, fam.kind, ""), "alongside": alongside})
    return site.render(
        "matrix.html",
        page,
        table=table,
        fam=fam,
        layout=fam.layout,
        sections=sections,
        files=site.files(page, table),
        count=len(table.entries),
    )


PAGES = {"grid": _grid_page, "classes": _classes_page, "matrix": _matrix_page}
INDEX_PARTS = {"grid": _grid_index, "classes": _pages_index, "matrix": _pages_index}

"""Family pages by layout: grid, classes and matrix, and each layout's part of the index.

One page builder per layout name (:data:`PAGES`) and one index builder
(:data:`INDEX_PARTS`); both read only the plan, the family record and the
computed values.  Every piece of MathML comes from mathml.py.  The page templates
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
from .latex import latex_symbol
from .env import qn_html
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
    zero: bool
    why: str = ""  # a zero: "id: text" of the selection rule that makes it zero
    source: str | None = None  # relative link to the value this one is made of (matrix layout's source)


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
    tex_eq: str = ""  # "symbol = value" in LaTeX


@dataclass(frozen=True)
class ClassRow:
    """One class of a classes page: the symbols equal under the ordinary symmetries."""

    anchor: str
    symbol: Markup
    tex: str
    math: Markup
    decimal: str
    plus: tuple[str, ...]  # forms equal to the value
    minus: tuple[str, ...]  # forms equal to minus the value
    companions: tuple[Companion, ...] = ()
    zero: bool = False
    why: str = ""  # a zero: "id: text" of the selection rule that makes it zero
    partners: tuple[tuple[str, str], ...] = ()  # (symbol text, link) of each Regge partner on the site
    beyond: int = 0  # forms of the same value with a j beyond the range (not on the site)
    tex_eq: str = ""  # "symbol = value" in LaTeX


def _tex_equation(kind_key: str, key: tuple[int, ...], tex: str) -> str:
    """'symbol = value' in LaTeX, the symbol from the kind's notation."""
    return f"{latex_symbol(kind(kind_key).notation, [half_text(x) for x in key])} = {tex}"


def _tex_symbol_pattern(fam: Family, given: tuple[tuple[str, int], ...], kind_key: str = "") -> str:
    """The family's symbol in LaTeX, the ``given`` arguments as numbers and every other one as @name@.

    A grid or matrix table carries it (data-e); site.js fills each @name@ from a
    cell's id (name=value pairs) and its corner note, so that every cell copies as
    "symbol = value" without the symbol written out once per cell.
    """
    known = dict(given)
    k = kind(kind_key) if kind_key else fam.kind_record
    return latex_symbol(k.notation, [half_text(known[a]) if a in known else f"@{a}@" for a in k.arguments])


def _cell(site: "_Site", page: Page, kind: str, entry: Entry, note: str) -> Cell:
    s = site.shown(kind, entry.key)
    return Cell(
        anchor=entry.anchor,
        tex=s.tex,
        math=Markup(mathml.value_inner(s.tex)),
        decimal=s.decimal,
        note=note,
        zero=not s.value,
        why=s.zero_rule,
        source=relative_url(page.path, entry.source) if entry.source else None,
    )


# -- grid ----------------------------------------------------------------------------
def _grid_rows(site: "_Site", page: Page, fam: Family, section: Section) -> list[Row]:
    layout, args = fam.layout, fam.kind_record.arguments
    at = {name: args.index(name) for name in ("j1", "j2", "m1", "m2")}
    third = section.params[0][1]
    j1, j2 = (section.entries[0].key[at[n]] for n in ("j1", "j2"))
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
        ket = Markup(mathml.equation(mathml.coupled_ket(j1, j2, third, tr), "")) if layout.row_states else None
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
            "tex_symbol": _tex_symbol_pattern(fam, table.params + s.params),
            "twin": relative_url(page.path, s.twin) if s.twin else None,  # a pattern: see cellpattern
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
    """A table of links, rows j1 and columns j2; each cell names the values of the third j its page holds."""
    pages: dict[tuple[int, int], str] = {}
    thirds: dict[tuple[int, int], list[int]] = {}
    for t in site.plan.tables_of(fam.key):  # a split pair: its first part's page, every third j
        pair = (t.param("j1"), t.param("j2"))
        pages.setdefault(pair, t.page)
        thirds.setdefault(pair, []).extend(s.params[0][1] for s in t.sections)
    links = {}
    for pair, ks in thirds.items():
        span = _qn(ks[0]) if len(ks) == 1 else f"{_qn(min(ks))}–{_qn(max(ks))}"
        links[pair] = (relative_url(page.path, pages[pair]), span)
    js = sorted({a for a, _ in links} | {b for _, b in links})
    return {
        "js": [half_text(t) for t in js],
        "third": fam.layout.third,
        "rows": [(half_text(a), [(half_text(b), *links.get((a, b), (None, ""))) for b in js]) for a in js],
    }


# -- classes ------------------------------------------------------------------------------
def _class_row(site: "_Site", page: Page, fam: Family, entry: Entry) -> ClassRow:
    k = fam.kind_record
    s = site.shown(fam.kind, entry.key)
    companions = []
    for c in fam.companions:
        args, sign = c.mapping(entry.key)
        other = site.shown(c.kind, args)
        math = mathml.equation(mathml.symbol(kind(c.kind).notation, args), mathml.value_inner(other.tex))
        companions.append(Companion(Markup(math), other.tex, sign < 0, _tex_equation(c.kind, args, other.tex)))
    forms = fam.layout.filed_by(*entry.key)  # the class: signs relative to its canonical form, the key
    left, right = k.notation.brackets or "{}"
    partners = tuple(
        (f"{left}{_dash(target.split('#', 1)[1]).replace(',', ' ').replace(';', '; ')}{right}", relative_url(page.path, target))
        for target in entry.partners
    )
    return ClassRow(
        anchor=entry.anchor,
        symbol=Markup(mathml.symbol(k.notation, entry.key)),
        tex=s.tex,
        math=Markup(mathml.value_inner(s.tex)),
        decimal=s.decimal,
        plus=tuple(k.text(m) for m, sign in forms if sign > 0),
        minus=tuple(k.text(m) for m, sign in forms if sign < 0),
        companions=tuple(companions),
        zero=not s.value,
        why=s.zero_rule,
        partners=partners,
        beyond=entry.beyond,
        tex_eq=_tex_equation(fam.kind, entry.key, s.tex),
    )


def _classes_page(site: "_Site", page: Page) -> bytes:
    table = site.plan.table(page.tables[0])
    fam = site.plan.family(table.family)
    sections = [{"title": s.title, "anchor": s.anchor, "classes": [_class_row(site, page, fam, e) for e in s.entries]}
                for s in table.sections]
    classes = [c for s in sections for c in s["classes"]]
    return site.render(
        "classes.html",
        page,
        table=table,
        fam=fam,
        sections=sections,
        count=len(classes),
        forms=sum(len(c.plus) + len(c.minus) for c in classes),
        files=site.files(page, table),
    )


def _classes_index(site: "_Site", page: Page, fam: Family) -> dict:
    """Per first entry: its pages' sections (second entry) and truthful counts.

    Forms counted are those with every j in the range (each on exactly one row);
    forms of the same values with a j beyond the range are counted apart, once
    per value class on the page.
    """
    leads: dict[int, dict] = {}
    for t in site.plan.tables_of(fam.key):
        (name, value), = t.params
        item = leads.setdefault(value, {"name": name, "label": _qn(value), "href": relative_url(page.path, t.page),
                                        "sections": [], "count": 0, "forms": 0, "beyond": 0, "seen": set()})
        for sec in t.sections:
            if not any(x["title"] == sec.title for x in item["sections"]):
                item["sections"].append({"title": sec.title, "label": _qn(sec.params[0][1]),
                                         "href": relative_url(page.path, f"{t.page}#{sec.anchor}")})
            for e in sec.entries:
                item["count"] += 1
                item["forms"] += len(fam.layout.filed_by(*e.key))
                if e.beyond:
                    value_class = fam.kind_record.members(*e.key)[0][0]
                    if value_class not in item["seen"]:
                        item["seen"].add(value_class)
                        item["beyond"] += e.beyond
    out = []
    for item in leads.values():
        item.pop("seen")
        out.append(item)
    second = fam.kind_record.arguments[1]
    return {"leads": out, "second": second}


def _pages_index(site: "_Site", page: Page, fam: Family) -> dict:
    """A list of the family's pages with their counts (matrix layout)."""
    items = []
    for t in site.plan.tables_of(fam.key):
        names, values = zip(*t.params) if t.params else ((), ())  # no block parameters: the family's one page
        named = getattr(fam.layout, "page_name", None)
        items.append({
            "name": ", ".join(names),
            "label": ", ".join(_qn(v) for v in values),
            "text": named(t.params) if named else ", ".join(f"{n} = {_qn(v)}" for n, v in t.params) or t.title,
            "href": relative_url(page.path, t.page),
            "count": len(t.entries),
            "forms": sum(e.forms for e in t.entries),
        })
    return {"pages": items}


# -- matrix -------------------------------------------------------------------------------
def _state_lists(site: "_Site", fam: Family, section: Section) -> tuple[list[dict], list[dict]]:
    """Each row written in column states and each column in row states: MathML pieces and the LaTeX."""
    from .kets import expansions

    def shown(e: Entry):
        return site.shown(fam.kind, e.key)

    def html(x) -> dict:
        terms = []
        for i, t in enumerate(x.terms):
            sign = "−" if t.negative else ("+" if i else "")
            coeff = "" if t.unit else mathml.value_inner(t.value.tex_abs)
            terms.append(Term(sign, Markup(coeff + mathml.text(t.ket_text.replace("-", "−")))))
        return {"ket": Markup(mathml.equation(mathml.text(x.ket_text.replace("-", "−")), "")), "terms": terms,
                "tex": x.tex}

    by_row, by_column = expansions(fam.layout, section, shown)
    return [html(x) for x in by_row], [html(x) for x in by_column]


def _names_html(names: tuple[str, ...]) -> Markup:
    """'j12' or '(j12, j34)' with each name set as a quantum number."""
    inner = Markup(", ").join(qn_html(n) for n in names)
    return inner if len(names) == 1 else Markup("({})").format(inner)


def _matrix_rows(site: "_Site", page: Page, fam: Family, s: Section, kind_key: str, suffix: str) -> list[Row]:
    """A section's matrix of values of one kind; ids get ``suffix`` (a kind shown alongside: ';d(pi/2)')."""
    rows = []
    for r, tr in enumerate(s.rows):
        cells = []
        for e in s.grid[r]:
            cell = None if e is None else _cell(site, page, kind_key, e, "")
            cells.append(cell if cell is None or not suffix else replace(cell, anchor=cell.anchor + suffix))
        rows.append(Row(label=_dash(fam.layout.label(tr)), anchor=s.row_anchors[r] + suffix, cells=tuple(cells)))
    return rows


def _matrix_page(site: "_Site", page: Page) -> bytes:
    table = site.plan.table(page.tables[0])
    fam = site.plan.family(table.family)
    sections = []
    for s in table.sections:
        rows = _matrix_rows(site, page, fam, s, fam.kind, "")
        label = fam.layout.label
        alongside = [{"label": a.label, "rows": _matrix_rows(site, page, fam, s, a.kind, f";{a.kind}"),
                      "tex_symbol": _tex_symbol_pattern(fam, table.params + s.params, a.kind)}
                     for a in fam.alongside]
        columns = ([Markup(mathml.math(mathml.value_inner(t))) for t in s.column_tex] if s.column_tex
                   else [_dash(label(c)) for c in s.columns])
        states = _state_lists(site, fam, s) if fam.layout.row_ket and fam.layout.column_ket else None
        sections.append({"title": s.title, "anchor": s.anchor, "columns": columns, "rows": rows, "states": states,
                         "tex_symbol": _tex_symbol_pattern(fam, table.params + s.params), "alongside": alongside})
    source = site.plan.family(fam.layout.source) if fam.layout.source in site.keys else None
    return site.render(
        "matrix.html",
        page,
        table=table,
        fam=fam,
        layout=fam.layout,
        source_label=source.kind_record.key if source else "",
        row_head=_names_html(fam.layout.row_names),
        column_head=_names_html(fam.layout.column_names),
        sections=sections,
        files=site.files(page, table),
        count=len(table.entries),
    )


PAGES = {"grid": _grid_page, "classes": _classes_page, "matrix": _matrix_page}
INDEX_PARTS = {"grid": _grid_index, "classes": _classes_index, "matrix": _pages_index}

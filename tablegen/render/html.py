"""The HTML pages of a build, plus their stylesheet and script.

``render_html`` walks the plan's pages in order and yields (path, bytes).
Everything a page shows comes from the plan (layout, anchors, links) and the
ValueBook (each value's text forms); this module only chooses which form to
print and turns site paths into links relative to the page.  Values are
written as MathML here, at build time, so the pages read without scripts;
the script adds copy buttons and the jump box on top.
"""

from __future__ import annotations

import json
import posixpath
from dataclasses import dataclass
from functools import lru_cache
from typing import Iterator

from markupsafe import Markup

from ..buildinfo import BuildMeta, bibtex, plain_citation
from ..compute import Shown, ValueBook
from ..notation import symbol_text
from ..plan import Entry, Page, Section, SitePlan, Table
from ..recipe import FAMILY_NAMES
from ..spins import half_text
from . import mathml
from .env import html_environment, templates_dir
from .markdown_pages import render_text_page

__all__ = ["render_html", "relative_url", "ASSETS", "CONVENTION_LINES"]

ASSETS = ("assets/style.css", "assets/site.js")

#: The short convention statement printed on every page of a family.
CONVENTION_LINES = {
    "cg": "Condon–Shortley phase. ⟨j1 m1; j2 m2 | J M⟩ = (−1)^(j1−j2+M) √(2J+1) (j1 j2 J; m1 m2 −M). "
    "Coupling order j1 ⊗ j2; the reversed order differs by (−1)^(j1+j2−J).",
    "3j": "Condon–Shortley phase. (j1 j2 j3; m1 m2 m3) = (−1)^(j1−j2−m3) ⟨j1 m1; j2 m2 | j3 −m3⟩ / √(2j3+1).",
    "6j": "Condon–Shortley phase. W(a b c d; e f) = (−1)^(a+b+c+d) {a b e; d c f}. "
    "All forms of a class (tetrahedral and Regge symmetries) are equal.",
    "9j": "Rows in the order written, {j1 j2 j12; j3 j4 j34; j13 j24 J}. An odd permutation of rows or "
    "columns multiplies it by (−1)^(sum of all nine j); transposing leaves it unchanged.",
}

#: Root-level files written by the data renderer that pages may link to.
_DATA_FILES = ("values.txt", "recipe.toml", "cite.bib")


def relative_url(from_page: str, target: str) -> str:
    """The link from one site path to another ('cg/1x1.html' -> '../3j/1x1.html#...')."""
    path, hash_, anchor = target.partition("#")
    if not path:
        return f"#{anchor}"
    rel = _relative_path(posixpath.dirname(from_page) or ".", path)
    return f"{rel}#{anchor}" if hash_ else rel


@lru_cache(maxsize=8192)
def _relative_path(base: str, path: str) -> str:
    """posixpath.relpath, remembered: a page links to few distinct files, many times."""
    return posixpath.relpath(path, base)


# -- small formatting helpers -------------------------------------------------
def _dash(text: str) -> str:
    """Plain text with typographic minus signs."""
    return text.replace("-", "−")


@dataclass(frozen=True)
class Cell:
    """One value in a grid, ready to print."""

    anchor: str
    tex: str
    math: Markup
    decimal: str
    note: str  # the quantum number not given by row and column (m2)
    twin: str | None  # relative link to the same number in the other family
    zero: bool


@dataclass(frozen=True)
class Term:
    """One term of a ket expansion."""

    sign: str  # '', '+', '−'
    coeff: Markup  # MathML content of |coefficient| ('' when it is 1)
    kets: Markup


@dataclass(frozen=True)
class Row:
    label: str
    anchor: str  # id of the row (3j) or of its ket expansion (CG)
    cells: tuple[Cell | None, ...]
    ket: Markup | None = None  # CG: MathML of |J M>
    terms: tuple[Term, ...] = ()


@dataclass(frozen=True)
class ClassRow:
    """One symmetry class of a 6j or 9j page."""

    anchor: str
    symbol: Markup
    tex: str
    math: Markup
    decimal: str
    plus: tuple[str, ...]  # forms equal to the value
    minus: tuple[str, ...]  # forms equal to minus the value
    w_math: Markup | None = None
    w_tex: str = ""
    w_sign: str = ""
    zero: bool = False


class _Site:
    """What every page of one build shares."""

    def __init__(self, plan: SitePlan, book: ValueBook, meta: BuildMeta) -> None:
        self.plan = plan
        self.book = book
        self.meta = meta
        self.env = html_environment()
        self.families = tuple(f.family for f in plan.recipe.families)

    # links ------------------------------------------------------------------
    def nav(self, page: Page) -> list[dict]:
        items = [{"label": "Index", "href": relative_url(page.path, "index.html"), "current": page.kind == "index"}]
        for fam in self.families:
            items.append({
                "label": {"cg": "CG", "3j": "3j", "6j": "6j & W", "9j": "9j"}[fam],
                "href": relative_url(page.path, f"index.html#{fam}"),
                "current": page.kind == fam,
            })
        for path, label, kind in (
            ("conventions.html", "Conventions", "conventions"),
            ("methods.html", "Methods", "methods"),
            ("cite.html", "Cite", "cite"),
        ):
            items.append({"label": label, "href": relative_url(page.path, path), "current": page.kind == kind})
        return items

    def link(self, page: Page, link) -> dict | None:
        if link is None:
            return None
        return {"label": link.label, "href": relative_url(page.path, link.path)}

    def render(self, template: str, page: Page, **context) -> bytes:
        root = relative_url(page.path, "index.html")[: -len("index.html")]
        text = self.env.get_template(template).render(
            page=page,
            root=root,
            site_title=self.meta.title,
            meta=self.meta,
            nav=self.nav(page),
            prev=self.link(page, page.prev),
            next=self.link(page, page.next),
            related=[self.link(page, r) for r in page.related],
            convention=CONVENTION_LINES.get(page.kind, ""),
            **context,
        )
        return text.encode("utf-8")

    # values -----------------------------------------------------------------
    def shown(self, family: str, key: tuple[int, ...]) -> Shown:
        return self.book[(family, key)]

    def cell(self, page: Page, family: str, entry: Entry, note: str) -> Cell:
        s = self.shown(family, entry.key)
        return Cell(
            anchor=entry.anchor,
            tex=s.tex,
            math=Markup(mathml.value_inner(s.tex)),
            decimal=s.decimal,
            note=note,
            twin=relative_url(page.path, entry.twin) if entry.twin else None,
            zero=not s.value,
        )


# -- CG and 3j pages -----------------------------------------------------------
def _cg_rows(site: _Site, page: Page, section: Section) -> list[Row]:
    rows = []
    for r, tM in enumerate(section.rows):
        cells = []
        terms = []
        for entry in section.grid[r]:
            if entry is None:
                cells.append(None)
                continue
            tj1, tm1, tj2, tm2, tJ, _ = entry.key
            cells.append(site.cell(page, "cg", entry, _dash(half_text(tm2))))
            s = site.shown("cg", entry.key)
            if not s.value:
                continue
            first = not terms
            sign = ("" if first else "+") if s.value.sign > 0 else "−"
            unit = s.tex_abs == "1"
            kets = f"<mtext>{mathml.ket_text(tj1, tm1)}{mathml.ket_text(tj2, tm2)}</mtext>"
            coeff = "" if unit else mathml.value_inner(s.tex_abs)
            terms.append(Term(sign, Markup(coeff), Markup(kets)))
        tJ = section.params[0][1]
        rows.append(
            Row(
                label=_dash(half_text(tM)),
                anchor=section.row_anchors[r],
                cells=tuple(cells),
                ket=Markup(f"<mtext>{mathml.ket_text(tJ, tM)}</mtext>"),
                terms=tuple(terms),
            )
        )
    return rows


def _threej_rows(site: _Site, page: Page, section: Section) -> list[Row]:
    rows = []
    for r, tm3 in enumerate(section.rows):
        cells = []
        for entry in section.grid[r]:
            if entry is None:
                cells.append(None)
                continue
            cells.append(site.cell(page, "3j", entry, _dash(half_text(entry.key[4]))))
        rows.append(Row(label=_dash(half_text(tm3)), anchor=section.row_anchors[r], cells=tuple(cells)))
    return rows


def _files(page: Page, table: Table) -> list[dict]:
    """Links to the table's data and LaTeX files (written by the other renderers)."""
    return [
        {"label": "CSV", "href": relative_url(page.path, table.csv)},
        {"label": "JSON", "href": relative_url(page.path, table.json)},
        {"label": "LaTeX table", "href": relative_url(page.path, table.tex)},
        {"label": "LaTeX sheet", "href": relative_url(page.path, table.tex_sheet)},
    ]


def _pair_page(site: _Site, page: Page) -> bytes:
    table = site.plan.table(page.tables[0])
    family = table.family
    params = dict(table.params)
    tj1, tj2 = params["j1"], params["j2"]
    sections = []
    for section in table.sections:
        rows = _cg_rows(site, page, section) if family == "cg" else _threej_rows(site, page, section)
        sections.append({
            "title": section.title,
            "anchor": section.anchor,
            "value": _dash(half_text(section.params[0][1])),
            "columns": [_dash(half_text(c)) for c in section.columns],
            "rows": rows,
        })
    return site.render(
        "pair.html",
        page,
        table=table,
        family=family,
        j1=half_text(tj1),
        j2=half_text(tj2),
        sections=sections,
        files=_files(page, table),
        count=len(table.entries),
    )


# -- 6j and 9j pages -------------------------------------------------------------
def _class_row(site: _Site, family: str, entry: Entry) -> ClassRow:
    s = site.shown(family, entry.key)
    symbol = mathml.sixj_symbol(entry.key) if family == "6j" else mathml.ninej_symbol(entry.key)
    plus = tuple(symbol_text(family, m) for m, sign in entry.members if sign > 0)
    minus = tuple(symbol_text(family, m) for m, sign in entry.members if sign < 0)
    w_math = None
    w_tex = w_sign = ""
    if entry.w_form is not None:
        w_args, sign = entry.w_form
        w = site.shown("w", w_args)
        w_math = Markup(mathml.w_symbol(w_args) + "<mo>=</mo>" + mathml.value_inner(w.tex))
        w_tex = w.tex
        w_sign = "+" if sign > 0 else "−"
    return ClassRow(
        anchor=entry.anchor,
        symbol=Markup(symbol),
        tex=s.tex,
        math=Markup(mathml.value_inner(s.tex)),
        decimal=s.decimal,
        plus=plus,
        minus=minus,
        w_math=w_math,
        w_tex=w_tex,
        w_sign=w_sign,
        zero=not s.value,
    )


def _symbol_page(site: _Site, page: Page) -> bytes:
    table = site.plan.table(page.tables[0])
    classes = [_class_row(site, table.family, e) for e in table.entries]
    return site.render(
        "symbols.html",
        page,
        table=table,
        family=table.family,
        section=table.sections[0],
        classes=classes,
        forms=sum(len(c.plus) + len(c.minus) for c in classes),
        files=_files(page, table),
    )


# -- index, text and cite pages -------------------------------------------------------
def _pair_grid(site: _Site, page: Page) -> dict | None:
    """The j1 × j2 table of links to CG and 3j pages."""
    pages: dict[tuple[int, int], dict[str, str]] = {}
    for fam in ("cg", "3j"):
        for table in site.plan.tables_of(fam):
            p = dict(table.params)
            pages.setdefault((p["j1"], p["j2"]), {})[fam] = relative_url(page.path, table.page)
    if not pages:
        return None
    js = sorted({a for a, _ in pages} | {b for _, b in pages})
    return {
        "js": [half_text(t) for t in js],
        "rows": [
            (half_text(a), [(half_text(b), pages.get((a, b), {})) for b in js])
            for a in js
        ],
        "families": [f for f in ("cg", "3j") if f in site.families],
    }


def _symbol_lists(site: _Site, page: Page) -> list[dict]:
    out = []
    for fam in ("6j", "9j"):
        tables = site.plan.tables_of(fam)
        if fam not in site.families:
            continue
        items = []
        for t in tables:
            items.append({
                "label": _dash(half_text(dict(t.params)["jmax"])),
                "href": relative_url(page.path, t.page),
                "classes": len(t.entries),
                "forms": sum(e.forms for e in t.entries),
            })
        out.append({"family": fam, "name": FAMILY_NAMES[fam], "pages": items})
    return out


def _summary(site: _Site) -> list[dict]:
    counts = dict(site.meta.counts)
    rows = []
    for f in site.plan.recipe.families:
        pages = dict(site.plan.family_pages).get(f.family, ())
        tables = site.plan.tables_of(f.family)
        forms = sum(e.forms for t in tables for e in t.entries) if f.family in ("6j", "9j") else None
        rows.append({
            "family": f.family,
            "name": FAMILY_NAMES[f.family],
            "range": f.describe(),
            "count": f"{counts.get(f.family, 0):,}",
            "forms": None if forms is None else f"{forms:,}",
            "pages": len(pages),
            "w": sum(1 for t in tables for e in t.entries if e.w_form is not None) if f.family == "6j" else None,
        })
    return rows


def _index_page(site: _Site, page: Page) -> bytes:
    return site.render(
        "index.html",
        page,
        recipe=site.plan.recipe,
        summary=_summary(site),
        pair_grid=_pair_grid(site, page),
        symbol_lists=_symbol_lists(site, page),
        conventions=CONVENTION_LINES,
        booklet=relative_url(page.path, site.plan.booklet),
        data_files=[{"label": f, "href": relative_url(page.path, f)} for f in _DATA_FILES],
    )


def _text_page(site: _Site, page: Page) -> bytes:
    body = render_text_page(page.kind, {"digits": str(site.plan.recipe.digits), "style": site.plan.recipe.latex_style})
    return site.render("text.html", page, body=Markup(body))


def _cite_page(site: _Site, page: Page) -> bytes:
    return site.render(
        "cite.html",
        page,
        bibtex=bibtex(site.meta),
        plain=plain_citation(site.meta),
        recipe_toml=site.meta.recipe_toml,
        data_files=[{"label": f, "href": relative_url(page.path, f)} for f in _DATA_FILES],
    )


_RENDERERS = {
    "index": _index_page,
    "conventions": _text_page,
    "methods": _text_page,
    "cite": _cite_page,
    "cg": _pair_page,
    "3j": _pair_page,
    "6j": _symbol_page,
    "9j": _symbol_page,
}


# -- assets ------------------------------------------------------------------------
def _build_facts(plan: SitePlan) -> dict:
    """What the jump box must know about this build: ranges and 6j/9j page tops."""
    return {
        "families": {f.family: [f.min_tj, f.max_tj] for f in plan.recipe.families},
        "pages": {fam: list(paths) for fam, paths in plan.family_pages if fam in ("6j", "9j")},
    }


def _site_js(plan: SitePlan) -> bytes:
    source = (templates_dir() / "html" / "site.js").read_text(encoding="utf-8")
    facts = json.dumps(_build_facts(plan), sort_keys=True, separators=(",", ":"))
    marker = "/*BUILD*/null"
    if marker not in source:
        raise AssertionError("site.js lacks the /*BUILD*/null marker")
    return source.replace(marker, facts).encode("utf-8")


def _style_css() -> bytes:
    return (templates_dir() / "html" / "style.css").read_bytes()


def render_html(plan: SitePlan, book: ValueBook, meta: BuildMeta) -> Iterator[tuple[str, bytes]]:
    """Every HTML page of the plan, then assets/style.css and assets/site.js."""
    site = _Site(plan, book, meta)
    for page in plan.pages:
        yield page.path, _RENDERERS[page.kind](site, page)
    yield "assets/style.css", _style_css()
    yield "assets/site.js", _site_js(plan)


"""The HTML pages of a build, plus their stylesheet and script.

``render_html`` walks the plan's pages in order and yields (path, bytes).
Everything a page shows comes from the plan (layout, anchors, links), the
family records (titles, labels, conventions) and the computed values (each value's
text forms); this module only chooses which form to print and turns site
paths into links relative to the page.  Family pages are made by the page
builder of their layout (html_layouts.py); values are written as MathML at
build time (mathml.py), so the pages read without scripts; the script adds
copy buttons and the jump box, fed by assets/data.js made from the records
(jumpdata.py).
"""

from __future__ import annotations

from typing import Iterator

from markupsafe import Markup

from ..buildinfo import BuildMeta, bibtex, plain_citation
from ..compute import ComputedValues, FormattedValue
from ..sitemodel import Page, SitePlan, Table
from . import html_layouts
from .env import html_environment, templates_dir
from .jumpdata import jump_script
from .links import relative_url
from .markdown_pages import render_text_page

__all__ = ["render_html", "relative_url", "asset_paths"]

#: Root-level files written by the data renderer that pages may link to.
_DATA_FILES = ("values.txt", "recipe.toml", "cite.bib")
_STYLE, _SCRIPT, _DATA = "assets/style.css", "assets/site.js", "assets/data.js"


def asset_paths() -> tuple[str, ...]:
    """The files render_html writes besides the pages."""
    return (_STYLE, _SCRIPT, _DATA)


class _Site:
    """What every page of one build shares."""

    def __init__(self, plan: SitePlan, book: ComputedValues, meta: BuildMeta) -> None:
        self.plan = plan
        self.book = book
        self.meta = meta
        self.env = html_environment()
        self.keys = {f.key for f in plan.families}

    def nav(self, page: Page) -> list[dict]:
        items = [{"label": "Index", "href": relative_url(page.path, "index.html"), "current": page.kind == "index"}]
        for fam in self.plan.families:
            items.append({
                "label": fam.nav_label,
                "href": relative_url(page.path, f"index.html#{fam.key}"),
                "current": page.kind == fam.key,
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
        fam = self.plan.family(page.kind) if page.kind in self.keys else None
        text = self.env.get_template(template).render(
            page=page,
            root=root,
            site_title=self.meta.title,
            meta=self.meta,
            nav=self.nav(page),
            prev=self.link(page, page.prev),
            next=self.link(page, page.next),
            related=[self.link(page, r) for r in page.related],
            convention=fam.convention if fam else "",
            layout_name=fam.layout.name if fam else "",
            **context,
        )
        return text.encode("utf-8")

    def shown(self, kind: str, key: tuple[int, ...]) -> FormattedValue:
        return self.book[(kind, key)]

    def files(self, page: Page, table: Table) -> list[dict]:
        """Links to the table's data and LaTeX files (written by the other renderers)."""
        return [
            {"label": "CSV", "href": relative_url(page.path, table.csv)},
            {"label": "JSON", "href": relative_url(page.path, table.json)},
            {"label": "LaTeX table", "href": relative_url(page.path, table.tex)},
            {"label": "LaTeX sheet", "href": relative_url(page.path, table.tex_sheet)},
        ]


# -- index, text and cite pages -------------------------------------------------------
def _summary(site: _Site) -> list[dict]:
    counts = dict(site.meta.counts)
    rows = []
    for fam in site.plan.families:
        tables = site.plan.tables_of(fam.key)
        forms = sum(e.forms for t in tables for e in t.entries)
        rows.append({
            "family": fam.key,
            "name": fam.title,
            "range": site.plan.recipe.family(fam.key).describe(),
            "count": f"{counts.get(fam.key, 0):,}",
            "forms": f"{forms:,}" if forms else None,
            "companions": [c.label for c in fam.companions]
            + ([f"values at {' and '.join(a.label for a in fam.alongside)}"] if fam.alongside else []),
            "pages": len(dict(site.plan.family_pages)[fam.key]),
        })
    return rows


def _browse(site: _Site, page: Page) -> list[dict]:
    """The index's browsing sections: runs of families sharing a layout, each family with its links."""
    runs: list[dict] = []
    for fam in site.plan.families:
        item = {"family": fam, **html_layouts.INDEX_PARTS[fam.layout.name](site, page, fam)}
        if runs and runs[-1]["layout"] == fam.layout.name:
            runs[-1]["families"].append(item)
        else:
            runs.append({"layout": fam.layout.name, "families": [item]})
    return runs


def _index_page(site: _Site, page: Page) -> bytes:
    return site.render(
        "index.html",
        page,
        recipe=site.plan.recipe,
        summary=_summary(site),
        browse=_browse(site, page),
        families=site.plan.families,
        booklet=relative_url(page.path, site.plan.booklet),
        data_files=[{"label": f, "href": relative_url(page.path, f)} for f in _DATA_FILES],
    )


def _text_page(site: _Site, page: Page) -> bytes:
    facts = {"digits": str(site.plan.recipe.digits), "style": site.plan.recipe.latex_style}
    body = render_text_page(page.kind, facts)
    if page.kind == "conventions":  # then the sections of the families in this build that bring one
        for name in dict.fromkeys(f.convention_text for f in site.plan.families if f.convention_text):
            body += render_text_page(name, facts)
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


_FIXED_PAGES = {
    "index": _index_page,
    "conventions": _text_page,
    "methods": _text_page,
    "cite": _cite_page,
}


def _page(site: _Site, page: Page) -> bytes:
    if page.kind in _FIXED_PAGES:
        return _FIXED_PAGES[page.kind](site, page)
    return html_layouts.PAGES[site.plan.family(page.kind).layout.name](site, page)


def render_html(plan: SitePlan, book: ComputedValues, meta: BuildMeta) -> Iterator[tuple[str, bytes]]:
    """Every HTML page of the plan, then assets/style.css, assets/site.js and assets/data.js (the jump data)."""
    site = _Site(plan, book, meta)
    for page in plan.pages:
        yield page.path, _page(site, page)
    yield _STYLE, (templates_dir() / "html" / "style.css").read_bytes()
    yield _SCRIPT, (templates_dir() / "html" / "site.js").read_bytes()
    yield _DATA, jump_script(plan)

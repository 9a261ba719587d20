"""The site plan: every page, table, anchor and URL, as pure data.

Planning happens before anything is computed or rendered, so a cross-link can
only point at something the plan contains.  Nothing here does I/O, imports
Jinja or computes a coefficient value; the only maths is combinatorics
(which symbols a range holds, and their symmetry classes), done by each
family's layout record.  :func:`plan_site` loops over the family records and
never asks which family it is planning.

The records the plan is made of live in :mod:`tablegen.sitemodel`; the
page-path and anchor rules in :mod:`tablegen.layouts`, whose patterns are also
written into every page for the jump box (render/jumpdata.py).
"""

from __future__ import annotations

from .families import FAMILIES, Family
from .layouts import symbols_in_range
from .recipe import Recipe
from .sitemodel import Entry, Link, Page, Section, SitePlan, Table, half_for_file_name

__all__ = [
    "Link",
    "Entry",
    "Section",
    "Table",
    "Page",
    "SitePlan",
    "plan_site",
    "half_for_file_name",
    "symbols_in_range",
    "internal_targets",
]

#: The fixed pages after the index: (path, title, kind, ids the page carries).
_TEXT_PAGES = (
    ("conventions.html", "Conventions", "conventions", ()),
    ("methods.html", "How the values are computed and checked", "methods", ()),
    ("cite.html", "How to cite this build", "cite", ("bibtex", "plain", "digest", "recipe")),
)


def plan_site(recipe: Recipe, families: tuple[Family, ...] = FAMILIES) -> SitePlan:
    """Every page and table of the site the recipe asks for, family by family in record order."""
    in_build = [(fam, recipe.family(fam.key)) for fam in families if recipe.family(fam.key) is not None]
    by_key = {fam.key: (fam, f) for fam, f in in_build}
    # the index has a section per family of the build, named by its key
    index_ids = ("contents", "conventions", "find") + tuple(fam.key for fam, _ in in_build)
    pages = [Page("index.html", recipe.title, "index", anchors=index_ids)]
    pages += [Page(path, title, kind, anchors=ids) for path, title, kind, ids in _TEXT_PAGES]
    tables: list[Table] = []
    family_pages = []
    for fam, f in in_build:
        fp, ft = fam.layout.plan(fam, f, by_key.get)
        pages += fp
        tables += ft
        family_pages.append((fam.key, tuple(p.path for p in fp)))
    _check_unique(pages, tables)
    return SitePlan(recipe, tuple(pages), tuple(tables), tuple(family_pages), families=tuple(fam for fam, _ in in_build))


def _check_unique(pages: list[Page], tables: list[Table]) -> None:
    paths = [p.path for p in pages]
    if len(set(paths)) != len(paths):
        raise AssertionError("plan: two pages share a path")
    for t in tables:
        anchors = [s.anchor for s in t.sections] + [e.anchor for s in t.sections for e in s.entries]
        anchors += [a for s in t.sections for a in s.row_anchors]
        if len(set(anchors)) != len(anchors):
            raise AssertionError(f"plan: duplicate anchor on {t.page}")


def internal_targets(plan: SitePlan) -> dict[str, set[str]]:
    """Every page path with the set of ids on it that the plan promises: what a link may point at."""
    out: dict[str, set[str]] = {p.path: set(p.anchors) for p in plan.pages}
    for t in plan.tables:
        ids = out.setdefault(t.page, set())
        for s in t.sections:
            ids.add(s.anchor)
            ids.update(s.row_anchors)
            ids.update(e.anchor for e in s.entries)
    return out

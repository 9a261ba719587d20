"""Build a reference site: plan -> compute -> render -> write -> check, top to bottom.

The one function here reads in the order things happen.  Nothing is written
before the plan and every value exist; everything is written into a staging
folder that replaces the output folder only at the very end.
"""

from __future__ import annotations

import os
import time
from dataclasses import dataclass
from itertools import chain
from typing import Callable

from . import __version__
from .buildinfo import BuildMeta
from .compute import compute_values
from .output import MANIFEST_FORMAT, Staging, check_target, sha256_hex
from .plan import SitePlan, plan_site
from .recipe import Recipe, check_size

__all__ = ["build", "BuildResult", "family_counts"]


@dataclass(frozen=True)
class BuildResult:
    out_dir: str
    pages: int
    files: int
    values: int
    bytes: int
    data_digest: str
    seconds: float


def family_counts(plan: SitePlan) -> tuple[tuple[str, int], ...]:
    """Number of tabulated values per family (6j/9j: one per symmetry class)."""
    counts: dict[str, int] = {}
    for table in plan.tables:
        counts[table.family] = counts.get(table.family, 0) + len(table.entries)
    return tuple((f.family, counts.get(f.family, 0)) for f in plan.recipe.families)


def build(
    recipe: Recipe,
    out_dir: str | os.PathLike = "site",
    *,
    jobs: int | None = None,
    allow_large: bool = False,
    discard_extra: bool = False,
    progress: Callable[[str, int, int], None] | None = None,
) -> BuildResult:
    """Write the site for ``recipe`` into ``out_dir`` (replacing a previous site)."""
    started = time.perf_counter()
    check_size(recipe, allow_large)  # refuse before any computing
    check_target(out_dir, discard_extra)  # refuse before any computing, too

    if progress:
        progress("planning", 0, 0)
    plan = plan_site(recipe)

    book = compute_values(plan, jobs, (lambda d, n: progress("computing", d, n)) if progress else None)

    from .render.data import canonical_values, render_data
    from .render.html import render_html
    from .render.latex import render_latex

    values_txt = canonical_values(book)
    counts = family_counts(plan)
    meta = BuildMeta(
        tool="tablegen",
        version=__version__,
        data_digest=sha256_hex(values_txt),
        recipe_toml=recipe.toml_text(),
        title=recipe.title,
        counts=counts,
    )
    outputs = chain(
        render_html(plan, book, meta),
        render_latex(plan, book, meta),
        render_data(plan, book, meta, values_txt),
    )
    with Staging(out_dir, discard_extra) as site:
        for n, (path, data) in enumerate(outputs, 1):
            site.write(path, data)
            if progress and n % 50 == 0:
                progress("writing", n, 0)
        site.finish(
            {
                "format": MANIFEST_FORMAT,
                "tool": "tablegen",
                "version": __version__,
                "recipe": recipe.as_dict(),
                "counts": dict(counts),
                "pages": len(plan.pages),
                "data_digest": meta.data_digest,
                "data_digest_of": "values.txt",
                "checksums": "SHA256SUMS",
            }
        )
        files, size = len(site.sums), sum(site.sizes.values())
    return BuildResult(
        out_dir=str(site.target),
        pages=len(plan.pages),
        files=files + 1,
        values=len(book),
        bytes=size,
        data_digest=meta.data_digest,
        seconds=time.perf_counter() - started,
    )

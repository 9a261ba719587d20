"""Build a reference site: plan -> compute -> render -> write -> check, top to bottom.

``build`` reads in the order things happen.  Nothing is written before the
plan and every value exist; everything is written into a staging folder that
replaces the output folder only at the very end, after the check that every
internal link and anchor of every page resolves (linkcheck.py, against the
plan).  ``render_site`` is the same pipeline without any I/O: plan -> compute
-> render -> check, returning {path: bytes} (everything but manifest.json and
SHA256SUMS, which output.py adds) and the manifest's fields, for a rebuild in
memory.
"""

from __future__ import annotations

import os
import time
from dataclasses import dataclass
from itertools import chain
from typing import Callable, Iterator

from . import RELEASE_YEAR, __version__
from .buildinfo import BuildMeta
from .compute import ValueBook, compute_values
from .linkcheck import LinkCheck
from .output import MANIFEST_FORMAT, Staging, check_target, sha256_hex
from .plan import SitePlan, plan_site
from .recipe import Recipe, check_size

__all__ = ["build", "BuildResult", "family_counts", "render_outputs", "render_site", "manifest_fields"]


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
    """Number of tabulated values per family (classes layouts: one per symmetry class)."""
    counts: dict[str, int] = {}
    for table in plan.tables:
        counts[table.family] = counts.get(table.family, 0) + len(table.entries)
    return tuple((f.key, counts.get(f.key, 0)) for f in plan.families)


def render_outputs(plan: SitePlan, book: ValueBook) -> tuple[BuildMeta, Iterator[tuple[str, bytes]]]:
    """The build facts and every (path, bytes) of the site in write order (no manifest, no checksums)."""
    from .render.data import canonical_values, render_data
    from .render.html import render_html
    from .render.latex import render_latex

    values_txt = canonical_values(book)
    meta = BuildMeta(
        tool="tablegen",
        version=__version__,
        data_digest=sha256_hex(values_txt),
        recipe_toml=plan.recipe.toml_text(),
        title=plan.recipe.title,
        counts=family_counts(plan),
        release_year=RELEASE_YEAR,
    )
    outputs = chain(
        render_html(plan, book, meta),
        render_latex(plan, book, meta),
        render_data(plan, book, meta, values_txt),
    )
    return meta, outputs


def manifest_fields(plan: SitePlan, meta: BuildMeta) -> dict:
    """What manifest.json says besides its file count and size (output.py adds those)."""
    return {
        "format": MANIFEST_FORMAT,
        "tool": "tablegen",
        "version": __version__,
        "recipe": plan.recipe.as_dict(),
        "counts": dict(meta.counts),
        "pages": len(plan.pages),
        "data_digest": meta.data_digest,
        "data_digest_of": "values.txt",
        "checksums": "SHA256SUMS",
    }


def render_site(recipe: Recipe, *, jobs: int | None = 1) -> tuple[dict[str, bytes], dict]:
    """The whole site in memory, link-checked: ({path: bytes} in write order, manifest fields).  No I/O."""
    plan = plan_site(recipe)
    meta, outputs = render_outputs(plan, compute_values(plan, jobs))
    check = LinkCheck(plan)
    files: dict[str, bytes] = {}
    for path, data in outputs:
        check.add(path, data)
        files[path] = data
    check.finish()
    return files, manifest_fields(plan, meta)


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

    meta, outputs = render_outputs(plan, book)
    check = LinkCheck(plan)
    with Staging(out_dir, discard_extra) as site:
        for n, (path, data) in enumerate(outputs, 1):
            site.write(path, data)
            check.add(path, data)
            if progress and n % 50 == 0:
                progress("writing", n, 0)
        if progress:
            progress("checking links", 0, 0)
        check.finish()  # a broken link stops here, before the swap: the old site stays
        site.finish(manifest_fields(plan, meta))
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

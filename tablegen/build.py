"""Build a reference site: plan -> compute -> render -> write -> check, top to bottom.

``build`` reads in the order things happen.  Every check that can be made
before computing is made first (size, target, text, free disk); the target is
then locked, and everything is written into a staging folder that replaces the
output folder only at the very end, after the check that every internal link
and anchor of every page resolves (linkcheck.py, against the plan).

``render_site`` is the same pipeline without the disk (plan -> compute ->
render, link-checked as the files are read); ``site_files`` adds manifest.json
and SHA256SUMS, which is what ``verify`` compares a site against.
"""

from __future__ import annotations

import os
import time
from dataclasses import dataclass
from itertools import chain
from typing import Callable, Iterable, Iterator

from . import RELEASE_YEAR, __version__
from .buildinfo import BuildMeta
from .compute import ComputedValues, compute_values
from .errors import RecipeError
from .linkcheck import LinkCheck
from .output import MANIFEST, MANIFEST_FORMAT, SUMS, Staging, check_target, seal, sha256_hex
from .plan import SitePlan, plan_site
from .diskweight import check_bytes
from .recipe import Recipe, check_size

__all__ = [
    "build", "BuildResult", "RenderedSite", "family_counts", "render_outputs", "manifest_fields",
    "render_site", "site_files", "sealed_files", "BYTES_PER_VALUE",
]

#: A low estimate of the bytes a site needs per tabulated value (13.2 MB for 17,129 in the default site).
BYTES_PER_VALUE = 400


@dataclass(frozen=True)
class BuildResult:
    out_dir: str
    pages: int
    files: int
    values: int
    bytes: int
    data_digest: str
    seconds: float


@dataclass(frozen=True)
class RenderedSite:
    """A site before it touches the disk: every file (lazily, link-checked as read) and the manifest's fields."""

    plan: SitePlan
    values: int
    files: Iterable[tuple[str, bytes]]
    manifest: dict


def family_counts(plan: SitePlan) -> tuple[tuple[str, int], ...]:
    """Number of tabulated values per family (classes layouts: one per symmetry class)."""
    counts: dict[str, int] = {}
    for table in plan.tables:
        counts[table.family] = counts.get(table.family, 0) + len(table.entries)
    return tuple((f.key, counts.get(f.key, 0)) for f in plan.families)


def render_outputs(plan: SitePlan, book: ComputedValues) -> tuple[BuildMeta, Iterator[tuple[str, bytes]]]:
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
        "checksums": SUMS,
    }


def check_text(recipe: Recipe) -> None:
    """Refuse, before computing, text that cannot be written as UTF-8 (a stray byte from the shell)."""
    for key in ("title", "notes"):
        value = getattr(recipe, key)
        try:
            value.encode("utf-8")
        except UnicodeEncodeError as exc:
            raise RecipeError(key, value, f"holds a byte that is not UTF-8 text (at character {exc.start + 1})") from None


def _link_checked(plan: SitePlan, outputs: Iterable[tuple[str, bytes]]) -> Iterator[tuple[str, bytes]]:
    """Pass the files through, then stop with LinkError if any internal link or anchor does not resolve."""
    check = LinkCheck(plan)
    for path, data in outputs:
        check.add(path, data)
        yield path, data
    check.finish()  # a broken link stops here, before anything is swapped in


def render_site(
    recipe: Recipe, jobs: int | None = None, progress: Callable[[str, int, int], None] | None = None
) -> RenderedSite:
    """Plan and compute; the files are rendered (and link-checked) as they are read."""
    if progress:
        progress("planning", 0, 0)
    plan = plan_site(recipe)

    book = compute_values(plan, jobs, (lambda d, n: progress("computing", d, n)) if progress else None)

    meta, outputs = render_outputs(plan, book)
    return RenderedSite(
        plan=plan, values=len(book), files=_link_checked(plan, outputs), manifest=manifest_fields(plan, meta)
    )


def site_files(recipe: Recipe, jobs: int | None = None) -> Iterator[tuple[str, bytes]]:
    """Every file of the site for ``recipe`` as (relative path, bytes), without writing anything.

    The files come in build order, manifest.json and SHA256SUMS last;
    ``dict(site_files(recipe))`` is the whole site in memory.
    """
    return sealed_files(render_site(recipe, jobs))


def sealed_files(rendered: RenderedSite) -> Iterator[tuple[str, bytes]]:
    """The rendered files, then manifest.json and SHA256SUMS made from them."""
    sums: dict[str, str] = {}
    sizes: dict[str, int] = {}
    for path, data in rendered.files:
        sums[path], sizes[path] = sha256_hex(data), len(data)
        yield path, data
    manifest_bytes, sums_bytes = seal(rendered.manifest, sums, sizes)
    yield MANIFEST, manifest_bytes
    yield SUMS, sums_bytes


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
    estimate = check_size(recipe, allow_large)  # refuse before any computing: values, then bytes
    check_bytes(estimate, allow_large, recipe)
    check_target(out_dir, discard_extra)  # refuse before any computing, too
    check_text(recipe)

    # the target stays locked from here until the swap: a second build of it is refused at once
    with Staging(out_dir, discard_extra) as site:
        site.check_room(sum(estimate.values()) * BYTES_PER_VALUE)
        rendered = render_site(recipe, jobs, progress)
        for n, (path, data) in enumerate(rendered.files, 1):  # link-checked as they pass
            site.write(path, data)
            if progress and n % 50 == 0:
                progress("writing", n, 0)
        site.finish(rendered.manifest)
        files, size = len(site.sums), sum(site.sizes.values())
    return BuildResult(
        out_dir=str(site.target),
        pages=len(rendered.plan.pages),
        files=files + 1,
        values=rendered.values,
        bytes=size,
        data_digest=rendered.manifest["data_digest"],
        seconds=time.perf_counter() - started,
    )

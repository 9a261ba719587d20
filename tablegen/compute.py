"""Compute every value a plan needs, with its text forms, on all cores.

The result is a ValueBook: (kind key, doubled key) -> Shown, for each
table's kind and for the companions its family record names (Racah W beside
a 6j).  Shown carries the
exact value and each text form the renderers print (exact text, signed
square, decimal, LaTeX in the recipe's root style), so that renderers only format.
Work is split into fixed chunks in plan order and reassembled in that order,
so the result does not depend on how many processes ran.
"""

from __future__ import annotations

import os
from dataclasses import dataclass
from typing import Callable, Iterator

from .kinds import kind
from .plan import SitePlan
from .values import Surd

__all__ = ["Shown", "ValueBook", "compute_values", "wanted_keys", "show"]

#: Below this many values one process is faster than starting a pool.
PARALLEL_THRESHOLD = 8_000
CHUNK = 2_000


@dataclass(frozen=True, slots=True)
class Shown:
    """A value and the text forms shown for it."""

    value: Surd
    exact: str
    square: str
    decimal: str
    tex: str  # in the recipe's LaTeX style

    @property
    def tex_abs(self) -> str:
        """LaTeX of |value| in the recipe style (for ket expansions: sign written apart)."""
        return self.tex[1:] if self.tex.startswith("-") else self.tex


ValueBook = dict[tuple[str, tuple[int, ...]], Shown]


def show(value: Surd, digits: int, style: str) -> Shown:
    """All text forms of one value.

    A value that is a function (a rotation function d(beta) as a trigonometric
    polynomial) has no single decimal and no rational square: those forms are
    left empty, the exact text and the LaTeX are still written.
    """
    squared = getattr(value, "squared", None)
    decimal = getattr(value, "decimal", None)
    return Shown(
        value=value,
        exact=str(value),
        square=str(squared()) if squared else "",
        decimal=decimal(digits) if decimal else "",
        tex=value.latex(style),
    )


def wanted_keys(plan: SitePlan) -> list[tuple[str, tuple[int, ...]]]:
    """Every (kind, key) the site shows, in plan order, without repeats."""
    out: dict[tuple[str, tuple[int, ...]], None] = {}
    for table in plan.tables:
        fam = plan.family(table.family)
        for entry in table.entries:
            out[(table.kind, entry.key)] = None
            for c in fam.companions:
                out[(c.kind, c.mapping(entry.key)[0])] = None
            for a in fam.alongside:  # another kind at the same arguments (d^j at a fixed angle)
                out[(a.kind, entry.key)] = None
    return list(out)


def _compute_chunk(args: tuple[list[tuple[str, tuple[int, ...]]], int, str]) -> list[Shown]:
    keys, digits, style = args
    return [show(kind(k).doubled(*key), digits, style) for k, key in keys]


def compute_values(
    plan: SitePlan,
    jobs: int | None = None,
    progress: Callable[[int, int], None] | None = None,
) -> ValueBook:
    """The ValueBook for a plan in ``jobs`` processes.

    Default: all cores once the build is large enough to repay starting them.
    """
    keys = wanted_keys(plan)
    digits, style = plan.recipe.digits, plan.recipe.latex_style
    chunks = [keys[i : i + CHUNK] for i in range(0, len(keys), CHUNK)]
    if jobs is None:
        jobs = (os.cpu_count() or 1) if len(keys) >= PARALLEL_THRESHOLD else 1
    results: list[Shown] = []
    done = 0
    for shown in _run(chunks, digits, style, jobs):
        results.extend(shown)
        done += len(shown)
        if progress:
            progress(done, len(keys))
    return dict(zip(keys, results))


def _worker_start() -> None:
    """Workers die quietly when the pool ends them (the CLI's SIGTERM handler is not theirs)."""
    import signal

    signal.signal(signal.SIGTERM, signal.SIG_DFL)
    signal.signal(signal.SIGINT, signal.SIG_IGN)


def _run(chunks, digits: int, style: str, jobs: int) -> Iterator[list[Shown]]:
    work = [(c, digits, style) for c in chunks]
    if jobs <= 1 or len(work) <= 1:
        for w in work:
            yield _compute_chunk(w)
        return
    import multiprocessing

    # fresh worker processes (not forks of this one): they hold only the engine,
    # not a copy of the plan, which keeps a large build's memory down
    methods = multiprocessing.get_all_start_methods()
    ctx = multiprocessing.get_context("forkserver" if "forkserver" in methods else "spawn")
    with ctx.Pool(jobs, initializer=_worker_start) as pool:
        yield from pool.imap(_compute_chunk, work)

"""Compute every value a plan needs, with its text forms, on all cores.

The result, :data:`ComputedValues`, maps (kind key, doubled key) to a
:class:`FormattedValue` for each table's kind and for the companions its
family record names (Racah W beside a 6j).  A FormattedValue carries the
exact value and each text form the renderers print (exact text, the parts
sign, p, q of sign*sqrt(p/q), decimal, LaTeX in the recipe's style), so that
renderers only format.
Work is split into fixed chunks in plan order and reassembled in that order,
so the result does not depend on how many processes ran.
"""

from __future__ import annotations

import os
from contextlib import closing
from dataclasses import dataclass
from typing import Callable, Iterator

from .errors import RecipeError, TablegenError
from .interrupts import sigint_ignored_by_children, signals_held
from .kinds import kind
from .plan import SitePlan
from .values import Surd

__all__ = [
    "FormattedValue", "ComputedValues", "compute_values", "wanted_keys", "format_value", "worker_count", "ComputeError",
]

#: Below this many values one process is faster than starting a pool.
PARALLEL_THRESHOLD = 8_000
CHUNK = 2_000


@dataclass(frozen=True, slots=True)
class FormattedValue:
    """A value and the text forms shown for it."""

    value: Surd
    exact: str
    parts: tuple[int, int, int] | None  # (sign, p, q) of sign*sqrt(p/q), p/q reduced; None for a function
    decimal: str
    tex: str  # in the recipe's LaTeX style
    zero_rule: str = ""  # a zero value: the selection rule that makes it zero, "id: text" (kind's zero_rule)

    @property
    def tex_abs(self) -> str:
        """LaTeX of |value| in the recipe style (for ket expansions: sign written apart)."""
        return self.tex[1:] if self.tex.startswith("-") else self.tex


class ComputeError(TablegenError):
    """Computing could not finish (a worker process died); nothing was written."""


#: Every value of a build: (kind key, doubled arguments) -> its FormattedValue.
ComputedValues = dict[tuple[str, tuple[int, ...]], FormattedValue]


def format_value(value: Surd, digits: int, style: str, zero_rule: object = None) -> FormattedValue:
    """All text forms of one value.

    A value that is a function (a rotation function d(beta) as a trigonometric
    polynomial) has no single decimal and no parts sign, p, q: those forms are
    left empty, the exact text and the LaTeX are still written.
    """
    decimal = getattr(value, "decimal", None)
    return FormattedValue(
        value=value,
        exact=str(value),
        parts=(value.sign, value.p, value.q) if isinstance(value, Surd) else None,
        decimal=decimal(digits) if decimal else "",
        tex=value.latex(style),
        zero_rule=str(zero_rule) if zero_rule else "",
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


def _compute_chunk(args: tuple[list[tuple[str, tuple[int, ...]]], int, str]) -> list[FormattedValue]:
    keys, digits, style = args
    out = []
    for k, key in keys:
        record = kind(k)
        value = record.doubled(*key)
        out.append(format_value(value, digits, style, record.zero_rule(key) if value == 0 else None))
    return out


def usable_cpus() -> int:
    """CPUs this process may run on (its affinity mask where the platform has one)."""
    try:
        return max(1, len(os.sched_getaffinity(0)))
    except (AttributeError, OSError):
        return os.cpu_count() or 1


def worker_count(jobs: int | None, n_keys: int) -> int:
    """Processes to use: ``jobs`` (checked), capped at the number of chunks and of CPUs.

    Default: all CPUs once the build is large enough to repay starting them.
    """
    if jobs is not None and (isinstance(jobs, bool) or not isinstance(jobs, int) or jobs < 1):
        raise RecipeError("--jobs", jobs, "must be a whole number >= 1")
    chunks = max(1, -(-n_keys // CHUNK))
    if jobs is None:
        jobs = usable_cpus() if n_keys >= PARALLEL_THRESHOLD else 1
    return max(1, min(jobs, chunks, usable_cpus()))


def compute_values(
    plan: SitePlan,
    jobs: int | None = None,
    progress: Callable[[int, int], None] | None = None,
) -> ComputedValues:
    """Every value of a plan with its text forms, computed in up to ``jobs`` processes (see worker_count)."""
    keys = wanted_keys(plan)
    digits, style = plan.recipe.digits, plan.recipe.latex_style
    jobs = worker_count(jobs, len(keys))
    chunks = [keys[i : i + CHUNK] for i in range(0, len(keys), CHUNK)]
    results: list[FormattedValue] = []
    done = 0
    run = _run_serial if jobs <= 1 or len(chunks) <= 1 else _run_workers
    with closing(run(chunks, digits, style, jobs)) as stream:  # workers end here, whatever happens
        for shown in stream:
            results.extend(shown)
            done += len(shown)
            if progress:
                progress(done, len(keys))
    return dict(zip(keys, results))


def _run_serial(chunks, digits: int, style: str, jobs: int) -> Iterator[list[FormattedValue]]:
    for c in chunks:
        yield _compute_chunk((c, digits, style))


def _worker(conn) -> None:
    """One worker process: receive its chunks, compute them in order, send each result back.

    It ignores SIGINT (Ctrl-C reaches the whole terminal group; the main
    process decides and ends the workers) and dies at once on SIGTERM.  If the
    main process goes away mid-conversation the worker ends without a word.
    """
    import signal

    signal.signal(signal.SIGTERM, signal.SIG_DFL)
    signal.signal(signal.SIGINT, signal.SIG_IGN)
    try:
        for w in conn.recv():
            conn.send(_compute_chunk(w))
    except (EOFError, OSError, ValueError, ImportError, MemoryError, __import__("pickle").UnpicklingError):
        pass  # the main process is gone or stopped: it reports what happened, not the worker
    finally:
        conn.close()


def _worker_died(p) -> ComputeError:
    p.join(5)
    return ComputeError(f"a worker process ended unexpectedly (exit status {p.exitcode}); nothing was written")


def _run_workers(chunks, digits: int, style: str, jobs: int) -> Iterator[list[FormattedValue]]:
    """Chunk i is computed by worker i % jobs and read back in chunk order.

    Plain processes and one pipe each, no pool: the main process runs no helper
    threads, so a signal at any moment ends the build at once (a
    multiprocessing.Pool could hang on a futex when its workers died under a
    process-group SIGTERM, or print a traceback from threading at exit).
    """
    import multiprocessing

    # fresh worker processes (not forks of this one): they hold only the engine,
    # not a copy of the plan, which keeps a large build's memory down
    methods = multiprocessing.get_all_start_methods()
    ctx = multiprocessing.get_context("forkserver" if "forkserver" in methods else "spawn")
    work = [(c, digits, style) for c in chunks]
    procs, conns = [], []
    try:
        for k in range(jobs):
            mine, theirs = ctx.Pipe()
            p = ctx.Process(target=_worker, args=(theirs,), daemon=True)
            # a start cut short would leave the child a truncated message to complain about
            with sigint_ignored_by_children():
                try:
                    p.start()
                except (EOFError, OSError):  # the fork server lost the new child before it reported in
                    raise ComputeError("a worker process ended unexpectedly (while starting); nothing was written") from None
            theirs.close()
            procs.append(p)
            conns.append(mine)
        for k, conn in enumerate(conns):
            try:
                conn.send(work[k::jobs])
            except OSError:
                raise _worker_died(procs[k]) from None
        for i in range(len(work)):
            k = i % jobs
            try:
                result = conns[k].recv()
            except (EOFError, OSError):  # closed, or reset when it died with data unread
                raise _worker_died(procs[k]) from None
            yield result
    finally:
        with signals_held():  # a second signal must not cut the clean-up short
            for p in procs:
                if p.exitcode is None:
                    p.kill()
            for p in procs:
                p.join(10)
            for c in conns:
                c.close()

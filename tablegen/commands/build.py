"""``tablegen build``: write the reference site for a recipe (file, options or the default).

Everything the user typed is checked before anything is computed: the recipe
(with the options naming themselves in errors), the size guard, the target
folder and the current folder.
"""

from __future__ import annotations

import sys

from . import emit

__all__ = ["DESCRIPTION", "add_arguments", "run"]

DESCRIPTION = (
    "Write the offline reference site for a recipe (the built-in default recipe when no --recipe "
    "and no family option is given). Family options take a RANGE: MAX, MIN..MAX (e.g. 1/2..7/2) "
    "or 'none' to leave the family out. A build estimated above {values:,} values or {minutes} "
    "minutes of computing is refused unless --allow-large is given."
)


def description() -> str:
    from ..limits import TIME_LIMIT, VALUE_LIMIT

    return DESCRIPTION.format(values=VALUE_LIMIT, minutes=TIME_LIMIT // 60)


def add_arguments(parser) -> None:
    from ..families import FAMILIES
    from ..limits import MAX_DIGITS, MAX_JOBS

    parser.add_argument("--recipe", metavar="FILE", help="TOML recipe file")
    parser.add_argument("--out", metavar="DIR", default="site", help="output folder (default: ./site)")
    for f in FAMILIES:
        parser.add_argument(f"--{f.key}", metavar="RANGE", dest=f"range_{f.key}",
                            help=f"range of {f.range_name} for {f.title}")
    parser.add_argument("--digits", metavar="N", help=f"significant digits of the decimals, 1 to {MAX_DIGITS:,}")
    parser.add_argument("--latex-style", metavar="STYLE", help="LaTeX style of the values: root, rational or inline")
    parser.add_argument("--title", help="title of the build (no control characters)")
    parser.add_argument("--notes", help="notes shown on the index page")
    parser.add_argument("--jobs", metavar="N", help=f"processes for computing, 1 to {MAX_JOBS} (default: all cores)")
    parser.add_argument("--allow-large", action="store_true",
                        help="build even above the size guard (values, time, or j above a kind's one-value limit)")
    parser.add_argument(
        "--discard-extra", action="store_true",
        help="replace an old site even if it holds files its SHA256SUMS does not list (they are deleted)",
    )
    parser.add_argument("--quiet", action="store_true", help="no progress or summary output")


def options_of(ns) -> dict[str, str]:
    """The recipe options the user gave, by option name ('--cg' -> '1/2..7/2')."""
    from ..families import FAMILY_KEYS

    given = {f"--{key}": getattr(ns, f"range_{key}") for key in FAMILY_KEYS}
    given.update({"--digits": ns.digits, "--latex-style": ns.latex_style, "--title": ns.title, "--notes": ns.notes})
    return {k: v for k, v in given.items() if v is not None}


def run(ns) -> int:
    import os
    import signal

    from ..errors import OptionError
    from ..limits import MAX_JOBS
    from ..recipe import recipe_from_options
    from ..spins import count_from_text

    jobs = None if ns.jobs is None else count_from_text(ns.jobs, "--jobs", 1, MAX_JOBS)
    if not ns.out.strip():
        raise OptionError("--out", ns.out, "must name a folder")
    try:
        os.getcwd()
    except OSError:
        raise OptionError("--out", ns.out, "the current folder no longer exists; change to an existing folder") from None
    recipe = recipe_from_options(options_of(ns), ns.recipe)
    from ..build import build

    from ..interrupts import after_stop, stop_once
    from . import AS_PROGRAM

    # a terminated build must clean up: the first SIGINT/SIGTERM becomes an exception, later ones wait
    previous = {s: signal.signal(s, stop_once) for s in (signal.SIGINT, signal.SIGTERM)}
    try:
        return _build_with_progress(ns, recipe, jobs, build)
    finally:
        for s, handler in previous.items():
            signal.signal(s, handler)
        after_stop(process_ends=AS_PROGRAM)


def _build_with_progress(ns, recipe, jobs, build) -> int:
    show = sys.stderr.isatty() and not ns.quiet

    def progress(stage: str, done: int, total: int) -> None:
        if total:
            text = f"{stage} {done:,}/{total:,} values"
        else:
            text = f"{stage} {done:,} files" if done else f"{stage}..."
        print(f"\rtablegen: {text}\033[K", end="", file=sys.stderr, flush=True)

    result = build(
        recipe, ns.out, jobs=jobs, allow_large=ns.allow_large, discard_extra=ns.discard_extra,
        progress=progress if show else None,
    )
    if show:
        print("\r\033[K", end="", file=sys.stderr)
    if not ns.quiet:
        emit(
            f"tablegen: wrote {result.out_dir}: {result.pages} pages, {result.files} files, "
            f"{result.values:,} values, {result.bytes / 1e6:.1f} MB in {result.seconds:.1f} s; "
            f"data digest {result.data_digest}\n"
        )
    return 0

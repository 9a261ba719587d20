"""``tablegen verify DIR``: re-check a built site; exit status 0 only when everything holds."""

from __future__ import annotations

from . import emit

__all__ = ["DESCRIPTION", "add_arguments", "run"]

DESCRIPTION = (
    "Check every file against SHA256SUMS, report missing and extra files, and recompute every "
    "value in the data files. Exit status 0 when everything holds, 1 when a problem is found, "
    "2 when the check cannot be made."
)

#: Longest problem line printed (a forged value can be thousands of digits long).
PROBLEM_MAX = 300


def add_arguments(parser) -> None:
    parser.add_argument("folder", metavar="DIR")


def run(ns) -> int:
    from ..verify import verify_site

    report = verify_site(ns.folder)
    lines = [report.summary()]
    lines += [f"  {_short(problem)}" for problem in report.problems]
    emit("\n".join(lines) + "\n")
    return 0 if report.ok else 1


def _short(line: str) -> str:
    line = "".join(c if c.isprintable() else repr(c)[1:-1] for c in str(line))
    return line if len(line) <= PROBLEM_MAX else line[: PROBLEM_MAX - 3] + "..."

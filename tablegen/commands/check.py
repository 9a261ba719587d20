"""``tablegen check FILE``: judge another program's floating-point values against the exact ones."""

from __future__ import annotations

from . import JSON_FORMAT

__all__ = ["DESCRIPTION", "add_arguments", "run"]

DESCRIPTION = (
    "Read a CSV with columns kind, value and either arguments (space-separated) or arg1..arg9, and "
    "report per kind how many values agree to a relative tolerance, the largest error in ulps, and "
    "every row with a wrong sign, a wrong selection-rule zero or a larger error (--json: as one JSON "
    "object). Exit status 0 all agree, 1 some disagree, 2 bad input."
)


def add_arguments(parser) -> None:
    parser.add_argument("file", metavar="FILE", help="the CSV file ('-': stdin)")
    parser.add_argument("--rtol", metavar="X", help="relative tolerance (default 1e-12)")
    parser.add_argument("--json", action="store_true",
                        help=f"print the report as one JSON object (format {JSON_FORMAT}); errors and bad rows "
                        "become JSON objects on stderr")


def run(ns) -> int:
    from ..check import main_check  # its own report, bad-input lines and exit status

    return main_check(ns.file, ns.rtol, as_json=ns.json)

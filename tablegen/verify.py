"""Re-check a built site: every checksum, the file list, the digest and every value.

``verify_site`` never trusts the site: it recomputes each value found in the
data files (CSV, JSON and values.txt) with the engine and compares the exact
text, the signed square and the decimal, then reports each problem with the
file and the value it concerns.
"""

from __future__ import annotations

import csv
import io
import json
from dataclasses import dataclass, field
from pathlib import Path, PurePosixPath

from .coefficients import parse_arguments
from .kinds import ALL_KINDS
from .errors import OutputError, TablegenError
from .notation import symbol_text
from .output import MANIFEST, SUMS, sha256_hex
from .recipe import MAX_DIGITS
from .render.data import TABLE_FORMAT
from .values import Surd

__all__ = ["verify_site", "Report"]

#: every kind a site may hold (coupling symbols and tabulated functions), from the records
ARGUMENT_NAMES = {k.key: k.arguments for k in ALL_KINDS}
DOUBLED = {k.key: k.doubled for k in ALL_KINDS}


@dataclass
class Report:
    files: int = 0
    values: int = 0
    problems: list[str] = field(default_factory=list)

    @property
    def ok(self) -> bool:
        return not self.problems

    def summary(self) -> str:
        state = "OK" if self.ok else f"{len(self.problems)} problem{'s' * (len(self.problems) != 1)}"
        return f"verify: {self.files} files checked, {self.values} values recomputed and compared: {state}"


class _Engine:
    """Engine values by (family, argument texts), memoised across files."""

    def __init__(self, digits: int | None) -> None:
        self.digits = digits
        self.seen_in_tables: set[tuple[str, tuple[str, ...]]] = set()
        self._cache: dict[tuple[str, tuple[str, ...]], tuple[str, tuple[int, ...], Surd]] = {}

    def value(self, family: str, args: tuple[str, ...]) -> tuple[tuple[int, ...], Surd]:
        key = (family, args)
        hit = self._cache.get(key)
        if hit is None:
            t = parse_arguments(family, args, max_j=10**6)
            hit = (family, t, DOUBLED[family](*t))
            self._cache[key] = hit
        return hit[1], hit[2]


def _check_value(report: Report, engine: _Engine, where: str, family: str, args, exact, square, decimal) -> None:
    report.values += 1
    try:
        t, value = engine.value(family, tuple(args))
    except (TablegenError, TypeError, ValueError) as exc:
        report.problems.append(f"{where}: arguments {' '.join(map(str, args))} cannot be read ({exc})")
        return
    name = symbol_text(family, t)
    if exact is not None and exact != str(value):
        report.problems.append(f"{where}: {name}: exact {exact!r}, but the engine gives {str(value)!r}")
    squared = getattr(value, "squared", None)  # a function has neither a square nor one decimal: ""
    want_square = str(squared()) if squared else ""
    if square is not None and square != want_square:
        report.problems.append(f"{where}: {name}: square {square!r}, but the engine gives {want_square!r}")
    if decimal is not None and engine.digits is not None:
        want = value.decimal(engine.digits) if hasattr(value, "decimal") else ""
        if decimal != want:
            report.problems.append(f"{where}: {name}: decimal {decimal!r}, but the engine gives {want!r}")


def _read_text(root: Path, path: str, report: Report) -> str | None:
    """A file's text, or None with a problem reported if it is not UTF-8."""
    try:
        return (root / path).read_text(encoding="utf-8")
    except UnicodeDecodeError as exc:
        report.problems.append(f"{path}: not UTF-8 text (byte {exc.start})")
        return None


def _check_sums(root: Path, report: Report) -> set[str]:
    listed: dict[str, str] = {}
    text = _read_text(root, SUMS, report) or ""
    for n, line in enumerate(text.splitlines(), 1):
        digest, sep, path = line.partition("  ")
        if not sep or len(digest) != 64:
            report.problems.append(f"{SUMS} line {n}: not '<sha256>  <path>'")
            continue
        listed[path] = digest
    for path, digest in sorted(listed.items()):
        rel = PurePosixPath(path)
        if rel.is_absolute() or ".." in rel.parts:
            report.problems.append(f"{SUMS}: unsafe path {path!r}")
            continue
        f = root.joinpath(*rel.parts)
        if not f.is_file():
            report.problems.append(f"missing file: {path}")
            continue
        report.files += 1
        if sha256_hex(f.read_bytes()) != digest:
            report.problems.append(f"checksum mismatch: {path}")
    present = {p.relative_to(root).as_posix() for p in root.rglob("*") if p.is_file()}
    for extra in sorted(present - set(listed) - {SUMS}):
        report.problems.append(f"extra file not in {SUMS}: {extra}")
    return present


def _family_of_columns(columns: list[str]) -> str | None:
    for family, names in ARGUMENT_NAMES.items():
        if columns[: len(names)] == list(names) and family != "w":
            return family
    return None


def _check_csv(root: Path, path: str, engine: _Engine, report: Report) -> None:
    text = _read_text(root, path, report)
    if text is None:
        return
    rows = list(csv.reader(io.StringIO(text)))
    if not rows:
        report.problems.append(f"{path}: empty")
        return
    head = rows[0]
    family = _family_of_columns(head)
    if family is None or not {"exact", "square", "decimal"} <= set(head):
        report.problems.append(f"{path}: unrecognised header {','.join(head)}")
        return
    n = len(ARGUMENT_NAMES[family])
    ie, iq, idec = head.index("exact"), head.index("square"), head.index("decimal")
    for i, row in enumerate(rows[1:], 2):
        if len(row) != len(head):
            report.problems.append(f"{path} line {i}: {len(row)} fields, expected {len(head)}")
            continue
        _check_value(report, engine, f"{path} line {i}", family, row[:n], row[ie], row[iq], row[idec])
        engine.seen_in_tables.add((family, tuple(row[:n])))
        for other in head:  # kinds at the same arguments (columns <kind>, <kind>_square, <kind>_decimal)
            if other in ARGUMENT_NAMES and f"{other}_decimal" in head:
                at = (head.index(other), head.index(f"{other}_square"), head.index(f"{other}_decimal"))
                _check_value(report, engine, f"{path} line {i}", other, row[:n], *(row[k] for k in at))
                engine.seen_in_tables.add((other, tuple(row[:n])))
        if family == "6j" and "w" in head:
            engine.seen_in_tables.add(("w", tuple(row[head.index("w")].split(" "))))


def _kind_of_family(key: object) -> object:
    """The kind a family's table holds, from its Family record (the key itself if no record has it)."""
    from .families import FAMILIES

    return next((f.kind for f in FAMILIES if f.key == key), key)


def _check_json(root: Path, path: str, engine: _Engine, report: Report) -> None:
    try:
        doc = json.loads((root / path).read_bytes().decode("utf-8"))
    except ValueError as exc:  # UnicodeDecodeError is a ValueError too
        report.problems.append(f"{path}: not valid JSON ({exc})")
        return
    if not isinstance(doc, dict) or doc.get("format") != TABLE_FORMAT:
        report.problems.append(f"{path}: not a {TABLE_FORMAT} file")
        return
    family = _kind_of_family(doc.get("family"))
    if family not in ARGUMENT_NAMES:
        report.problems.append(f"{path}: unknown family {family!r}")
        return
    for i, row in enumerate(doc.get("rows", []), 1):
        try:
            args, exact, square, decimal = row["args"], row["exact"], row["square"], row["decimal"]
        except (KeyError, TypeError):
            report.problems.append(f"{path} row {i}: missing args/exact/square/decimal")
            continue
        _check_value(report, engine, f"{path} row {i}", family, args, exact, square, decimal)
        for other, forms in row.items():  # kinds at the same arguments: {"exact", "square", "decimal"}
            if other in ARGUMENT_NAMES and isinstance(forms, dict) and "exact" in forms:
                _check_value(report, engine, f"{path} row {i}", other, args, forms.get("exact"),
                             forms.get("square"), forms.get("decimal"))


def _check_values_txt(root: Path, engine: _Engine, report: Report) -> None:
    text = _read_text(root, "values.txt", report)
    if text is None:
        return
    listed: set[tuple[str, tuple[str, ...]]] = set()
    for i, line in enumerate(text.splitlines(), 1):
        if not line or line.startswith("#"):
            continue
        parts = line.split(" ")
        family = parts[0]
        if family not in ARGUMENT_NAMES:
            report.problems.append(f"values.txt line {i}: unknown family {family!r}")
            continue
        n = len(ARGUMENT_NAMES[family])
        parts = line.split(" ", n + 1)  # the value is the rest of the line (a function's text has spaces)
        if len(parts) != n + 2:
            report.problems.append(f"values.txt line {i}: expected {n} arguments and a value")
            continue
        _check_value(report, engine, f"values.txt line {i}", family, parts[1 : n + 1], parts[-1], None, None)
        listed.add((family, tuple(parts[1 : n + 1])))
    # the digest covers values.txt, so the tables must hold exactly the same values
    for family, args in sorted(engine.seen_in_tables - listed):
        report.problems.append(f"values.txt: lacks {family} {' '.join(args)}, which a data file tabulates")
    for family, args in sorted(listed - engine.seen_in_tables):
        report.problems.append(f"values.txt: lists {family} {' '.join(args)}, which no CSV table holds")


def verify_site(folder: str) -> Report:
    """Check a built site; the report lists every problem found."""
    root = Path(folder)
    if not root.is_dir():
        raise OutputError(root, "is not a folder")
    if not (root / SUMS).is_file():
        raise OutputError(root, f"has no {SUMS}; is it a tablegen site?")
    report = Report()
    present = _check_sums(root, report)
    digits = None
    if MANIFEST in present:
        try:
            manifest = json.loads((root / MANIFEST).read_bytes().decode("utf-8"))
            digits = manifest["recipe"]["digits"]
            if isinstance(digits, bool) or not isinstance(digits, int) or not 1 <= digits <= MAX_DIGITS:
                report.problems.append(f"{MANIFEST}: recipe digits {digits!r} is not a whole number from 1 to {MAX_DIGITS}")
                digits = None
            if "values.txt" in present:
                actual = sha256_hex((root / "values.txt").read_bytes())
                if manifest.get("data_digest") != actual:
                    report.problems.append(
                        f"{MANIFEST}: data_digest {manifest.get('data_digest')} is not the SHA-256 of values.txt ({actual})"
                    )
        except (ValueError, KeyError, TypeError) as exc:
            report.problems.append(f"{MANIFEST}: unreadable ({exc})")
    else:
        report.problems.append(f"missing file: {MANIFEST}")
    engine = _Engine(digits)
    for path in sorted(present):
        if path.startswith("data/") and path.endswith(".csv"):
            _check_csv(root, path, engine, report)
        elif path.startswith("data/") and path.endswith(".json"):
            _check_json(root, path, engine, report)
    if "values.txt" in present:
        _check_values_txt(root, engine, report)
    else:
        report.problems.append("missing file: values.txt")
    return report

"""Re-check a built site: the fast checks, then the whole site rebuilt and compared byte for byte.

A forger who edits a value and recomputes SHA256SUMS passes any checksum
test, so ``verify_site`` trusts nothing in the site.  It checks every file
against SHA256SUMS and the folder against the listing (fast, and it catches
ordinary damage), then rebuilds the site in memory from the recipe in its own
manifest with the installed engine and compares every file byte for byte,
naming each difference by file, line and, in the data files, by value.  A
site that another tablegen version made cannot be compared byte for byte: verify
says so and recomputes every value of its data files instead (verify_values.py).

Exit statuses (cli.py): 0 the site holds; 1 the site is damaged or forged
(the report lists every problem); 2 verify could not do its work: the folder
is missing, no site, or a file cannot be read (one line on stderr).
"""

from __future__ import annotations

import json
import os
import re
from dataclasses import dataclass, field
from pathlib import Path, PurePosixPath

from . import __version__
from .errors import OutputError, TablegenError
from .output import MANIFEST, SUMS, sha256_hex

__all__ = ["verify_site", "Report"]

#: File differences listed one by one; the rest are counted.
MAX_LISTED = 40
#: Problems listed in all; the summary counts every one.
MAX_PROBLEMS = 200
#: Longest excerpt of a line shown in a problem.
EXCERPT = 60


@dataclass
class Report:
    files: int = 0
    values: int = 0
    method: str = ""
    notes: list[str] = field(default_factory=list)
    problems: list[str] = field(default_factory=list)
    _seen: set[str] = field(default_factory=set, repr=False)

    @property
    def ok(self) -> bool:
        return not self.problems

    def add(self, problem: str) -> None:
        if problem in self._seen:
            return
        self._seen.add(problem)
        if len(self.problems) < MAX_PROBLEMS:
            self.problems.append(problem)
        elif len(self.problems) == MAX_PROBLEMS:
            self.problems.append("... and more problems, not listed")

    def summary(self) -> str:
        """The verdict line, then any notes on how the site was checked."""
        n = len(self._seen)
        state = "OK" if self.ok else f"{n} problem{'s' * (n != 1)}"
        head = f"verify: {self.files} files checked, {self.values} values recomputed and compared{self.method}: {state}"
        return "\n".join([head, *(f"  note: {note}" for note in self.notes)])


class _Site:
    """Read access to the site's files; an unreadable one stops verify with one line."""

    def __init__(self, root: Path) -> None:
        self.root = root

    def read(self, path: str) -> bytes | None:
        rel = PurePosixPath(path)
        if rel.is_absolute() or ".." in rel.parts or not rel.parts:
            return None
        try:
            return self.root.joinpath(*rel.parts).read_bytes()
        except (FileNotFoundError, IsADirectoryError, NotADirectoryError):
            return None
        except OSError as exc:
            raise OutputError(self.root, f"its file {path!r} cannot be read ({exc.strerror or exc}); nothing was checked") from None

    def present(self) -> set[str]:
        """Every file in the folder (symlinks included, as entries), '/'-separated."""
        out: set[str] = set()

        def fail(exc: OSError) -> None:
            where = Path(exc.filename).relative_to(self.root).as_posix() if exc.filename else "."
            raise OutputError(self.root, f"its folder {where!r} cannot be read ({exc.strerror or exc}); nothing was checked")

        for root, dirs, files in os.walk(self.root, onerror=fail):
            rel = Path(root).relative_to(self.root).as_posix()
            for name in files + [d for d in dirs if os.path.islink(os.path.join(root, d))]:
                out.add(name if rel == "." else f"{rel}/{name}")
        return out


def verify_site(folder: str | os.PathLike, jobs: int | None = None) -> Report:
    """Check a built site; the report lists every problem found."""
    root = Path(folder)
    if not root.is_dir():
        raise OutputError(root, "is not a folder")
    site = _Site(root)
    sums_bytes = site.read(SUMS)
    if sums_bytes is None:
        raise OutputError(root, f"has no {SUMS}; is it a tablegen site?")
    report = Report()
    present = site.present()
    listed = _check_sums(site, sums_bytes, present, report)
    for path in sorted(present):
        if (root / path).is_symlink():  # tablegen writes none: its bytes would live outside the site
            report.add(f"{path}: a symbolic link, not a file of the site")
    manifest = _read_manifest(site, report)
    _check_digest(site, manifest, report)
    recipe = _manifest_recipe(manifest, report, present, root)
    made_by = manifest.get("version") if isinstance(manifest, dict) else None
    other = isinstance(made_by, str) and made_by != __version__  # a missing or odd version is a problem, not a version
    if recipe is not None:
        same = _compare_rebuild(site, recipe, present, listed, report, jobs, made_by, other)
        if not other or same:
            return report
    if other:
        report.notes.append(
            f"made by tablegen {made_by[:EXCERPT]}, this is tablegen {__version__}: the files cannot be "
            "compared byte for byte, so every value in every data file (CSV, JSON, values.txt) was "
            "recomputed instead; in the HTML pages, LaTeX files and cite.bib every printed decimal and "
            "data digest was checked, not the place of each value"
        )
    from .verify_values import check_values

    report.values = 0
    report.method = " (value by value)"
    check_values(root, present, site.read, report, manifest)
    return report


def _check_sums(site: _Site, sums_bytes: bytes, present: set[str], report: Report) -> dict[str, str]:
    """Every listed file exists with its digest; nothing unlisted is there."""
    listed: dict[str, str] = {}
    try:
        text = sums_bytes.decode("utf-8")
    except UnicodeDecodeError as exc:
        report.add(f"{SUMS}: not UTF-8 text (byte {exc.start})")
        text = sums_bytes.decode("utf-8", "replace")
    for n, line in enumerate(text.splitlines(), 1):
        digest, sep, path = line.partition("  ")
        if not sep or len(digest) != 64 or not path:
            report.add(f"{SUMS} line {n}: not '<sha256>  <path>'")
            continue
        if path in listed:
            report.add(f"{SUMS} line {n}: lists {_cut(path)} twice")
        listed[path] = digest
    for path, digest in sorted(listed.items()):
        rel = PurePosixPath(path)
        if rel.is_absolute() or ".." in rel.parts:
            report.add(f"{SUMS}: unsafe path {_cut(path)!r}")
            continue
        data = site.read(path)
        if data is None:
            report.add(f"missing file: {path}")
            continue
        report.files += 1
        if sha256_hex(data) != digest:
            report.add(f"checksum mismatch: {path}")
    for extra in sorted(present - set(listed) - {SUMS}):
        report.add(f"extra file not in {SUMS}: {extra}")
    return listed


def _check_digest(site: _Site, manifest: dict | None, report: Report) -> None:
    """The manifest's data digest is the SHA-256 of values.txt."""
    values_txt = site.read("values.txt")
    if values_txt is None:
        report.add("missing file: values.txt")
    elif manifest is not None and manifest.get("data_digest") != sha256_hex(values_txt):
        report.add(
            f"{MANIFEST}: data_digest {_cut(str(manifest.get('data_digest')), 70)} is not the SHA-256 of "
            f"values.txt ({sha256_hex(values_txt)})"
        )


def _read_manifest(site: _Site, report: Report) -> dict | None:
    data = site.read(MANIFEST)
    if data is None:
        report.add(f"missing file: {MANIFEST}")
        return None
    try:
        manifest = json.loads(data.decode("utf-8"))
    except ValueError as exc:
        report.add(f"{MANIFEST}: not valid JSON ({_cut(str(exc))})")
        return None
    if not isinstance(manifest, dict):
        report.add(f"{MANIFEST}: not a JSON object")
        return None
    return manifest


def _manifest_recipe(manifest: dict | None, report: Report, present: set[str], root: Path):
    """The Recipe the manifest names, if it is one this engine can rebuild in reasonable time."""
    if manifest is None:
        return None
    from .build import BYTES_PER_VALUE
    from .recipe import check_size, recipe_from_mapping

    try:
        recipe = recipe_from_mapping(manifest.get("recipe"))
    except TablegenError as exc:
        report.add(f"{MANIFEST}: its recipe cannot be rebuilt ({_cut(str(exc), 120)})")
        return None
    # a forged recipe must not make verify compute for hours: the site it names must be about this big
    need = sum(check_size(recipe, allow_large=True).values()) * BYTES_PER_VALUE
    have = sum((root / p).stat().st_size for p in present if (root / p).is_file())
    if need > 4 * have + 20_000_000:
        report.add(
            f"{MANIFEST}: its recipe makes a site of about {need / 1e6:.0f} MB, far more than the "
            f"{have / 1e6:.1f} MB here; not rebuilt"
        )
        return None
    return recipe


def _compare_rebuild(site, recipe, present, listed, report: Report, jobs, made_by, other: bool) -> bool:
    """Rebuild the site in memory and compare every file; True if every byte agrees."""
    from .build import render_site, sealed_files

    rendered = render_site(recipe, jobs)
    problems: list[str] = []
    made: set[str] = set()
    sums_differ = False
    manifest_bytes = b"{}"
    for path, want in sealed_files(rendered):
        made.add(path)
        if path == MANIFEST:
            manifest_bytes = want
        got = site.read(path)
        if got is None:
            problems.append(f"missing file: {path}")
        elif got != want:
            if path == SUMS:
                sums_differ = True
            else:
                problems.append(describe_difference(path, got, want))
    for extra in sorted(present - made):
        problems.append(
            f"extra file not in {SUMS}: {extra}" if extra not in listed
            else f"extra file: {extra} is listed in {SUMS} but its recipe does not make it"
        )
    if sums_differ and not problems:
        problems.append(f"{SUMS}: differs from the one its recipe makes")
    version_only = (
        made_by != __version__
        and len(problems) == 1
        and site.read(MANIFEST) is not None
        and _manifest_keys_differing(site.read(MANIFEST), manifest_bytes) == ["version"]
    )
    if other and problems and not version_only:
        return False  # another version's site: checked value by value instead
    report.values = rendered.values
    report.method = f", site rebuilt from its recipe and compared byte for byte ({len(made)} files)"
    if version_only:
        problems = [
            f"{MANIFEST}: version {str(made_by)[:EXCERPT]!r} is false: every other byte is what "
            f"tablegen {__version__} makes"
        ]
    problems.sort(key=_weight)  # the manifest and the data files name values best: list them first
    for p in problems[:MAX_LISTED]:
        report.add(p)
    if len(problems) > MAX_LISTED:
        report.add(f"... and {len(problems) - MAX_LISTED} more files that differ from the rebuilt site")
    return not problems


def _weight(problem: str) -> int:
    for n, start in enumerate((MANIFEST, "values.txt", "data/", "latex/", "cite.bib")):
        if problem.startswith(start):
            return n
    return 9


def describe_difference(path: str, got: bytes, want: bytes) -> str:
    """One line naming where ``got`` first departs from ``want`` (line, value, excerpt)."""
    if path == MANIFEST:
        return _manifest_difference(got, want)
    try:
        got_text, want_text = got.decode("utf-8"), want.decode("utf-8")
    except UnicodeDecodeError:
        at = next((i for i, (a, b) in enumerate(zip(got, want)) if a != b), min(len(got), len(want)))
        return f"{path}: differs from the rebuilt file at byte {at + 1}"
    if path.startswith("data/") and path.endswith(".json"):
        table = _table_difference(path, got_text, want_text)
        if table:
            return table
    g, w = got_text.splitlines(), want_text.splitlines()
    i = next((k for k, (a, b) in enumerate(zip(g, w)) if a != b), min(len(g), len(w)))
    size = f" ({len(g)} lines, the rebuilt file has {len(w)})" if len(g) != len(w) else ""
    got_line = g[i] if i < len(g) else None
    want_line = w[i] if i < len(w) else None
    named = _value_named(path, want_text, want_line if want_line is not None else got_line)
    column = _first_column(got_line or "", want_line or "")
    if named and got_line is not None and want_line is not None:
        named += _field_named(path, want_text, want_line, column)
    shown = "the file ends" if got_line is None else _excerpt(got_line, column)
    expected = "the file ends" if want_line is None else _excerpt(want_line, column)
    return f"{path} line {i + 1}{named}: {shown}, where the rebuilt site has {expected}{size}"


def _table_difference(path: str, got_text: str, want_text: str) -> str:
    """The first differing field of a per-table JSON file (one compact line), named by row, value and column.

    Empty when ``got_text`` is not a table at all: the caller then shows the raw excerpt.
    """
    try:
        got, want = json.loads(got_text), json.loads(want_text)
    except ValueError:
        return ""
    if not isinstance(got, dict) or not isinstance(got.get("rows"), list):
        return ""
    for key in want:
        if key != "rows" and got.get(key, ...) != want[key]:
            return f"{path}: {key} is {_cut(json.dumps(got.get(key), ensure_ascii=False))}, " \
                   f"where the rebuilt site has {_cut(json.dumps(want[key], ensure_ascii=False))}"
    rows, columns = want["rows"], want["columns"]
    for i, (g, w) in enumerate(zip(got["rows"], rows)):
        if g != w:
            named = _value_named(path, want_text, w)
            k = next((k for k, (a, b) in enumerate(zip(g, w)) if a != b), min(len(g), len(w))) \
                if isinstance(g, list) else 0
            field = f", {columns[k]}" if k < len(columns) else ""
            shown = _cut(json.dumps(g[k] if isinstance(g, list) and k < len(g) else g, ensure_ascii=False))
            expected = _cut(json.dumps(w[k] if k < len(w) else w, ensure_ascii=False))
            return f"{path} row {i + 1}{named}{field}: {shown}, where the rebuilt site has {expected}"
    return f"{path}: {len(got['rows'])} rows, the rebuilt file has {len(rows)}"


def _manifest_keys_differing(got: bytes, want: bytes) -> list[str] | str:
    """The manifest keys whose values differ from the rebuilt manifest's, or a problem text."""
    try:
        doc = json.loads(got.decode("utf-8"))
    except ValueError as exc:
        return f"{MANIFEST}: not valid JSON ({_cut(str(exc))})"
    if not isinstance(doc, dict):
        return f"{MANIFEST}: not a JSON object"
    expected = json.loads(want.decode("utf-8"))
    return [k for k in list(expected) + [k for k in doc if k not in expected] if doc.get(k, ...) != expected.get(k, ...)]


def _manifest_difference(got: bytes, want: bytes) -> str:
    keys = _manifest_keys_differing(got, want)
    if isinstance(keys, str):
        return keys
    if not keys:
        return f"{MANIFEST}: differs from the rebuilt one in layout only"
    doc, expected = json.loads(got.decode("utf-8")), json.loads(want.decode("utf-8"))

    def shown(d: dict, k: str) -> str:
        return _cut(json.dumps(d[k], ensure_ascii=False)) if k in d else "absent"

    parts = [f"{k} is {shown(doc, k)}, but its recipe gives {shown(expected, k)}" for k in keys]
    return f"{MANIFEST}: " + "; ".join(parts)


def _value_named(path: str, want_text: str, line: "str | list | None") -> str:
    """', value <symbol>' for a line of a data file (or a row of a JSON table), where it names one."""
    if not line:
        return ""
    try:
        from .families import FAMILY_KEYS, family as family_record
        from .kinds import ALL_KINDS, kind
        from .notation import symbol_text

        if path == "values.txt":
            parts = line.split(" ")
            family, args = parts[0], parts[1 : 1 + len(kind(parts[0]).arguments)]
        elif path.endswith(".csv"):
            header = want_text.split("\n", 1)[0]
            family = next(k.key for k in ALL_KINDS if k.key != "w" and header.startswith(",".join(k.arguments) + ","))
            args = line.split(",")[: len(kind(family).arguments)]
        elif path.endswith(".json") and isinstance(line, list):
            family = json.loads(want_text)["family"]
            family = family_record(family).kind if family in FAMILY_KEYS else family  # the kind its table holds
            args = line[: len(kind(family).arguments)]
        else:
            return ""
        return f", value {symbol_text(family, kind(family).parse(tuple(args), 10**6))}"
    except (StopIteration, KeyError, IndexError, ValueError, TypeError, AttributeError, TablegenError):
        return ""


def _field_named(path: str, want_text: str, line: str, column: int) -> str:
    """', <field>' for the field of a data line in which ``column`` falls."""
    if path.endswith(".csv"):
        header = want_text.split("\n", 1)[0].split(",")
        index = line[:column].count(",")
        return f", {header[index]}" if index < len(header) else ""
    if path == "values.txt":
        return ", exact" if line[:column].count(" ") >= len(line.split(" ")) - 1 else ", arguments"
    return ""


def _first_column(a: str, b: str) -> int:
    return next((k for k, (x, y) in enumerate(zip(a, b)) if x != y), min(len(a), len(b)))


def _excerpt(line: str, column: int) -> str:
    """About EXCERPT characters of ``line`` around ``column``, quoted, control characters escaped."""
    start = max(0, column - EXCERPT // 2)
    end = start + EXCERPT
    text = line[start:end]
    text = ("…" if start else "") + text + ("…" if end < len(line) else "")
    return repr(text)


def _cut(text: str, n: int = EXCERPT) -> str:
    text = text.encode("unicode_escape").decode("ascii") if any(c < " " for c in text) else text
    return text if len(text) <= n else text[: n - 1] + "…"

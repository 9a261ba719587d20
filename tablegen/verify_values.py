"""verify's fallback for a site made by another tablegen version: recompute every value.

A byte-for-byte comparison needs the same renderers; a site from another
version can still be checked value by value, because its data files use the
stable ``tablegen-table`` formats (1: a named object per row; 2: typed
columns, as in the CSV, plus the list of equal forms).  Every value in every CSV, JSON table and
values.txt is recomputed with the installed engine (exact text, signed
square, decimal), the sign of each listed symmetry form and of each W is
checked against the engine, the files are checked against each other (the same
rows, in the same order, no repeats) and against the manifest's counts.
"""

from __future__ import annotations

import csv
import hashlib
import io
import json
import re
from pathlib import Path

from . import symmetry
from .errors import TablegenError
from .families import FAMILIES
from .kinds import ALL_KINDS, kind
from .notation import symbol_text
from .recipe import MAX_DIGITS
from .render.data import TABLE_FORMAT
from .values import Surd


def signed_square_text(value: Surd) -> str:
    """The "square" column of sites made by tablegen 0.1.0: sign * p/q as one fraction text."""
    from .intmath import int_text

    if not value.sign:
        return "0"
    text = f"{int_text(value.p)}/{int_text(value.q)}" if value.q != 1 else int_text(value.p)
    return f"-{text}" if value.sign < 0 else text

__all__ = ["check_values"]

#: kind key -> its argument names, for every kind a site may hold (numbers, then the tabulated functions)
ARGUMENTS_OF_KIND = {k.key: k.arguments for k in ALL_KINDS}
#: The family key a data file's rows count under in the manifest, by the kind they hold ("d" -> "rotation").
_FAMILY_OF_KIND = {f.kind: f.key for f in reversed(FAMILIES)}
_TABLE_KIND = {f.key: f.kind for f in FAMILIES}  # a JSON table names its family; its rows hold that family's kind

Key = tuple[str, tuple[str, ...]]


class _Engine:
    """Engine values by (family, argument texts), memoised across files."""

    def __init__(self, digits: int | None) -> None:
        self.digits = digits
        self._cache: dict[Key, tuple[tuple[int, ...], Surd]] = {}

    def value(self, family: str, args: tuple[str, ...]) -> tuple[tuple[int, ...], Surd]:
        key = (family, args)
        hit = self._cache.get(key)
        if hit is None:
            k = kind(family)
            t = k.parse(tuple(args), 10**6)
            hit = (t, k.doubled(*t))
            self._cache[key] = hit
        return hit


class _Checker:
    def __init__(self, root: Path, read, report, digits: int | None) -> None:
        self.root, self.read, self.report = root, read, report
        self.engine = _Engine(digits)
        self.rows: dict[str, dict[str, list[Key]]] = {}  # table stem -> {"csv"/"json": rows}
        self.in_tables: set[Key] = set()
        self.decimals: set[str] = set()

    def _shown(self, value: Surd) -> None:
        """Remember |value| as a decimal: pages and LaTeX may print no other (a function prints none)."""
        if self.engine.digits is not None and isinstance(value, Surd):
            self.decimals.add(value.decimal(self.engine.digits).lstrip("-"))

    def problem(self, text: str) -> None:
        self.report.add(text)

    def text(self, path: str) -> str | None:
        data = self.read(path)
        if data is None:
            return None
        try:
            return data.decode("utf-8")
        except UnicodeDecodeError as exc:
            self.problem(f"{path}: not UTF-8 text (byte {exc.start})")
            return None

    def value(self, where: str, family: str, args, exact, written, decimal) -> Surd | None:
        """``written``: the value's rational parts as the site wrote them, ("square", text) in sites of
        0.1.0 (sign * p/q as one fraction) or ("parts", [sign, p, q]) since, or None."""
        self.report.values += 1
        try:
            t, value = self.engine.value(family, tuple(str(a) for a in args))
        except (TablegenError, TypeError, ValueError) as exc:
            self.problem(f"{where}: arguments {' '.join(map(str, args))[:60]} cannot be read ({exc})")
            return None
        name = symbol_text(family, t)
        self._shown(value)
        if exact is not None and exact != str(value):
            self.problem(f"{where}: {name}: exact {_cut(exact)}, but the engine gives {_cut(str(value))}")
        function = not isinstance(value, Surd)  # a rotation function or a harmonic: no parts, no single decimal
        if written is not None:
            form, got = written
            if function:
                want = "" if form == "square" else ["", "", ""]
                got = got if form == "square" else ["" if x is None else x for x in got]
            else:
                want = signed_square_text(value) if form == "square" else [str(value.sign), str(value.p), str(value.q)]
            if (got if form == "square" else [str(x) for x in got]) != want:
                shown = got if form == "square" else " ".join(map(str, got))
                wanted = want if form == "square" else " ".join(want)
                self.problem(f"{where}: {name}: {'square' if form == 'square' else 'sign, p, q'} {_cut(shown)}, "
                             f"but the engine gives {_cut(wanted)}")
        if decimal is not None and self.engine.digits is not None:
            want = "" if function else value.decimal(self.engine.digits)
            if decimal != want:
                self.problem(f"{where}: {name}: decimal {_cut(decimal)}, but the engine gives {_cut(want)}")
        return value

    def sign_of(self, where: str, family: str, value: Surd | None, form: str, sign, what: str) -> None:
        """A symmetry form or W listed with a sign: the engine must give sign * value there."""
        if value is None:
            return
        try:
            t, there = self.engine.value(family, tuple(form.split(" ")))
        except (TablegenError, TypeError, ValueError, AttributeError) as exc:
            self.problem(f"{where}: {what} {str(form)[:60]!r} cannot be read ({exc})")
            return
        self._shown(there)
        if sign not in (1, -1, "1", "-1") or there != (value if int(sign) == 1 else -value):
            self.problem(
                f"{where}: {what} {symbol_text(family, t)} listed with sign {_cut(sign)}, but the engine gives {_cut(str(there))}"
            )

    def forms(self, where: str, family: str, args, value: Surd | None, forms: list) -> None:
        """Each listed symmetry form with its sign: a member of the class, with the phase the algebra gives.

        The members and their phases (Regge 1958/1959 for 3j and 6j; the 72
        of the 9j, Edmonds 1957 6.4) come from symmetry.py; a form outside the
        class is recomputed with the engine, so a wrong sign never passes.
        """
        if value is None or not forms:
            return
        t, _ = self.engine.value(family, tuple(str(a) for a in args))
        phases = {m: sign for m, sign in symmetry.members(family, *t)} if family in ("3j", "6j", "9j") else {}
        for form in forms:
            if not (isinstance(form, list) and len(form) == 2 and isinstance(form[0], str)):
                self.problem(f"{where}: malformed symmetry form {str(form)[:60]}")
                continue
            try:
                tf = kind(family).parse(tuple(form[0].split(" ")), 10**6)
            except (TablegenError, ValueError, TypeError):
                self.problem(f"{where}: symmetry form {form[0][:60]!r} cannot be read")
                continue
            if tf in phases and form[1] in (1, -1):
                if phases[tf] != form[1] and value:
                    self.problem(
                        f"{where}: symmetry form {symbol_text(family, tf)} listed with sign {form[1]}, "
                        f"but the algebra gives {phases[tf]}"
                    )
            else:
                self.sign_of(where, family, value, form[0], form[1], "symmetry form")

    def csv_table(self, path: str) -> None:
        text = self.text(path)
        if text is None:
            return
        rows = list(csv.reader(io.StringIO(text)))
        head = rows[0] if rows else []
        family = _family_of_columns(head)
        parts_columns = ("square",) if "square" in head else ("sign", "p", "q")
        if family is None or not {"exact", "decimal", *parts_columns} <= set(head):
            self.problem(f"{path}: unrecognised header {','.join(head)[:60]}")
            return
        n = len(ARGUMENTS_OF_KIND[family])
        ie, idec = head.index("exact"), head.index("decimal")
        iparts = [head.index(c) for c in parts_columns]
        iw = head.index("w") if "w" in head else None
        iws = head.index("w_sign") if "w_sign" in head else None
        # kinds tabulated at the same arguments: columns <kind>, <kind>_sign, _p, _q (or _square), _decimal
        beside = [(other, head.index(other), [head.index(f"{other}_{c}") for c in parts_columns],
                   head.index(f"{other}_decimal")) for other in head
                  if other in ARGUMENTS_OF_KIND and {f"{other}_{c}" for c in (*parts_columns, "decimal")} <= set(head)]
        keys = []
        for i, row in enumerate(rows[1:], 2):
            if len(row) != len(head):
                self.problem(f"{path} line {i}: {len(row)} fields, expected {len(head)}")
                continue
            where = f"{path} line {i}"
            written = ("square", row[iparts[0]]) if len(iparts) == 1 else ("parts", [row[k] for k in iparts])
            value = self.value(where, family, row[:n], row[ie], written, row[idec])
            if iw is not None and iws is not None:
                self.sign_of(where, "w", value, row[iw], row[iws], "W")
                self.in_tables.add(("w", tuple(row[iw].split(" "))))
            for other, ie2, iparts2, idec2 in beside:
                parts = ("square", row[iparts2[0]]) if len(iparts2) == 1 else ("parts", [row[k] for k in iparts2])
                self.value(where, other, row[:n], row[ie2], parts, row[idec2])
                self.in_tables.add((other, tuple(row[:n])))
            keys.append((family, tuple(row[:n])))
        self._table_rows(path, "csv", keys)

    def json_table(self, path: str) -> None:
        text = self.text(path)
        if text is None:
            return
        try:
            doc = json.loads(text)
        except ValueError as exc:
            self.problem(f"{path}: not valid JSON ({str(exc)[:60]})")
            return
        if not isinstance(doc, dict) or doc.get("format") not in _TABLE_FORMATS:
            self.problem(f"{path}: not a {TABLE_FORMAT} file")
            return
        family, rows = doc.get("family"), doc.get("rows")
        family = _TABLE_KIND.get(family, family) if isinstance(family, str) else family  # the kind its rows hold
        if not isinstance(family, str) or family not in ARGUMENTS_OF_KIND:
            self.problem(f"{path}: unknown family {str(family)[:60]!r}")
            return
        if not isinstance(rows, list):
            self.problem(f"{path}: 'rows' is {type(rows).__name__}, not a list of rows")
            return
        if doc["format"] != _OLD_TABLE_FORMAT:
            columns = doc.get("columns")
            if not isinstance(columns, list) or not all(isinstance(c, str) for c in columns):
                self.problem(f"{path}: 'columns' is not a list of column names")
                return
            rows = [_named_row(columns, row, len(ARGUMENTS_OF_KIND[family])) for row in rows]
        keys = []
        for i, row in enumerate(rows, 1):
            where = f"{path} row {i}"
            try:
                args, exact, decimal = row["args"], row["exact"], row["decimal"]
                written = ("square", row["square"]) if "square" in row else ("parts", [row["sign"], row["p"], row["q"]])
                if not isinstance(args, list):
                    raise TypeError
            except (KeyError, TypeError):
                self.problem(f"{where}: missing or malformed args/exact/sign/p/q/decimal")
                continue
            value = self.value(where, family, args, exact, written, decimal)
            forms = row.get("forms", [])
            self.forms(where, family, args, value, forms if isinstance(forms, list) else [forms])
            w = row.get("w")
            if w is not None:
                if isinstance(w, dict) and isinstance(w.get("args"), list):
                    self.sign_of(where, "w", value, " ".join(map(str, w["args"])), w.get("sign"), "W")
                else:
                    self.problem(f"{where}: malformed W {str(w)[:60]}")
            for other, forms in row.items():  # kinds at the same arguments: {"exact", "sign", "p", "q", "decimal"}
                if other in ARGUMENTS_OF_KIND and isinstance(forms, dict) and "exact" in forms:
                    parts = (("square", forms.get("square")) if "square" in forms
                             else ("parts", [forms.get("sign"), forms.get("p"), forms.get("q")]))
                    self.value(where, other, args, forms.get("exact"), parts, forms.get("decimal"))
                    self.in_tables.add((other, tuple(map(str, args))))
            keys.append((family, tuple(map(str, args))))
        self._table_rows(path, "json", keys)

    def _table_rows(self, path: str, kind: str, keys: list[Key]) -> None:
        seen: set[Key] = set()
        for family, args in keys:
            if (family, args) in seen:
                self.problem(f"{path}: {family} {' '.join(args)} appears twice")
            seen.add((family, args))
        self.in_tables |= seen
        self.rows.setdefault(path.rsplit(".", 1)[0], {})[kind] = keys

    def values_txt(self) -> set[Key]:
        text = self.text("values.txt")
        listed: set[Key] = set()
        if text is None:
            return listed
        for i, line in enumerate(text.splitlines(), 1):
            if not line or line.startswith("#"):
                continue
            parts = line.split(" ")
            family = parts[0]
            if family not in ARGUMENTS_OF_KIND:
                self.problem(f"values.txt line {i}: unknown family {family[:60]!r}")
                continue
            n = len(ARGUMENTS_OF_KIND[family])
            parts = line.split(" ", n + 1)  # the value is the rest of the line (a function's text may hold spaces)
            if len(parts) != n + 2:
                self.problem(f"values.txt line {i}: expected {n} arguments and a value")
                continue
            key = (family, tuple(parts[1 : n + 1]))
            if key in listed:
                self.problem(f"values.txt line {i}: {family} {' '.join(key[1])} appears twice")
            self.value(f"values.txt line {i}", family, key[1], parts[-1], None, None)
            listed.add(key)
        return listed

    def agreement(self, listed: set[Key], counts) -> None:
        """CSV and JSON hold the same rows; values.txt holds what they hold; the counts fit."""
        for stem, kinds in sorted(self.rows.items()):
            if "csv" in kinds and "json" in kinds and kinds["csv"] != kinds["json"]:
                self.problem(f"{stem}.csv and {stem}.json: hold different rows ({len(kinds['csv'])} and {len(kinds['json'])})")
        for family, args in sorted(self.in_tables - listed)[:20]:
            self.problem(f"values.txt: lacks {family} {' '.join(args)}, which a data file tabulates")
        for family, args in sorted(listed - self.in_tables)[:20]:
            self.problem(f"values.txt: lists {family} {' '.join(args)}, which no data file holds")
        if isinstance(counts, dict):
            found: dict[str, int] = {}
            for kinds in self.rows.values():
                for family, _ in kinds.get("csv", kinds.get("json", [])):
                    key = _FAMILY_OF_KIND.get(family, family)  # the manifest counts by family key
                    found[key] = found.get(key, 0) + 1
            for family in sorted(set(counts) | set(found)):
                if counts.get(family) != found.get(family, 0):
                    self.problem(
                        f"manifest.json: counts says {family}: {counts.get(family)!r}, "
                        f"but the data files hold {found.get(family, 0)}"
                    )


def _cut(value: object, n: int = 60) -> str:
    """A value quoted for a problem line: control characters escaped, at most about n characters."""
    text = repr(value)
    return text if len(text) <= n else text[: n - 1] + "…"


def _family_of_columns(columns: list[str]) -> str | None:
    for family, names in ARGUMENTS_OF_KIND.items():
        if columns[: len(names)] == list(names) and family != "w":
            return family
    return None


def check_values(root: Path, present: set[str], read, report, manifest: dict | None) -> None:
    """Recompute every value of every data file; ``read(path)`` gives a file's bytes or None."""
    digits = None
    if isinstance(manifest, dict):
        recipe = manifest.get("recipe")
        digits = recipe.get("digits") if isinstance(recipe, dict) else None
        if isinstance(digits, bool) or not isinstance(digits, int) or not 1 <= digits <= MAX_DIGITS:
            report.add(f"manifest.json: recipe digits {str(digits)[:60]} is not a whole number from 1 to {MAX_DIGITS}")
            digits = None
    checker = _Checker(root, read, report, digits)
    for path in sorted(present):
        if path.startswith("data/") and path.endswith(".csv"):
            checker.csv_table(path)
        elif path.startswith("data/") and path.endswith(".json"):
            checker.json_table(path)
    listed = checker.values_txt() if "values.txt" in present else set()
    checker.agreement(listed, manifest.get("counts") if isinstance(manifest, dict) else None)
    values_txt = read("values.txt")
    if values_txt is not None:
        _check_digest_mentions(present, read, report, hashlib.sha256(values_txt).hexdigest())
    if digits is not None:
        _check_printed_decimals(present, read, report, checker.decimals)


_LONG_DECIMAL = re.compile(r"(?<![\w.])\d+\.\d{6,}(?![\w.])")


def _check_printed_decimals(present: set[str], read, report, decimals: set[str]) -> None:
    """Every long decimal a page or LaTeX file prints must be the decimal of a value the engine gave.

    A layout-free check of another version's HTML and LaTeX: it catches a
    changed digit, not a value moved to another cell.
    """
    for path in sorted(present):
        if not path.endswith((".html", ".tex")):
            continue
        data = read(path)
        text = data.decode("utf-8", "replace") if data is not None else ""
        for found in _LONG_DECIMAL.findall(text):
            if found not in decimals:
                report.add(f"{path}: prints the decimal {found[:60]}, which is no value of this site")
                break


_DIGEST_LIKE = re.compile(r"\b[0-9a-f]{12}(?:[0-9a-f]{52})?\b")


def _check_digest_mentions(present: set[str], read, report, digest: str) -> None:
    """Pages, LaTeX and cite.bib quote the data digest (whole, or its first 12 digits): it must be the true one.

    This much of the HTML and LaTeX needs no knowledge of another version's layout.
    """
    for path in sorted(present):
        if not path.endswith((".html", ".tex", ".bib")):
            continue
        data = read(path)
        text = data.decode("utf-8", "replace") if data is not None else ""
        for found in _DIGEST_LIKE.findall(text):
            if not digest.startswith(found):
                report.add(f"{path}: quotes the data digest {found}, but values.txt has {digest}")
                break


_OLD_TABLE_FORMAT = "tablegen-table/1"
_TABLE_FORMATS = (_OLD_TABLE_FORMAT, TABLE_FORMAT)


def _named_row(columns: list[str], row: object, n: int) -> object:
    """A format-2 row (cells in the order of ``columns``) as the format-1 object the checks read.

    A row of the wrong shape is passed on as it is, so that the checks report it.
    """
    if not isinstance(row, list) or len(row) != len(columns):
        return row
    cell = dict(zip(columns, row))
    named = {"args": row[:n], **{k: cell[k] for k in ("exact", "sign", "p", "q", "decimal") if k in cell}}
    if "members" in cell:
        named["forms"] = cell["members"]
    if "w" in cell:
        w_args = cell["w"]
        named["w"] = {"args": w_args.split(" ") if isinstance(w_args, str) else w_args, "sign": cell.get("w_sign")}
    for other in columns:  # a kind tabulated at the same arguments: columns <kind>, <kind>_sign, _p, _q, _decimal
        if other in ARGUMENTS_OF_KIND and f"{other}_decimal" in cell:
            named[other] = {"exact": cell[other], **{k: cell.get(f"{other}_{k}") for k in ("sign", "p", "q", "decimal")}}
    return named

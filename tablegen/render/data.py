"""Machine-readable output: per-table CSV and JSON, values.txt, recipe.toml, cite.bib.

values.txt is the canonical plain-text serialisation of every value in the
build, one line per value, sorted by family and arguments; its SHA-256 is the
build's data digest.  It holds exact values only, so the digest changes when a
value (or the set of values) changes, never when the look, the digits or the
tool version change.
"""

from __future__ import annotations

import csv
import io
import json
from typing import Iterator

from ..buildinfo import BuildMeta, bibtex
from ..coefficients import ARGUMENT_NAMES
from ..compute import ValueBook
from ..kinds import KIND_KEYS
from ..plan import SitePlan, Table
from ..spins import half_text

__all__ = ["canonical_values", "render_data", "TABLE_FORMAT", "VALUES_HEADER"]

TABLE_FORMAT = "tablegen-table/1"
VALUES_HEADER = (
    "# tablegen canonical values, format 1\n"
    "# one line per value: family, arguments in the order of the symbol, exact value\n"
    "# families: cg <j1 m1; j2 m2 | J M>, 3j (j1 j2 j3; m1 m2 m3), 6j {j1 j2 j3; j4 j5 j6},\n"
    "#           w W(a b c d; e f), 9j rows in order; Condon-Shortley phase\n"
)


def canonical_values(book: ValueBook) -> bytes:
    """values.txt: every value of the build, sorted, one per line."""
    order = {f: i for i, f in enumerate(KIND_KEYS)}  # registry order: cg, 3j, 6j, w, 9j
    lines = [
        f"{family} {' '.join(half_text(x) for x in key)} {shown.exact}\n"
        for (family, key), shown in sorted(book.items(), key=lambda kv: (order[kv[0][0]], kv[0][1]))
    ]
    return (VALUES_HEADER + "".join(lines)).encode("utf-8")


def _columns(family: str) -> list[str]:
    extra = {"6j": ["forms", "w", "w_sign"], "9j": ["forms"]}.get(family, [])
    return list(ARGUMENT_NAMES[family]) + ["exact", "square", "decimal"] + extra


def _rows(table: Table, book: ValueBook) -> Iterator[list[str]]:
    for entry in table.entries:
        shown = book[(table.family, entry.key)]
        row = [half_text(x) for x in entry.key] + [shown.exact, shown.square, shown.decimal]
        if table.family == "6j":
            w_args, w_sign = entry.w_form
            row += [str(entry.forms), " ".join(half_text(x) for x in w_args), str(w_sign)]
        elif table.family == "9j":
            row.append(str(entry.forms))
        yield row


def _csv(table: Table, book: ValueBook) -> bytes:
    buf = io.StringIO()
    writer = csv.writer(buf, lineterminator="\n")
    writer.writerow(_columns(table.family))
    writer.writerows(_rows(table, book))
    return buf.getvalue().encode("utf-8")


def _json(table: Table, book: ValueBook, meta: BuildMeta, digits: int) -> bytes:
    names = ARGUMENT_NAMES[table.family]
    head = {
        "format": TABLE_FORMAT,
        "tool": f"{meta.tool} {meta.version}",
        "table": table.id,
        "family": table.family,
        "title": table.title,
        "convention": "Condon-Shortley",
        "digits": digits,
        "arguments": list(names),
        "data_digest": meta.data_digest,
    }
    rows = []
    for entry in table.entries:
        shown = book[(table.family, entry.key)]
        row = {
            "args": [half_text(x) for x in entry.key],
            "exact": shown.exact,
            "square": shown.square,
            "decimal": shown.decimal,
        }
        if entry.forms:
            row["forms"] = [[" ".join(half_text(x) for x in m), s] for m, s in entry.members]
        if entry.w_form is not None:
            row["w"] = {"args": [half_text(x) for x in entry.w_form[0]], "sign": entry.w_form[1]}
        rows.append(json.dumps(row, ensure_ascii=False, separators=(",", ":")))
    text = json.dumps(head, ensure_ascii=False, indent=1)[:-2]  # reopen the object
    text += ',\n "rows": [\n  ' + ",\n  ".join(rows) + "\n ]\n}\n"
    return text.encode("utf-8")


def render_data(plan: SitePlan, book: ValueBook, meta: BuildMeta, values_txt: bytes) -> Iterator[tuple[str, bytes]]:
    """Every data file of the build (tables, values.txt, recipe.toml, cite.bib)."""
    for table in plan.tables:
        yield table.csv, _csv(table, book)
        yield table.json, _json(table, book, meta, plan.recipe.digits)
    yield "values.txt", values_txt
    yield "recipe.toml", meta.recipe_toml.encode("utf-8")
    yield "cite.bib", bibtex(meta).encode("utf-8")

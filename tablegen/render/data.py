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
from ..compute import ComputedValues
from ..families import Family, named_symbol
from ..kinds import ALL_KIND_KEYS, kind
from ..plan import SitePlan, Table
from ..spins import half_text

__all__ = ["canonical_values", "render_data", "TABLE_FORMAT", "values_header"]

TABLE_FORMAT = "tablegen-table/2"
_VALUES_PREAMBLE = (
    "# tablegen canonical values, format 1\n"
    "# one line per value: kind, its arguments in the order listed here, exact value\n"
    "# (each kind's phase convention: conventions.html, and 'convention' in every data table)\n"
)


def values_header(kinds: "list[str] | tuple[str, ...]") -> str:
    """The comment lines of values.txt: the preamble, then one line per kind present, from its record.

    It names argument orders only, never a convention, so that no line can
    claim a phase for a kind that has none (6j and 9j have no phase choice).
    """
    lines = [f"#   {k}: {' '.join(kind(k).arguments)}  =  {named_symbol(kind(k))}\n" for k in kinds]
    return _VALUES_PREAMBLE + "".join(lines)


def canonical_values(book: ComputedValues) -> bytes:
    """values.txt: every value of the build, sorted, one per line."""
    order = {f: i for i, f in enumerate(ALL_KIND_KEYS)}  # registry order: cg, 3j, 6j, w, 9j, ..., then functions
    items = sorted(book.items(), key=lambda kv: (order[kv[0][0]], kv[0][1]))
    lines = [f"{k} {' '.join(half_text(x) for x in key)} {shown.exact}\n" for (k, key), shown in items]
    kinds = sorted({k for k, _ in book}, key=order.__getitem__)
    return (values_header(kinds) + "".join(lines)).encode("utf-8")


def _cells(table: Table, fam: Family, book: ComputedValues) -> Iterator[list]:
    """Typed cells of every row, in the order of ``fam.data_columns``.

    Integers stay integers (sign, p, q, counts, companion signs) and a value
    that is a function has no sign, p or q (None); CSV and JSON both write
    these same cells, so the two files cannot disagree.
    """
    for entry in table.entries:
        shown = book[(table.kind, entry.key)]
        row = [half_text(x) for x in entry.key] + [shown.exact, *(shown.parts or (None, None, None)), shown.decimal]
        if entry.forms:
            row.append(entry.forms)
        for c in fam.companions:
            args, sign = c.mapping(entry.key)
            row += [" ".join(half_text(x) for x in args), sign]
        for a in fam.alongside:  # another kind at the same arguments: its exact, sign, p, q and decimal
            other = book[(a.kind, entry.key)]
            row += [other.exact, *(other.parts or (None, None, None)), other.decimal]
        yield row


def _csv(table: Table, fam: Family, book: ComputedValues) -> bytes:
    buf = io.StringIO()
    writer = csv.writer(buf, lineterminator="\n")
    writer.writerow(fam.data_columns)
    writer.writerows(["" if x is None else str(x) for x in row] for row in _cells(table, fam, book))
    return buf.getvalue().encode("utf-8")


def _json(table: Table, fam: Family, book: ComputedValues, meta: BuildMeta, digits: int) -> bytes:
    """The CSV's columns with their types, plus (for symbols filed by class) every equal form.

    One compact line: the file is for programs (the CSV is the one to read
    by eye), and naming every field in every row doubled its size.
    """
    columns = list(fam.data_columns)
    rows = list(_cells(table, fam, book))
    if "forms" in columns:
        columns.append("members")
        for row, entry in zip(rows, table.entries):
            row.append([[" ".join(half_text(x) for x in m), s] for m, s in entry.members])
    doc = {
        "format": TABLE_FORMAT,
        "tool": f"{meta.tool} {meta.version}",
        "table": table.id,
        "family": table.family,
        "title": table.title,
        "convention": fam.convention,
        "digits": digits,
        "arguments": list(fam.kind_record.arguments),
        "data_digest": meta.data_digest,
        "columns": columns,
        "rows": rows,
    }
    return (json.dumps(doc, ensure_ascii=False, separators=(",", ":")) + "\n").encode("utf-8")


def render_data(plan: SitePlan, book: ComputedValues, meta: BuildMeta, values_txt: bytes) -> Iterator[tuple[str, bytes]]:
    """Every data file of the build (tables, values.txt, recipe.toml, cite.bib)."""
    for table in plan.tables:
        fam = plan.family(table.family)
        yield table.csv, _csv(table, fam, book)
        yield table.json, _json(table, fam, book, meta, plan.recipe.digits)
    yield "values.txt", values_txt
    yield "recipe.toml", meta.recipe_toml.encode("utf-8")
    yield "cite.bib", bibtex(meta).encode("utf-8")

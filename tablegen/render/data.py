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
from ..compute import ValueBook
from ..families import Family
from ..kinds import ALL_KIND_KEYS, KIND_KEYS
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
#: Added to the header only when the build holds function-valued kinds (a build without them keeps its digest).
FUNCTIONS_HEADER = (
    "#           d j m' m: d^j_{m'm}(beta) = <j m'|exp(-i beta Jy)|j m>, d(pi/2), d(pi/3) its values there;\n"
    "#           Y l m: Y_l^m(theta, phi), the (-1)^m in Y\n"
)


def canonical_values(book: ValueBook) -> bytes:
    """values.txt: every value of the build, sorted, one per line."""
    order = {f: i for i, f in enumerate(ALL_KIND_KEYS)}  # registry order: cg, 3j, 6j, w, 9j, then functions
    lines = [
        f"{family} {' '.join(half_text(x) for x in key)} {shown.exact}\n"
        for (family, key), shown in sorted(book.items(), key=lambda kv: (order[kv[0][0]], kv[0][1]))
    ]
    header = VALUES_HEADER + (FUNCTIONS_HEADER if any(k not in KIND_KEYS for k, _ in book) else "")
    return (header + "".join(lines)).encode("utf-8")


def _rows(table: Table, fam: Family, book: ValueBook) -> Iterator[list[str]]:
    """CSV rows in the order of ``fam.data_columns``."""
    for entry in table.entries:
        shown = book[(table.kind, entry.key)]
        row = [half_text(x) for x in entry.key] + [shown.exact, shown.square, shown.decimal]
        if entry.forms:
            row.append(str(entry.forms))
        for c in fam.companions:
            args, sign = c.mapping(entry.key)
            row += [" ".join(half_text(x) for x in args), str(sign)]
        for a in fam.alongside:
            other = book[(a.kind, entry.key)]
            row += [other.exact, other.square, other.decimal]
        yield row


def _csv(table: Table, fam: Family, book: ValueBook) -> bytes:
    buf = io.StringIO()
    writer = csv.writer(buf, lineterminator="\n")
    writer.writerow(fam.data_columns)
    writer.writerows(_rows(table, fam, book))
    return buf.getvalue().encode("utf-8")


def _json(table: Table, fam: Family, book: ValueBook, meta: BuildMeta, digits: int) -> bytes:
    head = {
        "format": TABLE_FORMAT,
        "tool": f"{meta.tool} {meta.version}",
        "table": table.id,
        "family": table.family,
        "title": table.title,
        "convention": "Condon-Shortley",
        "digits": digits,
        "arguments": list(fam.kind_record.arguments),
        "data_digest": meta.data_digest,
    }
    rows = []
    for entry in table.entries:
        shown = book[(table.kind, entry.key)]
        row = {
            "args": [half_text(x) for x in entry.key],
            "exact": shown.exact,
            "square": shown.square,
            "decimal": shown.decimal,
        }
        if entry.forms:
            row["forms"] = [[" ".join(half_text(x) for x in m), s] for m, s in entry.members]
        for c in fam.companions:
            args, sign = c.mapping(entry.key)
            row[c.kind] = {"args": [half_text(x) for x in args], "sign": sign}
        for a in fam.alongside:
            other = book[(a.kind, entry.key)]
            row[a.kind] = {"exact": other.exact, "square": other.square, "decimal": other.decimal}
        rows.append(json.dumps(row, ensure_ascii=False, separators=(",", ":")))
    body = json.dumps(head, ensure_ascii=False, indent=1)[:-2]  # reopen the object: one row per line below
    body += ',\n "rows": [\n  ' + ",\n  ".join(rows) + "\n ]\n}\n"
    return body.encode("utf-8")


def render_data(plan: SitePlan, book: ValueBook, meta: BuildMeta, values_txt: bytes) -> Iterator[tuple[str, bytes]]:
    """Every data file of the build (tables, values.txt, recipe.toml, cite.bib)."""
    for table in plan.tables:
        fam = plan.family(table.family)
        yield table.csv, _csv(table, fam, book)
        yield table.json, _json(table, fam, book, meta, plan.recipe.digits)
    yield "values.txt", values_txt
    yield "recipe.toml", meta.recipe_toml.encode("utf-8")
    yield "cite.bib", bibtex(meta).encode("utf-8")

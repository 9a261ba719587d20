"""Machine-readable output: per-table CSV and JSON, values.txt, recipe.toml and the digest.

Rows are compared with the engine and with sympy.physics.wigner, an outside
implementation of the same symbols (Condon-Shortley phase), including the
correctly rounded decimal.
"""

from __future__ import annotations

import csv
import hashlib
import io
import json
import re
from math import gcd
from decimal import ROUND_HALF_EVEN, Context, Decimal
from fractions import Fraction
from pathlib import Path

import pytest
from sympy import N, Rational, sign as sympy_sign
from sympy.physics.wigner import clebsch_gordan, racah, wigner_3j, wigner_6j, wigner_9j

from tablegen.build import family_counts
from tablegen.buildinfo import BuildMeta
from tablegen.compute import compute_values
from tablegen.kinds import kind
from tablegen.output import sha256_hex
from tablegen.plan import plan_site
from tablegen.recipe import load_recipe, recipe_from_mapping
from tablegen.render.data import canonical_values, render_data

SMALL = {"cg": {"max_j": 1}, "3j": {"max_j": 1}, "6j": {"max_j": 1}, "9j": {"max_j": "1/2"}}

HEADERS = {  # argument order of each symbol as written in README's tour
    "cg": ["j1", "m1", "j2", "m2", "J", "M"],
    "3j": ["j1", "j2", "j3", "m1", "m2", "m3"],
    "6j": ["j1", "j2", "j3", "j4", "j5", "j6"],
    "9j": ["j11", "j12", "j13", "j21", "j22", "j23", "j31", "j32", "j33"],
}
EXTRA = {"cg": [], "3j": [], "6j": ["forms", "w", "w_sign"], "9j": ["forms"]}


class Data:
    """One small build's data files, made without the HTML and LaTeX renderers."""

    def __init__(self, mapping: dict) -> None:
        self.recipe = recipe_from_mapping(mapping)
        self.plan = plan_site(self.recipe)
        self.book = compute_values(self.plan, jobs=1)
        self.values_txt = canonical_values(self.book)
        self.meta = BuildMeta(
            tool="tablegen",
            version="0.0.test",
            data_digest=sha256_hex(self.values_txt),
            recipe_toml=self.recipe.toml_text(),
            title=self.recipe.title,
            counts=family_counts(self.plan),
        )
        self.pairs = list(render_data(self.plan, self.book, self.meta, self.values_txt))
        self.files = dict(self.pairs)


@pytest.fixture(scope="module")
def data() -> Data:
    return Data(SMALL)


@pytest.fixture(scope="module")
def data_rational_30() -> Data:
    return Data(dict(SMALL, digits=30, latex_style="rational"))


# -- outside reference -----------------------------------------------------------------------
def _q(text: str) -> Rational:
    return Rational(Fraction(text))


def _reference(family: str, args: list[str]):
    """The exact value from sympy.physics.wigner (Condon-Shortley phase)."""
    a = [_q(x) for x in args]
    if family == "cg":  # <j1 m1; j2 m2 | J M>; sympy's order is (j1, j2, J, m1, m2, M)
        j1, m1, j2, m2, J, M = a
        return clebsch_gordan(j1, j2, J, m1, m2, M)
    if family == "3j":
        return wigner_3j(*a)
    if family == "6j":
        return wigner_6j(*a)
    if family == "w":
        return racah(*a)
    return wigner_9j(*a, prec=None)


def _signed_square(value) -> Fraction:
    square = (value**2).expand()
    assert square.is_Rational, value
    return Fraction(int(square.p), int(square.q)) * int(sympy_sign(value))


_EXACT = re.compile(r"^(-?)(?:sqrt\((\d+)(?:/(\d+))?\)|(\d+)(?:/(\d+))?)$")


def _parse_exact(text: str) -> Fraction:
    """Signed square of an exact text '-sqrt(p/q)', 'sqrt(p)', 'p/q', '-p' or '0'."""
    m = _EXACT.match(text)
    assert m, f"exact value {text!r} is not in the documented form"
    sign = -1 if m.group(1) else 1
    if m.group(2) is not None:
        p, q = int(m.group(2)), int(m.group(3) or 1)
        square = Fraction(p, q)
        assert square.denominator == q and square.numerator == p, f"{text!r} is not in lowest terms"
    else:
        root = Fraction(int(m.group(4)), int(m.group(5) or 1))
        square = root * root
    return sign * square


def _check_decimal(text: str, ref, digits: int) -> None:
    """text is ref correctly rounded to `digits` significant digits (half to even)."""
    if ref == 0:
        assert Decimal(text) == 0, text
        return
    approx = Decimal(str(N(ref, digits + 25)))
    want = Context(prec=digits, rounding=ROUND_HALF_EVEN).create_decimal(approx)
    got = Decimal(text)
    assert got == want, (text, str(want))
    mantissa = re.sub(r"[eE].*$", "", text).lstrip("-").replace(".", "").lstrip("0")
    assert len(mantissa) == digits, f"{text!r} does not show {digits} significant digits"


def _csv_rows(data: Data, table) -> list[list[str]]:
    return list(csv.reader(io.StringIO(data.files[table.csv].decode("utf-8"))))


# -- files ------------------------------------------------------------------------------------
def test_one_csv_and_one_json_per_table(data: Data) -> None:
    paths = [p for p, _ in data.pairs]
    assert len(paths) == len(set(paths))
    expected = {f for t in data.plan.tables for f in (t.csv, t.json)} | {"values.txt", "recipe.toml", "cite.bib"}
    assert set(paths) == expected
    for t in data.plan.tables:
        assert t.csv == f"data/{t.id}.csv" and t.json == f"data/{t.id}.json"


@pytest.mark.parametrize("which", ["data", "data_rational_30"])
def test_csv_rows_match_engine_and_sympy(request, which: str) -> None:
    data: Data = request.getfixturevalue(which)
    digits = data.recipe.digits
    checked = 0
    for table in data.plan.tables:
        rows = _csv_rows(data, table)
        assert rows[0] == HEADERS[table.family] + ["exact", "sign", "p", "q", "decimal"] + EXTRA[table.family]
        assert len(rows) - 1 == len(table.entries), table.id
        n = len(HEADERS[table.family])
        for row, entry in zip(rows[1:], table.entries):
            assert len(row) == len(rows[0])
            args, exact, decimal = row[:n], row[n], row[n + 4]
            sign, p, q = (int(x) for x in row[n + 1 : n + 4])
            assert [Fraction(a) * 2 for a in args] == list(entry.key)  # quantum numbers
            engine = kind(table.family).doubled(*entry.key)
            assert exact == str(engine)
            ref = _reference(table.family, args)
            assert (_parse_exact(exact) == _signed_square(ref)) if ref else exact == "0", (table.id, row)
            # the value is sign * sqrt(p/q), p/q in lowest terms (zero: 0, 0, 1)
            assert sign in (-1, 0, 1) and p >= 0 and q >= 1 and gcd(p, q) == 1
            assert sign * Fraction(p, q) == _parse_exact(exact)
            if ref:
                assert sign == int(sympy_sign(ref))
            _check_decimal(decimal, ref, digits)
            checked += 1
            if table.family == "6j":
                forms, w_args, w_sign = row[n + 5 :]
                assert int(forms) == len(entry.members)
                # W(a b c d; e f) = (-1)^(a+b+c+d) {a b e; d c f} -- Edmonds 1957, §6.2
                w_ref = racah(*[_q(x) for x in w_args.split()])
                assert (_signed_square(w_ref) == int(w_sign) * _parse_exact(exact)) if w_ref else exact == "0"
            elif table.family == "9j":
                assert int(row[n + 5]) == len(entry.members)
    assert checked == sum(len(t.entries) for t in data.plan.tables) > 100


def test_a_few_values_by_hand(data: Data) -> None:
    # spot checks that do not depend on any library
    rows = {tuple(r[:6]): r for r in _csv_rows(data, data.plan.table("cg-j1-1-j2-1"))[1:]}
    # <1 1; 1 -1 | 0 0> = 1/sqrt(3): |0 0> = (|1,-1> - |0,0> + |-1,1>)/sqrt(3) for two
    # spin-1 particles -- common practice, no source
    assert rows[("1", "1", "1", "-1", "0", "0")][6:11] == ["sqrt(1/3)", "1", "1", "3", "0.577350269189626"]
    # <1 0; 1 0 | 1 0> = 0 by parity (j1 + j2 + J odd) -- Edmonds 1957, §3.7
    assert rows[("1", "0", "1", "0", "1", "0")][6:11] == ["0", "0", "0", "1", "0"]
    six = {tuple(r[:6]): r for t in data.plan.tables_of("6j") for r in _csv_rows(data, t)[1:]}
    # {1 1 1; 1 1 1} = 1/6 -- Edmonds 1957, Table 5, closed forms with one j = 1 (from memory)
    assert six[("1", "1", "1", "1", "1", "1")][6:10] == ["1/6", "1", "1", "36"]


def test_json_is_valid_and_matches_csv(data: Data) -> None:
    for table in data.plan.tables:
        text = data.files[table.json].decode("utf-8")
        doc = json.loads(text)
        assert text.count("\n") == 1 and text.endswith("}\n")  # one compact line, written by json.dumps
        assert doc["format"] == "tablegen-table/2"
        assert doc["table"] == table.id and doc["family"] == table.family
        assert doc["arguments"] == HEADERS[table.family]
        assert doc["convention"] == data.plan.family(table.family).convention
        if table.family in ("6j", "9j"):  # no phase choice of their own (Edmonds 1957, ch. 6)
            assert "Condon" not in doc["convention"] and "No phase choice" in doc["convention"]
        assert doc["digits"] == data.recipe.digits
        assert doc["data_digest"] == data.meta.data_digest
        rows = _csv_rows(data, table)
        header, rows = rows[0], rows[1:]
        n = len(HEADERS[table.family])
        # the JSON carries the CSV's columns with the same names and meanings, then the list of equal forms
        assert doc["columns"][: len(header)] == header
        assert doc["columns"][len(header):] == (["members"] if "forms" in header else [])
        assert len(doc["rows"]) == len(rows) == len(table.entries)
        for row, csv_row, entry in zip(doc["rows"], rows, table.entries):
            assert len(row) == len(doc["columns"])
            assert row[:n] == csv_row[:n] and all(type(x) is str for x in row[:n])
            assert [row[n], str(row[n + 1]), str(row[n + 2]), str(row[n + 3]), row[n + 4]] == csv_row[n : n + 5]
            assert all(type(row[k]) is int for k in range(n + 1, n + 4))
            if table.family in ("6j", "9j"):
                members = row[header.index("forms") + 1 :][-1]
                assert len(members) == len(entry.members) == int(csv_row[n + 5]) == row[n + 5]
                key_value = kind(table.family).doubled(*entry.key)
                for form, sign in members:
                    member = [int(Fraction(x) * 2) for x in form.split()]
                    # every listed form equals sign * this symbol (Regge 1958/1959 symmetries)
                    assert kind(table.family).doubled(*member) == key_value * sign
            if table.family == "6j":
                iw = header.index("w")
                assert [row[iw], str(row[iw + 1])] == csv_row[iw : iw + 2] and type(row[iw + 1]) is int
            else:
                assert "w" not in doc["columns"]


# -- values.txt and the digest ---------------------------------------------------------------
_ORDER = {"cg": 0, "3j": 1, "6j": 2, "w": 3, "9j": 4}
_ARITY = {"cg": 6, "3j": 6, "6j": 6, "w": 6, "9j": 9}


def _value_lines(data: Data) -> list[tuple[str, tuple[int, ...], str]]:
    text = data.files["values.txt"].decode("utf-8")
    assert text.endswith("\n")
    out = []
    for line in text.splitlines():
        if line.startswith("#"):
            assert not out, "comment after the first value line"
            continue
        parts = line.split(" ")
        family = parts[0]
        assert family in _ORDER, line
        assert len(parts) == _ARITY[family] + 2, line
        out.append((family, tuple(int(Fraction(x) * 2) for x in parts[1:-1]), parts[-1]))
    return out


def test_values_txt_one_sorted_line_per_value(data: Data) -> None:
    lines = _value_lines(data)
    keys = [(f, k) for f, k, _ in lines]
    assert len(keys) == len(set(keys)) == len(data.book)
    assert keys == sorted(keys, key=lambda fk: (_ORDER[fk[0]], fk[1]))
    for family, key, exact in lines:
        assert exact == str(kind(family).doubled(*key))
    # every tabulated value and every W form is in it, with the same exact text
    present = {(f, k): e for f, k, e in lines}
    for table in data.plan.tables:
        n = len(HEADERS[table.family])
        for row in _csv_rows(data, table)[1:]:
            key = tuple(int(Fraction(x) * 2) for x in row[:n])
            assert present[(table.family, key)] == row[n]
        for c in data.plan.family(table.family).companions:
            for entry in table.entries:
                assert (c.kind, c.mapping(entry.key)[0]) in present


def test_values_txt_header_names_each_kind_and_its_argument_order(data: Data) -> None:
    text = data.values_txt.decode("utf-8")
    header = [line for line in text.splitlines() if line.startswith("#")]
    kinds = sorted({f for f, _, _ in _value_lines(data)}, key=_ORDER.__getitem__)
    listed = [line.split(":")[0].lstrip("# ").strip() for line in header[3:]]
    assert listed == kinds  # one line per kind present, in the order of the lines
    for line, k in zip(header[3:], kinds):
        # W(a b c d; e f) in Racah's letters (Racah 1942); the others as in README's tour
        assert line.split(":", 1)[1].split("=")[0].split() == list(HEADERS.get(k, "a b c d e f".split()))
    # no blanket phase claim: 6j and 9j have no phase choice of their own (Edmonds 1957, ch. 6)
    assert not any("Condon" in line for line in header)


def test_values_txt_values_agree_with_sympy(data: Data) -> None:
    for family, key, exact in _value_lines(data)[::3]:  # a third of them keeps this quick
        ref = _reference(family, [str(Fraction(t, 2)) for t in key])
        assert (_parse_exact(exact) == _signed_square(ref)) if ref else exact == "0", (family, key)


def test_values_txt_does_not_depend_on_digits_or_style(data: Data, data_rational_30: Data) -> None:
    # README: the digest "changes when a value changes, not when the look does"
    assert data.values_txt == data_rational_30.values_txt
    assert data.meta.data_digest == data_rational_30.meta.data_digest
    assert data.files["data/cg-j1-1-j2-1.csv"] != data_rational_30.files["data/cg-j1-1-j2-1.csv"]  # digits differ


def test_digest_is_sha256_of_values_txt(data: Data) -> None:
    assert data.meta.data_digest == hashlib.sha256(data.files["values.txt"]).hexdigest()
    assert data.meta.data_digest in data.files["cite.bib"].decode("utf-8")


def test_recipe_toml_reads_back(tmp_path: Path, data: Data) -> None:
    path = tmp_path / "recipe.toml"
    path.write_bytes(data.files["recipe.toml"])
    assert load_recipe(str(path)) == data.recipe


def test_data_files_of_a_real_build(tmp_path: Path) -> None:
    from tablegen.build import build

    out = tmp_path / "site"
    result = build(recipe_from_mapping(SMALL), out, jobs=1)
    manifest = json.loads((out / "manifest.json").read_text(encoding="utf-8"))
    digest = hashlib.sha256((out / "values.txt").read_bytes()).hexdigest()
    assert manifest["data_digest"] == digest == result.data_digest
    assert manifest["data_digest_of"] == "values.txt"
    for path in sorted((out / "data").glob("*.json")):
        assert json.loads(path.read_text(encoding="utf-8"))["data_digest"] == digest, path.name
    assert digest in (out / "cite.bib").read_text(encoding="utf-8")
    # the same bytes as the renderer gives without the rest of the build
    expected = Data(SMALL)
    for path, body in expected.files.items():
        if path not in ("cite.bib",) and not path.endswith(".json"):  # these name the version
            assert (out / path).read_bytes() == body, path

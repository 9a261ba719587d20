"""The matrix layout, end to end, with a small family made for this test.

The family (conftest.SIXJ_MATRICES) shows 6j symbols {j1 j2 j3; j4 j5 j6} as recoupling matrices: for
fixed (j1, j2, j4, j5), rows j3 and columns j6.  Up to the factors
(-1)^(...) sqrt((2 j3 + 1)(2 j6 + 1)) this is the matrix that recouples three
angular momenta, so its columns are orthonormal with the weight (2j3+1)(2j6+1):
sum_j3 (2j3+1)(2j6+1) {j1 j2 j3; j4 j5 j6} {j1 j2 j3; j4 j5 j6'} = delta(j6, j6')
(Edmonds 1957, eq. 6.2.9).  It is not in the default recipe; it shows that
a new family on the matrix layout needs only a record.
"""

from __future__ import annotations

import csv
import io
import json
import re
from fractions import Fraction

import pytest

from tablegen.build import render_outputs
from tablegen.compute import compute_values
from tablegen.families import Family
from tablegen.layouts import MatrixBlock, MatrixLayout
from tablegen.linkcheck import LinkCheck
from tablegen.plan import plan_site
from tablegen.recipe import FamilyRange, Recipe
from tablegen.render.jumpdata import jump_data
from tablegen.values import ExactSum

from conftest import SIXJ_MATRICES as TOY


@pytest.fixture(scope="module")
def built():
    recipe = Recipe(title="Matrix layout test", families=(FamilyRange("6jm", 0, 3),))
    plan = plan_site(recipe, families=(TOY,))
    book = compute_values(plan, jobs=1)
    meta, outputs = render_outputs(plan, book)
    return plan, book, dict(outputs)


def test_matrices_are_orthonormal(built):
    # Edmonds 1957, eq. 6.2.9: the recoupling matrix is orthogonal
    plan, book, _ = built
    checked = 0
    for table in plan.tables:
        for s in table.sections:
            for a, ca in enumerate(s.columns):
                for b, cb in enumerate(s.columns):
                    total = ExactSum()
                    for r, j3 in enumerate(s.rows):
                        ea, eb = s.grid[r][a], s.grid[r][b]
                        total += (j3 + 1) * (ca + 1) * book[("6j", ea.key)].value * book[("6j", eb.key)].value
                    assert total == (1 if a == b else 0), (s.anchor, ca, cb)
                    checked += 1
    assert checked > 100


def test_page_has_labelled_rows_and_columns(built):
    plan, book, files = built
    table = plan.tables[3]
    page = files[table.page].decode("utf-8")
    assert '<th class="corner"><i>j</i><sub>3</sub> ╲ <i>j</i><sub>6</sub></th>' in page
    for s in table.sections:
        assert f'<section id="{s.anchor}"' in page
        for r, anchor in enumerate(s.row_anchors):
            assert f'<tr id="{anchor}"><th scope="row">' in page
        for e in s.entries:
            assert f'<td id="{e.anchor}" data-t="{book[("6j", e.key)].tex}"' in page
    assert 'data-layout="matrix"' in page


def test_latex_and_data_files(built):
    plan, book, files = built
    table = plan.tables[0]
    tex = files[table.tex].decode("utf-8")
    # a tabular per block, for the author's table or table* (longtable stops two-column documents)
    assert tex.count("\\begin{tabular}") == len(table.sections) and "longtable" not in tex
    assert "j_3 \\backslash j_6" in tex
    rows = list(csv.reader(io.StringIO(files[table.csv].decode("utf-8"))))
    assert rows[0] == ["j1", "j2", "j3", "j4", "j5", "j6", "exact", "sign", "p", "q", "decimal"]
    assert len(rows) - 1 == len(table.entries)
    data = json.loads(files[table.json])
    assert data["arguments"] == rows[0][:6]
    for row, e in zip(data["rows"], table.entries):
        assert [Fraction(x) * 2 for x in row[:6]] == list(e.key)
        assert row[data["columns"].index("exact")] == book[("6j", e.key)].exact


def test_every_link_resolves_and_the_jump_patterns_match(built):
    plan, _, files = built
    check = LinkCheck(plan)
    for path, data in files.items():
        check.add(path, data)
    assert check.finish() > 0
    fam = jump_data(plan)["families"]["6jm"]
    assert fam["layout"] == "matrix" and fam["params"] == ["j1", "j2", "j4", "j5"]
    half = lambda t: str(t // 2) if t % 2 == 0 else f"{t}/2"
    code = lambda t: str(t // 2) if t % 2 == 0 else f"{t // 2}.5"
    for table in plan.tables:
        for e in table.entries:
            named = dict(zip(("j1", "j2", "j3", "j4", "j5", "j6"), e.key))
            fill = lambda p, f: re.sub(r"\{([^}]+)\}", lambda m: f(named[m.group(1)]), p)
            assert fill(fam["page"], code) == table.page
            assert fill(fam["anchor"], half) == e.anchor


# -- a family whose values are functions: the rotation matrix d^j(beta), one matrix per j --------
def _d_blocks(lo: int, hi: int):
    for tj in range(lo, hi + 1):
        ms = tuple(range(tj, -tj - 1, -2))  # rows m' and columns m from j down to -j
        yield MatrixBlock((("j", tj),), ms, ms, lambda tmp, tm, tj=tj: (tj, tmp, tm))


def test_a_function_valued_family_renders_as_matrices():
    # a family of its own on the d kind (the registry lists it among the tabulated functions)
    rot = Family(
        key="d",
        kind="d",
        title="Wigner rotation functions d^j(β)",
        nav_label="d(β)",
        layout=MatrixLayout(block=("j",), row="mp", column="m", blocks=_d_blocks),
        convention="d^j_{m′m}(β) = ⟨j m′| exp(−iβJ_y) |j m⟩, Condon–Shortley phase.",
    )
    plan = plan_site(Recipe(title="Rotation test", families=(FamilyRange("d", 0, 2),)), families=(rot,))
    book = compute_values(plan, jobs=1)
    files = dict(render_outputs(plan, book)[1])
    # d^1_{00}(beta) = cos(beta), d^1_{10}(beta) = -sin(beta)/sqrt(2) (Edmonds 1957, table 4.1 — from memory)
    assert book[("d", (2, 0, 0))].exact == "cos(beta)"
    assert book[("d", (2, 2, 0))].exact == "-sqrt(1/2)*sin(beta)"
    assert book[("d", (2, 0, 0))].decimal == ""  # a function has no single decimal
    page = files["d/j-1.html"].decode("utf-8")
    assert '<td id="j=1;mp=0,m=0" data-t="\\cos \\beta"' in page
    assert "<mi>cos</mi>" in page
    rows = list(csv.reader(io.StringIO(files["data/d-j-1.csv"].decode("utf-8"))))
    assert rows[0] == ["j", "mp", "m", "exact", "sign", "p", "q", "decimal"] and len(rows) == 1 + 9
    # a function has no parts sign, p, q: those fields are empty
    assert all(r[3:7] != ["", "", "", ""] and r[4:7] == ["", "", ""] for r in rows[1:])
    assert "\\cos \\beta" in files["latex/d-j-1.tex"].decode("utf-8")


def test_two_families_of_one_kind_get_distinct_jump_entries():
    from tablegen.families import family

    recipe = Recipe(families=(FamilyRange("6j", 0, 1), FamilyRange("6jm", 0, 1)))
    plan = plan_site(recipe, families=(family("6j"), TOY))
    ids = [(k["id"], k["family"]) for k in jump_data(plan)["kinds"]]
    assert ids == [("6j", "6j"), ("w", "6j"), ("6j@6jm", "6jm")]

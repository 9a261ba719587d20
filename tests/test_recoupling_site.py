"""The recoupling families on the site (issue 10): pages, data, LaTeX, links to the symbols, exact values.

The family ``recouple3`` shows <((j1 j2)j12 j3)J | (j1 (j2 j3)j23)J> as one
matrix per (j1, j2, j3, J) on the matrix layout, each cell linked to the 6j
it is made of when the build tabulates that 6j.
"""

from __future__ import annotations

import csv
import io
import itertools
import json
import shutil
import subprocess
from collections import Counter
from fractions import Fraction

import pytest

from tablegen.build import build, render_outputs
from tablegen.compute import compute_values
from tablegen.families import family
from tablegen.kinds.recoupling import recouple3, sixj_of_recouple3
from tablegen.linkcheck import LinkCheck
from tablegen.plan import plan_site
from tablegen.recipe import DEFAULT_RECIPE, FamilyRange, Recipe, estimate_size
from tablegen.values import ExactSum, Surd
from tablegen.verify import verify_site

RANGE = FamilyRange("recouple3", 1, 3)  # leaves 1/2 <= j <= 3/2 (the default recipe goes to 2)


@pytest.fixture(scope="module")
def built():
    recipe = Recipe(title="Recoupling test", families=(FamilyRange("6j", 0, 9), RANGE))  # every 6j of the matrices
    plan = plan_site(recipe)
    book = compute_values(plan, jobs=1)
    _, outputs = render_outputs(plan, book)
    return plan, book, dict(outputs)


def _sections(plan):
    for table in plan.tables_of("recouple3"):
        for s in table.sections:
            yield table, s


def test_every_matrix_is_orthogonal(built):
    # common practice, no source: a change of orthonormal basis is an orthogonal matrix (real entries)
    plan, book, _ = built
    blocks = 0
    for _, s in _sections(plan):
        n = len(s.rows)
        assert n == len(s.columns), s.anchor  # both trees span the same space
        m = [[book[("recouple3", s.grid[r][c].key)].value for c in range(n)] for r in range(n)]
        for a, b in itertools.combinations_with_replacement(range(n), 2):
            rows, cols = ExactSum(), ExactSum()
            for k in range(n):
                rows += m[a][k] * m[b][k]
                cols += m[k][a] * m[k][b]
            want = 1 if a == b else 0
            assert rows == want and cols == want, (s.anchor, a, b)
        blocks += 1
    assert blocks == sum(1 for _ in family("recouple3").layout.blocks(RANGE.min_tj, RANGE.max_tj)) > 50


def _brute_force(t):
    """Sum over all m of CG products along both trees, with sympy's CG (sympy.physics.quantum.cg) as reference."""
    from sympy import Rational, S
    from sympy.physics.quantum.cg import CG

    j1, j2, j3, J, j12, j23 = (Rational(x, 2) for x in t)
    M = J  # the overlap does not depend on M
    total = S(0)
    for m1 in (j1 - k for k in range(int(2 * j1) + 1)):
        for m2 in (j2 - k for k in range(int(2 * j2) + 1)):
            m3 = M - m1 - m2
            if abs(m3) > j3 or abs(m1 + m2) > j12 or abs(m2 + m3) > j23:
                continue
            left = CG(j1, m1, j2, m2, j12, m1 + m2).doit() * CG(j12, m1 + m2, j3, m3, J, M).doit()
            right = CG(j2, m2, j3, m3, j23, m2 + m3).doit() * CG(j1, m1, j23, m2 + m3, J, M).doit()
            total += left * right
    return total


def test_entries_agree_with_brute_force_cg_sums(built):
    # reference library: sympy's CG coefficients, exactly, on every 5th cell
    import sympy

    plan, book, _ = built
    keys = [e.key for _, s in _sections(plan) for e in s.entries]
    sample = keys[::5]
    assert len(sample) > 60
    for key in sample:
        want = _brute_force(key)
        assert sympy.simplify(book[("recouple3", key)].value.to_sympy() - want) == 0, key


def test_entries_equal_the_6j_formula_and_link_to_that_6j(built):
    # Edmonds 1957, eq. 6.1.5: <(j1 j2)j12, j3; J | j1, (j2 j3)j23; J>
    #   = (-1)^(j1+j2+j3+J) sqrt((2j12+1)(2j23+1)) {j1 j2 j12; j3 J j23}
    plan, book, files = built
    six = family("6j")
    six_range = plan.recipe.family("6j")
    linked = 0
    for table, s in _sections(plan):
        page = files[table.page].decode("utf-8")
        for e in s.entries:
            j1, j2, j3, J, j12, j23 = e.key
            sym = sixj_of_recouple3(e.key)
            sixj = six.kind_record.doubled(*sym)
            sign = -1 if (j1 + j2 + j3 + J) // 2 % 2 else 1
            assert book[("recouple3", e.key)].value ** 2 == (j12 + 1) * (j23 + 1) * sixj ** 2, e.key
            assert (book[("recouple3", e.key)].value * sign * sixj >= 0), e.key
            # the link names the class page and anchor of that 6j, as the 6j layout record writes them
            target = six.layout.locate(six, six_range, sym)
            assert e.source == target is not None
            canon = six.layout.filed_by(*sym)[0][0]  # the class as the 6j pages file it (tetrahedral forms)
            path, anchor = target.split("#")
            assert path.startswith("6j/j1-") and anchor == six.layout.anchor(canon, six.kind_record.notation.groups)
            assert f'id="{anchor}"' in files[path].decode("utf-8")
            assert f'href="../{target}"' in page
            linked += 1
    assert linked == len([e for t in plan.tables_of("recouple3") for e in t.entries])


def test_links_only_to_6j_symbols_the_build_tabulates():
    # 6j only up to j = 1: a cell links to its 6j only when that 6j has every j <= 1, which is when the
    # 6j pages hold its class (they file classes under the tetrahedral symmetries, which only permute the
    # entries; Regge partners are linked from there, not filed); every link resolves
    recipe = Recipe(families=(FamilyRange("6j", 0, 2), FamilyRange("recouple3", 0, 2)))
    plan = plan_site(recipe)
    entries = [e for t in plan.tables_of("recouple3") for e in t.entries]
    with_link = [e for e in entries if e.source]
    assert 0 < len(with_link) < len(entries)
    for e in entries:
        assert bool(e.source) == all(x <= 2 for x in sixj_of_recouple3(e.key)), e.key
    book = compute_values(plan, jobs=1)
    check = LinkCheck(plan)
    for path, data in render_outputs(plan, book)[1]:
        check.add(path, data)
    assert check.finish() > 0
    # without the 6j family in the build there are no links at all
    alone = plan_site(Recipe(families=(FamilyRange("recouple3", 0, 2),)))
    assert not any(e.source for t in alone.tables for e in t.entries)


def test_page_data_and_latex(built):
    plan, book, files = built
    table = plan.tables_of("recouple3")[2]
    page = files[table.page].decode("utf-8")
    assert '<th class="corner"><i>j</i><sub>12</sub> ╲ <i>j</i><sub>23</sub></th>' in page
    assert "(−1)^(j1+j2+j3+J)" in page  # the convention is stated
    rows = list(csv.reader(io.StringIO(files[table.csv].decode("utf-8"))))
    assert rows[0] == ["j1", "j2", "j3", "J", "j12", "j23", "exact", "sign", "p", "q", "decimal"]
    assert len(rows) - 1 == len(table.entries)
    for row, e in zip(rows[1:], table.entries):
        assert [int(Fraction(x) * 2) for x in row[:6]] == list(e.key)
        assert row[6] == book[("recouple3", e.key)].exact
    doc = json.loads(files[table.json])
    assert doc["family"] == "recouple3" and len(doc["rows"]) == len(table.entries)
    tex = files[table.tex].decode("utf-8")
    assert tex.count("\\begin{tabular}") == len(table.sections)  # one tabular block per matrix (two-column safe)
    assert "{}j_{12} \\backslash j_{23}" in tex
    # values.txt lists every recoupling value under its kind
    values = files["values.txt"].decode("utf-8")
    assert sum(1 for line in values.splitlines() if line.startswith("recouple3 ")) == len(
        {e.key for t in plan.tables_of("recouple3") for e in t.entries})


@pytest.mark.parametrize("key, lo, hi", [("recouple3", 0, 3), ("recouple3", 1, 4), ("recouple3", 2, 2),
                                          ("recouple4", 1, 2), ("lsjj", 0, 6), ("lsjj", 1, 3), ("state3", 1, 2),
                                          ("state4", 1, 2), ("state4", 0, 1)])
def test_size_estimate_is_the_exact_count(key, lo, hi):
    recipe = Recipe(families=(FamilyRange(key, lo, hi),))
    n = sum(len(t.entries) for t in plan_site(recipe).tables)
    assert estimate_size(recipe)[key] == n > 0


def test_size_guard_refuses_a_huge_recoupling_recipe():
    # beyond the exactly counted span the guard extrapolates (span^6) instead of enumerating every block
    from tablegen.errors import TooLargeError
    from tablegen.recipe import check_size

    with pytest.raises(TooLargeError, match=r"recipe too large .*recouple3: [0-9,]+\)"):
        check_size(Recipe(families=(FamilyRange("recouple3", 0, 200),)))
    assert check_size(Recipe(families=(FamilyRange("recouple3", 0, 4),)))["recouple3"] == 1359
    # the coupled states count their cells from the m-polynomials of the leaves (listing 10^10 cells of the
    # exactly counted span would hang the guard); the count is the plan's (test_size_estimate_is_the_exact_count)
    for key in ("state3", "state4"):
        with pytest.raises(TooLargeError, match=rf"recipe too large .*{key}: [0-9,]+\)"):
            check_size(Recipe(families=(FamilyRange(key, 0, 40),)))


def test_default_recipe_has_the_families():
    # the issue: three leaves j1, j2, j3 <= 2 (from 1/2: a leaf 0 only gives 1 x 1 matrices), LS-jj for l <= 3,
    # small four-leaf matrices (leaves 1/2 and 1), three and four spins 1/2 written out in product states
    assert DEFAULT_RECIPE.family("recouple3") == FamilyRange("recouple3", 1, 4)
    assert DEFAULT_RECIPE.family("recouple4") == FamilyRange("recouple4", 1, 2)
    assert DEFAULT_RECIPE.family("lsjj") == FamilyRange("lsjj", 0, 6)
    assert DEFAULT_RECIPE.family("state3") == FamilyRange("state3", 1, 1)
    assert DEFAULT_RECIPE.family("state4") == FamilyRange("state4", 1, 1)


def test_a_built_site_verifies(tmp_path):
    # verify recomputes every recoupling value of the data files through the kind record
    out = tmp_path / "site"
    build(Recipe(families=(FamilyRange("6j", 0, 2), FamilyRange("recouple3", 0, 2))), out, jobs=1)
    report = verify_site(str(out))
    assert report.ok, report.problems
    assert report.values > 0
    # a forged value is caught
    csv_path = next((out / "data").glob("recouple3-*.csv"))
    text = csv_path.read_text()
    forged = text.replace("sqrt(1/3)", "sqrt(1/4)", 1)
    assert forged != text
    csv_path.write_text(forged)
    assert not verify_site(str(out)).ok


def test_fragment_compiles(built, tmp_path):
    # the LaTeX sheet of one table compiles with pdflatex (skipped when TeX is not installed)
    pdflatex = shutil.which("pdflatex")
    if pdflatex is None:
        pytest.skip("pdflatex not found: LaTeX of the recoupling tables NOT compiled")
    plan, _, files = built
    table = plan.tables_of("recouple3")[-1]
    (tmp_path / "sheet.tex").write_bytes(files[table.tex_sheet])
    for path, data in files.items():
        if path.startswith("latex/") and path != table.tex_sheet:
            (tmp_path / path.split("/", 1)[1]).write_bytes(data)
    proc = subprocess.run([pdflatex, "-interaction=nonstopmode", "-halt-on-error", "sheet.tex"], cwd=tmp_path,
                          capture_output=True, text=True, errors="replace", timeout=300)
    assert proc.returncode == 0, proc.stdout[-3000:]


def test_kind_value_matches_engine_api():
    # the kind evaluates through the engine's public recoupling function (one path for API, CLI and site)
    from tablegen.recoupling import recoupling

    for key in ((2, 2, 2, 2, 0, 2), (1, 1, 2, 2, 2, 1), (3, 1, 4, 4, 2, 5)):
        names = dict(zip(("j1", "j2", "j3", "J", "j12", "j23"), (Fraction(x, 2) for x in key)))
        assert recouple3(*key) == recoupling("((j1 j2)j12 j3)J", "(j1 (j2 j3)j23)J",
                                             **{k: str(v) for k, v in names.items()})


# -- four angular momenta: recouple4, each cell linked to its 9j ------------------------------------------
RANGE4 = FamilyRange("recouple4", 1, 2)  # leaves 1/2 and 1, as in the default recipe


@pytest.fixture(scope="module")
def built4():
    recipe = Recipe(title="Recoupling test", families=(FamilyRange("9j", 0, 4), RANGE4))
    plan = plan_site(recipe)
    book = compute_values(plan, jobs=1)
    _, outputs = render_outputs(plan, book)
    return plan, book, dict(outputs)


def test_four_leaf_matrices_are_orthogonal(built4):
    # common practice, no source: a change of orthonormal basis is an orthogonal matrix
    plan, book, _ = built4
    blocks = 0
    for table in plan.tables_of("recouple4"):
        for s in table.sections:
            n = len(s.rows)
            assert n == len(s.columns), s.anchor
            m = [[book[("recouple4", s.grid[r][c].key)].value for c in range(n)] for r in range(n)]
            for a, b in itertools.combinations_with_replacement(range(n), 2):
                total = ExactSum()
                for k in range(n):
                    total += m[a][k] * m[b][k]
                assert total == (1 if a == b else 0), (s.anchor, a, b)
            blocks += 1
    assert blocks > 30


def _brute_force4(t):
    """Sum over all m of CG products along both four-leaf trees, sympy's CG as reference."""
    from sympy import Rational, S
    from sympy.physics.quantum.cg import CG

    j1, j2, j3, j4, J, j12, j34, j13, j24 = (Rational(x, 2) for x in t)
    M = J
    cg = lambda a, ma, b, mb, c: CG(a, ma, b, mb, c, ma + mb).doit()  # noqa: E731
    span = lambda j: [j - k for k in range(int(2 * j) + 1)]  # noqa: E731
    total = S(0)
    for m1, m2, m3 in itertools.product(span(j1), span(j2), span(j3)):
        m4 = M - m1 - m2 - m3
        if abs(m4) > j4 or abs(m1 + m2) > j12 or abs(m3 + m4) > j34 or abs(m1 + m3) > j13 or abs(m2 + m4) > j24:
            continue
        left = cg(j1, m1, j2, m2, j12) * cg(j3, m3, j4, m4, j34) * CG(j12, m1 + m2, j34, m3 + m4, J, M).doit()
        right = cg(j1, m1, j3, m3, j13) * cg(j2, m2, j4, m4, j24) * CG(j13, m1 + m3, j24, m2 + m4, J, M).doit()
        total += left * right
    return total


def test_four_leaf_entries_agree_with_brute_force_cg_sums(built4):
    # reference library: sympy's CG coefficients, exactly, on every 12th cell
    import sympy

    plan, book, _ = built4
    keys = [e.key for t in plan.tables_of("recouple4") for e in t.entries]
    sample = keys[::12]
    assert len(sample) > 40
    for key in sample:
        assert sympy.simplify(book[("recouple4", key)].value.to_sympy() - _brute_force4(key)) == 0, key


def test_four_leaf_entries_equal_the_9j_formula_and_link_to_it(built4):
    # Edmonds 1957, eq. 6.4.2: <(j1 j2)j12, (j3 j4)j34; J | (j1 j3)j13, (j2 j4)j24; J>
    #   = sqrt((2j12+1)(2j34+1)(2j13+1)(2j24+1)) {j1 j2 j12; j3 j4 j34; j13 j24 J}
    from tablegen.kinds.recoupling import ninej_of_recouple4

    plan, book, files = built4
    nine = family("9j")
    linked = 0
    for table in plan.tables_of("recouple4"):
        page = files[table.page].decode("utf-8")
        assert "(<i>j</i><sub>12</sub>, <i>j</i><sub>34</sub>) ╲ (<i>j</i><sub>13</sub>, <i>j</i><sub>24</sub>)" in page
        for e in table.entries:
            j1, j2, j3, j4, J, j12, j34, j13, j24 = e.key
            sym = ninej_of_recouple4(e.key)
            value = nine.kind_record.doubled(*sym)
            assert book[("recouple4", e.key)].value == value * Surd(1, (j12 + 1) * (j34 + 1) * (j13 + 1) * (j24 + 1), 1)
            assert e.source == nine.layout.locate(nine, plan.recipe.family("9j"), sym)
            if e.source is None:  # a total J = 3 or 4 lies beyond the 9j pages of this build (j <= 2)
                assert max(sym) > 4
                continue
            linked += 1
            assert f'href="../{e.source}"' in page
            path, anchor = e.source.split("#")
            assert f'id="{anchor}"' in files[path].decode("utf-8")
    assert linked > 300
    tex = files[plan.tables_of("recouple4")[0].tex].decode("utf-8")
    assert "(j_{12}, j_{34}) \\backslash (j_{13}, j_{24})" in tex
    assert "& (1/2, 1/2)" in tex or "& (1, 0)" in tex


# -- two-particle LS <-> jj: a page per configuration -------------------------------------------------------
@pytest.fixture(scope="module")
def built_lsjj():
    recipe = Recipe(title="LS-jj test", families=(FamilyRange("9j", 0, 4), DEFAULT_RECIPE.family("lsjj")))
    plan = plan_site(recipe)
    book = compute_values(plan, jobs=1)
    _, outputs = render_outputs(plan, book)
    return plan, book, dict(outputs)


def test_lsjj_pages_cover_the_configurations(built_lsjj):
    plan, _, files = built_lsjj
    names = {t.title.split(" for ")[1].split(" (")[0] for t in plan.tables_of("lsjj")}
    assert {"s²", "sp", "p²", "pd", "d²", "pf", "df", "f²", "pp′", "dd′"} <= names
    page = files[next(t.page for t in plan.tables_of("lsjj") if " p² " in t.title + " ")].decode("utf-8")
    assert "(l s)j" in page  # the coupling order is stated
    assert "Pauli-allowed" in page  # and the normalisation of equivalent particles
    # columns are term symbols: 3P2 as ^3 P_2 in MathML and LaTeX
    assert '<th scope="col"><math><msup><mrow></mrow><mn>3</mn></msup><msub><mi mathvariant="normal">P</mi><mn>2</mn>' in page
    tex = files[next(t.tex for t in plan.tables_of("lsjj") if " p² " in t.title + " ")].decode("utf-8")
    assert "{}^{3}\\mathrm{P}_{2}" in tex and "(j_1, j_2) \\backslash (L, S)" in tex


def test_lsjj_site_values_are_the_engine_matrices(built_lsjj):
    # the site shows exactly the matrices of lsjj_matrices, whose p^2 and pd entries tests/test_lsjj.py
    # checks against Condon and Shortley (1935) and Cowan (1981), from memory
    from tablegen.recoupling.lsjj import lsjj_matrices

    plan, book, _ = built_lsjj
    seen = 0
    for table in plan.tables_of("lsjj"):
        shells, l1, l2 = (table.param(n) // 2 for n in ("shells", "l1", "l2"))
        mats = {m.J: m for m in lsjj_matrices(l1, l2, equivalent=shells == 1)}
        assert len(mats) == len(table.sections)
        for s in table.sections:
            m = mats[dict(s.params)["J"] // 2]
            assert s.rows == m.rows and s.columns == tuple((2 * L, S2) for L, S2 in m.columns)
            for r, line in enumerate(s.grid):
                for c, e in enumerate(line):
                    assert book[("lsjj", e.key)].value == m.entries[r][c]
                    seen += 1
    assert seen == 404


def test_lsjj_two_shell_entries_agree_with_sympy_9j(built_lsjj):
    # reference library: sympy.physics.wigner.wigner_9j, exactly, with the factor of Edmonds 1957, eq. 6.4.2
    import sympy
    from sympy.physics.wigner import wigner_9j

    plan, book, _ = built_lsjj
    for table in plan.tables_of("lsjj"):
        if table.param("shells") != 4:
            continue
        for e in table.entries:
            _, l1, l2, j1, j2, J, L, S = (sympy.Rational(x, 2) for x in e.key)
            want = sympy.sqrt((2 * j1 + 1) * (2 * j2 + 1) * (2 * L + 1) * (2 * S + 1)) * wigner_9j(
                l1, sympy.Rational(1, 2), j1, l2, sympy.Rational(1, 2), j2, L, S, J, prec=None)
            assert sympy.simplify(book[("lsjj", e.key)].value.to_sympy() - want) == 0, e.key


def test_lsjj_matrices_orthogonal_and_linked(built_lsjj):
    # common practice, no source: orthogonal; cells link to their 9j where the 9j pages hold it
    plan, book, files = built_lsjj
    nine = family("9j")
    linked = 0
    for table in plan.tables_of("lsjj"):
        for s in table.sections:
            n = len(s.rows)
            assert n == len(s.columns)
            m = [[book[("lsjj", s.grid[r][c].key)].value for c in range(n)] for r in range(n)]
            for a, b in itertools.combinations_with_replacement(range(n), 2):
                total = ExactSum()
                for k in range(n):
                    total += m[a][k] * m[b][k]
                assert total == (1 if a == b else 0), (table.id, s.anchor)
            for e in s.entries:
                from tablegen.kinds.lsjj import ninej_of_lsjj

                assert e.source == nine.layout.locate(nine, plan.recipe.family("9j"), ninej_of_lsjj(e.key))
                linked += e.source is not None
    assert linked > 50  # with 9j for j <= 2: the s, p and d configurations mostly
    check = LinkCheck(plan)
    for path, data in files.items():
        check.add(path, data)
    assert check.finish() > 0


def test_lsjj_sheet_compiles(built_lsjj, tmp_path):
    pdflatex = shutil.which("pdflatex")
    if pdflatex is None:
        pytest.skip("pdflatex not found: LaTeX of the LS-jj tables NOT compiled")
    plan, _, files = built_lsjj
    table = next(t for t in plan.tables_of("lsjj") if t.param("l1") == 6 and t.param("shells") == 2)  # ff'
    (tmp_path / "sheet.tex").write_bytes(files[table.tex_sheet])
    (tmp_path / table.tex.split("/", 1)[1]).write_bytes(files[table.tex])
    proc = subprocess.run([pdflatex, "-interaction=nonstopmode", "-halt-on-error", "sheet.tex"], cwd=tmp_path,
                          capture_output=True, text=True, errors="replace", timeout=300)
    assert proc.returncode == 0, proc.stdout[-3000:]


def test_lsjj_kind_rules():
    from tablegen.errors import QuantumNumberError
    from tablegen.kinds import kind

    k = kind("lsjj")
    with pytest.raises(QuantumNumberError, match="shells"):
        k.parse((3, 1, 1, "1/2", "3/2", 1, 1, 0), None)
    # p^2 3P1 is allowed, 1P1 is not (L + S odd); j1 = j2 = 3/2 with J = 1 is not antisymmetric
    assert k.value(1, 1, 1, "1/2", "3/2", 1, 1, 1)
    assert str(k.zero_rule(k.parse((1, 1, 1, "1/2", "3/2", 1, 1, 0), None))).startswith("pauli:")
    assert str(k.zero_rule(k.parse((1, 1, 1, "3/2", "3/2", 1, 1, 1), None))).startswith("pauli:")
    # two shells: 1P1 is a term of pp', and <(3/2, 3/2); 1 | 3P1> vanishes with every coupling allowed
    assert k.value(2, 1, 1, "1/2", "3/2", 1, 1, 0)
    assert str(k.zero_rule(k.parse((2, 1, 1, "3/2", "3/2", 1, 1, 1), None))).startswith("cancellation:")


def test_four_leaf_sheet_compiles(built4, tmp_path):
    # labels of two numbers, (1/2, 1), start the rows: the sheet must still compile
    pdflatex = shutil.which("pdflatex")
    if pdflatex is None:
        pytest.skip("pdflatex not found: LaTeX of the four-leaf tables NOT compiled")
    plan, _, files = built4
    table = plan.tables_of("recouple4")[-1]
    (tmp_path / "sheet.tex").write_bytes(files[table.tex_sheet])
    (tmp_path / table.tex.split("/", 1)[1]).write_bytes(files[table.tex])
    proc = subprocess.run([pdflatex, "-interaction=nonstopmode", "-halt-on-error", "sheet.tex"], cwd=tmp_path,
                          capture_output=True, text=True, errors="replace", timeout=300)
    assert proc.returncode == 0, proc.stdout[-3000:]


# -- coupled states of three angular momenta, both directions ------------------------------------------------
@pytest.fixture(scope="module")
def built_states():
    plan = plan_site(Recipe(title="States test", families=(FamilyRange("state3", 1, 2),)))  # leaves 1/2 and 1
    book = compute_values(plan, jobs=1)
    return plan, book, dict(render_outputs(plan, book)[1])


def test_state_coefficients_are_cg_products_and_orthogonal(built_states):
    # reference library: sympy.physics.quantum.cg.CG, exactly; orthogonality: common practice, no source
    import sympy
    from sympy.physics.quantum.cg import CG

    plan, book, _ = built_states
    cells = 0
    for table in plan.tables_of("state3"):
        for s in table.sections:
            n = len(s.rows)
            assert n == len(s.columns), s.anchor  # as many coupled states as product states for each M
            for line in s.grid:
                for e in line:
                    j1, j2, j3, j12, J, M, m1, m2, m3 = (sympy.Rational(x, 2) for x in e.key)
                    want = CG(j1, m1, j2, m2, j12, m1 + m2).doit() * CG(j12, m1 + m2, j3, m3, J, M).doit()
                    assert sympy.simplify(book[("state3", e.key)].value.to_sympy() - want) == 0, e.key
                    cells += 1
            m = [[book[("state3", e.key)].value for e in line] for line in s.grid]
            for a, b in itertools.combinations_with_replacement(range(n), 2):
                total = ExactSum()
                for k in range(n):
                    total += m[k][a] * m[k][b]
                assert total == (1 if a == b else 0), s.anchor
    assert cells == 479


def _uncoupled(j1, j2, j3, j12, J, M):
    """{(2 m1, 2 m2, 2 m3): coefficient} of sympy's uncouple of |((j1 j2)j12 j3)J M>."""
    import sympy
    from sympy.physics.quantum import TensorProduct
    from sympy.physics.quantum.spin import JzKetCoupled, uncouple

    ket = uncouple(JzKetCoupled(J, M, (j1, j2, j3), ((1, 2, j12), (1, 3, J))))
    out = {}
    for term in sympy.Add.make_args(sympy.expand(ket)):
        coeff, product = term.as_independent(TensorProduct)
        out[tuple(int(2 * k.m) for k in product.args)] = coeff
    return out


@pytest.mark.parametrize("leaves", [(1, 1, 1), (2, 2, 2)])
def test_both_expansions_agree_with_sympy_uncouple(built_states, leaves):
    # reference library: sympy.physics.quantum.spin.uncouple of a JzKetCoupled with the coupling
    # ((1,2,j12), (1,3,J)), i.e. the tree ((j1 j2)j12 j3)J (sympy 1.12 fails on mixed leaves such as
    # (1/2, 1, 1/2), so three spins 1/2 and three spins 1 are compared)
    import sympy
    from tablegen.render.kets import expansions

    plan, book, files = built_states
    layout = family("state3").layout
    table = next(t for t in plan.tables_of("state3") if tuple(v for _, v in t.params) == leaves)
    compared = 0
    for s in table.sections:
        by_row, by_column = expansions(layout, s, lambda e: book[("state3", e.key)])
        j1, j2, j3, M = (sympy.Rational(v, 2) for _, v in s.params)
        ket_of = {layout.column_ket(s.params, c)[0]: c for c in s.columns}
        for r, (t12, tJ) in enumerate(s.rows):
            want = _uncoupled(j1, j2, j3, sympy.Rational(t12, 2), sympy.Rational(tJ, 2), M)
            got = {ket_of[t.ket_text]: (-1 if t.negative else 1) * abs(t.value.value.to_sympy()) for t in by_row[r].terms}
            assert set(got) == {k for k, v in want.items() if v != 0}, (s.anchor, r)
            for k, v in got.items():
                assert sympy.simplify(v - want[k]) == 0, (s.anchor, r, k)
                compared += 1
        # a column written in coupled states reads the same coefficients down the column (the transpose)
        for c, x in enumerate(by_column):
            assert [t.value for t in x.terms] == [book[("state3", line[c].key)] for line in s.grid
                                                  if book[("state3", line[c].key)].value]
    assert compared > 5
    page = files[table.page].decode("utf-8")
    assert "<h3>Rows written out</h3>" in page and "<h3>Columns written out</h3>" in page


def test_coupled_and_product_kets_cannot_be_confused(built_states):
    plan, _, files = built_states
    table = next(t for t in plan.tables_of("state3") if t.params == (("j1", 1), ("j2", 2), ("j3", 1)))
    page = files[table.page].decode("utf-8")
    assert "|(1/2 1)3/2, 1/2; 2, 2⟩" in page  # coupled: (j1 j2)j12, j3; J, M
    assert "|1/2, 1/2⟩|1, 1⟩|1/2, 1/2⟩" in page  # product: one |j, m⟩ per angular momentum
    tex = files[table.tex].decode("utf-8")
    assert "\\vert (1/2\\,1)3/2,\\,1/2;\\,2,\\,2\\rangle &=" in tex
    assert "Rows written out:" in tex and "Columns written out:" in tex


def test_states_sheet_compiles(built_states, tmp_path):
    pdflatex = shutil.which("pdflatex")
    if pdflatex is None:
        pytest.skip("pdflatex not found: LaTeX of the coupled states NOT compiled")
    plan, _, files = built_states
    table = plan.tables_of("state3")[-1]  # three spins 1: the longest expansions
    (tmp_path / "sheet.tex").write_bytes(files[table.tex_sheet])
    (tmp_path / table.tex.split("/", 1)[1]).write_bytes(files[table.tex])
    proc = subprocess.run([pdflatex, "-interaction=nonstopmode", "-halt-on-error", "sheet.tex"], cwd=tmp_path,
                          capture_output=True, text=True, errors="replace", timeout=300)
    assert proc.returncode == 0, proc.stdout[-3000:]


# -- coupled states of four angular momenta, tree ((j1 j2)j12, (j3 j4)j34)J ---------------------------------
@pytest.fixture(scope="module")
def built_states4():
    plan = plan_site(Recipe(title="States of four", families=(FamilyRange("state4", 1, 2),)))  # leaves 1/2 and 1
    book = compute_values(plan, jobs=1)
    return plan, book, dict(render_outputs(plan, book)[1])


def _state4_table(plan, leaves):
    return next(t for t in plan.tables_of("state4") if tuple(v for _, v in t.params) == leaves)


def test_state4_matrices_are_square_and_orthogonal(built_states4):
    # orthogonality of the coupled states: common practice, no source
    plan, book, _ = built_states4
    blocks = cells = 0
    for table in plan.tables_of("state4"):
        for s in table.sections:
            n = len(s.rows)
            assert n == len(s.columns), s.anchor  # as many coupled states as product states for each M
            m = [[book[("state4", e.key)].value for e in line] for line in s.grid]
            for a, b in itertools.combinations_with_replacement(range(n), 2):
                total = ExactSum()
                for k in range(n):
                    total += m[k][a] * m[k][b]
                assert total == (1 if a == b else 0), (s.anchor, a, b)
            blocks += 1
            cells += n * n
    # a block per M = -(j1+...+j4) .. j1+...+j4 for each of the 16 leaf sets; cells counted by hand-free enumeration
    assert blocks == sum(sum(js) + 1 for js in itertools.product((1, 2), repeat=4)) and cells == 5413


@pytest.mark.parametrize("leaves", [(1, 1, 1, 1), (1, 2, 2, 1), (2, 1, 1, 2)])
def test_state4_coefficients_are_products_of_three_sympy_cg(built_states4, leaves):
    # reference library: sympy.physics.quantum.cg.CG, exactly, along the tree ((j1 j2)j12, (j3 j4)j34)J
    import sympy
    from sympy.physics.quantum.cg import CG

    plan, book, _ = built_states4
    checked = 0
    for s in _state4_table(plan, leaves).sections:
        for line in s.grid:
            for e in line:
                j1, j2, j3, j4, j12, j34, J, M, m1, m2, m3, m4 = (sympy.Rational(x, 2) for x in e.key)
                want = (CG(j1, m1, j2, m2, j12, m1 + m2).doit() * CG(j3, m3, j4, m4, j34, m3 + m4).doit()
                        * CG(j12, m1 + m2, j34, m3 + m4, J, M).doit())
                assert sympy.simplify(book[("state4", e.key)].value.to_sympy() - want) == 0, e.key
                checked += 1
    # every cell: for each M, (number of product states with that M) squared
    by_m = Counter(sum(ms) for ms in itertools.product(*(range(-j, j + 1, 2) for j in leaves)))
    assert checked == sum(n * n for n in by_m.values())


def test_state4_expansions_agree_with_sympy_uncouple(built_states4):
    # reference library: sympy.physics.quantum.spin.uncouple of a JzKetCoupled of four spins 1/2 with the
    # coupling ((1,2,j12), (3,4,j34), (1,3,J)): the tree ((j1 j2)j12, (j3 j4)j34)J
    import sympy
    from sympy.physics.quantum import TensorProduct
    from sympy.physics.quantum.spin import JzKetCoupled, uncouple
    from tablegen.render.kets import expansions

    plan, book, files = built_states4
    layout = family("state4").layout
    table = _state4_table(plan, (1, 1, 1, 1))
    half = sympy.Rational(1, 2)
    compared = 0
    for s in table.sections:
        by_row, by_column = expansions(layout, s, lambda e: book[("state4", e.key)])
        M = sympy.Rational(dict(s.params)["M"], 2)
        ket_of = {layout.column_ket(s.params, c)[0]: c for c in s.columns}
        for r, (t12, t34, tJ) in enumerate(s.rows):
            j12, j34, J = (sympy.Rational(t, 2) for t in (t12, t34, tJ))
            ket = uncouple(JzKetCoupled(J, M, (half,) * 4, ((1, 2, j12), (3, 4, j34), (1, 3, J))))
            want = {}
            for term in sympy.Add.make_args(sympy.expand(ket)):
                coeff, product = term.as_independent(TensorProduct)
                want[tuple(int(2 * k.m) for k in product.args)] = coeff
            got = {ket_of[t.ket_text]: (-1 if t.negative else 1) * abs(t.value.value.to_sympy()) for t in by_row[r].terms}
            assert set(got) == {k for k, v in want.items() if v != 0}, (s.anchor, r)
            for k, v in got.items():
                assert sympy.simplify(v - want[k]) == 0, (s.anchor, r, k)
                compared += 1
        for c, x in enumerate(by_column):  # the inverse expansion: product states in coupled states
            assert [t.value for t in x.terms] == [book[("state4", line[c].key)] for line in s.grid
                                                  if book[("state4", line[c].key)].value]
    assert compared > 20
    page = files[table.page].decode("utf-8")
    assert "<h3>Rows written out</h3>" in page and "<h3>Columns written out</h3>" in page


def test_state4_kets_name_the_tree_and_cannot_be_confused(built_states4):
    plan, _, files = built_states4
    table = _state4_table(plan, (1, 2, 2, 1))
    page = files[table.page].decode("utf-8")
    assert "|(1/2 1)3/2, (1 1/2)1/2; 1, 1⟩" in page  # coupled: (j1 j2)j12, (j3 j4)j34; J, M
    assert "|1/2, 1/2⟩|1, 1⟩|1, −1⟩|1/2, −1/2⟩" in page  # product: one |j, m⟩ per angular momentum
    assert "((j1 j2)j12, (j3 j4)j34)J" in page  # the tree is stated on the page
    tex = files[table.tex].decode("utf-8")
    assert "\\vert (1/2\\,1)3/2,\\,(1\\,1/2)1/2;\\,1,\\,1\\rangle" in tex
    assert "Rows written out:" in tex and "Columns written out:" in tex


def test_state4_one_value_and_zero_rules():
    from tablegen.kinds import kind

    k = kind("state4")
    # |(1/2 1/2)0, (1/2 1/2)0; 0 0> = (|+-> - |-+>)(|+-> - |-+>)/2: the coefficient of |+-+->
    assert k.value("1/2", "1/2", "1/2", "1/2", 0, 0, 0, 0, "1/2", "-1/2", "1/2", "-1/2") == Surd(1, 1, 4)
    assert k.value("1/2", "1/2", "1/2", "1/2", 0, 0, 0, 0, "-1/2", "1/2", "1/2", "-1/2") == Surd(-1, 1, 4)
    t = k.parse(("1/2", "1/2", "1/2", "1/2", 1, 0, 1, 1, "1/2", "-1/2", "1/2", "1/2"))
    assert k.zero_rule(t).id == "m-range" and "m3 + m4" in k.zero_rule(t).text  # |m3 + m4| = 1 > j34 = 0
    t = k.parse(("1/2", "1/2", "1/2", "1/2", 1, 0, 2, 0, "1/2", "-1/2", "1/2", "-1/2"))
    assert k.zero_rule(t).id == "triangle"

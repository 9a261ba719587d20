"""The site's rotation and harmonics families: pages, data files, values.txt, LaTeX, verify, recipe.

The rotation family shows d^j_{m'm}(beta) per j (rows m', columns m) and, under it, its exact values
at beta = pi/2 and pi/3 (kinds of their own, d(pi/2) and d(pi/3)); the harmonics family shows
Y_l^m(theta, phi) on one page.  The values are checked against sympy (a reference library):
sympy.physics.quantum.spin.Rotation.d(j, m, mp, beta) is <j m| exp(-i beta Jy) |j mp> (its
docstring), the same definition and index order as tablegen's d^j_{m'm} with (m', m) = (m, mp);
sympy.Ynm(l, m, theta, phi) is Y_l^m in the Condon-Shortley phase (its docstring).
"""

from __future__ import annotations

import csv
import io
import json
import shutil
from fractions import Fraction
from pathlib import Path

import pytest

from tablegen import cli
from tablegen.build import build, render_outputs
from tablegen.compute import compute_values
from tablegen.errors import RecipeError
from tablegen.output import SUMS, sha256_hex
from tablegen.plan import plan_site
from tablegen.recipe import check_size, estimate_size, recipe_from_mapping

SMALL = {"rotation": {"max_j": "3/2"}, "harmonics": {"max_l": 2}}
SITE = Path(__file__).resolve().parent.parent / "site"


def _half(text: str) -> Fraction:
    return Fraction(text)


@pytest.fixture(scope="module")
def small_files():
    recipe = recipe_from_mapping(SMALL)
    plan = plan_site(recipe)
    book = compute_values(plan, jobs=1)
    meta, outputs = render_outputs(plan, book)
    return plan, book, dict(outputs)


def _csv_rows(text: str) -> list[dict[str, str]]:
    return list(csv.DictReader(io.StringIO(text)))


# -- the committed site (default recipe: j <= 3 in halves, l <= 4) ------------------------------------
def test_committed_site_has_a_page_per_j_and_one_harmonics_page():
    pages = sorted(p.name for p in (SITE / "rotation").iterdir())
    assert pages == sorted(f"j-{t // 2}.html" if t % 2 == 0 else f"j-{t // 2}.5.html" for t in range(0, 7))
    assert [p.name for p in (SITE / "harmonics").iterdir()] == ["all.html"]


@pytest.mark.slow
def test_committed_d_data_agree_with_sympy_at_half_pi_exactly():
    # sympy's Rotation.d, index order as in the module docstring, at beta = pi/2 exactly
    import sympy
    from sympy.physics.quantum.spin import Rotation

    beta = sympy.Symbol("beta")
    checked = 0
    for path in sorted((SITE / "data").glob("rotation-j-*.csv")):
        for row in _csv_rows(path.read_text(encoding="utf-8")):
            j, mp, m = (sympy.Rational(str(_half(row[k]))) for k in ("j", "mp", "m"))
            ref = Rotation.d(j, mp, m, sympy.pi / 2).doit()
            assert sympy.simplify(sympy.sympify(row["d(pi/2)"]) - ref) == 0, row
            # the function's own text, read back by sympy, gives the tabulated values at both angles
            f = sympy.sympify(row["exact"], locals={"beta": beta})
            assert sympy.simplify(f.subs(beta, sympy.pi / 2) - sympy.sympify(row["d(pi/2)"])) == 0, row
            assert sympy.simplify(f.subs(beta, sympy.pi / 3) - sympy.sympify(row["d(pi/3)"])) == 0, row
            checked += 1
    assert checked == sum((t + 1) ** 2 for t in range(0, 7))  # every entry for j <= 3


@pytest.mark.slow
def test_committed_harmonics_agree_with_sympy_ynm():
    # sympy.Ynm(l, m, theta, phi).expand(func=True): Condon-Shortley phase, like ours
    import sympy

    theta, phi = sympy.symbols("theta phi")
    rows = _csv_rows((SITE / "data" / "harmonics-all.csv").read_text(encoding="utf-8"))
    assert len(rows) == 25  # l <= 4
    for row in rows:
        l, m = int(row["l"]), int(row["m"])
        ours = sympy.sympify(row["exact"], locals={"theta": theta, "phi": phi})
        ref = sympy.Ynm(l, m, theta, phi).expand(func=True)
        assert sympy.simplify(sympy.expand_trig(ours - ref).rewrite(sympy.exp)) == 0, row


def test_committed_values_txt_lists_every_function_and_angle_value():
    lines = set((SITE / "values.txt").read_text(encoding="utf-8").splitlines())
    for path in sorted((SITE / "data").glob("rotation-j-*.csv")):
        for row in _csv_rows(path.read_text(encoding="utf-8")):
            args = f"{row['j']} {row['mp']} {row['m']}"
            assert f"d {args} {row['exact']}" in lines
            assert f"d(pi/2) {args} {row['d(pi/2)']}" in lines
            assert f"d(pi/3) {args} {row['d(pi/3)']}" in lines
    # d^1_{10}(pi/2) = -sqrt(1/2) (Edmonds 1957, table 4.1: d^1_{10} = -sin(beta)/sqrt(2) — from memory)
    assert "d(pi/2) 1 1 0 -sqrt(1/2)" in lines


def test_committed_conventions_page_has_the_rotation_section():
    page = (SITE / "conventions.html").read_text(encoding="utf-8")
    assert "Rotation functions and spherical harmonics" in page
    for words in ("passive", "Index order", "worked example", "where", "Legendre function"):
        assert words.lower() in page.lower(), words
    # the formulas are there as copyable LaTeX: the passive relation and the Y-D relation
    assert "D^j_{m&#x27;m}(-\\gamma, -\\beta, -\\alpha) = D^{j\\,\\ast}_{mm&#x27;}(\\alpha, \\beta, \\gamma)" in page
    assert "\\sqrt{\\frac{2l+1}{4\\pi}}\\, D^{l\\,\\ast}_{m0}(\\phi, \\theta, 0)" in page


# -- pages, data and LaTeX of a small build ---------------------------------------------------------
def test_rotation_page_shows_functions_then_the_angle_matrices(small_files):
    _, book, files = small_files
    page = files["rotation/j-1.html"].decode("utf-8")
    f = book[("d", (2, 2, 0))]
    assert f.exact == "-sqrt(1/2)*sin(beta)"  # Edmonds 1957, table 4.1 (from memory)
    assert f'<td id="j=1;mp=1,m=0" data-t="{f.tex}"' in page
    at = book[("d(pi/2)", (2, 2, 0))]
    assert f'<td id="j=1;mp=1,m=0;d(pi/2)" data-t="{at.tex}"' in page and at.decimal in page
    assert page.index('id="j=1;mp=1,m=0"') < page.index("<h3>β = π/2</h3>") < page.index("<h3>β = π/3</h3>")
    assert page.count('<table class="grid matrix rotation"') == 3
    # each matrix copies "symbol = value" with its own symbol: the function, then the values at the angles
    for symbol in ("d^{1}_{@mp@,@m@}(\\beta)", "d^{1}_{@mp@,@m@}(\\pi/2)", "d^{1}_{@mp@,@m@}(\\pi/3)"):
        assert f'data-e="{symbol}"' in page
    assert '<th class="corner"><i>m</i>′ ╲ <i>m</i></th>' in page  # the row index is m′ (argument mp)


@pytest.mark.parametrize("path", ["rotation/j-0.5.html", "rotation/j-1.5.html", "harmonics/all.html"])
def test_every_page_of_the_families_states_its_conventions(small_files, path):
    plan, _, files = small_files
    page = files[path].decode("utf-8")
    fam = plan.family(path.split("/")[0])
    assert f'<p class="conv">{fam.convention} <a href="../conventions.html">' in page.replace("&#39;", "'")
    assert "Condon–Shortley" in page


def test_harmonics_page_and_data(small_files):
    _, book, files = small_files
    page = files["harmonics/all.html"].decode("utf-8")
    y = book[("Y", (2, 2))]
    # Y_1^1 = -sqrt(3/(8 pi)) sin(theta) e^{i phi}: the Condon-Shortley sign (Jackson 1999, eq. 3.53 — from memory)
    assert y.exact == "-sqrt(3/(8*pi))*sin(theta)*exp(I*phi)"
    assert f'<td id="m=1,l=1" data-t="{y.tex}"' in page
    rows = _csv_rows(files["data/harmonics-all.csv"].decode("utf-8"))
    assert [(r["l"], r["m"]) for r in rows][:4] == [("2", "2"), ("1", "1"), ("2", "1"), ("0", "0")]  # rows m down, columns l up
    assert len(rows) == 9


def test_data_files_carry_each_entry_with_its_angle_values(small_files):
    _, book, files = small_files
    rows = _csv_rows(files["data/rotation-j-1.5.csv"].decode("utf-8"))
    assert len(rows) == 16
    doc = json.loads(files["data/rotation-j-1.5.json"])
    assert doc["columns"] == list(rows[0])  # the CSV's columns, the values alongside included
    for row, cells in zip(rows, doc["rows"]):
        jrow = dict(zip(doc["columns"], cells))
        key = tuple(int(2 * _half(row[k])) for k in ("j", "mp", "m"))
        for k in ("d(pi/2)", "d(pi/3)"):
            shown = book[(k, key)]
            sign, p, q = (str(x) for x in shown.parts)
            assert [row[k], row[f"{k}_sign"], row[f"{k}_p"], row[f"{k}_q"], row[f"{k}_decimal"]] == \
                [shown.exact, sign, p, q, shown.decimal]
            assert [jrow[k], jrow[f"{k}_sign"], jrow[f"{k}_p"], jrow[f"{k}_q"], jrow[f"{k}_decimal"]] == \
                [shown.exact, *shown.parts, shown.decimal]  # typed: sign, p, q are integers
        # a function has no parts sign, p, q and no single decimal
        assert row["exact"] == book[("d", key)].exact and [row[c] for c in ("sign", "p", "q", "decimal")] == [""] * 4
        assert [jrow[c] for c in ("sign", "p", "q", "decimal")] == [None, None, None, ""]


def test_latex_fragments_and_sheets_compile(small_files, tmp_path):
    from test_render_latex import _compile, _write

    _, _, files = small_files
    tex = {p: b for p, b in files.items() if p.startswith("latex/") and ("rotation-j-1.5" in p or "harmonics" in p)}
    assert set(tex) == {"latex/rotation-j-1.5.tex", "latex/rotation-j-1.5-sheet.tex",
                        "latex/harmonics-all.tex", "latex/harmonics-all-sheet.tex"}
    fragment = tex["latex/rotation-j-1.5.tex"].decode("utf-8")
    assert "d^{3/2}_{3/2,-1/2}(\\beta) &" in fragment and "at $\\beta = \\pi/3$" in fragment
    assert "longtable" not in fragment and fragment.count("\\begin{tabular}") == 3  # the list, then two matrices
    sheet = tex["latex/harmonics-all-sheet.tex"].decode("utf-8")
    assert "(-1)^m" in sheet and "D^{l\\,*}_{m0}(\\phi,\\theta,0)" in sheet
    folder = _write(tex, tmp_path)
    for name in ("rotation-j-1.5-sheet.tex", "harmonics-all-sheet.tex"):
        _compile(folder, name, tmp_path / "texmf", runs=2)


# -- verify -----------------------------------------------------------------------------------------
@pytest.fixture(scope="module")
def built(tmp_path_factory) -> Path:
    out = tmp_path_factory.mktemp("rotverify") / "site"
    build(recipe_from_mapping(SMALL), out, jobs=1)
    return out


def _reseal_all(site: Path) -> None:
    """A forger who recomputes every checksum and the manifest's data digest."""
    manifest = json.loads((site / "manifest.json").read_text(encoding="utf-8"))
    manifest["data_digest"] = sha256_hex((site / "values.txt").read_bytes())
    (site / "manifest.json").write_text(json.dumps(manifest), encoding="utf-8")
    files = sorted(p.relative_to(site).as_posix() for p in site.rglob("*") if p.is_file() and p.name != SUMS)
    (site / SUMS).write_text("".join(f"{sha256_hex((site / f).read_bytes())}  {f}\n" for f in files), encoding="utf-8")


def test_fresh_build_with_the_families_verifies(capsys, built):
    assert cli.main(["verify", str(built)]) == 0
    assert "OK" in capsys.readouterr().out


@pytest.mark.parametrize("old, new, words", [
    # d^{1/2}_{1/2,-1/2}(pi/2) = -sin(pi/4) = -sqrt(1/2) (the worked example of the conventions page)
    ("d(pi/2) 1/2 1/2 -1/2 -sqrt(1/2)", "d(pi/2) 1/2 1/2 -1/2 sqrt(1/2)", "d(pi/2)(1/2; 1/2 -1/2)"),
    ("d 1/2 1/2 -1/2 -sin(beta/2)", "d 1/2 1/2 -1/2 sin(beta/2)", "d(1/2; 1/2 -1/2)"),
])
def test_verify_catches_a_forged_d_value_everywhere_resealed(capsys, built, tmp_path, old, new, words):
    site = tmp_path / "site"
    shutil.copytree(built, site)
    kind, *args = old.split(" ")[:4]
    value, forged = old.split(" ", 4)[4], new.split(" ", 4)[4]
    values = site / "values.txt"
    text = values.read_text(encoding="utf-8")
    assert text.count(old + "\n") == 1
    values.write_text(text.replace(old + "\n", new + "\n"), encoding="utf-8")
    csv_path = site / "data" / "rotation-j-0.5.csv"
    table = csv_path.read_text(encoding="utf-8")
    assert table.count(value) >= 1
    csv_path.write_text(table.replace(f"{','.join(args)},{value}," if kind == "d" else f",{value},",
                                      f"{','.join(args)},{forged}," if kind == "d" else f",{forged},", 1),
                        encoding="utf-8")
    _reseal_all(site)
    status = cli.main(["verify", str(site)])
    out = capsys.readouterr().out
    assert status == 1
    assert words in out and "values.txt" in out and "rotation-j-0.5.csv" in out, out


# -- recipe -----------------------------------------------------------------------------------------
def test_recipe_sections_validate_and_read_back():
    r = recipe_from_mapping({"rotation": {"max_j": "5/2", "min_j": 1}, "harmonics": {"max_l": 3}})
    assert r.family("rotation").max_tj == 5 and r.family("harmonics").max_tj == 6
    assert "[harmonics]\nmax_l = \"3\"" in r.toml_text()
    with pytest.raises(RecipeError, match="harmonics.max_l.*whole number"):
        recipe_from_mapping({"harmonics": {"max_l": "3/2"}})
    with pytest.raises(RecipeError, match=r"harmonics.max_j.*unknown key \(known: max_l, min_l\)"):
        recipe_from_mapping({"harmonics": {"max_j": 2}})
    with pytest.raises(RecipeError, match="rotation.max_j.*is required"):
        recipe_from_mapping({"rotation": {}})


@pytest.mark.parametrize("ranges", [SMALL, {"rotation": {"max_j": 3, "min_j": "3/2"}, "harmonics": {"max_l": 4, "min_l": 1}},
                                    {"rotation": {"max_j": 0}, "harmonics": {"max_l": 0}}])
def test_size_estimate_counts_the_cells_exactly(ranges):
    # (2j+1)^2 functions per j, 2l+1 per l: the guard's closed forms agree with the plan
    recipe = recipe_from_mapping(ranges)
    est = estimate_size(recipe)
    plan = plan_site(recipe)
    for key in ("rotation", "harmonics"):
        assert est[key] == sum(len(t.entries) for t in plan.tables_of(key)), key


def test_size_guard_refuses_a_huge_rotation_recipe_with_its_estimate():
    # j <= 80: 1.4 million functions, each slow (the time model of the d kind): refused before computing
    with pytest.raises(Exception, match="--allow-large") as info:
        check_size(recipe_from_mapping({"rotation": {"max_j": 80}}))
    assert "rotation: 1,404,081" in str(info.value)
    assert check_size(recipe_from_mapping({"rotation": {"max_j": 4}}))["rotation"] == sum((t + 1) ** 2 for t in range(9))


# -- verify of a site made by another version: the functions and the values alongside, value by value -------
@pytest.fixture()
def other_version(monkeypatch):
    """Pretend the installed tablegen is a later version: the site can no longer match byte for byte."""
    import tablegen.build
    import tablegen.verify

    monkeypatch.setattr(tablegen.build, "__version__", "9.0.0")
    monkeypatch.setattr(tablegen.verify, "__version__", "9.0.0")


def test_another_versions_site_with_the_families_holds_value_by_value(capsys, built, other_version):
    assert cli.main(["verify", str(built)]) == 0
    out = capsys.readouterr().out
    assert "value by value" in out and out.splitlines()[0].endswith(": OK"), out


@pytest.mark.parametrize("path, old, new, words", [
    # d^{1}_{1,0}(pi/2) = -sqrt(1/2) (Edmonds 1957, table 4.1: d^1_{10} = -sin(beta)/sqrt(2) — from memory)
    ("data/rotation-j-1.csv", "1,1,0,-sqrt(1/2)*sin(beta),,,,,-sqrt(1/2),-1,1,2,", "1,1,0,-sqrt(1/2)*sin(beta),,,,,sqrt(1/2),-1,1,2,",
     "data/rotation-j-1.csv line"),
    ("data/rotation-j-1.json", '["1","1","0","-sqrt(1/2)*sin(beta)",null,null,null,"","-sqrt(1/2)",-1,',
     '["1","1","0","-sqrt(1/2)*sin(beta)",null,null,null,"","-sqrt(1/2)",1,', "data/rotation-j-1.json row"),
    ("values.txt", "Y 1 1 -sqrt(3/(8*pi))*sin(theta)*exp(I*phi)", "Y 1 1 sqrt(3/(8*pi))*sin(theta)*exp(I*phi)", "values.txt line"),
])
def test_value_by_value_catches_a_forged_function_or_angle_value(capsys, built, tmp_path, other_version,
                                                                 path, old, new, words):
    site = tmp_path / "site"
    shutil.copytree(built, site)
    text = (site / path).read_text(encoding="utf-8")
    assert text.count(old) == 1, path
    (site / path).write_text(text.replace(old, new), encoding="utf-8")
    _reseal_all(site)
    status = cli.main(["verify", str(site)])
    out = capsys.readouterr().out
    assert status == 1 and "value by value" in out
    assert any(line.strip().startswith(words) for line in out.splitlines()[1:]), out

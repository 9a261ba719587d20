"""LaTeX output: fragments, standalone sheets and the booklet.

Text checks run everywhere; the compile checks need pdflatex (skipped with a
reason when it is missing, failing instead when CI is set), and the checks of
the printed text need pdftotext as well.
"""

from __future__ import annotations

import os
import re
import shutil
import subprocess
import unicodedata
from concurrent.futures import ThreadPoolExecutor
from fractions import Fraction
from pathlib import Path

import pytest

from tablegen.buildinfo import BuildMeta
from tablegen.compute import compute_values
from tablegen.plan import plan_site
from tablegen.recipe import DEFAULT_RECIPE, recipe_from_mapping
from tablegen.render.latex import FRAGMENT_PACKAGES, render_latex, tex_text
from tablegen.values import Surd

# Every special character of LaTeX, a command that would end the document,
# ligature pairs and characters the default fonts lack.
HOSTILE_TITLE = r"Odd \title {x} $y$ 50% & #2 a_b c^d e~f <g> |h| i--j ``k'' !`l \end{document} ⊗ é"
HOSTILE_NOTES = "First note with \\end{document} and }{ unbalanced braces.\n\nSecond: 100% of #3 & $4 ^ ~ _"
SMALL = {"cg": {"max_j": 1}, "3j": {"max_j": 1}, "6j": {"max_j": 1}, "9j": {"max_j": 1}}
ALLOWED_PACKAGES = {"amsmath", "amssymb", "booktabs", "longtable", "array", "geometry", "hyperref",
                    "fontenc", "inputenc"}


def _meta(recipe, digest: str = "5e" * 32) -> BuildMeta:
    return BuildMeta("tablegen", "0.1.0", digest, recipe.toml_text(), recipe.title, (("cg", 1), ("3j", 1)))


def _render(recipe) -> tuple[object, object, BuildMeta, dict[str, bytes], list[str]]:
    plan = plan_site(recipe)
    book = compute_values(plan, jobs=1)
    meta = _meta(recipe)
    pairs = list(render_latex(plan, book, meta))
    return plan, book, meta, dict(pairs), [p for p, _ in pairs]


@pytest.fixture(scope="module")
def small():
    # the other root style than the default recipe, so that both are compiled
    recipe = recipe_from_mapping(
        {"title": HOSTILE_TITLE, "notes": HOSTILE_NOTES, "latex_style": "rational", **SMALL}
    )
    return _render(recipe)


def _text(files: dict[str, bytes], path: str) -> str:
    return files[path].decode("utf-8")


# -- parsing a fragment's rows ---------------------------------------------------------
def _doubled(text: str) -> int:
    """'3/2' -> 3, '-1' -> -2 (the inverse of half_text)."""
    return int(text[:-2]) if text.endswith("/2") else 2 * int(text)


def _rows(fragment: str) -> list[str]:
    body = fragment.split("\\endlastfoot\n", 1)[1].split("\\end{longtable}", 1)[0]
    rows = []
    for line in body.splitlines():
        if line.startswith(("\\midrule", "\\addlinespace")):
            continue
        assert line.endswith("\\\\"), line
        rows.append(line[:-2])
    return rows


def _cells(row: str) -> list[str]:
    """Cells of a row; a leading Bmatrix (6j/9j symbol) is one cell."""
    symbol = []
    if row.startswith("\\begin{Bmatrix}"):
        end = row.index("\\end{Bmatrix}") + len("\\end{Bmatrix}")
        symbol, row = [row[:end]], row[end + 3 :]
    return symbol + [c.strip().replace("\\phantom{-}", "") for c in row.split(" & ")]


def _symbol(cell: str) -> tuple[int, ...]:
    inner = cell[len("\\begin{Bmatrix}") : -len("\\end{Bmatrix}")]
    return tuple(_doubled(x.strip()) for line in inner.split("\\\\") for x in line.split("&"))


# -- what is written --------------------------------------------------------------------
def test_fragment_and_sheet_per_table_then_one_booklet(small):
    plan, _, _, files, order = small
    expected = [p for t in plan.tables for p in (t.tex, t.tex_sheet)] + [plan.booklet]
    assert order == expected
    assert all(p.startswith("latex/") for p in order)


def test_cg_rows_match_every_entry_and_value(small):
    plan, book, _, files, _ = small
    for table in plan.tables_of("cg"):
        rows = [_cells(r) for r in _rows(_text(files, table.tex))]
        assert len(rows) == len(table.entries)
        for cells, entry in zip(rows, table.entries):
            tj1, tm1, tj2, tm2, tJ, tM = entry.key
            assert [_doubled(c) for c in cells[:4]] == [tm1, tm2, tJ, tM]
            shown = book[("cg", entry.key)]
            assert cells[4:] == [shown.tex, shown.decimal]


def test_cg_rows_for_spin_half_follow_the_closed_form(small):
    # Closed form for coupling j1 with 1/2, Condon-Shortley phase (Edmonds 1957,
    # ch. 3, table for j2 = 1/2; table number from memory):
    # <j1 M-1/2; 1/2 1/2 | j1+1/2 M> = +sqrt((j1+M+1/2)/(2j1+1)),
    # <j1 M+1/2; 1/2 -1/2 | j1+1/2 M> = +sqrt((j1-M+1/2)/(2j1+1)),
    # <j1 M-1/2; 1/2 1/2 | j1-1/2 M> = -sqrt((j1-M+1/2)/(2j1+1)),
    # <j1 M+1/2; 1/2 -1/2 | j1-1/2 M> = +sqrt((j1+M+1/2)/(2j1+1)).
    plan, _, _, files, _ = small
    style = plan.recipe.latex_style
    checked = 0
    for table in plan.tables_of("cg"):
        tj1, tj2 = table.params[0][1], table.params[1][1]
        if tj2 != 1 or tj1 == 0:
            continue
        j1 = Fraction(tj1, 2)
        for cells in map(_cells, _rows(_text(files, table.tex))):
            m2, J, M = (Fraction(_doubled(c), 2) for c in cells[1:4])
            plus = (j1 + M + Fraction(1, 2)) / (2 * j1 + 1)
            minus = (j1 - M + Fraction(1, 2)) / (2 * j1 + 1)
            if J == j1 + Fraction(1, 2):
                square, sign = (plus if m2 > 0 else minus), 1
            else:
                square, sign = (minus, -1) if m2 > 0 else (plus, 1)
            expected = Surd(sign, square.numerator, square.denominator) if square else Surd(0)
            assert cells[4] == expected.latex(style), (table.id, cells)
            checked += 1
    assert checked == 6 + 10  # every row of 1/2 x 1/2 and of 1 x 1/2


def test_threej_rows_match_entries_and_j3_zero_closed_form(small):
    # (j j 0; m -m 0) = (-1)^(j-m) / sqrt(2j+1)   (Edmonds 1957, §3.7; equation from memory)
    plan, book, _, files, _ = small
    style = plan.recipe.latex_style
    zero_rows = 0
    for table in plan.tables_of("3j"):
        rows = [_cells(r) for r in _rows(_text(files, table.tex))]
        assert len(rows) == len(table.entries)
        for cells, entry in zip(rows, table.entries):
            tj1, tj2, tj3, tm1, tm2, tm3 = entry.key
            assert [_doubled(c) for c in cells[:4]] == [tj3, tm1, tm2, tm3]
            shown = book[("3j", entry.key)]
            assert cells[4:] == [shown.tex, shown.decimal]
            if tj3 == 0:
                sign = -1 if ((tj1 - tm1) // 2) % 2 else 1
                assert cells[4] == Surd(sign, 1, tj1 + 1).latex(style)
                zero_rows += 1
    assert zero_rows == 1 + 2 + 3  # j = 0, 1/2, 1


def test_sixj_rows_give_the_racah_w_they_equal(small):
    # W(a b c d; e f) = (-1)^(a+b+c+d) {a b e; d c f}   (Racah 1942; Edmonds 1957, §6.2)
    plan, book, _, files, _ = small
    for table in plan.tables_of("6j"):
        rows = [_cells(r) for r in _rows(_text(files, table.tex))]
        assert len(rows) == len(table.entries)
        for cells, entry in zip(rows, table.entries):
            symbol = _symbol(cells[0])
            assert symbol == entry.key
            shown = book[("6j", entry.key)]
            assert cells[1:3] == [shown.tex, shown.decimal]
            assert int(cells[3]) == len(entry.members)
            w = re.fullmatch(r"([+-])W\((\S+)\\ (\S+)\\ (\S+)\\ (\S+);\\ (\S+)\\ (\S+)\)", cells[4])
            assert w, cells[4]
            a, b, c, d, e, f = (_doubled(x) for x in w.groups()[1:])
            assert symbol == (a, b, e, d, c, f)
            phase = "-" if ((a + b + c + d) // 2) % 2 else "+"
            assert w.group(1) == phase


def test_ninej_rows_match_entries(small):
    plan, book, _, files, _ = small
    for table in plan.tables_of("9j"):
        rows = [_cells(r) for r in _rows(_text(files, table.tex))]
        assert [_symbol(c[0]) for c in rows] == [e.key for e in table.entries]
        for cells, entry in zip(rows, table.entries):
            shown = book[("9j", entry.key)]
            assert cells[1:] == [shown.tex, shown.decimal, str(len(entry.members))]


def test_fragment_opens_with_packages_and_conventions(small):
    plan, _, meta, files, _ = small
    for table in plan.tables:
        text = _text(files, table.tex)
        head = text.split("\\begingroup", 1)[0]
        assert all(line.startswith("%") for line in head.splitlines()), table.id
        assert f"% Needs in the preamble: \\usepackage{{{','.join(FRAGMENT_PACKAGES)}}}" in head
        assert "Condon-Shortley" in head
        assert "(-1)^(j1-j2+M) sqrt(2J+1) (j1 j2 J; m1 m2 -M)" in head
        assert "W(a b c d; e f) = (-1)^(a+b+c+d) {a b e; d c f}" in head
        assert meta.data_digest in head
        assert not any(line.startswith("\\usepackage") for line in text.splitlines())


def test_sheets_and_booklet_state_conventions_and_build_facts(small):
    plan, _, meta, files, _ = small
    documents = [t.tex_sheet for t in plan.tables] + [plan.booklet]
    for path in documents:
        text = _text(files, path)
        assert "Condon--Shortley phase" in text
        assert "(-1)^{j_1-j_2+M}\\sqrt{2J+1}" in text
        assert "W(a\\,b\\,c\\,d;\\,e\\,f) = (-1)^{a+b+c+d}" in text
        assert "rows in the order written" in text
        assert "tablegen 0.1.0" in text and meta.data_digest in text
        assert "\\today" not in text


def test_sheets_and_booklet_input_fragments_instead_of_copying(small):
    plan, _, _, files, _ = small
    booklet = _text(files, plan.booklet)
    for table in plan.tables:
        name = table.tex.rsplit("/", 1)[1]
        sheet = _text(files, table.tex_sheet)
        assert f"\\input{{{name}}}" in sheet and "longtable}{" not in sheet
        assert f"\\input{{{name}}}" in booklet
    assert "longtable}{" not in booklet


def test_only_allowed_packages(small):
    _, _, _, files, _ = small
    used = set()
    for data in files.values():
        for match in re.finditer(r"\\(?:usepackage|RequirePackage)(?:\[[^\]]*\])?\{([^}]*)\}", data.decode()):
            used.update(p.strip() for p in match.group(1).split(","))
    assert used and used <= ALLOWED_PACKAGES, used - ALLOWED_PACKAGES
    # what a fragment's head comment asks the manuscript for is what the sheets themselves load
    assert set(FRAGMENT_PACKAGES) <= used


def test_recipe_title_and_notes_are_escaped(small):
    plan, _, _, files, _ = small
    booklet = _text(files, plan.booklet)
    title = tex_text(HOSTILE_TITLE)
    assert f"\\title{{{title}}}" in booklet
    # no special character is left bare (every one is preceded by a backslash or spelled out)
    assert not re.search(r"(?<!\\)[$%&#_^~]", title)
    assert "\\end{document}" not in title and "\\textbackslash{}end\\{document\\}" in title
    assert "-{}-" in title and "[U+2297]" in title and "é" in title
    assert booklet.count("\\end{document}") == 1
    notes = tex_text("Second: 100% of #3 & $4 ^ ~ _")
    assert notes in booklet
    for table in plan.tables:  # every sheet names the build by its escaped title
        assert title in _text(files, table.tex_sheet)


def test_fragments_do_not_depend_on_user_text(small):
    plan, _, _, files, _ = small
    plain = recipe_from_mapping({"title": "Plain", "latex_style": plan.recipe.latex_style, **SMALL})
    _, _, _, other, _ = _render(plain)
    for table in plan.tables:
        assert other[table.tex] == files[table.tex]
    assert other[plan.booklet] != files[plan.booklet]


def test_render_is_deterministic(small):
    plan, book, meta, files, order = small
    again = list(render_latex(plan, book, meta))
    assert [p for p, _ in again] == order
    assert all(files[p] == data for p, data in again)


@pytest.fixture(scope="module")
def default_files():
    plan = plan_site(DEFAULT_RECIPE)
    book = compute_values(plan, jobs=1)
    return plan, dict(render_latex(plan, book, _meta(DEFAULT_RECIPE)))


def test_default_recipe_latex_stays_small(default_files):
    # size budget of the committed site (issue: LaTeX under ~5 MB); common practice, no source
    plan, files = default_files
    assert len(files) == 2 * len(plan.tables) + 1
    total = sum(len(data) for data in files.values())
    assert 500_000 < total < 5_000_000, total


# -- compiling ---------------------------------------------------------------------------
def _tool(name: str, package: str) -> str:
    path = shutil.which(name)
    if path is None:
        reason = f"{name} not found: LaTeX compile checks NOT run (install {package})"
        if os.environ.get("CI"):
            pytest.fail(reason)
        pytest.skip(reason)
    return path


def _write(files: dict[str, bytes], root: Path) -> Path:
    for path, data in files.items():
        target = root / path
        target.parent.mkdir(parents=True, exist_ok=True)
        target.write_bytes(data)
    return root / "latex"


def _compile(folder: Path, name: str, texmfvar: Path, runs: int = 1) -> Path:
    """pdflatex ``runs`` times (the second run reads the contents and bookmarks back)."""
    pdflatex = _tool("pdflatex", "texlive-latex-recommended")
    for _ in range(runs):
        proc = subprocess.run(
            [pdflatex, "-interaction=nonstopmode", "-halt-on-error", name],
            cwd=folder,
            capture_output=True,
            text=True,
            errors="replace",
            timeout=300,
            env={**os.environ, "TEXMFVAR": str(texmfvar)},  # fresh cache: font generation shows
        )
        assert proc.returncode == 0, f"{name}:\n{proc.stdout[-3000:]}"
        # every glyph comes from the standard Type 1 fonts; a bitmap font would be made by mktexpk
        assert "mktexpk" not in proc.stdout + proc.stderr, name
    pdf = folder / (name[: -len(".tex")] + ".pdf")
    assert pdf.is_file() and pdf.stat().st_size > 1000, pdf
    return pdf


def _pdf_text(pdf: Path) -> str:
    pdftotext = shutil.which("pdftotext")
    if pdftotext is None:
        pytest.skip("pdftotext not found (poppler-utils): printed text NOT checked")
    out = subprocess.run([pdftotext, str(pdf), "-"], capture_output=True, text=True, check=True).stdout
    return unicodedata.normalize("NFC", out)  # accents come out as combining marks


@pytest.fixture(scope="module")
def compiled(small, tmp_path_factory):
    """Every sheet and the booklet of the small build, plus a manuscript that inputs fragments."""
    _tool("pdflatex", "texlive-latex-recommended")
    plan, _, _, files, _ = small
    root = tmp_path_factory.mktemp("latex-small")
    folder = _write(files, root)
    fragment_head = _text(files, plan.tables[0].tex)
    packages = re.search(r"Needs in the preamble: (\\usepackage\{[^}]*\})", fragment_head).group(1)
    picks = [next(t for t in plan.tables_of(f) if len(t.entries) > 3) for f in ("cg", "3j", "6j", "9j")]
    (folder / "manuscript.tex").write_text(
        "\\documentclass{article}\n" + packages + "\n\\begin{document}\nText before.\n"
        + "".join(f"\\input{{{t.tex.rsplit('/', 1)[1]}}}\n" for t in picks)
        + "See Table~\\ref{tablegen:" + picks[0].id + "}.\n\\end{document}\n"
    )
    names = [p.rsplit("/", 1)[1] for p in files if p.endswith("-sheet.tex")]
    names += [plan.booklet.rsplit("/", 1)[1], "manuscript.tex"]
    booklet = plan.booklet.rsplit("/", 1)[1]
    with ThreadPoolExecutor(2) as pool:
        pdfs = list(pool.map(lambda n: _compile(folder, n, root / "texmf-var", 1 + (n == booklet)), names))
    return dict(zip(names, pdfs))


def test_every_sheet_booklet_and_manuscript_compiles(small, compiled):
    plan = small[0]
    assert len(compiled) == len(plan.tables) + 2


def test_booklet_prints_title_literally_and_values(small, compiled):
    plan = small[0]
    text = _pdf_text(compiled["booklet.tex"])
    # The title as typed, but for characters drawn as accents or rules by TeX
    # (^ ~ _ print as accents/rules) and the ones the fonts lack.
    for piece in (r"Odd \title {x} $y$ 50% & #2", "<g> |h| i--j", r"\end{document} [U+2297] é",
                  "First note with \\end{document} and }{ unbalanced braces."):
        assert piece in text, piece
    assert "@misc{tablegen-5e5e5e5e," in text  # the BibTeX block, braces and all
    # <1 0; 1/2 1/2 | 1/2 1/2> = -sqrt(1/3) = -0.577350269189626  (closed form above)
    assert "−0.577350269189626" in text
    # one captioned longtable per table, except on the matrix layout: one per section, and one more
    # per kind shown alongside (d^j at beta = pi/2 and pi/3 under the list of functions)
    expected = sum(
        len(t.sections) * (1 + len(plan.family(t.family).alongside)) if plan.family(t.family).layout.name == "matrix"
        else 1 for t in plan.tables)
    assert len(set(re.findall(r"Table (\d+): ", text))) == expected


def test_sheet_prints_its_table(compiled):
    text = _pdf_text(compiled["cg-1x0.5-sheet.tex"])
    assert "Clebsch–Gordan coefficients, j1 = 1, j2 = 1/2" in text.replace("\n", " ")
    assert "0.816496580927726" in text  # sqrt(2/3), closed form for j2 = 1/2 (Edmonds 1957, ch. 3)


def test_default_booklet_compiles(default_files, tmp_path):
    _tool("pdflatex", "texlive-latex-recommended")
    plan, files = default_files
    folder = _write(files, tmp_path)
    pdf = _compile(folder, "booklet.tex", tmp_path / "texmf-var")
    text = _pdf_text(pdf)
    # one captioned longtable per table, except on the matrix layout: one per section, and one more
    # per kind shown alongside (d^j at beta = pi/2 and pi/3 under the list of functions)
    expected = sum(
        len(t.sections) * (1 + len(plan.family(t.family).alongside)) if plan.family(t.family).layout.name == "matrix"
        else 1 for t in plan.tables)
    assert len(set(re.findall(r"Table (\d+): ", text))) == expected

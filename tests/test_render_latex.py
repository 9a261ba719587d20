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


# -- parsing a fragment's blocks ------------------------------------------------------
def _doubled(text: str) -> int:
    """'3/2' -> 3, '-1' -> -2 (the inverse of half_text)."""
    return int(text[:-2]) if text.endswith("/2") else 2 * int(text)


_TABULAR = re.compile(r"\\begin\{tabular\}\{.*?\}\n(.*?)\\end\{tabular\}", re.S)


def _blocks(fragment: str) -> list[list[list[str]]]:
    """Every tabular block as its parts between booktabs rules, each part a list of rows (without '\\\\')."""
    assert "longtable" not in fragment
    blocks = []
    for body in _TABULAR.findall(fragment):
        parts: list[list[str]] = []
        lines = body.splitlines()
        assert lines[0] == "\\toprule" and lines[-1] == "\\bottomrule", body
        for line in lines[:-1]:
            if line in ("\\toprule", "\\midrule"):
                parts.append([])
            elif not line.startswith("\\addlinespace"):
                assert line.endswith("\\\\"), line
                parts[-1].append(line[:-2])
        blocks.append(parts)
    assert blocks, "no tabular in the fragment"
    return blocks


def _rows(fragment: str) -> list[str]:
    """Classes layout: the data rows of every block, in order (each block repeats the header)."""
    return [row for _, rows in _blocks(fragment) for row in rows]


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


_THIRD = re.compile(r"\\vert (\S+)\\,M\\rangle|\\begin\{pmatrix\}.*? & .*? & (\S+)\\\\ ")


def _grid(fragment: str) -> dict[tuple[str, int, int, int], str]:
    """Grid layout: {(part, doubled third j, doubled row projection, doubled m1): cell}.

    part is "exact" or "decimal"; the third j is read from each block's title (the symbol
    with the table's j's as numbers), rows and columns from the labels.
    """
    cells: dict[tuple[str, int, int, int], str] = {}
    for parts in _blocks(fragment):
        (title,), (header,), rows = parts
        third = _THIRD.search(title)
        assert third, title
        tk = _doubled(third.group(1) or third.group(2))
        part = "decimal" if "decimals" in title else "exact"
        columns = [_doubled(c.strip()) for c in header.split(" & ")[1:]]
        for row in rows:
            label, *values = [c.strip() for c in row.split(" & ")]
            assert len(values) == len(columns), row
            for tm1, value in zip(columns, values):
                key = (part, tk, _doubled(label), tm1)
                assert key not in cells, key
                cells[key] = value
    return cells


# -- what is written --------------------------------------------------------------------
def test_fragment_and_sheet_per_table_then_one_booklet(small):
    plan, _, _, files, order = small
    expected = [p for t in plan.tables for p in (t.tex, t.tex_sheet)] + [plan.booklet]
    assert order == expected
    assert all(p.startswith("latex/") for p in order)


def _grid_check(plan, book, files, family: str, row_of, m1_of, third_of) -> int:
    checked = 0
    for table in plan.tables_of(family):
        cells = _grid(_text(files, table.tex))
        written = {k: v for k, v in cells.items() if v}
        for entry in table.entries:
            shown = book[(family, entry.key)]
            place = (third_of(entry.key), row_of(entry.key), m1_of(entry.key))
            assert cells[("exact",) + place] == shown.tex, (table.id, entry.key)
            assert cells[("decimal",) + place] == shown.decimal, (table.id, entry.key)
            checked += 1
        # nothing is written but the entries (a blank cell has no value)
        assert len(written) == 2 * len(table.entries), table.id
    return checked


def test_cg_matrices_hold_every_entry_and_value(small):
    plan, book, _, files, _ = small
    # key (j1, m1, j2, m2, J, M): rows M, columns m1, one matrix per J
    n = _grid_check(plan, book, files, "cg", lambda k: k[5], lambda k: k[1], lambda k: k[4])
    assert n == sum(len(t.entries) for t in plan.tables_of("cg")) > 20


def test_threej_matrices_hold_every_entry_and_value(small):
    plan, book, _, files, _ = small
    # key (j1, j2, j3, m1, m2, m3): rows m3, columns m1, one matrix per j3
    n = _grid_check(plan, book, files, "3j", lambda k: k[5], lambda k: k[3], lambda k: k[2])
    assert n == sum(len(t.entries) for t in plan.tables_of("3j")) > 20


def test_cg_cells_for_spin_half_follow_the_closed_form(small):
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
        for (part, tJ, tM, tm1), cell in _grid(_text(files, table.tex)).items():
            if part != "exact" or not cell:
                continue
            J, M, m1 = Fraction(tJ, 2), Fraction(tM, 2), Fraction(tm1, 2)
            m2 = M - m1  # the rule each matrix states in its title
            plus = (j1 + M + Fraction(1, 2)) / (2 * j1 + 1)
            minus = (j1 - M + Fraction(1, 2)) / (2 * j1 + 1)
            if J == j1 + Fraction(1, 2):
                square, sign = (plus if m2 > 0 else minus), 1
            else:
                square, sign = (minus, -1) if m2 > 0 else (plus, 1)
            expected = Surd(sign, square.numerator, square.denominator) if square else Surd(0)
            assert cell == expected.latex(style), (table.id, J, M, m1, cell)
            checked += 1
    assert checked == 6 + 10  # every value of 1/2 x 1/2 and of 1 x 1/2


def test_threej_cells_for_j3_zero_follow_the_closed_form(small):
    # (j j 0; m -m 0) = (-1)^(j-m) / sqrt(2j+1)   (Edmonds 1957, §3.7; equation from memory)
    plan, _, _, files, _ = small
    style = plan.recipe.latex_style
    zero = 0
    for table in plan.tables_of("3j"):
        tj1 = table.param("j1")
        for (part, tj3, tm3, tm1), cell in _grid(_text(files, table.tex)).items():
            if part == "exact" and tj3 == 0 and cell:
                assert tm3 == 0
                sign = -1 if ((tj1 - tm1) // 2) % 2 else 1
                assert cell == Surd(sign, 1, tj1 + 1).latex(style)
                zero += 1
    assert zero == 1 + 2 + 3  # j = 0, 1/2, 1


def test_grid_matrix_titles_state_the_left_out_projection(small):
    plan, _, _, files, _ = small
    # m1 + m2 = M for CG, m1 + m2 + m3 = 0 for 3j (Edmonds 1957, ch. 3)
    assert "$m_2 = M - m_1$" in _text(files, plan.tables_of("cg")[3].tex)
    assert "$m_2 = -m_3 - m_1$" in _text(files, plan.tables_of("3j")[3].tex)


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


def test_long_classes_tables_come_in_blocks_with_their_header(default_files):
    # a tabular cannot break across pages: a long table is a run of blocks, each
    # under a page tall (common practice, no source)
    plan, files = default_files
    longest = max(plan.tables_of("6j"), key=lambda t: len(t.entries))
    blocks = _blocks(_text(files, longest.tex))
    assert len(blocks) > 1
    assert all(len(rows) <= 24 for _, rows in blocks)
    assert len({tuple(head) for head, _ in blocks}) == 1  # the same header on every block
    assert sum(len(rows) for _, rows in blocks) == len(longest.entries)


def test_no_decimals_drops_every_decimal():
    recipe = recipe_from_mapping({"decimals": False, "latex_style": "inline", **SMALL})
    plan, book, _, files, _ = _render(recipe)
    for table in plan.tables:
        text = _text(files, table.tex)
        for entry in table.entries:
            shown = book[(table.kind, entry.key)]
            if "." in shown.decimal:
                assert shown.decimal not in text, (table.id, shown.decimal)
        assert "decimal" not in text, table.id
    cg = _grid(_text(files, plan.tables_of("cg")[4].tex))
    assert cg and {part for part, *_ in cg} == {"exact"}
    sixj = [_cells(r) for r in _rows(_text(files, plan.tables_of("6j")[-1].tex))]
    assert all(len(c) == 4 for c in sixj)  # symbol, value, forms, W
    # the inline style: no built-up fractions (a root over a slashed fraction)
    assert not any("\\frac" in _text(files, t.tex) for t in plan.tables)
    assert any("\\sqrt{1/2}" in _text(files, t.tex) for t in plan.tables)


def test_fragment_opens_with_packages_and_conventions(small):
    plan, _, meta, files, _ = small
    for table in plan.tables:
        text = _text(files, table.tex)
        head = text.split("\\noindent", 1)[0]
        assert all(line.startswith("%") for line in head.splitlines()), table.id
        assert head.isascii(), table.id
        assert f"% Needs in the preamble: \\usepackage{{{','.join(FRAGMENT_PACKAGES)}}}" in head
        assert "table or table* environment" in head
        assert meta.data_digest in head
        # each fragment states its own family's convention (no phase named where none is chosen)
        if table.family in ("cg", "3j"):
            assert "Condon-Shortley" in head
        if table.family == "cg":
            assert "(-1)^(j1-j2+M) sqrt(2J+1) (j1 j2 J; m1 m2 -M)" in head
        if table.family in ("6j", "9j"):
            assert "No phase choice of its own" in head and "Condon-Shortley" not in head
        if table.family == "6j":
            assert "W(a b c d; e f) = (-1)^(a+b+c+d) {a b e; d c f}" in head
        assert not any(line.startswith("\\usepackage") for line in text.splitlines())


def test_sheets_and_booklet_state_conventions_and_build_facts(small):
    plan, _, meta, files, _ = small
    documents = [t.tex_sheet for t in plan.tables] + [plan.booklet]
    for path in documents:
        text = _text(files, path)
        assert "3j symbols follow the Condon--Shortley\nphase convention" in text
        assert "The 6j and 9j symbols have\nno phase choice of their own" in text
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
        assert f"\\input{{{name}}}" in sheet and "\\toprule" not in sheet
        assert f"\\input{{{name}}}" in booklet
    assert "\\toprule" not in booklet


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


def _manuscript(plan, files: dict[str, bytes]) -> str:
    """A two-column article that inputs a fragment of every family, each in the author's own float.

    longtable stops a two-column document ("longtable not in 1-column mode"), so
    this compiles only with fragments made of tabulars.  The widest go in table*
    (both columns), a small one in a one-column table.
    """
    fragment_head = _text(files, plan.tables[0].tex)
    packages = re.search(r"Needs in the preamble: (\\usepackage\{[^}]*\})", fragment_head).group(1)
    picks = [next(t for t in plan.tables_of(f.key) if len(t.entries) > 3) for f in plan.families]
    narrow = next(t for t in plan.tables_of(plan.families[0].key) if len(t.entries) <= 4)
    body = ""
    for t, env in [(t, "table*") for t in picks] + [(narrow, "table")]:
        name = t.tex.rsplit("/", 1)[1]
        body += (f"\\begin{{{env}}}\\centering\n\\input{{{name}}}\n"
                 f"\\caption{{The author's caption for {t.id}.}}\\label{{tab:{t.id}}}\n\\end{{{env}}}\n")
    return (
        "\\documentclass[twocolumn]{article}\n" + packages + "\n\\begin{document}\nText before.\n" + body
        + "See Table~\\ref{tab:" + picks[0].id + "}.\n\\end{document}\n"
    )


@pytest.fixture(scope="module")
def compiled(small, tmp_path_factory):
    """Every sheet and the booklet of the small build, plus a two-column manuscript that inputs fragments."""
    _tool("pdflatex", "texlive-latex-recommended")
    plan, _, _, files, _ = small
    root = tmp_path_factory.mktemp("latex-small")
    folder = _write(files, root)
    (folder / "manuscript.tex").write_text(_manuscript(plan, files))
    names = [p.rsplit("/", 1)[1] for p in files if p.endswith("-sheet.tex")]
    names += [plan.booklet.rsplit("/", 1)[1], "manuscript.tex"]
    booklet = plan.booklet.rsplit("/", 1)[1]
    with ThreadPoolExecutor(2) as pool:
        pdfs = list(pool.map(lambda n: _compile(folder, n, root / "texmf-var", 1 + (n in (booklet, "manuscript.tex"))),
                             names))
    return dict(zip(names, pdfs))


def test_two_column_manuscript_without_decimals_in_inline_style_compiles(tmp_path):
    plan, _, _, files, _ = _render(recipe_from_mapping({"decimals": False, "latex_style": "inline", **SMALL}))
    folder = _write(files, tmp_path)
    (folder / "manuscript.tex").write_text(_manuscript(plan, files))
    pdf = _compile(folder, "manuscript.tex", tmp_path / "texmf-var", 2)
    text = _pdf_text(pdf)
    assert "caption for cg-" in text and "Table 1" in text
    assert "0.57735" not in text  # no decimals printed


def test_every_sheet_booklet_and_manuscript_compiles(small, compiled):
    plan = small[0]
    assert len(compiled) == len(plan.tables) + 2


def test_two_column_manuscript_prints_every_family_in_its_floats(small, compiled):
    plan = small[0]
    text = _pdf_text(compiled["manuscript.tex"])
    for fam in plan.families:
        assert f"caption for {fam.key}-" in text, fam.key
    # <1 0; 1/2 1/2 | 1/2 1/2> = -sqrt(1/3) = -0.577350269189626 (closed form above), in the cg float
    assert "−0.577350269189626" in text


def test_booklet_prints_title_literally_and_values(small, compiled):
    plan, files = small[0], small[3]
    text = _pdf_text(compiled["booklet.tex"])
    # The title as typed, but for characters drawn as accents or rules by TeX
    # (^ ~ _ print as accents/rules) and the ones the fonts lack.
    for piece in (r"Odd \title {x} $y$ 50% & #2", "<g> |h| i--j", r"\end{document} [U+2297] é",
                  "First note with \\end{document} and }{ unbalanced braces."):
        assert piece in text, piece
    assert "@misc{tablegen-5e5e5e5e," in text  # the BibTeX block, braces and all
    # <1 0; 1/2 1/2 | 1/2 1/2> = -sqrt(1/3) = -0.577350269189626  (closed form above)
    assert "−0.577350269189626" in text
    # one numbered subsection per table, listed in the contents
    toc = compiled["booklet.tex"].with_suffix(".toc").read_text()
    assert toc.count("\\contentsline {subsection}") == len(plan.tables)


def test_sheet_prints_its_table(compiled):
    text = _pdf_text(compiled["cg-j1-1-j2-0.5-sheet.tex"])
    assert "Clebsch–Gordan coefficients, j1 = 1, j2 = 1/2" in text.replace("\n", " ")
    assert "0.816496580927726" in text  # sqrt(2/3), closed form for j2 = 1/2 (Edmonds 1957, ch. 3)


def test_default_booklet_compiles(default_files, tmp_path):
    _tool("pdflatex", "texlive-latex-recommended")
    plan, files = default_files
    folder = _write(files, tmp_path)
    pdf = _compile(folder, "booklet.tex", tmp_path / "texmf-var", 2)
    toc = pdf.with_suffix(".toc").read_text()
    assert toc.count("\\contentsline {subsection}") == len(plan.tables)
    # the 6j tables are filed by their first entry: a subsection "j1 = 4" exists (the CG ones add j2)
    assert "{\\numberline" in toc and any(line.endswith("$j_1 = 4$}") or "$j_1 = 4$}{" in line for line in toc.splitlines())

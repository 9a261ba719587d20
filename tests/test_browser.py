"""The built pages in a real browser, opened from disk as a reader would.

Drives Debian's /usr/bin/chromium through Python playwright (never a
downloaded browser).  Without them the tests are skipped with a reason, except
in CI (CI set), where they fail.  Expected addresses come from the Python
side (plan names, symmetry.py canonical forms), so the script's own
reconstruction of names and canonical forms is checked against them.
"""

from __future__ import annotations

import os
from pathlib import Path

import pytest

from tablegen.buildinfo import BuildMeta
from tablegen.compute import compute_values
from tablegen.families import family
from tablegen.plan import plan_site
from tablegen.recipe import recipe_from_mapping
from tablegen.render.data import render_data
from tablegen.render.html import render_html
from tablegen.symmetry import ninej_canonical, sixj_canonical

CHROMIUM = "/usr/bin/chromium"
ARGS = [
    "--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
    "--disable-background-networking", "--disable-component-update", "--disable-sync",
]
SMALL = {"cg": {"max_j": 1}, "3j": {"max_j": 1}, "6j": {"max_j": 1}, "9j": {"max_j": 1}}


def _unavailable(reason: str) -> None:
    if os.environ.get("CI"):
        pytest.fail(f"browser test cannot run in CI: {reason}")
    pytest.skip(f"BROWSER TESTS SKIPPED: {reason} (install Debian's chromium and `pip install playwright`)")


@pytest.fixture(scope="module")
def site(tmp_path_factory):
    """A small build written to disk: HTML pages, assets and data files."""
    recipe = recipe_from_mapping(SMALL)
    plan = plan_site(recipe)
    book = compute_values(plan, jobs=1)
    meta = BuildMeta("tablegen", "0.1.0", "cd" * 32, recipe.toml_text(), recipe.title, (("cg", 1),))
    root = tmp_path_factory.mktemp("browser") / "site"
    outputs = list(render_html(plan, book, meta)) + list(render_data(plan, book, meta, b"values\n"))
    for path, data in outputs:
        target = root / path
        target.parent.mkdir(parents=True, exist_ok=True)
        target.write_bytes(data)
    return root, plan, book


@pytest.fixture(scope="module")
def browser():
    if not Path(CHROMIUM).exists():
        _unavailable(f"{CHROMIUM} not found")
    try:
        from playwright.sync_api import sync_playwright
    except ImportError:
        _unavailable("Python playwright is not installed")
    with sync_playwright() as p:
        b = p.chromium.launch(executable_path=CHROMIUM, args=ARGS)
        yield b
        b.close()


class Watched:
    """A page whose failed requests, console errors and script errors are recorded."""

    def __init__(self, browser, root: Path, clipboard: bool = False) -> None:
        self.context = browser.new_context(viewport={"width": 1280, "height": 800})
        if clipboard:
            self.context.grant_permissions(["clipboard-read", "clipboard-write"])
        self.page = self.context.new_page()
        self.root = root
        self.problems: list[str] = []
        self.page.on("requestfailed", lambda r: self.problems.append(f"failed request {r.url}"))
        self.page.on("pageerror", lambda e: self.problems.append(f"script error {e}"))
        self.page.on("console", lambda m: m.type == "error" and self.problems.append(f"console {m.text}"))

    def open(self, path: str) -> None:
        self.page.goto((self.root / path).as_uri())
        self.page.wait_for_load_state("load")

    def close(self) -> None:
        self.context.close()


@pytest.fixture
def tab(browser, site):
    w = Watched(browser, site[0])
    yield w
    w.close()


PAGES = ["index.html", "cg/1x0.5.html", "3j/0.5x1.html", "6j/jmax-1.html", "9j/jmax-1.html",
         "conventions.html", "methods.html", "cite.html"]


@pytest.mark.parametrize("path", PAGES)
def test_page_loads_without_errors_from_disk(tab, path):
    tab.open(path)
    page = tab.page
    assert page.url.startswith("file://")
    assert page.locator("#jump form").count() == 1, "the jump box was not built"
    assert page.locator("#jump").is_visible()
    assert page.evaluate("getComputedStyle(document.body).fontFamily").startswith("system-ui")
    if path != "index.html":
        assert page.locator("button.cp").count() >= 1, "no copy buttons were added"
    assert tab.problems == []


def test_value_mathml_is_laid_out(tab, site):
    # a MathML-capable browser gives the formula a real box (W3C MathML Core)
    tab.open("cg/1x0.5.html")
    box = tab.page.locator('td[id="J=3/2,M=1/2,m1=1"] > math').bounding_box()
    assert box and box["width"] > 10 and box["height"] > 10
    root_box = tab.page.locator('td[id="J=3/2,M=1/2,m1=1"] msqrt').bounding_box()
    assert root_box and root_box["width"] > 5 and root_box["height"] > 5
    tab.open("6j/jmax-1.html")
    sym = tab.page.locator("td.sym > math").first.bounding_box()
    assert sym and sym["height"] > 20  # a two-row array
    assert tab.problems == []


def _type(page, family: str, values: list[str]) -> None:
    page.select_option("#jump select", family)
    inputs = page.locator("#jump input")
    assert inputs.count() == len(values)
    for i, v in enumerate(values):
        inputs.nth(i).fill(v)
    page.locator("#jump button[type=submit]").click()


def _landed(page, path: str, anchor: str) -> None:
    page.wait_for_function(
        "([p, a]) => decodeURIComponent(location.pathname).endsWith('/' + p) && "
        "decodeURIComponent(location.hash) === '#' + a",
        arg=[path, anchor],
        timeout=5000,
    )
    assert page.evaluate("document.querySelector(':target') && document.querySelector(':target').id") == anchor
    assert page.locator(f'[id="{anchor}"]').count() == 1


# page names and anchors as the Python side writes them (the family records' layouts)
_CG, _3J = family("cg").layout, family("3j").layout
_ROWS = ((0, 1, 2), (3, 4, 5), (6, 7, 8))


def _class_place(key_of_family: str, canon):
    layout = family(key_of_family).layout
    return layout.page_path(key_of_family, canon[0]), layout.anchor(canon, _ROWS[: len(canon) // 3])


def _sixj_expected(key):
    return _class_place("6j", sixj_canonical(*key)[0])


CASES = [
    # <1 -1; 1/2 1/2 | 1/2 -1/2>, typed with a decimal and a fraction
    ("index.html", "cg", ["1", "-1", "0.5", "1/2", "1/2", "-0.5"],
     _CG.page_path("cg", 2, 1), _CG.anchor(1, -1, -2)),
    # (1/2 1 3/2; -1/2 1 -1/2) from a page in a subfolder, with a typographic minus
    ("3j/0x0.html", "3j", ["1/2", "1", "1.5", "\u22121/2", "1", "-1/2"],
     _3J.page_path("3j", 1, 2), _3J.anchor(3, -1, -1)),
]


@pytest.mark.parametrize("start, family, values, path, anchor", CASES)
def test_jump_box_lands_on_cg_and_3j_cells(tab, start, family, values, path, anchor):
    tab.open(start)
    _type(tab.page, family, values)
    _landed(tab.page, path, anchor)
    assert tab.problems == []


def test_jump_box_finds_a_6j_from_a_non_canonical_form(tab):
    key = (1, 1, 2, 1, 1, 0)  # {1/2 1/2 1; 1/2 1/2 0}
    path, anchor = _sixj_expected(key)
    assert anchor != _class_place("6j", key)[1], "the test needs a non-canonical form"
    tab.open("cg/0x0.html")
    _type(tab.page, "6j", ["1/2", "1/2", "1", "1/2", "1/2", "0"])
    _landed(tab.page, path, anchor)
    note = tab.page.locator("#jump-note").text_content()
    assert "canonical form" in note
    assert tab.problems == []


def test_jump_box_finds_a_racah_w_and_tells_the_sign(tab):
    # W(a b c d; e f) = (-1)^(a+b+c+d) {a b e; d c f} (Racah 1942; Edmonds 1957, eq. 6.2.13 — from memory)
    a, b, c, d, e, f = 1, 1, 1, 1, 2, 0  # W(1/2 1/2 1/2 1/2; 1 0)
    path, anchor = _sixj_expected((a, b, e, d, c, f))
    tab.open("index.html")
    _type(tab.page, "w", ["1/2", "1/2", "1/2", "1/2", "1", "0"])
    _landed(tab.page, path, anchor)
    note = tab.page.locator("#jump-note").text_content()
    assert note.startswith("W(1/2 1/2 1/2 1/2; 1 0) = {1/2 1/2 1; 1/2 1/2 0}")  # a+b+c+d = 2: sign +1
    tab.page.goto((tab.root / "index.html").as_uri())
    _type(tab.page, "w", ["1", "1/2", "1/2", "1", "1/2", "1/2"])  # a+b+c+d = 3: sign -1
    path, anchor = _sixj_expected((2, 1, 1, 2, 1, 1))
    _landed(tab.page, path, anchor)
    assert "= \u22121 \u00d7 {1 1/2 1/2; 1 1/2 1/2}" in tab.page.locator("#jump-note").text_content()
    assert tab.problems == []


def test_jump_box_finds_a_9j_from_a_non_canonical_form(tab):
    key = (1, 1, 2, 1, 1, 0, 2, 0, 2)  # {1/2 1/2 1; 1/2 1/2 0; 1 0 1}
    canon, sign = ninej_canonical(*key)
    assert canon != key, "the test needs a non-canonical form"
    tab.open("6j/jmax-1.html")
    _type(tab.page, "9j", ["0.5", "1/2", "1", "1/2", "0.5", "0", "1", "0", "1"])
    _landed(tab.page, *_class_place("9j", canon))
    note = tab.page.locator("#jump-note").text_content()
    assert ("\u22121 \u00d7" in note) == (sign < 0)
    assert tab.problems == []


@pytest.mark.parametrize(
    "family, values, message",
    [
        ("cg", ["1", "1", "1", "0", "1", "0"], "do not add up"),  # m1 + m2 != M
        ("cg", ["1", "0", "1", "0", "3", "0"], "triangle rule"),  # J > j1 + j2
        ("cg", ["2", "0", "1", "0", "1", "0"], "range"),  # j1 beyond this build
        ("3j", ["1", "1", "1", "1", "1", "1"], "do not add up"),
        ("6j", ["1", "1", "1", "1", "1", "3"], "triangle rule"),
        # the first failing triad in the order of the W kind's selection rules: (a, b, e), (a, c, f), ...
        ("w", ["1", "1", "1/2", "1", "1", "1"], "a, c, f do not add up"),
        ("9j", ["1", "1", "1", "1", "1", "1", "1", "1", "1/2"], "integer"),
        ("cg", ["1", "1/2", "1", "0", "1", "0"], "must be an integer"),
        ("cg", ["one", "0", "1", "0", "1", "0"], "not a number"),
        ("3j", ["1/3", "1", "1", "0", "0", "0"], "multiple of 1/2"),
    ],
)
def test_jump_box_explains_instead_of_navigating(tab, family, values, message):
    tab.open("index.html")
    before = tab.page.url
    _type(tab.page, family, values)
    out = tab.page.locator("#jump output")
    out.wait_for(state="visible")
    assert message in out.text_content()
    assert tab.page.url == before
    assert tab.problems == []


def _h(t: int) -> str:
    return str(t // 2) if t % 2 == 0 else f"{t}/2"


def _ket_latex(section, r: int, book) -> str:
    """|J,M> = c1 |j1,m1>|j2,m2> + ..., written independently of the site script."""
    tJ, tM = dict(section.params)["J"], section.rows[r]
    text = f"|{_h(tJ)},{_h(tM)}\\rangle = "
    first = True
    for entry in section.grid[r]:
        if entry is None or not book[("cg", entry.key)].value:
            continue
        shown = book[("cg", entry.key)]
        tj1, tm1, tj2, tm2, _, _ = entry.key
        negative = shown.value < 0
        text += ("-" if negative else "") if first else (" - " if negative else " + ")
        text += "" if shown.tex_abs == "1" else shown.tex_abs + "\\,"
        text += f"|{_h(tj1)},{_h(tm1)}\\rangle|{_h(tj2)},{_h(tm2)}\\rangle"
        first = False
    return text


def test_copy_buttons_copy_the_latex(browser, site):
    root, plan, book = site
    w = Watched(browser, root, clipboard=True)
    try:
        table = plan.table("cg-1x0.5")
        entry = table.sections[0].grid[1][0]  # J = 3/2, M = 1/2, m1 = 1
        w.open(table.page)
        cell = w.page.locator(f'td[id="{entry.anchor}"]')
        cell.hover()
        cell.locator("button.cp").click()
        assert w.page.evaluate("navigator.clipboard.readText()") == book[("cg", entry.key)].tex

        for pair in (plan.table("cg-1x1"), table):  # every state |J M> of two pages
            w.open(pair.page)
            for section in pair.sections:
                for r, anchor in enumerate(section.row_anchors):
                    w.page.locator(f'li[id="{anchor}"] button.cp').click()
                    assert w.page.evaluate("navigator.clipboard.readText()") == _ket_latex(section, r, book), anchor

        six = plan.tables_of("6j")[-1]
        entry = six.entries[-1]
        w.open(six.page)
        w.page.locator(f'tr[id="{entry.anchor}"] td[data-t] button.cp').first.click()
        assert w.page.evaluate("navigator.clipboard.readText()") == book[("6j", entry.key)].tex

        w.open("cite.html")
        w.page.locator("pre.copy + button.cp").first.click()
        assert w.page.evaluate("navigator.clipboard.readText()").startswith("@misc{tablegen-cdcdcdcd,")
        assert w.problems == []
    finally:
        w.close()


@pytest.fixture(scope="module")
def matrix_site(tmp_path_factory):
    """A build with the 6j on both the classes layout and the matrix layout (conftest.SIXJ_MATRICES)."""
    from conftest import SIXJ_MATRICES

    from tablegen.build import render_outputs
    from tablegen.recipe import FamilyRange, Recipe

    recipe = Recipe(families=(FamilyRange("6j", 0, 2), FamilyRange("6jm", 0, 2)))
    plan = plan_site(recipe, families=(family("6j"), SIXJ_MATRICES))
    _, outputs = render_outputs(plan, compute_values(plan, jobs=1))
    root = tmp_path_factory.mktemp("matrix") / "site"
    for path, data in outputs:
        (root / path).parent.mkdir(parents=True, exist_ok=True)
        (root / path).write_bytes(data)
    return root, plan


def test_jump_box_lands_on_a_matrix_cell(browser, matrix_site):
    root, plan = matrix_site
    w = Watched(browser, root)
    try:
        w.open("index.html")
        _type(w.page, "6j@6jm", ["1/2", "1", "1/2", "1", "1/2", "1"])  # {1/2 1 1/2; 1 1/2 1}
        layout = plan.family("6jm").layout
        block = layout.block_anchor((("j1", 1), ("j2", 2), ("j4", 2), ("j5", 1)))
        _landed(w.page, layout.page_path("6jm", 1), layout.anchor(block, 1, 2))
        w.page.goto((root / "index.html").as_uri())
        _type(w.page, "6j", ["1/2", "1", "1/2", "1", "1/2", "1"])  # the same symbol, on the classes layout
        _landed(w.page, *_sixj_expected((1, 2, 1, 2, 1, 2)))
        assert w.problems == []
    finally:
        w.close()


# -- the rotation and harmonics families (issue 9): the jump box reaches a d^j entry and a Y ----------
@pytest.fixture(scope="module")
def rotation_site(tmp_path_factory):
    from tablegen.build import render_outputs

    plan = plan_site(recipe_from_mapping({"rotation": {"max_j": "3/2"}, "harmonics": {"max_l": 2}}))
    _, outputs = render_outputs(plan, compute_values(plan, jobs=1))
    root = tmp_path_factory.mktemp("rotation") / "site"
    for path, data in outputs:
        (root / path).parent.mkdir(parents=True, exist_ok=True)
        (root / path).write_bytes(data)
    return root, plan


def test_jump_box_lands_on_a_rotation_function_and_a_harmonic(browser, rotation_site):
    root, plan = rotation_site
    w = Watched(browser, root)
    try:
        w.open("index.html")
        _type(w.page, "d", ["3/2", "1/2", "-3/2"])  # d^{3/2}_{1/2,-3/2}
        rot = plan.family("rotation").layout
        _landed(w.page, rot.page_path("rotation", 3), rot.anchor(rot.block_anchor((("j", 3),)), 1, -3))
        assert w.page.locator(f'[id="{rot.anchor("j=3/2", 1, -3)}"] math').count() == 1
        w.page.goto((root / "index.html").as_uri())
        _type(w.page, "Y", ["2", "-1"])
        har = plan.family("harmonics").layout
        _landed(w.page, har.page_path("harmonics"), har.anchor("", -2, 4))  # rows m, columns l
        w.page.goto((root / "index.html").as_uri())
        _type(w.page, "d", ["1", "2", "0"])  # |m'| > j: a zero by the selection rule, no navigation
        w.page.wait_for_function("document.querySelector('#jump').textContent.includes('|mp| > j')", timeout=5000)
        assert w.problems == []
    finally:
        w.close()

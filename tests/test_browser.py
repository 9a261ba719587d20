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


PAGES = ["index.html", "cg/j1-1-j2-0.5.html", "3j/j1-0.5-j2-1.html", "6j/j1-1.html", "9j/j11-1.html",
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
    tab.open("cg/j1-1-j2-0.5.html")
    box = tab.page.locator('td[id="J=3/2,M=1/2,m1=1"] > math').bounding_box()
    assert box and box["width"] > 10 and box["height"] > 10
    root_box = tab.page.locator('td[id="J=3/2,M=1/2,m1=1"] msqrt').bounding_box()
    assert root_box and root_box["width"] > 5 and root_box["height"] > 5
    tab.open("6j/j1-1.html")
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


_SMALL_PLAN = plan_site(recipe_from_mapping(SMALL))


def _class_place(key_of_family: str, canon):
    """The page and row of a filed class, from the Python plan."""
    layout = family(key_of_family).layout
    (page,) = [t.page for t in _SMALL_PLAN.tables_of(key_of_family) if any(e.key == canon for e in t.entries)]
    return page, layout.anchor(canon, _ROWS[: len(canon) // 3])


def _sixj_expected(key):
    # filed under its largest tetrahedral form (Edmonds 1957, eq. 6.2.4 — from memory)
    return _class_place("6j", family("6j").layout.filed_by(*key)[0][0])


CASES = [
    # <1 -1; 1/2 1/2 | 1/2 -1/2>, typed with a decimal and a fraction
    ("index.html", "cg", ["1", "-1", "0.5", "1/2", "1/2", "-0.5"],
     _CG.page_path("cg", 2, 1), _CG.anchor(1, -1, -2)),
    # (1/2 1 3/2; -1/2 1 -1/2) from a page in a subfolder, with a typographic minus
    ("3j/j1-0-j2-0.html", "3j", ["1/2", "1", "1.5", "\u22121/2", "1", "-1/2"],
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
    assert anchor != family("6j").layout.anchor(key, _ROWS[:2]), "the test needs a non-canonical form"
    tab.open("cg/j1-0-j2-0.html")
    _type(tab.page, "6j", ["1/2", "1/2", "1", "1/2", "1/2", "0"])
    _landed(tab.page, path, anchor)
    note = tab.page.locator("#jump-note .ctx").text_content()
    assert note.startswith("Filed under {1 1/2 1/2; 0 1/2 1/2}")  # its largest tetrahedral form
    assert tab.problems == []


def test_jump_box_finds_a_racah_w_and_tells_the_sign(tab):
    # W(a b c d; e f) = (-1)^(a+b+c+d) {a b e; d c f} (Racah 1942; Edmonds 1957, eq. 6.2.13 — from memory)
    a, b, c, d, e, f = 1, 1, 1, 1, 2, 0  # W(1/2 1/2 1/2 1/2; 1 0)
    path, anchor = _sixj_expected((a, b, e, d, c, f))
    tab.open("index.html")
    _type(tab.page, "w", ["1/2", "1/2", "1/2", "1/2", "1", "0"])
    _landed(tab.page, path, anchor)
    note = tab.page.locator("#jump-note .ctx").text_content()
    assert note.startswith("W(1/2 1/2 1/2 1/2; 1 0) = {1/2 1/2 1; 1/2 1/2 0}")  # a+b+c+d = 2: sign +1
    tab.page.goto((tab.root / "index.html").as_uri())
    _type(tab.page, "w", ["1", "1/2", "1/2", "1", "1/2", "1/2"])  # a+b+c+d = 3: sign -1
    path, anchor = _sixj_expected((2, 1, 1, 2, 1, 1))
    _landed(tab.page, path, anchor)
    assert "= \u22121 \u00d7 {1 1/2 1/2; 1 1/2 1/2}" in tab.page.locator("#jump-note .ctx").text_content()
    assert tab.problems == []


def test_jump_box_finds_a_9j_from_a_non_canonical_form(tab):
    key = (1, 1, 2, 1, 1, 0, 2, 0, 2)  # {1/2 1/2 1; 1/2 1/2 0; 1 0 1}
    canon, sign = ninej_canonical(*key)
    assert canon != key, "the test needs a non-canonical form"
    tab.open("6j/j1-1.html")
    _type(tab.page, "9j", ["0.5", "1/2", "1", "1/2", "0.5", "0", "1", "0", "1"])
    _landed(tab.page, *_class_place("9j", canon))
    note = tab.page.locator("#jump-note .ctx").text_content()
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


def _half_text(t: int) -> str:
    """A doubled quantum number as written: 3 -> '3/2', 4 -> '2'."""
    return str(t // 2) if t % 2 == 0 else f"{t}/2"


def _ket_latex(section, r: int, book) -> str:
    """|(j1,j2) J,M> = c1 |j1,m1>|j2,m2> + ..., written independently of the site script."""
    tJ, tM = dict(section.params)["J"], section.rows[r]
    tj1, tj2 = section.entries[0].key[0], section.entries[0].key[2]
    text = f"|({_half_text(tj1)},{_half_text(tj2)})\\,{_half_text(tJ)},{_half_text(tM)}\\rangle = "
    first = True
    for entry in section.grid[r]:
        if entry is None or not book[("cg", entry.key)].value:
            continue
        shown = book[("cg", entry.key)]
        tj1, tm1, tj2, tm2, _, _ = entry.key
        negative = shown.value < 0
        text += ("-" if negative else "") if first else (" - " if negative else " + ")
        text += "" if shown.tex_abs == "1" else shown.tex_abs + "\\,"
        text += f"|{_half_text(tj1)},{_half_text(tm1)}\\rangle|{_half_text(tj2)},{_half_text(tm2)}\\rangle"
        first = False
    return text


def test_copy_buttons_copy_the_latex(browser, site):
    root, plan, book = site
    w = Watched(browser, root, clipboard=True)
    try:
        table = plan.table("cg-j1-1-j2-0.5")
        entry = table.sections[0].grid[1][0]  # J = 3/2, M = 1/2, m1 = 1
        w.open(table.page)
        cell = w.page.locator(f'td[id="{entry.anchor}"]')
        cell.hover()
        cell.locator("button.cp").first.click()
        assert w.page.evaluate("navigator.clipboard.readText()") == book[("cg", entry.key)].tex

        for pair in (plan.table("cg-j1-1-j2-1"), table):  # every state |J M> of two pages
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


def _equation(kind_key: str, key: tuple[int, ...], book) -> str:
    from tablegen.kinds import kind
    from tablegen.render.latex import latex_symbol
    from tablegen.spins import half_text

    return f"{latex_symbol(kind(kind_key).notation, [half_text(x) for x in key])} = {book[(kind_key, key)].tex}"


def _copy_equation(w, cell) -> str:
    button = cell.locator("button.cp", has_text="TeX =")
    assert button.count() == 1
    button.click()
    return w.page.evaluate("navigator.clipboard.readText()")


def test_every_kind_of_value_copies_symbol_equals_value(browser, site):
    root, plan, book = site
    w = Watched(browser, root, clipboard=True)
    try:
        # <1 1; 1/2 -1/2 | 3/2 1/2> = sqrt(1/3) (closed form for j2 = 1/2, Edmonds 1957, ch. 3)
        table = plan.table("cg-j1-1-j2-0.5")
        w.open(table.page)
        cell = w.page.locator('td[id="J=3/2,M=1/2,m1=1"]')
        assert _copy_equation(w, cell) == "\\langle 1\\,1;\\,1/2\\,-1/2\\vert 3/2\\,1/2\\rangle = \\sqrt{\\frac{1}{3}}"
        for family_key in ("cg", "3j"):
            for t in plan.tables_of(family_key)[-2:]:
                w.open(t.page)
                for entry in t.entries[:: max(1, len(t.entries) // 6)]:
                    got = _copy_equation(w, w.page.locator(f'td[id="{entry.anchor}"]'))
                    assert got == _equation(t.kind, entry.key, book), entry.anchor
        for family_key in ("6j", "9j"):
            t = plan.tables_of(family_key)[-1]
            fam = plan.family(family_key)
            w.open(t.page)
            entry = t.entries[-1]
            cells = w.page.locator(f'tr[id="{entry.anchor}"] td[data-t]')
            assert _copy_equation(w, cells.nth(0)) == _equation(family_key, entry.key, book)
            for i, c in enumerate(fam.companions, 1):  # the Racah W beside the 6j
                assert _copy_equation(w, cells.nth(i)) == _equation(c.kind, c.mapping(entry.key)[0], book)
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


# -- the sign trap (issue 8): a typed or linked form shows its own value ------------------------
def _signed_form(kind_key: str, fam_key: str, book):
    """A form of a non-zero symbol whose value is −1 × its class's highlighted row, found from the Python side."""
    from tablegen.kinds import kind
    from tablegen.layouts import symbols_in_range

    k = kind(kind_key)
    for t in symbols_in_range(k, 0, 2):
        members = k.members(*t)  # value(form) = sign * value(t); members[0] is the canonical form
        for form, sign in members:
            if sign * members[0][1] < 0 and k.doubled(*form):
                return form
    raise AssertionError(f"no form with sign -1 in {kind_key}")  # pragma: no cover


def _check_said(tab, kind_key: str, form) -> None:
    """The note shows value(form) with its own sign: LaTeX, decimal and the copied LaTeX."""
    from tablegen.kinds import kind

    value = kind(kind_key).doubled(*form)
    tex = value.latex("root")  # the small build's recipe style
    said = tab.page.locator("#jump-note .said")
    said.wait_for(state="visible")
    assert said.get_attribute("data-value") == tex
    assert value.decimal(15) in said.text_content()
    said.locator("button.cp").click()
    assert tab.page.evaluate("navigator.clipboard.readText()") == tex


@pytest.fixture
def clip_tab(browser, site):
    w = Watched(browser, site[0], clipboard=True)
    yield w
    w.close()


def test_a_typed_9j_with_sign_minus_one_shows_its_own_value(clip_tab, site):
    # odd row/column permutations bring (-1)^(sum of the nine j) (Edmonds 1957, eq. 6.4.6 — from memory)
    _, plan, book = site
    form = _signed_form("9j", "9j", book)
    canon, sign = ninej_canonical(*form)
    assert sign < 0 and canon != form
    clip_tab.open("index.html")
    _type(clip_tab.page, "9j", [_half_text(x) for x in form])
    _landed(clip_tab.page, *_class_place("9j", canon))
    _check_said(clip_tab, "9j", form)
    assert clip_tab.problems == []


def test_a_typed_w_with_sign_minus_one_shows_its_own_value(clip_tab, site):
    # W(a b c d; e f) = (-1)^(a+b+c+d) {a b e; d c f} (Racah 1942; Edmonds 1957, eq. 6.2.13 — from memory)
    a, b, c, d, e, f = 2, 1, 1, 2, 1, 1  # a+b+c+d = 3: W = -{1 1/2 1/2; 1 1/2 1/2}
    from tablegen.kinds import kind

    assert kind("w").doubled(a, b, c, d, e, f) == -kind("6j").doubled(a, b, e, d, c, f) != 0
    clip_tab.open("index.html")
    _type(clip_tab.page, "w", [_half_text(x) for x in (a, b, c, d, e, f)])
    _landed(clip_tab.page, *_sixj_expected((a, b, e, d, c, f)))
    _check_said(clip_tab, "w", (a, b, c, d, e, f))
    assert clip_tab.problems == []


def test_a_link_to_one_form_shows_that_form(clip_tab, site):
    # a link naming a non-canonical 9j form lands on its class and shows the form's own value
    _, plan, book = site
    form = _signed_form("9j", "9j", book)
    canon, _ = ninej_canonical(*form)
    path, anchor = _class_place("9j", canon)
    form_anchor = family("9j").layout.anchor(form, _ROWS)
    clip_tab.page.goto((clip_tab.root / path).as_uri() + "#" + form_anchor)
    _landed(clip_tab.page, path, anchor)
    _check_said(clip_tab, "9j", form)
    assert clip_tab.problems == []


# -- layout at a laptop's and a phone's size, and in print (issue 8) --------------------------------
@pytest.fixture(scope="module")
def wide_site(tmp_path_factory):
    """A build whose widest CG page is 4 ⊗ 4 (nine columns m1)."""
    recipe = recipe_from_mapping({"cg": {"max_j": 4}})
    plan = plan_site(recipe)
    book = compute_values(plan, jobs=1)
    meta = BuildMeta("tablegen", "0.1.0", "cd" * 32, recipe.toml_text(), recipe.title, (("cg", 1),))
    root = tmp_path_factory.mktemp("wide") / "site"
    for path, data in render_html(plan, book, meta):
        target = root / path
        target.parent.mkdir(parents=True, exist_ok=True)
        target.write_bytes(data)
    return root


def test_a_4x4_cg_page_fits_a_laptop_screen(browser, wide_site):
    w = Watched(browser, wide_site)  # 1280 × 800
    try:
        w.open(_CG.page_path("cg", 8, 8))
        page = w.page
        # the page itself never scrolls sideways; the table scrolls inside its own box
        assert page.evaluate("document.documentElement.scrollWidth") <= 1280
        box = page.locator(".scroll").first
        assert box.evaluate("b => b.scrollWidth > b.clientWidth")
        # headers stay in view while the table's box scrolls down and across
        head = page.locator(".grid thead th").nth(3)
        row_head = page.locator(".grid tbody th").first
        top0, left0 = box.bounding_box()["y"], box.bounding_box()["x"]
        box.evaluate("b => { b.scrollTop = 200; b.scrollLeft = 300; }")
        assert abs(head.bounding_box()["y"] - top0) < 2
        assert abs(row_head.bounding_box()["x"] - left0) < 2
        assert w.problems == []
    finally:
        w.close()


@pytest.mark.parametrize("path", PAGES)
def test_the_header_takes_at_most_a_tenth_of_a_phone_screen(browser, site, path):
    w = Watched(browser, site[0])
    w.context.close()
    w.context = browser.new_context(viewport={"width": 390, "height": 844}, is_mobile=True, has_touch=True)
    w.page = w.context.new_page()
    try:
        w.open(path)
        assert w.page.locator("header.top").bounding_box()["height"] <= 844 / 10
        assert w.page.evaluate("document.documentElement.scrollWidth") <= 390
        # the folded jump box opens from its button and still works
        w.page.locator(".bar .find").click()
        assert w.page.locator("#jump form").is_visible()
    finally:
        w.close()


def test_print_hides_downloads_and_buttons(tab):
    for path in ("index.html", "cg/j1-1-j2-0.5.html", "6j/j1-1.html"):
        tab.open(path)
        tab.page.emulate_media(media="print")
        assert tab.page.locator("button").count() >= 1
        assert all(not b.is_visible() for b in tab.page.locator("button").all())
        assert all(not a.is_visible() for a in tab.page.locator(".dl a").all())
        assert tab.page.locator("table").first.is_visible()  # the values themselves print
        tab.page.emulate_media(media="screen")


def test_the_jump_box_reaches_a_pair_split_into_pages(browser, tmp_path):
    # 9 ⊗ 9 has a page per J (pages stay light); <9 1; 9 -1 | 5 0> is on the J = 5 page
    recipe = recipe_from_mapping({"cg": {"min_j": "9", "max_j": "9"}})
    plan = plan_site(recipe)
    book = compute_values(plan, jobs=1)
    meta = BuildMeta("tablegen", "0.1.0", "cd" * 32, recipe.toml_text(), recipe.title, (("cg", 1),))
    for path, data in render_html(plan, book, meta):
        (tmp_path / path).parent.mkdir(parents=True, exist_ok=True)
        (tmp_path / path).write_bytes(data)
    w = Watched(browser, tmp_path)
    try:
        w.open("index.html")
        _type(w.page, "cg", ["9", "1", "9", "-1", "5", "0"])
        _landed(w.page, _CG.page_path("cg", 18, 18, 10), _CG.anchor(10, 0, 2))
        assert w.problems == []
    finally:
        w.close()


def test_jump_box_lands_on_four_spin_states(browser, recoupling_site):
    root, plan = recoupling_site
    w = Watched(browser, root)
    try:
        # fields in the order of the symbol <j1 m1; j2 m2; j3 m3; j4 m4 | j12 j34 J M>
        w.open("index.html")
        _type(w.page, "state4", ["1/2", "1/2", "1/2", "-1/2", "1/2", "1/2", "1/2", "-1/2", "1", "0", "1", "0"])
        layout = plan.family("state4").layout
        block = layout.block_anchor((("j1", 1), ("j2", 1), ("j3", 1), ("j4", 1), ("M", 0)))
        _landed(w.page, layout.page_path("state4", 1, 1, 1, 1), layout.anchor(block, (2, 0, 2), (1, -1, 1, -1)))
        assert w.problems == []
    finally:
        w.close()


def test_jump_box_files_an_lsjj_with_l1_above_l2_under_l1_below_l2(browser, recoupling_site):
    # the site has the page sp, not ps: the box lands on the exchanged form and says the sign
    from tablegen.kinds import kind

    root, plan = recoupling_site
    layout = plan.family("lsjj").layout
    k = kind("lsjj")
    typed = (4, 2, 0, 1, 1, 2, 2, 2)  # LSjj(2; 1 0; 1/2 1/2; 1 1; 1): l1 = 1 > l2 = 0, particles in two shells
    filed, sign = layout.exchange.filed(k.arguments, typed)
    assert filed == (4, 0, 2, 1, 1, 2, 2, 2) and k.doubled(*typed) == sign * k.doubled(*filed) != 0
    w = Watched(browser, root)
    try:
        w.open("index.html")
        _type(w.page, "lsjj", ["2", "1", "0", "1/2", "1/2", "1", "1", "1"])  # LSjj(shells; l1 l2; j1 j2; L S; J)
        block = layout.block_anchor((("shells", 4), ("l1", 0), ("l2", 2), ("J", 2)))
        _landed(w.page, layout.page_path("lsjj", 4, 0, 2), layout.anchor(block, (1, 1), (2, 2)))
        note = w.page.locator("#jump-note .ctx").text_content()
        assert note.startswith("Filed as LSjj(2; 0 1; 1/2 1/2; 1 1; 1)"), note
        assert ("\u22121 \u00d7" in note) == (sign < 0)
        said = w.page.locator("#jump-note .said")
        assert said.get_attribute("data-value") == k.doubled(*typed).latex("root")  # the typed form's own value
        # equivalent particles in two different shells name no page: a message, no navigation
        w.page.goto((root / "index.html").as_uri())
        before = w.page.url
        _type(w.page, "lsjj", ["1", "0", "1", "1/2", "1/2", "1", "1", "1"])
        out = w.page.locator("#jump output")
        out.wait_for(state="visible")
        assert "no LS–jj transformation of two particles page for shells = 1, l1 = 0, l2 = 1" in out.text_content()
        assert w.page.url == before
        _type(w.page, "lsjj", ["1", "1", "0", "1/2", "1/2", "1", "1", "1"])  # the same with l1 > l2: named as typed
        w.page.wait_for_function("document.querySelector('#jump output').textContent.indexOf('l1 = 1, l2 = 0') >= 0")
        assert w.page.url == before
        assert w.problems == []
    finally:
        w.close()


@pytest.fixture(scope="module")
def recoupling_site(tmp_path_factory):
    """A build with the recoupling families (issue 10): rows and columns named by several arguments."""
    from tablegen.build import render_outputs
    from tablegen.recipe import FamilyRange, Recipe

    recipe = Recipe(families=(FamilyRange("6j", 0, 2), FamilyRange("recouple3", 1, 2), FamilyRange("lsjj", 0, 2),
                              FamilyRange("state3", 1, 1), FamilyRange("state4", 1, 1)))
    plan = plan_site(recipe)
    _, outputs = render_outputs(plan, compute_values(plan, jobs=1))
    root = tmp_path_factory.mktemp("recoupling") / "site"
    for path, data in outputs:
        (root / path).parent.mkdir(parents=True, exist_ok=True)
        (root / path).write_bytes(data)
    return root, plan


def test_jump_box_lands_on_recoupling_cells(browser, recoupling_site):
    root, plan = recoupling_site
    w = Watched(browser, root)
    try:
        # <(1/2 1)1/2, 1/2; 1 | 1/2, (1 1/2)3/2; 1>
        w.open("index.html")
        _type(w.page, "recouple3", ["1/2", "1", "1/2", "1", "1/2", "3/2"])
        layout = plan.family("recouple3").layout
        block = layout.block_anchor((("j1", 1), ("j2", 2), ("j3", 1), ("J", 2)))
        _landed(w.page, layout.page_path("recouple3", 1), layout.anchor(block, 1, 3))
        # p^2, J = 2: <(1/2, 3/2); 2 | 1D2>, the page of a configuration named by shells, l1, l2
        w.page.goto((root / "index.html").as_uri())
        _type(w.page, "lsjj", ["1", "1", "1", "1/2", "3/2", "2", "0", "2"])  # LSjj(shells; l1 l2; j1 j2; L S; J)
        layout = plan.family("lsjj").layout
        block = layout.block_anchor((("shells", 2), ("l1", 2), ("l2", 2), ("J", 4)))
        _landed(w.page, layout.page_path("lsjj", 2, 2, 2), layout.anchor(block, (1, 3), (4, 0)))
        # three spins 1/2: the product state |1/2,1/2>|1/2,-1/2>|1/2,1/2> in |(1/2 1/2)1, 1/2; 3/2, 1/2>
        w.page.goto((root / "index.html").as_uri())
        # fields in the order of the symbol <j1 m1; j2 m2; j3 m3 | j12 J M>
        _type(w.page, "state3", ["1/2", "1/2", "1/2", "-1/2", "1/2", "1/2", "1", "3/2", "1/2"])
        layout = plan.family("state3").layout
        block = layout.block_anchor((("j1", 1), ("j2", 1), ("j3", 1), ("M", 1)))
        _landed(w.page, layout.page_path("state3", 1, 1, 1), layout.anchor(block, (2, 3), (1, -1, 1)))
        assert w.problems == []
    finally:
        w.close()


@pytest.mark.parametrize("path", ["cg/j1-1-j2-0.5.html", "3j/j1-0.5-j2-1.html"])
def test_each_cell_links_to_its_twin_as_the_plan_says(tab, site, path):
    # the page script writes each cell's twin link from its table's pattern; the plan says where each must go
    from tablegen.render.links import relative_url

    _, plan, _ = site
    tab.open(path)
    made = tab.page.evaluate(
        "Array.from(document.querySelectorAll('table[data-twin] td[id]'))"
        ".map(td => [td.id, Array.from(td.querySelectorAll('a')).map(a => a.getAttribute('href'))])")
    wanted = {e.anchor: relative_url(path, e.twin) for t in plan.tables if t.page == path for e in t.entries}
    assert len(made) == len(wanted) > 5
    for cell_id, hrefs in made:
        assert hrefs == [wanted[cell_id]], cell_id
    # following one lands on the same number: |1, 1>|1/2, -1/2> in J = 1/2 <-> its 3j (common practice, no source)
    if path.startswith("cg/"):
        tab.page.locator('td[id="J=1/2,M=1/2,m1=1"] a').click()
        tab.page.wait_for_load_state("load")
        assert tab.page.url.endswith("3j/j1-1-j2-0.5.html#j3=1/2,m3=-1/2,m1=1")
    assert tab.problems == []


# -- the rotation and harmonics families (issue 9): the jump box reaches a d^j entry and a Y ----------
@pytest.fixture(scope="module")
def rotation_site(tmp_path_factory):
    from tablegen.build import render_outputs

    plan = plan_site(recipe_from_mapping({"rotation": {"max_j": "3/2"}, "harmonics": {"max_l": 2}}))
    book = compute_values(plan, jobs=1)
    _, outputs = render_outputs(plan, book)
    root = tmp_path_factory.mktemp("rotation") / "site"
    for path, data in outputs:
        (root / path).parent.mkdir(parents=True, exist_ok=True)
        (root / path).write_bytes(data)
    return root, plan, book


def test_jump_box_lands_on_a_rotation_function_and_a_harmonic(browser, rotation_site):
    root, plan, _ = rotation_site
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
        w.page.goto((root / "index.html").as_uri())
        _type(w.page, "Y", ["3", "0"])  # l beyond the build's range: said, no navigation
        w.page.wait_for_function("document.querySelector('#jump').textContent.includes('range')", timeout=5000)
        assert w.problems == []
    finally:
        w.close()


def test_rotation_cells_copy_symbol_equals_value(browser, rotation_site):
    # each matrix has its own symbol: the function d^j_{m'm}(beta), then its values at pi/2 and pi/3
    root, plan, book = rotation_site
    w = Watched(browser, root, clipboard=True)
    try:
        t = plan.tables_of("rotation")[-1]
        w.open(t.page)
        entry = t.entries[1]
        assert _copy_equation(w, w.page.locator(f'td[id="{entry.anchor}"]')) == _equation("d", entry.key, book)
        for a in plan.family("rotation").alongside:
            got = _copy_equation(w, w.page.locator(f'td[id="{entry.anchor};{a.kind}"]'))
            assert got == _equation(a.kind, entry.key, book), a.kind
        h = plan.tables_of("harmonics")[0]
        w.open(h.page)
        entry = h.entries[2]
        assert _copy_equation(w, w.page.locator(f'td[id="{entry.anchor}"]')) == _equation("Y", entry.key, book)
        assert w.problems == []
    finally:
        w.close()

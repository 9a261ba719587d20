"""HTML pages of a small build: completeness, anchors, links, escaping, values, determinism.

Pages are parsed with the standard library's html.parser, the way any HTML
consumer would see them (the HTML Living Standard's rules for ids and links).
"""

from __future__ import annotations

import json
import posixpath
import re
from html.parser import HTMLParser
from urllib.parse import urlsplit

import pytest

from tablegen.buildinfo import BuildMeta
from tablegen.cellpattern import fill_cell_pattern
from tablegen.compute import compute_values
from tablegen.layouts import ClassesLayout
from tablegen.plan import plan_site
from tablegen.recipe import recipe_from_mapping
from tablegen.render.data import render_data
from tablegen.render.html import asset_paths, relative_url, render_html
from tablegen.symmetry import sixj_tetrahedral_members, ninej_canonical, sixj_canonical

HOSTILE_TITLE = "Tables <script>alert('t')</script> & more"
HOSTILE_NOTES = 'Line one <img src=x onerror="alert(1)"> & \'quoted\'\nline two </p><script>bad()</script>'
SMALL = {
    "title": HOSTILE_TITLE,
    "notes": HOSTILE_NOTES,
    "cg": {"max_j": 1},
    "3j": {"max_j": 1},
    "6j": {"max_j": 1},
    "9j": {"max_j": 1},
}
# files at the site root written by the data renderer and linked from pages
ROOT_DATA = {"values.txt", "recipe.toml", "cite.bib"}


class _Page(HTMLParser):
    """Collects ids, links, data-t attributes and the text of <math> elements."""

    def __init__(self) -> None:
        super().__init__(convert_charrefs=True)
        self.ids: list[str] = []
        self.links: list[tuple[str, str]] = []  # (attribute, value)
        self.tex: dict[str, str] = {}
        self.math_in: dict[str, int] = {}
        self.cell_links: dict[str, list[str]] = {}
        self._stack: list[str | None] = []  # id of the enclosing element with an id
        self.scripts_inline = 0

    def handle_starttag(self, tag, attrs):
        a = dict(attrs)
        if "id" in a:
            self.ids.append(a["id"])
            if "data-t" in a:
                self.tex[a["id"]] = a["data-t"]
        for name in ("href", "src", "action"):
            if name in a and a[name] is not None:
                self.links.append((name, a[name]))
        current = self._stack[-1] if self._stack else None
        if tag == "math" and current is not None:
            self.math_in[current] = self.math_in.get(current, 0) + 1
        if tag == "a" and current is not None and "href" in a:
            self.cell_links.setdefault(current, []).append(a["href"])
        if tag == "script" and "src" not in a and a.get("type") != "application/json":  # data blocks never run
            self.scripts_inline += 1
        if tag == "table":
            self._twin = a.get("data-twin")
        if tag == "td" and a.get("id") and getattr(self, "_twin", None):
            # the link site.js writes into the cell from the table's pattern (cellpattern's rule)
            self.cell_links.setdefault(a["id"], []).append(fill_cell_pattern(self._twin, a["id"]))
        if tag in ("td", "tr", "li"):
            self._stack.append(a.get("id", current))

    def handle_endtag(self, tag):
        if tag == "table":
            self._twin = None
        if tag in ("td", "tr", "li") and self._stack:
            self._stack.pop()


def _parse(data: bytes) -> _Page:
    p = _Page()
    p.feed(data.decode("utf-8"))
    p.close()
    return p


def _meta(recipe, plan) -> BuildMeta:
    counts = tuple((f.family, sum(len(t.entries) for t in plan.tables_of(f.family))) for f in recipe.families)
    return BuildMeta("tablegen", "0.1.0", "ab" * 32, recipe.toml_text(), recipe.title, counts)


@pytest.fixture(scope="module")
def built():
    recipe = recipe_from_mapping(SMALL)
    plan = plan_site(recipe)
    book = compute_values(plan, jobs=1)
    meta = _meta(recipe, plan)
    files = dict(render_html(plan, book, meta))
    return recipe, plan, book, meta, files


@pytest.fixture(scope="module")
def parsed(built):
    files = built[4]
    return {path: _parse(data) for path, data in files.items() if path.endswith(".html")}


def test_every_planned_page_and_the_assets_are_written(built):
    _, plan, _, _, files = built
    assert sorted(files) == sorted([p.path for p in plan.pages] + list(asset_paths()))
    assert all(isinstance(v, bytes) and v for v in files.values())


def test_every_anchor_is_an_id_exactly_once_on_its_page(built, parsed):
    _, plan, _, _, _ = built
    for table in plan.tables:
        ids = parsed[table.page].ids
        wanted = [s.anchor for s in table.sections]
        wanted += [e.anchor for e in table.entries]
        wanted += [a for s in table.sections for a in s.row_anchors]
        for anchor in wanted:
            assert ids.count(anchor) == 1, (table.page, anchor, ids.count(anchor))
    for path, page in parsed.items():
        dupes = {i for i in page.ids if page.ids.count(i) > 1}
        assert not dupes, (path, dupes)


def _known_files(plan, book, meta, files) -> set[str]:
    known = set(files)
    known |= {path for path, _ in render_data(plan, book, meta, b"")}
    known |= {t.tex for t in plan.tables} | {t.tex_sheet for t in plan.tables} | {plan.booklet}
    return known


def test_every_internal_link_resolves_to_a_file_and_an_id(built, parsed):
    # HTML Living Standard: a fragment names the element whose id equals it exactly
    _, plan, book, meta, files = built
    known = _known_files(plan, book, meta, files)
    assert ROOT_DATA <= known
    checked = 0
    for path, page in parsed.items():
        for attr, link in page.links:
            parts = urlsplit(link)
            assert not parts.scheme and not parts.netloc, f"{path}: external {attr}={link}"
            assert not link.startswith("//"), f"{path}: protocol-relative {link}"
            target = posixpath.normpath(posixpath.join(posixpath.dirname(path), parts.path)) if parts.path else path
            assert target in known, f"{path}: {attr}={link} points at a missing file {target}"
            if parts.fragment:
                assert target.endswith(".html"), f"{path}: anchor into a non-page {link}"
                assert parts.fragment in parsed[target].ids, f"{path}: {link} has no element with that id"
            checked += 1
    assert checked > 500


def test_no_external_resources_anywhere(built):
    files = built[4]
    for path, data in files.items():
        text = data.decode("utf-8")
        for m in re.finditer(r"""(?:href|src|action)\s*=\s*["']?([^"'\s>]+)""", text):
            assert not re.match(r"(?i)(https?:|//|ftp:|data:)", m.group(1)), (path, m.group(1))
        assert "@import" not in text and "url(" not in text, path
        assert not re.search(r"(?i)https?://", text.replace("http://www.w3.org/1998/Math/MathML", "")), path


def test_title_and_notes_are_escaped(built, parsed):
    files = built[4]
    index = files["index.html"].decode("utf-8")
    assert "<script>alert" not in index and "<img" not in index and "<script>bad" not in index
    assert "Tables &lt;script&gt;alert(&#39;t&#39;)&lt;/script&gt; &amp; more" in index
    assert "&lt;img src=x onerror=&#34;alert(1)&#34;&gt; &amp;" in index
    assert "&lt;/p&gt;&lt;script&gt;bad()&lt;/script&gt;" in index
    for path, data in files.items():
        if path.endswith(".html"):
            assert "<script>alert" not in data.decode("utf-8"), path
            assert parsed[path].scripts_inline == 0, path


def test_every_value_cell_has_mathml_and_its_latex(built, parsed):
    _, plan, book, _, _ = built
    for table in plan.tables:
        page = parsed[table.page]
        for entry in table.entries:
            shown = book[(table.family, entry.key)]
            assert page.math_in.get(entry.anchor, 0) >= 1, (table.page, entry.anchor)
            if table.family in ("cg", "3j"):
                assert page.tex[entry.anchor] == shown.tex, (table.page, entry.anchor)


def test_value_text_shows_the_decimal_and_the_exact_form(built):
    _, plan, book, _, files = built
    for table in plan.tables:
        text = files[table.page].decode("utf-8")
        for entry in table.entries:
            shown = book[(table.family, entry.key)]
            start = text.index(f'id="{entry.anchor}"')
            chunk = text[start : start + 2500]
            if shown.value:
                assert shown.decimal in chunk, (table.page, entry.anchor)
            else:
                assert "<mn>0</mn>" in chunk


def test_cg_and_3j_cells_link_to_their_twins(built, parsed):
    _, plan, _, _, _ = built
    count = 0
    for table in plan.tables:
        if table.family not in ("cg", "3j"):
            continue
        page = parsed[table.page]
        for entry in table.entries:
            assert entry.twin is not None
            assert relative_url(table.page, entry.twin) in page.cell_links.get(entry.anchor, []), entry.anchor
            count += 1
    assert count > 50


def test_cg_rows_are_written_as_ket_expansions(built, parsed):
    # the expansion |(j1 j2) J M> = sum <j1 m1; j2 m2|J M> |j1 m1>|j2 m2> (Edmonds 1957, eq. 3.5.1 — from memory)
    _, plan, book, _, files = built
    for table in plan.tables_of("cg"):
        page = parsed[table.page]
        text = files[table.page].decode("utf-8")
        j1, j2 = (_half_text(v) for _, v in table.params)
        assert f'data-j="{j1},{j2}"' in text  # what the script needs to write the LaTeX
        for section in table.sections:
            tJ = dict(section.params)["J"]
            for r, tM in enumerate(section.rows):
                anchor = section.row_anchors[r]
                item = text[text.index(f'<li id="{anchor}">') :]
                item = item[: item.index("</li>")]
                assert item.count("<math>") == page.math_in[anchor]
                # the coupled state shows its coupling; product states are |j m>|j m> (issue 8)
                assert f"<mtext>|({j1}, {j2}) {_shown_half(tJ)}, {_shown_half(tM)}⟩</mtext><mo>=</mo>" in item
                terms = [e for e in section.grid[r] if e is not None and book[("cg", e.key)].value]
                assert page.math_in[anchor] == len(terms) + 1
                for e in terms:
                    tj1, tm1, tj2, tm2, _, _ = e.key
                    assert f"|{_shown_half(tj1)}, {_shown_half(tm1)}⟩|{_shown_half(tj2)}, {_shown_half(tm2)}⟩</mtext>" in item, (anchor, e.key)
                # the row header links to the expansion (the script finds the row this way)
                assert text.count(f'<a href="#{anchor}">') == 1


def _shown_half(t: int) -> str:
    """A doubled quantum number as a page shows it, with the typographic minus sign."""
    return _half_text(t).replace("-", "−")


def _half_text(t: int) -> str:
    """A doubled quantum number as written: 3 -> '3/2', 4 -> '2'."""
    return str(t // 2) if t % 2 == 0 else f"{t}/2"


def _braced(member) -> str:
    return "{" + "; ".join(" ".join(_half_text(x) for x in member[i : i + 3]) for i in (0, 3, 6)[: len(member) // 3]) + "}"


def test_symbol_pages_list_every_form_and_the_racah_w(built):
    # a row lists its ordinary forms (6j: 24 tetrahedral forms, Edmonds 1957, eq. 6.2.4; 9j: row/column
    # permutations and the transpose, eq. 6.4.6 — from memory); Regge partners are linked, never listed as forms
    recipe, plan, book, _, files = built
    for table in plan.tables:
        if table.family not in ("6j", "9j"):
            continue
        fam = plan.family(table.family)
        f = recipe.family(table.family)
        text = files[table.page].decode("utf-8")
        for entry in table.entries:
            row = text[text.index(f'<tr id="{entry.anchor}"') :]
            row = row[: row.index("</tr>")]
            forms = fam.layout.filed_by(*entry.key)
            assert forms[0] == (entry.key, 1)  # filed under its largest form
            for member, sign in forms:
                assert f"<li>{_braced(member)}" in row, (entry.anchor, member)
            if any(s < 0 for _, s in forms):
                assert "Equal to minus the value" in row
            # every other form of the same value is a form of a linked partner or lies beyond the range
            ordinary = {m for m, _ in forms}
            every = fam.kind_record.members(*entry.key)  # every symmetry, Regge's included
            assert entry.members == tuple(forms)  # the data files list the class as filed
            beyond = [m for m, _ in every if any(not f.min_tj <= x <= f.max_tj for x in m)]
            assert entry.beyond == (len(beyond) if entry.partners or beyond else 0)
            for m, _ in every:
                if m in ordinary or m in beyond:
                    continue
                canon = fam.layout.filed_by(*m)[0][0]
                assert any(p.endswith("#" + fam.layout.anchor(canon, fam.kind_record.notation.groups)) for p in entry.partners)
            for target in entry.partners:
                assert f'href="{relative_url(table.page, target)}"' in row
            for c in plan.family(table.family).companions:
                w_args, w_sign = c.mapping(entry.key)
                assert f'data-t="{book[(c.kind, w_args)].tex}"' in row
                assert ("= −1 × the 6j" in row) == (w_sign < 0)


def test_every_page_loads_the_jump_data_from_the_records(built):
    recipe, plan, _, _, files = built
    for page in plan.pages:
        text = files[page.path].decode("utf-8")
        data = relative_url(page.path, "assets/data.js")
        script = relative_url(page.path, "assets/site.js")
        assert f'<script src="{data}" defer></script>' in text, f"{page.path} does not load the jump data"
        assert text.index(data) < text.index(script)  # deferred scripts run in document order
        assert "tablegen-data" not in text  # no copy of the data in the page itself
    m = re.fullmatch(r"window\.tablegenData = (.*);\n", files["assets/data.js"].decode("utf-8"), re.S)
    assert m
    facts = json.loads(m.group(1))
    assert {k: v["range"] for k, v in facts["families"].items()} == {f.family: [f.min_tj, f.max_tj] for f in recipe.families}
    # classes: each page with the first (smallest) canonical form on it, in plan order
    assert [p for p, _ in facts["families"]["6j"]["pages"]] == list(dict(plan.family_pages)["6j"])
    for (path, first), table in zip(facts["families"]["6j"]["pages"], plan.tables_of("6j")):
        assert table.page == path and tuple(first) == min(e.key for e in table.entries)
    assert [k["key"] for k in facts["kinds"]] == ["cg", "3j", "6j", "w", "9j"]
    # the patterns the script fills in give the plan's own names
    cg = facts["families"]["cg"]
    table = plan.tables_of("cg")[1]
    entry = table.entries[0]
    named = dict(zip(facts["kinds"][0]["names"], entry.key))
    fill = lambda pattern, fmt: re.sub(r"\{([^}]+)\}", lambda m: fmt(named[m.group(1)]), pattern)
    code = lambda t: str(t // 2) if t % 2 == 0 else f"{t // 2}.5"
    assert fill(cg["page"], code) == table.page
    assert fill(cg["anchor"], _half_text) == entry.anchor
    assert "BUILD" not in files["assets/site.js"].decode("utf-8")  # the script is the same file for every build


def test_canonical_forms_reachable_by_name(built):
    # the jump box lands on symbol_anchor(canonical); every class row must carry exactly that id
    _, plan, _, _, _ = built
    rows = ((0, 1, 2), (3, 4, 5), (6, 7, 8))
    for table in plan.tables_of("6j"):
        for entry in table.entries:
            # filed under its largest tetrahedral form (Edmonds 1957, eq. 6.2.4 — from memory)
            assert entry.anchor == ClassesLayout.anchor(sixj_tetrahedral_members(*entry.key)[0][0], rows[:2])
            assert sixj_canonical(*entry.key)[0] >= entry.key  # a Regge partner may be larger: never filed under it
    for table in plan.tables_of("9j"):
        for entry in table.entries:
            assert entry.anchor == ClassesLayout.anchor(ninej_canonical(*entry.key)[0], rows)


def test_every_page_states_its_conventions_and_links_to_them(built):
    _, plan, _, _, files = built
    for page in plan.pages:
        text = files[page.path].decode("utf-8")
        assert 'conventions.html"' in text, page.path
        if page.kind in ("cg", "3j"):
            assert "Condon–Shortley" in text, page.path
        if page.kind in ("6j", "9j"):
            # the 6j and 9j involve no phase choice of their own once the CG phase is fixed
            # (Edmonds 1957, ch. 6): their pages say so instead of naming a phase convention
            assert "No phase choice of its own" in text and "Condon–Shortley phase" not in text, page.path
        if page.kind == "cg":
            assert "(−1)^(j1−j2+M) √(2J+1)" in text
        if page.kind == "6j":
            assert "W(a b c d; e f) = (−1)^(a+b+c+d) {a b e; d c f}" in text


def test_cite_page_has_bibtex_digest_and_recipe(built):
    _, _, _, meta, files = built
    text = files["cite.html"].decode("utf-8")
    assert meta.data_digest in text
    assert "@misc{tablegen-abababab," in text
    assert "tablegen 0.1.0" in text
    assert "[9j]" in text and 'max_j = &#34;1&#34;' in text


def test_text_pages_have_offline_formulas(built):
    files = built[4]
    for path in ("conventions.html", "methods.html"):
        text = files[path].decode("utf-8")
        assert text.count("<math") > 20, path
        assert "$" not in text.split("<main>")[1], f"{path}: a formula was left untranslated"
        assert "zzmath" not in text


def test_rendering_is_deterministic(built):
    recipe, plan, book, meta, files = built
    again = dict(render_html(plan, book, meta))
    assert again == files
    # a book filled in another order must give the same bytes (no dict-order dependence)
    reordered = dict(reversed(list(book.items())))
    assert dict(render_html(plan, reordered, meta)) == files


def test_per_value_html_stays_compact(built):
    # the committed default site must stay small (the issue asks for well under 15 MB in all)
    _, plan, _, _, files = built
    for fam in ("cg", "3j"):
        tables = plan.tables_of(fam)
        size = sum(len(files[t.page]) for t in tables)
        values = sum(len(t.entries) for t in tables)
        fixed = 4500 * len(tables)  # header, navigation and explanations of each page
        assert (size - fixed) / values < 700, (fam, size, values)


@pytest.mark.parametrize(
    "mapping",
    [
        {"cg": {"max_j": "3/2"}},  # one family only
        {"3j": {"max_j": 1, "min_j": "1/2"}, "9j": {"max_j": "1/2"}},  # a lower bound, no CG twins
        {"cg": {"max_j": "1/2"}, "3j": {"max_j": 1}, "6j": {"max_j": "1/2"}},  # ranges that differ
        {"6j": {"max_j": 1, "min_j": 1}, "latex_style": "rational", "digits": 30},
    ],
    ids=["cg-only", "3j-and-9j", "unequal-ranges", "6j-rational"],
)
def test_other_recipes_render_with_working_links(mapping):
    recipe = recipe_from_mapping(mapping)
    plan = plan_site(recipe)
    book = compute_values(plan, jobs=1)
    meta = _meta(recipe, plan)
    files = dict(render_html(plan, book, meta))
    assert sorted(files) == sorted([p.path for p in plan.pages] + list(asset_paths()))
    parsed = {path: _parse(data) for path, data in files.items() if path.endswith(".html")}
    known = _known_files(plan, book, meta, files)
    for path, page in parsed.items():
        for _, link in page.links:
            parts = urlsplit(link)
            target = posixpath.normpath(posixpath.join(posixpath.dirname(path), parts.path)) if parts.path else path
            assert target in known, (path, link)
            if parts.fragment:
                assert parts.fragment in parsed[target].ids, (path, link)
    for table in plan.tables:
        for entry in table.entries:
            shown = book[(table.family, entry.key)]
            assert parsed[table.page].tex.get(entry.anchor, shown.tex) == shown.tex
            if shown.value:
                assert shown.decimal in files[table.page].decode("utf-8")


def test_every_zero_shown_names_the_rule_that_makes_it_zero(built):
    # selection rules: triangle, projection sum, parity of (j1 j2 j3; 0 0 0) (Edmonds 1957, ch. 3 — from memory)
    from tablegen.kinds import kind

    _, plan, book, _, files = built
    seen = 0
    for table in plan.tables:
        text = files[table.page].decode("utf-8")
        for entry in table.entries:
            if book[(table.kind, entry.key)].value != 0:
                continue
            rule = kind(table.kind).zero_rule(entry.key)
            assert rule is not None, (table.kind, entry.key)
            at = text.index(f'id="{entry.anchor}"')
            place = text[at : text.index("</t", at + 1) if table.kind in ("cg", "3j") else text.index("</tr>", at)]
            assert f"zero by {rule}" in place, (table.page, entry.anchor)
            seen += 1
    assert seen > 0  # the test build has zeros (parity in CG/3j grids, cancellations in 6j/9j)


def test_the_index_reaches_every_6j_and_9j_section_and_counts_truthfully(built):
    # two clicks from the index to a symbol: its first entry's section link, then the row (issue 8);
    # the forms counted are exactly the symbols with every j in range (enumerated here independently)
    from tablegen.kinds import kind
    from tablegen.layouts import symbols_in_range

    recipe, plan, _, _, files = built
    index = files["index.html"].decode("utf-8")
    for key in ("6j", "9j"):
        f = recipe.family(key)
        for table in plan.tables_of(key):
            for section in table.sections:
                assert f'href="{table.page}#{section.anchor}"' in index, (table.page, section.anchor)
        part = index[index.index(f'<section id="{key}"') :]
        part = part[: part.index("</section>")]
        counted = sum(int(n) for n in re.findall(r"(\d+) forms? in range", part))
        assert counted == sum(1 for _ in symbols_in_range(kind(key), f.min_tj, f.max_tj))


def test_a_full_classes_or_grid_page_stays_under_two_megabytes(built):
    # pages stay light (issue 8): a page holds at most page_rows classes (page_cells grid values), so the
    # heaviest row or cell seen here, times that many, must stay under 2 MB
    _, plan, _, _, files = built
    for fam in plan.families:
        limit = getattr(fam.layout, "page_rows", None) or getattr(fam.layout, "page_cells", None)
        if limit is None:
            continue
        sizes = sorted((len(t.entries), len(files[t.page])) for t in plan.tables_of(fam.key))
        (n0, b0), (n1, b1) = sizes[0], sizes[-1]
        assert n1 > n0
        per_value = (b1 - b0) / (n1 - n0)  # a page's fixed part (header, prose) apart
        assert b0 + per_value * (limit - n0) < 2_000_000, (fam.key, per_value)


# -- "symbol = value" in LaTeX -------------------------------------------------------------
_TABLE = re.compile(r'<table [^>]*?data-e="([^"]*)"(?: data-note="([^"]*)")?[^>]*>(.*?)</table>', re.S)
_CELL = re.compile(r'<td id="([^"]+)" data-t="([^"]*)"[^>]*>(.*?)</td>', re.S)
_OWN = re.compile(r'<tr id="([^"]+)">(.*?)</tr>', re.S)


def _fill(pattern: str, cell_id: str, note_name: str | None, note: str | None) -> str:
    """What site.js does: each @name@ from the cell's id (name=value pairs) or its corner note.

    site.js then appends " = " and the cell's data-t.
    """
    values = dict(pair.split("=", 1) for pair in re.split(r"[,;]", cell_id) if "=" in pair)
    if note_name and note is not None:
        values[note_name] = note.replace("−", "-")
    return re.sub(r"@([^@]+)@", lambda m: values[m.group(1)], pattern)


def test_every_value_copies_as_symbol_equals_value(built):
    # the LaTeX symbol comes from the kind's notation record; the value is the cell's own LaTeX
    from html import unescape

    from tablegen.kinds import kind
    from tablegen.render.latex import latex_symbol
    from tablegen.spins import half_text

    _, plan, book, _, files = built

    def expected(kind_key, key):
        symbol = latex_symbol(kind(kind_key).notation, [half_text(x) for x in key])
        return f"{symbol} = {book[(kind_key, key)].tex}"

    checked = 0
    for table in plan.tables:
        text = files[table.page].decode("utf-8")
        by_anchor = {e.anchor: e for e in table.entries}
        fam = plan.family(table.family)
        if fam.layout.name == "classes":
            for row_id, body in _OWN.findall(text):
                entry = by_anchor[unescape(row_id)]
                own = [unescape(e) for e in re.findall(r'<td data-t="[^"]*" data-e="([^"]*)"', body)]
                wanted = [expected(fam.kind, entry.key)]
                wanted += [expected(c.kind, c.mapping(entry.key)[0]) for c in fam.companions]
                assert own == wanted, (table.id, row_id)
                checked += 1
            continue
        for pattern, note_name, body in _TABLE.findall(text):
            for cell_id, tex, inner in _CELL.findall(body):
                note = re.search(r"<var>(.*?)</var>", inner)
                symbol = _fill(unescape(pattern), unescape(cell_id), note_name, note and note.group(1))
                entry = by_anchor[unescape(cell_id)]
                assert f"{symbol} = {unescape(tex)}" == expected(fam.kind, entry.key), (table.id, cell_id)
                checked += 1
    assert checked == sum(len(t.entries) for t in plan.tables)
    # one by hand: <1 1; 1 -1 | 0 0> = 1/sqrt(3) (two spin 1 coupled to J = 0, common practice)
    cg = files[plan.table("cg-j1-1-j2-1").page].decode("utf-8")
    pattern = next(p for p, _, b in _TABLE.findall(cg) if 'id="J=0,M=0,m1=1"' in b)
    assert _fill(unescape(pattern), "J=0,M=0,m1=1", "m2", "−1") == "\\langle 1\\,1;\\,1\\,-1\\vert 0\\,0\\rangle"

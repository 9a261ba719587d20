"""The site plan: pages, grids, anchors, links and symmetry classes, before anything renders.

The plan is checked against independent enumerations from the selection rules
and, for values, against the engine and sympy.physics.wigner (an outside
reference implementation of the same symbols).
"""

from __future__ import annotations

from fractions import Fraction
from pathlib import Path

import pytest
from sympy import Rational, sign as sympy_sign
from sympy.physics.wigner import racah, wigner_6j, wigner_9j

from tablegen.coefficients import cg2, ninej2, racah_w2, sixj2, threej2
from tablegen.plan import plan_site
from tablegen.recipe import recipe_from_mapping
from tablegen.values import Surd
from tablegen.symmetry import sixj_members

REPO = Path(__file__).resolve().parent.parent

SMALL = {"cg": {"max_j": "3/2"}, "3j": {"max_j": "3/2"}, "6j": {"max_j": "3/2"}, "9j": {"max_j": 1}}


@pytest.fixture(scope="module")
def plan():
    return plan_site(recipe_from_mapping(SMALL))


def _triangle(a: int, b: int, c: int) -> bool:
    # triangle rule with an integer sum, doubled arguments -- common practice, no source
    return (a + b + c) % 2 == 0 and abs(a - b) <= c <= a + b


def _ms(t: int) -> range:
    return range(-t, t + 1, 2)


def _half(t: int) -> Rational:
    return Rational(t, 2)


def _signed_square(value) -> Fraction:
    """sign * value**2 of a sympy number that is +-sqrt(rational), as a Fraction."""
    square = (value**2).expand()
    assert square.is_Rational, value
    return Fraction(int(square.p), int(square.q)) * int(sympy_sign(value))


def _anchors(table) -> list[str]:
    out = [s.anchor for s in table.sections]
    out += [e.anchor for s in table.sections for e in s.entries]
    out += [a for s in table.sections for a in s.row_anchors]
    return out


def _anchor_index(plan) -> dict[str, dict[str, object]]:
    """page path -> anchor -> Entry (or None for section and row anchors)."""
    index: dict[str, dict[str, object]] = {}
    for page in plan.pages:
        anchors = index.setdefault(page.path, {})
        for tid in page.tables:
            table = plan.table(tid)
            for a in _anchors(table):
                anchors.setdefault(a, None)
            for e in table.entries:
                anchors[e.anchor] = e
    return index


# -- pages and tables --------------------------------------------------------------------
def test_pages_and_tables_are_consistent(plan) -> None:
    paths = [p.path for p in plan.pages]
    assert len(paths) == len(set(paths))
    assert {"index.html", "conventions.html", "methods.html", "cite.html"} <= set(paths)
    on_pages = [tid for p in plan.pages for tid in p.tables]
    assert sorted(on_pages) == sorted(t.id for t in plan.tables)  # each table on exactly one page
    by_path = {p.path: p for p in plan.pages}
    for t in plan.tables:
        assert by_path[t.page].tables == (t.id,)  # one table per family page
    files = [f for t in plan.tables for f in (t.csv, t.json, t.tex, t.tex_sheet)]
    assert len(files) == len(set(files))


def test_anchors_are_unique_per_page_and_usable_as_ids(plan) -> None:
    for page in plan.pages:
        anchors = [a for tid in page.tables for a in _anchors(plan.table(tid))]
        assert len(anchors) == len(set(anchors)), page.path
        # HTML ids: non-empty, no whitespace -- WHATWG HTML, "The id attribute"
        assert all(a and not any(c.isspace() for c in a) for a in anchors), page.path


def test_cg_grids_hold_exactly_the_allowed_coefficients(plan) -> None:
    tables = plan.tables_of("cg")
    assert len(tables) == 16  # (j1, j2) in {0, 1/2, 1, 3/2}^2
    for table in tables:
        tj1, tj2 = dict(table.params)["j1"], dict(table.params)["j2"]
        # selection rules: |m| <= j, M = m1 + m2, triangle (j1 j2 J) -- Edmonds 1957, §3.5
        expected = {
            (tj1, tm1, tj2, tm2, tJ, tm1 + tm2)
            for tm1 in _ms(tj1)
            for tm2 in _ms(tj2)
            for tJ in range(abs(tj1 - tj2), tj1 + tj2 + 1, 2)
            if abs(tm1 + tm2) <= tJ
        }
        keys = [e.key for e in table.entries]
        assert len(keys) == len(set(keys)), table.id
        assert set(keys) == expected, table.id
        for section in table.sections:
            tJ = dict(section.params)["J"]
            cells = []
            for r, row in enumerate(section.grid):
                assert len(row) == len(section.columns)
                for c, entry in enumerate(row):
                    tM, tm1 = section.rows[r], section.columns[c]
                    if abs(tM - tm1) > tj2:
                        assert entry is None
                        continue
                    assert entry is not None and entry.key == (tj1, tm1, tj2, tM - tm1, tJ, tM)
                    cells.append(entry)
            assert tuple(cells) == section.entries
            assert len(section.row_anchors) == len(section.rows)


def test_threej_grids_hold_exactly_the_allowed_symbols(plan) -> None:
    for table in plan.tables_of("3j"):
        tj1, tj2 = dict(table.params)["j1"], dict(table.params)["j2"]
        # selection rules: |m| <= j, m1 + m2 + m3 = 0, triangle -- Edmonds 1957, §3.7
        expected = {
            (tj1, tj2, tj3, tm1, tm2, -tm1 - tm2)
            for tm1 in _ms(tj1)
            for tm2 in _ms(tj2)
            for tj3 in range(abs(tj1 - tj2), tj1 + tj2 + 1, 2)
            if abs(tm1 + tm2) <= tj3
        }
        keys = [e.key for e in table.entries]
        assert len(keys) == len(set(keys)) and set(keys) == expected, table.id
        for section in table.sections:
            for r, row in enumerate(section.grid):
                for c, entry in enumerate(row):
                    if entry is not None:
                        assert entry.key[3] == section.columns[c] and entry.key[5] == section.rows[r]


def test_twin_links_point_at_existing_anchors_with_the_related_value(plan) -> None:
    index = _anchor_index(plan)
    seen = 0
    for family, other in (("cg", "3j"), ("3j", "cg")):
        for table in plan.tables_of(family):
            for e in table.entries:
                assert e.twin is not None  # both families cover the same range here
                page, _, anchor = e.twin.partition("#")
                assert page in index, e.twin
                assert anchor in index[page], e.twin
                twin = index[page][anchor]
                assert twin is not None and twin.twin is not None
                assert twin.twin.split("#")[0] == table.page and twin.twin.split("#")[1] == e.anchor
                cg_key, tj_key = (e.key, twin.key) if family == "cg" else (twin.key, e.key)
                tj1, tm1, tj2, tm2, tJ, tM = cg_key
                assert tj_key == (tj1, tj2, tJ, tm1, tm2, -tM)
                # <j1 m1; j2 m2|J M> = (-1)^(j1-j2+M) sqrt(2J+1) (j1 j2 J; m1 m2 -M)
                # -- Edmonds 1957, eq. 3.7.3
                phase = -1 if ((tj1 - tj2 + tM) // 2) % 2 else 1
                assert cg2(*cg_key) == phase * Surd.from_square(tJ + 1) * threej2(*tj_key)
                seen += 1
    assert seen > 100


def test_no_twin_outside_the_other_family_range() -> None:
    plan = plan_site(recipe_from_mapping({"cg": {"max_j": 1}, "3j": {"min_j": "1/2", "max_j": "1/2"}}))
    index = _anchor_index(plan)
    for table in plan.tables_of("cg"):
        tj1, tj2 = dict(table.params)["j1"], dict(table.params)["j2"]
        for e in table.entries:
            if tj1 == tj2 == 1:
                assert e.twin is not None and e.twin.split("#")[1] in index[e.twin.split("#")[0]]
            else:
                assert e.twin is None, (table.id, e.key)


def test_prev_next_chains(plan) -> None:
    by_path = {p.path: p for p in plan.pages}
    assert [f for f, _ in plan.family_pages] == [f.family for f in plan.recipe.families]
    for family, paths in plan.family_pages:
        assert paths, family
        chain = [by_path[p] for p in paths]
        assert all(p.kind == family for p in chain)
        assert chain[0].prev is None and chain[-1].next is None
        for a, b in zip(chain, chain[1:]):
            assert a.next.path == b.path and a.next.label == (b.label or b.title)
            assert b.prev.path == a.path and b.prev.label == (a.label or a.title)
    for page in plan.pages:
        for link in page.related:
            assert link.path.split("#")[0] in by_path, (page.path, link)


# -- 6j, W and 9j classes -------------------------------------------------------------------
def _sixj_in_range(lo: int, hi: int) -> set[tuple[int, ...]]:
    # four triads (j1 j2 j3), (j1 j5 j6), (j4 j2 j6), (j4 j5 j3) -- Edmonds 1957, §6.2
    js = range(lo, hi + 1)
    return {
        (a, b, c, d, e, f)
        for a in js for b in js for c in js if _triangle(a, b, c)
        for d in js for e in js if _triangle(d, e, c)
        for f in js if _triangle(a, e, f) and _triangle(d, b, f)
    }


@pytest.mark.parametrize("lo, hi", [(0, 3), (1, 4)])
def test_sixj_classes_partition_the_symbols_in_range(lo: int, hi: int) -> None:
    plan = plan_site(recipe_from_mapping({"6j": {"min_j": f"{lo}/2", "max_j": f"{hi}/2"}}))
    wanted = _sixj_in_range(lo, hi)
    owner: dict[tuple[int, ...], tuple[int, ...]] = {}
    layout = plan.family("6j").layout
    for table in plan.tables_of("6j"):
        for e in table.entries:
            forms = layout.filed_by(*e.key)  # the tetrahedral class, filed under its largest form
            assert forms[0] == (e.key, 1) and len(forms) <= 24
            for member, sign in forms:
                assert member not in owner, f"{member} in two classes"
                owner[member] = e.key
                # value(member) = sign * value(key): the classical symmetries (Edmonds 1957, eq. 6.2.4)
                assert sixj2(*member) == sixj2(*e.key) * sign
            for member, sign in sixj_members(*e.key):  # and the Regge partners (Regge 1959) share the value
                assert sixj2(*member) == sixj2(*e.key) * sign
    missing = wanted - owner.keys()
    assert not missing, sorted(missing)[:5]
    # exactly the symbols in range are filed: a symbol is never filed under a partner beyond the range
    assert set(owner) == wanted


def test_sixj_values_agree_with_sympy(plan) -> None:
    checked = 0
    for table in plan.tables_of("6j"):
        for e in table.entries:
            ref = wigner_6j(*map(_half, e.key))  # sympy.physics.wigner, exact
            mine = sixj2(*e.key)
            assert (mine.sign * mine.squared() == _signed_square(ref)) if ref else not mine, e.key
            checked += 1
    assert checked > 10


def test_w_forms(plan) -> None:
    (companion,) = plan.family("6j").companions
    assert companion.kind == "w"
    checked = 0
    for table in plan.tables_of("6j"):
        for e in table.entries:
            (a, b, c, d, ee, f), w_sign = companion.mapping(e.key)
            # W(a b c d; e f) = (-1)^(a+b+c+d) {a b e; d c f} -- Edmonds 1957, §6.2 (Racah 1942)
            assert e.key == (a, b, ee, d, c, f)
            assert w_sign == (-1 if ((a + b + c + d) // 2) % 2 else 1)
            assert racah_w2(a, b, c, d, ee, f) == sixj2(*e.key) * w_sign
            ref = racah(*map(_half, (a, b, c, d, ee, f)))  # sympy's Racah W, exact
            assert _signed_square(ref) == w_sign * _signed_square(sixj2(*e.key).to_sympy())
            checked += 1
    assert checked > 10


def _ninej_in_range(hi: int) -> set[tuple[int, ...]]:
    # triads in every row and column -- Edmonds 1957, §6.4
    js = range(0, hi + 1)
    rows = [(a, b, c) for a in js for b in js for c in js if _triangle(a, b, c)]
    return {
        r1 + r2 + r3
        for r1 in rows for r2 in rows for r3 in rows
        if all(_triangle(r1[k], r2[k], r3[k]) for k in range(3))
    }


def test_ninej_classes_partition_the_symbols_in_range(plan) -> None:
    wanted = _ninej_in_range(2)
    owner: dict[tuple[int, ...], tuple[int, ...]] = {}
    for table in plan.tables_of("9j"):
        for e in table.entries:
            assert e.members[0] == (e.key, 1)
            key_value = ninej2(*e.key)
            for member, sign in e.members:
                assert member not in owner, f"{member} in two classes"
                owner[member] = e.key
                # odd permutations of rows or columns give (-1)^(sum of all j); transposition
                # leaves it unchanged -- Edmonds 1957, §6.4
                assert ninej2(*member) == key_value * sign
    assert not (wanted - owner.keys())
    assert {e.key for t in plan.tables_of("9j") for e in t.entries} == {owner[s] for s in wanted}


def test_ninej_values_agree_with_sympy(plan) -> None:
    checked = 0
    for table in plan.tables_of("9j"):
        for e in table.entries:
            ref = wigner_9j(*map(_half, e.key), prec=None)  # sympy.physics.wigner, exact
            mine = ninej2(*e.key)
            assert (mine.sign * mine.squared() == _signed_square(ref)) if ref else not mine, e.key
            checked += 1
    assert checked >= 10


def test_symbol_pages_group_classes_by_their_leading_entries(plan) -> None:
    # each 6j/9j page holds the classes whose canonical form starts with its first entry (the largest j
    # of the symbol), in sections by the second entry, ascending: a printed symbol is two clicks away
    for family in ("6j", "9j"):
        first, second = plan.family(family).kind_record.arguments[:2]
        for table in plan.tables_of(family):
            lead = table.param(first)
            assert table.entries
            for section in table.sections:
                assert section.anchor == f"{second}={_half(dict(section.params)[second])}"
                for e in section.entries:
                    assert max(e.key) == lead == e.key[0] and e.key[1] == dict(section.params)[second]
            keys = [e.key for e in table.entries]
            assert keys == sorted(keys)


def test_a_familiar_6j_is_filed_under_its_own_numbers() -> None:
    # {3 2 2; 0 2 2} (issue 8): its Regge partner {7/2 2 3/2; 1/2 2 3/2} has a larger first entry
    plan = plan_site(recipe_from_mapping({"6j": {"max_j": "3"}}))
    key = (6, 4, 4, 0, 4, 4)
    (table,) = [t for t in plan.tables_of("6j") if any(e.key == key for e in t.entries)]
    assert table.page == "6j/j1-3.html"
    entry = next(e for e in table.entries if e.key == key)
    assert entry.beyond > 0  # the partners with a j of 7/2 lie beyond the range and are counted apart
    assert all(p.split("#")[0] in {t.page for t in plan.tables_of("6j")} for p in entry.partners)


def test_large_classes_pages_are_split_in_parts() -> None:
    # no page holds more than page_rows classes; parts follow each other and keep every class once
    plan = plan_site(recipe_from_mapping({"9j": {"max_j": "2"}}))
    layout = plan.family("9j").layout
    small = type(layout)(class_size=layout.class_size, filed_by=layout.filed_by, page_rows=25)
    from tablegen.families import FAMILIES, Family

    fam = next(f for f in FAMILIES if f.key == "9j")
    split = Family(fam.key, fam.kind, fam.title, fam.nav_label, small, fam.convention)
    plan2 = plan_site(recipe_from_mapping({"9j": {"max_j": "2"}}), families=(split,))
    keys = [e.key for t in plan.tables_of("9j") for e in t.entries]
    assert [e.key for t in plan2.tables_of("9j") for e in t.entries] == keys
    assert len(plan2.tables_of("9j")) > len(plan.tables_of("9j"))
    assert all(len(t.entries) <= 25 for t in plan2.tables_of("9j"))
    assert any(t.page.endswith("-part2.html") for t in plan2.tables_of("9j"))


# -- determinism ----------------------------------------------------------------------------
def test_plan_is_deterministic(plan) -> None:
    again = plan_site(recipe_from_mapping(SMALL))
    assert again == plan
    assert repr(again) == repr(plan)


def test_a_pair_too_large_for_one_page_gets_a_page_per_third_j() -> None:
    # pages stay light (issue 8): 9 ⊗ 9 holds more values than one page may show
    plan = plan_site(recipe_from_mapping({"cg": {"min_j": "9", "max_j": "9"}, "3j": {"min_j": "9", "max_j": "9"}}))
    layout = plan.family("cg").layout
    assert layout.split(18, 18)
    tables = plan.tables_of("cg")
    assert len(tables) == 19  # J = 18, 17, ..., 0
    for t in tables:
        (section,) = t.sections
        tk = section.params[0][1]
        assert t.page == f"cg/j1-9-j2-9-J-{tk // 2}.html" == layout.page_path("cg", 18, 18, tk)
        assert len(t.entries) <= layout.page_cells
        for e in t.entries:  # the twin link names the 3j's page of the same third j
            page, anchor = e.twin.split("#")
            assert page == f"3j/j1-9-j2-9-j3-{tk // 2}.html"
    # every value of the pair once, and the parts chained and linked to each other
    assert sum(len(t.entries) for t in tables) == sum((36 - max(0, abs(a + b))) // 2 + 1
                                                      for a in range(-18, 19, 2) for b in range(-18, 19, 2))
    pages = [p for p in plan.pages if p.kind == "cg"]
    assert all(len([r for r in p.related if r.path.startswith("cg/j1-9-j2-9-J-")]) == 18 for p in pages)

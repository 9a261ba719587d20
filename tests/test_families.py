"""The Family records agree with the site as built today and with the algebra."""

from __future__ import annotations

import pytest

from tablegen.families import FAMILIES, FAMILY_KEYS, family, sixj_to_w
from tablegen.kinds import KIND_KEYS, kind
from tablegen.plan import plan_site
from tablegen.recipe import FAMILIES as RECIPE_FAMILIES, FAMILY_NAMES, recipe_from_mapping
from tablegen.render.html import CONVENTION_LINES


def test_one_record_per_recipe_section_in_order() -> None:
    assert FAMILY_KEYS == RECIPE_FAMILIES
    for f in FAMILIES:
        assert f.title == FAMILY_NAMES[f.key]
        assert f.convention == CONVENTION_LINES[f.key]
        assert all(k in KIND_KEYS for k in f.kinds)


def test_lookup_names_the_argument() -> None:
    assert family("9j").kind == "9j"
    with pytest.raises(ValueError, match="argument family = 'w'"):
        family("w")


def test_w_companion_matches_the_plan_and_the_engine() -> None:
    # W(a b c d; e f) = (-1)^(a+b+c+d) {a b e; d c f} (Edmonds 1957, eq. 6.2.6)
    plan = plan_site(recipe_from_mapping({"6j": {"max_j": 2}}))
    (companion,) = family("6j").companions
    sixj, w = kind("6j"), kind(companion.kind)
    checked = 0
    for table in plan.tables_of("6j"):
        for e in table.entries:
            args, sign = companion.mapping(e.key)
            assert (args, sign) == e.w_form
            assert w.doubled(*args) == sign * sixj.doubled(*e.key)
            checked += 1
    assert checked > 50
    assert sixj_to_w((2, 2, 2, 2, 2, 2)) == ((2, 2, 2, 2, 2, 2), 1)

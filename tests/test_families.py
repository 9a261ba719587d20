"""The Family records: one per recipe section, read by plan, data and the jump box."""

from __future__ import annotations

import random

import pytest

from tablegen.families import FAMILIES, FAMILY_KEYS, family, named_symbol
from tablegen.kinds import ALL_KIND_KEYS, kind
from tablegen.kinds.sixj import sixj_of_w
from tablegen.plan import plan_site
from tablegen.recipe import FAMILIES as RECIPE_FAMILIES, recipe_from_mapping
from tablegen.render.jumpdata import mapping_as_data


def test_one_record_per_recipe_section_in_order() -> None:
    assert FAMILY_KEYS == RECIPE_FAMILIES
    for f in FAMILIES:
        assert all(k in ALL_KIND_KEYS for k in f.kinds)
        assert f.layout.name in ("grid", "classes", "matrix")
        assert f.title and f.nav_label and f.convention


def test_lookup_names_the_argument() -> None:
    assert family("9j").kind == "9j"
    with pytest.raises(ValueError, match="argument family = 'w'"):
        family("w")


def test_grid_twins_point_at_each_other_with_opposite_projection_sums() -> None:
    # CG: m1 + m2 = M; 3j: m1 + m2 = -m3 (Edmonds 1957, eq. 3.7.3 — from memory)
    for f in FAMILIES:
        if f.layout.name == "grid" and f.layout.twin:
            twin = family(f.layout.twin)
            assert twin.layout.twin == f.key
            assert f.layout.m_sum_sign * twin.layout.m_sum_sign == -1


def test_w_companion_matches_the_plan_and_the_engine() -> None:
    # W(a b c d; e f) = (-1)^(a+b+c+d) {a b e; d c f} (Edmonds 1957, eq. 6.2.6)
    plan = plan_site(recipe_from_mapping({"6j": {"max_j": 2}}))
    (companion,) = family("6j").companions
    sixj, w = kind("6j"), kind(companion.kind)
    checked = 0
    for table in plan.tables_of("6j"):
        for e in table.entries:
            args, sign = companion.mapping(e.key)
            assert sixj_of_w(args) == (e.key, sign)  # the mapping and its inverse agree
            assert w.doubled(*args) == sign * sixj.doubled(*e.key)
            checked += 1
    assert checked > 50


def test_companion_mapping_as_data_reproduces_the_mapping() -> None:
    # the jump box gets the mapping as a permutation and a phase, read off the Python function
    (companion,) = family("6j").companions
    data = mapping_as_data(companion.mapping, 6)
    rng = random.Random(6)
    for _ in range(500):
        t = tuple(rng.randrange(0, 12) for _ in range(6))
        if sum(t) % 2:
            t = t[:5] + (t[5] + 1,)
        args, sign = companion.mapping(t)
        assert args == tuple(t[i] for i in data["order"])
        assert sign == (-1) ** (sum(t[i] for i in data["phase"]) // 2)


def test_data_columns_follow_from_the_records() -> None:
    assert family("cg").data_columns == ("j1", "m1", "j2", "m2", "J", "M", "exact", "sign", "p", "q", "decimal")
    assert family("6j").data_columns[-3:] == ("forms", "w", "w_sign")
    assert family("9j").data_columns[-1] == "forms"


def test_named_symbol_uses_the_notation() -> None:
    assert named_symbol(kind("cg")) == "⟨j1 m1; j2 m2 | J M⟩"
    assert named_symbol(kind("w")) == "W(a b c d; e f)"
    assert named_symbol(kind("3j")) == "(j1 j2 j3; m1 m2 m3)"

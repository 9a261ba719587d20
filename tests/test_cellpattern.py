"""The rule by which a table's one link pattern becomes each cell's link (site.js twinHref does the same)."""

from __future__ import annotations

from tablegen.cellpattern import cell_values, fill_cell_pattern


def test_names_are_filled_and_negated() -> None:
    # CG <j1 m1; j2 m2 | J M> and 3j (j1 j2 J; m1 m2 -M) share a value up to a factor (Edmonds 1957, eq. 3.7.3),
    # so the cell (J, M, m1) of a CG table links to the 3j cell (J, -M, m1)
    pattern = "../3j/j1-1-j2-1.html#j3=2,m3=@-M@,m1=@m1@"
    assert fill_cell_pattern(pattern, "J=2,M=-1,m1=0") == "../3j/j1-1-j2-1.html#j3=2,m3=1,m1=0"
    assert fill_cell_pattern(pattern, "J=2,M=1,m1=-1") == "../3j/j1-1-j2-1.html#j3=2,m3=-1,m1=-1"
    assert fill_cell_pattern(pattern, "J=2,M=0,m1=0") == "../3j/j1-1-j2-1.html#j3=2,m3=0,m1=0"  # no "-0"
    assert fill_cell_pattern("#x=@-M@", "J=3/2,M=-3/2,m1=1") == "#x=3/2"


def test_a_missing_name_gives_no_link() -> None:
    assert fill_cell_pattern("#j3=@-M@", "J=2,m1=0") is None
    assert cell_values("J=2,M=-1,m1=0") == {"J": "2", "M": "-1", "m1": "0"}
    assert cell_values("row:oops") == {}


def test_every_grid_cell_of_the_default_plan_links_where_its_entry_says() -> None:
    from tablegen.plan import plan_site
    from tablegen.recipe import recipe_from_mapping

    plan = plan_site(recipe_from_mapping({"cg": {"max_j": 2}, "3j": {"max_j": 2}}))
    checked = 0
    for table in plan.tables:
        for s in table.sections:
            for e in s.entries:
                assert s.twin is not None and fill_cell_pattern(s.twin, e.anchor) == e.twin
                checked += 1
    assert checked > 500

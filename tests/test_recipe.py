"""Recipes: TOML loading, defaults, command-line overrides, validation and the size guard.

Every malformed recipe must give one line that names the key and the rule it
breaks; through the command line that line goes to stderr with exit status 2
and no traceback.  A recipe too large for the machine is refused before any
computing, with its size estimate and the hint to pass --allow-large.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from tablegen import cli
from tablegen.errors import RecipeError, TooLargeError
from tablegen.kinds import kind
from tablegen.plan import plan_site, symbols_in_range
from tablegen.recipe import (
    DEFAULT_RECIPE,
    VALUE_LIMIT,
    FamilyRange,
    Recipe,
    check_size,
    estimate_size,
    load_recipe,
    recipe_from_mapping,
)


def _write(tmp_path: Path, text: str, name: str = "recipe.toml") -> Path:
    path = tmp_path / name
    path.write_text(text, encoding="utf-8")
    return path


def _parse_build(argv: list[str]) -> Recipe:
    """The recipe the command line would build, without building it."""
    from tablegen.commands import build as build_command
    from tablegen.recipe import recipe_from_options

    ns = cli._parse(["build", *argv])
    return recipe_from_options(build_command.options_of(ns), ns.recipe)


def _triangle(a: int, b: int, c: int) -> bool:
    # triangle rule with an integer sum, doubled arguments -- common practice, no source
    return (a + b + c) % 2 == 0 and abs(a - b) <= c <= a + b


# -- loading ---------------------------------------------------------------------------
def test_toml_file_is_loaded(tmp_path: Path) -> None:
    path = _write(
        tmp_path,
        'title = "Shell-model exercise"\n'
        'notes = "p and d shells only"\n'
        "digits = 20\n"
        'latex_style = "rational"\n'
        "[cg]\nmax_j = 2\n"
        '[3j]\nmax_j = "7/2"\nmin_j = "1/2"\n'
        "[6j]\nmax_j = 3.5\n"
        "[9j]\nmax_j = 1\n",
    )
    r = load_recipe(str(path))
    assert r.title == "Shell-model exercise"
    assert r.notes == "p and d shells only"
    assert r.digits == 20
    assert r.latex_style == "rational"
    # ranges are kept in doubled integers: 7/2 -> 7, 3.5 -> 7
    assert r.families == (
        FamilyRange("cg", 0, 4),
        FamilyRange("3j", 1, 7),
        FamilyRange("6j", 0, 7),
        FamilyRange("9j", 0, 2),
    )


def test_toml_defaults_fill_missing_keys(tmp_path: Path) -> None:
    r = load_recipe(str(_write(tmp_path, "[6j]\nmax_j = 1\n")))
    plain = Recipe()
    assert (r.title, r.notes, r.digits, r.latex_style) == (plain.title, plain.notes, plain.digits, plain.latex_style)
    assert r.families == (FamilyRange("6j", 0, 2),)


def test_families_come_in_fixed_order(tmp_path: Path) -> None:
    # the order of the tables in the file must not change pages, data or digest
    r = load_recipe(str(_write(tmp_path, "[9j]\nmax_j = 1\n[cg]\nmax_j = 1\n")))
    assert [f.family for f in r.families] == ["cg", "9j"]


@pytest.mark.parametrize(
    "text, doubled",
    [("7/2", 7), ("3.5", 7), (3.5, 7), ("1/2", 1), (0, 0), ("4", 8), (4, 8), ("0.5", 1)],
)
def test_half_integers(text, doubled) -> None:
    r = recipe_from_mapping({"cg": {"max_j": text}})
    assert r.family("cg") == FamilyRange("cg", 0, doubled)
    r = recipe_from_mapping({"6j": {"min_j": text, "max_j": 5}})
    assert r.family("6j") == FamilyRange("6j", doubled, 10)


def test_describe_uses_fractions() -> None:
    assert FamilyRange("3j", 1, 7).describe() == "1/2 ≤ j ≤ 7/2"
    assert FamilyRange("cg", 0, 8).describe() == "j ≤ 4"


# -- defaults --------------------------------------------------------------------------
def test_default_recipe_ranges() -> None:
    # README / the issue: CG and 3j for all j1, j2 <= 4, 6j for all j <= 4, 9j for all j <= 2
    for family, top in (("cg", 8), ("3j", 8), ("6j", 8), ("9j", 4)):
        f = DEFAULT_RECIPE.family(family)
        assert f is not None, family
        assert f.min_tj == 0 and f.max_tj >= top, (family, f)


def test_command_line_without_options_builds_the_default() -> None:
    assert _parse_build([]) == DEFAULT_RECIPE


def test_default_plan_covers_the_promised_symbols() -> None:
    plan = plan_site(DEFAULT_RECIPE)
    pages = {p.path for p in plan.pages}
    for tj1 in range(0, 9):
        for tj2 in range(0, 9):
            code1 = str(tj1 // 2) if tj1 % 2 == 0 else f"{tj1 // 2}.5"
            code2 = str(tj2 // 2) if tj2 % 2 == 0 else f"{tj2 // 2}.5"
            assert f"cg/j1-{code1}-j2-{code2}.html" in pages
            assert f"3j/j1-{code1}-j2-{code2}.html" in pages
    # every 6j with all j <= 4 (triangle rule on the four triads, Edmonds 1957, §6.2)
    # belongs to a class tabulated by the default build
    six_members = {m for t in plan.tables_of("6j") for e in t.entries for m, _ in e.members}
    js = range(0, 9)
    missing = [
        (a, b, c, d, e, f)
        for a in js for b in js for c in js if _triangle(a, b, c)
        for d in js for e in js if _triangle(d, e, c)
        for f in js if _triangle(a, e, f) and _triangle(d, b, f)
        if (a, b, c, d, e, f) not in six_members
    ]
    assert not missing, missing[:5]
    # every 9j with all j <= 2 (triads in each row and column, Edmonds 1957, §6.4)
    nine_members = {m for t in plan.tables_of("9j") for e in t.entries for m, _ in e.members}
    js = range(0, 5)
    rows = [(a, b, c) for a in js for b in js for c in js if _triangle(a, b, c)]
    count = 0
    for r1 in rows:
        for r2 in rows:
            for r3 in rows:
                if all(_triangle(r1[k], r2[k], r3[k]) for k in range(3)):
                    count += 1
                    assert r1 + r2 + r3 in nine_members, r1 + r2 + r3
    assert count > 1000  # the loop really ran over a full range


# -- command-line overrides ------------------------------------------------------------
def test_command_line_families_replace_the_default_families() -> None:
    r = _parse_build(["--cg", "1", "--6j", "1/2..3/2"])
    assert r.families == (FamilyRange("cg", 0, 2), FamilyRange("6j", 1, 3))
    assert r.title == DEFAULT_RECIPE.title


def test_command_line_keeps_default_families_for_other_options() -> None:
    r = _parse_build(["--title", "Shell-model notes", "--digits", "30", "--latex-style", "rational", "--notes", "n"])
    assert r.families == DEFAULT_RECIPE.families
    assert (r.title, r.digits, r.latex_style, r.notes) == ("Shell-model notes", 30, "rational", "n")


def test_command_line_overrides_a_recipe_file(tmp_path: Path) -> None:
    path = _write(tmp_path, 'title = "From file"\ndigits = 12\n[cg]\nmax_j = 2\n[6j]\nmax_j = 2\n')
    r = _parse_build(["--recipe", str(path), "--cg", "none", "--9j", "1", "--digits", "40"])
    assert r.title == "From file"
    assert r.digits == 40
    assert r.families == (FamilyRange("6j", 0, 4), FamilyRange("9j", 0, 2))
    r = _parse_build(["--recipe", str(path), "--6j", "7/2"])
    assert r.families == (FamilyRange("cg", 0, 4), FamilyRange("6j", 0, 7))


def test_command_line_none_for_every_family_is_refused(capsys) -> None:
    status = cli.main(["build", "--cg", "none", "--3j", "none", "--6j", "none", "--9j", "none", "--out", "unused"])
    err = capsys.readouterr().err
    assert status == 2
    assert len(err.splitlines()) == 1 and "no family" in err


# -- toml_text round trip --------------------------------------------------------------
@pytest.mark.parametrize(
    "recipe",
    [
        DEFAULT_RECIPE,
        Recipe(),
        Recipe(
            title='Quotes " and back\\slashes, tabs\tand UTF-8: ⟨j m|',
            notes="two\nlines, a tab \t and \"quotes\"",
            digits=3,
            latex_style="rational",
            families=(FamilyRange("3j", 1, 7), FamilyRange("9j", 2, 3)),
        ),
        Recipe(title="print only", latex_style="inline", decimals=False, families=(FamilyRange("cg", 0, 2),)),
    ],
    ids=["default", "empty", "awkward-text", "inline-no-decimals"],
)
def test_toml_text_round_trip(tmp_path: Path, recipe: Recipe) -> None:
    path = _write(tmp_path, recipe.toml_text())
    assert load_recipe(str(path)) == recipe


def test_as_dict_matches_toml_text(tmp_path: Path) -> None:
    r = recipe_from_mapping({"title": "T", "3j": {"min_j": "1/2", "max_j": 2}})
    d = r.as_dict()
    assert list(d) == ["title", "notes", "digits", "latex_style", "decimals", "3j"]
    assert d["3j"] == {"max_j": "2", "min_j": "1/2"}
    assert recipe_from_mapping(d) == r


# -- malformed recipes -----------------------------------------------------------------
BAD = [
    # (mapping, key named in the message, words of the rule)
    ({"7j": {"max_j": 1}}, "7j", "unknown key"),
    ({"colour": "blue"}, "colour", "unknown key"),
    ({"6j": {"max_j": 1, "step": 1}}, "6j.step", "unknown key"),
    ({"6j": {"max_j": "0.3"}}, "6j.max_j", "multiple of 1/2"),
    ({"6j": {"max_j": 0.3}}, "6j.max_j", "multiple of 1/2"),
    ({"cg": {"max_j": -1}}, "cg.max_j", ">= 0"),
    ({"3j": {"max_j": "abc"}}, "3j.max_j", "not a number"),
    ({"9j": {"max_j": True}}, "9j.max_j", "must be a number"),
    ({"cg": {"max_j": 1, "min_j": "abc"}}, "cg.min_j", "not a number"),
    ({"6j": {"min_j": 2, "max_j": 1}}, "6j.min_j", "reversed range"),
    ({"6j": {"min_j": 1}}, "6j.max_j", "required"),
    ({"digits": "x"}, "digits", "whole number"),
    ({"digits": 2.5}, "digits", "whole number"),
    ({"digits": 0}, "digits", "from 1 to 10,000"),
    ({"digits": 10001}, "digits", "from 1 to 10,000"),
    ({"title": 3}, "title", "string"),
    ({"title": "   "}, "title", "non-empty"),
    ({"notes": ["a"]}, "notes", "string"),
    ({"6j": 4}, "6j", "must be a table"),
    ({"latex_style": "fancy"}, "latex_style", "root, rational"),
]


@pytest.mark.parametrize("mapping, key, rule", BAD, ids=[f"{k}:{r}" for _, k, r in BAD])
def test_malformed_recipe_gives_one_line_naming_key_and_rule(mapping, key, rule) -> None:
    with pytest.raises(RecipeError) as info:
        recipe_from_mapping(mapping)
    message = str(info.value)
    assert "\n" not in message
    assert info.value.key == key
    assert f"recipe key {key} =" in message
    assert rule in message


def _toml_value(value) -> str:
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, str):
        return '"' + value + '"'
    if isinstance(value, list):
        return "[" + ", ".join(_toml_value(v) for v in value) + "]"
    return repr(value)


def _as_toml(mapping: dict) -> str:
    top, tables = [], []
    for key, value in mapping.items():
        if isinstance(value, dict):
            tables.append(f"[{key}]")
            tables += [f"{k} = {_toml_value(v)}" for k, v in value.items()]
        else:
            top.append(f"{key} = {_toml_value(value)}")
    return "\n".join(top + tables) + "\n"


@pytest.mark.parametrize("mapping, key, rule", BAD, ids=[f"{k}:{r}" for _, k, r in BAD])
def test_malformed_recipe_file_through_the_cli(tmp_path: Path, capsys, mapping, key, rule) -> None:
    path = _write(tmp_path, _as_toml(mapping))
    out = tmp_path / "out"
    status = cli.main(["build", "--recipe", str(path), "--out", str(out), "--quiet"])
    err = capsys.readouterr().err
    assert status == 2
    assert len(err.splitlines()) == 1, err
    assert "Traceback" not in err
    assert key in err and rule in err
    assert not out.exists()


@pytest.mark.parametrize(
    "text, words",
    [
        ("title = \n", "not valid TOML"),
        ("[6j\nmax_j = 1\n", "not valid TOML"),
    ],
)
def test_unreadable_toml_is_one_line(tmp_path: Path, capsys, text: str, words: str) -> None:
    path = _write(tmp_path, text)
    with pytest.raises(RecipeError) as info:
        load_recipe(str(path))
    assert "\n" not in str(info.value) and words in str(info.value)
    assert cli.main(["build", "--recipe", str(path), "--out", str(tmp_path / "o")]) == 2
    err = capsys.readouterr().err
    assert len(err.splitlines()) == 1 and words in err and "Traceback" not in err


def test_missing_recipe_file_and_folder(tmp_path: Path, capsys) -> None:
    with pytest.raises(RecipeError, match="file not found"):
        load_recipe(str(tmp_path / "nope.toml"))
    with pytest.raises(RecipeError, match="is a folder"):
        load_recipe(str(tmp_path))
    assert cli.main(["build", "--recipe", str(tmp_path / "nope.toml"), "--out", str(tmp_path / "o")]) == 2
    err = capsys.readouterr().err
    assert len(err.splitlines()) == 1 and "--recipe" in err and "file not found" in err


def test_non_utf8_recipe_file(tmp_path: Path) -> None:
    path = tmp_path / "latin1.toml"
    path.write_bytes('title = "Übung"\n'.encode("latin-1"))
    with pytest.raises(RecipeError) as info:
        load_recipe(str(path))
    assert "\n" not in str(info.value) and "--recipe" in str(info.value)


# -- size guard ------------------------------------------------------------------------
def test_estimate_is_exact_for_cg_and_3j() -> None:
    # recipe.estimate_size promises an exact count for CG and 3j; count the planned entries
    for top in (0, 1, 2, 3):
        r = recipe_from_mapping({"cg": {"max_j": top / 2}, "3j": {"min_j": "1/2", "max_j": top / 2 + 0.5}})
        plan = plan_site(r)
        est = estimate_size(r)
        assert est["cg"] == sum(len(t.entries) for t in plan.tables_of("cg"))
        assert est["3j"] == sum(len(t.entries) for t in plan.tables_of("3j"))


def test_default_recipe_passes_the_guard() -> None:
    est = check_size(DEFAULT_RECIPE)
    assert sum(est.values()) <= VALUE_LIMIT


def test_huge_recipe_is_refused_with_estimate_and_hint() -> None:
    huge = recipe_from_mapping({"6j": {"max_j": 40}})
    with pytest.raises(TooLargeError) as info:
        check_size(huge)
    message = str(info.value)
    assert "\n" not in message
    assert f"{estimate_size(huge)['6j']:,}" in message
    assert "--allow-large" in message
    # insisting lifts the guard (the estimate is still returned)
    assert check_size(huge, allow_large=True) == estimate_size(huge)


def test_huge_recipe_is_refused_before_any_computing(tmp_path: Path, capsys, monkeypatch) -> None:
    import tablegen.build as build_module

    def must_not_run(*args, **kwargs):
        raise AssertionError("the size guard let a huge recipe reach planning or computing")

    monkeypatch.setattr(build_module, "plan_site", must_not_run)
    monkeypatch.setattr(build_module, "compute_values", must_not_run)
    before = sorted(p.name for p in tmp_path.iterdir())
    out = tmp_path / "site"
    status = cli.main(["build", "--6j", "40", "--out", str(out)])
    err = capsys.readouterr().err
    assert status == 2
    assert len(err.splitlines()) == 1, err
    assert "estimated" in err and "--allow-large" in err and "Traceback" not in err
    assert not out.exists()
    assert sorted(p.name for p in tmp_path.iterdir()) == before  # no staging folder either


def test_sixj_symbol_enumeration_matches_triangle_rule() -> None:
    # symbols_in_range is what the 6j pages rest on; count independently
    # (four triads (j1 j2 j3), (j1 j5 j6), (j4 j2 j6), (j4 j5 j3): Edmonds 1957, §6.2)
    f = FamilyRange("6j", 0, 3)
    js = range(0, 4)
    expected = {
        (a, b, c, d, e, g)
        for a in js for b in js for c in js for d in js for e in js for g in js
        if _triangle(a, b, c) and _triangle(a, e, g) and _triangle(d, b, g) and _triangle(d, e, c)
    }
    got = list(symbols_in_range(kind("6j"), f.min_tj, f.max_tj))
    assert len(got) == len(set(got))
    assert set(got) == expected


def test_toml_text_escapes_control_characters(tmp_path: Path) -> None:
    # TOML 1.0, "String": control characters other than tab (U+0000-U+0008, U+000A-U+001F,
    # U+007F) must be escaped in basic strings; notes may hold line breaks and tabs.
    recipe = recipe_from_mapping({"title": "tab\there", "notes": "a\r\nb\tc", "cg": {"max_j": 1}})
    assert load_recipe(str(_write(tmp_path, recipe.toml_text()))) == recipe


@pytest.mark.parametrize("key", ["title", "notes"])
@pytest.mark.parametrize("char", ["\x00", "\x07", "\x1b", "\x7f", "\x85"])
def test_control_characters_in_title_and_notes_are_refused(key: str, char: str) -> None:
    # NUL, BEL, ESC, DEL and a C1 control would reach HTML and LaTeX raw: refused with the key named
    with pytest.raises(RecipeError) as info:
        recipe_from_mapping({key: f"before{char}after", "cg": {"max_j": 1}})
    message = str(info.value)
    assert f"recipe key {key} = " in message and "control character" in message
    assert all(c.isprintable() for c in message)  # the offending character is shown escaped


def test_decimals_switch_defaults_on_and_takes_only_booleans() -> None:
    # journal output: the LaTeX decimal columns can be dropped; common practice, no source
    assert recipe_from_mapping({}).decimals is True
    assert recipe_from_mapping({"decimals": False}).decimals is False
    for bad in ("no", 0, 1, None):
        with pytest.raises(RecipeError, match=r"decimals = .*must be true or false"):
            recipe_from_mapping({"decimals": bad})


def test_inline_latex_style_is_accepted() -> None:
    assert recipe_from_mapping({"latex_style": "inline"}).latex_style == "inline"

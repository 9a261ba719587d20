"""The bytes-on-disk guard: an estimate close to what a build writes, and a refusal before computing."""

from __future__ import annotations

from pathlib import Path

import pytest

from tablegen import build as build_module
from tablegen.diskweight import BYTES_LIMIT, check_bytes, estimate_bytes
from tablegen.errors import TooLargeError
from tablegen.recipe import estimate_size, load_recipe

REPO = Path(__file__).resolve().parents[1]


def test_the_estimate_is_close_to_the_committed_site() -> None:
    # the committed site is the default recipe's real output: the estimate must be within a factor 1.5
    site = REPO / "site"
    real = sum(p.stat().st_size for p in site.rglob("*") if p.is_file())
    recipe = load_recipe(str(site / "recipe.toml"))
    guess = sum(estimate_bytes(estimate_size(recipe), recipe).values())
    assert real / 1.5 < guess < real * 1.5, (guess, real)


@pytest.mark.slow
@pytest.mark.parametrize("ranges", [{"rotation": {"max_j": 8}}, {"harmonics": {"max_l": 24}}])
def test_the_estimate_follows_functions_that_grow_with_j(tmp_path, ranges) -> None:
    # a rotation function's or a harmonic's text grows with j: the family's own rate, within a factor 1.5
    from tablegen.recipe import recipe_from_mapping

    recipe = recipe_from_mapping(ranges)
    build_module.build(recipe, tmp_path / "site", jobs=1)
    real = sum(p.stat().st_size for p in (tmp_path / "site").rglob("*") if p.is_file())
    guess = sum(estimate_bytes(estimate_size(recipe), recipe).values())
    assert real / 1.5 < guess < real * 1.5, (guess, real)
    # without the recipe (no range) the layout's flat rate is all the guard has: far lower
    assert sum(estimate_bytes(estimate_size(recipe)).values()) < guess


def test_a_build_too_large_on_disk_is_refused_before_computing(tmp_path, monkeypatch) -> None:
    def no_computing(*args, **kwargs):  # pragma: no cover - reaching it is the failure
        raise AssertionError("computed before refusing")

    monkeypatch.setattr(build_module, "plan_site", no_computing)
    monkeypatch.setattr(build_module, "compute_values", no_computing)
    monkeypatch.setattr(build_module, "check_size", lambda recipe, allow_large=False: {"9j": 10**6})
    recipe = load_recipe(str(REPO / "site" / "recipe.toml"))
    with pytest.raises(TooLargeError) as err:
        build_module.build(recipe, tmp_path / "out")
    text = str(err.value)
    assert "on disk" in text and "MB" in text and "--allow-large" in text
    assert not (tmp_path / "out").exists()


def test_insisting_passes_the_guard() -> None:
    values = {"9j": BYTES_LIMIT}  # far beyond the limit at any rate
    with pytest.raises(TooLargeError):
        check_bytes(values)
    assert check_bytes(values, allow_large=True)["9j"] > BYTES_LIMIT

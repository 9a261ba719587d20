"""The post-build link check, and the in-memory pipeline it runs on."""

from __future__ import annotations

from pathlib import Path

import pytest

from tablegen.build import build, render_site
from tablegen.errors import LinkError
from tablegen.linkcheck import LinkCheck
from tablegen.plan import plan_site
from tablegen.recipe import recipe_from_mapping

SMALL = {"cg": {"max_j": 1}, "3j": {"max_j": 1}, "6j": {"max_j": 1}, "9j": {"max_j": 1}}


@pytest.fixture(scope="module")
def rendered():
    site = render_site(recipe_from_mapping(SMALL), jobs=1)
    return dict(site.files), site.manifest


def test_a_built_site_has_no_broken_link(rendered):
    files, _ = rendered
    check = LinkCheck(plan_site(recipe_from_mapping(SMALL)))
    for path, data in files.items():
        check.add(path, data)
    assert check.finish() > 500
    assert ("3j/j1-1-j2-1.html", "j3=1,m3=0,m1=0") in check.links  # it saw the cell-to-twin links, too


@pytest.mark.parametrize(
    "href, rule",
    [
        ("../3j/j1-1-j2-1.html#j3=9,m3=0,m1=0", "no such id"),  # a twin anchor the plan does not have
        ("../3j/j1-7-j2-7.html", "no such file"),
        ("#nowhere", "no such id"),
        ("../assets/missing.css", "no such file"),
    ],
)
def test_a_broken_link_is_named(rendered, href, rule):
    files, _ = rendered
    check = LinkCheck(plan_site(recipe_from_mapping(SMALL)))
    for path, data in files.items():
        if path == "cg/j1-1-j2-1.html":
            data = data.replace(b"</main>", f'<a href="{href}">x</a></main>'.encode())
        check.add(path, data)
    with pytest.raises(LinkError, match=rule) as err:
        check.finish()
    assert "cg/j1-1-j2-1.html" in str(err.value)


def test_in_memory_site_equals_the_written_one(rendered, tmp_path: Path):
    files, manifest = rendered
    build(recipe_from_mapping(SMALL), tmp_path / "site", jobs=1)
    on_disk = {
        p.relative_to(tmp_path / "site").as_posix(): p.read_bytes()
        for p in (tmp_path / "site").rglob("*") if p.is_file()
    }
    assert set(on_disk) == set(files) | {"manifest.json", "SHA256SUMS"}
    assert all(on_disk[p] == data for p, data in files.items())
    assert manifest["data_digest"] in on_disk["manifest.json"].decode()

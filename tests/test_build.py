"""Whole builds: same recipe, same bytes; the data digest; user text escaped everywhere.

Builds here use small recipes so that the file stays fast.
"""

from __future__ import annotations

import hashlib
import html
import json
import os
import re
import subprocess
import sys
from pathlib import Path

import pytest

from tablegen import compute
from tablegen.build import build, family_counts
from tablegen.compute import FormattedValue, compute_values
from tablegen.plan import plan_site
from tablegen.recipe import recipe_from_mapping
from tablegen.render.data import canonical_values
from tablegen.values import Surd

REPO = Path(__file__).resolve().parent.parent
SMALL = {"cg": {"max_j": 1}, "3j": {"max_j": "1/2"}, "6j": {"max_j": 1}, "9j": {"max_j": "1/2"}}
SMALL_ARGS = ["--cg", "1", "--3j", "1/2", "--6j", "1", "--9j", "1/2"]


def _snapshot(root: Path) -> dict[str, bytes]:
    return {p.relative_to(root).as_posix(): p.read_bytes() for p in sorted(root.rglob("*")) if p.is_file()}


def _env(**extra: str) -> dict[str, str]:
    path = os.pathsep.join(filter(None, [str(REPO), os.environ.get("PYTHONPATH")]))
    return dict(os.environ, PYTHONPATH=path, **extra)


@pytest.fixture(scope="module")
def small_site(tmp_path_factory) -> tuple[Path, object]:
    out = tmp_path_factory.mktemp("small") / "site"
    result = build(recipe_from_mapping(SMALL), out, jobs=1)
    return out, result


# -- same recipe, same bytes -----------------------------------------------------------------------
def test_two_builds_are_byte_identical(tmp_path: Path, small_site) -> None:
    # common practice, no source: a citable build must be reproducible byte for byte
    first, _ = small_site
    second = tmp_path / "elsewhere" / "other-name"
    second.parent.mkdir()
    build(recipe_from_mapping(SMALL), second, jobs=1)
    a, b = _snapshot(first), _snapshot(second)
    assert sorted(a) == sorted(b)
    assert [p for p in a if a[p] != b[p]] == []


def test_builds_ignore_hash_seed(tmp_path: Path, small_site) -> None:
    # common practice, no source: str hashing is randomised per process (PYTHONHASHSEED);
    # nothing written may depend on set or dict order of strings
    first, _ = small_site
    want = _snapshot(first)
    for seed in ("0", "4242"):
        out = tmp_path / f"seed-{seed}"
        done = subprocess.run(
            [sys.executable, "-m", "tablegen", "build", "--out", str(out), "--quiet", *SMALL_ARGS],
            env=_env(PYTHONHASHSEED=seed), cwd=tmp_path, capture_output=True, text=True, timeout=300,
        )
        assert done.returncode == 0, done.stderr
        got = _snapshot(out)
        assert sorted(got) == sorted(want), seed
        assert [p for p in want if want[p] != got[p]] == [], seed


def test_parallel_computing_gives_the_same_book(monkeypatch) -> None:
    # the chunks must come back in plan order whatever the number of processes
    plan = plan_site(recipe_from_mapping({"cg": {"max_j": "3/2"}, "6j": {"max_j": "3/2"}}))
    serial = compute_values(plan, jobs=1)
    monkeypatch.setattr(compute, "CHUNK", 7)
    monkeypatch.setattr(compute, "PARALLEL_THRESHOLD", 1)
    parallel = compute_values(plan, jobs=2)
    assert list(parallel.items()) == list(serial.items())


def test_build_result_and_manifest(small_site) -> None:
    out, result = small_site
    files = _snapshot(out)
    plan = plan_site(recipe_from_mapping(SMALL))
    manifest = json.loads(files["manifest.json"])
    assert result.files == len(files)
    assert result.pages == len(plan.pages) == manifest["pages"]
    for page in plan.pages:
        assert page.path in files, page.path
    assert manifest["tool"] == "tablegen" and manifest["format"] == "tablegen-manifest/1"
    assert manifest["counts"] == dict(family_counts(plan))
    assert manifest["recipe"] == recipe_from_mapping(SMALL).as_dict()
    assert manifest["data_digest"] == result.data_digest
    assert Path(result.out_dir) == out.absolute()
    value_lines = [l for l in files["values.txt"].decode().splitlines() if l and not l.startswith("#")]
    assert result.values == len(value_lines)


# -- the data digest -------------------------------------------------------------------------------
def _digest(mapping: dict) -> str:
    plan = plan_site(recipe_from_mapping(mapping))
    return hashlib.sha256(canonical_values(compute_values(plan, jobs=1))).hexdigest()


def test_digest_ignores_the_look() -> None:
    # README: the digest "changes when a value changes, not when the look does"
    base = _digest(SMALL)
    assert _digest(dict(SMALL, digits=40)) == base
    assert _digest(dict(SMALL, latex_style="rational")) == base
    assert _digest(dict(SMALL, title="Another title", notes="Some notes")) == base


def test_digest_follows_the_set_of_values() -> None:
    base = _digest(SMALL)
    assert _digest({k: v for k, v in SMALL.items() if k != "9j"}) != base  # a family less
    assert _digest(dict(SMALL, **{"3j": {"max_j": 1}})) != base  # a wider range
    assert _digest(dict(SMALL, **{"cg": {"min_j": "1/2", "max_j": 1}})) != base  # a narrower one


def test_digest_follows_a_single_value() -> None:
    plan = plan_site(recipe_from_mapping(SMALL))
    book = compute_values(plan, jobs=1)
    before = canonical_values(book)
    key = ("cg", (2, 2, 2, -2, 0, 0))  # <1 1; 1 -1 | 0 0>
    old = book[key]
    assert old.value == Surd(1, 1, 3)  # 1/sqrt(3), the J = 0 state of two spin 1 -- common practice
    changed = dict(book)
    changed[key] = FormattedValue(Surd(1, 1, 2), "sqrt(1/2)", (1, 1, 2), old.decimal, old.tex)
    assert canonical_values(changed) != before
    changed[key] = FormattedValue(-old.value, "-" + old.exact, (-1,) + old.parts[1:], old.decimal, old.tex)
    assert canonical_values(changed) != before  # a sign alone
    assert canonical_values(dict(book)) == before


def test_digest_of_a_build_ignores_digits(tmp_path: Path, small_site) -> None:
    _, result = small_site
    other = build(recipe_from_mapping(dict(SMALL, digits=25, title="Same values")), tmp_path / "s", jobs=1)
    assert other.data_digest == result.data_digest
    more = build(recipe_from_mapping(dict(SMALL, **{"3j": {"max_j": 1}})), tmp_path / "s", jobs=1)
    assert more.data_digest != result.data_digest


# -- user text is escaped ----------------------------------------------------------------------------
# Every LaTeX special sits between two copies of a marker, so that the raw text can be
# searched for whatever escaping the renderer chose.
SPECIALS = {"amp": "&", "pct": "%", "dol": "$", "hash": "#", "und": "_", "car": "^", "til": "~",
            "bra": "{", "ket": "}", "bsl": "\\"}
MARKED = " ".join(f"tg{name}{ch}tg{name}" for name, ch in SPECIALS.items())
TITLE = f"Tables <i>tgital</i> {MARKED}"
NOTES = f"First line with <script>alert('tgscript')</script> & more.\n\nSecond paragraph: {MARKED}"


@pytest.fixture(scope="module")
def text_site(tmp_path_factory) -> Path:
    out = tmp_path_factory.mktemp("text") / "site"
    build(recipe_from_mapping({"cg": {"max_j": "1/2"}, "6j": {"max_j": "1/2"}, "title": TITLE, "notes": NOTES}),
          out, jobs=1)
    return out


def test_recipe_text_is_escaped_in_html(text_site: Path) -> None:
    pages = {p: b.decode("utf-8") for p, b in _snapshot(text_site).items() if p.endswith(".html")}
    assert pages
    for path, text in pages.items():
        # HTML 5: '<' starts a tag, '&' a character reference -- WHATWG HTML, "Syntax"
        assert "<script>alert(" not in text, path
        assert "<i>tgital</i>" not in text, path
        for name, ch in SPECIALS.items():
            if ch == "&":
                assert f"tg{name}&tg{name}" not in text, path
    index = pages["index.html"]
    assert TITLE in html.unescape(index)
    for para in NOTES.split("\n"):
        if para:
            assert para in html.unescape(index), para


def _strip_verbatim(tex: str) -> str:
    tex = re.sub(r"\\begin\{(verbatim|Verbatim|lstlisting)\}.*?\\end\{\1\}", "", tex, flags=re.S)
    return re.sub(r"\\verb(.).*?\1", "", tex)


def test_recipe_text_is_escaped_in_latex(text_site: Path) -> None:
    files = {p: b.decode("utf-8") for p, b in _snapshot(text_site).items() if p.endswith(".tex")}
    assert "latex/booklet.tex" in files
    for path, text in files.items():
        body = _strip_verbatim(text)
        # LaTeX specials # $ % & ~ _ ^ \ { } must be escaped in running text
        # -- Lamport 1994, LaTeX: A Document Preparation System, §2.2.1 (from memory)
        for name, ch in SPECIALS.items():
            assert f"tg{name}{ch}tg{name}" not in body, (path, ch)
        assert "<script>" not in body and "<i>" not in body, path
    booklet = files["latex/booklet.tex"]
    for name in SPECIALS:
        assert f"tg{name}" in booklet, f"the title or notes are missing from the booklet ({name})"
    assert "tgscript" in booklet and "tgital" in booklet


def test_recipe_text_is_escaped_in_bibtex(text_site: Path) -> None:
    # BibTeX passes field text to LaTeX, so & % $ # _ ^ ~ \ must be escaped there as well
    # -- Patashnik 1988, BibTeXing, §4 (from memory)
    bib = (text_site / "cite.bib").read_text(encoding="utf-8")
    assert "tgamp" in bib
    for name, ch in SPECIALS.items():
        if ch not in "{}":  # bibtex() drops braces from the title
            assert f"tg{name}{ch}tg{name}" not in bib, ch

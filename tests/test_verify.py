"""verify: a fresh build passes; every kind of damage is reported with the file and the value.

Damage is made by hand in a copy of a small built site; the expected values
come from the selection rules and closed forms named beside each case.
"""

from __future__ import annotations

import json
import re
import shutil
from pathlib import Path

import pytest

from tablegen import cli
from tablegen.build import build
from tablegen.output import SUMS, sha256_hex
from tablegen.recipe import recipe_from_mapping
from tablegen.verify import verify_site

SMALL = {"cg": {"max_j": 1}, "6j": {"max_j": 1}, "9j": {"max_j": "1/2"}}


@pytest.fixture(scope="module")
def built(tmp_path_factory) -> Path:
    out = tmp_path_factory.mktemp("verify") / "site"
    build(recipe_from_mapping(SMALL), out, jobs=1)
    return out


@pytest.fixture()
def site(built: Path, tmp_path: Path) -> Path:
    copy = tmp_path / "site"
    shutil.copytree(built, copy)
    return copy


def _run(capsys, folder: Path) -> tuple[int, list[str], str]:
    status = cli.main(["verify", str(folder)])
    captured = capsys.readouterr()
    return status, captured.out.splitlines(), captured.err


def _replace_once(path: Path, old: str, new: str) -> None:
    text = path.read_text(encoding="utf-8")
    assert text.count(old) == 1, f"{old!r} occurs {text.count(old)} times in {path.name}"
    path.write_text(text.replace(old, new), encoding="utf-8")


def _reseal(site: Path, rel: str) -> None:
    """Update the SHA256SUMS line of one file, as a careless edit might."""
    sums = site / SUMS
    lines = []
    for line in sums.read_text(encoding="utf-8").splitlines():
        digest, _, path = line.partition("  ")
        if path == rel:
            digest = sha256_hex((site / rel).read_bytes())
        lines.append(f"{digest}  {path}")
    sums.write_text("\n".join(lines) + "\n", encoding="utf-8")


# -- a fresh build -------------------------------------------------------------------------------
def test_fresh_build_verifies(capsys, built: Path) -> None:
    status, out, err = _run(capsys, built)
    assert status == 0, out
    assert len(out) == 1 and out[0].endswith(": OK") and out[0].startswith("verify:")
    assert err == ""
    report = verify_site(str(built))
    files = [p for p in built.rglob("*") if p.is_file()]
    assert report.files == len(files) - 1  # every file but SHA256SUMS itself is listed
    counts = json.loads((built / "manifest.json").read_text(encoding="utf-8"))["counts"]
    assert report.values >= sum(counts.values()) > 50  # every tabulated value, W companions too
    assert "compared byte for byte" in out[0]
    assert f"{report.files} files" in out[0] and f"{report.values} values" in out[0]


# -- a changed value ---------------------------------------------------------------------------------
# <1 1; 1 -1 | 0 0> = 1/sqrt(3) (two spin-1's coupled to J = 0, common practice, no source)
# {1 1 1; 1 1 1} = 1/6 (Edmonds 1957, Table 5, closed forms with one j = 1; from memory)
CHANGES = [
    # (file, old text, new text, words every matching problem must carry)
    ("data/cg-j1-1-j2-1.csv", "1,1,1,-1,0,0,sqrt(1/3),", "1,1,1,-1,0,0,sqrt(1/5),", ["<1 1; 1 -1 | 0 0>", "exact"]),
    ("data/cg-j1-1-j2-1.csv", "1,1,1,-1,0,0,sqrt(1/3),1,1,3,0.577350269189626",
     "1,1,1,-1,0,0,sqrt(1/3),1,1,3,0.577350269189627", ["<1 1; 1 -1 | 0 0>", "decimal"]),
    ("data/cg-j1-1-j2-1.csv", "1,1,1,-1,0,0,sqrt(1/3),1,1,3,", "1,1,1,-1,0,0,sqrt(1/3),1,1,2,", ["<1 1; 1 -1 | 0 0>", "q: "]),
    ("data/cg-j1-1-j2-1.csv", "1,1,1,-1,0,0,sqrt(1/3),1,1,3,", "1,1,1,-1,0,0,sqrt(1/3),-1,1,3,", ["<1 1; 1 -1 | 0 0>", "sign: "]),
    ("data/6j-j1-1.json", '["1","1","1","1","1","1","1/6",1,1,36,',
     '["1","1","1","1","1","1","1/6",1,1,35,', ["{1 1 1; 1 1 1}", "q"]),
    ("data/6j-j1-1.json", '["1","1","1","1","1","1","1/6",', '["1","1","1","1","1","1","1/7",',
     ["{1 1 1; 1 1 1}", "exact"]),
    ("values.txt", "\n6j 1 1 1 1 1 1 1/6\n", "\n6j 1 1 1 1 1 1 1/9\n", ["{1 1 1; 1 1 1}", "exact"]),
    ("values.txt", "\ncg 1 1 1 -1 0 0 sqrt(1/3)\n", "\ncg 1 1 1 -1 0 0 -sqrt(1/3)\n", ["<1 1; 1 -1 | 0 0>"]),
]


@pytest.mark.parametrize("reseal", [False, True], ids=["sums-untouched", "sums-updated"])
@pytest.mark.parametrize("rel, old, new, words", CHANGES, ids=[f"{c[0]}:{i}" for i, c in enumerate(CHANGES)])
def test_changed_value_is_reported(capsys, site: Path, rel, old, new, words, reseal: bool) -> None:
    _replace_once(site / rel, old, new)
    if reseal:
        _reseal(site, rel)  # the values are recomputed, so fixing the checksum hides nothing
    status, out, _ = _run(capsys, site)
    assert status == 1
    assert not out[0].endswith(": OK")
    value_problems = [line for line in out[1:] if line.strip().startswith(rel) and words[0] in line]
    assert len(max(out, key=len)) < 400, out  # lines are cut, never thousands of characters
    assert value_problems, out
    assert all(all(w in line for w in words) for line in value_problems), value_problems
    checksum = [line for line in out if "checksum mismatch" in line]
    assert checksum == ([] if reseal else [f"  checksum mismatch: {rel}"])
    if rel == "values.txt":
        assert any("data_digest" in line for line in out)  # the manifest's digest no longer fits


# -- missing, extra and checksum problems ----------------------------------------------------------
def test_missing_file_is_reported(capsys, site: Path) -> None:
    (site / "data" / "cg-j1-1-j2-1.csv").unlink()
    status, out, _ = _run(capsys, site)
    assert status == 1
    assert "  missing file: data/cg-j1-1-j2-1.csv" in out


def test_missing_values_txt_is_reported(capsys, site: Path) -> None:
    (site / "values.txt").unlink()
    status, out, _ = _run(capsys, site)
    assert status == 1
    assert out.count("  missing file: values.txt") == 1, out  # named once, not once per check


def test_extra_file_is_reported(capsys, site: Path) -> None:
    (site / "data" / "my-notes.txt").write_text("added later\n", encoding="utf-8")
    status, out, _ = _run(capsys, site)
    assert status == 1
    assert f"  extra file not in {SUMS}: data/my-notes.txt" in out


def test_corrupted_sums_line_is_reported(capsys, site: Path) -> None:
    sums = site / SUMS
    lines = sums.read_text(encoding="utf-8").splitlines()
    n = next(i for i, line in enumerate(lines) if line.endswith("  values.txt"))
    lines[n] = "this line is not a checksum"
    sums.write_text("\n".join(lines) + "\n", encoding="utf-8")
    status, out, _ = _run(capsys, site)
    assert status == 1
    assert any(re.search(rf"{SUMS} line {n + 1}\b", line) for line in out), out
    assert f"  extra file not in {SUMS}: values.txt" in out  # it is no longer listed


def test_changed_digest_in_sums_is_reported(capsys, site: Path) -> None:
    sums = site / SUMS
    text = sums.read_text(encoding="utf-8")
    line = next(l for l in text.splitlines() if l.endswith("  data/cg-j1-1-j2-1.csv"))
    flipped = ("0" if line[0] != "0" else "1") + line[1:]
    sums.write_text(text.replace(line, flipped), encoding="utf-8")
    status, out, _ = _run(capsys, site)
    assert status == 1
    assert "  checksum mismatch: data/cg-j1-1-j2-1.csv" in out




@pytest.mark.parametrize(
    "rel",
    [
        SUMS,
        "data/cg-j1-1-j2-1.csv",
        "values.txt",
        "data/cg-j1-1-j2-1.json",
    ],
)
def test_bytes_that_are_not_utf8_are_reported(capsys, site: Path, rel: str) -> None:
    # a flipped byte is the most ordinary damage a file can suffer: report it, do not crash
    with open(site / rel, "ab") as fh:
        fh.write(b"\xff\xfe not utf-8\n")
    status, out, err = _run(capsys, site)
    assert status == 1
    assert "Traceback" not in err
    assert any(rel in line for line in out[1:]), out


@pytest.mark.parametrize(
    "digits",
    ["0", '"abc"'],
)
def test_damaged_manifest_is_reported(capsys, site: Path, digits: str) -> None:
    _replace_once(site / "manifest.json", '"digits": 15', f'"digits": {digits}')
    status, out, err = _run(capsys, site)
    assert status == 1
    assert "Traceback" not in err
    assert "  checksum mismatch: manifest.json" in out


# -- not a site ----------------------------------------------------------------------------------------
def test_folder_that_is_not_a_site(capsys, tmp_path: Path) -> None:
    folder = tmp_path / "plain"
    folder.mkdir()
    (folder / "readme.txt").write_text("hello\n", encoding="utf-8")
    status, out, err = _run(capsys, folder)
    assert status == 2
    assert out == []
    assert len(err.splitlines()) == 1 and str(folder) in err and "Traceback" not in err


def test_missing_folder(capsys, tmp_path: Path) -> None:
    status, _, err = _run(capsys, tmp_path / "nowhere")
    assert status == 2
    assert len(err.splitlines()) == 1 and "not a folder" in err


def test_a_deleted_table_row_is_noticed_even_when_resealed(capsys, site: Path) -> None:
    # The digest is the SHA-256 of values.txt, so every value a table holds must be listed there
    # and the other way round (common practice, no source). <1 1; 1 -1 | 0 0> = 1/sqrt(3) is the
    # J = 0 state of two spin-1 particles (Condon & Shortley 1935, from memory).
    csv_path = site / "data" / "cg-j1-1-j2-1.csv"
    lines = csv_path.read_text(encoding="utf-8").splitlines(keepends=True)
    row = "1,1,1,-1,0,0,sqrt(1/3),1,1,3,0.577350269189626\n"
    assert row in lines
    csv_path.write_text("".join(line for line in lines if line != row), encoding="utf-8")
    _reseal(site, "data/cg-j1-1-j2-1.csv")
    status, out, _ = _run(capsys, site)
    assert status == 1
    assert any("data/cg-j1-1-j2-1.csv line 18, value <1 1; 1 -1 | 0 0>" in line and "(19 lines" in line for line in out), out


# -- forgeries: the forger recomputes every line of SHA256SUMS ---------------------------------------
def _forge_sums(site: Path) -> None:
    """Rewrite SHA256SUMS for every file, as a careful forger would."""
    files = sorted(p.relative_to(site).as_posix() for p in site.rglob("*") if p.is_file() and p.name != SUMS)
    (site / SUMS).write_text("".join(f"{sha256_hex((site / f).read_bytes())}  {f}\n" for f in files), encoding="utf-8")


def _sub_first(site: Path, rel: str, pattern: str, repl) -> None:
    path = site / rel
    text = path.read_text(encoding="utf-8")
    new, n = re.subn(pattern, repl, text, count=1)
    assert n == 1 and new != text, (rel, pattern)
    path.write_text(new, encoding="utf-8")


def _lines(site: Path, rel: str) -> list[str]:
    return (site / rel).read_text(encoding="utf-8").splitlines(keepends=True)


def _set_lines(site: Path, rel: str, lines: list[str]) -> None:
    (site / rel).write_text("".join(lines), encoding="utf-8")


def _edit_manifest(site: Path, change) -> None:
    doc = json.loads((site / "manifest.json").read_text(encoding="utf-8"))
    change(doc)
    (site / "manifest.json").write_text(json.dumps(doc, indent=1, ensure_ascii=False) + "\n", encoding="utf-8")


# {1 1 1; 1 1/2 1/2} = 1/6 and its W (Edmonds 1957, Table 5; from memory) sit in 6j-j1-1;
# <1 1; 1 -1 | 0 0> = 1/sqrt(3) (common practice, no source) in cg-j1-1-j2-1.
_ROW_6J = "1,1/2,1/2,1,1/2,1/2,1/6,1,1,36,0.166666666666667,3,1 1/2 1/2 1 1/2 1/2,-1\n"
_ROW_CG = "1,1,1,-1,0,0,sqrt(1/3),1,1,3,0.577350269189626\n"


def _delete_row_everywhere(site: Path) -> None:
    """The cg row removed from CSV, JSON and values.txt; every digest and checksum updated to match."""
    _set_lines(site, "data/cg-j1-1-j2-1.csv", [l for l in _lines(site, "data/cg-j1-1-j2-1.csv") if l != _ROW_CG])
    table = site / "data" / "cg-j1-1-j2-1.json"
    doc = json.loads(table.read_text(encoding="utf-8"))
    doc["rows"] = [r for r in doc["rows"] if r[:6] != ["1", "1", "1", "-1", "0", "0"]]
    table.write_text(json.dumps(doc, ensure_ascii=False, separators=(",", ":")) + "\n", encoding="utf-8")
    _set_lines(site, "values.txt", [l for l in _lines(site, "values.txt") if l != "cg 1 1 1 -1 0 0 sqrt(1/3)\n"])
    old = json.loads((site / "manifest.json").read_text(encoding="utf-8"))["data_digest"]
    new = sha256_hex((site / "values.txt").read_bytes())
    for p in site.rglob("*"):
        if p.is_file() and p.suffix in (".html", ".json", ".bib", ".tex", ".csv", ".txt"):
            text = p.read_text(encoding="utf-8")
            if old in text or old[:12] in text:
                p.write_text(text.replace(old, new).replace(old[:12], new[:12]), encoding="utf-8")


def _other_hex(m: re.Match) -> str:
    """A plausible forged digest: one hex digit changed."""
    return m.group(1) + ("0" if m.group(2) != "0" else "1")


FORGERIES = {
    # name: (forge(site), the file a problem line must name)
    "html-value": (lambda s: _sub_first(s, "6j/j1-1.html", r"0\.166666666666667", "0.166666666666668"), "6j/j1-1.html"),
    "latex-fragment-value": (lambda s: _sub_first(s, "latex/6j-j1-1.tex", r"\\frac\{1\}\{6\}", r"\\frac{1}{7}"), "latex/6j-j1-1.tex"),
    "latex-sheet-title": (lambda s: _sub_first(s, "latex/6j-j1-1-sheet.tex", r"j1 = 1\}", "j1 = 2}"), "latex/6j-j1-1-sheet.tex"),
    "cite-bib-count": (lambda s: _sub_first(s, "cite.bib", r"cg: 56 values", "cg: 57 values"), "cite.bib"),
    "cite-bib-digest": (lambda s: _sub_first(s, "cite.bib", r"(SHA-256 of values.txt\): )([0-9a-f])", _other_hex), "cite.bib"),
    "page-footer-digest": (lambda s: _sub_first(s, "index.html", r'(values.txt">)([0-9a-f])', _other_hex), "index.html"),
    "csv-w-sign": (lambda s: _sub_first(s, "data/6j-j1-1.csv", re.escape(_ROW_6J), _ROW_6J.replace(",-1\n", ",1\n")), "data/6j-j1-1.csv"),
    # the W columns of a row: its arguments, then its sign, before the list of equal forms
    "json-w-sign": (lambda s: _sub_first(s, "data/6j-j1-1.json", r'("[0-9/ ]+",)-1,\[\[', r"\g<1>1,[["), "data/6j-j1-1.json"),
    "json-form-sign": (lambda s: _sub_first(s, "data/6j-j1-1.json", r'(\["[^"]+",)1\]', r"\1-1]"), "data/6j-j1-1.json"),
    "row-deleted-everywhere": (_delete_row_everywhere, "data/cg-j1-1-j2-1.csv"),
    "csv-row-removed-not-json": (
        lambda s: _set_lines(s, "data/cg-j1-1-j2-1.csv", [l for l in _lines(s, "data/cg-j1-1-j2-1.csv") if l != _ROW_CG]),
        "data/cg-j1-1-j2-1.csv"),
    "row-duplicated": (
        lambda s: _set_lines(s, "data/cg-j1-1-j2-1.csv", _lines(s, "data/cg-j1-1-j2-1.csv") + [_ROW_CG]), "data/cg-j1-1-j2-1.csv"),
    "rows-reordered": (
        lambda s: _set_lines(s, "data/cg-j1-1-j2-1.csv", _lines(s, "data/cg-j1-1-j2-1.csv")[:1] + _lines(s, "data/cg-j1-1-j2-1.csv")[1:][::-1]),
        "data/cg-j1-1-j2-1.csv"),
    "manifest-counts": (lambda s: _edit_manifest(s, lambda d: d["counts"].update(cg=57)), "manifest.json"),
    "manifest-recipe": (lambda s: _edit_manifest(s, lambda d: d["recipe"]["cg"].update(max_j="1/2")), "manifest.json"),
    "manifest-version": (lambda s: _edit_manifest(s, lambda d: d.update(version="0.0.9")), "manifest.json"),
    "manifest-version-removed": (lambda s: _edit_manifest(s, lambda d: d.pop("version")), "manifest.json"),
    "manifest-version-and-counts": (
        lambda s: _edit_manifest(s, lambda d: (d.update(version="0.0.9"), d["counts"].update(cg=57))), "manifest.json"),
    "manifest-digits": (lambda s: _edit_manifest(s, lambda d: d["recipe"].update(digits=14)), "manifest.json"),
}


@pytest.mark.parametrize("name", sorted(FORGERIES))
def test_forgery_with_recomputed_checksums_is_caught(capsys, site: Path, name: str) -> None:
    forge, rel = FORGERIES[name]
    forge(site)
    _forge_sums(site)
    status, out, err = _run(capsys, site)
    assert status == 1, out
    assert err == "" and not out[0].endswith(": OK")
    assert not any("checksum mismatch" in line for line in out), out  # the sums are consistent ...
    assert any(line.strip().startswith(rel) for line in out[1:]), out  # ... but the forged file is named
    assert len(max(out, key=len)) < 400, out


def test_a_forged_version_is_named_as_false(capsys, site: Path) -> None:
    FORGERIES["manifest-version"][0](site)
    _forge_sums(site)
    status, out, _ = _run(capsys, site)
    assert status == 1
    assert any("version '0.0.9' is false" in line for line in out), out


def test_a_difference_names_the_value_and_the_field(capsys, site: Path) -> None:
    FORGERIES["csv-w-sign"][0](site)
    _forge_sums(site)
    _, out, _ = _run(capsys, site)
    line = next(l for l in out if "data/6j-j1-1.csv" in l)
    assert "value {1 1/2 1/2; 1 1/2 1/2}" in line and ", w_sign:" in line, line


# -- a site made by another version: every value recomputed instead ---------------------------------
@pytest.fixture()
def other_version(monkeypatch):
    """Pretend the installed tablegen is a later version: the old site can no longer match byte for byte."""
    import tablegen.build
    import tablegen.verify

    monkeypatch.setattr(tablegen.build, "__version__", "9.0.0")
    monkeypatch.setattr(tablegen.verify, "__version__", "9.0.0")


def test_another_versions_site_is_checked_value_by_value(capsys, site: Path, other_version) -> None:
    status, out, _ = _run(capsys, site)
    assert status == 0, out
    assert "value by value" in out[0] and out[0].endswith(": OK")
    report = verify_site(str(site))
    assert any("made by tablegen 0.1.0, this is tablegen 9.0.0" in n for n in report.notes)
    assert report.values > 200  # CSV, JSON and values.txt each recomputed


VALUE_FORGERIES = [
    "html-value", "cite-bib-digest", "page-footer-digest", "csv-w-sign", "json-w-sign", "json-form-sign", "row-deleted-everywhere", "csv-row-removed-not-json",
    "row-duplicated", "manifest-counts", "manifest-digits",
]


@pytest.mark.parametrize("name", VALUE_FORGERIES)
def test_value_by_value_catches_data_forgeries(capsys, site: Path, other_version, name: str) -> None:
    forge, rel = FORGERIES[name]
    forge(site)
    _forge_sums(site)
    status, out, err = _run(capsys, site)
    assert status == 1 and "value by value" in out[0], out
    assert err == ""
    expected = {"row-deleted-everywhere": "manifest.json", "manifest-digits": "data/"}.get(name, rel)
    assert any(line.strip().startswith(expected) for line in out[1:]), out


@pytest.mark.parametrize("body", ['"rows": 5', '"rows": [{"args": null, "exact": "1", "square": "1", "decimal": "1"}]',
                                  '"rows": [5]', '"rows": [{"args": [1], "exact": 1, "square": 1, "decimal": 1, "forms": 3, "w": 1}]',
                                  '"rows": [[1]]', '"rows": [[null, 1, "x", [], {}, 0, "a", -1, null, 3, 1]]',
                                  '"columns": 7, "rows": []'])
def test_malformed_json_tables_are_problems_not_tracebacks(capsys, site: Path, other_version, body: str) -> None:
    path = site / "data" / "cg-j1-1-j2-1.json"
    doc = path.read_text(encoding="utf-8")
    start = doc.index('"columns":[' if body.startswith('"columns"') else '"rows":[')
    path.write_text(doc[:start] + body + "\n}\n", encoding="utf-8")
    _forge_sums(site)
    status, out, err = _run(capsys, site)
    assert status == 1 and "Traceback" not in err, (out, err)
    assert any(line.strip().startswith("data/cg-j1-1-j2-1.json") for line in out[1:]), out


def test_a_huge_forged_value_gives_a_short_line(capsys, site: Path, other_version) -> None:
    _sub_first(site, "data/cg-j1-1-j2-1.csv", re.escape("1,1,1,-1,0,0,sqrt(1/3),"), "1,1,1,-1,0,0," + "7" * 5000 + ",")
    _forge_sums(site)
    status, out, _ = _run(capsys, site)
    assert status == 1 and any("<1 1; 1 -1 | 0 0>: exact" in line for line in out), out
    assert len(max(out, key=len)) < 400


@pytest.mark.parametrize("body", ['"rows": 5', '"rows": [{"args": null}]'])
def test_malformed_json_tables_in_a_same_version_site_are_differences(capsys, site: Path, body: str) -> None:
    path = site / "data" / "6j-j1-1.json"
    doc = path.read_text(encoding="utf-8")
    path.write_text(doc[: doc.index('"rows":[')] + body + "\n}\n", encoding="utf-8")
    _forge_sums(site)
    status, out, err = _run(capsys, site)
    assert status == 1 and err == "", (out, err)
    assert any(line.startswith("  data/6j-j1-1.json") for line in out), out


def test_a_listed_file_replaced_by_a_symlink_is_reported(capsys, site: Path, tmp_path: Path) -> None:
    # the same bytes, but kept outside the site, where they can change unseen
    outside = tmp_path / "elsewhere.csv"
    outside.write_bytes((site / "data" / "cg-j1-1-j2-1.csv").read_bytes())
    (site / "data" / "cg-j1-1-j2-1.csv").unlink()
    (site / "data" / "cg-j1-1-j2-1.csv").symlink_to(outside)
    status, out, _ = _run(capsys, site)
    assert status == 1 and "  data/cg-j1-1-j2-1.csv: a symbolic link, not a file of the site" in out, out


def test_a_forged_recipe_far_larger_than_the_site_is_not_rebuilt(capsys, site: Path) -> None:
    _edit_manifest(site, lambda d: d["recipe"]["cg"].update(max_j="40"))  # hours of computing, if believed
    _forge_sums(site)
    status, out, _ = _run(capsys, site)
    assert status == 1 and any("far more than" in line and "not rebuilt" in line for line in out), out

"""verify: a fresh build passes; every kind of damage is reported with the file and the value.

Damage is made by hand in a copy of a small built site; the expected values
come from the selection rules and closed forms named beside each case.
"""

from __future__ import annotations

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
    assert report.values > 100
    assert f"{report.files} files" in out[0] and f"{report.values} values" in out[0]


# -- a changed value ---------------------------------------------------------------------------------
# <1 1; 1 -1 | 0 0> = 1/sqrt(3) (two spin-1's coupled to J = 0, common practice, no source)
# {1 1 1; 1 1 1} = 1/6 (Edmonds 1957, Table 5, closed forms with one j = 1; from memory)
CHANGES = [
    # (file, old text, new text, words every matching problem must carry)
    ("data/cg-1x1.csv", "1,1,1,-1,0,0,sqrt(1/3),", "1,1,1,-1,0,0,sqrt(1/5),", ["<1 1; 1 -1 | 0 0>", "exact"]),
    ("data/cg-1x1.csv", "1,1,1,-1,0,0,sqrt(1/3),1,1,3,0.577350269189626",
     "1,1,1,-1,0,0,sqrt(1/3),1,1,3,0.577350269189627", ["<1 1; 1 -1 | 0 0>", "decimal"]),
    ("data/cg-1x1.csv", "1,1,1,-1,0,0,sqrt(1/3),1,1,3,", "1,1,1,-1,0,0,sqrt(1/3),1,1,2,", ["<1 1; 1 -1 | 0 0>", "sign, p, q"]),
    ("data/cg-1x1.csv", "1,1,1,-1,0,0,sqrt(1/3),1,1,3,", "1,1,1,-1,0,0,sqrt(1/3),-1,1,3,", ["<1 1; 1 -1 | 0 0>", "sign, p, q"]),
    ("data/6j-jmax-1.json", '"args":["1","1","1","1","1","1"],"exact":"1/6","sign":1,"p":1,"q":36',
     '"args":["1","1","1","1","1","1"],"exact":"1/6","sign":1,"p":1,"q":35',
     ["{1 1 1; 1 1 1}", "sign, p, q"]),
    ("data/6j-jmax-1.json", '"args":["1","1","1","1","1","1"],"exact":"1/6"',
     '"args":["1","1","1","1","1","1"],"exact":"1/7"', ["{1 1 1; 1 1 1}", "exact"]),
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
    assert value_problems, out
    assert all(all(w in line for w in words) for line in value_problems), value_problems
    checksum = [line for line in out if "checksum mismatch" in line]
    assert checksum == ([] if reseal else [f"  checksum mismatch: {rel}"])
    if rel == "values.txt":
        assert any("data_digest" in line for line in out)  # the manifest's digest no longer fits


# -- missing, extra and checksum problems ----------------------------------------------------------
def test_missing_file_is_reported(capsys, site: Path) -> None:
    (site / "data" / "cg-1x1.csv").unlink()
    status, out, _ = _run(capsys, site)
    assert status == 1
    assert "  missing file: data/cg-1x1.csv" in out


def test_missing_values_txt_is_reported(capsys, site: Path) -> None:
    (site / "values.txt").unlink()
    status, out, _ = _run(capsys, site)
    assert status == 1
    assert "  missing file: values.txt" in out


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
    line = next(l for l in text.splitlines() if l.endswith("  data/cg-1x1.csv"))
    flipped = ("0" if line[0] != "0" else "1") + line[1:]
    sums.write_text(text.replace(line, flipped), encoding="utf-8")
    status, out, _ = _run(capsys, site)
    assert status == 1
    assert "  checksum mismatch: data/cg-1x1.csv" in out




@pytest.mark.parametrize(
    "rel",
    [
        SUMS,
        "data/cg-1x1.csv",
        "values.txt",
        "data/cg-1x1.json",
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
    csv_path = site / "data" / "cg-1x1.csv"
    lines = csv_path.read_text(encoding="utf-8").splitlines(keepends=True)
    row = "1,1,1,-1,0,0,sqrt(1/3),1,1,3,0.577350269189626\n"
    assert row in lines
    csv_path.write_text("".join(line for line in lines if line != row), encoding="utf-8")
    _reseal(site, "data/cg-1x1.csv")
    status, out, _ = _run(capsys, site)
    assert status == 1
    assert any("values.txt" in line and "cg 1 1 1 -1 0 0" in line for line in out), out

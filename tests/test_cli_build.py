"""The build command line: family ranges, none, title, jobs, and one-line errors with exit 2."""

from __future__ import annotations

import json
import os
import subprocess
import sys
from pathlib import Path

import pytest

from tablegen import cli

REPO = Path(__file__).resolve().parent.parent


def _run(capsys, *argv: str) -> tuple[int, list[str], list[str]]:
    status = cli.main(list(argv))
    captured = capsys.readouterr()
    return status, captured.out.splitlines(), captured.err.splitlines()


def _manifest(out: Path) -> dict:
    return json.loads((out / "manifest.json").read_text(encoding="utf-8"))


def test_build_with_ranges_and_title(capsys, tmp_path: Path) -> None:
    out = tmp_path / "tables"
    status, stdout, stderr = _run(capsys, "build", "--out", str(out), "--cg", "1", "--6j", "1/2..1", "--title", "X")
    assert status == 0, stderr
    assert stderr == []
    manifest = _manifest(out)
    assert len(stdout) == 1
    assert stdout[0].startswith(f"tablegen: wrote {out}") and manifest["data_digest"] in stdout[0]
    recipe = manifest["recipe"]
    assert recipe["title"] == "X"
    assert recipe["cg"] == {"max_j": "1"}
    assert recipe["6j"] == {"max_j": "1", "min_j": "1/2"}
    assert "3j" not in recipe and "9j" not in recipe  # only the families asked for
    assert (out / "cg" / "j1-1-j2-1.html").is_file() and (out / "data" / "cg-j1-0.5-j2-1.csv").is_file()
    assert not (out / "3j").exists() and not (out / "9j").exists()
    assert list((out / "data").glob("6j-*.csv"))
    # the command verifies what it wrote
    assert _run(capsys, "verify", str(out))[0] == 0


def test_none_leaves_a_family_out_of_a_recipe_file(capsys, tmp_path: Path) -> None:
    recipe = tmp_path / "recipe.toml"
    recipe.write_text('title = "Two families"\n[cg]\nmax_j = 1\n[3j]\nmax_j = "1/2"\n', encoding="utf-8")
    out = tmp_path / "site"
    status, stdout, stderr = _run(capsys, "build", "--recipe", str(recipe), "--cg", "none", "--out", str(out), "--quiet")
    assert status == 0, stderr
    assert stdout == [] and stderr == []  # --quiet
    manifest = _manifest(out)
    assert "cg" not in manifest["recipe"] and manifest["recipe"]["3j"] == {"max_j": "1/2"}
    assert not (out / "cg").exists() and not list((out / "data").glob("cg-*"))
    assert (out / "data" / "3j-j1-0.5-j2-0.5.csv").is_file()


@pytest.mark.parametrize(
    "option, text, words",
    [
        ("--cg", "1..", "--cg = '1..'"),
        ("--cg", "..2", "--cg = '..2'"),
        ("--3j", "abc", "--3j = 'abc'"),
        ("--6j", "2..1", "reversed range"),
        ("--6j", "1/3", "multiple of 1/2"),
        ("--9j", "1...2", "--9j = '1...2'"),
        ("--cg", "-1", ">= 0"),
        ("--cg", "1,2", "--cg = '1,2'"),
    ],
)
def test_bad_range_is_one_line(capsys, tmp_path: Path, option: str, text: str, words: str) -> None:
    out = tmp_path / "site"
    status, stdout, stderr = _run(capsys, "build", "--out", str(out), f"{option}={text}")
    assert status == 2
    assert stdout == []
    assert len(stderr) == 1 and words in stderr[0], stderr
    assert not out.exists()


@pytest.mark.parametrize(
    "argv, words",
    [
        (["--jobs", "0"], "--jobs"),
        (["--jobs", "-3"], "--jobs"),
        (["--jobs", "many"], "--jobs"),
        (["--digits", "0"], "digits"),
        (["--digits", "ten"], "--digits"),
        (["--latex-style", "fancy"], "--latex-style"),
        (["--title", ""], "title"),
        (["--colour", "red"], "--colour"),
    ],
)
def test_bad_options_are_one_line(capsys, tmp_path: Path, argv: list[str], words: str) -> None:
    out = tmp_path / "site"
    status, stdout, stderr = _run(capsys, "build", "--out", str(out), "--cg", "1/2", *argv)
    assert status == 2
    assert stdout == []
    assert len(stderr) == 1 and words in stderr[0], stderr
    assert "Traceback" not in stderr[0]
    assert not out.exists()


def test_jobs_one_and_two_give_the_same_site(capsys, tmp_path: Path) -> None:
    sites = []
    for jobs in ("1", "2"):
        out = tmp_path / f"jobs-{jobs}"
        assert _run(capsys, "build", "--out", str(out), "--6j", "1", "--jobs", jobs, "--quiet")[0] == 0
        sites.append({p.relative_to(out).as_posix(): p.read_bytes() for p in out.rglob("*") if p.is_file()})
    assert sites[0] == sites[1]


def test_python_dash_m_entry_point(tmp_path: Path) -> None:
    env = dict(os.environ, PYTHONPATH=os.pathsep.join(filter(None, [str(REPO), os.environ.get("PYTHONPATH")])))
    out = tmp_path / "site"
    done = subprocess.run(
        [sys.executable, "-m", "tablegen", "build", "--out", str(out), "--9j", "1/2", "--title", "Entry point"],
        env=env, cwd=tmp_path, capture_output=True, text=True, timeout=300,
    )
    assert done.returncode == 0, done.stderr
    assert done.stdout.count("\n") == 1 and "data digest" in done.stdout
    done = subprocess.run(
        [sys.executable, "-m", "tablegen", "build", "--out", str(out), "--9j", "x"],
        env=env, cwd=tmp_path, capture_output=True, text=True, timeout=300,
    )
    assert done.returncode == 2
    assert done.stderr.count("\n") == 1 and "Traceback" not in done.stderr
    assert _manifest(out)["recipe"]["title"] == "Entry point"  # the failed run changed nothing


def test_inline_latex_style_from_the_command_line(capsys, tmp_path: Path) -> None:
    # <1/2 1/2; 1/2 -1/2 | 1 0> = sqrt(1/2) (the triplet M = 0 state, common practice, no source)
    out = tmp_path / "site"
    assert _run(capsys, "build", "--out", str(out), "--cg", "1/2", "--latex-style", "inline", "--quiet")[0] == 0
    fragment = (out / "latex" / "cg-j1-0.5-j2-0.5.tex").read_text(encoding="utf-8")
    assert "\\sqrt{1/2}" in fragment and "\\frac" not in fragment
    assert _manifest(out)["recipe"]["latex_style"] == "inline"

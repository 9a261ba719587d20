"""Writing a site: staging folder, SHA256SUMS, manifest, refusal rules and atomic replacement.

A failed or interrupted build must leave the previous site byte-identical and
no staging or temporary folder behind; a folder that is not a tablegen site is
never replaced.
"""

from __future__ import annotations

import json
import os
import shutil
import signal
import subprocess
import sys
import time
from pathlib import Path

import pytest

from tablegen import cli
from tablegen.errors import OutputError
from tablegen.output import MANIFEST, SUMS, Staging, check_target, is_tablegen_site, sha256_hex
from tablegen.recipe import recipe_from_mapping

REPO = Path(__file__).resolve().parent.parent
SMALL = {"cg": {"max_j": 1}, "6j": {"max_j": 1}, "9j": {"max_j": "1/2"}}


def _snapshot(root: Path) -> dict[str, bytes]:
    """Every file under root (relative '/'-paths) with its bytes."""
    return {p.relative_to(root).as_posix(): p.read_bytes() for p in sorted(root.rglob("*")) if p.is_file()}


def _hidden_leftovers(parent: Path) -> list[str]:
    return sorted(p.name for p in parent.iterdir() if p.name.startswith("."))


def _write_site(out: Path, files: dict[str, bytes], manifest: dict | None = None) -> None:
    with Staging(out) as site:
        for path, data in files.items():
            site.write(path, data)
        site.finish(manifest or {"tool": "tablegen", "format": "test"})


# -- the staging writer ------------------------------------------------------------------------
def test_staging_writes_files_sums_and_manifest(tmp_path: Path) -> None:
    out = tmp_path / "site"
    files = {"index.html": b"<p>hello</p>\n", "data/a.csv": b"x,y\n1,2\n", "deep/er/b.txt": "ü\n".encode()}
    _write_site(out, files, {"tool": "tablegen", "format": "test", "note": "ok"})
    got = _snapshot(out)
    for path, data in files.items():
        assert got[path] == data
    assert set(got) == set(files) | {MANIFEST, SUMS}
    manifest = json.loads(got[MANIFEST])
    assert manifest["tool"] == "tablegen" and manifest["note"] == "ok"
    assert manifest["files"] == len(files) + 1  # the files SHA256SUMS lists, the manifest included
    assert is_tablegen_site(out)
    # SHA256SUMS: "<64 hex>  <path>" per line, sorted, every file but itself
    # -- GNU coreutils sha256sum, text-mode output format
    lines = got[SUMS].decode("utf-8").splitlines()
    listed = {}
    for line in lines:
        digest, path = line.split("  ", 1)
        assert len(digest) == 64 and all(c in "0123456789abcdef" for c in digest)
        listed[path] = digest
    assert [line.split("  ", 1)[1] for line in lines] == sorted(listed)
    assert set(listed) == set(got) - {SUMS}
    for path, digest in listed.items():
        assert digest == sha256_hex(got[path])
    assert _hidden_leftovers(tmp_path) == []


@pytest.mark.skipif(shutil.which("sha256sum") is None, reason="sha256sum (GNU coreutils) not installed")
def test_sums_are_readable_by_sha256sum(tmp_path: Path) -> None:
    out = tmp_path / "site"
    _write_site(out, {"a.txt": b"a\n", "sub dir/b c.txt": b"spaces in names\n", "x/y/z.json": b"{}\n"})
    done = subprocess.run(["sha256sum", "-c", "--strict", SUMS], cwd=out, capture_output=True, text=True)
    assert done.returncode == 0, done.stdout + done.stderr
    assert done.stdout.count(": OK") == 4  # three files and the manifest
    # and it notices a change
    (out / "a.txt").write_bytes(b"b\n")
    done = subprocess.run(["sha256sum", "-c", SUMS], cwd=out, capture_output=True, text=True)
    assert done.returncode == 1 and "a.txt: FAILED" in done.stdout


@pytest.mark.parametrize("path", ["../escape.txt", "/abs.txt", "", "a/../../b.txt"])
def test_bad_paths_are_refused(tmp_path: Path, path: str) -> None:
    with pytest.raises(ValueError), Staging(tmp_path / "site") as site:
        site.write(path, b"x")
    assert not (tmp_path / "escape.txt").exists() and not (tmp_path / "site").exists()
    assert _hidden_leftovers(tmp_path) == []


def test_repeated_path_is_refused(tmp_path: Path) -> None:
    with pytest.raises(ValueError), Staging(tmp_path / "site") as site:
        site.write("a.txt", b"1")
        site.write("a.txt", b"2")
    assert not (tmp_path / "site").exists()
    assert _hidden_leftovers(tmp_path) == []


def test_empty_existing_folder_is_accepted(tmp_path: Path) -> None:
    out = tmp_path / "site"
    out.mkdir()
    _write_site(out, {"a.txt": b"a"})
    assert (out / "a.txt").read_bytes() == b"a"


def test_replacing_a_site_removes_its_old_files(tmp_path: Path) -> None:
    out = tmp_path / "site"
    _write_site(out, {"old.txt": b"old", "shared.txt": b"1"})
    _write_site(out, {"new.txt": b"new", "shared.txt": b"2"})
    got = _snapshot(out)
    assert "old.txt" not in got
    assert got["new.txt"] == b"new" and got["shared.txt"] == b"2"
    assert _hidden_leftovers(tmp_path) == []


def test_leftovers_of_a_killed_build_are_cleaned(tmp_path: Path) -> None:
    out = tmp_path / "site"
    for name in (".site.tablegen-staging-999999", ".site.tablegen-old-999999"):
        (tmp_path / name / "sub").mkdir(parents=True)
        (tmp_path / name / "sub" / "f.txt").write_bytes(b"stale")
    (tmp_path / ".unrelated").mkdir()  # someone else's hidden folder stays
    _write_site(out, {"a.txt": b"a"})
    assert _hidden_leftovers(tmp_path) == [".unrelated"]


def test_exception_inside_staging_keeps_the_previous_site(tmp_path: Path) -> None:
    out = tmp_path / "site"
    _write_site(out, {"a.txt": b"first", "b/c.txt": b"first"})
    before = _snapshot(out)
    with pytest.raises(RuntimeError), Staging(out) as site:
        site.write("a.txt", b"second")
        raise RuntimeError("renderer failed")
    assert _snapshot(out) == before
    assert _hidden_leftovers(tmp_path) == []


# -- refusals ------------------------------------------------------------------------------------
def _foreign_folder(tmp_path: Path) -> tuple[Path, dict[str, bytes]]:
    folder = tmp_path / "thesis"
    (folder / "chapters").mkdir(parents=True)
    (folder / "main.tex").write_bytes(b"\\documentclass{article}\n")
    (folder / "chapters" / "one.tex").write_bytes(b"Coupling of two spins.\n")
    return folder, _snapshot(folder)


def test_foreign_folder_is_refused_by_staging(tmp_path: Path) -> None:
    folder, before = _foreign_folder(tmp_path)
    with pytest.raises(OutputError) as info:
        Staging(folder)
    assert "\n" not in str(info.value) and "not empty" in str(info.value)
    assert _snapshot(folder) == before


def test_folder_with_a_foreign_manifest_is_refused(tmp_path: Path) -> None:
    folder = tmp_path / "other"
    folder.mkdir()
    (folder / MANIFEST).write_text('{"tool": "something else"}', encoding="utf-8")
    with pytest.raises(OutputError):
        check_target(folder)
    (folder / MANIFEST).write_text("[1, 2]", encoding="utf-8")  # valid JSON, not an object
    with pytest.raises(OutputError):
        check_target(folder)
    assert (folder / MANIFEST).read_text(encoding="utf-8") == "[1, 2]"


def test_foreign_folder_is_refused_by_the_cli(tmp_path: Path, capsys) -> None:
    folder, before = _foreign_folder(tmp_path)
    status = cli.main(["build", "--cg", "1/2", "--out", str(folder)])
    err = capsys.readouterr().err
    assert status == 2
    assert len(err.splitlines()) == 1 and "Traceback" not in err
    assert str(folder) in err and "refusing" in err
    assert _snapshot(folder) == before
    assert _hidden_leftovers(tmp_path) == []


def test_file_as_out_is_refused(tmp_path: Path, capsys) -> None:
    target = tmp_path / "notes.txt"
    target.write_bytes(b"keep me\n")
    with pytest.raises(OutputError, match="not a folder"):
        check_target(target)
    status = cli.main(["build", "--cg", "1/2", "--out", str(target)])
    err = capsys.readouterr().err
    assert status == 2 and len(err.splitlines()) == 1 and "not a folder" in err
    assert target.read_bytes() == b"keep me\n"
    assert _hidden_leftovers(tmp_path) == []


def test_missing_parent_is_refused(tmp_path: Path, capsys) -> None:
    status = cli.main(["build", "--cg", "1/2", "--out", str(tmp_path / "no" / "such" / "site")])
    err = capsys.readouterr().err
    assert status == 2 and len(err.splitlines()) == 1 and "parent" in err


# -- failures during a real build ------------------------------------------------------------------
def test_a_renderer_failing_midway_keeps_the_previous_site(tmp_path: Path, monkeypatch) -> None:
    from tablegen import build as build_module
    from tablegen.render import data as data_module

    out = tmp_path / "site"
    build_module.build(recipe_from_mapping(SMALL), out, jobs=1)
    before = _snapshot(out)
    real = data_module.render_data

    def failing(*args, **kwargs):
        for n, item in enumerate(real(*args, **kwargs)):
            if n == 3:
                raise RuntimeError("disk on fire")
            yield item

    monkeypatch.setattr(data_module, "render_data", failing)
    with pytest.raises(RuntimeError, match="disk on fire"):
        build_module.build(recipe_from_mapping(dict(SMALL, title="A different build")), out, jobs=1)
    assert _snapshot(out) == before
    assert _hidden_leftovers(tmp_path) == []


def test_replacing_a_built_site_with_another_recipe(tmp_path: Path) -> None:
    from tablegen.build import build

    out = tmp_path / "site"
    build(recipe_from_mapping({"cg": {"max_j": 1}, "6j": {"max_j": 1}}), out, jobs=1)
    assert (out / "data" / "cg-j1-1-j2-1.csv").is_file()
    build(recipe_from_mapping({"3j": {"max_j": "1/2"}}), out, jobs=1)
    files = _snapshot(out)
    assert "data/3j-j1-0.5-j2-0.5.csv" in files
    assert not any(p.startswith(("data/cg-", "data/6j-", "cg/", "6j/")) for p in files)
    assert json.loads(files[MANIFEST])["recipe"]["3j"] == {"max_j": "1/2"}
    assert _hidden_leftovers(tmp_path) == []


def _has_files(folder: Path) -> bool:
    try:
        return any(p.is_file() for p in folder.rglob("*"))
    except OSError:  # the folder went away while we looked
        return False


def _build_process(out: Path, *extra: str) -> subprocess.Popen:
    env = dict(os.environ, PYTHONPATH=os.pathsep.join(filter(None, [str(REPO), os.environ.get("PYTHONPATH")])))
    return subprocess.Popen(
        [sys.executable, "-m", "tablegen", "build", "--out", str(out), "--jobs", "1", "--quiet", *extra],
        env=env, cwd=out.parent, stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True,
    )


@pytest.mark.slow
@pytest.mark.parametrize("moment", ["computing", "writing"])
def test_sigterm_keeps_the_previous_site(tmp_path: Path, moment: str) -> None:
    out = tmp_path / "site"
    first = _build_process(out, "--cg", "1/2", "--6j", "1/2")
    _, first_err = first.communicate(timeout=120)
    assert first.returncode == 0, first_err
    before = _snapshot(out)
    # a medium recipe: long enough to be caught computing or writing on most machines
    proc = _build_process(out, "--cg", "3", "--3j", "3", "--6j", "3", "--9j", "3/2")
    staging_prefix = ".site.tablegen-staging-"
    deadline = time.monotonic() + 60
    if moment == "writing":  # wait until files are being written into the staging folder
        while proc.poll() is None and time.monotonic() < deadline:
            staging = [p for p in tmp_path.iterdir() if p.name.startswith(staging_prefix)]
            if staging and _has_files(staging[0]):
                break
            time.sleep(0.002)
    else:
        time.sleep(0.3)
    signalled = proc.poll() is None
    if signalled:
        proc.send_signal(signal.SIGTERM)
    _, err = proc.communicate(timeout=120)
    status = proc.returncode
    assert "Traceback" not in err, err
    assert _hidden_leftovers(tmp_path) == [], _hidden_leftovers(tmp_path)
    if status == 0:
        # the build finished first: the new site must then be complete and valid
        from tablegen.verify import verify_site

        report = verify_site(str(out))
        assert report.ok, report.problems[:5]
        assert json.loads((out / MANIFEST).read_text(encoding="utf-8"))["recipe"]["9j"] == {"max_j": "3/2"}
    else:
        assert signalled
        if status == -signal.SIGTERM:
            # killed before the command line installed its handler (still importing):
            # nothing can have been written yet
            assert moment == "computing" and err == "", err
        else:
            assert status == 130 and "interrupted" in err and len(err.splitlines()) == 1, (status, err)
        assert _snapshot(out) == before


# -- an interrupt at the worst moments, simulated deterministically --------------------------------
def test_interrupt_between_the_two_renames_keeps_the_previous_site(tmp_path: Path, monkeypatch) -> None:
    import tablegen.output as output_module

    out = tmp_path / "site"
    _write_site(out, {"a.txt": b"first"})
    before = _snapshot(out)
    real_rename = os.rename
    calls = []

    def rename(src, dst):
        calls.append((src, dst))
        if len(calls) == 2:  # the old site is aside, the new one not yet in place
            raise KeyboardInterrupt
        return real_rename(src, dst)

    monkeypatch.setattr(output_module.os, "rename", rename)
    with pytest.raises(KeyboardInterrupt):
        _write_site(out, {"a.txt": b"second"})
    monkeypatch.undo()
    assert _snapshot(out) == before
    assert _hidden_leftovers(tmp_path) == []


def test_interrupt_right_after_the_staging_folder_is_made(tmp_path: Path, monkeypatch) -> None:
    out = tmp_path / "site"
    _write_site(out, {"a.txt": b"first"})
    before = _snapshot(out)
    real_mkdir = Path.mkdir

    def mkdir(self, *args, **kwargs):
        real_mkdir(self, *args, **kwargs)
        if ".tablegen-staging-" in self.name:
            raise KeyboardInterrupt

    monkeypatch.setattr(Path, "mkdir", mkdir)
    with pytest.raises(KeyboardInterrupt):
        _write_site(out, {"a.txt": b"second"})
    monkeypatch.undo()
    assert _snapshot(out) == before
    assert _hidden_leftovers(tmp_path) == []

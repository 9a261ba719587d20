"""Fault injection: concurrent builds, forged manifests, user files, odd --out targets, signals.

Real subprocesses and real signals wherever that is cheap; every loop is
bounded in count and time; signals go only to processes started here.
"""

from __future__ import annotations

import json
import os
import signal
import subprocess
import sys
import time
from pathlib import Path

import pytest

from tablegen import cli

REPO = Path(__file__).resolve().parent.parent
SMALL = ["--cg", "1", "--6j", "1", "--3j", "none", "--9j", "none"]


def _env() -> dict:
    return dict(os.environ, PYTHONPATH=os.pathsep.join(filter(None, [str(REPO), os.environ.get("PYTHONPATH")])))


def _snapshot(root: Path) -> dict[str, bytes]:
    return {p.relative_to(root).as_posix(): p.read_bytes() for p in sorted(root.rglob("*")) if p.is_file()}


def _hidden(parent: Path) -> list[str]:
    return sorted(p.name for p in parent.iterdir() if p.name.startswith("."))


def _cli(capsys, *argv: str) -> tuple[int, list[str]]:
    status = cli.main(list(argv))
    return status, capsys.readouterr().err.splitlines()


def _popen(out: Path, *extra: str, cwd: Path | None = None) -> subprocess.Popen:
    return subprocess.Popen(
        [sys.executable, "-m", "tablegen", "build", "--out", str(out), "--quiet", *extra],
        env=_env(), cwd=cwd or out.parent, stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True,
        start_new_session=True,
    )


# -- concurrent builds ---------------------------------------------------------------------------
@pytest.mark.slow
def test_two_builds_into_one_folder_never_install_a_broken_site(tmp_path: Path) -> None:
    from tablegen.verify import verify_site

    out = tmp_path / "site"
    first = _popen(out, "--cg", "3", "--6j", "2", "--jobs", "1")
    deadline = time.monotonic() + 60
    while not (tmp_path / ".site.tablegen-lock").exists() and time.monotonic() < deadline and first.poll() is None:
        time.sleep(0.01)
    second = _popen(out, *SMALL, "--jobs", "1")
    _, err2 = second.communicate(timeout=120)
    _, err1 = first.communicate(timeout=120)
    assert first.returncode == 0, err1
    if second.returncode != 0:  # refused while the first held the lock
        assert second.returncode == 2 and len(err2.splitlines()) == 1 and "another tablegen build" in err2, err2
    assert "Traceback" not in err1 + err2
    report = verify_site(str(out))
    assert report.ok, report.problems[:5]
    assert _hidden(tmp_path) == []


def test_lock_held_refuses_a_second_build(tmp_path: Path, capsys) -> None:
    out = tmp_path / "site"
    assert _cli(capsys, "build", "--out", str(out), *SMALL, "--quiet")[0] == 0
    before = _snapshot(out)
    stale = tmp_path / ".site.tablegen-staging-12345"
    stale.mkdir()
    # another process holds the lock: a child started here, holding it until told to stop
    holder = subprocess.Popen(
        [sys.executable, "-c",
         "import fcntl,os,sys; fd=os.open(sys.argv[1], os.O_RDWR|os.O_CREAT); fcntl.flock(fd, fcntl.LOCK_EX);"
         "print('held', flush=True); sys.stdin.read()", str(tmp_path / ".site.tablegen-lock")],
        stdin=subprocess.PIPE, stdout=subprocess.PIPE, text=True,
    )
    try:
        assert holder.stdout.readline().strip() == "held"
        status, err = _cli(capsys, "build", "--out", str(out), "--cg", "1/2", "--quiet")
        assert status == 2 and len(err) == 1 and "another tablegen build" in err[0], err
        assert stale.is_dir()  # its owner may be alive: not removed
        assert _snapshot(out) == before
    finally:
        holder.communicate("", timeout=30)
    # the holder is gone: its lock is free, so its staging folder is provably abandoned
    assert _cli(capsys, "build", "--out", str(out), "--cg", "1/2", "--quiet")[0] == 0
    assert _hidden(tmp_path) == []


# -- forged manifests and user files ---------------------------------------------------------------
def test_forged_manifest_does_not_make_a_site(tmp_path: Path, capsys) -> None:
    proj = tmp_path / "proj"
    proj.mkdir()
    (proj / "results.csv").write_bytes(b"data\n")
    (proj / "manifest.json").write_text('{"tool": "tablegen"}', encoding="utf-8")
    before = _snapshot(proj)
    for extra in ([], ["--discard-extra"]):
        status, err = _cli(capsys, "build", "--out", str(proj), "--cg", "1/2", "--quiet", *extra)
        assert status == 2 and len(err) == 1 and "not a tablegen site" in err[0], err
        assert _snapshot(proj) == before
    assert _hidden(tmp_path) == []


def test_a_user_file_in_a_site_is_never_deleted_silently(tmp_path: Path, capsys) -> None:
    out = tmp_path / "site"
    assert _cli(capsys, "build", "--out", str(out), *SMALL, "--quiet")[0] == 0
    (out / "booklet.pdf").write_bytes(b"%PDF-1.5 compiled by the user\n")
    (out / "data" / "notes.txt").write_bytes(b"my notes\n")
    before = _snapshot(out)
    status, err = _cli(capsys, "build", "--out", str(out), "--cg", "1/2", "--quiet")
    assert status == 2 and len(err) == 1 and "'booklet.pdf'" in err[0] and "--discard-extra" in err[0], err
    assert _snapshot(out) == before
    (out / "booklet.pdf").unlink()
    status, err = _cli(capsys, "build", "--out", str(out), "--cg", "1/2", "--quiet")
    assert status == 2 and "'data/notes.txt'" in err[0], err
    # an empty folder the user made is foreign, too
    (out / "data" / "notes.txt").unlink()
    (out / "drafts").mkdir()
    status, err = _cli(capsys, "build", "--out", str(out), "--cg", "1/2", "--quiet")
    assert status == 2 and "'drafts/'" in err[0], err
    # insisting replaces the whole folder
    assert _cli(capsys, "build", "--out", str(out), "--cg", "1/2", "--quiet", "--discard-extra")[0] == 0
    assert not (out / "drafts").exists() and json.loads((out / "manifest.json").read_text())["recipe"]["cg"]
    assert _hidden(tmp_path) == []


# -- odd --out targets ---------------------------------------------------------------------------
def test_symlinked_out_builds_into_the_link_target(tmp_path: Path, capsys) -> None:
    real = tmp_path / "real-site"
    link = tmp_path / "site"
    link.symlink_to(real.name)
    assert _cli(capsys, "build", "--out", str(link), *SMALL, "--quiet")[0] == 2  # dangling: one line
    real.mkdir()
    assert _cli(capsys, "build", "--out", str(link), *SMALL, "--quiet")[0] == 0
    assert link.is_symlink() and (real / "manifest.json").is_file()
    assert _cli(capsys, "build", "--out", str(link), "--cg", "1/2", "--quiet")[0] == 0
    assert link.is_symlink() and json.loads((real / "manifest.json").read_text())["recipe"]["cg"] == {"max_j": "1/2"}
    assert _hidden(tmp_path) == []


def test_out_inside_a_site_or_around_the_current_folder_is_refused(tmp_path: Path, capsys, monkeypatch) -> None:
    out = tmp_path / "site"
    assert _cli(capsys, "build", "--out", str(out), *SMALL, "--quiet")[0] == 0
    before = _snapshot(out)
    status, err = _cli(capsys, "build", "--out", str(out / "data" / "inner"), "--cg", "1/2")
    assert status == 2 and len(err) == 1 and "inside the tablegen site" in err[0], err
    monkeypatch.chdir(out / "data")
    for target in ("..", str(out)):
        status, err = _cli(capsys, "build", "--out", target, "--cg", "1/2")
        assert status == 2 and len(err) == 1 and "current folder" in err[0], err
    assert _snapshot(out) == before


@pytest.mark.parametrize("target", ["/proc/x"])
def test_unwritable_places_are_one_line(tmp_path: Path, target: str) -> None:
    done = subprocess.run(
        [sys.executable, "-m", "tablegen", "build", "--out", target, "--cg", "1/2", "--quiet"],
        env=_env(), cwd=tmp_path, capture_output=True, text=True, timeout=120,
    )
    assert done.returncode == 2 and done.stderr.count("\n") == 1 and "Traceback" not in done.stderr, done.stderr


# -- signals -------------------------------------------------------------------------------------
def test_sigterm_handler_is_restored_after_a_build(tmp_path: Path, capsys) -> None:
    before = signal.getsignal(signal.SIGTERM)
    assert _cli(capsys, "build", "--out", str(tmp_path / "site"), "--cg", "1/2", "--quiet")[0] == 0
    assert signal.getsignal(signal.SIGTERM) == before
    assert _cli(capsys, "build", "--out", str(tmp_path / "site"), "--cg", "x")[0] == 2
    assert signal.getsignal(signal.SIGTERM) == before


@pytest.mark.slow
def test_sigkill_keeps_the_old_site_and_the_next_build_cleans_up(tmp_path: Path, capsys) -> None:
    out = tmp_path / "site"
    assert _cli(capsys, "build", "--out", str(out), "--cg", "1/2", "--quiet")[0] == 0
    before = _snapshot(out)
    for delay in (0.4, 0.8, 1.2):  # bounded: three tries
        proc = _popen(out, "--cg", "3", "--3j", "2", "--jobs", "1")
        time.sleep(delay)
        if proc.poll() is None:
            proc.kill()
        proc.communicate(timeout=60)
        if proc.returncode == 0:
            before = _snapshot(out)
        else:
            # killed before the swap: the old site, untouched; killed after it: the new site, complete
            now = _snapshot(out)
            if now != before:
                from tablegen.verify import verify_site

                assert verify_site(str(out)).ok
                before = now
    assert _cli(capsys, "build", "--out", str(out), "--cg", "1/2", "--quiet")[0] == 0
    assert _hidden(tmp_path) == []

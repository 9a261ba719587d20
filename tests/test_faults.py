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
    # the first holds the lock from before it computes: the second is refused at once
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
    before = [signal.getsignal(s) for s in (signal.SIGINT, signal.SIGTERM)]
    mask = signal.pthread_sigmask(signal.SIG_BLOCK, [])
    assert _cli(capsys, "build", "--out", str(tmp_path / "site"), "--cg", "1/2", "--quiet")[0] == 0
    assert [signal.getsignal(s) for s in (signal.SIGINT, signal.SIGTERM)] == before
    assert _cli(capsys, "build", "--out", str(tmp_path / "site"), "--cg", "x")[0] == 2
    assert [signal.getsignal(s) for s in (signal.SIGINT, signal.SIGTERM)] == before
    assert signal.pthread_sigmask(signal.SIG_BLOCK, []) == mask  # nothing left blocked for a caller


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


# -- a second build is refused at once, before it computes anything ------------------------------------
def test_a_locked_target_is_refused_before_computing(tmp_path: Path, capsys, monkeypatch) -> None:
    import fcntl

    import tablegen.build as build_module

    out = tmp_path / "site"
    fd = os.open(tmp_path / ".site.tablegen-lock", os.O_RDWR | os.O_CREAT)
    try:
        fcntl.flock(fd, fcntl.LOCK_EX)  # held by this test: the build under test must not wait for it

        def must_not_run(*args, **kwargs):
            raise AssertionError("computed although the target is locked")

        monkeypatch.setattr(build_module, "compute_values", must_not_run)
        status, err = _cli(capsys, "build", "--out", str(out), "--cg", "1/2", "--quiet")
        assert status == 2 and len(err) == 1 and "another tablegen build" in err[0], err
    finally:
        os.close(fd)
    assert not out.exists()


# -- read-only sites, unreadable files: as another user (root ignores permissions) -------------------
def _nobody_python() -> list[str] | None:
    """An interpreter the unprivileged user 65534 can run with tablegen importable, or None."""
    import shutil
    import sysconfig

    if os.geteuid() != 0 or shutil.which("setpriv") is None:
        return None
    paths = os.pathsep.join([str(REPO), sysconfig.get_paths()["purelib"], sysconfig.get_paths()["platlib"]])
    for exe in dict.fromkeys([sys.executable, shutil.which("python3") or "", "/usr/bin/python3"]):
        cmd = ["setpriv", "--reuid=65534", "--regid=65534", "--clear-groups", "env", f"PYTHONPATH={paths}",
               "HOME=/tmp", exe]
        try:
            ok = subprocess.run(cmd + ["-c", "import jinja2, tablegen.build"], capture_output=True, timeout=60)
        except (OSError, subprocess.TimeoutExpired):
            continue
        if ok.returncode == 0:
            return cmd
    return None


NOBODY = _nobody_python()
needs_nobody = pytest.mark.skipif(NOBODY is None, reason="needs root, setpriv and a Python user 65534 can run")


@pytest.fixture()
def open_tmp():
    """A folder user 65534 can reach (pytest's own tmp_path is private to root)."""
    import shutil
    import tempfile

    folder = Path(tempfile.mkdtemp(prefix="tablegen-faults-"))
    folder.chmod(0o777)
    yield folder
    shutil.rmtree(folder, ignore_errors=True)


def _as_nobody(*argv: str, cwd: Path) -> subprocess.CompletedProcess:
    return subprocess.run([*NOBODY, "-m", "tablegen", *argv], cwd=cwd, capture_output=True, text=True, timeout=180)


@needs_nobody
def test_a_read_only_old_site_leaves_no_copy_behind(open_tmp: Path) -> None:
    open_tmp.chmod(0o777)
    assert _as_nobody("build", "--out", "site", *SMALL, "--quiet", cwd=open_tmp).returncode == 0
    for p in [open_tmp / "site", *(open_tmp / "site").rglob("*")]:
        p.chmod(p.stat().st_mode & ~0o222)  # the whole old site read-only, as its owner might make it
    done = _as_nobody("build", "--out", "site", "--cg", "1/2", "--quiet", cwd=open_tmp)
    assert done.returncode == 0, done.stderr
    assert _hidden(open_tmp) == []
    assert json.loads((open_tmp / "site" / "manifest.json").read_text())["recipe"]["cg"] == {"max_j": "1/2"}


@needs_nobody
def test_an_old_site_this_user_cannot_empty_is_refused_before_computing(open_tmp: Path, capsys) -> None:
    open_tmp.chmod(0o777)
    out = open_tmp / "site"
    assert _cli(capsys, "build", "--out", str(out), *SMALL, "--quiet")[0] == 0  # made by root
    out.chmod(0o777)  # the user may rename the site, but not empty root's subfolders
    before = _snapshot(out)
    done = _as_nobody("build", "--out", "site", "--cg", "1/2", "--quiet", cwd=open_tmp)
    assert done.returncode == 2 and done.stderr.count("\n") == 1 and "read-only folder" in done.stderr, done.stderr
    assert _snapshot(out) == before and _hidden(open_tmp) == []


@needs_nobody
@pytest.mark.parametrize("what", ["SHA256SUMS", "data/cg-j1-1-j2-1.csv", "manifest.json", "recipe.toml", "data", "."])
def test_verify_of_an_unreadable_site_is_one_line(open_tmp: Path, capsys, what: str) -> None:
    out = open_tmp / "site"
    assert _cli(capsys, "build", "--out", str(out), *SMALL, "--quiet")[0] == 0
    (out / what).chmod(0o700 if (out / what).is_dir() else 0o600)
    done = _as_nobody("verify", str(out), cwd=open_tmp)
    assert done.returncode == 2, (done.stdout, done.stderr)
    assert done.stderr.count("\n") == 1 and "Traceback" not in done.stderr and "cannot be read" in done.stderr, done.stderr


# -- a full disk ---------------------------------------------------------------------------------------
def test_too_little_free_disk_is_refused_before_computing(tmp_path: Path, capsys, monkeypatch) -> None:
    import tablegen.build as build_module
    import tablegen.output as output_module

    real = os.statvfs

    class Tiny:
        def __init__(self, st) -> None:
            self.f_frsize, self.f_bavail = st.f_frsize, 1

    monkeypatch.setattr(output_module.os, "statvfs", lambda p: Tiny(real(p)))
    monkeypatch.setattr(build_module, "compute_values", lambda *a, **k: pytest.fail("computed"))
    status, err = _cli(capsys, "build", "--out", str(tmp_path / "site"), *SMALL, "--quiet")
    assert status == 2 and len(err) == 1 and "MB free" in err[0], err
    assert list(tmp_path.iterdir()) == []


@pytest.mark.skipif(os.geteuid() != 0, reason="mounting a small tmpfs needs root")
def test_a_disk_that_fills_up_during_the_build_is_one_line(tmp_path: Path) -> None:
    disk = tmp_path / "disk"
    disk.mkdir()
    if subprocess.run(["mount", "-t", "tmpfs", "-o", "size=6m", "tmpfs", str(disk)], capture_output=True).returncode:
        pytest.skip("cannot mount a tmpfs here")
    try:
        out = disk / "site"
        first = _popen(out, *SMALL, cwd=disk)
        assert first.communicate(timeout=120)[0] is not None and first.returncode == 0
        before = _snapshot(out)
        # about 6 MB of files, but an estimate small enough to pass the free-disk check
        proc = _popen(out, "--cg", "4", "--6j", "4", "--3j", "3", "--9j", "1", "--jobs", "1", cwd=disk)
        _, err = proc.communicate(timeout=300)
        assert proc.returncode == 2, err
        assert err.count("\n") == 1 and "disk is full" in err and "Traceback" not in err, err
        assert _snapshot(out) == before and _hidden(disk) == []
    finally:
        subprocess.run(["umount", str(disk)], capture_output=True)


# -- text that cannot be written, found before computing ----------------------------------------------
def test_a_title_with_a_stray_byte_is_refused_before_computing(tmp_path: Path, capsys, monkeypatch) -> None:
    import tablegen.build as build_module

    monkeypatch.setattr(build_module, "compute_values", lambda *a, **k: pytest.fail("computed"))
    status, err = _cli(capsys, "build", "--out", str(tmp_path / "site"), "--cg", "1/2", "--title", "T\udcff")
    assert status == 2 and len(err) == 1 and "title" in err[0] and "UTF-8" in err[0], err
    assert list(tmp_path.iterdir()) == []


# -- --jobs ----------------------------------------------------------------------------------------------
def test_jobs_are_capped_at_chunks_and_cpus_and_checked_by_the_library(tmp_path: Path) -> None:
    from tablegen.build import build
    from tablegen.compute import CHUNK, usable_cpus, worker_count
    from tablegen.errors import RecipeError
    from tablegen.recipe import recipe_from_mapping

    assert worker_count(400, 10) == 1  # one chunk: one process
    assert worker_count(400, 100 * CHUNK) == usable_cpus()
    assert worker_count(None, 5) == 1
    for bad in (0, -3, True, 1.5):
        with pytest.raises(RecipeError, match="--jobs"):
            worker_count(bad, 10)
    with pytest.raises(RecipeError, match="--jobs"):
        build(recipe_from_mapping({"cg": {"max_j": "1/2"}}), tmp_path / "site", jobs=0)
    assert not (tmp_path / "site").exists()


# -- signals: the whole process group, double signals, a signal during the swap --------------------------
MEDIUM = ["--cg", "4", "--6j", "4", "--3j", "3", "--9j", "1", "--jobs", "2"]


@pytest.mark.slow
def test_sigterm_to_the_whole_process_group_ends_the_build_quickly(tmp_path: Path, capsys) -> None:
    import random

    from tablegen.verify import verify_site

    out = tmp_path / "site"
    assert _cli(capsys, "build", "--out", str(out), *SMALL, "--quiet")[0] == 0
    before = _snapshot(out)
    rng = random.Random(7)
    for _ in range(6):  # bounded: six tries, each at most 20 s
        proc = _popen(out, *MEDIUM)  # its own session: the group holds only this build and its workers
        time.sleep(rng.uniform(0.3, 2.5))
        if proc.poll() is None:
            os.killpg(proc.pid, signal.SIGTERM)
        started = time.monotonic()
        _, err = proc.communicate(timeout=20)
        assert time.monotonic() - started < 10, "the build did not end within 10 s of SIGTERM"
        assert "Traceback" not in err, err
        assert _hidden(tmp_path) == [], _hidden(tmp_path)
        if proc.returncode == 0:  # it finished first: the new site, complete
            assert verify_site(str(out)).ok
            before = _snapshot(out)
        else:
            assert proc.returncode in (130, -signal.SIGTERM), (proc.returncode, err)
            assert _snapshot(out) == before
            assert err == "" or err.strip() == "tablegen: error: interrupted", err


@pytest.mark.slow
def test_a_second_ctrl_c_during_clean_up_leaves_nothing_and_prints_no_traceback(tmp_path: Path, capsys) -> None:
    out = tmp_path / "site"
    assert _cli(capsys, "build", "--out", str(out), *SMALL, "--quiet")[0] == 0
    before = _snapshot(out)
    for delay, gap in ((1.0, 0.0), (1.5, 0.02), (2.0, 0.1)):  # bounded: three tries
        proc = _popen(out, *MEDIUM)
        time.sleep(delay)
        if proc.poll() is None:
            os.killpg(proc.pid, signal.SIGINT)  # as a terminal sends Ctrl-C: to the whole group
            time.sleep(gap)
            if proc.poll() is None:
                os.killpg(proc.pid, signal.SIGINT)
        _, err = proc.communicate(timeout=30)
        assert "Traceback" not in err and "KeyboardInterrupt" not in err, err
        assert _hidden(tmp_path) == [], _hidden(tmp_path)
        if proc.returncode == 0:
            before = _snapshot(out)
        else:
            # 130, or killed by the second SIGINT once Python had already restored its default
            # action while exiting (after the clean-up and the message): both end the build truly
            assert proc.returncode in (130, -signal.SIGINT), (proc.returncode, err)
            assert err.strip() == "tablegen: error: interrupted", err
            assert _snapshot(out) == before


@pytest.mark.parametrize("other_thread", [False, True], ids=["main-thread-only", "with-another-thread"])
def test_sigterm_during_the_swap_reports_the_true_outcome(tmp_path: Path, capsys, monkeypatch, other_thread) -> None:
    # with another thread alive, the kernel hands it the signal the main thread blocks; the
    # handler still runs in the main thread, so blocking alone does not defer it
    import threading

    import tablegen.output as output_module
    from tablegen.verify import verify_site

    stop = threading.Event()
    if other_thread:
        threading.Thread(target=stop.wait, args=(60,), daemon=True).start()
    out = tmp_path / "site"
    assert _cli(capsys, "build", "--out", str(out), *SMALL, "--quiet")[0] == 0
    real_rename = os.rename

    def rename(src, dst):
        os.kill(os.getpid(), signal.SIGTERM)  # to this process only; held until the swap is done
        return real_rename(src, dst)

    monkeypatch.setattr(output_module.os, "rename", rename)
    try:
        status = cli.main(["build", "--out", str(out), "--cg", "1/2"])
    finally:
        stop.set()
    captured = capsys.readouterr()
    monkeypatch.undo()
    assert status == 0 and "interrupted" not in captured.err, captured
    assert captured.out.startswith("tablegen: wrote ")
    assert json.loads((out / "manifest.json").read_text())["recipe"]["cg"] == {"max_j": "1/2"}
    assert verify_site(str(out)).ok and _hidden(tmp_path) == []


def test_an_interrupt_during_clean_up_is_not_a_second_outcome(tmp_path: Path, capsys, monkeypatch) -> None:
    import tablegen.output as output_module

    out = tmp_path / "site"
    assert _cli(capsys, "build", "--out", str(out), *SMALL, "--quiet")[0] == 0
    before = _snapshot(out)
    real_remove = output_module._remove_tree
    import tablegen.build as build_module

    def interrupted(*args, **kwargs):
        raise KeyboardInterrupt  # the first Ctrl-C, while computing

    def remove_with_second_signal(path):
        os.kill(os.getpid(), signal.SIGINT)  # the second Ctrl-C, during the clean-up
        return real_remove(path)

    monkeypatch.setattr(build_module, "compute_values", interrupted)
    monkeypatch.setattr(output_module, "_remove_tree", remove_with_second_signal)
    status, err = _cli(capsys, "build", "--out", str(out), "--cg", "1/2")
    monkeypatch.undo()
    assert status == 130 and err == ["tablegen: error: interrupted"], err
    assert _snapshot(out) == before and _hidden(tmp_path) == []


def test_an_old_copy_that_cannot_be_removed_is_reported_truly(tmp_path: Path, capsys, monkeypatch) -> None:
    import tablegen.output as output_module

    out = tmp_path / "site"
    assert _cli(capsys, "build", "--out", str(out), *SMALL, "--quiet")[0] == 0
    real_remove = output_module._remove_tree
    monkeypatch.setattr(output_module, "_remove_tree", lambda p: None if ".tablegen-old-" in p.name else real_remove(p))
    status, err = _cli(capsys, "build", "--out", str(out), "--cg", "1/2", "--quiet")
    monkeypatch.undo()
    assert status == 2 and len(err) == 1 and "new site is installed" in err[0] and ".site.tablegen-old-" in err[0], err
    assert json.loads((out / "manifest.json").read_text())["recipe"]["cg"] == {"max_j": "1/2"}


def test_a_file_added_to_the_site_during_the_build_is_kept(tmp_path: Path, capsys, monkeypatch) -> None:
    import tablegen.build as build_module

    out = tmp_path / "site"
    assert _cli(capsys, "build", "--out", str(out), *SMALL, "--quiet")[0] == 0
    real_compute = build_module.compute_values

    def compute_while_the_user_writes(*args, **kwargs):
        (out / "notes.txt").write_bytes(b"written while the build computed\n")
        return real_compute(*args, **kwargs)

    monkeypatch.setattr(build_module, "compute_values", compute_while_the_user_writes)
    status, err = _cli(capsys, "build", "--out", str(out), "--cg", "1/2", "--quiet")
    monkeypatch.undo()
    assert status == 2 and len(err) == 1 and "'notes.txt'" in err[0], err
    assert (out / "notes.txt").read_bytes() == b"written while the build computed\n"
    assert _hidden(tmp_path) == []


def _session_processes(sid: int) -> dict[int, tuple[int, str]]:
    """pid -> (parent pid, command line) of the processes in session ``sid`` (those this test started)."""
    found = {}
    for entry in Path("/proc").iterdir():
        if not entry.name.isdigit():
            continue
        try:
            stat = (entry / "stat").read_text().rsplit(")", 1)[1].split()
            cmdline = (entry / "cmdline").read_bytes().replace(b"\0", b" ").decode(errors="replace")
        except OSError:
            continue
        if int(stat[3]) == sid and stat[0] != "Z":  # fields after the name: state, ppid, pgrp, session
            found[int(entry.name)] = (int(stat[1]), cmdline)
    return found


@pytest.mark.slow
@pytest.mark.skipif(not Path("/proc/self/stat").exists(), reason="needs /proc")
def test_a_worker_that_dies_alone_ends_the_build_with_one_line(tmp_path: Path, capsys) -> None:
    out = tmp_path / "site"
    assert _cli(capsys, "build", "--out", str(out), *SMALL, "--quiet")[0] == 0
    before = _snapshot(out)
    proc = _popen(out, *MEDIUM)
    deadline = time.monotonic() + 30
    victim = None
    while victim is None and proc.poll() is None and time.monotonic() < deadline:  # bounded in time
        procs = _session_processes(proc.pid)
        servers = {pid for pid, (_, cmd) in procs.items() if "forkserver" in cmd}
        workers = [pid for pid, (ppid, _) in procs.items() if ppid in servers or (ppid == proc.pid and pid not in servers
                   and "resource_tracker" not in procs[pid][1] and "forkserver" not in procs[pid][1])]
        victim = workers[0] if workers else None
        time.sleep(0.05)
    if victim is None:
        proc.communicate(timeout=120)
        pytest.skip("the build ended before a worker could be found")
    os.kill(victim, signal.SIGKILL)  # a process of the build this test started
    _, err = proc.communicate(timeout=60)
    if proc.returncode == 0:
        pytest.skip("the worker had already finished its share")
    assert proc.returncode == 2, (proc.returncode, err)
    assert err.count("\n") == 1 and "worker process ended unexpectedly" in err and "Traceback" not in err, err
    assert _snapshot(out) == before and _hidden(tmp_path) == []

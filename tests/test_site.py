"""The committed site/ is exactly what the default recipe builds (byte for byte)."""

from __future__ import annotations

import os
import subprocess
import sys
from pathlib import Path

import pytest

from tablegen.build import build
from tablegen.recipe import DEFAULT_RECIPE
from tablegen.verify import verify_site

REPO = Path(__file__).resolve().parent.parent
COMMITTED = REPO / "site"


def _files(root: Path) -> dict[str, bytes]:
    return {p.relative_to(root).as_posix(): p.read_bytes() for p in sorted(root.rglob("*")) if p.is_file()}


@pytest.fixture(scope="module")
def rebuilt(tmp_path_factory) -> Path:
    out = tmp_path_factory.mktemp("rebuild") / "site"
    build(DEFAULT_RECIPE, out, jobs=1)
    return out


def test_committed_site_is_the_default_build(rebuilt: Path) -> None:
    assert COMMITTED.is_dir(), "site/ is missing: run `tablegen build` at the repository root and commit it"
    want, got = _files(COMMITTED), _files(rebuilt)
    assert sorted(want) == sorted(got), "file lists differ: rebuild site/ with `tablegen build`"
    changed = [path for path in want if want[path] != got[path]]
    assert not changed, f"{len(changed)} files differ from a fresh build, e.g. {changed[:5]}"


def test_committed_site_verifies() -> None:
    report = verify_site(str(COMMITTED))
    assert report.ok, report.problems[:10]
    assert report.values > 10_000


def test_committed_site_stays_small() -> None:
    # the issue asks for the default site to stay under about 15 MB
    total = sum(p.stat().st_size for p in COMMITTED.rglob("*") if p.is_file())
    assert total < 15_000_000, f"site/ is {total / 1e6:.1f} MB"


def test_build_ignores_hash_seed_and_jobs(tmp_path: Path, rebuilt: Path) -> None:
    # common practice, no source: output must not depend on PYTHONHASHSEED or parallelism
    out = tmp_path / "site"
    env = dict(os.environ, PYTHONHASHSEED="12345", PYTHONPATH=str(REPO))
    subprocess.run(
        [sys.executable, "-m", "tablegen", "build", "--out", str(out), "--jobs", "2", "--quiet"],
        check=True, env=env, cwd=tmp_path,
    )
    assert _files(out) == _files(rebuilt)

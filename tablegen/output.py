"""Writing a site safely: a staging folder, one write function, checksums, atomic swap.

Every output file goes through ``Staging.write``, which writes into a hidden
staging folder beside the target and records the file's SHA-256.  Only when
everything is written are SHA256SUMS and manifest.json added and the staging
folder swapped in for the target; an interrupted or failed build removes its
staging folder and leaves the previous site untouched.  A non-empty target
that is not a tablegen site is refused, never wiped.
"""

from __future__ import annotations

import hashlib
import json
import os
import shutil
import signal
import threading
from contextlib import contextmanager
from pathlib import Path, PurePosixPath

from .errors import OutputError

__all__ = ["Staging", "check_target", "is_tablegen_site", "MANIFEST", "SUMS", "MANIFEST_FORMAT", "sha256_hex"]

MANIFEST = "manifest.json"
SUMS = "SHA256SUMS"
MANIFEST_FORMAT = "tablegen-manifest/1"
_STAGING_TAG = ".tablegen-staging-"
_OLD_TAG = ".tablegen-old-"


def sha256_hex(data: bytes) -> str:
    return hashlib.sha256(data).hexdigest()


def is_tablegen_site(folder: Path) -> bool:
    """True if folder holds a manifest written by tablegen."""
    try:
        with open(folder / MANIFEST, encoding="utf-8") as fh:
            return json.load(fh).get("tool") == "tablegen"
    except (OSError, ValueError, AttributeError):
        return False


def check_target(out_dir: str | os.PathLike) -> Path:
    """The output folder as a Path, if tablegen may replace it."""
    target = Path(out_dir).absolute()
    if target.exists() and not target.is_dir():
        raise OutputError(target, "exists and is not a folder")
    if target.is_dir() and any(target.iterdir()) and not is_tablegen_site(target):
        raise OutputError(
            target, f"is not empty and holds no tablegen {MANIFEST}; refusing to replace it (choose another --out)"
        )
    parent = target.parent
    if not parent.is_dir():
        raise OutputError(parent, "does not exist (the parent of --out must exist)")
    if not os.access(parent, os.W_OK):
        raise OutputError(parent, "is not writable")
    return target


def _remove_leftovers(target: Path) -> None:
    """Staging or old folders left by a build that was killed outright."""
    parent = target.parent
    prefix = f".{target.name}"
    for p in parent.iterdir():
        if p.name.startswith(prefix + _STAGING_TAG) or p.name.startswith(prefix + _OLD_TAG):
            if p.is_dir() and not p.is_symlink():
                shutil.rmtree(p, ignore_errors=True)


class Staging:
    """Context manager: collect a site in a staging folder, then swap it in."""

    def __init__(self, out_dir: str | os.PathLike) -> None:
        self.target = check_target(out_dir)
        parent = self.target.parent
        self._dir = parent / f".{self.target.name}{_STAGING_TAG}{os.getpid()}"
        self.sums: dict[str, str] = {}
        self.sizes: dict[str, int] = {}

    def __enter__(self) -> "Staging":
        _remove_leftovers(self.target)
        try:
            with _signals_held():
                self._dir.mkdir()
        except BaseException:
            shutil.rmtree(self._dir, ignore_errors=True)
            raise
        return self

    def __exit__(self, exc_type, exc, tb) -> None:
        if exc_type is not None:
            shutil.rmtree(self._dir, ignore_errors=True)

    def write(self, path: str, data: bytes) -> None:
        """Write one file of the site (path relative to the site root, '/'-separated)."""
        rel = PurePosixPath(path)
        if rel.is_absolute() or ".." in rel.parts or not rel.parts or path in self.sums:
            raise ValueError(f"bad or repeated output path {path!r}")
        dest = self._dir.joinpath(*rel.parts)
        dest.parent.mkdir(parents=True, exist_ok=True)
        with open(dest, "wb") as fh:
            fh.write(data)
        self.sums[path] = sha256_hex(data)
        self.sizes[path] = len(data)

    def finish(self, manifest: dict) -> None:
        """Add manifest.json and SHA256SUMS, then replace the target folder."""
        body = dict(manifest)
        body["files"] = len(self.sums) + 1  # + the manifest itself; SHA256SUMS lists both
        body["bytes"] = sum(self.sizes.values())
        self.write(MANIFEST, (json.dumps(body, indent=1, ensure_ascii=False) + "\n").encode("utf-8"))
        lines = "".join(f"{digest}  {path}\n" for path, digest in sorted(self.sums.items()))
        with open(self._dir / SUMS, "wb") as fh:
            fh.write(lines.encode("utf-8"))
        self._swap()

    def _swap(self) -> None:
        target = self.target
        old = target.parent / f".{target.name}{_OLD_TAG}{os.getpid()}"
        # no interrupt may fall between the two renames: hold SIGINT/SIGTERM until both are done
        with _signals_held():
            if target.exists():
                # the target was checked to be empty or a tablegen site
                os.rename(target, old)
            try:
                os.rename(self._dir, target)
            except BaseException:
                if old.exists():
                    os.rename(old, target)  # put the previous site back
                raise
        shutil.rmtree(old, ignore_errors=True)


@contextmanager
def _signals_held():
    """Defer SIGINT and SIGTERM (where the platform allows) for a critical section."""
    held = {signal.SIGINT, signal.SIGTERM}
    can_block = hasattr(signal, "pthread_sigmask") and threading.current_thread() is threading.main_thread()
    if can_block:
        previous = signal.pthread_sigmask(signal.SIG_BLOCK, held)
    try:
        yield
    finally:
        if can_block:
            signal.pthread_sigmask(signal.SIG_SETMASK, previous)

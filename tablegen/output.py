"""Writing a site safely: a staging folder, one write function, checksums, atomic swap.

Every output file goes through ``Staging.write``, which writes into a hidden
staging folder beside the target and records the file's SHA-256.  Only when
everything is written are SHA256SUMS and manifest.json added and the staging
folder swapped in for the target; an interrupted or failed build removes its
staging folder and leaves the previous site untouched.  A non-empty target
that is not a tablegen site is refused, never wiped.
"""

from __future__ import annotations

import errno
import fcntl
import hashlib
import json
import os
import re
import shutil
import stat
from pathlib import Path, PurePosixPath

from .errors import OutputError
from .interrupts import drop_pending, signals_held

__all__ = [
    "Staging", "check_target", "is_tablegen_site", "seal", "MANIFEST", "SUMS", "MANIFEST_FORMAT", "sha256_hex",
]

MANIFEST = "manifest.json"
SUMS = "SHA256SUMS"
MANIFEST_FORMAT = "tablegen-manifest/1"
_STAGING_TAG = ".tablegen-staging-"
_OLD_TAG = ".tablegen-old-"
_LOCK_TAG = ".tablegen-lock"
#: errno values that mean the disk, not the program, failed a write
_WRITE_FAULTS = {errno.ENOSPC, errno.EDQUOT, errno.EROFS, errno.EIO, errno.EACCES, errno.EPERM, errno.EFBIG}


def sha256_hex(data: bytes) -> str:
    return hashlib.sha256(data).hexdigest()


def _listed_files(folder: Path) -> dict[str, str] | None:
    """SHA256SUMS of folder as {path: digest}, or None if it is missing or malformed."""
    try:
        text = (folder / SUMS).read_text(encoding="utf-8")
    except (OSError, ValueError):
        return None
    listed: dict[str, str] = {}
    for line in text.splitlines():
        digest, sep, path = line.partition("  ")
        if not sep or len(digest) != 64 or not path:
            return None
        listed[path] = digest
    return listed


def _site_listing(folder: Path) -> dict[str, str] | None:
    """The listing of a genuine tablegen site: SHA256SUMS and manifest.json agree."""
    listed = _listed_files(folder)
    if not listed or MANIFEST not in listed:
        return None
    try:
        data = (folder / MANIFEST).read_bytes()
        manifest = json.loads(data.decode("utf-8"))
    except (OSError, ValueError):
        return None
    if not isinstance(manifest, dict) or manifest.get("tool") != "tablegen":
        return None
    if sha256_hex(data) != listed[MANIFEST] or manifest.get("files") != len(listed):
        return None
    return listed


def _first_foreign(folder: Path, listed: dict[str, str]) -> str | None:
    """The first entry (sorted walk) that SHA256SUMS does not account for."""
    dirs = {str(PurePosixPath(p).parent) for p in listed}
    dirs |= {str(parent) for p in listed for parent in PurePosixPath(p).parents}
    for root, subdirs, files in os.walk(folder, onerror=_raise):
        subdirs.sort()
        rel_root = Path(root).relative_to(folder).as_posix()
        for name in sorted(files) + [d for d in subdirs if os.path.islink(os.path.join(root, d))]:
            rel = name if rel_root == "." else f"{rel_root}/{name}"
            if rel == SUMS or (rel in listed and not os.path.islink(os.path.join(root, name))):
                continue
            return rel
        for name in list(subdirs):
            rel = name if rel_root == "." else f"{rel_root}/{name}"
            if os.path.islink(os.path.join(root, name)):
                subdirs.remove(name)
            elif rel not in dirs:
                return rel + "/"
    return None


def _raise(exc: OSError) -> None:
    raise exc


def _first_unremovable(folder: Path) -> str | None:
    """A folder of the old site this user could not empty (read-only and not ours), or None.

    Checked before computing, so that replacing the site can never leave a
    half-removed copy of it behind.
    """
    me = os.geteuid()
    for root, subdirs, _ in os.walk(folder, onerror=_raise):
        subdirs[:] = sorted(d for d in subdirs if not os.path.islink(os.path.join(root, d)))
        if me != 0 and not os.access(root, os.W_OK | os.X_OK) and os.stat(root).st_uid != me:
            rel = Path(root).relative_to(folder).as_posix()
            return "." if rel == "." else rel + "/"
    return None


def _remove_tree(path: Path) -> None:
    """Remove a folder tablegen made or replaced, read-only subfolders included."""
    tried: set[str] = set()

    def _writable(folder: str) -> None:
        os.chmod(folder, stat.S_IMODE(os.lstat(folder).st_mode) | stat.S_IRWXU)

    def make_writable_and_retry(func, name, exc_info) -> None:
        if name in tried:
            return  # tried once already; the caller's check that the folder is gone reports it
        tried.add(name)
        try:
            if func in (os.unlink, os.rmdir):  # the folder holding ``name`` is read-only
                _writable(os.path.dirname(name))
                func(name)
            else:  # ``name`` itself cannot be listed or opened
                _writable(name)
                shutil.rmtree(name, onerror=make_writable_and_retry)
        except OSError:
            pass

    if path.is_dir() and not path.is_symlink():
        try:
            _writable(str(path))
        except OSError:
            pass
        shutil.rmtree(path, onerror=make_writable_and_retry)


def check_room(target: Path, need: int) -> None:
    """Refuse before computing if the target's disk lacks room for about ``need`` bytes."""
    try:
        st = os.statvfs(target.parent)
    except OSError:
        return  # unknowable here; a full disk is still caught while writing
    free = st.f_bavail * st.f_frsize
    if need > free:
        raise OutputError(
            target,
            f"its disk has {free / 1e6:.1f} MB free, but the new site needs about {need / 1e6:.1f} MB "
            "(the old site stays until the new one is complete); free some space or choose another --out",
        )


def is_tablegen_site(folder: Path) -> bool:
    """True if folder is a site tablegen wrote: SHA256SUMS and manifest agree, nothing unlisted."""
    listed = _site_listing(Path(folder))
    return listed is not None and _first_foreign(Path(folder), listed) is None


def resolve_target(out_dir: str | os.PathLike) -> Path:
    """The real folder --out names: symlinks followed, the current folder checked."""
    try:
        target = Path(out_dir).absolute()
    except OSError:
        raise OutputError(out_dir, "is relative, but the current folder no longer exists") from None
    if target.is_symlink():
        try:
            real = target.resolve(strict=True)
        except (OSError, RuntimeError):
            raise OutputError(target, "is a symbolic link to nothing (its target does not exist)") from None
        target = real
    else:
        target = Path(os.path.realpath(target))
    try:
        here = Path(os.getcwd()).resolve()
    except OSError:
        here = None
    if here is not None and (here == target or target in here.parents):
        raise OutputError(target, "contains the current folder; run the build from outside it")
    for parent in target.parents:
        if _site_listing(parent) is not None:
            raise OutputError(target, f"lies inside the tablegen site {str(parent)!r}; choose a folder outside it")
    return target


def check_target(out_dir: str | os.PathLike, discard_extra: bool = False) -> Path:
    """The output folder as a Path, if tablegen may replace it."""
    target = resolve_target(out_dir)
    if target.exists() and not target.is_dir():
        raise OutputError(target, "exists and is not a folder")
    try:
        if target.is_dir() and any(target.iterdir()):
            listed = _site_listing(target)
            if listed is None:
                raise OutputError(
                    target,
                    f"is not empty and is not a tablegen site (no {SUMS} and {MANIFEST} that agree); "
                    "refusing to replace it (choose another --out)",
                )
            foreign = _first_foreign(target, listed)
            if foreign is not None and not discard_extra:
                raise OutputError(
                    target,
                    f"holds {foreign!r}, which {SUMS} does not list; refusing to delete it "
                    "(move it away, or pass --discard-extra to replace the whole folder)",
                )
            locked = _first_unremovable(target)
            if locked is not None:
                raise OutputError(
                    target,
                    f"holds the read-only folder {locked!r} of another user, so the old site could not be "
                    "removed after the swap; make it writable or choose another --out",
                )
    except PermissionError as exc:
        raise OutputError(target, f"cannot be read ({exc.strerror})") from None
    parent = target.parent
    if not parent.is_dir():
        raise OutputError(parent, "does not exist (the parent of --out must exist)")
    if not os.access(parent, os.W_OK):
        raise OutputError(parent, "is not writable")
    return target


class _TargetLock:
    """An flock on '.<name>.tablegen-lock' beside the target, held until the swap is done.

    A second build of the same target is refused.  The lock file is removed
    while held; an opener that raced with the removal notices the inode changed
    and tries again.
    """

    def __init__(self, target: Path) -> None:
        self.path = target.parent / f".{target.name}{_LOCK_TAG}"
        self._fd: int | None = None

    def acquire(self, target: Path) -> None:
        for _ in range(100):
            fd = os.open(self.path, os.O_RDWR | os.O_CREAT, 0o644)
            try:
                fcntl.flock(fd, fcntl.LOCK_EX | fcntl.LOCK_NB)
            except BlockingIOError:
                os.close(fd)
                raise OutputError(
                    target, "another tablegen build is writing it; wait for that build to end, or choose another --out"
                ) from None
            try:
                same = os.stat(self.path).st_ino == os.fstat(fd).st_ino
            except FileNotFoundError:
                same = False
            if same:
                self._fd = fd
                return
            os.close(fd)
        raise OutputError(target, "its lock file keeps changing; try again")

    def release(self) -> None:
        if self._fd is None:
            return
        try:
            os.unlink(self.path)
        except FileNotFoundError:
            pass
        os.close(self._fd)
        self._fd = None


def _remove_leftovers(target: Path) -> None:
    """Staging or old folders of builds that are provably gone (the caller holds the target's lock)."""
    parent = target.parent
    pattern = re.compile(re.escape(f".{target.name}") + r"\.tablegen-(staging|old)-\d+")
    for p in parent.iterdir():
        if pattern.fullmatch(p.name) and p.is_dir() and not p.is_symlink():
            _remove_tree(p)


def seal(manifest: dict, sums: dict[str, str], sizes: dict[str, int]) -> tuple[bytes, bytes]:
    """The bytes of manifest.json and SHA256SUMS for a site whose other files have these digests and sizes."""
    body = dict(manifest)
    body["files"] = len(sums) + 1  # + the manifest itself; SHA256SUMS lists both
    body["bytes"] = sum(sizes.values())
    manifest_bytes = (json.dumps(body, indent=1, ensure_ascii=False) + "\n").encode("utf-8")
    listing = dict(sums)
    listing[MANIFEST] = sha256_hex(manifest_bytes)
    lines = "".join(f"{digest}  {path}\n" for path, digest in sorted(listing.items()))
    return manifest_bytes, lines.encode("utf-8")


class Staging:
    """Context manager: lock the target, collect a site in a staging folder, then swap it in.

    The lock is taken on entering, before anything is computed, so a second
    build of the same target is refused at once rather than after its work.
    """

    def __init__(self, out_dir: str | os.PathLike, discard_extra: bool = False) -> None:
        self.target = check_target(out_dir, discard_extra)
        self._discard_extra = discard_extra
        self._lock = _TargetLock(self.target)
        self.installed = False
        parent = self.target.parent
        self._dir = parent / f".{self.target.name}{_STAGING_TAG}{os.getpid()}"
        self.sums: dict[str, str] = {}
        self.sizes: dict[str, int] = {}

    def __enter__(self) -> "Staging":
        try:
            with signals_held():
                self._lock.acquire(self.target)
                check_target(self.target, self._discard_extra)  # again, now that no other build can change it
                _remove_leftovers(self.target)
                self._dir.mkdir()
        except BaseException as exc:
            with signals_held():
                _remove_tree(self._dir)
                self._lock.release()
            if self._is_write_fault(exc):
                raise self._fault(exc) from None
            raise
        return self

    def __exit__(self, exc_type, exc, tb) -> None:
        with signals_held():  # a second Ctrl-C must not cut the clean-up short
            if exc_type is not None and not self.installed:
                _remove_tree(self._dir)
            self._lock.release()
            if exc_type is not None and issubclass(exc_type, KeyboardInterrupt):
                drop_pending()  # already stopping: a second Ctrl-C or SIGTERM changes nothing
        if self._is_write_fault(exc):
            raise self._fault(exc) from None

    def _is_write_fault(self, exc: BaseException | None) -> bool:
        if not isinstance(exc, OSError) or isinstance(exc, OutputError):
            return False
        name = str(getattr(exc, "filename", "") or "")
        return exc.errno in _WRITE_FAULTS or name.startswith(str(self._dir)) or name.startswith(str(self.target))

    def _fault(self, exc: OSError) -> OutputError:
        """A file-system failure while building, as one line about the target (not the staging path)."""
        reason = "its disk is full" if exc.errno == errno.ENOSPC else (exc.strerror or str(exc))
        kept = "the new site was installed" if self.installed else "the previous contents are untouched"
        return OutputError(self.target, f"cannot be written ({reason}); nothing was half-written, {kept}")

    def check_room(self, need: int) -> None:
        check_room(self.target, need)

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
        manifest_bytes, sums_bytes = seal(manifest, self.sums, self.sizes)
        self.write(MANIFEST, manifest_bytes)
        with open(self._dir / SUMS, "wb") as fh:
            fh.write(sums_bytes)
        check_target(self.target, self._discard_extra)  # a file the user added while we computed is not ours to delete
        self._swap()

    def _swap(self) -> None:
        target = self.target
        old = target.parent / f".{target.name}{_OLD_TAG}{os.getpid()}"
        # no interrupt may fall between the two renames: hold SIGINT/SIGTERM until both are done
        with signals_held():
            if target.exists():
                # the target was checked to be empty or a tablegen site
                os.rename(target, old)
            try:
                os.rename(self._dir, target)
            except BaseException:
                if old.exists():
                    os.rename(old, target)  # put the previous site back
                raise
            self.installed = True
            _remove_tree(old)
            # the new site is in place: a signal that came during the swap must not
            # make the outcome look like an interrupted build
            drop_pending()
        if old.exists():  # checked to be removable beforehand; say so if the disk disagreed
            raise OutputError(
                target, f"the new site is installed, but the previous one could not be removed from {str(old)!r}"
            )

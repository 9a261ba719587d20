"""Links between site paths, relative to the page that holds them."""

from __future__ import annotations

import posixpath
from functools import lru_cache

__all__ = ["relative_url"]


def relative_url(from_page: str, target: str) -> str:
    """The link from one site path to another ('cg/j1-1-j2-1.html' -> '../3j/j1-1-j2-1.html#...')."""
    path, hash_, anchor = target.partition("#")
    if not path:
        return f"#{anchor}"
    rel = _relative_path(posixpath.dirname(from_page) or ".", path)
    return f"{rel}#{anchor}" if hash_ else rel


@lru_cache(maxsize=8192)
def _relative_path(base: str, path: str) -> str:
    """posixpath.relpath, remembered: a page links to few distinct files, many times."""
    return posixpath.relpath(path, base)

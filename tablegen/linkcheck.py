"""The last step of a build: every internal link of every page resolves.

The plan knows every page and every id it promises (plan.internal_targets);
the renderers know every other file they write.  While the files stream past
on their way to the staging folder, :class:`LinkCheck` collects the links of
each HTML page (href and src, relative to the page, and the cell links a
table's data-twin pattern makes); ``finish`` then checks
each against that data and raises LinkError for the first one that points
nowhere, before the new site replaces the old.  External links (a scheme such
as https:) are left alone: the site is meant to work offline and has none.
"""

from __future__ import annotations

import posixpath
import re
from html import unescape
from urllib.parse import unquote

from .cellpattern import fill_cell_pattern
from .errors import LinkError
from .plan import internal_targets
from .sitemodel import SitePlan

__all__ = ["LinkCheck"]

_LINK = re.compile(rb'\s(?:href|src)="([^"]*)"')
_TWIN_TABLE = re.compile(rb'<table[^>]*\sdata-twin="([^"]*)"[^>]*>(.*?)</table>', re.S)
_CELL_ID = re.compile(rb'<td id="([^"]*)"')
_SCHEME = re.compile(r"^[a-z][a-z0-9+.-]*:", re.I)


class LinkCheck:
    """Collects the links of the pages written, then checks them against the plan and the file list."""

    def __init__(self, plan: SitePlan) -> None:
        self.targets = internal_targets(plan)
        self.files: set[str] = set()
        self.links: dict[tuple[str, str], str] = {}  # (resolved path, anchor) -> first page linking there
        self.count = 0

    def add(self, path: str, data: bytes) -> None:
        """Note a written file; collect its links if it is a page."""
        self.files.add(path)
        if not path.endswith(".html"):
            return
        base = posixpath.dirname(path)
        for href in self._hrefs(data):
            if _SCHEME.match(href):
                continue
            self.count += 1
            target, _, anchor = href.partition("#")
            resolved = posixpath.normpath(posixpath.join(base, unquote(target))) if target else path
            self.links.setdefault((resolved, unquote(anchor)), path)

    @staticmethod
    def _hrefs(data: bytes):
        """Every link of a page: those written out, and those its script writes into cells (data-twin)."""
        for m in _LINK.finditer(data):
            yield unescape(m.group(1).decode("utf-8"))
        for m in _TWIN_TABLE.finditer(data):
            pattern = unescape(m.group(1).decode("utf-8"))
            for cell in _CELL_ID.finditer(m.group(2)):
                href = fill_cell_pattern(pattern, unescape(cell.group(1).decode("utf-8")))
                if href is not None:
                    yield href

    def finish(self) -> int:
        """Raise LinkError for the first broken link; return how many links were checked."""
        for (target, anchor), page in sorted(self.links.items()):
            shown = f"{target}#{anchor}" if anchor else target
            if target not in self.files:
                raise LinkError(page, shown, "no such file in the site")
            if anchor and anchor not in self.targets.get(target, ()):
                raise LinkError(page, shown, "the plan has no such id on that page")
        return self.count

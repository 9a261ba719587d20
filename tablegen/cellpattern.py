"""Links a page script writes into every cell of a table, from one pattern per table.

A grid table of CG coefficients links each cell to the same number among the
3j symbols.  Written out, those links were 0.9 MB of the default site; the
table now carries one pattern (``data-twin``) such as
``../3j/j1-1-j2-1.html#j3=2,m3=@-M@,m1=@m1@`` and site.js fills it in from
each cell's id (name=value pairs).  ``@name@`` is the cell's value of that
name, ``@-name@`` its negative.  This module is the same rule in Python, for
the build's link check and the tests; it must agree with site.js ``twinHref``.
"""

from __future__ import annotations

import re

__all__ = ["fill_cell_pattern", "cell_values"]

_SLOT = re.compile(r"@(-?)([^@]+)@")


def cell_values(cell_id: str) -> dict[str, str]:
    """The name=value pairs of a cell id such as 'J=2,M=-1,m1=0'."""
    pairs = (p.split("=") for p in re.split(r"[,;]", cell_id))
    return {kv[0]: kv[1] for kv in pairs if len(kv) == 2}


def _negated(text: str) -> str:
    if text == "0":
        return text
    return text[1:] if text.startswith("-") else "-" + text


def fill_cell_pattern(pattern: str, cell_id: str) -> str | None:
    """The pattern with every slot filled from ``cell_id``; None when the id lacks a name."""
    values = cell_values(cell_id)
    missing = False

    def slot(m: re.Match) -> str:
        nonlocal missing
        if m.group(2) not in values:
            missing = True
            return ""
        v = values[m.group(2)]
        return _negated(v) if m.group(1) else v

    out = _SLOT.sub(slot, pattern)
    return None if missing else out

"""Plain-text names of symbols, shared by the command line and the data files.

One function per concern: ``half_text`` writes a doubled quantum number
("3/2"), ``symbol_text`` writes a whole symbol in the order physicists write
it.  No markup here: renderers build HTML, MathML and LaTeX themselves.
"""

from __future__ import annotations

from functools import lru_cache

from . import spins

#: spins.half_text, memoised: renderers call it for every quantum number they print
half_text = lru_cache(maxsize=8192)(spins.half_text)

__all__ = ["half_text", "symbol_text"]


def symbol_text(kind: str, t: tuple[int, ...]) -> str:
    """'<1 1; 1 -1 | 0 0>', '(1 1 0; 1 -1 0)', '{a b c; d e f}', 'W(a b c d; e f)', 9j in rows: the kind's notation."""
    from .kinds import kind as kind_record

    return kind_record(kind).text(t)

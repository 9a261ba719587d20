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
    """'<1 1; 1 -1 | 0 0>', '(1 1 0; 1 -1 0)', '{a b c; d e f}', 'W(a b c d; e f)', 9j in rows."""
    h = [half_text(x) for x in t]
    if kind == "cg":
        return f"<{h[0]} {h[1]}; {h[2]} {h[3]} | {h[4]} {h[5]}>"
    if kind == "3j":
        return f"({h[0]} {h[1]} {h[2]}; {h[3]} {h[4]} {h[5]})"
    if kind == "6j":
        return f"{{{h[0]} {h[1]} {h[2]}; {h[3]} {h[4]} {h[5]}}}"
    if kind == "w":
        return f"W({h[0]} {h[1]} {h[2]} {h[3]}; {h[4]} {h[5]})"
    if kind == "9j":
        return f"{{{h[0]} {h[1]} {h[2]}; {h[3]} {h[4]} {h[5]}; {h[6]} {h[7]} {h[8]}}}"
    raise ValueError(f"argument kind = {kind!r}: must be one of cg, 3j, 6j, w, 9j")

"""Escaping plain text for LaTeX (and BibTeX, which hands its fields to LaTeX).

Kept apart from the Jinja environment so that build facts such as the
BibTeX entry can use it without importing a template engine.
"""

from __future__ import annotations

__all__ = ["tex_escape"]

_TEX_SPECIALS = {
    "\\": r"\textbackslash{}",
    "{": r"\{",
    "}": r"\}",
    "#": r"\#",
    "$": r"\$",
    "%": r"\%",
    "&": r"\&",
    "_": r"\_",
    "^": r"\textasciicircum{}",
    "~": r"\textasciitilde{}",
    "<": r"\textless{}",
    ">": r"\textgreater{}",
    "|": r"\textbar{}",
}


def tex_escape(text: object) -> str:
    """Plain text made safe for LaTeX: specials escaped, control characters dropped."""
    out = []
    for ch in str(text):
        if ch in _TEX_SPECIALS:
            out.append(_TEX_SPECIALS[ch])
        elif ch in "\n\r\t":
            out.append(" ")
        elif ord(ch) < 32 or ord(ch) == 127:
            continue
        else:
            out.append(ch)
    return "".join(out)



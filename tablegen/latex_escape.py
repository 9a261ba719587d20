"""Escaping plain text for LaTeX, and for BibTeX, which hands its fields to LaTeX.

Kept apart from the Jinja environment so that build facts such as the
BibTeX entry can use it without importing a template engine.

:func:`tex_escape` escapes the specials.  :func:`bibtex_text` goes further,
because a .bib file ends up in someone else's manuscript, compiled with any
engine and input encoding: the result is pure ASCII -- accented letters and the
few special letters as LaTeX accent commands ({\\'e}, {\\ss}), typographic
punctuation as text commands, Greek letters and common math symbols in
\\ensuremath, and anything else as a visible placeholder [U+XXXX]; ligature
pairs (-- `` '' !` ?`) are split so they print as typed.
"""

from __future__ import annotations

import unicodedata

__all__ = ["tex_escape", "bibtex_text"]

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


# Combining marks that LaTeX's standard accent commands draw (LaTeX manual, "Accents").
_ACCENTS = {
    "\u0300": "`", "\u0301": "'", "\u0302": "^", "\u0303": "~", "\u0304": "=", "\u0306": "u",
    "\u0307": ".", "\u0308": '"', "\u030a": "r", "\u030b": "H", "\u030c": "v", "\u0323": "d",
    "\u0327": "c", "\u0328": "k",
}
# Letters and punctuation with text commands in LaTeX's default (OT1) fonts.
_TEXT_COMMANDS = {
    "ß": r"{\ss}", "æ": r"{\ae}", "Æ": r"{\AE}", "ø": r"{\o}", "Ø": r"{\O}", "œ": r"{\oe}", "Œ": r"{\OE}",
    "ł": r"{\l}", "Ł": r"{\L}", "ı": r"{\i}", "å": r"{\aa}", "Å": r"{\AA}",
    "–": r"\textendash{}", "—": r"\textemdash{}", "‘": r"`{}", "’": r"'{}", "“": r"``{}", "”": r"''{}",
    "…": r"\ldots{}", "\u00a0": "~", "¡": r"\textexclamdown{}", "¿": r"\textquestiondown{}",
}
# Symbols that exist in LaTeX's math fonts.
_MATH = {
    "⟨": r"\langle", "⟩": r"\rangle", "±": r"\pm", "×": r"\times", "−": "-", "⊗": r"\otimes",
    "⊕": r"\oplus", "≤": r"\leq", "≥": r"\geq", "≠": r"\neq", "≈": r"\approx", "√": r"\surd",
    "∞": r"\infty", "→": r"\to", "·": r"\cdot", "°": r"^\circ", "ħ": r"\hbar",
}
_GREEK = "alpha beta gamma delta epsilon zeta eta theta iota kappa lambda mu nu xi o pi rho varsigma sigma tau upsilon phi chi psi omega".split()
for _i, _name in enumerate(_GREEK):
    if _name not in ("o", "varsigma"):
        _MATH[chr(0x3B1 + _i)] = "\\" + _name
for _upper in ("Gamma", "Delta", "Theta", "Lambda", "Xi", "Pi", "Sigma", "Upsilon", "Phi", "Psi", "Omega"):
    _MATH[chr(0x391 + _GREEK.index(_upper.lower()))] = "\\" + _upper
_LIGATURE_PAIRS = ("--", "``", "''", "!`", "?`")


def _bib_char(ch: str) -> str:
    if " " <= ch <= "~":
        return tex_escape(ch)
    if ch in _TEXT_COMMANDS:
        return _TEXT_COMMANDS[ch]
    if ch in _MATH:
        return "\\ensuremath{" + _MATH[ch] + "}"
    if ch in "\n\r\t":
        return " "
    base, *marks = unicodedata.normalize("NFD", ch)
    if marks and " " <= base <= "~" and base.isalpha() and all(m in _ACCENTS for m in marks):
        out = "\\i" if base == "i" else base  # dotless i under an accent
        for mark in marks:
            out = "\\" + _ACCENTS[mark] + ("{" + out + "}" if _ACCENTS[mark].isalpha() else out)
        return "{" + out + "}"
    if unicodedata.category(ch) in ("Cc", "Cf", "Cs"):
        return ""  # control and format characters: nothing to show
    return f"[U+{ord(ch):04X}]"


def bibtex_text(text: object) -> str:
    """Text for a BibTeX field: ASCII only, LaTeX commands where they exist, [U+XXXX] otherwise.

    Braces are dropped (BibTeX balances them itself); ligature pairs are split.
    """
    out = "".join(_bib_char(ch) for ch in str(text).replace("{", "").replace("}", ""))
    for pair in _LIGATURE_PAIRS:
        while pair in out:
            out = out.replace(pair, pair[0] + "{}" + pair[1])
    return out

"""LaTeX text of exact values, kept beside the types and out of them.

Three styles.  Two for displayed formulas and tables: "root" writes the
square root of a fraction (-\\sqrt{\\frac{5}{14}}), "rational" rationalises the
denominator (-\\frac{\\sqrt{70}}{14}); integers and plain fractions are written
as such (\\frac{2}{3}).  One for running text, "inline": a root over a slashed
fraction (-\\sqrt{5/14}) and slashed fractions (2/3), which keep the line
height of the sentence around them.
"""

from __future__ import annotations

from math import gcd, isqrt

from ..intmath import int_text, split_square

__all__ = ["LATEX_STYLES", "check_style", "surd_latex", "sum_latex"]

LATEX_STYLES = ("root", "rational", "inline")


def check_style(style: str) -> None:
    """ValueError naming the argument unless ``style`` is one of LATEX_STYLES."""
    if style not in LATEX_STYLES:
        raise ValueError(f"argument style = {style!r}: must be one of {', '.join(LATEX_STYLES)}")


def surd_latex(sign: int, p: int, q: int, style: str = "root", wrap: bool = False) -> str:
    """LaTeX for sign*sqrt(p/q) (p/q reduced); wrap=True puts a negative value or a fraction in parentheses.

    A factor in running text ("inline") gets plain parentheses, the display styles \\left( \\right).
    """
    check_style(style)
    if not sign:
        return "0"
    t = int_text
    rp, rq = isqrt(p), isqrt(q)
    slashed = False
    if rp * rp == p and rq * rq == q:
        if rq == 1:
            body = t(rp)
        elif style == "inline":
            body, slashed = f"{t(rp)}/{t(rq)}", True
        else:
            body = f"\\frac{{{t(rp)}}}{{{t(rq)}}}"
    elif style == "inline":
        body = f"\\sqrt{{{t(p)}}}" if q == 1 else f"\\sqrt{{{t(p)}/{t(q)}}}"
    elif style == "root":
        body = f"\\sqrt{{{t(p)}}}" if q == 1 else f"\\sqrt{{\\frac{{{t(p)}}}{{{t(q)}}}}}"
    else:
        # sqrt(p/q) = sqrt(p*q)/q = a*sqrt(b)/q with p*q = a^2 b, b square-free
        a, b = split_square(p * q)
        g = gcd(a, q)
        a, den = a // g, q // g
        top = f"\\sqrt{{{t(b)}}}" if a == 1 else f"{t(a)}\\sqrt{{{t(b)}}}"
        body = top if den == 1 else f"\\frac{{{top}}}{{{t(den)}}}"
    text = f"-{body}" if sign < 0 else body
    if wrap and (sign < 0 or slashed or "\\frac" in body):
        return f"({text})" if style == "inline" else f"\\left({text}\\right)"
    return text


def sum_latex(terms: "list[tuple[int, int, int]]", style: str = "root", wrap: bool = False) -> str:
    """LaTeX for a sum of terms (sign, p, q), each written as surd_latex does, joined by + and -."""
    check_style(style)
    if not terms:
        return "0"
    parts = [surd_latex(*terms[0], style)]
    for term in terms[1:]:
        text = surd_latex(*term, style)
        parts.append(f" - {text[1:]}" if text.startswith("-") else f" + {text}")
    text = "".join(parts)
    if wrap and len(terms) > 1:
        return f"({text})" if style == "inline" else f"\\left({text}\\right)"
    return text

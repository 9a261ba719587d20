"""The one place Jinja environments are made (HTML and LaTeX).

HTML: autoescape on, StrictUndefined.  LaTeX: autoescape off (LaTeX has its
own escaping filter, ``tex``) and delimiters that do not clash with braces:
``<< expr >>``, ``<% stmt %>``, ``<# comment #>``.  Filters are registered from
one dict.  Templates are found in the top-level templates/ folder of a source
checkout, or in tablegen/templates inside an installed wheel.
"""

from __future__ import annotations

from functools import lru_cache
from pathlib import Path

import re

import jinja2
from markupsafe import Markup, escape

from ..latex_escape import tex_escape
from ..notation import half_text

__all__ = ["templates_dir", "html_environment", "latex_environment", "tex_escape"]

_NAME = re.compile(r"([A-Za-z]+)(\d*)(.*)")
_PRIMED = re.compile(r"[a-z]p")  # an argument name for a primed letter: 'mp' = m′


def qn_html(name: str) -> Markup:
    """A quantum-number name in HTML: 'm1' -> <i>m</i><sub>1</sub>, 'M' -> <i>M</i>."""
    letters, digits, rest = _NAME.fullmatch(name).groups()
    if _PRIMED.fullmatch(letters) and not digits:  # 'mp' is m′, the argument names' way to write a prime
        return Markup("<i>{}</i>′{}").format(letters[0], escape(rest))
    sub = Markup("<sub>{}</sub>").format(digits) if digits else ""
    return Markup("<i>{}</i>{}{}").format(letters, sub, escape(rest))


def qn_tex(name: str) -> str:
    """A quantum-number name in LaTeX math: 'm1' -> m_1, 'j12' -> j_{12}, 'M' -> M."""
    letters, digits, rest = _NAME.fullmatch(name).groups()
    if _PRIMED.fullmatch(letters) and not digits:  # 'mp' -> m'
        return f"{letters[0]}'{rest}"
    sub = "" if not digits else f"_{digits}" if len(digits) == 1 else f"_{{{digits}}}"
    return f"{letters}{sub}{rest}"


FILTERS = {
    "half": half_text,  # doubled int -> '3/2'
    "tex": tex_escape,
    "qn_tex": qn_tex,
}


def templates_dir() -> Path:
    """templates/ beside the package (checkout) or tablegen/templates (wheel)."""
    here = Path(__file__).resolve().parent.parent
    for candidate in (here / "templates", here.parent / "templates"):
        if candidate.is_dir():
            return candidate
    raise FileNotFoundError("tablegen templates folder not found")


@lru_cache(maxsize=None)
def html_environment() -> jinja2.Environment:
    env = jinja2.Environment(
        loader=jinja2.FileSystemLoader(str(templates_dir() / "html")),
        autoescape=True,
        undefined=jinja2.StrictUndefined,
        trim_blocks=True,
        lstrip_blocks=True,
        keep_trailing_newline=True,
    )
    env.filters.update(FILTERS)
    env.filters["qn_html"] = qn_html
    return env


@lru_cache(maxsize=None)
def latex_environment() -> jinja2.Environment:
    env = jinja2.Environment(
        loader=jinja2.FileSystemLoader(str(templates_dir() / "latex")),
        autoescape=False,
        undefined=jinja2.StrictUndefined,
        block_start_string="<%",
        block_end_string="%>",
        variable_start_string="<<",
        variable_end_string=">>",
        comment_start_string="<#",
        comment_end_string="#>",
        trim_blocks=True,
        lstrip_blocks=True,
        keep_trailing_newline=True,
    )
    env.filters.update(FILTERS)
    return env

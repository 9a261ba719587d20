"""The conventions and methods pages: Markdown texts with formulas as MathML.

The texts live in templates/text/*.md.  Formulas are written in LaTeX between
``$$ … $$`` (displayed, on lines of their own) or ``$ … $`` (inline); they are
swapped for placeholders before Markdown runs and replaced afterwards by the
MathML that mathml.tex_to_mathml writes, so the pages need neither a script
nor the network.  A displayed formula keeps its LaTeX in data-t, for the copy
button.  ``{{name}}`` inserts a build fact (digits, LaTeX style).
"""

from __future__ import annotations

import re
from html import escape

import markdown

from . import mathml
from .env import templates_dir

__all__ = ["render_text_page", "render_markdown"]

_DISPLAY = re.compile(r"\$\$(.+?)\$\$", re.S)
_INLINE = re.compile(r"(?<![\\$])\$([^$\n]+?)\$")
_FACT = re.compile(r"\{\{\s*([a-z_]+)\s*\}\}")


def _fill(text: str, facts: dict[str, str]) -> str:
    def one(m: re.Match) -> str:
        if m.group(1) not in facts:
            raise KeyError(f"unknown fact {{{{{m.group(1)}}}}} in a text page")
        return facts[m.group(1)]

    return _FACT.sub(one, text)


def render_markdown(text: str, facts: dict[str, str] | None = None) -> str:
    """HTML for Markdown with $$display$$ and $inline$ LaTeX formulas."""
    text = _fill(text, facts or {})
    formulas: list[tuple[str, bool]] = []

    def hold(display: bool):
        def sub(m: re.Match) -> str:
            formulas.append((m.group(1).strip(), display))
            tag = "D" if display else "I"
            return f"\n\nzzmath{tag}{len(formulas) - 1}zz\n\n" if display else f"zzmath{tag}{len(formulas) - 1}zz"

        return sub

    text = _DISPLAY.sub(hold(True), text)
    text = _INLINE.sub(hold(False), text)
    html = markdown.markdown(text, extensions=["tables", "toc"], output_format="html")

    def put(m: re.Match) -> str:
        tex, display = formulas[int(m.group(2))]
        out = mathml.tex_to_mathml(tex, display)
        if not display:
            return out
        return f'<div class="eq" data-t="{escape(tex, quote=True)}">{out}</div>'

    html = re.sub(r"<p>zzmath(D)(\d+)zz</p>", put, html)
    html = re.sub(r"zzmath([DI])(\d+)zz", put, html)
    return html


def render_text_page(name: str, facts: dict[str, str]) -> str:
    """The body HTML of templates/text/<name>.md."""
    source = (templates_dir() / "text" / f"{name}.md").read_text(encoding="utf-8")
    return render_markdown(source, facts)

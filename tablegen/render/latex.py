"""LaTeX output: per table a fragment and a standalone sheet, and one booklet.

A fragment is the table alone (a ``longtable``), to ``\\input`` into a
manuscript; it opens with a comment naming the packages it needs and the
conventions.  A sheet is a small document that prints the conventions and the
build facts and ``\\input``s its fragment (they sit side by side in latex/);
the booklet does the same for every table, so no table is written twice.

Everything is formatting: values arrive as ``Shown`` text forms, quantum
numbers are written with ``half``.  Output has no dates, so the bytes depend
only on the plan, the values and the build facts.
"""

from __future__ import annotations

import posixpath
from typing import Callable, Iterator

from ..buildinfo import BuildMeta, bibtex, plain_citation
from ..compute import Shown, ValueBook
from ..plan import Entry, SitePlan, Table
from .env import latex_environment, tex_escape

__all__ = ["render_latex", "DOCUMENT_PACKAGES", "FRAGMENT_PACKAGES", "tex_text", "tt_text", "pdf_text"]

#: What sheets and the booklet load (all from TeX's base and recommended sets).
DOCUMENT_PACKAGES = ("amsmath", "array", "booktabs", "longtable", "geometry", "hyperref")
#: What a fragment needs in the manuscript's preamble.
FRAGMENT_PACKAGES = ("amsmath", "array", "booktabs", "longtable")

FRAGMENT_TEMPLATES = {
    "cg": "fragment_cg.tex",
    "3j": "fragment_3j.tex",
    "6j": "fragment_6j.tex",
    "9j": "fragment_9j.tex",
}

# Characters beyond ASCII that pdflatex prints with its default (OT1) fonts and
# UTF-8 input, without font substitutions; anything else in user text is
# written as [U+XXXX] so that a recipe title can never stop a compile.
_PRINTABLE_EXTRA = frozenset(
    "\u00a0¡\u00ad¸¿ÀÁÂÃÄÅÆÇÈÉÊËÌÍÎÏÑÒÓÔÕÖØÙÚÛÜÝßàáâãäåæçèéêëìíîïñòóôõöøùúûüýÿ"
    "ĀāĂăĆćĈĉĊċČčĎďĒēĔĕĖėĚěĜĝĞğĠġĢģĤĥĨĩĪīĬĭİıĲĳĴĵĶķĹĺĻļĽľŁłŃńŅņŇňŌōŎŏŐőŒœ"
    "ŔŕŖŗŘřŚśŜŝŞşŠšŢţŤťŨũŪūŬŭŮůŰűŴŵŶŷŸŹźŻżŽž–—‘’“”…"
)
# Pairs the default text font joins into another glyph (-- `` '' !` ?`).
_LIGATURE_PAIRS = ("--", "``", "''", "!`", "?`")


def _printable(text: str) -> str:
    """Text with every character the default fonts lack written as [U+XXXX]."""
    return "".join(
        ch if (" " <= ch <= "~") or ch in "\n\r\t" or ch in _PRINTABLE_EXTRA else f"[U+{ord(ch):04X}]"
        for ch in text
    )


def tex_text(text: object) -> str:
    """User text (recipe title, notes) as LaTeX that prints it literally.

    The environment's ``tex`` filter escapes the specials; around it,
    characters the default fonts lack become [U+XXXX], ligature pairs are
    split with ``{}`` so that "--" stays two hyphens, and $ is taken from the
    text font (its \\$ would load a companion font that a basic TeX
    installation only has as a bitmap, made on the fly).  User text is never
    set in italics, where that font position holds a pound sign.
    """
    escaped = tex_escape(_printable(str(text))).replace("\\$", "\\char36{}")
    return _split_ligatures(escaped)


def pdf_text(text: object) -> str:
    """User text for a PDF string (document title): escaped, kept as typed."""
    return tex_escape(_printable(str(text)))


# Characters that the typewriter font has at their ASCII places but that the
# text escapes would take from a symbol or companion font; \char prints them
# in place.
# Straight quote and grave accent sit at 13 and 18 in that font.
_TT_CHARS = {ch: ord(ch) for ch in "\\{}<>|^~_$"} | {"'": 13, "`": 18}


def tt_text(text: object) -> str:
    """User or citation text for a typewriter block: literal, spaces kept."""
    out = []
    for ch in _printable(str(text)):
        if ch in _TT_CHARS:
            out.append(f"\\char{_TT_CHARS[ch]}{{}}")
        elif ch == " ":
            out.append("\\ ")
        else:
            out.append(tex_escape(ch))
    return "".join(out)


def _split_ligatures(out: str) -> str:
    for pair in _LIGATURE_PAIRS:
        while pair in out:
            out = out.replace(pair, pair[0] + "{}" + pair[1])
    return out


def _fragment_name(table: Table, document: str) -> str:
    """The fragment's file name as \\input from the folder of ``document``."""
    return posixpath.relpath(table.tex, posixpath.dirname(document))


def _lookup(book: ValueBook, family: str) -> Callable[[Entry], Shown]:
    def value(entry: Entry) -> Shown:
        return book[(family, entry.key)]

    return value


def render_latex(plan: SitePlan, book: ValueBook, meta: BuildMeta) -> Iterator[tuple[str, bytes]]:
    """(path, bytes) for every fragment and sheet, then the booklet."""
    env = latex_environment()
    common = {
        "meta": meta,
        "recipe": plan.recipe,
        "text": tex_text,
        "tt": tt_text,
        "pdf_text": pdf_text,
        "fragment_packages": FRAGMENT_PACKAGES,
    }
    sheet = env.get_template("sheet.tex")
    for table in plan.tables:
        fragment = env.get_template(FRAGMENT_TEMPLATES[table.family])
        yield table.tex, _encode(
            fragment.render(
                common,
                table=table,
                fragment_file=posixpath.basename(table.tex),
                value=_lookup(book, table.family),
            )
        )
        yield table.tex_sheet, _encode(
            sheet.render(common, table=table, fragment=_fragment_name(table, table.tex_sheet))
        )
    families = [
        (f.family, [(t, _fragment_name(t, plan.booklet)) for t in plan.tables_of(f.family)])
        for f in plan.recipe.families
    ]
    booklet = env.get_template("booklet.tex")
    yield plan.booklet, _encode(
        booklet.render(
            common,
            families=[f for f in families if f[1]],
            bibtex_lines=bibtex(meta).rstrip("\n").split("\n"),
            recipe_lines=meta.recipe_toml.rstrip("\n").split("\n"),
            citation=plain_citation(meta),
        )
    )


def _encode(text: str) -> bytes:
    return text.encode("utf-8")

"""LaTeX output: per table a fragment and a standalone sheet, and one booklet.

A fragment is the table alone, to ``\\input`` into a manuscript inside the
author's own ``table`` or ``table*``: a sequence of ``tabular`` blocks with
booktabs rules (a matrix per third j for the grid layout, a matrix per block
for the matrix layout, runs of rows for the classes layout), so it works in
two-column documents, where ``longtable`` stops.  Each block is at most about a
page tall, so outside a float the table still runs over as many pages as it
needs.  It opens with a comment naming the packages it needs and the
convention.  A sheet is a small document that prints the conventions and the
build facts and ``\\input``s its fragment (they sit side by side in latex/);
the booklet does the same for every table, so no table is written twice.

Everything is formatting: values arrive as ``FormattedValue`` text forms, quantum
numbers are written with ``half``.  Output has no dates, so the bytes depend
only on the plan, the values and the build facts.
"""

from __future__ import annotations

import posixpath
from typing import Callable, Iterator

from ..buildinfo import BuildMeta, bibtex, plain_citation
from ..compute import ComputedValues, FormattedValue
from ..families import Family
from ..kinds import Notation, kind
from ..sitemodel import Entry, Section, SitePlan, Table
from .env import latex_environment, qn_tex, tex_escape
from ..spins import half_text

__all__ = ["render_latex", "FRAGMENT_PACKAGES", "tex_text", "tt_text", "pdf_text", "latex_symbol"]

#: What a fragment needs in the manuscript's preamble (named in its head comment).
FRAGMENT_PACKAGES = ("amsmath", "array", "booktabs")

#: Printed lines in one block of the classes layout (a symbol of n rows takes n lines):
#: a block stays shorter than a page, so that the blocks can break between pages.
BLOCK_LINES = 48
#: Decimal matrices take at most this many characters of digits per printed line
#: (footnotesize on a page, or across both columns with table*).
DECIMAL_LINE_CHARS = 84

# Plain-text forms of the symbols a family's convention line uses, for the ASCII head comment.
_ASCII = str.maketrans({"−": "-", "⟨": "<", "⟩": ">", "–": "-", "—": "-", "⊗": "x"})

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


def _lookup(book: ComputedValues, kind_key: str) -> Callable[[Entry], FormattedValue]:
    def value(entry: Entry) -> FormattedValue:
        return book[(kind_key, entry.key)]

    return value


def latex_symbol(notation: Notation, parts: list[str]) -> str:
    """A symbol in LaTeX from its Notation record, each argument already written as LaTeX."""
    if notation.tex:  # a symbol written as handbooks print it (d^j_{m'm}(beta), Y_l^m(theta, phi))
        return notation.tex.format(*parts)
    groups = [[parts[i] for i in g] for g in notation.groups]
    if notation.style == "array":
        env = "pmatrix" if notation.brackets == "()" else "Bmatrix"
        return f"\\begin{{{env}}}" + "\\\\ ".join(" & ".join(g) for g in groups) + f"\\end{{{env}}}"
    if notation.style == "braket":
        inner = ";\\,".join("\\,".join(g) for g in groups[:-1])
        last = "\\,".join(groups[-1])
        return f"\\langle {inner}\\vert {last}\\rangle"
    return f"{notation.name}(" + ";\\ ".join("\\ ".join(g) for g in groups) + ")"


def _param_words(name: str, layout) -> tuple[str, str]:
    """(words before the symbol, the symbol) of a table parameter: ('largest', 'j') or ('', 'j1')."""
    words = getattr(layout, "param_words", {}).get(name, name).rsplit(" ", 1)
    return (words[0] + " ", words[1]) if len(words) == 2 else ("", words[0])


class _Helpers:
    """Names, parameters and symbols for the templates, from the plan's family records."""

    def __init__(self, plan: SitePlan) -> None:
        self.plan = plan

    def family_name(self, fam: Family) -> str:
        """The title in LaTeX; an en dash as the command, which every TeX font setup prints."""
        return tex_text(fam.title).replace("–", "\\textendash{}")

    @staticmethod
    def plain_family_name(fam: Family) -> str:
        return fam.title.replace("–", "-")

    def _params(self, params, layout, tex: bool) -> str:
        out = []
        for name, value in params:
            before, symbol = _param_words(name, layout)
            if tex:
                out.append(f"{before}${qn_tex(symbol)} = {half_text(value)}$")
            else:
                out.append(f"{before}{symbol} = {half_text(value)}")
        return ", ".join(out)

    def params(self, table: Table) -> str:
        return self._params(table.params, self.plan.family(table.family).layout, True)

    def plain_params(self, table: Table) -> str:
        return self._params(table.params, self.plan.family(table.family).layout, False)

    def section_params(self, section: Section) -> str:
        return self._params(section.params, None, True)

    @staticmethod
    def plain_convention(fam: Family) -> str:
        """The family's convention line in ASCII, for a comment."""
        return fam.convention.translate(_ASCII).replace("√", "sqrt")

    @staticmethod
    def m_rule(layout, tex: bool) -> str:
        """The projection a grid leaves out: 'm_2 = M - m_1' (CG), 'm_2 = -m_3 - m_1' (3j)."""
        row = qn_tex(layout.row) if tex else layout.row
        m1, m2 = ("m_1", "m_2") if tex else ("m1", "m2")
        return f"{m2} = {'' if layout.m_sum_sign > 0 else '-'}{row} - {m1}"

    def decimal_blocks(self, section: Section) -> list[tuple[list[tuple[int, int]], list[int]]]:
        """A grid section's decimal matrix in parts narrow enough to print.

        Each part is (its columns as (position, m1), the row positions with a value
        in those columns); the columns are shared out evenly between the parts.
        """
        per_line = max(1, DECIMAL_LINE_CHARS // (self.plan.recipe.digits + 6))
        cols = list(enumerate(section.columns))
        parts = -(-len(cols) // per_line)
        size = -(-len(cols) // parts)
        out = []
        for i in range(0, len(cols), size):
            chunk = cols[i : i + size]
            rows = [r for r, line in enumerate(section.grid) if any(line[c] is not None for c, _ in chunk)]
            out.append((chunk, rows))
        return out

    @staticmethod
    def row_blocks(fam: Family, entries: tuple[Entry, ...]) -> list[tuple[Entry, ...]]:
        """Runs of rows of a classes table, each at most BLOCK_LINES printed lines."""
        per_block = max(1, BLOCK_LINES // len(kind(fam.kind).notation.groups))
        return [entries[i : i + per_block] for i in range(0, len(entries), per_block)]

    @staticmethod
    def list_blocks(entries: tuple[Entry, ...]) -> list[tuple[Entry, ...]]:
        """Runs of a listed matrix (symbol = function, one a line), each at most BLOCK_LINES lines."""
        return [entries[i : i + BLOCK_LINES] for i in range(0, len(entries), BLOCK_LINES)]

    @staticmethod
    def qn_names(names: "str | tuple[str, ...]") -> str:
        """A label's argument name(s) in LaTeX math: 'j_{12}' or '(j_{12}, j_{34})'."""
        if isinstance(names, str):
            return qn_tex(names)
        return "(" + ", ".join(qn_tex(n) for n in names) + ")"

    @staticmethod
    def qn_label(value: "int | tuple[int, ...]") -> str:
        """A label's value(s): '3/2' or '(1, 3/2)'."""
        return half_text(value) if isinstance(value, int) else "(" + ", ".join(half_text(v) for v in value) + ")"

    @staticmethod
    def kets(layout, section: Section, value) -> tuple[list[str], list[str]]:
        """LaTeX equations: each row written in column states, each column in row states (empty lists when
        the layout's rows and columns are not states)."""
        if not (getattr(layout, "row_ket", None) and getattr(layout, "column_ket", None)):
            return [], []
        from .kets import expansions

        by_row, by_column = expansions(layout, section, value)
        return [x.tex for x in by_row], [x.tex for x in by_column]

    def symbol(self, kind_key: str, key: tuple[int, ...]) -> str:
        return latex_symbol(kind(kind_key).notation, [half_text(x) for x in key])

    def head_symbol(self, table: Table, section: Section | None = None) -> str:
        """The symbol with the table's (and section's) parameters as numbers and the rest as names."""
        given = dict(table.params) | dict(section.params if section else ())
        return latex_symbol(
            kind(table.kind).notation,
            [half_text(given[a]) if a in given else qn_tex(a) for a in kind(table.kind).arguments],
        )


def render_latex(plan: SitePlan, book: ComputedValues, meta: BuildMeta) -> Iterator[tuple[str, bytes]]:
    """(path, bytes) for every fragment and sheet, then the booklet."""
    env = latex_environment()
    helpers = _Helpers(plan)
    common = {
        "meta": meta,
        "recipe": plan.recipe,
        "text": tex_text,
        "tt": tt_text,
        "pdf_text": pdf_text,
        "fragment_packages": FRAGMENT_PACKAGES,
        **{name: getattr(helpers, name) for name in (
            "family_name", "plain_family_name", "params", "plain_params", "section_params", "symbol",
            "head_symbol", "plain_convention", "m_rule", "decimal_blocks", "row_blocks", "list_blocks", "qn_names", "qn_label", "kets",
        )},
    }
    sheet = env.get_template("sheet.tex")
    for table in plan.tables:
        fam = plan.family(table.family)
        fragment = env.get_template(f"fragment_{fam.layout.name}.tex")
        yield table.tex, _encode(
            fragment.render(
                common,
                table=table,
                fam=fam,
                layout=fam.layout,
                fragment_file=posixpath.basename(table.tex),
                value=_lookup(book, table.kind),
                alongside=[(a.tex_label, _lookup(book, a.kind)) for a in fam.alongside],
            )
        )
        yield table.tex_sheet, _encode(
            sheet.render(common, table=table, fam=fam, fragment=_fragment_name(table, table.tex_sheet))
        )
    families = [(fam, [(t, _fragment_name(t, plan.booklet)) for t in plan.tables_of(fam.key)]) for fam in plan.families]
    counts = dict(meta.counts)
    booklet = env.get_template("booklet.tex")
    yield plan.booklet, _encode(
        booklet.render(
            common,
            families=[f for f in families if f[1]],
            counted=[(fam, counts.get(fam.key, 0)) for fam in plan.families],
            bibtex_lines=bibtex(meta).rstrip("\n").split("\n"),
            recipe_lines=meta.recipe_toml.rstrip("\n").split("\n"),
            citation=plain_citation(meta),
            convention_texts=list(dict.fromkeys(f.convention_text for f in plan.families if f.convention_text)),
        )
    )


def _encode(text: str) -> bytes:
    return text.encode("utf-8")

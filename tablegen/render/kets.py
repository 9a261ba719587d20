"""Ket expansions of a matrix whose rows and columns are states, for the HTML and LaTeX renderers.

A real orthogonal matrix <column state | row state> = c: each row state is the
sum over columns of c |column>, and each column state the sum over rows of
c |row> (the inverse is the transpose).  The layout record writes each ket
(text and LaTeX); this module only pairs them with the computed values.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Callable

from ..compute import FormattedValue
from ..sitemodel import Entry, Section

__all__ = ["KetTerm", "Expansion", "expansions"]


@dataclass(frozen=True)
class KetTerm:
    negative: bool
    value: FormattedValue
    ket_text: str
    ket_tex: str

    @property
    def unit(self) -> bool:
        """The coefficient is +-1 (written as a sign only)."""
        return self.value.tex_abs == "1"


@dataclass(frozen=True)
class Expansion:
    ket_text: str
    ket_tex: str
    terms: tuple[KetTerm, ...]

    @property
    def tex(self) -> str:
        """The whole equation in LaTeX: |state> = c1 |a> - c2 |b> + ..."""
        out = []
        for i, t in enumerate(self.terms):
            sign = "-" if t.negative else ("+" if i else "")
            coeff = "" if t.unit else t.value.tex_abs
            out.append(f"{sign}{coeff}{t.ket_tex}")
        return f"{self.ket_tex} = " + " ".join(out)


def expansions(layout, section: Section, shown: Callable[[Entry], FormattedValue]) -> tuple[list[Expansion], list[Expansion]]:
    """(rows written in column states, columns written in row states) of one matrix section."""
    params = section.params
    rows = [layout.row_ket(params, r) for r in section.rows]
    cols = [layout.column_ket(params, c) for c in section.columns]

    def term(entry: "Entry | None", ket: tuple[str, str]) -> "KetTerm | None":
        if entry is None:
            return None
        s = shown(entry)
        return KetTerm(s.value.sign < 0, s, *ket) if s.value else None

    by_row = [Expansion(*rows[r], tuple(t for c, e in enumerate(line) if (t := term(e, cols[c]))))
              for r, line in enumerate(section.grid)]
    by_column = [Expansion(*cols[c], tuple(t for r, line in enumerate(section.grid) if (t := term(line[c], rows[r]))))
                 for c in range(len(section.columns))]
    return by_row, by_column

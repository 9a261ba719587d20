"""Layouts: how a family's values are arranged on pages, tables and sections.

A layout is a small frozen record (its options) with one method,
``plan(family, range, lookup)``, that returns the family's pages and tables as
plain :mod:`tablegen.sitemodel` records, and the naming methods the pages,
the tests and the jump box share.  Three exist:

* :class:`GridLayout` (grid.py): a coupling j1 x j2 per page, a section per
  third j, rows by the third projection and columns by m1 (CG, 3j);
* :class:`ClassesLayout` (classes.py): symmetry classes, one page per largest
  j of the canonical form (6j, 9j);
* :class:`MatrixLayout` (matrix.py): one matrix per block of parameters, rows
  and columns labelled by quantum numbers (recoupling matrices, d^j(beta)).

Renderers and templates dispatch on ``layout.name``.
"""

from __future__ import annotations

from .classes import ClassesLayout, symbols_in_range
from .grid import GridLayout
from .matrix import Exchange, MatrixBlock, MatrixLayout

Layout = GridLayout | ClassesLayout | MatrixLayout

__all__ = ["GridLayout", "ClassesLayout", "MatrixLayout", "MatrixBlock", "Exchange", "Layout", "symbols_in_range"]

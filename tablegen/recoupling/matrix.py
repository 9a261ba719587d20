"""Recoupling matrices: <tree1|tree2> over every allowed value of the intermediates.

For fixed leaves and total, the states of one tree with all allowed
intermediate values form an orthonormal basis of the same space, so the
matrix between two trees is square and orthogonal.  Rows are labelled by the
intermediates of tree 1, columns by those of tree 2 (each label a tuple of
(name, doubled value) pairs, bottom-up as they appear in the tree text).
"""

from __future__ import annotations

from typing import NamedTuple


from ..spins import half_text
from ..values.surd import Surd
from ._exact import surd_sum
from .coefficient import evaluate, pair_of
from .paths import plan_path
from .trees import Leaf, Node, Tree, bind_values, nodes

__all__ = ["RecouplingMatrix", "recoupling_matrix", "assignments", "label_text"]

Label = tuple[tuple[str, int], ...]


def _values(t: Tree, tj: dict[str, int]):
    """(doubled value of t, {intermediate: doubled value}) for every allowed coupling below t."""
    if isinstance(t, Leaf):
        yield tj[t.name], {}
        return
    for tl, left in _values(t.left, tj):
        for tr, right in _values(t.right, tj):
            for tz in range(abs(tl - tr), tl + tr + 1, 2):
                yield tz, {**left, **right, t.name: tz}


def assignments(t: Node, tj: dict[str, int]) -> list[Label]:
    """Every allowed assignment of the intermediates of t, for the leaves and total in tj."""
    order = [n.name for n in nodes(t) if n is not t]
    out = []
    for total, inner in _values(t, tj):
        if total == tj[t.name]:
            out.append(tuple((name, inner[name]) for name in order))
    return sorted(out, key=lambda lab: tuple(v for _, v in lab))


def label_text(label: Label) -> str:
    """'e=3/2 g=1' for a row or column label."""
    return " ".join(f"{name}={half_text(v)}" for name, v in label)


class RecouplingMatrix(NamedTuple):
    """An exact recoupling matrix with labelled rows (tree 1) and columns (tree 2)."""

    first: str
    second: str
    fixed: tuple[tuple[str, int], ...]  # leaves and total, doubled
    rows: tuple[Label, ...]
    columns: tuple[Label, ...]
    entries: tuple[tuple[Surd, ...], ...]

    def entry(self, row: Label, column: Label) -> Surd:
        return self.entries[self.rows.index(row)][self.columns.index(column)]

    def is_orthogonal(self) -> bool:
        """M M^T = 1 and M^T M = 1, checked with exact sums."""
        n = len(self.rows)
        if n != len(self.columns):
            return False
        m = self.entries
        for i in range(n):
            for k in range(i, n):
                rows = surd_sum(m[i][j] * m[k][j] for j in range(n))
                cols = surd_sum(m[j][i] * m[j][k] for j in range(n))
                want = 1 if i == k else 0
                if rows != want or cols != want:
                    return False
        return True

    def text(self) -> str:
        """A plain-text grid: one line per row label."""
        head = f"<{self.first}|{self.second}>  ({label_text(self.fixed)})"
        lines = [head, "rows: " + " | ".join(label_text(r) for r in self.rows),
                 "columns: " + " | ".join(label_text(c) for c in self.columns)]
        for r, row in zip(self.rows, self.entries):
            lines.append(f"{label_text(r)}: " + "  ".join(str(v) for v in row))
        return "\n".join(lines)


def recoupling_matrix(tree1: str, tree2: str, **values) -> RecouplingMatrix:
    """The matrix <tree1|tree2> for given leaves and total, e.g.
    recoupling_matrix("((a b)e c)f", "(a (b c)g)f", a=1, b=1, c=1, f=1).
    """
    pair = pair_of(tree1, tree2)
    free = pair.intermediate_names(1) + tuple(
        n for n in pair.intermediate_names(2) if n not in pair.intermediate_names(1)
    )
    tj = bind_values(pair, values, free=free)
    rows = assignments(pair.first, tj)
    cols = assignments(pair.second, {**tj, pair.second.name: tj[pair.second.name]})
    plan = plan_path(pair)
    entries = []
    for r in rows:
        line = []
        for c in cols:
            env = {**tj, **dict(r)}
            clash = any(env.get(k, v) != v for k, v in c)  # a name shared by both trees
            line.append(Surd._trusted(0, 0, 1) if clash else evaluate(plan, {**env, **dict(c)}))
        entries.append(tuple(line))
    fixed = tuple((n, tj[n]) for n in pair.leaf_names()) + ((pair.second.name, tj[pair.second.name]),)
    return RecouplingMatrix(pair.first_text, pair.second_text, fixed, tuple(rows), tuple(cols), tuple(entries))

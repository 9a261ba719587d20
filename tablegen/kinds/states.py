"""Coupled states of several angular momenta in the product basis, as kinds: one per coupling tree.

For a binary tree the coefficient of the product state |j1,m1>|j2,m2>...|jn,mn>
in the coupled state of the tree is the product, over the tree's nodes, of the
Clebsch-Gordan coefficient of each node (common practice: coupling one pair
after the other, Condon-Shortley phase), every intermediate projection being
the sum of the projections below it.  Two trees are tabulated:

    state3   ((j1 j2)j12 j3)J:
             <j1 m1; j2 m2 | j12 m1+m2> <j12 m1+m2; j3 m3 | J M>
    state4   ((j1 j2)j12, (j3 j4)j34)J:
             <j1 m1; j2 m2 | j12 m1+m2> <j3 m3; j4 m4 | j34 m3+m4> <j12 m1+m2; j34 m3+m4 | J M>

For fixed leaves and M the coefficients form a real orthogonal matrix, rows
the coupled states (intermediates, J), columns the product states (m1 ... mn):
a row is a coupled state written in product states, a column a product state
written in coupled states.  A :class:`StateTree` record describes a tree as
data; :func:`state_kind` makes its Kind, and the site's tables and kets
(recoupling/tables.py) read the same record.
"""

from __future__ import annotations

from collections import namedtuple

from ..values import Surd
from . import Kind, Notation, Selection
from .common import first_triad_zero, projection_zero

__all__ = ["StateTree", "TREE3", "TREE4", "STATE3", "STATE4", "state3", "state4", "state_kind"]

_ZERO = Surd._trusted(0, 0, 1)


class StateTree(namedtuple("StateTree", "leaves inner nodes")):
    """A binary coupling tree as positions in the list of j's: leaves j1..jn, the intermediates, then J.

    leaves: how many; inner: names of the intermediates, in the order of ``nodes``;
    nodes: (left, right, coupled) positions, children before parents, the last one coupling to J.
    (A collections named tuple: typing would cost a one-value lookup of a state its start-up.)
    """

    __slots__ = ()

    @property
    def j_names(self) -> tuple[str, ...]:
        return tuple(f"j{i + 1}" for i in range(self.leaves)) + self.inner + ("J",)

    @property
    def m_names(self) -> tuple[str, ...]:
        return tuple(f"m{i + 1}" for i in range(self.leaves))

    @property
    def arguments(self) -> tuple[str, ...]:
        """The j's, then M, then the leaves' projections."""
        return self.j_names + ("M",) + self.m_names

    def projections(self, t: tuple[int, ...]) -> list[int]:
        """Doubled projection of every j position (leaves given, each node the sum of its children)."""
        nj = len(self.j_names)
        m = list(t[nj + 1:]) + [0] * (nj - self.leaves)
        for left, right, up in self.nodes:
            m[up] = m[left] + m[right]
        return m

    def split(self, t: tuple[int, ...]) -> tuple[tuple[int, ...], list[int]]:
        """(doubled j's, doubled projections of every j position) of a key."""
        return t[: len(self.j_names)], self.projections(t)


#: ((j1 j2)j12 j3)J
TREE3 = StateTree(3, ("j12",), ((0, 1, 3), (3, 2, 4)))
#: ((j1 j2)j12, (j3 j4)j34)J
TREE4 = StateTree(4, ("j12", "j34"), ((0, 1, 4), (2, 3, 5), (4, 5, 6)))


def _zero(tree: StateTree, t: tuple[int, ...]):
    names = tree.arguments
    nj = len(tree.j_names)
    rule = first_triad_zero(t, names, tree.nodes)
    if rule:
        return rule
    m = tree.projections(t)
    pairs = [(t[i], t[nj + 1 + i], names[nj + 1 + i]) for i in range(tree.leaves)] + [(t[nj - 1], t[nj], "M")]
    for _, _, up in tree.nodes[:-1]:
        below = " + ".join(f"m{i + 1}" for i in _leaves_below(tree, up))
        pairs.append((t[up], m[up], below))
    total = sum(t[nj + 1:]) - t[nj]
    return projection_zero(pairs, total, f"{' + '.join(tree.m_names)} differs from M")


def _leaves_below(tree: StateTree, position: int) -> list[int]:
    if position < tree.leaves:
        return [position]
    left, right, _ = next(n for n in tree.nodes if n[2] == position)
    return _leaves_below(tree, left) + _leaves_below(tree, right)


def _value(tree: StateTree, t: tuple[int, ...]) -> Surd:
    """The product of the tree's CG coefficients from doubled arguments."""
    if _zero(tree, t):
        return _ZERO
    from .threej import cg2

    js, m = tree.split(t)
    out = None
    for left, right, up in tree.nodes:
        c = cg2(js[left], m[left], js[right], m[right], js[up], m[up])
        out = c if out is None else out * c
    return out


def state3(tj1: int, tj2: int, tj3: int, tj12: int, tJ: int, tM: int, tm1: int, tm2: int, tm3: int) -> Surd:
    """<j1 m1; j2 m2; j3 m3 | (j1 j2)j12, j3; J M> from doubled arguments: two CG coefficients."""
    return _value(TREE3, (tj1, tj2, tj3, tj12, tJ, tM, tm1, tm2, tm3))


def state4(tj1: int, tj2: int, tj3: int, tj4: int, tj12: int, tj34: int, tJ: int, tM: int,
           tm1: int, tm2: int, tm3: int, tm4: int) -> Surd:
    """<j1 m1; ...; j4 m4 | (j1 j2)j12, (j3 j4)j34; J M> from doubled arguments: three CG coefficients."""
    return _value(TREE4, (tj1, tj2, tj3, tj4, tj12, tj34, tJ, tM, tm1, tm2, tm3, tm4))


def state_kind(key: str, tree: StateTree, doubled, title: str, max_j: int, seconds_at_max_j: float) -> Kind:
    """The Kind of one tree's coefficients; the notation <j1 m1; ...; jn mn | intermediates J M>."""
    names = tree.arguments
    nj = len(tree.j_names)
    n = tree.leaves

    def zero_rule(t):
        rule = _zero(tree, t)
        if rule is None and not doubled(*t):
            from . import ZeroRule

            return ZeroRule("cancellation", "every rule holds, but a CG coefficient of the tree is exactly 0")
        return rule

    def parse(values, max_j=None) -> tuple[int, ...]:
        """Doubled arguments: the j's first, then each m against its j."""
        from ..spins import parse_j, parse_m
        from .common import check_count

        check_count(key, names, values)
        t = [parse_j(values[i], names[i], max_j) for i in range(nj)]
        for i, j in [(nj, nj - 1)] + [(nj + 1 + k, k) for k in range(n)]:
            t.append(parse_m(values[i], names[i], t[j], names[j], max_j))
        return tuple(t)

    leaves = tuple((k, nj + 1 + k) for k in range(n))
    return Kind(
        key=key,
        max_j=max_j,
        cost_power=2,
        seconds_at_max_j=seconds_at_max_j,
        convention="Condon-Shortley phase at every node of the tree, the left branch coupled first",
        title=title,
        arguments=names,
        j_positions=tuple(range(nj)),
        parse=parse,
        doubled=doubled,
        zero_rule=zero_rule,
        notation=Notation("braket", leaves + (tuple(range(n, nj + 1)),)),
        selection=Selection(triads=tree.nodes, projections=leaves + ((nj - 1, nj),),
                            m_sum=(0,) * nj + (-1,) + (1,) * n),
    )


STATE3 = state_kind("state3", TREE3, state3, "coefficient of a product state in a coupled state of three angular "
                    "momenta", max_j=5000, seconds_at_max_j=0.6)  # all j = 5000: ~0.6 s (measured, CG products)
STATE4 = state_kind("state4", TREE4, state4, "coefficient of a product state in a coupled state of four angular "
                    "momenta", max_j=5000, seconds_at_max_j=0.7)  # all j = 5000: ~0.7 s (measured, CG products)

"""A short path of elementary moves from one coupling tree to another.

The search runs on unordered trees (a node is the frozenset of its two
parts), because an exchange is only a phase: it costs nothing and is added
afterwards, when the path is laid onto the ordered trees.  The costly moves
are re-association (a 6j, cost 4) and the four-leaf change (one 9j, cost 6,
instead of three 6j and a sum).  A* with "missing target couplings" as the
admissible estimate (a move creates at most one, a 9j at most two) finds a
cheapest path.  The number of unordered trees grows as (2n-3)!! (945 for six
leaves), so the search is bounded: beyond MAX_SEARCH trees a weighted A*
(estimate x4, short but not always shortest) takes over, and beyond its own
bound the request is refused with a TooLargeError.

The result is a :class:`Plan`: the ordered steps with every participating
value named (leaf, tree-1 or tree-2 name, or a fresh summation name), which
both the evaluation (coefficient.py) and the formula (working.py) read.
"""

from __future__ import annotations

import heapq
from functools import lru_cache
from itertools import count
from typing import NamedTuple, Union

from ..errors import TooLargeError
from .trees import Leaf, Node, Tree, TreePair, clade, nodes, tree_text

__all__ = ["Step", "Plan", "plan_path", "MAX_SEARCH"]

#: Unordered trees the exact search may visit; beyond it a greedy (weighted) search takes
#: over with the same budget, and beyond that the request is refused.
MAX_SEARCH = 5_000
_GREEDY_WEIGHT = 4
_GREEDY_SEARCH = 10 * MAX_SEARCH

Shape = Union[str, frozenset]  # unordered: a leaf name or a frozenset of two shapes
Ordered = Union[str, tuple]  # ordered: a leaf name or (left, right)

_COST_6J, _COST_9J, _PER_CLADE = 4, 6, 3


class Step(NamedTuple):
    """One move on the ordered tree, with the values it involves named.

    kind "exchange": args (x, y, z), |(x y)z> = (-1)^(x+y-z) |(y x)z>.
    kind "reassociate": args (a, b, c, e, f, g), overlap <((a b)e c)f|(a (b c)g)f>.
    kind "four-leaf": args (a, b, c, d, e, h, g, k, j), overlap of moves.four_leaf.
    ``created`` lists (name, ranges): each range is a pair of names (x, y)
    whose triangle bounds the new value; ``destroyed`` the names that go.
    """

    kind: str
    args: tuple[str, ...]
    before: str
    after: str
    created: tuple[tuple[str, tuple[tuple[str, str], ...]], ...] = ()
    destroyed: tuple[str, ...] = ()


class Plan(NamedTuple):
    """The whole path: steps, summation names, and names that must agree at the end."""

    steps: tuple[Step, ...]
    summed: tuple[str, ...]
    deltas: tuple[tuple[str, str], ...]  # (tree-1 name, tree-2 name) of one coupling
    first: str
    second: str


# -- shapes -----------------------------------------------------------------
def _ordered(t: Tree) -> Ordered:
    return t.name if isinstance(t, Leaf) else (_ordered(t.left), _ordered(t.right))


def _unordered(o: Ordered) -> Shape:
    return o if isinstance(o, str) else frozenset((_unordered(o[0]), _unordered(o[1])))


@lru_cache(maxsize=1 << 16)
def _clade(s: Shape) -> frozenset:
    if isinstance(s, str):
        return frozenset((s,))
    a, b = tuple(s)
    return _clade(a) | _clade(b)


def _clades(s: Shape) -> frozenset:
    """The leaf sets of all coupling nodes."""
    out: set = set()
    stack = [s]
    while stack:
        x = stack.pop()
        if not isinstance(x, str):
            out.add(_clade(x))
            stack.extend(x)
    return frozenset(out)


def _neighbours(s: Shape, ninej: bool):
    """(cost, shape, move) for every move at every node; move names clades."""
    if isinstance(s, str):
        return
    x, y = tuple(s)
    for child, other in ((x, y), (y, x)):
        if not isinstance(child, str):
            p, q = tuple(child)
            for stay, move in ((p, q), (q, p)):
                new = frozenset((move, other))
                yield _COST_6J, frozenset((stay, new)), ("r", _clade(s), _clade(child), _clade(new))
    if ninej and not isinstance(x, str) and not isinstance(y, str):
        a, b = tuple(x)
        c, d = tuple(y)
        for g, k in ((frozenset((a, c)), frozenset((b, d))), (frozenset((a, d)), frozenset((b, c)))):
            yield _COST_9J, frozenset((g, k)), ("9", _clade(s), (_clade(x), _clade(y)), (_clade(g), _clade(k)))
    for child, other in ((x, y), (y, x)):
        for cost, new, move in _neighbours(child, ninej):
            yield cost, frozenset((new, other)), move


def _search(start: Shape, goal: Shape, ninej: bool, leaves: int) -> list[tuple]:
    """A cheapest list of unordered moves (A*), or a short one (weighted A*) for big trees."""
    try:
        return _astar(start, goal, ninej, 1, MAX_SEARCH)
    except _Budget:
        pass
    try:
        return _astar(start, goal, ninej, _GREEDY_WEIGHT, _GREEDY_SEARCH)
    except _Budget:
        raise TooLargeError(
            f"a path between two trees of {leaves} leaves", f"more than {_GREEDY_SEARCH} trees searched",
            "the path search is bounded; split the change into smaller recouplings",
        ) from None


class _Budget(Exception):
    """The search visited MAX_SEARCH trees."""


def _astar(start: Shape, goal: Shape, ninej: bool, weight: int, budget: int) -> list[tuple]:
    target = _clades(goal)
    per = weight * (_PER_CLADE if ninej else _COST_6J)

    def h(s: Shape) -> int:
        return per * len(target - _clades(s))

    tie = count()
    frontier = [(h(start), next(tie), 0, start)]
    best = {start: 0}
    back: dict = {start: None}
    while frontier:
        _, _, g, s = heapq.heappop(frontier)
        if s == goal:
            moves = []
            while back[s] is not None:
                prev, move = back[s]
                moves.append(move)
                s = prev
            return moves[::-1]
        if g > best.get(s, g):
            continue
        if len(best) > budget:
            raise _Budget
        for cost, new, move in _neighbours(s, ninej):
            ng = g + cost
            if ng < best.get(new, ng + 1):
                best[new] = ng
                back[new] = (s, move)
                heapq.heappush(frontier, (ng + h(new), next(tie), ng, new))
    raise AssertionError("unreachable: every two trees over the same leaves are connected")


# -- laying the path onto ordered trees ---------------------------------------
class _Walker:
    """The ordered tree along the path, with a name for every coupling."""

    def __init__(self, pair: TreePair, final_names: dict, used: set) -> None:
        self.tree: Ordered = _ordered(pair.first)
        self.name = {clade(n): n.name for n in nodes(pair.first)}
        for leaf in pair.leaf_names():
            self.name[frozenset((leaf,))] = leaf
        self.final, self.used, self.fresh = final_names, used, count(1)
        self.steps: list[Step] = []
        self.summed: list[str] = []

    def text(self, o: Ordered | None = None) -> str:
        o = self.tree if o is None else o
        if isinstance(o, str):
            return o
        return f"({self.text(o[0])} {self.text(o[1])}){self.name[_oclade(o)]}"

    def new_name(self, c: frozenset, persists: bool) -> str:
        if persists:
            return self.final[c]
        while True:
            n = f"x{next(self.fresh)}"
            if n not in self.used:
                self.used.add(n)
                self.summed.append(n)
                return n

    def replace(self, c: frozenset, build) -> None:
        """Rebuild the tree with the node of leaf set c replaced by build(node)."""

        def walk(o: Ordered) -> Ordered:
            if isinstance(o, str):
                return o
            if _oclade(o) == c:
                return build(o)
            left, right = o
            if c <= _oclade(left):
                return (walk(left), right)
            return (left, walk(right))

        self.tree = walk(self.tree)

    def find(self, c: frozenset) -> Ordered:
        o = self.tree
        while _oclade(o) != c:
            o = o[0] if c <= _oclade(o[0]) else o[1]
        return o

    def exchange(self, c: frozenset) -> None:
        o = self.find(c)
        before = self.text()
        self.replace(c, lambda n: (n[1], n[0]))
        x, y = self.name[_oclade(o[0])], self.name[_oclade(o[1])]
        self.steps.append(Step("exchange", (x, y, self.name[c]), before, self.text()))

    def rotate(self, f: frozenset, e: frozenset, g: frozenset, persists: bool) -> None:
        """At node f, destroy its part e = A u B and create g = B u C."""
        node = self.find(f)
        left_is_e = _oclade(node[0]) == e
        enode = node[0] if left_is_e else node[1]
        b_clade = g & e
        # ((A B)e C)f -> (A (B C)g)f needs B on the right of e; the mirror needs it on the left
        if (_oclade(enode[1]) == b_clade) != left_is_e:
            self.exchange(e)
            node = self.find(f)
            enode = node[0] if left_is_e else node[1]
        before = self.text()
        gname = self.new_name(g, persists)
        self.name[g] = gname
        n = self.name
        if left_is_e:
            (a, b), c = enode, node[1]
            args = (n[_oclade(a)], n[_oclade(b)], n[_oclade(c)], n[e], n[f], gname)
            self.replace(f, lambda _: (a, (b, c)))
        else:
            c, (b, a) = node[0], enode
            args = (n[_oclade(c)], n[_oclade(b)], n[_oclade(a)], gname, n[f], n[e])
            self.replace(f, lambda _: ((c, b), a))
        ranges = ((n[_oclade(b)], n[_oclade(c)]), (n[_oclade(a)], n[f]))
        self.steps.append(Step("reassociate", args, before, self.text(), ((gname, ranges),), (n[e],)))

    def four_leaf(self, f: frozenset, olds: tuple, news: tuple, persists: tuple) -> None:
        """At node f = (E H), make the new pairs G = A u C and K = B u D."""
        node = self.find(f)
        g_clade, k_clade = news
        # arrange ((A B)e (C D)h)j with A, C in G and B, D in K; G is the pair holding A
        if g_clade.isdisjoint(_oclade(node[0][0])):
            g_clade, k_clade = k_clade, g_clade
            persists = persists[::-1]
        if g_clade.isdisjoint(_oclade(node[1][0])):
            self.exchange(_oclade(node[1]))
        node = self.find(f)
        before = self.text()
        (a, b), (c, d) = node
        n = self.name
        gname = self.new_name(g_clade, persists[0])
        n[g_clade] = gname
        kname = self.new_name(k_clade, persists[1])
        n[k_clade] = kname
        na, nb, nc, nd = (n[_oclade(x)] for x in (a, b, c, d))
        args = (na, nb, nc, nd, n[_oclade(node[0])], n[_oclade(node[1])], gname, kname, n[f])
        destroyed = (n[_oclade(node[0])], n[_oclade(node[1])])
        self.replace(f, lambda _: ((a, c), (b, d)))
        created = ((gname, ((na, nc),)), (kname, ((nb, nd), (gname, n[f]))))
        self.steps.append(Step("four-leaf", args, before, self.text(), created, destroyed))


@lru_cache(maxsize=1 << 16)
def _oclade(o: Ordered) -> frozenset:
    return frozenset((o,)) if isinstance(o, str) else _oclade(o[0]) | _oclade(o[1])


@lru_cache(maxsize=4096)
def plan_path(pair: TreePair, ninej: bool = True) -> Plan:
    """The steps from pair.first to pair.second (cached per pair of trees)."""
    start, goal = _unordered(_ordered(pair.first)), _unordered(_ordered(pair.second))
    moves = _search(start, goal, ninej, len(pair.leaf_names()))
    final_names = {clade(n): n.name for n in nodes(pair.second)}
    # a coupling keeps its tree-2 name only if no later move destroys it
    walker = _Walker(pair, final_names, set(pair.names()))
    for i, move in enumerate(moves):
        later_destroyed = set()
        for m in moves[i + 1:]:
            later_destroyed.update((m[2],) if m[0] == "r" else m[2])
        if move[0] == "r":
            _, f, e, g = move
            walker.rotate(f, e, g, g in final_names and g not in later_destroyed)
        else:
            _, f, olds, news = move
            walker.four_leaf(f, olds, news, tuple(c in final_names and c not in later_destroyed for c in news))
    # exchanges to reach tree 2's order, top-down
    stack: list[Tree] = [pair.second]
    while stack:
        t = stack.pop()
        if isinstance(t, Node):
            c = clade(t)
            if _oclade(walker.find(c)[0]) != clade(t.left):
                walker.exchange(c)
            stack.extend((t.left, t.right))
    deltas = tuple(
        (walker.name[c], name) for c, name in sorted(final_names.items(), key=lambda kv: kv[1])
        if walker.name[c] != name
    )
    return Plan(tuple(walker.steps), tuple(walker.summed), deltas, pair.first_text, tree_text(pair.second))

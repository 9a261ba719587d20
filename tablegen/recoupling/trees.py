"""Binary coupling trees: the notation, its strict parser, and the checks on a pair.

Notation (designed for tablegen, close to how physicists write a coupling)::

    ((a b)e c)f        a and b couple to e; e and c couple to f
    ((a b)e, (c d)g)J  a comma between the two parts is allowed

* A node is ``(`` part part ``)`` followed at once by the name of the value
  the two parts couple to; a part is a name (a leaf) or a node.
* Names are ASCII identifiers: a letter or ``_``, then letters, digits, ``_``.
* The order inside a node is the order of the Clebsch-Gordan coefficient
  ``<x mx; y my | z mz>``: swapping the two parts costs a phase.
* Values are bound to names separately (``a=1 b=1/2 c=1 e=3/2 f=5/2``).

Every rule that fails raises a one-line :class:`~tablegen.errors.TreeError`
naming the tree, the character position (counted from 1) and the rule.
"""

from __future__ import annotations

from typing import NamedTuple, Iterator, Union

from ..errors import QuantumNumberError, TreeError
from ..spins import half_text, parse_j

__all__ = ["Leaf", "Node", "Tree", "parse_tree", "TreePair", "parse_pair", "tree_text"]


class Leaf(NamedTuple):
    """One angular momentum being coupled."""

    name: str
    position: int = 0


class Node(NamedTuple):
    """Two parts coupled to the value called ``name``."""

    left: "Tree"
    right: "Tree"
    name: str
    position: int = 0


Tree = Union[Leaf, Node]

_START = frozenset("abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ_")
_REST = _START | frozenset("0123456789")


def tree_text(t: Tree) -> str:
    """The canonical text of a tree (one space between parts)."""
    if isinstance(t, Leaf):
        return t.name
    return f"({tree_text(t.left)} {tree_text(t.right)}){t.name}"


def leaves(t: Tree) -> Iterator[Leaf]:
    """The leaves from left to right."""
    if isinstance(t, Leaf):
        yield t
    else:
        yield from leaves(t.left)
        yield from leaves(t.right)


def nodes(t: Tree) -> Iterator[Node]:
    """The coupling nodes, children before parents."""
    if isinstance(t, Node):
        yield from nodes(t.left)
        yield from nodes(t.right)
        yield t


def clade(t: Tree) -> frozenset[str]:
    """The names of the leaves below a part: what a node couples, whatever the order."""
    return frozenset(leaf.name for leaf in leaves(t))


class _Parser:
    """Recursive descent over one tree text; positions are 1-based."""

    def __init__(self, text: str, which: str) -> None:
        self.text, self.which, self.i = text, which, 0

    def fail(self, rule: str, at: int | None = None) -> TreeError:
        return TreeError(self.which, self.text, (self.i if at is None else at) + 1, rule)

    def skip(self) -> None:
        while self.i < len(self.text) and self.text[self.i] in " \t":
            self.i += 1

    def name(self, what: str) -> tuple[str, int]:
        start = self.i
        if start >= len(self.text) or self.text[start] not in _START:
            found = "the end" if start >= len(self.text) else repr(self.text[start])
            raise self.fail(f"expected {what} (a letter or _ first), found {found}")
        self.i += 1
        while self.i < len(self.text) and self.text[self.i] in _REST:
            self.i += 1
        return self.text[start:self.i], start + 1

    def part(self) -> Tree:
        self.skip()
        if self.i < len(self.text) and self.text[self.i] == "(":
            return self.node()
        name, pos = self.name("'(' or a leaf name")
        return Leaf(name, pos)

    def node(self) -> Node:
        opened = self.i
        self.i += 1  # the '('
        left = self.part()
        self.skip()
        if self.i < len(self.text) and self.text[self.i] == ",":
            self.i += 1
        self.skip()
        if self.i < len(self.text) and self.text[self.i] == ")":
            raise self.fail("a node couples exactly two parts, found one")
        right = self.part()
        self.skip()
        if self.i >= len(self.text):
            raise self.fail(f"'(' at character {opened + 1} is never closed")
        if self.text[self.i] != ")":
            if self.text[self.i] in _START or self.text[self.i] in "(,":
                raise self.fail("a node couples exactly two parts, found a third")
            raise self.fail(f"unexpected character {self.text[self.i]!r}")
        self.i += 1
        if self.i >= len(self.text) or self.text[self.i] not in _START:
            raise self.fail("every ')' must be followed at once by the name of the coupled value")
        name, pos = self.name("the name of the coupled value")
        return Node(left, right, name, pos)

    def tree(self) -> Node:
        if not isinstance(self.text, str):
            raise TreeError(self.which, str(self.text), None, "a tree must be given as text")
        self.skip()
        if self.i >= len(self.text):
            raise self.fail("the tree is empty")
        if self.text[self.i] != "(":
            raise self.fail("a tree starts with '(' : it couples at least two angular momenta")
        t = self.node()
        self.skip()
        if self.i < len(self.text):
            raise self.fail(f"text after the end of the tree: {self.text[self.i]!r}")
        return t


def parse_tree(text: str, which: str = "tree") -> Node:
    """Parse one tree and check that its names are distinct (TreeError otherwise)."""
    t = _Parser(text, which).tree()
    seen: dict[str, tuple[str, int]] = {}
    for item in list(leaves(t)) + list(nodes(t)):
        kind = "leaf" if isinstance(item, Leaf) else "intermediate"
        if item.name in seen:
            first_kind, first_pos = seen[item.name]
            rule = (f"{kind} {item.name} used twice (first at character {first_pos})" if kind == first_kind
                    else f"name {item.name} clashes: {kind} here, {first_kind} at character {first_pos}")
            raise TreeError(which, text, item.position, rule)
        seen[item.name] = (kind, item.position)
    return t


class TreePair(NamedTuple):
    """Two trees over the same leaves, checked against each other."""

    first: Node
    second: Node
    first_text: str
    second_text: str

    def leaf_names(self) -> tuple[str, ...]:
        return tuple(leaf.name for leaf in leaves(self.first))

    def intermediate_names(self, which: int) -> tuple[str, ...]:
        """Names of the inner nodes of tree 1 or 2 (not the total), bottom-up."""
        t = self.first if which == 1 else self.second
        return tuple(n.name for n in nodes(t) if n is not t)

    def names(self) -> tuple[str, ...]:
        """Every name in either tree, each once: leaves, then tree 1, then tree 2."""
        out: list[str] = list(self.leaf_names())
        for t in (self.first, self.second):
            for n in nodes(t):
                if n.name not in out:
                    out.append(n.name)
        return tuple(out)


def parse_pair(text1: str, text2: str) -> TreePair:
    """Parse two trees and check that they couple the same leaves consistently."""
    t1, t2 = parse_tree(text1, "tree 1"), parse_tree(text2, "tree 2")
    l1 = {leaf.name: leaf for leaf in leaves(t1)}
    l2 = {leaf.name: leaf for leaf in leaves(t2)}
    for name, leaf in l1.items():
        if name not in l2:
            raise TreeError("tree 1", text1, leaf.position, f"leaf {name} is missing from tree 2")
    for name, leaf in l2.items():
        if name not in l1:
            raise TreeError("tree 2", text2, leaf.position, f"leaf {name} is missing from tree 1")
    inner1 = {n.name: n for n in nodes(t1)}
    for n in nodes(t2):
        other = inner1.get(n.name)
        if other is not None and clade(other) != clade(n):
            rule = (f"name {n.name} clashes: it couples {' '.join(sorted(clade(n)))} here"
                    f" but {' '.join(sorted(clade(other)))} in tree 1")
            raise TreeError("tree 2", text2, n.position, rule)
    return TreePair(t1, t2, text1, text2)


def bind_values(pair: TreePair, values: dict, *, free: tuple[str, ...] = (), max_j: int | None = None) -> dict[str, int]:
    """Doubled values for every name of the pair except those in ``free``.

    A missing value, a value for a name in neither tree, or totals that differ
    each raise a one-line error naming the argument.
    """
    known = pair.names()
    for name in values:
        if name not in known:
            raise QuantumNumberError(name, values[name], "not a name in either tree")
    out: dict[str, int] = {}
    for name in known:
        if name in free:
            if name in values:
                raise QuantumNumberError(name, values[name], "an intermediate of a matrix is an index: give no value")
            continue
        if name not in values:
            raise QuantumNumberError(name, "(missing)", "every leaf, intermediate and total needs a value")
        out[name] = parse_j(values[name], name, max_j)
    r1, r2 = pair.first.name, pair.second.name
    if r1 != r2 and out[r1] != out[r2]:
        raise QuantumNumberError(
            r2, half_text(out[r2]), f"unequal totals: tree 1 couples to {r1} = {half_text(out[r1])}"
        )
    return out

"""The tree notation: strict parsing, one-line errors naming the place and the rule, fuzz."""

from __future__ import annotations

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from tablegen.errors import QuantumNumberError, TablegenError, TreeError
from tablegen.recoupling import recoupling, recoupling_matrix
from tablegen.values.surd import Surd
from tablegen.recoupling.trees import leaves, parse_pair, parse_tree, tree_text


def test_the_issue_example_parses():
    t = parse_tree("((a b)e c)f")
    assert tree_text(t) == "((a b)e c)f"
    assert [leaf.name for leaf in leaves(t)] == ["a", "b", "c"]
    assert t.name == "f" and t.left.name == "e"
    assert tree_text(parse_tree("  ((j1, j2)j12 , (j3 j4)j34)J ")) == "((j1 j2)j12 (j3 j4)j34)J"


@pytest.mark.parametrize("text,position,rule", [
    ("((a b)e c", 10, "never closed"),
    ("((a b) c)f", 7, "followed at once by the name"),
    ("((a b)e c)", 11, "followed at once by the name"),
    ("((a b c)e d)f", 7, "exactly two parts, found a third"),
    ("((a)e b)f", 4, "exactly two parts, found one"),
    ("a", 1, "starts with '('"),
    ("", 1, "empty"),
    ("((a b)e c)f g", 13, "text after the end"),
    ("((a 1b)e c)f", 5, "expected '(' or a leaf name"),
    ("((a b)e a)f", 9, "leaf a used twice (first at character 3)"),
    ("((a b)a c)f", 7, "name a clashes"),
    ("((a b)e (c d)e)f", 14, "intermediate e used twice (first at character 7)"),
    ("((a b)e c)e", 11, "intermediate e used twice"),
    ("((a+b)e c)f", 4, "found '+'"), ("((a b)e c+)f", 10, "unexpected character '+'"),
])
def test_malformed_tree_errors(text, position, rule):
    with pytest.raises(TreeError) as info:
        parse_tree(text, "tree 1")
    message = str(info.value)
    assert "\n" not in message and rule in message and f"at character {position}:" in message
    assert message.startswith("tree 1 ") and info.value.position == position


def test_pair_errors():
    with pytest.raises(TreeError, match=r"tree 1 .* at character 9: leaf c is missing from tree 2"):
        parse_pair("((a b)e c)f", "((a b)e d)f")
    with pytest.raises(TreeError, match=r"tree 2 .*: name e clashes: it couples b c here but a b in tree 1"):
        parse_pair("((a b)e c)f", "(a (b c)e)f")
    with pytest.raises(TreeError, match=r"tree 2 .* at character 12: leaf d is missing from tree 1"):
        parse_pair("((a b)e c)f", "((a b)e (c d)h)f")
    with pytest.raises(QuantumNumberError, match=r"argument F = '3/2': unequal totals: tree 1 couples to f = 5/2"):
        recoupling("((a b)e c)f", "(a (b c)g)F", a=1, b=1, c="1/2", e=2, f="5/2", g="3/2", F="3/2")
    with pytest.raises(QuantumNumberError, match=r"argument g = '\(missing\)'"):
        recoupling("((a b)e c)f", "(a (b c)g)f", a=1, b=1, c="1/2", e=2, f="5/2")
    with pytest.raises(QuantumNumberError, match=r"argument z = 1: not a name in either tree"):
        recoupling("((a b)e c)f", "(a (b c)g)f", a=1, b=1, c="1/2", e=2, f="5/2", g=1, z=1)
    with pytest.raises(QuantumNumberError, match=r"argument e = 1: an intermediate of a matrix is an index"):
        recoupling_matrix("((a b)e c)f", "(a (b c)g)f", a=1, b=1, c=1, e=1, f=1)
    with pytest.raises(QuantumNumberError, match=r"argument a = '1/3': not a multiple of 1/2"):
        recoupling("((a b)e c)f", "(a (b c)g)f", a="1/3", b=1, c=1, e=1, f=1, g=1)


_PIECES = st.sampled_from(list("()ab cde,fg1_+)(") + ["\t", "\u00e9", "\n", "))", "((", "(a b)", "e"])


@settings(max_examples=400, deadline=None)
@given(st.lists(_PIECES, max_size=20).map("".join))
def test_fuzz_random_text_gives_one_line_errors(text):
    # any text either parses or raises a one-line TreeError; nothing else escapes
    try:
        t = parse_tree(text, "tree 1")
    except TreeError as e:
        message = str(e)
        assert "\n" not in message and message.startswith("tree 1 ")
        return
    assert tree_text(parse_tree(tree_text(t))) == tree_text(t)


@pytest.mark.parametrize("bad", [None, 3, ["(a b)c"], b"(a b)c"])
def test_a_tree_that_is_not_text(bad):
    with pytest.raises(TreeError, match="a tree must be given as text"):
        recoupling(bad, "(a b)c", a=1, b=1, c=1)


_GOOD = ["((a b)e c)f", "(a (b c)g)f", "((c a)h b)f", "((a b)e (c d)k)f", "(((a b)e c)g d)f"]


@settings(max_examples=300, deadline=None)
@given(st.sampled_from(_GOOD), st.sampled_from(_GOOD), st.integers(0, 12), st.sampled_from(list("()ab x,")),
       st.dictionaries(st.sampled_from(list("abcdefghkz")), st.sampled_from([0, 1, "1/2", "3/2", "x", -1, 2.5, None])))
def test_fuzz_mutated_pairs_and_values_never_traceback(t1, t2, where, char, values):
    # a good tree with one character changed, and random values: a value or a TablegenError
    mutated = t2[:where] + char + t2[where + 1:]
    try:
        value = recoupling(t1, mutated, **values)
    except TablegenError as e:
        assert "\n" not in str(e)
    else:
        assert isinstance(value, Surd)

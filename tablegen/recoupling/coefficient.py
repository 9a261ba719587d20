"""Recoupling coefficients <tree1|tree2>, exactly, by summing along a path of moves.

The path (paths.py) is walked once per coefficient.  The running state maps
the values of the summation couplings alive at that point to the overlap of
tree 1 with the current tree; a re-association branches over the allowed
values of the coupling it creates and a coupling that disappears is summed
out, so the nested sum costs one pass over small dictionaries.  Every sum is
exact (see _exact.py); the moves are cached functions of doubled ints.
"""

from __future__ import annotations

from functools import lru_cache

from ..errors import TreeError
from ..values.surd import Surd
from ._exact import surd_sum
from .moves import allowed, exchange_sign, four_leaf, reassociate
from .paths import Plan, plan_path
from .trees import TreePair, bind_values, nodes, parse_pair

__all__ = ["recoupling", "evaluate", "pair_of", "tree_allowed"]

_ZERO = Surd._trusted(0, 0, 1)
_ONE = Surd._trusted(1, 1, 1)


def pair_of(text1: str, text2: str) -> TreePair:
    """Parsed and cross-checked trees, cached by their texts."""
    for which, text in (("tree 1", text1), ("tree 2", text2)):
        if not isinstance(text, str):
            raise TreeError(which, repr(text), None, "a tree must be given as text")
    return _pair_cached(text1, text2)


@lru_cache(maxsize=4096)
def _pair_cached(text1: str, text2: str) -> TreePair:
    return parse_pair(text1, text2)


@lru_cache(maxsize=4096)
def _triads(pair: TreePair) -> tuple[tuple[str, str, str], ...]:
    out = []
    for t in (pair.first, pair.second):
        for n in nodes(t):
            out.append((n.left.name, n.right.name, n.name))
    return tuple(out)


def tree_allowed(pair: TreePair, tj: dict[str, int]) -> bool:
    """True when every coupling of both trees obeys the triad rule."""
    return all(allowed(tj[x], tj[y], tj[z]) for x, y, z in _triads(pair))


def _values_of(name: str, ranges, env: dict[str, int]):
    """The doubled values a new coupling may take, from its bounding triangles."""
    lo, hi, parity = 0, 1 << 62, None
    for x, y in ranges:
        tx, ty = env[x], env[y]
        lo, hi = max(lo, abs(tx - ty)), min(hi, tx + ty)
        parity = (tx + ty) & 1
    if (lo & 1) != parity:
        lo += 1
    return range(lo, hi + 1, 2)


def evaluate(plan: Plan, fixed: dict[str, int]) -> Surd:
    """<tree1|tree2> for doubled values of every leaf, intermediate and total."""
    for a, b in plan.deltas:
        if fixed[a] != fixed[b]:
            return _ZERO
    states: dict[tuple, Surd] = {(): _ONE}
    for step in plan.steps:
        if step.kind == "exchange":
            new_states = {}
            for key, value in states.items():
                env = fixed if not key else {**fixed, **dict(key)}
                x, y, z = (env[n] for n in step.args)
                new_states[key] = value if exchange_sign(x, y, z) > 0 else -value
            states = new_states
            continue
        move = reassociate if step.kind == "reassociate" else four_leaf
        sums: dict[tuple, list[Surd]] = {}
        for key, value in states.items():
            env = {**fixed, **dict(key)}
            for choice in _choices(step.created, env, fixed):
                env.update(choice)
                factor = move(*(env[n] for n in step.args))
                if factor:
                    alive = {k: v for k, v in key if k not in step.destroyed}
                    alive.update((k, v) for k, v in choice.items() if k not in fixed)
                    sums.setdefault(tuple(sorted(alive.items())), []).append(value * factor)
        states = {k: total for k, terms in sums.items() if (total := surd_sum(terms))}
    return states.get((), _ZERO)


def _choices(created, env: dict[str, int], fixed: dict[str, int]):
    """Every assignment of the couplings a move creates (one if they are fixed)."""
    if not created:
        yield {}
        return
    (name, ranges), rest = created[0], created[1:]
    options = (fixed[name],) if name in fixed else _values_of(name, ranges, env)
    for v in options:
        inner = {**env, name: v}
        for more in _choices(rest, inner, fixed):
            yield {name: v, **more}


def recoupling(tree1: str, tree2: str, **values) -> Surd:
    """<tree1|tree2> exactly, e.g. recoupling("((a b)e c)f", "(a (b c)g)f", a=1, ...).

    Every leaf, intermediate and total needs a value; a coupling that breaks
    the triad rule makes the coefficient exactly zero (the state does not
    exist), as for the 6j.
    """
    pair = pair_of(tree1, tree2)
    tj = bind_values(pair, values)
    if not tree_allowed(pair, tj):
        return _ZERO
    return evaluate(plan_path(pair), tj)

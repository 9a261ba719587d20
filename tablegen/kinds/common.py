"""What the kind modules share: argument parsing and the selection-rule texts."""

from __future__ import annotations

from ..spins import parse_j
from ..triads import triad_failure
from . import ZeroRule

__all__ = ["CACHE_ENTRIES", "CACHE_MAX_J", "TRIAD_TEXT", "check_count", "parse_js", "triad_zero", "projection_zero", "first_triad_zero"]

#: Largest number of values each kind's cache keeps (least recently used go first).
CACHE_ENTRIES = 1 << 16
#: Only symbols with every j <= this are cached, bounding each cached value's size.
CACHE_MAX_J = 40

TRIAD_TEXT = {"triad-sum": "do not add up to an integer", "triangle": "violate the triangle rule"}


def check_count(key: str, names: Sequence[str], values: Sequence[object]) -> None:
    """TypeError unless one value per argument name."""
    if len(values) != len(names):
        raise TypeError(f"{key} takes {len(names)} arguments ({' '.join(names)}), got {len(values)}")


def parse_js(key: str, names: Sequence[str], values: Sequence[object], max_j: "int | None") -> tuple[int, ...]:
    """Doubled j's, one per name (QuantumNumberError naming the argument)."""
    check_count(key, names, values)
    return tuple([parse_j(v, n, max_j) for n, v in zip(names, values)])


def triad_zero(ta: int, tb: int, tc: int, names: str) -> "ZeroRule | None":
    """The ZeroRule of a triad that cannot couple, or None if it can."""
    rid = triad_failure(ta, tb, tc)
    return None if rid is None else ZeroRule(rid, f"{names} {TRIAD_TEXT[rid]}")


def first_triad_zero(t: Sequence[int], names: Sequence[str], triads: Sequence[tuple[int, int, int]]) -> "ZeroRule | None":
    """The first failing triad among argument positions ``triads``."""
    for i, k, n in triads:
        rule = triad_zero(t[i], t[k], t[n], f"{names[i]}, {names[k]}, {names[n]}")
        if rule:
            return rule
    return None


def projection_zero(pairs: Sequence[tuple[int, int, str]], total: int, sum_text: str) -> "ZeroRule | None":
    """|m| > j for some (tj, tm, name), else a non-zero m sum, else None."""
    for tj, tm, name in pairs:
        if abs(tm) > tj:
            return ZeroRule("m-range", f"|{name}| > its j")
    if total:
        return ZeroRule("m-sum", sum_text)
    return None

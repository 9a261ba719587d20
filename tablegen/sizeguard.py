"""The size guard: how many values and how much time a recipe costs, judged before computing.

For each family, from its actual range (doubled j from min_tj to max_tj):

* grid families (CG, 3j): the exact number of entries, from a closed form per
  coupling (j1, j2) summed over the range by exact polynomial extrapolation
  (O(1) whatever the range);
* symmetry-class families (6j, 9j): the exact number of classes, by
  enumerating the admissible symbols when there are at most
  ``ENUMERATION_BUDGET`` of them; beyond that, bounds: at least
  (symbols / class size) and at most the number of symbols, the symbols
  estimated by a fixed-seed sample of the box (the plan must enumerate them
  all, so they also give the planning time);
* time: values x (the kind's time at the largest j + rendering) plus the
  symbols to plan.

A recipe is refused (TooLargeError) when it asks for j above a kind's
one-value limit, at least VALUE_LIMIT values, or more than TIME_LIMIT seconds,
unless ``allow_large`` (``build --allow-large``) insists.
"""

from __future__ import annotations

from math import comb

from .errors import TooLargeError
from .limits import TIME_LIMIT, VALUE_LIMIT

__all__ = ["FamilyEstimate", "estimate_family", "estimate_size", "check_size", "pair_count", "ENUMERATION_BUDGET"]

#: Loop steps spent enumerating symbols before switching to bounds (about half a second).
ENUMERATION_BUDGET = 250_000
#: Rendering and writing one value (HTML, LaTeX, data), and planning one symbol (measured, rounded up).
SECONDS_PER_VALUE = 2e-4
SECONDS_PER_SYMBOL = 5e-6
_SAMPLES = 20_000


class FamilyEstimate:
    """Values of one family (low == high when exact), symbols to plan, and seconds."""

    __slots__ = ("family", "low", "high", "symbols", "seconds", "largest_tj")

    def __init__(self, family: str, low: int, high: int, symbols: int, seconds: float, largest_tj: int) -> None:
        self.family, self.low, self.high = family, low, high
        self.symbols, self.seconds, self.largest_tj = symbols, seconds, largest_tj

    @property
    def exact(self) -> bool:
        return self.low == self.high

    def describe(self) -> str:
        count = f"{self.low:,}" if self.exact else f"{self.low:,} to {self.high:,}"
        return f"{self.family}: {count}"


def pair_count(a: int, b: int) -> int:
    """Entries <j1 m1; j2 m2 | J M> of one coupling, doubled a = 2j1, b = 2j2 (every J, M, m1).

    For j1 >= j2 and each J from j1 - j2 to j1 + j2, sum over |M| <= J the
    number of m1 with |m1| <= j1, |M - m1| <= j2; with t = J - (j1 - j2) that
    is (2d+1)(2j2+1) + t(4j2+1) - t^2, and summing t = 0..2j2 gives
    (b+1)^2 (a-b+1) + b(b+1)(2b+1)/3 (checked against the plan in the tests).
    """
    if a < b:
        a, b = b, a
    return (b + 1) ** 2 * (a - b + 1) + b * (b + 1) * (2 * b + 1) // 3


def _box_pairs(lo: int, n: int) -> int:
    return sum(pair_count(a, b) for a in range(lo, lo + n) for b in range(lo, lo + n))


def _grid_count(lo: int, hi: int) -> int:
    """Sum of pair_count over the box, exactly: a degree-5 polynomial in the width, extrapolated."""
    n = hi - lo + 1
    samples = [_box_pairs(lo, k) for k in range(7)]
    if n < len(samples):
        return samples[n]
    diffs, total = samples, 0
    for k in range(7):  # Newton's forward differences: P(n) = sum_k delta^k P(0) * C(n, k)
        total += diffs[0] * comb(n, k)
        diffs = [y - x for x, y in zip(diffs, diffs[1:])]
    return total


def _sampled_symbols(kind, lo: int, hi: int) -> int:
    """Admissible symbols in the box, estimated from a fixed-seed sample (deterministic)."""
    import random

    from .triads import is_triad

    rng = random.Random(20260401)
    size = len(kind.arguments)
    hits = 0
    for _ in range(_SAMPLES):
        t = [rng.randint(lo, hi) for _ in range(size)]
        hits += all(is_triad(t[i], t[k], t[m]) for i, k, m in kind.triads)
    return max(1, (hits * (hi - lo + 1) ** size) // _SAMPLES)


def _class_count(kind, layout, lo: int, hi: int) -> tuple[int, int, int]:
    """(low, high, symbols): exact classes as the layout files them when enumerable, else bounds.

    A class holds at most ``layout.class_size`` forms, so symbols / class_size bounds it from below;
    the enumeration is the plan's own, stopped after ENUMERATION_BUDGET steps.
    """
    from .layouts.classes import EnumerationBudget, symbols_in_range

    seen: set[tuple[int, ...]] = set()
    classes = symbols = 0
    try:
        for s in symbols_in_range(kind, lo, hi, ENUMERATION_BUDGET):
            symbols += 1
            if s in seen:
                continue
            classes += 1
            seen.update(m for m, _ in layout.filed_by(*s))
    except EnumerationBudget:
        estimated = max(symbols, _sampled_symbols(kind, lo, hi))
        return max(classes, -(-estimated // layout.class_size)), estimated, estimated
    return classes, classes, symbols


# -- families whose layout counts its own cells (the recoupling matrices, issue 10) ------------------------------
#: Above this many distinct j a layout's exact count is itself too slow; the guard then extrapolates.
_COUNT_SPAN = 13


def _layout_count(f) -> int | None:
    """Exact cells of a family whose layout record has a ``count``; None for the others.

    For a span of j beyond _COUNT_SPAN the count at that span is scaled by the
    span to the sixth power, enough for a guard against runaway builds.
    """
    from .families import family

    count = getattr(family(f.family).layout, "count", None)
    if count is None:
        return None
    n = f.max_tj - f.min_tj + 1
    if n <= _COUNT_SPAN or family(f.family).layout.count_closed:
        return count(f.min_tj, f.max_tj)
    return int(count(f.min_tj, f.min_tj + _COUNT_SPAN - 1) * (n / _COUNT_SPAN) ** 6)
# -- end of the layout counts ----------------------------------------------------------------------------------


def estimate_family(f) -> FamilyEstimate:
    """The estimate of one FamilyRange."""
    from .families import family
    from .kinds import kind

    fam = family(f.family)
    k = kind(fam.kind)
    if fam.layout.name == "classes":
        low, high, symbols = _class_count(k, fam.layout, f.min_tj, f.max_tj)
    else:
        counted = _layout_count(f)  # a layout that counts its own cells (matrix families)
        low = high = _grid_count(f.min_tj, f.max_tj) if counted is None else counted
        symbols = 0
    per_value = sum(kind(name).seconds(f.max_tj) for name in fam.kinds) + SECONDS_PER_VALUE
    seconds = low * per_value + symbols * SECONDS_PER_SYMBOL
    return FamilyEstimate(f.family, low, high, symbols, seconds, f.max_tj)


def estimate_size(recipe) -> dict[str, int]:
    """Values per family: exact where possible, else the proven lower bound."""
    return {f.family: estimate_family(f).low for f in recipe.families}


def check_size(recipe, allow_large: bool = False) -> dict[str, int]:
    """Refuse a recipe too large for this machine before anything is computed."""
    from .families import family
    from .kinds import kind
    from .spins import half_text

    estimates = [estimate_family(f) for f in recipe.families]
    if not allow_large:
        insist = "narrow the ranges, or pass --allow-large to insist"
        for e in estimates:
            k = kind(family(e.family).kind)
            if e.largest_tj > 2 * k.max_j:
                raise TooLargeError(
                    f"recipe key {e.family}.max_j = {half_text(e.largest_tj)}",
                    f"one {k.key} value there takes about {k.seconds(e.largest_tj):,.0f} s",
                    f"above the {k.key} one-value limit {k.max_j:,}; {insist}",
                )
        total = sum(e.low for e in estimates)
        seconds = sum(e.seconds for e in estimates)
        if total > VALUE_LIMIT or seconds > TIME_LIMIT:
            parts = "; ".join(e.describe() for e in estimates)
            raise TooLargeError(
                "recipe too large",
                f"estimated {'at least ' if not all(e.exact for e in estimates) else ''}{total:,} values "
                f"({parts}) and about {_duration(seconds)} of computing",
                f"the limits are {VALUE_LIMIT:,} values and {TIME_LIMIT // 60} minutes; {insist}",
            )
    return {e.family: e.low for e in estimates}


def _duration(seconds: float) -> str:
    if seconds < 120:
        return f"{seconds:.0f} s"
    if seconds < 7200:
        return f"{seconds / 60:,.0f} min"
    return f"{seconds / 3600:,.0f} h"

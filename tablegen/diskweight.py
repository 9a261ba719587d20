"""Bytes on disk a build would write, estimated before anything is computed.

The value guard (recipe.estimate_size) counts values; this module turns those
counts into bytes, by layout, with rates measured on the default recipe's
committed site (every file a value appears in: its HTML page, CSV, JSON and
LaTeX table and sheet).  The rates are per *estimated* value, so they absorb
how the value estimate of each layout compares with the true count.  Pages
themselves stay light whatever the size (grid and classes layouts split long
pages), so a total is what needs guarding.

Kept apart from recipe.py on purpose: one small function and one limit.
"""

from __future__ import annotations

from .errors import TooLargeError
from .families import family

__all__ = ["BYTES_LIMIT", "BYTES_PER_VALUE", "estimate_bytes", "check_bytes"]

#: A build is refused above this many bytes on disk, unless insisted on (--allow-large).
BYTES_LIMIT = 1_000_000_000

#: Bytes written per estimated value, by layout name (measured: the default site has grid families
#: at ~0.6-0.7 kB per value, 6j at ~3.0 kB and 9j at ~2.5 kB per estimated class).
BYTES_PER_VALUE = {"grid": 750, "classes": 3_100, "matrix": 750}


def estimate_bytes(values: dict[str, int], recipe=None) -> dict[str, int]:
    """Bytes on disk per family, from the value estimate per family key.

    A family whose record has its own rate (``Family.bytes_per_value``, from the
    range's largest j: a rotation function's text grows with j) uses it when the
    recipe is given; the others use their layout's rate.
    """
    out = {}
    for key, n in values.items():
        fam = family(key)
        f = recipe.family(key) if recipe is not None else None
        rate = fam.bytes_per_value(f.max_tj) if fam.bytes_per_value and f else None
        out[key] = n * (rate or BYTES_PER_VALUE.get(fam.layout.name, 3_100))
    return out


def check_bytes(values: dict[str, int], allow_large: bool = False, recipe=None) -> dict[str, int]:
    """Refuse, before any computing, a build whose files would exceed BYTES_LIMIT on disk."""
    est = estimate_bytes(values, recipe)
    total = sum(est.values())
    if total > BYTES_LIMIT and not allow_large:
        parts = ", ".join(f"{k}: ~{_mb(v)}" for k, v in est.items())
        raise TooLargeError(
            "build too large on disk",
            f"estimated {_mb(total)}; {parts}",
            f"the limit is {_mb(BYTES_LIMIT)}; narrow the ranges, or pass --allow-large to insist",
        )
    return est


def _mb(n: int) -> str:
    return f"{n / 1e6:,.0f} MB"

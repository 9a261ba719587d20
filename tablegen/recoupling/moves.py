"""The elementary moves between coupling trees, as cached functions of doubled ints.

With |(x y)z> = sum <x mx; y my | z mz> |x mx>|y my> (Condon-Shortley), the
three moves and their overlaps are (Edmonds 1957, eqs. 3.5.14, 6.1.5, 6.4.2):

* exchange:  |(x y)z> = (-1)**(x+y-z) |(y x)z>;
* re-associate:  <((a b)e c)f | (a (b c)g)f>
  = (-1)**(a+b+c+f) sqrt((2e+1)(2g+1)) {a b e; c f g};
* four-leaf change:  <((a b)e (c d)h)j | ((a c)g (b d)k)j>
  = sqrt((2e+1)(2h+1)(2g+1)(2k+1)) {a b e; c d h; g k j}.

Each overlap is real, so it is the same read in either direction.  Here a, b,
c, d stand for whole parts of a tree (their total values); what lies below
them does not change.
"""

from __future__ import annotations

from functools import lru_cache

from ..coefficients import ninej2, sixj2
from ..values.surd import Surd

__all__ = ["exchange_sign", "reassociate", "four_leaf", "allowed"]

_CACHE = 1 << 16


def allowed(tx: int, ty: int, tz: int) -> bool:
    """The triad rule on doubled ints (integer sum and triangle)."""
    return not (tx + ty + tz) & 1 and abs(tx - ty) <= tz <= tx + ty


def exchange_sign(tx: int, ty: int, tz: int) -> int:
    """(-1)**(x+y-z), the phase of swapping the two parts of |(x y)z>."""
    return -1 if ((tx + ty - tz) >> 1) & 1 else 1


@lru_cache(maxsize=_CACHE)
def reassociate(ta: int, tb: int, tc: int, te: int, tf: int, tg: int) -> Surd:
    """<((a b)e c)f | (a (b c)g)f> from doubled ints."""
    six = sixj2(ta, tb, te, tc, tf, tg)
    if not six:
        return six
    value = six * Surd._trusted(1, (te + 1) * (tg + 1), 1)
    return -value if ((ta + tb + tc + tf) >> 1) & 1 else value


@lru_cache(maxsize=_CACHE)
def four_leaf(ta: int, tb: int, tc: int, td: int, te: int, th: int, tg: int, tk: int, tj: int) -> Surd:
    """<((a b)e (c d)h)j | ((a c)g (b d)k)j> from doubled ints."""
    nine = ninej2(ta, tb, te, tc, td, th, tg, tk, tj)
    if not nine:
        return nine
    return nine * Surd((1), (te + 1) * (th + 1) * (tg + 1) * (tk + 1), 1)

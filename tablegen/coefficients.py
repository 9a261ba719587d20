"""Clebsch-Gordan coefficients, Wigner 3j, 6j, 9j and Racah W symbols, exactly.

Phase convention: Condon-Shortley.  <j1 j1; j2 (J-j1) | J J> > 0, and

    <j1 m1; j2 m2 | J M> = (-1)**(j1 - j2 + M) * sqrt(2J + 1) * (j1 j2 J; m1 m2 -M)
    W(a b c d; e f)      = (-1)**(a + b + c + d) * {a b e; d c f}

The 3j and 6j symbols come from Racah's single-sum formulas, the 9j from its
sum over products of three 6j symbols.  Every sum is evaluated in integers:
the ratio of consecutive terms is a ratio of small integers, so a Horner
scheme gives the sum as an integer over a product of factorials, and the
square of the value is reduced once at the end (see intmath.reduce_square).
Nothing on this path is a float.

Two layers:

* ``cg2``, ``threej2``, ``sixj2``, ``racah_w2``, ``ninej2`` take doubled
  integers (2j, 2m), apply the selection rules and return a Surd.  Table
  builders use these directly.
* ``cg``, ``threej``, ``sixj``, ``racah_w``, ``ninej`` take the quantum numbers
  in any accepted form (see spins.py), check them, and call the layer above.

Caches (functools.lru_cache, one per family) hold at most CACHE_ENTRIES
values each, and only for symbols whose factorial arguments stay below about
2 * CACHE_MAX_J, so every cached value is a few hundred bytes at most: the
three caches together stay under about 100 MB in the worst case and a few MB
in practice.
"""

from __future__ import annotations

from fractions import Fraction
from functools import lru_cache
from math import gcd

from . import intmath
from .intmath import factorial, reduce_square
from .spins import parse_j, parse_m, projection_rule, triad_rule
from .surd import Surd

__all__ = [
    "cg",
    "threej",
    "sixj",
    "racah_w",
    "ninej",
    "why_zero",
    "cg2",
    "threej2",
    "sixj2",
    "racah_w2",
    "ninej2",
    "CACHE_ENTRIES",
    "CACHE_MAX_J",
]

#: Largest number of values each family's cache keeps (least recently used go first).
CACHE_ENTRIES = 1 << 16
#: Only symbols with every j <= this are cached, bounding each cached value's size.
CACHE_MAX_J = 40
_CACHE_MAX_TJ = 2 * CACHE_MAX_J

_ZERO = Surd._trusted(0, 0, 1)
_FACT = intmath._FACTORIALS  # the growing factorial table, indexed directly on hot paths
_SMALL_TOP = intmath._PRIME_PATH_THRESHOLD


def _pos(t: int) -> int:
    """(-1)**(t/2) for even t: the phase of an integer combination of j's."""
    return -1 if (t >> 1) & 1 else 1


# ---------------------------------------------------------------------------
# 3j: Racah's formula (e.g. Edmonds 1957, eq. 3.7.3)
# ---------------------------------------------------------------------------
def _threej_square(tj1: int, tj2: int, tj3: int, tm1: int, tm2: int, tm3: int) -> tuple[int, int, int]:
    """(sign, p, q) of an allowed 3j symbol (selection rules already checked)."""
    g = (tj1 + tj2 - tj3) >> 1  # j1 + j2 - j3
    d = (tj1 - tm1) >> 1  # j1 - m1
    e = (tj2 + tm2) >> 1  # j2 + m2
    al = (tj3 - tj2 + tm1) >> 1  # j3 - j2 + m1
    be = (tj3 - tj1 - tm2) >> 1  # j3 - j1 - m2
    kmin = max(0, -al, -be)
    kmax = min(g, d, e)
    if kmin > kmax:
        return 0, 0, 1
    # Horner from the last term down: H_k = 1 - P_k/Q_k * H_{k+1}
    num = den = 1
    for k in range(kmax - 1, kmin - 1, -1):
        q = (k + 1) * (al + k + 1) * (be + k + 1)
        num = q * den - (g - k) * (d - k) * (e - k) * num
        den *= q
    if not num:
        return 0, 0, 1
    sign = (-1 if kmin & 1 else 1) * (1 if num > 0 else -1) * _pos(tj1 - tj2 - tm3)
    top = (tj1 + tj2 + tj3 + 2) >> 1  # the largest factorial argument below
    if top <= _SMALL_TOP:
        # the common small case, inlined: one gcd of multiplied-out factorials
        F = _FACT
        if top >= len(F):
            factorial(top)
        n = F[kmax] * F[al + kmax] * F[be + kmax] * F[g - kmin] * F[d - kmin] * F[e - kmin]
        p = (
            num * num * F[g] * F[(tj1 - tj2 + tj3) >> 1] * F[(tj2 + tj3 - tj1) >> 1]
            * F[(tj1 + tm1) >> 1] * F[d] * F[e] * F[(tj2 - tm2) >> 1]
            * F[(tj3 + tm3) >> 1] * F[(tj3 - tm3) >> 1]
        )
        q = n * n * F[top]
        r = gcd(p, q)
        return sign, p // r, q // r
    up = [
        g,
        (tj1 - tj2 + tj3) >> 1,
        (tj2 + tj3 - tj1) >> 1,
        (tj1 + tm1) >> 1,
        d,
        e,
        (tj2 - tm2) >> 1,
        (tj3 + tm3) >> 1,
        (tj3 - tm3) >> 1,
    ]
    lower = [kmax, al + kmax, be + kmax, g - kmin, d - kmin, e - kmin]
    # value = +-num / prod(lower!) * sqrt(prod(up!) / top!)
    p, q = reduce_square(num, up, [top], (), lower)
    return sign, p, q


@lru_cache(maxsize=CACHE_ENTRIES)
def _threej_square_cached(tj1: int, tj2: int, tj3: int, tm1: int, tm2: int, tm3: int) -> tuple[int, int, int]:
    return _threej_square(tj1, tj2, tj3, tm1, tm2, tm3)


def _threej_lookup(tj1: int, tj2: int, tj3: int, tm1: int, tm2: int, tm3: int) -> tuple[int, int, int]:
    """(sign, p, q) through the cache, keyed by a classical-symmetry image.

    Odd column permutations and m -> -m each multiply a 3j by
    (-1)**(j1 + j2 + j3); the key flips m so that the first non-zero m is
    positive, then sorts the columns, and the phase is restored afterwards.
    """
    if tj1 > _CACHE_MAX_TJ or tj2 > _CACHE_MAX_TJ or tj3 > _CACHE_MAX_TJ:
        return _threej_square(tj1, tj2, tj3, tm1, tm2, tm3)
    odd = 0
    if tm1 < 0 or (tm1 == 0 and (tm2 < 0 or (tm2 == 0 and tm3 < 0))):
        tm1, tm2, tm3 = -tm1, -tm2, -tm3
        odd = 1
    a, b, c = (tj1, tm1), (tj2, tm2), (tj3, tm3)
    if a > b:
        a, b = b, a
        odd ^= 1
    if b > c:
        b, c = c, b
        odd ^= 1
        if a > b:
            a, b = b, a
            odd ^= 1
    sign, p, q = _threej_square_cached(a[0], b[0], c[0], a[1], b[1], c[1])
    if odd and (tj1 + tj2 + tj3) & 2:
        sign = -sign
    return sign, p, q


def _threej_rule(tj1: int, tj2: int, tj3: int, tm1: int, tm2: int, tm3: int) -> str | None:
    rule = (
        triad_rule(tj1, tj2, tj3, "j1, j2, j3")
        or projection_rule(((tj1, tm1, "m1"), (tj2, tm2, "m2"), (tj3, tm3, "m3")), tm1 + tm2 + tm3, "m1 + m2 + m3 != 0")
        or (
            "parity: all m are 0 and j1 + j2 + j3 is odd"
            if tm1 == tm2 == tm3 == 0 and (tj1 + tj2 + tj3) & 2
            else None
        )
    )
    if rule is None and (tj1 + tj2 + tj3) & 2:
        cols = ((tj1, tm1), (tj2, tm2), (tj3, tm3))
        if len(set(cols)) < 3:
            rule = "symmetry: two equal columns and j1 + j2 + j3 odd"
    return rule


def threej2(tj1: int, tj2: int, tj3: int, tm1: int, tm2: int, tm3: int) -> Surd:
    """(j1 j2 j3; m1 m2 m3) from doubled arguments (2j, 2m), parities already valid."""
    if (
        tm1 + tm2 + tm3
        or (tj1 + tj2 + tj3) & 1
        or not abs(tj1 - tj2) <= tj3 <= tj1 + tj2
        or abs(tm1) > tj1
        or abs(tm2) > tj2
        or abs(tm3) > tj3
    ):
        return _ZERO
    sign, p, q = _threej_lookup(tj1, tj2, tj3, tm1, tm2, tm3)
    return Surd._trusted(sign, p, q) if sign else _ZERO


def cg2(tj1: int, tm1: int, tj2: int, tm2: int, tJ: int, tM: int) -> Surd:
    """<j1 m1; j2 m2 | J M> from doubled arguments, parities already valid."""
    if (
        tm1 + tm2 != tM
        or (tj1 + tj2 + tJ) & 1
        or not abs(tj1 - tj2) <= tJ <= tj1 + tj2
        or abs(tm1) > tj1
        or abs(tm2) > tj2
        or abs(tM) > tJ
    ):
        return _ZERO
    sign, p, q = _threej_lookup(tj1, tj2, tJ, tm1, tm2, -tM)
    if not sign:
        return _ZERO
    # times (-1)**(j1 - j2 + M) * sqrt(2J + 1)
    n = tJ + 1
    g = gcd(n, q)
    return Surd._trusted(sign * _pos(tj1 - tj2 + tM), p * (n // g), q // g)


# ---------------------------------------------------------------------------
# 6j: Racah's formula, written with the triad sums alpha and the quadrangle
# sums beta (e.g. Edmonds 1957, eq. 6.3.7).  The value depends only on the
# multisets {alpha} and {beta}: that is the 144-element (Regge) symmetry, and
# no phase is involved.
# ---------------------------------------------------------------------------
def sixj_invariants(ta: int, tb: int, tc: int, td: int, te: int, tf: int) -> tuple[tuple[int, ...], tuple[int, ...]]:
    """Sorted triad sums (4) and quadrangle sums (3) of a 6j, as integers."""
    al = sorted(((ta + tb + tc) >> 1, (ta + te + tf) >> 1, (td + tb + tf) >> 1, (td + te + tc) >> 1))
    be = sorted(((ta + tb + td + te) >> 1, (ta + tc + td + tf) >> 1, (tb + tc + te + tf) >> 1))
    return tuple(al), tuple(be)


def _sixj_sum(al: tuple[int, ...], be: tuple[int, ...]) -> tuple[int, int, list[int], list[int]]:
    """The Racah sum of a 6j as sign * num * prod(up!) / prod(down!)."""
    a1, a2, a3, a4 = al
    b1, b2, b3 = be
    kmin = max(al)
    kmax = min(be)
    num = den = 1
    for k in range(kmax - 1, kmin - 1, -1):
        q = (k + 1 - a1) * (k + 1 - a2) * (k + 1 - a3) * (k + 1 - a4)
        num = q * den - (k + 2) * (b1 - k) * (b2 - k) * (b3 - k) * num
        den *= q
    sign = -1 if kmin & 1 else 1
    up = [kmin + 1]
    down = [kmax - a1, kmax - a2, kmax - a3, kmax - a4, b1 - kmin, b2 - kmin, b3 - kmin]
    return sign, num, up, down


def _sixj_square(al: tuple[int, ...], be: tuple[int, ...]) -> tuple[int, int, int]:
    """(sign, p, q) of an allowed 6j from its invariants."""
    sign, num, up, down = _sixj_sum(al, be)
    if not num:
        return 0, 0, 1
    if num < 0:
        sign = -sign
    # prefactor: prod over triads of Delta^2 = prod_{i,j} (beta_j - alpha_i)! / prod_i (alpha_i + 1)!
    a1, a2, a3, a4 = al
    b1, b2, b3 = be
    if b3 <= _SMALL_TOP:  # the common small case, inlined
        F = _FACT
        if b3 + 1 >= len(F):
            factorial(b3 + 1)
        n = num * F[up[0]]
        d = F[down[0]] * F[down[1]] * F[down[2]] * F[down[3]] * F[down[4]] * F[down[5]] * F[down[6]]
        p = (
            n * n * F[b1 - a1] * F[b2 - a1] * F[b3 - a1] * F[b1 - a2] * F[b2 - a2] * F[b3 - a2]
            * F[b1 - a3] * F[b2 - a3] * F[b3 - a3] * F[b1 - a4] * F[b2 - a4] * F[b3 - a4]
        )
        q = d * d * F[a1 + 1] * F[a2 + 1] * F[a3 + 1] * F[a4 + 1]
        r = gcd(p, q)
        return sign, p // r, q // r
    pre_up = [b - a for a in al for b in be]
    pre_down = [a + 1 for a in al]
    p, q = reduce_square(num, pre_up, pre_down, up, down)
    return sign, p, q


def _sixj_value(al: tuple[int, ...], be: tuple[int, ...]) -> Surd:
    sign, p, q = _sixj_square(al, be)
    return Surd._trusted(sign, p, q) if sign else _ZERO


_sixj_value_cached = lru_cache(maxsize=CACHE_ENTRIES)(_sixj_value)


def _sixj_allowed(ta: int, tb: int, tc: int, td: int, te: int, tf: int) -> bool:
    for x, y, z in ((ta, tb, tc), (ta, te, tf), (td, tb, tf), (td, te, tc)):
        if (x + y + z) & 1 or not abs(x - y) <= z <= x + y:
            return False
    return True


def sixj2(ta: int, tb: int, tc: int, td: int, te: int, tf: int) -> Surd:
    """{j1 j2 j3; j4 j5 j6} from doubled arguments."""
    s1, s2, s3, s4 = ta + tb + tc, ta + te + tf, td + tb + tf, td + te + tc
    if (s1 | s2 | s3 | s4) & 1:
        return _ZERO
    al = tuple(sorted((s1 >> 1, s2 >> 1, s3 >> 1, s4 >> 1)))
    be = tuple(sorted(((ta + tb + td + te) >> 1, (ta + tc + td + tf) >> 1, (tb + tc + te + tf) >> 1)))
    # every triangle inequality of the four triads is some beta_j - alpha_i >= 0
    if be[0] < al[3]:
        return _ZERO
    if be[2] <= _CACHE_MAX_TJ:  # a beta is a sum of four j's, so all are small here
        return _sixj_value_cached(al, be)
    return _sixj_value(al, be)


def racah_w2(ta: int, tb: int, tc: int, td: int, te: int, tf: int) -> Surd:
    """W(a b c d; e f) = (-1)**(a+b+c+d) {a b e; d c f}, doubled arguments."""
    value = sixj2(ta, tb, te, td, tc, tf)
    return -value if value and (ta + tb + tc + td) & 2 else value


# ---------------------------------------------------------------------------
# 9j: sum over x of (-1)**(2x) (2x+1) times three 6j symbols
# (e.g. Edmonds 1957, eq. 6.4.3).  In each product the x-dependent triangle
# factors appear squared, so only the six row and column triads stay under
# the root and the sum over x is a sum of rationals.
# ---------------------------------------------------------------------------
def _delta_square(ta: int, tb: int, tc: int) -> Fraction:
    return Fraction(
        factorial((ta + tb - tc) >> 1) * factorial((ta - tb + tc) >> 1) * factorial((tb + tc - ta) >> 1),
        factorial((ta + tb + tc + 2) >> 1),
    )


def _racah_rational(ta: int, tb: int, tc: int, td: int, te: int, tf: int) -> Fraction:
    """The 6j divided by its four triangle factors: a rational number."""
    al, be = sixj_invariants(ta, tb, tc, td, te, tf)
    sign, num, up, down = _sixj_sum(al, be)
    n = sign * num
    for x in up:
        n *= factorial(x)
    d = 1
    for x in down:
        d *= factorial(x)
    return Fraction(n, d)


@lru_cache(maxsize=CACHE_ENTRIES)
def _ninej_square(*t: int) -> tuple[int, int, int]:
    j11, j12, j13, j21, j22, j23, j31, j32, j33 = t
    lo = max(abs(j11 - j33), abs(j21 - j32), abs(j12 - j23))
    hi = min(j11 + j33, j21 + j32, j12 + j23)
    if (lo - j11 - j33) & 1:
        lo += 1
    total = Fraction(0)
    for x in range(lo, hi + 1, 2):
        if not (
            _sixj_allowed(j11, j21, j31, j32, j33, x)
            and _sixj_allowed(j12, j22, j32, j21, x, j23)
            and _sixj_allowed(j13, j23, j33, x, j11, j12)
        ):
            continue
        term = (
            _delta_square(j11, j33, x)
            * _delta_square(j21, j32, x)
            * _delta_square(j12, j23, x)
            * _racah_rational(j11, j21, j31, j32, j33, x)
            * _racah_rational(j12, j22, j32, j21, x, j23)
            * _racah_rational(j13, j23, j33, x, j11, j12)
        )
        total += -(x + 1) * term if x & 1 else (x + 1) * term
    if not total:
        return 0, 0, 1
    pre = (
        _delta_square(j11, j12, j13)
        * _delta_square(j21, j22, j23)
        * _delta_square(j31, j32, j33)
        * _delta_square(j11, j21, j31)
        * _delta_square(j12, j22, j32)
        * _delta_square(j13, j23, j33)
    )
    square = pre * total * total
    return (1 if total > 0 else -1), square.numerator, square.denominator


def _ninej_allowed(t: tuple[int, ...]) -> bool:
    rows = (t[0:3], t[3:6], t[6:9])
    cols = (t[0::3], t[1::3], t[2::3])
    for x, y, z in rows + cols:
        if (x + y + z) & 1 or not abs(x - y) <= z <= x + y:
            return False
    return True


def ninej2(*t: int) -> Surd:
    """The 9j symbol from nine doubled arguments, rows in order."""
    if len(t) != 9:
        raise TypeError(f"ninej2 takes 9 doubled arguments, got {len(t)}")
    if not _ninej_allowed(t):
        return _ZERO
    if max(t) <= _CACHE_MAX_TJ:
        sign, p, q = _ninej_square(*t)
    else:
        sign, p, q = _ninej_square.__wrapped__(*t)
    return Surd._trusted(sign, p, q) if sign else _ZERO


# ---------------------------------------------------------------------------
# Public layer: any accepted quantum-number form in, Surd out.
# ---------------------------------------------------------------------------
def cg(j1, m1, j2, m2, J, M, *, max_j: int | None = None) -> Surd:
    """Clebsch-Gordan coefficient <j1 m1; j2 m2 | J M>, Condon-Shortley phase.

    >>> cg(1, 1, 1, -1, 0, 0)
    Surd(1, 1, 3)
    """
    return cg2(*_parse_cg(j1, m1, j2, m2, J, M, max_j))


def threej(j1, j2, j3, m1, m2, m3, *, max_j: int | None = None) -> Surd:
    """Wigner 3j symbol (j1 j2 j3; m1 m2 m3), Condon-Shortley phase."""
    return threej2(*_parse_threej(j1, j2, j3, m1, m2, m3, max_j))


def sixj(j1, j2, j3, j4, j5, j6, *, max_j: int | None = None) -> Surd:
    """Wigner 6j symbol {j1 j2 j3; j4 j5 j6}."""
    return sixj2(
        parse_j(j1, "j1", max_j),
        parse_j(j2, "j2", max_j),
        parse_j(j3, "j3", max_j),
        parse_j(j4, "j4", max_j),
        parse_j(j5, "j5", max_j),
        parse_j(j6, "j6", max_j),
    )


def racah_w(a, b, c, d, e, f, *, max_j: int | None = None) -> Surd:
    """Racah W(a b c d; e f) = (-1)**(a+b+c+d) {a b e; d c f}."""
    return racah_w2(*_parse_js(("a", "b", "c", "d", "e", "f"), (a, b, c, d, e, f), max_j))


def ninej(j11, j12, j13, j21, j22, j23, j31, j32, j33, *, max_j: int | None = None) -> Surd:
    """Wigner 9j symbol with rows (j11 j12 j13), (j21 j22 j23), (j31 j32 j33)."""
    return ninej2(*_parse_js(_NINEJ_NAMES, (j11, j12, j13, j21, j22, j23, j31, j32, j33), max_j))


_NINEJ_NAMES = ("j11", "j12", "j13", "j21", "j22", "j23", "j31", "j32", "j33")


def _parse_js(names: tuple[str, ...], values: tuple, max_j: int | None) -> list[int]:
    return [parse_j(v, n, max_j) for n, v in zip(names, values)]


def _parse_cg(j1, m1, j2, m2, J, M, max_j) -> tuple[int, ...]:
    tj1 = parse_j(j1, "j1", max_j)
    tj2 = parse_j(j2, "j2", max_j)
    tJ = parse_j(J, "J", max_j)
    return (
        tj1,
        parse_m(m1, "m1", tj1, "j1", max_j),
        tj2,
        parse_m(m2, "m2", tj2, "j2", max_j),
        tJ,
        parse_m(M, "M", tJ, "J", max_j),
    )


def _parse_threej(j1, j2, j3, m1, m2, m3, max_j) -> tuple[int, ...]:
    tj1 = parse_j(j1, "j1", max_j)
    tj2 = parse_j(j2, "j2", max_j)
    tj3 = parse_j(j3, "j3", max_j)
    return (
        tj1,
        tj2,
        tj3,
        parse_m(m1, "m1", tj1, "j1", max_j),
        parse_m(m2, "m2", tj2, "j2", max_j),
        parse_m(m3, "m3", tj3, "j3", max_j),
    )


#: The kinds of symbol by the names the command line and the data files use
#: (W is a kind of its own here; tables show it beside the 6j).
KINDS = ("cg", "3j", "6j", "w", "9j")
ARGUMENT_NAMES = {
    "cg": ("j1", "m1", "j2", "m2", "J", "M"),
    "3j": ("j1", "j2", "j3", "m1", "m2", "m3"),
    "6j": ("j1", "j2", "j3", "j4", "j5", "j6"),
    "w": ("a", "b", "c", "d", "e", "f"),
    "9j": _NINEJ_NAMES,
}


def parse_arguments(kind: str, values, max_j: int | None = None) -> tuple[int, ...]:
    """Doubled arguments of a family's symbol, checked (QuantumNumberError)."""
    names = ARGUMENT_NAMES.get(kind)
    if names is None:
        raise ValueError(f"argument kind = {kind!r}: must be one of {', '.join(KINDS)}")
    if len(values) != len(names):
        raise TypeError(f"{kind} takes {len(names)} arguments ({' '.join(names)}), got {len(values)}")
    if kind == "cg":
        return _parse_cg(*values, max_j)
    if kind == "3j":
        return _parse_threej(*values, max_j)
    return tuple(_parse_js(names, tuple(values), max_j))


DOUBLED = {"cg": cg2, "3j": threej2, "6j": sixj2, "w": racah_w2, "9j": ninej2}


def why_zero_doubled(kind: str, t: tuple[int, ...]) -> str | None:
    """Which rule makes a symbol zero (doubled arguments), or None if it is not zero."""
    if kind == "cg":
        tj1, tm1, tj2, tm2, tJ, tM = t
        rule = triad_rule(tj1, tj2, tJ, "j1, j2, J") or projection_rule(
            ((tj1, tm1, "m1"), (tj2, tm2, "m2"), (tJ, tM, "M")), tm1 + tm2 - tM, "m1 + m2 != M"
        )
        if rule is None:
            rule = _threej_rule(tj1, tj2, tJ, tm1, tm2, -tM)
    elif kind == "3j":
        rule = _threej_rule(*t)
    elif kind in ("6j", "w"):
        a, b, c, d, e, f = t if kind == "6j" else (t[0], t[1], t[4], t[3], t[2], t[5])
        names = ARGUMENT_NAMES[kind]
        if kind == "6j":
            triads = ((a, b, c, (0, 1, 2)), (a, e, f, (0, 4, 5)), (d, b, f, (3, 1, 5)), (d, e, c, (3, 4, 2)))
        else:  # W(abcd;ef) = +-{a b e; d c f}: triads (a b e), (c d e), (a c f), (b d f)
            triads = ((a, b, c, (0, 1, 4)), (a, e, f, (0, 2, 5)), (d, b, f, (3, 1, 5)), (d, e, c, (3, 2, 4)))
        rule = None
        for x, y, z, idx in triads:
            rule = triad_rule(x, y, z, ", ".join(names[i] for i in idx))
            if rule:
                break
    elif kind == "9j":
        rule = None
        names = _NINEJ_NAMES
        for idx in ((0, 1, 2), (3, 4, 5), (6, 7, 8), (0, 3, 6), (1, 4, 7), (2, 5, 8)):
            rule = triad_rule(t[idx[0]], t[idx[1]], t[idx[2]], ", ".join(names[i] for i in idx))
            if rule:
                break
        if rule is None and _ninej_odd_swap_zero(t):
            rule = "symmetry: two equal rows or columns and an odd sum of all nine j"
    else:
        raise ValueError(f"argument kind = {kind!r}: must be one of {', '.join(KINDS)}")
    if rule is not None:
        return rule
    if DOUBLED[kind](*t):
        return None
    return "cancellation: every selection rule holds, but the Racah sum is exactly 0"


def _ninej_odd_swap_zero(t: tuple[int, ...]) -> bool:
    """A 9j with two equal rows (or columns) and an odd total is zero by symmetry."""
    if sum(t) & 2 == 0:
        return False
    rows = (t[0:3], t[3:6], t[6:9])
    cols = (t[0::3], t[1::3], t[2::3])
    return len(set(rows)) < 3 or len(set(cols)) < 3


def why_zero(kind: str, *values, max_j: int | None = None) -> str | None:
    """Why a coefficient is zero, or None if it is not.

    ``kind`` is one of "cg", "3j", "6j", "w", "9j"; the values are given in
    the same order as to the function of that family.  The answer starts with
    the rule's short name ("triangle", "triad-sum", "m-sum", "m-range",
    "parity", "symmetry", "cancellation") followed by a colon.
    """
    return why_zero_doubled(kind, parse_arguments(kind, values, max_j))

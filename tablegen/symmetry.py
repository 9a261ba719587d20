"""Symmetry classes of 3j, 6j and 9j symbols, with the signs that relate members.

All functions take doubled arguments (2j, 2m) in the order of the symbol and
return doubled arguments.  ``*_members(t)`` lists pairs (arguments, sign)
meaning value(member) = sign * value(t); ``*_canonical(t)`` returns
(canonical, sign) meaning value(t) = sign * value(canonical).

* 3j, 72 operations (Regge 1958): write the symbol as the square
      [[-j1+j2+j3, j1-j2+j3, j1+j2-j3], [j1-m1, j2-m2, j3-m3], [j1+m1, j2+m2, j3+m3]];
  every row and column sums to J = j1+j2+j3.  Permuting rows or columns
  multiplies the symbol by (-1)**J for an odd permutation; transposing leaves it.
* 6j, 144 operations (Regge 1959): the symbol depends only on the multiset of
  its four triad sums and the multiset of its three quadrangle sums, with no
  phase; the 24 tetrahedral symmetries are a subgroup.
* 9j, 72 operations: permuting rows or columns multiplies the symbol by
  (-1)**(sum of all nine j) for an odd permutation; transposing leaves it.

The canonical member of a class is the one with the largest argument tuple.
Tables list one row per class and caches may key on the canonical form.
"""

from __future__ import annotations

from itertools import permutations

from .triads import sixj_sums

__all__ = [
    "threej_members",
    "threej_canonical",
    "sixj_members",
    "sixj_tetrahedral_members",
    "sixj_canonical",
    "ninej_members",
    "ninej_canonical",
    "members",
    "canonical",
    "symmetry_class",
    "canonical_form",
    "square_images",
]

def _perm_parity(p: tuple[int, ...]) -> int:
    inversions = sum(1 for i in range(len(p)) for k in range(i + 1, len(p)) if p[i] > p[k])
    return inversions & 1


_PERMS3 = tuple((p, _perm_parity(p)) for p in permutations(range(3)))


def square_images(square) -> list[tuple[tuple[tuple[int, ...], ...], int]]:
    """The 72 images of a 3x3 square under row and column permutations and transposition.

    Each image comes with the parity (0 or 1) of its permutations; transposing
    adds none.  The identity comes first.  Both the 3j (as its Regge square)
    and the 9j take their classes from this one helper.
    """
    out = []
    for rows, rpar in _PERMS3:
        for cols, cpar in _PERMS3:
            sq = tuple(tuple(square[rows[a]][cols[b]] for b in range(3)) for a in range(3))
            parity = (rpar + cpar) & 1
            out.append((sq, parity))
            out.append((tuple(zip(*sq)), parity))
    return out


# -- 3j -----------------------------------------------------------------------
def _regge_square(t: tuple[int, ...]) -> tuple[tuple[int, int, int], ...]:
    tj1, tj2, tj3, tm1, tm2, tm3 = t
    return (
        ((tj2 + tj3 - tj1) // 2, (tj1 - tj2 + tj3) // 2, (tj1 + tj2 - tj3) // 2),
        ((tj1 - tm1) // 2, (tj2 - tm2) // 2, (tj3 - tm3) // 2),
        ((tj1 + tm1) // 2, (tj2 + tm2) // 2, (tj3 + tm3) // 2),
    )


def _from_regge(r) -> tuple[int, ...]:
    tj = tuple(r[1][i] + r[2][i] for i in range(3))
    tm = tuple(r[2][i] - r[1][i] for i in range(3))
    return tj + tm


def threej_members(*t: int) -> list[tuple[tuple[int, ...], int]]:
    """The distinct symbols equal (up to sign) to an allowed 3j, with their signs.

    The 3j must obey the triangle rule, integer triad sum, m1+m2+m3 = 0 and
    |m| <= j; outside those the symbol is zero and has no Regge square.
    """
    r = _regge_square(t)
    odd_sign = -1 if sum(r[0]) & 1 else 1
    seen: dict[tuple[int, ...], int] = {}
    for square, odd in square_images(r):
        seen.setdefault(_from_regge(square), odd_sign if odd else 1)
    return sorted(seen.items(), reverse=True)


def threej_canonical(*t: int) -> tuple[tuple[int, ...], int]:
    """(canonical arguments, sign) with value(t) = sign * value(canonical).

    members[0] is (canonical, s) with value(canonical) = s * value(t), and s is
    +-1, so value(t) = s * value(canonical) as well.
    """
    return threej_members(*t)[0]


# -- 6j -----------------------------------------------------------------------
def _sixj_sums(t: tuple[int, ...]) -> tuple[tuple[int, ...], tuple[int, ...]]:
    s = sixj_sums(*t)
    return tuple(x // 2 for x in s[:4]), tuple(x // 2 for x in s[4:])


def _sixj_from_sums(al, be) -> tuple[int, ...]:
    """Doubled {a b c; d e f} with triad sums al and quadrangle sums be.

    Inverts a+b+c = al1, a+e+f = al2, d+b+f = al3, d+e+c = al4,
    a+b+d+e = be1, a+c+d+f = be2, b+c+e+f = be3 (each j = half of two
    differences be_j - al_i, which are the triangle combinations a+b-c etc.).
    """
    a1, a2, a3, a4 = al
    b1, b2, b3 = be
    return (
        (b1 - a4) + (b2 - a3),
        (b1 - a4) + (b3 - a2),
        (b2 - a3) + (b3 - a2),
        (b1 - a1) + (b2 - a2),
        (b1 - a1) + (b3 - a3),
        (b2 - a1) + (b3 - a4),
    )


def sixj_members(*t: int) -> list[tuple[tuple[int, ...], int]]:
    """The distinct symbols equal to an allowed 6j (all with sign +1)."""
    al, be = _sixj_sums(t)
    found = {
        _sixj_from_sums(pa, pb) for pa in set(permutations(al)) for pb in set(permutations(be))
    }
    return [(m, 1) for m in sorted(found, reverse=True)]


def sixj_tetrahedral_members(*t: int) -> list[tuple[tuple[int, ...], int]]:
    """The symbols equal to a 6j by its ordinary (tetrahedral) symmetries alone, largest first, all sign +1.

    Any permutation of the columns, and exchanging upper and lower entries in
    two of the columns (Edmonds 1957, eq. 6.2.4): the 24 forms a printed table
    files under one entry.  The Regge symmetries (sixj_members) join up to six
    such classes.
    """
    cols = ((t[0], t[3]), (t[1], t[4]), (t[2], t[5]))
    found = set()
    for p in permutations(cols):
        for flip in ((0, 0, 0), (1, 1, 0), (1, 0, 1), (0, 1, 1)):
            c = [col[::-1] if f else col for col, f in zip(p, flip)]
            found.add((c[0][0], c[1][0], c[2][0], c[0][1], c[1][1], c[2][1]))
    return [(m, 1) for m in sorted(found, reverse=True)]


def sixj_canonical(*t: int) -> tuple[tuple[int, ...], int]:
    """(canonical arguments, +1); equal symbols share the canonical form."""
    return sixj_members(*t)[0][0], 1


# -- 9j -----------------------------------------------------------------------
def ninej_members(*t: int) -> list[tuple[tuple[int, ...], int]]:
    """The distinct symbols equal (up to sign) to a 9j, with their signs."""
    rows = (t[0:3], t[3:6], t[6:9])
    odd_sign = -1 if (sum(t) // 2) & 1 else 1
    seen: dict[tuple[int, ...], int] = {}
    for square, odd in square_images(rows):
        seen.setdefault(tuple(x for row in square for x in row), odd_sign if odd else 1)
    return sorted(seen.items(), reverse=True)


def ninej_canonical(*t: int) -> tuple[tuple[int, ...], int]:
    """(canonical arguments, sign) with value(t) = sign * value(canonical) (see threej_canonical)."""
    return ninej_members(*t)[0]


_MEMBERS = {"3j": threej_members, "6j": sixj_members, "9j": ninej_members}
_CANONICAL = {"3j": threej_canonical, "6j": sixj_canonical, "9j": ninej_canonical}


def members(kind: str, *t: int) -> list[tuple[tuple[int, ...], int]]:
    """Class members of a symbol of kind "3j", "6j" or "9j" (doubled arguments)."""
    return _MEMBERS[kind](*t)


def canonical(kind: str, *t: int) -> tuple[tuple[int, ...], int]:
    """Canonical form and relating sign of a symbol of kind "3j", "6j" or "9j"."""
    return _CANONICAL[kind](*t)


def _allowed_doubled(key: str, values: tuple, max_j: int | None) -> tuple[int, ...]:
    from .kinds import KINDS

    with_class = {k.key: k for k in KINDS if k.members is not None}
    if key not in with_class:
        raise ValueError(f"argument kind = {key!r}: must be one of {', '.join(with_class)}")
    k = with_class[key]
    t = k.parse(values, max_j)
    rule = k.zero_rule(t)
    if rule and rule.id not in ("cancellation", "parity", "symmetry"):
        raise ValueError(f"the {key} symbol is zero by a selection rule ({rule}); it has no symmetry class")
    return t


def _halves(t: tuple[int, ...]) -> tuple[Fraction, ...]:
    from fractions import Fraction  # only here: the one-value command never needs it

    return tuple(Fraction(x, 2) for x in t)


def symmetry_class(kind: str, *values, max_j: int | None = None) -> list[tuple[tuple[Fraction, ...], int]]:
    """Every symbol equal (up to sign) to the given one, as (arguments, sign).

    Quantum numbers in any accepted form; arguments come back as Fractions in
    the order of the symbol, with value(member) = sign * value(given symbol).

    >>> len(symmetry_class("6j", 1, 2, 3, 3, 3, 3))
    144
    """
    t = _allowed_doubled(kind, values, max_j)
    return [(_halves(m), s) for m, s in members(kind, *t)]


def canonical_form(kind: str, *values, max_j: int | None = None) -> tuple[tuple[Fraction, ...], int]:
    """(canonical arguments, sign) with value(given symbol) = sign * value(canonical)."""
    t = _allowed_doubled(kind, values, max_j)
    canon, sign = canonical(kind, *t)
    return _halves(canon), sign


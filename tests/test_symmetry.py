"""Symmetries of the 3j, 6j and 9j symbols.

Two things are checked:

* the values: every published symmetry operation, applied here from its
  definition (not from tablegen.symmetry), maps a symbol to one whose value
  is the same up to the published sign;
* tablegen.symmetry: its member lists are exactly the images found here,
  with the right signs, and its canonical form is shared by the whole class
  and relates to the value as documented.

All arguments are doubled integers (2j, 2m), as in tablegen.symmetry.
"""

from __future__ import annotations

import itertools

import pytest

from hypothesis import given, settings
from hypothesis import strategies as st

from tablegen import symmetry
from tablegen.coefficients import ninej2, sixj2, threej2

PROPERTY = dict(deadline=None, derandomize=True, database=None)


def is_triad(ta: int, tb: int, tc: int) -> bool:
    return (ta + tb + tc) % 2 == 0 and abs(ta - tb) <= tc <= ta + tb


def perm_is_odd(p) -> bool:
    return sum(1 for i, k in itertools.combinations(range(len(p)), 2) if p[i] > p[k]) % 2 == 1


PERMS = [(p, perm_is_odd(p)) for p in itertools.permutations(range(3))]


def phase_of_sum(doubled_sum: int) -> int:
    """(-1)**(sum of the j's) from the doubled sum (an even number here)."""
    assert doubled_sum % 2 == 0
    return -1 if (doubled_sum // 2) % 2 else 1


# ---------------------------------------------------------------------------
# 3j: columns, m -> -m, and Regge's 72 (Regge 1958)
# ---------------------------------------------------------------------------
def allowed_3j(t) -> bool:
    tj1, tj2, tj3, tm1, tm2, tm3 = t
    return (
        is_triad(tj1, tj2, tj3)
        and tm1 + tm2 + tm3 == 0
        and all(abs(tm) <= tj and (tj - tm) % 2 == 0 for tj, tm in ((tj1, tm1), (tj2, tm2), (tj3, tm3)))
    )


def small_3j(max_t: int):
    for tj1, tj2, tj3 in itertools.product(range(max_t + 1), repeat=3):
        for tm1, tm2 in itertools.product(range(-tj1, tj1 + 1, 2), range(-tj2, tj2 + 1, 2)):
            t = (tj1, tj2, tj3, tm1, tm2, -tm1 - tm2)
            if allowed_3j(t):
                yield t


def threej_column_images(t):
    """(image, sign): column permutations and m -> -m, NIST DLMF §34.3(ii)."""
    tj, tm = t[:3], t[3:]
    J = phase_of_sum(sum(tj))
    for p, odd in PERMS:
        for flip in (1, -1):
            image = tuple(tj[i] for i in p) + tuple(flip * tm[i] for i in p)
            sign = (J if odd else 1) * (J if flip < 0 else 1)
            yield image, sign


def regge_square(t):
    """Regge 1958: the 3j as a 3x3 square whose rows and columns all sum to J."""
    tj1, tj2, tj3, tm1, tm2, tm3 = t
    return (
        ((tj2 + tj3 - tj1) // 2, (tj1 - tj2 + tj3) // 2, (tj1 + tj2 - tj3) // 2),
        ((tj1 - tm1) // 2, (tj2 - tm2) // 2, (tj3 - tm3) // 2),
        ((tj1 + tm1) // 2, (tj2 + tm2) // 2, (tj3 + tm3) // 2),
    )


def from_regge_square(r):
    """Inverse of regge_square: 2j_i = R[1][i] + R[2][i], 2m_i = R[2][i] - R[1][i]."""
    return tuple(r[1][i] + r[2][i] for i in range(3)) + tuple(r[2][i] - r[1][i] for i in range(3))


def threej_regge_images(t):
    """(image, sign) for the 72 operations: permute rows, permute columns,
    transpose; an odd permutation (rows and columns together) gives (-1)**J."""
    r = regge_square(t)
    J = phase_of_sum(sum(t[:3]))
    for (rp, rodd), (cp, codd) in itertools.product(PERMS, PERMS):
        sq = tuple(tuple(r[rp[a]][cp[b]] for b in range(3)) for a in range(3))
        sign = J if rodd != codd else 1
        for square in (sq, tuple(zip(*sq))):
            yield from_regge_square(square), sign


def images_as_dict(images, value_is_zero: bool) -> dict:
    """{image: sign}; an image reached with both signs is only possible for a zero value."""
    out: dict = {}
    for image, sign in images:
        if out.setdefault(image, sign) != sign:
            assert value_is_zero, image
    return out


def check_threej(t) -> None:
    value = threej2(*t)
    for image, sign in itertools.chain(threej_column_images(t), threej_regge_images(t)):
        assert threej2(*image) == sign * value, (t, image, sign)
    # tablegen.symmetry lists exactly these members, with these signs
    regge = images_as_dict(threej_regge_images(t), not value)
    members = dict(symmetry.members("3j", *t))
    assert set(members) == set(regge), t
    if value:
        assert members == regge, t
    check_canonical("3j", t, value, threej2)


def check_canonical(kind: str, t, value, evaluate) -> None:
    """canonical(): documented relation to the value, the largest member, one per class.

    (The member values were checked against the images by the caller.)
    """
    members = symmetry.members(kind, *t)
    canon, sign = symmetry.canonical(kind, *t)
    assert canon == max(m for m, _ in members)
    assert value == sign * evaluate(*canon), (kind, t, canon, sign)
    # the same canonical form from other members (about eight of them, to keep it quick)
    for member, _ in members[:: 1 + len(members) // 8]:
        assert symmetry.canonical(kind, *member)[0] == canon, (kind, t, member)


def test_threej_symmetries_for_all_j_up_to_3_2():
    count = 0
    for t in small_3j(3):
        check_threej(t)
        count += 1
    assert count > 100


@st.composite
def threej_cases(draw, top=80):
    tj1, tj2 = draw(st.integers(0, top)), draw(st.integers(0, top))
    tj3 = draw(st.sampled_from(range(abs(tj1 - tj2), tj1 + tj2 + 1, 2)))
    tm3 = draw(st.sampled_from(range(-tj3, tj3 + 1, 2)))
    tm1 = draw(st.sampled_from(range(max(-tj1, -tm3 - tj2), min(tj1, -tm3 + tj2) + 1, 2)))
    return tj1, tj2, tj3, tm1, -tm3 - tm1, tm3


@settings(max_examples=40, **PROPERTY)
@given(threej_cases())
def test_threej_symmetries_up_to_j_40(t):
    check_threej(t)


def test_threej_class_sizes():
    # nine different entries in the Regge square: 72 different images
    t = (3, 11, 12, -3, -1, 4)  # (3/2 11/2 6; -3/2 -1/2 2)
    entries = [x for row in regge_square(t) for x in row]
    assert sorted(entries) == [0, 1, 2, 3, 4, 5, 6, 8, 10]
    assert threej2(*t)
    assert len(dict(threej_regge_images(t))) == 72
    assert len(symmetry.members("3j", *t)) == 72
    # (2 2 2; 0 0 0): every entry of its square is 2, a class of one
    t = (4, 4, 4, 0, 0, 0)
    assert len(symmetry.members("3j", *t)) == len(dict(threej_regge_images(t))) == 1


# ---------------------------------------------------------------------------
# 6j: 24 tetrahedral symmetries (NIST DLMF 34.5.8) and Regge's (DLMF 34.5.9,
# 34.5.10), 144 in all; no signs
# ---------------------------------------------------------------------------
def sixj_tetrahedral_images(t):
    """Column permutations and upper/lower exchange in any two columns."""
    upper, lower = t[:3], t[3:]
    for p, _ in PERMS:
        u, l = [upper[i] for i in p], [lower[i] for i in p]
        for pair in ((), (0, 1), (0, 2), (1, 2)):
            uu, ll = list(u), list(l)
            for c in pair:
                uu[c], ll[c] = ll[c], uu[c]
            yield tuple(uu) + tuple(ll)


def sixj_regge_first(t):
    """NIST DLMF 34.5.9, on doubled arguments."""
    j1, j2, j3, l1, l2, l3 = t
    return (j1, (j2 + l2 + j3 - l3) // 2, (j2 - l2 + j3 + l3) // 2, l1, (j2 + l2 - j3 + l3) // 2, (-j2 + l2 + j3 + l3) // 2)


def sixj_regge_second(t):
    """NIST DLMF 34.5.10, on doubled arguments."""
    j1, j2, j3, l1, l2, l3 = t
    return (
        (j2 + l2 + j3 - l3) // 2,
        (j1 - l1 + j3 + l3) // 2,
        (j1 + l1 + j2 - l2) // 2,
        (j2 + l2 - j3 + l3) // 2,
        (-j1 + l1 + j3 + l3) // 2,
        (j1 + l1 - j2 + l2) // 2,
    )


def sixj_class(t) -> set:
    """Closure of t under the tetrahedral operations and DLMF 34.5.9."""
    seen, todo = {t}, [t]
    while todo:
        s = todo.pop()
        for image in itertools.chain(sixj_tetrahedral_images(s), [sixj_regge_first(s)]):
            if image not in seen:
                seen.add(image)
                todo.append(image)
    return seen


def allowed_6j(t) -> bool:
    a, b, c, d, e, f = t
    return is_triad(a, b, c) and is_triad(a, e, f) and is_triad(d, b, f) and is_triad(d, e, c)


def check_sixj(t) -> None:
    value = sixj2(*t)
    for image in itertools.chain(sixj_tetrahedral_images(t), [sixj_regge_first(t), sixj_regge_second(t)]):
        assert allowed_6j(image), (t, image)
        assert sixj2(*image) == value, (t, image)
    cls = sixj_class(t)
    for image in cls:
        assert sixj2(*image) == value, (t, image)
    members = symmetry.members("6j", *t)
    assert {m for m, _ in members} == cls, t
    assert all(sign == 1 for _, sign in members)
    check_canonical("6j", t, value, sixj2)


def test_sixj_symmetries_for_all_j_up_to_2():
    count = 0
    for t in itertools.product(range(5), repeat=6):
        if allowed_6j(t):
            check_sixj(t)
            count += 1
    assert count > 500


@st.composite
def sixj_cases(draw, top=80):
    a, b, d = (draw(st.integers(0, top)) for _ in range(3))
    c = draw(st.sampled_from(range(abs(a - b), a + b + 1, 2)))
    e = draw(st.sampled_from(range(abs(d - c), d + c + 1, 2)))
    fs = [f for f in range(abs(a - e), a + e + 1, 2) if is_triad(d, b, f)]
    if not fs:  # rebuild b from a triad (d b f) with f from (a e f)
        f = draw(st.sampled_from(range(abs(a - e), a + e + 1, 2)))
        bs = [x for x in range(abs(d - f), d + f + 1, 2) if is_triad(a, x, c)]
        if not bs:
            return a, a, 0, 0, a, a  # {a a 0; 0 a a}: always allowed
        return a, draw(st.sampled_from(bs)), c, d, e, f
    return a, b, c, d, e, draw(st.sampled_from(fs))


@settings(max_examples=40, **PROPERTY)
@given(sixj_cases())
def test_sixj_symmetries_up_to_j_40(t):
    check_sixj(t)


def test_sixj_class_size_is_144_for_a_generic_symbol():
    t = (2, 4, 6, 6, 6, 6)  # {1 2 3; 3 3 3}
    assert allowed_6j(t) and sixj2(*t)
    assert len(sixj_class(t)) == 144
    assert len(symmetry.members("6j", *t)) == 144


# ---------------------------------------------------------------------------
# 9j: row and column permutations, transposition (Edmonds 1957, §6.4;
# NIST DLMF §34.7): an odd permutation gives (-1)**(sum of all nine j)
# ---------------------------------------------------------------------------
def ninej_images(t):
    rows = (t[0:3], t[3:6], t[6:9])
    sign_odd = phase_of_sum(sum(t))
    for (rp, rodd), (cp, codd) in itertools.product(PERMS, PERMS):
        m = tuple(tuple(rows[rp[a]][cp[b]] for b in range(3)) for a in range(3))
        sign = sign_odd if rodd != codd else 1
        for square in (m, tuple(zip(*m))):
            yield tuple(x for row in square for x in row), sign


def allowed_9j(t) -> bool:
    return all(is_triad(*t[i : i + 3]) for i in (0, 3, 6)) and all(is_triad(t[i], t[i + 3], t[i + 6]) for i in range(3))


def check_ninej(t) -> None:
    value = ninej2(*t)
    images = list(ninej_images(t))
    for image, sign in images:
        assert ninej2(*image) == sign * value, (t, image, sign)
    expected = images_as_dict(images, not value)
    members = dict(symmetry.members("9j", *t))
    assert set(members) == set(expected), t
    if value:
        assert members == expected, t
    check_canonical("9j", t, value, ninej2)


def test_ninej_symmetries_for_all_j_up_to_1():
    count = 0
    for t in itertools.product(range(3), repeat=9):
        if allowed_9j(t):
            check_ninej(t)
            count += 1
    assert count == 215  # every allowed 9j with j <= 1 (same count as the sympy comparison)


@st.composite
def ninej_cases(draw, top=20):
    j11, j12, j21, j22 = (draw(st.integers(0, top)) for _ in range(4))
    j13 = draw(st.sampled_from(range(abs(j11 - j12), j11 + j12 + 1, 2)))
    j23 = draw(st.sampled_from(range(abs(j21 - j22), j21 + j22 + 1, 2)))
    j31 = draw(st.sampled_from(range(abs(j11 - j21), j11 + j21 + 1, 2)))
    j32 = draw(st.sampled_from(range(abs(j12 - j22), j12 + j22 + 1, 2)))
    both = [x for x in range(abs(j31 - j32), j31 + j32 + 1, 2) if is_triad(j13, j23, x)]
    if not both:  # {j11 j12 j13; j11 j12 j13; 0 0 0}: always allowed
        return j11, j12, j13, j11, j12, j13, 0, 0, 0
    return j11, j12, j13, j21, j22, j23, j31, j32, draw(st.sampled_from(both))


@settings(max_examples=30, **PROPERTY)
@given(ninej_cases())
def test_ninej_symmetries_up_to_j_10(t):
    assert allowed_9j(t)
    check_ninej(t)


def test_ninej_class_size_is_72_for_a_generic_symbol():
    t = (6, 6, 4, 5, 4, 3, 5, 6, 1)  # {3 3 2; 5/2 2 3/2; 5/2 3 1/2}
    assert allowed_9j(t) and ninej2(*t)
    assert len(dict(ninej_images(t))) == 72
    assert len(symmetry.members("9j", *t)) == 72


def test_public_class_helpers_take_quantum_numbers() -> None:
    # The 6j symbol's Regge class of a generic symbol has 144 members, all equal
    # (Regge 1959; DLMF 34.5.8-10); the values are checked against the engine itself.
    from fractions import Fraction

    from tablegen import sixj, threej
    from tablegen.symmetry import canonical_form, symmetry_class

    members = symmetry_class("6j", 1, 2, 3, 3, 3, 3)
    assert len(members) == 144
    value = sixj(1, 2, 3, 3, 3, 3)
    assert all(sign == 1 and sixj(*args) == value for args, sign in members)
    # (j1 j2 j3; m1 m2 m3) = (-1)^(j1+j2+j3) (j2 j1 j3; m2 m1 m3) -- Edmonds 1957, eq. 3.7.5 (from memory)
    args, sign = canonical_form("3j", "1/2", 1, "3/2", "1/2", 0, "-1/2")
    assert threej("1/2", 1, "3/2", "1/2", 0, "-1/2") == sign * threej(*args)
    assert all(isinstance(a, Fraction) for a in args)
    with pytest.raises(ValueError, match="triangle"):
        symmetry_class("6j", 1, 1, 5, 1, 1, 1)

"""Published identities, checked exactly over whole small ranges and, with
hypothesis, at larger j.

Sums of values are taken with tablegen's ExactSum: a rational combination of
square roots of square-free integers in one canonical form, unique because
such roots are linearly independent over the rationals (Besicovitch 1940),
so a sum equals 0 or a Surd exactly and nothing is rounded.

Identities (sources beside each test):
* orthogonality of CG coefficients and of 3j symbols (both sums),
* orthogonality of 6j and of 9j symbols,
* Racah's sum rule and the Biedenharn-Elliott identity for 6j symbols,
* the 9j as a sum over products of three 6j symbols,
* CG <-> 3j and W <-> 6j relations.
"""

from __future__ import annotations

import itertools

from hypothesis import given, settings
from hypothesis import strategies as st

from tablegen.coefficients import cg2, ninej2, racah_w2, sixj2, threej2
from tablegen.values import ExactSum, Surd

# deterministic, no example database written into the checkout
PROPERTY = dict(deadline=None, derandomize=True, database=None)


def triads(ta: int, tb: int, top: int | None = None) -> range:
    """Every doubled c with (a b c) a triad (and c <= top if given)."""
    hi = ta + tb if top is None else min(ta + tb, top)
    return range(abs(ta - tb), hi + 1, 2)


def is_triad(ta: int, tb: int, tc: int) -> bool:
    return (ta + tb + tc) % 2 == 0 and abs(ta - tb) <= tc <= ta + tb


def phase(t: int) -> int:
    """(-1)**(t/2) for an even doubled exponent t."""
    assert t % 2 == 0
    return -1 if (t // 2) % 2 else 1


@st.composite
def partner_of(draw, ta: int, tb: int, top: int):
    choices = triads(ta, tb, top)
    return choices[draw(st.integers(0, len(choices) - 1))]


# ---------------------------------------------------------------------------
# Orthogonality of CG coefficients and 3j symbols
# (unitarity of the coupling, Condon & Shortley 1935, ch. III; NIST DLMF §34.3(iv)
# for the 3j form)
# ---------------------------------------------------------------------------
def cg_sum_over_m(tj1, tj2, tJ, tK, tM):
    """sum_m1 <j1 m1; j2 M-m1 | J M> <j1 m1; j2 M-m1 | K M>."""
    s = ExactSum()
    for tm1 in range(-tj1, tj1 + 1, 2):
        tm2 = tM - tm1
        if abs(tm2) <= tj2:
            s += cg2(tj1, tm1, tj2, tm2, tJ, tM) * cg2(tj1, tm1, tj2, tm2, tK, tM)
    return s


def cg_sum_over_j(tj1, tj2, tm1, tn1, tM):
    """sum_J <j1 m1; j2 M-m1 | J M> <j1 n1; j2 M-n1 | J M>."""
    s = ExactSum()
    for tJ in triads(tj1, tj2):
        s += cg2(tj1, tm1, tj2, tM - tm1, tJ, tM) * cg2(tj1, tn1, tj2, tM - tn1, tJ, tM)
    return s


def test_cg_orthogonality_for_all_j_up_to_3():
    checked = 0
    for tj1, tj2 in itertools.product(range(7), repeat=2):
        allowed = triads(tj1, tj2)
        for tJ, tK in itertools.product(allowed, repeat=2):
            for tM in range(-min(tJ, tK), min(tJ, tK) + 1, 2):
                assert cg_sum_over_m(tj1, tj2, tJ, tK, tM) == (tJ == tK), (tj1, tj2, tJ, tK, tM)
                checked += 1
        for tm1, tn1 in itertools.product(range(-tj1, tj1 + 1, 2), repeat=2):
            for tm2 in range(-tj2, tj2 + 1, 2):
                tM = tm1 + tm2
                if abs(tM - tn1) <= tj2:
                    assert cg_sum_over_j(tj1, tj2, tm1, tn1, tM) == (tm1 == tn1), (tj1, tj2, tm1, tn1)
                    checked += 1
    assert checked > 3000


def test_threej_orthogonality_for_all_j_up_to_5_2():
    # sum_{m1 m2} (2 j3 + 1) (j1 j2 j3; m1 m2 m3)(j1 j2 j3'; m1 m2 m3') = delta delta
    # sum_{j3 m3} (2 j3 + 1) (j1 j2 j3; m1 m2 m3)(j1 j2 j3; m1' m2' m3) = delta delta
    for tj1, tj2 in itertools.product(range(6), repeat=2):
        for tj3, tk3 in itertools.product(triads(tj1, tj2), repeat=2):
            for tm3, tn3 in itertools.product(range(-tj3, tj3 + 1, 2), range(-tk3, tk3 + 1, 2)):
                s = ExactSum()
                for tm1, tm2 in itertools.product(range(-tj1, tj1 + 1, 2), range(-tj2, tj2 + 1, 2)):
                    s += (threej2(tj1, tj2, tj3, tm1, tm2, tm3) * threej2(tj1, tj2, tk3, tm1, tm2, tn3)) * (tj3 + 1)
                assert s == (tj3 == tk3 and tm3 == tn3), (tj1, tj2, tj3, tk3, tm3, tn3)
        ms = list(itertools.product(range(-tj1, tj1 + 1, 2), range(-tj2, tj2 + 1, 2)))
        for (tm1, tm2), (tn1, tn2) in itertools.product(ms, repeat=2):
            s = ExactSum()
            for tj3 in triads(tj1, tj2):
                for tm3 in range(-tj3, tj3 + 1, 2):
                    s += (threej2(tj1, tj2, tj3, tm1, tm2, tm3) * threej2(tj1, tj2, tj3, tn1, tn2, tm3)) * (tj3 + 1)
            assert s == ((tm1, tm2) == (tn1, tn2)), (tj1, tj2, tm1, tm2, tn1, tn2)


@st.composite
def cg_orthogonality_cases(draw, top=60):
    tj1, tj2 = draw(st.integers(0, top)), draw(st.integers(0, top))
    tJ, tK = draw(partner_of(tj1, tj2, 2 * top)), draw(partner_of(tj1, tj2, 2 * top))
    low = min(tJ, tK)
    tM = draw(st.sampled_from(range(-low, low + 1, 2)))
    m_range = range(max(-tj1, tM - tj2), min(tj1, tM + tj2) + 1, 2)
    tm1, tn1 = draw(st.sampled_from(m_range)), draw(st.sampled_from(m_range))
    return tj1, tj2, tJ, tK, tM, tm1, tn1


@settings(max_examples=150, **PROPERTY)
@given(cg_orthogonality_cases())
def test_cg_orthogonality_up_to_j_30(case):
    # both orthogonality sums (Condon & Shortley 1935, ch. III), j1, j2 <= 30
    tj1, tj2, tJ, tK, tM, tm1, tn1 = case
    assert cg_sum_over_m(tj1, tj2, tJ, tK, tM) == (tJ == tK)
    assert cg_sum_over_j(tj1, tj2, tm1, tn1, tM) == (tm1 == tn1)


# ---------------------------------------------------------------------------
# 6j orthogonality (NIST DLMF §34.5(iv); Edmonds 1957, §6.2):
#   sum_x (2x + 1)(2f + 1) {a b x; c d f}{a b x; c d f'} = delta(f, f')
# for (a d f), (c b f), (a d f'), (c b f') triads.
# ---------------------------------------------------------------------------
def sixj_orthogonality_sum(a, b, c, d, f, g):
    s = ExactSum()
    for x in triads(a, b):
        s += (sixj2(a, b, x, c, d, f) * sixj2(a, b, x, c, d, g)) * ((x + 1) * (f + 1))
    return s


def test_sixj_orthogonality_for_all_j_up_to_5_2():
    checked = 0
    for a, b, c, d in itertools.product(range(6), repeat=4):
        fs = [f for f in triads(a, d) if is_triad(c, b, f)]
        for f, g in itertools.product(fs, repeat=2):
            assert sixj_orthogonality_sum(a, b, c, d, f, g) == (f == g), (a, b, c, d, f, g)
            checked += 1
    assert checked > 2000


@st.composite
def sixj_orthogonality_cases(draw, top=60):
    a, b, c = (draw(st.integers(0, top)) for _ in range(3))
    d = draw(st.integers(0, top))
    fs = [f for f in triads(a, d) if is_triad(c, b, f)]
    if not fs:  # make one: choose d from the triads of (a, f) with f from (c, b)
        f = draw(partner_of(c, b, 2 * top))
        d = draw(partner_of(a, f, 2 * top))
        fs = [f for f in triads(a, d) if is_triad(c, b, f)]
    return a, b, c, d, draw(st.sampled_from(fs)), draw(st.sampled_from(fs))


@settings(max_examples=100, **PROPERTY)
@given(sixj_orthogonality_cases())
def test_sixj_orthogonality_up_to_j_30(case):
    a, b, c, d, f, g = case
    assert sixj_orthogonality_sum(a, b, c, d, f, g) == (f == g)


# ---------------------------------------------------------------------------
# 9j orthogonality (NIST DLMF 34.7.2):
#   sum_{j12 j34} (2j12+1)(2j34+1)(2j13+1)(2j24+1)
#       {j1 j2 j12; j3 j4 j34; j13 j24 j}{j1 j2 j12; j3 j4 j34; j13' j24' j}
#   = delta(j13, j13') delta(j24, j24')
# ---------------------------------------------------------------------------
def ninej_orthogonality_sum(j1, j2, j3, j4, j, k13, k24, l13, l24):
    s = ExactSum()
    for j12 in triads(j1, j2):
        for j34 in triads(j3, j4):
            s += (
                ninej2(j1, j2, j12, j3, j4, j34, k13, k24, j) * ninej2(j1, j2, j12, j3, j4, j34, l13, l24, j)
            ) * ((j12 + 1) * (j34 + 1) * (k13 + 1) * (k24 + 1))
    return s


def coupled_pairs(j1, j2, j3, j4, j):
    """(j13, j24) with (j1 j3 j13), (j2 j4 j24) and (j13 j24 j) triads."""
    return [(x, y) for x in triads(j1, j3) for y in triads(j2, j4) if is_triad(x, y, j)]


def test_ninej_orthogonality_for_small_j():
    checked = 0
    for j1, j2, j3, j4 in itertools.product(range(4), repeat=4):
        for j in range(0, j1 + j2 + j3 + j4 + 1):
            pairs = coupled_pairs(j1, j2, j3, j4, j)
            for (k13, k24), (l13, l24) in itertools.product(pairs, repeat=2):
                got = ninej_orthogonality_sum(j1, j2, j3, j4, j, k13, k24, l13, l24)
                assert got == ((k13, k24) == (l13, l24)), (j1, j2, j3, j4, j, k13, k24, l13, l24)
                checked += 1
    assert checked > 5000


@st.composite
def ninej_orthogonality_cases(draw, top=16):
    j1, j2, j3, j4 = (draw(st.integers(0, top)) for _ in range(4))
    k13, k24 = draw(partner_of(j1, j3, 4 * top)), draw(partner_of(j2, j4, 4 * top))
    j = draw(partner_of(k13, k24, 4 * top))
    l13, l24 = draw(st.sampled_from(coupled_pairs(j1, j2, j3, j4, j)))  # contains (k13, k24)
    return j1, j2, j3, j4, j, k13, k24, l13, l24


@settings(max_examples=40, **PROPERTY)
@given(ninej_orthogonality_cases())
def test_ninej_orthogonality_up_to_j_8(case):
    j1, j2, j3, j4, j, k13, k24, l13, l24 = case
    assert ninej_orthogonality_sum(*case) == ((k13, k24) == (l13, l24))


# ---------------------------------------------------------------------------
# Racah's sum rule (NIST DLMF §34.5(vi); Edmonds 1957, §6.2):
#   sum_x (-1)**(p+q+x) (2x+1) {a b x; c d p}{a b x; d c q} = {a c q; b d p}
# ---------------------------------------------------------------------------
def racah_sum_rule_sides(a, b, c, d, p, q):
    s = ExactSum()
    for x in triads(a, b):
        term = sixj2(a, b, x, c, d, p) * sixj2(a, b, x, d, c, q)
        if term:
            s += (term) * (phase(p + q + x) * (x + 1))
    return s, sixj2(a, c, q, b, d, p)


def test_racah_sum_rule_for_all_j_up_to_2():
    nonzero = 0
    for a, b, c, d, p, q in itertools.product(range(5), repeat=6):
        lhs, rhs = racah_sum_rule_sides(a, b, c, d, p, q)
        assert lhs == rhs, (a, b, c, d, p, q)
        nonzero += bool(rhs)
    assert nonzero > 500


@st.composite
def racah_sum_rule_cases(draw, top=60):
    # {a c q; b d p} allowed: (a c q), (a d p), (b c p), (b d q)
    a, c, d = (draw(st.integers(0, top)) for _ in range(3))
    q, p = draw(partner_of(a, c, 2 * top)), draw(partner_of(a, d, 2 * top))
    b = draw(partner_of(c, p, 2 * top))
    return a, b, c, d, p, q


@settings(max_examples=100, **PROPERTY)
@given(racah_sum_rule_cases())
def test_racah_sum_rule_up_to_j_30(case):
    lhs, rhs = racah_sum_rule_sides(*case)
    assert lhs == rhs


# ---------------------------------------------------------------------------
# Biedenharn-Elliott identity (NIST DLMF §34.5(vi); Edmonds 1957, §6.2):
#   sum_x (-1)**(S+x) (2x+1) {a b x; c d p}{c d x; e f q}{e f x; b a r}
#       = {p q r; e a d}{p q r; f b c},   S = a+b+c+d+e+f+p+q+r
# ---------------------------------------------------------------------------
def biedenharn_elliott_sides(a, b, c, d, e, f, p, q, r):
    total = a + b + c + d + e + f + p + q + r
    s = ExactSum()
    for x in triads(a, b):
        term = sixj2(a, b, x, c, d, p) * sixj2(c, d, x, e, f, q) * sixj2(e, f, x, b, a, r)
        if term:
            s += (term) * (phase(total + x) * (x + 1))
    return s, sixj2(p, q, r, e, a, d) * sixj2(p, q, r, f, b, c)


def test_biedenharn_elliott_for_all_j_up_to_1():
    nonzero = 0
    for t in itertools.product(range(3), repeat=9):
        lhs, rhs = biedenharn_elliott_sides(*t)
        assert lhs == rhs, t
        nonzero += bool(rhs)
    assert nonzero > 200


@st.composite
def biedenharn_elliott_cases(draw, top=40):
    # right side allowed: {p q r; e a d} needs (p q r), (p a d), (e q d), (e a r);
    # {p q r; f b c} needs (p b c), (f q c), (f b r)
    p, q, a = (draw(st.integers(0, top)) for _ in range(3))
    r = draw(partner_of(p, q, 2 * top))
    d = draw(partner_of(p, a, 2 * top))
    e = draw(partner_of(a, r, 2 * top))
    b = draw(st.integers(0, top))
    c = draw(partner_of(p, b, 2 * top))
    f = draw(partner_of(b, r, 2 * top))
    return a, b, c, d, e, f, p, q, r


@settings(max_examples=100, **PROPERTY)
@given(biedenharn_elliott_cases())
def test_biedenharn_elliott_up_to_j_20(case):
    lhs, rhs = biedenharn_elliott_sides(*case)
    assert lhs == rhs


# ---------------------------------------------------------------------------
# The 9j as a sum of three 6j (NIST DLMF 34.6.2):
#   {j11 j12 j13; j21 j22 j23; j31 j32 j33}
#     = sum_x (-1)**(2x) (2x+1) {j11 j21 j31; j32 j33 x}{j12 j22 j32; j21 x j23}{j13 j23 j33; x j11 j12}
# ---------------------------------------------------------------------------
@st.composite
def ninej_cases(draw, top=24):
    j11, j12, j21, j22 = (draw(st.integers(0, top)) for _ in range(4))
    j13, j23 = draw(partner_of(j11, j12, 2 * top)), draw(partner_of(j21, j22, 2 * top))
    j31, j32 = draw(partner_of(j11, j21, 2 * top)), draw(partner_of(j12, j22, 2 * top))
    # j33 closes the third row; usually the third column too, sometimes not (value 0)
    both = [x for x in triads(j31, j32) if is_triad(j13, j23, x)]
    j33 = draw(st.sampled_from(both or triads(j31, j32)))
    return j11, j12, j13, j21, j22, j23, j31, j32, j33


@settings(max_examples=60, **PROPERTY)
@given(ninej_cases())
def test_ninej_is_a_sum_of_sixj_products(t):
    j11, j12, j13, j21, j22, j23, j31, j32, j33 = t
    s = ExactSum()
    for x in range(0, 2 * max(t) + 1):
        term = sixj2(j11, j21, j31, j32, j33, x) * sixj2(j12, j22, j32, j21, x, j23) * sixj2(j13, j23, j33, x, j11, j12)
        if term:
            s += (term) * ((1 if x % 2 == 0 else -1) * (x + 1))
    assert s == ninej2(*t)


# ---------------------------------------------------------------------------
# Relations between the families
# ---------------------------------------------------------------------------
def test_cg_is_a_scaled_threej():
    # NIST DLMF 34.1.1: <j1 m1; j2 m2 | J M> = (-1)**(j1 - j2 + M) sqrt(2J + 1) (j1 j2 J; m1 m2 -M);
    nonzero = 0
    for tj1, tj2, tJ in itertools.product(range(9), repeat=3):
        for tm1, tm2 in itertools.product(range(-tj1, tj1 + 1, 2), range(-tj2, tj2 + 1, 2)):
            tM = tm1 + tm2
            if (tJ - tM) % 2:  # J - M not an integer: no such coefficient
                continue
            three = threej2(tj1, tj2, tJ, tm1, tm2, -tM)
            got = cg2(tj1, tm1, tj2, tm2, tJ, tM)
            sign = phase(tj1 - tj2 + tM) if three else 1
            assert got == sign * Surd.from_square(tJ + 1) * three, (tj1, tm1, tj2, tm2, tJ, tM)
            nonzero += bool(got)
    assert nonzero > 1000


def test_racah_w_is_a_signed_sixj():
    # Racah 1942; Edmonds 1957, §6.2: W(a b c d; e f) = (-1)**(a+b+c+d) {a b e; d c f}
    nonzero = 0
    for a, b, c, d, e, f in itertools.product(range(5), repeat=6):
        w = racah_w2(a, b, c, d, e, f)
        six = sixj2(a, b, e, d, c, f)
        if (a + b + c + d) % 2:  # a + b + c + d not an integer: W is 0 (a triad fails)
            assert not w
            continue
        assert w == six * phase(a + b + c + d), (a, b, c, d, e, f)
        nonzero += bool(w)
    assert nonzero > 500

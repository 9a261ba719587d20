"""Values of the engine against references outside the project.

* sympy.physics.wigner (a general-purpose computer-algebra library, used here
  only as a reference): every CG and 3j with all j <= 3, every 6j with all
  j <= 3, every W with all j <= 2, every 9j with all j <= 1, seeded random
  samples up to j = 60, and a few symbols whose factorials exceed the engine's
  small-number path.
* Handbook closed forms, written out here with sympy Rational/sqrt.
* The selection-rule explanations of ``why_zero``.

Values are compared exactly: sign(x) * x**2 is a rational number for every
value involved, so comparing it compares sign and magnitude at once.
"""

from __future__ import annotations

import itertools
import random
from fractions import Fraction

import pytest
import sympy
from sympy import Rational, sqrt
from sympy.physics import wigner

from tablegen import Surd, cg, ninej, racah_w, sixj, threej, why_zero
from tablegen.coefficients import cg2, ninej2, racah_w2, sixj2, threej2, why_zero_doubled

HALF = Rational(1, 2)


# ---------------------------------------------------------------------------
# helpers
# ---------------------------------------------------------------------------
def h(t: int) -> Rational:
    """A doubled integer as the sympy number t/2."""
    return Rational(t, 2)


def as_surd(x) -> Surd:
    """The Surd equal to a sympy number r * sqrt(s) (r, s rational, s > 0), read structurally."""
    x = sympy.sympify(x)
    if x == 0:
        return Surd()
    # structural reading, no assumption queries (they dominate the run time)
    coeff, rest = x.as_coeff_Mul()
    if rest == 1:
        radicand = sympy.Integer(1)
    else:
        assert rest.is_Pow and rest.exp == HALF and rest.base.is_Rational and rest.base > 0, x
        radicand = rest.base
    square = coeff * coeff * radicand
    return Surd.from_square(Fraction(int(square.p), int(square.q)), 1 if coeff > 0 else -1)


def triad_ok(ta: int, tb: int, tc: int) -> bool:
    """Triangle rule with an integer sum, on doubled ints (common practice, no source)."""
    return (ta + tb + tc) % 2 == 0 and abs(ta - tb) <= tc <= ta + tb


def sixj_ok(a, b, c, d, e, f) -> bool:
    """The four triads of {a b c; d e f}: (a b c), (a e f), (d b f), (d e c) (NIST DLMF §34.5)."""
    return triad_ok(a, b, c) and triad_ok(a, e, f) and triad_ok(d, b, f) and triad_ok(d, e, c)


def ninej_ok(t) -> bool:
    """Every row and column of a 9j is a triad (NIST DLMF §34.6)."""
    return all(triad_ok(*t[i : i + 3]) for i in (0, 3, 6)) and all(
        triad_ok(t[i], t[i + 3], t[i + 6]) for i in range(3)
    )


def projections(tj: int):
    return range(-tj, tj + 1, 2)


def partner(rng: random.Random, ta: int, tb: int) -> int:
    """A random doubled c with (a b c) a triad."""
    lo, hi = abs(ta - tb), ta + tb
    return lo + 2 * rng.randint(0, (hi - lo) // 2)


def mismatches_report(bad: list) -> str:
    return f"{len(bad)} mismatches, first: {bad[:5]}"


# ---------------------------------------------------------------------------
# 1. sympy.physics.wigner, exhaustive over small j.
#    sympy's argument orders (from its docstrings): clebsch_gordan(j1, j2, j3,
#    m1, m2, m3) = <j1 m1; j2 m2 | j3 m3>; wigner_3j(j1, j2, j3, m1, m2, m3);
#    wigner_6j(j1..j6) = {j1 j2 j3; j4 j5 j6}; racah(a, b, c, d, e, f) =
#    W(a b c d; e f); wigner_9j(j1..j9) in row order.  It raises ValueError
#    for some non-triangular symbols where tablegen returns 0.
# ---------------------------------------------------------------------------
SMALL = range(7)  # doubled j from 0 to 3


@pytest.mark.parametrize("tj1", SMALL)
def test_cg_and_threej_match_sympy_for_all_j_up_to_3(tj1):
    # reference: sympy.physics.wigner.clebsch_gordan / wigner_3j
    bad, compared, nonzero = [], 0, 0
    for tj2, tj3 in itertools.product(SMALL, SMALL):
        for tm1 in projections(tj1):
            for tm2 in projections(tj2):
                tm3 = tm1 + tm2
                ref_cg = wigner.clebsch_gordan(h(tj1), h(tj2), h(tj3), h(tm1), h(tm2), h(tm3))
                ref_3j = wigner.wigner_3j(h(tj1), h(tj2), h(tj3), h(tm1), h(tm2), h(-tm3))
                got_cg = cg2(tj1, tm1, tj2, tm2, tj3, tm3)
                got_3j = threej2(tj1, tj2, tj3, tm1, tm2, -tm3)
                compared += 1
                nonzero += bool(got_cg)
                if got_cg.to_sympy() != ref_cg or got_cg != as_surd(ref_cg):
                    bad.append(("cg", tj1, tm1, tj2, tm2, tj3, tm3, got_cg, ref_cg))
                if got_3j.to_sympy() != ref_3j or got_3j != as_surd(ref_3j):
                    bad.append(("3j", tj1, tj2, tj3, tm1, tm2, -tm3, got_3j, ref_3j))
    assert not bad, mismatches_report(bad)
    # 28 * 7 (j2, j3, m2 combinations) * (2 j1 + 1) symbols; a good part non-zero
    assert compared == 28 * 7 * (tj1 + 1) and nonzero >= compared // 8


def test_every_sixj_up_to_3_matches_sympy():
    # reference: sympy.physics.wigner.wigner_6j; non-triads are 0 by definition
    # (NIST DLMF §34.5: the 6j is defined only on four triads)
    bad, allowed = [], 0
    for t in itertools.product(SMALL, repeat=6):
        got = sixj2(*t)
        if not sixj_ok(*t):
            if got:
                bad.append((t, got, "should be 0"))
            continue
        allowed += 1
        ref = wigner.wigner_6j(*map(h, t))
        if got != as_surd(ref):
            bad.append((t, got, ref))
    assert not bad, mismatches_report(bad)
    assert allowed == 3418  # every allowed 6j with j <= 3 was compared


def test_every_racah_w_up_to_2_matches_sympy():
    # reference: sympy.physics.wigner.racah(a, b, c, d, e, f) = W(a b c d; e f);
    # W's triads are (a b e), (c d e), (a c f), (b d f) (Racah 1942)
    bad, allowed = [], 0
    for a, b, c, d, e, f in itertools.product(range(5), repeat=6):
        got = racah_w2(a, b, c, d, e, f)
        if not (triad_ok(a, b, e) and triad_ok(c, d, e) and triad_ok(a, c, f) and triad_ok(b, d, f)):
            if got:
                bad.append(((a, b, c, d, e, f), got, "should be 0"))
            continue
        allowed += 1
        ref = wigner.racah(h(a), h(b), h(c), h(d), h(e), h(f))
        # the public function (sympy Rational arguments) gives the same value
        if got != as_surd(ref) or racah_w(h(a), h(b), h(c), h(d), h(e), h(f)) != got:
            bad.append(((a, b, c, d, e, f), got, ref))
    assert not bad, mismatches_report(bad)
    assert allowed > 500


def test_every_ninej_up_to_1_matches_sympy():
    # reference: sympy.physics.wigner.wigner_9j (rows in order)
    bad, allowed = [], 0
    for t in itertools.product(range(3), repeat=9):
        got = ninej2(*t)
        if not ninej_ok(t):
            if got:
                bad.append((t, got, "should be 0"))
            continue
        allowed += 1
        ref = wigner.wigner_9j(*map(h, t))
        # the public function (sympy Rational arguments) gives the same value
        if got != as_surd(ref) or ninej(*map(h, t)) != got:
            bad.append((t, got, ref))
    assert not bad, mismatches_report(bad)
    assert allowed == 215  # every allowed 9j with j <= 1 was compared


# ---------------------------------------------------------------------------
# 1b. sympy.physics.wigner on seeded random samples up to j = 60.
# ---------------------------------------------------------------------------
MAX_T = 120  # doubled j = 60


def random_cg_args(rng: random.Random):
    tj1, tj2 = rng.randint(0, MAX_T), rng.randint(0, MAX_T)
    tJ = partner(rng, tj1, tj2)
    while tJ > MAX_T:
        tJ = partner(rng, tj1, tj2)
    tM = rng.choice(projections(tJ))
    tm1 = rng.choice(range(max(-tj1, tM - tj2), min(tj1, tM + tj2) + 1, 2))
    return tj1, tm1, tj2, tM - tm1, tJ, tM


def random_sixj_args(rng: random.Random):
    while True:
        a, b, d = (rng.randint(0, MAX_T) for _ in range(3))
        c = partner(rng, a, b)
        e = partner(rng, d, c)
        lo, hi = max(abs(a - e), abs(d - b)), min(a + e, d + b)
        if lo <= hi and max(c, e, hi) <= MAX_T:
            return a, b, c, d, e, lo + 2 * rng.randint(0, (hi - lo) // 2)


def random_ninej_args(rng: random.Random, max_t: int):
    while True:
        j11, j12, j21, j22 = (rng.randint(0, max_t) for _ in range(4))
        j13, j23 = partner(rng, j11, j12), partner(rng, j21, j22)
        j31, j32 = partner(rng, j11, j21), partner(rng, j12, j22)
        lo = max(abs(j13 - j23), abs(j31 - j32))
        hi = min(j13 + j23, j31 + j32)
        if lo <= hi and (lo - j13 - j23) % 2 == 0:
            t = (j11, j12, j13, j21, j22, j23, j31, j32, lo + 2 * rng.randint(0, (hi - lo) // 2))
            if max(t) <= max_t:
                return t


def test_random_cg_and_threej_up_to_60_match_sympy():
    # reference: sympy.physics.wigner.clebsch_gordan / wigner_3j
    rng = random.Random(1958)
    nonzero = 0
    for _ in range(40):
        tj1, tm1, tj2, tm2, tJ, tM = random_cg_args(rng)
        got = cg2(tj1, tm1, tj2, tm2, tJ, tM)
        ref = wigner.clebsch_gordan(h(tj1), h(tj2), h(tJ), h(tm1), h(tm2), h(tM))
        assert got == as_surd(ref), (tj1, tm1, tj2, tm2, tJ, tM)
        got = threej2(tj1, tj2, tJ, tm1, tm2, -tM)
        ref = wigner.wigner_3j(h(tj1), h(tj2), h(tJ), h(tm1), h(tm2), h(-tM))
        assert got == as_surd(ref), (tj1, tj2, tJ, tm1, tm2, -tM)
        nonzero += bool(got)
    assert nonzero >= 35


def test_random_sixj_and_w_up_to_60_match_sympy():
    # reference: sympy.physics.wigner.wigner_6j and racah
    rng = random.Random(1959)
    nonzero = 0
    for _ in range(40):
        a, b, c, d, e, f = random_sixj_args(rng)
        got = sixj2(a, b, c, d, e, f)
        ref = wigner.wigner_6j(h(a), h(b), h(c), h(d), h(e), h(f))
        assert got == as_surd(ref), (a, b, c, d, e, f)
        # the same six numbers as W(a b e d; c f), whose triads are those of the 6j
        got = racah_w2(a, b, e, d, c, f)
        ref = wigner.racah(h(a), h(b), h(e), h(d), h(c), h(f))
        assert got == as_surd(ref), ("W", a, b, e, d, c, f)
        nonzero += bool(got)
    assert nonzero >= 35


def test_random_ninej_match_sympy():
    # reference: sympy.physics.wigner.wigner_9j; sympy's 9j is slow at large j,
    # so most samples stay below j = 12 and a few go up to j = 60
    rng = random.Random(1953)
    samples = [random_ninej_args(rng, 24) for _ in range(20)]
    samples += [random_ninej_args(rng, MAX_T) for _ in range(3)]
    nonzero = 0
    for t in samples:
        got = ninej2(*t)
        ref = wigner.wigner_9j(*map(h, t))
        assert got == as_surd(ref), t
        nonzero += bool(got)
    assert nonzero >= 20


def test_large_arguments_match_sympy():
    # Factorial arguments above 400 take the engine's prime-exponent path
    # (tablegen.intmath); reference: sympy.physics.wigner
    cases_3j = [
        (300, 280, 260, 11 * 2, -31 * 2, 20 * 2),
        (401, 399, 200, 201, -151, -50),
        (500, 420, 260, 0, 0, 0),
    ]
    for t in cases_3j:
        got = threej2(*t)
        assert got, t
        assert got == as_surd(wigner.wigner_3j(*map(h, t))), t
    cases_6j = [(300, 280, 260, 290, 270, 250), (401, 399, 200, 351, 349, 250)]
    for t in cases_6j:
        got = sixj2(*t)
        assert got, t
        assert got == as_surd(wigner.wigner_6j(*map(h, t))), t


# ---------------------------------------------------------------------------
# 2. Handbook closed forms, over many j1 (integers and half-integers).
#    Each function gives the reference value as a sympy expression.
# ---------------------------------------------------------------------------
J1_RANGE = range(1, 41)  # doubled j1 from 1/2 to 20


def cg_half_table(j1, M, m2, J):
    """<j1 M-m2; 1/2 m2 | J M> for J = j1 +- 1/2.

    Condon & Shortley 1935, Table 1^3 (written from memory).
    """
    if J == j1 + HALF:
        return {
            HALF: sqrt((j1 + M + HALF) / (2 * j1 + 1)),
            -HALF: sqrt((j1 - M + HALF) / (2 * j1 + 1)),
        }[m2]
    # J = j1 - 1/2
    return {
        HALF: -sqrt((j1 - M + HALF) / (2 * j1 + 1)),
        -HALF: sqrt((j1 + M + HALF) / (2 * j1 + 1)),
    }[m2]


def cg_one_table(j1, M, m2, J):
    """<j1 M-m2; 1 m2 | J M> for J = j1 + 1, j1, j1 - 1.

    Condon & Shortley 1935, Table 2^3 (written from memory).
    """
    if J == j1 + 1:
        return {
            1: sqrt((j1 + M) * (j1 + M + 1) / ((2 * j1 + 1) * (2 * j1 + 2))),
            0: sqrt((j1 - M + 1) * (j1 + M + 1) / ((2 * j1 + 1) * (j1 + 1))),
            -1: sqrt((j1 - M) * (j1 - M + 1) / ((2 * j1 + 1) * (2 * j1 + 2))),
        }[m2]
    if J == j1:
        return {
            1: -sqrt((j1 + M) * (j1 - M + 1) / (2 * j1 * (j1 + 1))),
            0: M / sqrt(j1 * (j1 + 1)),
            -1: sqrt((j1 - M) * (j1 + M + 1) / (2 * j1 * (j1 + 1))),
        }[m2]
    # J = j1 - 1
    return {
        1: sqrt((j1 - M) * (j1 - M + 1) / (2 * j1 * (2 * j1 + 1))),
        0: -sqrt((j1 - M) * (j1 + M) / (j1 * (2 * j1 + 1))),
        -1: sqrt((j1 + M + 1) * (j1 + M) / (2 * j1 * (2 * j1 + 1))),
    }[m2]


def test_cg_with_j2_one_half_matches_closed_form():
    # Condon & Shortley 1935, Table 1^3
    count = 0
    for tj1 in J1_RANGE:
        j1 = h(tj1)
        for tJ in (tj1 - 1, tj1 + 1):
            for tM in projections(tJ):
                for tm2 in (1, -1):
                    tm1 = tM - tm2
                    ref = cg_half_table(j1, h(tM), h(tm2), h(tJ)) if abs(tm1) <= tj1 else 0
                    got = cg(j1, h(tm1), HALF, h(tm2), h(tJ), h(tM))
                    assert got == as_surd(ref), (j1, h(tm1), h(tm2), h(tJ), h(tM))
                    count += 1
    assert count > 3000


def test_cg_with_j2_one_matches_closed_form():
    # Condon & Shortley 1935, Table 2^3
    count = 0
    for tj1 in J1_RANGE:
        j1 = h(tj1)
        for tJ in (tj1 - 2, tj1, tj1 + 2):
            if tJ < 0:
                continue
            for tM in projections(tJ):
                for m2 in (1, 0, -1):
                    tm1 = tM - 2 * m2
                    ref = cg_one_table(j1, h(tM), m2, h(tJ)) if abs(tm1) <= tj1 else 0
                    got = cg(j1, h(tm1), 1, m2, h(tJ), h(tM))
                    assert got == as_surd(ref), (j1, h(tm1), m2, h(tJ), h(tM))
                    count += 1
    assert count > 7000


def test_threej_with_j3_zero_matches_closed_form():
    # NIST DLMF 34.3.1: (j j 0; m -m 0) = (-1)**(j - m) / sqrt(2j + 1);
    # any other j2 or m2 gives 0 (triangle rule, m-sum)
    for tj in range(0, 41):
        j = h(tj)
        for tm in projections(tj):
            m = h(tm)
            ref = (-1) ** (j - m) / sqrt(2 * j + 1)
            assert threej(j, j, 0, m, -m, 0) == as_surd(ref), (j, m)
            assert not threej(j, j + 1, 0, m, -m, 0)
            if tj:
                assert not threej(j, j, 0, m, 1 - m, 0)


def threej_one_table(j, m, kind):
    """(j' j 1; m -m-mu mu) for the four families listed below."""
    if kind == "j j 1; m -m 0":  # NIST DLMF 34.3.2
        return (-1) ** (j - m) * 2 * m / sqrt(2 * j * (2 * j + 1) * (2 * j + 2))
    if kind == "j j 1; m -m-1 1":  # NIST DLMF 34.3.3
        return (-1) ** (j - m) * sqrt(2 * (j - m) * (j + m + 1) / (2 * j * (2 * j + 1) * (2 * j + 2)))
    if kind == "j+1 j 1; m -m 0":  # Edmonds 1957, Table 2 (from memory)
        return (-1) ** (j - m - 1) * sqrt(
            2 * (j + m + 1) * (j - m + 1) / ((2 * j + 1) * (2 * j + 2) * (2 * j + 3))
        )
    # "j+1 j 1; m -m-1 1": Edmonds 1957, Table 2 (from memory)
    return (-1) ** (j - m - 1) * sqrt((j - m) * (j - m + 1) / ((2 * j + 1) * (2 * j + 2) * (2 * j + 3)))


def test_threej_with_j3_one_matches_closed_form():
    count = 0
    for tj in range(1, 41):
        j = h(tj)
        for tm in range(-tj - 2, tj + 3, 2):
            m = h(tm)
            cases = {
                "j j 1; m -m 0": (j, j, m, -m, 0),
                "j j 1; m -m-1 1": (j, j, m, -m - 1, 1),
                "j+1 j 1; m -m 0": (j + 1, j, m, -m, 0),
                "j+1 j 1; m -m-1 1": (j + 1, j, m, -m - 1, 1),
            }
            for kind, (ja, jb, ma, mb, mu) in cases.items():
                if abs(ma) > ja or abs(mb) > jb:
                    assert not threej(ja, jb, 1, ma, mb, mu)
                    continue
                ref = threej_one_table(j, m, kind)
                got = threej(ja, jb, 1, ma, mb, mu)
                assert got == as_surd(ref), (kind, j, m)
                count += 1
    assert count > 3000


def test_threej_with_all_m_zero_matches_closed_form():
    # NIST DLMF 34.3.5: (j1 j2 j3; 0 0 0) is 0 for odd J = j1 + j2 + j3, and
    # (-1)**(J/2) sqrt((J-2j1)! (J-2j2)! (J-2j3)! / (J+1)!) (J/2)! / ((J/2-j1)! (J/2-j2)! (J/2-j3)!)
    f = sympy.factorial
    for j1, j2 in itertools.product(range(0, 16), repeat=2):
        for j3 in range(abs(j1 - j2), j1 + j2 + 1):
            big = j1 + j2 + j3
            if big % 2:
                ref = 0
            else:
                g = big // 2
                ref = (-1) ** g * sqrt(f(big - 2 * j1) * f(big - 2 * j2) * f(big - 2 * j3) / f(big + 1)) * f(g) / (
                    f(g - j1) * f(g - j2) * f(g - j3)
                )
            assert threej(j1, j2, j3, 0, 0, 0) == as_surd(ref), (j1, j2, j3)


def test_large_j_closed_forms():
    # <j 0; j 0 | 0 0> = (-1)**j / sqrt(2j + 1): NIST DLMF 34.3.1 with the
    # CG-3j relation DLMF 34.1.1; (j1 j2 j3; 0 0 0) from DLMF 34.3.5 at large j
    for j in (50, 60, 100, 250):
        ref = (-1) ** j / sqrt(2 * j + 1)
        assert cg(j, 0, j, 0, 0, 0) == as_surd(ref), j
        for m in (1, 17, j):
            ref = (-1) ** (j - m) / sqrt(2 * j + 1)
            assert cg(j, m, j, -m, 0, 0) == as_surd(ref), (j, m)
    f = sympy.factorial
    for j1, j2, j3 in ((100, 120, 80), (150, 160, 170), (300, 200, 250)):
        g = (j1 + j2 + j3) // 2
        big = 2 * g
        ref = (-1) ** g * sqrt(f(big - 2 * j1) * f(big - 2 * j2) * f(big - 2 * j3) / f(big + 1)) * f(g) / (
            f(g - j1) * f(g - j2) * f(g - j3)
        )
        assert threej(j1, j2, j3, 0, 0, 0) == as_surd(ref), (j1, j2, j3)


def test_sixj_with_a_zero_matches_closed_form():
    # NIST DLMF 34.5.1: {j1 j2 j3; 0 j3 j2} = (-1)**(j1+j2+j3) / sqrt((2 j2 + 1)(2 j3 + 1));
    # equivalently (Edmonds 1957, §6.3) {a b c; d e 0} = delta(a,e) delta(b,d)
    # (-1)**(a+b+c) / sqrt((2a + 1)(2b + 1)), which is 0 when a != e or b != d
    count = 0
    for t2, t3 in itertools.product(range(0, 41), repeat=2):
        j2, j3 = h(t2), h(t3)
        allowed = range(abs(t2 - t3), t2 + t3 + 1, 2)
        # every j1 while there are few, then about ten spread over the range
        for t1 in allowed[:: 1 + len(allowed) // 10]:
            j1 = h(t1)
            ref = (-1) ** (j1 + j2 + j3) / sqrt((2 * j2 + 1) * (2 * j3 + 1))
            assert sixj(j1, j2, j3, 0, j3, j2) == as_surd(ref), (j1, j2, j3)
            # the zero moved to the last place: {j3 j2 j1; j2 j3 0} (columns swapped)
            assert sixj(j3, j2, j1, j2, j3, 0) == as_surd(ref), (j1, j2, j3)
            count += 1
    assert count > 8000
    for a, b, c, d, e in itertools.product(range(7), repeat=5):
        got = sixj2(a, b, c, d, e, 0)
        if (a, b) != (e, d) or not triad_ok(a, b, c):
            assert not got, (a, b, c, d, e)


def ninej_zero_reference(t11, t12, t13, t21, t22, t31):
    """NIST DLMF 34.7.1 (also Edmonds 1957, §6.4):

    {j11 j12 j13; j21 j22 j13; j31 j31 0}
        = (-1)**(j12+j21+j13+j31) / sqrt((2 j13 + 1)(2 j31 + 1)) {j11 j12 j13; j22 j21 j31}

    with the 6j taken from sympy.physics.wigner, so that the check is
    independent of the engine.
    """
    args6 = (t11, t12, t13, t22, t21, t31)
    if not sixj_ok(*args6):
        return 0
    j12, j21, j13, j31 = h(t12), h(t21), h(t13), h(t31)
    return (
        (-1) ** (j12 + j21 + j13 + j31)
        / sqrt((2 * j13 + 1) * (2 * j31 + 1))
        * wigner.wigner_6j(*map(h, args6))
    )


def test_ninej_with_a_zero_reduces_to_sixj():
    # every such 9j with j11, j12, j21, j22 <= 2 ...
    count = 0
    for t11, t12, t21, t22 in itertools.product(range(5), repeat=4):
        for t13 in range(abs(t11 - t12), t11 + t12 + 1, 2):
            for t31 in range(abs(t11 - t21), t11 + t21 + 1, 2):
                got = ninej2(t11, t12, t13, t21, t22, t13, t31, t31, 0)
                ref = ninej_zero_reference(t11, t12, t13, t21, t22, t31)
                assert got == as_surd(ref), (t11, t12, t13, t21, t22, t31)
                count += bool(got)
    assert count > 500
    # ... and seeded random ones with j up to 20
    rng = random.Random(1974)
    count = 0
    while count < 30:
        t11, t12, t21, t22 = (rng.randint(0, 40) for _ in range(4))
        t13, t31 = partner(rng, t11, t12), partner(rng, t11, t21)
        ref = ninej_zero_reference(t11, t12, t13, t21, t22, t31)
        if ref == 0 or max(t13, t31) > 40:
            continue
        got = ninej2(t11, t12, t13, t21, t22, t13, t31, t31, 0)
        assert got == as_surd(ref), (t11, t12, t13, t21, t22, t31)
        count += 1


# ---------------------------------------------------------------------------
# 5. Selection rules: why_zero names a rule that really holds, and None
#    exactly for the non-zero values.
# ---------------------------------------------------------------------------
def test_why_zero_named_cases():
    # one case for each rule, where no other rule applies.  Definitions: the
    # triangle rule, integer triad sums, m-sum and |m| <= j (NIST DLMF §34.2);
    # parity from DLMF 34.3.5; the equal-column zero from the column symmetry
    # DLMF 34.3.9; the equal-row zero of the 9j from Edmonds 1957, §6.4
    cases = [
        (("cg", 1, 1, 1, 0, 3, 1), "triangle"),  # j1 + j2 < J
        (("w", 1, 1, 1, 1, 3, 1), "triangle"),  # W's triad (a b e) = (1 1 3)
        (("6j", "1/2", "1/2", "1/2", "1/2", "1/2", "1/2"), "triad-sum"),
        (("9j", 1, 1, "1/2", 1, 1, 1, 1, 1, 1), "triad-sum"),
        (("cg", 1, 1, 1, 0, 2, 0), "m-sum"),
        (("3j", 1, 1, 2, 1, 1, -1), "m-sum"),
        (("cg", 1, 2, 1, -1, 2, 1), "m-range"),
        (("3j", "1/2", "1/2", 1, "3/2", "-1/2", -1), "m-range"),
        (("cg", 2, 0, 3, 0, 4, 0), "parity"),  # j1 + j2 + J = 9, no two equal columns
        (("3j", 4, 3, 2, 0, 0, 0), "parity"),
        (("3j", 2, 2, 3, 1, 1, -2), "symmetry"),  # equal columns, j1 + j2 + j3 = 7
        (("9j", 1, 1, 1, 1, 1, 1, 1, 1, 1), "symmetry"),  # equal rows, sum 9
    ]
    for (kind, *args), rule in cases:
        reason = why_zero(kind, *args)
        assert reason is not None and reason.startswith(rule + ":"), (kind, args, reason)
    # an accidental zero: all rules hold and sympy.physics.wigner gives 0 too
    args = ("3/2", 3, "7/2", "-1/2", -1, "3/2")
    assert wigner.wigner_3j(*map(Rational, args)) == 0
    assert not threej(*args)
    assert why_zero("3j", *args).startswith("cancellation:")
    for kind, *args in (("cg", 1, 1, 1, -1, 0, 0), ("3j", 1, 1, 0, 1, -1, 0), ("6j", 1, 1, 1, 1, 1, 1),
                        ("w", 1, 1, 1, 1, 1, 1), ("9j", 1, 1, 1, 1, 1, 1, 1, 1, 0)):
        assert why_zero(kind, *args) is None, (kind, args)


def projection_rules(pairs, m_sum: int) -> set[str]:
    rules = {"m-range"} if any(abs(tm) > tj for tj, tm in pairs) else set()
    if m_sum:
        rules.add("m-sum")
    return rules


def triad_rules(*triads) -> set[str]:
    rules = set()
    for ta, tb, tc in triads:
        if (ta + tb + tc) % 2:
            rules.add("triad-sum")
        elif not abs(ta - tb) <= tc <= ta + tb:
            rules.add("triangle")
    return rules


def threej_rules(tj1, tj2, tj3, tm1, tm2, tm3) -> set[str]:
    """Every rule that makes this 3j zero, from the definitions."""
    rules = triad_rules((tj1, tj2, tj3)) | projection_rules(
        ((tj1, tm1), (tj2, tm2), (tj3, tm3)), tm1 + tm2 + tm3
    )
    odd = (tj1 + tj2 + tj3) % 4 == 2  # j1 + j2 + j3 odd
    if odd and tm1 == tm2 == tm3 == 0:
        rules.add("parity")
    cols = [(tj1, tm1), (tj2, tm2), (tj3, tm3)]
    if odd and len(set(cols)) < 3:
        rules.add("symmetry")
    return rules


def check_why_zero(kind: str, t, value, rules: set[str], bad: list) -> None:
    reason = why_zero_doubled(kind, t)
    if value:
        if reason is not None or rules:
            bad.append((kind, t, value, reason, rules))
        return
    if reason is None:
        bad.append((kind, t, "zero but no reason"))
        return
    name = reason.split(":", 1)[0]
    if rules and name not in rules:
        bad.append((kind, t, reason, rules))
    if not rules and name != "cancellation":
        bad.append((kind, t, reason, "expected cancellation"))


def test_why_zero_over_all_small_cg_and_threej():
    bad, seen = [], set()
    r = range(5)  # doubled j up to 2; m over a wider range than |m| <= j
    for tj1, tj2, tj3 in itertools.product(r, repeat=3):
        for tm1, tm2, tm3 in itertools.product(range(-4, 5), repeat=3):
            if (tj1 - tm1) % 2 or (tj2 - tm2) % 2 or (tj3 - tm3) % 2:
                continue
            rules = threej_rules(tj1, tj2, tj3, tm1, tm2, tm3)
            check_why_zero("3j", (tj1, tj2, tj3, tm1, tm2, tm3), threej2(tj1, tj2, tj3, tm1, tm2, tm3), rules, bad)
            # <j1 m1; j2 m2 | J -m3> is +-sqrt(2J + 1) times this 3j: the same rules
            check_why_zero("cg", (tj1, tm1, tj2, tm2, tj3, -tm3), cg2(tj1, tm1, tj2, tm2, tj3, -tm3), rules, bad)
            seen |= rules
    # all m = 0 up to j = 8, where parity is often the only rule that applies
    for tj1, tj2, tj3 in itertools.product(range(0, 17, 2), repeat=3):
        t = (tj1, tj2, tj3, 0, 0, 0)
        check_why_zero("3j", t, threej2(*t), threej_rules(*t), bad)
        check_why_zero("cg", (tj1, 0, tj2, 0, tj3, 0), cg2(tj1, 0, tj2, 0, tj3, 0), threej_rules(*t), bad)
    assert not bad, mismatches_report(bad)
    assert seen == {"triad-sum", "triangle", "m-range", "m-sum", "parity", "symmetry"}


def test_why_zero_over_all_small_sixj_w_and_ninej():
    bad = []
    for t in itertools.product(range(4), repeat=6):
        a, b, c, d, e, f = t
        rules = triad_rules((a, b, c), (a, e, f), (d, b, f), (d, e, c))
        check_why_zero("6j", t, sixj2(*t), rules, bad)
        rules = triad_rules((a, b, e), (c, d, e), (a, c, f), (b, d, f))
        check_why_zero("w", t, racah_w2(*t), rules, bad)
    for t in itertools.product(range(3), repeat=9):
        rows, cols = (t[0:3], t[3:6], t[6:9]), (t[0::3], t[1::3], t[2::3])
        rules = triad_rules(*rows, *cols)
        # two equal rows or columns with an odd sum of all nine j: the 9j
        # changes sign under their exchange (Edmonds 1957, §6.4)
        if not rules and sum(t) % 4 == 2 and (len(set(rows)) < 3 or len(set(cols)) < 3):
            rules = {"symmetry"}
        check_why_zero("9j", t, ninej2(*t), rules, bad)
    assert not bad, mismatches_report(bad)

"""Quantum-number parsing (tablegen.spins) and selection-rule zeros.

Accepted forms must all give the same coefficient as the plain int/Fraction
form, and that coefficient is checked against sympy.physics.wigner (a
general-purpose reference).  Malformed input must raise QuantumNumberError
(a ValueError) with a one-line message naming the argument, the value and
the rule.  Selection rules are not errors: the value is exactly 0 and
why_zero names the rule.
"""

from __future__ import annotations

import itertools
from decimal import Decimal
from fractions import Fraction

import numpy as np
import pytest
import sympy
from sympy.physics.wigner import clebsch_gordan, wigner_3j, wigner_6j, wigner_9j

import tablegen
from tablegen import QuantumNumberError, Surd, TablegenError, cg, ninej, racah_w, sixj, threej, why_zero
from tablegen.spins import DEFAULT_MAX_J, parse_j, parse_m

R = sympy.Rational

RULE_NUMBER = "not a number"
RULE_HALF = "not a multiple of 1/2"
RULE_NEGATIVE = "j must be >= 0"
RULE_FINITE = "NaN or infinity"
RULE_LIMIT = "size limit"


def _message_check(exc: QuantumNumberError, argument: str, rule: str) -> None:
    text = str(exc)
    assert "\n" not in text
    assert exc.argument == argument
    assert f"argument {argument} = " in text
    assert rule in text
    assert exc.rule and exc.rule in text


# ---------------------------------------------------------------------------
# accepted forms
# ---------------------------------------------------------------------------
THREE_HALVES = [
    Fraction(3, 2),
    "3/2",
    " 3/2 ",
    "1.5",
    "6/4",
    1.5,
    np.float64(1.5),
    np.float32(1.5),
    R(3, 2),
    sympy.Float(1.5),
    Decimal("1.5"),
    Decimal("1.50"),
]
TWO = [2, "2", "2.0", "+2", Fraction(2), 2.0, np.int64(2), np.int8(2), np.uint16(2), np.float64(2.0),
       sympy.Integer(2), Decimal("2"), "4/2"]
MINUS_HALF = [Fraction(-1, 2), "-1/2", "-0.5", "\u22121/2", -0.5, np.float64(-0.5), R(-1, 2), Decimal("-0.5")]


@pytest.mark.parametrize("value", THREE_HALVES)
def test_three_halves_forms(value):
    assert parse_j(value, "j1") == 3
    assert parse_m(value, "m1", 5, "j1") == 3


@pytest.mark.parametrize("value", TWO)
def test_integer_forms(value):
    assert parse_j(value, "j1") == 4
    assert parse_m(value, "m1", 4, "j1") == 4


@pytest.mark.parametrize("value", MINUS_HALF)
def test_negative_half_forms_as_projection(value):
    assert parse_m(value, "m2", 1, "j2") == -1


def test_public_functions_agree_across_forms_and_with_sympy():
    # <3/2 -1/2; 2 2 | 5/2 3/2>: the reference is sympy's clebsch_gordan
    expected = clebsch_gordan(R(3, 2), 2, R(5, 2), R(-1, 2), 2, R(3, 2))
    assert expected != 0
    for j1 in THREE_HALVES:
        for m1 in MINUS_HALF:
            for two in TWO[::3]:
                v = cg(j1, m1, two, two, "5/2", j1)
                assert isinstance(v, Surd) and v.to_sympy() == expected
    # 6j {3/2 2 5/2; 1 3/2 2} in several spellings, against sympy's wigner_6j
    ref6 = wigner_6j(R(3, 2), 2, R(5, 2), 1, R(3, 2), 2)
    for a in THREE_HALVES:
        for b in TWO:
            assert sixj(a, b, "5/2", 1, a, b).to_sympy() == ref6


def test_doubled_values_roundtrip_through_text():
    for t in range(0, 41):
        text = f"{t}/2" if t % 2 else str(t // 2)
        assert parse_j(text, "j") == t
        assert parse_m("-" + text, "m", t, "j") == -t


# ---------------------------------------------------------------------------
# malformed input
# ---------------------------------------------------------------------------
BAD_J = [
    ("abc", RULE_NUMBER),
    (None, RULE_NUMBER),
    ([], RULE_NUMBER),
    ({}, RULE_NUMBER),
    (True, RULE_NUMBER),
    (False, RULE_NUMBER),
    (np.bool_(True), RULE_NUMBER),
    (1 + 0j, RULE_NUMBER),
    ("", RULE_NUMBER),
    ("1/0", RULE_NUMBER),
    ("1 1", RULE_NUMBER),
    ("3//2", RULE_NUMBER),
    (b"1", RULE_NUMBER),
    (0.3, RULE_HALF),
    ("1/3", RULE_HALF),
    ("0.3", RULE_HALF),
    (1.49999, RULE_HALF),
    (Fraction(1, 3), RULE_HALF),
    (R(1, 3), RULE_HALF),
    (Decimal("0.3"), RULE_HALF),
    (np.float64(0.25), RULE_HALF),
    (-1, RULE_NEGATIVE),
    ("-1/2", RULE_NEGATIVE),
    (-0.5, RULE_NEGATIVE),
    (Fraction(-3, 2), RULE_NEGATIVE),
    (float("nan"), RULE_FINITE),
    (float("inf"), RULE_FINITE),
    (float("-inf"), RULE_FINITE),
    (np.float64("nan"), RULE_FINITE),
    ("nan", RULE_FINITE),
    ("NaN", RULE_FINITE),
    ("inf", RULE_FINITE),
    ("-Infinity", RULE_FINITE),
    (Decimal("NaN"), RULE_FINITE),
    (Decimal("Infinity"), RULE_FINITE),
    (1e9, RULE_LIMIT),
    ("1e9", RULE_LIMIT),
    (10**9, RULE_LIMIT),
    (DEFAULT_MAX_J + 1, RULE_LIMIT),
    (Fraction(2 * DEFAULT_MAX_J + 1, 2), RULE_LIMIT),
]


@pytest.mark.parametrize("value, rule", BAD_J, ids=[repr(v) for v, _ in BAD_J])
def test_bad_j(value, rule):
    with pytest.raises(QuantumNumberError) as info:
        parse_j(value, "j2")
    _message_check(info.value, "j2", rule)
    assert isinstance(info.value, ValueError) and isinstance(info.value, TablegenError)
    # the offending value is kept (a sympy Rational or Decimal comes back as the equal Fraction)
    assert info.value.value is value or info.value.value == value


@pytest.mark.parametrize(
    "value",
    ["abc", "1/3", 0.3, "nan"],
)
def test_message_shows_the_value(value):
    with pytest.raises(QuantumNumberError) as info:
        parse_j(value, "j3")
    text = str(info.value)
    assert (repr(value) if isinstance(value, str) else str(value)) in text


def test_message_for_a_long_value_stays_short():
    with pytest.raises(QuantumNumberError) as info:
        parse_j("x" * 500, "j1")
    assert len(str(info.value)) < 200 and "at most 40 characters" in str(info.value)


def test_largest_default_j_is_accepted_and_max_j_overrides():
    assert parse_j(DEFAULT_MAX_J, "j1") == 2 * DEFAULT_MAX_J
    assert parse_j(10**9, "j1", max_j=10**9) == 2 * 10**9
    assert parse_j("1e9", "j1", max_j=10**9) == 2 * 10**9
    with pytest.raises(QuantumNumberError) as info:
        parse_j(4, "j1", max_j=3)
    _message_check(info.value, "j1", "size limit 3")
    assert "max_j" in str(info.value)


def test_max_j_lets_a_larger_symbol_through():
    # (j j 0; 0 0 0) for j above the default limit, against sympy's wigner_3j
    j = DEFAULT_MAX_J + 500
    with pytest.raises(QuantumNumberError) as info:
        threej(j, j, 0, 0, 0, 0)
    _message_check(info.value, "j1", RULE_LIMIT)
    value = threej(j, j, 0, 0, 0, 0, max_j=j)
    assert value.to_sympy() == wigner_3j(j, j, 0, 0, 0, 0)
    assert value.squared() == Fraction(1, 2 * j + 1)  # Edmonds 1957, eq. 3.7.9 (from memory)


def test_projection_rules():
    # j - m must be a whole number
    with pytest.raises(QuantumNumberError) as info:
        parse_m("1/2", "m1", 2, "j1")
    _message_check(info.value, "m1", "j1 - m1 must be an integer")
    assert "j1 = 1" in str(info.value)
    with pytest.raises(QuantumNumberError) as info:
        parse_m(1, "M", 3, "J")
    _message_check(info.value, "M", "J - M must be an integer (J = 3/2)")
    # |m| > j is allowed here (a selection-rule zero), but not beyond the size limit
    assert parse_m(5, "m1", 2, "j1") == 10
    for bad, rule in (("1e9", RULE_LIMIT), (-(10**9), RULE_LIMIT), ("x", RULE_NUMBER), (0.3, RULE_HALF),
                      (float("nan"), RULE_FINITE)):
        with pytest.raises(QuantumNumberError) as info:
            parse_m(bad, "m2", 2, "j2")
        _message_check(info.value, "m2", rule)


# ---------------------------------------------------------------------------
# argument names through the public functions
# ---------------------------------------------------------------------------
FAMILIES = [
    (cg, ("j1", "m1", "j2", "m2", "J", "M"), (1, 0, 1, 0, 2, 0)),
    (threej, ("j1", "j2", "j3", "m1", "m2", "m3"), (1, 1, 2, 0, 0, 0)),
    (sixj, ("j1", "j2", "j3", "j4", "j5", "j6"), (1, 1, 1, 1, 1, 1)),
    (racah_w, ("a", "b", "c", "d", "e", "f"), (1, 1, 1, 1, 1, 1)),
    (ninej, ("j11", "j12", "j13", "j21", "j22", "j23", "j31", "j32", "j33"), (1, 1, 1, 1, 1, 1, 1, 1, 0)),
]


@pytest.mark.parametrize("func, names, good", FAMILIES, ids=[f[0].__name__ for f in FAMILIES])
@pytest.mark.parametrize(
    "bad, rule", [("abc", RULE_NUMBER), ("1/3", RULE_HALF), (float("inf"), RULE_FINITE), ("1e9", RULE_LIMIT)]
)
def test_public_functions_name_the_argument(func, names, good, bad, rule):
    assert func(*good) != 0  # the good arguments give a non-zero value
    for i, name in enumerate(names):
        args = list(good)
        args[i] = bad
        with pytest.raises(QuantumNumberError) as info:
            func(*args)
        _message_check(info.value, name, rule)


@pytest.mark.parametrize("func, names, good", FAMILIES, ids=[f[0].__name__ for f in FAMILIES])
def test_public_functions_reject_negative_j(func, names, good):
    m_names = {"m1", "m2", "m3", "M"}
    for i, name in enumerate(names):
        if name in m_names:
            continue
        args = list(good)
        args[i] = -1
        with pytest.raises(QuantumNumberError) as info:
            func(*args)
        _message_check(info.value, name, RULE_NEGATIVE)


def test_public_functions_check_j_minus_m():
    with pytest.raises(QuantumNumberError) as info:
        cg(1, "1/2", 1, 0, 1, 0)
    _message_check(info.value, "m1", "j1 - m1 must be an integer")
    with pytest.raises(QuantumNumberError) as info:
        cg(1, 0, 1, 0, 1, "1/2")
    _message_check(info.value, "M", "J - M must be an integer")
    with pytest.raises(QuantumNumberError) as info:
        threej(1, "3/2", "1/2", 0, "1/2", 0)
    _message_check(info.value, "m3", "j3 - m3 must be an integer")


def test_max_j_keyword_on_every_public_function():
    big = DEFAULT_MAX_J + 1
    for func, names, good in FAMILIES:
        args = [big] * len(names)
        with pytest.raises(QuantumNumberError):
            func(*args)
    # with the limit raised, parsing passes and the selection rules decide
    assert sixj(big, big, 0, 0, 0, 1, max_j=big) == 0
    assert why_zero("6j", big, big, 0, 0, 0, 1, max_j=big).startswith("triangle")


# ---------------------------------------------------------------------------
# selection rules: exactly zero, not errors
# ---------------------------------------------------------------------------
# Selection rules of the 3j / CG: |m| <= j, m1 + m2 = M, triangle rule, integer
# triad sum (NIST DLMF §34.2; Edmonds 1957, §3.7).  6j: every one of its four
# triads obeys the triangle rule with an integer sum (DLMF §34.4).  9j: every
# row and column (DLMF §34.6).  All m = 0 with j1 + j2 + j3 odd: zero
# (DLMF §34.3, from memory).
ZEROS = [
    ("cg", (1, 2, 1, -1, 1, 1), "m-range", "m1"),
    ("cg", (1, 1, 1, -1, 2, 3), "m-range", "M"),
    ("cg", (1, 1, 1, 0, 1, 0), "m-sum", "m1 + m2 != M"),
    ("cg", (1, 0, 1, 0, 3, 0), "triangle", "j1, j2, J"),
    ("cg", ("1/2", "1/2", "1/2", "-1/2", "1/2", "1/2"), "triad-sum", "j1, j2, J"),
    ("cg", (1, 0, 1, 0, 1, 0), "parity", ""),
    ("3j", (1, 1, 1, 0, 0, 0), "parity", ""),
    ("3j", (1, 1, 1, 1, 1, 1), "m-sum", "m1 + m2 + m3"),
    ("3j", (2, 1, 1, 3, -2, -1), "m-range", "m1"),
    ("3j", (1, 1, 3, 0, 0, 0), "triangle", "j1, j2, j3"),
    ("6j", (1, 1, 3, 1, 1, 1), "triangle", "j1, j2, j3"),
    ("6j", (1, 1, 1, 1, 1, 3), "triangle", "j1, j5, j6"),
    ("6j", ("1/2", "1/2", "1/2", 1, 1, 1), "triad-sum", "j1, j2, j3"),
    ("w", (1, 1, 1, 1, 3, 1), "triangle", "a, b, e"),
    ("w", (1, 1, 1, 1, "1/2", 1), "triad-sum", "a, b, e"),
    ("9j", (1, 1, 3, 1, 1, 1, 1, 1, 1), "triangle", "j11, j12, j13"),
    ("9j", (1, 1, 0, 1, 1, 0, 1, 1, 3), "triangle", "j31, j32, j33"),
    ("9j", (1, 1, 1, 1, 1, 1, 1, 1, 1), "symmetry", "odd"),
]
_FUNCS = {"cg": cg, "3j": threej, "6j": sixj, "w": racah_w, "9j": ninej}


@pytest.mark.parametrize("kind, args, rule, detail", ZEROS, ids=[f"{z[0]}-{z[2]}-{i}" for i, z in enumerate(ZEROS)])
def test_selection_rule_zeros(kind, args, rule, detail):
    value = _FUNCS[kind](*args)
    assert isinstance(value, Surd) and value == 0 and value.sign == 0 and not value
    text = why_zero(kind, *args)
    assert text.startswith(rule + ":"), text
    assert detail in text


def test_zeros_agree_with_sympy():
    # sympy returns 0 for these as well (reference, same inputs)
    assert clebsch_gordan(1, 1, 1, 2, -1, 1) == 0
    assert clebsch_gordan(1, 1, 1, 1, 0, 0) == 0
    assert clebsch_gordan(1, 1, 1, 0, 0, 0) == 0
    assert wigner_3j(1, 1, 1, 0, 0, 0) == 0
    assert wigner_6j(1, 1, 3, 1, 1, 1) == 0
    assert wigner_9j(1, 1, 1, 1, 1, 1, 1, 1, 1) == 0
    # two equal columns and j1 + j2 + j3 odd: zero by column symmetry (Edmonds 1957, §3.7; from memory)
    assert threej(2, 2, 3, 1, 1, -2) == 0 == wigner_3j(2, 2, 3, 1, 1, -2)
    assert why_zero("3j", 2, 2, 3, 1, 1, -2).startswith("symmetry:")


def test_why_zero_is_none_for_non_zero_values():
    assert why_zero("cg", 1, 1, "1/2", "-1/2", "3/2", "1/2") is None
    assert why_zero("3j", 1, 1, 1, 1, 0, -1) is None
    assert why_zero("6j", 1, 1, 1, 1, 1, 1) is None
    assert why_zero("w", 1, 1, 1, 1, 1, 1) is None
    assert why_zero("9j", 1, 1, 1, 1, 1, 1, 1, 1, 0) is None


def test_why_zero_checks_its_input():
    with pytest.raises(QuantumNumberError) as info:
        why_zero("6j", 1, 1, 1, 1, "x", 1)
    _message_check(info.value, "j5", RULE_NUMBER)
    with pytest.raises(ValueError, match="kind"):
        why_zero("7j", 1, 1, 1, 1, 1, 1)
    with pytest.raises(TypeError):
        why_zero("6j", 1, 1, 1)


def test_cancellation_zero_is_named():
    # {j1 j2 j3; j4 j5 j6} = 0 with every triangle satisfied: a non-trivial
    # zero; found by searching small symbols against sympy's wigner_6j
    def allowed():
        for a, b, d in itertools.product(range(1, 5), range(1, 5), range(5)):
            for c in range(abs(a - b), a + b + 1):
                for e in range(abs(d - c), d + c + 1):
                    for f in range(max(abs(a - e), abs(d - b)), min(a + e, d + b) + 1):
                        yield a, b, c, d, e, f

    found = next((t for t in allowed() if wigner_6j(*t) == 0), None)
    assert found is not None
    assert sixj(*found) == 0
    assert why_zero("6j", *found).startswith("cancellation:")


def test_module_exports():
    assert tablegen.QuantumNumberError is QuantumNumberError
    assert issubclass(QuantumNumberError, ValueError)

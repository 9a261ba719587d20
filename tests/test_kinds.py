"""The kind records: one list, each record consistent with itself and with the
public functions; the one 6j <-> W mapping; the registry loading kinds when asked.

W(a b c d; e f) = (-1)**(a+b+c+d) {a b e; d c f} (Racah 1942, as in Edmonds
1957, eq. 6.2.13; equation number from memory).
"""

from __future__ import annotations

import importlib
import itertools
import subprocess
import sys
from fractions import Fraction

import pytest
from sympy import Rational
from sympy.physics.wigner import racah

from tablegen import coefficients, why_zero
from tablegen.errors import QuantumNumberError
from tablegen.kinds import KIND_KEYS, KINDS, ZeroRule, kind
from tablegen.kinds.sixj import sixj_of_w, w_of_sixj
from tablegen.triads import is_triad


def test_the_list_and_lookup():
    # the coupling symbols first, in the order of the first release; a new kind goes after them
    assert KIND_KEYS[:5] == ("cg", "3j", "6j", "w", "9j") and len(set(KIND_KEYS)) == len(KIND_KEYS)
    assert {"recouple3", "recouple4", "lsjj", "state3", "state4"} <= set(KIND_KEYS)
    assert [kind(k) for k in KIND_KEYS] == list(KINDS)
    with pytest.raises(ValueError, match=f"argument kind = 'x': must be one of {', '.join(KIND_KEYS)}"):
        kind("x")


def test_every_kind_states_its_phase_convention_or_has_none():
    # CG and everything built of CG coefficients: Condon-Shortley (Condon and Shortley 1935);
    # 6j and 9j have no phase choice of their own (Edmonds 1957, ch. 6)
    for k in KINDS:
        if k.key in ("6j", "9j"):
            assert k.convention.startswith("no phase choice")
        elif k.key == "w":
            assert "(-1)^(a+b+c+d)" in k.convention  # Racah 1942
        else:
            assert "Condon-Shortley" in k.convention, k.key


def test_zero_rule_agrees_with_the_value_over_small_ranges():
    # a value is zero exactly when the kind names a rule for it (all arguments <= 1, doubled <= 2)
    for k in KINDS:
        n = len(k.arguments)
        positions = set(k.j_positions)
        ranges = [range(0, 3) if i in positions else range(-2, 3) for i in range(n)]
        count = 0
        for t in itertools.product(*ranges):
            if any(abs(t[m]) % 2 != t[j] % 2 for j, m in _pairs(k)):
                continue  # parity of j - m is a parse error, not a zero
            try:
                k.parse([Fraction(x, 2) for x in t], None)
            except QuantumNumberError:
                continue  # an argument outside its kind's domain (lsjj: shells is 1 or 2) is an error, not a zero
            rule = k.zero_rule(t)
            value = k.doubled(*t)
            assert (rule is None) == bool(value), (k.key, t, rule, value)
            if rule is not None:
                assert isinstance(rule, ZeroRule) and rule.id in (
                    "triangle", "triad-sum", "m-sum", "m-range", "parity", "symmetry", "cancellation", "pauli")
                assert why_zero(k.key, *[x / 2 for x in t]) == f"{rule.id}: {rule.text}"
            count += 1
            if count > 4000:
                break


def _pairs(k):
    """(j position, m position) pairs, as the kind's Selection record states them."""
    return k.selection.projections


def test_selection_records_state_the_projection_pairs_and_sums():
    # each m belongs to its j: in the CG bracket it follows its j, in the 3j it sits below it;
    # m1 + m2 = M for CG, m1 + m2 + m3 = 0 for 3j (Edmonds 1957, eqs. 3.6.1, 3.7.3 — from memory)
    assert kind("cg").selection.projections == ((0, 1), (2, 3), (4, 5))
    assert kind("cg").selection.m_sum == (0, 1, 0, 1, 0, -1)
    assert kind("3j").selection.projections == ((0, 3), (1, 4), (2, 5))
    assert kind("3j").selection.m_sum == (0, 0, 0, 1, 1, 1)
    for k in KINDS:  # every triad named is one the zero rule checks
        assert all(len(t) == 3 and max(t) < len(k.arguments) for t in k.selection.triads)


def test_parse_names_the_argument_and_counts():
    for k in KINDS:
        with pytest.raises(TypeError, match=f"{k.key} takes {len(k.arguments)} arguments"):
            k.parse((1,) * (len(k.arguments) - 1))
        values = ["1"] * len(k.arguments)
        values[-1] = "1/3"
        with pytest.raises(QuantumNumberError, match=f"argument {k.arguments[-1]} = "):
            k.parse(values)


def test_sixj_w_mapping_is_one_involution_pair_and_matches_racah():
    for t in itertools.product(range(0, 5), repeat=6):
        w, s = w_of_sixj(t)
        back, s2 = sixj_of_w(w)
        assert back == t and s == s2
    checked = 0
    for t in itertools.product(range(0, 4), repeat=6):
        if kind("w").zero_rule(t) is None:
            checked += 1
            assert kind("w").doubled(*t).to_sympy() == racah(*[Rational(x, 2) for x in t]), t
    assert checked > 50


def test_triad_predicate():
    # the triangle rule with an integer sum (common practice, no source)
    for a, b, c in itertools.product(range(7), repeat=3):
        assert is_triad(a, b, c) == ((a + b + c) % 2 == 0 and abs(a - b) <= c <= a + b)
        assert is_triad(a, b, c) == is_triad(b, c, a) == is_triad(c, b, a)


def test_the_registry_names_each_record_by_its_own_key_and_loads_kinds_when_asked():
    # a lookup imports the module of its kind only (start-up of `tablegen value`)
    from tablegen.kinds.registry import KIND_PLACES

    assert tuple(key for key, _, _ in KIND_PLACES) == KIND_KEYS
    for key, module, name in KIND_PLACES:
        assert kind(key).key == key and kind(key) is getattr(importlib.import_module(f"tablegen.kinds.{module}"), name)
    code = (
        "import sys; from tablegen.kinds import kind; kind('6j');"
        "print(sorted(m for m in sys.modules if m.startswith('tablegen.kinds.')))"
    )
    done = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, timeout=60)
    assert done.returncode == 0, done.stderr
    loaded = set(eval(done.stdout))
    assert "tablegen.kinds.sixj" in loaded
    assert not loaded & {"tablegen.kinds.ninej", "tablegen.kinds.lsjj", "tablegen.kinds.recoupling", "tablegen.kinds.states"}


def test_why_zero_doubled_names_the_rule():
    # all m zero and j1 + j2 + j3 odd: the 3j vanishes (common practice, no source)
    assert coefficients.why_zero_doubled("3j", (2, 2, 2, 0, 0, 0)) == "parity: all m are 0 and j1 + j2 + j3 is odd"

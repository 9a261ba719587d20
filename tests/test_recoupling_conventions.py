"""The conventions page's recoupling section: its formulas hold for the engine, and the pages carry it."""

from __future__ import annotations

import itertools
from fractions import Fraction

import pytest
import sympy
from sympy.physics.wigner import racah

from tablegen import recoupling
from tablegen.values import phase

HALVES = [Fraction(k, 2) for k in range(0, 5)]  # 0 .. 2


def _triad(a, b, c) -> bool:
    return abs(a - b) <= c <= a + b and (a + b + c).denominator == 1


def test_exchange_of_two_branches_is_the_phase_stated():
    # |(b a)c> = (-1)^(a+b-c) |(a b)c>: the symmetry of the Clebsch-Gordan coefficient under j1 <-> j2
    # (Condon and Shortley 1935; Edmonds 1957, ch. 3 — equation number not given: from memory)
    n = 0
    for a, b, c in itertools.product(HALVES, repeat=3):
        if _triad(a, b, c):
            assert recoupling("(a b)c", "(b a)c", a=a, b=b, c=c) == phase(a + b - c)
            n += 1
    assert n > 20


def test_reassociation_is_the_normalised_racah_w():
    # <(j1 j2)j12, j3; J | j1, (j2 j3)j23; J> = sqrt((2j12+1)(2j23+1)) W(j1 j2 J j3; j12 j23)
    # (Racah 1942, where W is defined by this recoupling; W from sympy.physics.wigner.racah, a reference library)
    n = 0
    for j1, j2, j3 in itertools.product(HALVES[1:], repeat=3):
        for J in HALVES + [Fraction(5, 2), 3, Fraction(7, 2), 4, Fraction(9, 2), 5, Fraction(11, 2), 6]:
            for j12, j23 in itertools.product([Fraction(k, 2) for k in range(0, 9)], repeat=2):
                if not (_triad(j1, j2, j12) and _triad(j12, j3, J) and _triad(j2, j3, j23) and _triad(j1, j23, J)):
                    continue
                ours = recoupling("((a b)e c)f", "(a (b c)g)f", a=j1, b=j2, c=j3, e=j12, f=J, g=j23)
                R = sympy.Rational
                w = racah(*(R(x.numerator, x.denominator) for x in (j1, j2, J, j3, j12, j23)))
                want = sympy.sqrt((2 * R(j12.numerator, j12.denominator) + 1) * (2 * R(j23.numerator, j23.denominator) + 1)) * w
                assert sympy.nsimplify(ours.to_sympy() - want) == 0, (j1, j2, j3, J, j12, j23)
                n += 1
    assert n > 300


@pytest.mark.parametrize("l1, l2", [(0, 1), (1, 1), (1, 2), (2, 3)])
def test_spin_orbit_order_changes_rows_by_the_phase_stated(l1, l2):
    # coupling each particle (s l)j instead of (l s)j: row (j1, j2) times (-1)^(l1+l2+1-j1-j2)
    # (the exchange phase above applied to both particles; common practice, no source)
    half = Fraction(1, 2)
    n = 0
    for j1, j2 in itertools.product([l1 - half, l1 + half], [l2 - half, l2 + half]):
        if j1 < 0 or j2 < 0:
            continue
        for J, L, S in itertools.product(range(0, l1 + l2 + 2), range(0, l1 + l2 + 1), (0, 1)):
            if not (_triad(j1, j2, J) and _triad(l1, l2, L) and _triad(L, S, J)):
                continue
            values = dict(a=l1, b=half, c=l2, d=half, e=j1, f=j2, g=L, h=S, J=J)
            ls = recoupling("((a b)e (c d)f)J", "((a c)g (b d)h)J", **values)
            sl = recoupling("((b a)e (d c)f)J", "((a c)g (b d)h)J", **values)
            assert sl == ls * phase(l1 + l2 + 1 - j1 - j2)
            n += 1
    assert n > 3


def test_the_section_is_on_the_conventions_page_and_in_the_sheets():
    from tablegen.buildinfo import BuildMeta
    from tablegen.compute import compute_values
    from tablegen.plan import plan_site
    from tablegen.recipe import recipe_from_mapping
    from tablegen.render.html import render_html
    from tablegen.render.latex import render_latex

    recipe = recipe_from_mapping({"recouple3": {"max_j": "1/2"}, "cg": {"max_j": "1/2"}})
    plan = plan_site(recipe)
    book = compute_values(plan, jobs=1)
    meta = BuildMeta("tablegen", "0.1.0", "ab" * 32, recipe.toml_text(), recipe.title, (("cg", 1),))
    html = dict(render_html(plan, book, meta))
    assert "Recoupling coefficients and coupled states" in html["conventions.html"].decode("utf-8")
    tex = dict(render_latex(plan, book, meta))
    sheet = tex[plan.tables_of("recouple3")[0].tex_sheet].decode("utf-8")
    assert "Recoupling coefficients and coupled states" in sheet and "W(j_1\\,j_2\\,J\\,j_3" in sheet
    # a build without recoupling families does not carry the section
    plain = plan_site(recipe_from_mapping({"cg": {"max_j": "1/2"}}))
    html = dict(render_html(plain, compute_values(plain, jobs=1), meta))
    assert "Recoupling coefficients and coupled states" not in html["conventions.html"].decode("utf-8")

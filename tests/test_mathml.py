"""MathML written for values and symbols: well-formed, and saying exactly the value.

Each value's MathML is read back as a number — <mn> integers, <mfrac> a
quotient, <msqrt> a square root, a leading <mo>−</mo> the sign (W3C MathML
Core, §3.2.4 mn, §3.3.2 mfrac, §3.3.3 msqrt) — and compared with the exact
value, and for a sample with sympy.physics.wigner as an outside reference.
"""

from __future__ import annotations

import xml.etree.ElementTree as ET
from fractions import Fraction
from itertools import product

import pytest

from tablegen.coefficients import cg2, ninej2, racah_w2, sixj2, threej2
from tablegen.compute import format_value
from tablegen.kinds import kind
from tablegen.plan import symbols_in_range
from tablegen.render import mathml
from tablegen.render.markdown_pages import render_markdown, render_text_page
from tablegen.spins import half_text
from tablegen.values import Surd

MINUS = "\u2212"


def _tree(markup: str) -> ET.Element:
    root = ET.fromstring(markup)  # raises on malformed XML
    assert root.tag == "math"
    return root


def _rational(node: ET.Element) -> Fraction:
    """A rational MathML expression: <mn> or <mfrac> of rationals, or an <mrow> of one."""
    if node.tag == "mn":
        assert node.text and node.text.isdigit(), ET.tostring(node)
        return Fraction(int(node.text))
    if node.tag == "mfrac":
        num, den = list(node)
        return _rational(num) / _rational(den)
    if node.tag == "mrow" and len(node) == 1:
        return _rational(node[0])
    raise AssertionError(f"not a rational: {ET.tostring(node)!r}")


def _square(nodes: list[ET.Element]) -> Fraction:
    """The square of a product of juxtaposed MathML factors (no sign)."""
    total = Fraction(1)
    for node in nodes:
        if node.tag == "msqrt":
            total *= _rational(node[0]) if len(node) == 1 else _square(list(node))
        elif node.tag == "mfrac":
            num, den = list(node)
            total *= _square([num]) / _square([den])
        elif node.tag == "mrow":
            total *= _square(list(node))
        elif node.tag == "mn":
            total *= _rational(node) ** 2
        else:
            raise AssertionError(f"unexpected element in a value: {ET.tostring(node)!r}")
    return total


def value_of(markup: str) -> Surd:
    """The number a value's <math> shows, read back as a Surd."""
    children = list(_tree(markup))
    sign = 1
    if children and children[0].tag == "mo":
        assert children[0].text == MINUS, "only a leading minus sign may appear"
        sign = -1
        children = children[1:]
    assert children, "a value needs a number"
    if len(children) == 1 and children[0].tag == "mn" and children[0].text == "0":
        return Surd()
    return Surd.from_square(_square(children), sign)


def _all_values():
    """(family, key, value) for every allowed CG and 3j with j1, j2 <= 5/2, 6j and W with
    j <= 5/2 and 9j with j <= 3/2, plus some symbols that are zero by a selection rule."""
    js = range(0, 6)
    for tj1, tj2 in product(js, js):
        for tJ in range(abs(tj1 - tj2), tj1 + tj2 + 1, 2):
            for tm1 in range(-tj1, tj1 + 1, 2):
                for tm2 in range(-tj2, tj2 + 1, 2):
                    tM = tm1 + tm2
                    if abs(tM) <= tJ:
                        yield "cg", (tj1, tm1, tj2, tm2, tJ, tM), cg2(tj1, tm1, tj2, tm2, tJ, tM)
                        yield "3j", (tj1, tj2, tJ, tm1, tm2, -tM), threej2(tj1, tj2, tJ, tm1, tm2, -tM)
    for key in symbols_in_range(kind("6j"), 0, 5):
        yield "6j", key, sixj2(*key)
        yield "w", key, racah_w2(*key)
    for key in symbols_in_range(kind("9j"), 0, 3):
        yield "9j", key, ninej2(*key)
    for key in [(2, 0, 2, 0, 2, 0), (1, 1, 1, 1, 5, 2), (2, 2, 2, 2, 2, 5)]:
        yield "zero", key, cg2(*key)


@pytest.mark.parametrize("style", ["root", "rational"])
def test_value_mathml_reads_back_as_the_exact_value(style):
    checked = nonzero = 0
    for family, key, value in _all_values():
        shown = format_value(value, 6, style)
        markup = mathml.value_mathml(shown)
        assert value_of(markup) == value, (family, key, markup)
        assert "<msqrt>" in markup or value.is_rational(), (family, key, markup)
        checked += 1
        nonzero += bool(value)
    assert checked > 6_000 and nonzero > 5_000


def test_surd_mathml_covers_hand_picked_values():
    # common practice, no source: how each kind of exact value is written
    cases = {
        Surd(0): "<math><mn>0</mn></math>",
        Surd(1, 1, 1): "<math><mn>1</mn></math>",
        Surd(-1, 1, 4): f"<math><mo>{MINUS}</mo><mfrac><mn>1</mn><mn>2</mn></mfrac></math>",
        Surd(1, 5, 14): "<math><msqrt><mfrac><mn>5</mn><mn>14</mn></mfrac></msqrt></math>",
        Surd(-1, 3, 1): f"<math><mo>{MINUS}</mo><msqrt><mn>3</mn></msqrt></math>",
    }
    for value, want in cases.items():
        assert mathml.surd_mathml(value) == want
    # the rational style: sqrt(5/14) = sqrt(70)/14
    assert mathml.surd_mathml(Surd(1, 5, 14), "rational") == (
        "<math><mfrac><msqrt><mn>70</mn></msqrt><mn>14</mn></mfrac></math>"
    )
    assert value_of(mathml.surd_mathml(Surd(-1, 12, 1), "rational")) == Surd(-1, 12, 1)  # −2√3


def test_sample_agrees_with_sympy_wigner():
    # outside reference: sympy.physics.wigner (Rasch & Yu 2003 algorithms)
    wigner = pytest.importorskip("sympy.physics.wigner")
    from sympy import Rational

    def r(t):
        return Rational(t, 2)

    samples = [
        ((2, 0, 1, 1, 3, 1), lambda t: wigner.clebsch_gordan(r(t[0]), r(t[2]), r(t[4]), r(t[1]), r(t[3]), r(t[5]))),
        ((3, -1, 2, 2, 3, 1), lambda t: wigner.clebsch_gordan(r(t[0]), r(t[2]), r(t[4]), r(t[1]), r(t[3]), r(t[5]))),
    ]
    for key, ref in samples:
        markup = mathml.value_mathml(format_value(cg2(*key), 8, "root"))
        exact = ref(key)
        assert value_of(markup) == Surd.from_square(Fraction(int((exact**2).p), int((exact**2).q)), 1 if exact > 0 else -1)
    for key in [(2, 2, 2, 2, 2, 2), (4, 2, 2, 3, 3, 3), (3, 3, 2, 3, 3, 4)]:
        exact = wigner.wigner_6j(*(r(t) for t in key))
        markup = mathml.value_mathml(format_value(sixj2(*key), 8, "rational"))
        assert value_of(markup) == Surd.from_square(Fraction(int((exact**2).p), int((exact**2).q)), 1 if exact > 0 else -1)
    for key in [(2, 2, 2, 2, 2, 2, 2, 2, 0), (1, 1, 2, 1, 1, 2, 2, 2, 2)]:
        exact = wigner.wigner_9j(*(r(t) for t in key))
        markup = mathml.value_mathml(format_value(ninej2(*key), 8, "root"))
        assert value_of(markup) == Surd.from_square(Fraction(int((exact**2).p), int((exact**2).q)), 1 if exact > 0 else -1)


def _mn_texts(markup: str) -> list[str]:
    return [n.text for n in _tree(markup).iter("mn")]


def _qn(t: int) -> str:
    return half_text(t).replace("-", MINUS)


def test_symbol_notation_shows_every_argument_in_order():
    # notation as written in Edmonds 1957 (ch. 3, 6) — from memory
    cg = (3, -1, 2, 2, 5, 1)
    m = mathml.math(mathml.symbol(kind("cg").notation, cg))
    assert _mn_texts(m) == [_qn(t) for t in cg]
    assert [o.text for o in _tree(m).iter("mo")] == ["⟨", ";", "|", "⟩"]

    three = (2, 1, 3, 0, -1, 1)
    m = mathml.math(mathml.symbol(kind("3j").notation, three))
    rows = list(_tree(m).iter("mtr"))
    assert [[c.find("mn").text for c in r] for r in rows] == [[_qn(t) for t in three[:3]], [_qn(t) for t in three[3:]]]
    assert [o.text for o in _tree(m).iter("mo")] == ["(", ")"]

    six = (4, 2, 2, 3, 3, 3)
    m = mathml.math(mathml.symbol(kind("6j").notation, six))
    assert len(list(_tree(m).iter("mtr"))) == 2 and _mn_texts(m) == [_qn(t) for t in six]
    assert [o.text for o in _tree(m).iter("mo")] == ["{", "}"]

    nine = (2, 2, 2, 2, 2, 2, 2, 2, 0)
    m = mathml.math(mathml.symbol(kind("9j").notation, nine))
    assert len(list(_tree(m).iter("mtr"))) == 3 and _mn_texts(m) == [_qn(t) for t in nine]

    w = (1, 1, 1, 1, 2, 0)
    m = mathml.math(mathml.symbol(kind("w").notation, w))
    assert _mn_texts(m) == [_qn(t) for t in w]
    assert _tree(m).find(".//mi").text == "W"

    m = mathml.math(mathml.ket(3, -1))
    assert _mn_texts(m) == ["3/2", f"{MINUS}1/2"]
    assert mathml.ket_text(3, -1) == f"|3/2, {MINUS}1/2⟩"


def test_latex_subset_translates_structure():
    m = mathml.tex_to_mathml(r"\frac{(-1)^{j_1}}{\sqrt{2J+1}}")
    root = _tree(m)
    frac = root.find("mfrac")
    assert frac is not None and frac[1].tag == "msqrt"
    assert frac[0].tag == "msup" and frac[0][0].tag == "mrow"  # the bracket is grouped
    m = mathml.tex_to_mathml(r"\begin{Bmatrix} a & b \\ c & d \end{Bmatrix}", display=True)
    root = _tree(m)
    assert root.get("display") == "block"
    assert [[c.find("mi").text for c in r] for r in root.iter("mtr")] == [["a", "b"], ["c", "d"]]
    assert _tree(mathml.tex_to_mathml(r"\text{if } x")).find("mtext").text == "if "
    for bad in [r"\unknowncommand", r"(a", r"\begin{weird} a \end{weird}", r"a^", "€"]:
        with pytest.raises(mathml.TexError):
            mathml.tex_to_mathml(bad)


def test_markdown_formulas_become_mathml():
    html = render_markdown("Text $a_1$ here.\n\n$$ \\frac{1}{2} $$\n\nEnd {{x}}.", {"x": "fact"})
    assert "<math><msub><mi>a</mi><mn>1</mn></msub></math>" in html
    assert (
        '<div class="eq" data-t="\\frac{1}{2}"><math display="block"><mfrac><mn>1</mn><mn>2</mn></mfrac></math></div>'
        in html
    )
    assert "End fact." in html and "$" not in html
    with pytest.raises(KeyError):
        render_markdown("{{missing}}", {})


@pytest.mark.parametrize("name", ["conventions", "methods"])
def test_text_pages_formulas_are_well_formed(name):
    html = render_text_page(name, {"digits": "15", "style": "root"})
    blocks = []
    start = 0
    while True:
        i = html.find("<math", start)
        if i < 0:
            break
        j = html.index("</math>", i) + len("</math>")
        blocks.append(html[i:j])
        start = j
    assert len(blocks) > 20
    for block in blocks:
        _tree(block)
    assert "$" not in html


def test_rational_check_helper_is_strict():
    # guard for the reader above: it must refuse what it cannot read
    with pytest.raises(AssertionError):
        value_of("<math><mi>x</mi></math>")
    with pytest.raises(AssertionError):
        value_of("<math><mo>+</mo><mn>1</mn></math>")
    assert value_of("<math><mn>2</mn><msqrt><mn>3</mn></msqrt></math>") == Surd(1, 12, 1)

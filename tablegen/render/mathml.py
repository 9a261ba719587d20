"""Presentation MathML, written at build time so that pages need no script.

Two sources of MathML:

* ``tex_to_mathml`` translates the small LaTeX subset that tablegen writes
  (values such as ``-\\sqrt{\\frac{5}{14}}``, and the formulas of the
  conventions and methods pages) into MathML.  A value's MathML is made from
  its own LaTeX, so the two can never disagree, and every root stays written
  out as an ``<msqrt>``.
* the notation builders (``symbol`` from a kind's Notation record, ``ket``,
  ``ket_product``, ``equation``) write symbols on doubled quantum numbers
  directly: half-integers appear as ``3/2`` and minus signs as U+2212.  The
  HTML renderer builds every piece of MathML here, never by concatenation.

Output is compact (no whitespace between elements) and well-formed XML; the
``<math>`` element carries no namespace attribute, which HTML does not need.
"""

from __future__ import annotations

import re
from functools import lru_cache
from html import escape

from ..spins import half_text
from ..values import Surd

__all__ = [
    "TexError",
    "tex_to_mathml",
    "value_mathml",
    "value_inner",
    "surd_mathml",
    "qn",
    "symbol",
    "equation",
    "text",
    "ket_product",
    "ket",
    "ket_text",
    "coupled_ket",
    "math",
]

MINUS = "\u2212"


class TexError(ValueError):
    """LaTeX outside the subset this module translates."""


def math(inner: str, display: bool = False) -> str:
    """Wrap MathML content in a <math> element."""
    return f'<math display="block">{inner}</math>' if display else f"<math>{inner}</math>"


# -- LaTeX subset -> MathML ------------------------------------------------------
_TOKEN = re.compile(
    r"(?P<cmd>\\[A-Za-z]+)|(?P<esc>\\[{}|,;:! \\])|(?P<num>\d+(?:\.\d+)?)|(?P<ws>\s+)|(?P<ch>.)",
    re.S,
)

_IDENTIFIERS = {
    "alpha": "α", "beta": "β", "gamma": "γ", "delta": "δ", "epsilon": "ε", "lambda": "λ",
    "mu": "μ", "nu": "ν", "pi": "π", "rho": "ρ", "sigma": "σ", "tau": "τ", "phi": "φ",
    "psi": "ψ", "omega": "ω", "theta": "θ", "Delta": "Δ", "Lambda": "Λ", "Sigma": "Σ", "Phi": "Φ",
    "Psi": "Ψ", "Omega": "Ω", "hbar": "ℏ", "ell": "ℓ",
}
_OPERATORS = {
    "langle": "⟨", "rangle": "⟩", "times": "×", "cdot": "⋅", "pm": "±", "mp": "∓",
    "le": "≤", "leq": "≤", "ge": "≥", "geq": "≥", "ne": "≠", "neq": "≠", "to": "→",
    "otimes": "⊗", "ldots": "…", "cdots": "⋯", "equiv": "≡", "approx": "≈", "in": "∈",
    "lvert": "|", "rvert": "|", "vert": "|", "mid": "|", "sum": "∑", "prod": "∏",
    "ast": "∗", "lbrace": "{", "rbrace": "}", "lfloor": "⌊", "rfloor": "⌋", "lceil": "⌈", "rceil": "⌉",
}
#: Function names written upright, followed by an invisible function application (U+2061).
_FUNCTIONS = ("sin", "cos", "tan", "exp", "log")
_SPACES = {",": "0.17em", ":": "0.22em", ";": "0.28em", " ": "0.25em", "quad": "1em", "qquad": "2em"}
_FENCES = {"pmatrix": ("(", ")"), "Bmatrix": ("{", "}"), "vmatrix": ("|", "|"), "matrix": ("", "")}
_CHAR_OPERATORS = set("+=()[]|,;<>/!:'")
#: Opening token -> (left fence, closing token, right fence): grouped into one <mrow>.
_PAIRS = {
    "(": ("(", ")", ")"),
    "[": ("[", "]", "]"),
    "\\{": ("{", "\\}", "}"),
    "\\langle": ("⟨", "\\rangle", "⟩"),
}


class _Parser:
    def __init__(self, tex: str) -> None:
        matches = [m for m in _TOKEN.finditer(tex) if m.lastgroup != "ws"]
        self.tokens = [(m.lastgroup, m.group()) for m in matches]
        self.starts = [m.start() for m in matches]
        self.pos = 0
        self.tex = tex

    def peek(self) -> tuple[str, str] | None:
        return self.tokens[self.pos] if self.pos < len(self.tokens) else None

    def take(self) -> tuple[str, str]:
        tok = self.peek()
        if tok is None:
            raise TexError(f"unexpected end of LaTeX in {self.tex!r}")
        self.pos += 1
        return tok

    def expect(self, text: str) -> None:
        token, value = self.take()
        if value != text:
            raise TexError(f"expected {text!r} but found {value!r} in {self.tex!r}")

    def raw_group(self) -> str:
        """The source text inside {...}, spaces kept (for \\text, \\begin)."""
        self.expect("{")
        start = self.starts[self.pos - 1] + 1
        depth = 1
        while True:
            token, value = self.take()
            if value == "{":
                depth += 1
            elif value == "}":
                depth -= 1
                if depth == 0:
                    return self.tex[start : self.starts[self.pos - 1]]

    def sequence(self, stops: tuple[str, ...]) -> list[str]:
        """Items up to (not including) a stop token."""
        items: list[str] = []
        while True:
            tok = self.peek()
            if tok is None or tok[1] in stops:
                return items
            if tok[1] in ("^", "_"):
                if not items:
                    raise TexError(f"script without a base in {self.tex!r}")
                items[-1] = self.scripts(items[-1])
                continue
            item = self.atom()
            if item == _MINUS_MO and items and _opens(items[-1]):
                item = f'<mo form="prefix">{MINUS}</mo>'
            items.append(item)

    def group(self) -> str:
        """One argument: {...} or a single atom."""
        tok = self.peek()
        if tok is not None and tok[1] == "{":
            self.take()
            items = self.sequence(("}",))
            self.expect("}")
            return _row(items)
        return self.atom()

    def scripts(self, base: str) -> str:
        sub = sup = None
        while self.peek() is not None and self.peek()[1] in ("^", "_"):
            _, which = self.take()
            arg = self.group()
            if which == "^":
                sup = arg
            else:
                sub = arg
        large = base.startswith("<mo>∑") or base.startswith("<mo>∏")
        if sub is not None and sup is not None:
            tag = "munderover" if large else "msubsup"
            return f"<{tag}>{base}{sub}{sup}</{tag}>"
        if sub is not None:
            tag = "munder" if large else "msub"
            return f"<{tag}>{base}{sub}</{tag}>"
        tag = "mover" if large else "msup"
        return f"<{tag}>{base}{sup}</{tag}>"

    def fenced(self, left: str, closer: str, right: str) -> str:
        """A bracketed group as its own <mrow>, so that its fences fit its content."""
        items = self.sequence((closer,))
        if self.peek() is None:
            raise TexError(f"{left} without its closing {right} in {self.tex!r}")
        self.take()
        if items and items[0] == _MINUS_MO:  # a sign right after the opening fence
            items[0] = f'<mo form="prefix">{MINUS}</mo>'
        # plain brackets keep their natural size, as in LaTeX (\\left ... \\right stretches)
        return (
            f'<mrow><mo stretchy="false">{escape(left)}</mo>' + "".join(items)
            + f'<mo stretchy="false">{escape(right)}</mo></mrow>'
        )

    def atom(self) -> str:
        token, value = self.take()
        if token == "num":
            return f"<mn>{value}</mn>"
        if value in _PAIRS:
            left, closer, right = _PAIRS[value]
            return self.fenced(left, closer, right)
        if value == "|" or value == "\\|":
            return _mo("|")
        if token == "esc":
            ch = value[1]
            if ch in "{}":
                return _mo(ch)
            if ch == "!":
                return ""
            if ch == "\\":
                raise TexError(f"row break outside a matrix in {self.tex!r}")
            return f'<mspace width="{_SPACES[ch]}"/>'
        if token == "cmd":
            return self.command(value[1:])
        if value == "{":
            items = self.sequence(("}",))
            self.expect("}")
            return _row(items)
        if value == "-":
            return f"<mo>{MINUS}</mo>"
        if value == "+":
            return "<mo>+</mo>"
        if value.isalpha():
            return f"<mi>{escape(value)}</mi>"
        if value in _CHAR_OPERATORS:
            return _mo(value)
        raise TexError(f"unsupported character {value!r} in {self.tex!r}")

    def command(self, name: str) -> str:
        if name == "frac":
            num = self.group()
            den = self.group()
            return f"<mfrac>{num}{den}</mfrac>"
        if name == "sqrt":
            return f"<msqrt>{_unrow(self.group())}</msqrt>"
        if name == "text":
            return f"<mtext>{escape(self.raw_group())}</mtext>"
        if name in ("mathrm", "operatorname"):
            text = self.raw_group()
            variant = ' mathvariant="normal"' if len(text) == 1 else ""
            return f"<mi{variant}>{escape(text)}</mi>"
        if name == "left":
            left = self.delimiter()
            items = self.sequence(("\\right",))
            if self.peek() is None:
                raise TexError(f"\\left without \\right in {self.tex!r}")
            self.take()
            right = self.delimiter()
            fences = [f"<mo>{escape(d)}</mo>" if d else "" for d in (left, right)]
            return "<mrow>" + fences[0] + "".join(items) + fences[1] + "</mrow>"
        if name == "right":
            raise TexError(f"\\right without \\left in {self.tex!r}")
        if name == "begin":
            return self.environment(self.raw_group())
        if name in _FUNCTIONS:
            return f"<mi>{name}</mi><mo>\u2061</mo>"
        if name in _SPACES:
            return f'<mspace width="{_SPACES[name]}"/>'
        if name in _IDENTIFIERS:
            return f"<mi>{_IDENTIFIERS[name]}</mi>"
        if name in _OPERATORS:
            return _mo(_OPERATORS[name])
        raise TexError(f"unsupported command \\{name} in {self.tex!r}")

    def delimiter(self) -> str:
        """The delimiter after \\left or \\right ('' for '.')."""
        token, value = self.take()
        if token == "cmd":
            if value[1:] not in _OPERATORS:
                raise TexError(f"unsupported delimiter {value!r} in {self.tex!r}")
            return _OPERATORS[value[1:]]
        symbol = value[1:] if token == "esc" else value
        return "" if symbol == "." else symbol

    def environment(self, env: str) -> str:
        if env not in _FENCES:
            raise TexError(f"unsupported environment {env!r} in {self.tex!r}")
        rows: list[list[str]] = [[]]
        while True:
            cell = self.sequence(("&", "\\\\", "\\end"))
            rows[-1].append(_unrow(_row(cell)))
            token, value = self.take()
            if value == "&":
                continue
            if value == "\\\\":
                rows.append([])
                continue
            end = self.raw_group()
            if end != env:
                raise TexError(f"\\begin{{{env}}} closed by \\end{{{end}}} in {self.tex!r}")
            break
        table = "<mtable>" + "".join(
            "<mtr>" + "".join(f"<mtd>{c}</mtd>" for c in r) + "</mtr>" for r in rows if r != [""]
        ) + "</mtable>"
        left, right = _FENCES[env]
        if not left:
            return table
        return f"<mrow><mo>{left}</mo>{table}<mo>{right}</mo></mrow>"


_MINUS_MO = f"<mo>{MINUS}</mo>"
_CLOSERS = (")", "]", "}", "⟩", "|")


def _opens(item: str) -> bool:
    """True if a minus after this item is a sign, not a subtraction."""
    if item.startswith("<mspace"):
        return True
    if not item.startswith("<mo") or item.startswith("<mover"):
        return False
    symbol = item[item.index(">") + 1 : -5]
    return symbol not in _CLOSERS


_FENCE_SYMBOLS = set("()[]{}⟨⟩|")


def _mo(symbol: str) -> str:
    """An operator; a fence standing alone keeps its natural size and no spacing, as in LaTeX."""
    if symbol in _FENCE_SYMBOLS:
        return f'<mo stretchy="false" lspace="0" rspace="0">{escape(symbol)}</mo>'
    return f"<mo>{escape(symbol)}</mo>"


def _row(items: list[str]) -> str:
    items = [i for i in items if i]
    if len(items) == 1:
        return items[0]
    return "<mrow>" + "".join(items) + "</mrow>"


def _unrow(node: str) -> str:
    """Contents of an <mrow> (for elements that take an inferred row)."""
    if node.startswith("<mrow>") and node.endswith("</mrow>") and _balanced_row(node):
        return node[6:-7]
    return node


def _balanced_row(node: str) -> bool:
    # the outer <mrow> must close only at the very end
    depth = 0
    for m in re.finditer(r"<(/?)mrow>", node):
        depth += -1 if m.group(1) else 1
        if depth == 0 and m.end() != len(node):
            return False
    return True


@lru_cache(maxsize=8192)
def tex_to_mathml(tex: str, display: bool = False) -> str:
    """A <math> element for LaTeX in tablegen's subset; TexError otherwise."""
    parser = _Parser(tex)
    items = parser.sequence(())
    if parser.peek() is not None:  # pragma: no cover - sequence(()) reads to the end
        raise TexError(f"unread LaTeX in {tex!r}")
    inner = "".join(i for i in items if i)
    return math(inner, display)


def value_inner(tex: str) -> str:
    """MathML content (without <math>) of a value's LaTeX."""
    return tex_to_mathml(tex)[6:-7]


def value_mathml(shown) -> str:
    """<math> for a computed value (a compute.FormattedValue), from its LaTeX in the recipe style."""
    return tex_to_mathml(shown.tex)


def surd_mathml(value: Surd, style: str = "root") -> str:
    """<math> for a Surd in a LaTeX root style ("root" or "rational")."""
    return tex_to_mathml(value.latex(style))


# -- notation on doubled quantum numbers --------------------------------------------
def qn(t: int) -> str:
    """<mn> for a doubled quantum number: 3 -> 3/2, -1 -> −1/2."""
    return f"<mn>{half_text(t).replace('-', MINUS)}</mn>"


_GAP = '<mspace width="0.3em"/>'


def symbol(notation, key: tuple[int, ...]) -> str:
    """A symbol on doubled arguments, written as its kind's Notation says.

    "braket": <j1 m1; j2 m2 | J M>; "array": rows stacked in () or {};
    "function": name(g0; g1), e.g. W(a b c d; e f).
    """
    groups = [[qn(key[i]) for i in g] for g in notation.groups]
    if notation.style == "array":
        body = "".join("<mtr>" + "".join(f"<mtd>{c}</mtd>" for c in g) + "</mtr>" for g in groups)
        left, right = notation.brackets
        return f"<mrow><mo>{left}</mo><mtable>{body}</mtable><mo>{right}</mo></mrow>"
    parts = [_GAP.join(g) for g in groups]
    if notation.style == "braket":
        return f"<mrow><mo>⟨</mo>{'<mo>;</mo>'.join(parts[:-1])}<mo>|</mo>{parts[-1]}<mo>⟩</mo></mrow>"
    if notation.style == "function":
        inner = "<mo>;</mo>".join(parts)
        return f"<mrow><mi>{escape(notation.name)}</mi><mrow><mo>(</mo>{inner}<mo>)</mo></mrow></mrow>"
    raise ValueError(f"argument notation.style = {notation.style!r}: must be array, braket or function")


def equation(left: str, right: str) -> str:
    """MathML content 'left = right'."""
    return f"{left}<mo>=</mo>{right}"


def text(words: str) -> str:
    """An <mtext> element."""
    return f"<mtext>{escape(words)}</mtext>"


def ket_product(*pairs: tuple[int, int]) -> str:
    """|j1, m1⟩|j2, m2⟩... as one compact <mtext> (for long ket expansions)."""
    return text("".join(ket_text(tj, tm) for tj, tm in pairs))


def ket_text(tj: int, tm: int) -> str:
    """|j, m⟩ as plain text for an <mtext> (compact, for long ket expansions)."""
    return f"|{half_text(tj)}, {half_text(tm)}⟩".replace("-", MINUS)


def coupled_ket(tj1: int, tj2: int, tj: int, tm: int) -> str:
    """|(j1, j2) J, M⟩ as one <mtext>: a coupled state with its coupling shown.

    Written differently from a product state |j1, m1⟩|j2, m2⟩, so that an
    expansion never uses one notation for both sides.
    """
    return text(f"|({half_text(tj1)}, {half_text(tj2)}) {half_text(tj)}, {half_text(tm)}⟩".replace("-", MINUS))


def ket(tj: int, tm: int) -> str:
    """|j m⟩ (written |j,m⟩ so that a negative m cannot be misread)."""
    return f"<mrow><mo>|</mo>{qn(tj)}<mo>,</mo>{qn(tm)}<mo>⟩</mo></mrow>"

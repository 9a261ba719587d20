"""The working of a recoupling coefficient: its formula and the path of moves.

The formula is read off the same Plan the evaluation walks (paths.py): a sum
over the summation names of a phase, the sqrt(2x+1) factors and the 6j and
9j symbols, times Kronecker deltas where the two trees name one coupling
differently.  It is written as plain text and as LaTeX (amsmath's Bmatrix)
for a paper's appendix.  Phase exponents are reduced modulo 4, which is
exact: (-1)^(4x) = 1 for every integer or half-integer x.
"""

from __future__ import annotations

from typing import NamedTuple

import re

from ..values.surd import Surd
from .coefficient import pair_of, recoupling
from .paths import Plan, Step, plan_path

__all__ = ["Working", "recoupling_working"]


class Working(NamedTuple):
    """A recoupling coefficient shown as a formula, with the moves it came from."""

    text: str
    latex: str
    path: tuple[str, ...]
    path_latex: tuple[str, ...]
    value: Surd | None


def _tex_name(name: str) -> str:
    """j12 -> j_{12}, j_a -> j_{a}, x1 -> x_{1}; other names as they are."""
    m = re.fullmatch(r"([A-Za-z]+)_?([0-9]+)", name) or re.fullmatch(r"([A-Za-z]+)_([A-Za-z0-9]+)", name)
    if m:
        return f"{m.group(1)}_{{{m.group(2)}}}"
    return name.replace("_", r"\_")


def _tex_tree(text: str) -> str:
    out = re.sub(r"[A-Za-z_][A-Za-z0-9_]*", lambda m: _tex_name(m.group(0)), text)
    return out.replace(" ", r"\,")


def _phase(terms: dict[str, int], tex: bool) -> str:
    parts = []
    for name, k in terms.items():
        k %= 4
        k = -1 if k == 3 else k
        if not k:
            continue
        shown = _tex_name(name) if tex else name
        sign = "-" if k < 0 else "+"
        parts.append(f"{sign}{'' if abs(k) == 1 else abs(k)}{shown}")
    if not parts:
        return ""
    body = "".join(parts).lstrip("+")
    return f"(-1)^{{{body}}}" if tex else f"(-1)^({body})"


def _hats(counts: dict[str, int], tex: bool) -> str:
    whole, root = [], []
    for name, k in counts.items():
        shown = f"(2{_tex_name(name) if tex else name}+1)"
        whole += [shown] * (k // 2)
        root += [shown] * (k % 2)
    out = "".join(whole)
    if root:
        out += (r"\sqrt{" + "".join(root) + "}") if tex else f"sqrt({''.join(root)})"
    return out


def _symbol(step: Step, tex: bool) -> str:
    a = step.args
    if tex:
        names = [_tex_name(n) for n in a]
        rows = [names[i:i + 3] for i in range(0, len(names), 3)]
        return r"\begin{Bmatrix}" + r"\\".join(" & ".join(r) for r in rows) + r"\end{Bmatrix}"
    rows = [" ".join(a[i:i + 3]) for i in range(0, len(a), 3)]
    return "{" + "; ".join(rows) + "}"


def _symbol_args(step: Step) -> tuple[str, ...]:
    if step.kind == "reassociate":  # <((a b)e c)f|(a (b c)g)f> ~ {a b e; c f g}
        a, b, c, e, f, g = step.args
        return (a, b, e, c, f, g)
    a, b, c, d, e, h, g, k, j = step.args  # <((a b)e (c d)h)j|((a c)g (b d)k)j> ~ {a b e; c d h; g k j}
    return (a, b, e, c, d, h, g, k, j)


def _step_factor(step: Step, tex: bool) -> str:
    phase: dict[str, int] = {}
    hats: dict[str, int] = {}
    _collect(step, phase, hats)
    sym = "" if step.kind == "exchange" else _symbol(Step(step.kind, _symbol_args(step), "", ""), tex)
    return (_phase(phase, tex) + _hats(hats, tex) + sym) or "1"


def _collect(step: Step, phase: dict[str, int], hats: dict[str, int]) -> None:
    if step.kind == "exchange":
        x, y, z = step.args
        for name, k in ((x, 1), (y, 1), (z, -1)):
            phase[name] = phase.get(name, 0) + k
    elif step.kind == "reassociate":
        a, b, c, e, f, g = step.args
        for name in (a, b, c, f):
            phase[name] = phase.get(name, 0) + 1
        for name in (e, g):
            hats[name] = hats.get(name, 0) + 1
    else:
        for name in step.args[4:8]:
            hats[name] = hats.get(name, 0) + 1


_KIND_TEXT = {"exchange": "exchange", "reassociate": "re-associate (6j)", "four-leaf": "four-leaf change (9j)"}


def render(plan: Plan, value: Surd | None = None) -> Working:
    """The formula and path of a plan, as plain text and LaTeX."""
    phase: dict[str, int] = {}
    hats: dict[str, int] = {}
    for step in plan.steps:
        _collect(step, phase, hats)
    symbols = [Step(s.kind, _symbol_args(s), "", "") for s in plan.steps if s.kind != "exchange"]
    deltas_text = "".join(f"delta({a},{b})" for a, b in plan.deltas)
    deltas_tex = "".join(rf"\delta_{{{_tex_name(a)}{_tex_name(b)}}}" for a, b in plan.deltas)
    body_text = deltas_text + _phase(phase, False) + _hats(hats, False) + "".join(_symbol(s, False) for s in symbols)
    body_tex = deltas_tex + _phase(phase, True) + _hats(hats, True) + "".join(_symbol(s, True) for s in symbols)
    body_text, body_tex = body_text or "1", body_tex or "1"
    if plan.summed:
        body_text = f"sum_{{{','.join(plan.summed)}}} " + body_text
        body_tex = r"\sum_{" + ",".join(_tex_name(n) for n in plan.summed) + "} " + body_tex
    left_text = f"<{plan.first}|{plan.second}>"
    left_tex = rf"\langle {_tex_tree(plan.first)} \,|\, {_tex_tree(plan.second)} \rangle"
    text = f"{left_text} = {body_text}"
    latex = f"{left_tex} = {body_tex}"
    if value is not None:
        text += f" = {value}"
        latex += f" = {value.latex()}"
    path, path_tex = [], []
    for i, s in enumerate(plan.steps, 1):
        path.append(f"{i}. {_KIND_TEXT[s.kind]}: {s.before} -> {s.after}, factor {_step_factor(s, False)}")
        path_tex.append(rf"{_tex_tree(s.before)} \;\to\; {_tex_tree(s.after)}: \quad {_step_factor(s, True)}")
    return Working(text, latex, tuple(path), tuple(path_tex), value)


def recoupling_working(tree1: str, tree2: str, **values) -> Working:
    """The formula of <tree1|tree2>; with every value given, also its exact value."""
    plan = plan_path(pair_of(tree1, tree2))
    value = recoupling(tree1, tree2, **values) if values else None
    return render(plan, value)

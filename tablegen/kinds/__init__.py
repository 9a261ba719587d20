"""Kinds of exact value: one record per kind, in one explicit list.

A :class:`Kind` says everything the pipeline needs to know about one kind of
value (a CG coefficient, a 3j, 6j, W or 9j symbol, later rotation functions
and recoupling coefficients): the names of its arguments, how to parse them,
the function on doubled arguments, the selection rule that makes a value
zero, how the symbol is written (as data, for renderers), and its symmetry
class.  Code outside this package loops over :data:`KINDS` or looks a kind up
with :func:`kind`; it never asks "is this the 6j?".

Nothing registers itself on import: the list below is the registry.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Callable, Sequence

from ..values import Surd

__all__ = ["Kind", "Notation", "Selection", "ZeroRule", "KINDS", "KIND_KEYS", "ALL_KINDS", "ALL_KIND_KEYS", "kind"]


@dataclass(frozen=True, slots=True)
class ZeroRule:
    """Why a value is exactly zero: a short rule id and a sentence.

    ids: "triangle", "triad-sum", "m-sum", "m-range", "parity", "symmetry",
    "cancellation".  ``str()`` gives "id: text", the form the CLI prints.
    """

    id: str
    text: str

    def __str__(self) -> str:
        return f"{self.id}: {self.text}"


@dataclass(frozen=True, slots=True)
class Notation:
    """How a symbol is written, as data: renderers turn it into text, MathML or LaTeX.

    style:
      "array"    rows of arguments stacked inside ``brackets`` (3j, 6j, 9j);
      "braket"   <g0; g1; ... | last group> (CG: <j1 m1; j2 m2 | J M>);
      "function" name(g0; g1) (W(a b c d; e f)).
    groups: argument positions per row / group, in writing order.
    """

    style: str
    groups: tuple[tuple[int, ...], ...]
    brackets: str = ""  # "()" or "{}" for arrays
    name: str = ""  # function name for "function"


@dataclass(frozen=True, slots=True)
class Selection:
    """The selection rules of a kind as data (argument positions), for planners and the jump box.

    triads: positions of each triple that must obey the triad rule.
    projections: (j position, m position) pairs; each m runs over -j..j in integer steps.
    m_sum: a coefficient per argument; sum(c * t) must be 0 (empty: no projection sum).
    The kind's ``zero_rule`` applies the same data and adds the rules data cannot say.
    """

    triads: tuple[tuple[int, int, int], ...] = ()
    projections: tuple[tuple[int, int], ...] = ()
    m_sum: tuple[int, ...] = ()


@dataclass(frozen=True, slots=True)
class Kind:
    """One kind of value.

    key: the name the CLI, data files and values.txt use ("cg", "3j", "6j", "w", "9j").
    title: what one value is called in prose ("Clebsch–Gordan coefficient").
    arguments: argument names in the order of the symbol (and of the Python function).
    j_positions: which arguments are angular momenta j (the others are projections m).
    parse(values, max_j): doubled arguments, or QuantumNumberError naming the argument.
    doubled(*t): the exact value from doubled arguments.
    zero_rule(t): the ZeroRule that makes the value zero, or None if it is not zero.
    notation: how the symbol is written.
    members(*t): the symmetry class of an allowed symbol as [(arguments, sign)] with
        value(member) = sign * value(t), canonical (largest) form first; None if the
        kind has no tabulated symmetry class.
    selection: the selection rules as argument positions (see Selection).
    """

    key: str
    title: str
    arguments: tuple[str, ...]
    j_positions: tuple[int, ...]
    parse: Callable[[Sequence[object], "int | None"], tuple[int, ...]]
    doubled: Callable[..., Surd]
    zero_rule: Callable[[tuple[int, ...]], "ZeroRule | None"]
    notation: Notation
    members: "Callable[..., list[tuple[tuple[int, ...], int]]] | None" = None
    selection: Selection = Selection()

    def text(self, t: Sequence[int]) -> str:
        """The symbol in plain text: '<1 1; 1 -1 | 0 0>', '{1 1 1; 1 1 1}', 'W(a b c d; e f)'."""
        from ..notation import half_text

        n = self.notation
        parts = [" ".join(half_text(t[i]) for i in g) for g in n.groups]
        if n.style == "braket":
            return f"<{'; '.join(parts[:-1])} | {parts[-1]}>"
        if n.style == "function":
            return f"{n.name}({'; '.join(parts)})"
        return f"{n.brackets[0]}{'; '.join(parts)}{n.brackets[1]}"

    def value(self, *values: object, max_j: "int | None" = None) -> Surd:
        """The value from quantum numbers in any accepted form."""
        return self.doubled(*self.parse(values, max_j))


from .registry import KINDS, TABULATED_FUNCTIONS  # noqa: E402  (the explicit lists, built from the kind modules)

KIND_KEYS = tuple(k.key for k in KINDS)
#: every kind a site may tabulate, in the order of values.txt: the coupling symbols, then the functions
ALL_KINDS = KINDS + TABULATED_FUNCTIONS
ALL_KIND_KEYS = tuple(k.key for k in ALL_KINDS)
_BY_KEY = {k.key: k for k in ALL_KINDS}


def kind(key: str) -> Kind:
    """The Kind named ``key``, or ValueError naming the argument and the choices."""
    try:
        return _BY_KEY[key]
    except (KeyError, TypeError):
        raise ValueError(f"argument kind = {key!r}: must be one of {', '.join(ALL_KIND_KEYS)}") from None

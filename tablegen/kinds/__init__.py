"""Kinds of exact value: one record per kind, in one explicit list.

A :class:`Kind` says everything the pipeline needs to know about one kind of
value (a CG coefficient, a 3j, 6j, W or 9j symbol, later rotation functions
and recoupling coefficients): the names of its arguments, how to parse them,
the function on doubled arguments, the selection rule that makes a value
zero, how the symbol is written (as data, for renderers), and its symmetry
class.  Code outside this package loops over :data:`KINDS` or looks a kind up
with :func:`kind`; it never asks "is this the 6j?".

Nothing registers itself on import: the list in registry.py is the registry; a kind's
module is imported when the kind is first asked for (start-up of a one-value lookup).
"""

from __future__ import annotations

# Records are small slotted classes, not dataclasses or named tuples: the
# one-value command imports this module, and dataclasses (with inspect, ast,
# typing) would double its start-up time.  Annotations stay strings (PEP 563).


class _Record:
    """An immutable record: ``_fields`` by position or keyword, ``_defaults`` for the last ones."""

    __slots__ = ()
    _fields: tuple = ()
    _defaults: dict = {}

    def __init__(self, *args, **kwargs) -> None:
        if len(args) > len(self._fields) or not set(kwargs) <= set(self._fields):
            raise TypeError(f"{type(self).__name__} takes the fields {', '.join(self._fields)}")
        values = {**self._defaults, **dict(zip(self._fields, args)), **kwargs}
        missing = [f for f in self._fields if f not in values]
        if missing:
            raise TypeError(f"{type(self).__name__} is missing {', '.join(missing)}")
        for name in self._fields:
            object.__setattr__(self, name, values[name])

    def __setattr__(self, name: str, value: object) -> None:
        raise AttributeError(f"{type(self).__name__} is immutable")

    def _values(self) -> tuple:
        return tuple(getattr(self, f) for f in self._fields)

    def __eq__(self, other: object) -> bool:
        return type(other) is type(self) and self._values() == other._values()  # type: ignore[attr-defined]

    def __hash__(self) -> int:
        return hash(self._values())

    def __repr__(self) -> str:
        return f"{type(self).__name__}({', '.join(f'{f}={getattr(self, f)!r}' for f in self._fields)})"

__all__ = ["Kind", "Notation", "Selection", "ZeroRule", "KINDS", "KIND_KEYS", "ALL_KINDS", "ALL_KIND_KEYS", "kind"]


class ZeroRule(_Record):
    """Why a value is exactly zero: a short rule id and a sentence.

    ids: "triangle", "triad-sum", "m-sum", "m-range", "parity", "symmetry",
    "cancellation", "pauli" (equivalent particles).  ``str()`` gives "id: text", the form the CLI prints.
    """

    __slots__ = ("id", "text")
    _fields = __slots__

    def __str__(self) -> str:
        return f"{self.id}: {self.text}"


class Notation(_Record):
    """How a symbol is written, as data: renderers turn it into text, MathML or LaTeX.

    style:
      "array"    rows of arguments stacked inside ``brackets`` (3j, 6j, 9j);
      "braket"   <g0; g1; ... | last group> (CG: <j1 m1; j2 m2 | J M>);
      "function" name(g0; g1) (W(a b c d; e f)).
    groups: argument positions per row / group, in writing order.
    tex: a LaTeX pattern with {0}, {1}, ... for the arguments, where the symbol is printed otherwise than
      its style says (a rotation function: 'd^{{{0}}}_{{{1},{2}}}(\\beta)'); empty for the style's form.
    """

    __slots__ = ("style", "groups", "brackets", "name", "tex")
    _fields = __slots__
    _defaults = {"brackets": "", "name": "", "tex": ""}


class Selection(_Record):
    """The selection rules of a kind as data (argument positions), for planners and the jump box.

    triads: positions of each triple that must obey the triad rule.
    projections: (j position, m position) pairs; each m runs over -j..j in integer steps.
    m_sum: a coefficient per argument; sum(c * t) must be 0 (empty: no projection sum).
    The kind's ``zero_rule`` applies the same data and adds the rules data cannot say.
    """

    __slots__ = ("triads", "projections", "m_sum")
    _fields = __slots__
    _defaults = {"triads": (), "projections": (), "m_sum": ()}


class Kind(_Record):
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
    max_j: the one-value limit: the default largest j of a lookup, chosen so that
        every value within it returns in about a second (``--max-j`` raises it).
    convention: its phase convention in one line (``value --json`` says it); empty where the
        kind has none to choose.
    cost_power, seconds_at_max_j: the time of one value grows about like
        seconds_at_max_j * (j / max_j) ** cost_power (measured on the worst
        arguments, all j equal); the size guard and the --max-j warning use it.
    """

    __slots__ = (
        "key", "title", "arguments", "j_positions", "parse", "doubled", "zero_rule", "notation",
        "members", "selection", "max_j", "cost_power", "seconds_at_max_j", "convention",
    )
    _fields = __slots__
    _defaults = {"members": None, "selection": Selection(), "max_j": 2000, "cost_power": 2, "seconds_at_max_j": 1.0,
                 "convention": ""}

    @property
    def triads(self) -> tuple:
        """Argument positions of every triad of j's (a symbol is admissible when all couple)."""
        return self.selection.triads

    def seconds(self, tj: int) -> float:
        """Rough time of one value whose largest doubled j is ``tj`` (0 below j = 1)."""
        return self.seconds_at_max_j * (tj / (2 * self.max_j)) ** self.cost_power

    def text(self, t: "Sequence[int]") -> str:
        """The symbol in plain text: '<1 1; 1 -1 | 0 0>', '{1 1 1; 1 1 1}', 'W(a b c d; e f)'."""
        from ..spins import half_text

        n = self.notation
        parts = [" ".join(half_text(t[i]) for i in g) for g in n.groups]
        if n.style == "braket":
            return f"<{'; '.join(parts[:-1])} | {parts[-1]}>"
        if n.style == "function":
            return f"{n.name}({'; '.join(parts)})"
        return f"{n.brackets[0]}{'; '.join(parts)}{n.brackets[1]}"

    def value(self, *values: object, max_j: "int | None" = None) -> "Surd":
        """The value from quantum numbers in any accepted form."""
        return self.doubled(*self.parse(values, max_j))


from .registry import KIND_PLACES  # noqa: E402  (the explicit list: key, module, record name)

KIND_KEYS = tuple(key for key, _, _ in KIND_PLACES)
_BY_KEY: dict = {}  # key -> Kind, filled as kinds are asked for
_PLACE = {key: (module, name) for key, module, name in KIND_PLACES}


def _numbers() -> tuple:
    """Every kind whose values are numbers, in registry order (imports every kind module)."""
    return tuple(kind(key) for key in KIND_KEYS)


def _all_kinds() -> tuple:
    """Every kind a site may tabulate, in the order of values.txt: the numbers, then the functions.

    The function kinds (registry.tabulated_functions) are imported on first use: a one-value
    lookup of a number never needs them, and they would add to its start-up time.
    """
    from .registry import tabulated_functions

    return _numbers() + tabulated_functions()


def __getattr__(name: str):
    """KINDS, ALL_KINDS, ALL_KIND_KEYS: module attributes made on first use (they import kind modules)."""
    if name == "KINDS":
        globals()["KINDS"] = records = _numbers()
        return records
    if name == "ALL_KINDS":
        return _all_kinds()
    if name == "ALL_KIND_KEYS":
        return tuple(k.key for k in _all_kinds())
    raise AttributeError(f"module {__name__!r} has no attribute {name!r}")


def kind(key: str) -> Kind:
    """The Kind named ``key`` (only its module is imported), or ValueError naming the argument and the choices."""
    try:
        return _BY_KEY[key]
    except (KeyError, TypeError):
        pass
    place = _PLACE.get(key) if isinstance(key, str) else None
    if place is not None:
        module = __import__(f"{__name__}.{place[0]}", fromlist=[place[1]])  # not importlib: start-up time
        record = getattr(module, place[1])
        _BY_KEY[key] = record
        return record
    every = _all_kinds()
    for k in every[len(KIND_KEYS):]:
        if k.key == key:
            return k
    raise ValueError(f"argument kind = {key!r}: must be one of {', '.join(k.key for k in every)}") from None

"""Exact value types, and the protocol every one of them keeps.

Renderers, data files, values.txt and verify speak only this protocol, so a
new kind of exact value (a surd, an exact sum of surds, later a value times a
power of pi) plugs in without touching them:

* ``str(x)``: canonical text that ``sympy.sympify`` reads back as the same
  number (a data format: it goes into checksummed files);
* ``x.latex(style)``: LaTeX, ``style`` one of "root", "rational", "inline";
* ``x.decimal(digits)``: ``digits`` significant digits, correctly rounded
  (half to even), computed in integers only;
* ``x.to_sympy()``: the same number as a sympy expression (imports sympy);
* ``==`` and ``hash``: a value that happens to be rational equals, and hashes
  like, the same ``int`` or ``Fraction``; ordering against int, Fraction and
  float is exact and agrees with ``==``.

:func:`phase` is the sign factor (-1)**x as an int, for an integer x.
"""

from __future__ import annotations

from .surd import Surd

__all__ = ["Surd", "ExactSum", "phase"]


def __getattr__(name: str):
    """ExactSum on first use: it needs fractions, which a one-value lookup never does (start-up time)."""
    if name == "ExactSum":
        from .exact_sum import ExactSum

        return ExactSum
    raise AttributeError(f"module {__name__!r} has no attribute {name!r}")


def phase(x: object) -> int:
    """(-1)**x as the int 1 or -1, for an integer x.

    Accepts int, Fraction (and any numbers.Rational, sympy's too), integral
    floats and text such as "3", "-4/2" or "2.0", as quantum numbers are
    written; a half-integer, any other non-integer or a non-number raises
    ValueError naming the value (there (-1)**x is not a real sign).  Use it
    instead of ``(-1)**(l - lp)``, which gives a float for Fraction arguments.
    """
    if type(x) is int:
        return -1 if x & 1 else 1
    n = _as_integer(x)
    if n is None:
        raise ValueError(f"argument x = {x!r}: phase(x) = (-1)**x needs an integer x")
    return -1 if n & 1 else 1


def _as_integer(x: object) -> "int | None":
    import numbers
    from fractions import Fraction

    if isinstance(x, bool):
        return None
    if isinstance(x, numbers.Integral):
        return int(x)
    if isinstance(x, str):
        from ..errors import TablegenError
        from ..spins import rational_from_text  # refuses a huge literal by its length, never converts it

        try:
            x = Fraction(*rational_from_text(x, "x"))
        except (TablegenError, ValueError, ZeroDivisionError):
            return None
    if isinstance(x, numbers.Rational):
        return int(x.numerator) if x.denominator == 1 else None
    if isinstance(x, float):
        return int(x) if x.is_integer() else None
    return None

"""The exceptions tablegen raises on purpose.

Every error that a user can cause derives from :class:`TablegenError` and
renders as one line that names the argument (or recipe key, or path), the
offending value and the rule it breaks.  Only the command line turns these
into stderr text and an exit status; the library just raises them.
"""

from __future__ import annotations

__all__ = [
    "TablegenError",
    "QuantumNumberError",
    "OptionError",
    "RecipeError",
    "OutputError",
    "TooLargeError",
    "TreeError",
]


class TablegenError(Exception):
    """Base class for every error a user can trigger."""


class QuantumNumberError(TablegenError, ValueError):
    """A j or m that cannot be a quantum number (not a selection-rule zero)."""

    def __init__(self, argument: str, value: object, rule: str) -> None:
        self.argument = argument
        self.value = value
        self.rule = rule
        super().__init__(f"argument {argument} = {_show(value)}: {rule}")


class OptionError(TablegenError, ValueError):
    """A command-line option with a value it cannot take (--digits, --max-j, --jobs ...)."""

    def __init__(self, argument: str, value: object, rule: str) -> None:
        self.argument = argument
        self.value = value
        self.rule = rule
        super().__init__(f"argument {argument} = {_show(value)}: {rule}")


class RecipeError(TablegenError, ValueError):
    """A recipe key with a wrong value, type or name."""

    def __init__(self, key: str, value: object, rule: str) -> None:
        self.key = key
        self.value = value
        self.rule = rule
        what = "argument" if key.startswith("--") else "recipe key"  # the file itself, or a key in it
        super().__init__(f"{what} {key} = {_show(value)}: {rule}")


class TooLargeError(TablegenError, ValueError):
    """A request whose estimated size exceeds a safety limit."""

    def __init__(self, what: str, estimate: str, rule: str) -> None:
        self.what = what
        self.estimate = estimate
        self.rule = rule
        super().__init__(f"{what} ({estimate}): {rule}")


class OutputError(TablegenError, OSError):
    """An output or input folder that cannot be used as asked."""

    def __init__(self, path: object, rule: str) -> None:
        self.path = path
        self.rule = rule
        super().__init__(f"folder {str(path)!r}: {rule}")


class LinkError(TablegenError, RuntimeError):
    """A built page links to a file or an anchor the site does not have (a defect of tablegen itself)."""

    def __init__(self, page: str, target: str, rule: str) -> None:
        self.page = page
        self.target = target
        self.rule = rule
        super().__init__(f"page {page!r} links to {target!r}: {rule}")


class TreeError(TablegenError, ValueError):
    """A coupling tree (or a pair of trees) that breaks a rule of the notation."""

    def __init__(self, which: str, text: str, position: int | None, rule: str) -> None:
        self.which = which
        self.text = text
        self.position = position
        self.rule = rule
        where = "" if position is None else f" at character {position}"
        super().__init__(f"{which} {_show(text)}{where}: {rule}")


#: Longest rendering of an offending value in a message (longer ones end in "...").
SHOW_MAX = 60


def _show(value: object) -> str:
    """A short, single-line rendering of an offending value.

    Strings appear quoted with their control characters escaped (repr), other
    values as text with control characters escaped too; anything longer than
    SHOW_MAX characters is cut and ends in "...".
    """
    text = repr(value) if isinstance(value, str) else str(value)
    text = "".join(c if c.isprintable() else repr(c)[1:-1] for c in text)
    return text if len(text) <= SHOW_MAX else text[: SHOW_MAX - 3] + "..."

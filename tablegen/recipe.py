"""What to tabulate: the recipe, its defaults, TOML loading and validation.

A recipe names, for each family (cg, 3j, 6j, 9j), the range of j to tabulate,
plus the decimal digits, the LaTeX root style, a title and optional notes.
Racah W needs no entry: it is shown beside the 6j it equals.

Recipe file (TOML)::

    title = "Coupling tables for a shell-model exercise"
    notes = "Only the ranges needed for p and d shells."
    digits = 15                 # significant digits of the decimals (1..10000, limits.MAX_DIGITS)
    latex_style = "root"        # "root": \\sqrt{\\frac{5}{14}}; "rational": \\frac{\\sqrt{70}}{14};
                                # "inline": \\sqrt{5/14}, for running text
    decimals = true             # false: LaTeX tables without their decimal columns

    [cg]                        # <j1 m1; j2 m2 | J M> for min_j <= j1, j2 <= max_j
    max_j = 4
    [3j]                        # (j1 j2 j3; m1 m2 m3) for min_j <= j1, j2 <= max_j
    max_j = "7/2"
    min_j = "1/2"
    [6j]                        # every j of the symbol in [min_j, max_j]
    max_j = 4
    [9j]
    max_j = 2
    [recouple3]                 # <(j1 j2)j12, j3; J | j1, (j2 j3)j23; J>: leaves j1, j2, j3 in the range
    max_j = "3/2"
    [recouple4]                 # <(j1 j2)j12, (j3 j4)j34; J | (j1 j3)j13, (j2 j4)j24; J>: leaves in the range
    max_j = 1
    [lsjj]                      # LS<->jj of two spin-1/2 particles: every configuration with l in the range
    max_j = 3
    [state3]                    # coupled states ((j1 j2)j12 j3)J in product states and back: leaves in the range
    max_j = "1/2"
    [state4]                    # coupled states ((j1 j2)j12, (j3 j4)j34)J in product states and back
    max_j = "1/2"
    [rotation]                  # d^j_{m'm}(beta), one page per j in [min_j, max_j], steps of 1/2
    max_j = 3
    [harmonics]                 # Y_l^m(theta, phi) for whole l in [min_l, max_l], on one page
    max_l = 4

The ranges are inclusive; half-integers are written "7/2" or 3.5 (ASCII digits,
at most 40 characters, no j above limits.ENGINE_MAX_J).  The file is UTF-8,
with or without a byte-order mark.  Titles and notes hold no control
characters (notes may hold line breaks and tabs).  The size guard lives in
sizeguard.py; ``check_size`` and ``estimate_size`` are re-exported here.
"""

from __future__ import annotations

import sys
from dataclasses import dataclass, field

from .errors import QuantumNumberError, RecipeError
from .families import FAMILIES as _FAMILY_RECORDS
from .families import FAMILY_KEYS
from .limits import ENGINE_MAX_J, MAX_DIGITS, RECIPE_MAX_BYTES, VALUE_LIMIT
from .spins import half_text, parse_j
from .values.latex import LATEX_STYLES

__all__ = [
    "FamilyRange",
    "Recipe",
    "DEFAULT_RECIPE",
    "FAMILIES",
    "load_recipe",
    "recipe_from_mapping",
    "recipe_from_options",
    "estimate_size",
    "check_size",
]

#: Families in the order they appear everywhere (pages, data, digest): the family records' keys.
FAMILIES = FAMILY_KEYS
FAMILY_NAMES = {f.key: f.title for f in _FAMILY_RECORDS}
MAX_TITLE = 200
MAX_NOTES = 4000
_TOP_KEYS = ("title", "notes", "digits", "latex_style", "decimals") + FAMILIES
#: The letter of each family's range keys (max_j, min_j; the harmonics: max_l, min_l) and its doubled step.
_RANGE_NAMES = {f.key: f.range_name for f in _FAMILY_RECORDS}
_RANGE_STEPS = {f.key: f.range_step for f in _FAMILY_RECORDS}


@dataclass(frozen=True)
class FamilyRange:
    """Inclusive range of j for one family, in doubled integers."""

    family: str
    min_tj: int
    max_tj: int

    def describe(self) -> str:
        lo, hi = half_text(self.min_tj), half_text(self.max_tj)
        j = _RANGE_NAMES.get(self.family, "j")
        return f"{j} ≤ {hi}" if self.min_tj == 0 else f"{lo} ≤ {j} ≤ {hi}"


@dataclass(frozen=True)
class Recipe:
    """Everything a build depends on besides the tool version."""

    title: str = "Angular-momentum coupling tables"
    notes: str = ""
    digits: int = 15
    latex_style: str = "root"
    families: tuple[FamilyRange, ...] = field(default_factory=tuple)
    decimals: bool = True  # LaTeX tables print a decimal beside each exact value

    def family(self, name: str) -> FamilyRange | None:
        for f in self.families:
            if f.family == name:
                return f
        return None

    def as_dict(self) -> dict:
        """Plain data with a fixed key order (for the manifest and citation)."""
        out: dict = {
            "title": self.title,
            "notes": self.notes,
            "digits": self.digits,
            "latex_style": self.latex_style,
            "decimals": self.decimals,
        }
        for f in self.families:
            j = _RANGE_NAMES.get(f.family, "j")
            entry = {f"max_{j}": half_text(f.max_tj)}
            if f.min_tj:
                entry[f"min_{j}"] = half_text(f.min_tj)
            out[f.family] = entry
        return out

    def toml_text(self) -> str:
        """The recipe as TOML that load_recipe reads back to an equal Recipe."""
        lines = [
            f"title = {_toml_string(self.title)}",
            f"notes = {_toml_string(self.notes)}",
            f"digits = {self.digits}",
            f"latex_style = {_toml_string(self.latex_style)}",
            f"decimals = {'true' if self.decimals else 'false'}",
        ]
        for f in self.families:
            j = _RANGE_NAMES.get(f.family, "j")
            lines += ["", f"[{f.family}]", f'max_{j} = "{half_text(f.max_tj)}"']
            if f.min_tj:
                lines.append(f'min_{j} = "{half_text(f.min_tj)}"')
        return "\n".join(lines) + "\n"


def _toml_string(text: str) -> str:
    escaped = (
        text.replace("\\", "\\\\").replace('"', '\\"').replace("\n", "\\n").replace("\t", "\\t")
    )
    # TOML basic strings forbid control characters (U+0000-U+001F except tab, and U+007F)
    escaped = "".join(f"\\u{ord(c):04x}" if c < " " or c == "\x7f" else c for c in escaped)
    return f'"{escaped}"'


DEFAULT_RECIPE = Recipe(
    title="Angular-momentum coupling tables",
    notes="",
    digits=15,
    latex_style="root",
    families=(
        FamilyRange("cg", 0, 8),
        FamilyRange("3j", 0, 8),
        FamilyRange("6j", 0, 8),
        FamilyRange("9j", 0, 4),
        FamilyRange("recouple3", 1, 4),  # leaves 1/2 <= j1, j2, j3 <= 2 (a leaf 0 only gives 1 x 1 matrices)
        FamilyRange("recouple4", 1, 2),  # leaves 1/2 and 1
        FamilyRange("lsjj", 0, 6),
        FamilyRange("state3", 1, 1),  # three spins 1/2
        FamilyRange("state4", 1, 1),  # four spins 1/2
        FamilyRange("rotation", 0, 6),
        FamilyRange("harmonics", 0, 8),
    ),
)


def _load_toml(path: str) -> dict:
    """The parsed TOML of a recipe file; every failure is one RecipeError naming --recipe."""
    if sys.version_info >= (3, 11):
        import tomllib
    else:  # pragma: no cover - Python 3.10
        import tomli as tomllib
    import os
    import stat

    try:
        # a FIFO or a device would block on open or never end: only a regular file is a recipe
        if os.path.exists(path) and not stat.S_ISREG(os.stat(path).st_mode) and not os.path.isdir(path):
            raise RecipeError("--recipe", path, "is not a regular file (a pipe or a device); give a TOML file")
        with open(path, "rb") as fh:
            data = fh.read(RECIPE_MAX_BYTES + 1)
    except FileNotFoundError:
        raise RecipeError("--recipe", path, "file not found") from None
    except IsADirectoryError:
        raise RecipeError("--recipe", path, "is a folder, not a TOML file") from None
    except OSError as exc:  # permission, a dangling link, an I/O error
        raise RecipeError("--recipe", path, f"cannot be read ({exc.strerror or exc})") from None
    if len(data) > RECIPE_MAX_BYTES:
        raise RecipeError("--recipe", path, f"larger than {RECIPE_MAX_BYTES:,} bytes; not a recipe")
    if data.startswith(b"\xef\xbb\xbf"):  # a UTF-8 byte-order mark, as some editors write
        data = data[3:]
    try:
        text = data.decode("utf-8")
    except UnicodeDecodeError:
        raise RecipeError("--recipe", path, "not UTF-8 text") from None
    try:
        return tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise RecipeError("--recipe", path, f"not valid TOML ({exc})") from None
    except (ValueError, RecursionError, MemoryError):  # an integer of thousands of digits, deep nesting
        raise RecipeError("--recipe", path, "not valid TOML (a number or nesting beyond any recipe)") from None


def load_recipe(path: str) -> Recipe:
    """Read and validate a TOML recipe file."""
    return recipe_from_mapping(_load_toml(path))


def _j_value(key: str, value: object) -> int:
    if isinstance(value, bool) or not isinstance(value, (int, float, str)):
        raise RecipeError(key, value, "must be a number such as 4, 3.5 or \"7/2\"")
    if isinstance(value, int) and abs(value) > 10 * ENGINE_MAX_J:  # never double a 4000-digit int
        raise RecipeError(key, value, f"j above the engine's limit {ENGINE_MAX_J:,}")
    try:
        # the engine's ceiling here; the kinds' one-value limits, counts and time are the
        # size guard's (sizeguard.check_size), which --allow-large overrides
        return parse_j(value, key, max_j=ENGINE_MAX_J)
    except QuantumNumberError as exc:
        rule = exc.rule
        if "size limit" in rule:
            rule = f"j above the engine's limit {ENGINE_MAX_J:,} (no option lifts it)"
        raise RecipeError(key, value, rule) from None


def _text_value(key: str, value: object, allowed: str, limit: int, required: bool) -> str:
    """A title or notes: a string, UTF-8-encodable, without control characters but ``allowed``."""
    if not isinstance(value, str) or (required and not value.strip()):
        raise RecipeError(key, value, "must be a non-empty string" if required else "must be a string")
    if len(value) > limit:
        raise RecipeError(key, value, f"must be at most {limit} characters")
    try:
        value.encode("utf-8")
    except UnicodeEncodeError:  # a non-UTF-8 byte from the command line (surrogate escape)
        raise RecipeError(key, value, "not valid UTF-8 text") from None
    for ch in value:
        if ch not in allowed and (ch < " " or "\x7f" <= ch <= "\x9f"):
            raise RecipeError(key, value, f"control character {ch!r} not allowed")
    return value


def recipe_from_mapping(data: dict, base: Recipe | None = None, names: dict | None = None) -> Recipe:
    """Validate a mapping (parsed TOML or command-line options) into a Recipe.

    Keys absent from ``data`` come from ``base`` (``None``: the plain defaults
    with no families).  Every error names the key and the rule it breaks;
    ``names`` renames keys in errors (``{"title": "--title"}``).
    """
    names = names or {}
    if not isinstance(data, dict):
        raise RecipeError("(recipe)", data, "must be a table of keys")
    for key in data:
        if key not in _TOP_KEYS:
            raise RecipeError(key, data[key], f"unknown key (known: {', '.join(_TOP_KEYS)})")
    base = base or Recipe()
    title = _text_value(names.get("title", "title"), data.get("title", base.title), "\t", MAX_TITLE, True)
    notes = _text_value(names.get("notes", "notes"), data.get("notes", base.notes), "\n\r\t", MAX_NOTES, False)
    digits = data.get("digits", base.digits)
    if isinstance(digits, bool) or not isinstance(digits, int):
        raise RecipeError(names.get("digits", "digits"), digits, "must be a whole number")
    if not 1 <= digits <= MAX_DIGITS:
        raise RecipeError(names.get("digits", "digits"), digits, f"must be from 1 to {MAX_DIGITS:,}")
    style = data.get("latex_style", base.latex_style)
    if style not in LATEX_STYLES:
        raise RecipeError(names.get("latex_style", "latex_style"), style, f"must be one of {', '.join(LATEX_STYLES)}")
    # -- the LaTeX decimal columns (journal output) --
    decimals = data.get("decimals", base.decimals)
    if not isinstance(decimals, bool):
        raise RecipeError(names.get("decimals", "decimals"), decimals, "must be true or false")

    ranges = {f.family: f for f in base.families}
    for name in FAMILIES:
        if name not in data:
            continue
        table = data[name]
        if table is False or table is None:  # command line: drop a family
            ranges.pop(name, None)
            continue
        j = _RANGE_NAMES[name]
        top, bottom = f"max_{j}", f"min_{j}"
        if not isinstance(table, dict):
            raise RecipeError(name, table, f"must be a table with {top} (and optionally {bottom})")
        for key in table:
            if key not in (top, bottom):
                raise RecipeError(f"{name}.{key}", table[key], f"unknown key (known: {top}, {bottom})")
        if top not in table:
            raise RecipeError(f"{name}.{top}", "(missing)", "is required")
        hi = _j_value(f"{name}.{top}", table[top])
        lo = _j_value(f"{name}.{bottom}", table.get(bottom, 0))
        if lo > hi:
            raise RecipeError(
                f"{name}.{bottom}", table.get(bottom), f"must not exceed {top} = {half_text(hi)} (reversed range)"
            )
        for key, t in ((top, hi), (bottom, lo)):
            if t % _RANGE_STEPS[name]:
                raise RecipeError(f"{name}.{key}", table[key], f"{j} must be a whole number for this family")
        ranges[name] = FamilyRange(name, lo, hi)
    families = tuple(ranges[n] for n in FAMILIES if n in ranges)
    return Recipe(title=title, notes=notes, digits=digits, latex_style=style, families=families, decimals=decimals)


# -- command-line options ------------------------------------------------------
def _range_option(option: str, text: str) -> FamilyRange | None:
    """'4' -> j <= 4; '1/2..7/2' -> 1/2 <= j <= 7/2; 'none' -> None (leave the family out)."""
    name = option[2:]
    if text.strip().lower() == "none":
        return None
    lo, sep, hi = text.partition("..")
    try:
        top = _j_value(option, hi if sep else text)
        bottom = _j_value(option, lo) if sep else 0
    except RecipeError as exc:  # name the option with the whole range as typed
        raise RecipeError(option, text, exc.rule) from None
    if bottom > top:
        raise RecipeError(option, text, f"MIN must not exceed MAX = {half_text(top)} (reversed range)")
    if top % _RANGE_STEPS[name] or bottom % _RANGE_STEPS[name]:
        raise RecipeError(option, text, f"{_RANGE_NAMES[name]} must be a whole number for this family")
    return FamilyRange(name, bottom, top)


def recipe_from_options(options: dict[str, str], recipe_file: str | None = None) -> Recipe:
    """The recipe of ``build`` options ('--cg' -> '1/2..7/2', '--title' -> text, ...) over a base.

    The base is the recipe file if given, else only the families asked for if
    any family option is given, else the default recipe.  Every error is a
    RecipeError naming the option as typed.
    """
    from .errors import OptionError
    from .spins import count_from_text

    families = {f"--{key}" for key in FAMILIES}
    if recipe_file is not None:
        base = load_recipe(recipe_file)
    elif families & options.keys():
        base = Recipe(title=DEFAULT_RECIPE.title)  # only the families asked for
    else:
        base = DEFAULT_RECIPE
    data: dict = {}
    ranges = {f.family: f for f in base.families}
    for option, text in options.items():
        if option in families:
            chosen = _range_option(option, text)
            ranges.pop(option[2:], None) if chosen is None else ranges.update({chosen.family: chosen})
        elif option == "--digits":
            try:
                data["digits"] = count_from_text(text, option, 1, MAX_DIGITS)
            except OptionError as exc:
                raise RecipeError(option, text, exc.rule) from None
        else:
            data[option[2:].replace("-", "_")] = text
    names = {key: f"--{key.replace('_', '-')}" for key in data}
    recipe = recipe_from_mapping(data, base, names)
    chosen_families = tuple(ranges[key] for key in FAMILIES if key in ranges)
    if not chosen_families:
        option = "/".join(f"--{key}" for key in FAMILIES)
        raise RecipeError(option, "none", "the recipe tabulates no family (give a range to one of them)")
    from dataclasses import replace

    return replace(recipe, families=chosen_families)


# -- size guard (sizeguard.py) ---------------------------------------------------
def estimate_size(recipe: Recipe) -> dict[str, int]:
    """Values per family: exact where possible, else a lower bound (see sizeguard)."""
    from .sizeguard import estimate_size as estimate

    return estimate(recipe)




def check_size(recipe: Recipe, allow_large: bool = False) -> dict[str, int]:
    """Refuse a recipe too large for this machine before anything is computed (see sizeguard)."""
    from .sizeguard import check_size as check

    return check(recipe, allow_large)

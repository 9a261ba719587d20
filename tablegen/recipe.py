"""What to tabulate: the recipe, its defaults, TOML loading and validation.

A recipe names, for each family (cg, 3j, 6j, 9j), the range of j to tabulate,
plus the decimal digits, the LaTeX root style, a title and optional notes.
Racah W needs no entry: it is shown beside the 6j it equals.

Recipe file (TOML)::

    title = "Coupling tables for a shell-model exercise"
    notes = "Only the ranges needed for p and d shells."
    digits = 15                 # significant digits of the decimals (1..100)
    latex_style = "root"        # "root": \\sqrt{\\frac{5}{14}}; "rational": \\frac{\\sqrt{70}}{14}

    [cg]                        # <j1 m1; j2 m2 | J M> for min_j <= j1, j2 <= max_j
    max_j = 4
    [3j]                        # (j1 j2 j3; m1 m2 m3) for min_j <= j1, j2 <= max_j
    max_j = "7/2"
    min_j = "1/2"
    [6j]                        # every j of the symbol in [min_j, max_j]
    max_j = 4
    [9j]
    max_j = 2
    [rotation]                  # d^j_{m'm}(beta), one page per j in [min_j, max_j], steps of 1/2
    max_j = 3
    [harmonics]                 # Y_l^m(theta, phi) for whole l in [min_l, max_l], on one page
    max_l = 4

The ranges are inclusive; half-integers are written "7/2" or 3.5.
"""

from __future__ import annotations

import sys
from dataclasses import dataclass, field

from .errors import QuantumNumberError, RecipeError, TooLargeError
from .families import FAMILY_KEYS, family as family_record
from .spins import half_text, parse_j

__all__ = [
    "FamilyRange",
    "Recipe",
    "DEFAULT_RECIPE",
    "FAMILIES",
    "load_recipe",
    "recipe_from_mapping",
    "estimate_size",
    "check_size",
]

#: Families in the order they appear everywhere (pages, data, digest): the Family records' keys.
FAMILIES = FAMILY_KEYS
FAMILY_NAMES = {
    "cg": "Clebsch–Gordan coefficients",
    "3j": "Wigner 3j symbols",
    "6j": "Wigner 6j symbols and Racah W",
    "9j": "Wigner 9j symbols",
}
LATEX_STYLES = ("root", "rational")
MAX_DIGITS = 100
MAX_TITLE = 200
MAX_NOTES = 4000
#: Refuse builds estimated above this many values unless the caller insists.
VALUE_LIMIT = 1_500_000

_NO_J_LIMIT = 10**9
_TOP_KEYS = ("title", "notes", "digits", "latex_style") + FAMILIES


@dataclass(frozen=True)
class FamilyRange:
    """Inclusive range of j for one family, in doubled integers."""

    family: str
    min_tj: int
    max_tj: int

    def describe(self) -> str:
        lo, hi = half_text(self.min_tj), half_text(self.max_tj)
        j = _range_name(self.family)
        return f"{j} ≤ {hi}" if self.min_tj == 0 else f"{lo} ≤ {j} ≤ {hi}"


@dataclass(frozen=True)
class Recipe:
    """Everything a build depends on besides the tool version."""

    title: str = "Angular-momentum coupling tables"
    notes: str = ""
    digits: int = 15
    latex_style: str = "root"
    families: tuple[FamilyRange, ...] = field(default_factory=tuple)

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
        }
        for f in self.families:
            j = _range_name(f.family)
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
        ]
        for f in self.families:
            j = _range_name(f.family)
            lines += ["", f"[{f.family}]", f'max_{j} = "{half_text(f.max_tj)}"']
            if f.min_tj:
                lines.append(f'min_{j} = "{half_text(f.min_tj)}"')
        return "\n".join(lines) + "\n"


def _range_name(key: str) -> str:
    """The letter of a family's range keys ("j": max_j, min_j; "l": max_l, min_l), from its record."""
    try:
        return family_record(key).range_name
    except ValueError:  # a family made for a test, with no record in the list
        return "j"


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
        FamilyRange("rotation", 0, 6),
        FamilyRange("harmonics", 0, 8),
    ),
)


def _load_toml(path: str) -> dict:
    if sys.version_info >= (3, 11):
        import tomllib
    else:  # pragma: no cover - Python 3.10
        import tomli as tomllib
    try:
        with open(path, "rb") as fh:
            return tomllib.load(fh)
    except FileNotFoundError:
        raise RecipeError("--recipe", path, "file not found") from None
    except IsADirectoryError:
        raise RecipeError("--recipe", path, "is a folder, not a TOML file") from None
    except tomllib.TOMLDecodeError as exc:
        raise RecipeError("--recipe", path, f"not valid TOML ({exc})") from None
    except UnicodeDecodeError:
        raise RecipeError("--recipe", path, "not UTF-8 text") from None


def load_recipe(path: str) -> Recipe:
    """Read and validate a TOML recipe file."""
    return recipe_from_mapping(_load_toml(path))


def _j_value(key: str, value: object) -> int:
    if isinstance(value, bool) or not isinstance(value, (int, float, str)):
        raise RecipeError(key, value, "must be a number such as 4, 3.5 or \"7/2\"")
    try:
        # no size limit here: check_size judges the whole recipe, with --allow-large to insist
        return parse_j(value, key, max_j=_NO_J_LIMIT)
    except QuantumNumberError as exc:
        raise RecipeError(key, value, exc.rule) from None


def recipe_from_mapping(data: dict, base: Recipe | None = None) -> Recipe:
    """Validate a mapping (parsed TOML or command-line options) into a Recipe.

    Keys absent from ``data`` come from ``base`` (``None``: the plain defaults
    with no families).  Every error names the key and the rule it breaks.
    """
    if not isinstance(data, dict):
        raise RecipeError("(recipe)", data, "must be a table of keys")
    for key in data:
        if key not in _TOP_KEYS:
            raise RecipeError(key, data[key], f"unknown key (known: {', '.join(_TOP_KEYS)})")
    base = base or Recipe()
    title = data.get("title", base.title)
    if not isinstance(title, str) or not title.strip():
        raise RecipeError("title", title, "must be a non-empty string")
    if len(title) > MAX_TITLE:
        raise RecipeError("title", title, f"must be at most {MAX_TITLE} characters")
    notes = data.get("notes", base.notes)
    if not isinstance(notes, str):
        raise RecipeError("notes", notes, "must be a string")
    if len(notes) > MAX_NOTES:
        raise RecipeError("notes", notes, f"must be at most {MAX_NOTES} characters")
    digits = data.get("digits", base.digits)
    if isinstance(digits, bool) or not isinstance(digits, int):
        raise RecipeError("digits", digits, "must be a whole number")
    if not 1 <= digits <= MAX_DIGITS:
        raise RecipeError("digits", digits, f"must be from 1 to {MAX_DIGITS}")
    style = data.get("latex_style", base.latex_style)
    if style not in LATEX_STYLES:
        raise RecipeError("latex_style", style, f"must be one of {', '.join(LATEX_STYLES)}")

    ranges = {f.family: f for f in base.families}
    for name in FAMILIES:
        if name not in data:
            continue
        table = data[name]
        if table is False or table is None:  # command line: drop a family
            ranges.pop(name, None)
            continue
        j = _range_name(name)
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
        step = family_record(name).range_step
        for key, t in ((top, hi), (bottom, lo)):
            if t % step:
                raise RecipeError(f"{name}.{key}", table[key], f"{j} must be a whole number for this family")
        ranges[name] = FamilyRange(name, lo, hi)
    families = tuple(ranges[n] for n in FAMILIES if n in ranges)
    return Recipe(title=title, notes=notes, digits=digits, latex_style=style, families=families)


# -- size estimate -------------------------------------------------------------
def _js(f: FamilyRange) -> range:
    return range(f.min_tj, f.max_tj + 1)


def _cg_count(f: FamilyRange) -> int:
    """Exact number of <j1 m1; j2 m2 | J M> allowed by the selection rules.

    For a pair (j1, j2) each product state |m1 m2> appears once for every J
    with |M| <= J in the triangle range, so the count is a short sum.
    """
    total = 0
    for a in _js(f):
        for b in _js(f):
            lo = abs(a - b)
            for tm1 in range(-a, a + 1, 2):
                for tm2 in range(-b, b + 1, 2):
                    start = max(lo, abs(tm1 + tm2))
                    total += (a + b - start) // 2 + 1
    return total


# -- rotation functions and spherical harmonics (issue 9): exact counts, kept apart ---------------
def _rotation_count(f: FamilyRange) -> int:
    """d^j(beta) matrices: (2j+1)^2 functions per j, each with its two values at fixed angles,
    weighted by the j+1 coefficients a function of j holds (a large j costs more than a number)."""
    return sum((tj + 1) ** 2 * (3 + tj // 2) for tj in _js(f))


def _harmonics_count(f: FamilyRange) -> int:
    """Y_l^m: 2l+1 functions per whole l, weighted by their l+1 coefficients."""
    return sum((tl + 1) * (tl // 2 + 1) for tl in _js(f) if tl % 2 == 0)


_FUNCTION_COUNTS = {"rotation": _rotation_count, "harmonics": _harmonics_count}
# -- end of issue 9 counts ---------------------------------------------------------------------------


def estimate_size(recipe: Recipe) -> dict[str, int]:
    """Estimated number of tabulated values per family (classes for 6j/9j).

    Exact for cg/3j; for 6j and 9j a power law fitted to exact class counts,
    which is all a guard against runaway builds needs.
    """
    out: dict[str, int] = {}
    for f in recipe.families:
        n = f.max_tj - f.min_tj + 1  # number of distinct j values
        if f.family in ("cg", "3j"):
            out[f.family] = _cg_count(f) if f.max_tj <= 20 else int(0.132 * n**5)  # 7,809 at j <= 4
        elif f.family in _FUNCTION_COUNTS:
            out[f.family] = _FUNCTION_COUNTS[f.family](f)
        elif f.family == "6j":
            out[f.family] = max(1, int(630 * (n / 9) ** 6))  # 630 classes at j <= 4
        else:
            out[f.family] = max(1, int(350 * (n / 5) ** 9))  # ~350 classes at j <= 2
    return out


def check_size(recipe: Recipe, allow_large: bool = False) -> dict[str, int]:
    """Refuse a recipe too large for this machine before anything is computed."""
    est = estimate_size(recipe)
    total = sum(est.values())
    if total > VALUE_LIMIT and not allow_large:
        parts = ", ".join(f"{k}: ~{v:,}" for k, v in est.items())
        raise TooLargeError(
            "recipe too large",
            f"estimated {total:,} values; {parts}",
            f"the limit is {VALUE_LIMIT:,} values; narrow the ranges, or pass --allow-large to insist",
        )
    return est

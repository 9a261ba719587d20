"""Shared test helpers.

* The repository root goes on ``sys.path`` so that ``import tablegen`` works
  from a plain checkout, without installing the package.
"""

from __future__ import annotations

import sys
from pathlib import Path

_ROOT = Path(__file__).resolve().parent.parent
if str(_ROOT) not in sys.path:
    sys.path.insert(0, str(_ROOT))


# Test helper kept for the recoupling tests (independent of tablegen.values.ExactSum).
from fractions import Fraction
from math import isqrt
from tablegen.values.surd import Surd  # noqa: E402


def _rational_root(f: Fraction) -> Fraction | None:
    """sqrt(f) for a rational f >= 0 when it is rational, else None."""
    n, d = f.numerator, f.denominator
    rn, rd = isqrt(n), isqrt(d)
    if rn * rn == n and rd * rd == d:
        return Fraction(rn, rd)
    return None


class ExactSum:
    """An exact sum of terms weight * (sign * sqrt(p/q)), with rational weights.

    The running sum is kept as sum_k c_k * sqrt(r_k) with rational c_k and r_k,
    no two r_k in the same square class (r_i * r_k never a rational square).
    Square roots of distinct square-free integers are linearly independent
    over the rationals (Besicovitch 1940), so this form is unique: the sum is
    zero exactly when every c_k is zero, and it is a single +-sqrt(rational)
    exactly when at most one c_k is non-zero.  Only integer square roots are
    taken; nothing is factored and nothing is rounded.
    """

    def __init__(self) -> None:
        self._classes: list[list[Fraction]] = []  # [r_k, c_k] pairs

    def add(self, value: Surd, weight: int | Fraction = 1) -> "ExactSum":
        """Add weight * value; returns self so that calls can be chained."""
        if not value or not weight:
            return self
        r = Fraction(value.p, value.q)
        w = Fraction(weight) * value.sign
        for entry in self._classes:
            root = _rational_root(r * entry[0])
            if root is not None:
                # sqrt(r) = sqrt(r * r_k) / r_k * sqrt(r_k)
                entry[1] += w * root / entry[0]
                return self
        self._classes.append([r, w])
        return self

    def total(self) -> Surd:
        """The sum as a Surd (AssertionError if it is not +-sqrt of a rational)."""
        live = [(r, c) for r, c in self._classes if c]
        assert len(live) <= 1, f"the sum mixes square classes: {live}"
        if not live:
            return Surd(0)
        r, c = live[0]
        square = c * c * r
        return Surd(1 if c > 0 else -1, square.numerator, square.denominator)


# -- a small family on the matrix layout, for the layout and browser tests -------------------------
from tablegen.families import Family  # noqa: E402
from tablegen.layouts import MatrixBlock, MatrixLayout  # noqa: E402
from tablegen.triads import is_triad  # noqa: E402


def _sixj_matrix_blocks(lo: int, hi: int):
    """Blocks with (j1, j2, j4, j5) in the range; rows and columns complete (every j3, j6 the triads allow)."""
    js = range(lo, hi + 1)
    for j1 in js:
        for j2 in js:
            for j4 in js:
                for j5 in js:
                    every = range(0, 2 * hi + 1)
                    rows = tuple(j3 for j3 in every if is_triad(j1, j2, j3) and is_triad(j4, j5, j3))
                    cols = tuple(j6 for j6 in every if is_triad(j1, j5, j6) and is_triad(j4, j2, j6))
                    if rows and cols:
                        yield MatrixBlock(
                            (("j1", j1), ("j2", j2), ("j4", j4), ("j5", j5)), rows, cols,
                            lambda j3, j6, a=(j1, j2, j4, j5): (a[0], a[1], j3, a[2], a[3], j6),
                        )


SIXJ_MATRICES = Family(
    key="6jm",
    kind="6j",
    title="6j symbols as recoupling matrices",
    nav_label="6j matrices",
    layout=MatrixLayout(block=("j1", "j2", "j4", "j5"), row="j3", column="j6", blocks=_sixj_matrix_blocks),
    convention="Rows j3, columns j6 of {j1 j2 j3; j4 j5 j6}.",
)




# -- the slow marker: one list, so a fast local loop is `pytest -m "not slow"` ----------------------
# Whole modules that start a browser, run pdflatex/bibtex, rebuild the default site or fuzz the
# command line, and single tests that compare many values with sympy.  CI runs all of them.
import pytest  # noqa: E402

SLOW_MODULES = ("test_browser.py", "test_render_latex.py", "test_site.py", "test_cli_fuzz.py", "test_faults.py")
SLOW_TESTS = (
    "test_four_leaves_every_pair_every_order",
    "test_three_leaves_every_pair_every_order",
    "test_zero_leaves_every_pair_every_order",
    "test_ninej_fast_path_equals_three_sixj",
    "test_sympy_at_random_angles_30_digits",
    "test_orthonormal_on_the_sphere_30_digits",
    "test_every_sixj_up_to_3_matches_sympy",
    "test_random_ninej_match_sympy",
    "test_threej_orthogonality_for_all_j_up_to_5_2",
    "test_builds_ignore_hash_seed",
)


def pytest_collection_modifyitems(config, items):
    for item in items:
        name = item.name.split("[", 1)[0]
        if item.path.name in SLOW_MODULES or name in SLOW_TESTS:
            item.add_marker(pytest.mark.slow)

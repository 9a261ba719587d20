"""The documented limits of the command line and of recipes, as plain constants in one place.

* ``MAX_DIGITS``: significant digits of a decimal, for ``value --digits``
  (with ``--from`` and for d, D, Y too) and for a recipe's ``digits``
  (``build --digits``) alike.  The value types compute up to
  ``values.decimals.DECIMAL_MAX_DIGITS`` when called from Python.
* ``ENGINE_MAX_J``: no j above this is accepted anywhere, not even with
  ``--max-j`` or ``--allow-large``; the one-value limits of each kind
  (``Kind.max_j``, about a second per value) sit far below it.
* ``VALUE_LIMIT`` and ``TIME_LIMIT``: a build estimated above either is refused
  before computing unless ``--allow-large`` is given.
* ``MAX_JOBS``: the largest ``--jobs`` the command line takes (the build
  further caps it at the number of chunks and of CPUs).

Number literals (at most 40 characters, exponent at most 30) are checked in
:mod:`tablegen.spins`, which every reader of numbers uses.
"""

from __future__ import annotations

__all__ = ["MAX_DIGITS", "ENGINE_MAX_J", "VALUE_LIMIT", "TIME_LIMIT", "MAX_JOBS", "RECIPE_MAX_BYTES"]

MAX_DIGITS = 10_000
ENGINE_MAX_J = 1_000_000
VALUE_LIMIT = 1_500_000
TIME_LIMIT = 600  # seconds of estimated computing
MAX_JOBS = 256
RECIPE_MAX_BYTES = 1_000_000

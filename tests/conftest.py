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

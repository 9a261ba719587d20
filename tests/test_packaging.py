"""The wheel must carry every subpackage: pyproject lists packages explicitly (flat layout).

A subpackage missing from that list installs fine in editable mode and breaks a
non-editable install at import time, so the list is checked against the tree here
(common practice, no source).
"""

from __future__ import annotations

import tomllib
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent


def test_every_subpackage_is_listed_in_pyproject():
    listed = set(tomllib.loads((ROOT / "pyproject.toml").read_text())["tool"]["setuptools"]["packages"])
    on_disk = {
        ".".join(p.parent.relative_to(ROOT).parts)
        for p in (ROOT / "tablegen").rglob("__init__.py")
    }
    assert on_disk, "no package found under tablegen/"
    missing = sorted(on_disk - listed)
    assert not missing, f"pyproject.toml [tool.setuptools] packages lacks {missing}"
    assert "tablegen.templates" in listed


def test_every_template_is_covered_by_the_package_data_patterns():
    # setuptools ships a data file only if one of the glob patterns matches it
    patterns = tomllib.loads((ROOT / "pyproject.toml").read_text())["tool"]["setuptools"]["package-data"]["tablegen.templates"]
    files = [p.relative_to(ROOT / "templates") for p in (ROOT / "templates").rglob("*") if p.is_file()]
    assert files
    uncovered = [str(f) for f in files if not any(f.match(pat) and len(f.parts) == len(Path(pat).parts) for pat in patterns)]
    assert not uncovered, f"pyproject.toml package-data misses {uncovered}"

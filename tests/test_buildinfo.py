"""The citation texts: cite.bib names the release year, the version and the digest, and BibTeX reads it.

The BibTeX check runs the real ``bibtex`` (texlive) on a minimal document that
cites the entry; it is skipped with a reason when bibtex or pdflatex is
missing, and fails instead when CI is set.
"""

from __future__ import annotations

import os
import re
import shutil
import subprocess
from pathlib import Path

import pytest

from tablegen import RELEASE_YEAR, __version__
from tablegen.buildinfo import BuildMeta, bibtex, plain_citation

DIGEST = "0123456789abcdef" * 4
# every character that BibTeX or LaTeX treats specially, in the title a recipe gives
ODD_TITLE = "Tables {for} a 50% & #2 test_case with $x$ ~ ^"


def _meta(title: str = "Coupling tables for a two-shell exercise") -> BuildMeta:
    return BuildMeta("tablegen", __version__, DIGEST, 'title = "x"\n', title, (("cg", 12), ("6j", 3)))


def _field(entry: str, name: str) -> str:
    m = re.search(rf"^  {name} +=\s*\{{(.*)\}},?$", entry, re.M)
    assert m, f"no {name} field in\n{entry}"
    return m.group(1)


def test_entry_names_year_version_and_digest():
    entry = bibtex(_meta())
    assert entry.startswith(f"@misc{{tablegen-{DIGEST[:8]},")
    # the year is the tool's release year, a constant of the package: the same
    # recipe and version give the same bytes in any year (common practice, no source)
    assert _field(entry, "year") == str(RELEASE_YEAR)
    assert isinstance(RELEASE_YEAR, int) and 2020 <= RELEASE_YEAR <= 2100
    assert _field(entry, "version") == __version__
    assert __version__ in _field(entry, "howpublished")
    assert DIGEST in _field(entry, "note")
    assert bibtex(_meta()) == entry  # no clock, no state


def test_plain_citation_says_the_same():
    text = plain_citation(_meta())
    assert f"version {__version__} ({RELEASE_YEAR})" in text and DIGEST in text


def _tool(name: str) -> str:
    path = shutil.which(name)
    if path is None:
        reason = f"{name} not found: BibTeX check NOT run (install texlive-latex-recommended)"
        if os.environ.get("CI"):
            pytest.fail(reason)
        pytest.skip(reason)
    return path


def _run(cmd: list[str], cwd: Path) -> subprocess.CompletedProcess:
    return subprocess.run(cmd, cwd=cwd, capture_output=True, text=True, errors="replace", timeout=120,
                          env={**os.environ, "TEXMFVAR": str(cwd / "texmf-var")})


@pytest.mark.parametrize("style", ["plain", "unsrt", "alpha"])
def test_bibtex_reads_the_entry_without_warnings(tmp_path: Path, style: str):
    pdflatex, bibtex_cmd = _tool("pdflatex"), _tool("bibtex")
    meta = _meta(ODD_TITLE)
    (tmp_path / "cite.bib").write_text(bibtex(meta), encoding="utf-8")
    (tmp_path / "paper.tex").write_text(
        "\\documentclass{article}\n\\begin{document}\n"
        f"The values come from~\\cite{{{meta.citation_key}}}.\n"
        f"\\bibliographystyle{{{style}}}\n\\bibliography{{cite}}\n\\end{{document}}\n",
        encoding="utf-8",
    )
    first = _run([pdflatex, "-interaction=nonstopmode", "-halt-on-error", "paper.tex"], tmp_path)
    assert first.returncode == 0, first.stdout[-2000:]
    proc = _run([bibtex_cmd, "paper"], tmp_path)
    log = (tmp_path / "paper.blg").read_text(errors="replace")
    # bibtex exits 1 on warnings and 2 on errors (its documented status codes)
    assert proc.returncode == 0, proc.stdout + log
    assert "Warning" not in log and "error" not in log.lower(), log
    bbl = (tmp_path / "paper.bbl").read_text()
    assert "\\bibitem" in bbl and str(RELEASE_YEAR) in bbl and __version__ in bbl
    assert DIGEST in bbl.replace("\n", "").replace(" ", "")
    for _ in range(2):
        done = _run([pdflatex, "-interaction=nonstopmode", "-halt-on-error", "paper.tex"], tmp_path)
        assert done.returncode == 0, done.stdout[-2000:]
    assert not re.search(r"Citation .* undefined", done.stdout), done.stdout[-2000:]

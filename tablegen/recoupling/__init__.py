"""Recoupling between binary coupling trees: coefficients, the working, matrices, LS<->jj.

trees.py (notation, strict parser) -> paths.py (a short path of moves) ->
coefficient.py (exact sum along it, moves.py) -> matrix.py, working.py, lsjj.py.

The public functions below import their modules on first call, so that
``import tablegen`` (and a one-value lookup) stays as light as before.
"""

from __future__ import annotations

__all__ = ["recoupling", "recoupling_matrix", "recoupling_working", "lsjj_matrices",
           "RecouplingMatrix", "LsJjMatrix", "Working"]


def recoupling(tree1: str, tree2: str, **values):
    """<tree1|tree2> exactly, as a Surd: recoupling("((a b)e c)f", "(a (b c)g)f", a=1, ...)."""
    from .coefficient import recoupling as run

    return run(tree1, tree2, **values)


def recoupling_matrix(tree1: str, tree2: str, **values):
    """The exact orthogonal matrix <tree1|tree2> over all allowed intermediates (leaves and total given)."""
    from .matrix import recoupling_matrix as run

    return run(tree1, tree2, **values)


def recoupling_working(tree1: str, tree2: str, **values):
    """The formula of <tree1|tree2> (LaTeX and plain text) with its path of moves."""
    from .working import recoupling_working as run

    return run(tree1, tree2, **values)


def lsjj_matrices(l1: int, l2: int, *, equivalent: bool = False, order: str = "ls"):
    """Two-particle LS<->jj matrices, one per J, rows (j1, j2), columns ^{2S+1}L_J."""
    from .lsjj import lsjj_matrices as run

    return run(l1, l2, equivalent=equivalent, order=order)


_CLASSES = {"RecouplingMatrix": "matrix", "LsJjMatrix": "lsjj", "Working": "working"}


def __getattr__(name: str):
    if name in _CLASSES:
        from importlib import import_module

        return getattr(import_module(f"{__name__}.{_CLASSES[name]}"), name)
    raise AttributeError(f"module {__name__!r} has no attribute {name!r}")

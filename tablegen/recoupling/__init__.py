"""Recoupling between binary coupling trees: coefficients, the working, matrices, LS<->jj.

trees.py (notation, strict parser) -> paths.py (a short path of moves) ->
coefficient.py (exact sum along it, moves.py) -> matrix.py, working.py, lsjj.py.
"""

from .coefficient import recoupling
from .matrix import RecouplingMatrix, recoupling_matrix

__all__ = ["recoupling", "recoupling_matrix", "RecouplingMatrix"]

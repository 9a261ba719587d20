"""``tablegen lsjj L1 L2``: two-particle LS <-> jj matrices, one per total J.

Rows are the jj pairs (j1, j2), columns the term symbols ^{2S+1}L_J; the
engine is tablegen.recoupling.lsjj (the 9j, Edmonds 1957 eq. 6.4.2).  L1 and
L2 are whole numbers or the letters s p d f g h ...; --equivalent keeps the
Pauli-allowed states of l^2, --order sl couples each particle as (s l)j.
"""

from __future__ import annotations

from .common import CommandLineError, OneLineParser, options_first, print_json
from .recouple import grid

__all__ = ["run", "MAX_L"]

#: Largest orbital l without --allow-large (l1 + l2 + 2 matrices of at most 4 x 4 9j entries; about 1 s here).
MAX_L = 100


def _parser():
    parser = OneLineParser(
        prog="tablegen lsjj",
        description="The exact LS <-> jj transformation matrices <(l1 s1)j1, (l2 s2)j2; J | (l1 l2)L, (s1 s2)S; J> "
        "of two spin-1/2 particles with orbital L1 and L2 (whole numbers or the letters s p d f g ...), one "
        "matrix per J: rows (j1, j2), columns the term symbols 2S+1 L J.",
    )
    parser.add_argument("ls", nargs="*", metavar="L")
    parser.add_argument("--equivalent", action="store_true",
                        help="equivalent particles (l^2): Pauli-allowed terms and antisymmetric jj states only")
    parser.add_argument("--order", default="ls", choices=("ls", "sl"),
                        help="couple each particle as (l s)j (default) or (s l)j; they differ in sign")
    parser.add_argument("--J", dest="total", metavar="J", help="only this total J")
    parser.add_argument("--latex", action="store_true", help="also print each matrix as a LaTeX array")
    parser.add_argument("--json", action="store_true", help="print one JSON object instead of text")
    parser.add_argument("--allow-large", action="store_true", help=f"allow l above {MAX_L}")
    return parser


def read_l(text: str, argument: str) -> int:
    """An orbital l from '2' or a spectroscopic letter ('d'); QuantumNumberError otherwise."""
    from ..errors import QuantumNumberError
    from ..recoupling.lsjj import ORBITAL_LETTERS

    t = text.strip()
    if len(t) == 1 and t.isalpha() and t.upper() in ORBITAL_LETTERS:
        return ORBITAL_LETTERS.index(t.upper())
    if t.isdigit() and t.isascii():
        return int(t)
    raise QuantumNumberError(argument, text, f"an orbital l is a whole number >= 0 or one of the letters "
                                             f"{' '.join(ORBITAL_LETTERS.lower())}")


def run(tokens: list[str]) -> int:
    from ..errors import QuantumNumberError, TooLargeError
    from ..recoupling.lsjj import lsjj_matrices

    ns = _parser().parse_args(options_first(tokens, ("--order", "--J")))
    if len(ns.ls) != 2:
        raise CommandLineError(f"tablegen lsjj: needs 2 arguments (L1 L2), got {len(ns.ls)}")
    l1, l2 = read_l(ns.ls[0], "L1"), read_l(ns.ls[1], "L2")
    if max(l1, l2) > MAX_L and not ns.allow_large:
        raise TooLargeError("LS-jj matrices", f"l = {max(l1, l2)}: {l1 + l2 + 2} matrices of 9j entries",
                            f"refused above l = {MAX_L} (--allow-large to insist)")
    if ns.equivalent and l1 != l2:
        raise QuantumNumberError("L2", ns.ls[1], f"--equivalent needs L2 = L1 = {l1}")
    matrices = lsjj_matrices(l1, l2, equivalent=ns.equivalent, order=ns.order)
    if ns.total is not None:
        if not (ns.total.isdigit() and ns.total.isascii()):
            raise QuantumNumberError("--J", ns.total, "the total J of two spin-1/2 particles is a whole number >= 0")
        matrices = tuple(m for m in matrices if m.J == int(ns.total))
        if not matrices:
            raise QuantumNumberError("--J", ns.total, f"no state of this configuration has J = {ns.total}")
    name = _configuration(l1, l2, ns.equivalent)
    convention = matrices[0].convention() if matrices else ""
    if ns.json:
        print_json({
            "command": "lsjj",
            "l1": l1, "l2": l2, "configuration": name, "equivalent": ns.equivalent, "order": ns.order,
            "convention": convention,
            "matrices": [{
                "J": m.J,
                "rows": [[_half(a), _half(b)] for a, b in m.rows],
                "columns": list(m.column_labels()),
                "entries": [[str(v) for v in line] for line in m.entries],
                "latex": _latex(m) if ns.latex else None,
            } for m in matrices],
        })
        return 0
    print(f"LS <-> jj, configuration {name} (l1 = {l1}, l2 = {l2}): {convention}")
    for m in matrices:
        print(f"J = {m.J}")
        print(grid(list(m.row_labels()), list(m.column_labels()), [[str(v) for v in line] for line in m.entries]))
        if ns.latex:
            print(_latex(m))
    return 0


def _configuration(l1: int, l2: int, equivalent: bool) -> str:
    """'p2' for equivalent particles, 'sp' or "pp'" otherwise (letters as in the term symbols)."""
    from ..recoupling.lsjj import ORBITAL_LETTERS

    def letter(l: int) -> str:
        return ORBITAL_LETTERS[l].lower()

    if max(l1, l2) >= len(ORBITAL_LETTERS):  # beyond the letters: the numbers say it
        return f"l{l1}{'^2' if equivalent else f' l{l2}'}"
    if equivalent:
        return f"{letter(l1)}2"
    return letter(l1) + letter(l2) + ("'" if l1 == l2 else "")


def _latex(m) -> str:
    head = " & ".join([""] + list(m.column_labels(latex=True)))
    body = [" & ".join([f"({_half(a)},{_half(b)})"] + [v.latex() for v in line]) for (a, b), line in zip(m.rows, m.entries)]
    return (f"\\begin{{array}}{{c|{'c' * len(m.columns)}}}\n{head} \\\\ \\hline\n" + " \\\\\n".join(body)
            + "\n\\end{array}")


def _half(t: int) -> str:
    from ..spins import half_text

    return half_text(t)

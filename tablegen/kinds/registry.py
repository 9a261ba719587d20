"""The explicit list of kinds, in the order they appear everywhere (values.txt, data, pages)."""

from __future__ import annotations

from .. import coefficients as _c
from .. import symmetry as _s
from . import Kind, Notation, ZeroRule


def _zero_rule(key: str):
    def rule(t: tuple[int, ...]) -> ZeroRule | None:
        text = _c.why_zero_doubled(key, tuple(t))
        if text is None:
            return None
        rid, _, body = text.partition(": ")
        return ZeroRule(rid, body)

    return rule


def _parser(key: str):
    def parse(values, max_j=None) -> tuple[int, ...]:
        return _c.parse_arguments(key, tuple(values), max_j)

    return parse


CG = Kind(
    key="cg",
    title="Clebsch–Gordan coefficient",
    arguments=("j1", "m1", "j2", "m2", "J", "M"),
    j_positions=(0, 2, 4),
    parse=_parser("cg"),
    doubled=_c.cg2,
    zero_rule=_zero_rule("cg"),
    notation=Notation("braket", ((0, 1), (2, 3), (4, 5))),
)
THREEJ = Kind(
    key="3j",
    title="Wigner 3j symbol",
    arguments=("j1", "j2", "j3", "m1", "m2", "m3"),
    j_positions=(0, 1, 2),
    parse=_parser("3j"),
    doubled=_c.threej2,
    zero_rule=_zero_rule("3j"),
    notation=Notation("array", ((0, 1, 2), (3, 4, 5)), "()"),
    members=_s.threej_members,
)
SIXJ = Kind(
    key="6j",
    title="Wigner 6j symbol",
    arguments=("j1", "j2", "j3", "j4", "j5", "j6"),
    j_positions=(0, 1, 2, 3, 4, 5),
    parse=_parser("6j"),
    doubled=_c.sixj2,
    zero_rule=_zero_rule("6j"),
    notation=Notation("array", ((0, 1, 2), (3, 4, 5)), "{}"),
    members=_s.sixj_members,
)
RACAH_W = Kind(
    key="w",
    title="Racah W coefficient",
    arguments=("a", "b", "c", "d", "e", "f"),
    j_positions=(0, 1, 2, 3, 4, 5),
    parse=_parser("w"),
    doubled=_c.racah_w2,
    zero_rule=_zero_rule("w"),
    notation=Notation("function", ((0, 1, 2, 3), (4, 5)), name="W"),
)
NINEJ = Kind(
    key="9j",
    title="Wigner 9j symbol",
    arguments=("j11", "j12", "j13", "j21", "j22", "j23", "j31", "j32", "j33"),
    j_positions=tuple(range(9)),
    parse=_parser("9j"),
    doubled=_c.ninej2,
    zero_rule=_zero_rule("9j"),
    notation=Notation("array", ((0, 1, 2), (3, 4, 5), (6, 7, 8)), "{}"),
    members=_s.ninej_members,
)

KINDS: tuple[Kind, ...] = (CG, THREEJ, SIXJ, RACAH_W, NINEJ)

"""Rules of the coupling algebra, each written once: the triad and the 6j sums.

Doubled arguments (2j) throughout; no dependencies, so every layer (engine,
symmetry, plan, recipe) imports this cheaply.
"""

from __future__ import annotations

__all__ = ["is_triad", "triad_failure", "sixj_sums", "sixj_triad_sums", "sixj_quadrangle_sums"]


def is_triad(ta: int, tb: int, tc: int) -> bool:
    """True when j_a, j_b, j_c can couple: the triangle rule and an integer sum j_a + j_b + j_c."""
    return not (ta + tb + tc) & 1 and abs(ta - tb) <= tc <= ta + tb


def triad_failure(ta: int, tb: int, tc: int) -> "str | None":
    """Which half of the triad rule fails: "triad-sum", "triangle", or None when it holds."""
    if (ta + tb + tc) & 1:
        return "triad-sum"
    if not abs(ta - tb) <= tc <= ta + tb:
        return "triangle"
    return None


def sixj_sums(ta: int, tb: int, tc: int, td: int, te: int, tf: int) -> tuple[int, int, int, int, int, int, int]:
    """The 6j's doubled sums, flat for the hot path: the four triad sums, then the three quadrangle sums.

    Triads (a b c), (a e f), (d b f), (d e c) of {a b c; d e f}; quadrangles
    a+b+d+e, a+c+d+f, b+c+e+f.  Every triangle inequality of the four triads reads beta_j - alpha_i >= 0 for
    some triad sum alpha_i and quadrangle sum beta_j (Edmonds 1957, eq. 6.3.7):
    with integer triad sums, min(beta) >= max(alpha) is the whole triad rule.
    """
    return (
        ta + tb + tc, ta + te + tf, td + tb + tf, td + te + tc,
        ta + tb + td + te, ta + tc + td + tf, tb + tc + te + tf,
    )


def sixj_triad_sums(ta: int, tb: int, tc: int, td: int, te: int, tf: int) -> tuple[int, ...]:
    """Doubled sums of the four triads (a b c), (a e f), (d b f), (d e c) of {a b c; d e f}."""
    return sixj_sums(ta, tb, tc, td, te, tf)[:4]


def sixj_quadrangle_sums(ta: int, tb: int, tc: int, td: int, te: int, tf: int) -> tuple[int, ...]:
    """Doubled quadrangle sums a+b+d+e, a+c+d+f, b+c+e+f of {a b c; d e f}."""
    return sixj_sums(ta, tb, tc, td, te, tf)[4:]

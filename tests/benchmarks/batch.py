"""Batch answers (``tablegen value --from FILE``): values per second, against references in the same run.

    python3 tests/benchmarks/batch.py              # 100,000 lines, every j <= 10
    python3 tests/benchmarks/batch.py --lines 20000 --seed 7

Writes a seeded file of random lines (each of the five kinds equally often,
every j <= 10) and answers it in-process exactly as the command does (CSV,
15 digits), with the engine's value caches cleared first.  Two mixes:

* "allowed": every triad of every symbol holds and every |m| <= j, so almost
  every line is a real computation (the hard case);
* "uniform": quantum numbers drawn uniformly (j - m whole), so many lines are
  zero by a selection rule, as in a file swept over ranges.

References, measured in the same run on the same lines:

* "read+write": decode, split and write each line's tokens as a CSV row, the
  least any batch answerer must do;
* "engine": the kinds' functions alone on pre-parsed doubled arguments (cold
  caches), no text at all.

The target is >= 50,000 values per second for j <= 10.  Each timing is
repeated (--repeat) and the fastest run counts; the ratios matter more than
the rates on a shared machine.  Not a test: nothing is asserted, rates and
ratios are printed.
"""

from __future__ import annotations

import argparse
import csv
import io
import random
import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[2]))

from tablegen import batch  # noqa: E402
from tablegen.kinds import KINDS, ninej as k9, sixj as k6, threej as k3  # noqa: E402
from tablegen.kinds.sixj import w_of_sixj  # noqa: E402
from tablegen.spins import half_text  # noqa: E402

TOP = 20  # doubled: every j <= 10
TARGET = 50_000


def clear_caches() -> None:
    k3._threej_square_cached.cache_clear()
    k6._sixj_value_cached.cache_clear()
    k9._ninej_square.cache_clear()
    k9._racah_part_cached.cache_clear()


# -- random symbols (doubled arguments) ------------------------------------------------------
def _third(rng: random.Random, a: int, b: int) -> int | None:
    """A random c with (a b c) a triad and c <= TOP, or None."""
    lo, hi = abs(a - b), min(a + b, TOP)
    return rng.randrange(lo, hi + 1, 2) if lo <= hi else None


def _m(rng: random.Random, tj: int) -> int:
    return rng.randrange(-tj, tj + 1, 2)


def _allowed(rng: random.Random, key: str) -> tuple[int, ...]:
    while True:
        if key in ("cg", "3j"):
            a, b = rng.randint(0, TOP), rng.randint(0, TOP)
            c = _third(rng, a, b)
            if c is None:
                continue
            ma, mb = _m(rng, a), _m(rng, b)
            if abs(ma + mb) > c:
                continue
            return (a, ma, b, mb, c, ma + mb) if key == "cg" else (a, b, c, ma, mb, -ma - mb)
        if key in ("6j", "w"):
            a, b, d, e = (rng.randint(0, TOP) for _ in range(4))
            c = _third(rng, a, b)
            if c is None or not (abs(d - e) <= c <= d + e and (c + d + e) % 2 == 0):
                continue
            lo, hi = max(abs(a - e), abs(d - b)), min(a + e, d + b, TOP)
            fs = [f for f in range(lo, hi + 1, 2) if (a + e + f) % 2 == 0 and (d + b + f) % 2 == 0]
            if not fs:
                continue
            six = (a, b, c, d, e, rng.choice(fs))
            return six if key == "6j" else w_of_sixj(six)[0]
        j11, j12, j21, j22 = (rng.randint(0, TOP) for _ in range(4))
        j13, j23, j31, j32 = _third(rng, j11, j12), _third(rng, j21, j22), _third(rng, j11, j21), _third(rng, j12, j22)
        if None in (j13, j23, j31, j32):
            continue
        lo, hi = max(abs(j13 - j23), abs(j31 - j32)), min(j13 + j23, j31 + j32, TOP)
        xs = [x for x in range(lo, hi + 1, 2) if (x + j13 + j23) % 2 == 0 and (x + j31 + j32) % 2 == 0]
        if xs:
            return (j11, j12, j13, j21, j22, j23, j31, j32, rng.choice(xs))


def _uniform(rng: random.Random, key: str) -> tuple[int, ...]:
    k = next(k for k in KINDS if k.key == key)
    t = [0] * len(k.arguments)
    for i in k.j_positions:
        t[i] = rng.randint(0, TOP)
    js = list(k.j_positions)
    for i in range(len(t)):
        if i not in k.j_positions:  # an m, paired with the j of its column or group
            tj = t[js[[p for p in range(len(t)) if p not in k.j_positions].index(i)]]
            t[i] = _m(rng, tj)
    return tuple(t)


def make_lines(n: int, seed: int, mix: str) -> list[bytes]:
    rng = random.Random(seed)
    draw = _allowed if mix == "allowed" else _uniform
    keys = [k.key for k in KINDS]
    lines = []
    for _ in range(n):
        key = rng.choice(keys)
        lines.append(f"{key} {' '.join(half_text(x) for x in draw(rng, key))}\n".encode())
    return lines


# -- timings -----------------------------------------------------------------------------------
def time_batch(lines: list[bytes]) -> tuple[float, int, int]:
    clear_caches()
    out = io.StringIO()
    bad: list[tuple[int, str]] = []
    start = time.perf_counter()
    answered, n_bad = batch.answer_stream(iter(lines), out, lambda n, m: bad.append((n, m)))
    seconds = time.perf_counter() - start
    assert not bad, bad[:3]  # the generator writes only good lines
    zeros = out.getvalue().count(",0,0,0,")
    return seconds, answered, zeros


def time_read_write(lines: list[bytes]) -> float:
    out = io.StringIO()
    writer = csv.writer(out, lineterminator="\n")
    start = time.perf_counter()
    for n, raw in enumerate(lines, 1):
        writer.writerow((n, *raw.decode("utf-8").split()))
    return time.perf_counter() - start


def time_engine(lines: list[bytes]) -> float:
    by_key = {k.key: k for k in KINDS}
    work = []
    for raw in lines:
        key, *args = raw.decode().split()
        k = by_key[key]
        work.append((k.doubled, k.parse(args, None)))
    clear_caches()
    start = time.perf_counter()
    for f, t in work:
        f(*t)
    return time.perf_counter() - start


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--lines", type=int, default=100_000)
    parser.add_argument("--seed", type=int, default=2026)
    parser.add_argument("--repeat", type=int, default=3, help="runs of each timing; the fastest counts")
    ns = parser.parse_args()
    print(f"batch answers: {ns.lines:,} lines per mix, every j <= 10, seed {ns.seed}, CSV, 15 digits, "
          f"best of {ns.repeat} (interleaved, so a busy machine slows batch and references alike)")
    for mix in ("allowed", "uniform"):
        lines = make_lines(ns.lines, ns.seed, mix)
        runs = []
        for _ in range(ns.repeat):
            runs.append((time_batch(lines), time_read_write(lines), time_engine(lines)))
        (seconds, answered, zeros) = min(r[0] for r in runs)
        rw = min(r[1] for r in runs)
        engine = min(r[2] for r in runs)
        rate = answered / seconds
        verdict = "PASS" if rate >= TARGET else "MISS"
        print(f"\n[{mix}] {answered:,} values ({zeros:,} zero) in {seconds:.2f} s: "
              f"{rate:,.0f} values/s (target {TARGET:,}: {verdict})")
        print(f"  reference read+write  {rw:.2f} s  ({ns.lines / rw:,.0f} lines/s); batch / reference = {seconds / rw:.1f}")
        print(f"  reference engine      {engine:.2f} s  ({ns.lines / engine:,.0f} values/s); batch / reference = {seconds / engine:.2f}")


if __name__ == "__main__":
    main()

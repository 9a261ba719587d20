"""``tablegen recouple TREE1 TREE2 NAME=VALUE ...``: a recoupling coefficient or matrix.

One value <tree1|tree2> with every leaf, intermediate and total given (exact,
decimal, --latex, --working); with --matrix the leaves and total only, and
the whole orthogonal matrix over the allowed intermediates, rows labelled by
tree 1's intermediates and columns by tree 2's.  The engine is
tablegen.recoupling; this module reads the command line, guards the size
before computing, and lays the answer out.
"""

from __future__ import annotations

from .common import CommandLineError, OneLineParser, check_digits_option, field, options_first, print_json

__all__ = ["run", "dimension", "grid", "work_estimate", "MAX_MATRIX_ENTRIES", "MAX_WORK"]

#: Largest matrix computed without --allow-large (each entry is a sum along a path of moves).
MAX_MATRIX_ENTRIES = 10_000
#: Largest estimated work for one coefficient without --allow-large (see work_estimate;
#: about a second here: a 9j at j = 200, or a 5-leaf sum at j = 40).
MAX_WORK = 1_000_000

CONVENTION = ("<tree1|tree2> is the overlap of the two coupled states; each node (x y)z couples with the "
              "Clebsch-Gordan coefficient <x mx; y my | z mz> (Condon-Shortley phase), so exchanging the "
              "two parts of a node costs (-1)^(x+y-z)")


def _parser():
    parser = OneLineParser(
        prog="tablegen recouple",
        description="The exact recoupling coefficient <TREE1|TREE2> between two binary coupling trees over "
        "the same leaves, e.g. tablegen recouple '((a b)e c)f' '(a (b c)g)f' a=1 b=1/2 c=1 e=3/2 g=1/2 f=5/2. "
        "A node is '(' part part ')' followed by the name of the value they couple to; values are NAME=VALUE. "
        "With --matrix give only the leaves and the total: the whole matrix over the allowed intermediates. "
        f"Convention: {CONVENTION}.",
    )
    parser.add_argument("items", nargs="*", metavar="TREE1 TREE2 NAME=VALUE")
    parser.add_argument("--digits", type=int, default=15, help="significant digits of the decimal (default 15)")
    parser.add_argument("--latex", action="store_true", help="also print LaTeX (value, working, matrix)")
    parser.add_argument("--working", action="store_true", help="show the formula and the path of moves")
    parser.add_argument("--matrix", action="store_true", help="the whole matrix over the intermediates")
    parser.add_argument("--json", action="store_true", help="print one JSON object instead of text")
    parser.add_argument("--allow-large", action="store_true", help="compute even above the size guard")
    return parser


def read_items(items: list[str]) -> tuple[list[str], dict[str, str]]:
    """(trees, {name: value text}) from the positional words; one-line errors for malformed ones."""
    trees: list[str] = []
    values: dict[str, str] = {}
    for item in items:
        if "=" not in item:
            trees.append(item)
            continue
        name, _, text = item.partition("=")
        name = name.strip()
        if not name.isidentifier() or not name.isascii():
            raise CommandLineError(f"tablegen recouple: argument {item!r}: a value is written NAME=VALUE with NAME "
                                   "a name from the trees, such as e=3/2")
        if name in values:
            raise CommandLineError(f"tablegen recouple: argument {name} = {text!r}: {name} is given twice")
        values[name] = text
    if len(trees) != 2:
        raise CommandLineError(f"tablegen recouple: needs exactly two trees (quote each, e.g. '((a b)e c)f'), "
                               f"got {len(trees)}")
    return trees, values


def run(tokens: list[str]) -> int:
    """Print one coefficient or matrix; return the exit status (errors are raised)."""
    ns = _parser().parse_args(options_first(tokens, ("--digits",)))
    check_digits_option(ns.digits)
    (tree1, tree2), values = read_items(ns.items)
    if ns.matrix:
        if ns.working:
            raise CommandLineError("tablegen recouple: argument --working: not with --matrix (ask for one entry)")
        return _run_matrix(tree1, tree2, values, ns)
    return _run_value(tree1, tree2, values, ns)


# -- one coefficient -----------------------------------------------------------------
def _run_value(tree1: str, tree2: str, values: dict[str, str], ns) -> int:
    from ..errors import QuantumNumberError
    from ..recoupling.coefficient import evaluate, pair_of, tree_allowed
    from ..recoupling.paths import plan_path
    from ..recoupling.trees import bind_values

    pair = pair_of(tree1, tree2)
    try:
        tj = bind_values(pair, values)
    except QuantumNumberError as exc:
        if exc.value == "(missing)" and exc.argument not in pair.leaf_names():
            raise QuantumNumberError(exc.argument, exc.value, exc.rule + " (or give --matrix for the whole matrix)") from None
        raise
    plan = plan_path(pair)
    if tree_allowed(pair, tj):
        _guard_sum(plan, tj, ns.allow_large)
        value = evaluate(plan, tj)
    else:
        from ..values.surd import Surd

        value = Surd(0)
    rule = None if value else _zero_rule(pair, plan, tj)
    record = {
        "command": "recouple",
        "tree1": tree1,
        "tree2": tree2,
        "values": {name: _half(tj[name]) for name in pair.names()},
        "exact": str(value),
        "square": str(value.squared()),
        "decimal": value.decimal(ns.digits),
        "digits": ns.digits,
        "zero_rule": rule,
        "convention": CONVENTION,
    }
    if ns.latex:
        record["latex"] = {"root": value.latex("root"), "rational": value.latex("rational")}
    if ns.working:
        from ..recoupling.working import render

        w = render(plan, value)
        record["working"] = {"text": w.text, "latex": w.latex, "path": list(w.path), "path_latex": list(w.path_latex)}
    if ns.json:
        print_json(record)
        return 0
    print(f"<{tree1}|{tree2}>  " + " ".join(f"{k}={v}" for k, v in record["values"].items()))
    print(field("exact", record["exact"]))
    print(field("decimal", record["decimal"]))
    if rule:
        print(field("zero by", rule))
    if ns.latex:
        print(field("latex", record["latex"]["root"]))
        print(field("latex", record["latex"]["rational"] + "  (rationalised)"))
    if ns.working:
        w = record["working"]
        print(field("working", w["text"]))
        for line in w["path"]:
            print(field("path", line))
        if ns.latex:
            print(field("latex", w["latex"]))
            for line in w["path_latex"]:
                print(field("path", line))
    print(field("convention", CONVENTION))
    return 0


def _zero_rule(pair, plan, tj: dict[str, int]) -> str:
    """Which rule makes <tree1|tree2> zero: a coupling that cannot exist, two names of one coupling, or none."""
    from ..kinds.common import triad_zero
    from ..recoupling.trees import nodes

    for which, tree in (("tree 1", pair.first), ("tree 2", pair.second)):
        for n in nodes(tree):
            rule = triad_zero(tj[n.left.name], tj[n.right.name], tj[n.name], f"{n.left.name}, {n.right.name}, {n.name}")
            if rule is not None:
                return f"{rule} ({which})"
    for a, b in plan.deltas:
        if tj[a] != tj[b]:
            return (f"delta: {a} = {_half(tj[a])} and {b} = {_half(tj[b])} name the same coupling "
                    f"(of the same leaves), so they must be equal")
    return "cancellation: the sum over the intermediates cancels (no selection rule)"


def work_estimate(plan, tj: dict[str, int]) -> tuple[int, int]:
    """(work units, terms) of evaluating a plan: before computing, from the triangle bounds.

    A unit is one term of a 6j sum; a 6j of largest j costs j + 1 units, a 9j (j + 1)^3 / 8
    (its sum over 6j products, measured here), each times the summed values alive at that step.
    """
    bound = dict(tj)
    alive: dict[str, int] = {}
    work, terms = 0, 1
    for step in plan.steps:
        if step.kind == "exchange":
            continue
        choices = 1
        for name, ranges in step.created:
            if name in tj:
                continue
            bound[name] = min(bound[x] + bound[y] for x, y in ranges)
            count = min(min(bound[x], bound[y]) for x, y in ranges) + 1
            alive[name] = count
            choices *= count
        terms = max(terms, _product(alive.values()))
        j = max(bound[a] for a in step.args) // 2 + 1
        work += _product(alive.values()) * (j if step.kind == "reassociate" else j ** 3 // 8)
        for name in step.destroyed:
            alive.pop(name, None)
    return work, terms


def _product(values) -> int:
    out = 1
    for v in values:
        out *= v
    return out


def _guard_sum(plan, tj: dict[str, int], allow_large: bool) -> None:
    """Refuse, before computing, a coefficient whose nested sums are out of reach."""
    work, terms = work_estimate(plan, tj)
    if work > MAX_WORK and not allow_large:
        from ..errors import TooLargeError

        summed = f", up to {terms:,} terms in the sum over {', '.join(plan.summed)}" if plan.summed else ""
        raise TooLargeError("recoupling coefficient", f"about {work:,} work units{summed}",
                            f"refused above {MAX_WORK:,} (--allow-large to insist)")


# -- the whole matrix ------------------------------------------------------------------
def dimension(leaf_tjs: list[int], total_tj: int) -> int:
    """How many times the total J occurs in the product of the leaves: the matrix size.

    N(K) counts product states with sum of (j - m) = K (a convolution of boxes, by prefix
    sums); the multiplicity of J is N(K0) - N(K0 - 1) with K0 = sum j - J (common practice, no source).
    """
    s = sum(leaf_tjs)
    if (s - total_tj) & 1 or total_tj > s:
        return 0
    k0 = (s - total_tj) // 2
    counts = [1]
    for tj in leaf_tjs:
        prefix = [0]
        for c in counts:
            prefix.append(prefix[-1] + c)
        size = len(counts) + tj
        counts = [prefix[min(k, len(counts) - 1) + 1] - prefix[max(0, k - tj)] for k in range(size)]
    below = counts[k0 - 1] if k0 >= 1 else 0
    return counts[k0] - below


def _run_matrix(tree1: str, tree2: str, values: dict[str, str], ns) -> int:
    from ..errors import TooLargeError
    from ..recoupling.coefficient import pair_of
    from ..recoupling.matrix import label_text, recoupling_matrix
    from ..spins import parse_j

    pair = pair_of(tree1, tree2)
    for name in pair.leaf_names() + (pair.first.name,):
        if name in values:
            parse_j(values[name], name)
    leaves = [parse_j(values[n], n) for n in pair.leaf_names() if n in values]
    total = next((n for n in (pair.first.name, pair.second.name) if n in values), None)
    if len(leaves) == len(pair.leaf_names()) and total is not None:
        n = dimension(leaves, parse_j(values[total], total))
        if n * n > MAX_MATRIX_ENTRIES and not ns.allow_large:
            raise TooLargeError("recoupling matrix", f"{n} x {n} = {n * n:,} entries",
                                f"refused above {MAX_MATRIX_ENTRIES:,} entries (--allow-large to insist)")
    m = recoupling_matrix(tree1, tree2, **values)  # names any missing or misplaced value
    rows = [label_text(r) for r in m.rows]
    cols = [label_text(c) for c in m.columns]
    cells = [[str(v) for v in line] for line in m.entries]
    orthogonal = m.is_orthogonal()
    fixed = " ".join(f"{k}={_half(v)}" for k, v in m.fixed)
    if ns.json:
        print_json({
            "command": "recouple-matrix",
            "tree1": tree1,
            "tree2": tree2,
            "values": {k: _half(v) for k, v in m.fixed},
            "rows": [{k: _half(v) for k, v in r} for r in m.rows],
            "columns": [{k: _half(v) for k, v in c} for c in m.columns],
            "entries": cells,
            "decimals": [[v.decimal(ns.digits) for v in line] for line in m.entries],
            "digits": ns.digits,
            "orthogonal": orthogonal,
            "latex": _matrix_latex(m, rows, cols) if ns.latex else None,
            "convention": CONVENTION,
        })
        return 0
    print(f"<{tree1}|{tree2}>  {fixed}")
    print(f"  rows: {' '.join(pair.intermediate_names(1)) or '(none)'} (tree 1); "
          f"columns: {' '.join(pair.intermediate_names(2)) or '(none)'} (tree 2); "
          f"{len(rows)} x {len(cols)}, {'orthogonal (checked exactly)' if orthogonal else 'NOT orthogonal'}")
    if rows and cols:
        print(grid(rows, cols, cells))
    else:
        print("  (empty: the total cannot be reached from these leaves)")
    if ns.latex:
        print(_matrix_latex(m, rows, cols))
    print(field("convention", CONVENTION))
    return 0


def grid(rows: list[str], cols: list[str], cells: list[list[str]]) -> str:
    """Rows and columns labelled, every column as wide as its widest cell, entries right-aligned."""
    left = max(len(r) for r in rows)
    widths = [max(len(c), *(len(line[k]) for line in cells)) for k, c in enumerate(cols)]
    lines = ["  " + " " * left + "  " + "  ".join(c.rjust(w) for c, w in zip(cols, widths))]
    for r, line in zip(rows, cells):
        lines.append("  " + r.ljust(left) + "  " + "  ".join(v.rjust(w) for v, w in zip(line, widths)))
    return "\n".join(lines)


def _matrix_latex(m, rows: list[str], cols: list[str]) -> str:
    """An array with the labels as its first row and column (amsmath not needed)."""
    head = " & ".join([""] + [f"\\text{{{c}}}" for c in cols])
    body = [" & ".join([f"\\text{{{r}}}"] + [v.latex() for v in line]) for r, line in zip(rows, m.entries)]
    spec = "c|" + "c" * len(cols)
    return f"\\begin{{array}}{{{spec}}}\n{head} \\\\ \\hline\n" + " \\\\\n".join(body) + "\n\\end{array}"


def _half(t: int) -> str:
    from ..spins import half_text

    return half_text(t)

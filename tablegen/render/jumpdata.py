"""What the jump box (templates/html/site.js) must know, made from the records.

The page script finds a typed symbol offline, from disk, so it cannot ask the
generator anything: every name, path and anchor pattern it uses is written into
one small script file, ``assets/data.js`` (``window.tablegenData = {...};``), that
every page loads with ``<script src>`` before site.js (a page opened from disk
may load a script but cannot fetch a file), made here from the Kind and Family
records.  The script keeps only parsing, the
selection-rule checks on these lists and the symmetry algorithms a classes
layout needs (named by the kind's ``members`` function).
"""

from __future__ import annotations

import json

from ..families import Family, named_symbol
from ..kinds import Kind, kind
from ..kinds.common import TRIAD_TEXT
from ..sitemodel import SitePlan

__all__ = ["jump_data", "jump_json", "jump_script", "mapping_as_data"]


def mapping_as_data(mapping, size: int) -> dict:
    """A companion mapping (family arguments -> (companion arguments, sign)) as a permutation and a phase.

    ``order[k]`` is the family argument at companion position k; the sign is
    (-1)^(sum of the family arguments at ``phase``, halved).  Read off the
    mapping itself by probing, so the one Python function stays the only
    statement of the rule; tests/test_families.py checks the data reproduces it.
    """
    order, _ = mapping(tuple(range(size)))
    phase = [i for i in range(size) if mapping(tuple(2 if k == i else 0 for k in range(size)))[1] < 0]
    return {"order": list(order), "phase": phase}


def _shape(k: Kind) -> dict:
    n = k.notation
    if n.style == "braket":
        start, seps, end = "⟨", ["; "] * (len(n.groups) - 2) + [" | "], "⟩"
    elif n.style == "function":
        start, seps, end = f"{n.name}(", ["; "] * (len(n.groups) - 1), ")"
    else:
        start, seps, end = n.brackets[0], ["; "] * (len(n.groups) - 1), n.brackets[1]
    return {"open": start, "seps": seps, "close": end, "groups": [list(g) for g in n.groups]}


def _kind(k: Kind, fam: Family, mapping) -> dict:
    s = k.selection
    return {
        "key": k.key,
        "label": f"{k.title} {named_symbol(k)}",
        "family": fam.key,
        "names": list(k.arguments),
        "js": list(k.j_positions),
        "pairs": [list(p) for p in s.projections],
        "msum": list(s.m_sum),
        "triads": [list(t) for t in s.triads],
        "map": None if mapping is None else mapping_as_data(mapping, len(k.arguments)),
        **_shape(k),
    }


def _family(fam: Family, plan: SitePlan) -> dict:
    f = plan.recipe.family(fam.key)
    layout = fam.layout
    out = {
        "layout": layout.name,
        "kind": fam.kind,
        "title": fam.title,
        "range": [f.min_tj, f.max_tj],
    }
    if hasattr(layout, "page_pattern"):
        out["page"] = layout.page_pattern(fam.key)
    if layout.name == "classes":
        out["members"] = fam.kind_record.members.__name__  # every symmetry: finds a form in range
        out["filed"] = layout.filed_by.__name__  # the ordinary symmetries: the row a symbol is filed under
        out["pages"] = layout.page_firsts(plan.tables_of(fam.key))  # [path, first canonical form] in order
    else:
        out["anchor"] = layout.anchor_pattern()
        out["params"] = list(layout.params)
        if getattr(layout, "page_params", 1) > 1:  # pages named by several parameters: not every name is a page
            out["paths"] = sorted(t.page for t in plan.tables_of(fam.key))
        exchange = getattr(layout, "exchange", None)
        if exchange is not None:  # a form filed under another (LS-jj: l1 > l2 under l1 < l2)
            out["exchange"] = {"when": list(exchange.when), "pairs": [list(p) for p in exchange.pairs],
                               "phase": list(exchange.phase), "constant": exchange.constant}
    if hasattr(layout, "split"):  # grid: pairs too large for one page have a page per third j
        pairs = sorted({(t.param("j1"), t.param("j2")) for t in plan.tables_of(fam.key)})
        split = [f"{a},{b}" for a, b in pairs if layout.split(a, b)]
        if split:
            out["split"] = split
            out["splitPage"] = layout.split_pattern(fam.key)
    return out


def jump_data(plan: SitePlan) -> dict:
    """Kinds (in select order: each family's kind, then its companions) and families of the build.

    Each kind entry has an ``id``, its key, or "key@family" when an earlier
    family already shows that kind (two families may tabulate one kind).
    """
    kinds = []
    for fam in plan.families:
        kinds.append(_kind(fam.kind_record, fam, None))
        for c in fam.companions:
            kinds.append(_kind(kind(c.kind), fam, c.mapping))
    seen: set[str] = set()
    for entry in kinds:
        entry["id"] = entry["key"] if entry["key"] not in seen else f"{entry['key']}@{entry['family']}"
        seen.add(entry["key"])
    return {
        "kinds": kinds,
        "families": {fam.key: _family(fam, plan) for fam in plan.families},
        "texts": TRIAD_TEXT,
    }


def jump_json(plan: SitePlan) -> str:
    """The JSON block's text, safe inside <script> (no '</' can close it early)."""
    text = json.dumps(jump_data(plan), ensure_ascii=False, sort_keys=True, separators=(",", ":"))
    return text.replace("</", "<\\/")


def jump_script(plan: SitePlan) -> bytes:
    """assets/data.js: the jump data as one global, written once per build instead of into every page."""
    return ("window.tablegenData = " + jump_json(plan) + ";\n").encode("utf-8")

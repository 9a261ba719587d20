"""The classes layout: symbols filed as a printed table files them, by their own leading arguments.

Every symbol with all its j in the range and every triad of its kind allowed
is enumerated, and grouped into classes by the layout's ``filed_by`` function:
the ordinary symmetries of the symbol (tetrahedral for a 6j; row and column
permutations and the transpose for a 9j), not the Regge symmetries, so that
a symbol as printed in a paper is found under its own numbers.  The class's
canonical form is its largest form; a page holds the classes with one first
entry, in sections by the second entry (the classical order: largest j first).
A page with more than ``page_rows`` classes is split into numbered parts.

Regge partners (the other ordinary classes with the same value, from the
kind's ``members``) are linked when they lie in the range and counted apart
when they do not; a symbol is never filed under a partner.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import TYPE_CHECKING, Callable, Iterator

from ..sitemodel import Entry, Link, Page, Section, Table, chain, half, half_for_file_name, table_files
from ..triads import is_triad

if TYPE_CHECKING:  # pragma: no cover
    from ..families import Family
    from ..kinds import Kind
    from ..recipe import FamilyRange

__all__ = ["ClassesLayout", "EnumerationBudget", "symbols_in_range"]

_WHERE: dict = {}  # (family key, min_tj, max_tj) -> {canonical form: page path}; see ClassesLayout._where


class EnumerationBudget(Exception):
    """An enumeration needed more loop steps than its budget allowed."""


def symbols_in_range(k: "Kind", min_tj: int, max_tj: int, budget: "int | None" = None) -> Iterator[tuple[int, ...]]:
    """Every symbol of kind ``k`` with each j in [min_tj, max_tj] and every triad allowed, in order.

    A triad is checked as soon as its last argument is chosen, which prunes the
    search as early as the written-out loops it replaces.  With a ``budget``,
    EnumerationBudget is raised after that many loop steps, so that a size
    estimate over a wide range costs no more than one over a narrow range.
    """
    n = len(k.arguments)
    due: list[list[tuple[int, int, int]]] = [[] for _ in range(n)]
    for triad in k.selection.triads:
        due[max(triad)].append(triad)
    js = range(min_tj, max_tj + 1)
    t = [0] * n
    left = [budget]

    def fill(pos: int) -> Iterator[tuple[int, ...]]:
        for v in js:
            if budget is not None:
                left[0] -= 1
                if left[0] < 0:
                    raise EnumerationBudget
            t[pos] = v
            if all(is_triad(t[a], t[b], t[c]) for a, b, c in due[pos]):
                if pos + 1 == n:
                    yield tuple(t)
                else:
                    yield from fill(pos + 1)

    return fill(0)


@dataclass(frozen=True, slots=True)
class ClassesLayout:
    """Classes under the ordinary symmetries, a page per first entry, sections by the second."""

    class_size: int  # forms a generic class holds as filed (24 for a 6j, 72 for a 9j): bounds the class count
    filed_by: Callable[..., list] = field(repr=False)  # the ordinary symmetries: t -> [(form, sign)], largest first
    has_partners: bool = False  # the kind has symmetries beyond filed_by (Regge): pages show a partners column
    page_rows: int = 400  # classes on one page at most (about 1 kB each: pages stay well under 2 MB)
    count_noun: str = "symmetry classes"

    name = "classes"
    param_words: dict = field(default_factory=dict, repr=False)  # table parameters read as their own names

    @staticmethod
    def _lead(k: "Kind") -> tuple[str, str]:
        return k.arguments[0], k.arguments[1]

    def page_path(self, key: str, lead_name: str, lead: int, part: int = 1) -> str:
        """'6j/j1-3.html', then '6j/j1-3-part2.html' for a page split in parts."""
        tail = "" if part == 1 else f"-part{part}"
        return f"{key}/{lead_name}-{half_for_file_name(lead)}{tail}.html"

    @staticmethod
    def anchor(key: tuple[int, ...], groups: tuple[tuple[int, ...], ...]) -> str:
        """'1,1,1;1,1,1' for a 6j, '1,1,0;1,1,1;0,1,1' for a 9j: the kind's rows, joined."""
        return ";".join(",".join(half(key[i]) for i in g) for g in groups)

    def classes_in_range(self, k: "Kind", min_tj: int, max_tj: int) -> list[tuple[int, ...]]:
        """Canonical forms of the ordinary classes of every symbol in range, ascending."""
        seen: set[tuple[int, ...]] = set()
        out = []
        for s in symbols_in_range(k, min_tj, max_tj):
            if s in seen:
                continue
            forms = self.filed_by(*s)
            seen.update(m for m, _ in forms)
            out.append(forms[0][0])
        out.sort()
        return out

    def partners(self, k: "Kind", canon: tuple[int, ...]) -> tuple[list[tuple[int, ...]], list]:
        """(canonical forms of the other ordinary classes of the same value, every form of that value)."""
        full = k.members(*canon)
        out, done = [], set()
        for m, _ in full:
            if m in done:
                continue
            forms = self.filed_by(*m)
            done.update(f for f, _ in forms)
            if forms[0][0] != canon:
                out.append(forms[0][0])
        return sorted(out), full

    def locate(self, fam: "Family", f: "FamilyRange", key: tuple[int, ...]) -> "str | None":
        """'page#anchor' of the class holding the symbol ``key`` (doubled) if this build tabulates it, else None.

        The ordinary symmetries only permute a symbol's entries, so its class is on the site exactly when
        the symbol itself has every j in the range; the page is where ``plan`` files the class.
        """
        k = fam.kind_record
        if not all(f.min_tj <= key[i] <= f.max_tj for i in k.j_positions):
            return None
        canon = self.filed_by(*key)[0][0]
        path = self._where(fam, f).get(canon)
        return None if path is None else f"{path}#{self.anchor(canon, k.notation.groups)}"

    def _where(self, fam: "Family", f: "FamilyRange") -> dict:
        """Canonical form -> page path, as ``plan`` lays the pages out (kept per family and range)."""
        memo = (fam.key, f.min_tj, f.max_tj)
        if memo not in _WHERE:
            first = self._lead(fam.kind_record)[0]
            _WHERE[memo] = {
                c: self.page_path(fam.key, first, lead, part)
                for lead, part, secs in self._parts(fam.kind_record, f) for rows in secs for c in rows
            }
        return _WHERE[memo]

    def _parts(self, k: "Kind", f: "FamilyRange") -> list:
        """[(lead, part, sections)]: one page per first entry, split into parts of at most page_rows classes."""
        parts: list[tuple[int, int, list[list[tuple[int, ...]]]]] = []
        by_lead: dict[int, dict[int, list[tuple[int, ...]]]] = {}
        for c in self.classes_in_range(k, f.min_tj, f.max_tj):
            by_lead.setdefault(c[0], {}).setdefault(c[1], []).append(c)
        for lead, sections in by_lead.items():
            current: list[list[tuple[int, ...]]] = []
            size, part = 0, 1
            for rows in sections.values():
                for i in range(0, len(rows), self.page_rows):
                    chunk = rows[i : i + self.page_rows]
                    if current and size + len(chunk) > self.page_rows:
                        parts.append((lead, part, current))
                        current, size, part = [], 0, part + 1
                    current.append(chunk)
                    size += len(chunk)
            parts.append((lead, part, current))
        return parts

    def plan(self, fam: "Family", f: "FamilyRange", lookup: Callable) -> tuple[list[Page], list[Table]]:
        k = fam.kind_record
        groups = k.notation.groups
        first, second = self._lead(k)
        parts = self._parts(k, f)
        where = {c: self.page_path(fam.key, first, lead, part) for lead, part, secs in parts for rows in secs for c in rows}
        within = lambda t: all(f.min_tj <= t[i] <= f.max_tj for i in k.j_positions)  # noqa: E731
        pages, tables = [], []
        for lead, part, secs in parts:
            path = self.page_path(fam.key, first, lead, part)
            sections = []
            for rows in secs:
                entries = []
                for c in rows:
                    mates, every = self.partners(k, c)
                    beyond = sum(1 for m, _ in every if not within(m)) if mates else 0
                    linked = tuple(f"{where[m]}#{self.anchor(m, groups)}" for m in mates if m in where)
                    forms = len(self.filed_by(*c))
                    entries.append(Entry(c, self.anchor(c, groups), None, forms, fam.kind, partners=linked, beyond=beyond,
                                         filed_by=self.filed_by))
                value = rows[0][1]
                anchor = f"{second}={half(value)}"
                if any(s.anchor == anchor for s in sections):  # pragma: no cover - chunks go to separate pages
                    raise AssertionError(f"plan: section {anchor} twice on {path}")
                sections.append(Section(title=f"{second} = {half(value)}", anchor=anchor, entries=tuple(entries),
                                        params=((second, value),)))
            tid = f"{fam.key}-{first}-{half_for_file_name(lead)}" + ("" if part == 1 else f"-part{part}")
            in_parts = sum(1 for p in parts if p[0] == lead) > 1
            title = f"{fam.kind} symbols with {first} = {half(lead)}" + (f", part {part}" if in_parts else "")
            tables.append(Table(id=tid, family=fam.key, title=title, page=path, sections=tuple(sections),
                                params=((first, lead),), kind=fam.kind, **table_files(tid)))
            index = Link(f"all {fam.kind} pages", f"index.html#{fam.key}")
            label = f"{fam.kind}, {first} = {half(lead)}" + (f" ({part})" if in_parts else "")
            pages.append(Page(path, title, fam.key, (tid,), related=(index,), label=label))
        return chain(pages), tables

    def page_firsts(self, tables: "tuple[Table, ...]") -> list[list]:
        """[path, first canonical form on it] per page, in order: how the jump box finds a class's page."""
        return [[t.page, list(t.sections[0].entries[0].key)] for t in tables]

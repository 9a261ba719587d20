"""The classes layout: symmetry classes of a symbol, one page per largest j of the canonical form.

Every symbol with all its j in the range and every triad of its kind allowed
is enumerated (in lexicographic order), grouped into classes by its kind's
``members`` (canonical = largest form first), and each class becomes one Entry.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import TYPE_CHECKING, Callable, Iterator

from ..sitemodel import Entry, Link, Page, Section, Table, chain, file_code, half, table_files
from ..triads import is_triad

if TYPE_CHECKING:  # pragma: no cover
    from ..families import Family
    from ..kinds import Kind
    from ..recipe import FamilyRange

__all__ = ["ClassesLayout", "symbols_in_range"]


def symbols_in_range(k: "Kind", min_tj: int, max_tj: int) -> Iterator[tuple[int, ...]]:
    """Every symbol of kind ``k`` with each j in [min_tj, max_tj] and every triad allowed, in order.

    A triad is checked as soon as its last argument is chosen, which prunes the
    search as early as the written-out loops it replaces.
    """
    n = len(k.arguments)
    due: list[list[tuple[int, int, int]]] = [[] for _ in range(n)]
    for triad in k.selection.triads:
        due[max(triad)].append(triad)
    js = range(min_tj, max_tj + 1)
    t = [0] * n

    def fill(pos: int) -> Iterator[tuple[int, ...]]:
        for v in js:
            t[pos] = v
            if all(is_triad(t[a], t[b], t[c]) for a, b, c in due[pos]):
                if pos + 1 == n:
                    yield tuple(t)
                else:
                    yield from fill(pos + 1)

    return fill(0)


@dataclass(frozen=True, slots=True)
class ClassesLayout:
    """Symmetry classes, one page per largest j; class_size is the size of a generic class."""

    class_size: int  # forms a generic class holds (144 for 6j, 72 for 9j)
    count_noun: str = "symmetry classes (one value each)"

    name = "classes"
    params = ("jmax",)
    param_words = {"jmax": "largest j"}  # how a table parameter is read out

    def page_path(self, key: str, top: int) -> str:
        return f"{key}/jmax-{file_code(top)}.html"

    def page_pattern(self, key: str) -> str:
        """The page path with {top}, the first entry of the canonical form (the jump box fills it in)."""
        return f"{key}/jmax-{{top}}.html"

    @staticmethod
    def anchor(key: tuple[int, ...], groups: tuple[tuple[int, ...], ...]) -> str:
        """'1,1,1;1,1,1' for a 6j, '1,1,0;1,1,1;0,1,1' for a 9j: the kind's rows, joined."""
        return ";".join(",".join(half(key[i]) for i in g) for g in groups)

    def locate(self, fam: "Family", f: "FamilyRange", key: tuple[int, ...]) -> "str | None":
        """'page#anchor' of the class holding the symbol ``key`` (doubled) if this build tabulates it, else None.

        A class is tabulated when one of its forms has every j in the range (as ``plan`` enumerates them).
        """
        k = fam.kind_record
        members = k.members(*key)
        if not any(all(f.min_tj <= m[i] <= f.max_tj for i in k.j_positions) for m, _ in members):
            return None
        canon = members[0][0]
        return f"{self.page_path(fam.key, canon[0])}#{self.anchor(canon, k.notation.groups)}"

    def plan(self, fam: "Family", f: "FamilyRange", lookup: Callable) -> tuple[list[Page], list[Table]]:
        k = fam.kind_record
        groups = k.notation.groups
        seen: set[tuple[int, ...]] = set()
        classes = []
        for s in symbols_in_range(k, f.min_tj, f.max_tj):
            if s in seen:
                continue
            members = k.members(*s)  # sorted descending: members[0] is the canonical form
            seen.update(m for m, _ in members)
            classes.append((members[0][0], len(members)))
        classes.sort()
        by_top: dict[int, list] = {}
        for canon, forms in classes:
            by_top.setdefault(canon[0], []).append((canon, forms))
        pages, tables = [], []
        for top in sorted(by_top):
            entries = tuple(Entry(canon, self.anchor(canon, groups), None, forms, fam.kind) for canon, forms in by_top[top])
            tid = f"{fam.key}-jmax-{file_code(top)}"
            title = f"{fam.kind} classes whose largest j, over all {self.class_size} equivalent forms, is {half(top)}"
            section = Section(title=title, anchor=f"jmax={half(top)}", entries=entries)
            path = self.page_path(fam.key, top)
            tables.append(Table(id=tid, family=fam.key, title=title, page=path, sections=(section,),
                                params=(("jmax", top),), kind=fam.kind, **table_files(tid)))
            index = Link(f"all {fam.kind} pages", f"index.html#{fam.key}")
            pages.append(Page(path, title, fam.key, (tid,), related=(index,), label=f"{fam.kind}, largest j {half(top)}"))
        return chain(pages), tables

"""Propose the split of a table holding several observational units into tables in BCNF (or 3NF).

Method (the textbook algorithms, as in Silberschatz, Korth & Sudarshan, "Database System
Concepts", chapter on relational database design): attribute closure under the discovered
dependencies; BCNF decomposition by repeatedly splitting a table on a dependency X -> A whose
X is not a superkey of that table (X+ becomes one table, the rest keeps X to join on), which is
always lossless; the dependency-preservation test; and, when BCNF would lose a dependency, 3NF
synthesis from a canonical cover (one table per determinant, plus one holding a candidate key).
Every table gets its key; a table that holds another table's key refers to it.

Simplification (stated): the BCNF step only tries determinants that appear as left-hand sides
of the given dependencies, not every subset of a table's columns.
"""

from __future__ import annotations

from collections.abc import Iterable, Sequence
from dataclasses import dataclass

FD = tuple[frozenset[str], str]
"""A dependency as (determinant columns, dependent column)."""


@dataclass(frozen=True)
class UnitTable:
    """One table of a proposed split: one observational unit, its key and its columns."""

    name: str
    key: tuple[str, ...]
    columns: tuple[str, ...]
    """In the order of the original table."""
    references: tuple[tuple[tuple[str, ...], str], ...] = ()
    """(columns, table name): these columns hold the key of that other table."""


@dataclass(frozen=True)
class Split:
    """A proposed split and the normal form it reaches."""

    tables: tuple[UnitTable, ...]
    normal_form: str
    """"BCNF", or "3NF" when BCNF would lose a dependency."""
    lost_by_bcnf: tuple[FD, ...] = ()
    """The dependencies a BCNF split could not keep inside one table (the reason for 3NF)."""

    def table(self, name: str) -> UnitTable | None:
        return next((t for t in self.tables if t.name == name), None)


def closure(columns: Iterable[str], dependencies: Sequence[FD]) -> frozenset[str]:
    """All columns determined by `columns` (X+), by the textbook fixpoint."""
    result = set(columns)
    changed = True
    while changed:
        changed = False
        for determinant, dependent in dependencies:
            if dependent not in result and determinant <= result:
                result.add(dependent)
                changed = True
    return frozenset(result)


def bcnf_tables(
    columns: frozenset[str],
    dependencies: Sequence[FD],
    order: dict[str, int] | None = None,
    key: frozenset[str] = frozenset(),
) -> list[frozenset[str]]:
    """Column sets of a lossless BCNF decomposition of `columns`.

    Determinants inside the table's `key` are tried first (so the key stays whole in one table),
    then the smallest, then the leftmost in the table (`order`): when two columns determine each
    other, the one written first becomes the key.
    """
    rank = order or {}

    def place(fd: FD) -> tuple[bool, int, list[int], list[str], str]:
        return (not fd[0] <= key, len(fd[0]), sorted(rank.get(c, 0) for c in fd[0]), sorted(fd[0]), fd[1])

    for determinant, dependent in sorted(dependencies, key=place):
        if not determinant <= columns or dependent not in columns or dependent in determinant:
            continue
        reach = closure(determinant, dependencies) & columns
        if reach == columns:
            continue  # the determinant is a superkey here: no violation
        rest = columns - (reach - determinant)
        return bcnf_tables(reach, dependencies, order, key) + bcnf_tables(rest, dependencies, order, key)
    return [columns]


def preserved(dependency: FD, tables: Sequence[frozenset[str]], dependencies: Sequence[FD]) -> bool:
    """Whether the split still implies `dependency` (the textbook test, without computing projections)."""
    determinant, dependent = dependency
    result = set(determinant)
    changed = True
    while changed:
        changed = False
        for table in tables:
            gained = (closure(result & table, dependencies) & table) - result
            if gained:
                result |= gained
                changed = True
    return dependent in result


def canonical_cover(dependencies: Sequence[FD]) -> list[FD]:
    """The dependencies with left sides reduced and redundant ones removed."""
    reduced: list[FD] = []
    for determinant, dependent in dependencies:
        left = set(determinant)
        for column in sorted(determinant):
            if len(left) > 1 and dependent in closure(left - {column}, dependencies):
                left.discard(column)
        reduced.append((frozenset(left), dependent))
    cover = list(dict.fromkeys(reduced))
    for fd in list(cover):
        others = [d for d in cover if d != fd]
        if fd[1] in closure(fd[0], others):
            cover = others
    return cover


def third_nf_tables(
    columns: frozenset[str], key: frozenset[str], dependencies: Sequence[FD]
) -> list[frozenset[str]]:
    """Column sets of the 3NF synthesis: one per determinant of the cover, plus one with a key."""
    groups: dict[frozenset[str], set[str]] = {}
    for determinant, dependent in canonical_cover(dependencies):
        if determinant <= columns and dependent in columns:
            groups.setdefault(determinant, set(determinant)).add(dependent)
    tables = [frozenset(g) for g in groups.values()]
    if not any(key <= t for t in tables):
        tables.append(key)
    tables = [t for t in tables if not any(t < other for other in tables)]
    covered = frozenset().union(*tables) if tables else frozenset()
    if covered != columns:  # columns no dependency mentions stay with the key
        with_key = next(t for t in tables if key <= t)
        tables[tables.index(with_key)] = with_key | (columns - covered)
    return list(dict.fromkeys(tables))


def table_name(key: Sequence[str]) -> str:
    """A plural name for the unit a key identifies: site_id -> sites, (lab, method) -> lab_methods."""
    parts = [k.strip() for k in key]
    stems = []
    for part in parts:
        stem = part
        for suffix in ("_id", " id", "_ID", " ID", "Id", "_code", " code"):
            if stem.endswith(suffix) and len(stem) > len(suffix):
                stem = stem[: -len(suffix)]
                break
        stems.append(stem.replace(" ", "_").lower())
    return plural_noun("_".join(stems))


def plural_noun(name: str) -> str:
    """English plural of a unit name: site -> sites, county -> counties, batch -> batches.

    Common practice (no source): the regular English spelling rules; irregular nouns are rare
    in column names and keep the plain -s.
    """
    lower = name.lower()
    if lower.endswith("s"):
        return name
    if lower.endswith("y") and len(lower) > 1 and lower[-2] not in "aeiou":
        return name[:-1] + "ies"
    if lower.endswith(("x", "z", "ch", "sh")):
        return name + "es"
    return name + "s"


def propose_split(
    columns: Sequence[str], key: Sequence[str], dependencies: Sequence[FD], name: str = "rows"
) -> Split:
    """Split `columns` (keyed by `key`) by the dependencies into BCNF, or 3NF if BCNF loses one."""
    everything = frozenset(columns)
    whole_key = frozenset(key)
    relevant = [d for d in dependencies if d[0] <= everything and d[1] in everything and d[1] not in d[0]]
    # The key determines every column by definition, even where the given (minimal) dependencies
    # only imply it through a constant column's empty determinant.
    relevant += [(whole_key, c) for c in columns if c not in whole_key and (whole_key, c) not in relevant]
    order = {c: i for i, c in enumerate(columns)}
    sets = bcnf_tables(everything, relevant, order, whole_key)
    lost = tuple(d for d in canonical_cover(relevant) if not preserved(d, sets, relevant))
    form = "BCNF"
    if lost:
        sets, form = third_nf_tables(everything, whole_key, relevant), "3NF"
    keyed: list[tuple[frozenset[str], tuple[str, ...]]] = []
    for table in sets:
        found = whole_key if whole_key <= table else _smallest_key(table, relevant, order)
        keyed.append((table, tuple(sorted(found, key=order.__getitem__))))
    # Tables with the same key describe the same unit (their join is one to one): one table each.
    merged: dict[frozenset[str], frozenset[str]] = {}
    for table, table_key in keyed:
        merged[frozenset(table_key)] = merged.get(frozenset(table_key), frozenset()) | table
    keyed = [(table, tuple(sorted(k, key=order.__getitem__))) for k, table in merged.items()]
    # A table inside another (site_name, river of sites) is a projection of it: drop it (3NF rule).
    keyed = [(t, k) for t, k in keyed if whole_key <= t or not any(t < other for other, _ in keyed)]
    names: dict[frozenset[str], str] = {}
    for table, table_key in keyed:
        wanted = name if whole_key <= table else table_name(table_key)
        taken = set(names.values())
        names[table] = (
            wanted
            if wanted not in taken
            else next(f"{wanted}_{i}" for i in range(2, len(keyed) + 2) if f"{wanted}_{i}" not in taken)
        )
    units = []
    for table, table_key in sorted(keyed, key=lambda t: (not whole_key <= t[0], min(order[c] for c in t[0]))):
        refers = tuple(
            (other_key, names[other])
            for other, other_key in keyed
            if other != table and set(other_key) <= table and set(other_key) != set(table_key)
        )
        units.append(UnitTable(names[table], table_key, tuple(sorted(table, key=order.__getitem__)), refers))
    return Split(tuple(units), form, lost)


def _smallest_key(table: frozenset[str], dependencies: Sequence[FD], order: dict[str, int]) -> frozenset[str]:
    """The determinant that reaches all of `table` with the fewest, leftmost columns (else all columns)."""
    candidates = sorted(
        {d[0] for d in dependencies if d[0] <= table} | {table},
        key=lambda c: (len(c), sorted(order[x] for x in c)),
    )
    return next(c for c in candidates if closure(c, dependencies) >= table)

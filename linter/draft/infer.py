"""Propose a whole table contract from one or more Frames of the same kind: keys, variables, grid, rules."""

from __future__ import annotations

import re
from collections.abc import Callable, Sequence
from dataclasses import dataclass, field
from pathlib import PurePath
from typing import Any

import pandas as pd

from linter.contract.model import VarType
from linter.draft.columns import VariableDraft, draft_variable, plural
from linter.errors import WeirError
from linter.profile.keys import unique_combinations

MIN_KEY_ROWS = 2
"""A key is only proposed when there are rows to tell apart."""
MADE_UP = re.compile(r"\(column [A-Z]{1,3}\)$")
"""The label `linter.table.unique_labels` gives a blank or repeated header cell."""
MAX_UNIT_ROWS = 200_000
"""Longer tables are not searched for functional dependencies (exact TANE is not linear in rows)."""
BOUND_WORDS = (("min", "max"), ("minimum", "maximum"), ("low", "high"), ("lower", "upper"))


@dataclass(frozen=True)
class Sample:
    """The body of one sample table (column labels -> text cells) and where it came from."""

    body: pd.DataFrame
    source: str
    recipe: tuple[dict[str, Any], ...] = ()
    """Steps that made the body tidy (empty when the file was tidy as sent)."""


@dataclass(frozen=True)
class TableDraft:
    """The proposed contract of one table, with the evidence behind it."""

    name: str
    rows: int
    sources: tuple[str, ...]
    variables: tuple[VariableDraft, ...]
    keys: tuple[str, ...] = ()
    key_evidence: str = ""
    missing: tuple[str, ...] = ("",)
    missing_evidence: str = ""
    complete_over: tuple[str, ...] = ()
    complete_evidence: str = ""
    rules: tuple[str, ...] = ()
    applies_to: tuple[str, ...] = ()
    recipes: tuple[tuple[str, tuple[dict[str, Any], ...]], ...] = ()
    """(source, steps) for each sample that had to be reshaped before drafting."""
    notes: tuple[str, ...] = field(default=())
    """Observations for the data manager, written as comments at the top of the contract."""

    def variable(self, name: str) -> VariableDraft | None:
        return next((v for v in self.variables if v.name == name), None)


def draft_table(samples: Sequence[Sample], name: str | None = None) -> TableDraft:
    """Everything the draft proposes for the table the samples share; pure (no file is read)."""
    if not samples:
        raise ValueError("a draft needs at least one sample table")
    shared = set.intersection(*(set(map(str, s.body.columns)) for s in samples))
    if len(samples) > 1 and not shared:
        names = ", ".join(sorted({s.source for s in samples}))
        raise WeirError(
            f"the samples share no column, so they are not one kind of table ({names}); draft each separately"
        )
    body, absent_from = combined(samples)
    # A column with neither a name nor a value is a margin, not a variable: it is left out.
    unnamed_empty = [c for c in body.columns if MADE_UP.search(str(c)) and body[c].isna().all()]
    body = body.drop(columns=unnamed_empty)
    variables = []
    for label in body.columns:
        variable = draft_variable(str(label), body[label])
        if absent_from.get(str(label)):
            missing_in = absent_from[str(label)]
            evidence = {**variable.evidence, "required": f"absent from {plural(missing_in, 'sample file')}"}
            variable = _replace(variable, required=False, evidence=evidence)
        variables.append(variable)
    keys, key_evidence = choose_key(body, variables)
    variables = [_replace(v, nullable=False) if v.name in keys else v for v in variables]
    seen = sorted({code for v in variables for code in v.missing_seen})
    missing = ("", *seen)
    counts = [f"{code} in {', '.join(v.name for v in variables if code in v.missing_seen)}" for code in seen]
    complete, complete_evidence = complete_grid(body, keys)
    sources = tuple(s.source for s in samples)
    return TableDraft(
        name=name or table_name(sources),
        rows=len(body),
        sources=sources,
        variables=tuple(variables),
        keys=keys,
        key_evidence=key_evidence,
        missing=missing,
        missing_evidence=("seen: " + "; ".join(counts)) if counts else "",
        complete_over=complete,
        complete_evidence=complete_evidence,
        rules=bound_rules(body, variables),
        applies_to=file_globs(sources),
        recipes=tuple((s.source, s.recipe) for s in samples if s.recipe),
        notes=(
            (
                (f"Left out {', '.join(map(str, unnamed_empty))}: no header and no value in any row.",)
                if unnamed_empty
                else ()
            )
            + label_notes(body.columns)
            + padding_notes(variables)
            + unit_notes(body, keys)
        ),
    )


def padding_notes(variables: Sequence[VariableDraft]) -> tuple[str, ...]:
    """Codes and patterns are proposed trimmed, so cells written with spaces around them will not pass."""
    padded = [v for v in variables if v.padded and (v.type is VarType.CATEGORY or v.pattern)]
    if not padded:
        return ()
    shown = ", ".join(f"{v.name} ({plural(v.padded, 'cell')})" for v in padded)
    return (
        f"Cells with spaces around the value in {shown}: the codes and patterns below are trimmed, "
        "so those cells will be reported until the file is corrected.",
    )


def label_notes(columns: pd.Index) -> tuple[str, ...]:
    """Columns whose header was blank or repeated carry a made-up label; the provider must name them."""
    made_up = [str(c) for c in columns if MADE_UP.search(str(c))]
    if not made_up:
        return ()
    return (
        f"{len(made_up)} column(s) have a blank or repeated header and are drafted as "
        + ", ".join(made_up)
        + ": give each its own name in the file and here, or the file cannot pass.",
    )


def unit_notes(body: pd.DataFrame, keys: tuple[str, ...]) -> tuple[str, ...]:
    """Say so when the rows describe several observational units (columns that depend on part of the key)."""
    if not keys or len(body) > MAX_UNIT_ROWS:
        return ()
    from linter.profile.evidence import mixed_units

    found = mixed_units(body, keys, "rows")
    if found is None:
        return ()
    parts = [f"{t.name} ({', '.join(t.columns)}; key {', '.join(t.key)})" for t in found.split.tables]
    return (
        f"The rows describe {len(parts)} observational units ({found.split.normal_form} split): "
        + "; ".join(parts)
        + ". Consider one table per unit (`weir tidy` proposes the split_by_unit step).",
    )


def _replace(variable: VariableDraft, **changes: Any) -> VariableDraft:
    from dataclasses import replace

    return replace(variable, **changes)


def combined(samples: Sequence[Sample]) -> tuple[pd.DataFrame, dict[str, int]]:
    """All sample bodies stacked on their column names (first-seen order), and how many lack each column."""
    order: list[str] = []
    for sample in samples:
        order.extend(str(c) for c in sample.body.columns if str(c) not in order)
    absent = {c: sum(c not in map(str, s.body.columns) for s in samples) for c in order}
    frames = [s.body.rename(columns=str) for s in samples]
    body = (
        pd.concat(frames, ignore_index=True, sort=False) if len(frames) > 1 else frames[0].rename(columns=str)
    )
    body = body.reindex(columns=order).astype(object)
    return body.where(body.notna(), None), absent


def choose_key(body: pd.DataFrame, variables: Sequence[VariableDraft]) -> tuple[tuple[str, ...], str]:
    """The leftmost minimal unique column set, measurements left out; the others named as alternatives.

    Common practice (no source): identifying columns come first in a table, and a decimal
    measurement is never an identifier even when its values happen to be distinct.
    """
    rows = len(body)
    if rows < MIN_KEY_ROWS:
        return (), ""
    # A key cell is never empty, so only columns without empty cells or missing-value codes take part.
    candidates = [
        v.name for v in variables if not v.is_measurement and v.type is not VarType.BOOLEAN and not v.nullable
    ]
    if not candidates:
        return (), f"no column set identifies each of {rows:,} rows"
    frame = body[candidates]
    found = unique_combinations(frame)
    if not found.keys:
        return (), f"no set of up to {found.max_size} columns is unique over {rows:,} rows"
    position = {name: i for i, name in enumerate(body.columns)}
    ranked = sorted(found.keys, key=lambda key: (max(position[c] for c in key), len(key)))
    best = ranked[0]
    evidence = f"unique over {rows:,} rows; no smaller unique set"
    others = [f"[{', '.join(k)}]" for k in ranked[1:4]]
    if others:
        evidence += "; also unique: " + ", ".join(others)
    return best, evidence


def complete_grid(body: pd.DataFrame, keys: tuple[str, ...]) -> tuple[tuple[str, ...], str]:
    """Propose `complete_over: keys` when every combination of the key values is present."""
    if len(keys) < 2:
        return (), ""
    sizes = [int(body[k].nunique()) for k in keys]
    if min(sizes) < 2:
        return (), ""
    product = 1
    for size in sizes:
        product *= size
    if product != len(body):
        return (), ""
    shown = " x ".join(f"{s} {k}" for s, k in zip(sizes, keys, strict=True))
    return keys, f"every one of the {shown} combinations has a row"


def bound_rules(body: pd.DataFrame, variables: Sequence[VariableDraft]) -> tuple[str, ...]:
    """`x_min <= x_max` for each pair of numeric columns named as bounds that every row keeps."""
    numeric = {v.name: v for v in variables if v.type in (VarType.NUMBER, VarType.INTEGER)}
    rules: list[str] = []
    for name in numeric:
        for low_word, high_word in BOUND_WORDS:
            pattern = re.compile(rf"(?<![A-Za-z]){low_word}(?![A-Za-z])", re.IGNORECASE)
            if not pattern.search(name):
                continue
            partner = pattern.sub(_same_case_as(high_word), name, count=1)
            if partner not in numeric:
                continue
            low = _as_numbers(body[name], numeric[name].censored_prefix)
            high = _as_numbers(body[partner], numeric[partner].censored_prefix)
            both = low.notna() & high.notna()
            if both.any() and bool((low[both] <= high[both]).all()):
                rules.append(f"{_operand(name)} <= {_operand(partner)}")
    return tuple(rules)


def _same_case_as(word: str) -> Callable[[re.Match[str]], str]:
    """A replacement that writes `word` in the case of the text it replaces (min -> max, MIN -> MAX)."""

    def replace(match: re.Match[str]) -> str:
        found = match.group(0)
        return word.upper() if found.isupper() else word.capitalize() if found[0].isupper() else word

    return replace


def _as_numbers(cells: pd.Series, prefix: str | None) -> pd.Series:
    text = cells.astype(object).where(cells.notna(), None).str.strip()
    if prefix:
        text = text.str.removeprefix(prefix)
    return pd.to_numeric(text, errors="coerce")


def _operand(name: str) -> str:
    """A name as Weir's rule grammar reads it: bare when it is a plain identifier, else in backticks."""
    return name if re.fullmatch(r"[A-Za-z_][A-Za-z0-9_]*", name) else f"`{name}`"


def file_globs(sources: Sequence[str]) -> tuple[str, ...]:
    """File-name globs the samples share: the common name start before any digit, then `*` and the suffix."""
    names = [PurePath(s).name for s in sources]
    stems = [PurePath(n).stem for n in names]
    prefix = stems[0]
    for stem in stems[1:]:
        while not stem.startswith(prefix):
            prefix = prefix[:-1]
    prefix = re.split(r"\d", prefix, maxsplit=1)[0]
    suffixes = sorted({PurePath(n).suffix.lower() for n in names if PurePath(n).suffix})
    return tuple(f"{prefix}*{suffix}" for suffix in suffixes) or (f"{prefix}*",)


def table_name(sources: Sequence[str]) -> str:
    """A contract id from the file names: their common leading words, e.g. `chemistry` or `field-sheets`."""
    glob = file_globs(sources)[0]
    words = re.sub(r"[^A-Za-z0-9]+", "-", glob.split("*", 1)[0]).strip("-").lower()
    return words or "drafted"

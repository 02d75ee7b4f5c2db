"""The value-conservation audit: every non-empty input cell is found again or deliberately dropped."""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any

import numpy as np
import pandas as pd

from linter.reshape.apply import Reshaped
from linter.reshape.recipe import Recipe
from linter.table import Table

KEPT = ("value", "header_value", "column_name", "part", "renamed")
"""How a kept cell lives on: as the same value, as a value made from a header, as an output
column name, inside or around an output text (split, joined or exploded), or renamed on purpose."""


@dataclass(frozen=True)
class AuditCell:
    """One input cell the audit names: where it was, what it said, and why it is listed."""

    row: int
    """Provider row number."""
    letter: str
    """Spreadsheet column letter."""
    text: str
    why: str
    """For a dropped cell the recipe's reason (blank, notes, total, title, layout label);
    for a lost cell what happened to it."""
    source: str = ""

    def to_json(self) -> dict[str, Any]:
        return {"row": self.row, "column": self.letter, "text": self.text, "why": self.why}


@dataclass(frozen=True)
class Audit:
    """What became of every non-empty input cell under a recipe."""

    input_cells: int
    """Non-empty input cells (header rows included)."""
    kept: dict[str, int]
    """Kept cells per way of living on (see KEPT)."""
    dropped: tuple[AuditCell, ...]
    """Cells removed on purpose, each with the recipe's reason."""
    lost: tuple[AuditCell, ...]
    """Cells neither found again nor deliberately dropped (or dropped for a reason that is untrue)."""
    unmatched: int = 0
    """Cells a split_column pattern did not match (kept whole in the first new column)."""
    collisions: int = 0
    """Values a spread found a second value for; they are lost and listed in `lost`."""

    @property
    def lossless(self) -> bool:
        return not self.lost

    def counts(self) -> dict[str, int]:
        reasons: dict[str, int] = {}
        for cell in self.dropped:
            reasons[cell.why] = reasons.get(cell.why, 0) + 1
        return {
            "input_cells": self.input_cells,
            **{f"kept_{k}": v for k, v in self.kept.items()},
            **{f"dropped_{k.replace(' ', '_')}": v for k, v in sorted(reasons.items())},
            "lost": len(self.lost),
            "unmatched": self.unmatched,
            "collisions": self.collisions,
        }

    def to_json(self) -> dict[str, Any]:
        return {
            "lossless": self.lossless,
            "counts": self.counts(),
            "dropped": [c.to_json() for c in self.dropped],
            "lost": [c.to_json() for c in self.lost],
        }


def _input_cells(reshaped: Reshaped) -> pd.DataFrame:
    frames = []
    for which, table in enumerate(reshaped.index.tables):
        values = table.grid.to_numpy(dtype=object).ravel()
        ids = reshaped.index.base_codes(which).ravel() // 2
        text = pd.Series(values, dtype=object)
        filled = text.notna() & (text.astype(str).str.strip() != "")
        frames.append(
            pd.DataFrame({"id": ids[filled.to_numpy()], "text": text[filled].astype(str).to_numpy()})
        )
    return pd.concat(frames, ignore_index=True) if frames else pd.DataFrame({"id": [], "text": []})


def _fragments(reshaped: Reshaped) -> pd.DataFrame:
    """Every place an input cell lives on: (input cell id, how, output text)."""
    parts = []
    for name, cells in reshaped.tables.items():
        codes = reshaped.provenance[name].to_numpy().ravel()
        texts = pd.Series(cells.to_numpy(dtype=object).ravel(), dtype=object)
        ok = (codes >= 0) & texts.notna().to_numpy()
        how = np.where(codes[ok] % 2 == 1, "header_value", "value")
        parts.append(
            pd.DataFrame({"id": codes[ok] // 2, "how": how, "out": texts[ok].astype(str).to_numpy()})
        )
        named = [(c // 2, "column_name", column) for column, cs in reshaped.headers[name].items() for c in cs]
        parts.append(pd.DataFrame(named, columns=["id", "how", "out"]))
    carried = [(c // 2, "header_value" if c % 2 else "value", text) for c, text in reshaped.carried if c >= 0]
    parts.append(pd.DataFrame(carried, columns=["id", "how", "out"]))
    return pd.concat(parts, ignore_index=True).astype({"id": np.int64})


def _as_number(text: str) -> float | None:
    try:
        number = float(text.replace(",", ""))
    except ValueError:
        return None
    return number if math.isfinite(number) else None


def _total_mismatches(
    reshaped: Reshaped, inputs: pd.DataFrame, kept_value: pd.Series, totals: set[int]
) -> dict:
    """Total-row cells the data does not recompute: id -> why. A total is the sum of the kept
    values above it in its column, down to the previous total (so subtotals work too)."""
    why: dict[int, str] = {}
    widths = {}
    for which, table in enumerate(reshaped.index.tables):
        widths[reshaped.index.offsets[which]] = table.grid.shape[1]
    offsets = np.asarray(sorted(widths))
    cells = inputs.assign(kept=kept_value.to_numpy(), total=inputs["id"].isin(totals).to_numpy())
    base = offsets[np.searchsorted(offsets, cells["id"].to_numpy(), side="right") - 1]
    width = np.asarray([widths[b] for b in base]) if len(base) else np.zeros(0, dtype=np.int64)
    cells["table"] = base
    cells["column"] = (cells["id"].to_numpy() - base) % np.maximum(width, 1)
    cells["number"] = [_as_number(t) for t in cells["text"]] if len(cells) else []
    for _, column in cells.sort_values("id").groupby(["table", "column"]):
        if not column["total"].any():
            continue
        # each total closes a segment: the cells above it, after the previous total
        segment = column["total"].cumsum().shift(fill_value=0)
        counted = column[column["kept"] & column["number"].notna() & ~column["total"]]
        sums = counted.groupby(segment[counted.index])["number"].sum()
        for position, (cell, number) in enumerate(zip(column["id"], column["number"], strict=True)):
            if not column["total"].iloc[position] or number is None or math.isnan(number):
                continue
            expected = sums.get(segment.iloc[position])
            if expected is None or not math.isclose(number, expected, rel_tol=1e-9, abs_tol=1e-9):
                shown = "nothing" if expected is None else f"{expected:g}"
                why[int(cell)] = f"dropped as a total, but the values above it sum to {shown}"
    return why


def audit(table: Table, reshaped: Reshaped, recipe: Recipe | None = None) -> Audit:
    """Account for every non-empty cell of `table` (and any other input) under `reshaped`.

    `recipe` is accepted so callers hand over everything the audit is about; the facts
    themselves come from the provenance that applying the recipe recorded.
    """
    if not any(t is table for t in reshaped.index.tables):
        raise ValueError("audit: this Reshaped was not made from this table")
    inputs = _input_cells(reshaped)
    frags = _fragments(reshaped)
    pairs = inputs.merge(frags, on="id", how="inner")
    a = pairs["text"].str.strip()
    b = pairs["out"].str.strip()
    same = (a == b).to_numpy()
    inside = np.fromiter(
        ((x in y) or (y in x) for x, y in zip(a, b, strict=True)), dtype=bool, count=len(pairs)
    )
    renamed = pairs["id"].isin({c // 2 for c in reshaped.renamed}).to_numpy()
    how = pairs["how"].to_numpy()
    pairs["rank"] = np.select(
        [
            same & (how == "value"),
            same & (how == "header_value"),
            same & (how == "column_name"),
            inside & ~same,
            renamed & (how == "column_name"),
        ],
        [0, 1, 2, 3, 4],
        default=9,
    )
    best = pairs.groupby("id")["rank"].min()
    rank = inputs["id"].map(best).fillna(9).astype(int)
    kept = {name: int((rank == r).sum()) for r, name in enumerate(KEPT)}
    dropped_reason: dict[int, str] = {}
    for record in reshaped.dropped:
        for code in record.codes:
            dropped_reason.setdefault(code // 2, record.reason)
    note_why: dict[int, str] = {}
    for note in reshaped.notes:
        if note.kind in ("collision", "unnamed"):
            for code in note.codes:
                note_why.setdefault(code // 2, f"step {note.step}: {note.message}")
    totals = {i for i, r in dropped_reason.items() if r == "total"}
    total_why = _total_mismatches(reshaped, inputs, rank == 0, totals) if totals else {}
    changed = set(pairs["id"][pairs["rank"] == 9].tolist())
    dropped, lost = [], []
    missing = inputs[(rank == 9).to_numpy()]
    for cell, text in zip(missing["id"].tolist(), missing["text"].tolist(), strict=True):
        place = reshaped.index.decode(cell * 2)
        assert place is not None  # every input id decodes
        reason = dropped_reason.get(cell)
        if reason == "blank":
            why = "dropped as blank, but the cell holds text"
        elif cell in total_why:
            why = total_why[cell]
        elif reason is not None:
            dropped.append(AuditCell(place.row, place.letter, text, reason, place.source))
            continue
        elif cell in note_why:
            why = note_why[cell]
        elif cell in changed:
            why = "its text was changed"
        else:
            why = "not found in the output"
        lost.append(AuditCell(place.row, place.letter, text, why, place.source))
    unmatched = sum(len(n.codes) for n in reshaped.notes if n.kind == "unmatched")
    collisions = sum(len(n.codes) for n in reshaped.notes if n.kind == "collision")
    return Audit(len(inputs), kept, tuple(dropped), tuple(lost), unmatched, collisions)

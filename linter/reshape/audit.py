"""The value-conservation audit: every non-empty input cell is found again or deliberately dropped."""

from __future__ import annotations

import math
from collections.abc import Callable
from dataclasses import dataclass
from typing import Any

import numpy as np

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
    trimmed: tuple[AuditCell, ...] = ()
    """Cells kept in parts whose left-out text holds letters but no digit (a constant label
    such as the `Sample` of `Sample 1 Depth`, or a unit the pattern spells out): listed so
    nobody is surprised, not counted as loss. Left-out digits make the cell lost instead."""

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
            "trimmed": len(self.trimmed),
            "unmatched": self.unmatched,
            "collisions": self.collisions,
        }

    def to_json(self) -> dict[str, Any]:
        return {
            "lossless": self.lossless,
            "counts": self.counts(),
            "dropped": [c.to_json() for c in self.dropped],
            "lost": [c.to_json() for c in self.lost],
            "trimmed": [c.to_json() for c in self.trimmed],
        }


def _input_texts(reshaped: Reshaped) -> np.ndarray:
    """Text of every input cell by cell id; None for an empty or blank cell."""
    parts = [table.grid.to_numpy(dtype=object).ravel() for table in reshaped.index.tables]
    values = np.concatenate(parts) if parts else np.zeros(0, dtype=object)
    filled = np.fromiter(
        (isinstance(v, str) and v.strip() != "" for v in values), dtype=bool, count=len(values)
    )
    texts = values.copy()
    texts[~filled] = None
    return texts


def _fragments(reshaped: Reshaped) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Every place an input cell lives on: (input cell ids, how as an index of KEPT, output texts)."""
    ids, hows, outs = [], [], []
    for name, cells in reshaped.tables.items():
        codes = reshaped.provenance[name].to_numpy(dtype=np.int64).ravel()
        texts = cells.to_numpy(dtype=object).ravel()
        ok = codes >= 0
        ids.append(codes[ok] // 2)
        hows.append((codes[ok] % 2).astype(np.int8))  # 0 value, 1 header_value
        outs.append(texts[ok])
        named = [(c // 2, column) for column, cs in reshaped.headers[name].items() for c in cs]
        ids.append(np.asarray([c for c, _ in named], dtype=np.int64))
        hows.append(np.full(len(named), 2, dtype=np.int8))
        outs.append(np.asarray([str(n) for _, n in named], dtype=object))
    for chunk in reshaped.carried:
        ok = chunk.codes >= 0
        ids.append(chunk.codes[ok] // 2)
        hows.append((chunk.codes[ok] % 2).astype(np.int8))
        outs.append(chunk.texts[ok])
    return np.concatenate(ids), np.concatenate(hows), np.concatenate(outs)


def _ranks(reshaped: Reshaped, texts: np.ndarray) -> tuple[np.ndarray, dict[int, set[str]]]:
    """For every input cell id, the best way it lives on (index into KEPT), or 9 when it does not;
    and for cells kept in parts, the pieces of their text that the output holds."""
    ids, how, out = _fragments(reshaped)
    source = texts[ids]
    usable = np.fromiter((o is not None for o in out), dtype=bool, count=len(out)) & (source != None)  # noqa: E711
    same = usable & (source == out)
    rank = np.where(same, how, 9).astype(np.int8)
    # Only the few fragments that differ need a closer look (whitespace, split, joined, renamed).
    odd = np.flatnonzero(usable & ~same)
    renamed = {c // 2 for c in reshaped.renamed}
    pieces: dict[int, set[str]] = {}
    whole: set[int] = set()
    for k in odd.tolist():
        a, b = str(source[k]).strip(), str(out[k]).strip()
        if a == b:
            rank[k] = how[k]
        elif a in b:  # the whole cell lives on inside a longer text (a joined header)
            rank[k] = 3
            whole.add(int(ids[k]))
        elif b in a:  # a piece of the cell (a split, an exploded item, part of a header)
            rank[k] = 3
            pieces.setdefault(int(ids[k]), set()).add(b)
        elif how[k] == 2 and int(ids[k]) in renamed:
            rank[k] = 4
    best = np.full(len(texts), 9, dtype=np.int8)
    np.minimum.at(best, ids, rank)
    for cell in whole:
        pieces.pop(cell, None)
    return best, pieces


def _left_out(text: str, pieces: set[str]) -> str:
    """What of `text` no piece covers, separators and spaces aside ('' when nothing is)."""
    for piece in sorted(pieces, key=len, reverse=True):
        text = text.replace(piece, "\0")
    rest = " ".join(part.strip() for part in text.split("\0") if part.strip())
    return rest if any(ch.isalnum() for ch in rest) else ""


def _as_number(text: str) -> float | None:
    try:
        number = float(text.replace(",", ""))
    except ValueError:
        return None
    return number if math.isfinite(number) else None


def _sums(texts: np.ndarray, cells: list[int], counted: Callable[[int], bool]) -> tuple[float, bool]:
    total, seen = 0.0, False
    for cell in cells:
        number = _as_number(texts[cell]) if texts[cell] is not None and counted(cell) else None
        if number is not None:
            total, seen = total + number, True
    return total, seen


def _total_mismatches(
    reshaped: Reshaped, texts: np.ndarray, best: np.ndarray, totals: set[int]
) -> dict[int, str]:
    """Total cells the data does not recompute: id -> why.

    A total row cell is the sum of the kept values above it in its column, down to the previous
    total (so subtotals work too). A total column cell is the sum of the kept values to its left
    in its row. The grand total where a total row meets a total column is the sum of the
    totals above it or to its left. Every check is exact arithmetic on the provider's numbers.
    """
    why: dict[int, str] = {}
    for which, table in enumerate(reshaped.index.tables):
        base = reshaped.index.offsets[which]
        n_rows, n_cols = table.grid.shape
        mine = [t - base for t in totals if base <= t < base + n_rows * n_cols]
        for col in sorted({t % n_cols for t in mine}):
            running, seen = 0.0, False
            for cell in (base + np.arange(n_rows) * n_cols + col).tolist():
                text = texts[cell]
                number = _as_number(text) if text is not None else None
                if cell in totals:
                    if number is not None and not (seen and math.isclose(number, running, rel_tol=1e-9)):
                        shown = f"{running:g}" if seen else "nothing"
                        why[cell] = f"dropped as a total, but the values above it sum to {shown}"
                    running, seen = 0.0, False
                elif number is not None and best[cell] == 0:
                    running += number
                    seen = True
        for cell in [c for c in why if base <= c < base + n_rows * n_cols]:
            row, col = divmod(cell - base, n_cols)
            number = _as_number(str(texts[cell]))
            left = [base + row * n_cols + j for j in range(col)]
            above = [base + i * n_cols + col for i in range(row)]
            for cells, counted in (
                (left, lambda c: best[c] == 0 and c not in totals),
                (left, lambda c: c in totals and c not in why),
                (above, lambda c: c in totals and c not in why),
            ):
                total, seen = _sums(texts, cells, counted)
                if number is not None and seen and math.isclose(number, total, rel_tol=1e-9):
                    del why[cell]
                    break
    return why


def audit(table: Table, reshaped: Reshaped, recipe: Recipe | None = None) -> Audit:
    """Account for every non-empty cell of `table` (and any other input) under `reshaped`.

    `recipe` is accepted so callers hand over everything the audit is about; the facts
    themselves come from the provenance that applying the recipe recorded.
    """
    if not any(t is table for t in reshaped.index.tables):
        raise ValueError("audit: this Reshaped was not made from this table")
    texts = _input_texts(reshaped)
    best, pieces = _ranks(reshaped, texts)
    filled = np.flatnonzero(texts != None)  # noqa: E711
    counts = np.bincount(best[filled], minlength=10)
    kept = {name: int(counts[r]) for r, name in enumerate(KEPT)}
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
    total_why = _total_mismatches(reshaped, texts, best, totals) if totals else {}
    cited = set(_fragments(reshaped)[0].tolist()) if (best[filled] == 9).any() else set()
    dropped: list[AuditCell] = []
    lost: list[AuditCell] = []
    for cell in filled[best[filled] == 9].tolist():
        text = str(texts[cell])
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
        elif cell in cited:
            why = "its text was changed"
        else:
            why = "not found in the output"
        lost.append(AuditCell(place.row, place.letter, text, why, place.source))
    trimmed: list[AuditCell] = []
    for cell in filled[best[filled] == 3].tolist():
        if cell not in pieces:
            continue
        rest = _left_out(str(texts[cell]).strip(), pieces[cell])
        if not rest:
            continue
        place = reshaped.index.decode(cell * 2)
        assert place is not None
        kept_parts = ", ".join(repr(p) for p in sorted(pieces[cell]))
        why = f"kept as {kept_parts}; left out {rest!r}"
        # Digits are data (a separator or a constant label never holds one): a cut number is loss.
        target = lost if any(ch.isdigit() for ch in rest) else trimmed
        target.append(AuditCell(place.row, place.letter, str(texts[cell]), why, place.source))
    unmatched = sum(len(n.codes) for n in reshaped.notes if n.kind == "unmatched")
    collisions = sum(len(n.codes) for n in reshaped.notes if n.kind == "collision")
    return Audit(len(filled), kept, tuple(dropped), tuple(lost), unmatched, collisions, tuple(trimmed))

"""Before/after sketches of a table's shape for one recipe step, drawn as small inline SVG."""

from __future__ import annotations

from collections.abc import Callable, Mapping, Sequence
from dataclasses import dataclass
from html import escape
from typing import Any

Grid = tuple[str, ...]
"""One sketched table: a string per row, a character per cell (see CELL)."""

CELL: dict[str, tuple[str, str, float, str]] = {
    # kind: (fill, stroke, stroke width, extra mark) — the marks keep kinds apart in black and white
    "h": ("#c9d6e3", "#5b6b7d", 1.0, ""),  # header
    "k": ("#e8a33d", "#7a4a00", 2.0, "dot"),  # header that moves or is new
    "d": ("#ffffff", "#8a9bb0", 1.0, ""),  # data
    "v": ("#fbe3bd", "#7a4a00", 2.0, "dot"),  # data that moves or is new
    "x": ("#f4c7c3", "#9b2c22", 1.0, "cross"),  # dropped
    "t": ("#5b6b7d", "#2f3a45", 1.0, ""),  # section title
    ".": ("#ffffff", "#8a9bb0", 1.0, "dash"),  # empty cell
}
CELL_W, CELL_H, GAP, PAD, ARROW, LABEL_H = 30, 18, 3, 10, 60, 16


@dataclass(frozen=True)
class Sketch:
    """What a step does to a table's shape: tables before, tables after, and a sentence saying it."""

    before: tuple[Grid, ...]
    after: tuple[Grid, ...]
    caption: str


def _names(step: Mapping[str, Any], key: str, limit: int = 3) -> str:
    value = step.get(key)
    items = [str(v) for v in value] if isinstance(value, list | tuple) else [str(value or "")]
    shown = ", ".join(items[:limit]) + (", …" if len(items) > limit else "")
    return shown or "—"


def _mapping(step: Mapping[str, Any], key: str) -> Mapping[str, Any]:
    value = step.get(key)
    return value if isinstance(value, Mapping) else {}


def _listed(step: Mapping[str, Any], key: str) -> list[Any]:
    value = step.get(key)
    return list(value) if isinstance(value, list | tuple) else []


def sketch_for(step: Mapping[str, Any]) -> Sketch:
    """The sketch of `step`; every step of the recipe vocabulary has one, unknown steps a generic one."""
    name = str(step.get("step", ""))
    s = step
    sketches: dict[str, Callable[[], Sketch]] = {
        "gather": lambda: Sketch(
            (("hhkkk", "ddvvv", "ddvvv"),),
            (("hhkv", "ddkv", "ddkv", "ddkv", "ddkv", "ddkv", "ddkv"),),
            f"Columns {_names(s, 'columns')} turn into rows: their headers become values of "
            f"{_names(s, 'names_to')} and their cells go into {_names(s, 'values_to')}. "
            "A wide block turns long.",
        ),
        "gather_groups": lambda: Sketch(
            (("hkkkk", "dvvvv", "dvvvv"),),
            (("hhkk", "dkvv", "dkvv", "dkvv", "dkvv"),),
            f"Repeated groups of columns become one row per group, numbered in {_names(s, 'names_to')}.",
        ),
        "spread": lambda: Sketch(
            (("hhkv", "ddkv", "ddkv", "ddkv", "ddkv"),),
            (("hhkk", "ddvv", "ddvv"),),
            f"The names in {_names(s, 'names_from')} become columns holding {_names(s, 'values_from')}. "
            "A long block turns wide.",
        ),
        "split_column": lambda: Sketch(
            (("hhk", "ddv", "ddv", "ddv"),),
            (("hhkk", "ddvv", "ddvv", "ddvv"),),
            f"Column {_names(s, 'column')} holds two things at once; it splits into {_names(s, 'into')}.",
        ),
        "explode": lambda: Sketch(
            (("hhk", "ddv", "ddv"),),
            (("hhk", "ddv", "ddv", "ddv", "ddv"),),
            f"Cells of {_names(s, 'column')} list several items; each item gets its own row.",
        ),
        "fill_down": lambda: Sketch(
            (("khh", "vdd", ".dd", ".dd", "vdd", ".dd"),),
            (("khh", "vdd", "vdd", "vdd", "vdd", "vdd"),),
            f"Empty cells of {_names(s, 'columns')} meant 'same as above'; they are filled in.",
        ),
        "drop_rows": lambda: Sketch(
            (("hhh", "ddd", "ddd", "xxx", "xxx"),),
            (("hhh", "ddd", "ddd"),),
            f"Rows {_names(s, 'rows', 5)} are not data ({s.get('reason', 'notes')}); they are set aside.",
        ),
        "drop_columns": lambda: Sketch(
            (("hhhx", "dddx", "dddx"),),
            (("hhh", "ddd", "ddd"),),
            f"Columns {_names(s, 'columns', 5)} are not data ({s.get('reason', 'notes')}); "
            "they are set aside.",
        ),
        "transpose": lambda: Sketch(
            (("kddd", "kddd", "kddd"),),
            (("kkk", "ddd", "ddd", "ddd"),),
            "The table is printed sideways: its rows become columns and its columns rows.",
        ),
        "header": lambda: Sketch(
            (("kkk", "kkk", "ddd", "ddd"),) if s.get("rows") else (("ddd", "ddd"),),
            (("kkk", "ddd", "ddd"),),
            f"Rows {_names(s, 'rows')} together name the columns."
            if s.get("rows")
            else f"The file has no header row; the columns are named {_names(s, 'names')}.",
        ),
        "lift_titles": lambda: Sketch(
            (("hhh", "t..", "ddd", "ddd", "t..", "ddd"),),
            (("khhh", "vddd", "vddd", "vddd"),),
            f"Section titles (rows {_names(s, 'rows')}) move into a new column {_names(s, 'into')}.",
        ),
        "add_row_id": lambda: Sketch(
            (("hhh", "ddd", "ddd"),),
            (("khhh", "vddd", "vddd"),),
            f"A column {_names(s, 'name')} keeps each row's number, so every row stays traceable.",
        ),
        "rename": lambda: Sketch(
            (("hkh", "ddd", "ddd"),),
            (("hkh", "ddd", "ddd"),),
            "Columns are renamed: " + ", ".join(f"{a} → {b}" for a, b in _mapping(s, "columns").items()),
        ),
        "split_by_unit": lambda: Sketch(
            (("hkkh", "dvvd", "dvvd", "dvvd", "dvvd"),),
            (("hkk", "dvv", "dvv"), ("hh", "dd", "dd", "dd", "dd")),
            "One table holds two kinds of row; it becomes "
            + ", ".join(str(t.get("name", "?")) for t in _listed(s, "tables") if isinstance(t, Mapping))
            + ", one table per kind.",
        ),
        "stack_files": lambda: Sketch(
            (("hh", "dd", "dd"), ("hh", "dd", "dd")),
            (("khh", "vdd", "vdd", "vdd", "vdd"),),
            f"Files of the same kind are stacked into one table; a column {_names(s, 'column')} "
            "keeps what each file's name said.",
        ),
        "join_files": lambda: Sketch(
            (("kh", "vd", "vd"), ("kh", "vd", "vd")),
            (("khh", "vdd", "vdd"),),
            f"Files about the same units are joined on {_names(s, 'on')}; a unit in one file only "
            "keeps its row, with empty cells for the other file's columns.",
        ),
    }
    if name in sketches:
        return sketches[name]()
    return Sketch(
        (("hhh", "ddd", "ddd"),), (("hhh", "ddd", "ddd"),), f"The table is reshaped by step {name}."
    )


def _grid_size(grid: Grid) -> tuple[int, int]:
    cols = max((len(r) for r in grid), default=0)
    return cols * (CELL_W + GAP) - GAP, len(grid) * (CELL_H + GAP) - GAP


def _cells(grid: Grid, left: int, top: int) -> list[str]:
    parts: list[str] = []
    for r, line in enumerate(grid):
        for c, kind in enumerate(line):
            fill, stroke, width, mark = CELL[kind]
            x, y = left + c * (CELL_W + GAP), top + r * (CELL_H + GAP)
            dash = ' stroke-dasharray="2 2"' if mark == "dash" else ""
            parts.append(
                f'<rect x="{x}" y="{y}" width="{CELL_W}" height="{CELL_H}" fill="{fill}" '
                f'stroke="{stroke}" stroke-width="{width}"{dash}/>'
            )
            if mark == "dot":
                parts.append(f'<circle cx="{x + CELL_W / 2}" cy="{y + CELL_H / 2}" r="3" fill="{stroke}"/>')
            elif mark == "cross":
                parts.append(
                    f'<path d="M{x} {y}L{x + CELL_W} {y + CELL_H}M{x + CELL_W} {y}L{x} {y + CELL_H}" '
                    f'stroke="{stroke}"/>'
                )
    return parts


def _blocks(grids: Sequence[Grid], left: int, top: int) -> tuple[list[str], int, int]:
    """Draw grids side by side from (left, top); return the parts, the right edge and the height."""
    parts: list[str] = []
    height = 0
    for grid in grids:
        w, h = _grid_size(grid)
        parts += _cells(grid, left, top)
        left += w + 3 * GAP + CELL_W // 2
        height = max(height, h)
    return parts, left - (3 * GAP + CELL_W // 2), height


def svg(step: Mapping[str, Any]) -> str:
    """Inline SVG (no scripts, no external references) of `step`'s before and after shapes."""
    sketch = sketch_for(step)
    before, right, h1 = _blocks(sketch.before, PAD, PAD)
    arrow_x = right + 8
    after, right, h2 = _blocks(sketch.after, arrow_x + ARROW, PAD)
    label_y = PAD + max(h1, h2) + LABEL_H - 4
    labels = (
        f'<text x="{PAD}" y="{label_y}" font-size="12" fill="#5b6b7d">before</text>'
        f'<text x="{arrow_x + ARROW}" y="{label_y}" font-size="12" fill="#5b6b7d">after</text>'
    )
    width, height = right + PAD, max(h1, h2) + 2 * PAD + LABEL_H
    mid = PAD + min(h1, h2) // 2
    tip = arrow_x + ARROW - 6
    arrow = (
        f'<path d="M{arrow_x} {mid}H{arrow_x + ARROW - 12}" stroke="#2f3a45" stroke-width="2"/>'
        f'<path d="M{tip - 8} {mid - 5}L{tip} {mid}L{tip - 8} {mid + 5}Z" fill="#2f3a45"/>'
    )
    title = escape(f"Before and after: {sketch.caption}")
    return (
        f'<svg xmlns="http://www.w3.org/2000/svg" class="sketch" width="{width}" height="{height}" '
        f'viewBox="0 0 {width} {height}" role="img" aria-label="{title}"><title>{title}</title>'
        + "".join([*before, arrow, *after, labels])
        + "</svg>"
    )

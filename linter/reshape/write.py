"""Writing a tidy result: table(s) as RFC 4180 CSV, the recipe and the audit, into an output folder."""

from __future__ import annotations

import io
import json
import re
from dataclasses import dataclass
from pathlib import Path
from typing import Any

import pandas as pd

from linter.errors import WeirError
from linter.output import write_text_atomic
from linter.reshape.apply import Reshaped
from linter.reshape.audit import Audit
from linter.reshape.codegen import pandas_code
from linter.reshape.recipe import Recipe, dumps_recipe
from linter.table import Table

AUDIT_FORMAT = 1


@dataclass(frozen=True)
class Written:
    """What `write_tidy` put into the output folder."""

    tables: tuple[Path, ...]
    """The tidy CSV files (none when the recipe loses data and loss was not allowed)."""
    origins: tuple[Path, ...]
    """Beside each tidy CSV, when asked for: the input cell (`C7`) behind every output cell."""
    recipe: Path
    audit: Path
    code: Path | None


def csv_text(frame: pd.DataFrame) -> str:
    """RFC 4180 text: CRLF line ends, fields with comma, quote or line break quoted; empty = None."""
    buffer = io.StringIO()
    frame.fillna("").to_csv(buffer, index=False, lineterminator="\r\n")
    return buffer.getvalue()


def _file_name(name: str) -> str:
    safe = re.sub(r"[^\w.\-]+", "_", name).strip("._")
    return safe or "table"


def audit_json(table: Table, reshaped: Reshaped, result: Audit) -> dict[str, Any]:
    outputs = {
        name: {"rows": int(frame.shape[0]), "columns": [str(c) for c in frame.columns]}
        for name, frame in reshaped.tables.items()
    }
    return {
        "weir_audit": AUDIT_FORMAT,
        "input": table.source,
        "sheet": table.sheet,
        **result.to_json(),
        "outputs": outputs,
    }


def write_tidy(
    out_dir: Path,
    table: Table,
    reshaped: Reshaped,
    result: Audit,
    recipe: Recipe,
    *,
    allow_loss: bool = False,
    with_code: bool = True,
    with_origins: bool = False,
) -> Written:
    """Write into `out_dir` (created if needed). Never overwrites an input file: a clash is a WeirError.

    The audit and the recipe are always written; the tidy tables only when the audit is
    lossless or `allow_loss` is set, so a lossy recipe never passes for a complete result.
    """
    if out_dir.exists() and not out_dir.is_dir():
        raise WeirError(f"output folder {out_dir} is a file, not a folder")
    stem = _file_name(Path(table.source).stem)
    planned = {
        "recipe": out_dir / f"{stem}.recipe.json",
        "audit": out_dir / f"{stem}.audit.json",
        **({"code": out_dir / f"{stem}.tidy.py"} if with_code else {}),
    }
    write_tables = result.lossless or allow_loss
    table_paths = [out_dir / f"{_file_name(name)}.csv" for name in reshaped.tables] if write_tables else []
    inputs = {Path(t.source).resolve() for t in reshaped.index.tables}
    for path in [*planned.values(), *table_paths]:
        if path.resolve() in inputs:
            raise WeirError(f"refusing to overwrite the input {path}; choose another output folder")
    if len(set(table_paths)) != len(table_paths):
        raise WeirError("two output tables would get the same file name; rename them in the recipe")
    origin_paths = [p.with_name(f"{p.stem}.origins.csv") for p in table_paths] if with_origins else []
    for path in origin_paths:
        if path.resolve() in inputs:
            raise WeirError(f"refusing to overwrite the input {path}; choose another output folder")
    if write_tables:
        for path, frame in zip(table_paths, reshaped.tables.values(), strict=True):
            write_text_atomic(path, csv_text(frame))
        if with_origins:
            for path, name in zip(origin_paths, reshaped.tables, strict=True):
                write_text_atomic(path, csv_text(reshaped.origin_labels(name)))
    write_text_atomic(planned["recipe"], dumps_recipe(recipe))
    audit_text = json.dumps(audit_json(table, reshaped, result), indent=2, ensure_ascii=False) + "\n"
    write_text_atomic(planned["audit"], audit_text)
    if with_code:
        write_text_atomic(planned["code"], pandas_code(recipe, Path(table.source).name, sheet=table.sheet))
    return Written(
        tuple(table_paths), tuple(origin_paths), planned["recipe"], planned["audit"], planned.get("code")
    )

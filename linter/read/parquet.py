"""Parquet files read through pyarrow, every value written as text and the header taken from the schema."""

from __future__ import annotations

from typing import Any

import numpy as np
import pandas as pd
import pyarrow as pa
import pyarrow.parquet as pq

from linter.read.cells import cell_text, number_text
from linter.read.errors import UnreadableFile, too_many_cells
from linter.read.limits import ReadLimits
from linter.table import Table


def column_texts(column: pa.ChunkedArray) -> list[str | None]:
    """Text of every value of one column; floats as the shortest text that reads back the same."""
    kind = column.type
    if pa.types.is_dictionary(kind):
        column = column.cast(kind.value_type)
        kind = column.type
    values: list[Any] = column.to_pylist()
    if pa.types.is_float32(kind) or pa.types.is_float16(kind):
        # A float32 widened to Python's float gains digits it never had (0.1 -> 0.10000000149...).
        return [None if v is None else number_text(float(str(np.float32(v))), None) for v in values]
    if pa.types.is_floating(kind):
        return [None if v is None else number_text(v, None) for v in values]
    return [cell_text(v, digits=None) for v in values]


def read_parquet(path: str, limits: ReadLimits) -> Table:
    """A Parquet file as one Table: row 1 is the schema's column names, data from row 2."""
    try:
        parquet = pq.ParquetFile(path)
        meta = parquet.metadata
        if meta.num_columns > limits.max_columns or meta.num_rows > limits.max_rows:
            raise UnreadableFile(
                "file.too-many-columns" if meta.num_columns > limits.max_columns else "file.too-many-rows",
                f"The Parquet file has {meta.num_rows:,} rows and {meta.num_columns:,} columns, beyond the "
                f"limits of {limits.max_rows:,} rows and {limits.max_columns:,} columns.",
                "Split the submission into smaller files.",
            )
        if meta.num_columns * meta.num_rows > limits.max_cells:
            raise too_many_cells(limits)
        data = parquet.read()
    except (pa.ArrowException, ValueError, OSError) as error:
        # pyarrow reports damaged metadata as OSError ("Couldn't deserialize thrift"); the file
        # itself was already opened and read by read_path, so here it means corrupt content.
        raise UnreadableFile(
            "file.corrupt",
            f"The Parquet file cannot be read: {error}.",
            "Write the file again with a Parquet library, or send it as CSV UTF-8.",
        ) from None
    names: list[str | None] = [name if name != "" else None for name in data.schema.names]
    try:
        columns = [column_texts(data.column(i)) for i in range(data.num_columns)]
    except UnicodeDecodeError:
        # Parquet text must be UTF-8; pyarrow only finds out when a value is taken out.
        raise UnreadableFile(
            "file.corrupt",
            "The Parquet file has a text column holding bytes that are not UTF-8, which Parquet "
            "does not allow.",
            "Write the file again with a Parquet library, or send it as CSV UTF-8.",
        ) from None
    rows = [names, *map(list, zip(*columns, strict=True))] if columns else [names]
    if data.num_rows == 0 and not names:
        raise UnreadableFile("file.empty", "The Parquet file has no columns.", "Send the table again.")
    grid = pd.DataFrame(rows, dtype=object)
    return Table(
        source=path,
        sheet=None,
        grid=grid,
        row_numbers=tuple(range(1, len(rows) + 1)),
        format="parquet",
    )

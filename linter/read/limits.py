"""The bounds the reader enforces so that no submitted file can exhaust memory or hang Weir."""

from __future__ import annotations

from dataclasses import dataclass

MAX_FILE_BYTES = 512 * 1024 * 1024
"""Larger files are refused before a byte is parsed."""
MAX_LINE_CHARS = 1_000_000
"""A physical line longer than this stops reading (a runaway line or a file that is not a table)."""
MAX_CELL_CHARS = 32_767
# From memory of Excel's published specifications and limits: a cell holds at most 32,767 characters.
MAX_COLUMNS = 16_384
# From memory of Excel's published specifications and limits: 16,384 columns (XFD) per worksheet.
MAX_ROWS = 1_048_576
# From memory of Excel's published specifications and limits: 1,048,576 rows per worksheet.
MAX_CELLS = 20_000_000
"""Cells per table; each is a Python string, so this bounds memory at a few GB at worst."""
MAX_UNCOMPRESSED_BYTES = 1024 * 1024 * 1024
"""Declared inflated size of all members of a workbook archive; more is treated as a zip bomb."""
MAX_COMPRESSION_RATIO = 200
"""Declared inflated/compressed size of one archive member; real workbooks stay far below."""
MAX_SHEETS = 1_000
"""Worksheets per workbook; a submission holds a few, so hundreds means a generated or hostile file."""
# Common practice (no source): Excel itself caps sheets only by memory.
FULL_WORKBOOK_BYTES = 64 * 1024 * 1024
"""Workbooks declaring more XML than this are streamed: bounded memory, but merged ranges and
hidden rows/columns are then not seen (openpyxl's streaming mode does not expose them)."""


@dataclass(frozen=True)
class ReadLimits:
    """Bounds for one read; pass explicitly so settings can override the defaults."""

    max_file_bytes: int = MAX_FILE_BYTES
    """Files larger than this on disk are refused (`file.too-large`)."""
    max_line_chars: int = MAX_LINE_CHARS
    """Longest physical line of a text file (`file.line-too-long`)."""
    max_cell_chars: int = MAX_CELL_CHARS
    """Longest single cell, quoted newlines included (`file.cell-too-long`)."""
    max_columns: int = MAX_COLUMNS
    """Widest row (`file.too-many-columns`)."""
    max_rows: int = MAX_ROWS
    """Most rows per table (`file.too-many-rows`)."""
    max_cells: int = MAX_CELLS
    """Most cells (rows x columns) per table (`file.too-many-cells`)."""
    max_uncompressed_bytes: int = MAX_UNCOMPRESSED_BYTES
    """Total declared size of a workbook's archive members (`file.zip-bomb`)."""
    max_compression_ratio: int = MAX_COMPRESSION_RATIO
    """Declared inflation ratio of any one archive member (`file.zip-bomb`)."""
    max_sheets: int = MAX_SHEETS
    """Most worksheets per workbook, counted in the archive before opening (`file.too-many-sheets`)."""
    full_workbook_bytes: int = FULL_WORKBOOK_BYTES
    """Above this declared size a workbook is streamed, without merged/hidden information."""


DEFAULT_LIMITS = ReadLimits()

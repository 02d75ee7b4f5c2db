"""Rules for files that cannot be read as a table at all; the reader raises them, `check` reports them."""

from __future__ import annotations

from linter.findings import Severity
from linter.rules.registry import define_rule

NOT_A_TABLE = define_rule(
    "file.not-a-table",
    "The file is not a table",
    Severity.ERROR,
    """
    Finds files whose bytes are another kind of document (PDF, image, archive...) whatever
    their name says; the message names the kind found from the file's first bytes.

    Bad: `results.csv` that is really a PDF export (starts with `%PDF-`).
    Good: `results.csv` holding the rows as comma-separated text.
    """,
)
EMPTY = define_rule(
    "file.empty",
    "The file holds no data",
    Severity.ERROR,
    """
    Finds files of 0 bytes, text files with only blank lines and workbooks whose sheets are all empty.

    Bad: an upload that stopped before any byte arrived (0 bytes).
    Good: a header line followed by at least one data line.
    """,
)
ENCODING_UNKNOWN = define_rule(
    "file.encoding-unknown",
    "The text encoding cannot be recognised",
    Severity.ERROR,
    """
    Finds text files that are neither UTF-8 nor any encoding Weir can recognise, so their
    characters cannot be read reliably.

    Bad: bytes that decode as neither UTF-8 nor Windows-1252 (e.g. `0x81 0x8D` in running text).
    Good: the same table saved as CSV UTF-8.
    """,
)
TOO_LARGE = define_rule(
    "file.too-large",
    "The file is larger than the size limit",
    Severity.ERROR,
    """
    Finds files larger on disk than the configured maximum; they are refused before parsing.

    Bad: a 2 GB export of every year's results in one file.
    Good: one file per submission period, well below the limit.
    """,
)
LINE_TOO_LONG = define_rule(
    "file.line-too-long",
    "A line is longer than the line limit",
    Severity.ERROR,
    """
    Finds text files with a physical line longer than the limit (a file whose line breaks were
    lost, or a file that is not a table); reading stops at that line, without loading it whole.

    Bad: a 200 MB file that is one single line.
    Good: one record per line, each a few hundred characters.
    """,
)
CELL_TOO_LONG = define_rule(
    "file.cell-too-long",
    "A cell is longer than the cell limit",
    Severity.ERROR,
    """
    Finds a cell longer than the cell limit (by default the 32,767 characters a spreadsheet
    cell can hold), most often caused by a quote that is never closed.

    Bad: `VB-014,"2024-03-05,4.2` followed by thousands of lines swallowed into one cell.
    Good: `VB-014,2024-03-05,4.2` (quotes only around cells that need them, always closed).
    """,
)
TOO_MANY_COLUMNS = define_rule(
    "file.too-many-columns",
    "A row has more cells than the column limit",
    Severity.ERROR,
    """
    Finds rows with more cells than the column limit, usually a wrong delimiter or data
    written across instead of down.

    Bad: one row per site with 20,000 daily readings across.
    Good: one row per site and day, with a `sampled_on` column.
    """,
)
TOO_MANY_ROWS = define_rule(
    "file.too-many-rows",
    "The table has more rows than the row limit",
    Severity.ERROR,
    """
    Finds tables with more rows than the row limit (by default a spreadsheet's 1,048,576).

    Bad: ten years of readings in one file of 3 million rows.
    Good: one file per year.
    """,
)
TOO_MANY_CELLS = define_rule(
    "file.too-many-cells",
    "The table has more cells than the cell limit",
    Severity.ERROR,
    """
    Finds tables with more cells (rows times columns) than the limit, which bounds the memory
    one submission may take.

    Bad: 40,000 rows of 1,000 columns each in one file.
    Good: the same readings as a long table (site, date, variable, value), split by year.
    """,
)
ZIP_BOMB = define_rule(
    "file.zip-bomb",
    "The workbook would inflate far beyond its size",
    Severity.ERROR,
    """
    Finds workbooks whose archive declares an inflated size or ratio beyond the limits; they
    are refused before anything is inflated.

    Bad: a 40 KB `.xlsx` that declares 10 GB of sheet XML.
    Good: a workbook saved normally by a spreadsheet program.
    """,
)
CORRUPT = define_rule(
    "file.corrupt",
    "The workbook or Parquet file is damaged",
    Severity.ERROR,
    """
    Finds workbooks and Parquet files that cannot be opened: a truncated upload, a damaged
    archive, XML that does not parse.

    Bad: an `.xlsx` cut off half-way through the upload.
    Good: the same workbook saved again and uploaded completely.
    """,
)
ENCRYPTED = define_rule(
    "file.encrypted",
    "The workbook is password-protected",
    Severity.ERROR,
    """
    Finds workbooks saved with a password to open, whose cells cannot be read.

    Bad: `results.xlsx` protected with "Encrypt with password".
    Good: the same workbook saved without a password, sent through the agreed channel.
    """,
)
UNSUPPORTED_FORMAT = define_rule(
    "file.unsupported-format",
    "The file is an old binary spreadsheet",
    Severity.ERROR,
    """
    Finds Excel 97-2003 `.xls` workbooks and other OLE documents, which Weir does not read.

    Bad: `results.xls` (binary Excel 97-2003 format).
    Good: `results.xlsx` or `results.csv` saved as CSV UTF-8.
    """,
)

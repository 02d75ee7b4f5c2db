"""`weir tidy INPUT --out OUTDIR`: find (or re-run) the recipe that makes a table tidy, write it."""

from __future__ import annotations

from pathlib import Path

import typer

from linter.cli.app import app, guarded
from linter.errors import WeirError


@app.command()
@guarded
def tidy(
    inputs: list[Path] = typer.Argument(
        ...,
        help="The submitted file (CSV, TSV, xlsx or Parquet), or several files or a folder of one "
        "submission; never modified.",
        metavar="INPUT",
    ),
    out: Path = typer.Option(..., "--out", "-o", help="Folder for the tidy CSV, recipe.json and audit.json."),
    contract: Path | None = typer.Option(
        None, "--contract", "-c", help="Contract whose keys guide the choice."
    ),
    recipe: Path | None = typer.Option(
        None,
        "--recipe",
        help="Re-run this saved recipe instead of searching (for several files: the recipe.json "
        "that combined them, given the same files in the same order).",
    ),
    drop_empty: bool = typer.Option(False, "--drop-empty", help="Drop rows kept only for an empty cell."),
) -> int:
    """Reshape a table into tidy form; exit 0 when written, 2 if Weir could not.

    Several files (or a folder) of one submission: each is tidied on its own into OUT/files/.
    Files with the same columns and a value in their names are then stacked into OUT/<name>.csv.
    Files with different variables about the same keys are outer-joined into OUT/<name>.csv.
    recipe.json and audit.json go beside it; keys found in one file only are kept and listed.
    """
    from linter.check import governing
    from linter.config import find_settings
    from linter.contract.model import TableContract
    from linter.deadline import TimedOut, time_limit
    from linter.limits import Limits
    from linter.read import UnreadableFile, read_path
    from linter.reshape.tidy_run import TidyResult, tidy_tables, write_outputs

    if len(inputs) > 1 or inputs[0].is_dir():
        from linter.reshape.tidy_files import submitted_files

        files = submitted_files(inputs)
        if len(files) < 2:
            raise WeirError(f"{inputs[0]}: a submission needs two or more data files")
    else:
        files = inputs
    input = files[0]
    if not input.is_file():
        raise WeirError(f"no such file: {input}")
    if out.exists() and not out.is_dir():
        raise WeirError(f"--out must be a folder, and {out} is a file")
    if recipe is not None and not recipe.is_file():
        raise WeirError(f"no such recipe file: {recipe}")
    settings = find_settings(Path.cwd())
    bounds = settings.bounds if settings else Limits()
    loaded = []
    if contract is not None:
        if not contract.is_file():
            raise WeirError(f"no such contract file: {contract}")
        from linter.contract.load import load_contract

        loaded = [load_contract(str(contract), bounds)]

    def tidied(path: Path) -> tuple[Path, list[TidyResult], TableContract | None]:
        try:
            with time_limit(bounds.seconds_per_file):
                tables = read_path(str(path), bounds.read)
        except UnreadableFile as error:
            raise WeirError(f"{path}: {error.message}") from None
        except TimedOut:
            raise WeirError(f"{path}: not read within {bounds.seconds_per_file:g} seconds") from None
        if not tables:
            raise WeirError(f"{path}: no table found in the file")
        own = recipe if len(files) == 1 else None
        rules = governing(str(path), loaded)[1] if loaded else None
        return path, tidy_tables(tables, rules, recipe_path=own, keep_empty=not drop_empty), rules

    if len(files) > 1:
        from linter.reshape.tidy_files import tidy_submission

        lines = tidy_submission([tidied(f) for f in files], out, recipe)
    else:
        lines = write_outputs(tidied(input)[1], input, out)
    for line in lines:
        typer.echo(line)
    return 0

"""`weir tidy INPUT --out OUTDIR`: find (or re-run) the recipe that makes a table tidy, write it."""

from __future__ import annotations

from pathlib import Path

import typer

from linter.cli.app import app, guarded
from linter.errors import WeirError


@app.command()
@guarded
def tidy(
    input: Path = typer.Argument(..., help="The submitted file (CSV, TSV, xlsx or Parquet); never modified."),
    out: Path = typer.Option(..., "--out", "-o", help="Folder for the tidy CSV, recipe.json and audit.json."),
    contract: Path | None = typer.Option(
        None, "--contract", "-c", help="Contract whose keys guide the choice."
    ),
    recipe: Path | None = typer.Option(
        None, "--recipe", help="Re-run this saved recipe instead of searching."
    ),
    drop_empty: bool = typer.Option(False, "--drop-empty", help="Drop rows kept only for an empty cell."),
) -> int:
    """Reshape a table into tidy form; exit 0 when written, 2 if Weir could not."""
    from linter.check import governing
    from linter.config import find_settings
    from linter.deadline import TimedOut, time_limit
    from linter.limits import Limits
    from linter.read import UnreadableFile, read_path
    from linter.reshape.tidy_run import tidy_tables, write_outputs

    if not input.is_file():
        raise WeirError(f"no such file: {input}")
    if out.exists() and not out.is_dir():
        raise WeirError(f"--out must be a folder, and {out} is a file")
    if recipe is not None and not recipe.is_file():
        raise WeirError(f"no such recipe file: {recipe}")
    settings = find_settings(Path.cwd())
    bounds = settings.bounds if settings else Limits()
    rules = None
    if contract is not None:
        if not contract.is_file():
            raise WeirError(f"no such contract file: {contract}")
        from linter.contract.load import load_contract

        rules = governing(str(input), [load_contract(str(contract), bounds)])[1]
    try:
        with time_limit(bounds.seconds_per_file):
            tables = read_path(str(input), bounds.read)
    except UnreadableFile as error:
        raise WeirError(f"{input}: {error.message}") from None
    except TimedOut:
        raise WeirError(f"{input}: not read within {bounds.seconds_per_file:g} seconds") from None
    if not tables:
        raise WeirError(f"{input}: no table found in the file")
    results = tidy_tables(tables, rules, recipe_path=recipe, keep_empty=not drop_empty)
    for line in write_outputs(results, input, out):
        typer.echo(line)
    return 0

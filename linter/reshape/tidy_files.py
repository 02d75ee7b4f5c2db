"""`weir tidy` over the files of one submission: each file tidied on its own, then stacked or
joined into one table when the check's own evidence says they hold one observational unit."""

from __future__ import annotations

import json
from collections.abc import Sequence
from dataclasses import dataclass
from pathlib import Path, PurePath
from typing import Any

import pandas as pd

from linter.contract.model import TableContract
from linter.output import write_text_atomic
from linter.reshape.apply import Reshaped
from linter.reshape.audit import Audit, audit
from linter.reshape.join_files import ONE_FILE_ONLY, JoinFiles, texts_of
from linter.reshape.normalise import StackFiles, apply_recipe_to_tables
from linter.reshape.recipe import Recipe
from linter.reshape.steps import RecipeError, StepParams
from linter.reshape.tidy_run import TidyResult
from linter.rules.subject import Subject
from linter.rules.submission_units import split_over_files, stacked_files
from linter.table import Table, first_row_header


@dataclass(frozen=True)
class Combined:
    """The files of a submission made into one table, with the recipe and its audit."""

    name: str
    output: pd.DataFrame
    recipe: Recipe
    audit: Audit
    one_file_only: tuple[dict[str, Any], ...]
    """Key cells of units that only one file has (kept as rows with empty cells elsewhere)."""


def as_table(result: TidyResult, source: str) -> Table:
    """A file's tidy output as a Table (header row first), so the combining step sees tidy tables.

    A file its own recipe left unchanged is used as read, so the audit names the provider's rows."""
    if not result.recipe["steps"]:
        return result.table
    frame = result.output
    grid = pd.DataFrame([list(map(str, frame.columns)), *frame.astype(object).values.tolist()], dtype=object)
    grid.columns = pd.RangeIndex(grid.shape[1])
    grid = grid.where(grid.notna(), None)
    return Table(source, result.table.sheet, grid, tuple(range(1, len(grid) + 1)))


def combining_step(
    tables: Sequence[Table], contracts: Sequence[TableContract | None] = ()
) -> StepParams | None:
    """The stack or join the submission rules suggest for these tables, None when they suggest neither.

    `contracts` (one per table, if given) matter as in `weir check`: governed files are the agreed
    delivery and are not stacked, and two different table contracts are a bundle, not a split."""
    governed = list(contracts) or [None] * len(tables)
    subjects = [Subject(t, first_row_header(t), c) for t, c in zip(tables, governed, strict=True)]
    everyone = {t.label for t in tables}
    for finding in stacked_files(subjects):
        if set(finding.evidence["files"]) == everyone and finding.step is not None:
            return StackFiles.from_json(finding.step)
    joins = [f for f in split_over_files(subjects) if f.rule == "units.split-over-files"]
    if not joins:
        return None
    key = tuple(joins[0].evidence["key"])
    linked = {label for f in joins if tuple(f.evidence["key"]) == key for label in f.evidence["files"]}
    if linked != everyone or joins[0].step is None:
        return None  # some file holds another unit: combining all of them would mislead
    if len(tables) > 2:
        # The pair's step names the columns two files share; a join of more needs those in all.
        frames = [first_row_header(t).body for t in tables]
        shared = [c for c in frames[0].columns if all(c in f.columns for f in frames[1:])]
        return JoinFiles(tuple(dict.fromkeys([*key, *shared])))
    return JoinFiles.from_json(joins[0].step)


def combine(tables: Sequence[Table], recipe: Recipe) -> Combined:
    """Apply a combining recipe to the files' tables and audit every input cell."""
    reshaped = apply_recipe_to_tables(tables, recipe)
    if len(reshaped.tables) != 1:
        raise RecipeError("the recipe does not make the files into one table; nothing was combined")
    checked = audit(tables[0], reshaped, recipe)
    if not checked.lossless:
        first = checked.lost[0]
        raise RecipeError(
            f"combining the files would lose {len(checked.lost)} cell(s) "
            f"(first: {first.source} {first.letter}{first.row} {first.text!r}); nothing was written"
        )
    ((name, output),) = reshaped.tables.items()
    return Combined(name, output, recipe, checked, _one_file_only(reshaped))


def _one_file_only(reshaped: Reshaped) -> tuple[dict[str, Any], ...]:
    out = []
    for note in reshaped.notes:
        if note.kind != ONE_FILE_ONLY:
            continue
        for code, text in zip(note.codes, texts_of(reshaped.index, note.codes), strict=True):
            place = reshaped.index.decode(code)
            if place is not None:
                out.append({"file": place.source, "row": place.row, "column": place.letter, "text": text})
    return tuple(out)


def write_combined(combined: Combined, out: Path, sources: Sequence[str]) -> list[str]:
    """Write DIR/<name>.csv, recipe.json and audit.json for the combined table."""
    target = out / f"{PurePath(combined.name).name}.csv"
    if any(target.resolve() == Path(s).resolve() for s in sources):
        raise RecipeError(f"the combined CSV would overwrite the input {target}; choose another --out folder")
    # Source: RFC 4180 §2 rule 1 (records end with CRLF).
    write_text_atomic(target, combined.output.to_csv(index=False, lineterminator="\r\n"))
    recipe = combined.recipe.to_json()
    write_text_atomic(out / "recipe.json", json.dumps(recipe, indent=2, ensure_ascii=False) + "\n")
    audited = combined.audit.to_json()
    audited["files"] = list(sources)
    audited["one_file_only"] = list(combined.one_file_only)
    write_text_atomic(out / "audit.json", json.dumps(audited, indent=2, ensure_ascii=False) + "\n")
    step = recipe["steps"][-1]["step"] if recipe["steps"] else "none"
    lone = len(combined.one_file_only)
    return [
        f"{target}: {len(combined.output)} rows, {combined.output.shape[1]} columns "
        f"({step} of {len(sources)} files; audit: "
        f"{'lossless' if combined.audit.lossless else 'cells lost'}"
        + (f"; {lone} key cell(s) in one file only, kept with empty cells" if lone else "")
        + ")"
    ]


SUBMITTED_SUFFIXES = (".csv", ".tsv", ".txt", ".xlsx", ".parquet")


def submitted_files(paths: Sequence[Path]) -> list[Path]:
    """The files named, a folder standing for the data files directly inside it (in name order)."""
    files: list[Path] = []
    for path in paths:
        if path.is_dir():
            files += sorted(
                p for p in path.iterdir() if p.is_file() and p.suffix.lower() in SUBMITTED_SUFFIXES
            )
        elif path.is_file():
            files.append(path)
        else:
            raise RecipeError(f"no such file or folder: {path}")
    if len({p.resolve() for p in files}) != len(files):
        raise RecipeError("a file is named twice; name each file once")
    return files


def tidy_submission(
    tidied: Sequence[tuple[Path, list[TidyResult], TableContract | None]], out: Path, recipe_path: Path | None
) -> list[str]:
    """Write each file's own tidy output to DIR/files/<stem>/, then the combined table (if any)."""
    from linter.reshape.recipe import load_recipe
    from linter.reshape.tidy_run import write_outputs

    stems = [source.stem or "table" for source, _, _ in tidied]
    repeated = sorted({s for s in stems if stems.count(s) > 1})
    if repeated:  # each file's own output goes to files/<stem>/: two of them would overwrite each other
        raise RecipeError(
            f"two files are named {repeated[0]!r}; give the files of a submission different names"
        )
    tables: list[Table] = []
    contracts: list[TableContract | None] = []
    for source, results, contract in tidied:
        tables += [as_table(r, str(source)) for r in results]
        contracts += [contract] * len(results)
    combined: Combined | None = None
    why = "the files do not hold one observational unit between them"
    if recipe_path is not None:  # a saved recipe that does not fit stops the run before anything is written
        combined = combine(tables, load_recipe(recipe_path))
    elif (step := combining_step(tables, contracts)) is not None:
        try:
            combined = combine(tables, Recipe.of([step]))
        except RecipeError as err:  # a suggestion that does not fit is reported, not fatal
            why = f"the files were not combined ({err})"
    lines: list[str] = []
    for source, results, _ in tidied:
        lines += write_outputs(results, source, out / "files" / (source.stem or "table"))
    if combined is None:
        return [*lines, f"{why}; each was tidied on its own"]
    return lines + write_combined(combined, out, [str(s) for s, _, _ in tidied])

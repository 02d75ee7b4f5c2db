"""Scores `weir tidy` on the layout corpus: top-1 accuracy and the false-alarm rate on tidy tables.

A case counts when the tidy CSV equals the expected CSV with column names, column order and row
order ignored, numbers compared as numbers, and extra output rows allowed only when they hold an
explicitly kept empty value (a gathered cell the provider left blank). A tidy case is a false
alarm when `weir check` reports any layout error on it.

Run: python benchmarks/layout_accuracy.py [CORPUS_FOLDER]
"""

from __future__ import annotations

import csv
import io
import sys
import tempfile
from collections import Counter
from dataclasses import dataclass
from itertools import permutations
from pathlib import Path

REPO = Path(__file__).resolve().parent.parent
CORPUS = REPO / "tests" / "reference" / "layout_corpus"


def _cell(text: str | None) -> str:
    text = (text or "").strip()
    try:
        number = float(text.replace(",", "")) if text and text[0] not in "<>" else None
    except ValueError:
        number = None
    return repr(number) if number is not None and text.lower() not in ("nan", "inf") else text


def read_rows(text: str) -> tuple[list[str], list[tuple[str, ...]]]:
    rows = list(csv.reader(io.StringIO(text)))
    if not rows:
        return [], []
    width = len(rows[0])
    body = [tuple(_cell(r[i] if i < len(r) else "") for i in range(width)) for r in rows[1:]]
    return rows[0], body


def _fits(expected: list[tuple[str, ...]], output: list[tuple[str, ...]], order: tuple[int, ...]) -> bool:
    arranged = Counter(tuple(row[i] for i in order) for row in output)
    wanted = Counter(expected)
    if any(arranged[row] < n for row, n in wanted.items()):
        return False
    extra = arranged - wanted
    return all("" in row for row in extra.elements())


def same_content(expected_text: str, output_text: str) -> bool:
    """True when the output holds the expected table (see the module docstring for the rules)."""
    _, expected = read_rows(expected_text)
    _, output = read_rows(output_text)
    width = len(expected[0]) if expected else 0
    if not expected or not output or len(output[0]) != width or len(output) < len(expected):
        return False
    # Columns are matched by content: an output column may stand for an expected one only if it
    # holds every expected value of that column (extra rows may add values).
    options: list[list[int]] = []
    for j in range(width):
        need = Counter(row[j] for row in expected)
        options.append([k for k in range(width) if not need - Counter(row[k] for row in output)])
    if any(not o for o in options):
        return False
    if width > 9:
        order = tuple(o[0] for o in options)
        return len(set(order)) == width and _fits(expected, output, order)
    return any(
        all(order[j] in options[j] for j in range(width)) and _fits(expected, output, order)
        for order in permutations(range(width))
    )


def case_family(folder: Path) -> str:
    """The `family:` line of a case.yaml; other keys (source_style, why) may follow it."""
    lines = (folder / "case.yaml").read_text(encoding="utf-8").splitlines()
    return next((line.split(":", 1)[1].strip() for line in lines if line.startswith("family:")), "")


@dataclass(frozen=True)
class CaseResult:
    name: str
    family: str
    correct: bool
    layout_errors: int
    message: str = ""


def run_case(folder: Path) -> CaseResult:
    from typer.testing import CliRunner

    from linter.check import check_paths
    from linter.cli import app

    family = case_family(folder)
    source = next(p for p in sorted(folder.iterdir()) if p.stem == "input")
    with tempfile.TemporaryDirectory() as out:
        result = CliRunner().invoke(app, ["tidy", str(source), "--out", out])
        written = sorted(p for p in Path(out).glob("*.csv"))
        if result.exit_code != 0 or len(written) != 1:
            return CaseResult(folder.name, family, False, 0, (result.output or "").strip()[-200:])
        correct = same_content(
            (folder / "expected.csv").read_text(encoding="utf-8"), written[0].read_text(encoding="utf-8")
        )
    errors = 0
    if family == "tidy":
        report = check_paths([str(source)], [])
        errors = sum(
            1 for f in report.all_findings() if f.rule.startswith("layout.") and f.severity == "error"
        )
    return CaseResult(folder.name, family, correct, errors)


def score(corpus: Path = CORPUS) -> tuple[float, float, list[CaseResult]]:
    """(top-1 accuracy over all cases, false-alarm rate over tidy cases, per-case results)."""
    results = [run_case(f) for f in sorted(corpus.iterdir()) if (f / "case.yaml").exists()]
    tidy = [r for r in results if r.family == "tidy"]
    accuracy = sum(r.correct for r in results) / len(results)
    alarms = sum(r.layout_errors > 0 or not r.correct for r in tidy) / len(tidy) if tidy else 0.0
    return accuracy, alarms, results


def main() -> None:
    corpus = Path(sys.argv[1]) if len(sys.argv) > 1 else CORPUS
    accuracy, alarms, results = score(corpus)
    for r in results:
        if not r.correct or r.layout_errors:
            print(f"MISS {r.name} ({r.family}) layout errors={r.layout_errors} {r.message}")
    tidy = sum(r.family == "tidy" for r in results)
    print(f"cases: {len(results)} (tidy: {tidy})")
    print(f"top-1 accuracy: {accuracy:.3f}")
    print(f"false alarms on tidy tables: {alarms:.3f}")


if __name__ == "__main__":
    main()

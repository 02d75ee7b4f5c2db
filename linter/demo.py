"""`make demo`: check every Vell Basin demo file as its manifest says; write its report and letter."""

from __future__ import annotations

import sys
from dataclasses import dataclass
from pathlib import Path
from typing import Any

from ruamel.yaml import YAML

from linter.errors import WeirError
from linter.output import write_text_atomic

FOLDERS = ("clean", "returned")


@dataclass(frozen=True)
class DemoRun:
    """One demo file checked: what its manifest expected, what Weir said, and what was written."""

    folder: str
    name: str
    expected_exit: int
    exit: int
    written: tuple[Path, ...]


def manifest_entries(root: Path) -> list[tuple[str, str, dict[str, Any]]]:
    found: list[tuple[str, str, dict[str, Any]]] = []
    for folder in FOLDERS:
        manifest = root / "sample_submissions" / folder / "expected.yaml"
        if not manifest.is_file():
            raise WeirError(f"no demo manifest at {manifest}; run `make demo` from the repository root")
        data = YAML(typ="safe", pure=True).load(manifest)
        found.extend((folder, name, entry) for name, entry in data["files"].items())
    return found


def run_demo(out: Path) -> list[DemoRun]:
    """Check each demo file (with the files submitted alongside it); write JSON for all, letters for returned.

    Runs from the repository root and names files relative to it, as a provider would name them,
    so the letters say `sample_submissions/...` and never a machine path.
    """
    root = Path(".")
    from linter.check import check_paths
    from linter.contract.load import load_contract
    from linter.report import html, json_report, markdown, sarif

    contracts = [load_contract(str(p)) for p in sorted((root / "contracts").glob("*.yaml"))]
    runs: list[DemoRun] = []
    for folder, name, entry in manifest_entries(root):
        base = root / "sample_submissions" / folder
        paths = [str(base / name)] + [str(base / other) for other in entry.get("submitted_with", [])]
        report = check_paths(paths, contracts)
        # The whole file name (suffix kept) names the outputs: a .csv and an .xlsx may share a stem.
        folder_out = out / folder
        outputs = {folder_out / f"{name}.report.json": json_report.render(report)}
        if report.failed:
            outputs[folder_out / f"{name}.letter.html"] = html.render(report)
            outputs[folder_out / f"{name}.letter.md"] = markdown.render(report)
            outputs[folder_out / f"{name}.sarif"] = sarif.render(report)
        for target, text in outputs.items():
            write_text_atomic(target, text)
        runs.append(DemoRun(folder, name, int(entry["exit"]), 1 if report.failed else 0, tuple(outputs)))
    return runs


def main(argv: list[str] | None = None) -> int:
    args = sys.argv[1:] if argv is None else argv
    out = Path(args[0] if args else "demo-out")
    try:
        runs = run_demo(out)
    except WeirError as error:
        print(f"weir demo: {error}", file=sys.stderr)
        return 2
    for run in runs:
        verdict = "returned" if run.exit else "accepted"
        agrees = "as expected" if run.exit == run.expected_exit else f"EXPECTED exit {run.expected_exit}"
        letter = next((p for p in run.written if p.name.endswith(".letter.html")), None)
        print(f"{run.folder}/{run.name}: {verdict} ({agrees})" + (f" -> {letter}" if letter else ""))
    wrong = [r for r in runs if r.exit != r.expected_exit]
    print(
        f"{len(runs)} demo files, {sum(r.exit for r in runs)} returned with a letter, {len(wrong)} unexpected"
    )
    return 1 if wrong else 0


if __name__ == "__main__":
    raise SystemExit(main())

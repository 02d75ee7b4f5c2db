"""`make demo`: run Weir on the invented Vell Basin submissions and write what goes back to providers.

It checks the clean files (accepted), each returned file with the files submitted beside it
(JSON report, HTML and Markdown letters), the multi-file units folder, tidies the
badly shaped layout samples and writes each contract's dictionary and fill-in workbook, then
prints one line per result. Everything lands in demo-out/.
"""

from __future__ import annotations

import contextlib
import io
import sys
from pathlib import Path

from ruamel.yaml import YAML
from typer.main import get_command

from linter.cli import app


def weir(*args: str) -> tuple[int, str]:
    """Run one `weir` command in this process; return its exit code and what it printed."""
    printed = io.StringIO()
    with contextlib.redirect_stdout(printed), contextlib.redirect_stderr(printed):
        try:
            code = get_command(app).main(list(args), prog_name="weir", standalone_mode=False)
        except SystemExit as stop:  # click's own usage errors
            code = stop.code
    return int(code or 0), printed.getvalue()


def manifest(folder: Path) -> dict[str, dict[str, object]]:
    data = YAML(typ="safe").load((folder / "expected.yaml").read_text(encoding="utf-8"))
    return data["files"]


def contract_options(samples: Path) -> list[str]:
    """`--contract` for every demo contract, so the demo works from any folder."""
    options: list[str] = []
    for path in sorted((samples.parent / "contracts").glob("*.yaml")):
        options += ["--contract", str(path)]
    return options


def check_returned(folder: Path, out: Path) -> list[tuple[str, int, int, str]]:
    rows = []
    for name, entry in manifest(folder).items():
        stem = Path(name).stem
        companions = [str(folder / f) for f in entry.get("submitted_with", [])]  # type: ignore[attr-defined]
        code, _ = weir(
            "check",
            str(folder / name),
            *companions,
            *contract_options(folder.parent),
            "--report",
            str(out / "returned" / f"{stem}.json"),
            "--letter",
            str(out / "returned" / f"{stem}.html"),
            "--markdown",
            str(out / "returned" / f"{stem}.md"),
        )
        expected = int(entry.get("exit", 1))  # type: ignore[call-overload]
        rows.append((name, code, expected, str(out / "returned" / f"{stem}.html")))
    return rows


def tidy_layouts(folder: Path, out: Path) -> list[tuple[str, int, str]]:
    rows = []
    for path in sorted(folder.glob("*.csv")):
        target = out / "tidy" / path.stem
        code, printed = weir("tidy", str(path), "--out", str(target))
        rows.append((path.name, code, printed.strip().splitlines()[-1] if printed.strip() else ""))
    return rows


def provider_forms(samples: Path, out: Path) -> list[tuple[str, int, int]]:
    """A data dictionary and a fill-in workbook for every demo contract (what a provider gets first)."""
    rows = []
    for path in sorted((samples.parent / "contracts").glob("*.yaml")):
        spec, _ = weir("dictionary", str(path), "--out", str(out / "forms" / f"{path.stem}.html"))
        form, _ = weir("template", str(path), "--out", str(out / "forms" / f"{path.stem}.xlsx"))
        rows.append((path.stem, spec, form))
    return rows


def main(samples: Path = Path("sample_submissions"), out: Path = Path("demo-out")) -> int:
    """Run the whole demo; returns 0 when every demo file got the verdict its manifest promises."""
    if not samples.is_dir():
        print("weir demo: run it from the project folder (sample_submissions/ not found)", file=sys.stderr)
        return 2
    print("Weir demo — the Vell Basin Water Network (invented data)\n")

    surprises: list[str] = []
    code, printed = weir(
        "check", str(samples / "clean"), *contract_options(samples), "--report", str(out / "clean.json")
    )
    print(f"1. Clean submissions: exit {code} — {printed.strip().splitlines()[-1]}")
    if code != 0:
        surprises.append(f"clean folder: exit {code}, expected 0")

    print("\n2. Returned submissions (a letter for each provider):")
    for name, code, expected, letter in check_returned(samples / "returned", out):
        print(f"   {'returned' if code == 1 else 'exit ' + str(code):9} {name:50} -> {letter}")
        if code != expected:
            surprises.append(f"{name}: exit {code}, expected {expected}")

    code, printed = weir(
        "check",
        str(samples / "units"),
        *contract_options(samples),
        "--report",
        str(out / "units.json"),
        "--letter",
        str(out / "units.html"),
    )
    print(f"\n3. One submission of several files (units): exit {code} — {printed.strip().splitlines()[-1]}")

    print("\n4. Badly shaped files reshaped by `weir tidy` (recipe and audit beside each):")
    for name, code, summary in tidy_layouts(samples / "layout", out):
        print(f"   {name:34} exit {code}  {summary}")

    print("\n5. Before they send: a data dictionary (.html) and a fill-in workbook (.xlsx) per contract:")
    for name, spec, form in provider_forms(samples, out):
        print(f"   {name:34} -> {out}/forms/{name}.html, {out}/forms/{name}.xlsx")
        if spec or form:
            surprises.append(f"forms for {name}: exit {spec} and {form}, expected 0")

    print(f"\nEverything is in {out}/. Open {out}/returned/*.html in a browser to read the letters.")
    for surprise in surprises:
        print(f"UNEXPECTED: {surprise}", file=sys.stderr)
    return 1 if surprises else 0


if __name__ == "__main__":
    sys.exit(main())

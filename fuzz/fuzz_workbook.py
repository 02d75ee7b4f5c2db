"""Fuzz target: a well-formed archive around a fuzzed workbook part reads or gets a verdict."""

from __future__ import annotations

import io
import sys
import zipfile

import atheris

# Only Weir's own modules are instrumented: pandas and friends are imported by them
# uninstrumented, or start-up would take minutes. Lazy imports are made here, inside.
with atheris.instrument_imports(include=["linter"]):
    import linter.read.cells
    import linter.read.excel
    import linter.read.formulas  # noqa: F401  (instrumented for coverage)
    from linter.read import UnreadableFile, read_path
    from linter.read.limits import ReadLimits

from verdicts import scratch_file


def seed_members() -> dict[str, bytes]:
    """The parts of a small invented workbook (Vell Basin site results) as openpyxl writes them."""
    from openpyxl import Workbook

    book = Workbook()
    sheet = book.active
    assert sheet is not None
    for row in (["site_id", "sampled_on", "result"], ["VB-014", "2026-03-02", 4.2], ["VB-015", None, "=B2"]):
        sheet.append(row)
    sheet.merge_cells("A5:B5")
    raw = io.BytesIO()
    book.save(raw)
    with zipfile.ZipFile(raw) as archive:
        return {name: archive.read(name) for name in archive.namelist()}


MEMBERS = seed_members()
NAMES = sorted(MEMBERS)
LIMITS = ReadLimits(max_cells=50_000, max_rows=5_000, max_columns=2_000)


def test_one_input(data: bytes) -> None:
    if not data:
        return
    # The first byte picks the part to replace; the rest is that part's new content. Stored
    # (not deflated) so the archive's checksums are right and the XML itself is what is fuzzed.
    name = NAMES[data[0] % len(NAMES)]
    members = dict(MEMBERS, **{name: data[1:]})
    raw = io.BytesIO()
    with zipfile.ZipFile(raw, "w", zipfile.ZIP_STORED) as archive:
        for member, content in members.items():
            archive.writestr(member, content)
    path = scratch_file("input.xlsx", raw.getvalue())
    try:
        read_path(path, LIMITS)
    except UnreadableFile as verdict:
        assert verdict.rule.startswith("file.") and verdict.message


if __name__ == "__main__":
    atheris.Setup(sys.argv, test_one_input)
    atheris.Fuzz()

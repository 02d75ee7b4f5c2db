"""Write the adversarial corpus: broken and hostile files a partner (or an attacker) could send.

Run `python tests/reference/adversarial/make_corpus.py` from the repository root to rebuild it;
the bytes are deterministic (fixed ZIP timestamps), so a rebuild shows no diff unless a case
changed. `manifest.json` beside this script says which verdict each file must get.
All content is invented (the Vell Basin Water Network scenario).
"""

from __future__ import annotations

import io
import random
import re
import struct
import sys
import zipfile
from collections.abc import Callable
from datetime import datetime
from pathlib import Path

HERE = Path(__file__).resolve().parent
FILES = HERE / "files"
STAMP = (2026, 3, 1, 0, 0, 0)
GOOD = "site_id,sampled_on,result\nVB-014,2026-03-02,4.2\nVB-015,2026-03-02,3.9\n"


def zipped(members: dict[str, bytes], method: int = zipfile.ZIP_DEFLATED) -> bytes:
    """A ZIP archive with fixed timestamps, so the corpus rebuilds byte for byte."""
    buffer = io.BytesIO()
    with zipfile.ZipFile(buffer, "w", method) as archive:
        for name, data in members.items():
            info = zipfile.ZipInfo(name, STAMP)
            info.compress_type = method
            archive.writestr(info, data)
    return buffer.getvalue()


def workbook(fill: Callable[[object], None], macro: bool = False) -> bytes:
    """An openpyxl workbook, re-zipped with fixed timestamps."""
    from openpyxl import Workbook

    book = Workbook()
    book.properties.created = book.properties.modified = datetime(2026, 3, 1)
    fill(book)
    raw = io.BytesIO()
    book.save(raw)
    with zipfile.ZipFile(io.BytesIO(raw.getvalue())) as archive:
        members = {n: archive.read(n) for n in archive.namelist()}
    # openpyxl stamps the save time into the core properties; pin it so rebuilds match.
    members["docProps/core.xml"] = re.sub(
        rb"(<dcterms:modified[^>]*>)[^<]*", rb"\g<1>2026-03-01T00:00:00Z", members["docProps/core.xml"]
    )
    if macro:
        # Source: ECMA-376 Part 2 / [MS-OFFMACRO2]: a macro-enabled workbook carries
        # xl/vbaProject.bin; Weir must never run it (openpyxl does not even parse it).
        members["xl/vbaProject.bin"] = (
            b"\xd0\xcf\x11\xe0\xa1\xb1\x1a\xe1" + b'Attribute VB_Name = "Auto_Open"\n'
        )
    return zipped(members)


def rows_sheet(rows: list[list[object]]) -> Callable[[object], None]:
    def fill(book: object) -> None:
        sheet = book.active  # type: ignore[attr-defined]
        for row in rows:
            sheet.append(row)

    return fill


def formulas(book: object) -> None:
    sheet = book.active  # type: ignore[attr-defined]
    sheet.append(["site_id", "result", "doubled"])
    sheet.append(["VB-014", 4.2, "=B2*2"])
    # A formula that would run a program if a spreadsheet evaluated it (DDE); Weir never does.
    sheet.append(["VB-015", 3.9, '=cmd|" /C calc"!A0'])


def many_sheets(book: object) -> None:
    for i in range(12):
        book.create_sheet(f"VB-{i:03d}")["A1"] = "site_id"  # type: ignore[attr-defined]


def hidden_and_merged(book: object) -> None:
    sheet = book.active  # type: ignore[attr-defined]
    sheet.append(["Vell Basin Water Network - March 2026"])
    sheet.merge_cells("A1:C1")
    for row in (
        ["site_id", "sampled_on", "result"],
        ["VB-014", "2026-03-02", 4.2],
        ["VB-015", "2026-03-02", 3.9],
    ):
        sheet.append(row)
    sheet.row_dimensions[4].hidden = True
    book.create_sheet("scratch").sheet_state = "hidden"  # type: ignore[attr-defined]
    book["scratch"]["A1"] = "do not send"  # type: ignore[index]


def empty_book(book: object) -> None:
    book.create_sheet("second")  # type: ignore[attr-defined]


def xml_entities_sheet() -> bytes:
    """A workbook whose sheet XML declares a nested entity ("billion laughs" in XML)."""
    base = workbook(rows_sheet([["site_id"], ["VB-014"]]))
    with zipfile.ZipFile(io.BytesIO(base)) as archive:
        members = {n: archive.read(n) for n in archive.namelist()}
    entities = '<!ENTITY a0 "lol">' + "".join(
        f'<!ENTITY a{i} "{("&a" + str(i - 1) + ";") * 10}">' for i in range(1, 10)
    )
    sheet = members["xl/worksheets/sheet1.xml"].decode("utf-8")
    head, _, rest = sheet.partition("?>")
    members["xl/worksheets/sheet1.xml"] = f"{head}?><!DOCTYPE worksheet [{entities}]>{rest}".replace(
        "VB-014", "&a9;"
    ).encode("utf-8")
    return zipped(members)


def damaged_sheet_xml() -> bytes:
    base = workbook(rows_sheet([["site_id"], ["VB-014"]]))
    with zipfile.ZipFile(io.BytesIO(base)) as archive:
        members = {n: archive.read(n) for n in archive.namelist()}
    members["xl/worksheets/sheet1.xml"] = b"<worksheet><sheetData><row><c r='A1'"
    return zipped(members)


def traversal_member() -> bytes:
    base = workbook(rows_sheet([["site_id"], ["VB-014"]]))
    with zipfile.ZipFile(io.BytesIO(base)) as archive:
        members = {n: archive.read(n) for n in archive.namelist()}
    members["../../../../tmp/weir-escaped.txt"] = b"a member that would land outside if extracted"
    return zipped(members)


def lying_sizes() -> bytes:
    """A zip bomb whose headers declare 1,000 inflated bytes for an 8 MB member.

    Source: PKWARE APPNOTE 6.3.10 §4.3.7 and §4.3.12: the uncompressed size sits at offset 22
    of each local header and offset 24 of each central directory header. Declared sizes pass
    the bomb check, so what must hold is that inflating stops at the declared size.
    """
    base = workbook(rows_sheet([["site_id"], ["VB-014"]]))
    with zipfile.ZipFile(io.BytesIO(base)) as archive:
        members = {n: archive.read(n) for n in archive.namelist()}
    # Whitespace after the root element is still well-formed XML (XML 1.0 §2.8, Misc).
    sheet = members["xl/worksheets/sheet1.xml"] + b" " * (8 << 20)
    members["xl/worksheets/sheet1.xml"] = sheet
    data = bytearray(zipped(members))
    for signature, offset in ((b"PK\x03\x04", 22), (b"PK\x01\x02", 24)):
        start = data.find(signature)
        while start != -1:
            if struct.unpack_from("<I", data, start + offset)[0] == len(sheet):
                struct.pack_into("<I", data, start + offset, 1000)
            start = data.find(signature, start + 1)
    return bytes(data)


def ole_file(stream_name: str) -> bytes:
    """A minimal compound-file header followed by a directory name ([MS-CFB] §2.2, §2.6.1)."""
    header = b"\xd0\xcf\x11\xe0\xa1\xb1\x1a\xe1" + bytes(16) + struct.pack("<HH", 0x3E, 3) + bytes(488)
    return header + stream_name.encode("utf-16-le") + bytes(64)


def parquet_bytes() -> bytes:
    import pyarrow as pa
    import pyarrow.parquet as pq

    sink = io.BytesIO()
    pq.write_table(pa.table({"site_id": ["VB-014", "VB-015"], "result": [4.2, 3.9]}), sink)
    return sink.getvalue()


def nested_yaml(depth: int) -> bytes:
    return ("contract: deep\nversion: 1\nvariables:\n  site_id: " + "[" * depth + "]" * depth + "\n").encode()


def laughs() -> bytes:
    lines = ['a0: &a0 ["lol"]']
    lines += [f"a{i}: &a{i} [{', '.join(['*a' + str(i - 1)] * 9)}]" for i in range(1, 10)]
    return ("\n".join(lines) + "\ncontract: laughs\nversion: 1\n").encode()


CONTRACT = (
    "contract: stream-chemistry\nversion: 1\nobservational_unit: one sample at one site\n"
    "keys: [site_id, sampled_on]\nvariables:\n  site_id: {type: string}\n"
    "  sampled_on: {type: date}\n  result: {type: number, min: 0}\n"
)


def corpus() -> dict[str, bytes]:
    """File name -> bytes, for every case in the manifest."""
    zeros = bytes(8 << 20)
    rnd = random.Random(7)  # fixed seed: high bytes with commas, no encoding can read them as text
    noise = bytes(rnd.choice([*range(0x80, 0x100), *[0x2C] * 10]) for _ in range(2000))
    return {
        # --- bytes and encodings ---
        "empty.csv": b"",
        "blank-lines-only.csv": b"\n\r\n   \n\n",
        "bom-only.csv": b"\xef\xbb\xbf",
        "utf8-bom.csv": b"\xef\xbb\xbf" + GOOD.encode(),
        "utf16le-bom.csv": b"\xff\xfe" + GOOD.encode("utf-16-le"),
        "utf16be-bom.csv": b"\xfe\xff" + GOOD.encode("utf-16-be"),
        "utf16le-no-bom.csv": GOOD.encode("utf-16-le"),
        "utf32le-bom.csv": GOOD.encode("utf-32"),
        "windows-1252.csv": "site_id,note\nVB-014,Trübung – hoch\nVB-015,€ 12\n".encode("cp1252"),
        "mixed-encodings.csv": "site_id,note\nVB-014,Trübung\n".encode()
        + "VB-015,Trübung\n".encode("cp1252"),
        "nul-bytes.csv": b"site_id,result\nVB-014,4\x002\nVB-015,3.9\n",
        "cr-only.csv": GOOD.replace("\n", "\r").encode(),
        "mixed-line-ends.csv": b"site_id,result\r\nVB-014,4.2\nVB-015,3.9\rVB-016,1.0\r\n",
        "no-final-newline.csv": GOOD.rstrip("\n").encode(),
        "invalid-utf8.csv": b"site_id,note\nVB-014,\x81\x8d\x8f\x90\x9d\n" * 3,
        "overlong-utf8.csv": b"site_id,note\nVB-014,\xc0\xaf\xe0\x80\xaf\n",
        "bidi-and-zero-width.csv": "site_id,result\nVB-0\u202e41,4.2\nVB-\u200b015,3.9\n".encode(),
        # --- not tables at all ---
        "pdf-renamed.csv": b"%PDF-1.7\n%\xe2\xe3\xcf\xd3\n1 0 obj << /Type /Catalog >> endobj\n",
        "png-renamed.csv": b"\x89PNG\r\n\x1a\n" + bytes(64),
        "gzip-renamed.csv": b"\x1f\x8b\x08\x00" + bytes(32),
        "random-binary.csv": bytes((i * 37 + 11) % 256 for i in range(4096)),
        "zip-of-csv.xlsx": zipped({"results.csv": GOOD.encode()}),
        "parquet-magic-only.parquet": b"PAR1",
        "truncated.parquet": parquet_bytes()[:-40],
        "parquet-renamed.csv": parquet_bytes(),
        # --- delimited text that fights the parser ---
        "unclosed-quote.csv": b'site_id,note\nVB-014,"never closed\nVB-015,ok\n',
        "ragged-rows.csv": b"site_id,sampled_on,result\nVB-014,2026-03-02\nVB-015,2026-03-02,3.9,extra,x\n",
        "duplicate-headers.csv": b"site_id,result,result\nVB-014,4.2,4.3\n",
        "header-only.csv": b"site_id,sampled_on,result\n",
        "only-delimiters.csv": b",,,\n,,,\n,,,\n",
        "formula-injection.csv": b'site_id,note\nVB-014,"=HYPERLINK(""http://example.invalid"",""x"")"\n'
        b"VB-015,@SUM(1+1)\nVB-016,+cmd|' /C calc'!A0\n",
        "high-byte-noise.csv": b"site_id,note\n" + noise + b"\n",
        "-leading-dash.csv": GOOD.encode(),
        "space and ünïcode name.csv": GOOD.encode(),
        "ten-thousand-columns.csv": (
            ",".join(f"c{i}" for i in range(10_000)) + "\n" + ",".join("1" * 10_000) + "\n"
        ).encode(),
        "too-many-columns.csv": (",".join("x" * 20_000) + "\n").encode(),
        "long-line.csv": b"site_id,note\nVB-014," + b"x" * 3000 + b"\n",
        "long-cell.csv": b'site_id,note\nVB-014,"' + b"y" * 500 + b'"\n',
        "many-rows.csv": ("site_id\n" + "".join(f"VB-{i:03d}\n" for i in range(200))).encode(),
        # --- workbooks ---
        "zip-bomb.xlsx": zipped({"xl/workbook.xml": b"<workbook/>", "xl/worksheets/sheet1.xml": zeros}),
        "lying-sizes.xlsx": lying_sizes(),
        "truncated.xlsx": workbook(rows_sheet([["site_id"], ["VB-014"]]))[:700],
        "damaged-sheet-xml.xlsx": damaged_sheet_xml(),
        "xml-entity-bomb.xlsx": xml_entities_sheet(),
        "path-traversal-member.xlsx": traversal_member(),
        "formula-cells.xlsx": workbook(formulas),
        "macro-enabled.xlsm": workbook(rows_sheet([["site_id", "result"], ["VB-014", 4.2]]), macro=True),
        "many-sheets.xlsx": workbook(many_sheets),
        "hidden-and-merged.xlsx": workbook(hidden_and_merged),
        "empty-workbook.xlsx": workbook(empty_book),
        "workbook-renamed.csv": workbook(rows_sheet([["site_id", "result"], ["VB-014", 4.2]])),
        "password-protected.xlsx": ole_file("EncryptedPackage"),
        "old-binary.xls": ole_file("Workbook"),
        # --- contracts ---
        "billion-laughs.yaml": laughs(),
        "python-object-tag.yaml": b"contract: !!python/object/apply:os.system ['echo hacked']\nversion: 1\n",
        "custom-tag.yaml": b"contract: x\nversion: !include secrets.yaml\n",
        "code-list-escape.yaml": (
            CONTRACT + "  analyte: {type: category, codes: ../../../../etc/passwd}\n"
        ).encode(),
        "code-list-absolute.yaml": (
            CONTRACT + "  analyte: {type: category, codes: /etc/hostname}\n"
        ).encode(),
        "deep-nesting.yaml": nested_yaml(500),
        "contract-not-utf8.yaml": CONTRACT.replace("one sample", "ein Probenahmeort für").encode("cp1252"),
        "contract-binary.yaml": bytes(range(256)),
        "contract-empty.yaml": b"",
        "contract-two-documents.yaml": (CONTRACT + "---\n" + CONTRACT).encode(),
        "contract-big.yaml": (CONTRACT + "".join(f"# padding line {i}\n" for i in range(200))).encode(),
        # A pattern with nested repetition takes exponential time on a near-miss in a
        # backtracking engine (regular expression denial of service). Text cells are matched by
        # Arrow's linear-time engine, so the plain near-miss is simply reported; a cell with a
        # line break is matched by Python's engine (its `$` differs), and the per-file clock
        # must stop it.
        "redos-pattern.yaml": (
            b"contract: redos\nversion: 1\nobservational_unit: one sample at one site\nkeys: [site_id]\n"
            b"variables:\n  site_id: {type: string}\n"
            b'  note: {type: string, pattern: "^(a+)+$", required: false}\n'
        ),
        "redos-cells.csv": b"site_id,note\nVB-014," + b"a" * 40 + b"!\n",
        "redos-cells-line-break.csv": b'site_id,note\nVB-014,"' + b"a" * 40 + b'!\n"\n',
        "ok.csv": GOOD.encode(),
    }


def main(target: Path = FILES) -> int:
    target.mkdir(parents=True, exist_ok=True)
    for name, data in corpus().items():
        (target / name).write_bytes(data)
    print(f"wrote {len(corpus())} files to {target.relative_to(HERE.parent.parent.parent)}")
    return 0


if __name__ == "__main__":
    sys.exit(main())

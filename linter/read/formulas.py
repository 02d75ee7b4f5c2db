"""Formula cells a workbook saved without their value, found by streaming the sheet XML."""

from __future__ import annotations

import posixpath
import zipfile
from xml.etree.ElementTree import iterparse

# Source: ECMA-376 Part 1 §18.2.19 (sheet), §18.3.1.4 (c), §18.3.1.40 (f), §18.3.1.96 (v);
# Part 2 (Open Packaging Conventions) §9.3 for relationships.
MAIN = "{http://schemas.openxmlformats.org/spreadsheetml/2006/main}"
OFFICE_REL = "{http://schemas.openxmlformats.org/officeDocument/2006/relationships}id"
PACKAGE_REL = "{http://schemas.openxmlformats.org/package/2006/relationships}Relationship"


def sheet_parts(archive: zipfile.ZipFile) -> dict[str, str]:
    """Sheet name -> archive member of its XML, from the workbook part and its relationships."""
    targets: dict[str, str] = {}
    with archive.open("xl/_rels/workbook.xml.rels") as rels:
        for _, element in iterparse(rels):
            if element.tag == PACKAGE_REL:
                target = element.get("Target", "")
                member = target.lstrip("/") if target.startswith("/") else posixpath.join("xl", target)
                targets[element.get("Id", "")] = posixpath.normpath(member)
    parts: dict[str, str] = {}
    with archive.open("xl/workbook.xml") as book:
        for _, element in iterparse(book):
            if element.tag == f"{MAIN}sheet":
                part = targets.get(element.get(OFFICE_REL, ""))
                if part:
                    parts[element.get("name", "")] = part
    return parts


def uncached_formulas(path: str, limit: int = 5) -> dict[str, tuple[int, list[str]]]:
    """Per sheet: how many formula cells have no saved value, and the first few references."""
    found: dict[str, tuple[int, list[str]]] = {}
    with zipfile.ZipFile(path) as archive:
        for name, member in sheet_parts(archive).items():
            if member not in archive.namelist():
                continue
            count, refs = 0, list[str]()
            with archive.open(member) as sheet:
                for _, element in iterparse(sheet):
                    if element.tag == f"{MAIN}c":
                        formula = element.find(f"{MAIN}f")
                        value = element.find(f"{MAIN}v")
                        if formula is not None and (value is None or not value.text):
                            count += 1
                            if len(refs) < limit:
                                refs.append(element.get("r", "?"))
                        element.clear()
                    elif element.tag == f"{MAIN}row":
                        element.clear()
            if count:
                found[name] = (count, refs)
    return found

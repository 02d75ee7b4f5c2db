"""Code lists: allowed values of a category, inline or from a file beside the contract."""

from __future__ import annotations

import csv
import io
from pathlib import Path, PurePosixPath, PureWindowsPath

from linter.contract.model import CodeList, Position
from linter.contract.yaml_tree import YNode, parse_yaml, read_text
from linter.errors import WeirError

CODE_FILE_SUFFIXES = (".yaml", ".yml", ".csv")


def code_text(node: YNode, file: str) -> str:
    """A code exactly as written (`01` stays `01`): codes are text, never numbers."""
    if not node.is_scalar or node.value is None:
        raise WeirError(f"{node.position}: a code must be a single value, not {describe(node)}")
    text = node.text
    if text != text.strip() or not text:
        raise WeirError(f"{node.position}: code {text!r} is empty or has spaces around it")
    return text


def describe(node: YNode) -> str:
    if node.is_mapping:
        return "a mapping"
    if node.is_sequence:
        return "a list"
    return "an empty value" if node.value is None else f"{node.text!r}"


def code_list_from_node(node: YNode, file: str, source: str | None = None) -> CodeList:
    """A YAML list of codes, or a mapping code -> label."""
    pairs: list[tuple[str, str | None, Position]] = []
    if isinstance(node.value, list):
        pairs = [(code_text(item, file), None, item.position) for item in node.value]
    elif isinstance(node.value, dict):
        for name, label in node.value.items():
            if not label.is_scalar or (label.value is not None and not isinstance(label.value, str)):
                raise WeirError(f"{label.position}: the label of code {name!r} must be text")
            key = YNode(name, label.where, text=name)
            pairs.append((code_text(key, file), label.text if label.value is not None else None, label.where))
    else:
        raise WeirError(
            f"{node.position}: a code list is a list of codes or a mapping code -> label, "
            f"not {describe(node)}"
        )
    return build(pairs, node.position, source)


def build(pairs: list[tuple[str, str | None, Position]], at: Position, source: str | None) -> CodeList:
    if not pairs:
        raise WeirError(f"{at}: the code list is empty")
    seen: set[str] = set()
    for code, _, where in pairs:
        if code in seen:
            raise WeirError(f"{where}: code {code!r} is listed twice")
        seen.add(code)
    labels = {code: label for code, label, _ in pairs if label}
    return CodeList(tuple(code for code, _, _ in pairs), labels, source)


def resolve_inside(reference: str, contract_path: str, at: Position) -> Path:
    """The code-list file, which must sit in the contract's folder or below it."""
    if (
        PurePosixPath(reference).is_absolute()
        or PureWindowsPath(reference).is_absolute()
        or (PureWindowsPath(reference).drive)
    ):
        raise WeirError(f"{at}: code-list path {reference!r} must be relative to the contract's folder")
    if ".." in PurePosixPath(reference.replace("\\", "/")).parts:
        raise WeirError(f"{at}: code-list path {reference!r} may not leave the contract's folder ('..')")
    folder = Path(contract_path).resolve().parent
    target = (folder / reference.replace("\\", "/")).resolve()  # a path written on Windows works too
    if not target.is_relative_to(folder):
        # a symbolic link can still lead outside; the folder is the trust boundary
        raise WeirError(f"{at}: code-list path {reference!r} leads outside the contract's folder")
    if not target.is_file():
        raise WeirError(f"{at}: code-list file {reference!r} not found next to the contract")
    if target.suffix.lower() not in CODE_FILE_SUFFIXES:
        raise WeirError(f"{at}: code-list file {reference!r} must be .yaml, .yml or .csv")
    return target


def load_code_list(reference: YNode, contract_path: str) -> CodeList:
    """The code list a `codes:` entry names, read from YAML (list or mapping) or CSV (`code,label`)."""
    if not isinstance(reference.value, str) or not reference.value.strip():
        raise WeirError(f"{reference.position}: 'codes' must name a code-list file, e.g. codes/analytes.yaml")
    name = reference.value
    path = resolve_inside(name, contract_path, reference.position)
    shown = str(Path(Path(contract_path).parent, name))
    text = read_text(str(path), shown)
    if path.suffix.lower() == ".csv":
        return codes_from_csv(text, shown, name)
    return code_list_from_node(parse_yaml(text, shown), shown, name)


def codes_from_csv(text: str, shown: str, source: str) -> CodeList:
    try:
        return read_csv_codes(text, shown, source)
    except csv.Error as error:  # e.g. a field longer than the csv module allows
        raise WeirError(f"{shown}:1:1: not a readable CSV code list: {error}") from None


def read_csv_codes(text: str, shown: str, source: str) -> CodeList:
    reader = csv.reader(io.StringIO(text))
    header = [cell.strip().lower() for cell in next(reader, [])]
    if "code" not in header:
        raise WeirError(f"{shown}:1:1: a CSV code list needs a header row with a 'code' column (and 'label')")
    code_at = header.index("code")
    label_at = header.index("label") if "label" in header else None
    pairs: list[tuple[str, str | None, Position]] = []
    for row in reader:
        if not any(cell.strip() for cell in row):
            continue
        where = Position(shown, reader.line_num, 1)
        if code_at >= len(row):
            raise WeirError(f"{where}: row has no code")
        code = row[code_at]
        if not code or code != code.strip():
            raise WeirError(f"{where}: code {code!r} is empty or has spaces around it")
        label = row[label_at].strip() if label_at is not None and label_at < len(row) else None
        pairs.append((code, label or None, where))
    return build(pairs, Position(shown, 1, 1), source)

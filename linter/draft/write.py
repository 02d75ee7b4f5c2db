"""Write a TableDraft as contract YAML (ruamel round-trip nodes) with evidence comments, in a stable order."""

from __future__ import annotations

import io
import json
import re
from dataclasses import dataclass

from ruamel.yaml import YAML
from ruamel.yaml.comments import CommentedMap, CommentedSeq
from ruamel.yaml.scalarstring import SingleQuotedScalarString

from linter.contract.model import VarType
from linter.draft.columns import LONG_CODE_LIST, VariableDraft
from linter.draft.infer import TableDraft

CODES_FOLDER = "codes"


@dataclass(frozen=True)
class DraftFiles:
    """The contract text and its code-list files (path relative to the contract -> text)."""

    contract: str
    code_lists: dict[str, str]


def yaml_writer() -> YAML:
    yaml = YAML(typ="rt")
    yaml.indent(mapping=2, sequence=4, offset=2)
    yaml.width = 4096  # one line per entry: long patterns and comments are never folded
    yaml.preserve_quotes = True
    return yaml


def dump(node: object) -> str:
    stream = io.StringIO()
    yaml_writer().dump(node, stream)
    return stream.getvalue()


def evidence_comment(node: CommentedMap, text: str, key: str) -> None:
    """The evidence for an entry as an end-of-line comment, one space after the value on every line."""
    if text:
        node.yaml_add_eol_comment(f"# {text}", key, column=1)


def flow(items: list[object]) -> CommentedSeq:
    seq = CommentedSeq(items)
    seq.fa.set_flow_style()
    return seq


def quoted(text: str) -> SingleQuotedScalarString:
    return SingleQuotedScalarString(text)


def number(value: float) -> int | float:
    return int(value) if value == int(value) else value


def code_list_path(contract_id: str, variable: str) -> str:
    safe = re.sub(r"[^A-Za-z0-9_-]+", "-", variable).strip("-").lower() or "codes"
    return f"{CODES_FOLDER}/{contract_id}-{safe}.yaml"


def variable_node(variable: VariableDraft, contract_id: str, code_lists: dict[str, str]) -> CommentedMap:
    """One variable's properties, each with the evidence that led to it as an end-of-line comment."""
    node = CommentedMap()
    node["type"] = variable.type.value
    if not variable.required:
        node["required"] = False
    node["nullable"] = variable.nullable
    if variable.type is VarType.CATEGORY:
        if len(variable.values) > LONG_CODE_LIST:
            path = code_list_path(contract_id, variable.name)
            code_lists[path] = code_list_text(variable)
            node["codes"] = path
            key = "codes"
        else:
            node["values"] = flow(list(variable.values))
            key = "values"
        evidence_comment(node, variable.evidence.get("values", ""), key)
    if isinstance(variable.minimum, str):
        node["min"] = quoted(variable.minimum)  # quoted: a date bound is ISO 8601 text
    elif variable.minimum is not None:
        node["min"] = number(variable.minimum)
    if variable.maximum is not None:
        node["max"] = number(variable.maximum)
    if variable.pattern is not None:
        node["pattern"] = quoted(variable.pattern)
    if variable.unit is not None:
        node["unit"] = variable.unit
    if variable.censored_prefix is not None:
        node["censored_prefix"] = quoted(variable.censored_prefix)
    if variable.date_format is not None:
        node["date_format"] = variable.date_format
    for key in ("nullable", "required", "min", "max", "pattern", "unit", "censored_prefix", "date_format"):
        if key in node and variable.evidence.get(key):
            evidence_comment(node, variable.evidence[key], key)
    return node


def code_list_text(variable: VariableDraft) -> str:
    seq = CommentedSeq(list(variable.values))
    header = f"Codes of {variable.name} drafted by weir draft: {variable.evidence.get('values', '')}"
    seq.yaml_set_start_comment(header)
    return dump(seq)


def contract_node(draft: TableDraft, contract_id: str, code_lists: dict[str, str]) -> CommentedMap:
    """The whole one-table contract, keys in the order the contract format documents them."""
    top = CommentedMap()
    top["contract"] = contract_id
    top["version"] = 1
    top["title"] = f"Drafted contract for {contract_id} files (edit the title, unit and ranges)"
    keys_words = ", ".join(draft.keys) if draft.keys else "(no key found)"
    top["observational_unit"] = f"one row per {keys_words}; say in words what one row is"
    top["applies_to"] = flow(list(draft.applies_to))
    if draft.keys:
        top["keys"] = flow(list(draft.keys))
        evidence_comment(top, draft.key_evidence, "keys")
    variables = CommentedMap()
    for variable in draft.variables:
        variables[variable.name] = variable_node(variable, contract_id, code_lists)
        if variable.evidence.get(""):
            evidence_comment(variables, variable.evidence[""], variable.name)
    top["variables"] = variables
    top["missing"] = flow(list(draft.missing))
    if draft.missing_evidence:
        evidence_comment(top, draft.missing_evidence, "missing")
    if draft.rules:
        top["rules"] = flow(list(draft.rules))
        evidence_comment(top, "every row keeps it", "rules")
    if draft.complete_over:
        top["complete_over"] = flow(list(draft.complete_over))
        evidence_comment(top, draft.complete_evidence, "complete_over")
    top["extra_columns"] = "warn"
    top["column_order"] = False
    return top


def header_comment(draft: TableDraft) -> str:
    files = ", ".join(sorted({s.replace("\\", "/").rsplit("/", 1)[-1] for s in draft.sources}))
    lines = [
        f"Drafted by weir draft from {draft.rows:,} rows of: {files}",
        "Every entry is a proposal with its evidence; edit it before you send it to partners.",
    ]
    lines.extend(draft.notes)
    for source, steps in draft.recipes:
        lines.append(
            f"{source.replace(chr(92), '/').rsplit('/', 1)[-1]} is not tidy as sent: this contract describes "
            f"the table that these {len(steps)} recipe step(s) make (`weir tidy` finds and applies them):"
        )
        lines.extend(f"  {json.dumps(step, ensure_ascii=False)}" for step in steps)
    return "\n".join(lines)


def render_draft(draft: TableDraft, contract_id: str | None = None) -> DraftFiles:
    """The contract YAML text (and any code-list files) for `draft`; the same draft gives the same text."""
    contract_id = contract_id or draft.name
    code_lists: dict[str, str] = {}
    top = contract_node(draft, contract_id, code_lists)
    top.yaml_set_start_comment(header_comment(draft))
    return DraftFiles(dump(top), code_lists)

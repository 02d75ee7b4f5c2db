"""Propose additions to a contract the data manager already edited, keeping every edit and comment."""

from __future__ import annotations

import difflib
import io
from dataclasses import dataclass, replace
from fnmatch import fnmatch
from pathlib import PurePath

from ruamel.yaml.comments import CommentedMap, CommentedSeq
from ruamel.yaml.error import YAMLError
from ruamel.yaml.util import load_yaml_guess_indent

from linter.contract.load import contract_from_tree
from linter.contract.model import Contract, TableContract, Variable, VarType
from linter.contract.yaml_tree import parse_yaml
from linter.draft.columns import VariableDraft
from linter.draft.infer import TableDraft
from linter.draft.write import evidence_comment, variable_node, yaml_writer
from linter.errors import WeirError


@dataclass(frozen=True)
class Update:
    """The contract text with the proposed additions, what was added, and what only a person can decide."""

    old: str
    new: str
    added: tuple[str, ...]
    notes: tuple[str, ...]

    def unified_diff(self, path: str) -> str:
        lines = difflib.unified_diff(
            self.old.splitlines(keepends=True),
            self.new.splitlines(keepends=True),
            fromfile=path,
            tofile=f"{path} (proposed)",
        )
        return "".join(lines)


def propose_update(text: str, path: str, contract: Contract, draft: TableDraft) -> Update:
    """Add what the draft saw and the contract lacks: new columns (not required), codes, missing codes.

    Nothing the contract says is changed or removed; a disagreement (a value outside a declared
    range, another type) becomes a note for the data manager instead.
    """
    try:
        _, indent, block_indent = load_yaml_guess_indent(text)
        document = yaml_writer().load(text)  # preserves quotes, so untouched lines stay as written
    except YAMLError as error:
        raise WeirError(f"{path}: not readable YAML: {str(error).splitlines()[0]}") from None
    table, node = governed_table(contract, document, draft)
    variables = node["variables"]
    added: list[str] = []
    notes: list[str] = []
    files = ", ".join(sorted({PurePath(s).name for s in draft.sources}))
    for variable in draft.variables:
        declared = table.variable(variable.name)
        if declared is None:
            code_lists: dict[str, str] = {}
            proposal = variable_node(_optional(variable), table.name, code_lists)
            if code_lists:  # a long code list stays inline here: the update writes one file only
                proposal.pop("codes", None)
                proposal["values"] = list(variable.values)
            if variables.fa.flow_style():
                # Inside a one-line mapping a comment would break the line: the entry goes in bare.
                bare = CommentedMap(proposal.items())
                bare.fa.set_flow_style()
                variables[variable.name] = bare
                added.append(f"variable {variable.name} (not required)")
                continue
            variables[variable.name] = proposal
            evidence_comment(
                variables, f"new column seen in {files}; proposed as not required", variable.name
            )
            added.append(f"variable {variable.name} (not required)")
            continue
        notes.extend(disagreements(declared, variable))
        if declared.type is VarType.CATEGORY and declared.codes is not None:
            new_codes, variants = unseen_codes(variable.seen_values, declared.codes.values)
            if variants:
                notes.append(
                    f"{variable.name}: {', '.join(repr(v) for v in variants)} differ from declared codes "
                    "only in spaces or letter case; not proposed (the files should use the code)"
                )
            if not new_codes:
                continue
            if declared.codes.source is not None:
                notes.append(
                    f"{variable.name}: codes {', '.join(new_codes)} seen but not in {declared.codes.source}; "
                    "add them there if they are valid"
                )
                continue
            entry = variables[variable.name]
            values = entry.get("values") if isinstance(entry, CommentedMap) else None
            if isinstance(values, list):
                values.extend(new_codes)
            elif isinstance(values, CommentedMap):
                for code in new_codes:
                    values[code] = code
            else:
                continue
            added.append(f"codes {', '.join(new_codes)} of {variable.name}")
    seen = [c for c in draft.missing if c and c not in table.missing]
    if seen:
        written = node.get("missing")
        if isinstance(written, list):
            written.extend(seen)
        elif written is not None:  # a single code written without brackets stays first
            node["missing"] = _flow([written, *seen])
        else:
            node["missing"] = _flow(["", *seen])
        added.append(f"missing-value codes {', '.join(seen)}")
    new_text = _dump(document, indent, block_indent) if added else text
    if added:
        contract_from_tree(parse_yaml(new_text, path), path)  # the proposal must still load
    return Update(text, new_text, tuple(added), tuple(notes))


def governed_table(
    contract: Contract, document: object, draft: TableDraft
) -> tuple[TableContract, CommentedMap]:
    """The contract table the drafted files belong to, and its YAML node."""
    if not isinstance(document, CommentedMap):
        raise WeirError("the contract is not a YAML mapping")
    if "tables" not in document:
        return contract.tables[0], document
    names = [PurePath(s).name for s in draft.sources]
    for table in contract.tables:
        if all(any(fnmatch(n, g) for g in table.applies_to) for n in names):
            return table, document["tables"][table.name]
    raise WeirError(
        "no table of the bundle has applies_to globs matching "
        + ", ".join(names)
        + "; --update needs the table the files belong to"
    )


def unseen_codes(seen: tuple[str, ...], declared: tuple[str, ...]) -> tuple[list[str], list[str]]:
    """Values not among the codes: (new codes, variants of a code that differ in spaces or case)."""
    folded = {c.strip().casefold() for c in declared}
    new = [v for v in seen if v not in declared and v.strip().casefold() not in folded]
    variants = [v for v in seen if v not in declared and v.strip().casefold() in folded]
    return new, variants


def disagreements(declared: Variable, variable: VariableDraft) -> list[str]:
    """Where the new files disagree with what the data manager wrote: for a person to decide."""
    notes: list[str] = []
    numeric = declared.type in (VarType.NUMBER, VarType.INTEGER)
    low, high = declared.minimum, declared.maximum
    if numeric and variable.seen_min is not None and isinstance(low, float | int) and variable.seen_min < low:
        notes.append(f"{declared.name}: value {variable.seen_min:g} seen, below the declared min {low:g}")
    if (
        numeric
        and variable.seen_max is not None
        and isinstance(high, float | int)
        and variable.seen_max > high
    ):
        notes.append(f"{declared.name}: value {variable.seen_max:g} seen, above the declared max {high:g}")
    looser = {VarType.INTEGER: (VarType.NUMBER,), VarType.STRING: (VarType.CATEGORY,)}
    if variable.type is not declared.type and declared.type not in (
        VarType.STRING,
        *looser.get(variable.type, ()),
    ):
        notes.append(f"{declared.name}: declared {declared.type}, but the files hold {variable.type} values")
    return notes


def _optional(variable: VariableDraft) -> VariableDraft:
    return replace(variable, required=False)


def _flow(items: list[str]) -> CommentedSeq:
    seq = CommentedSeq(items)
    seq.fa.set_flow_style()
    return seq


def _dump(document: object, indent: int | None, block_indent: int | None) -> str:
    yaml = yaml_writer()
    mapping = indent or 2
    yaml.indent(mapping=mapping, sequence=mapping + (block_indent or 0), offset=block_indent or 0)
    stream = io.StringIO()
    yaml.dump(document, stream)
    return stream.getvalue()

"""Read one variable of a contract (type, ranges, codes, pattern, unit...) with its checks."""

from __future__ import annotations

import re
from datetime import date, datetime

from linter.contract import entries
from linter.contract.codes import code_list_from_node, load_code_list
from linter.contract.model import CodeList, Reference, Variable, VarType
from linter.contract.yaml_tree import YNode
from linter.errors import WeirError

VARIABLE_KEYS = (
    "type",
    "required",
    "nullable",
    "values",
    "codes",
    "min",
    "max",
    "pattern",
    "unit",
    "missing",
    "censored_prefix",
    "date_format",
    "references",
    "description",
)
TYPES = tuple(t.value for t in VarType)
NUMERIC = (VarType.INTEGER, VarType.NUMBER)
TEMPORAL = (VarType.DATE, VarType.DATETIME)
APPLIES = {
    "values": ((VarType.CATEGORY,), "category"),
    "codes": ((VarType.CATEGORY,), "category"),
    "min": ((*NUMERIC, *TEMPORAL), "integer, number, date or datetime"),
    "max": ((*NUMERIC, *TEMPORAL), "integer, number, date or datetime"),
    "pattern": ((VarType.STRING, VarType.CATEGORY), "string or category"),
    "unit": (NUMERIC, "integer or number"),
    "censored_prefix": (NUMERIC, "integer or number"),
    "date_format": (TEMPORAL, "date or datetime"),
}
"""Which keys make sense for which types: a key that cannot apply is a mistake, not a no-op."""
_REFERENCE = re.compile(r"^([^.\s]+)\.([^.\s]+)$")
_PROBE = datetime(2026, 3, 2, 13, 45, 30)
"""A moment with distinct day, month, hour, minute and second, to prove a date format round-trips."""


def load_variable(name: str, node: YNode, contract_path: str, is_key: bool) -> Variable:
    """A variable from `name: {type: ..., ...}` or the shorthand `name: type`."""
    if isinstance(node.value, str):
        node = YNode({"type": node}, node.position, key_position=node.key_position)
    what = f"variable {name!r}"
    given = entries.check_keys(node, VARIABLE_KEYS, what)
    var_type = VarType(entries.one_of(given["type"], TYPES, "type")) if "type" in given else VarType.STRING
    for key, (types, label) in APPLIES.items():
        if key in given and var_type not in types:
            raise WeirError(
                f"{given[key].where}: {key!r} applies only to {label} variables; {name!r} is {var_type}"
            )
    required = entries.flag(given["required"], "required") if "required" in given else True
    nullable = entries.flag(given["nullable"], "nullable") if "nullable" in given else True
    if is_key:
        for key, value in (("required", required), ("nullable", nullable)):
            if key in given and value:
                raise WeirError(f"{given[key].where}: {name!r} is a key, so it is never {key}: true")
        nullable = False
    minimum = bound(given["min"], var_type, "min") if "min" in given else None
    maximum = bound(given["max"], var_type, "max") if "max" in given else None
    if minimum is not None and maximum is not None and ordered(minimum) > ordered(maximum):
        raise WeirError(f"{given['max'].position}: max {maximum} of {name!r} is below its min {minimum}")
    return Variable(
        name=name,
        type=var_type,
        required=required if not is_key else True,
        nullable=nullable,
        codes=codes(given, var_type, name, node, contract_path),
        minimum=minimum,
        maximum=maximum,
        pattern=pattern(given["pattern"]) if "pattern" in given else None,
        unit=entries.text(given["unit"], "unit") if "unit" in given else None,
        missing=entries.text_list(given["missing"], "missing") if "missing" in given else (),
        censored_prefix=(
            entries.text(given["censored_prefix"], "censored_prefix") if "censored_prefix" in given else None
        ),
        date_format=date_format(given["date_format"], var_type) if "date_format" in given else None,
        references=reference(given["references"]) if "references" in given else None,
        description=entries.text(given["description"], "description") if "description" in given else "",
        position=node.where,
    )


def codes(
    given: dict[str, YNode], var_type: VarType, name: str, node: YNode, contract_path: str
) -> CodeList | None:
    if "values" in given and "codes" in given:
        raise WeirError(f"{given['codes'].where}: give either 'values' or 'codes' for {name!r}, not both")
    if "values" in given:
        return code_list_from_node(given["values"], contract_path)
    if "codes" in given:
        return load_code_list(given["codes"], contract_path)
    if var_type is VarType.CATEGORY:
        raise WeirError(f"{node.where}: category {name!r} needs 'values: [...]' or 'codes: FILE'")
    return None


def bound(node: YNode, var_type: VarType, key: str) -> float | str:
    """A number for numeric variables; ISO 8601 text for dates (as YAML date or quoted text)."""
    if var_type in NUMERIC:
        return entries.number(node, key)
    value = node.value
    if isinstance(value, datetime):
        return value.isoformat()
    if isinstance(value, date):
        return value.isoformat()
    if isinstance(value, str):
        try:
            parsed: date = (
                datetime.fromisoformat(value) if var_type is VarType.DATETIME else date.fromisoformat(value)
            )
        except ValueError:
            raise WeirError(f"{node.position}: {key} {value!r} is not an ISO 8601 {var_type}") from None
        return parsed.isoformat()
    raise WeirError(f"{node.position}: {key} must be an ISO 8601 {var_type}, not {entries.kind_of(node)}")


def ordered(value: float | str) -> float:
    """Bounds as comparable numbers: dates become POSIX seconds (time zones dropped)."""
    if isinstance(value, str):
        return datetime.fromisoformat(value).replace(tzinfo=None).timestamp()
    return value


def pattern(node: YNode) -> str:
    text = entries.text(node, "pattern")
    try:
        re.compile(text)
    except re.error as error:
        raise WeirError(
            f"{node.position}: pattern {text!r} is not a valid regular expression: {error.msg}"
            + (f" at character {error.pos + 1}" if error.pos is not None else "")
        ) from None
    return text


def date_format(node: YNode, var_type: VarType) -> str:
    """A strftime format that must write and read back a probe date unchanged."""
    fmt = entries.text(node, "date_format")
    if "%" not in fmt:
        raise WeirError(f"{node.position}: date_format {fmt!r} has no % directive (e.g. '%d/%m/%Y')")
    probe = _PROBE if var_type is VarType.DATETIME else datetime(_PROBE.year, _PROBE.month, _PROBE.day)
    try:
        round_trip = datetime.strptime(probe.strftime(fmt), fmt)
    except ValueError as error:
        raise WeirError(f"{node.position}: date_format {fmt!r} cannot be read back: {error}") from None
    if round_trip.date() != probe.date():
        raise WeirError(f"{node.position}: date_format {fmt!r} does not hold a whole date (day, month, year)")
    return fmt


def reference(node: YNode) -> Reference:
    text = entries.text(node, "references")
    match = _REFERENCE.match(text)
    if match is None:
        raise WeirError(f"{node.position}: references {text!r} must be 'table.column', e.g. sites.site_id")
    return Reference(match.group(1), match.group(2))

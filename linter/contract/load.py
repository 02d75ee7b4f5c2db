"""Load a contract file (one table or a bundle of tables) into the model, or fail at file:line:col."""

from __future__ import annotations

import re
from typing import TYPE_CHECKING

from linter.contract import entries
from linter.contract.expressions import parse_rule
from linter.contract.model import Comparison, Contract, Position, TableContract, Variable, VarType
from linter.contract.variables import load_variable
from linter.contract.yaml_tree import YNode, parse_yaml, read_text
from linter.errors import WeirError

if TYPE_CHECKING:
    from linter.limits import Limits

HEADER_KEYS = ("contract", "version", "title", "description")
TABLE_KEYS = (
    "observational_unit",
    "applies_to",
    "keys",
    "variables",
    "missing",
    "rules",
    "complete_over",
    "extra_columns",
    "column_order",
    "description",
)
SINGLE_KEYS = (*HEADER_KEYS, *(k for k in TABLE_KEYS if k != "description"))
BUNDLE_KEYS = (*HEADER_KEYS, "tables")
EXTRA_COLUMNS = ("error", "warn", "allow")
NAME = re.compile(r"^[^.\s]+$")


def load_contract(path: str, limits: Limits | None = None) -> Contract:
    """Read, check and convert one contract file; every problem is a `path:line:col` WeirError."""
    if limits is None:
        tree = parse_yaml(read_text(path), path)
    else:
        tree = parse_yaml(read_text(path, max_bytes=limits.contract_bytes), path, limits.contract_nodes)
    return contract_from_tree(tree, path)


def contract_from_tree(tree: YNode, path: str) -> Contract:
    top = entries.mapping(tree, "a contract")
    bundle = "tables" in top
    allowed = BUNDLE_KEYS if bundle else SINGLE_KEYS
    for key, value in top.items():
        if key not in allowed and bundle and key in TABLE_KEYS:
            raise WeirError(
                f"{value.where}: {key!r} belongs inside one of the tables of a bundle (under 'tables:')"
            )
    top = entries.check_keys(tree, allowed, "the contract")
    id_node = entries.require(top, "contract", tree, "a contract")
    contract_id = table_name(id_node, entries.text(id_node, "contract"))
    version = entries.text(entries.require(top, "version", tree, "a contract"), "version", numbers_ok=True)
    title = entries.text(top["title"], "title") if "title" in top else ""
    if bundle:
        named = entries.mapping(top["tables"], "tables")
        if not named:
            raise WeirError(f"{top['tables'].position}: a bundle needs at least one table under 'tables:'")
        tables = tuple(
            load_table(table_name(YNode(name, node.where), name), node, path) for name, node in named.items()
        )
    else:
        tables = (load_table(contract_id, tree, path, single=True),)
    check_bundle_references(tables)
    return Contract(id=contract_id, version=version, title=title, tables=tables, path=path)


def table_name(node: YNode, name: str) -> str:
    """Tables are named in references as `table.column`, so a name holds no dot and no space."""
    if not NAME.match(name):
        raise WeirError(
            f"{node.position}: name {name!r} may not contain dots or spaces (it is used in table.column)"
        )
    return name


def load_table(name: str, node: YNode, path: str, single: bool = False) -> TableContract:
    what = "the contract" if single else f"table {name!r}"
    given = entries.mapping(node, what) if single else entries.check_keys(node, TABLE_KEYS, what)
    unit = entries.text(entries.require(given, "observational_unit", node, what), "observational_unit")
    keys_node = given.get("keys")
    keys = entries.text_list(keys_node, "keys") if keys_node is not None else ()
    declared = entries.mapping(entries.require(given, "variables", node, what), "variables")
    if not declared:
        raise WeirError(f"{given['variables'].position}: 'variables' needs at least one variable")
    if keys_node is not None:
        check_names(keys_node, keys, declared, "key")
    variables = tuple(load_variable(n, v, path, is_key=n in keys) for n, v in declared.items())
    complete_node = given.get("complete_over")
    complete_over = entries.text_list(complete_node, "complete_over") if complete_node is not None else ()
    if complete_node is not None:
        check_names(complete_node, complete_over, declared, "complete_over entry")
    missing = entries.text_list(given["missing"], "missing") if "missing" in given else ("",)
    return TableContract(
        name=name,
        observational_unit=unit,
        keys=keys,
        variables=variables,
        applies_to=entries.text_list(given["applies_to"], "applies_to") if "applies_to" in given else (),
        # an empty cell is missing whatever else the contract lists
        missing=missing if "" in missing else ("", *missing),
        comparisons=typed_comparisons(comparisons(given.get("rules"), tuple(declared)), variables),
        complete_over=complete_over,
        extra_columns=(
            entries.one_of(given["extra_columns"], EXTRA_COLUMNS, "extra_columns")
            if "extra_columns" in given
            else "warn"
        ),
        column_order=(
            entries.flag(given["column_order"], "column_order") if "column_order" in given else False
        ),
        position=node.where if not single else Position(path, 1, 1),
    )


def check_names(node: YNode, names: tuple[str, ...], declared: dict[str, YNode], what: str) -> None:
    """Every name must be a declared variable; point at the very item that is not."""
    items = node.value if isinstance(node.value, list) else [node]
    seen: set[str] = set()
    for item, name in zip(items, names, strict=True):
        if name not in declared:
            raise WeirError(
                f"{item.position}: {what} {name!r} names no variable"
                + entries.did_you_mean(name, list(declared))
            )
        if name in seen:
            raise WeirError(f"{item.position}: {what} {name!r} is listed twice")
        seen.add(name)


def comparisons(node: YNode | None, known: tuple[str, ...]) -> tuple[Comparison, ...]:
    if node is None:
        return ()
    items = node.value if isinstance(node.value, list) else [node]
    if not isinstance(node.value, list | str):
        raise WeirError(f"{node.position}: rules must be a list of comparisons like 'min_temp <= max_temp'")
    found: list[Comparison] = []
    for item in items:
        if not isinstance(item.value, str):
            raise WeirError(f"{item.position}: a rule must be text like 'min_temp <= max_temp'")
        found.extend(parse_rule(item.value, rule_start(item), known))
    return tuple(found)


FAMILIES = {
    VarType.INTEGER: "number",
    VarType.NUMBER: "number",
    VarType.DATE: "date",
    VarType.DATETIME: "date",
    VarType.STRING: "text",
    VarType.CATEGORY: "text",
    VarType.BOOLEAN: "true/false",
}
"""Values of one family can be compared with each other; numbers and dates also by order."""


def typed_comparisons(
    found: tuple[Comparison, ...], variables: tuple[Variable, ...]
) -> tuple[Comparison, ...]:
    """Refuse rules that cannot be judged: a date against a number, text ordered with `<`, ..."""
    types = {v.name: v.type for v in variables}
    for rule in found:
        left = FAMILIES[types[rule.left]]
        right = FAMILIES[types[str(rule.right)]] if rule.right_is_variable else "number"
        if left != right:
            shown = f"{rule.right!r} ({types[str(rule.right)]})" if rule.right_is_variable else "a number"
            raise WeirError(
                f"{rule.position}: rule {rule.text!r} compares {rule.left!r} ({types[rule.left]}) "
                f"with {shown}; both sides must be numbers, both dates, or both text"
            )
        if left not in ("number", "date") and rule.operator not in ("==", "!="):
            raise WeirError(
                f"{rule.position}: rule {rule.text!r} orders {left} values with {rule.operator}; "
                "only numbers and dates have an order (use == or !=)"
            )
    return found


def rule_start(item: YNode) -> Position:
    """Where the rule's first character is: just inside the quote of a quoted scalar."""
    at = item.position
    return Position(at.file, at.line, at.column + (1 if item.quote else 0))


def check_bundle_references(tables: tuple[TableContract, ...]) -> None:
    """A reference to another table of the same bundle must name one of that table's variables."""
    by_name = {t.name: t for t in tables}
    for table in tables:
        for variable in table.variables:
            target = variable.references
            if target is None or target.table not in by_name:
                continue
            other = by_name[target.table]
            if other.variable(target.column) is None:
                raise WeirError(
                    f"{variable.position}: references {target} names no variable of table "
                    f"{target.table!r}{entries.did_you_mean(target.column, list(other.names))}"
                )

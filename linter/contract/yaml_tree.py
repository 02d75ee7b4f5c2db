"""Parse contract YAML safely into a tree of plain values that remember their file:line:col."""

from __future__ import annotations

from dataclasses import dataclass
from datetime import date, datetime
from pathlib import Path

from ruamel.yaml import YAML
from ruamel.yaml.error import MarkedYAMLError, YAMLError
from ruamel.yaml.nodes import MappingNode, Node, ScalarNode, SequenceNode

from linter.contract.model import Position
from linter.errors import WeirError

MAX_FILE_BYTES = 1_000_000
"""A contract is a page of text; anything bigger is a mistake (or an attack), not a contract."""
MAX_NODES = 20_000
"""Nodes after alias expansion: stops "billion laughs" documents long before memory is at risk."""
MAX_DEPTH = 40

_TAG = "tag:yaml.org,2002:"
SCALAR_TAGS = frozenset(_TAG + t for t in ("str", "int", "float", "bool", "null", "timestamp"))
"""Only plain data tags are honoured; any other tag (one that would build an object) is refused."""

Scalar = str | int | float | bool | date | datetime | None


@dataclass(frozen=True)
class YNode:
    """One YAML value with its place; mappings hold YNodes keyed by the key's text."""

    value: Scalar | dict[str, YNode] | list[YNode]
    position: Position
    text: str = ""
    """The scalar exactly as written (so `01` stays `01` and `2.10` stays `2.10`)."""
    key_position: Position | None = None
    """Where the key naming this value was written, if it is a mapping entry."""
    quote: str = ""
    """The quote character of a quoted scalar (`'` or `"`), empty for plain ones."""

    @property
    def is_mapping(self) -> bool:
        return isinstance(self.value, dict)

    @property
    def is_sequence(self) -> bool:
        return isinstance(self.value, list)

    @property
    def is_scalar(self) -> bool:
        return not (self.is_mapping or self.is_sequence)

    @property
    def where(self) -> Position:
        """The best place to point at when the entry is wrong: its key if it has one."""
        return self.key_position or self.position


def place(file: str, node: Node) -> Position:
    return Position(file, node.start_mark.line + 1, node.start_mark.column + 1)


def read_text(path: str, shown: str | None = None, max_bytes: int = MAX_FILE_BYTES) -> str:
    """The contract file's text; every reason it cannot be read is a one-line WeirError.

    `shown` is the name used in messages (the path as the user wrote it, not as resolved).
    """
    file = Path(path)
    path = shown or path
    if not file.is_file():
        raise WeirError(f"{path}: no such contract file")
    size = file.stat().st_size
    if size > max_bytes:
        raise WeirError(f"{path}:1:1: contract file is {size:,} bytes; the limit is {max_bytes:,}")
    raw = file.read_bytes()
    try:
        text = raw.decode("utf-8-sig")
    except UnicodeDecodeError as error:
        line = raw[: error.start].count(b"\n") + 1
        raise WeirError(f"{path}:{line}:1: contract file is not UTF-8 text; save it as UTF-8") from None
    if not text.strip():
        raise WeirError(f"{path}:1:1: contract file is empty")
    return text


def parse_yaml(text: str, file: str, max_nodes: int = MAX_NODES) -> YNode:
    """Compose (never construct) the YAML, then build the tree ourselves under the limits."""
    yaml = YAML(typ="safe", pure=True)
    try:
        root = yaml.compose(text)
    except MarkedYAMLError as error:
        mark = error.problem_mark or error.context_mark
        where = f"{file}:{mark.line + 1}:{mark.column + 1}" if mark else f"{file}:1:1"
        problem = error.problem or error.context or "not valid YAML"
        raise WeirError(f"{where}: broken YAML: {problem}") from None
    except YAMLError as error:
        raise WeirError(f"{file}:1:1: broken YAML: {str(error).splitlines()[0]}") from None
    except RecursionError:  # ruamel's composer recurses once per nesting level
        raise WeirError(f"{file}:1:1: contract nests deeper than {MAX_DEPTH} levels") from None
    if root is None:
        raise WeirError(f"{file}:1:1: contract file holds no YAML document")
    budget = _Budget(file, yaml, max_nodes)
    return budget.build(root, None, 0, ())


class _Budget:
    """Walks the composed node graph, expanding aliases while counting every node it visits."""

    def __init__(self, file: str, yaml: YAML, max_nodes: int = MAX_NODES) -> None:
        self.file = file
        self.max_nodes = max_nodes
        self.yaml = yaml
        self.visited = 0

    def build(self, node: Node, key_at: Position | None, depth: int, path: tuple[int, ...]) -> YNode:
        at = place(self.file, node)
        self.visited += 1
        if self.visited > self.max_nodes:
            raise WeirError(
                f"{at}: contract expands to more than {self.max_nodes:,} YAML nodes "
                "(aliases repeated too often); write the values out plainly"
            )
        if depth > MAX_DEPTH or id(node) in path:
            raise WeirError(f"{at}: contract nests deeper than {MAX_DEPTH} levels or refers to itself")
        inner = (*path, id(node))
        if isinstance(node, ScalarNode):
            return self.scalar(node, at, key_at)
        if isinstance(node, SequenceNode):
            self.plain_tag(node, _TAG + "seq", at)
            items = [self.build(item, None, depth + 1, inner) for item in node.value]
            return YNode(items, at, key_position=key_at)
        if isinstance(node, MappingNode):
            self.plain_tag(node, _TAG + "map", at)
            entries: dict[str, YNode] = {}
            for key, value in node.value:
                key_pos = place(self.file, key)
                if not isinstance(key, ScalarNode) or key.tag == _TAG + "merge":
                    raise WeirError(f"{key_pos}: a key must be plain text")
                name = str(key.value)
                if name in entries:
                    raise WeirError(f"{key_pos}: key {name!r} is written twice in the same mapping")
                entries[name] = self.build(value, key_pos, depth + 1, inner)
            return YNode(entries, at, key_position=key_at)
        raise WeirError(f"{at}: unsupported YAML node")

    def plain_tag(self, node: Node, expected: str, at: Position) -> None:
        if node.tag != expected:
            raise WeirError(f"{at}: YAML tag {node.tag!r} is not allowed in a contract")

    def scalar(self, node: ScalarNode, at: Position, key_at: Position | None) -> YNode:
        if node.tag not in SCALAR_TAGS:
            raise WeirError(f"{at}: YAML tag {node.tag!r} is not allowed in a contract")
        try:
            value = self.yaml.constructor.construct_object(node, deep=True)
        except Exception:  # an explicit tag (!!bool, !!float...) on text that is not such a value
            kind = node.tag.rsplit(":", 1)[-1]
            raise WeirError(f"{at}: {node.value!r} is not a valid YAML {kind}") from None
        quote = node.style if node.style in ("'", '"') else ""
        return YNode(value, at, text=str(node.value), key_position=key_at, quote=quote or "")


def to_plain(node: YNode) -> object:
    """The tree as plain Python data (dates as ISO text), e.g. to validate against the JSON Schema."""
    if isinstance(node.value, dict):
        return {k: to_plain(v) for k, v in node.value.items()}
    if isinstance(node.value, list):
        return [to_plain(v) for v in node.value]
    if isinstance(node.value, date | datetime):
        return node.value.isoformat()
    return node.value

"""Typed reads of contract YAML entries; each wrong entry becomes a `path:line:col` WeirError."""

from __future__ import annotations

import difflib
from collections.abc import Sequence

from linter.contract.yaml_tree import YNode
from linter.errors import WeirError


def did_you_mean(word: str, choices: Sequence[str]) -> str:
    close = difflib.get_close_matches(word, list(choices), n=1, cutoff=0.6)
    return f"; did you mean {close[0]!r}?" if close else ""


def kind_of(node: YNode) -> str:
    if node.is_mapping:
        return "a mapping"
    if node.is_sequence:
        return "a list"
    if node.value is None:
        return "nothing"
    if isinstance(node.value, bool):
        return f"true/false ({node.text})"
    if isinstance(node.value, int | float):
        return f"a number ({node.text})"
    return f"{node.text!r}"


def mapping(node: YNode, what: str) -> dict[str, YNode]:
    if not isinstance(node.value, dict):
        raise WeirError(f"{node.position}: {what} must be a mapping of keys to values, not {kind_of(node)}")
    return node.value


def check_keys(node: YNode, allowed: Sequence[str], what: str) -> dict[str, YNode]:
    """The mapping's entries, after refusing any key outside `allowed` (with a did-you-mean)."""
    entries = mapping(node, what)
    for key, value in entries.items():
        if key not in allowed:
            raise WeirError(
                f"{value.where}: unknown key {key!r} in {what}{did_you_mean(key, allowed)}"
                f" (allowed: {', '.join(allowed)})"
            )
    return entries


def require(entries: dict[str, YNode], key: str, at: YNode, what: str) -> YNode:
    if key not in entries:
        raise WeirError(f"{at.position}: {what} needs a {key!r} entry")
    return entries[key]


def text(node: YNode, what: str, numbers_ok: bool = False) -> str:
    """A text entry; with `numbers_ok`, a number is kept exactly as written (`version: 2.10`)."""
    if isinstance(node.value, str) and node.value.strip():
        return node.value
    if numbers_ok and isinstance(node.value, int | float) and not isinstance(node.value, bool):
        return node.text
    raise WeirError(f"{node.position}: {what} must be text, not {kind_of(node)}")


def flag(node: YNode, what: str) -> bool:
    if not isinstance(node.value, bool):
        raise WeirError(f"{node.position}: {what} must be true or false, not {kind_of(node)}")
    return node.value


def text_list(node: YNode, what: str, one_ok: bool = True) -> tuple[str, ...]:
    """A list of texts as written (a single text counts as a list of one, if `one_ok`)."""
    if one_ok and isinstance(node.value, str):
        return (node.value,)
    if not isinstance(node.value, list):
        raise WeirError(f"{node.position}: {what} must be a list, not {kind_of(node)}")
    items: list[str] = []
    for item in node.value:
        if not item.is_scalar or item.value is None or isinstance(item.value, bool):
            raise WeirError(f"{item.position}: each item of {what} must be text, not {kind_of(item)}")
        items.append(item.text)
    return tuple(items)


def number(node: YNode, what: str) -> float:
    if isinstance(node.value, bool) or not isinstance(node.value, int | float):
        raise WeirError(f"{node.position}: {what} must be a number, not {kind_of(node)}")
    return float(node.value)


def one_of(node: YNode, choices: Sequence[str], what: str) -> str:
    word = text(node, what)
    if word not in choices:
        raise WeirError(
            f"{node.position}: {what} {word!r} is not one of {', '.join(choices)}"
            + did_you_mean(word, choices)
        )
    return word

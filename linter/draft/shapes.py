"""Generalise identifier values such as `VB-014` into the pattern they share, such as `^VB-\\d{3}$`."""

from __future__ import annotations

import re
from collections.abc import Iterable

import pandas as pd

TOKEN = re.compile(r"[A-Za-z]+|\d+|.", re.DOTALL)
SEPARATORS = frozenset("-_./:#")
REGEX_SPECIAL = frozenset(".^$*+?{}[]\\|()")


def tokens(value: str) -> list[str]:
    """Runs of letters, runs of digits, and single other characters."""
    return TOKEN.findall(value)


def kind(token: str) -> str:
    if token.isdigit():
        return "digits"
    if token.isalpha():
        return "letters"
    return token  # punctuation stands for itself


def id_pattern(values: pd.Series) -> str | None:
    """The one pattern every value fits, or None when the values are not identifiers of one shape.

    Digits always generalise (`014` -> `\\d{3}`); a letter run that is the same in every value and
    stands next to a separator is a fixed prefix and stays literal (`VB-`); other letter runs
    generalise by case (`AU260301` -> `[A-Z]{2}\\d{6}`). Values with spaces are text, not ids.
    Common practice (no source): identifiers are a fixed prefix plus a counter, as in `VB-014`.
    """
    unique = [str(v) for v in pd.unique(values)]
    if len(unique) < 2 or any(re.search(r"\s", v) for v in unique):
        return None
    split = [tokens(v) for v in unique]
    shape = [kind(t) for t in split[0]]
    if "digits" not in shape or any([kind(t) for t in s] != shape for s in split):
        return None
    parts: list[str] = []
    for position, token_kind in enumerate(shape):
        column = [s[position] for s in split]
        if token_kind == "digits":
            parts.append(r"\d" + _length(len(t) for t in column))
        elif token_kind == "letters":
            parts.append(_letters(column, shape, position))
        else:
            parts.append(literal(token_kind))
    return "^" + "".join(parts) + "$"


def _letters(column: list[str], shape: list[str], position: int) -> str:
    neighbours = {shape[i] for i in (position - 1, position + 1) if 0 <= i < len(shape)}
    if len(set(column)) == 1 and neighbours & SEPARATORS:
        return literal(column[0])
    if all(t.isupper() for t in column):
        letters = "[A-Z]"
    elif all(t.islower() for t in column):
        letters = "[a-z]"
    else:
        letters = "[A-Za-z]"
    return letters + _length(len(t) for t in column)


def literal(text: str) -> str:
    """Text as a regular expression that matches it, escaping only what needs it (`VB-`, not `VB\\-`)."""
    return "".join("\\" + c if c in REGEX_SPECIAL else c for c in text)


def _length(lengths: Iterable[int]) -> str:
    seen = set(lengths)
    low, high = min(seen), max(seen)
    return f"{{{low}}}" if low == high else f"{{{low},{high}}}"

"""Write one text that a contract's regular expression accepts, so example rows show a real id."""

from __future__ import annotations

import importlib
import re
import string
from typing import Any

sre: Any = importlib.import_module("re._parser")
"""The parser behind `re` itself: its tree is exactly what the pattern means to the check."""

CATEGORY_CHARS = {
    "CATEGORY_DIGIT": string.digits,
    "CATEGORY_WORD": string.ascii_uppercase + string.digits,
    "CATEGORY_SPACE": " ",
    "CATEGORY_NOT_DIGIT": string.ascii_uppercase,
    "CATEGORY_NOT_WORD": "-",
    "CATEGORY_NOT_SPACE": string.ascii_uppercase,
}
POOL = string.ascii_uppercase + string.digits + "-_."
"""Characters tried for `.` and negated classes."""


class Unwritable(Exception):
    """The pattern uses a construct this writer does not follow (look-around, back-reference...)."""


class Writer:
    """Walk the parsed pattern once, choosing characters by `variant` so two examples differ."""

    def __init__(self, variant: int) -> None:
        self.variant = variant
        self.turn = 0

    def pick(self, choices: str) -> str:
        if not choices:
            raise Unwritable("empty class")
        chosen = choices[(self.variant + self.turn + 1) % len(choices)]
        self.turn += 1
        return chosen

    def klass(self, items: list[tuple[Any, Any]]) -> str:
        allowed = ""
        negate = False
        for op, arg in items:
            name = str(op)
            if name == "NEGATE":
                negate = True
            elif name == "LITERAL":
                allowed += chr(arg)
            elif name == "RANGE":
                allowed += "".join(chr(c) for c in range(arg[0], min(arg[1], arg[0] + 40) + 1))
            elif name == "CATEGORY":
                allowed += CATEGORY_CHARS.get(str(arg), "")
            else:
                raise Unwritable(name)
        if negate:
            return self.pick("".join(c for c in POOL if c not in allowed))
        return self.pick(allowed)

    def walk(self, tree: Any) -> str:
        out = ""
        for op, arg in tree:
            name = str(op)
            if name == "LITERAL":
                out += chr(arg)
            elif name == "NOT_LITERAL":
                out += self.pick("".join(c for c in POOL if c != chr(arg)))
            elif name == "ANY":
                out += self.pick(POOL)
            elif name == "IN":
                out += self.klass(arg)
            elif name in ("MAX_REPEAT", "MIN_REPEAT", "POSSESSIVE_REPEAT"):
                low, _high, sub = arg
                out += "".join(self.walk(sub) for _ in range(low))
            elif name in ("SUBPATTERN", "ATOMIC_GROUP"):
                out += self.walk(arg[-1] if name == "SUBPATTERN" else arg)
            elif name == "BRANCH":
                alternatives = arg[1]
                out += self.walk(alternatives[self.variant % len(alternatives)])
            elif name == "AT":
                continue
            else:
                raise Unwritable(name)
        return out


def pattern_example(pattern: str, variant: int = 0) -> str | None:
    """A text that `pattern` fully matches, different for each variant where the pattern allows; or None."""
    try:
        tree = sre.parse(pattern)
    except re.error:
        return None
    for attempt in range(variant, variant + 12):
        try:
            text = Writer(attempt).walk(tree)
        except (Unwritable, RecursionError):
            return None
        if re.fullmatch(pattern, text):
            return text
    return None


def text_width(pattern: str) -> tuple[int, int | None]:
    """Shortest and longest text `pattern` can match (None: unbounded), for a text-length rule."""
    low, high = sre.parse(pattern).getwidth()
    return low, (None if high >= sre.MAXREPEAT else high)

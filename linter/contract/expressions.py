"""Weir's own tiny grammar for cross-variable rules (`min_temp <= max_temp`), parsed without eval.

    rule       := comparison ("and" comparison)*
    comparison := operand OPERATOR operand
    operand    := NAME | `any column name` | NUMBER
    OPERATOR   := <  <=  >  >=  ==  !=

A NAME is letters, digits and underscores (not starting with a digit); a column whose name has
other characters is written between backticks. Nothing else is accepted: no calls, no
arithmetic, no attribute access, so a rule can never run code.
"""

from __future__ import annotations

import difflib
import re
from collections.abc import Collection
from dataclasses import dataclass

from linter.contract.model import Comparison, Position
from linter.errors import WeirError

OPERATORS = ("<=", ">=", "==", "!=", "<", ">")
FLIPPED = {"<": ">", "<=": ">=", ">": "<", ">=": "<=", "==": "==", "!=": "!="}
"""`0 <= depth` is stored as `depth >= 0`, so the variable is always on the left."""

_TOKEN = re.compile(
    r"""
    (?P<space>\s+)
  | (?P<number>[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?(?![A-Za-z_]))
  | (?P<name>[A-Za-z_][A-Za-z0-9_]*)
  | (?P<quoted>`[^`\n]+`)
  | (?P<operator><=|>=|==|!=|<|>)
    """,
    re.VERBOSE,
)


@dataclass(frozen=True)
class Token:
    """One piece of a rule: its kind, its text and where it starts in the rule (0-based)."""

    kind: str
    text: str
    offset: int


def locate(at: Position, text: str, offset: int) -> Position:
    """The file position of character `offset` of a rule that starts at `at`."""
    before = text[:offset]
    newlines = before.count("\n")
    if newlines:
        return Position(at.file, at.line + newlines, offset - before.rfind("\n"))
    return Position(at.file, at.line, at.column + offset)


def fail(at: Position, text: str, offset: int, message: str) -> WeirError:
    return WeirError(f"{locate(at, text, offset)}: rule {text.strip()!r}: {message}")


def tokenize(text: str, at: Position) -> list[Token]:
    tokens: list[Token] = []
    offset = 0
    while offset < len(text):
        match = _TOKEN.match(text, offset)
        if match is None:
            char = text[offset]
            hint = (
                "; a rule compares two variables or a variable and a number, nothing more"
                if char in "()[]{}.*/+-%'\",;="
                else ""
            )
            raise fail(at, text, offset, f"unexpected character {char!r}{hint}")
        kind = match.lastgroup or ""
        if kind != "space":
            word = match.group()
            if kind == "name" and word in ("and", "or", "not"):
                kind = word
            tokens.append(Token(kind, word, offset))
        offset = match.end()
    return tokens


def operand_value(token: Token) -> tuple[str | float, bool]:
    """An operand as (variable name, True) or (number, False)."""
    if token.kind == "number":
        return float(token.text), False
    if token.kind == "quoted":
        return token.text[1:-1], True
    return token.text, True


def check_name(name: str, token: Token, text: str, at: Position, known: Collection[str] | None) -> None:
    if known is None or name in known:
        return
    close = difflib.get_close_matches(name, list(known), n=1)
    hint = f"; did you mean {close[0]!r}?" if close else ""
    raise fail(at, text, token.offset, f"{name!r} is not a variable of this table{hint}")


def parse_rule(text: str, at: Position, known: Collection[str] | None = None) -> tuple[Comparison, ...]:
    """Parse one rule into its comparisons (an `and` of several gives several records).

    `at` is where the rule's first character sits in the contract file; every error points
    into the rule text. `known`, if given, is the set of variable names a rule may use.
    """
    tokens = tokenize(text, at)
    if not tokens:
        raise fail(at, text, 0, "empty rule")
    clauses: list[list[Token]] = [[]]
    for token in tokens:
        if token.kind == "and":
            if not clauses[-1] or token is tokens[-1]:
                raise fail(at, text, token.offset, "'and' needs a comparison on each side")
            clauses.append([])
        elif token.kind in ("or", "not"):
            raise fail(at, text, token.offset, f"{token.text!r} is not supported; only 'and' joins rules")
        else:
            clauses[-1].append(token)
    return tuple(parse_clause(clause, text, at, known, single=len(clauses) == 1) for clause in clauses)


def parse_clause(
    clause: list[Token], text: str, at: Position, known: Collection[str] | None, single: bool
) -> Comparison:
    is_operator = [t.kind == "operator" for t in clause]
    if len(clause) > 3 and is_operator[:4] == [False, True, False, True]:
        raise fail(at, text, clause[3].offset, "chained comparison; write 'a < b and b < c'")
    wanted = (False, True, False)
    for index, want_operator in enumerate(wanted):
        expected = "a comparison operator (< <= > >= == !=)" if want_operator else "a variable or a number"
        if index >= len(clause):
            last = clause[-1]
            raise fail(at, text, last.offset + len(last.text), f"expected {expected} after {last.text!r}")
        if is_operator[index] != want_operator:
            raise fail(at, text, clause[index].offset, f"expected {expected}, found {clause[index].text!r}")
    if len(clause) > 3:
        raise fail(at, text, clause[3].offset, f"unexpected {clause[3].text!r} after the comparison")
    left_token, op_token, right_token = clause
    left, left_is_variable = operand_value(left_token)
    right, right_is_variable = operand_value(right_token)
    operator = op_token.text
    if not left_is_variable and not right_is_variable:
        raise fail(at, text, left_token.offset, "compares two numbers; name at least one variable")
    if left_is_variable:
        check_name(str(left), left_token, text, at, known)
    if right_is_variable:
        check_name(str(right), right_token, text, at, known)
    start = left_token.offset
    if not left_is_variable:
        left, right, operator = right, left, FLIPPED[operator]
        left_is_variable, right_is_variable = True, False
    clause_text = text.strip() if single else text[start : right_token.offset + len(right_token.text)]
    return Comparison(
        text=clause_text,
        left=str(left),
        operator=operator,
        right=right,
        right_is_variable=right_is_variable,
        position=locate(at, text, start),
    )

"""The rule grammar: what it accepts, where it points when it refuses, and that it never runs text."""

from __future__ import annotations

import operator
import re
from pathlib import Path

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from linter.contract.expressions import FLIPPED, parse_rule
from linter.contract.model import Position
from linter.errors import WeirError

AT = Position("c.yaml", 7, 11)
KNOWN = ("min_temp", "max_temp", "depth_m", "result", "limit", "max temp (C)")


@pytest.mark.parametrize(
    ("rule", "expected"),
    [
        ("min_temp <= max_temp", [("min_temp", "<=", "max_temp", True)]),
        ("depth_m>=0", [("depth_m", ">=", 0.0, False)]),
        ("result != -1.5e2", [("result", "!=", -150.0, False)]),
        ("result < .5", [("result", "<", 0.5, False)]),
        ("10 > depth_m", [("depth_m", "<", 10.0, False)]),
        ("`max temp (C)` == limit", [("max temp (C)", "==", "limit", True)]),
        (
            "min_temp < max_temp and result <= limit",
            [("min_temp", "<", "max_temp", True), ("result", "<=", "limit", True)],
        ),
    ],
)
def test_valid_rules(rule: str, expected: list[tuple[str, str, object, bool]]) -> None:
    parsed = parse_rule(rule, AT, KNOWN)
    assert [(c.left, c.operator, c.right, c.right_is_variable) for c in parsed] == expected
    assert parsed[0].position == AT


def test_second_clause_points_at_its_own_start() -> None:
    rule = "min_temp < max_temp and result <= limit"
    second = parse_rule(rule, AT, KNOWN)[1]
    assert second.text == "result <= limit"
    assert second.position == Position("c.yaml", 7, AT.column + rule.index("result"))


@pytest.mark.parametrize("op", sorted(FLIPPED))
@pytest.mark.parametrize("value", [-1.0, 2.0, 3.0, 4.5])
def test_flipping_a_number_on_the_left_keeps_the_meaning(op: str, value: float) -> None:
    # Source: Python's operator module as the reference meaning of each comparison
    functions = {
        "<": operator.lt,
        "<=": operator.le,
        ">": operator.gt,
        ">=": operator.ge,
        "==": operator.eq,
        "!=": operator.ne,
    }
    (comparison,) = parse_rule(f"3 {op} depth_m", AT, KNOWN)
    assert comparison.left == "depth_m" and comparison.right == 3.0
    assert functions[comparison.operator](value, 3.0) == functions[op](3.0, value)


@pytest.mark.parametrize(
    ("rule", "anchor", "words"),
    [
        ("min_temp <", "<", "expected a variable or a number after '<'"),
        ("min_temp <= max_temp <= limit", "<= limit", "chained comparison"),
        ("min_temp = max_temp", "=", "unexpected character '='"),
        ("result <= 10 * limit", "*", "unexpected character '*'"),
        ("1 < 2", "1", "compares two numbers"),
        ("min_temp < max_temp or depth_m > 0", "or", "only 'and' joins rules"),
        ("min_temp max_temp", "max_temp", "expected a comparison operator"),
        ("and min_temp < max_temp", "and", "'and' needs a comparison on each side"),
        ("min_temp < max_temp and", "and", "'and' needs a comparison on each side"),
        ("min_tmp < max_temp", "min_tmp", "did you mean 'min_temp'?"),
        ("result.real > 0", ".", "unexpected character '.'"),
        ("", None, "empty rule"),
    ],
)
def test_invalid_rules_point_into_the_rule(rule: str, anchor: str | None, words: str) -> None:
    offset = rule.rindex(anchor) if anchor in ("and", "<= limit") else (rule.index(anchor) if anchor else 0)
    if anchor == "<":
        offset = len(rule)  # nothing after the operator: the error points just past it
    with pytest.raises(WeirError) as caught:
        parse_rule(rule, AT, KNOWN)
    message = str(caught.value)
    assert message.startswith(f"c.yaml:7:{AT.column + offset}: "), message
    assert words in message


def test_rule_spread_over_lines_points_at_the_right_line() -> None:
    with pytest.raises(WeirError, match=r"^c\.yaml:8:3: "):
        parse_rule("min_temp <=\n  ?", AT, KNOWN)


@pytest.mark.parametrize(
    "rule",
    [
        "__import__('os').system('touch pwned')",
        "open('pwned', 'w') == 1",
        "exec(\"open('pwned','w')\") == 1",
        "depth_m >= 0 and __import__('os').system('touch pwned') == 0",
        "(lambda: open('pwned', 'w'))() == 0",
    ],
)
def test_code_in_a_rule_is_refused_and_never_run(tmp_path: Path, rule: str) -> None:
    # tests run inside tmp_path; if the text were evaluated, a file named pwned would appear here
    with pytest.raises(WeirError, match=r"unexpected character|not a variable"):
        parse_rule(rule, AT, KNOWN)
    assert not (tmp_path / "pwned").exists()


def test_without_known_names_any_name_parses() -> None:
    (comparison,) = parse_rule("anything <= other", AT)
    assert (comparison.left, comparison.right) == ("anything", "other")


RULE_BITS = [*"ab_01.<=>!`()'\" \n\t-+eE", "and", "or", " min_temp "]


@settings(max_examples=200, deadline=None)
@given(st.lists(st.sampled_from(RULE_BITS), max_size=20).map("".join))
def test_any_text_parses_or_gives_one_positioned_line(rule: str) -> None:
    try:
        parsed = parse_rule(rule, AT)
    except WeirError as error:
        message = str(error)
        assert re.match(r"^c\.yaml:\d+:\d+: rule ", message) and "\n" not in message
        return
    # whatever parsed is made only of names, numbers and the six operators
    assert parsed and all(c.operator in FLIPPED and c.left for c in parsed)

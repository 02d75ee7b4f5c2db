"""Every rule documents itself: a title, what it finds, and a bad and a good example."""

from __future__ import annotations

import re

import pytest

import linter.rules.catalogue  # noqa: F401
from linter.rules.registry import RULES

RULE_ID = re.compile(r"^[a-z]+(\.[a-z0-9-]+)+$")


def test_rules_are_registered() -> None:
    assert RULES, "no rule family registered in linter/rules/catalogue.py"


@pytest.mark.parametrize("rule_id", sorted(RULES))
def test_rule_documents_bad_and_good_form(rule_id: str) -> None:
    rule = RULES[rule_id]
    assert RULE_ID.match(rule.id)
    assert rule.title and rule.title[0].isupper()
    assert "Bad:" in rule.doc and "Good:" in rule.doc, f"{rule_id} doc lacks Bad:/Good: examples"
    assert len(rule.doc.split("Bad:")[0].strip()) > 20, f"{rule_id} doc does not say what it finds"

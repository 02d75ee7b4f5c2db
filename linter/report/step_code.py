"""The pandas code of one recipe step, as the reshape engine writes it, for a letter to show."""

from __future__ import annotations

from collections.abc import Mapping
from typing import Any

from linter.errors import WeirError


def step_pandas_code(step: Mapping[str, Any]) -> str | None:
    """The engine's pandas lines for `step` (acting on `df`), or None if the engine cannot read it.

    A letter must still go out when a detector proposes a step the engine does not know (yet):
    then the reader sees the step's JSON only.
    """
    import linter.reshape.recipe  # noqa: F401  (registers every step)
    from linter.reshape.steps import STEPS, step_from_json

    try:
        params = step_from_json(dict(step), 1)
        return "\n".join(STEPS[str(step["step"])].code(params))
    except (WeirError, KeyError, TypeError, ValueError):
        return None

"""The JSON Schema of saved recipes, derived from the registered steps' parameter classes."""

from __future__ import annotations

import dataclasses
import json
import types
import typing
from pathlib import Path
from typing import Any, Literal, get_args, get_origin

import linter.reshape.recipe  # noqa: F401  (registers the built-in steps)
from linter.reshape.steps import STEPS, StepParams

SCHEMA_PATH = Path(__file__).with_name("recipe-v1.json")


def _type_schema(hint: Any) -> dict[str, Any]:
    origin = get_origin(hint)
    if origin in (typing.Union, types.UnionType):
        options = [o for o in get_args(hint) if o is not type(None)]
        return {"anyOf": [_type_schema(options[0]), {"type": "null"}]}
    if origin is Literal:
        return {"enum": list(get_args(hint))}
    if origin is tuple:
        return {"type": "array", "items": _type_schema(get_args(hint)[0])}
    if origin is dict:
        return {"type": "object", "additionalProperties": _type_schema(get_args(hint)[1])}
    if isinstance(hint, type) and issubclass(hint, StepParams):
        return _params_schema(hint, with_step=bool(hint.step))
    return {bool: {"type": "boolean"}, int: {"type": "integer"}, str: {"type": "string"}}[hint]


def _params_schema(params: type[StepParams], with_step: bool = True) -> dict[str, Any]:
    hints = typing.get_type_hints(params)
    properties: dict[str, Any] = {"step": {"const": params.step}} if with_step else {}
    required = ["step"] if with_step else []
    for f in dataclasses.fields(params):  # type: ignore[arg-type]
        properties[f.name] = _type_schema(hints[f.name])
        if f.default is dataclasses.MISSING and f.default_factory is dataclasses.MISSING:
            required.append(f.name)
    doc = (params.__doc__ or "").strip().split("\n\n")[0]
    return {
        "description": " ".join(doc.split()),
        "type": "object",
        "properties": properties,
        "required": required,
        "additionalProperties": False,
    }


def recipe_schema() -> dict[str, Any]:
    """JSON Schema (draft 2020-12) of `{"weir_recipe": 1, "steps": [...]}` for every registered step."""
    return {
        "$schema": "https://json-schema.org/draft/2020-12/schema",
        "$id": "https://weir.invalid/schema/recipe-v1.json",
        "title": "Weir reshaping recipe, format 1",
        "type": "object",
        "properties": {
            "weir_recipe": {"const": 1},
            "steps": {
                "type": "array",
                "items": {"oneOf": [{"$ref": f"#/$defs/{name}"} for name in sorted(STEPS)]},
            },
        },
        "required": ["weir_recipe", "steps"],
        "additionalProperties": False,
        "$defs": {name: _params_schema(STEPS[name].params) for name in sorted(STEPS)},
    }


def schema_text() -> str:
    return json.dumps(recipe_schema(), indent=2, ensure_ascii=False) + "\n"


if __name__ == "__main__":  # regenerate the shipped schema after adding a step
    SCHEMA_PATH.write_text(schema_text(), encoding="utf-8")

"""The step registry: step name -> parameter class, apply function and pandas-code function."""

from __future__ import annotations

import dataclasses
import types
import typing
from collections.abc import Callable, Mapping
from dataclasses import dataclass, replace
from typing import Any, ClassVar, Literal, Self, TypeVar, get_args, get_origin

from linter.errors import WeirError
from linter.reshape.sheet import Bench, Carried, Dropped, Sheet, StepNote


class RecipeError(WeirError):
    """A recipe that cannot be read or cannot be applied to this table (exit 2, one line)."""


class StepParams:
    """Base of every step's frozen parameter dataclass: JSON in and out, with validation.

    Subclasses are frozen dataclasses whose fields use only str, int, bool, Literal,
    tuple[X, ...], dict[str, str], optional forms of those, or a nested StepParams
    dataclass (and tuples of them), so one generic reader validates every saved recipe.
    """

    step: ClassVar[str] = ""

    def to_json(self) -> dict[str, Any]:
        out: dict[str, Any] = {"step": self.step}
        for f in dataclasses.fields(self):  # type: ignore[arg-type]
            out[f.name] = _to_json(getattr(self, f.name))
        return out

    @classmethod
    def from_json(cls, data: Mapping[str, Any]) -> Self:
        where = f"step '{cls.step}'"
        if not isinstance(data, Mapping):
            raise RecipeError(f"{where}: expected an object, got {type(data).__name__}")
        hints = typing.get_type_hints(cls)
        fields = {f.name: f for f in dataclasses.fields(cls)}  # type: ignore[arg-type]
        unknown = sorted(set(data) - set(fields) - {"step"})
        if unknown:
            raise RecipeError(
                f"{where}: unknown parameter(s) {', '.join(unknown)}; known: {', '.join(fields)}"
            )
        values: dict[str, Any] = {}
        for name, f in fields.items():
            if name in data:
                values[name] = _read(hints[name], data[name], f"{where}, parameter '{name}'")
            elif f.default is dataclasses.MISSING and f.default_factory is dataclasses.MISSING:
                raise RecipeError(f"{where}: missing parameter '{name}'")
        made = cls(**values)
        made.check()
        return made

    def check(self) -> None:
        """Further checks of the parameters; raise RecipeError with a one-line reason."""


def _to_json(value: Any) -> Any:
    if isinstance(value, StepParams):
        out = value.to_json()
        if not value.step:  # a nested parameter group, not a step of its own
            out.pop("step")
        return out
    if dataclasses.is_dataclass(value) and not isinstance(value, type):
        return {f.name: _to_json(getattr(value, f.name)) for f in dataclasses.fields(value)}
    if isinstance(value, tuple):
        return [_to_json(v) for v in value]
    if isinstance(value, Mapping):
        return {str(k): _to_json(v) for k, v in value.items()}
    return value


def _read(hint: Any, value: Any, where: str) -> Any:
    origin = get_origin(hint)
    if origin in (typing.Union, types.UnionType):
        options = get_args(hint)
        if value is None and type(None) in options:
            return None
        (inner,) = [o for o in options if o is not type(None)]
        return _read(inner, value, where)
    if origin is Literal:
        if value not in get_args(hint):
            allowed = ", ".join(repr(a) for a in get_args(hint))
            raise RecipeError(f"{where}: {value!r} is not one of {allowed}")
        return value
    if origin is tuple:
        if not isinstance(value, list):
            raise RecipeError(f"{where}: expected a list, got {type(value).__name__}")
        inner = get_args(hint)[0]
        return tuple(_read(inner, v, f"{where}[{i}]") for i, v in enumerate(value))
    if origin is dict:
        if not isinstance(value, dict):
            raise RecipeError(f"{where}: expected an object, got {type(value).__name__}")
        key_hint, value_hint = get_args(hint)
        return {_read(key_hint, k, where): _read(value_hint, v, f"{where}['{k}']") for k, v in value.items()}
    if isinstance(hint, type) and issubclass(hint, StepParams):
        return hint.from_json(value)
    if hint is bool:
        if not isinstance(value, bool):
            raise RecipeError(f"{where}: expected true or false, got {value!r}")
        return value
    if hint is int:
        if isinstance(value, bool) or not isinstance(value, int):
            raise RecipeError(f"{where}: expected a whole number, got {value!r}")
        return value
    if hint is str:
        if not isinstance(value, str):
            raise RecipeError(f"{where}: expected text, got {value!r}")
        return value
    raise TypeError(f"{where}: unsupported parameter type {hint!r}")  # a programming error, not input


P = TypeVar("P", bound=StepParams)


@dataclass(frozen=True)
class Outcome:
    """What a single-sheet step returns: the new sheet and what the audit must know."""

    sheet: Sheet
    dropped: tuple[tuple[tuple[int, ...], str], ...] = ()
    """(origin codes, reason) of input cells removed on purpose."""
    notes: tuple[tuple[str, str, tuple[int, ...]], ...] = ()
    """(kind, message, origin codes) to report."""
    renamed: tuple[int, ...] = ()
    carried: tuple[Carried, ...] = ()
    """Input cells kept inside output texts beyond their one origin code (see Carried)."""


@dataclass(frozen=True)
class StepKind:
    """One entry of the registry."""

    name: str
    params: type[StepParams]
    apply: Callable[[Any, Bench], Bench]
    code: Callable[[Any], list[str]]
    """Lines of pandas code acting on `df` (index = provider row numbers) for these parameters."""
    grid_level: bool
    """True for steps that act on the raw grid, before a header is chosen."""


STEPS: dict[str, StepKind] = {}


def register_bench_step(
    params: type[P], *, grid_level: bool, code: Callable[[P], list[str]]
) -> Callable[[Callable[[P, Bench], Bench]], Callable[[P, Bench], Bench]]:
    """Register a step that sees the whole bench (all sheets): for steps that make or merge tables."""

    def register(apply: Callable[[P, Bench], Bench]) -> Callable[[P, Bench], Bench]:
        if params.step in STEPS:
            raise ValueError(f"step {params.step!r} registered twice")
        STEPS[params.step] = StepKind(params.step, params, apply, code, grid_level)
        return apply

    return register


def register_sheet_step(
    params: type[P], *, grid_level: bool, code: Callable[[P], list[str]]
) -> Callable[[Callable[[P, Sheet], Outcome]], Callable[[P, Sheet], Outcome]]:
    """Register a step that reshapes each sheet on its own (the usual case)."""

    def register(apply: Callable[[P, Sheet], Outcome]) -> Callable[[P, Sheet], Outcome]:
        def on_bench(p: P, bench: Bench) -> Bench:
            sheets, dropped, notes, renamed = {}, list(bench.dropped), list(bench.notes), set(bench.renamed)
            carried = list(bench.carried)
            for name, sheet in bench.sheets.items():
                outcome = apply(p, sheet)
                sheets[name] = outcome.sheet
                dropped += [Dropped(codes, reason, bench.step) for codes, reason in outcome.dropped if codes]
                notes += [StepNote(bench.step, kind, msg, codes) for kind, msg, codes in outcome.notes]
                renamed.update(outcome.renamed)
                carried += outcome.carried
            return replace(
                bench,
                sheets=sheets,
                dropped=tuple(dropped),
                notes=tuple(notes),
                renamed=frozenset(renamed),
                carried=tuple(carried),
            )

        register_bench_step(params, grid_level=grid_level, code=code)(on_bench)
        return apply

    return register


def step_from_json(data: Any, position: int) -> StepParams:
    """Read one saved step; the error names its position and the known step names."""
    if not isinstance(data, Mapping) or not isinstance(data.get("step"), str):
        raise RecipeError(f'recipe step {position}: expected an object with a "step" name')
    kind = STEPS.get(data["step"])
    if kind is None:
        known = ", ".join(sorted(STEPS))
        raise RecipeError(f"recipe step {position}: unknown step {data['step']!r}; known steps: {known}")
    try:
        return kind.params.from_json(data)
    except RecipeError as err:
        raise RecipeError(f"recipe step {position}: {err}") from None

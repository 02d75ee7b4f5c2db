"""The typer application and the one error boundary every command goes through."""

from __future__ import annotations

import functools
import sys
from collections.abc import Callable
from typing import Any, TypeVar

import typer

from linter.errors import WeirError

app = typer.Typer(
    name="weir",
    help="Check partner data files against their contract, and say how to fix them.",
    no_args_is_help=True,
    add_completion=False,
    pretty_exceptions_enable=False,
)

F = TypeVar("F", bound=Callable[..., Any])


def guarded(command: F) -> F:
    """Map Weir's own errors to exit 2 with one line, never a traceback.

    The command's integer result becomes the exit code (0 pass, 1 findings).
    """

    @functools.wraps(command)
    def run(*args: Any, **kwargs: Any) -> None:
        try:
            code = command(*args, **kwargs)
        except WeirError as error:
            print(f"weir: {error}", file=sys.stderr)
            raise typer.Exit(2) from None
        except KeyboardInterrupt:
            print("weir: interrupted", file=sys.stderr)
            raise typer.Exit(130) from None
        except OSError as error:
            print(
                f"weir: {error.strerror or error}: {error.filename or ''}".rstrip(": "),
                file=sys.stderr,
            )
            raise typer.Exit(2) from None
        except (typer.Exit, typer.Abort):
            raise
        except Exception as error:  # the last line of defence: a bug must not show a traceback
            print(
                f"weir: internal error ({type(error).__name__}: {error}); please report it",
                file=sys.stderr,
            )
            raise typer.Exit(2) from None
        raise typer.Exit(int(code or 0))

    return run  # type: ignore[return-value]

"""Fuzz target: any contract text loads into a Contract or fails with one positioned WeirError."""

from __future__ import annotations

import sys

import atheris

# Only Weir's own modules are instrumented: pandas and friends are imported by them
# uninstrumented, or start-up would take minutes. Lazy imports are made here, inside.
with atheris.instrument_imports(include=["linter"]):
    import linter.contract.codes
    import linter.contract.expressions  # noqa: F401  (instrumented for coverage)
    from linter.contract.load import load_contract
    from linter.errors import WeirError

from verdicts import scratch_file


def test_one_input(data: bytes) -> None:
    path = scratch_file("contract.yaml", data)
    try:
        load_contract(path)
    except WeirError as error:
        message = str(error)
        assert message and "\n" not in message.strip(), message


if __name__ == "__main__":
    atheris.Setup(sys.argv, test_one_input)
    atheris.Fuzz()

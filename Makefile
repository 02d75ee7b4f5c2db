# Everything Weir needs is installed from here; `make demo` and `make test` are the README's two commands.
PY ?= python3
VENV ?= .venv
BIN := $(VENV)/bin
STAMP := $(VENV)/.installed

.PHONY: venv demo test lint format bench clean

$(STAMP): pyproject.toml
	$(PY) -m venv $(VENV)
	$(BIN)/pip install -q --upgrade pip
	$(BIN)/pip install -q -e '.[test]'
	touch $(STAMP)

venv: $(STAMP)

demo: venv
	$(BIN)/python -m linter.demo

test: venv
	$(BIN)/pytest -q -n 2

lint: venv
	$(BIN)/ruff check linter tests benchmarks fuzz
	$(BIN)/ruff format --check linter tests benchmarks fuzz
	$(BIN)/mypy linter benchmarks

format: venv
	$(BIN)/ruff format linter tests benchmarks
	$(BIN)/ruff check --fix linter tests benchmarks

bench: venv
	$(BIN)/pip install -q -e '.[test,bench]'  # polars: the pandera-polars baseline of benchmarks/scale.py
	for script in benchmarks/*.py; do echo "== $$script"; $(BIN)/python $$script || exit 1; done

clean:
	rm -rf $(VENV) demo-out .pytest_cache .mypy_cache .ruff_cache

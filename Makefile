# Every target does its own set-up from a fresh clone: it creates .venv and installs what it needs.
PYTHON ?= python3
VENV := .venv
BIN := $(VENV)/bin
STAMP := $(VENV)/.installed

.PHONY: install test demo bench clean

$(STAMP): pyproject.toml
	$(PYTHON) -m venv $(VENV)
	$(BIN)/python -m pip install --quiet --upgrade pip
	$(BIN)/python -m pip install --quiet -e ".[test]"
	touch $(STAMP)

install: $(STAMP)

test: $(STAMP)
	$(BIN)/python -m pytest

# The demo unit has one line that fails on purpose (exit code 1); only a usage error (2) stops make.
demo: $(STAMP)
	$(BIN)/boresize size examples/demo-unit/lines.csv --criteria examples/demo-unit/criteria.toml; \
	  status=$$?; [ $$status -le 1 ]

bench: $(STAMP)
	$(BIN)/python benchmarks/bench_sizing.py

clean:
	rm -rf $(VENV) build *.egg-info src/*.egg-info .pytest_cache

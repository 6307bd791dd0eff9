# Every target does its own set-up from a fresh clone: it creates .venv and installs what it needs (every extra:
# the report, workbook and progress-bar modules are extras, boresize[outputs]).
PYTHON ?= python3
VENV := .venv
BIN := $(VENV)/bin
STAMP := $(VENV)/.installed

.PHONY: install test demo bench lowest clean

$(STAMP): pyproject.toml
	$(PYTHON) -m venv $(VENV)
	$(BIN)/python -m pip install --quiet --upgrade pip
	$(BIN)/python -m pip install --quiet -e ".[test,outputs]"
	touch $(STAMP)

install: $(STAMP)

test: $(STAMP)
	$(BIN)/ruff check src tests plugins examples benchmarks
	$(BIN)/mypy
	$(BIN)/python -m pytest

# The demo unit has one line that fails on purpose (exit code 1); only a usage error (2) stops make.
# It also writes the calculation report, its paged PDF sheet and the result workbook to out/, and compares revision 2
# of the line list (flows raised 30 % on some lines) with the first (diff exits 1 when lines changed).
DEMO := examples/demo-unit
demo: $(STAMP)
	mkdir -p out
	$(BIN)/boresize size $(DEMO)/lines.csv --criteria $(DEMO)/criteria.toml --document $(DEMO)/document.toml \
	  --output out/demo-report.html --output out/demo-sheet.pdf --output out/demo-results.xlsx; \
	  status=$$?; [ $$status -le 1 ]
	$(BIN)/boresize diff $(DEMO)/lines.csv $(DEMO)/lines-rev2.csv --criteria $(DEMO)/criteria.toml; \
	  status=$$?; [ $$status -le 1 ]
	@echo "Calculation report written to out/demo-report.html (open it in a browser), the paged sheet to out/demo-sheet.pdf; results in out/demo-results.xlsx"

# Every benchmark in benchmarks/ (bench_batch.py: 2,000 lines on 2 worker processes against the property floor;
# bench_mixtures.py: 300 natural-gas lines through the CLI against the thermo and CoolProp floors;
# bench_scale.py: the CLI against the CoolProp floor at 2,000 lines and one line, time per line and peak memory
# up to 50,000 lines).
bench: $(STAMP)
	@for script in benchmarks/bench_*.py; do echo "== $$script"; $(BIN)/python $$script || exit 1; done

# The declared minimum versions, proved: the lowest version of every direct dependency in a fresh venv (uv's
# --resolution lowest-direct), then again with numpy 2, each running the smoke subset (.ci/smoke.py).
lowest:
	PYTHON=$(PYTHON) .ci/lowest-versions

clean:
	rm -rf $(VENV) build *.egg-info src/*.egg-info .pytest_cache

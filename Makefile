# Two entry points: `make demo` and `make test`. Both create .venv on first use.
PYTHON ?= python3
VENV   := .venv
BIN    := $(VENV)/bin

.PHONY: demo test bench clean

$(BIN)/python:
	$(PYTHON) -m venv $(VENV)
	$(BIN)/python -m pip install --quiet --upgrade pip

$(VENV)/.installed: $(BIN)/python pyproject.toml
	$(BIN)/python -m pip install --quiet -e '.[test]'
	touch $@

demo: $(VENV)/.installed
	$(BIN)/cablefam sweep --demo --overwrite
	@echo "(the cablefam command is $(BIN)/cablefam; or run: . $(BIN)/activate)"

test: $(VENV)/.installed
	$(BIN)/python -m pytest -q

bench: $(VENV)/.installed
	$(BIN)/python tests/benchmarks/bench_physics.py

clean:
	rm -rf $(VENV) build *.egg-info

# Two commands do everything on a fresh machine:
#   make demo   set up, then build the demo packages into out/
#   make test   set up, then run the test suite
PY      ?= python3
VENV    := .venv
BIN     := $(VENV)/bin
STAMP   := $(VENV)/.installed

.PHONY: demo test setup bench clean mutation

$(STAMP): pyproject.toml
	bash .ci/system-deps
	$(PY) -m venv $(VENV)
	$(BIN)/pip install --quiet --upgrade pip
	$(BIN)/pip install --quiet -e '.[test]'
	touch $(STAMP)

setup: $(STAMP)

demo: $(STAMP)
	$(BIN)/calcsheet build sheets/*.calc -o out --format html,pdf,json
	$(BIN)/calcsheet build sheets/boardwalk_joist.calc --schedule sheets/schedules/boardwalk_joists.csv -o out/boardwalk_joists --format html,pdf,json
	$(BIN)/calcsheet build sheets/boardwalk_joist.calc --sweep "L=2.4:4.8:0.1 m" -o out --format html,pdf,json

test: $(STAMP)
	bash .ci/system-deps --test
	$(BIN)/python -m pytest -q

# Every benchmark, then one table of every figure with its goal and PASS/MISS (benchmarks/summary.py).
bench: $(STAMP)
	@summary=$$(mktemp); \
	for b in benchmarks/bench_*.py; do echo "== $$b"; \
	  CALCSHEET_BENCH_SUMMARY=$$summary $(BIN)/python $$b || { rm -f $$summary; exit 1; }; done; \
	echo; $(BIN)/python benchmarks/summary.py $$summary; rm -f $$summary

# Mutation testing of the engineering modules (slow; not part of CI). Narrow it with
#   make mutation MUTATION_ARGS="column material --limit 40"
mutation: $(STAMP)
	$(BIN)/python tools/mutation.py $(MUTATION_ARGS)

clean:
	rm -rf out build *.egg-info

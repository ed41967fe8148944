# gainscape — build, test, examples and benchmarks.
GO ?= go

.PHONY: build test demo examples bench fuzz check

build:
	$(GO) build -o bin/gainscape ./cmd/gainscape

test:
	$(GO) test -timeout 20m ./...

# The built-in demo map, written to gainscape-demo.png.
demo: build
	./bin/gainscape map

# Re-make every image in examples/ from its scenario (output paths in a
# scenario are taken from the scenario's own folder); a file named
# *-compare.toml is a comparison, with its note and responses.
examples: build
	./bin/gainscape map -o examples/demo-pump-pid.png --grid 400x300 --quiet
	for f in examples/*.toml; do \
		case "$$f" in \
		*-compare.toml) ./bin/gainscape compare --scenario "$$f" --quiet || exit 1 ;; \
		*) ./bin/gainscape map --scenario "$$f" --quiet || exit 1 ;; \
		esac; \
	done

# Every benchmark, each comparing methods within one run; the command's
# end-to-end benchmarks (the demo at 800×800, a degree-20 map) report
# their ratio to a per-node eigenvalue loop over the same nodes as
# "eigen/map".
bench:
	$(GO) test -run XXX -bench . -benchtime 2s ./regions/...
	$(GO) test -run XXX -bench . -benchtime 2s ./cmd/gainscape/

# Longer fuzz runs than the few seconds CI gives each target.
fuzz:
	$(GO) test -run XXX -fuzz '^FuzzParse$$' -fuzztime 3m ./regions/expr/
	$(GO) test -run XXX -fuzz '^FuzzParseList$$' -fuzztime 3m ./regions/expr/
	$(GO) test -run XXX -fuzz '^FuzzParsePlant$$' -fuzztime 3m ./regions/expr/
	$(GO) test -run XXX -fuzz '^FuzzCount$$' -fuzztime 3m ./regions/routh/
	$(GO) test -run XXX -fuzz '^FuzzDecode$$' -fuzztime 3m ./regions/scenario/
	$(GO) test -run XXX -fuzz '^FuzzDecodeCompare$$' -fuzztime 3m ./regions/scenario/

check:
	gofmt -l .
	$(GO) vet ./...
	$(GO) test -timeout 20m ./...

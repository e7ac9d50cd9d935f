# Two quick-start commands: `make demo` and `make test`. Both run `setup` first.
BUILD ?= build
JOBS ?= 2
PACKAGES := $(shell grep -v '^\#' .ci/packages)

.PHONY: setup configure build demo test san-build test-asan fuzz-smoke fuzz-long adversarial-long bench bench-sweep clean format

setup:
	@missing=""; for p in $(PACKAGES); do \
	  dpkg-query -W -f='$${Status}' $$p 2>/dev/null | grep -q 'install ok installed' || missing="$$missing $$p"; \
	done; \
	if [ -n "$$missing" ]; then \
	  if [ "$$(id -u)" = 0 ]; then \
	    echo "porecert: installing$$missing"; \
	    apt-get update -q && DEBIAN_FRONTEND=noninteractive apt-get install -y -q --no-install-recommends $$missing; \
	  else \
	    echo "porecert: missing Debian packages. Run as root:"; \
	    echo "  apt-get update && apt-get install -y$$missing"; exit 1; \
	  fi; \
	fi

configure: setup
	cmake -S . -B $(BUILD) -DCMAKE_BUILD_TYPE=Release \
	  -DPORECERT_MPI=$$(dpkg-query -W -f='$${Status}' libopenmpi-dev 2>/dev/null | grep -q 'install ok installed' && echo ON || echo OFF)

build: configure
	cmake --build $(BUILD) -j $(JOBS)

demo: configure
	cmake --build $(BUILD) -j $(JOBS) --target porecert
	./$(BUILD)/porecert verify cases/membrane-module.toml --json $(BUILD)/membrane-module.cert.json
	./$(BUILD)/porecert report $(BUILD)/membrane-module.cert.json --html $(BUILD)/membrane-module.html

test: build
	cd $(BUILD) && ctest --output-on-failure -j $(JOBS)
	$(MAKE) --no-print-directory test-asan fuzz-smoke

# Soundness campaign (docs/soundness.md §3): one clang build with ASan + UBSan and libFuzzer's
# coverage hooks at -O1 serves both the whole suite at a reduced PORECERT_TEST_SCALE and a short
# libFuzzer run of every reader. One build instead of two (g++ ASan at -O2 was most of CI's time).
SAN_BUILD ?= build-san
ASAN_SCALE ?= 0.1
FUZZ_SECONDS ?= 10
san-build: setup
	cmake -S . -B $(SAN_BUILD) -DCMAKE_BUILD_TYPE=Release "-DCMAKE_CXX_FLAGS_RELEASE=-O1 -gline-tables-only" \
	  -DCMAKE_CXX_COMPILER=clang++ -DPORECERT_FUZZ=ON
	cmake --build $(SAN_BUILD) -j $(JOBS)
	cmake --build $(SAN_BUILD) -j $(JOBS) --target porecert_fuzzers

test-asan: san-build
	cd $(SAN_BUILD) && ASAN_OPTIONS=detect_leaks=1:abort_on_error=1 UBSAN_OPTIONS=print_stacktrace=1 \
	  PORECERT_TEST_SCALE=$(ASAN_SCALE) ctest --output-on-failure -j $(JOBS)

fuzz-smoke: san-build
	tests/fuzz/run.sh $(SAN_BUILD) smoke $(FUZZ_SECONDS)

# The big runs of docs/soundness.md (not part of `make test`).
fuzz-long: san-build
	tests/fuzz/run.sh $(SAN_BUILD) runs 1000000

adversarial-long: build
	cd $(BUILD) && PORECERT_TRIALS=100000 ./test_adversarial

bench: configure
	cmake --build $(BUILD) -j $(JOBS) --target porecert_bench
	./$(BUILD)/porecert_bench

# Sweep reach (docs/performance.md): tens of minutes on 2 cores.
bench-sweep: build
	tests/bench/sweep_reach.sh $(BUILD)

format:
	find lib verify tests -name '*.hpp' -o -name '*.cpp' | xargs clang-format -i

clean:
	rm -rf $(BUILD) $(SAN_BUILD)

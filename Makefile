# Two quick-start commands: `make demo` and `make test`. Both run `setup` first.
BUILD ?= build
JOBS ?= 2
PACKAGES := $(shell grep -v '^\#' .ci/packages)

.PHONY: setup configure build demo test bench clean format

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

bench: configure
	cmake --build $(BUILD) -j $(JOBS) --target porecert_bench
	./$(BUILD)/porecert_bench

format:
	find lib verify tests -name '*.hpp' -o -name '*.cpp' | xargs clang-format -i

clean:
	rm -rf $(BUILD)

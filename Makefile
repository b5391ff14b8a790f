# Conveniences over the README's two set-up commands (.ci/demo and .ci/test).
JOBS ?= $(shell nproc)

.PHONY: demo test bench debug-test tsan-test fuzz fuzz-long format

demo:
	bash .ci/demo

test:
	bash .ci/test

bench:
	cmake --preset release && cmake --build --preset release -j $(JOBS) && ./build/larder bench

# AddressSanitizer + UBSan build of everything (clang, -O1), then the whole suite.
debug-test:
	bash .ci/install-deps
	cmake --preset debug
	cmake --build --preset debug -j $(JOBS)
	ctest --preset debug -j $(JOBS)

# The parallel runner tests under ThreadSanitizer (clang).
tsan-test:
	bash .ci/install-deps
	bash .ci/tsan

# Every fuzz target for FUZZ_SECONDS (default 60) each; see DEVELOPERS.md, "Fuzzing".
FUZZ_SECONDS ?= 60
fuzz:
	bash .ci/install-deps
	bash .ci/fuzz $(FUZZ_SECONDS)

# Every fuzz target for FUZZ_RUNS (default 10 million) inputs each, however long it takes
# (hours on 2 cores); see DEVELOPERS.md, "Fuzzing".
FUZZ_RUNS ?= 10000000
fuzz-long:
	bash .ci/install-deps
	FUZZ_RUNS=$(FUZZ_RUNS) bash .ci/fuzz

format:
	find sim policies reports cli tests -name '*.hpp' -o -name '*.cpp' | xargs clang-format -i

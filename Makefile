# Conveniences over the README's two set-up commands (.ci/demo and .ci/test).
JOBS ?= $(shell nproc)

.PHONY: demo test bench debug-test format

demo:
	bash .ci/demo

test:
	bash .ci/test

bench:
	cmake --preset release && cmake --build --preset release -j $(JOBS) && ./build/larder bench

# AddressSanitizer + UBSan build of everything, then the whole suite.
debug-test:
	bash .ci/install-deps
	cmake --preset debug
	cmake --build --preset debug -j $(JOBS)
	ctest --preset debug -j $(JOBS)

format:
	find sim policies reports cli tests -name '*.hpp' -o -name '*.cpp' | xargs clang-format -i

# The two set-up commands of the README, and a few conveniences.
# `make demo`: install dependencies, build, run the built-in demo.
# `make test`: install dependencies, build with warnings as errors, run the whole test suite.
JOBS ?= $(shell nproc)

.PHONY: deps demo build test bench format debug-test

deps:
	bash .ci/install-deps

build: deps
	cmake --preset release
	cmake --build --preset release -j $(JOBS)

demo: build
	./build/larder run

test: deps
	cmake --preset ci
	cmake --build --preset ci -j $(JOBS)
	ctest --preset ci -j $(JOBS)

debug-test: deps
	cmake --preset debug
	cmake --build --preset debug -j $(JOBS)
	ctest --preset debug -j $(JOBS)

bench: build
	./build/larder bench

format:
	find sim policies reports cli tests -name '*.hpp' -o -name '*.cpp' | xargs clang-format -i

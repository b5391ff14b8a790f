// The one Catch2 main of the test executable.
#define CATCH_CONFIG_MAIN
#include <catch2/catch.hpp>

// Memory sizes as people write them (powers of 1024, worked by hand).

#include "sim/runner/memory_limit.hpp"

#include <catch2/catch.hpp>

namespace larder {
namespace {

TEST_CASE("parse_memory_size reads K, M, G and T suffixes", "[runner]") {
  CHECK(parse_memory_size("800000") == std::size_t{800000});
  CHECK(parse_memory_size("512M") == std::size_t{512} << 20);
  CHECK(parse_memory_size("4g") == std::size_t{4} << 30);
  CHECK(parse_memory_size("1.5G") == std::size_t{3} << 29);
  CHECK_FALSE(parse_memory_size(""));
  CHECK_FALSE(parse_memory_size("G"));
  CHECK_FALSE(parse_memory_size("-1G"));
  CHECK(parse_memory_size("4GB") == std::size_t{4} << 30);
  CHECK(parse_memory_size("4 GiB") == std::size_t{4} << 30);
  CHECK(parse_memory_size("1K") == std::size_t{1024});
  CHECK_FALSE(parse_memory_size("1e30T"));  // beyond 2^60 bytes: never converted
  CHECK_FALSE(parse_memory_size("nan"));
  CHECK_FALSE(parse_memory_size("0x10"));
  CHECK_FALSE(parse_memory_size("0.1"));  // less than a byte
  // Small limits are shown in their own unit, not as "0 MiB" (issue 23).
  CHECK(format_bytes(1024) == "1 KiB");
  CHECK(format_bytes(100) == "100 bytes");
  CHECK(format_bytes(std::size_t{3} << 29) == "1.5 GiB");
  CHECK(format_bytes(std::size_t{512} << 20) == "512 MiB");
}

}  // namespace
}  // namespace larder

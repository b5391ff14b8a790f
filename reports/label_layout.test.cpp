// Label placement worked by hand: no two placed labels overlap, none covers a marker, all stay
// inside the bounds, and a label without a free spot is left out.

#include "reports/label_layout.hpp"

#include <catch2/catch.hpp>

namespace larder {
namespace {

TEST_CASE("labels take the first free spot: right, left, above, below", "[html]") {
  const LabelBox bounds{0, 0, 400, 300};
  // Two points at the same place: the first label goes right, the second left.
  const std::vector<LabelRequest> r = {
      {100, 100, 40, 12}, {100, 100, 40, 12}, {100, 100, 40, 12}, {100, 100, 40, 12}};
  const std::vector<LabelBox> markers = {{96, 96, 104, 104}};
  const auto out = place_labels(r, markers, bounds);
  REQUIRE(out.size() == 4);
  REQUIRE(out[0]);
  CHECK(out[0]->x0 == 107.0);  // 100 + gap 7
  CHECK(out[0]->y0 == 94.0);   // centred: 100 - 12 / 2
  REQUIRE(out[1]);
  CHECK(out[1]->x1 == 93.0);  // 100 - 7
  REQUIRE(out[2]);
  CHECK(out[2]->y1 == 93.0);  // above
  REQUIRE(out[3]);
  CHECK(out[3]->y0 == 107.0);  // below
}

TEST_CASE("many labels at one place: none overlap, the rest are left out", "[html]") {
  const LabelBox bounds{0, 0, 400, 300};
  std::vector<LabelRequest> r(20, LabelRequest{200, 150, 60, 12});
  std::vector<LabelBox> markers;
  for (int k = 0; k < 20; ++k) markers.push_back({196, 146, 204, 154});
  const auto out = place_labels(r, markers, bounds);
  std::vector<LabelBox> placed;
  for (const auto& b : out) {
    if (!b) continue;
    for (const LabelBox& o : placed) CHECK_FALSE(b->overlaps(o));
    CHECK_FALSE(b->overlaps(markers.front()));
    placed.push_back(*b);
  }
  // Right, left, above and below; the corners overlap those (by hand: the label is 60 wide, so
  // the upper-right box x 207-267 meets the box above, x 170-230, at the same height).
  CHECK(placed.size() == 4);
}

TEST_CASE("labels stay inside the bounds", "[html]") {
  const LabelBox bounds{0, 0, 100, 100};
  // Near the right edge the right spot leaves the picture: the label goes left.
  const std::vector<LabelRequest> r = {{95, 50, 40, 12}};
  const auto out = place_labels(r, {}, bounds);
  REQUIRE(out[0]);
  CHECK(out[0]->x1 == 88.0);
  // A label wider than the picture finds no spot.
  const std::vector<LabelRequest> wide = {{50, 50, 200, 12}};
  CHECK_FALSE(place_labels(wide, {}, bounds)[0].has_value());
}

}  // namespace
}  // namespace larder

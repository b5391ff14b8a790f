#include "reports/label_layout.hpp"

#include <algorithm>
#include <array>

namespace larder {

namespace {

constexpr double kGap = 7.0;  ///< between a point and its label

bool inside(const LabelBox& b, const LabelBox& bounds) {
  return b.x0 >= bounds.x0 && b.x1 <= bounds.x1 && b.y0 >= bounds.y0 && b.y1 <= bounds.y1;
}

/// The candidate boxes of a label, in order of preference.
std::array<LabelBox, 8> candidates(const LabelRequest& r) {
  const double w = r.width;
  const double h = r.height;
  const auto box = [&](double left, double top) { return LabelBox{left, top, left + w, top + h}; };
  return {box(r.x + kGap, r.y - h / 2.0),       // right
          box(r.x - kGap - w, r.y - h / 2.0),   // left
          box(r.x - w / 2.0, r.y - kGap - h),   // above
          box(r.x - w / 2.0, r.y + kGap),       // below
          box(r.x + kGap, r.y - kGap - h),      // upper right
          box(r.x + kGap, r.y + kGap),          // lower right
          box(r.x - kGap - w, r.y - kGap - h),  // upper left
          box(r.x - kGap - w, r.y + kGap)};     // lower left
}

}  // namespace

std::vector<std::optional<LabelBox>> place_labels(std::span<const LabelRequest> labels,
                                                  std::span<const LabelBox> markers,
                                                  const LabelBox& bounds) {
  std::vector<std::optional<LabelBox>> out;
  std::vector<LabelBox> placed;
  const auto free = [&](const LabelBox& b) {
    const auto hits = [&](const LabelBox& o) { return b.overlaps(o); };
    return inside(b, bounds) && std::none_of(placed.begin(), placed.end(), hits) &&
           std::none_of(markers.begin(), markers.end(), hits);
  };
  for (const LabelRequest& r : labels) {
    std::optional<LabelBox> spot;
    for (const LabelBox& b : candidates(r)) {
      if (free(b)) {
        spot = b;
        break;
      }
    }
    if (spot) placed.push_back(*spot);
    out.push_back(spot);
  }
  return out;
}

}  // namespace larder

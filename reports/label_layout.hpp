#pragma once
// Where a chart writes the labels of its points so that no two labels overlap and no label
// covers a point: each label tries a few spots around its point (right, left, above, below,
// then the corners) and takes the first one that stays inside the picture and touches no label
// placed before it and no point's marker; a label that finds no spot is left out (the legend
// and the table beside the chart still name the point).

#include <optional>
#include <span>
#include <vector>

namespace larder {

/// An axis-aligned rectangle in pixels (y grows downwards).
struct LabelBox {
  double x0 = 0.0;
  double y0 = 0.0;
  double x1 = 0.0;
  double y1 = 0.0;
  bool overlaps(const LabelBox& o) const {
    return x0 < o.x1 && o.x0 < x1 && y0 < o.y1 && o.y0 < y1;
  }
};

/// One label to place: its point and the size of its text.
struct LabelRequest {
  double x = 0.0;
  double y = 0.0;
  double width = 0.0;
  double height = 12.0;
};

/// The box of each label in the order requested (nullopt: no free spot). `markers` are the
/// boxes of every drawn point; `bounds` is the area labels must stay in.
std::vector<std::optional<LabelBox>> place_labels(std::span<const LabelRequest> labels,
                                                  std::span<const LabelBox> markers,
                                                  const LabelBox& bounds);

}  // namespace larder

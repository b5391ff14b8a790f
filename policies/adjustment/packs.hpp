#pragma once
// Whole case packs: the engine rounds every final order up to the item's pack size, so
// adjustments that enforce a ceiling round down to packs to keep it.

namespace larder {

/// The smallest multiple of `pack` >= q (q >= 0, pack >= 1).
inline int round_up_to_pack(int q, int pack) {
  return pack > 1 ? (q + pack - 1) / pack * pack : q;
}

/// The largest multiple of `pack` <= q (q >= 0, pack >= 1).
inline int round_down_to_pack(int q, int pack) {
  return pack > 1 ? q / pack * pack : q;
}

}  // namespace larder

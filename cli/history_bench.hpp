#pragma once
// `larder bench`'s history case: how fast the strict history reader loads a large file.

namespace larder {

/// Generates a history of `stores` x `items` x `days` rows in memory (valid rows, every rule
/// checked), reads it with read_history and prints rows per second.
void bench_history_reader(int stores, int items, int days);

}  // namespace larder

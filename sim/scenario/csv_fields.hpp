#pragma once
// The fields of one CSV line, for the strict readers of CSV inputs (the `replay` order file,
// sales histories, item files). A line is split at commas; blanks around a field are dropped;
// a field in double quotes may hold commas, and "" inside it is one double quote (RFC 4180),
// but a quoted field cannot span lines. Each field keeps its 1-based column for messages.

#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace larder {

/// One CSV field and the 1-based column where it starts.
struct CsvField {
  std::string text;
  int column = 1;
};

/// The 1-based column of a quote that opens a field and is never closed on `line` (the field
/// then swallows the commas after it, so the count of fields is off); nullopt when every quote
/// is closed. Readers say this instead of "expected N fields".
std::optional<int> unclosed_quote(std::string_view line);

/// Splits `line` (without its line end) into `out`, reusing its storage.
void split_fields(std::string_view line, std::vector<CsvField>& out);

/// Splits `line` (without its line end) into fields.
std::vector<CsvField> split_fields(std::string_view line);

/// A whole number: an optional `+` or `-` and decimal digits only, within long long.
std::optional<long long> whole_number(std::string_view text);

/// `text` for a message: at most `max` characters, bytes outside printable ASCII as \xNN, and
/// "..." when cut (input files may hold anything, including binary data).
std::string printable(std::string_view text, std::size_t max = 40);

}  // namespace larder

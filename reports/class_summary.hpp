#pragma once
// The class view of a drill (`larder drill --summary DIR...`): several trainees' scorecard.json
// files of one exercise in one table, with the comparison policies as reference rows, as text
// and as CSV (`name,role,source,waste_units,in_stock_at_close,fill_rate,profit,profit_vs_house,
// chasing_weight,pull_to_center,implied_service,justified_service`).

#include <string>
#include <vector>

namespace larder {

class Diagnostics;

struct ClassRow {
  std::string name;
  std::string role;    ///< trainee, house or comparison
  std::string source;  ///< the scorecard file
  double waste_units = 0, in_stock_at_close = 0, fill_rate = 0, profit = 0;
  double profit_vs_house = 0;  ///< the row's profit minus the house rule's, same demand
  double chasing_weight = 0, pull_to_center = 0, implied_service = 0, justified_service = 0;
};

struct ClassSummary {
  std::string scenario;
  std::string store;
  int days = 0;
  std::string currency;
  std::string house;
  bool same_seed = true;       ///< every trainee played the same demand
  std::vector<ClassRow> rows;  ///< trainees in the order given, then the first file's policies
};

/// One scorecard.json's text and the file it is reported as.
struct ScorecardSource {
  std::string file;
  std::string text;
};

/// The class view of `cards` (the first card read sets the exercise); every card that is not a
/// scorecard, is damaged or belongs to another exercise is reported to `diag` and left out.
/// A function of the texts only, so the fuzz target of tests/fuzz/ calls it without files.
ClassSummary parse_class(const std::vector<ScorecardSource>& cards, Diagnostics& diag);

/// Reads `inputs` (folders holding scorecard.json, or the files; each at most once). Throws
/// InputError naming the files when one cannot be read, is given twice, is not a scorecard, or
/// belongs to another exercise.
ClassSummary read_class(const std::vector<std::string>& inputs);

std::string class_text(const ClassSummary& s);
std::string class_csv(const ClassSummary& s);

}  // namespace larder

#include "sim/scenario/yaml_stall.hpp"

#include <fmt/format.h>
#include <yaml-cpp/eventhandler.h>
#include <yaml-cpp/mark.h>
#include <yaml-cpp/parser.h>

#include <sstream>

namespace larder {

namespace {

/// Records where each document starts; ignores everything else.
class DocumentStarts : public YAML::EventHandler {
 public:
  void OnDocumentStart(const YAML::Mark& mark) override { start = mark; }
  void OnDocumentEnd() override {}
  void OnNull(const YAML::Mark&, YAML::anchor_t) override {}
  void OnAlias(const YAML::Mark&, YAML::anchor_t) override {}
  void OnScalar(const YAML::Mark&, const std::string&, YAML::anchor_t,
                const std::string&) override {}
  void OnSequenceStart(const YAML::Mark&, const std::string&, YAML::anchor_t,
                       YAML::EmitterStyle::value) override {}
  void OnSequenceEnd() override {}
  void OnMapStart(const YAML::Mark&, const std::string&, YAML::anchor_t,
                  YAML::EmitterStyle::value) override {}
  void OnMapEnd() override {}

  YAML::Mark start = YAML::Mark::null_mark();
};

}  // namespace

std::optional<YamlStall> find_yaml_stall(const std::string& text) {
  std::istringstream in(text);
  YAML::Parser parser(in);
  DocumentStarts events;
  bool first = true;
  YAML::Mark previous = YAML::Mark::null_mark();
  while (parser.HandleNextDocument(events)) {
    const YAML::Mark& m = events.start;
    if (!first && m.pos == previous.pos && m.line == previous.line && m.column == previous.column) {
      const bool inside = m.pos >= 0 && static_cast<size_t>(m.pos) < text.size();
      const char c = inside ? text[static_cast<size_t>(m.pos)] : '\0';
      std::string what = c > ' ' && c < 127 ? fmt::format("unexpected '{}'", c)
                                            : std::string("the parser cannot go on here");
      return YamlStall{m.line, m.column, std::move(what)};
    }
    first = false;
    previous = m;
  }
  return std::nullopt;
}

}  // namespace larder

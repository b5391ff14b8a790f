// XML escaping against the XML 1.0 specification (section 2.4: & and < must be escaped in
// character data; quotes in attribute values; section 2.2: which control characters are
// allowed at all), checked by parsing the result with Python's xml.etree.

#include "reports/xml_text.hpp"

#include <catch2/catch.hpp>

#include "reports/markup_check.test.hpp"

namespace larder {
namespace {

TEST_CASE("xml_escape writes the five markup characters as entities", "[html]") {
  CHECK(xml_escape("a < b & c > d") == "a &lt; b &amp; c &gt; d");
  CHECK(xml_escape(R"(say "hi" it's)") == "say &quot;hi&quot; it&#39;s");
  CHECK(xml_escape("plain ± é") == "plain ± é");  // UTF-8 passes through
  CHECK(xml_escape("&amp;") == "&amp;amp;");      // escaping is not idempotent, by design
  CHECK(xml_escape(std::string("tab\there\x01\x1f\nend")) == "tab\there\nend");
}

TEST_CASE("escaped text survives an XML parser in content and in attributes", "[html]") {
  const std::string nasty = "<b>&\"quoted\" 'single' ]]> \x07";
  const std::string doc = "<root a=\"" + xml_escape(nasty) + "\" b='" + xml_escape(nasty) + "'>" +
                          xml_escape(nasty) + "</root>";
  CHECK(test::markup_problems(doc, "xml", "root").empty());
  const std::string raw = "<root>" + nasty + "</root>";
  CHECK_FALSE(test::markup_problems(raw, "xml", "root").empty());  // the check can fail
}

}  // namespace
}  // namespace larder

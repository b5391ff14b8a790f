#pragma once
// Text inside XML and HTML markup (the SVG charts and report.html): the five characters with a
// meaning in markup are written as entities (XML 1.0, section 2.4 "Character Data and Markup"),
// so a scenario or policy name can never break the page.

#include <string>
#include <string_view>

namespace larder {

/// `text` with & < > " ' replaced by &amp; &lt; &gt; &quot; &#39;, safe in element content and
/// in attribute values quoted with either quote; control characters other than tab, newline and
/// carriage return (not allowed in XML 1.0) are dropped.
std::string xml_escape(std::string_view text);

}  // namespace larder

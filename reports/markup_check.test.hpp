#pragma once
// Test helpers that check markup with parsers outside larder: Python's xml.etree (expat: is it
// well-formed XML?) and html.parser (do HTML start and end tags nest, with HTML's void
// elements?), plus the rules of a self-contained page: no URL to fetch, no script, no link.
// Python is /usr/bin/python3 (LARDER_PYTHON); the scripts are written to a scratch folder.

#include <fmt/format.h>
#include <sys/wait.h>

#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <string>
#include <string_view>

#include "reports/sample_run.test.hpp"

namespace larder::test {

struct ProcessResult {
  int code = -1;
  std::string output;  ///< stdout and stderr together
};

/// Runs a shell command line, capturing its output and exit code.
inline ProcessResult run_command_line(const std::string& command) {
  ProcessResult r;
  FILE* pipe = ::popen((command + " 2>&1").c_str(), "r");
  if (pipe == nullptr) return r;
  std::array<char, 4096> buf{};
  std::size_t n = 0;
  while ((n = std::fread(buf.data(), 1, buf.size(), pipe)) > 0) r.output.append(buf.data(), n);
  const int status = ::pclose(pipe);
  r.code = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  return r;
}

/// Runs a Python script (its text) with `args`, from a file in `dir`.
inline ProcessResult run_python(std::string_view script, const std::string& args,
                                const std::filesystem::path& dir) {
  const std::filesystem::path file = dir / "check.py";
  std::ofstream(file) << script;
  return run_command_line(fmt::format("{} {} {}", LARDER_PYTHON, file.string(), args));
}

/// The chromium executable on PATH, or "" when there is none.
inline std::string find_chromium() {
  for (const char* name : {"chromium", "chromium-browser"}) {
    const ProcessResult r = run_command_line(fmt::format("command -v {}", name));
    if (r.code == 0 && !r.output.empty()) return r.output.substr(0, r.output.find('\n'));
  }
  return {};
}

/// Checks a file: `xml` (well-formed, root element named by the second argument) or `html`
/// (also well-formed XML with root html, tags nest as HTML, and the page is self-contained).
inline constexpr std::string_view kMarkupScript = R"py(
import sys, re
import xml.etree.ElementTree as ET
from html.parser import HTMLParser

path, mode, root_name = sys.argv[1], sys.argv[2], sys.argv[3]
text = open(path, encoding='utf-8').read()
problems = []
try:
    root = ET.fromstring(text)
    if root.tag != root_name:
        problems.append('root element is %s, not %s' % (root.tag, root_name))
except ET.ParseError as e:
    problems.append('not well-formed XML: %s' % e)

VOID = {'meta', 'br', 'hr', 'img', 'input', 'link', 'col', 'area', 'base', 'wbr', 'source'}
FORBIDDEN = {'script', 'link', 'iframe', 'img', 'object', 'embed', 'frame', 'audio', 'video',
             'image', 'use', 'foreignobject', 'base', 'form'}

class Nesting(HTMLParser):
    def __init__(self):
        super().__init__(convert_charrefs=True)
        self.stack, self.ids = [], set()
    def attrs_ok(self, tag, attrs):
        for name, value in attrs:
            value = value or ''
            if name == 'id':
                if value in self.ids:
                    problems.append('duplicate id %s' % value)
                self.ids.add(value)
            if name in ('src', 'srcset', 'xlink:href', 'action', 'formaction', 'poster'):
                problems.append('<%s %s=...> fetches something' % (tag, name))
            if name == 'href' and not value.startswith('#'):
                problems.append('<%s href="%s"> leaves the page' % (tag, value))
            if name.startswith('on'):
                problems.append('<%s %s> is a script' % (tag, name))
            if 'url(' in value or '//' in value:
                problems.append('<%s %s="%s"> names a URL' % (tag, name, value))
    def handle_starttag(self, tag, attrs):
        if tag in FORBIDDEN:
            problems.append('forbidden element <%s>' % tag)
        self.attrs_ok(tag, attrs)
        if tag not in VOID:
            self.stack.append((tag, self.getpos()))
    def handle_startendtag(self, tag, attrs):
        if tag in FORBIDDEN:
            problems.append('forbidden element <%s>' % tag)
        self.attrs_ok(tag, attrs)
    def handle_endtag(self, tag):
        if tag in VOID:
            problems.append('end tag of void element %s' % tag)
        elif not self.stack or self.stack[-1][0] != tag:
            problems.append('</%s> at line %d does not close %s' %
                            (tag, self.getpos()[0], self.stack[-1] if self.stack else 'anything'))
        else:
            self.stack.pop()

if mode == 'html':
    p = Nesting()
    p.feed(text)
    p.close()
    if p.stack:
        problems.append('unclosed elements: %s' % p.stack)
    if not text.startswith('<!DOCTYPE html>'):
        problems.append('no <!DOCTYPE html> first')
    for needle in ('http://', 'https://', 'url(', '@import', '<script', '<link', 'javascript:'):
        if needle in text:
            problems.append('contains %r' % needle)
    if re.search(r'=\s*"//', text):
        problems.append('a protocol-relative URL')
print('\n'.join(problems) if problems else 'ok')
sys.exit(1 if problems else 0)
)py";

/// "" when `text` passes kMarkupScript in `mode` ("xml" or "html") with root `root`, else the
/// problems the script found (or why it could not run).
inline std::string markup_problems(std::string_view text, std::string_view mode,
                                   std::string_view root) {
  const ScratchDir dir(fmt::format("markup-{}", mode));
  const std::filesystem::path file = dir.path() / "page.txt";
  std::ofstream(file, std::ios::binary) << text;
  const ProcessResult r =
      run_python(kMarkupScript, fmt::format("{} {} {}", file.string(), mode, root), dir.path());
  return r.code == 0 && r.output == "ok\n" ? std::string()
                                           : r.output + fmt::format(" (exit {})", r.code);
}

}  // namespace larder::test

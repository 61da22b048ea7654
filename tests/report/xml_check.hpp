#pragma once
// A small XML well-formedness checker for the report tests: balanced and properly nested tags,
// quoted attributes without '<', no duplicate attribute names, and only the five predefined or
// numeric character references (XML 1.0, sections 2.1 and 4.1; from memory). A DOCTYPE, comments
// and processing instructions are skipped. Returns "" when well-formed, else what is wrong and where.
#include <cctype>
#include <map>
#include <set>
#include <string>
#include <vector>

namespace xml_check {

struct Result {
  std::string error;                         // empty when well-formed
  std::map<std::string, int> element_count;  // elements by name
};

inline bool name_char(char c) { return std::isalnum(static_cast<unsigned char>(c)) || c == '-' || c == '_' || c == ':' || c == '.'; }

inline bool valid_reference(const std::string& text, std::size_t& i) {
  const std::size_t end = text.find(';', i);
  if (end == std::string::npos || end - i > 10) return false;
  const std::string ref = text.substr(i + 1, end - i - 1);
  i = end;
  static const std::set<std::string> named = {"amp", "lt", "gt", "quot", "apos"};
  if (named.count(ref)) return true;
  if (ref.size() > 1 && ref[0] == '#') {
    const bool hex = ref[1] == 'x';
    for (std::size_t k = hex ? 2 : 1; k < ref.size(); ++k)
      if (!(hex ? std::isxdigit(static_cast<unsigned char>(ref[k])) : std::isdigit(static_cast<unsigned char>(ref[k])))) return false;
    return ref.size() > (hex ? 2u : 1u);
  }
  return false;
}

inline Result check(const std::string& text) {
  Result r;
  std::vector<std::string> stack;
  std::size_t i = 0;
  const auto fail = [&](const std::string& what) {
    r.error = what + " at offset " + std::to_string(i) + ": '" + text.substr(i, 60) + "'";
    return r;
  };
  bool root_seen = false;
  while (i < text.size()) {
    const char c = text[i];
    if (c == '&') {
      if (!valid_reference(text, i)) return fail("bad character reference");
      ++i;
      continue;
    }
    if (c != '<') {
      if (stack.empty() && !std::isspace(static_cast<unsigned char>(c))) return fail("text outside the root element");
      ++i;
      continue;
    }
    if (text.compare(i, 4, "<!--") == 0) {
      const std::size_t end = text.find("-->", i);
      if (end == std::string::npos) return fail("unclosed comment");
      i = end + 3;
      continue;
    }
    if (text.compare(i, 2, "<!") == 0 || text.compare(i, 2, "<?") == 0) {
      const std::size_t end = text.find('>', i);
      if (end == std::string::npos) return fail("unclosed declaration");
      i = end + 1;
      continue;
    }
    const bool closing = text[i + 1] == '/';
    std::size_t k = i + (closing ? 2 : 1);
    const std::size_t name_start = k;
    while (k < text.size() && name_char(text[k])) ++k;
    const std::string name = text.substr(name_start, k - name_start);
    if (name.empty()) return fail("tag without a name");
    if (closing) {
      while (k < text.size() && std::isspace(static_cast<unsigned char>(text[k]))) ++k;
      if (k >= text.size() || text[k] != '>') return fail("malformed end tag");
      if (stack.empty() || stack.back() != name) return fail("end tag </" + name + "> does not match " + (stack.empty() ? "nothing" : "<" + stack.back() + ">"));
      stack.pop_back();
      i = k + 1;
      continue;
    }
    if (stack.empty() && root_seen) return fail("second root element");
    std::set<std::string> attributes;
    bool self_closing = false;
    while (true) {
      while (k < text.size() && std::isspace(static_cast<unsigned char>(text[k]))) ++k;
      if (k >= text.size()) return fail("unclosed start tag");
      if (text[k] == '>') break;
      if (text.compare(k, 2, "/>") == 0) {
        self_closing = true;
        ++k;
        break;
      }
      const std::size_t a = k;
      while (k < text.size() && name_char(text[k])) ++k;
      const std::string attribute = text.substr(a, k - a);
      if (attribute.empty() || k >= text.size() || text[k] != '=') return fail("attribute without a quoted value in <" + name + ">");
      if (!attributes.insert(attribute).second) return fail("duplicate attribute " + attribute);
      const char quote = text[++k];
      if (quote != '"' && quote != '\'') return fail("unquoted attribute value");
      const std::size_t end = text.find(quote, k + 1);
      if (end == std::string::npos) return fail("unterminated attribute value");
      for (std::size_t v = k + 1; v < end; ++v) {
        if (text[v] == '<') return fail("'<' in an attribute value");
        if (text[v] == '&' && !valid_reference(text, v)) return fail("bad reference in an attribute value");
      }
      k = end + 1;
    }
    ++r.element_count[name];
    root_seen = true;
    if (!self_closing) stack.push_back(name);
    i = k + 1;
  }
  if (!stack.empty()) return fail("unclosed element <" + stack.back() + ">");
  if (!root_seen) return fail("no element");
  return r;
}

} // namespace xml_check

#include "reports/pdf_finishing.hpp"

#include <cctype>
#include <cstdio>
#include <map>
#include <regex>
#include <stdexcept>

namespace counterpoise::reports {

namespace {

[[noreturn]] void unexpected(const std::string& what) {
  throw std::runtime_error("the PDF from Qt does not have the expected structure: " + what);
}

// The text between the "<<" at or after `from` and its matching ">>" (nested dictionaries counted).
std::string dictionary_at(const std::string& pdf, std::size_t from) {
  const std::size_t open = pdf.find("<<", from);
  if (open == std::string::npos) unexpected("a dictionary is missing");
  int depth = 0;
  for (std::size_t i = open; i + 1 < pdf.size(); ++i) {
    if (pdf.compare(i, 2, "<<") == 0) ++depth, ++i;
    else if (pdf.compare(i, 2, ">>") == 0) {
      if (--depth == 0) return pdf.substr(open, i + 2 - open);
      ++i;
    }
  }
  unexpected("a dictionary is not closed");
}

// Where object `number` starts ("N 0 obj" at the start of a line), searching from the end so the
// newest version wins.
std::size_t object_start(const std::string& pdf, int number) {
  const std::string header = std::to_string(number) + " 0 obj";
  for (std::size_t at = pdf.rfind(header); at != std::string::npos; at = at == 0 ? std::string::npos : pdf.rfind(header, at - 1))
    if (at == 0 || pdf[at - 1] == '\n' || pdf[at - 1] == '\r') return at;
  unexpected("object " + std::to_string(number) + " is missing");
}

std::string object_body(const std::string& pdf, int number) {
  const std::size_t start = object_start(pdf, number);
  const std::size_t end = pdf.find("endobj", start);
  if (end == std::string::npos) unexpected("object " + std::to_string(number) + " has no end");
  return pdf.substr(start, end - start);
}

int reference_in(const std::string& dictionary, const std::string& key) {
  std::smatch m;
  if (!std::regex_search(dictionary, m, std::regex(key + "\\s+(\\d+)\\s+0\\s+R"))) return -1;
  return std::stoi(m[1]);
}

// The dictionary with `key` set to `value` (replacing an existing entry whose value is a name, a
// reference or a string).
std::string with_entry(std::string dictionary, const std::string& key, const std::string& value) {
  const std::regex existing(key + "\\s*(/[^\\s/<>\\[\\]()]+|\\d+\\s+0\\s+R|\\([^)]*\\)|<[0-9A-Fa-f]*>)");
  if (std::regex_search(dictionary, existing)) return std::regex_replace(dictionary, existing, key + " " + value);
  dictionary.insert(dictionary.size() - 2, key + " " + value + "\n");
  return dictionary;
}

void append_utf16be(std::string& hex, unsigned unit) {
  char buffer[8];
  std::snprintf(buffer, sizeof buffer, "%04X", unit);
  hex += buffer;
}

}  // namespace

std::string pdf_text_string(const std::string& utf8) {
  bool ascii = true;
  for (unsigned char c : utf8) ascii = ascii && c >= 0x20 && c < 0x7F;
  if (ascii) {
    std::string out = "(";
    for (char c : utf8) {
      if (c == '(' || c == ')' || c == '\\') out += '\\';
      out += c;
    }
    return out + ")";
  }
  std::string hex = "<FEFF";
  for (std::size_t i = 0; i < utf8.size();) {
    const unsigned char c = static_cast<unsigned char>(utf8[i]);
    unsigned code = c;
    int extra = c >= 0xF0 ? 3 : c >= 0xE0 ? 2 : c >= 0xC0 ? 1 : 0;
    if (extra) code = c & (0x3F >> extra);
    for (int k = 1; k <= extra && i + k < utf8.size(); ++k) code = (code << 6) | (static_cast<unsigned char>(utf8[i + k]) & 0x3F);
    i += 1 + extra;
    if (code >= 0x10000) {
      code -= 0x10000;
      append_utf16be(hex, 0xD800 + (code >> 10));
      append_utf16be(hex, 0xDC00 + (code & 0x3FF));
    } else {
      append_utf16be(hex, code);
    }
  }
  return hex + ">";
}

std::string finish_pdf(const std::string& pdf, const std::vector<OutlineEntry>& outline, const DocumentInfo& info) {
  const std::size_t startxref = pdf.rfind("startxref");
  const std::size_t trailer_at = pdf.rfind("trailer");
  if (startxref == std::string::npos || trailer_at == std::string::npos) unexpected("no trailer");
  const long previous_xref = std::stol(pdf.substr(startxref + 9));
  const std::string trailer = dictionary_at(pdf, trailer_at);
  std::smatch m;
  if (!std::regex_search(trailer, m, std::regex("/Size\\s+(\\d+)"))) unexpected("the trailer has no /Size");
  int next_number = std::stoi(m[1]);
  const int root = reference_in(trailer, "/Root");
  if (root < 0) unexpected("the trailer has no /Root");
  const int info_number = reference_in(trailer, "/Info");
  std::string id;
  if (std::regex_search(trailer, m, std::regex("/ID\\s*(\\[[^\\]]*\\])"))) id = m[1];

  const std::string catalog = dictionary_at(pdf, object_start(pdf, root));
  const int pages_number = reference_in(catalog, "/Pages");
  if (pages_number < 0) unexpected("the catalog has no /Pages");
  const std::string pages = dictionary_at(pdf, object_start(pdf, pages_number));
  std::vector<int> page_objects;
  if (!std::regex_search(pages, m, std::regex("/Kids\\s*\\[([^\\]]*)\\]"))) unexpected("the page tree has no /Kids");
  const std::string kids = m[1];
  const std::regex reference("(\\d+)\\s+0\\s+R");
  for (auto it = std::sregex_iterator(kids.begin(), kids.end(), reference); it != std::sregex_iterator(); ++it)
    page_objects.push_back(std::stoi((*it)[1]));

  std::map<int, std::string> objects;  // number -> body (the text between "N 0 obj" and "endobj")

  // The outline: a flat list of the sections, each pointing at the top of its page.
  std::vector<OutlineEntry> entries;
  for (const auto& e : outline)
    if (e.page >= 1 && e.page <= static_cast<int>(page_objects.size())) entries.push_back(e);
  std::string new_catalog = catalog;
  if (!entries.empty()) {
    const int outlines = next_number++;
    const int first = next_number;
    next_number += static_cast<int>(entries.size());
    for (std::size_t i = 0; i < entries.size(); ++i) {
      const int number = first + static_cast<int>(i);
      std::string item = "<<\n/Title " + pdf_text_string(entries[i].title) + "\n/Parent " + std::to_string(outlines) + " 0 R\n";
      if (i > 0) item += "/Prev " + std::to_string(number - 1) + " 0 R\n";
      if (i + 1 < entries.size()) item += "/Next " + std::to_string(number + 1) + " 0 R\n";
      item += "/Dest [" + std::to_string(page_objects[static_cast<std::size_t>(entries[i].page - 1)]) + " 0 R /Fit]\n>>";
      objects[number] = item;
    }
    objects[outlines] = "<<\n/Type /Outlines\n/First " + std::to_string(first) + " 0 R\n/Last " +
                        std::to_string(first + static_cast<int>(entries.size()) - 1) + " 0 R\n/Count " +
                        std::to_string(entries.size()) + "\n>>";
    new_catalog = with_entry(new_catalog, "/Outlines", std::to_string(outlines) + " 0 R");
    new_catalog = with_entry(new_catalog, "/PageMode", "/UseOutlines");
    objects[root] = new_catalog;
  }

  // The document information, with the entries QPdfWriter has no setter for.
  std::string info_dictionary = info_number >= 0 ? dictionary_at(pdf, object_start(pdf, info_number)) : "<<\n>>";
  if (!info.author.empty()) info_dictionary = with_entry(info_dictionary, "/Author", pdf_text_string(info.author));
  if (!info.subject.empty()) info_dictionary = with_entry(info_dictionary, "/Subject", pdf_text_string(info.subject));
  if (!info.keywords.empty()) info_dictionary = with_entry(info_dictionary, "/Keywords", pdf_text_string(info.keywords));
  const int info_object = info_number >= 0 ? info_number : next_number++;
  objects[info_object] = info_dictionary;

  // Subset tags: Qt tags the font descriptor's /FontName ("QNBAAA+DejaVuSans") but not the
  // /BaseFont of the font dictionaries, which is the name readers check; give them the same tag.
  std::map<std::string, std::string> tagged;  // "DejaVuSans" -> "QNBAAA+DejaVuSans"
  const std::regex descriptor_name("/FontName\\s*/([A-Z]{6})\\+([A-Za-z0-9_.\\-]+)");
  for (auto it = std::sregex_iterator(pdf.begin(), pdf.end(), descriptor_name); it != std::sregex_iterator(); ++it)
    tagged[(*it)[2]] = std::string((*it)[1]) + "+" + std::string((*it)[2]);
  const std::regex base_font("/BaseFont\\s*/([A-Za-z0-9_.\\-]+)");
  for (auto it = std::sregex_iterator(pdf.begin(), pdf.end(), base_font); it != std::sregex_iterator(); ++it) {
    const auto tag = tagged.find((*it)[1]);
    if (tag == tagged.end()) continue;
    // The object holding this name: the last "N 0 obj" before it.
    const std::size_t header = pdf.rfind(" 0 obj", static_cast<std::size_t>(it->position(0)));
    if (header == std::string::npos) continue;
    std::size_t digits = header;
    while (digits > 0 && std::isdigit(static_cast<unsigned char>(pdf[digits - 1]))) --digits;
    const int number = std::stoi(pdf.substr(digits, header - digits));
    if (object_body(pdf, number).find("stream") != std::string::npos) continue;
    std::string body = objects.count(number) ? objects[number] : dictionary_at(pdf, object_start(pdf, number));
    objects[number] = std::regex_replace(body, std::regex("/BaseFont\\s*/" + tag->first + "(?![A-Za-z0-9_.\\-+])"),
                                         "/BaseFont /" + tag->second);
  }

  // The update: the objects, a cross-reference section with one subsection per object, a trailer.
  std::string out = pdf;
  if (!out.empty() && out.back() != '\n') out += '\n';
  std::map<int, std::size_t> offsets;
  for (const auto& [number, body] : objects) {
    offsets[number] = out.size();
    out += std::to_string(number) + " 0 obj\n" + body + "\nendobj\n";
  }
  const std::size_t xref = out.size();
  out += "xref\n";
  for (const auto& [number, offset] : offsets) {
    char entry[32];
    std::snprintf(entry, sizeof entry, "%010zu 00000 n\r\n", offset);
    out += std::to_string(number) + " 1\n" + entry;
  }
  out += "trailer\n<<\n/Size " + std::to_string(next_number) + "\n/Root " + std::to_string(root) + " 0 R\n/Info " +
         std::to_string(info_object) + " 0 R\n/Prev " + std::to_string(previous_xref) + "\n";
  if (!id.empty()) out += "/ID " + id + "\n";
  out += ">>\nstartxref\n" + std::to_string(xref) + "\n%%EOF\n";
  return out;
}

}  // namespace counterpoise::reports

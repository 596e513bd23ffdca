#pragma once
// What QPdfWriter cannot write itself, added to its file as one incremental update (ISO 32000-1,
// 7.5.6: new and changed objects appended with their own cross-reference section, the original
// bytes untouched):
// - the document outline (bookmarks) for the sections and appendices (ISO 32000-1, 12.3.3);
// - the document information's Author, Subject and Keywords, matching the XMP packet written with
//   the file (PDF/A-1, ISO 19005-1, 6.7.3, requires the two to agree);
// - the subset tag on each embedded font's /BaseFont (ISO 32000-1, 9.6.4): Qt embeds only the
//   glyphs used and tags the descriptor's /FontName ("QNBAAA+DejaVuSans"), but names the font
//   dictionaries as if the font were whole.
// Plain byte work on Qt's output (PDF 1.4, classic cross-reference table, no object streams).

#include <string>
#include <vector>

namespace counterpoise::reports {

struct OutlineEntry {
  std::string title;  // UTF-8
  int page = 1;       // from 1
};

struct DocumentInfo {
  std::string author;    // the examiner; equals the XMP dc:creator
  std::string subject;   // equals the XMP dc:description
  std::string keywords;  // equals the XMP pdf:Keywords
};

// `pdf` with the outline, the information and the subset tags appended as an incremental update.
// Throws std::runtime_error when the file does not have the structure QPdfWriter writes (no
// trailer, no catalog, page tree not found), so a change in Qt fails loudly, not silently.
std::string finish_pdf(const std::string& pdf, const std::vector<OutlineEntry>& outline, const DocumentInfo& info);

// A PDF text string: plain "(...)" with escapes for ASCII, UTF-16BE with a byte order mark
// "<FEFF...>" otherwise (ISO 32000-1, 7.9.2.2).
std::string pdf_text_string(const std::string& utf8);

}  // namespace counterpoise::reports

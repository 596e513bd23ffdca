// The PDF writer: each demo case in both modes is written and read back with poppler-utils —
// pdftotext for the headings, numbers, digest and cautions as printed; pdfinfo for the page
// count, PDF version and the PDF/A-1b identification in the XMP metadata; pdffonts for embedded
// fonts; pdftoppm to be sure every page rasterises.
#include <QPrinter>

#include <regex>
#include <set>

#include "reports/pdf_writer.hpp"
#include "reports/report_text.hpp"
#include "reports/report_wording.hpp"
#include "report_test_support.hpp"

using namespace counterpoise;
using namespace counterpoise::reports;
using namespace counterpoise::reports::testing;

namespace {

ReportModel full_model(const casefile::Case& value, ReportMode mode) {
  static auto shipped = std::make_shared<const guard::WordingChecker>(guard::WordingChecker::load_default());
  auto model = build_report_model(value, evaluation::evaluate_case(value), mode);
  apply_wording_check(model, value, guard_wording_check(shipped, value.propositions), "the shipped rules");
  return model;
}

std::filesystem::path write_pdf(const ReportModel& model, const std::filesystem::path& dir, const std::string& name,
                                int* pages = nullptr) {
  ensure_gui();
  const auto pdf = render_pdf(model);
  const auto path = dir / name;
  write_file_atomically(path, pdf.bytes);
  if (pages) *pages = pdf.pages;
  return path;
}

int pdfinfo_pages(const std::filesystem::path& pdf) {
  const auto r = run("pdfinfo " + quoted(pdf));
  REQUIRE(r.exit_code == 0);
  std::smatch m;
  REQUIRE(std::regex_search(r.output, m, std::regex("Pages:\\s+(\\d+)")));
  return std::stoi(m[1]);
}

// The text of the whole file without the running header and footer lines, joined as pdf_text
// does, so that a paragraph that continues on the next page reads through.
std::string body_text(const std::filesystem::path& pdf, const ReportModel& model) {
  const std::string raw = pdf_text(pdf, 0, false);
  const std::string header = model.header.laboratory + " | " + model.header.reference + " | " + model.header.title;
  const std::string footer = model.header.person_line() + " | Date: " + model.header.date;
  std::istringstream lines(raw);
  std::string line, text;
  while (std::getline(lines, line)) {
    if (!line.empty() && line.front() == '\f') line.erase(0, 1);
    if (collapsed(line) == collapsed(header) || collapsed(line) == collapsed(footer) ||
        std::regex_match(line, std::regex("Page \\d+ of \\d+")))
      continue;
    text += line + "\n";
  }
  return collapsed(text);
}

// The last line of a page's text above its footer ("" for a page without text).
std::string last_body_line(const std::filesystem::path& pdf, int page, const ReportModel& model) {
  const std::string footer = collapsed(model.header.person_line() + " | Date: " + model.header.date);
  std::istringstream lines(pdf_text(pdf, page, false));
  std::string line, last = " ";
  while (std::getline(lines, line)) {
    if (!line.empty() && line.front() == '\f') line.erase(0, 1);
    std::string text = collapsed(line);
    while (!text.empty() && text.back() == ' ') text.pop_back();
    if (text.empty() || text == footer || std::regex_match(text, std::regex("Page \\d+ of \\d+"))) continue;
    last = text;
  }
  return last;
}

// Where a page's text lies (pdftotext -bbox, in points from the top): the running header's foot,
// the footer's top, the first body word and the lowest body word's foot.
struct PageText {
  double header_bottom = 0, footer_top = 0, body_bottom = 0;
  std::string first_word;
};

PageText page_text_extent(const std::filesystem::path& pdf, int page) {
  const auto r = run("pdftotext -bbox -f " + std::to_string(page) + " -l " + std::to_string(page) + " " + quoted(pdf) + " -");
  REQUIRE(r.exit_code == 0);
  struct Word {
    double top, bottom;
    std::string text;
  };
  std::vector<Word> words;
  const std::regex word("<word xMin=\"[^\"]*\" yMin=\"([^\"]*)\" xMax=\"[^\"]*\" yMax=\"([^\"]*)\">([^<]*)</word>");
  for (auto it = std::sregex_iterator(r.output.begin(), r.output.end(), word); it != std::sregex_iterator(); ++it)
    words.push_back({std::stod((*it)[1]), std::stod((*it)[2]), (*it)[3]});
  REQUIRE(words.size() > 2);
  double first_top = words.front().top, last_top = words.front().top;
  for (const auto& w : words) first_top = std::min(first_top, w.top), last_top = std::max(last_top, w.top);
  PageText t;
  t.header_bottom = first_top, t.footer_top = last_top;
  for (const auto& w : words) {
    if (w.top <= first_top + 1) t.header_bottom = std::max(t.header_bottom, w.bottom);  // the header's line
  }
  double first_body = last_top;
  for (const auto& w : words) {
    if (w.top <= first_top + 1 || w.top >= last_top - 1) continue;  // header and footer lines
    t.body_bottom = std::max(t.body_bottom, w.bottom);
    if (w.top < first_body) first_body = w.top, t.first_word = w.text;
  }
  return t;
}

}  // namespace

TEST_CASE("pdf: every demo case in both modes — text, numbers, digest, pages, PDF/A, fonts, rasterising") {
  const auto dir = temp_dir("demo");
  for (const auto& path : demo_cases()) {
    const auto value = load_case(path);
    for (const auto mode : {ReportMode::casework, ReportMode::training}) {
      INFO(path.filename() << " " << report_mode_name(mode));
      const auto model = full_model(value, mode);
      int pages = 0;
      const auto pdf = write_pdf(model, dir, path.stem().string() + "-" + std::string(report_mode_name(mode)) + ".pdf", &pages);
      const std::string text = body_text(pdf, model);

      // Every heading and every paragraph as printed (line breaks aside), every table cell.
      for (const auto& s : model.sections) {
        CHECK(text.find(collapsed(s.heading)) != std::string::npos);
        for (const auto& b : s.blocks) {
          if (const auto* p = std::get_if<Paragraph>(&b)) {
            INFO("paragraph: " << p->text);
            // A paragraph that cites a section gets " (page N)" before its full stop.
            const std::string printed = p->page_of.empty() ? p->text : p->text.substr(0, p->text.size() - 1) + " (page ";
            CHECK(text.find(collapsed(printed)) != std::string::npos);
          }
          if (const auto* t = std::get_if<Table>(&b))
            for (const auto& row : t->rows)
              for (const auto& cell : row) {
                INFO("cell: " << cell);
                CHECK(text.find(collapsed(cell)) != std::string::npos);
              }
        }
      }
      // The digest comes back exactly: no ligature or substitution in its 64 hex digits.
      CHECK(text.find(model.header.digest) != std::string::npos);
      CHECK(text.find(model.header.examiner) != std::string::npos);
      CHECK(text.find(model.header.laboratory) != std::string::npos);

      // "Page n of m" on every page, and pdfinfo agrees on m.
      CHECK(pdfinfo_pages(pdf) == pages);
      for (int page = 1; page <= pages; ++page)
        CHECK(pdf_text(pdf, page).find("Page " + std::to_string(page) + " of " + std::to_string(pages)) != std::string::npos);
      // No page ends with words that introduce what follows ("The evaluation makes these
      // assumptions:") while the list or table they introduce starts on the next page.
      for (int page = 1; page < pages; ++page) {
        INFO("page " << page);
        CHECK(last_body_line(pdf, page, model).back() != ':');
      }

      // PDF/A-1b identification (ISO 19005-1: pdfaid:part 1, conformance B) and the author.
      const auto meta = run("pdfinfo -meta " + quoted(pdf));
      REQUIRE(meta.exit_code == 0);
      CHECK(std::regex_search(meta.output, std::regex("pdfaid:part>\\s*1\\s*<")));
      CHECK(std::regex_search(meta.output, std::regex("pdfaid:conformance>\\s*B\\s*<")));
      CHECK(meta.output.find(model.header.examiner) != std::string::npos);
      const auto info = run("pdfinfo " + quoted(pdf));
      CHECK(info.output.find(model.header.reference) != std::string::npos);  // the title
      // The Info dictionary matches the XMP (PDF/A-1, ISO 19005-1, 6.7.3): author, subject, keywords.
      CHECK(std::regex_search(info.output, std::regex("Author:\\s+" + model.header.examiner)));
      CHECK(std::regex_search(info.output, std::regex("Subject:\\s+Case " + model.header.reference)));
      CHECK(std::regex_search(info.output, std::regex("Keywords:\\s+evaluative report; likelihood ratio; " + model.header.reference)));
      // The document outline: a bookmark for the title and one for each section and appendix, in
      // order, each pointing at the page its heading is printed on.
      const auto outline = run("pdftohtml -xml -i -q -stdout " + quoted(pdf));
      REQUIRE(outline.exit_code == 0);
      std::vector<std::pair<int, std::string>> bookmarks;
      const std::regex item("<item page=\"(\\d+)\">([^<]*)</item>");
      for (auto it = std::sregex_iterator(outline.output.begin(), outline.output.end(), item); it != std::sregex_iterator(); ++it)
        bookmarks.push_back({std::stoi((*it)[1]), (*it)[2]});
      REQUIRE(bookmarks.size() == model.sections.size() + 1);
      CHECK(bookmarks[0] == std::pair<int, std::string>{1, model.header.title});
      // No page is more than half empty before a page that an appendix opens, unless a section
      // starts on it (docs/report.md, "Layout"): the appendix would have fitted below.
      std::set<int> section_pages;
      for (const auto& [page, title] : bookmarks) section_pages.insert(page);
      for (std::size_t i = 1; i < bookmarks.size(); ++i) {
        const auto& [page, title] = bookmarks[i];
        if (title.rfind("Appendix ", 0) != 0 || page < 2 || bookmarks[i - 1].first == page) continue;
        if (page_text_extent(pdf, page).first_word != "Appendix") continue;  // it does not open its page
        if (section_pages.count(page - 1)) continue;
        const PageText before = page_text_extent(pdf, page - 1);
        INFO(title << " opens page " << page);
        CHECK(before.body_bottom - before.header_bottom >= 0.5 * (before.footer_top - before.header_bottom));
      }
      for (std::size_t i = 0; i < model.sections.size(); ++i) {
        const auto& [page, title] = bookmarks[i + 1];
        const std::string& heading = model.sections[i].heading;
        INFO("bookmark " << title << " on page " << page);
        CHECK(title.size() >= heading.size());
        CHECK(title.compare(title.size() - heading.size(), heading.size(), heading) == 0);
        CHECK(pdf_text(pdf, page).find(collapsed(title)) != std::string::npos);
      }
      CHECK(std::regex_search(info.output, std::regex("PDF version:\\s+1\\.4")));  // PDF/A-1 is based on PDF 1.4

      // Every font embedded.
      const auto fonts = run("pdffonts " + quoted(pdf));
      REQUIRE(fonts.exit_code == 0);
      std::istringstream lines(fonts.output);
      std::string line;
      int font_rows = 0;
      while (std::getline(lines, line)) {
        if (line.rfind("name", 0) == 0 || line.rfind("----", 0) == 0 || line.empty()) continue;
        ++font_rows;
        INFO(line);
        // Embedded, subset (a tagged /BaseFont: "QJCAAA+DejaVuSans", ISO 32000-1, 9.6.4) and with
        // a ToUnicode map: the emb, sub and uni columns all "yes".
        CHECK(std::regex_search(line, std::regex("^[A-Z]{6}\\+\\S+\\s.*\\s+yes\\s+yes\\s+yes\\s+\\d+\\s+\\d+\\s*$")));
      }
      CHECK(font_rows > 0);

      // Every page rasterises.
      const auto prefix = dir / (pdf.stem().string() + "-page");
      REQUIRE(run("pdftoppm -r 30 -png " + quoted(pdf) + " " + quoted(prefix)).exit_code == 0);
      int rendered = 0;
      for (const auto& entry : std::filesystem::directory_iterator(dir))
        if (entry.path().filename().string().rfind(prefix.filename().string(), 0) == 0 && entry.file_size() > 1000) ++rendered;
      CHECK(rendered == pages);
    }
  }
}

TEST_CASE("pdf: casework and training files differ as specified") {
  const auto dir = temp_dir("modes");
  const auto value = load_case(demo_dir() / "harwick-vale-breakin.json");
  const std::string casework = pdf_text(write_pdf(full_model(value, ReportMode::casework), dir, "c.pdf"));
  const std::string training = pdf_text(write_pdf(full_model(value, ReportMode::training), dir, "t.pdf"));
  // Appendices are lettered in order (Appendix A, B, ...): the illustration of prior odds is one of
  // them in casework; training has the inputs and recomputation appendices but not that one.
  const std::regex illustration("Appendix [A-Z]: An illustration of how the findings");
  std::smatch found;
  REQUIRE(std::regex_search(casework, found, illustration));
  CHECK(casework.find("Why P(E|H) and P(H|E) differ") == std::string::npos);
  CHECK_FALSE(std::regex_search(training, illustration));
  CHECK(std::regex_search(training, std::regex("Appendix [A-Z]: Recomputation")));
  CHECK(training.find("Why P(E|H) and P(H|E) differ") != std::string::npos);
  // Casework: the appendix comes after the cautions; training: the sensitivity before them.
  CHECK(static_cast<std::size_t>(found.position(0)) > casework.find("Cautions"));
  CHECK(training.find("How the findings would change different prior odds") < training.find("Cautions"));
}

TEST_CASE("pdf: no ligatures — letter pairs that fonts often join come back as typed") {
  ensure_gui();
  ReportModel model;
  model.header = {"Evaluative report", "Vale Forensic Laboratory (fictional)", "HV-LIG-1", "Ligature check",
                  "Dr Effie Griffiths", "2026-01-01", "working copy", "Digest", std::string("ff") + std::string(62, 'f')};
  model.header.digest = "ffe0fffb1f0ffa3dd1fff2a0ffe0fffb1f0ffa3dd1fff2a0ffe0fffb1f0ffa3d";
  Section s{"test", "Office affairs", false, {}};
  s.blocks.push_back(Paragraph{"The official fifty affine flows fit the buffer; 1 − 0.0044 and 2.3 × 10^9 stay as printed.",
                               Paragraph::Style::body, "Effect", {}, {}});
  model.sections.push_back(s);
  const auto pdf = write_pdf(model, temp_dir("ligatures"), "l.pdf");
  const std::string text = pdf_text(pdf);
  CHECK(text.find(model.header.digest) != std::string::npos);
  CHECK(text.find("The official fifty affine flows fit the buffer; 1 − 0.0044 and 2.3 × 10^9 stay as printed.") != std::string::npos);
  CHECK(text.find("Office affairs") != std::string::npos);
  CHECK(text.find("Dr Effie Griffiths") != std::string::npos);
}

TEST_CASE("pdf: a long table breaks between rows, never inside one, and repeats its header") {
  ensure_gui();
  ReportModel model;
  model.header = {"Evaluative report", "Vale Forensic Laboratory (fictional)", "HV-TAB-1", "Table check",
                  "Dr Ada Penhallow", "2026-01-01", "working copy", "Digest", std::string(64, '0')};
  Section s{"test", "A long table", false, {}};
  Table table;
  table.header = {"Row key", "A cell that wraps onto several lines", "Number"};
  table.widths = {1, 2, 1};
  table.no_wrap = {true, false, true};
  for (int i = 0; i < 90; ++i) {
    char key[16];
    std::snprintf(key, sizeof key, "R%03d", i);
    table.rows.push_back({key, std::string("start") + key + " words words words words words words words words words "
                                   "words words words words words end" + key, std::to_string(1000 + i)});
  }
  s.blocks.push_back(table);
  model.sections.push_back(s);
  int pages = 0;
  const auto pdf = write_pdf(model, temp_dir("table"), "t.pdf", &pages);
  REQUIRE(pages >= 3);
  std::vector<int> page_of(90, 0);
  for (int page = 1; page <= pages; ++page) {
    const std::string text = pdf_text(pdf, page);
    INFO("page " << page);
    CHECK(text.find("Row key") != std::string::npos);  // the header on every page
    for (int i = 0; i < 90; ++i) {
      char key[16];
      std::snprintf(key, sizeof key, "R%03d", i);
      const bool start = text.find(std::string("start") + key) != std::string::npos;
      const bool end = text.find(std::string("end") + key) != std::string::npos;
      CHECK(start == end);  // both halves of a row on the same page
      if (start) page_of[i] = page;
    }
  }
  for (int i = 0; i < 90; ++i) CHECK(page_of[i] > 0);
  CHECK(std::is_sorted(page_of.begin(), page_of.end()));
}

TEST_CASE("pdf: a missing font folder is a clear error naming the package") {
  ensure_gui();
  PdfOptions options;
  options.font_dir = "/nonexistent/fonts/dejavu";
  ReportModel model;
  try {
    render_pdf(model, options);
    FAIL("no error");
  } catch (const validation::FileError& error) {
    CHECK(std::string(error.what()).find("fonts-dejavu-core") != std::string::npos);
  }
}

TEST_CASE("pdf: a network item — its node names, the drawing's heading and the CPT entries are printed") {
  const auto value = load_case(demo_dir() / "harwick-vale-network.json");
  const auto dir = temp_dir("report-network");
  const auto model = full_model(value, ReportMode::casework);
  int pages = 0;
  const auto pdf = write_pdf(model, dir, "network.pdf", &pages);
  const std::string text = body_text(pdf, model);
  for (const char* part : {"The network behind item N1", "How sensitive the network's likelihood ratio is to each table entry",
                           "Activity", "Contact", "Fibres", "Glass",
                           "matching fibres found",
                           // Beta(14, 6) has mean 14 / 20 = 0.7 (Johnson, Kotz & Balakrishnan 1995, Continuous
                           // Univariate Distributions vol. 2, ch. 25).
                           "Beta(14, 6), mean 0.7"}) {
    INFO(part);
    CHECK(text.find(collapsed(part)) != std::string::npos);
  }
  CHECK(std::regex_search(text, std::regex("Appendix [A-Z]: Probability tables of the networks")));
  // The item's inputs and the network section cite the tables' appendix with the page it starts on.
  int appendix_page = 0;
  for (int page = 1; page <= pages && !appendix_page; ++page)
    if (std::regex_search(pdf_text(pdf, page), std::regex("Appendix [A-Z]: Probability tables of the networks")))
      appendix_page = page;
  REQUIRE(appendix_page > 0);
  const std::string cited = "the probability tables of the networks (page " + std::to_string(appendix_page) + ").";
  std::size_t citations = 0;
  for (auto at = text.find(cited); at != std::string::npos; at = text.find(cited, at + 1)) ++citations;
  CHECK(citations == 2);
  CHECK(pdfinfo_pages(pdf) == pages);
  const auto prefix = dir / "network-page";
  REQUIRE(run("pdftoppm -r 30 -png " + quoted(pdf) + " " + quoted(prefix)).exit_code == 0);
  int rendered = 0;
  for (const auto& entry : std::filesystem::directory_iterator(dir))
    if (entry.path().filename().string().rfind("network-page", 0) == 0 && entry.file_size() > 1000) ++rendered;
  CHECK(rendered == pages);
}

// The print preview paints through the same entry point onto a QPrinter. Painted to a PDF file
// by the printer, the demo case gives the pages and the text of the issued PDF.
TEST_CASE("pdf: painted onto a printer, the report has the PDF writer's pages and text") {
  const auto value = load_case(demo_dir() / "harwick-vale-breakin.json");
  const auto dir = temp_dir("report-printer");
  const auto model = full_model(value, ReportMode::casework);
  int pages = 0;
  const auto issued = write_pdf(model, dir, "issued.pdf", &pages);

  QPrinter printer(QPrinter::HighResolution);
  printer.setResolution(kReportResolution);
  printer.setOutputFormat(QPrinter::PdfFormat);
  const auto printed = dir / "printed.pdf";
  printer.setOutputFileName(QString::fromStdString(printed.string()));
  CHECK(paint_report(model, printer) == pages);
  CHECK(pdfinfo_pages(printed) == pages);
  CHECK(body_text(printed, model) == body_text(issued, model));

  // Another resolution would break lines elsewhere: refused, not painted differently.
  QPrinter coarse(QPrinter::ScreenResolution);
  coarse.setResolution(96);
  CHECK_THROWS_AS(paint_report(model, coarse), std::invalid_argument);
}

// The data file's digest is printed so that it extracts exactly (pdftotext), like the case digest.
TEST_CASE("pdf: the data files appendix prints each file's SHA-256 as it extracts") {
  const auto value = load_case(demo_dir() / "harwick-vale-dna.json");
  const auto dir = temp_dir("report-data-files");
  const auto model = full_model(value, ReportMode::casework);
  const auto pdf = write_pdf(model, dir, "dna.pdf");
  // GNU coreutils sha256sum of the demo's frequency file (FIPS 180-4, outside the project).
  const auto sum = run("sha256sum " + quoted(demo_dir() / "dna" / "vale-str-frequencies.csv"));
  REQUIRE(sum.exit_code == 0);
  const std::string text = body_text(pdf, model);
  CHECK(std::regex_search(text, std::regex("Appendix [A-Z]: Data files used")));
  CHECK(text.find(sum.output.substr(0, 64)) != std::string::npos);
}

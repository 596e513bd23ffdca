#pragma once
// The report model rendered as a PDF/A-1b file with QPdfWriter and QPainter: A4 pages, the
// DejaVu fonts embedded, text drawn unshaped (no ligatures, so digests and numbers extract
// exactly as printed), vector charts, tables that never split a row and repeat their header on
// each page, and "Page n of m" on every page. PDF/A-1b is ISO 19005-1:2005, level B; Qt writes
// the output intent and XMP identification (docs/report.md, "The PDF file").
// Needs a QGuiApplication (the offscreen platform is enough).

#include <filesystem>
#include <string>

#include "reports/report_model.hpp"

namespace counterpoise::reports {

struct PdfOptions {
  std::string creator = "Counterpoise " COUNTERPOISE_VERSION;
  // Where the DejaVu fonts are (Debian package fonts-dejavu-core).
  std::filesystem::path font_dir = "/usr/share/fonts/truetype/dejavu";
};

struct PdfResult {
  std::string bytes;  // the PDF file
  int pages = 0;
};

// The report as PDF bytes. Throws validation::FileError (item "fonts") when a DejaVu font
// cannot be found or loaded, std::logic_error when no QGuiApplication exists, and
// std::runtime_error when Qt fails to paint.
PdfResult render_pdf(const ReportModel& model, const PdfOptions& options = {});

// Writes `bytes` to `path` through a temporary file renamed into place. Throws
// validation::FileError when the file cannot be written.
void write_file_atomically(const std::filesystem::path& path, const std::string& bytes);

}  // namespace counterpoise::reports

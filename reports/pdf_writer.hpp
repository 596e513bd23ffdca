#pragma once
// The report model painted with QPainter onto a paged device: a PDF/A-1b file through
// QPdfWriter, or a QPrinter for the print preview. A4 pages, the DejaVu fonts embedded, text
// drawn unshaped (no ligatures, so digests and numbers extract exactly as printed), vector
// charts, tables that never split a row and repeat their header on each page, and "Page n of
// m" on every page. PDF/A-1b is ISO 19005-1:2005, level B; Qt writes the output intent and XMP
// identification (docs/report.md, "The PDF file").
// Needs a QGuiApplication (the offscreen platform is enough).

#include <filesystem>
#include <map>
#include <string>

#include <QPageLayout>

#include "reports/report_model.hpp"

class QPagedPaintDevice;

namespace counterpoise::reports {

// The report is laid out in device units of 1/1200 inch (QPdfWriter's default resolution), so a
// printer used for the preview must be set to the same resolution to break lines where the PDF does.
constexpr int kReportResolution = 1200;

struct PdfOptions {
  std::string creator = "Counterpoise " COUNTERPOISE_VERSION;
  // Where the DejaVu fonts are (Debian package fonts-dejavu-core).
  std::filesystem::path font_dir = "/usr/share/fonts/truetype/dejavu";
};

struct PdfResult {
  std::string bytes;  // the PDF file
  int pages = 0;
};

// A4 portrait with the report's margins.
QPageLayout report_page_layout();

// Paints the report onto `device` (the PDF writer, or a QPrinter for Qt's print preview): sets
// the page layout, composes and paints every page, and returns the number of pages. The device
// must have kReportResolution; throws std::invalid_argument otherwise, and what render_pdf
// throws for fonts and painting.
// `section_pages`, when given, receives the page (from 1) on which each section starts, by id.
int paint_report(const ReportModel& model, QPagedPaintDevice& device, const PdfOptions& options = {},
                 std::map<std::string, int>* section_pages = nullptr);

// The report as PDF bytes. Throws validation::FileError (item "fonts") when a DejaVu font
// cannot be found or loaded, std::logic_error when no QGuiApplication exists, and
// std::runtime_error when Qt fails to paint.
PdfResult render_pdf(const ReportModel& model, const PdfOptions& options = {});

// Writes `bytes` to `path` as a file of case content: atomically and privately
// (platform::write_private_file: the store's mode whatever the umask, fsynced, never through a
// link). Throws validation::FileError when the file cannot be written.
void write_file_atomically(const std::filesystem::path& path, const std::string& bytes);

}  // namespace counterpoise::reports

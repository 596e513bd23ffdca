#pragma once
// The seam to reports/: print preview and PDF export of the evaluative report. Built with the
// report module (COUNTERPOISE_HAVE_REPORTS) it renders through it; without, it says so and the
// report actions stay disabled.

#include <QByteArray>
#include <QString>

#include <memory>

class QWidget;

namespace counterpoise::editor {

class CaseDocument;

struct ReportOutput {
  QByteArray pdf;     // the file's bytes
  QString problem;    // why there is no report (a refused wording, an invalid case, no module)
};

class ReportService {
 public:
  virtual ~ReportService() = default;
  virtual bool available() const = 0;
  virtual QString unavailableReason() const = 0;
  // The report PDF for the document as it stands.
  virtual ReportOutput render_pdf(const CaseDocument& document) = 0;
  // Opens Qt's print preview of the report (modal, like every print preview).
  virtual QString preview(const CaseDocument& document, QWidget* parent) = 0;
};

std::unique_ptr<ReportService> make_report_service();

}  // namespace counterpoise::editor

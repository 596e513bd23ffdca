#pragma once
// The seam to reports/: print preview and PDF export of the evaluative report. Built with the
// report module (COUNTERPOISE_HAVE_REPORTS) it renders through it; without, it says so and the
// report actions stay disabled.

#include <QByteArray>
#include <QString>

#include <functional>
#include <memory>

class QWidget;

namespace counterpoise::editor {

class CaseDocument;

struct ReportOutput {
  QByteArray pdf;     // the file's bytes
  QString problem;    // why there is no report (a refused wording, an invalid case, no module)
  QString digest;     // the case-state digest printed in the report's header
  int pages = 0;
};

class ReportService {
 public:
  virtual ~ReportService() = default;
  virtual bool available() const = 0;
  virtual QString unavailableReason() const = 0;
  // The report PDF for the document as it stands. With `for_issue` (a case file only) the header
  // names the revision about to be sealed and the digest of the store's state.
  ReportOutput render_pdf(const CaseDocument& document, bool for_issue) { return prepare_pdf(document, for_issue)(); }
  // The same, in two steps: what is read from the document (and its store) is read now, on the
  // calling thread; the returned work (evaluation, wording check, layout, PDF) holds copies only
  // and may run on any thread, once.
  virtual std::function<ReportOutput()> prepare_pdf(const CaseDocument& document, bool for_issue) = 0;
  // Opens Qt's print preview of the report (modal, like every print preview): the pages of the
  // PDF exactly as they would be issued.
  virtual QString preview(const CaseDocument& document, QWidget* parent) = 0;
};

std::unique_ptr<ReportService> make_report_service();

}  // namespace counterpoise::editor

#pragma once
// The seam to reports/: print preview and PDF export of the evaluative report. Built with the
// report module (COUNTERPOISE_HAVE_REPORTS) it renders through it; without, it says so and the
// report actions stay disabled.

#include <QByteArray>
#include <QString>

#include <functional>
#include <memory>
#include <optional>

class QProgressDialog;
class QWidget;

namespace counterpoise::platform {
class Ed25519PrivateKey;
}
namespace counterpoise::store {
struct PreparedSeal;
}

namespace counterpoise::casefile {
struct CaseDetails;
}
namespace counterpoise::comparison {
struct CaseComparison;
}

namespace counterpoise::editor {

// How an issued report's seal is signed: with the sealer's `key` (store::find_signing_key), or
// unsigned (null) when the user chose that explicitly; the report then prints it as unsigned.
struct SealSigning {
  std::shared_ptr<const platform::Ed25519PrivateKey> key;
};

class CaseDocument;

struct ReportOutput {
  QByteArray pdf;     // the file's bytes
  QString problem;    // why there is no report (a refused wording, an invalid case, no module)
  QString digest;     // the case-state digest printed in the report's header
  int pages = 0;
  // An issued report's seal, prepared (fixed and signed) before the report was rendered; the
  // caller writes it with CaseDocument::sealRevision once the PDF is made.
  std::shared_ptr<const store::PreparedSeal> seal;
};

class ReportService {
 public:
  virtual ~ReportService() = default;
  virtual bool available() const = 0;
  virtual QString unavailableReason() const = 0;
  // The report PDF for the document as it stands. With `issue` (a case file only) the seal is
  // prepared first (CaseDocument::prepareSeal, signed as `issue` says) and the report prints it:
  // the revision and state digest in its header, the seal in its appendix and metadata.
  ReportOutput render_pdf(const CaseDocument& document, const std::optional<SealSigning>& issue) {
    return prepare_pdf(document, issue)();
  }
  // The same, in two steps: what is read from the document (and its store) is read now, on the
  // calling thread; the returned work (evaluation, wording check, layout, PDF) holds copies only
  // and may run on any thread, once.
  virtual std::function<ReportOutput()> prepare_pdf(const CaseDocument& document,
                                                    const std::optional<SealSigning>& issue) = 0;
  // Opens Qt's print preview of the report (modal, like every print preview): the pages of the
  // PDF exactly as they would be issued. The report is built first off the GUI thread behind a
  // progress dialog (`shown` is called with it once it is up); Cancel there opens no preview and
  // returns no problem. Returns why there is no preview, or an empty string.
  virtual QString preview(const CaseDocument& document, QWidget* parent,
                          const std::function<void(QProgressDialog*)>& shown) = 0;
  // The review memo of `comparison` as PDF, headed with the second version's `details` and
  // naming `reviewer` (the person making the comparison; empty: "not given"): the memo
  // `counterpoise-cli compare -o --reviewer NAME` writes. The returned work holds copies and may
  // run on any thread, once.
  virtual std::function<ReportOutput()> prepare_comparison_memo(const comparison::CaseComparison& comparison,
                                                                const casefile::CaseDetails& details,
                                                                const std::string& reviewer) = 0;
};

std::unique_ptr<ReportService> make_report_service();

}  // namespace counterpoise::editor

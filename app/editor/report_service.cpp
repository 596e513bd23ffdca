#include "app/editor/report_service.hpp"

#include <QObject>

#if COUNTERPOISE_HAVE_REPORTS
#include <QDir>
#include <QFile>
#include <QImage>
#include <QPainter>
#include <QPrintPreviewDialog>
#include <QPrinter>
#include <QProcess>
#include <QStandardPaths>
#include <QTemporaryDir>

#include "app/editor/case_document.hpp"
#include "core/evaluation/case_evaluation.hpp"
#include "core/guard/wording_checker.hpp"
#include "core/interchange/case_json.hpp"
#include "core/store/case_store.hpp"
#include "core/store/sha256.hpp"
#include "reports/pdf_writer.hpp"
#include "reports/report_model.hpp"
#include "reports/report_wording.hpp"
#endif

namespace counterpoise::editor {

namespace {

class NoReports final : public ReportService {
 public:
  bool available() const override { return false; }
  QString unavailableReason() const override {
    return QObject::tr("This build has no report module (configure with COUNTERPOISE_BUILD_REPORTS=ON).");
  }
  ReportOutput render_pdf(const CaseDocument&, bool) override { return {{}, unavailableReason(), {}, 0}; }
  QString preview(const CaseDocument&, QWidget*) override { return unavailableReason(); }
};

#if COUNTERPOISE_HAVE_REPORTS

// The report through reports/: the same steps as `counterpoise-cli report` (model, wording
// check, PDF), on the case as the editor holds it.
class Reports final : public ReportService {
 public:
  bool available() const override { return true; }
  QString unavailableReason() const override { return {}; }

  ReportOutput render_pdf(const CaseDocument& document, bool for_issue) override {
    ReportOutput output;
    const auto read = interchange::read_case(document.document(), document.baseDir());
    if (!read.value) {
      output.problem = QObject::tr("The case has problems to correct before a report can be written: %1")
                           .arg(QString::fromStdString(read.diagnostics.problems().front().text()));
      return output;
    }
    const casefile::Case& value = *read.value;
    const auto mode = value.mode_or_default() == casefile::CaseMode::training ? reports::ReportMode::training
                                                                             : reports::ReportMode::casework;
    reports::IssueInfo issue;
    if (for_issue) {
      store::CaseStore* store = document.caseStore();
      if (!store) {
        output.problem = QObject::tr("Issuing a report seals a revision of a case file: save the case as a case file first.");
        return output;
      }
      const auto seal = store->latest_seal();
      const std::int64_t revision = store->current_revision() + (seal && seal->revision == store->current_revision() ? 1 : 0);
      issue.revision = std::to_string(revision) + " of the case store, sealed when this report was issued";
      issue.digest_label = "Sealed case state (SHA-256 of the canonical case JSON in the store)";
      issue.digest = store::sha256_hex(store->export_canonical());
    }
    try {
      const auto result = evaluation::evaluate_case(value);
      auto model = reports::build_report_model(value, result, mode, issue);
      if (!checker_) checker_ = std::make_shared<const guard::WordingChecker>(guard::WordingChecker::load_default());
      reports::apply_wording_check(model, value, reports::guard_wording_check(checker_, value.propositions),
                                   "the reasoning guard's shipped rules (" + std::to_string(checker_->rules().rules().size()) +
                                       " rules)");
      const auto pdf = reports::render_pdf(model);
      output.pdf = QByteArray::fromStdString(pdf.bytes);
      output.pages = pdf.pages;
      output.digest = QString::fromStdString(issue.digest);
    } catch (const reports::ReportRefused& refused) {
      output.problem = QObject::tr("The report is refused by the wording check: %1 (see the Guard tab, or record an "
                                   "override with a reason in the case's report settings)")
                           .arg(QString::fromStdString(refused.bare_message()));
    } catch (const std::exception& error) {
      output.problem = QString::fromStdString(error.what());
    }
    return output;
  }

  QString preview(const CaseDocument& document, QWidget* parent) override {
    const ReportOutput output = render_pdf(document, false);
    if (!output.problem.isEmpty()) return output.problem;
    // The preview shows the PDF's own pages, rasterised by poppler's pdftoppm.
    const QString rasteriser = QStandardPaths::findExecutable("pdftoppm");
    if (rasteriser.isEmpty()) return QObject::tr("The print preview needs pdftoppm (Debian package poppler-utils).");
    QTemporaryDir folder;
    const QString pdf_path = folder.filePath("report.pdf");
    QFile pdf(pdf_path);
    if (!pdf.open(QIODevice::WriteOnly) || pdf.write(output.pdf) != output.pdf.size()) return QObject::tr("Cannot write the preview file.");
    pdf.close();
    QProcess process;
    process.start(rasteriser, {"-r", "150", "-png", pdf_path, folder.filePath("page")});
    if (!process.waitForFinished(60000) || process.exitCode() != 0)
      return QObject::tr("The print preview could not rasterise the report: %1").arg(QString::fromLocal8Bit(process.readAllStandardError()));
    QStringList pages = QDir(folder.path()).entryList({"page*.png"}, QDir::Files, QDir::Name);
    QPrinter printer(QPrinter::HighResolution);
    printer.setPageSize(QPageSize(QPageSize::A4));
    printer.setDocName(document.displayName());
    QPrintPreviewDialog dialog(&printer, parent);
    dialog.setWindowTitle(QObject::tr("Report print preview — %1").arg(document.displayName()));
    QObject::connect(&dialog, &QPrintPreviewDialog::paintRequested, &dialog, [&](QPrinter* target) {
      QPainter painter(target);
      for (int i = 0; i < pages.size(); ++i) {
        if (i > 0) target->newPage();
        const QImage image(QDir(folder.path()).filePath(pages[i]));
        const QRectF page = target->pageRect(QPrinter::DevicePixel).translated(-target->pageRect(QPrinter::DevicePixel).topLeft());
        painter.drawImage(page, image);
      }
    });
    dialog.exec();
    return {};
  }

 private:
  std::shared_ptr<const guard::WordingChecker> checker_;
};

#endif

}  // namespace

std::unique_ptr<ReportService> make_report_service() {
#if COUNTERPOISE_HAVE_REPORTS
  return std::make_unique<Reports>();
#else
  return std::make_unique<NoReports>();
#endif
}

}  // namespace counterpoise::editor

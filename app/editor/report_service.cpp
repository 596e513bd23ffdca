#include "app/editor/report_service.hpp"

#include <QObject>

#if COUNTERPOISE_HAVE_REPORTS
#include <QPrintPreviewDialog>
#include <QPrinter>

#include <optional>

#include "app/editor/case_document.hpp"
#include "app/editor/work_progress.hpp"
#include "core/evaluation/case_evaluation.hpp"
#include "core/guard/case_rules.hpp"
#include "core/guard/wording_checker.hpp"
#include "core/interchange/case_json.hpp"
#include "core/store/case_store.hpp"
#include "core/comparison/case_comparison.hpp"
#include "reports/comparison_memo.hpp"
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
  std::function<ReportOutput()> prepare_pdf(const CaseDocument&, const std::optional<SealSigning>&) override {
    return [reason = unavailableReason()] { return ReportOutput{{}, reason, {}, 0, nullptr}; };
  }
  QString preview(const CaseDocument&, QWidget*, const std::function<void(QProgressDialog*)>&) override {
    return unavailableReason();
  }
  std::function<ReportOutput()> prepare_comparison_memo(const comparison::CaseComparison&,
                                                        const casefile::CaseDetails&, const std::string&) override {
    return [reason = unavailableReason()] { return ReportOutput{{}, reason, {}, 0, nullptr}; };
  }
};

#if COUNTERPOISE_HAVE_REPORTS

// The report through reports/: the same steps as `counterpoise-cli report` (model, wording
// check, PDF), on the case as the editor holds it.
class Reports final : public ReportService {
 public:
  bool available() const override { return true; }
  QString unavailableReason() const override { return {}; }

  std::function<ReportOutput()> prepare_pdf(const CaseDocument& document,
                                            const std::optional<SealSigning>& issue) override {
    ReportOutput failed;
    auto job = prepare(document, issue, failed);
    if (!job) return [failed] { return failed; };
    return [job = std::move(*job)] {
      ReportOutput output;
      output.seal = job.seal;
      const auto model = build(job, output);
      if (!model) return output;
      try {
        const auto pdf = reports::render_pdf(*model);
        output.pdf = QByteArray::fromStdString(pdf.bytes);
        output.pages = pdf.pages;
      } catch (const std::exception& error) {
        output.problem = QString::fromStdString(error.what());
      }
      return output;
    };
  }

  std::function<ReportOutput()> prepare_comparison_memo(const comparison::CaseComparison& comparison,
                                                        const casefile::CaseDetails& details,
                                                        const std::string& reviewer) override {
    return [comparison, info = reports::comparison_memo_info(details, reviewer)] {
      ReportOutput output;
      try {
        const auto pdf = reports::render_comparison_memo(comparison, info);
        output.pdf = QByteArray::fromStdString(pdf.bytes);
        output.pages = pdf.pages;
      } catch (const std::exception& error) {
        output.problem = QString::fromStdString(error.what());
      }
      return output;
    };
  }

  QString preview(const CaseDocument& document, QWidget* parent,
                  const std::function<void(QProgressDialog*)>& shown) override {
    ReportOutput failed;
    auto job = prepare(document, std::nullopt, failed);
    if (!job) return failed.problem;
    // Evaluating the case (intervals, a network's sensitivity table) takes seconds: off the GUI
    // thread with a progress dialog, as the PDF export; Cancel shows no preview.
    struct Built {
      std::optional<reports::ReportModel> model;
      ReportOutput output;
    };
    const auto built = run_with_progress<Built>(
        parent, QObject::tr("Report print preview"),
        QObject::tr("Evaluating the case and laying out the report for %1…").arg(document.displayName()),
        [job = std::move(*job)] {
          Built b;
          b.model = build(job, b.output);
          return b;
        },
        shown);
    if (!built) return {};
    if (!built->model) return built->output.problem;
    const reports::ReportModel& model = *built->model;
    // The preview paints the report model onto the preview's printer through the same entry
    // point that writes the PDF, at the same resolution, so its pages break where the PDF's do.
    QPrinter printer(QPrinter::HighResolution);
    printer.setResolution(reports::kReportResolution);
    printer.setPageLayout(reports::report_page_layout());
    printer.setDocName(document.displayName());
    QPrintPreviewDialog dialog(&printer, parent);
    dialog.setObjectName("report_preview");
    dialog.setWindowTitle(QObject::tr("Report print preview — %1").arg(document.displayName()));
    QString problem;
    QObject::connect(&dialog, &QPrintPreviewDialog::paintRequested, &dialog, [&](QPrinter* target) {
      try {
        if (target->resolution() != reports::kReportResolution) target->setResolution(reports::kReportResolution);
        reports::paint_report(model, *target);
      } catch (const std::exception& error) {
        problem = QString::fromStdString(error.what());
      }
    });
    dialog.exec();
    return problem;
  }

 private:
  // What a report needs from the document, read on the GUI thread: the case as read, the
  // prepared seal of an issued report, and the wording checker for its rule files.
  struct Job {
    casefile::Case value;
    reports::ReportMode mode;
    reports::IssueInfo issue;
    std::shared_ptr<const guard::WordingChecker> checker;
    std::shared_ptr<const store::PreparedSeal> seal;
  };

  // The job for the document as it stands; nullopt with `output.problem` set when the case does
  // not read or a report cannot be issued from it.
  std::optional<Job> prepare(const CaseDocument& document, const std::optional<SealSigning>& issue_signing,
                             ReportOutput& output) {
    const auto read = interchange::read_case(document.document(), document.baseDir());
    if (!read.value) {
      output.problem = QObject::tr("The case has problems to correct before a report can be written: %1")
                           .arg(QString::fromStdString(read.diagnostics.problems().front().text()));
      return std::nullopt;
    }
    const casefile::Case& value = *read.value;
    const auto mode = value.mode_or_default() == casefile::CaseMode::training ? reports::ReportMode::training
                                                                             : reports::ReportMode::casework;
    reports::IssueInfo issue;
    std::shared_ptr<const store::PreparedSeal> seal;
    if (issue_signing) {
      // The seal is fixed (time, revision, chain head) and signed before the report is rendered,
      // since the report prints it, exactly as `counterpoise-cli report` does.
      auto prepared = document.prepareSeal(issue_signing->key, output.problem);
      if (!prepared) return std::nullopt;
      seal = std::make_shared<const store::PreparedSeal>(std::move(*prepared));
      issue = reports::issue_info_for_seal(*seal, document.caseStore()->review_notes());
    }
    try {
      return Job{value, mode, issue, checkerFor(value), seal};
    } catch (const std::exception& error) {
      output.problem = QString::fromStdString(error.what());
    }
    return std::nullopt;
  }

  // The report model of a job, wording-checked (any thread); nullopt with `output.problem` set
  // when the wording check refuses it.
  static std::optional<reports::ReportModel> build(const Job& job, ReportOutput& output) {
    try {
      const auto result = evaluation::evaluate_case(job.value);
      auto model = reports::build_report_model(job.value, result, job.mode, job.issue);
      reports::apply_wording_check(model, job.value, reports::guard_wording_check(job.checker, job.value.propositions),
                                   guard::rules_description(*job.checker, job.value.guard_rule_files));
      output.digest = QString::fromStdString(job.issue.digest);
      return model;
    } catch (const reports::ReportRefused& refused) {
      output.problem = QObject::tr("The report is refused by the wording check: %1 (see the Guard tab, or record an "
                                   "override with a reason in the case's report settings)")
                           .arg(QString::fromStdString(refused.bare_message()));
    } catch (const std::exception& error) {
      output.problem = QString::fromStdString(error.what());
    }
    return std::nullopt;
  }

  // The shipped rules with the case's rule files, kept while the files' digests stay the same.
  std::shared_ptr<const guard::WordingChecker> checkerFor(const casefile::Case& value) {
    const std::string key = guard::rule_files_key(value.guard_rule_files);
    if (!checker_ || key != checker_key_) {
      checker_ = std::make_shared<const guard::WordingChecker>(guard::checker_for_case(value));
      checker_key_ = key;
    }
    return checker_;
  }

  std::shared_ptr<const guard::WordingChecker> checker_;
  std::string checker_key_;
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

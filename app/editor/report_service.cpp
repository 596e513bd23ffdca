#include "app/editor/report_service.hpp"

#include <QObject>

namespace counterpoise::editor {

namespace {

class NoReports final : public ReportService {
 public:
  bool available() const override { return false; }
  QString unavailableReason() const override {
    return QObject::tr("This build has no report module (configure with COUNTERPOISE_BUILD_REPORTS=ON once reports/ exists).");
  }
  ReportOutput render_pdf(const CaseDocument&) override { return {{}, unavailableReason()}; }
  QString preview(const CaseDocument&, QWidget*) override { return unavailableReason(); }
};

}  // namespace

std::unique_ptr<ReportService> make_report_service() { return std::make_unique<NoReports>(); }

}  // namespace counterpoise::editor

// The plain-text rendering carries the same headings, numbers and digest as the model.
#include "reports/report_text.hpp"
#include "report_test_support.hpp"

using namespace counterpoise;
using namespace counterpoise::reports;
using namespace counterpoise::reports::testing;

TEST_CASE("text: headings in order, header fields, every paragraph and table cell") {
  for (const auto& path : demo_cases()) {
    const auto value = load_case(path);
    for (const auto mode : {ReportMode::casework, ReportMode::training}) {
      INFO(path << " " << report_mode_name(mode));
      const auto model = build_report_model(value, evaluation::evaluate_case(value), mode);
      const std::string text = render_text(model);
      std::size_t at = 0;
      for (const auto& s : model.sections) {
        const auto found = text.find("\n" + s.heading + "\n", at);
        CHECK(found != std::string::npos);
        if (found != std::string::npos) at = found;
      }
      CHECK(text.find(model.header.digest) != std::string::npos);
      CHECK(text.find(model.header.examiner) != std::string::npos);
      for (const auto& s : model.sections)
        for (const auto& b : s.blocks) {
          if (const auto* p = std::get_if<Paragraph>(&b)) CHECK(text.find(p->text) != std::string::npos);
          if (const auto* t = std::get_if<Table>(&b))
            for (const auto& row : t->rows)
              for (const auto& cell : row) CHECK(text.find(cell) != std::string::npos);
        }
    }
  }
}

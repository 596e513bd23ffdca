#pragma once
// The evaluative report as plain data (no Qt): a header and ordered sections of paragraphs,
// tables and charts, built from a case and its evaluation. Renderers (report_text, pdf_writer)
// only lay it out; every word and number of the report is decided here.
// What a report carries follows common practice for evaluative reporting (case and items,
// the question, propositions and conditioning information, findings, evaluation with LR and
// verbal equivalent, assumptions, cautions, examiner and date); the sections and their order
// are explained in docs/report.md. Numbers are written by core/numbers/number_text.

#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>
#include <string_view>
#include <variant>
#include <vector>

#include "core/casefile/case_model.hpp"
#include "core/evaluation/case_evaluation.hpp"
#include "core/guard/report_readiness.hpp"
#include "core/store/review_note.hpp"
#include "core/store/seal_statement.hpp"
#include "reports/report_settings.hpp"

namespace counterpoise::store {
struct PreparedSeal;  // core/store/case_store.hpp
}

namespace counterpoise::reports {

enum class ReportMode { casework, training };

// "casework" or "training".
std::string_view report_mode_name(ReportMode mode);

// Where a piece of text came from: the user's case file (checked, may need an override) or the
// program itself (must always pass the wording check). The user's texts a report prints are
// listed in core (guard::report_user_texts) so that `validate` checks the same texts.
using TextSource = guard::TextOrigin;

struct Paragraph {
  enum class Style { body, lead, bullet, note };
  std::string text;
  Style style = Style::body;
  std::string label;  // a short bold lead ("Hp", "E1 Glass on the jacket") or empty
  TextSource source;
  // A section this paragraph refers the reader to: the PDF adds that section's page ("(page 9)")
  // before the final full stop. Empty for none.
  std::string page_of;
};

struct Table {
  std::vector<std::string> header;
  std::vector<double> widths;   // relative column widths, one per column
  std::vector<bool> no_wrap;    // columns whose cells must stay on one line (numbers)
  std::vector<std::vector<std::string>> rows;
};

// Posterior probability of Hp against prior odds (log axis), with the band from the LR's
// interval and the prior odds at which the posterior reaches each threshold.
struct PosteriorPlot {
  std::vector<double> log10_prior_odds;
  std::vector<double> probability;         // at the point LR
  std::vector<double> low, high;           // at the interval's ends; empty when no interval
  struct Crossing {
    double threshold;
    double log10_prior_odds;
  };
  std::vector<Crossing> crossings;         // finite crossings inside the plotted range
  std::string caption;
};

// Each included item's log10 LR and the running total, in the order of the case.
struct ContributionChart {
  struct Bar {
    std::string id;
    double log10_lr;      // finite; zero/infinite items are listed in the caption instead
    double running_log10;
  };
  std::vector<Bar> bars;
  std::string caption;
};

// A network's graph for drawing, placed by its layered layout (core/models/network/network_layout):
// boxes in layers top to bottom, arrows parent -> child through the bend slots of the layers between.
struct NetworkDiagram {
  struct Node {
    std::string name;
    std::size_t layer = 0, position = 0;
    bool proposition = false;    // the node that carries Hp and Hd
    std::string observed_state;  // the state observed, empty when the node is not observed
  };
  struct Slot {
    std::size_t layer = 0, position = 0;
  };
  struct Edge {
    std::size_t parent = 0, child = 0;  // indices into nodes
    std::vector<Slot> bends;            // one per layer strictly between, top to bottom
  };
  std::vector<Node> nodes;
  std::vector<Edge> edges;
  std::vector<std::size_t> layer_widths;  // slots per layer
  std::string caption;
};

// Curves over shared axes (the plots of a method validation: Tippett curves, cross-entropy,
// calibration). Every series is drawn in the axes' ranges, with a legend of the series' names.
struct LineChart {
  struct Series {
    enum class Style { solid, dashed, dotted };
    std::string name;
    std::vector<double> x, y;  // the same length; non-finite points break the line
    Style style = Style::solid;
  };
  std::vector<Series> series;
  std::string x_title, y_title;
  double x_from = 0, x_to = 1, y_from = 0, y_to = 1;
  std::string caption;
};

using Block = std::variant<Paragraph, Table, PosteriorPlot, ContributionChart, NetworkDiagram, LineChart>;

struct Section {
  std::string id;  // stable identifier: "case", "question", "propositions", "findings", ...
  std::string heading;
  bool appendix = false;
  std::vector<Block> blocks;
};

struct ReportHeader {
  std::string title;       // "Evaluative report"
  std::string laboratory, reference, case_title, examiner, date, revision;
  // How the running line names `examiner`: the report's examiner, or the reviewer of a review
  // memo. An empty `examiner` is printed as "not given".
  std::string examiner_label = "Examiner";
  std::string digest_label;  // what the digest is of
  std::string digest;        // 64 hex digits

  // "Examiner: NAME" (or "Reviewer: …"; "… : not given" without a name), as the title block,
  // the running line and the text form print it.
  std::string person_line() const { return examiner_label + ": " + (examiner.empty() ? "not given" : examiner); }
};

struct ReportModel {
  ReportMode mode = ReportMode::casework;
  ReportHeader header;
  std::vector<Section> sections;
  // The seal of a report issued from a case store: printed in the appendix "Seal of this
  // report" (seal_section.hpp) and embedded in the PDF's XMP metadata (core/store/report_anchor.hpp).
  std::optional<store::SealAnchor> seal;

  // The section with `id`, or nullptr.
  const Section* find(std::string_view id) const;
};

// A reviewer's note on an earlier sealed revision of the case, as the case store recorded it.
struct ReviewNoteEntry {
  std::int64_t revision = 0;
  std::string at;        // when it was recorded, as stored
  std::string reviewer;  // the declared reviewer's name
  std::string verdict;   // "agree", "disagree" or "comment"
  std::string note;      // the reviewer's words, possibly empty for "agree"
};

// How the report is issued: the revision and digest shown in the header.
struct IssueInfo {
  std::string revision;      // e.g. "3 (sealed when this report was issued)"
  std::string digest_label;  // e.g. "Sealed case state (SHA-256)"
  std::string digest;        // when empty: case_digest(value)
  std::optional<store::SealAnchor> seal;  // when the report seals a revision of a case store
  // The review notes recorded in the case store, in the order recorded; listed in the section
  // "Review notes" (docs/report.md), each note quoted (TextOrigin::quoted).
  std::vector<ReviewNoteEntry> review_notes;
};

// The field of a quoted review note's text, the text the wording check reads (report_wording.hpp).
inline constexpr const char* kReviewNoteField = "note";

// What a report that seals a revision prints about it: the revision and state digest in its
// header, the prepared seal (signed, or unsigned on purpose) in its appendix and metadata, and
// the store's review notes. The command line and the editor issue reports through this one
// function.
IssueInfo issue_info_for_seal(const store::PreparedSeal& prepared, const std::vector<store::ReviewNote>& review_notes);

// SHA-256 (hex) of the canonical JSON text of the case (interchange::canonical_text of
// write_case). Throws validation::InvalidValue for a case with invalid UTF-8 in its text.
std::string case_digest(const casefile::Case& value);

// The report model without its wording-check section (see report_wording.hpp, which adds it).
// `mode` decides where the prior sensitivity goes: an appendix (casework) or the body with an
// explanation (training). Throws validation::InvalidValue for bad "report" settings
// (read_report_settings).
ReportModel build_report_model(const casefile::Case& value, const evaluation::CaseEvaluation& result,
                               ReportMode mode, const IssueInfo& issue = {});

// Prefixes each appendix heading with its letter in order ("Appendix A: Inputs as used").
void letter_appendices(ReportModel& model);

// The ids of the sections in order, for tests and the text rendering.
std::vector<std::string> section_ids(const ReportModel& model);

}  // namespace counterpoise::reports

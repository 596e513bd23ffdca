#include "reports/report_text.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "core/numbers/number_text.hpp"

namespace counterpoise::reports {

namespace {

// Width in code points (UTF-8 continuation bytes not counted).
std::size_t display_width(const std::string& text) {
  std::size_t n = 0;
  for (unsigned char c : text) n += (c & 0xC0) != 0x80;
  return n;
}

std::string padded(const std::string& text, std::size_t width) {
  const std::size_t w = display_width(text);
  return text + std::string(w < width ? width - w : 0, ' ');
}

std::string fixed2(double x) { return numbers::log10_for_readers(x); }
std::string general(double x) { return numbers::decimal_for_readers(x); }

void render_table(const Table& table, std::string& out) {
  std::vector<std::size_t> widths(table.header.size(), 0);
  for (std::size_t c = 0; c < table.header.size(); ++c) widths[c] = display_width(table.header[c]);
  for (const auto& row : table.rows)
    for (std::size_t c = 0; c < row.size() && c < widths.size(); ++c) widths[c] = std::max(widths[c], display_width(row[c]));
  const auto line = [&](const std::vector<std::string>& cells) {
    std::string text;
    for (std::size_t c = 0; c < cells.size(); ++c)
      text += c + 1 == cells.size() ? cells[c] : padded(cells[c], widths[c]) + "  ";
    out += text + "\n";
  };
  line(table.header);
  std::string rule;
  for (std::size_t c = 0; c < widths.size(); ++c) rule += std::string(widths[c], '-') + (c + 1 == widths.size() ? "" : "  ");
  out += rule + "\n";
  for (const auto& row : table.rows) line(row);
  out += "\n";
}

}  // namespace

std::string render_text(const ReportModel& model) {
  std::string out;
  const auto& h = model.header;
  out += h.title + "\n" + std::string(display_width(h.title), '=') + "\n";
  out += h.laboratory + "\n";
  out += "Case reference: " + h.reference + "\n";
  out += h.person_line() + "\n";
  out += "Date: " + h.date + "\n";
  out += "Revision: " + h.revision + "\n";
  out += h.digest_label + ": " + h.digest + "\n\n";
  for (const auto& section : model.sections) {
    out += section.heading + "\n" + std::string(display_width(section.heading), '-') + "\n\n";
    for (const auto& block : section.blocks) {
      if (const auto* p = std::get_if<Paragraph>(&block)) {
        std::string lead = p->style == Paragraph::Style::bullet ? "- " : "";
        if (!p->label.empty()) lead += p->label + ": ";
        out += lead + p->text + "\n\n";
      } else if (const auto* t = std::get_if<Table>(&block)) {
        render_table(*t, out);
      } else if (const auto* plot = std::get_if<PosteriorPlot>(&block)) {
        out += "[Chart] " + plot->caption + "\n";
        for (const auto& c : plot->crossings)
          // Each line is a sentence of its own (capital, full stop), so a reader of the text — and the
          // wording guard — does not run it into the caption before it.
          out += "  Threshold " + general(c.threshold) + ": reached from log10 prior odds of " + fixed2(c.log10_prior_odds) + ".\n";
        out += "\n";
      } else if (const auto* chart = std::get_if<ContributionChart>(&block)) {
        out += "[Chart] " + chart->caption + "\n";
        for (const auto& bar : chart->bars)
          out += "  " + bar.id + ": log10 LR " + fixed2(bar.log10_lr) + ", running total " + fixed2(bar.running_log10) + "\n";
        out += "\n";
      } else if (const auto* chart = std::get_if<LineChart>(&block)) {
        out += "[Chart] " + chart->caption + "\n";
        for (const auto& series : chart->series) out += "  curve: " + series.name + "\n";
        out += "\n";
      } else if (const auto* net = std::get_if<NetworkDiagram>(&block)) {
        out += "[Network] " + net->caption + "\n";
        for (const auto& n : net->nodes) {
          out += "  " + n.name + " (layer " + std::to_string(n.layer + 1) + ")";
          if (n.proposition) out += ", propositions";
          if (!n.observed_state.empty()) out += ", observed: " + n.observed_state;
          out += "\n";
        }
        for (const auto& e : net->edges) out += "  " + net->nodes[e.parent].name + " -> " + net->nodes[e.child].name + "\n";
        out += "\n";
      }
    }
  }
  return out;
}

}  // namespace counterpoise::reports

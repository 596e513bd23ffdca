#include "reports/pdf_writer.hpp"

#include <QBuffer>
#include <QDateTime>
#include <QFile>
#include <QFont>
#include <QFontDatabase>
#include <QFontMetricsF>
#include <QGuiApplication>
#include <QPageLayout>
#include <QPageSize>
#include <QPagedPaintDevice>
#include <QPainter>
#include <QPainterPath>
#include <QPdfWriter>
#include <QPolygonF>
#include <QTextLayout>
#include <QXmlStreamWriter>

#include <algorithm>
#include <cmath>
#include <fstream>
#include <functional>
#include <map>
#include <optional>
#include <memory>
#include <stdexcept>

#include <unistd.h>

#include "core/numbers/number_text.hpp"
#include "core/platform/private_file.hpp"
#include "core/validation/input_error.hpp"
#include "reports/column_widths.hpp"
#include "reports/pdf_finishing.hpp"
#include "reports/seal_xmp.hpp"

namespace counterpoise::reports {

namespace {

constexpr double kUnitsPerPoint = kReportResolution / 72.0;
constexpr double kUnitsPerMm = kReportResolution / 25.4;

// Colours are opaque: PDF/A-1 forbids transparency.
const QColor kInk(20, 20, 20);
const QColor kMuted(95, 95, 95);
const QColor kRule(160, 160, 160);
const QColor kHeaderFill(228, 232, 238);
const QColor kCurve(25, 70, 140);
const QColor kBand(200, 218, 240);
const QColor kHpBar(60, 110, 180);
const QColor kHdBar(190, 90, 60);
const QColor kThreshold(130, 130, 130);

QString q(const std::string& text) { return QString::fromUtf8(text.data(), static_cast<qsizetype>(text.size())); }

struct FontFamilies {
  QString sans, mono;
};

// Loads the DejaVu fonts once per process; they are embedded in every PDF written.
const FontFamilies& load_fonts(const std::filesystem::path& dir) {
  static std::map<std::filesystem::path, FontFamilies> loaded;
  if (auto it = loaded.find(dir); it != loaded.end()) return it->second;
  FontFamilies families;
  for (const char* name : {"DejaVuSans.ttf", "DejaVuSans-Bold.ttf", "DejaVuSans-Oblique.ttf", "DejaVuSansMono.ttf"}) {
    const auto path = dir / name;
    if (!std::filesystem::exists(path))
      throw validation::FileError(validation::Location{"fonts", path.string()},
                                  "the report font is missing; install the Debian package fonts-dejavu-core "
                                  "(apt-get install fonts-dejavu-core)");
    const int id = QFontDatabase::addApplicationFont(q(path.string()));
    if (id < 0) throw validation::FileError(validation::Location{"fonts", path.string()}, "Qt could not load the font");
    const auto names = QFontDatabase::applicationFontFamilies(id);
    if (names.isEmpty()) throw validation::FileError(validation::Location{"fonts", path.string()}, "the font has no family");
    if (std::string(name) == "DejaVuSans.ttf") families.sans = names.front();
    if (std::string(name) == "DejaVuSansMono.ttf") families.mono = names.front();
  }
  return loaded.emplace(dir, families).first->second;
}

// A font that is never shaped into ligatures and never replaced by another family, so every
// character of a number or digest is its own glyph with its own Unicode mapping.
QFont report_font(const QString& family, double points, bool bold = false, bool italic = false) {
  QFont font(family);
  font.setPointSizeF(points);
  font.setBold(bold);
  font.setItalic(italic);
  font.setKerning(false);
  font.setStyleStrategy(static_cast<QFont::StyleStrategy>(QFont::PreferNoShaping | QFont::NoFontMerging));
  font.setHintingPreference(QFont::PreferNoHinting);
  return font;
}

using PaintOp = std::function<void(QPainter&)>;

// A paragraph broken into lines for one width, each line its own unwrapped layout, so that
// lines can be drawn one by one (a paragraph continues on the next page) and breaks fall only
// at spaces: pdftotext joins a line ending in "-" or "/" with the next and would change the text.
struct Lines {
  std::vector<std::shared_ptr<QTextLayout>> layouts;
  double line_height = 0;
  int count() const { return static_cast<int>(layouts.size()); }
  double width(int i) const { return layouts[static_cast<std::size_t>(i)]->lineAt(0).naturalTextWidth(); }
};

class Composer {
 public:
  // `section_pages` gives the page (from 1) of each section, for page references; a reference to a
  // section not in it is laid out with a placeholder of the same width as a two-digit page.
  Composer(QPaintDevice& device, const FontFamilies& fonts, const ReportModel& model,
           std::map<std::string, int> section_pages = {})
      : device_(device), fonts_(fonts), model_(model), known_pages_(std::move(section_pages)) {
    const QRectF paper(0, 0, device.width(), device.height());
    left_ = 0, top_ = 0, width_ = paper.width(), bottom_ = paper.height();
    body_ = report_font(fonts.sans, 9.5);
    bold_ = report_font(fonts.sans, 9.5, true);
    small_ = report_font(fonts.sans, 8);
    small_bold_ = report_font(fonts.sans, 8, true);
    italic_ = report_font(fonts.sans, 8.5, false, true);
    heading_ = report_font(fonts.sans, 12.5, true);
    title_ = report_font(fonts.sans, 17, true);
    mono_ = report_font(fonts.mono, 8.5);
    // Room for the running header and footer drawn on every page.
    top_ += 9 * kUnitsPerMm;
    bottom_ -= 8 * kUnitsPerMm;
    new_page();
  }

  std::vector<std::vector<PaintOp>> compose() {
    title_block();
    for (const auto& section : model_.sections) add_section(section);
    return std::move(pages_);
  }

  // The page (from 1) on which each section's heading was placed.
  const std::map<std::string, int>& section_pages() const { return placed_pages_; }
  double page_width() const { return width_; }
  double top() const { return top_; }
  double bottom() const { return bottom_; }

 private:
  double pt(double points) const { return points * kUnitsPerPoint; }
  double mm(double millimetres) const { return millimetres * kUnitsPerMm; }

  void new_page() {
    pages_.emplace_back();
    y_ = top_;
  }
  double room() const { return bottom_ - y_; }
  void ensure(double height) {
    if (height > room() && y_ > top_ + 1) new_page();
  }
  void add(PaintOp op) { pages_.back().push_back(std::move(op)); }

  // One unwrapped line of `text` with its first `bold_prefix` UTF-16 units in bold.
  std::shared_ptr<QTextLayout> one_line(const QString& text, const QFont& font, int bold_prefix) const {
    auto layout = std::make_shared<QTextLayout>(text, font, &device_);
    QTextOption option;
    option.setWrapMode(QTextOption::NoWrap);
    option.setUseDesignMetrics(true);
    layout->setTextOption(option);
    if (bold_prefix > 0) {
      QTextLayout::FormatRange range;
      range.start = 0;
      range.length = bold_prefix;
      range.format.setFont(report_font(font.family(), font.pointSizeF(), true, font.italic()));
      layout->setFormats({range});
    }
    layout->beginLayout();
    QTextLine line = layout->createLine();
    line.setPosition(QPointF(0, 0));
    layout->endLayout();
    return layout;
  }

  // `text` broken greedily at spaces into lines no wider than `width` (a single word wider than
  // the line stays whole). With wrap false, one line.
  Lines lay_out(const std::string& text, const QFont& font, double width, int bold_prefix = 0,
                bool wrap = true) const {
    Lines lines;
    const QFontMetricsF metrics(font, &device_);
    lines.line_height = metrics.height() * 1.18;
    const QString all = q(text);
    if (!wrap) {
      lines.layouts.push_back(one_line(all, font, bold_prefix));
      return lines;
    }
    const QFontMetricsF bold_metrics(report_font(font.family(), font.pointSizeF(), true, font.italic()), &device_);
    const double space = metrics.horizontalAdvance(QLatin1Char(' '));
    qsizetype line_start = 0, pos = 0;
    double line_width = 0;
    bool empty = true;
    while (pos < all.size()) {
      qsizetype word_end = all.indexOf(QLatin1Char(' '), pos);
      if (word_end < 0) word_end = all.size();
      const QString word = all.mid(pos, word_end - pos);
      const double advance = (pos < bold_prefix ? bold_metrics : metrics).horizontalAdvance(word);
      if (!empty && line_width + space + advance > width) {
        const int prefix = static_cast<int>(std::clamp<qsizetype>(bold_prefix - line_start, 0, pos - 1 - line_start));
        lines.layouts.push_back(one_line(all.mid(line_start, pos - 1 - line_start), font, prefix));
        line_start = pos, line_width = advance;
      } else {
        line_width += (empty ? 0 : space) + advance;
      }
      empty = false;
      pos = word_end + 1;
    }
    const int prefix = static_cast<int>(std::clamp<qsizetype>(bold_prefix - line_start, 0, all.size() - line_start));
    lines.layouts.push_back(one_line(all.mid(line_start), font, prefix));
    return lines;
  }

  // Draws lines [first, last) at (x, y0), one line per line_height.
  static PaintOp draw_lines(Lines lines, int first, int last, double x, double y0, QColor colour) {
    return [=](QPainter& p) {
      p.setPen(colour);
      for (int i = first; i < last; ++i)
        lines.layouts[static_cast<std::size_t>(i)]->lineAt(0).draw(&p, QPointF(x, y0 + (i - first) * lines.line_height));
    };
  }

  // Flows a paragraph down the page, continuing on new pages as needed.
  void flow(const Lines& lines, double x, QColor colour = kInk, int keep_first = 2) {
    int next = 0;
    const int n = lines.count();
    ensure(std::min(n, keep_first) * lines.line_height);
    while (next < n) {
      int fit = static_cast<int>(std::floor(room() / lines.line_height));
      if (fit <= 0) {
        new_page();
        continue;
      }
      const int last = std::min(n, next + fit);
      add(draw_lines(lines, next, last, x, y_, colour));
      y_ += (last - next) * lines.line_height;
      next = last;
      if (next < n) new_page();
    }
  }

  void title_block() {
    const auto& h = model_.header;
    flow(lay_out(h.title, title_, width_), left_);
    y_ += mm(1);
    flow(lay_out(h.laboratory, bold_, width_), left_);
    const std::string reference = "Case reference " + h.reference + (h.case_title.empty() ? "" : ": " + h.case_title);
    flow(lay_out(reference, body_, width_), left_);
    flow(lay_out(h.person_line() + "    Date: " + h.date, body_, width_), left_);
    flow(lay_out("Revision: " + h.revision, body_, width_), left_);
    flow(lay_out(h.digest_label + ":", small_, width_), left_, kMuted);
    flow(lay_out(h.digest, mono_, width_, 0, false), left_);
    y_ += mm(2);
    const double rule_y = y_;
    add([=, this](QPainter& p) {
      p.setPen(QPen(kRule, pt(0.6)));
      p.drawLine(QPointF(left_, rule_y), QPointF(left_ + width_, rule_y));
    });
    y_ += mm(3);
  }

  void add_section(const Section& section) {
    // An appendix starts on a new page, unless that would leave the page before it more than half
    // empty: then it follows on the same page.
    if (section.appendix && y_ > top_ + (bottom_ - top_) / 2) new_page();
    const Lines heading = lay_out(section.heading, heading_, width_);
    // Keep the heading with what follows: at least a few lines, or the first paragraph and the
    // figure it introduces.
    const double opening = section.blocks.empty() ? 0 : keep_with_next_height(section.blocks, 0);
    ensure(heading.count() * heading.line_height + mm(3.5) + std::max(4 * body_line_height(), opening));
    y_ += mm(2);
    placed_pages_[section.id] = static_cast<int>(pages_.size());
    flow(heading, left_);
    y_ += mm(1.5);
    for (std::size_t i = 0; i < section.blocks.size(); ++i) {
      const Block& block = section.blocks[i];
      // A paragraph that introduces a figure stays on the figure's page; a short one that
      // introduces a table or a list stays with the table's header and first row, or the first item.
      if (introduces_next(section.blocks, i)) ensure(keep_with_next_height(section.blocks, i));
      if (const auto* p = std::get_if<Paragraph>(&block)) add_paragraph(*p);
      else if (const auto* t = std::get_if<Table>(&block)) add_table(*t);
      else if (const auto* plot = std::get_if<PosteriorPlot>(&block)) add_posterior_plot(*plot);
      else if (const auto* chart = std::get_if<ContributionChart>(&block)) add_contribution_chart(*chart);
      else if (const auto* net = std::get_if<NetworkDiagram>(&block)) add_network_diagram(*net);
      else if (const auto* line_chart = std::get_if<LineChart>(&block)) add_line_chart(*line_chart);
    }
    y_ += mm(2);
  }

  double body_line_height() const { return QFontMetricsF(body_, &device_).height() * 1.18; }

  static bool is_figure(const Block& block) {
    return std::holds_alternative<PosteriorPlot>(block) || std::holds_alternative<ContributionChart>(block) ||
           std::holds_alternative<NetworkDiagram>(block);
  }

  // The height a figure needs, with its caption (as add_* lays them out).
  double figure_height(const Block& block) const {
    double height = 0;
    std::string caption;
    if (const auto* plot = std::get_if<PosteriorPlot>(&block)) height = mm(72), caption = plot->caption;
    else if (const auto* chart = std::get_if<ContributionChart>(&block))
      height = chart->bars.size() * mm(7) + mm(14), caption = chart->caption;
    else if (const auto* net = std::get_if<NetworkDiagram>(&block)) {
      const double layers = static_cast<double>(std::max<std::size_t>(net->layer_widths.size(), 1));
      height = layers * mm(11) + (layers - 1) * mm(11) + mm(4), caption = net->caption;
    }
    const Lines lines = lay_out(caption, italic_, width_);
    return height + lines.count() * lines.line_height + mm(2);
  }

  // Whether block i is a paragraph kept on one page with the start of the block after it: any
  // paragraph before a figure; a paragraph of at most kIntroductionLines lines (not itself a list
  // item) before a table or a list, so that "The evaluation makes these assumptions:" or the
  // words above a table never stand alone at the foot of a page.
  static constexpr int kIntroductionLines = 4;
  bool introduces_next(const std::vector<Block>& blocks, std::size_t i) const {
    const auto* p = std::get_if<Paragraph>(&blocks[i]);
    if (!p || i + 1 >= blocks.size()) return false;
    const Block& next = blocks[i + 1];
    if (is_figure(next)) return true;
    const auto* next_paragraph = std::get_if<Paragraph>(&next);
    const bool list_or_table =
        std::holds_alternative<Table>(next) || (next_paragraph && next_paragraph->style == Paragraph::Style::bullet);
    return list_or_table && p->style != Paragraph::Style::bullet &&
           lay_out(paragraph_text(*p), body_, width_).count() <= kIntroductionLines;
  }

  // The height of what must open the next page with block i when block i does not fit: a
  // figure whole; a table's header and first row; a list's first item (two lines of it).
  double opening_height(const Block& block) const {
    if (is_figure(block)) return figure_height(block);
    if (const auto* table = std::get_if<Table>(&block)) return table_opening_height(*table);
    if (std::holds_alternative<Paragraph>(block)) return 2 * body_line_height();
    return 0;
  }

  // Block i's height, and the opening of the next block when block i introduces it.
  double keep_with_next_height(const std::vector<Block>& blocks, std::size_t i) const {
    double height = 0;
    if (const auto* p = std::get_if<Paragraph>(&blocks[i])) {
      const Lines lines = lay_out(paragraph_text(*p), body_, width_);
      height = lines.count() * lines.line_height + mm(3);
      if (introduces_next(blocks, i)) height += opening_height(blocks[i + 1]);
    } else if (is_figure(blocks[i])) {
      height = figure_height(blocks[i]);
    }
    return std::min(height, bottom_ - top_);
  }

  // The paragraph's text with its page reference: " (page 9)" before the final full stop.
  std::string paragraph_text(const Paragraph& p) const {
    if (p.page_of.empty()) return p.text;
    const auto known = known_pages_.find(p.page_of);
    const std::string reference = " (page " + (known == known_pages_.end() ? std::string("00") : std::to_string(known->second)) + ")";
    std::string text = p.text;
    if (!text.empty() && text.back() == '.') text.insert(text.size() - 1, reference);
    else text += reference;
    return text;
  }

  void add_paragraph(const Paragraph& p) {
    const bool bullet = p.style == Paragraph::Style::bullet;
    const double indent = bullet ? mm(5) : 0;
    std::string text = paragraph_text(p);
    int bold_prefix = 0;
    if (!p.label.empty()) {
      const std::string prefix = p.label + (p.style == Paragraph::Style::lead ? "  " : ": ");
      bold_prefix = static_cast<int>(q(prefix).size());
      text = prefix + text;
    }
    const QFont& font = p.style == Paragraph::Style::lead ? bold_ : p.style == Paragraph::Style::note ? italic_ : body_;
    if (p.style == Paragraph::Style::lead) y_ += mm(1.5);
    const Lines lines = lay_out(text, font, width_ - indent, bold_prefix);
    ensure(std::min(lines.count(), 2) * lines.line_height);
    if (bullet) {
      const double bullet_y = y_;
      const Lines mark = lay_out("\u2022", body_, mm(4));
      add(draw_lines(mark, 0, 1, left_ + mm(1.2), bullet_y, kInk));
    }
    flow(lines, left_ + indent, p.style == Paragraph::Style::note ? kMuted : kInk);
    y_ += mm(bullet ? 0.8 : 1.6);
  }

  // The widest piece of `text` that cannot be broken: the whole text when `whole`, else its
  // longest word (numbers hold no breakable space: their groups are joined by U+202F).
  double unbreakable_width(const std::string& text, const QFont& font, bool whole) const {
    const QFontMetricsF metrics(font, &device_);
    if (whole) return metrics.horizontalAdvance(q(text));
    double widest = 0;
    for (const QString& word : q(text).split(QLatin1Char(' '))) widest = std::max(widest, metrics.horizontalAdvance(word));
    return widest;
  }

  struct TableRow {
    std::vector<Lines> cells;
    double height = 0;
  };

  // The x positions of a table's column edges (left edge first).
  std::vector<double> table_columns(const Table& table) const {
    const std::size_t columns = table.header.size();
    const double pad = table_pad();
    // Column widths from the cells: a number column is as wide as its widest number, and every
    // column at least as wide as its longest word; nothing is set smaller, nothing overlaps.
    const auto needs_for = [&](bool numbers_whole) {
      std::vector<ColumnNeed> needs(columns);
      for (std::size_t c = 0; c < columns; ++c) {
        const bool whole = numbers_whole && c < table.no_wrap.size() && table.no_wrap[c];
        double widest = unbreakable_width(table.header[c], small_bold_, false);
        for (const auto& row : table.rows)
          if (c < row.size()) widest = std::max(widest, unbreakable_width(row[c], small_, whole));
        needs[c] = {widest + 2 * pad + 1, c < table.widths.size() ? table.widths[c] : 1.0};
      }
      return needs;
    };
    auto needs = needs_for(true);
    if (!fits_within(needs, width_)) needs = needs_for(false);  // numbers wrap at their spaces
    const auto widths = column_widths(needs, width_);
    std::vector<double> xs{left_};
    for (double w : widths) xs.push_back(xs.back() + w);
    return xs;
  }

  double table_pad() const { return mm(1.2); }

  // One row of a table laid out in the columns `xs`.
  TableRow table_row(const std::vector<double>& xs, const std::vector<std::string>& cells, bool header) const {
    const double pad = table_pad();
    TableRow row;
    for (std::size_t c = 0; c + 1 < xs.size(); ++c) {
      const std::string text = c < cells.size() ? cells[c] : "";
      const double width = xs[c + 1] - xs[c] - 2 * pad;
      Lines lines = lay_out(text, header ? small_bold_ : small_, width, 0, true);
      row.cells.push_back(lines);
      row.height = std::max(row.height, row.cells.back().count() * row.cells.back().line_height + 2 * pad);
    }
    return row;
  }

  // The height of a table's header and first row, which never part.
  double table_opening_height(const Table& table) const {
    const auto xs = table_columns(table);
    return table_row(xs, table.header, true).height +
           (table.rows.empty() ? 0 : table_row(xs, table.rows.front(), false).height);
  }

  void add_table(const Table& table) {
    const std::size_t columns = table.header.size();
    const double pad = table_pad();
    const auto xs = table_columns(table);
    const TableRow header = table_row(xs, table.header, true);
    const auto draw_row = [&](const TableRow& row, bool is_header) {
      const double y0 = y_;
      const double height = row.height;
      add([=, this](QPainter& p) {
        if (is_header) p.fillRect(QRectF(xs.front(), y0, xs.back() - xs.front(), height), kHeaderFill);
        p.setPen(QPen(kRule, pt(0.4)));
        p.drawLine(QPointF(xs.front(), y0 + height), QPointF(xs.back(), y0 + height));
      });
      for (std::size_t c = 0; c < columns; ++c)
        add(draw_lines(row.cells[c], 0, row.cells[c].count(), xs[c] + pad, y0 + pad, kInk));
      y_ += row.height;
    };
    ensure(table_opening_height(table));
    draw_row(header, true);
    for (const auto& cells : table.rows) {
      const TableRow row = table_row(xs, cells, false);
      if (row.height > room()) {  // a row is never split: it moves to the next page with the header
        new_page();
        draw_row(header, true);
      }
      draw_row(row, false);
    }
    y_ += mm(3);
  }

  // x positions of decades on an axis from `from` to `to` (log10), at most about ten labels.
  static std::vector<int> decade_ticks(double from, double to) {
    const int span = static_cast<int>(std::ceil(to - from));
    const int step = std::max(1, static_cast<int>(std::ceil(span / 10.0)));
    std::vector<int> ticks;
    for (int k = static_cast<int>(std::ceil(from)); k <= static_cast<int>(std::floor(to)); ++k)
      if (k % step == 0) ticks.push_back(k);
    return ticks;
  }

  void add_caption(const std::string& caption) {
    flow(lay_out(caption, italic_, width_), left_, kMuted);
    y_ += mm(2);
  }

  void add_posterior_plot(const PosteriorPlot& plot) {
    if (plot.log10_prior_odds.size() < 2) return;
    const double height = mm(72);
    ensure(height + mm(12));
    const QRectF frame(left_ + mm(16), y_ + mm(3), width_ - mm(30), height - mm(16));
    const double x_from = plot.log10_prior_odds.front(), x_to = plot.log10_prior_odds.back();
    const auto X = [=](double l) { return frame.left() + (l - x_from) / (x_to - x_from) * frame.width(); };
    const auto Y = [=](double p) { return frame.bottom() - p * frame.height(); };
    const QFont small = small_;
    const auto tick_label = [this](const std::string& text) { return lay_out(text, small_, mm(30), 0, false); };
    std::vector<std::pair<QPointF, Lines>> labels;  // top-left corner and text
    for (int k : decade_ticks(x_from, x_to)) {
      const std::string text = k == 0 ? "1" : k == 1 ? "10" : numbers::power_of_ten_text(k);
      const Lines l = tick_label(text);
      labels.push_back({QPointF(X(k) - l.width(0) / 2, frame.bottom() + mm(1.2)), l});
    }
    for (double p : {0.0, 0.25, 0.5, 0.75, 1.0}) {
      const Lines l = tick_label(numbers::decimal_for_readers(p));
      labels.push_back({QPointF(frame.left() - mm(1.5) - l.width(0), Y(p) - l.line_height / 2), l});
    }
    const Lines x_title = tick_label("Prior odds of Hp to Hd (logarithmic scale)");
    labels.push_back({QPointF(frame.center().x() - x_title.width(0) / 2, frame.bottom() + mm(5.5)), x_title});
    // Threshold labels at the right edge, from the top down, pushed apart when they would overlap.
    auto by_height = plot.crossings;
    std::sort(by_height.begin(), by_height.end(), [](const auto& a, const auto& b) { return a.threshold > b.threshold; });
    double next_free = -1e300;
    for (const auto& c : by_height) {
      const Lines l = tick_label(numbers::decimal_for_readers(c.threshold));
      const double label_top = std::max(Y(c.threshold) - l.line_height / 2, next_free);
      labels.push_back({QPointF(frame.right() + mm(1), label_top), l});
      next_free = label_top + l.line_height;
    }
    QPolygonF curve, band;
    for (std::size_t i = 0; i < plot.log10_prior_odds.size(); ++i)
      curve << QPointF(X(plot.log10_prior_odds[i]), Y(plot.probability[i]));
    if (!plot.low.empty()) {
      for (std::size_t i = 0; i < plot.low.size(); ++i) band << QPointF(X(plot.log10_prior_odds[i]), Y(plot.low[i]));
      for (std::size_t i = plot.high.size(); i-- > 0;) band << QPointF(X(plot.log10_prior_odds[i]), Y(plot.high[i]));
    }
    const auto crossings = plot.crossings;
    const double line = pt(0.5);
    add([=](QPainter& p) {
      p.save();
      p.setRenderHint(QPainter::Antialiasing);
      p.setClipRect(frame.adjusted(-line, -line, line, line));
      if (!band.isEmpty()) {
        p.setPen(Qt::NoPen);
        p.setBrush(kBand);
        p.drawPolygon(band);
      }
      QPen dashed(kThreshold, line);
      dashed.setStyle(Qt::DashLine);
      p.setPen(dashed);
      for (const auto& c : crossings) {
        p.drawLine(QPointF(frame.left(), Y(c.threshold)), QPointF(frame.right(), Y(c.threshold)));
        p.drawLine(QPointF(X(c.log10_prior_odds), frame.bottom()), QPointF(X(c.log10_prior_odds), Y(c.threshold)));
      }
      p.setPen(QPen(kCurve, line * 3));
      p.setBrush(Qt::NoBrush);
      p.drawPolyline(curve);
      p.setBrush(kCurve);
      p.setPen(Qt::NoPen);
      for (const auto& c : crossings) p.drawEllipse(QPointF(X(c.log10_prior_odds), Y(c.threshold)), line * 3, line * 3);
      p.restore();
      p.setPen(QPen(kInk, line));
      p.setBrush(Qt::NoBrush);
      p.drawRect(frame);
    });
    for (const auto& [corner, l] : labels) add(draw_lines(l, 0, 1, corner.x(), corner.y(), kInk));
    y_ += height;
    add_caption(plot.caption);
  }

  // Ticks at 1, 2 or 5 times a power of ten, about six over the range.
  static std::vector<double> nice_ticks(double from, double to) {
    const double raw = (to - from) / 6.0;
    const double power = std::pow(10.0, std::floor(std::log10(raw)));
    const double step = raw / power < 1.5 ? power : raw / power < 3.5 ? 2 * power : raw / power < 7.5 ? 5 * power : 10 * power;
    std::vector<double> ticks;
    for (double t = std::ceil(from / step) * step; t <= to + step * 1e-9; t += step) ticks.push_back(std::abs(t) < step * 1e-9 ? 0.0 : t);
    return ticks;
  }

  void add_line_chart(const LineChart& chart) {
    if (chart.series.empty() || !(chart.x_to > chart.x_from) || !(chart.y_to > chart.y_from)) return;
    const double height = mm(70);
    ensure(height + mm(12));
    const QRectF frame(left_ + mm(16), y_ + mm(3), width_ - mm(22), height - mm(16));
    const auto X = [=](double v) { return frame.left() + (v - chart.x_from) / (chart.x_to - chart.x_from) * frame.width(); };
    const auto Y = [=](double v) { return frame.bottom() - (v - chart.y_from) / (chart.y_to - chart.y_from) * frame.height(); };
    const auto tick_label = [this](const std::string& text) { return lay_out(text, small_, mm(40), 0, false); };
    std::vector<std::pair<QPointF, Lines>> labels;
    const auto number = [](double v) {
      char buffer[24];
      std::snprintf(buffer, sizeof buffer, "%g", v);
      std::string text = buffer;
      if (!text.empty() && text[0] == '-') text = "\u2212" + text.substr(1);  // the minus sign
      return text;
    };
    for (double t : nice_ticks(chart.x_from, chart.x_to)) {
      const Lines l = tick_label(number(t));
      labels.push_back({QPointF(X(t) - l.width(0) / 2, frame.bottom() + mm(1.2)), l});
    }
    for (double t : nice_ticks(chart.y_from, chart.y_to)) {
      const Lines l = tick_label(number(t));
      labels.push_back({QPointF(frame.left() - mm(1.5) - l.width(0), Y(t) - l.line_height / 2), l});
    }
    const Lines x_title = tick_label(chart.x_title);
    labels.push_back({QPointF(frame.center().x() - x_title.width(0) / 2, frame.bottom() + mm(5.5)), x_title});
    const Lines y_title = tick_label(chart.y_title);
    labels.push_back({QPointF(frame.left(), frame.top() - mm(3.6)), y_title});
    static const QColor palette[] = {kCurve, kHdBar, QColor(60, 140, 80), kThreshold, QColor(120, 60, 150)};
    struct Drawn {
      std::vector<QPolygonF> pieces;
      QColor colour;
      Qt::PenStyle style;
    };
    std::vector<Drawn> drawn, swatches;
    double legend_y = frame.top() + mm(1.5), legend_left = frame.right();
    for (std::size_t s = 0; s < chart.series.size(); ++s) {
      const auto& series = chart.series[s];
      Drawn d{{QPolygonF()}, palette[s % 5],
              series.style == LineChart::Series::Style::dashed   ? Qt::DashLine
              : series.style == LineChart::Series::Style::dotted ? Qt::DotLine
                                                                 : Qt::SolidLine};
      for (std::size_t i = 0; i < series.x.size() && i < series.y.size(); ++i) {
        if (!std::isfinite(series.x[i]) || !std::isfinite(series.y[i])) {
          if (!d.pieces.back().isEmpty()) d.pieces.emplace_back();
          continue;
        }
        d.pieces.back() << QPointF(X(series.x[i]), Y(series.y[i]));
      }
      drawn.push_back(d);
      const Lines l = tick_label(series.name);
      labels.push_back({QPointF(frame.right() - mm(2) - l.width(0), legend_y), l});
      const double swatch_y = legend_y + l.line_height / 2;
      const double swatch_x = frame.right() - mm(10) - l.width(0);
      legend_left = std::min(legend_left, swatch_x - mm(1));
      swatches.push_back({{QPolygonF({QPointF(swatch_x, swatch_y), QPointF(swatch_x + mm(6), swatch_y)})}, d.colour, d.style});
      legend_y += l.line_height;
    }
    const double line = pt(0.5);
    // The legend sits on a white box so a curve passing under it does not cross its words.
    const QRectF legend_box(legend_left, frame.top() + mm(0.8), frame.right() - mm(0.8) - legend_left,
                            legend_y - frame.top() + mm(0.2));
    add([=](QPainter& p) {
      const auto draw = [&](const Drawn& d) {
        QPen pen(d.colour, line * 2.4);
        pen.setStyle(d.style);
        p.setPen(pen);
        for (const auto& piece : d.pieces) p.drawPolyline(piece);
      };
      p.save();
      p.setRenderHint(QPainter::Antialiasing);
      p.setClipRect(frame.adjusted(-line, -line, line, line));
      for (const auto& d : drawn) draw(d);
      p.setPen(Qt::NoPen);
      p.setBrush(Qt::white);
      p.drawRect(legend_box);
      for (const auto& d : swatches) draw(d);
      p.restore();
      p.setPen(QPen(kInk, line));
      p.setBrush(Qt::NoBrush);
      p.drawRect(frame);
    });
    for (const auto& [corner, l] : labels) add(draw_lines(l, 0, 1, corner.x(), corner.y(), kInk));
    y_ += height;
    add_caption(chart.caption);
  }

  void add_contribution_chart(const ContributionChart& chart) {
    if (chart.bars.empty()) {
      add_caption(chart.caption);
      return;
    }
    const double row_height = mm(7);
    const double height = chart.bars.size() * row_height + mm(14);
    ensure(height + mm(10));
    double lo = 0, hi = 0;
    for (const auto& b : chart.bars) {
      lo = std::min({lo, b.log10_lr, b.running_log10});
      hi = std::max({hi, b.log10_lr, b.running_log10});
    }
    lo = std::floor(lo), hi = std::ceil(hi);
    if (hi - lo < 1) hi = lo + 1;
    const QRectF frame(left_ + mm(16), y_ + mm(2), width_ - mm(24), chart.bars.size() * row_height);
    const auto X = [=](double l) { return frame.left() + (l - lo) / (hi - lo) * frame.width(); };
    std::vector<std::pair<QPointF, Lines>> labels;
    for (int k : decade_ticks(lo, hi)) {
      const Lines l = lay_out(numbers::count_for_readers(k), small_, mm(20), 0, false);
      labels.push_back({QPointF(X(k) - l.width(0) / 2, frame.bottom() + mm(1)), l});
    }
    const Lines axis = lay_out("log10 likelihood ratio (bars: each item; diamonds: running total)", small_, width_, 0, false);
    labels.push_back({QPointF(frame.center().x() - axis.width(0) / 2, frame.bottom() + mm(5)), axis});
    struct BarGeometry {
      QRectF bar;
      QPointF total;
      bool hp;
    };
    std::vector<BarGeometry> bars;
    for (std::size_t i = 0; i < chart.bars.size(); ++i) {
      const auto& b = chart.bars[i];
      const double top = frame.top() + i * row_height + row_height * 0.2;
      const double x0 = X(0), x1 = X(b.log10_lr);
      bars.push_back({QRectF(QPointF(std::min(x0, x1), top), QPointF(std::max(x0, x1), top + row_height * 0.6)),
                      QPointF(X(b.running_log10), top + row_height * 0.3), b.log10_lr >= 0});
      const Lines l = lay_out(b.id, small_bold_, mm(14), 0, false);
      labels.push_back({QPointF(left_, top + row_height * 0.3 - l.line_height / 2), l});
    }
    const double line = pt(0.5);
    add([=](QPainter& p) {
      p.save();
      p.setRenderHint(QPainter::Antialiasing);
      QPen grid(kRule, line * 0.6);
      grid.setStyle(Qt::DotLine);
      p.setPen(grid);
      for (int k : decade_ticks(lo, hi)) p.drawLine(QPointF(X(k), frame.top()), QPointF(X(k), frame.bottom()));
      p.setPen(Qt::NoPen);
      for (const auto& b : bars) {
        p.setBrush(b.hp ? kHpBar : kHdBar);
        p.drawRect(b.bar);
      }
      p.setPen(QPen(kInk, line * 1.5));
      p.setBrush(Qt::NoBrush);
      QPolygonF path;
      for (const auto& b : bars) path << b.total;
      p.drawPolyline(path);
      p.setBrush(kInk);
      const double d = line * 4;
      for (const auto& b : bars) {
        QPolygonF diamond;
        diamond << b.total + QPointF(0, -d) << b.total + QPointF(d, 0) << b.total + QPointF(0, d) << b.total + QPointF(-d, 0);
        p.drawPolygon(diamond);
      }
      p.setPen(QPen(kInk, line * 1.2));
      p.drawLine(QPointF(X(0), frame.top()), QPointF(X(0), frame.bottom()));
      p.drawLine(QPointF(frame.left(), frame.bottom()), QPointF(frame.right(), frame.bottom()));
      p.restore();
    });
    for (const auto& [corner, l] : labels) add(draw_lines(l, 0, 1, corner.x(), corner.y(), kInk));
    y_ += height;
    add_caption(chart.caption);
  }

  // The network as boxes in layers (top to bottom) joined by arrows through their bend slots; the
  // proposition node with a heavy outline, observed nodes shaded with the observed state.
  void add_network_diagram(const NetworkDiagram& net) {
    if (net.nodes.empty()) {
      add_caption(net.caption);
      return;
    }
    std::size_t widest = 1;
    for (std::size_t w : net.layer_widths) widest = std::max(widest, w);
    const std::size_t layers = std::max<std::size_t>(net.layer_widths.size(), 1);
    const double slot = std::min(mm(42), width_ / static_cast<double>(widest));
    const double box_w = slot * 0.86, box_h = mm(11), gap = mm(11);
    const double height = layers * box_h + (layers - 1) * gap + mm(4);
    ensure(height + mm(10));
    const double top = y_ + mm(2);
    const auto centre = [&](std::size_t layer, std::size_t position) {
      const double w = layer < net.layer_widths.size() ? static_cast<double>(net.layer_widths[layer]) : 1.0;
      const double x = left_ + width_ / 2 + (static_cast<double>(position) - (w - 1) / 2) * slot;
      return QPointF(x, top + layer * (box_h + gap) + box_h / 2);
    };
    struct Box {
      QRectF rect;
      bool proposition, observed;
    };
    std::vector<Box> boxes;
    std::vector<std::pair<QPointF, Lines>> labels;
    for (const auto& n : net.nodes) {
      const QPointF c = centre(n.layer, n.position);
      const QRectF rect(c.x() - box_w / 2, c.y() - box_h / 2, box_w, box_h);
      boxes.push_back({rect, n.proposition, !n.observed_state.empty()});
      const Lines name = lay_out(n.name, small_bold_, box_w - mm(2), 0, false);
      const bool two = !n.observed_state.empty();
      const double text_top = c.y() - (two ? name.line_height : name.line_height / 2);
      labels.push_back({QPointF(c.x() - name.width(0) / 2, text_top), name});
      if (two) {
        const Lines state = lay_out("= " + n.observed_state, small_, box_w - mm(2), 0, false);
        labels.push_back({QPointF(c.x() - std::min(state.width(0), box_w - mm(2)) / 2, text_top + name.line_height), state});
      }
    }
    std::vector<QPolygonF> arrows;
    for (const auto& e : net.edges) {
      QPolygonF path;
      const QRectF& from = boxes[e.parent].rect;
      const QRectF& to = boxes[e.child].rect;
      path << QPointF(from.center().x(), from.bottom());
      for (const auto& b : e.bends) {
        const QPointF c = centre(b.layer, b.position);
        path << QPointF(c.x(), c.y() - box_h / 2) << QPointF(c.x(), c.y() + box_h / 2);
      }
      path << QPointF(to.center().x(), to.top());
      arrows.push_back(path);
    }
    const double line = pt(0.6);
    add([=](QPainter& p) {
      p.save();
      p.setRenderHint(QPainter::Antialiasing);
      p.setBrush(Qt::NoBrush);
      p.setPen(QPen(kInk, line));
      for (const auto& path : arrows) {
        p.drawPolyline(path);
        const QPointF tip = path.back(), before = path[path.size() - 2];
        const double dx = tip.x() - before.x(), dy = tip.y() - before.y();
        const double len = std::max(std::hypot(dx, dy), 1e-9);
        const QPointF u(dx / len, dy / len), n(-u.y(), u.x());
        const double a = line * 6;
        QPolygonF head;
        head << tip << tip - u * a + n * (a * 0.45) << tip - u * a - n * (a * 0.45);
        p.setBrush(kInk);
        p.drawPolygon(head);
        p.setBrush(Qt::NoBrush);
      }
      for (const auto& b : boxes) {
        p.setBrush(b.observed ? kHeaderFill : QColor(Qt::white));
        p.setPen(QPen(b.proposition ? kHpBar : kInk, b.proposition ? line * 3 : line));
        p.drawRoundedRect(b.rect, line * 4, line * 4);
      }
      p.restore();
    });
    for (const auto& [corner, l] : labels) add(draw_lines(l, 0, 1, corner.x(), corner.y(), kInk));
    y_ += height;
    add_caption(net.caption);
  }

  QPaintDevice& device_;
  const FontFamilies& fonts_;
  const ReportModel& model_;
  QFont body_, bold_, small_, small_bold_, italic_, heading_, title_, mono_;
  std::map<std::string, int> known_pages_, placed_pages_;
  double left_ = 0, top_ = 0, width_ = 0, bottom_ = 0, y_ = 0;
  std::vector<std::vector<PaintOp>> pages_;
};

// XMP with the PDF/A-1b identification and the title, author (dc:creator) and tools, so the
// author is recorded even though QPdfWriter has no setter for the Info dictionary's /Author.
QByteArray xmp_metadata(const std::string& title, const DocumentInfo& info, const std::string& creator,
                        const std::optional<store::SealAnchor>& seal) {
  const QDateTime now = QDateTime::currentDateTime();
  const int offset = now.offsetFromUtc();
  QString date = now.toString(QStringLiteral("yyyy-MM-ddTHH:mm:ss"));
  date += offset == 0 ? QStringLiteral("Z")
                      : QString::asprintf("%c%02d:%02d", offset < 0 ? '-' : '+', std::abs(offset) / 3600,
                                          (std::abs(offset) % 3600) / 60);
  QByteArray xml;
  QXmlStreamWriter w(&xml);
  w.setAutoFormatting(true);
  w.writeProcessingInstruction(QStringLiteral("xpacket"), QStringLiteral("begin='' id='W5M0MpCehiHzreSzNTczkc9d'"));
  w.writeStartElement(QStringLiteral("x:xmpmeta"));
  w.writeAttribute(QStringLiteral("xmlns:x"), QStringLiteral("adobe:ns:meta/"));
  w.writeStartElement(QStringLiteral("rdf:RDF"));
  w.writeAttribute(QStringLiteral("xmlns:rdf"), QStringLiteral("http://www.w3.org/1999/02/22-rdf-syntax-ns#"));

  w.writeStartElement(QStringLiteral("rdf:Description"));
  w.writeAttribute(QStringLiteral("rdf:about"), QString());
  w.writeAttribute(QStringLiteral("xmlns:dc"), QStringLiteral("http://purl.org/dc/elements/1.1/"));
  w.writeStartElement(QStringLiteral("dc:title"));
  w.writeStartElement(QStringLiteral("rdf:Alt"));
  w.writeStartElement(QStringLiteral("rdf:li"));
  w.writeAttribute(QStringLiteral("xml:lang"), QStringLiteral("x-default"));
  w.writeCharacters(q(title));
  w.writeEndElement();
  w.writeEndElement();
  w.writeEndElement();
  w.writeStartElement(QStringLiteral("dc:creator"));
  w.writeStartElement(QStringLiteral("rdf:Seq"));
  w.writeTextElement(QStringLiteral("rdf:li"), q(info.author));
  w.writeEndElement();
  w.writeEndElement();
  w.writeStartElement(QStringLiteral("dc:description"));
  w.writeStartElement(QStringLiteral("rdf:Alt"));
  w.writeStartElement(QStringLiteral("rdf:li"));
  w.writeAttribute(QStringLiteral("xml:lang"), QStringLiteral("x-default"));
  w.writeCharacters(q(info.subject));
  w.writeEndElement();
  w.writeEndElement();
  w.writeEndElement();
  w.writeEndElement();

  w.writeStartElement(QStringLiteral("rdf:Description"));
  w.writeAttribute(QStringLiteral("rdf:about"), QString());
  w.writeAttribute(QStringLiteral("xmlns:xmp"), QStringLiteral("http://ns.adobe.com/xap/1.0/"));
  w.writeAttribute(QStringLiteral("xmlns:pdf"), QStringLiteral("http://ns.adobe.com/pdf/1.3/"));
  w.writeAttribute(QStringLiteral("xmlns:pdfaid"), QStringLiteral("http://www.aiim.org/pdfa/ns/id/"));
  w.writeTextElement(QStringLiteral("xmp:CreatorTool"), q(creator));
  w.writeTextElement(QStringLiteral("xmp:CreateDate"), date);
  w.writeTextElement(QStringLiteral("xmp:ModifyDate"), date);
  w.writeTextElement(QStringLiteral("pdf:Producer"), QStringLiteral("Qt " QT_VERSION_STR));
  w.writeTextElement(QStringLiteral("pdf:Keywords"), q(info.keywords));
  w.writeTextElement(QStringLiteral("pdfaid:part"), QStringLiteral("1"));
  w.writeTextElement(QStringLiteral("pdfaid:conformance"), QStringLiteral("B"));
  w.writeEndElement();

  if (seal) write_seal_anchor_xmp(w, *seal);
  w.writeEndElement();  // rdf:RDF
  w.writeEndElement();  // x:xmpmeta
  w.writeProcessingInstruction(QStringLiteral("xpacket"), QStringLiteral("end='w'"));
  return xml;
}

}  // namespace

QPageLayout report_page_layout() {
  return QPageLayout(QPageSize(QPageSize::A4), QPageLayout::Portrait, QMarginsF(20, 16, 20, 14), QPageLayout::Millimeter);
}

int paint_report(const ReportModel& model, QPagedPaintDevice& device, const PdfOptions& options,
                 std::map<std::string, int>* section_pages) {
  if (!QGuiApplication::instance()) throw std::logic_error("painting the report needs a QGuiApplication");
  // The layout is computed in device units of 1/1200 inch; another resolution would change
  // where lines break, and the preview would no longer show the pages as issued.
  if (device.logicalDpiX() != kReportResolution || device.logicalDpiY() != kReportResolution)
    throw std::invalid_argument("the report is laid out at " + std::to_string(kReportResolution) +
                                " device units per inch; the paint device has " + std::to_string(device.logicalDpiX()));
  const FontFamilies& fonts = load_fonts(options.font_dir);
  if (!device.setPageLayout(report_page_layout())) throw std::runtime_error("Qt could not set the report's A4 page layout");

  // Page references need the pages of the sections they cite: lay out, read where the sections
  // fell, and lay out again with those numbers until they no longer move (twice in practice).
  std::map<std::string, int> pages_of;
  std::vector<std::vector<PaintOp>> pages;
  double width = 0, bottom = 0;
  for (int pass = 0; pass < 4; ++pass) {
    Composer composer(device, fonts, model, pages_of);
    pages = composer.compose();
    width = composer.page_width(), bottom = composer.bottom();
    const bool settled = composer.section_pages() == pages_of;
    pages_of = composer.section_pages();
    if (settled) break;
  }
  if (section_pages) *section_pages = pages_of;
  const int page_count = static_cast<int>(pages.size());

  QPainter painter;
  if (!painter.begin(&device)) throw std::runtime_error("Qt could not start painting the report");
  const QFont running = report_font(fonts.sans, 7.5);
  const auto running_line = [&](const std::string& text, double y, Qt::Alignment align) {
    painter.setFont(running);
    painter.setPen(kMuted);
    painter.drawText(QRectF(0, y, width, 8 * kUnitsPerMm), static_cast<int>(align | Qt::AlignTop), q(text));
  };
  for (int i = 0; i < page_count; ++i) {
    if (i > 0 && !device.newPage()) throw std::runtime_error("Qt could not add a page to the report");
    running_line(model.header.laboratory + "  |  " + model.header.reference + "  |  " + model.header.title, 0, Qt::AlignLeft);
    painter.setPen(QPen(kRule, 0.4 * kUnitsPerPoint));
    painter.drawLine(QPointF(0, 5 * kUnitsPerMm), QPointF(width, 5 * kUnitsPerMm));
    running_line("Page " + std::to_string(i + 1) + " of " + std::to_string(page_count), bottom + 3 * kUnitsPerMm,
                 Qt::AlignRight);
    running_line(model.header.person_line() + "  |  Date: " + model.header.date,
                 bottom + 3 * kUnitsPerMm, Qt::AlignLeft);
    for (const auto& op : pages[static_cast<std::size_t>(i)]) op(painter);
  }
  if (!painter.end()) throw std::runtime_error("Qt could not finish painting the report");
  return page_count;
}

PdfResult render_pdf(const ReportModel& model, const PdfOptions& options) {
  if (!QGuiApplication::instance()) throw std::logic_error("render_pdf needs a QGuiApplication");
  load_fonts(options.font_dir);  // a missing font is reported before anything is written

  QByteArray bytes;
  QBuffer buffer(&bytes);
  buffer.open(QIODevice::WriteOnly);
  QPdfWriter writer(&buffer);
  writer.setPdfVersion(QPagedPaintDevice::PdfVersion_A1b);
  writer.setResolution(kReportResolution);
  const std::string title = model.header.title + " " + model.header.reference;
  writer.setTitle(q(title));
  writer.setCreator(q(options.creator));
  DocumentInfo info;
  info.author = model.header.examiner;
  info.subject = "Case " + model.header.reference + (model.header.case_title.empty() ? "" : ": " + model.header.case_title);
  info.keywords = "evaluative report; likelihood ratio; " + model.header.reference;
  writer.setDocumentXmpMetadata(xmp_metadata(title, info, options.creator, model.seal));
  std::map<std::string, int> section_pages;
  const int page_count = paint_report(model, writer, options, &section_pages);
  buffer.close();
  // The outline lists the title page and every section, appendices included, in reading order.
  std::vector<OutlineEntry> outline{{model.header.title, 1}};
  for (const auto& section : model.sections)
    if (const auto page = section_pages.find(section.id); page != section_pages.end())
      outline.push_back({section.heading, page->second});
  return PdfResult{finish_pdf(std::string(bytes.constData(), static_cast<std::size_t>(bytes.size())), outline, info),
                   page_count};
}

void write_file_atomically(const std::filesystem::path& path, const std::string& bytes) {
  platform::write_private_file(path, bytes);
}

}  // namespace counterpoise::reports

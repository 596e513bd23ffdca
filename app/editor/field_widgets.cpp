#include "app/editor/field_widgets.hpp"

#include <QAbstractSlider>
#include <QAbstractSpinBox>
#include <QApplication>
#include <QComboBox>
#include <QHeaderView>
#include <QRegularExpression>
#include <QScrollBar>
#include <QSignalBlocker>
#include <QStyle>
#include <QTextBlock>
#include <QWheelEvent>

#include <algorithm>

#include "core/models/dna/dna_single_source_model.hpp"
#include "core/models/dna/str_loci.hpp"
#include "core/numbers/number_text.hpp"
#include "core/validation/display_text.hpp"

namespace counterpoise::editor {

FindingsHighlighter::FindingsHighlighter(QTextDocument* document) : QSyntaxHighlighter(document) {}

void FindingsHighlighter::setSpans(std::vector<std::pair<int, int>> spans) {
  if (spans == spans_) return;
  spans_ = std::move(spans);
  rehighlight();
}

void FindingsHighlighter::highlightBlock(const QString& text) {
  const int block_begin = currentBlock().position();
  const int block_end = block_begin + static_cast<int>(text.size());
  QTextCharFormat format;
  format.setUnderlineStyle(QTextCharFormat::WaveUnderline);
  format.setUnderlineColor(QColor(200, 30, 30));
  format.setBackground(QColor(255, 225, 200));
  for (const auto& [begin, end] : spans_) {
    const int from = std::max(begin, block_begin), to = std::min(end, block_end);
    if (from < to) setFormat(from - block_begin, to - from, format);
  }
}

TextField::TextField(QWidget* parent, int visible_lines) : QPlainTextEdit(parent), highlighter_(new FindingsHighlighter(document())) {
  setTabChangesFocus(true);
  const int line = fontMetrics().lineSpacing();
  setFixedHeight(line * visible_lines + 2 * frameWidth() + 10);
  pause_.setSingleShot(true);
  pause_.setInterval(kCommitPauseMs);
  connect(&pause_, &QTimer::timeout, this, [this] { flush(); });
  connect(this, &QPlainTextEdit::textChanged, this, [this] {
    if (showing_) return;
    pending_ = true;
    pause_.start();
  });
}

void TextField::showText(const QString& text) {
  if (toPlainText() == text) return;
  if (pending_) return;  // the user's own typing wins until it has been reported
  showing_ = true;
  setPlainText(text);
  showing_ = false;
}

void TextField::setFindings(std::vector<std::pair<int, int>> spans, const QString& tooltip) {
  highlighter_->setSpans(std::move(spans));
  setToolTip(tooltip);
}

void TextField::focusOutEvent(QFocusEvent* event) {
  flush();
  QPlainTextEdit::focusOutEvent(event);
}

void TextField::flush() {
  pause_.stop();
  if (!pending_) return;
  pending_ = false;
  emit edited(toPlainText());
}

namespace {
const char* kPendingProperty = "counterpoiseTypingPending";
}

bool typing_pending(const QLineEdit* line) { return line->property(kPendingProperty).toBool(); }

void commit_typing(QLineEdit* line, std::function<void(const QString&)> commit) {
  auto* pause = new QTimer(line);
  pause->setSingleShot(true);
  pause->setInterval(kCommitPauseMs);
  auto flush = [line, pause, commit = std::move(commit)] {
    pause->stop();
    if (!typing_pending(line)) return;
    line->setProperty(kPendingProperty, false);
    commit(line->text());
  };
  QObject::connect(line, &QLineEdit::textEdited, pause, [line, pause] {
    line->setProperty(kPendingProperty, true);
    pause->start();
  });
  QObject::connect(pause, &QTimer::timeout, line, flush);
  QObject::connect(line, &QLineEdit::editingFinished, line, flush);
}

void commit_pending_typing(QWidget* root) {
  for (auto* line : root->findChildren<QLineEdit*>())
    if (typing_pending(line)) emit line->editingFinished();
  for (auto* text : root->findChildren<TextField*>()) text->commitPending();
}

nlohmann::json number_or_text(const QString& text) {
  const std::string raw = text.trimmed().toStdString();
  if (!raw.empty()) {
    try {
      auto parsed = nlohmann::json::parse(raw);
      if (parsed.is_number()) return parsed;
    } catch (const std::exception&) {
    }
  }
  return text.toStdString();
}

std::optional<nlohmann::json> optional_number_or_text(const QString& text) {
  if (text.trimmed().isEmpty()) return std::nullopt;
  return number_or_text(text.trimmed());
}

QLineEdit* new_line_field(QWidget* parent, const QString& object_name, const QString& placeholder, const QString& tooltip) {
  auto* line = new QLineEdit(parent);
  line->setObjectName(object_name);
  line->setPlaceholderText(placeholder);
  line->setToolTip(tooltip);
  return line;
}

QComboBox* new_locus_picker(QWidget* parent, const QString& object_name) {
  auto* picker = new QComboBox(parent);
  picker->setEditable(true);
  picker->setObjectName(object_name);
  picker->setToolTip(QObject::tr("A locus to add: pick a standard STR locus or type another name."));
  return picker;
}

void offer_loci(QComboBox* picker, const nlohmann::json& profile) {
  const QSignalBlocker quiet(picker);
  picker->clear();
  for (std::string_view locus : models::dna::standard_str_loci())
    if (!profile.is_object() || !profile.contains(std::string(locus))) picker->addItem(QString::fromStdString(std::string(locus)));
  picker->setCurrentIndex(-1);
  picker->setEditText(QString());
}

void render_after_cell_edit(QObject* owner, bool inside_cell_edit, const std::function<void()>& render) {
  if (inside_cell_edit) QTimer::singleShot(0, owner, render);
  else render();
}

void fit_table_to_rows(QTableWidget* table) {
  table->resizeRowsToContents();
  int height = table->horizontalHeader()->height() + 2 * table->frameWidth();
  for (int row = 0; row < table->rowCount(); ++row) height += table->rowHeight(row);
  if (table->horizontalScrollBar()->isVisible()) height += table->horizontalScrollBar()->height();
  table->setFixedHeight(std::max(height + 2, 120));
}

nlohmann::json object_member(const nlohmann::json& fields, const char* key) {
  const nlohmann::json value = fields.is_object() ? fields.value(key, nlohmann::json::object()) : nlohmann::json::object();
  return value.is_object() ? value : nlohmann::json::object();
}

int index_of(const std::vector<std::string>& names, const QString& name) {
  const auto it = std::find(names.begin(), names.end(), name.toStdString());
  return it == names.end() ? -1 : static_cast<int>(it - names.begin());
}

bool field_is_within(const std::string& field, std::initializer_list<const char*> fields) {
  for (const char* name : fields) {
    const std::string f = name;
    if (field == f || field.rfind(f + ".", 0) == 0 || field.rfind(f + "[", 0) == 0) return true;
  }
  return false;
}

nlohmann::json typed_ibd_relationship(QLineEdit* field, const nlohmann::json& shown) {
  if (field->text().trimmed().isEmpty()) {
    const auto k = models::dna::ibd_of_relationship(shown.is_string() ? shown.get<std::string>() : "unrelated");
    if (k) field->setText(QStringLiteral("%1, %2, %3").arg(k->k0).arg(k->k1).arg(k->k2));
  }
  nlohmann::json coefficients = nlohmann::json::array();
  for (const QString& part : field->text().split(',', Qt::SkipEmptyParts)) coefficients.push_back(number_or_text(part.trimmed()));
  field->setEnabled(true);
  return nlohmann::json{{"ibd", coefficients}};
}

nlohmann::json comma_separated_names(const QString& text) {
  nlohmann::json names = nlohmann::json::array();
  for (const QString& part : text.split(',', Qt::SkipEmptyParts))
    if (!part.trimmed().isEmpty()) names.push_back(part.trimmed().toStdString());
  return names;
}

nlohmann::json allele_list(const QString& text) {
  nlohmann::json alleles = nlohmann::json::array();
  for (const QString& allele : text.split(QRegularExpression("[,/\\s]+"), Qt::SkipEmptyParts)) alleles.push_back(allele.toStdString());
  return alleles;
}

QString comma_text(const nlohmann::json& list) {
  if (!list.is_array()) return QString::fromStdString(list.dump());
  QStringList parts;
  for (const auto& v : list) parts << QString::fromStdString(v.is_string() ? v.get<std::string>() : v.dump());
  return parts.join(", ");
}

QString value_text(const std::optional<nlohmann::json>& value) {
  if (!value || value->is_null()) return {};
  if (value->is_string()) return QString::fromStdString(value->get<std::string>());
  if (value->is_number_integer()) return QString::number(value->get<long long>());
  if (value->is_number()) return QString::fromStdString(numbers::exact_text(value->get<double>()));
  return QString::fromStdString(value->dump());
}

void show_value(QLineEdit* line, const std::optional<nlohmann::json>& value) {
  if (typing_pending(line)) return;  // the user's own typing wins until it is committed
  const nlohmann::json shown = number_or_text(line->text());
  if (value && (shown == *value || (shown.is_number() && value->is_number() && shown.get<double>() == value->get<double>())))
    return;
  if (!value && line->text().isEmpty()) return;
  line->setText(value_text(value));
}

void show_text(QLineEdit* line, const QString& text) {
  if (typing_pending(line)) return;
  if (line->text() != text) line->setText(text);
}

namespace {
// A control whose value the wheel changes; scroll bars are meant to take the wheel.
QWidget* wheel_sensitive(QObject* object) {
  if (qobject_cast<QScrollBar*>(object)) return nullptr;
  if (qobject_cast<QComboBox*>(object) || qobject_cast<QAbstractSpinBox*>(object) || qobject_cast<QAbstractSlider*>(object))
    return static_cast<QWidget*>(object);
  return nullptr;
}
}  // namespace

bool WheelGuard::eventFilter(QObject* watched, QEvent* event) {
  if (event->type() != QEvent::Wheel && event->type() != QEvent::Polish) return false;
  QWidget* control = wheel_sensitive(watched);
  if (!control) return false;
  if (event->type() == QEvent::Polish) {
    // The wheel must not give such a control the focus (Qt::WheelFocus) either.
    if ((control->focusPolicy() & Qt::WheelFocus) == Qt::WheelFocus) control->setFocusPolicy(Qt::StrongFocus);
    return false;
  }
  const QWidget* focus = QApplication::focusWidget();
  if (focus && (focus == control || control->isAncestorOf(focus))) return false;
  event->ignore();  // passed on to the parent: the scroll area under the form scrolls
  return true;
}

FieldMessage::FieldMessage(QWidget* parent) : QLabel(parent) {
  setWordWrap(true);
  setTextFormat(Qt::PlainText);  // a message may quote a case's text: never read as markup
  setStyleSheet("color: #b00020;");
  setTextInteractionFlags(Qt::TextSelectableByMouse);
  hide();
}

void FieldMessage::showProblems(const std::vector<validation::Problem>& problems, QWidget* field) {
  QStringList lines;
  for (const auto& problem : problems)
    // Escaped as every message is (a path or value from the case may hold control characters); each said once.
    if (const QString line = QString::fromStdString(validation::display_lines(problem.message)); !lines.contains(line))
      lines << line;
  const bool any = !lines.isEmpty();
  setText(lines.join('\n'));
  setVisible(any);
  if (field && field->property("invalid").toBool() != any) {
    field->setProperty("invalid", any);
    field->setStyleSheet(any ? "border: 1px solid #b00020;" : "");
  }
}

}  // namespace counterpoise::editor

#pragma once
// Small widgets shared by the forms: a text field that highlights the guard's findings, a line
// field for numbers or text, and the in-place message under a field. They only show values and
// report what the user typed; the forms turn that into EditFacade calls.

#include <QComboBox>
#include <QLabel>
#include <QLineEdit>
#include <QPlainTextEdit>
#include <QSyntaxHighlighter>
#include <QTableWidget>
#include <QTimer>

#include <functional>
#include <initializer_list>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/validation/input_error.hpp"

namespace counterpoise::editor {

// Marks spans (UTF-16 offsets in the whole text) with a wavy underline and a tint.
class FindingsHighlighter : public QSyntaxHighlighter {
  Q_OBJECT
 public:
  explicit FindingsHighlighter(QTextDocument* document);
  void setSpans(std::vector<std::pair<int, int>> spans);
  const std::vector<std::pair<int, int>>& spans() const { return spans_; }

 protected:
  void highlightBlock(const QString& text) override;

 private:
  std::vector<std::pair<int, int>> spans_;
};

// How long typing may pause before what was typed is committed as one edit. Long enough that
// a word typed at a normal pace is one change, short enough that the numbers follow soon.
inline constexpr int kCommitPauseMs = 800;

// Commits what the user types into `line` as one change of its field: when the field is left,
// on Enter, or after a pause in typing — never per keystroke, so one deliberate change is one
// undo step and (in a case file) one audit row holding the whole field's old and new value.
// While typing is pending, show_value and show_text leave the line alone, so a re-render for
// some other reason does not throw the typing away.
void commit_typing(QLineEdit* line, std::function<void(const QString&)> commit);
// Whether `line` holds typing not yet committed.
bool typing_pending(const QLineEdit* line);
// Commits the pending typing of every field inside `root` now (before the form shows another
// item, before undo, save or a report), so nothing typed is lost or applied to the wrong item.
void commit_pending_typing(QWidget* root);

// A multi-line text field. Reports its text as one edit when focus leaves or typing pauses
// (kCommitPauseMs), so a burst of keystrokes is one edit of the document.
class TextField : public QPlainTextEdit {
  Q_OBJECT
 public:
  explicit TextField(QWidget* parent = nullptr, int visible_lines = 3);
  // Shows `text` unless the field already shows it (the cursor stays where it is).
  void showText(const QString& text);
  void setFindings(std::vector<std::pair<int, int>> spans, const QString& tooltip);
  FindingsHighlighter* highlighter() const { return highlighter_; }
  // Reports typing not yet reported, now.
  void commitPending() { flush(); }

 signals:
  // The user changed the text (reported once per pause or when focus leaves).
  void edited(const QString& text);

 protected:
  void focusOutEvent(QFocusEvent* event) override;

 private:
  void flush();
  FindingsHighlighter* highlighter_;
  QTimer pause_;
  bool showing_ = false;
  bool pending_ = false;
};

// A one-line field with its object name, placeholder and tooltip, as the forms make them.
QLineEdit* new_line_field(QWidget* parent, const QString& object_name, const QString& placeholder, const QString& tooltip);

// The DNA forms' choice of a locus to add: an editable list of the standard STR loci (another
// name may be typed); offer_loci refills it with those not yet keys of `profile`.
QComboBox* new_locus_picker(QWidget* parent, const QString& object_name);
void offer_loci(QComboBox* picker, const nlohmann::json& profile);

// Calls `render` now or, while a table's cellChanged is being handled (`inside_cell_edit`), once
// the signal returns, so the cell being edited is not deleted under the view still using it.
void render_after_cell_edit(QObject* owner, bool inside_cell_edit, const std::function<void()>& render);
// Keeps every row of `table` in view, none clipped: the table is as tall as its rows (the form
// around it scrolls), rows as tall as their contents.
void fit_table_to_rows(QTableWidget* table);

// What the user typed in a number field, as the document holds it: a JSON number when the text
// is one, otherwise the text itself (a string), so the core's reader names the problem.
nlohmann::json number_or_text(const QString& text);
// The same for an optional field: nothing typed is no value (the field is removed).
std::optional<nlohmann::json> optional_number_or_text(const QString& text);
// A donor's relationship given as IBD coefficients typed in `field` ("0.25, 0.5, 0.25"), as the
// case file writes it: {"ibd": [k0, k1, k2]}. An empty field is first filled with the
// coefficients of `shown` (the relationship shown until now, a name; "unrelated" otherwise), so
// switching to coefficients starts from them. Enables the field.
nlohmann::json typed_ibd_relationship(QLineEdit* field, const nlohmann::json& shown);
// "a, b , c": the names separated by commas, trimmed, empty ones left out, as a JSON array of
// strings (node states, loci).
nlohmann::json comma_separated_names(const QString& text);
// "15, 17", "15/17" or "15 17": alleles (of a genotype or an observed profile) as strings, as
// the case file writes them.
nlohmann::json allele_list(const QString& text);
// A list of names (alleles, loci) as a form shows it, separated by commas; anything that is not
// a string is shown as JSON so the core's message about it can be read against it.
QString comma_text(const nlohmann::json& list);
// The text a field shows for a value: numbers in the shortest exact form, strings as they are.
QString value_text(const std::optional<nlohmann::json>& value);
// Shows `value` in `line` unless the line's text already stands for the same value.
void show_value(QLineEdit* line, const std::optional<nlohmann::json>& value);
// Shows `text` in `line` unless it already shows it.
void show_text(QLineEdit* line, const QString& text);

// Member `key` of `fields` when it is an object, otherwise an empty object (the core names what
// is wrong with it), for forms that edit inside an object field.
nlohmann::json object_member(const nlohmann::json& fields, const char* key);
// Where `name` stands in `names` (a table's rows or columns as written), or -1.
int index_of(const std::vector<std::string>& names, const QString& name);

// Whether a problem's field is one of `fields` or inside one ("profile.TH01[0]" is inside
// "profile"), so a form shows each problem under the part of the form it concerns.
bool field_is_within(const std::string& field, std::initializer_list<const char*> fields);

// Keeps the mouse wheel from changing a combo box, spin box or slider that does not have the
// keyboard focus: scrolling over a form then scrolls the form, and never silently changes a
// proposition level or a locus on the way. A focused control takes the wheel as usual. The main
// window installs one on the application, so every form has it without subclasses.
class WheelGuard : public QObject {
  Q_OBJECT
 public:
  explicit WheelGuard(QObject* parent = nullptr) : QObject(parent) {}
  bool eventFilter(QObject* watched, QEvent* event) override;
};

// The in-place message under a field: the core's text for the field's problems (red), or hidden.
class FieldMessage : public QLabel {
  Q_OBJECT
 public:
  explicit FieldMessage(QWidget* parent = nullptr);
  // Shows the problems (their messages without the location, which the form makes plain) and
  // marks `field` (a red frame) while there are any.
  void showProblems(const std::vector<validation::Problem>& problems, QWidget* field);
};

}  // namespace counterpoise::editor

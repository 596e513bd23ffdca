#pragma once
// A form over the fields of case sections ("case", "propositions"): each row binds a widget to
// (section, field). Rows show the document's value and the core's message for the field; edits
// go through the EditFacade. Used by the case details and the propositions panels.

#include <QWidget>

#include <functional>
#include <string>
#include <vector>

#include "app/editor/case_document.hpp"
#include "app/editor/edit_commands.hpp"

class QComboBox;
class QFormLayout;
class QLineEdit;

namespace counterpoise::editor {

class FieldMessage;
class TextField;

class SectionForm : public QWidget {
  Q_OBJECT
 public:
  SectionForm(CaseDocument* document, EditFacade* edits, QWidget* parent = nullptr);

  QLineEdit* addLine(const std::string& section, const std::string& field, const QString& label, const QString& tooltip);
  // A multi-line text; with `lines_array` the field is an array of strings, one per line.
  TextField* addText(const std::string& section, const std::string& field, const QString& label, const QString& tooltip,
                     int visible_lines, bool lines_array = false);
  // A choice of fixed values (data: the JSON string; an empty data string removes the field).
  // An empty `field` binds the whole section (e.g. "mode").
  QComboBox* addChoice(const std::string& section, const std::string& field, const QString& label, const QString& tooltip,
                       const std::vector<std::pair<QString, QString>>& choices);
  void addHeading(const QString& text);
  void addNote(const QString& text);
  QFormLayout* layout() const { return form_; }

  void render();

 private:
  struct Row {
    std::string section, field;
    QWidget* widget;
    FieldMessage* message;
    std::function<void()> show;
  };
  FieldMessage* addMessage();
  CaseDocument* document_;
  EditFacade* edits_;
  QFormLayout* form_;
  std::vector<Row> rows_;
};

}  // namespace counterpoise::editor

#include "app/editor/section_form.hpp"

#include <QComboBox>
#include <QFormLayout>
#include <QLabel>
#include <QLineEdit>
#include <QVBoxLayout>

#include "app/editor/field_widgets.hpp"

namespace counterpoise::editor {

using nlohmann::json;

SectionForm::SectionForm(CaseDocument* document, EditFacade* edits, QWidget* parent)
    : QWidget(parent), document_(document), edits_(edits), form_(new QFormLayout) {
  auto* outer = new QVBoxLayout(this);
  outer->addLayout(form_);
  outer->addStretch(1);  // spare height goes below the form, not into its rows
  form_->setRowWrapPolicy(QFormLayout::WrapLongRows);
  form_->setFieldGrowthPolicy(QFormLayout::AllNonFixedFieldsGrow);
  connect(document_, &CaseDocument::changed, this, [this](Changes what) {
    if (what & (Change::content | Change::guard | Change::file)) render();
  });
}

FieldMessage* SectionForm::addMessage() {
  auto* message = new FieldMessage(this);
  form_->addRow(QString(), message);
  return message;
}

void SectionForm::addHeading(const QString& text) {
  auto* label = new QLabel(text, this);
  label->setStyleSheet("font-weight: bold; font-size: 13pt; margin-top: 6px;");
  label->setSizePolicy(QSizePolicy::Preferred, QSizePolicy::Fixed);
  form_->addRow(label);
}

void SectionForm::addNote(const QString& text) {
  auto* label = new QLabel(text, this);
  label->setWordWrap(true);
  label->setStyleSheet("color: palette(dark);");
  form_->addRow(label);
}

QLineEdit* SectionForm::addLine(const std::string& section, const std::string& field, const QString& label,
                                const QString& tooltip) {
  auto* line = new QLineEdit(this);
  line->setObjectName(QString::fromStdString(section + "." + field));
  line->setToolTip(tooltip);
  form_->addRow(label, line);
  FieldMessage* message = addMessage();
  commit_typing(line, [this, section, field](const QString& text) {
    edits_->setSectionField(section, field, json(text.toStdString()));
  });
  rows_.push_back({section, field, line, message, [this, line, section, field] {
                     const auto value = document_->value(store::EntityRef::section(section), field);
                     show_text(line, value_text(value));
                   }});
  return line;
}

TextField* SectionForm::addText(const std::string& section, const std::string& field, const QString& label,
                                const QString& tooltip, int visible_lines, bool lines_array) {
  auto* text = new TextField(this, visible_lines);
  text->setObjectName(QString::fromStdString(section + "." + field));
  text->setToolTip(tooltip);
  form_->addRow(label, text);
  FieldMessage* message = addMessage();
  connect(text, &TextField::edited, this, [this, section, field, lines_array](const QString& value) {
    if (lines_array) {
      json lines = json::array();
      for (const QString& line : value.split('\n'))
        if (!line.trimmed().isEmpty()) lines.push_back(line.toStdString());
      edits_->setSectionField(section, field, lines.empty() ? std::nullopt : std::optional<json>(lines));
    } else {
      edits_->setSectionField(section, field, value.isEmpty() ? std::nullopt : std::optional<json>(value.toStdString()));
    }
  });
  rows_.push_back({section, field, text, message, [this, text, section, field, tooltip] {
                     const auto value = document_->value(store::EntityRef::section(section), field);
                     text->showText(field_text(value));
                     std::vector<std::pair<int, int>> spans;
                     QStringList tips{tooltip};
                     for (const auto* f : document_->guard().at({store::EntityRef::section(section), field})) {
                       spans.emplace_back(f->begin(), f->end());
                       tips << QString::fromStdString(f->finding.family_name + ": " + f->finding.explanation);
                     }
                     text->setFindings(std::move(spans), tips.join("\n\n"));
                   }});
  return text;
}

QComboBox* SectionForm::addChoice(const std::string& section, const std::string& field, const QString& label,
                                  const QString& tooltip, const std::vector<std::pair<QString, QString>>& choices) {
  auto* box = new QComboBox(this);
  box->setObjectName(QString::fromStdString(section + "." + field));
  box->setToolTip(tooltip);
  for (const auto& [text, data] : choices) box->addItem(text, data);
  form_->addRow(label, box);
  FieldMessage* message = addMessage();
  connect(box, &QComboBox::activated, this, [this, box, section, field](int index) {
    const QString data = box->itemData(index).toString();
    const std::optional<json> value = data.isEmpty() ? std::nullopt : std::optional<json>(data.toStdString());
    if (field.empty()) edits_->setSection(section, value);
    else edits_->setSectionField(section, field, value);
  });
  rows_.push_back({section, field, box, message, [this, box, section, field] {
                     const auto value = document_->value(store::EntityRef::section(section), field);
                     const int index = box->findData(value_text(value));
                     box->setCurrentIndex(index >= 0 ? index : 0);
                   }});
  return box;
}

void SectionForm::render() {
  setEnabled(!document_->readOnly());
  for (auto& row : rows_) {
    row.show();
    // The core names top-level sections as the item ("case", "propositions"); "mode" is a field of "file".
    auto problems = row.field.empty() ? document_->problemsAt("file", row.section) : document_->problemsAt(row.section, row.field);
    row.message->showProblems(problems, row.widget);
  }
}

}  // namespace counterpoise::editor

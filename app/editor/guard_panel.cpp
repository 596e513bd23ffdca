#include "app/editor/guard_panel.hpp"

#include <QDialog>
#include <QDialogButtonBox>
#include <QHeaderView>
#include <QLabel>
#include <QPushButton>
#include <QSplitter>
#include <QTreeWidget>
#include <QVBoxLayout>

namespace counterpoise::editor {

using nlohmann::json;

QString describe_field(const TextFieldRef& where) {
  static const std::map<std::string, QString> names{
      {"purpose", QObject::tr("question asked")},
      {"title", QObject::tr("title")},
      {"hp", QObject::tr("Hp")},
      {"hd", QObject::tr("Hd")},
      {"conditioning_information", QObject::tr("conditioning information")},
      {"assumptions", QObject::tr("assumptions")},
      {"description", QObject::tr("description")},
      {"notes", QObject::tr("notes")},
  };
  const auto it = names.find(where.field);
  const QString field = it != names.end() ? it->second : QString::fromStdString(where.field);
  if (where.entity.kind == store::EntityKind::item) return QObject::tr("Item %1: %2").arg(QString::fromStdString(where.entity.key), field);
  if (where.entity.key == "propositions") return QObject::tr("Propositions: %1").arg(field);
  return QObject::tr("Case: %1").arg(field);
}

QString describe_check_place(const guard::CaseWarning& check) {
  const QString field = QString::fromStdString(check.field);
  if (check.item == "case" || check.item == "propositions" || check.item == "priors") {
    const QString place = check.item == "case" ? QObject::tr("Case") : check.item == "propositions" ? QObject::tr("Propositions")
                                                                                                   : QObject::tr("Priors");
    return field.isEmpty() ? place : QObject::tr("%1: %2").arg(place, field);
  }
  const QString item = QObject::tr("Item %1").arg(QString::fromStdString(check.item));
  return field.isEmpty() ? item : QObject::tr("%1: %2").arg(item, field);
}

GuardPanel::GuardPanel(CaseDocument* document, EditFacade* edits, QWidget* parent)
    : QWidget(parent), document_(document), edits_(edits) {
  auto* layout = new QVBoxLayout(this);
  summary_ = new QLabel(this);
  summary_->setWordWrap(true);
  layout->addWidget(summary_);
  auto* splitter = new QSplitter(Qt::Vertical, this);
  list_ = new QTreeWidget(splitter);
  list_->setObjectName("guardFindings");
  list_->setRootIsDecorated(false);
  list_->setHeaderLabels({tr("Where"), tr("Problem"), tr("Words")});
  list_->header()->setStretchLastSection(true);
  list_->setColumnWidth(0, 200);
  list_->setColumnWidth(1, 260);
  auto* bottom = new QWidget(splitter);
  auto* bottom_layout = new QVBoxLayout(bottom);
  bottom_layout->setContentsMargins(0, 0, 0, 0);
  details_ = new QLabel(bottom);
  details_->setWordWrap(true);
  details_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  details_->setAlignment(Qt::AlignTop | Qt::AlignLeft);
  bottom_layout->addWidget(details_, 1);
  apply_ = new QPushButton(tr("&Rewrite the sentence…"), bottom);
  apply_->setToolTip(tr("Shows the sentence as it would read with the suggested wording, in its own field, before "
                        "anything is changed; Apply replaces it (undo with the usual shortcut)."));
  bottom_layout->addWidget(apply_, 0, Qt::AlignLeft);
  splitter->setStretchFactor(0, 1);
  splitter->setStretchFactor(1, 1);
  layout->addWidget(splitter, 1);

  connect(list_, &QTreeWidget::currentItemChanged, this, [this] { showDetails(); });
  connect(list_, &QTreeWidget::itemActivated, this, [this] {
    const int row = list_->indexOfTopLevelItem(list_->currentItem());
    if (row >= 0 && row < static_cast<int>(shown_.size())) emit showField(shown_[static_cast<std::size_t>(row)].where);
  });
  connect(apply_, &QPushButton::clicked, this, [this] { previewSuggestion(list_->indexOfTopLevelItem(list_->currentItem())); });
  connect(document_, &CaseDocument::changed, this, [this](Changes what) {
    if (what & Change::guard) render();
  });
  render();
}

void GuardPanel::render() {
  const auto& guard = document_->guard();
  const int current = list_->indexOfTopLevelItem(list_->currentItem());
  shown_ = guard.findings;
  list_->clear();
  if (!guard.available) {
    summary_->setText(tr("The reasoning guard is not available: %1").arg(guard.problem));
    showDetails();
    return;
  }
  for (const auto& finding : shown_) {
    auto* row = new QTreeWidgetItem(list_);
    row->setText(0, describe_field(finding.where));
    row->setText(1, QString::fromStdString(finding.finding.family_name));
    row->setText(2, QString::fromStdString(finding.finding.matched_text));
    row->setToolTip(1, QString::fromStdString(finding.finding.explanation));
    if (finding.finding.severity == guard::Severity::error) row->setForeground(1, QColor(176, 0, 32));
  }
  // The checks on how the case is set up follow the wording findings, one row each.
  checks_ = guard.case_checks;
  for (const auto& check : checks_) {
    auto* row = new QTreeWidgetItem(list_);
    row->setText(0, describe_check_place(check));
    row->setText(1, tr("check on the case: %1").arg(QString::fromStdString(check.rule)));
    row->setText(2, QString::fromStdString(check.message));
    row->setToolTip(2, QString::fromStdString(check.message));
    if (check.severity == guard::Severity::error) row->setForeground(1, QColor(176, 0, 32));
  }
  QString summary = shown_.empty() ? tr("The reasoning guard found nothing to flag in the case's texts.")
                                   : tr("The reasoning guard flags %n statement(s). Each is highlighted in its text field.", nullptr,
                                        static_cast<int>(shown_.size()));
  if (!checks_.empty())
    summary += " " + tr("%n check(s) on how the case is set up point something out (the same as validate prints).", nullptr,
                        static_cast<int>(checks_.size()));
  if (!guard.rules_note.isEmpty()) summary += "\n" + guard.rules_note;
  summary_->setText(summary);
  const int rows = list_->topLevelItemCount();
  if (rows > 0) list_->setCurrentItem(list_->topLevelItem(std::clamp(current, 0, rows - 1)));
  showDetails();
}

void GuardPanel::showDetails() {
  const int row = list_->indexOfTopLevelItem(list_->currentItem());
  const int check = row - static_cast<int>(shown_.size());
  if (check >= 0 && check < static_cast<int>(checks_.size())) {
    const auto& c = checks_[static_cast<std::size_t>(check)];
    details_->setText(tr("<p><b>Check on the case: %1</b> (%2), %3</p><p>%4</p>")
                          .arg(QString::fromStdString(c.rule).toHtmlEscaped(),
                               QString::fromStdString(std::string(guard::severity_name(c.severity))),
                               describe_check_place(c).toHtmlEscaped(), QString::fromStdString(c.message).toHtmlEscaped()));
    apply_->setEnabled(false);  // a check names what to change; there is no one rewrite
    return;
  }
  if (row < 0 || row >= static_cast<int>(shown_.size())) {
    details_->clear();
    apply_->setEnabled(false);
    return;
  }
  const auto& f = shown_[static_cast<std::size_t>(row)];
  const QString sentence = f.text.mid(static_cast<int>(f.finding.sentence.utf16_begin),
                                      static_cast<int>(f.finding.sentence.utf16_end - f.finding.sentence.utf16_begin));
  details_->setText(tr("<p><b>%1</b> (%2)</p><p><i>“%3”</i></p><p>%4</p><p><b>Suggested:</b> %5</p>")
                        .arg(QString::fromStdString(f.finding.family_name).toHtmlEscaped(),
                             QString::fromStdString(std::string(guard::severity_name(f.finding.severity))),
                             sentence.trimmed().toHtmlEscaped(), QString::fromStdString(f.finding.explanation).toHtmlEscaped(),
                             QString::fromStdString(f.finding.suggestion).toHtmlEscaped()));
  apply_->setEnabled(!f.finding.suggestion.empty() && !document_->readOnly());
}

bool GuardPanel::previewSuggestion(int row) {
  if (row < 0 || row >= static_cast<int>(shown_.size())) return false;
  const TextFinding finding = shown_[static_cast<std::size_t>(row)];
  const int from = static_cast<int>(finding.finding.sentence.utf16_begin);
  const int to = static_cast<int>(finding.finding.sentence.utf16_end);
  const QString before = finding.text.mid(from, to - from).trimmed();
  // The rewritten field differs from the original only inside the sentence: the rest of the
  // field is kept, so the new sentence is the changed part.
  const QString rewritten = finding.rewritten();
  const int tail = static_cast<int>(finding.text.size()) - to;
  const QString after = rewritten.mid(from, static_cast<int>(rewritten.size()) - from - tail).trimmed();

  QDialog dialog(this);
  dialog.setObjectName("rewritePreview");
  dialog.setWindowTitle(tr("Rewrite a flagged sentence"));
  auto* layout = new QVBoxLayout(&dialog);
  auto* text = new QLabel(&dialog);
  text->setObjectName("rewriteText");
  text->setWordWrap(true);
  text->setTextFormat(Qt::RichText);
  text->setText(tr("<p><b>%1</b> — %2</p><p>Now:</p><p style='color:#8a1c1c'><s>%3</s></p><p>Would read:</p>"
                   "<p style='color:#1b5e20'>%4</p><p>Only this sentence of this field changes. Read it in its "
                   "place before you apply it: the suggestion is a starting point, and the wording is yours.</p>")
                    .arg(describe_field(finding.where).toHtmlEscaped(), QString::fromStdString(finding.finding.family_name).toHtmlEscaped(),
                         before.toHtmlEscaped(), after.toHtmlEscaped()));
  text->setMinimumWidth(520);
  layout->addWidget(text);
  auto* buttons = new QDialogButtonBox(QDialogButtonBox::Cancel, &dialog);
  buttons->addButton(tr("&Apply"), QDialogButtonBox::AcceptRole);
  connect(buttons, &QDialogButtonBox::accepted, &dialog, &QDialog::accept);
  connect(buttons, &QDialogButtonBox::rejected, &dialog, &QDialog::reject);
  layout->addWidget(buttons);
  if (dialog.exec() != QDialog::Accepted) return false;
  return applySuggestion(row);
}

bool GuardPanel::applySuggestion(int row) {
  if (row < 0 || row >= static_cast<int>(shown_.size())) return false;
  const TextFinding finding = shown_[static_cast<std::size_t>(row)];
  const QString rewritten = finding.rewritten();
  std::optional<json> value;
  const auto current = document_->value(finding.where.entity, finding.where.field);
  if (current && current->is_array()) {
    json lines = json::array();
    for (const QString& line : rewritten.split('\n'))
      if (!line.trimmed().isEmpty()) lines.push_back(line.toStdString());
    value = lines;
  } else {
    value = rewritten.toStdString();
  }
  if (finding.where.entity.kind == store::EntityKind::item)
    return edits_->setItemField(finding.where.entity.key, finding.where.field, value);
  return edits_->setSectionField(finding.where.entity.key, finding.where.field, value);
}

}  // namespace counterpoise::editor

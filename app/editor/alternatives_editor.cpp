#include "app/editor/alternatives_editor.hpp"

#include <QCheckBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QMessageBox>
#include <QPushButton>
#include <QTableWidget>
#include <QVBoxLayout>

#include "app/editor/field_widgets.hpp"
#include "core/validation/display_text.hpp"

namespace counterpoise::editor {

using nlohmann::json;

namespace {

QString q(const std::string& text) { return QString::fromStdString(text); }

QString shown_id(const json& alternative) {
  return alternative.is_object() && alternative.value("id", json()).is_string()
             ? q(validation::display_text(alternative["id"].get<std::string>()))
             : QString();
}

// What a value an item holds for an alternative is, in words, for the removal's question.
QString value_words(const interchange::AlternativeValue& value, const QString& id) {
  const QString shown = q(validation::display_text(value.value.dump()));
  if (value.field.rfind("p_given.", 0) == 0)
    return QObject::tr("item %1: the probability of the findings if %2 is true (%3)").arg(q(value.item), id, shown);
  return QObject::tr("item %1: its values against %2 (%3)").arg(q(value.item), id, shown);
}

}  // namespace

AlternativesEditor::AlternativesEditor(CaseDocument* document, EditFacade* edits, QWidget* parent)
    : QWidget(parent), document_(document), edits_(edits) {
  setObjectName("alternativesEditor");
  confirm_ = [this](const QString& text) {
    QMessageBox box(QMessageBox::Question, tr("Remove the alternative"), text, QMessageBox::Yes | QMessageBox::No, this);
    box.setObjectName("removeAlternative");
    box.setDefaultButton(QMessageBox::No);
    return box.exec() == QMessageBox::Yes;
  };
  auto* layout = new QVBoxLayout(this);
  layout->setContentsMargins(0, 0, 0, 0);
  intro_ = new QLabel(this);
  intro_->setWordWrap(true);
  layout->addWidget(intro_);
  to_several_ = new QPushButton(tr("Weigh Hp against &several alternatives"), this);
  to_several_->setObjectName("toSeveralAlternatives");
  to_several_->setToolTip(tr("Hd becomes the first alternative, with its text and every item's value under it; "
                             "add the others to the list."));
  layout->addWidget(to_several_, 0, Qt::AlignLeft);

  list_box_ = new QWidget(this);
  auto* list_layout = new QVBoxLayout(list_box_);
  list_layout->setContentsMargins(0, 0, 0, 0);
  table_ = new QTableWidget(0, ColumnCount, list_box_);
  table_->setObjectName("alternativesTable");
  table_->setHorizontalHeaderLabels({tr("Id"), tr("Alternative proposition"), tr("Weight"), tr("Unspecified")});
  table_->horizontalHeaderItem(IdColumn)->setToolTip(tr("How items name the alternative (unique; not \"Hp\")."));
  table_->horizontalHeaderItem(WeightColumn)
      ->setToolTip(tr("The fact-finder's relative prior weight of the alternative: used only in the LR against the "
                      "weighted set and in illustrations, never in an item's LR. Weights need not add up to 1."));
  table_->horizontalHeaderItem(UnspecifiedColumn)
      ->setToolTip(tr("Nothing is known of this alternative beyond the findings' range; the results show what it changes."));
  table_->horizontalHeader()->setSectionResizeMode(TextColumn, QHeaderView::Stretch);
  table_->verticalHeader()->setVisible(false);
  table_->setSelectionBehavior(QAbstractItemView::SelectRows);
  table_->setSelectionMode(QAbstractItemView::SingleSelection);
  table_->setWordWrap(false);  // one line per alternative; the whole text is its tooltip
  list_layout->addWidget(table_);
  weighted_ = new QCheckBox(tr("The fact-finder's weights among the alternatives are &given"), list_box_);
  weighted_->setObjectName("alternativeWeights");
  weighted_->setToolTip(tr("On: every alternative has a weight, starting equal; off: none has."));
  list_layout->addWidget(weighted_);
  auto* buttons = new QHBoxLayout;
  add_ = new QPushButton(tr("Add alter&native"), list_box_);
  remove_ = new QPushButton(tr("&Remove"), list_box_);
  up_ = new QPushButton(tr("Move &up"), list_box_);
  down_ = new QPushButton(tr("Move do&wn"), list_box_);
  to_two_ = new QPushButton(tr("&Back to Hp and Hd"), list_box_);
  to_two_->setObjectName("toTwoPropositions");
  for (QPushButton* b : {add_, remove_, up_, down_}) buttons->addWidget(b);
  buttons->addStretch(1);
  buttons->addWidget(to_two_);
  list_layout->addLayout(buttons);
  layout->addWidget(list_box_);
  message_ = new FieldMessage(this);
  message_->setObjectName("alternativesMessage");
  layout->addWidget(message_);

  connect(to_several_, &QPushButton::clicked, this, [this] {
    apply(&interchange::to_several_alternatives, tr("Weigh Hp against several alternatives"));
  });
  connect(to_two_, &QPushButton::clicked, this, [this] {
    apply(&interchange::to_two_propositions, tr("Back to the two propositions Hp and Hd"));
  });
  connect(add_, &QPushButton::clicked, this, [this] {
    json alternatives = list();
    json added{{"id", interchange::fresh_alternative_id(alternatives)}, {"text", ""}};
    if (weighted_->isChecked()) added["weight"] = 1;  // weights stay given for all
    alternatives.push_back(added);
    setList(std::move(alternatives), tr("Add alternative %1").arg(q(added["id"].get<std::string>())));
  });
  connect(remove_, &QPushButton::clicked, this, &AlternativesEditor::removeCurrent);
  connect(up_, &QPushButton::clicked, this, [this] { moveCurrent(-1); });
  connect(down_, &QPushButton::clicked, this, [this] { moveCurrent(+1); });
  connect(weighted_, &QCheckBox::clicked, this, &AlternativesEditor::setWeighted);
  connect(table_, &QTableWidget::cellChanged, this, [this](int row, int column) {
    if (rendering_) return;
    in_cell_edit_ = true;
    cellEdited(row, column);
    in_cell_edit_ = false;
  });
  connect(table_, &QTableWidget::itemSelectionChanged, this, [this] {
    const int row = table_->currentRow();
    remove_->setEnabled(row >= 0 && table_->rowCount() > 1);
    up_->setEnabled(row > 0);
    down_->setEnabled(row >= 0 && row + 1 < table_->rowCount());
  });
  connect(document_, &CaseDocument::changed, this, [this](Changes what) {
    if (what & Change::content) {
      refusal_.clear();
      render_after_cell_edit(this, in_cell_edit_, [this] { render(); });
    }
  });
}

json AlternativesEditor::list() const {
  const auto value = document_->value(store::EntityRef::section("propositions"), "alternatives");
  return value && value->is_array() ? *value : json::array();
}

QString AlternativesEditor::message() const { return message_->isVisible() ? message_->text() : QString(); }

void AlternativesEditor::render() {
  rendering_ = true;
  const json alternatives = list();
  const bool several = !alternatives.empty();
  intro_->setText(several ? tr("Hp is weighed against each of these exclusive alternatives. Every item gives its "
                               "probability of the findings under each one.")
                          : tr("Hp is weighed against Hd alone. A case may instead weigh Hp against several exclusive "
                               "alternatives (an unknown person, a brother, another source of the same kind)."));
  to_several_->setVisible(!several);
  list_box_->setVisible(several);
  const int current = table_->currentRow();
  table_->setRowCount(static_cast<int>(alternatives.size()));
  bool all_weighted = several;
  for (std::size_t i = 0; i < alternatives.size(); ++i) {
    const json& alternative = alternatives[i];
    const int row = static_cast<int>(i);
    const auto member = [&](const char* key) {
      return alternative.is_object() && alternative.contains(key) ? std::optional<json>(alternative[key]) : std::nullopt;
    };
    auto set = [&](int column, const QString& text) {
      auto* cell = table_->item(row, column);
      if (!cell) table_->setItem(row, column, cell = new QTableWidgetItem);
      cell->setText(text);
      return cell;
    };
    set(IdColumn, value_text(member("id")));
    set(TextColumn, value_text(member("text")))->setToolTip(value_text(member("text")));
    set(WeightColumn, value_text(member("weight")));
    auto* unspecified = set(UnspecifiedColumn, QString());
    unspecified->setFlags(Qt::ItemIsEnabled | Qt::ItemIsSelectable | Qt::ItemIsUserCheckable);
    unspecified->setCheckState(member("unspecified").value_or(json(false)) == json(true) ? Qt::Checked : Qt::Unchecked);
    if (!member("weight")) all_weighted = false;
  }
  weighted_->setChecked(all_weighted);
  if (current >= 0 && current < table_->rowCount()) table_->selectRow(current);
  emit table_->itemSelectionChanged();
  to_two_->setEnabled(alternatives.size() == 1);
  to_two_->setToolTip(alternatives.size() == 1
                          ? tr("The one alternative becomes Hd again, with its text and every item's value under it.")
                          : tr("A case goes back to Hp and Hd only with one alternative left: remove the others first."));
  fit_table_to_rows(table_);

  std::vector<validation::Problem> shown;
  if (!refusal_.isEmpty()) shown.push_back({{}, refusal_.toStdString()});
  for (const auto& problem : document_->problemsAt("propositions", "alternatives"))
    shown.push_back({{}, interchange::alternative_problem_words(problem, alternatives)});
  message_->showProblems(shown, table_);
  rendering_ = false;
  emit severalChanged(several);
}

void AlternativesEditor::refuse(const QString& reason) {
  refusal_ = reason;
  render_after_cell_edit(this, in_cell_edit_, [this] { render(); });
}

void AlternativesEditor::setList(json alternatives, const QString& text) {
  // An added alternative starts without its text (the core names it missing): nothing typed is refused.
  const bool added = alternatives.size() > list().size();
  const QString refused = edits_->setAlternatives(alternatives, !added, text);
  if (!refused.isEmpty()) refuse(refused);
}

void AlternativesEditor::apply(const std::function<interchange::AlternativesEdit(const json&)>& edit, const QString& text) {
  try {
    edits_->applyAlternativesEdit(edit(document_->document()), text);
  } catch (const validation::Error& error) {
    refuse(q(interchange::alternative_problem_words({error.where(), error.bare_message()}, list())));
  }
}

void AlternativesEditor::cellEdited(int row, int column) {
  json alternatives = list();
  if (row < 0 || row >= static_cast<int>(alternatives.size()) || !alternatives[row].is_object()) return;
  json& alternative = alternatives[row];
  const QString typed = table_->item(row, column) ? table_->item(row, column)->text() : QString();
  const QString id = shown_id(alternative);
  switch (column) {
    case IdColumn: {
      const std::string from = alternative.value("id", std::string());
      const std::string to = typed.trimmed().toStdString();
      if (to == from) return;
      apply([&](const json& document) { return interchange::rename_alternative(document, from, to); },
            tr("Rename alternative %1").arg(id));
      return;
    }
    case TextColumn:
      alternative["text"] = typed.toStdString();
      return setList(std::move(alternatives), tr("Edit the text of alternative %1").arg(id));
    case WeightColumn:
      if (typed.trimmed().isEmpty()) alternative.erase("weight");
      else alternative["weight"] = number_or_text(typed.trimmed());
      return setList(std::move(alternatives), tr("Edit the weight of alternative %1").arg(id));
    case UnspecifiedColumn:
      if (table_->item(row, column)->checkState() == Qt::Checked) alternative["unspecified"] = true;
      else alternative.erase("unspecified");
      return setList(std::move(alternatives), tr("Mark alternative %1 unspecified or not").arg(id));
    default:
      return;
  }
}

void AlternativesEditor::setWeighted(bool on) {
  json alternatives = list();
  for (json& alternative : alternatives) {
    if (!alternative.is_object()) continue;
    if (!on) alternative.erase("weight");
    else if (!alternative.contains("weight")) alternative["weight"] = 1;  // equal weights to start from
  }
  setList(std::move(alternatives), on ? tr("Give the alternatives weights") : tr("Remove the alternatives' weights"));
}

void AlternativesEditor::moveCurrent(int by) {
  json alternatives = list();
  const int row = table_->currentRow();
  const int to = row + by;
  if (row < 0 || to < 0 || to >= static_cast<int>(alternatives.size())) return;
  std::swap(alternatives[row], alternatives[to]);
  const QString id = shown_id(alternatives[to]);
  if (edits_->setAlternatives(alternatives, false, tr("Move alternative %1").arg(id)).isEmpty()) table_->selectRow(to);
}

void AlternativesEditor::removeCurrent() {
  const json alternatives = list();
  const int row = table_->currentRow();
  if (row < 0 || row >= static_cast<int>(alternatives.size())) return;
  const std::string id = alternatives[row].value("id", std::string());
  const QString shown = shown_id(alternatives[row]);
  const auto values = interchange::values_naming(document_->document(), id);
  if (!values.empty()) {
    QStringList lines;
    for (const auto& value : values) lines << value_words(value, shown);
    const QString text = tr("Items still give values for alternative %1. Removing it removes these values from the "
                            "items (Undo brings them back):\n\n%2\n\nRemove alternative %1?")
                             .arg(shown, lines.join('\n'));
    if (!confirm_(text)) return;
  }
  apply([&](const json& document) { return interchange::remove_alternative(document, id); },
        tr("Remove alternative %1").arg(shown));
}

}  // namespace counterpoise::editor

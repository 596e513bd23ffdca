#include "app/editor/item_form.hpp"

#include <QCheckBox>
#include <QComboBox>
#include <QDir>
#include <QFileDialog>
#include <QFormLayout>
#include <QHBoxLayout>
#include <QGroupBox>
#include <QInputDialog>
#include <QLabel>
#include <QLineEdit>
#include <QMessageBox>
#include <QPushButton>
#include <QVBoxLayout>

#include "app/editor/display_text.hpp"
#include "app/editor/dna_mixture_form.hpp"
#include "app/editor/dna_profile_form.hpp"
#include "app/editor/field_widgets.hpp"
#include "app/editor/measurement_form.hpp"
#include "app/editor/network_form.hpp"
#include "app/editor/network_view.hpp"
#include "app/editor/probability_editor.hpp"
#include "core/casefile/proposition_level.hpp"
#include "core/interchange/alternative_edits.hpp"
#include "core/interchange/case_json.hpp"
#include "core/models/item_fields.hpp"
#include "core/models/model_registry.hpp"
#include "core/reading/csv_table.hpp"
#include "core/reading/data_access.hpp"
#include "core/models/dna/dna_single_source_model.hpp"
#include "core/models/per_alternative.hpp"
#include "core/validation/display_text.hpp"

namespace counterpoise::editor {

using nlohmann::json;

namespace {

enum ModelPage { assigned_page = 0, reported_lr_page, transfer_page, dna_page, measurement_page, mixture_page, data_page };

// The relationship list's choice of IBD coefficients of one's own (as the DNA profile form's).
constexpr const char* kIbdChoice = "ibd";

ModelPage page_for(const std::string& model) {
  if (model == "assigned") return assigned_page;
  if (model == "reported-lr") return reported_lr_page;
  if (model == "transfer") return transfer_page;
  if (model == "dna-single-source") return dna_page;
  if (model == "continuous-two-level") return measurement_page;
  if (model == "dna-mixture") return mixture_page;
  return data_page;
}

bool is_common(const std::string& key) {
  for (const auto& common : models::kCommonItemFields)
    if (key == common) return true;
  return false;
}

QLabel* wrapped(const QString& text, QWidget* parent) {
  auto* label = new QLabel(text, parent);
  label->setWordWrap(true);
  return label;
}

}  // namespace

ItemForm::ItemForm(CaseDocument* document, EditFacade* edits, QWidget* parent)
    : QWidget(parent), document_(document), edits_(edits) {
  auto* outer = new QVBoxLayout(this);
  heading_ = new QLabel(this);
  heading_->setStyleSheet("font-weight: bold; font-size: 13pt;");
  outer->addWidget(heading_);
  result_ = new QLabel(this);
  result_->setObjectName("itemResult");
  result_->setWordWrap(true);
  result_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  result_->setStyleSheet("background: palette(alternate-base); padding: 6px; border-radius: 3px;");
  outer->addWidget(result_);

  auto* about = new QGroupBox(tr("The findings"), this);
  auto* about_form = new QFormLayout(about);
  title_ = new QLineEdit(about);
  title_->setObjectName("itemTitle");
  title_->setToolTip(tr("A short name for this item of findings, used in tables and the report."));
  about_form->addRow(tr("&Title"), title_);
  description_ = new TextField(about, 3);
  description_->setToolTip(tr("What was found, in words. The reasoning guard checks this text."));
  about_form->addRow(tr("&Description"), description_);
  level_ = new QComboBox(about);
  level_->addItem(tr("(not stated)"), QString());
  for (auto level : {casefile::PropositionLevel::sub_source, casefile::PropositionLevel::source,
                     casefile::PropositionLevel::activity, casefile::PropositionLevel::offence}) {
    const QString name = QString::fromStdString(std::string(casefile::level_name(level)));
    level_->addItem(name, name);
  }
  level_->setToolTip(tr("The level in the hierarchy of propositions that this item's LR addresses."));
  about_form->addRow(tr("&Level addressed"), level_);
  model_ = new QComboBox(about);
  for (const auto& entry : models::all_models()) {
    model_->addItem(QString::fromUtf8(entry.name.data(), static_cast<int>(entry.name.size())),
                    QString::fromUtf8(entry.name.data(), static_cast<int>(entry.name.size())));
    model_->setItemData(model_->count() - 1, QString::fromUtf8(entry.summary.data(), static_cast<int>(entry.summary.size())),
                        Qt::ToolTipRole);
  }
  model_->setToolTip(tr("How the LR of this item is obtained."));
  about_form->addRow(tr("&Model"), model_);
  source_data_ = new QLineEdit(about);
  source_data_->setToolTip(tr("The data the probabilities come from (survey, database, experiment)."));
  about_form->addRow(tr("&Source of the data"), source_data_);
  common_message_ = new FieldMessage(about);
  about_form->addRow(common_message_);
  outer->addWidget(about);

  auto* inputs = new QGroupBox(tr("Evaluation of the findings"), this);
  auto* inputs_layout = new QVBoxLayout(inputs);
  model_pages_ = {buildAssignedPage(), buildReportedLrPage(), buildTransferPage(), buildDnaPage(), buildMeasurementPage(),
                  buildMixturePage(), buildDataPage()};
  for (QWidget* page : model_pages_) inputs_layout->addWidget(page);
  showModelPage(assigned_page);
  outer->addWidget(inputs);

  auto* combination = new QGroupBox(tr("Combination with the other items"), this);
  auto* combination_form = new QFormLayout(combination);
  included_ = new QCheckBox(tr("&Include in the combined LR"), combination);
  included_->setToolTip(tr("Independent items multiply (their log10 LRs add). Leave an item out, with a reason, "
                           "when it is not independent of the others or not used."));
  combination_form->addRow(included_);
  independence_ = new TextField(combination, 2);
  independence_->setToolTip(tr("Why this item's findings are independent of the other items' findings, given each proposition."));
  combination_form->addRow(tr("Why &independent"), independence_);
  exclusion_reason_ = new QLineEdit(combination);
  exclusion_reason_->setToolTip(tr("Why the item is left out of the combination (required when it is)."));
  combination_form->addRow(tr("Reason left &out"), exclusion_reason_);
  combination_message_ = new FieldMessage(combination);
  combination_form->addRow(combination_message_);
  outer->addWidget(combination);

  auto* notes_box = new QGroupBox(tr("Notes"), this);
  auto* notes_layout = new QVBoxLayout(notes_box);
  notes_ = new TextField(notes_box, 2);
  notes_layout->addWidget(notes_);
  outer->addWidget(notes_box);
  outer->addStretch(1);

  commit_typing(title_, [this](const QString& text) {
    setField("title", text.isEmpty() ? std::nullopt : std::optional<json>(text.toStdString()));
  });
  commit_typing(source_data_, [this](const QString& text) {
    setField("source_data", text.isEmpty() ? std::nullopt : std::optional<json>(text.toStdString()));
  });
  connect(description_, &TextField::edited, this, [this](const QString& text) {
    setField("description", text.isEmpty() ? std::nullopt : std::optional<json>(text.toStdString()));
  });
  connect(notes_, &TextField::edited, this, [this](const QString& text) {
    setField("notes", text.isEmpty() ? std::nullopt : std::optional<json>(text.toStdString()));
  });
  connect(level_, &QComboBox::activated, this, [this](int index) {
    const QString name = level_->itemData(index).toString();
    setField("level", name.isEmpty() ? std::nullopt : std::optional<json>(name.toStdString()));
  });
  connect(model_, &QComboBox::activated, this, [this](int index) {
    if (!rendering_ && !id_.empty()) edits_->changeItemModel(id_, model_->itemData(index).toString().toStdString());
  });
  connect(included_, &QCheckBox::clicked, this, [this](bool on) { setCombination("included", json(on)); });
  connect(independence_, &TextField::edited, this, [this](const QString& text) {
    setCombination("independence", text.isEmpty() ? std::nullopt : std::optional<json>(text.toStdString()));
  });
  commit_typing(exclusion_reason_, [this](const QString& text) {
    setCombination("exclusion_reason", text.isEmpty() ? std::nullopt : std::optional<json>(text.toStdString()));
  });
  connect(document_, &CaseDocument::changed, this, [this](Changes what) {
    if (what & (Change::content | Change::guard)) render();
    else if (what & Change::spread) renderResult();
  });
}

QWidget* ItemForm::buildAssignedPage() {
  auto* page = new QWidget(this);
  auto* form = new QFormLayout(page);
  form->setRowWrapPolicy(QFormLayout::WrapAllRows);
  p_hp_ = new ProbabilityEditor(page);
  p_hd_ = new ProbabilityEditor(page);
  p_hp_->pointField()->setObjectName("p_given_hp");
  p_hd_->pointField()->setObjectName("p_given_hd");
  auto* hp_label = new QLabel(tr("Probability of these findings if &Hp is true — P(E | Hp)"), page);
  hp_label->setBuddy(p_hp_);
  hp_label->setToolTip(tr("How probable these findings are if Hp is true, given the conditioning information. "
                          "It is not the probability that Hp is true."));
  auto* hd_label = hd_label_ = new QLabel(tr("Probability of these findings if H&d is true — P(E | Hd)"), page);
  hd_label->setBuddy(p_hd_);
  hd_label->setToolTip(tr("How probable these findings are if Hd is true, given the conditioning information. "
                          "It is not the probability that Hd is true, nor that anyone else is the source."));
  p_hp_->setToolTip(hp_label->toolTip());
  p_hd_->setToolTip(hd_label->toolTip());
  form->addRow(hp_label, p_hp_);
  form->addRow(hd_label, p_hd_);
  assigned_alternatives_ = new QWidget(page);
  auto* alternatives_form = new QFormLayout(assigned_alternatives_);
  alternatives_form->setContentsMargins(0, 0, 0, 0);
  alternatives_form->setRowWrapPolicy(QFormLayout::WrapAllRows);
  form->addRow(assigned_alternatives_);
  form->addRow(wrapped(tr("The probabilities need not add up to 1: they are probabilities of the same findings "
                          "under different propositions."),
                       page));
  // With several alternatives P(E|Hp) is the member "Hp" of p_given.
  connect(p_hp_, &ProbabilityEditor::edited, this, [this](const json& value) {
    if (shown_alternatives_.empty()) setField("p_given_hp", value);
    else setKeyed("p_given", casefile::kHpId, value);
  });
  connect(p_hd_, &ProbabilityEditor::edited, this, [this](const json& value) { setField("p_given_hd", value); });
  return page;
}

QWidget* ItemForm::buildReportedLrPage() {
  auto* page = new QWidget(this);
  auto* form = new QFormLayout(page);
  lr_ = new QLineEdit(page);
  lr_->setObjectName("reported_lr");
  lr_->setPlaceholderText(tr("e.g. 300"));
  lr_->setToolTip(tr("The likelihood ratio reported by the other method: how many times more probable the findings "
                     "are if Hp is true than if Hd is true."));
  form->addRow(tr("&Likelihood ratio"), lr_);
  auto* range = new QWidget(page);
  auto* range_layout = new QHBoxLayout(range);
  range_layout->setContentsMargins(0, 0, 0, 0);
  lr_low_ = new QLineEdit(range);
  lr_high_ = new QLineEdit(range);
  lr_low_->setPlaceholderText(tr("low"));
  lr_high_->setPlaceholderText(tr("high"));
  range_layout->addWidget(lr_low_);
  range_layout->addWidget(new QLabel(tr("to"), range));
  range_layout->addWidget(lr_high_);
  range->setToolTip(tr("Optional: the interval reported with the LR (taken as even on the log scale)."));
  form->addRow(tr("&Interval (optional)"), range);
  lr_range_ = range;
  lr_alternatives_ = new QWidget(page);
  auto* alternatives_form = new QFormLayout(lr_alternatives_);
  alternatives_form->setContentsMargins(0, 0, 0, 0);
  form->addRow(lr_alternatives_);
  lr_method_ = new QLineEdit(page);
  lr_method_->setToolTip(tr("The method or laboratory that computed the LR."));
  form->addRow(tr("M&ethod"), lr_method_);
  lr_message_ = new FieldMessage(page);
  form->addRow(lr_message_);
  commit_typing(lr_, [this](const QString& text) { setField("lr", number_or_text(text)); });
  auto interval_edited = [this](const QString&) {
    if (lr_low_->text().isEmpty() && lr_high_->text().isEmpty()) setField("interval", std::nullopt);
    else setField("interval", json::array({number_or_text(lr_low_->text()), number_or_text(lr_high_->text())}));
  };
  commit_typing(lr_low_, interval_edited);
  commit_typing(lr_high_, interval_edited);
  commit_typing(lr_method_, [this](const QString& text) {
    setField("method", text.isEmpty() ? std::nullopt : std::optional<json>(text.toStdString()));
  });
  return page;
}

QWidget* ItemForm::buildTransferPage() {
  auto* page = new QWidget(this);
  auto* form = new QFormLayout(page);
  const std::pair<const char*, QString> fields[] = {
      {"t0", tr("Probability that nothing was transferred, persisted and recovered, if Hp is true (t0)")},
      {"tn", tr("Probability that this group of n items was transferred, persisted and recovered, if Hp is true (tn)")},
      {"p0", tr("Probability that a person unconnected with the event carries no group (P0)")},
      {"p1", tr("Probability that such a person carries one group (P1)")},
      {"sn", tr("Probability that such a group has this many items (Sn)")},
      {"gamma", tr("Frequency of the matching characteristics (γ)")},
      {"t0_hd", tr("Optional: probability that nothing was transferred, persisted and recovered, if Hd is true (t0 under "
                   "Hd; empty: nothing transferred under Hd)")},
      {"tn_hd", tr("Optional: probability that this group of n items was transferred, persisted and recovered, if Hd is "
                   "true (tn under Hd)")},
  };
  form->setRowWrapPolicy(QFormLayout::WrapAllRows);
  for (const auto& [key, label] : fields) {
    auto* line = new QLineEdit(page);
    line->setObjectName(QString("transfer_") + key);
    line->setToolTip(label);
    form->addRow(label, line);
    const std::string field = key;
    const bool optional = field.ends_with("_hd");
    commit_typing(line, [this, field, optional](const QString& text) {
      setField(field, optional ? optional_number_or_text(text) : std::optional<json>(number_or_text(text)));
    });
    transfer_fields_.emplace_back(field, line);
  }
  transfer_alternatives_ = new QWidget(page);
  auto* alternatives_form = new QFormLayout(transfer_alternatives_);
  alternatives_form->setContentsMargins(0, 0, 0, 0);
  alternatives_form->setRowWrapPolicy(QFormLayout::WrapAllRows);
  form->addRow(transfer_alternatives_);
  transfer_message_ = new FieldMessage(page);
  form->addRow(transfer_message_);
  return page;
}

QWidget* ItemForm::buildDataPage() {
  auto* page = new QWidget(this);
  auto* layout = new QVBoxLayout(page);
  data_hint_ = wrapped({}, page);
  layout->addWidget(data_hint_);
  model_json_ = new TextField(page, 10);
  model_json_->setObjectName("model_json");
  QFont mono("monospace");
  mono.setStyleHint(QFont::Monospace);
  model_json_->setFont(mono);
  // A network is edited through its form and its drawing; its raw fields are for the advanced
  // user only, behind this switch.
  show_json_ = new QCheckBox(tr("Show the network's fields as JSON (advanced)"), page);
  show_json_->setObjectName("showNetworkJson");
  layout->addWidget(show_json_);
  connect(show_json_, &QCheckBox::toggled, this, [this] { render(); });
  auto* fields_and_graph = new QHBoxLayout;
  fields_and_graph->addWidget(model_json_, 1);
  network_view_ = new NetworkView(page);
  network_view_->setVisible(false);
  fields_and_graph->addWidget(network_view_, 1);
  layout->addLayout(fields_and_graph);
  network_form_ = new NetworkForm(edits_, page);
  network_form_->setVisible(false);
  layout->addWidget(network_form_);
  data_message_ = new FieldMessage(page);
  layout->addWidget(data_message_);
  connect(model_json_, &TextField::edited, this, [this](const QString& text) {
    try {
      const json fields = interchange::parse_json_text(text.toStdString(), tr("the model's fields").toStdString());
      if (!fields.is_object()) throw std::runtime_error(tr("the model's fields must be a JSON object").toStdString());
      data_message_->showProblems({}, model_json_);
      edits_->setItemModelFields(id_, fields);
    } catch (const std::exception& error) {
      data_message_->showProblems({{validation::Location{}, error.what()}}, model_json_);
    }
  });
  return page;
}

QWidget* ItemForm::buildDnaPage() {
  auto* page = new QWidget(this);
  auto* layout = new QVBoxLayout(page);
  layout->setContentsMargins(0, 0, 0, 0);
  dna_alternatives_ = new QGroupBox(tr("The alternative donor under each alternative"), page);
  auto* alternatives_form = new QFormLayout(dna_alternatives_);
  dna_alternatives_message_ = new FieldMessage(page);
  layout->addWidget(dna_alternatives_);
  layout->addWidget(dna_alternatives_message_);
  dna_form_ = new DnaProfileForm(edits_, page);
  layout->addWidget(dna_form_);
  (void)alternatives_form;
  connect(dna_form_, &DnaProfileForm::importRequested, this, [this] {
    const QString path = askForTable(tr("Import an allele frequency table"));
    if (!path.isEmpty()) dna_form_->useFrequencyFile(relativeToCase(path));
  });
  return page;
}

QWidget* ItemForm::buildMixturePage() {
  mixture_form_ = new DnaMixtureForm(edits_, this);
  connect(mixture_form_, &DnaMixtureForm::alternativeChosen, this, [this] { render(); });
  connect(mixture_form_, &DnaMixtureForm::importRequested, this, [this] {
    const QString path = askForTable(tr("Import an allele frequency table"));
    if (!path.isEmpty()) mixture_form_->useFrequencyFile(relativeToCase(path));
  });
  return mixture_form_;
}

QWidget* ItemForm::buildMeasurementPage() {
  measurement_form_ = new MeasurementForm(edits_, this);
  connect(measurement_form_, &MeasurementForm::alternativeChosen, this, [this] { render(); });
  // The file and its column for the population, or for the population if Hd (the chosen
  // alternative) is true: asked alike, each taken as one edit.
  const auto ask = [this](void (MeasurementForm::*use)(const QString&, const QString&), const std::string& field) {
    const QString path = askForTable(tr("Import background data"));
    if (path.isEmpty()) return;
    const QString column = askForColumn(path, field);
    if (!column.isEmpty()) (measurement_form_->*use)(relativeToCase(path), column);
  };
  connect(measurement_form_, &MeasurementForm::importRequested, this, [ask] { ask(&MeasurementForm::useBackgroundFile, "population.kde.file"); });
  connect(measurement_form_, &MeasurementForm::hdImportRequested, this, [this, ask] {
    const std::string& alternative = measurement_form_->alternativeChooser()->chosen();
    ask(&MeasurementForm::useHdBackgroundFile, (alternative.empty() ? std::string() : std::string(models::kAlternativesField) + "." +
                                                                                         alternative + ".") +
                                                   "population_hd.kde.file");
  });
  return measurement_form_;
}

QString ItemForm::askForTable(const QString& title) {
  const QString path = QFileDialog::getOpenFileName(this, title, QString::fromStdString(document_->baseDir().string()),
                                                    tr("Tables (*.csv *.txt);;All files (*)"));
  // The user picked this file: it may be read for this session even outside the case's folder.
  if (!path.isEmpty()) reading::allow_file_for_this_run(path.toStdString());
  return path;
}

QString ItemForm::relativeToCase(const QString& path) const {
  return QDir(QString::fromStdString(document_->baseDir().string())).relativeFilePath(path);
}

// The column of the background file with the measurements: the only one, or the user's choice
// among the header's names. Empty when the user cancels. `field` names the file's field in a
// message about the file.
QString ItemForm::askForColumn(const QString& path, const std::string& field) {
  QStringList columns;
  try {
    // The core's CSV reader, so the header is read exactly as the model will read it.
    const auto table = reading::read_csv_file(path.toStdString(), validation::Location{id_, field});
    for (const auto& name : table.header) columns << QString::fromStdString(name);
  } catch (const std::exception& error) {
    QMessageBox::warning(this, tr("Background data"), QString::fromStdString(error.what()));
    return {};
  }
  if (columns.size() == 1) return columns.front();
  bool ok = false;
  const QString column = QInputDialog::getItem(this, tr("Background data"), tr("Column with the measurements:"), columns, 0, false, &ok);
  return ok ? column : QString();
}

std::optional<json> ItemForm::field(const std::string& name) const {
  if (id_.empty()) return std::nullopt;
  return document_->value(store::EntityRef::item(id_), name);
}

void ItemForm::setField(const std::string& name, std::optional<json> value) {
  if (rendering_ || id_.empty()) return;
  edits_->setItemField(id_, name, std::move(value));
}

void ItemForm::setCombination(const char* key, std::optional<json> value) {
  if (rendering_ || id_.empty()) return;
  json combination = field("combination").value_or(json::object());
  if (!combination.is_object()) combination = json::object();
  if (value) combination[key] = *value;
  else combination.erase(key);
  if (combination.value("included", true) && combination.size() == 1) combination.erase("included");
  edits_->setItemField(id_, "combination", combination.empty() ? std::nullopt : std::optional<json>(combination));
}

std::vector<std::pair<std::string, std::string>> ItemForm::alternatives() const {
  std::vector<std::pair<std::string, std::string>> out;
  const auto list = document_->value(store::EntityRef::section("propositions"), "alternatives");
  if (!list || !list->is_array()) return out;
  for (const json& alternative : *list) {
    if (!alternative.is_object()) continue;
    const json id = alternative.value("id", json()), text = alternative.value("text", json());
    out.emplace_back(id.is_string() ? id.get<std::string>() : std::string(), text.is_string() ? text.get<std::string>() : std::string());
  }
  return out;
}

namespace {

void clear_rows(QWidget* holder) {
  auto* form = qobject_cast<QFormLayout*>(holder->layout());
  while (form && form->rowCount() > 0) form->removeRow(0);
}

QString shown(const std::string& text) { return QString::fromStdString(validation::display_text(text)); }

}  // namespace

void ItemForm::buildAlternativeRows(const std::vector<std::pair<std::string, std::string>>& alternatives) {
  // No typing is pending here: the list changes on the propositions tab (leaving a field
  // commits it) or through undo, which commits pending typing first.
  if (alternatives == shown_alternatives_) return;
  shown_alternatives_ = alternatives;
  for (QWidget* holder : {assigned_alternatives_, lr_alternatives_, static_cast<QWidget*>(dna_alternatives_), transfer_alternatives_})
    clear_rows(holder);
  alternative_transfer_.clear();
  alternative_interval_.clear();
  alternative_p_.clear();
  alternative_lr_.clear();
  alternative_relationship_.clear();
  alternative_ibd_.clear();
  auto* assigned = qobject_cast<QFormLayout*>(assigned_alternatives_->layout());
  auto* reported = qobject_cast<QFormLayout*>(lr_alternatives_->layout());
  auto* dna = qobject_cast<QFormLayout*>(dna_alternatives_->layout());
  auto* transfer = qobject_cast<QFormLayout*>(transfer_alternatives_->layout());
  for (const auto& [id, text] : alternatives) {
    const QString name = shown(id);
    const QString proposition = tr("%1: %2").arg(name, shown(text));

    auto* p = new ProbabilityEditor(assigned_alternatives_);
    p->pointField()->setObjectName(QString::fromStdString("p_given." + id));
    auto* label = new QLabel(tr("Probability of these findings if %1 is true — P(E | %1)").arg(name), assigned_alternatives_);
    label->setToolTip(tr("%1\nHow probable these findings are if this alternative is true, given the conditioning "
                         "information. It is not the probability that the alternative is true.").arg(proposition));
    p->setToolTip(label->toolTip());
    assigned->addRow(label, p);
    connect(p, &ProbabilityEditor::edited, this, [this, id](const json& value) { setKeyed("p_given", id, value); });
    alternative_p_.emplace_back(id, p);

    auto* lr = new QLineEdit(lr_alternatives_);
    lr->setObjectName(QString::fromStdString("reported_lr." + id));
    lr->setToolTip(tr("%1\nThe likelihood ratio of Hp against this alternative reported by the other method.").arg(proposition));
    reported->addRow(tr("LR of Hp against %1").arg(name), lr);
    commit_typing(lr, [this, id](const QString& typed) {
      json entry = object_member(field(models::kAlternativesField).value_or(json::object()), id.c_str());
      entry.erase("log10_lr");  // an LR typed replaces one given as log10
      entry["lr"] = number_or_text(typed);
      setKeyed(models::kAlternativesField, id, entry);
    });
    alternative_lr_.emplace_back(id, lr);
    // The interval reported with it, as the two-proposition form's: both ends or neither.
    auto* range = new QWidget(lr_alternatives_);
    auto* range_layout = new QHBoxLayout(range);
    range_layout->setContentsMargins(0, 0, 0, 0);
    auto* low = new QLineEdit(range);
    auto* high = new QLineEdit(range);
    low->setObjectName(QString::fromStdString("reported_lr_low." + id));
    high->setObjectName(QString::fromStdString("reported_lr_high." + id));
    low->setPlaceholderText(tr("low"));
    high->setPlaceholderText(tr("high"));
    range_layout->addWidget(low);
    range_layout->addWidget(new QLabel(tr("to"), range));
    range_layout->addWidget(high);
    range->setToolTip(tr("%1\nOptional: the interval reported with the LR against this alternative (taken as even on "
                         "the log scale).").arg(proposition));
    reported->addRow(tr("Interval against %1 (optional)").arg(name), range);
    auto interval_edited = [this, id, low, high](const QString&) {
      json entry = object_member(field(models::kAlternativesField).value_or(json::object()), id.c_str());
      entry.erase("interval_log10");  // an interval typed replaces one given as log10
      if (low->text().isEmpty() && high->text().isEmpty()) entry.erase("interval");
      else entry["interval"] = json::array({number_or_text(low->text()), number_or_text(high->text())});
      setKeyed(models::kAlternativesField, id, entry);
    };
    commit_typing(low, interval_edited);
    commit_typing(high, interval_edited);
    alternative_interval_.push_back({id, low, high});

    // Who the donor is: a relationship, or IBD coefficients of one's own, as the shared donor of
    // a two-proposition case is given.
    auto* donor = new QWidget(dna_alternatives_);
    auto* donor_layout = new QHBoxLayout(donor);
    donor_layout->setContentsMargins(0, 0, 0, 0);
    auto* relationship = new QComboBox(donor);
    relationship->setObjectName(QString::fromStdString("dna_relationship." + id));
    for (const auto& known : models::dna::standard_relationship_names())
      relationship->addItem(QString::fromStdString(known), QString::fromStdString(known));
    relationship->addItem(tr("other (IBD coefficients)"), QString::fromLatin1(kIbdChoice));
    relationship->setToolTip(tr("%1\nWho the donor is if this alternative is true: a person unrelated to the person of "
                                "interest, or a relative.").arg(proposition));
    auto* ibd = new QLineEdit(donor);
    ibd->setObjectName(QString::fromStdString("dna_ibd." + id));
    ibd->setPlaceholderText(tr("k0, k1, k2"));
    ibd->setToolTip(tr("The probabilities that the donor under this alternative and the person of interest share 0, 1 or "
                       "2 alleles identical by descent (they sum to 1)."));
    donor_layout->addWidget(relationship, 1);
    donor_layout->addWidget(ibd, 1);
    dna->addRow(tr("Donor if %1 is true").arg(name), donor);
    connect(relationship, &QComboBox::activated, this, [this, id, relationship, ibd] { setAlternativeDonor(id, relationship, ibd); });
    commit_typing(ibd, [this, id, relationship, ibd](const QString&) { setAlternativeDonor(id, relationship, ibd); });
    alternative_ibd_.emplace_back(id, ibd);
    alternative_relationship_.emplace_back(id, relationship);

    // The transfer under the alternative: what the person did if it is true. An empty field is
    // left out of the entry (both empty: nothing transferred under it).
    for (const auto& [key, words] : {std::pair{"t0_hd", tr("Probability that nothing was transferred, persisted and "
                                                           "recovered, if %1 is true (t0 under %1)")},
                                     std::pair{"tn_hd", tr("Probability that this group of n items was transferred, "
                                                           "persisted and recovered, if %1 is true (tn under %1)")}}) {
      auto* line = new QLineEdit(transfer_alternatives_);
      line->setObjectName(QString::fromStdString(std::string("transfer_") + key + "." + id));
      line->setPlaceholderText(tr("empty: nothing transferred under %1").arg(name));
      line->setToolTip(tr("%1\nWhat the person did if this alternative is true may transfer material too; leave both "
                          "fields empty when it transfers nothing.").arg(proposition));
      transfer->addRow(words.arg(name), line);
      const std::string field = key;
      commit_typing(line, [this, id, field](const QString& typed) {
        json entry = object_member(this->field(models::kAlternativesField).value_or(json::object()), id.c_str());
        if (const auto value = optional_number_or_text(typed)) entry[field] = *value;
        else entry.erase(field);
        setKeyed(models::kAlternativesField, id, entry);
      });
      alternative_transfer_.push_back({id, field, line});
    }
  }
}

void ItemForm::setAlternativeDonor(const std::string& alternative, const QComboBox* relationship, QLineEdit* ibd) {
  if (rendering_ || id_.empty()) return;
  json entry = object_member(field(models::kAlternativesField).value_or(json::object()), alternative.c_str());
  const QString chosen = relationship->currentData().toString();
  if (chosen != QString::fromLatin1(kIbdChoice)) {
    entry["relationship"] = chosen.toStdString();
  } else {
    entry["relationship"] =
        typed_ibd_relationship(ibd, entry.value("relationship", field("relationship").value_or(json("unrelated"))));
  }
  setKeyed(models::kAlternativesField, alternative, entry);
}

void ItemForm::setKeyed(const std::string& name, const std::string& alternative, const json& value) {
  if (rendering_ || id_.empty()) return;
  json keyed = field(name).value_or(json::object());
  if (!keyed.is_object()) keyed = json::object();
  keyed[alternative] = value;
  setField(name, keyed);
}

// The values and the core's problems of each alternative's row, and the mean each one uses.
void ItemForm::renderAlternativeRows(const json& body) {
  const bool several = !shown_alternatives_.empty();
  qobject_cast<QFormLayout*>(p_hd_->parentWidget()->layout())->setRowVisible(p_hd_, !several);
  auto* lr_form = qobject_cast<QFormLayout*>(lr_->parentWidget()->layout());
  lr_form->setRowVisible(lr_, !several);
  lr_form->setRowVisible(lr_range_, !several);
  assigned_alternatives_->setVisible(several);
  lr_alternatives_->setVisible(several);
  transfer_alternatives_->setVisible(several);
  auto* transfer_form = qobject_cast<QFormLayout*>(transfer_alternatives_->parentWidget()->layout());
  for (const auto& [key, line] : transfer_fields_)
    if (key.ends_with("_hd")) transfer_form->setRowVisible(line, !several);
  dna_alternatives_->setVisible(several);
  dna_form_->showSharedDonor(!several);
  if (!several) {
    dna_alternatives_message_->showProblems({}, nullptr);
    return;
  }
  const json p_given = object_member(body, "p_given");
  const json entries = object_member(body, models::kAlternativesField);
  const ItemPoint* evaluated = document_->points().item(id_);
  for (std::size_t i = 0; i < alternative_p_.size(); ++i) {
    const auto& [id, editor] = alternative_p_[i];
    editor->showValue(p_given.contains(id) ? std::optional<json>(p_given[id]) : std::nullopt);
    editor->showProblems(problemsAt("p_given." + id));
    QString mean;
    if (evaluated && i < evaluated->by_alternative.size()) {
      const auto& point = evaluated->by_alternative[i];
      if (point.log10_p_given_hd) mean = tr("Used for the LR (the mean): %1").arg(probability_text(*point.log10_p_given_hd));
    }
    editor->showMean(mean);
  }
  for (const auto& [id, line] : alternative_lr_) {
    const json entry = object_member(entries, id.c_str());
    show_value(line, entry.contains("lr") ? std::optional<json>(entry["lr"]) : std::nullopt);
    line->setPlaceholderText(entry.contains("log10_lr") ? tr("log10 LR %1 as written").arg(value_text(entry["log10_lr"]))
                                                        : tr("e.g. 300"));
  }
  for (const auto& [id, low, high] : alternative_interval_) {
    const json entry = object_member(entries, id.c_str());
    const json interval = entry.value("interval", json());
    show_value(low, interval.is_array() && !interval.empty() ? std::optional<json>(interval[0]) : std::nullopt);
    show_value(high, interval.is_array() && interval.size() > 1 ? std::optional<json>(interval[1]) : std::nullopt);
    const json written = entry.value("interval_log10", json());
    const bool as_log10 = written.is_array() && written.size() == 2;
    low->setPlaceholderText(as_log10 ? tr("log10 %1 as written").arg(value_text(written[0])) : tr("low"));
    high->setPlaceholderText(as_log10 ? tr("log10 %1 as written").arg(value_text(written[1])) : tr("high"));
  }
  for (const auto& [id, key, line] : alternative_transfer_) {
    const json entry = object_member(entries, id.c_str());
    show_value(line, entry.contains(key) ? std::optional<json>(entry[key]) : std::nullopt);
  }
  for (std::size_t i = 0; i < alternative_relationship_.size(); ++i) {
    const auto& [id, box] = alternative_relationship_[i];
    QLineEdit* ibd = alternative_ibd_[i].second;
    if (!entries.contains(id)) {  // no entry yet: nothing chosen (the core names it missing)
      box->setCurrentIndex(-1);
      ibd->clear();
      ibd->setEnabled(false);
      continue;
    }
    const json relationship = object_member(entries, id.c_str()).value("relationship", body.value("relationship", json("unrelated")));
    if (relationship.is_object()) {
      box->setCurrentIndex(box->findData(QString::fromLatin1(kIbdChoice)));
      if (!typing_pending(ibd)) {
        QStringList parts;
        const json k = relationship.value("ibd", json::array());
        if (k.is_array())
          for (const auto& v : k) parts << value_text(v);
        ibd->setText(parts.join(", "));
      }
    } else {
      box->setCurrentIndex(relationship.is_string() ? box->findData(QString::fromStdString(relationship.get<std::string>())) : -1);
      ibd->clear();
    }
    ibd->setEnabled(box->currentData().toString() == QString::fromLatin1(kIbdChoice));
  }
  dna_alternatives_message_->showProblems(problemsAt(models::kAlternativesField), dna_alternatives_);
}

std::vector<validation::Problem> ItemForm::problemsAt(const std::string& field_prefix) const {
  auto problems = document_->problemsAt(id_, field_prefix);
  // A problem in an alternative's entry says which alternative, as the propositions tab does.
  const json list = document_->value(store::EntityRef::section("propositions"), "alternatives").value_or(json::array());
  for (auto& p : problems)
    if (p.where.field.rfind(std::string(models::kAlternativesField) + ".", 0) == 0)
      p.message = interchange::alternative_problem_words(p, list);
  return problems;
}

json ItemForm::drawnNetwork(const json& body) const {
  // The drawing reads the network as a two-proposition item: the nodes are the same under every
  // alternative, so the first alternative's states stand in for Hd's when no shared one is given.
  json drawn = body;
  const json entries = object_member(body, models::kAlternativesField);
  drawn.erase(models::kAlternativesField);
  if (drawn.contains("proposition") && drawn["proposition"].is_object() && !drawn["proposition"].contains("hd") &&
      !shown_alternatives_.empty()) {
    const json first = object_member(entries, shown_alternatives_.front().first.c_str());
    if (first.contains("hd")) drawn["proposition"]["hd"] = first["hd"];
  }
  return drawn;
}

json ItemForm::chosenDetail(std::size_t alternative, const json& first) const {
  // The point evaluation computed each alternative's detail once, when the case last changed.
  const ItemPoint* point = document_->points().item(id_);
  if (!point || alternative >= point->by_alternative.size()) return first;
  return point->by_alternative[alternative].detail;
}

ProbabilityEditor* ItemForm::alternativeProbability(const std::string& alternative) const {
  for (const auto& [id, editor] : alternative_p_)
    if (id == alternative) return editor;
  return nullptr;
}

QLineEdit* ItemForm::alternativeLrField(const std::string& alternative) const {
  for (const auto& [id, line] : alternative_lr_)
    if (id == alternative) return line;
  return nullptr;
}

std::pair<QLineEdit*, QLineEdit*> ItemForm::alternativeIntervalFields(const std::string& alternative) const {
  for (const auto& [id, low, high] : alternative_interval_)
    if (id == alternative) return {low, high};
  return {nullptr, nullptr};
}

QLineEdit* ItemForm::alternativeTransferField(const std::string& alternative, const std::string& field) const {
  for (const auto& [id, key, line] : alternative_transfer_)
    if (id == alternative && key == field) return line;
  return nullptr;
}

QLineEdit* ItemForm::alternativeIbdField(const std::string& alternative) const {
  for (const auto& [id, line] : alternative_ibd_)
    if (id == alternative) return line;
  return nullptr;
}

QComboBox* ItemForm::alternativeRelationship(const std::string& alternative) const {
  for (const auto& [id, box] : alternative_relationship_)
    if (id == alternative) return box;
  return nullptr;
}

void ItemForm::showModelPage(int page) {
  for (std::size_t i = 0; i < model_pages_.size(); ++i) model_pages_[i]->setVisible(static_cast<int>(i) == page);
}

void ItemForm::setItem(const std::string& id) {
  if (id == id_) return;
  commit_pending_typing(this);  // typing in the item being left belongs to that item
  id_ = id;
  render();
}

void ItemForm::render() {
  const auto body = id_.empty() ? std::nullopt : document_->itemBody(id_);
  setEnabled(body.has_value() && !document_->readOnly());
  if (!body) {
    heading_->setText(tr("No item selected"));
    result_->clear();
    return;
  }
  rendering_ = true;
  const QString id = QString::fromStdString(id_);
  heading_->setText(tr("Item %1").arg(id));
  show_value(title_, field("title"));
  description_->showText(value_text(field("description")));
  show_value(source_data_, field("source_data"));
  notes_->showText(value_text(field("notes")));
  const QString level = value_text(field("level"));
  level_->setCurrentIndex(std::max(0, level_->findData(level)));
  const std::string model = field("model").value_or(json("")).is_string() ? field("model")->get<std::string>() : std::string();
  const int model_index = model_->findData(QString::fromStdString(model));
  model_->setCurrentIndex(model_index);
  showModelPage(page_for(model));

  std::vector<validation::Problem> common;
  for (const char* f : {"id", "title", "description", "level", "model", "notes", "source_data"})
    for (auto& p : problemsAt(f)) common.push_back(p);
  for (auto& p : problemsAt("")) if (p.where.field.empty()) common.push_back(p);
  common_message_->showProblems(common, nullptr);

  const auto& points = document_->points();
  const ItemPoint* point = points.item(id_);
  buildAlternativeRows(alternatives());
  renderAlternativeRows(*body);
  const bool several = !shown_alternatives_.empty();
  switch (page_for(model)) {
    case assigned_page:
      if (several) {
        const json p_given = object_member(*body, "p_given");
        p_hp_->showValue(p_given.contains(casefile::kHpId) ? std::optional<json>(p_given[casefile::kHpId]) : std::nullopt);
        // P(E|Hp)'s own problems, and those of the item's probabilities as a whole (p_given
        // missing, or the two-proposition fields given instead).
        auto problems = problemsAt(std::string("p_given.") + casefile::kHpId);
        for (const char* f : {"p_given_hp", "p_given_hd"})
          for (auto& p : problemsAt(f)) problems.push_back(p);
        for (auto& p : problemsAt("p_given"))
          if (p.where.field == "p_given") problems.push_back(p);
        p_hp_->showProblems(problems);
      } else {
        p_hp_->showValue(field("p_given_hp"));
        p_hd_->showValue(field("p_given_hd"));
        p_hp_->showProblems(problemsAt("p_given_hp"));
        p_hd_->showProblems(problemsAt("p_given_hd"));
      }
      p_hp_->showMean(point && point->evaluated && point->point.log10_p_given_hp
                          ? tr("Used for the LR (the mean): %1").arg(probability_text(*point->point.log10_p_given_hp))
                          : QString());
      p_hd_->showMean(point && point->evaluated && point->point.log10_p_given_hd
                          ? tr("Used for the LR (the mean): %1").arg(probability_text(*point->point.log10_p_given_hd))
                          : QString());
      break;
    case reported_lr_page: {
      show_value(lr_, field("lr"));
      const auto interval = field("interval");
      show_value(lr_low_, interval && interval->is_array() && !interval->empty() ? std::optional<json>((*interval)[0]) : std::nullopt);
      show_value(lr_high_, interval && interval->is_array() && interval->size() > 1 ? std::optional<json>((*interval)[1]) : std::nullopt);
      show_value(lr_method_, field("method"));
      std::vector<validation::Problem> problems;
      for (const char* f : {"lr", "log10_lr", "interval", "interval_log10", "method", "alternatives"})
        for (auto& p : problemsAt(f)) problems.push_back(p);
      lr_message_->showProblems(problems, lr_);
      break;
    }
    case transfer_page: {
      std::vector<validation::Problem> problems;
      for (auto& [key, line] : transfer_fields_) {
        show_value(line, field(key));
        for (auto& p : problemsAt(key)) problems.push_back(p);
      }
      // An alternative's entry is named by the core (alternatives.Hd2.tn_hd).
      for (auto& p : problemsAt(models::kAlternativesField)) problems.push_back(p);
      transfer_message_->showProblems(problems, nullptr);
      break;
    }
    case dna_page:
    case measurement_page:
    case mixture_page:
    case data_page: {
      json fields = json::object();
      for (auto it = body->begin(); it != body->end(); ++it)
        if (!is_common(it.key())) fields[it.key()] = it.value();
      std::vector<validation::Problem> problems;
      for (auto& p : problemsAt(""))
        if (!p.where.field.empty() && !is_common(p.where.field.substr(0, p.where.field.find_first_of(".[")))) problems.push_back(p);
      const json detail = point && point->evaluated ? point->point.detail : json();
      if (page_for(model) == dna_page) {
        // The alternatives' problems are shown under their relationships.
        std::erase_if(problems, [](const validation::Problem& p) { return field_is_within(p.where.field, {"alternatives"}); });
        dna_form_->showFields(id_, fields, detail, problems);
        break;
      }
      if (page_for(model) == mixture_page) {
        mixture_form_->showAlternatives(shown_alternatives_);
        mixture_form_->showFields(id_, fields, several ? chosenDetail(mixture_form_->chosenAlternative(), detail) : detail,
                                  problems);
        break;
      }
      if (page_for(model) == measurement_page) {
        measurement_form_->showAlternatives(shown_alternatives_);
        measurement_form_->showFields(id_, fields,
                                      several ? chosenDetail(measurement_form_->chosenAlternative(), detail) : detail,
                                      problems);
        break;
      }
      const bool network = model == "network";
      data_hint_->setText(network ? tr("The network as drawn from its fields; the form below edits it one node at a time.")
                                  : tr("The model's fields as they appear in the case file."));
      network_view_->setVisible(network);
      if (network && several) {
        // The box of the proposition node names each alternative's states, as written.
        const json entries = object_member(*body, models::kAlternativesField);
        const json shared = object_member(*body, "proposition").value("hd", json());
        QStringList states;
        for (const auto& [alternative, text] : shown_alternatives_) {
          const json entry = object_member(entries, alternative.c_str());
          const json hd = entry.contains("hd") ? entry["hd"] : shared;
          states << tr("%1: %2").arg(shown(alternative), hd.is_array()    ? comma_text(hd)
                                                      : hd.is_string() ? shown(hd.get<std::string>())
                                                                       : tr("not given"));
        }
        network_view_->showNetwork(drawnNetwork(*body), id_, states.join(QStringLiteral(" · ")));
      } else if (network) {
        network_view_->showNetwork(*body, id_);
      }
      show_json_->setVisible(network);
      model_json_->setVisible(!network || show_json_->isChecked());
      const QString text = QString::fromStdString(fields.dump(2));
      if (!model_json_->hasFocus()) model_json_->showText(text);
      // A network's problems are shown once, by its form, beside the node they concern.
      data_message_->showProblems(network ? std::vector<validation::Problem>{} : problems, model_json_);
      network_form_->setVisible(model == "network");
      if (model == "network") {
        network_form_->showAlternatives(shown_alternatives_);
        network_form_->showFields(id_, fields, problems);
      }
      break;
    }
  }

  const json combination = field("combination").value_or(json::object());
  const bool included = !combination.is_object() || combination.value("included", true);
  included_->setChecked(included);
  independence_->showText(combination.is_object() ? value_text(combination.contains("independence")
                                                                   ? std::optional<json>(combination["independence"])
                                                                   : std::nullopt)
                                                  : QString());
  show_text(exclusion_reason_, combination.is_object() && combination.contains("exclusion_reason")
                                   ? value_text(combination["exclusion_reason"])
                                   : QString());
  exclusion_reason_->setEnabled(!included);
  combination_message_->showProblems(problemsAt("combination"), nullptr);

  // Guard findings in the text fields of this item.
  const auto& guard = document_->guard();
  for (auto [widget, key] : {std::pair{description_, "description"}, std::pair{notes_, "notes"}}) {
    std::vector<std::pair<int, int>> spans;
    QStringList tips;
    for (const auto* f : guard.at({store::EntityRef::item(id_), key})) {
      spans.emplace_back(f->begin(), f->end());
      tips << QString::fromStdString(f->finding.family_name + ": " + f->finding.explanation);
    }
    widget->setFindings(std::move(spans), tips.join("\n"));
  }
  rendering_ = false;
  renderResult();
}

void ItemForm::renderResult() {
  if (id_.empty()) return;
  const ItemPoint* point = document_->points().item(id_);
  if (!point || !point->evaluated) {
    result_->setText(tr("No LR yet: correct the values marked below."));
    return;
  }
  std::optional<uncertainty::SpreadSummary> spread;
  const auto& full = document_->spread();
  if (full.evaluation && !document_->spreadPending())
    for (const auto& item : full.evaluation->items)
      if (item.id == id_) spread = item.spread;
  const auto& read = document_->points().evaluated_case;
  const bool several = read && read->propositions.has_alternatives() && !point->by_alternative.empty();
  const auto& alternatives = read ? read->propositions.alternatives : std::vector<casefile::Alternative>{};
  // With several alternatives the headline LR is Hp's against the first, and it says so.
  QString text = several ? tr("<b>LR against %1: %2</b> &nbsp; log10 LR %3")
                            .arg(shown(alternatives.front().id).toHtmlEscaped(), lr_text(point->point.lr, spread),
                                 log10_text(point->point.lr.log10()))
                      : tr("<b>LR %1</b> &nbsp; log10 LR %2").arg(lr_text(point->point.lr, spread), log10_text(point->point.lr.log10()));
  if (spread) text += tr(" &nbsp; interval %1").arg(interval_text(spread));
  else if (document_->spreadPending()) text += tr(" &nbsp; <i>interval: computing…</i>");
  if (!several) {
    text += "<br>" + QString::fromStdString(point->verbal.sentence).toHtmlEscaped();
  } else {
    // One sentence per alternative, each naming it, from the item's point against it.
    for (std::size_t i = 0; i < alternatives.size() && i < point->by_alternative.size(); ++i) {
      const auto& lr = point->by_alternative[i].lr;
      text += "<br>" + tr("Against %1: LR %2 (log10 %3). %4")
                           .arg(shown(alternatives[i].id).toHtmlEscaped(), lr_text(lr, std::nullopt), log10_text(lr.log10()),
                                QString::fromStdString(read->verbal_scale.express_against(lr, alternatives[i].id).sentence)
                                    .toHtmlEscaped());
    }
  }
  if (!point->included) text += "<br><i>" + tr("Left out of the combined LR.") + "</i>";
  result_->setText(text);
}

}  // namespace counterpoise::editor

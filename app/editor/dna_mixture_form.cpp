#include "app/editor/dna_mixture_form.hpp"

#include <QBrush>
#include <QCheckBox>
#include <QComboBox>
#include <QColor>
#include <QFormLayout>
#include <QGridLayout>
#include <QGroupBox>
#include <QHeaderView>
#include <QLabel>
#include <QHBoxLayout>
#include <QLineEdit>
#include <QPushButton>
#include <QScrollBar>
#include <QSignalBlocker>
#include <QSpinBox>
#include <QTableWidget>
#include <QVBoxLayout>

#include <algorithm>

#include "app/editor/display_text.hpp"
#include "app/editor/dropout_curve_chart.hpp"
#include "app/editor/edit_commands.hpp"
#include "app/editor/field_widgets.hpp"
#include "app/editor/frequency_source_box.hpp"
#include "core/models/dna/str_loci.hpp"
#include "core/numbers/likelihood_ratio.hpp"
#include "core/numbers/number_text.hpp"

namespace counterpoise::editor {

using nlohmann::json;

namespace {

// The most people a proposition may name (the model's limit, docs/methods.md "DNA mixtures").
constexpr int kMostContributors = 4;

QString q(const std::string& text) { return QString::fromStdString(text); }
// Numbers through the one formatter for readers (core/numbers/number_text).
QString d_text(double d) { return q(numbers::entered_for_readers(d)); }
QString share_text(double share) { return q(numbers::decimal_for_readers(100.0 * share, 2)) + QStringLiteral(" %"); }

// The LR of one locus as the core states it (a finite log10 LR, zero, infinite or undefined).
QString locus_lr_text(const json& lr) {
  const std::string state = lr.value("state", std::string());
  if (state == "finite") {
    const double log10_lr = lr.value("log10_lr", 0.0);
    return QObject::tr("%1 (log10 %2)").arg(lr_text(numbers::LikelihoodRatio::from_log10(log10_lr), std::nullopt), q(numbers::log10_for_readers(log10_lr)));
  }
  if (state == "zero") return lr_text(numbers::LikelihoodRatio::zero(), std::nullopt);
  if (state == "infinite") return lr_text(numbers::LikelihoodRatio::infinite(), std::nullopt);
  return QObject::tr("undefined: the alleles are impossible under both propositions");
}

// One proposition's unknown genotypes at a locus: how many sets were summed over and the one
// with the largest share of the locus probability.
QString genotype_sets_text(const char* side, const json& reading) {
  const int sets = reading.value("genotype_sets", 0);
  QString text = sets == 1 ? QObject::tr("%1: 1 set").arg(side) : QObject::tr("%1: %2 sets").arg(side, q(numbers::count_for_readers(sets)));
  const json leading = reading.value("leading_genotype_sets", json::array());
  if (sets > 1 && leading.is_array() && !leading.empty()) {
    QStringList genotypes;
    for (const auto& g : leading[0].value("unknown_genotypes", json::array())) genotypes << q(g.get<std::string>());
    text += QObject::tr(", largest %1 (%2)").arg(genotypes.join(QStringLiteral(" + ")), share_text(leading[0].value("share", 0.0)));
  }
  return text;
}

// Every leading genotype set of one proposition, one a line, for the cell's tooltip.
QString leading_sets_text(const char* side, const json& reading) {
  QStringList lines;
  for (const auto& set : reading.value("leading_genotype_sets", json::array())) {
    QStringList genotypes;
    for (const auto& g : set.value("unknown_genotypes", json::array())) genotypes << q(g.get<std::string>());
    if (genotypes.isEmpty()) continue;
    lines << QObject::tr("%1: %2 — %3").arg(side, genotypes.join(QStringLiteral(" + ")), share_text(set.value("share", 0.0)));
  }
  return lines.join('\n');
}

QSpinBox* count_box(QWidget* parent, const QString& name, int minimum) {
  auto* box = new QSpinBox(parent);
  box->setObjectName(name);
  box->setRange(minimum, kMostContributors);
  // Typing a number is one change when it is committed, not one per keystroke.
  box->setKeyboardTracking(false);
  box->setFocusPolicy(Qt::StrongFocus);
  return box;
}

}  // namespace

DnaMixtureForm::DnaMixtureForm(EditFacade* edits, QWidget* parent) : QWidget(parent), edits_(edits) {
  setObjectName("mixture_form");
  auto* layout = new QVBoxLayout(this);
  layout->setContentsMargins(0, 0, 0, 0);
  layout->addWidget(buildSettings());
  layout->addWidget(buildLoci(), 1);
  layout->addWidget(buildContributors());
  layout->addWidget(buildCurve());
  frequencies_box_ = new FrequencySourceBox("mixture", this);
  layout->addWidget(frequencies_box_);
  connect(frequencies_box_, &FrequencySourceBox::importRequested, this, &DnaMixtureForm::importRequested);
  connect(frequencies_box_, &FrequencySourceBox::edited, this, [this](const json& frequencies) { setField("frequencies", frequencies); });
}

QWidget* DnaMixtureForm::buildSettings() {
  auto* box = new QWidget(this);
  auto* form = new QFormLayout(box);
  form->setContentsMargins(0, 0, 0, 0);
  theta_ = new_line_field(box, "mixture_theta", tr("e.g. 0.01; 0 for the product rule"),
                          tr("The coancestry coefficient θ (FST) of the sampling formula, in [0, 1): it allows for the "
                             "contributors sharing ancestry in a subpopulation."));
  form->addRow(tr("&Theta (θ)"), theta_);
  dropin_ = new_line_field(box, "mixture_dropin", tr("e.g. 0.05; 0 for no drop-in"),
                           tr("The drop-in probability c per locus: an allele drops in with probability c times its "
                              "frequency, none drops in with probability 1 − c."));
  form->addRow(tr("Drop-&in probability (c)"), dropin_);
  dropout_ = new_line_field(box, "mixture_dropout", tr("e.g. 0.1, or a distribution such as {\"beta\": [2, 14]}"),
                            tr("The drop-out probability d of an allele of a heterozygous contributor: a number in [0, 1], "
                               "or a distribution as for assigned probabilities (JSON), over which the LR is averaged."));
  form->addRow(tr("Drop-&out probability (d)"), dropout_);
  dropout_words_ = new QLabel(box);
  dropout_words_->setObjectName("mixture_dropout_words");
  dropout_words_->setWordWrap(true);
  form->addRow(QString(), dropout_words_);
  dropout_homozygote_ = new_line_field(box, "mixture_dropout_homozygote", tr("automatic: d²"),
                                       tr("The probability that the allele of a homozygous contributor drops out, in "
                                          "[0, 1]. Left empty, it is d²."));
  form->addRow(tr("Drop-out of a &homozygote"), dropout_homozygote_);
  min_frequency_ = new_minimum_frequency_field(box, "mixture_min_frequency");
  form->addRow(tr("&Minimum allele frequency"), min_frequency_);
  settings_message_ = new FieldMessage(box);
  form->addRow(settings_message_);

  commit_typing(theta_, [this](const QString& text) { setField("theta", number_or_text(text)); });
  commit_typing(dropin_, [this](const QString& text) { setField("dropin", number_or_text(text)); });
  commit_typing(dropout_, [this](const QString& text) {
    const QString trimmed = text.trimmed();
    if (trimmed.startsWith('{')) {
      // A distribution; text that is not JSON stays text, which the core's reader names.
      const json parsed = json::parse(trimmed.toStdString(), nullptr, false);
      setField("dropout", parsed.is_discarded() ? json(trimmed.toStdString()) : parsed);
      return;
    }
    setField("dropout", number_or_text(trimmed));
  });
  commit_typing(dropout_homozygote_, [this](const QString& text) { setField("dropout_homozygote", optional_number_or_text(text)); });
  commit_typing(min_frequency_, [this](const QString& text) { setField("min_allele_frequency", optional_number_or_text(text)); });
  return box;
}

QWidget* DnaMixtureForm::buildLoci() {
  auto* box = new QGroupBox(tr("Observed alleles and reference profiles"), this);
  auto* layout = new QVBoxLayout(box);
  loci_ = new QTableWidget(0, 2, box);
  loci_->setObjectName("mixture_loci");
  loci_->setToolTip(tr("Alleles separated by commas, e.g. \"12, 13, 15\"; a reference's genotype as two alleles, or one "
                       "for a homozygote."));
  loci_->verticalHeader()->setVisible(false);
  loci_->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
  loci_->horizontalHeader()->setStretchLastSection(true);
  // One line a locus: the readings are short, their detail is in the tooltips.
  loci_->setWordWrap(false);
  loci_->setVerticalScrollBarPolicy(Qt::ScrollBarAlwaysOff);
  layout->addWidget(loci_);
  layout->addWidget(buildTableButtons(box));
  loci_message_ = new FieldMessage(box);
  layout->addWidget(loci_message_);
  connect(loci_, &QTableWidget::currentCellChanged, this, [this] { updateTableButtons(); });
  connect(loci_, &QTableWidget::cellChanged, this, [this](int row, int column) {
    if (rendering_ || column < ObservedColumn || column >= lrColumn()) return;
    editing_cell_ = true;
    setAlleles(row, column);
    editing_cell_ = false;
  });
  return box;
}

QWidget* DnaMixtureForm::buildTableButtons(QWidget* parent) {
  auto* row = new QWidget(parent);
  auto* layout = new QHBoxLayout(row);
  layout->setContentsMargins(0, 0, 0, 0);
  new_locus_ = new_locus_picker(row, "mixture_new_locus");
  new_locus_->setMinimumWidth(140);
  add_locus_ = new QPushButton(tr("Add &locus"), row);
  add_locus_->setObjectName("mixture_add_locus");
  remove_locus_ = new QPushButton(tr("Remove locus"), row);
  remove_locus_->setObjectName("mixture_remove_locus");
  remove_locus_->setToolTip(tr("Removes the selected row's locus from the observed profile and every reference profile."));
  new_person_ = new_line_field(row, "mixture_new_person", tr("name, e.g. Ms Venn"),
                               tr("The name of a person whose reference profile is to be added."));
  add_person_ = new QPushButton(tr("Add &person"), row);
  add_person_->setObjectName("mixture_add_person");
  remove_person_ = new QPushButton(tr("Remove person"), row);
  remove_person_->setObjectName("mixture_remove_person");
  remove_person_->setToolTip(tr("Removes the selected column's person: their reference profile, and them as a "
                                "contributor under Hp and Hd."));
  for (QWidget* w : std::initializer_list<QWidget*>{new_locus_, add_locus_, remove_locus_, new_person_, add_person_, remove_person_})
    layout->addWidget(w);
  layout->addStretch(1);
  connect(add_locus_, &QPushButton::clicked, this, [this] { addLocus(); });
  connect(remove_locus_, &QPushButton::clicked, this, [this] { removeCurrentLocus(); });
  connect(add_person_, &QPushButton::clicked, this, [this] { addPerson(); });
  connect(new_person_, &QLineEdit::returnPressed, this, [this] { addPerson(); });
  connect(remove_person_, &QPushButton::clicked, this, [this] { removeCurrentPerson(); });
  connect(new_locus_, &QComboBox::editTextChanged, this, [this] { updateTableButtons(); });
  connect(new_person_, &QLineEdit::textChanged, this, [this] { updateTableButtons(); });
  return row;
}

void DnaMixtureForm::updateTableButtons() {
  const int row = loci_->currentRow(), column = loci_->currentColumn();
  const QString locus = new_locus_->currentText().trimmed(), person = new_person_->text().trimmed();
  add_locus_->setEnabled(!locus.isEmpty() && rowOfLocus(locus) < 0);
  remove_locus_->setEnabled(row >= 0 && row < static_cast<int>(row_loci_.size()));
  add_person_->setEnabled(!person.isEmpty() && columnOfReference(person) < 0);
  remove_person_->setEnabled(column >= FirstReferenceColumn && column < lrColumn());
}

void DnaMixtureForm::setModelFields(const json& fields) {
  if (rendering_ || id_.empty()) return;
  edits_->setItemModelFields(id_, fields);
}

void DnaMixtureForm::addLocus() {
  const std::string locus = new_locus_->currentText().trimmed().toStdString();
  if (locus.empty() || rowOfLocus(q(locus)) >= 0) return;
  // No allele yet at the new locus, and none typed for the people: the core names what is missing.
  json observed = object_field("observed");
  observed[locus] = json::array();
  setField("observed", observed);
}

void DnaMixtureForm::removeCurrentLocus() {
  const int row = loci_->currentRow();
  if (row < 0 || row >= static_cast<int>(row_loci_.size())) return;
  const std::string locus = row_loci_[static_cast<std::size_t>(row)];
  json fields = fields_;
  for (const char* key : {"observed", "uncertain"})
    if (fields.contains(key) && fields[key].is_object()) fields[key].erase(locus);
  if (fields.contains("uncertain") && fields["uncertain"].is_object() && fields["uncertain"].empty()) fields.erase("uncertain");
  if (fields.contains("references") && fields["references"].is_object())
    for (auto& profile : fields["references"])
      if (profile.is_object()) profile.erase(locus);
  setModelFields(fields);
}

void DnaMixtureForm::addPerson() {
  const std::string person = new_person_->text().trimmed().toStdString();
  if (person.empty() || columnOfReference(q(person)) >= 0) return;
  json fields = fields_;
  fields["references"] = object_field("references");
  fields["references"][person] = json::object();
  new_person_->clear();
  setModelFields(fields);
}

void DnaMixtureForm::removeCurrentPerson() {
  const int column = loci_->currentColumn();
  if (column < FirstReferenceColumn || column >= lrColumn()) return;
  const std::string person = reference_names_[static_cast<std::size_t>(column - FirstReferenceColumn)];
  json fields = fields_;
  if (fields.contains("references") && fields["references"].is_object()) fields["references"].erase(person);
  auto leave_out = [&person](json& proposition) {
    if (!proposition.is_object() || !proposition.contains("contributors")) return;
    json& list = proposition["contributors"];
    if (list.is_array()) list.erase(std::remove(list.begin(), list.end(), json(person)), list.end());
  };
  for (const char* side : {"hp", "hd"})
    if (fields.contains(side)) leave_out(fields[side]);
  // ...and from the contributors under each alternative, in the same one change.
  if (fields.contains("alternatives") && fields["alternatives"].is_object())
    for (auto& entry : fields["alternatives"])
      if (entry.is_object() && entry.contains("hd")) leave_out(entry["hd"]);
  if (fields.contains("dropout_by_contributor") && fields["dropout_by_contributor"].is_object()) {
    fields["dropout_by_contributor"].erase(person);
    if (fields["dropout_by_contributor"].empty()) fields.erase("dropout_by_contributor");
  }
  setModelFields(fields);
}

QWidget* DnaMixtureForm::buildContributors() {
  auto* box = new QGroupBox(tr("Contributors under each proposition"), this);
  auto* layout = new QVBoxLayout(box);
  hd_chooser_ = new AlternativeChooser(tr("Contributors under the alternative"), "mixture_alternative", box);
  layout->addWidget(hd_chooser_);
  connect(hd_chooser_, &AlternativeChooser::chosenChanged, this, &DnaMixtureForm::alternativeChosen);
  auto* people = new QWidget(box);
  contributors_grid_ = new QGridLayout(people);
  contributors_grid_->setContentsMargins(0, 0, 0, 0);
  layout->addWidget(people);

  auto* counts = new QGridLayout;
  hp_unknowns_ = count_box(box, "mixture_hp_unknowns", 0);
  hd_unknowns_ = count_box(box, "mixture_hd_unknowns", 0);
  hp_stated_ = count_box(box, "mixture_hp_stated", 0);
  hd_stated_ = count_box(box, "mixture_hd_stated", 0);
  for (QSpinBox* stated : {hp_stated_, hd_stated_}) {
    stated->setSpecialValueText(tr("not stated"));
    stated->setToolTip(tr("The number of contributors the profile shows, if stated: it must equal the named people "
                          "plus the unknown people."));
  }
  for (QSpinBox* unknowns : {hp_unknowns_, hd_unknowns_})
    unknowns->setToolTip(tr("How many contributors are people not named (unknown, unrelated to the named people)."));
  hp_total_ = new QLabel(box);
  hd_total_ = new QLabel(box);
  hd_counts_heading_ = new QLabel(box);
  hd_counts_heading_->setObjectName("mixture_shared_hd_note");
  hd_counts_heading_->setWordWrap(true);
  counts->addWidget(new QLabel(tr("Unknown people"), box), 0, 0);
  counts->addWidget(hp_unknowns_, 0, 1);
  counts->addWidget(hd_unknowns_, 0, 2);
  counts->addWidget(new QLabel(tr("Stated number of contributors"), box), 1, 0);
  counts->addWidget(hp_stated_, 1, 1);
  counts->addWidget(hd_stated_, 1, 2);
  counts->addWidget(new QLabel(tr("Contributors in all"), box), 2, 0);
  counts->addWidget(hp_total_, 2, 1);
  counts->addWidget(hd_total_, 2, 2);
  for (QGridLayout* grid : {contributors_grid_, counts}) {
    grid->setColumnMinimumWidth(0, 240);
    grid->setColumnMinimumWidth(1, 170);
    grid->setColumnMinimumWidth(2, 170);
    grid->setColumnStretch(3, 1);
  }
  layout->addLayout(counts);
  layout->addWidget(hd_counts_heading_);
  contributors_message_ = new FieldMessage(box);
  layout->addWidget(contributors_message_);

  for (auto [spin, side, key] : {std::tuple{hp_unknowns_, "hp", "unknowns"}, std::tuple{hd_unknowns_, "hd", "unknowns"},
                                 std::tuple{hp_stated_, "hp", "number_of_contributors"},
                                 std::tuple{hd_stated_, "hd", "number_of_contributors"}}) {
    const char* s = side;
    const char* k = key;
    connect(spin, &QSpinBox::valueChanged, this, [this, s, k](int value) { setProposition(s, k, value); });
  }
  return box;
}

QWidget* DnaMixtureForm::buildCurve() {
  auto* box = curve_box_ = new QGroupBox(tr("The LR over the drop-out probability"), this);
  auto* layout = new QVBoxLayout(box);
  curve_ = new DropoutCurveChart(box);
  curve_->setToolTip(tr("log10 LR of the whole profile for each drop-out probability d from 0 to 1; the circle marks the "
                        "d with the lowest LR, the dashed line the d the loci above are read at."));
  layout->addWidget(curve_);
  curve_summary_ = new QLabel(box);
  curve_summary_->setObjectName("mixture_curve_summary");
  curve_summary_->setWordWrap(true);
  curve_summary_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  layout->addWidget(curve_summary_);
  return box;
}

void DnaMixtureForm::showAlternatives(const AlternativeList& alternatives) { hd_chooser_->showAlternatives(alternatives); }

json DnaMixtureForm::proposition(const char* side) const {
  if (std::string(side) != "hd" || !hd_chooser_->several()) return object_field(side);
  const json entry = object_member(object_field("alternatives"), hd_chooser_->chosen().c_str());
  return entry.contains("hd") && entry["hd"].is_object() ? entry["hd"] : object_field("hd");
}

void DnaMixtureForm::setPropositionValue(const char* side, const json& value) {
  if (std::string(side) != "hd" || !hd_chooser_->several()) {
    setField(side, value);
    return;
  }
  // The chosen alternative's entry, the rest of the item's entries as they are: one change.
  json entries = object_field("alternatives");
  json entry = object_member(entries, hd_chooser_->chosen().c_str());
  entry["hd"] = value;
  entries[hd_chooser_->chosen()] = entry;
  setField("alternatives", entries);
}

void DnaMixtureForm::useFrequencyFile(const QString& relative_path) { frequencies_box_->useFile(relative_path); }

QLabel* DnaMixtureForm::frequencySource() const { return frequencies_box_->sourceLabel(); }

void DnaMixtureForm::showFields(const std::string& item_id, const json& fields, const json& detail,
                                const std::vector<validation::Problem>& problems) {
  id_ = item_id;
  fields_ = fields;
  detail_ = detail;
  problems_ = problems;
  render_after_cell_edit(this, editing_cell_, [this] { render(); });
}

json DnaMixtureForm::object_field(const char* key) const { return object_member(fields_, key); }

int DnaMixtureForm::rowOfLocus(const QString& locus) const { return index_of(row_loci_, locus); }

int DnaMixtureForm::columnOfReference(const QString& name) const {
  const int index = index_of(reference_names_, name);
  return index < 0 ? -1 : FirstReferenceColumn + index;
}

QCheckBox* DnaMixtureForm::contributorBox(const char* side, const QString& name) const {
  const auto it = contributor_boxes_.find(name.toStdString());
  if (it == contributor_boxes_.end()) return nullptr;
  return std::string(side) == "hp" ? it->second.first : it->second.second;
}

void DnaMixtureForm::render() {
  rendering_ = true;
  for (auto [line, key] : {std::pair{theta_, "theta"}, std::pair{dropin_, "dropin"},
                           std::pair{dropout_homozygote_, "dropout_homozygote"}, std::pair{min_frequency_, "min_allele_frequency"}})
    show_value(line, fields_.contains(key) ? std::optional<json>(fields_[key]) : std::nullopt);
  const json dropout = fields_.value("dropout", json());
  if (dropout.is_object() || dropout.is_array()) {
    // A distribution is shown as its JSON, on one line; left alone when it already reads so.
    const json shown = json::parse(dropout_->text().toStdString(), nullptr, false);
    // (A discarded parse compares unequal to nothing, so it is tested for on its own.)
    if (!typing_pending(dropout_) && (shown.is_discarded() || shown != dropout)) dropout_->setText(q(dropout.dump()));
  } else {
    show_value(dropout_, dropout.is_null() ? std::nullopt : std::optional<json>(dropout));
  }
  QString words;
  if (detail_.is_object() && detail_.contains("dropout")) {
    const json& d = detail_["dropout"];
    words = d.value("integrated", false)
                ? tr("%1: the LR averages over it. The loci below are read at its mean, d = %2.")
                      .arg(q(d.value("assignment", std::string())), d_text(d.value("point", 0.0)))
                : tr("d = %1 for every locus.").arg(d_text(d.value("point", 0.0)));
  }
  dropout_words_->setText(words);
  dropout_words_->setVisible(!words.isEmpty());

  renderTable();
  renderContributors();
  renderCurve();
  showProblems();
  offer_loci(new_locus_, object_field("observed"));
  updateTableButtons();
  rendering_ = false;
}

void DnaMixtureForm::renderTable() {
  const json observed = object_field("observed");
  const json references = object_field("references");
  row_loci_.clear();
  for (auto it = observed.begin(); it != observed.end(); ++it) row_loci_.push_back(it.key());
  reference_names_.clear();
  for (auto it = references.begin(); it != references.end(); ++it) reference_names_.push_back(it.key());

  const json uncertain = object_field("uncertain");
  QStringList headers{tr("Locus"), tr("Observed alleles"), tr("Uncertain")};
  for (const auto& name : reference_names_) headers << q(name);
  const double d = detail_.is_object() && detail_.contains("dropout") ? detail_["dropout"].value("point", 0.0) : 0.0;
  const QString against = hd_chooser_->several() ? tr(" against %1").arg(hd_chooser_->chosenName()) : QString();
  headers << (detail_.is_object() ? tr("LR of the locus%1 at d = %2").arg(against, d_text(d)) : tr("LR of the locus%1").arg(against))
          << tr("Genotype sets of the unknowns summed over");
  const int current_row = loci_->currentRow(), current_column = loci_->currentColumn();
  loci_->setColumnCount(static_cast<int>(headers.size()));
  loci_->setHorizontalHeaderLabels(headers);
  loci_->horizontalHeaderItem(UncertainColumn)
      ->setToolTip(tr("Alleles below the threshold, marked uncertain: taken as neither seen nor missing (no drop-out "
                      "for a contributor who carries one, no drop-in if nobody does)."));
  loci_->setRowCount(static_cast<int>(row_loci_.size()));
  for (std::size_t r = 0; r < row_loci_.size(); ++r) {
    const std::string& locus = row_loci_[r];
    const int row = static_cast<int>(r);
    auto set = [&](int column, const QString& text, bool editable) {
      auto* cell = new QTableWidgetItem(text);
      if (!editable) cell->setFlags(Qt::ItemIsEnabled | Qt::ItemIsSelectable);
      loci_->setItem(row, column, cell);
    };
    set(LocusColumn, q(locus), false);
    set(ObservedColumn, comma_text(observed[locus]), true);
    set(UncertainColumn, uncertain.contains(locus) ? comma_text(uncertain[locus]) : QString(), true);
    for (std::size_t p = 0; p < reference_names_.size(); ++p) {
      const json& profile = references[reference_names_[p]];
      const bool typed = profile.is_object() && profile.contains(locus);
      set(FirstReferenceColumn + static_cast<int>(p), typed ? comma_text(profile[locus]) : QString(), true);
    }
    set(lrColumn(), {}, false);
    set(genotypeSetsColumn(), {}, false);
  }
  if (current_row >= 0 && current_row < loci_->rowCount() && current_column < loci_->columnCount())
    loci_->setCurrentCell(current_row, current_column);
  renderReadings();
  fit_table_to_rows(loci_);
}

void DnaMixtureForm::renderReadings() {
  std::map<std::string, const json*> by_locus;
  if (detail_.is_object() && detail_.contains("loci"))
    for (const auto& row : detail_["loci"]) by_locus[row.value("locus", std::string())] = &row;
  for (std::size_t r = 0; r < row_loci_.size(); ++r) {
    const int row = static_cast<int>(r);
    const auto it = by_locus.find(row_loci_[r]);
    QString lr, sets, tip;
    if (it != by_locus.end()) {
      const json& reading = *it->second;
      lr = locus_lr_text(reading.value("lr", json()));
      if (reading.value("lr", json()).value("state", std::string()) == "finite")
        loci_->item(row, lrColumn())->setData(Qt::UserRole, reading["lr"]["log10_lr"].get<double>());
      const std::string hd_name = hd_chooser_->chosenName().toStdString();
      sets = genotype_sets_text("Hp", reading.value("hp", json::object())) + QStringLiteral("; ") +
             genotype_sets_text(hd_name.c_str(), reading.value("hd", json::object()));
      tip = (leading_sets_text("Hp", reading.value("hp", json::object())) + '\n' +
             leading_sets_text(hd_name.c_str(), reading.value("hd", json::object())))
                .trimmed();
    } else if (models::dna::is_amelogenin(row_loci_[r])) {
      lr = tr("sex marker: not used");
    }
    loci_->item(row, lrColumn())->setText(lr);
    loci_->item(row, genotypeSetsColumn())->setText(sets);
    loci_->item(row, genotypeSetsColumn())->setToolTip(tip.isEmpty() ? QString() : tr("The largest shares of the locus probability:\n") + tip);
  }
}

void DnaMixtureForm::renderContributors() {
  const json hp = proposition("hp"), hd = proposition("hd");
  if (contributor_rows_ != reference_names_) {
    // The people changed: one row of check boxes per reference, in the references' order.
    while (QLayoutItem* item = contributors_grid_->takeAt(0)) {
      delete item->widget();
      delete item;
    }
    contributor_boxes_.clear();
    own_dropout_fields_.clear();
    QWidget* parent = contributors_grid_->parentWidget();
    contributors_grid_->addWidget(new QLabel(tr("<b>Person</b>"), parent), 0, 0);
    contributors_grid_->addWidget(new QLabel(tr("<b>Under Hp</b>"), parent), 0, 1);
    hd_heading_ = new QLabel(parent);
    contributors_grid_->addWidget(hd_heading_, 0, 2);
    contributors_grid_->addWidget(new QLabel(tr("<b>Own drop-out probability</b>"), parent), 0, 3);
    int row = 1;
    for (const auto& name : reference_names_) {
      contributors_grid_->addWidget(new QLabel(q(name), parent), row, 0);
      auto* under_hp = new QCheckBox(tr("contributor"), parent);
      auto* under_hd = new QCheckBox(tr("contributor"), parent);
      under_hp->setToolTip(tr("%1 is a contributor to the mixture if Hp is true.").arg(q(name)));
      contributors_grid_->addWidget(under_hp, row, 1);
      contributors_grid_->addWidget(under_hd, row, 2);
      auto* own = new_line_field(parent, QString(), tr("shared d"),
                                 tr("%1's own drop-out probability, a number in [0, 1] (for example lower for a major "
                                    "contributor); empty: the shared d. The curve over d keeps it fixed.")
                                     .arg(q(name)));
      own->setMaximumWidth(170);
      contributors_grid_->addWidget(own, row, 3);
      commit_typing(own, [this, name](const QString& text) { setOwnDropout(name, text); });
      own_dropout_fields_[name] = own;
      connect(under_hp, &QCheckBox::clicked, this, [this, name](bool on) { setContributor("hp", name, on); });
      connect(under_hd, &QCheckBox::clicked, this, [this, name](bool on) { setContributor("hd", name, on); });
      contributor_boxes_[name] = {under_hp, under_hd};
      ++row;
    }
    contributor_rows_ = reference_names_;
  }
  auto named = [](const json& proposition, const std::string& name) {
    const json list = proposition.value("contributors", json::array());
    return list.is_array() && std::find(list.begin(), list.end(), json(name)) != list.end();
  };
  for (auto& [name, boxes] : contributor_boxes_) {
    boxes.first->setChecked(named(hp, name));
    boxes.second->setChecked(named(hd, name));
  }
  // With several alternatives the Hd column is the chosen alternative's contributors.
  const QString hd_name = hd_chooser_->chosenName();
  if (hd_heading_) hd_heading_->setText(tr("<b>Under %1</b>").arg(hd_name.toHtmlEscaped()));
  for (auto& [name, boxes] : contributor_boxes_)
    boxes.second->setToolTip(tr("%1 is a contributor to the mixture if %2 is true.").arg(q(name), hd_name));
  const bool shared_default = hd_chooser_->several() &&
                              !object_member(object_field("alternatives"), hd_chooser_->chosen().c_str()).contains("hd");
  hd_counts_heading_->setVisible(shared_default);
  hd_counts_heading_->setText(
      object_field("hd").empty()
          ? tr("<i>%1 has no contributors of its own yet: tick them and give the unknown people here.</i>").arg(hd_name.toHtmlEscaped())
          : tr("<i>%1 has no contributors of its own: the column shows the ones every alternative shares (hd), and a "
               "change here gives %1 its own.</i>")
                .arg(hd_name.toHtmlEscaped()));
  const json own = object_field("dropout_by_contributor");
  for (auto& [name, field] : own_dropout_fields_)
    show_value(field, own.contains(name) ? std::optional<json>(own[name]) : std::nullopt);
  for (auto [proposition, unknowns, stated, total] : {std::tuple{&hp, hp_unknowns_, hp_stated_, hp_total_},
                                                      std::tuple{&hd, hd_unknowns_, hd_stated_, hd_total_}}) {
    const QSignalBlocker quiet_unknowns(unknowns), quiet_stated(stated);
    const json u = proposition->value("unknowns", json(0));
    const json n = proposition->value("number_of_contributors", json(0));
    unknowns->setValue(u.is_number_integer() ? u.get<int>() : 0);
    stated->setValue(n.is_number_integer() ? n.get<int>() : 0);
    const json list = proposition->value("contributors", json::array());
    const int people = (list.is_array() ? static_cast<int>(list.size()) : 0) + unknowns->value();
    total->setText(q(numbers::count_for_readers(people)));
  }
}

void DnaMixtureForm::renderCurve() {
  const DropoutCurveData data = DropoutCurveData::from_detail(detail_);
  curve_->showCurve(data);
  QString text;
  if (detail_.is_object() && detail_.contains("dropout_curve")) {
    const json minimum = detail_["dropout_curve"].value("minimum", json::object());
    text = tr("Lowest LR over d: %1 at d = %2.").arg(locus_lr_text(minimum.value("lr", json())), d_text(minimum.value("dropout", 0.0)));
    if (detail_.contains("lr_at_point_dropout") && detail_.contains("dropout"))
      text += ' ' + tr("At d = %1: %2.").arg(d_text(detail_["dropout"].value("point", 0.0)), locus_lr_text(detail_["lr_at_point_dropout"]));
    auto d_list = [](const std::vector<double>& ds) {
      QStringList parts;
      for (double d : ds) parts << d_text(d);
      return parts.join(QStringLiteral(", "));
    };
    if (!data.zero.empty())
      text += ' ' + tr("The LR is 0 at d = %1 (ticks on the bottom edge): an allele of a person named under Hp is not "
                       "observed, and so small a d does not let it drop out.")
                        .arg(d_list(data.zero));
    if (!data.other.empty())
      text += ' ' + tr("Not drawn: d = %1, where the LR is infinite or undefined.").arg(d_list(data.other));
  }
  if (hd_chooser_->several() && !text.isEmpty()) text = tr("Against %1: %2").arg(hd_chooser_->chosenName(), text);
  curve_summary_->setText(text);
  curve_box_->setTitle(hd_chooser_->several()
                           ? tr("The LR of Hp against %1 over the drop-out probability").arg(hd_chooser_->chosenName())
                           : tr("The LR over the drop-out probability"));
}

std::optional<std::pair<std::string, int>> DnaMixtureForm::cell_of(const std::string& field) const {
  auto locus_in = [](const std::string& rest) { return rest.substr(0, rest.find('[')); };
  if (field.rfind("observed.", 0) == 0) return std::pair{locus_in(field.substr(9)), static_cast<int>(ObservedColumn)};
  if (field.rfind("uncertain.", 0) == 0) return std::pair{locus_in(field.substr(10)), static_cast<int>(UncertainColumn)};
  if (field.rfind("references.", 0) != 0) return std::nullopt;
  const std::string rest = field.substr(11);
  for (std::size_t p = 0; p < reference_names_.size(); ++p) {
    const std::string& name = reference_names_[p];
    if (rest.rfind(name, 0) != 0) continue;
    const int column = FirstReferenceColumn + static_cast<int>(p);
    if (rest.size() == name.size()) return std::pair{std::string(), column};
    if (rest[name.size()] == '.') return std::pair{locus_in(rest.substr(name.size() + 1)), column};
  }
  return std::nullopt;
}

void DnaMixtureForm::showProblems() {
  std::vector<validation::Problem> settings, loci, contributors, frequencies;
  for (int row = 0; row < loci_->rowCount(); ++row)
    for (int column = ObservedColumn; column < lrColumn(); ++column) {
      loci_->item(row, column)->setBackground(QBrush());
      loci_->item(row, column)->setToolTip({});
    }
  for (validation::Problem p : problems_) {
    const std::string& f = p.where.field;
    if (field_is_within(f, {"hp", "hd", "dropout_by_contributor", "alternatives"})) {
      contributors.push_back(p);
    } else if (field_is_within(f, {"frequencies"})) {
      frequencies.push_back(p);
    } else if (field_is_within(f, {"observed", "uncertain", "references"})) {
      // Named by locus and column, and the cell tinted with the message as its tooltip.
      if (const auto cell = cell_of(f)) {
        const auto& [locus, column] = *cell;
        const QString part = column == ObservedColumn    ? tr("observed alleles")
                             : column == UncertainColumn ? tr("uncertain alleles")
                                                         : tr("reference profile of %1").arg(q(reference_names_[column - FirstReferenceColumn]));
        if (!locus.empty() && p.message.find(locus) == std::string::npos)
          p.message = tr("At %1, %2: ").arg(q(locus), part).toStdString() + p.message;
        if (const int row = rowOfLocus(q(locus)); row >= 0) {
          loci_->item(row, column)->setBackground(QColor(255, 225, 225));
          loci_->item(row, column)->setToolTip(q(p.message));
        }
      }
      loci.push_back(p);
    } else {
      settings.push_back(p);
    }
  }
  settings_message_->showProblems(settings, nullptr);
  loci_message_->showProblems(loci, loci_);
  contributors_message_->showProblems(contributors, nullptr);
  frequencies_box_->showFrequencies(fields_.value("frequencies", json()), frequencies);
}

void DnaMixtureForm::setField(const std::string& field, std::optional<json> value) {
  if (rendering_ || id_.empty()) return;
  edits_->setItemField(id_, field, std::move(value));
}

void DnaMixtureForm::setAlleles(int row, int column) {
  if (row < 0 || row >= static_cast<int>(row_loci_.size())) return;
  const std::string& locus = row_loci_[static_cast<std::size_t>(row)];
  const json alleles = allele_list(loci_->item(row, column)->text());
  if (column == ObservedColumn) {
    // No allele seen at a locus is a finding too (every allele dropped out); the core reads it.
    json observed = object_field("observed");
    observed[locus] = alleles;
    setField("observed", observed);
    return;
  }
  if (column == UncertainColumn) {
    json uncertain = object_field("uncertain");
    if (alleles.empty()) uncertain.erase(locus);
    else uncertain[locus] = alleles;
    setField("uncertain", uncertain.empty() ? std::nullopt : std::optional<json>(uncertain));
    return;
  }
  const std::string& person = reference_names_[static_cast<std::size_t>(column - FirstReferenceColumn)];
  json references = object_field("references");
  json profile = references.value(person, json::object());
  if (!profile.is_object()) profile = json::object();
  // An empty cell is a locus the person was not typed at; the core names it if it is needed.
  if (alleles.empty()) profile.erase(locus);
  else profile[locus] = alleles;
  references[person] = profile;
  setField("references", references);
}

void DnaMixtureForm::setContributor(const char* side, const std::string& name, bool contributes) {
  json proposition = this->proposition(side);
  json list = proposition.value("contributors", json::array());
  if (!list.is_array()) list = json::array();
  const auto at = std::find(list.begin(), list.end(), json(name));
  if (contributes && at == list.end()) list.push_back(name);
  if (!contributes && at != list.end()) list.erase(at);
  proposition["contributors"] = list;
  setPropositionValue(side, proposition);
}

void DnaMixtureForm::setOwnDropout(const std::string& name, const QString& text) {
  json own = object_field("dropout_by_contributor");
  const std::optional<json> value = optional_number_or_text(text);
  if (value) own[name] = *value;
  else own.erase(name);
  setField("dropout_by_contributor", own.empty() ? std::nullopt : std::optional<json>(own));
}

QLineEdit* DnaMixtureForm::ownDropoutField(const QString& name) const {
  const auto it = own_dropout_fields_.find(name.toStdString());
  return it == own_dropout_fields_.end() ? nullptr : it->second;
}

void DnaMixtureForm::setProposition(const char* side, const char* key, int value) {
  if (rendering_) return;
  json proposition = this->proposition(side);
  // A stated number of contributors of 0 is "not stated".
  if (std::string(key) == "number_of_contributors" && value == 0) proposition.erase(key);
  else proposition[key] = value;
  setPropositionValue(side, proposition);
}

}  // namespace counterpoise::editor

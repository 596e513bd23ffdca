#include "app/editor/dna_profile_form.hpp"

#include <QBrush>
#include <QColor>
#include <QComboBox>
#include <QFormLayout>
#include <QGroupBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QLineEdit>
#include <QPushButton>
#include <QScrollBar>
#include <QTableWidget>
#include <QTimer>
#include <QVBoxLayout>

#include <algorithm>
#include <map>

#include "app/editor/display_text.hpp"
#include "app/editor/edit_commands.hpp"
#include "app/editor/field_widgets.hpp"
#include "app/editor/frequency_source_box.hpp"
#include "core/models/dna/dna_single_source_model.hpp"
#include "core/models/dna/str_loci.hpp"

namespace counterpoise::editor {

using nlohmann::json;

namespace {

constexpr const char* kOtherRelationship = "ibd";

QString q(const std::string& text) { return QString::fromStdString(text); }

// The locus a problem's field names inside a profile: "profile.TH01[1]" gives TH01.
std::string locus_of(const std::string& field, const std::string& prefix) {
  if (field.rfind(prefix + ".", 0) != 0) return {};
  const std::string rest = field.substr(prefix.size() + 1);
  return rest.substr(0, rest.find('['));
}

// The core's reading of one locus, in words.
QString reading_text(const json& row) {
  const std::string status = row.value("status", std::string());
  if (status == "used") {
    const double log10_p = row.value("log10_match_probability", 0.0);
    return QObject::tr("used: match probability %1 (%2)")
        .arg(probability_text(log10_p), q(row.value("zygosity", std::string())));
  }
  if (status == "not-interpretable") return QObject::tr("not interpretable: not used");
  if (status == "differs") return QObject::tr("differs from the reference: an exclusion");
  if (status == "not-compared") return QObject::tr("no reference genotype: not used");
  if (status == "sex-marker") return QObject::tr("sex marker: not used");
  return q(status);
}

// The allele frequencies the core used at one locus, with floors marked.
QString frequencies_text(const json& row) {
  if (!row.contains("frequencies_used")) return {};
  QStringList parts;
  const json& listed = row.value("table_frequencies", json::object());
  for (auto it = row["frequencies_used"].begin(); it != row["frequencies_used"].end(); ++it) {
    QString part = q(it.key()) + ": " + value_text(it.value());
    const json table = listed.contains(it.key()) ? listed[it.key()] : json();
    if (table.is_null()) part += QObject::tr(" (not in the table)");
    else if (table != it.value()) part += QObject::tr(" (table %1)").arg(value_text(table));
    parts << part;
  }
  QString text = parts.join(QStringLiteral("; "));
  if (row.value("minimum_frequency_applied", false))
    text += QObject::tr(" — minimum frequency %1 by %2")
                .arg(value_text(row.value("minimum_frequency", json())), q(row.value("minimum_frequency_rule", std::string())));
  return text;
}

}  // namespace

DnaProfileForm::DnaProfileForm(EditFacade* edits, QWidget* parent) : QWidget(parent), edits_(edits) {
  setObjectName("dna_form");
  auto* layout = new QVBoxLayout(this);
  layout->setContentsMargins(0, 0, 0, 0);
  layout->addWidget(buildSettings());
  layout->addWidget(buildProfiles(), 1);
  layout->addWidget(buildFrequencies());
}

QWidget* DnaProfileForm::buildSettings() {
  auto* box = new QWidget(this);
  auto* form = new QFormLayout(box);
  form->setContentsMargins(0, 0, 0, 0);
  theta_ = new QLineEdit(box);
  theta_->setObjectName("dna_theta");
  theta_->setPlaceholderText(tr("e.g. 0.01; 0 for the product rule"));
  theta_->setToolTip(tr("The coancestry coefficient θ (FST) of the sampling formula, between 0 and 1. It allows for the "
                        "alternative donor and the person of interest sharing ancestry in a subpopulation."));
  form->addRow(tr("&Theta (θ)"), theta_);

  auto* donor = donor_ = new QWidget(box);
  auto* donor_layout = new QHBoxLayout(donor);
  donor_layout->setContentsMargins(0, 0, 0, 0);
  relationship_ = new QComboBox(donor);
  relationship_->setObjectName("dna_relationship");
  for (const auto& name : models::dna::standard_relationship_names()) relationship_->addItem(q(name), q(name));
  relationship_->addItem(tr("other (IBD coefficients)"), kOtherRelationship);
  relationship_->setToolTip(tr("Who the donor is if Hd is true: a person unrelated to the person of interest, or a relative."));
  ibd_ = new QLineEdit(donor);
  ibd_->setObjectName("dna_ibd");
  ibd_->setPlaceholderText(tr("k0, k1, k2"));
  ibd_->setToolTip(tr("The probabilities that the two people share 0, 1 or 2 alleles identical by descent (they sum to 1)."));
  donor_layout->addWidget(relationship_, 1);
  donor_layout->addWidget(ibd_, 1);
  form->addRow(tr("&Donor if Hd is true"), donor);

  min_frequency_ = new_minimum_frequency_field(box, "dna_min_frequency");
  form->addRow(tr("&Minimum allele frequency"), min_frequency_);
  settings_message_ = new FieldMessage(box);
  form->addRow(settings_message_);

  commit_typing(theta_, [this](const QString& text) { setField("theta", number_or_text(text)); });
  connect(relationship_, &QComboBox::activated, this, [this] { setRelationship(); });
  commit_typing(ibd_, [this](const QString&) { setRelationship(); });
  commit_typing(min_frequency_, [this](const QString& text) { setField("min_allele_frequency", optional_number_or_text(text)); });
  return box;
}

void DnaProfileForm::showSharedDonor(bool shown) {
  if (auto* form = qobject_cast<QFormLayout*>(donor_->parentWidget()->layout())) form->setRowVisible(donor_, shown);
}

QWidget* DnaProfileForm::buildProfiles() {
  auto* box = new QGroupBox(tr("Profiles"), this);
  auto* layout = new QVBoxLayout(box);
  profiles_ = new QTableWidget(0, 5, box);
  profiles_->setObjectName("dna_profiles");
  profiles_->setHorizontalHeaderLabels({tr("Locus"), tr("Questioned profile"), tr("Reference profile"), tr("Reading of the locus"),
                                        tr("Allele frequencies used")});
  profiles_->setToolTip(tr("Alleles separated by commas, e.g. \"15, 17\"; one allele for a homozygote. Leave the reference "
                           "empty at a locus it was not typed at."));
  profiles_->verticalHeader()->setVisible(false);
  profiles_->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
  profiles_->horizontalHeader()->setStretchLastSection(true);
  profiles_->setWordWrap(true);
  profiles_->setVerticalScrollBarPolicy(Qt::ScrollBarAlwaysOff);
  layout->addWidget(profiles_);

  auto* buttons = new QHBoxLayout;
  new_locus_ = new_locus_picker(box, "dna_new_locus");
  auto* add = new QPushButton(tr("&Add locus"), box);
  auto* remove = new QPushButton(tr("Remove &locus"), box);
  buttons->addWidget(new_locus_, 1);
  buttons->addWidget(add);
  buttons->addWidget(remove);
  buttons->addStretch(1);
  layout->addLayout(buttons);

  auto* form = new QFormLayout;
  uninterpretable_ = new QLineEdit(box);
  uninterpretable_->setObjectName("dna_uninterpretable");
  uninterpretable_->setToolTip(tr("Loci of the questioned profile that cannot be interpreted (drop-out, artefacts), "
                                  "separated by commas. They are left out of the match probability."));
  form->addRow(tr("Loci &not interpretable"), uninterpretable_);
  layout->addLayout(form);
  profile_message_ = new FieldMessage(box);
  layout->addWidget(profile_message_);

  connect(profiles_, &QTableWidget::cellChanged, this, [this](int row, int column) {
    if (rendering_) return;
    editing_cell_ = true;
    if (column == LocusColumn) renameLocus(row);
    else if (column == QuestionedColumn || column == ReferenceColumn) setGenotype(row, column);
    editing_cell_ = false;
  });
  connect(add, &QPushButton::clicked, this, [this] { addLocus(new_locus_->currentText()); });
  connect(remove, &QPushButton::clicked, this, [this] { removeLocusAt(profiles_->currentRow()); });
  connect(uninterpretable_, &QLineEdit::editingFinished, this, [this] {
    const json list = comma_separated_names(uninterpretable_->text());
    setField("uninterpretable_loci", list.empty() ? std::nullopt : std::optional<json>(list));
  });
  return box;
}

QWidget* DnaProfileForm::buildFrequencies() {
  frequencies_box_ = new FrequencySourceBox("dna", this);
  connect(frequencies_box_, &FrequencySourceBox::importRequested, this, &DnaProfileForm::importRequested);
  connect(frequencies_box_, &FrequencySourceBox::edited, this, [this](const json& frequencies) { setField("frequencies", frequencies); });
  return frequencies_box_;
}

void DnaProfileForm::useFrequencyFile(const QString& relative_path) { frequencies_box_->useFile(relative_path); }

QLabel* DnaProfileForm::frequencySource() const { return frequencies_box_->sourceLabel(); }

void DnaProfileForm::showFields(const std::string& item_id, const json& fields, const json& detail,
                                const std::vector<validation::Problem>& problems) {
  if (item_id != id_) form_problem_.reset();
  id_ = item_id;
  fields_ = fields;
  detail_ = detail;
  problems_ = problems;
  render_after_cell_edit(this, editing_cell_, [this] { render(); });
}

json DnaProfileForm::profile(const char* key) const { return object_member(fields_, key); }

int DnaProfileForm::rowOfLocus(const QString& locus) const { return index_of(row_loci_, locus); }

void DnaProfileForm::render() {
  rendering_ = true;
  show_value(theta_, fields_.contains("theta") ? std::optional<json>(fields_["theta"]) : std::nullopt);
  const json relationship = fields_.value("relationship", json("unrelated"));
  if (relationship.is_object()) {
    relationship_->setCurrentIndex(relationship_->findData(kOtherRelationship));
    const json k = relationship.value("ibd", json::array());
    if (!ibd_->hasFocus()) {
      QStringList parts;
      if (k.is_array())
        for (const auto& v : k) parts << value_text(v);
      ibd_->setText(parts.join(", "));
    }
  } else {
    relationship_->setCurrentIndex(relationship.is_string() ? relationship_->findData(q(relationship.get<std::string>())) : -1);
    ibd_->clear();
  }
  ibd_->setEnabled(relationship_->currentData().toString() == kOtherRelationship);
  show_value(min_frequency_,
             fields_.contains("min_allele_frequency") ? std::optional<json>(fields_["min_allele_frequency"]) : std::nullopt);
  if (!uninterpretable_->hasFocus()) uninterpretable_->setText(comma_text(fields_.value("uninterpretable_loci", json::array())));

  const json questioned = profile("profile");
  const json reference = profile("reference_profile");
  row_loci_.clear();
  for (auto it = questioned.begin(); it != questioned.end(); ++it) row_loci_.push_back(it.key());
  for (auto it = reference.begin(); it != reference.end(); ++it)
    if (!questioned.contains(it.key())) row_loci_.push_back(it.key());
  const int current = profiles_->currentRow();
  profiles_->setRowCount(static_cast<int>(row_loci_.size()));
  for (std::size_t r = 0; r < row_loci_.size(); ++r) {
    const std::string& locus = row_loci_[r];
    const int row = static_cast<int>(r);
    auto set = [&](int column, const QString& text, bool editable) {
      auto* cell = new QTableWidgetItem(text);
      if (!editable) cell->setFlags(Qt::ItemIsEnabled | Qt::ItemIsSelectable);
      profiles_->setItem(row, column, cell);
    };
    set(LocusColumn, q(locus), true);
    set(QuestionedColumn, questioned.contains(locus) ? comma_text(questioned[locus]) : QString(), true);
    set(ReferenceColumn, reference.contains(locus) ? comma_text(reference[locus]) : QString(), true);
    set(ReadingColumn, {}, false);
    set(FrequenciesColumn, {}, false);
  }
  if (current >= 0 && current < profiles_->rowCount()) profiles_->setCurrentCell(current, profiles_->currentColumn());
  renderReadings();
  fit_table_to_rows(profiles_);

  offer_loci(new_locus_, questioned);

  std::vector<validation::Problem> settings, profiles, frequency;
  if (form_problem_) profiles.push_back(*form_problem_);
  for (const auto& p : problems_) {
    const std::string& f = p.where.field;
    if (field_is_within(f, {"profile", "reference_profile", "uninterpretable_loci"})) profiles.push_back(p);
    else if (field_is_within(f, {"frequencies"})) frequency.push_back(p);
    else settings.push_back(p);
  }
  settings_message_->showProblems(settings, nullptr);
  profile_message_->showProblems(profiles, profiles_);
  frequencies_box_->showFrequencies(fields_.value("frequencies", json()), frequency);
  rendering_ = false;
}

void DnaProfileForm::renderReadings() {
  std::map<std::string, const json*> by_locus;
  if (detail_.is_object() && detail_.contains("loci"))
    for (const auto& row : detail_["loci"]) by_locus[row.value("locus", std::string())] = &row;
  // Without a reading from the core (it refused the item: no reference profile, or none at any
  // locus) a locus the reference does not type still says why it is not compared.
  const json questioned = profile("profile"), reference = profile("reference_profile");
  for (std::size_t r = 0; r < row_loci_.size(); ++r) {
    const auto it = by_locus.find(row_loci_[r]);
    const int row = static_cast<int>(r);
    const bool uncompared = questioned.contains(row_loci_[r]) && !reference.contains(row_loci_[r]);
    profiles_->item(row, ReadingColumn)
        ->setText(it != by_locus.end() ? reading_text(*it->second)
                  : uncompared        ? tr("no reference genotype: not compared, no LR")
                                      : QString());
    const QString frequencies = it == by_locus.end() ? QString() : frequencies_text(*it->second);
    profiles_->item(row, FrequenciesColumn)->setText(frequencies);
    profiles_->item(row, FrequenciesColumn)->setToolTip(frequencies);
    for (int column : {LocusColumn, QuestionedColumn, ReferenceColumn}) {
      profiles_->item(row, column)->setBackground(QBrush());
      profiles_->item(row, column)->setToolTip({});
    }
  }
  // A cell the core has something to say about is tinted, with the message as its tooltip.
  for (const auto& p : problems_) {
    for (auto [prefix, column] : {std::pair{"profile", QuestionedColumn}, std::pair{"reference_profile", ReferenceColumn}}) {
      const int row = rowOfLocus(q(locus_of(p.where.field, prefix)));
      if (row < 0) continue;
      profiles_->item(row, column)->setBackground(QColor(255, 225, 225));
      profiles_->item(row, column)->setToolTip(q(p.message));
    }
  }
}

void DnaProfileForm::setField(const std::string& field, std::optional<json> value) {
  if (rendering_ || id_.empty()) return;
  form_problem_.reset();
  edits_->setItemField(id_, field, std::move(value));
}

void DnaProfileForm::setFields(const json& fields) {
  if (id_.empty()) return;
  form_problem_.reset();
  edits_->setItemModelFields(id_, fields);
}

void DnaProfileForm::setRelationship() {
  if (rendering_) return;
  const QString chosen = relationship_->currentData().toString();
  if (chosen != kOtherRelationship) {
    setField("relationship", json(chosen.toStdString()));
    return;
  }
  setField("relationship", typed_ibd_relationship(ibd_, fields_.value("relationship", json("unrelated"))));
}

void DnaProfileForm::setGenotype(int row, int column) {
  if (row < 0 || row >= static_cast<int>(row_loci_.size())) return;
  const char* key = column == QuestionedColumn ? "profile" : "reference_profile";
  json value = profile(key);
  const std::string& locus = row_loci_[static_cast<std::size_t>(row)];
  const json alleles = allele_list(profiles_->item(row, column)->text());
  if (alleles.empty()) value.erase(locus);
  else value[locus] = alleles;
  // An empty reference profile is no reference profile; the questioned profile stays (the core
  // names it as empty).
  setField(key, value.empty() && column == ReferenceColumn ? std::nullopt : std::optional<json>(value));
}

void DnaProfileForm::renameLocus(int row) {
  if (row < 0 || row >= static_cast<int>(row_loci_.size())) return;
  const std::string old_name = row_loci_[static_cast<std::size_t>(row)];
  const std::string name = profiles_->item(row, LocusColumn)->text().trimmed().toStdString();
  if (name == old_name) return;
  json fields = fields_;
  const bool taken = profile("profile").contains(name) || profile("reference_profile").contains(name);
  if (name.empty() || taken) {
    // Refused here: the case file cannot hold a locus without a name or the same locus twice.
    form_problem_ = validation::Problem{validation::Location{id_, "profile"},
                                        name.empty() ? tr("a locus needs a name").toStdString()
                                                     : tr("locus %1 is already in the profiles").arg(q(name)).toStdString()};
    QTimer::singleShot(0, this, [this] { render(); });
    return;
  }
  for (const char* key : {"profile", "reference_profile"}) {
    if (!fields.contains(key) || !fields[key].is_object() || !fields[key].contains(old_name)) continue;
    fields[key][name] = fields[key][old_name];
    fields[key].erase(old_name);
  }
  if (fields.contains("uninterpretable_loci") && fields["uninterpretable_loci"].is_array())
    for (auto& locus : fields["uninterpretable_loci"])
      if (locus == old_name) locus = name;
  setFields(fields);
}

void DnaProfileForm::addLocus(const QString& text) {
  const std::string locus = text.trimmed().toStdString();
  if (locus.empty() || id_.empty()) return;
  if (profile("profile").contains(locus)) {
    profiles_->setCurrentCell(rowOfLocus(q(locus)), QuestionedColumn);
    return;
  }
  json value = profile("profile");
  // An empty genotype: the core names the locus as still to be filled in.
  value[locus] = json::array();
  setField("profile", value);
}

void DnaProfileForm::removeLocusAt(int row) {
  if (row < 0 || row >= static_cast<int>(row_loci_.size()) || id_.empty()) return;
  const std::string locus = row_loci_[static_cast<std::size_t>(row)];
  json fields = fields_;
  for (const char* key : {"profile", "reference_profile"})
    if (fields.contains(key) && fields[key].is_object()) fields[key].erase(locus);
  if (fields.contains("reference_profile") && fields["reference_profile"].empty()) fields.erase("reference_profile");
  if (fields.contains("uninterpretable_loci") && fields["uninterpretable_loci"].is_array()) {
    json kept = json::array();
    for (const auto& l : fields["uninterpretable_loci"])
      if (l != locus) kept.push_back(l);
    if (kept.empty()) fields.erase("uninterpretable_loci");
    else fields["uninterpretable_loci"] = kept;
  }
  setFields(fields);
}

}  // namespace counterpoise::editor

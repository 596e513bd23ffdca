#include "app/editor/measurement_form.hpp"

#include <QComboBox>
#include <QFormLayout>
#include <QGroupBox>
#include <QLabel>
#include <QLineEdit>
#include <QRegularExpression>
#include <QStackedWidget>
#include <QVBoxLayout>

#include <algorithm>

#include "app/editor/background_data_fields.hpp"
#include "app/editor/edit_commands.hpp"
#include "app/editor/field_widgets.hpp"

namespace counterpoise::editor {

using nlohmann::json;

namespace {

QString q(const std::string& text) { return QString::fromStdString(text); }

// "1.51991, 1.51995 1.51988": each entry a JSON number when it is one, otherwise the text, so
// the core's reader names the entry that is not a number.
json number_list(const QString& text) {
  json values = json::array();
  for (const QString& part : text.split(QRegularExpression("[,;\\s]+"), Qt::SkipEmptyParts)) values.push_back(number_or_text(part));
  return values;
}

QString list_text(const json& values) {
  if (!values.is_array()) return q(values.dump());
  QStringList parts;
  for (const auto& v : values) parts << value_text(v);
  return parts.join(", ");
}

// One replicate group per line.
json group_list(const QString& text) {
  json groups = json::array();
  for (const QString& line : text.split('\n', Qt::SkipEmptyParts))
    if (!line.trimmed().isEmpty()) groups.push_back(number_list(line));
  return groups;
}

QString groups_text(const json& groups) {
  if (!groups.is_array()) return q(groups.dump());
  QStringList lines;
  for (const auto& g : groups) lines << list_text(g);
  return lines.join('\n');
}

std::optional<json> member(const json& object, const char* key) {
  return object.is_object() && object.contains(key) ? std::optional<json>(object[key]) : std::nullopt;
}

// A stack as tall as the page it shows (QStackedWidget is otherwise as tall as its tallest page).
void fit_to_page(QStackedWidget* stack) {
  const QWidget* page = stack->currentWidget();
  stack->setFixedHeight(std::min(page->sizeHint().height(), page->maximumHeight()));
}

QString figures(const json& value) { return value.is_number() ? QString::number(value.get<double>(), 'g', 7) : QString(); }

// The core's reading of the measurements, from the point detail of the item; `hd_name` names
// Hd or the alternative the detail is against.
QString reading_text(const json& d, const QString& hd_name) {
  if (!d.is_object() || !d.contains("control")) return QObject::tr("No reading yet: correct the values marked above.");
  QStringList parts;
  parts << QObject::tr("Control: %n measurement(s), mean %1.", nullptr, d["control"].value("count", 0))
               .arg(figures(d["control"].value("mean", json())));
  parts << QObject::tr("Recovered: %n measurement(s), mean %1.", nullptr, d["recovered"].value("count", 0))
               .arg(figures(d["recovered"].value("mean", json())));
  const json within = d.value("within_sd", json::object());
  QString within_text = QObject::tr("Within-source standard deviation %1").arg(figures(within.value("value", json())));
  if (within.value("source", std::string()) == "pooled from replicates")
    within_text += QObject::tr(", pooled from %1 replicate groups (%2 degrees of freedom)")
                       .arg(within.value("replicate_groups", 0))
                       .arg(within.value("degrees_of_freedom", 0));
  parts << within_text + ".";
  const json population = d.value("population", json::object());
  if (population.contains("kde")) {
    const json& kde = population["kde"];
    parts << QObject::tr("Between sources: kernel density of %1 background values (%2 to %3), bandwidth %4 (%5).")
                 .arg(kde.value("values", 0))
                 .arg(figures(kde.value("min", json())), figures(kde.value("max", json())), figures(kde.value("bandwidth", json())),
                      q(kde.value("bandwidth_rule", std::string())));
  } else if (population.contains("normal")) {
    parts << QObject::tr("Between sources: normal, mean %1, standard deviation %2 (%3).")
                 .arg(figures(population["normal"].value("mean", json())), figures(population["normal"].value("sd", json())),
                      q(d.value("method", std::string())));
  }
  const json population_hd = d.value("population_hd", json::object());
  if (population_hd.contains("normal"))
    parts << QObject::tr("Sources of the recovered material if %1 is true: normal, mean %2, standard deviation %3.")
                 .arg(hd_name, figures(population_hd["normal"].value("mean", json())),
                      figures(population_hd["normal"].value("sd", json())));
  else if (population_hd.contains("kde"))
    parts << QObject::tr("Sources of the recovered material if %1 is true: kernel density of %2 background values, "
                         "bandwidth %3.")
                 .arg(hd_name)
                 .arg(population_hd["kde"].value("values", 0))
                 .arg(figures(population_hd["kde"].value("bandwidth", json())));
  return parts.join(' ');
}

}  // namespace

MeasurementForm::MeasurementForm(EditFacade* edits, QWidget* parent) : QWidget(parent), edits_(edits) {
  setObjectName("measurement_form");
  auto* layout = new QVBoxLayout(this);
  layout->setContentsMargins(0, 0, 0, 0);
  layout->addWidget(buildMeasurements());
  layout->addWidget(buildWithin());
  layout->addWidget(buildPopulation());
  layout->addWidget(buildHdPopulation());
  reading_ = new QLabel(this);
  reading_->setObjectName("measurement_reading");
  reading_->setWordWrap(true);
  reading_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  layout->addWidget(reading_);
  // Extra height goes below the form, not into the groups.
  for (auto* group : findChildren<QGroupBox*>(QString(), Qt::FindDirectChildrenOnly))
    group->setSizePolicy(QSizePolicy::Preferred, QSizePolicy::Maximum);
  layout->addStretch(1);
}

QWidget* MeasurementForm::buildMeasurements() {
  auto* box = new QGroupBox(tr("Measurements"), this);
  auto* form = new QFormLayout(box);
  form->setRowWrapPolicy(QFormLayout::WrapLongRows);
  control_ = new QLineEdit(box);
  control_->setObjectName("measurement_control");
  control_->setToolTip(tr("Measurements of the control material (the known source), separated by commas or spaces."));
  form->addRow(tr("&Control measurements"), control_);
  recovered_ = new QLineEdit(box);
  recovered_->setObjectName("measurement_recovered");
  recovered_->setToolTip(tr("Measurements of the recovered material (questioned), separated by commas or spaces."));
  form->addRow(tr("&Recovered measurements"), recovered_);
  measurement_message_ = new FieldMessage(box);
  form->addRow(measurement_message_);
  for (auto [line, key] : {std::pair{control_, "control"}, std::pair{recovered_, "recovered"}}) {
    const std::string field = key;
    commit_typing(line, [this, field](const QString& text) { setField(field, number_list(text)); });
  }
  return box;
}

QWidget* MeasurementForm::buildWithin() {
  auto* box = new QGroupBox(tr("Variation within one source"), this);
  auto* form = new QFormLayout(box);
  within_kind_ = new QComboBox(box);
  within_kind_->setObjectName("measurement_within_kind");
  within_kind_->addItem(tr("a standard deviation"));
  within_kind_->addItem(tr("pooled from replicate measurements of reference sources"));
  within_kind_->setToolTip(tr("How much repeated measurements of one source vary."));
  form->addRow(tr("&Given as"), within_kind_);
  within_pages_ = new QStackedWidget(box);
  within_sd_ = new QLineEdit(within_pages_);
  within_sd_->setObjectName("measurement_within_sd");
  within_sd_->setToolTip(tr("The standard deviation of repeated measurements of one source (greater than 0)."));
  within_pages_->addWidget(within_sd_);
  replicates_ = new TextField(within_pages_, 3);
  replicates_->setObjectName("measurement_replicates");
  replicates_->setToolTip(tr("One reference source per line: its replicate measurements separated by commas. The "
                             "pooled standard deviation of the groups is used, with its uncertainty."));
  within_pages_->addWidget(replicates_);
  form->addRow(within_pages_);
  within_message_ = new FieldMessage(box);
  form->addRow(within_message_);
  connect(within_kind_, &QComboBox::activated, this, [this](int index) { chooseWithin(static_cast<Within>(index)); });
  commit_typing(within_sd_, [this](const QString& text) { setField("within_sd", number_or_text(text)); });
  connect(replicates_, &TextField::edited, this, [this](const QString& text) { setField("within_replicates", group_list(text)); });
  return box;
}

QWidget* MeasurementForm::buildPopulation() {
  auto* box = new QGroupBox(tr("Variation between sources (the population)"), this);
  auto* form = new QFormLayout(box);
  population_kind_ = new QComboBox(box);
  population_kind_->setObjectName("measurement_population_kind");
  population_kind_->addItem(tr("normal, with a mean and standard deviation"));
  population_kind_->addItem(tr("background data, through a kernel density"));
  population_kind_->setToolTip(tr("How the measured property varies among the sources the recovered material could "
                                  "have come from if Hd is true."));
  form->addRow(tr("&Model"), population_kind_);
  population_pages_ = new QStackedWidget(box);

  auto* normal = new QWidget(population_pages_);
  auto* normal_form = new QFormLayout(normal);
  normal_form->setContentsMargins(0, 0, 0, 0);
  normal_mean_ = new QLineEdit(normal);
  normal_mean_->setObjectName("measurement_normal_mean");
  normal_sd_ = new QLineEdit(normal);
  normal_sd_->setObjectName("measurement_normal_sd");
  normal_form_ = new QComboBox(normal);
  normal_form_->addItem(tr("exact"), "exact");
  normal_form_->addItem(tr("approximate (between-source spread much larger than within)"), "approximate");
  normal_form->addRow(tr("M&ean"), normal_mean_);
  normal_form->addRow(tr("&Standard deviation"), normal_sd_);
  normal_form->addRow(tr("&Formula"), normal_form_);
  population_pages_->addWidget(normal);

  background_ = new BackgroundDataFields("measurement", population_pages_);
  population_pages_->addWidget(background_);
  form->addRow(population_pages_);
  population_message_ = new FieldMessage(box);
  form->addRow(population_message_);

  connect(population_kind_, &QComboBox::activated, this, [this](int index) { choosePopulation(static_cast<Population>(index)); });
  connect(background_, &BackgroundDataFields::importRequested, this, &MeasurementForm::importRequested);
  for (QLineEdit* line : {normal_mean_, normal_sd_})
    commit_typing(line, [this](const QString&) { setPopulation(normalPopulation()); });
  connect(normal_form_, &QComboBox::activated, this, [this] {
    const QString form = normal_form_->currentData().toString();
    setField("form", form == "exact" ? std::nullopt : std::optional<json>(form.toStdString()));
  });
  connect(background_, &BackgroundDataFields::edited, this, [this] { setPopulation(kdePopulation()); });
  return box;
}

QWidget* MeasurementForm::buildHdPopulation() {
  auto* box = hd_box_ = new QGroupBox(tr("Sources of the recovered material if Hd is true"), this);
  box->setObjectName("measurement_hd_box");
  auto* form = new QFormLayout(box);
  hd_chooser_ = new AlternativeChooser(tr("Under the alternative"), "measurement_alternative", box);
  form->addRow(hd_chooser_);
  connect(hd_chooser_, &AlternativeChooser::chosenChanged, this, &MeasurementForm::alternativeChosen);
  hd_kind_ = new QComboBox(box);
  hd_kind_->setObjectName("measurement_hd_kind");
  hd_kind_->addItem(tr("the population above (the same kind of source as the control)"));
  hd_kind_->addItem(tr("a normal population of their own"));
  hd_kind_->addItem(tr("background data of their own, through a kernel density"));
  hd_kind_->setToolTip(tr("Where the recovered material's source comes from if the alternative is true: from the "
                          "population above, or, when the alternative names a source of another kind (a container "
                          "from his workplace rather than another window), from that kind's population. The "
                          "control's source stays in the population above."));
  form->addRow(tr("&Drawn from"), hd_kind_);
  hd_normal_ = new QWidget(box);
  auto* normal_form = new QFormLayout(hd_normal_);
  normal_form->setContentsMargins(0, 0, 0, 0);
  hd_mean_ = new QLineEdit(hd_normal_);
  hd_mean_->setObjectName("measurement_hd_mean");
  hd_sd_ = new QLineEdit(hd_normal_);
  hd_sd_->setObjectName("measurement_hd_sd");
  normal_form->addRow(tr("Mea&n"), hd_mean_);
  normal_form->addRow(tr("Standard de&viation"), hd_sd_);
  form->addRow(hd_normal_);
  hd_background_ = new BackgroundDataFields("measurement_hd", box);
  form->addRow(hd_background_);
  hd_message_ = new FieldMessage(box);
  form->addRow(hd_message_);
  connect(hd_kind_, &QComboBox::activated, this, [this](int index) { chooseHdPopulation(static_cast<HdPopulation>(index)); });
  for (QLineEdit* line : {hd_mean_, hd_sd_})
    commit_typing(line, [this](const QString&) {
      json normal = json::object();
      if (!hd_mean_->text().trimmed().isEmpty()) normal["mean"] = number_or_text(hd_mean_->text().trimmed());
      if (!hd_sd_->text().trimmed().isEmpty()) normal["sd"] = number_or_text(hd_sd_->text().trimmed());
      setHdPopulation(json{{"normal", normal}});
    });
  connect(hd_background_, &BackgroundDataFields::importRequested, this, &MeasurementForm::hdImportRequested);
  connect(hd_background_, &BackgroundDataFields::edited, this, [this] {
    setHdPopulation(json{{"kde", hd_background_->typedKde(member(hdPopulation(), "kde").value_or(json::object()))}});
  });
  return box;
}

QLineEdit* MeasurementForm::bandwidthField() const { return background_->bandwidthField(); }

void MeasurementForm::showAlternatives(const AlternativeList& alternatives) { hd_chooser_->showAlternatives(alternatives); }

json MeasurementForm::hdPopulation() const {
  if (!hd_chooser_->several()) return member(fields_, "population_hd").value_or(json());
  const json entries = member(fields_, "alternatives").value_or(json::object());
  const json entry = member(entries, hd_chooser_->chosen().c_str()).value_or(json::object());
  return member(entry, "population_hd").value_or(json());
}

void MeasurementForm::setHdPopulation(const json& population) {
  if (rendering_ || id_.empty()) return;
  if (!hd_chooser_->several()) {
    setField("population_hd", population.is_null() ? std::nullopt : std::optional<json>(population));
    return;
  }
  // The chosen alternative's entry changes; the other entries stay as they are: one edit.
  json entries = member(fields_, "alternatives").value_or(json::object());
  if (!entries.is_object()) entries = json::object();
  json entry = member(entries, hd_chooser_->chosen().c_str()).value_or(json::object());
  if (!entry.is_object()) entry = json::object();
  if (population.is_null()) entry.erase("population_hd");
  else entry["population_hd"] = population;
  entries[hd_chooser_->chosen()] = entry;
  setField("alternatives", entries);
}

void MeasurementForm::chooseHdPopulation(HdPopulation kind) {
  if (rendering_ || id_.empty()) return;
  const json now = hdPopulation();
  const char* wanted = kind == HdPopulation::normal ? "normal" : "kde";
  if (kind == HdPopulation::same ? now.is_null() : member(now, wanted).has_value()) return;
  // What the alternative held is set aside, so choosing it again brings it back.
  const std::string aside = "population_hd." + hd_chooser_->chosen() + ".";
  if (member(now, "normal")) set_aside_[aside + "normal"] = now;
  if (member(now, "kde")) set_aside_[aside + "kde"] = now;
  if (kind == HdPopulation::same) {
    setHdPopulation(json());
  } else if (auto it = set_aside_.find(aside + wanted); it != set_aside_.end()) {
    setHdPopulation(it->second);
  } else {
    // Starts from the population above when it is of the kind chosen, for the user to change.
    const json shared = member(member(fields_, "population").value_or(json::object()), wanted).value_or(json::object());
    setHdPopulation(json{{wanted, shared.is_object() ? shared : json::object()}});
  }
}

void MeasurementForm::useHdBackgroundFile(const QString& relative_path, const QString& column) {
  if (id_.empty()) return;
  json kde = member(hdPopulation(), "kde").value_or(json::object());
  if (!kde.is_object()) kde = json::object();
  kde["file"] = relative_path.toStdString();
  kde["column"] = column.toStdString();
  setHdPopulation(json{{"kde", kde}});
}

json MeasurementForm::normalPopulation() const {
  json normal = json::object();
  if (!normal_mean_->text().trimmed().isEmpty()) normal["mean"] = number_or_text(normal_mean_->text().trimmed());
  if (!normal_sd_->text().trimmed().isEmpty()) normal["sd"] = number_or_text(normal_sd_->text().trimmed());
  return json{{"normal", normal}};
}

json MeasurementForm::kdePopulation() const {
  return json{{"kde", background_->typedKde(member(member(fields_, "population").value_or(json::object()), "kde").value_or(json()))}};
}

void MeasurementForm::setPopulation(const json& population) { setField("population", population); }

void MeasurementForm::useBackgroundFile(const QString& relative_path, const QString& column) {
  json kde = member(member(fields_, "population").value_or(json::object()), "kde").value_or(json::object());
  if (!kde.is_object()) kde = json::object();
  kde["file"] = relative_path.toStdString();
  kde["column"] = column.toStdString();
  json fields = fields_;
  if (fields.contains("population") && fields["population"].contains("normal")) set_aside_["population"] = fields["population"];
  fields["population"] = json{{"kde", kde}};
  fields.erase("form");  // the formula choice belongs to a normal population
  setFields(fields);
}

void MeasurementForm::chooseWithin(Within kind) {
  if (rendering_ || id_.empty()) return;
  const char* wanted = kind == Within::sd ? "within_sd" : "within_replicates";
  const char* other = kind == Within::sd ? "within_replicates" : "within_sd";
  if (fields_.contains(wanted)) return;
  json fields = fields_;
  if (fields.contains(other)) set_aside_[other] = fields[other];
  fields.erase(other);
  if (auto it = set_aside_.find(wanted); it != set_aside_.end()) {
    fields[wanted] = it->second;
  } else if (kind == Within::sd && detail_.is_object() && detail_.contains("within_sd")) {
    // From pooled replicates to a given value: start from the value the replicates gave.
    fields[wanted] = detail_["within_sd"].value("value", json());
  } else if (kind == Within::replicates) {
    fields[wanted] = json::array();
  }
  setFields(fields);
}

void MeasurementForm::choosePopulation(Population kind) {
  if (rendering_ || id_.empty()) return;
  const char* wanted = kind == Population::normal ? "normal" : "kde";
  const json population = member(fields_, "population").value_or(json::object());
  if (population.is_object() && population.contains(wanted)) return;
  json fields = fields_;
  if (population.is_object() && !population.empty()) set_aside_[population.begin().key()] = population;
  if (auto it = set_aside_.find(wanted); it != set_aside_.end()) fields["population"] = it->second;
  else fields["population"] = json{{wanted, json::object()}};
  if (kind == Population::background) fields.erase("form");
  setFields(fields);
}

void MeasurementForm::showFields(const std::string& item_id, const json& fields, const json& detail,
                                 const std::vector<validation::Problem>& problems) {
  if (item_id != id_) set_aside_.clear();
  id_ = item_id;
  fields_ = fields;
  detail_ = detail;
  problems_ = problems;
  render();
}

void MeasurementForm::render() {
  rendering_ = true;
  if (!control_->hasFocus()) control_->setText(list_text(fields_.value("control", json::array())));
  if (!recovered_->hasFocus()) recovered_->setText(list_text(fields_.value("recovered", json::array())));

  const Within within = fields_.contains("within_replicates") ? Within::replicates : Within::sd;
  within_kind_->setCurrentIndex(static_cast<int>(within));
  within_pages_->setCurrentIndex(static_cast<int>(within));
  fit_to_page(within_pages_);
  show_value(within_sd_, member(fields_, "within_sd"));
  replicates_->showText(groups_text(fields_.value("within_replicates", json::array())));

  const json population = member(fields_, "population").value_or(json::object());
  const Population kind = population.is_object() && population.contains("kde") ? Population::background : Population::normal;
  population_kind_->setCurrentIndex(static_cast<int>(kind));
  population_pages_->setCurrentIndex(static_cast<int>(kind));
  fit_to_page(population_pages_);
  const json normal = member(population, "normal").value_or(json::object());
  show_value(normal_mean_, member(normal, "mean"));
  show_value(normal_sd_, member(normal, "sd"));
  normal_form_->setCurrentIndex(std::max(0, normal_form_->findData(q(fields_.value("form", std::string("exact"))))));
  background_->showKde(member(population, "kde").value_or(json()));

  const json hd_population = hdPopulation();
  const HdPopulation hd_kind = hd_population.is_null()        ? HdPopulation::same
                               : member(hd_population, "kde") ? HdPopulation::background
                                                              : HdPopulation::normal;
  hd_kind_->setCurrentIndex(static_cast<int>(hd_kind));
  hd_normal_->setVisible(hd_kind == HdPopulation::normal);
  hd_box_->setTitle(hd_chooser_->several() ? tr("Sources of the recovered material under each alternative")
                                           : tr("Sources of the recovered material if Hd is true"));
  const json hd_normal = member(hd_population, "normal").value_or(json::object());
  show_value(hd_mean_, member(hd_normal, "mean"));
  show_value(hd_sd_, member(hd_normal, "sd"));
  hd_background_->setVisible(hd_kind == HdPopulation::background);
  hd_background_->showKde(member(hd_population, "kde").value_or(json()));

  std::vector<validation::Problem> measurements, within_problems, population_problems, hd_problems;
  for (auto p : problems_) {
    const std::string& f = p.where.field;
    p.message = valueNamed(p).toStdString();
    if (field_is_within(f, {"population_hd", "alternatives"})) hd_problems.push_back(p);
    else if (field_is_within(f, {"within_sd", "within_replicates"})) within_problems.push_back(p);
    else if (field_is_within(f, {"population", "form"})) population_problems.push_back(p);
    else measurements.push_back(p);
  }
  QWidget* marked_measurement = nullptr;
  for (const auto& p : measurements)
    marked_measurement = field_is_within(p.where.field, {"recovered"}) ? static_cast<QWidget*>(recovered_) : control_;
  measurement_message_->showProblems(measurements, marked_measurement);
  within_message_->showProblems(within_problems, within_pages_->currentWidget());
  population_message_->showProblems(population_problems, population_pages_);
  hd_message_->showProblems(hd_problems, hd_kind == HdPopulation::background ? static_cast<QWidget*>(hd_background_) : hd_normal_);
  reading_->setText(reading_text(detail_, hd_chooser_->chosenName()));
  rendering_ = false;
}

QString MeasurementForm::valueNamed(const validation::Problem& problem) const {
  // "recovered[1]": the second recovered measurement. Say which value, as the user typed it.
  static const QRegularExpression element(QStringLiteral("^(control|recovered)\\[(\\d+)\\]$"));
  static const QRegularExpression replicate(QStringLiteral("^within_replicates\\[(\\d+)\\]\\[(\\d+)\\]$"));
  const QString field = QString::fromStdString(problem.where.field);
  const QString message = QString::fromStdString(problem.message);
  std::optional<json> value;
  QString which;
  if (const auto m = element.match(field); m.hasMatch()) {
    const int index = m.captured(2).toInt();
    const json& list = fields_.value(m.captured(1).toStdString(), json::array());
    if (list.is_array() && index < static_cast<int>(list.size())) value = list[static_cast<std::size_t>(index)];
    which = m.captured(1) == "control" ? tr("Control measurement %1 of %2").arg(index + 1).arg(list.size())
                                       : tr("Recovered measurement %1 of %2").arg(index + 1).arg(list.size());
  } else if (const auto r = replicate.match(field); r.hasMatch()) {
    const int group = r.captured(1).toInt(), index = r.captured(2).toInt();
    const json groups = fields_.value("within_replicates", json::array());
    if (groups.is_array() && group < static_cast<int>(groups.size()) && groups[static_cast<std::size_t>(group)].is_array() &&
        index < static_cast<int>(groups[static_cast<std::size_t>(group)].size()))
      value = groups[static_cast<std::size_t>(group)][static_cast<std::size_t>(index)];
    which = tr("Value %1 on line %2 of the replicates").arg(index + 1).arg(group + 1);
  }
  if (which.isEmpty()) return message;
  if (value && value->is_string())
    return tr("%1, “%2”, is not a number: separate the numbers with commas, for example 1.51844, 1.51846.")
        .arg(which, value_text(value));
  return tr("%1: %2").arg(which, message);
}

void MeasurementForm::setField(const std::string& field, std::optional<json> value) {
  if (rendering_ || id_.empty()) return;
  edits_->setItemField(id_, field, std::move(value));
}

void MeasurementForm::setFields(const json& fields) {
  if (id_.empty()) return;
  edits_->setItemModelFields(id_, fields);
}

}  // namespace counterpoise::editor

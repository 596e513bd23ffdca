#include "app/editor/network_form.hpp"

#include <QCheckBox>
#include <QComboBox>
#include <QFormLayout>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLineEdit>
#include <QListWidget>
#include <QPushButton>
#include <QRegularExpression>
#include <QTableWidget>
#include <QTimer>
#include <QVBoxLayout>

#include <algorithm>

#include "app/editor/edit_commands.hpp"
#include "app/editor/field_widgets.hpp"
#include "core/validation/display_text.hpp"

namespace counterpoise::editor {

using nlohmann::json;

namespace {

std::vector<std::string> string_list(const json& value) {
  std::vector<std::string> out;
  if (value.is_array())
    for (const auto& v : value)
      if (v.is_string()) out.push_back(v.get<std::string>());
  return out;
}

int index_of(const json& nodes, const std::string& name) {
  for (std::size_t i = 0; i < nodes.size(); ++i)
    if (nodes[i].is_object() && nodes[i].value("name", std::string()) == name) return static_cast<int>(i);
  return -1;
}

std::vector<std::string> states_of(const json& nodes, const std::string& name) {
  const int i = index_of(nodes, name);
  return i < 0 ? std::vector<std::string>{} : string_list(nodes[static_cast<std::size_t>(i)].value("states", json::array()));
}

// Rows of a node's table: one per combination of parent states, the first parent slowest.
std::vector<QString> row_labels(const json& nodes, const json& node) {
  std::vector<QString> labels{QString()};
  for (const auto& parent : string_list(node.value("parents", json::array()))) {
    std::vector<QString> next;
    for (const auto& label : labels)
      for (const auto& state : states_of(nodes, parent))
        next.push_back((label.isEmpty() ? QString() : label + ", ") + QString::fromStdString(parent + "=" + state));
    labels = next;
  }
  return labels;
}

// The text of one table entry: a number as written, anything else (a distribution, "complement")
// as compact JSON without quotes around a plain word.
QString entry_text(const json& entry) {
  if (entry.is_string()) return QString::fromStdString(entry.get<std::string>());
  return QString::fromStdString(entry.dump());
}

json entry_value(const QString& text) {
  const std::string s = text.trimmed().toStdString();
  const json parsed = json::parse(s, nullptr, false);
  return parsed.is_discarded() ? json(s) : parsed;
}

// Resizes `node`'s table to the rows its parents give and the columns its states give; new
// entries are 0 so the core names the rows still to fill.
void fit_table(const json& nodes, json& node) {
  if (!node.contains("cpt") && node.value("parents", json::array()).empty()) return;  // a root without a table
  const std::size_t rows = row_labels(nodes, node).size();
  const std::size_t columns = string_list(node.value("states", json::array())).size();
  json table = node.value("cpt", json::array());
  if (!table.is_array()) table = json::array();
  while (table.size() < rows) table.push_back(json::array());
  while (table.size() > rows) table.erase(table.size() - 1);
  for (auto& row : table) {
    if (!row.is_array()) row = json::array();
    while (row.size() < columns) row.push_back(0);
    while (row.size() > columns) row.erase(row.size() - 1);
  }
  node["cpt"] = table;
}

}  // namespace

NetworkForm::NetworkForm(EditFacade* edits, QWidget* parent) : QWidget(parent), edits_(edits) {
  setObjectName("network_form");
  auto* outer = new QVBoxLayout(this);
  outer->setContentsMargins(0, 0, 0, 0);
  auto* row = new QHBoxLayout;
  outer->addLayout(row);

  auto* list_column = new QVBoxLayout;
  nodes_ = new QListWidget(this);
  nodes_->setObjectName("network_nodes");
  nodes_->setAccessibleName(tr("Nodes"));
  list_column->addWidget(nodes_);
  auto* buttons = new QHBoxLayout;
  auto* add = new QPushButton(tr("Add node"), this);
  auto* remove = new QPushButton(tr("Remove node"), this);
  buttons->addWidget(add);
  buttons->addWidget(remove);
  list_column->addLayout(buttons);
  row->addLayout(list_column, 1);

  auto* form = new QFormLayout;
  name_ = new QLineEdit(this);
  name_->setObjectName("network_name");
  form->addRow(tr("&Name"), name_);
  states_ = new QLineEdit(this);
  states_->setObjectName("network_states");
  states_->setToolTip(tr("The node's states, separated by commas"));
  form->addRow(tr("&States"), states_);
  parents_ = new QListWidget(this);
  parents_->setObjectName("network_parents");
  parents_->setMaximumHeight(90);
  parents_->setToolTip(tr("The nodes this node depends on; the first checked varies slowest in the table"));
  form->addRow(tr("&Parents"), parents_);
  observed_ = new QComboBox(this);
  observed_->setObjectName("network_observed");
  form->addRow(tr("&Observed"), observed_);
  row->addLayout(form, 2);

  cpt_ = new QTableWidget(this);
  cpt_->setObjectName("network_cpt");
  cpt_->setToolTip(tr("Probability of each state of the node given its parents' states: one row per combination, "
                      "a number, \"complement\", or a distribution in JSON"));
  outer->addWidget(cpt_);

  auto* propositions = propositions_ = new QFormLayout;
  proposition_node_ = new QComboBox(this);
  proposition_node_->setObjectName("network_proposition_node");
  hp_state_ = new QComboBox(this);
  hp_state_->setObjectName("network_hp_state");
  hd_state_ = new QComboBox(this);
  hd_state_->setObjectName("network_hd_state");
  propositions->addRow(tr("Node carrying the propositions"), proposition_node_);
  propositions->addRow(tr("State meaning Hp is true"), hp_state_);
  propositions->addRow(tr("State meaning Hd is true"), hd_state_);
  outer->addLayout(propositions);
  message_ = new FieldMessage(this);
  outer->addWidget(message_);
  auto* sensitivity_row = new QHBoxLayout;
  sensitivity_ = new QPushButton(tr("Sensitivity to the &Tables…"), this);
  sensitivity_->setObjectName("networkSensitivityButton");
  sensitivity_->setToolTip(tr("How far the likelihood ratio moves when each table entry is moved across its range, "
                              "largest effects first (the report prints the same table)"));
  sensitivity_row->addWidget(sensitivity_);
  sensitivity_row->addStretch(1);
  outer->addLayout(sensitivity_row);
  connect(sensitivity_, &QPushButton::clicked, this, [this] { emit sensitivityRequested(QString::fromStdString(id_)); });

  connect(nodes_, &QListWidget::currentRowChanged, this, [this](int r) {
    if (rendering_ || r < 0) return;
    current_ = r;
    rendering_ = true;
    showNode();
    rendering_ = false;
  });
  connect(add, &QPushButton::clicked, this, &NetworkForm::addNode);
  connect(remove, &QPushButton::clicked, this, &NetworkForm::removeNode);
  connect(name_, &QLineEdit::editingFinished, this, [this] { rename(name_->text()); });
  connect(states_, &QLineEdit::editingFinished, this, [this] { setStates(states_->text()); });
  connect(parents_, &QListWidget::itemChanged, this, [this] { setParents(); });
  connect(cpt_, &QTableWidget::cellChanged, this, &NetworkForm::setCell);
  connect(observed_, &QComboBox::activated, this, &NetworkForm::setObserved);
  for (QComboBox* box : {proposition_node_, hp_state_, hd_state_})
    connect(box, &QComboBox::activated, this, [this, box] { setProposition(box); });
}

void NetworkForm::selectNode(int index) { nodes_->setCurrentRow(index); }

json& NetworkForm::node(json& fields) const { return fields["nodes"][static_cast<std::size_t>(current_)]; }

void NetworkForm::showFields(const std::string& item_id, const json& fields, const std::vector<validation::Problem>& problems) {
  if (item_id != id_) current_ = 0;
  id_ = item_id;
  fields_ = fields;
  problems_ = problems;
  // A change made from one of this form's own widgets re-renders after its signal returns, so
  // the widget is not rebuilt under the handler that is still using it.
  if (committing_) {
    if (!rebuild_queued_) {
      rebuild_queued_ = true;
      QTimer::singleShot(0, this, [this] {
        rebuild_queued_ = false;
        rebuild();
      });
    }
    return;
  }
  rebuild();
}

void NetworkForm::rebuild() {
  rendering_ = true;
  const auto& problems = problems_;
  if (!fields_.contains("nodes") || !fields_["nodes"].is_array()) fields_["nodes"] = json::array();
  const json& nodes = fields_["nodes"];
  nodes_->clear();
  for (const auto& n : nodes) nodes_->addItem(QString::fromStdString(n.is_object() ? n.value("name", std::string()) : std::string()));
  current_ = std::clamp(current_, 0, std::max(0, static_cast<int>(nodes.size()) - 1));
  nodes_->setCurrentRow(nodes.empty() ? -1 : current_);

  const json proposition = fields_.value("proposition", json::object());
  const std::string prop_node = proposition.is_object() ? proposition.value("node", std::string()) : std::string();
  proposition_node_->clear();
  for (const auto& n : nodes) proposition_node_->addItem(QString::fromStdString(n.is_object() ? n.value("name", std::string()) : std::string()));
  proposition_node_->setCurrentIndex(index_of(nodes, prop_node));
  for (auto [box, key] : {std::pair{hp_state_, "hp"}, std::pair{hd_state_, "hd"}}) {
    box->clear();
    for (const auto& s : states_of(nodes, prop_node)) box->addItem(QString::fromStdString(s));
    const json chosen = proposition.is_object() ? proposition.value(key, json()) : json();
    if (chosen.is_array()) {
      // Several states written for the proposition: shown as such and kept until one is chosen.
      box->addItem(tr("states %1 as written").arg(comma_text(chosen)), QStringLiteral("as written"));
      box->setCurrentIndex(box->count() - 1);
    } else {
      box->setCurrentIndex(chosen.is_string() ? box->findText(QString::fromStdString(chosen.get<std::string>())) : -1);
    }
  }
  // With several alternatives each has its own state or states (alternatives.<id>.hd), a shared
  // hd being the default an entry replaces: one check box per state, several may be checked.
  propositions_->setRowVisible(hd_state_, alternatives_.empty());
  const json entries = object_member(fields_, "alternatives");
  for (auto& row : alternative_states_) {
    const json entry = object_member(entries, row.id.c_str());
    const json shared = proposition.is_object() ? proposition.value("hd", json()) : json();
    showAlternativeStates(row, states_of(nodes, prop_node), entry.contains("hd") ? entry["hd"] : shared, !entry.contains("hd"));
  }
  showNode();
  // The form shows one node at a time, so each message says which node (or part) it concerns.
  std::vector<validation::Problem> shown;
  static const QRegularExpression entry(QStringLiteral("^nodes\\.(.+)\\.cpt\\[(\\d+)\\]\\[(\\d+)\\]$"));
  for (const auto& p : problems) {
    const std::string& f = p.where.field;
    std::string part = f.substr(0, f.find('.'));
    if (f.rfind("nodes.", 0) == 0) {
      const std::string rest = f.substr(6);
      part = tr("node %1").arg(QString::fromStdString(rest.substr(0, rest.find('.')))).toStdString();
    }
    // A table entry typed as words: say so in the form's terms (rows and columns counted from 1).
    if (const auto m = entry.match(QString::fromStdString(f)); m.hasMatch()) {
      const json typed = entryAt(m.captured(1).toStdString(), m.captured(2).toInt(), m.captured(3).toInt());
      if (typed.is_string() && typed.get<std::string>() != "complement") {
        shown.push_back({p.where, tr("node %1, row %2, column %3: “%4” is not a number; enter a probability between 0 and 1, "
                                     "for example 0.05, or the word complement for what the rest of the row leaves.")
                                      .arg(m.captured(1))
                                      .arg(m.captured(2).toInt() + 1)
                                      .arg(m.captured(3).toInt() + 1)
                                      .arg(QString::fromStdString(typed.get<std::string>()))
                                      .toStdString()});
        continue;
      }
    }
    shown.push_back({p.where, part.empty() ? p.message : part + ": " + p.message});
  }
  message_->showProblems(shown, cpt_);
  // The sensitivity is of the network as read: none while the core refuses it.
  sensitivity_->setEnabled(problems.empty());
  rendering_ = false;
}

json NetworkForm::entryAt(const std::string& node_name, int row, int column) const {
  const json& nodes = fields_["nodes"];
  for (const auto& n : nodes) {
    if (!n.is_object() || n.value("name", std::string()) != node_name) continue;
    const json cpt = n.value("cpt", json::array());
    if (cpt.is_array() && row < static_cast<int>(cpt.size()) && cpt[static_cast<std::size_t>(row)].is_array() &&
        column < static_cast<int>(cpt[static_cast<std::size_t>(row)].size()))
      return cpt[static_cast<std::size_t>(row)][static_cast<std::size_t>(column)];
  }
  return json();
}

void NetworkForm::showNode() {
  const json& nodes = fields_["nodes"];
  const bool any = current_ < static_cast<int>(nodes.size());
  for (QWidget* w : std::initializer_list<QWidget*>{name_, states_, parents_, observed_, cpt_}) w->setEnabled(any);
  parents_->clear();
  cpt_->clear();
  cpt_->setRowCount(0);
  cpt_->setColumnCount(0);
  observed_->clear();
  if (!any) {
    name_->clear();
    states_->clear();
    return;
  }
  const json& n = nodes[static_cast<std::size_t>(current_)];
  const std::string name = n.value("name", std::string());
  const auto states = string_list(n.value("states", json::array()));
  name_->setText(QString::fromStdString(name));
  QStringList state_names;
  for (const auto& s : states) state_names << QString::fromStdString(s);
  states_->setText(state_names.join(", "));

  const auto parents = string_list(n.value("parents", json::array()));
  for (const auto& other : nodes) {
    const std::string other_name = other.value("name", std::string());
    if (other_name == name) continue;
    auto* item = new QListWidgetItem(QString::fromStdString(other_name), parents_);
    item->setFlags(Qt::ItemIsEnabled | Qt::ItemIsUserCheckable);
    item->setCheckState(std::find(parents.begin(), parents.end(), other_name) != parents.end() ? Qt::Checked : Qt::Unchecked);
  }

  observed_->addItem(tr("(not observed)"));
  observed_->addItems(state_names);
  const json observed = fields_.value("observed", json::object());
  const json state = observed.is_object() ? observed.value(name, json()) : json();
  observed_->setCurrentIndex(state.is_string() ? std::max(0, observed_->findText(QString::fromStdString(state.get<std::string>()))) : 0);

  const auto labels = row_labels(nodes, n);
  const json table = n.value("cpt", json::array());
  cpt_->setColumnCount(static_cast<int>(states.size()));
  cpt_->setHorizontalHeaderLabels(state_names);
  cpt_->setRowCount(static_cast<int>(labels.size()));
  QStringList row_names;
  for (const auto& l : labels) row_names << (l.isEmpty() ? tr("(no parents)") : l);
  cpt_->setVerticalHeaderLabels(row_names);
  for (std::size_t r = 0; r < labels.size(); ++r)
    for (std::size_t c = 0; c < states.size(); ++c) {
      const bool present = table.is_array() && r < table.size() && table[r].is_array() && c < table[r].size();
      cpt_->setItem(static_cast<int>(r), static_cast<int>(c), new QTableWidgetItem(present ? entry_text(table[r][c]) : QString()));
    }
  cpt_->horizontalHeader()->setSectionResizeMode(QHeaderView::Stretch);
}

void NetworkForm::commit(json fields) {
  fields_ = fields;
  committing_ = true;
  edits_->setItemModelFields(id_, fields);
  committing_ = false;
}

void NetworkForm::rename(const QString& text) {
  if (rendering_ || current_ >= static_cast<int>(fields_["nodes"].size())) return;
  json fields = fields_;
  const std::string old_name = node(fields).value("name", std::string());
  const std::string name = text.trimmed().toStdString();
  if (name == old_name || name.empty()) return;
  node(fields)["name"] = name;
  for (auto& n : fields["nodes"])
    if (n.contains("parents") && n["parents"].is_array())
      for (auto& p : n["parents"])
        if (p == old_name) p = name;
  if (fields.contains("proposition") && fields["proposition"].is_object() && fields["proposition"].value("node", std::string()) == old_name)
    fields["proposition"]["node"] = name;
  if (fields.contains("observed") && fields["observed"].is_object() && fields["observed"].contains(old_name)) {
    fields["observed"][name] = fields["observed"][old_name];
    fields["observed"].erase(old_name);
  }
  commit(fields);
}

void NetworkForm::setStates(const QString& text) {
  if (rendering_ || current_ >= static_cast<int>(fields_["nodes"].size())) return;
  json fields = fields_;
  const json states = comma_separated_names(text);
  if (states == node(fields).value("states", json::array())) return;
  node(fields)["states"] = states;
  for (auto& n : fields["nodes"]) fit_table(fields["nodes"], n);
  commit(fields);
}

void NetworkForm::setParents() {
  if (rendering_) return;
  json fields = fields_;
  // Keep the parents in the order of the node list, so the table's row order is predictable.
  json parents = json::array();
  for (int i = 0; i < parents_->count(); ++i)
    if (parents_->item(i)->checkState() == Qt::Checked) parents.push_back(parents_->item(i)->text().toStdString());
  node(fields)["parents"] = parents;
  fit_table(fields["nodes"], node(fields));
  commit(fields);
}

void NetworkForm::setCell(int row, int column) {
  if (rendering_) return;
  json fields = fields_;
  json& n = node(fields);
  fit_table(fields["nodes"], n);
  n["cpt"][static_cast<std::size_t>(row)][static_cast<std::size_t>(column)] = entry_value(cpt_->item(row, column)->text());
  commit(fields);
}

void NetworkForm::setObserved(int index) {
  if (rendering_) return;
  json fields = fields_;
  const std::string name = node(fields).value("name", std::string());
  if (!fields.contains("observed") || !fields["observed"].is_object()) fields["observed"] = json::object();
  if (index <= 0) fields["observed"].erase(name);
  else fields["observed"][name] = observed_->itemText(index).toStdString();
  commit(fields);
}

void NetworkForm::setProposition(const QComboBox* changed) {
  if (rendering_) return;
  json fields = fields_;
  const json written = fields_.value("proposition", json::object()).is_object() ? fields_["proposition"] : json::object();
  json proposition = json::object();
  proposition["node"] = proposition_node_->currentText().toStdString();
  const bool same_node = written.value("node", json()) == proposition["node"];
  const auto states = states_of(fields["nodes"], proposition["node"].get<std::string>());
  // The state chosen in `box`; a list of states written for `key` stays as written unless the
  // user chose in that box or another node (its states are then another node's).
  const auto pick = [&](QComboBox* box, const char* key, std::size_t fallback) -> json {
    const bool keep = box != changed || box->currentData().toString() == QStringLiteral("as written");
    if (keep && same_node && written.contains(key) && written[key].is_array()) return written[key];
    const std::string s = box->currentText().toStdString();
    return std::find(states.begin(), states.end(), s) != states.end() || states.size() <= fallback ? s : states[fallback];
  };
  proposition["hp"] = pick(hp_state_, "hp", 0);
  // With several alternatives each gives its states in its entry; a shared hd stays as it was.
  if (alternatives_.empty())
    proposition["hd"] = pick(hd_state_, "hd", 1);
  else if (written.contains("hd"))
    proposition["hd"] = written["hd"];
  fields["proposition"] = proposition;
  commit(fields);
}

void NetworkForm::showAlternatives(const AlternativeList& alternatives) {
  if (alternatives == alternatives_) return;
  alternatives_ = alternatives;
  for (auto& row : alternative_states_) propositions_->removeRow(row.holder);
  alternative_states_.clear();
  for (const auto& [id, text] : alternatives_) {
    auto* holder = new QWidget(this);
    holder->setObjectName(QString::fromStdString("network_hd_states." + id));
    auto* layout = new QHBoxLayout(holder);
    layout->setContentsMargins(0, 0, 0, 0);
    const QString name = QString::fromStdString(validation::display_text(id));
    holder->setToolTip(tr("%1: %2\nThe state or states of the proposition node that stand for this alternative: "
                          "check one, or several when the alternative covers more than one state.")
                           .arg(name, QString::fromStdString(validation::display_text(text))));
    propositions_->addRow(tr("States meaning %1 is true").arg(name), holder);
    alternative_states_.push_back({id, holder, {}});
  }
}

void NetworkForm::showAlternativeStates(AlternativeStates& row, const std::vector<std::string>& states, const json& chosen,
                                        bool from_shared) {
  std::vector<std::string> checked;
  if (chosen.is_string()) checked.push_back(chosen.get<std::string>());
  for (const auto& s : string_list(chosen)) checked.push_back(s);
  // The node's states, then any the entry names that the node does not have (shown so that they
  // are not dropped unseen; the core's message says what is wrong with them).
  std::vector<std::pair<std::string, bool>> shown;
  for (const auto& s : states) shown.emplace_back(s, true);
  for (const auto& s : checked)
    if (std::find(states.begin(), states.end(), s) == states.end()) shown.emplace_back(s, false);
  // Later, not now: the rebuild may run from a signal of one of these boxes (see showFields).
  for (QCheckBox* box : row.boxes) {
    box->hide();
    box->deleteLater();
  }
  row.boxes.clear();
  auto* layout = qobject_cast<QHBoxLayout*>(row.holder->layout());
  for (const auto& [state, known] : shown) {
    auto* box = new QCheckBox(known ? QString::fromStdString(state) : tr("%1 (not a state of the node)").arg(QString::fromStdString(state)),
                              row.holder);
    box->setObjectName(QString::fromStdString("network_hd_state." + row.id + "." + state));
    box->setProperty("state", QString::fromStdString(state));
    box->setChecked(std::find(checked.begin(), checked.end(), state) != checked.end());
    if (from_shared && box->isChecked()) box->setToolTip(tr("The shared state of Hd; checking or unchecking a state gives this alternative its own."));
    const std::string alternative = row.id;
    connect(box, &QCheckBox::clicked, this, [this, alternative] { setAlternativeStates(alternative); });
    layout->addWidget(box);
    row.boxes.push_back(box);
  }
}

QCheckBox* NetworkForm::alternativeStateBox(const std::string& alternative, const std::string& state) const {
  for (const auto& row : alternative_states_)
    if (row.id == alternative)
      for (QCheckBox* box : row.boxes)
        if (box->property("state").toString().toStdString() == state) return box;
  return nullptr;
}

void NetworkForm::setAlternativeStates(const std::string& alternative) {
  if (rendering_) return;
  const auto row = std::find_if(alternative_states_.begin(), alternative_states_.end(),
                                [&](const AlternativeStates& r) { return r.id == alternative; });
  if (row == alternative_states_.end()) return;
  json states = json::array();
  for (const QCheckBox* box : row->boxes)
    if (box->isChecked()) states.push_back(box->property("state").toString().toStdString());
  json fields = fields_;
  json entries = object_member(fields, "alternatives");
  json entry = object_member(entries, alternative.c_str());
  // One state is written as a name, several as a list (both as the interchange reads them); none
  // leaves the entry without states of its own (the shared hd, or the core's message).
  if (states.empty()) entry.erase("hd");
  else entry["hd"] = states.size() == 1 ? states[0] : states;
  entries[alternative] = entry;
  fields["alternatives"] = entries;
  commit(fields);
}

void NetworkForm::addNode() {
  json fields = fields_;
  int k = static_cast<int>(fields["nodes"].size()) + 1;
  std::string name;
  do name = "Node " + std::to_string(k++);
  while (index_of(fields["nodes"], name) >= 0);
  fields["nodes"].push_back(json{{"name", name}, {"states", {"yes", "no"}}, {"parents", json::array()}, {"cpt", {{0.5, 0.5}}}});
  current_ = static_cast<int>(fields["nodes"].size()) - 1;
  commit(fields);
}

void NetworkForm::removeNode() {
  if (current_ >= static_cast<int>(fields_["nodes"].size())) return;
  json fields = fields_;
  const std::string name = node(fields).value("name", std::string());
  fields["nodes"].erase(static_cast<std::size_t>(current_));
  for (auto& n : fields["nodes"])
    if (n.contains("parents") && n["parents"].is_array()) {
      json kept = json::array();
      for (const auto& p : n["parents"])
        if (p != name) kept.push_back(p);
      n["parents"] = kept;
      fit_table(fields["nodes"], n);
    }
  if (fields.contains("observed") && fields["observed"].is_object()) fields["observed"].erase(name);
  current_ = std::max(0, current_ - 1);
  commit(fields);
}

}  // namespace counterpoise::editor

#pragma once
// The structured form of a network item: the node list (add, remove, rename), the selected
// node's states (a comma list), its parents (checked among the other nodes) and its table (one
// row per combination of parent states, the first parent's state varying slowest, as in the case
// file), the observed state, and the proposition node with its Hp and Hd states (several states
// written for one of them are kept until a state is chosen for it or another node; in a case with
// several alternatives to Hp, a check box per state for each alternative, one or several
// checked: alternatives.<id>.hd, a name or a list as the interchange has it). Every change is
// one undoable replacement of the item's model fields through the EditFacade; the core's
// validation message is shown under the form.

#include <QWidget>

#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "app/editor/alternative_chooser.hpp"
#include "core/validation/input_error.hpp"

class QCheckBox;
class QComboBox;
class QFormLayout;
class QLineEdit;
class QListWidget;
class QPushButton;
class QTableWidget;

namespace counterpoise::editor {

class EditFacade;
class FieldMessage;

class NetworkForm : public QWidget {
  Q_OBJECT
 public:
  NetworkForm(EditFacade* edits, QWidget* parent = nullptr);

  // Shows the model fields `fields` of item `item_id` and the problems the core found in them.
  void showFields(const std::string& item_id, const nlohmann::json& fields, const std::vector<validation::Problem>& problems);

  // The case's alternatives to Hp (empty with two propositions), before showFields.
  void showAlternatives(const AlternativeList& alternatives);

  // For tests.
  // The check box of state `state` of the proposition node for an alternative, or nullptr.
  QCheckBox* alternativeStateBox(const std::string& alternative, const std::string& state) const;
  QListWidget* nodeList() const { return nodes_; }
  // "Sensitivity to the Tables…": enabled while the network reads without problems.
  QPushButton* sensitivityButton() const { return sensitivity_; }

 signals:
  // The user asked how sensitive the LR of item `item_id` is to its table entries.
  void sensitivityRequested(const QString& item_id);

 public:
  QTableWidget* tableWidget() const { return cpt_; }
  void selectNode(int index);

 private:
  void rebuild();
  void showNode();
  // The entry of `node_name`'s table at (row, column) as the fields hold it; null when absent.
  nlohmann::json entryAt(const std::string& node_name, int row, int column) const;
  void commit(nlohmann::json fields);
  void rename(const QString& name);
  void setStates(const QString& text);
  void setParents();
  void setCell(int row, int column);
  void setObserved(int index);
  // The proposition node and its Hp and Hd states as chosen, after a choice in `changed`.
  void setProposition(const QComboBox* changed);
  // The check boxes of one alternative's states.
  struct AlternativeStates {
    std::string id;
    QWidget* holder;
    std::vector<QCheckBox*> boxes;
  };
  // Shows the node's `states` in `row`, those of `chosen` (a name or a list) checked;
  // `from_shared` when they are the shared hd's.
  void showAlternativeStates(AlternativeStates& row, const std::vector<std::string>& states, const nlohmann::json& chosen,
                             bool from_shared);
  // Writes the states checked for `alternative` as one edit.
  void setAlternativeStates(const std::string& alternative);
  void addNode();
  void removeNode();
  nlohmann::json& node(nlohmann::json& fields) const;

  EditFacade* edits_;
  std::string id_;
  nlohmann::json fields_;
  int current_ = 0;
  bool rendering_ = false;
  bool committing_ = false;
  bool rebuild_queued_ = false;
  std::vector<validation::Problem> problems_;

  QListWidget* nodes_;
  QLineEdit* name_;
  QLineEdit* states_;
  QListWidget* parents_;
  QTableWidget* cpt_;
  QComboBox* observed_;
  QComboBox* proposition_node_;
  QComboBox* hp_state_;
  QComboBox* hd_state_;
  QFormLayout* propositions_;
  AlternativeList alternatives_;
  std::vector<AlternativeStates> alternative_states_;
  FieldMessage* message_;
  QPushButton* sensitivity_;
};

}  // namespace counterpoise::editor

#pragma once
// The structured form of a network item: the node list (add, remove, rename), the selected
// node's states (a comma list), its parents (checked among the other nodes) and its table (one
// row per combination of parent states, the first parent's state varying slowest, as in the case
// file), the observed state, and the proposition node with its Hp and Hd states. Every change is
// one undoable replacement of the item's model fields through the EditFacade; the core's
// validation message is shown under the form.

#include <QWidget>

#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/validation/input_error.hpp"

class QComboBox;
class QLineEdit;
class QListWidget;
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

  // For tests.
  QListWidget* nodeList() const { return nodes_; }
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
  void setProposition();
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
  FieldMessage* message_;
};

}  // namespace counterpoise::editor

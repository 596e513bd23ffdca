#pragma once
// How sensitive a network item's LR is to each entry of its tables: the core's one-way
// sensitivity rows (models/network/network_sensitivity.hpp), largest effects first, every row
// (the report prints the first 15). The rows are computed off the GUI thread, behind a progress
// dialog with Cancel, by MainWindow::showNetworkSensitivity; this window only shows them.

#include <QDialog>

#include <string>
#include <vector>

#include "core/models/network/network_definition.hpp"
#include "core/models/network/network_sensitivity.hpp"
#include "core/numbers/likelihood_ratio.hpp"

class QLabel;
class QTableWidget;

namespace counterpoise::editor {

class NetworkSensitivityWindow : public QDialog {
  Q_OBJECT
 public:
  enum Column { NodeColumn, GivenColumn, StateColumn, ValueColumn, RangeColumn, LowEndColumn, HighEndColumn, ColumnCount };

  explicit NetworkSensitivityWindow(QWidget* parent = nullptr);

  // Shows `rows` (ordered by effect) of item `item_id`'s network, whose LR at the tables'
  // means is `lr`; `against` names the alternative to Hp the LR is against ("" with two
  // propositions).
  void showRows(const std::string& item_id, const models::network::Network& network,
                const std::vector<models::network::EntrySensitivity>& rows, const numbers::LikelihoodRatio& lr,
                const std::string& against);

  QTableWidget* table() const { return table_; }
  QLabel* summary() const { return summary_; }

 private:
  QLabel* summary_;
  QTableWidget* table_;
};

}  // namespace counterpoise::editor

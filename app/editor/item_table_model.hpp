#pragma once
// The items of findings as a table: one row per item in document order, with its model, the two
// probabilities, the LR (point, log10, interval) and the verbal expression. Columns are an enum
// ending in a count; RawValueRole gives the number behind a cell (log10 LR, or the mean
// probability) so a QSortFilterProxyModel sorts by value, not by text. Re-renders (a model
// reset) whenever the document says its content or evaluation changed.

#include <QAbstractTableModel>

#include "app/editor/case_document.hpp"

namespace counterpoise::editor {

class ItemTableModel : public QAbstractTableModel {
  Q_OBJECT
 public:
  enum Column { Id, Title, Model, PGivenHp, PGivenHd, LR, Log10LR, Interval, Verbal, Included, ColumnCount };
  enum Role { RawValueRole = Qt::UserRole + 1, ItemIdRole };

  explicit ItemTableModel(CaseDocument* document, QObject* parent = nullptr);

  int rowCount(const QModelIndex& parent = {}) const override;
  int columnCount(const QModelIndex& parent = {}) const override;
  QVariant data(const QModelIndex& index, int role = Qt::DisplayRole) const override;
  QVariant headerData(int section, Qt::Orientation orientation, int role = Qt::DisplayRole) const override;

  // The row of the item with this id, or -1.
  int rowOf(const std::string& id) const;

 private:
  struct Row {
    std::string id;
    QString title, model, p_hp, p_hd, lr, log10_lr, interval, verbal;
    double raw_p_hp = 0, raw_p_hd = 0, raw_log10 = 0, raw_width = 0;
    bool included = true, evaluated = false, problem = false;
  };
  void rebuild();

  CaseDocument* document_;
  std::vector<Row> rows_;
};

}  // namespace counterpoise::editor

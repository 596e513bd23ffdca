#include "app/editor/item_table_model.hpp"

#include <QBrush>
#include <QColor>

#include <cmath>

#include "app/editor/display_text.hpp"
#include "core/probability/probability_assignment.hpp"

namespace counterpoise::editor {

using nlohmann::json;

ItemTableModel::ItemTableModel(CaseDocument* document, QObject* parent) : QAbstractTableModel(parent), document_(document) {
  connect(document_, &CaseDocument::changed, this, [this](Changes what) {
    if (what & (Change::content | Change::evaluation | Change::spread)) rebuild();
  });
  rebuild();
}

void ItemTableModel::rebuild() {
  beginResetModel();
  rows_.clear();
  const auto& points = document_->points();
  const auto& full = document_->spread();
  const bool spread_current = full.evaluation && !document_->spreadPending();
  for (const auto& [id, body] : document_->state().items()) {
    Row row;
    row.id = id;
    row.title = QString::fromStdString(body.value("title", std::string()));
    row.model = QString::fromStdString(body.value("model", std::string()));
    const ItemPoint* point = points.item(id);
    row.problem = !document_->problemsAt(id, "").empty();
    if (point && point->evaluated) {
      row.evaluated = true;
      row.included = point->included;
      std::optional<uncertainty::SpreadSummary> spread;
      if (spread_current)
        for (const auto& item : full.evaluation->items)
          if (item.id == id) spread = item.spread;
      row.lr = lr_text(point->point.lr, spread);
      row.raw_log10 = point->point.lr.log10();
      row.log10_lr = log10_text(row.raw_log10);
      row.interval = interval_text(spread);
      if (spread) row.raw_width = spread->high_log10 - spread->low_log10;
      row.verbal = QString::fromStdString(point->verbal.label);
      if (point->point.log10_p_given_hp) row.raw_p_hp = std::pow(10.0, *point->point.log10_p_given_hp);
      if (point->point.log10_p_given_hd) row.raw_p_hd = std::pow(10.0, *point->point.log10_p_given_hd);
      auto describe = [&](const char* key) -> QString {
        if (!body.contains(key)) return {};
        try {
          return QString::fromStdString(probability::describe(probability::read_assignment(body[key], {id, key})));
        } catch (const std::exception&) {
          return {};
        }
      };
      row.p_hp = describe("p_given_hp");
      row.p_hd = describe("p_given_hd");
    } else {
      row.lr = tr("(problem)");
    }
    rows_.push_back(std::move(row));
  }
  endResetModel();
}

int ItemTableModel::rowCount(const QModelIndex& parent) const { return parent.isValid() ? 0 : static_cast<int>(rows_.size()); }
int ItemTableModel::columnCount(const QModelIndex& parent) const { return parent.isValid() ? 0 : ColumnCount; }

int ItemTableModel::rowOf(const std::string& id) const {
  for (std::size_t i = 0; i < rows_.size(); ++i)
    if (rows_[i].id == id) return static_cast<int>(i);
  return -1;
}

QVariant ItemTableModel::data(const QModelIndex& index, int role) const {
  if (!index.isValid() || index.row() >= static_cast<int>(rows_.size())) return {};
  const Row& row = rows_[static_cast<std::size_t>(index.row())];
  if (role == ItemIdRole) return QString::fromStdString(row.id);
  const auto column = static_cast<Column>(index.column());
  if (role == Qt::DisplayRole) {
    switch (column) {
      case Id: return QString::fromStdString(row.id);
      case Title: return row.title;
      case Model: return row.model;
      case PGivenHp: return row.p_hp;
      case PGivenHd: return row.p_hd;
      case LR: return row.lr;
      case Log10LR: return row.evaluated ? row.log10_lr : QString();
      case Interval: return row.interval;
      case Verbal: return row.verbal;
      case Included: return row.included ? tr("yes") : tr("no");
      case ColumnCount: break;
    }
  }
  if (role == RawValueRole) {
    switch (column) {
      case PGivenHp: return row.raw_p_hp;
      case PGivenHd: return row.raw_p_hd;
      case LR:
      case Log10LR:
      case Verbal: return row.evaluated ? row.raw_log10 : -1e308;
      case Interval: return row.raw_width;
      case Included: return row.included;
      default: return data(index, Qt::DisplayRole);
    }
  }
  if (role == Qt::TextAlignmentRole && (column == LR || column == Log10LR)) return int(Qt::AlignRight | Qt::AlignVCenter);
  if (role == Qt::ForegroundRole && !row.included) return QBrush(QColor(120, 120, 120));
  if (role == Qt::BackgroundRole && row.problem) return QBrush(QColor(255, 228, 228));
  if (role == Qt::ToolTipRole && row.problem) {
    QStringList lines;
    for (const auto& p : document_->problemsAt(row.id, "")) lines << QString::fromStdString(p.text());
    return lines.join('\n');
  }
  return {};
}

QVariant ItemTableModel::headerData(int section, Qt::Orientation orientation, int role) const {
  if (orientation != Qt::Horizontal || role != Qt::DisplayRole) return QAbstractTableModel::headerData(section, orientation, role);
  switch (static_cast<Column>(section)) {
    case Id: return tr("Item");
    case Title: return tr("Title");
    case Model: return tr("Model");
    case PGivenHp: return tr("P(E | Hp)");
    case PGivenHd: return tr("P(E | Hd)");
    case LR: return tr("LR");
    case Log10LR: return tr("log10 LR");
    case Interval: return tr("Interval");
    case Verbal: return tr("In words");
    case Included: return tr("Combined");
    case ColumnCount: break;
  }
  return {};
}

}  // namespace counterpoise::editor

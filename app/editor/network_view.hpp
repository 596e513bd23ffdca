#pragma once
// A read-only drawing of a network item's graph beside its fields: node boxes with their names,
// arrows parent -> child through the layout's bend points, the proposition node and the observed
// nodes (with their observed state) marked. Placement is the core's layered layout
// (core/models/network/network_layout.hpp); this widget only scales and paints it.

#include <QRectF>
#include <QString>
#include <QStringList>
#include <QWidget>

#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/models/network/network_definition.hpp"
#include "core/models/network/network_layout.hpp"

namespace counterpoise::editor {

class NetworkView : public QWidget {
  Q_OBJECT
 public:
  explicit NetworkView(QWidget* parent = nullptr);

  // Reads the network fields of `item` (the item's JSON body) and redraws. A network the core
  // rejects is not drawn; the widget shows that the graph waits for valid fields. Never throws.
  // `alternative_states` (a case with several alternatives to Hp): what the proposition node's
  // box says after Hp's states instead of Hd's, e.g. "Hd1: elsewhere · Hd2: beside it".
  void showNetwork(const nlohmann::json& item, const std::string& item_id, const QString& alternative_states = {});

  // For tests and figures: the names of the drawn nodes (in node order; empty when nothing is
  // drawn) and their boxes in widget coordinates for the current size.
  QStringList nodeNames() const;
  std::vector<QRectF> nodeRects() const;

  QSize sizeHint() const override;
  QSize minimumSizeHint() const override;

 protected:
  void paintEvent(QPaintEvent* event) override;

 private:
  // Centre of slot `position` in `layer` for the current size.
  QPointF slotCentre(std::size_t layer, std::size_t position) const;
  QString nodeLabel(std::size_t node) const;
  QSizeF boxSize() const;

  bool drawn_ = false;
  QString alternative_states_;
  QString problem_;
  models::network::Network network_;
  models::network::NetworkLayout layout_;
};

}  // namespace counterpoise::editor

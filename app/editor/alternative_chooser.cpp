#include "app/editor/alternative_chooser.hpp"

#include <QComboBox>
#include <QHBoxLayout>
#include <QLabel>
#include <QSignalBlocker>

#include "core/validation/display_text.hpp"

namespace counterpoise::editor {

namespace {
QString shown(const std::string& text) { return QString::fromStdString(validation::display_text(text)); }
}  // namespace

AlternativeChooser::AlternativeChooser(const QString& label, const QString& object_name, QWidget* parent)
    : QWidget(parent) {
  auto* layout = new QHBoxLayout(this);
  layout->setContentsMargins(0, 0, 0, 0);
  auto* caption = new QLabel(label, this);
  box_ = new QComboBox(this);
  box_->setObjectName(object_name);
  box_->setSizeAdjustPolicy(QComboBox::AdjustToContents);
  box_->setToolTip(tr("The alternative to Hp whose own inputs are shown and edited here; the others keep theirs."));
  caption->setBuddy(box_);
  layout->addWidget(caption);
  layout->addWidget(box_);
  layout->addStretch(1);
  setVisible(false);
  connect(box_, &QComboBox::activated, this, [this](int index) {
    if (index < 0 || static_cast<std::size_t>(index) >= alternatives_.size()) return;
    if (alternatives_[static_cast<std::size_t>(index)].first == chosen_) return;
    chosen_ = alternatives_[static_cast<std::size_t>(index)].first;
    emit chosenChanged();
  });
}

void AlternativeChooser::showAlternatives(const AlternativeList& alternatives) {
  setVisible(!alternatives.empty());
  if (alternatives == alternatives_) return;
  alternatives_ = alternatives;
  const QSignalBlocker quiet(box_);
  box_->clear();
  bool still_there = false;
  for (const auto& [id, text] : alternatives_) {
    box_->addItem(tr("%1: %2").arg(shown(id), shown(text)), QString::fromStdString(id));
    box_->setItemData(box_->count() - 1, shown(text), Qt::ToolTipRole);
    still_there = still_there || id == chosen_;
  }
  if (!still_there) chosen_ = alternatives_.empty() ? std::string() : alternatives_.front().first;
  box_->setCurrentIndex(static_cast<int>(chosenIndex()));
}

std::size_t AlternativeChooser::chosenIndex() const {
  for (std::size_t i = 0; i < alternatives_.size(); ++i)
    if (alternatives_[i].first == chosen_) return i;
  return 0;
}

QString AlternativeChooser::chosenName() const { return several() ? shown(chosen_) : QStringLiteral("Hd"); }

}  // namespace counterpoise::editor

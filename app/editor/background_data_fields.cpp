#include "app/editor/background_data_fields.hpp"

#include <QComboBox>
#include <QFormLayout>
#include <QHBoxLayout>
#include <QLabel>
#include <QLineEdit>
#include <QPushButton>

#include <algorithm>

#include "app/editor/field_widgets.hpp"

namespace counterpoise::editor {

using nlohmann::json;

namespace {

std::optional<json> member(const json& object, const char* key) {
  return object.is_object() && object.contains(key) ? std::optional<json>(object[key]) : std::nullopt;
}

}  // namespace

BackgroundDataFields::BackgroundDataFields(const QString& prefix, QWidget* parent) : QWidget(parent) {
  auto* form = new QFormLayout(this);
  form->setContentsMargins(0, 0, 0, 0);
  file_ = new QLabel(this);
  file_->setObjectName(prefix + "_background_file");
  // One line, cut at the form's edge, the whole path in its tool tip: a word-wrapped label would
  // make the form's height depend on its width, which the groups above it do not follow.
  file_->setSizePolicy(QSizePolicy::Ignored, QSizePolicy::Preferred);
  import_ = new QPushButton(tr("&Import background data…"), this);
  import_->setObjectName(prefix + "_background_import");
  import_->setToolTip(tr("A CSV file with one row per source; you choose the column with the measurements. The case "
                         "keeps the file's path relative to the case."));
  auto* file_row = new QHBoxLayout;
  file_row->addWidget(file_, 1);
  file_row->addWidget(import_);
  form->addRow(tr("File"), file_row);
  column_ = new QLineEdit(this);
  column_->setObjectName(prefix + "_background_column");
  column_->setToolTip(tr("The column of the file that holds the measurements (its name in the header)."));
  form->addRow(tr("C&olumn"), column_);
  bandwidth_ = new QLineEdit(this);
  bandwidth_->setObjectName(prefix + "_bandwidth");
  bandwidth_->setPlaceholderText(tr("Silverman's rule of thumb"));
  bandwidth_->setToolTip(tr("The kernel bandwidth (greater than 0); leave empty for Silverman's rule of thumb."));
  form->addRow(tr("&Bandwidth"), bandwidth_);
  method_ = new QComboBox(this);
  method_->setObjectName(prefix + "_summation");
  method_->addItem(tr("fast (bounded relative error)"), "fast");
  method_->addItem(tr("exact (every background value)"), "exact");
  form->addRow(tr("&Summation"), method_);

  connect(import_, &QPushButton::clicked, this, &BackgroundDataFields::importRequested);
  for (QLineEdit* line : {column_, bandwidth_}) commit_typing(line, [this](const QString&) { emit edited(); });
  connect(method_, &QComboBox::activated, this, &BackgroundDataFields::edited);
}

void BackgroundDataFields::showKde(const json& kde) {
  const auto file = member(kde, "file");
  file_->setText(file ? value_text(file) : tr("No background data yet: import a file."));
  file_->setToolTip(file_->text());
  show_value(column_, member(kde, "column"));
  show_value(bandwidth_, member(kde, "bandwidth"));
  const json method = member(kde, "method").value_or(json("fast"));
  method_->setCurrentIndex(
      std::max(0, method_->findData(QString::fromStdString(method.is_string() ? method.get<std::string>() : "fast"))));
}

json BackgroundDataFields::typedKde(const json& given) const {
  json kde = given.is_object() ? given : json::object();
  kde["column"] = column_->text().trimmed().toStdString();
  if (bandwidth_->text().trimmed().isEmpty()) kde.erase("bandwidth");
  else kde["bandwidth"] = number_or_text(bandwidth_->text().trimmed());
  if (method_->currentData().toString() == "exact") kde["method"] = "exact";
  else kde.erase("method");
  return kde;
}

}  // namespace counterpoise::editor

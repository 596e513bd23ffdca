#include "app/editor/frequency_source_box.hpp"

#include <QFormLayout>
#include <QHBoxLayout>
#include <QLabel>
#include <QLineEdit>
#include <QPushButton>

#include "app/editor/field_widgets.hpp"
#include "core/validation/display_text.hpp"

namespace counterpoise::editor {

using nlohmann::json;

QLineEdit* new_minimum_frequency_field(QWidget* parent, const QString& object_name) {
  return new_line_field(parent, object_name, QObject::tr("automatic: 5/2N wherever the database size is known"),
                        QObject::tr("The smallest allele frequency used: a number in (0, 1], \"5/2N\" for a database of N "
                                    "people, or \"none\". It applies to rare alleles and to alleles not in the table."));
}

FrequencySourceBox::FrequencySourceBox(const QString& name_prefix, QWidget* parent)
    : QGroupBox(tr("Allele frequencies"), parent) {
  auto* form = new QFormLayout(this);
  source_ = new QLabel(this);
  source_->setObjectName(name_prefix + "_frequency_source");
  source_->setWordWrap(true);
  source_->setTextFormat(Qt::PlainText);
  import_ = new QPushButton(tr("&Import frequency table…"), this);
  import_->setToolTip(tr("A CSV table with the columns locus, allele, frequency (or count). The case keeps the file's "
                         "path relative to the case."));
  auto* source_row = new QHBoxLayout;
  source_row->addWidget(source_, 1);
  source_row->addWidget(import_);
  form->addRow(tr("Source"), source_row);
  database_size_ = new_line_field(this, name_prefix + "_database_size", tr("people in the database, e.g. 250"),
                                  tr("The number of people N in the frequency database, for the 5/2N minimum frequency and "
                                     "for frequencies given as counts. A JSON object gives it per locus."));
  form->addRow(tr("&Database size (N)"), database_size_);
  message_ = new FieldMessage(this);
  form->addRow(message_);

  connect(import_, &QPushButton::clicked, this, &FrequencySourceBox::importRequested);
  connect(database_size_, &QLineEdit::editingFinished, this, [this] { databaseSizeEdited(); });
}

void FrequencySourceBox::databaseSizeEdited() {
  json frequencies = frequencies_.is_object() ? frequencies_ : json::object();
  const QString text = database_size_->text().trimmed();
  if (text.isEmpty()) {
    frequencies.erase("database_size");
  } else if (text.startsWith('{')) {
    const json parsed = json::parse(text.toStdString(), nullptr, false);
    frequencies["database_size"] = parsed.is_discarded() ? json(text.toStdString()) : parsed;
  } else {
    frequencies["database_size"] = number_or_text(text);
  }
  if (frequencies != frequencies_) emit edited(frequencies);
}

void FrequencySourceBox::useFile(const QString& relative_path) {
  json frequencies = json::object();
  for (const char* kept : {"database_size", "sum_tolerance"})
    if (frequencies_.is_object() && frequencies_.contains(kept)) frequencies[kept] = frequencies_[kept];
  frequencies["file"] = relative_path.toStdString();
  emit edited(frequencies);
}

void FrequencySourceBox::showFrequencies(const json& frequencies, const std::vector<validation::Problem>& problems) {
  frequencies_ = frequencies;
  QString source = tr("No allele frequencies yet: import a frequency table.");
  if (frequencies.is_object()) {
    if (frequencies.contains("file"))
      source = tr("From the file %1")
                   .arg(frequencies["file"].is_string()
                            ? QString::fromStdString(validation::display_text(frequencies["file"].get<std::string>()))
                            : value_text(frequencies["file"]));
    else if (frequencies.contains("table")) source = tr("A table in the case file (%n loci)", nullptr, static_cast<int>(frequencies["table"].size()));
    else if (frequencies.contains("counts")) source = tr("Allele counts in the case file (%n loci)", nullptr, static_cast<int>(frequencies["counts"].size()));
  }
  source_->setText(source);
  if (!database_size_->hasFocus()) {
    const json size = frequencies.is_object() ? frequencies.value("database_size", json()) : json();
    database_size_->setText(size.is_null() ? QString() : size.is_object() ? QString::fromStdString(size.dump()) : value_text(size));
  }
  message_->showProblems(problems, import_);
}

}  // namespace counterpoise::editor

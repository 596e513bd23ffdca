#include "app/editor/probability_editor.hpp"

#include <QHBoxLayout>
#include <QVBoxLayout>

namespace counterpoise::editor {

using nlohmann::json;

ProbabilityEditor::ProbabilityEditor(QWidget* parent) : QWidget(parent) {
  auto* outer = new QVBoxLayout(this);
  outer->setContentsMargins(0, 0, 0, 0);
  auto* row = new QHBoxLayout;
  form_ = new QComboBox(this);
  form_->addItems({tr("Single value"), tr("Range"), tr("Beta distribution"), tr("Survey counts")});
  form_->setToolTip(tr("How the probability is assigned: one value, a range of plausible values, a Beta "
                       "distribution, or counts from a survey (k of n, by Laplace's rule of succession)."));
  row->addWidget(form_);
  pages_ = new QStackedWidget(this);
  auto make_page = [&] {
    auto* page = new QWidget(pages_);
    auto* layout = new QHBoxLayout(page);
    layout->setContentsMargins(0, 0, 0, 0);
    pages_->addWidget(page);
    return page;
  };
  QWidget* page = make_page();
  point_ = addLine(page, tr("e.g. 0.95"), tr("A probability between 0 and 1."));
  page = make_page();
  low_ = addLine(page, tr("low"), tr("The lowest plausible value."));
  page->layout()->addWidget(new QLabel(tr("to"), page));
  high_ = addLine(page, tr("high"), tr("The highest plausible value."));
  scale_ = new QComboBox(page);
  scale_->addItems({tr("even on the log scale"), tr("even on the plain scale")});
  scale_->setToolTip(tr("How values inside the range are weighted when the uncertainty is computed."));
  page->layout()->addWidget(scale_);
  page = make_page();
  page->layout()->addWidget(new QLabel(tr("Beta("), page));
  beta_a_ = addLine(page, tr("a"), tr("First shape parameter (> 0)."));
  page->layout()->addWidget(new QLabel(",", page));
  beta_b_ = addLine(page, tr("b"), tr("Second shape parameter (> 0)."));
  page->layout()->addWidget(new QLabel(")", page));
  page = make_page();
  k_ = addLine(page, tr("k"), tr("How many of the surveyed cases showed the findings."));
  page->layout()->addWidget(new QLabel(tr("of"), page));
  n_ = addLine(page, tr("n"), tr("How many cases were surveyed."));
  row->addWidget(pages_, 1);
  outer->addLayout(row);
  mean_ = new QLabel(this);
  mean_->setStyleSheet("color: palette(mid);");
  outer->addWidget(mean_);
  message_ = new FieldMessage(this);
  outer->addWidget(message_);

  connect(form_, &QComboBox::activated, this, [this](int index) {
    pages_->setCurrentIndex(index);
    emitEdited();
  });
  connect(scale_, &QComboBox::activated, this, [this] { emitEdited(); });
  setFocusProxy(form_);
}

QLineEdit* ProbabilityEditor::addLine(QWidget* page, const QString& placeholder, const QString& tooltip) {
  auto* line = new QLineEdit(page);
  line->setPlaceholderText(placeholder);
  line->setToolTip(tooltip);
  page->layout()->addWidget(line);
  commit_typing(line, [this](const QString&) { emitEdited(); });
  return line;
}

json ProbabilityEditor::currentValue() const {
  switch (form()) {
    case Form::point:
      return number_or_text(point_->text());
    case Form::interval: {
      json value{{"interval", json::array({number_or_text(low_->text()), number_or_text(high_->text())})}};
      value["scale"] = scale_->currentIndex() == 0 ? "log" : "linear";
      return value;
    }
    case Form::beta:
      return json{{"beta", json::array({number_or_text(beta_a_->text()), number_or_text(beta_b_->text())})}};
    case Form::counts: {
      json counts{{"k", number_or_text(k_->text())}, {"n", number_or_text(n_->text())}};
      if (prior_) counts["prior"] = *prior_;
      return json{{"counts", counts}};
    }
  }
  return {};
}

void ProbabilityEditor::emitEdited() {
  // A form chosen with empty fields starts from sensible values rather than blanks.
  if (form() == Form::interval && low_->text().isEmpty() && high_->text().isEmpty()) low_->setText("0.1"), high_->setText("0.5");
  if (form() == Form::beta && beta_a_->text().isEmpty() && beta_b_->text().isEmpty()) beta_a_->setText("1"), beta_b_->setText("1");
  if (form() == Form::counts && k_->text().isEmpty() && n_->text().isEmpty()) k_->setText("1"), n_->setText("100");
  if (form() == Form::point && point_->text().isEmpty()) point_->setText("0.5");
  emit edited(currentValue());
}

void ProbabilityEditor::showValue(const std::optional<json>& value) {
  Form shown = Form::point;
  auto element = [](const json& array, std::size_t i) -> std::optional<json> {
    if (array.is_array() && i < array.size()) return array[i];
    return std::nullopt;
  };
  if (value && value->is_object()) {
    if (value->contains("interval")) {
      shown = Form::interval;
      show_value(low_, element((*value)["interval"], 0));
      show_value(high_, element((*value)["interval"], 1));
      scale_->setCurrentIndex(value->value("scale", std::string("log")) == "linear" ? 1 : 0);
    } else if (value->contains("beta")) {
      shown = Form::beta;
      show_value(beta_a_, element((*value)["beta"], 0));
      show_value(beta_b_, element((*value)["beta"], 1));
    } else if (value->contains("counts")) {
      shown = Form::counts;
      const json& counts = (*value)["counts"];
      auto member = [&](const char* key) -> std::optional<json> {
        if (counts.is_object() && counts.contains(key)) return counts[key];
        return std::nullopt;
      };
      show_value(k_, member("k"));
      show_value(n_, member("n"));
      prior_ = member("prior");
    }
  } else {
    show_value(point_, value);
  }
  if (form_->currentIndex() != static_cast<int>(shown)) form_->setCurrentIndex(static_cast<int>(shown));
  pages_->setCurrentIndex(static_cast<int>(shown));
}

void ProbabilityEditor::showMean(const QString& text) {
  mean_->setText(text);
  mean_->setVisible(!text.isEmpty());
}

QString ProbabilityEditor::typedValueProblem() const {
  struct Typed {
    QLineEdit* line;
    QString name, hint;
  };
  const QString probability = tr("a number between 0 and 1, for example 0.25");
  std::vector<Typed> shown;
  switch (form()) {
    case Form::point: shown = {{point_, tr("The probability"), probability}}; break;
    case Form::interval:
      shown = {{low_, tr("The low value"), tr("a number between 0 and 1, for example 0.1")},
               {high_, tr("The high value"), tr("a number between 0 and 1, for example 0.5")}};
      break;
    case Form::beta:
      shown = {{beta_a_, tr("The first parameter"), tr("a number greater than 0, for example 2")},
               {beta_b_, tr("The second parameter"), tr("a number greater than 0, for example 8")}};
      break;
    case Form::counts:
      shown = {{k_, tr("k"), tr("a whole number of cases, for example 3")},
               {n_, tr("n"), tr("the whole number of cases surveyed, for example 412")}};
      break;
  }
  for (const auto& typed : shown) {
    const QString text = typed.line->text().trimmed();
    const json value = number_or_text(text);
    if (text.isEmpty()) return tr("%1 is empty: enter %2.").arg(typed.name, typed.hint);
    if (!value.is_number()) return tr("%1 “%2” is not a number: enter %3.").arg(typed.name, text, typed.hint);
    if (typed.line == point_ && !(value.get<double>() >= 0.0 && value.get<double>() <= 1.0))
      return tr("%1 %2 is not between 0 and 1: enter %3.").arg(typed.name, text, typed.hint);
  }
  return {};
}

void ProbabilityEditor::showProblems(const std::vector<validation::Problem>& problems) {
  // What the user typed, in the user's words, rather than the file format's (which lists the JSON
  // forms a probability may take); the core's message stands for every other problem.
  const QString typed = problems.empty() ? QString() : typedValueProblem();
  if (!typed.isEmpty()) {
    message_->showProblems({{problems.front().where, typed.toStdString()}}, pages_->currentWidget());
    return;
  }
  message_->showProblems(problems, pages_->currentWidget());
}

}  // namespace counterpoise::editor

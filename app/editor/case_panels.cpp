#include "app/editor/case_panels.hpp"

#include <QFormLayout>
#include <QFrame>
#include <QLabel>
#include <QObject>
#include <QVBoxLayout>

#include "app/editor/alternatives_editor.hpp"
#include "app/editor/field_widgets.hpp"
#include "core/casefile/proposition_level.hpp"

namespace counterpoise::editor {

SectionForm* make_case_details_panel(CaseDocument* document, EditFacade* edits, QWidget* parent) {
  auto* form = new SectionForm(document, edits, parent);
  form->addHeading(QObject::tr("Case details"));
  form->addLine("case", "reference", QObject::tr("&Reference"), QObject::tr("The laboratory's case reference."));
  form->addLine("case", "title", QObject::tr("&Title"), QObject::tr("A short title for the case."));
  form->addLine("case", "laboratory", QObject::tr("&Laboratory"), QObject::tr("The laboratory issuing the evaluation."));
  form->addLine("case", "examiner", QObject::tr("&Examiner"), QObject::tr("The scientist responsible for the evaluation."));
  form->addLine("case", "requested_by", QObject::tr("Re&quested by"), QObject::tr("Who asked for the evaluation."));
  form->addText("case", "purpose", QObject::tr("&Question asked"),
                QObject::tr("What the scientist was asked to help with, in the words of the request."), 3);
  form->addLine("case", "date", QObject::tr("&Date"), QObject::tr("Date of the evaluation (YYYY-MM-DD)."));
  form->addChoice("mode", "", QObject::tr("&Mode"),
                  QObject::tr("Casework: a real case; posterior probabilities appear only as an illustration for the "
                              "fact-finder. Training: a teaching case; the prior explorer is shown prominently."),
                  {{QObject::tr("Casework"), "casework"}, {QObject::tr("Training"), "training"}});
  return form;
}

SectionForm* make_propositions_panel(CaseDocument* document, EditFacade* edits, QWidget* parent) {
  auto* form = new SectionForm(document, edits, parent);
  form->addHeading(QObject::tr("Propositions"));
  form->addNote(QObject::tr("Hp and its alternative Hd (or several alternatives), mutually exclusive, framed before the "
                            "findings are evaluated. Every probability in this case is a probability of the findings "
                            "if one of them is true."));
  // No level is chosen for the user: a new case starts with none, and the core names it missing.
  std::vector<std::pair<QString, QString>> levels{{QObject::tr("(choose the level)"), QString()}};
  for (auto level : {casefile::PropositionLevel::sub_source, casefile::PropositionLevel::source,
                     casefile::PropositionLevel::activity, casefile::PropositionLevel::offence}) {
    const QString name = QString::fromStdString(std::string(casefile::level_name(level)));
    levels.emplace_back(name, name);
  }
  form->addChoice("propositions", "level", QObject::tr("&Level in the hierarchy"),
                  QObject::tr("Sub-source (whose DNA), source (which object), activity (what was done) or offence "
                              "(the court's question). An LR at one level does not answer a question at another."),
                  levels);
  form->addText("propositions", "hp", QObject::tr("&Hp (prosecution)"), QObject::tr("The prosecution's proposition."), 2);
  TextField* hd = form->addText("propositions", "hd", QObject::tr("H&d (defence)"),
                                QObject::tr("The defence's proposition, or the alternative the scientist assumes when none is given."), 2);
  // The list of alternatives sits where Hd is, and Hd's row is hidden while the case has several.
  auto* alternatives = new AlternativesEditor(document, edits, form);
  int hd_row = 0;
  QFormLayout::ItemRole role;
  form->layout()->getWidgetPosition(hd, &hd_row, &role);
  form->layout()->insertRow(hd_row + 2, QObject::tr("Alternatives to Hp"), alternatives);
  QObject::connect(alternatives, &AlternativesEditor::severalChanged, form,
                   [form, hd](bool several) { form->layout()->setRowVisible(hd, !several); });
  form->addText("propositions", "conditioning_information", QObject::tr("&Conditioning information"),
                QObject::tr("What the scientist was told and takes as given: every probability is conditioned on it."), 4);
  form->addText("propositions", "assumptions", QObject::tr("&Assumptions (one per line)"),
                QObject::tr("Assumptions behind the evaluation; the report lists them."), 4, true);
  return form;
}

QWidget* make_first_steps_panel(const std::function<void(int)>& show_step, QWidget* parent) {
  auto* panel = new QFrame(parent);
  panel->setObjectName("firstSteps");
  panel->setStyleSheet("#firstSteps { background: #eef4fb; border: 1px solid #b7cde6; border-radius: 4px; }");
  auto* layout = new QVBoxLayout(panel);
  auto* text = new QLabel(panel);
  text->setWordWrap(true);
  text->setTextFormat(Qt::RichText);
  text->setText(QObject::tr(
      "<b>First steps with a new case</b><ol>"
      "<li><a href='1'>Propositions</a>: state Hp and Hd and the level they address, before looking at the "
      "findings.</li>"
      "<li><a href='2'>Findings</a>: add each item of findings with the probability of the findings if Hp is true and "
      "if Hd is true.</li>"
      "<li><a href='5'>Guard</a>: read what the wording guard flags in your sentences, and rephrase them.</li>"
      "<li><a href='report'>Report</a>: preview the report, save the case as a case file (.cpcase), then issue the "
      "report, which seals that revision.</li></ol>"));
  QObject::connect(text, &QLabel::linkActivated, panel, [show_step](const QString& link) {
    show_step(link == "report" ? -1 : link.toInt());
  });
  layout->addWidget(text);
  return panel;
}

}  // namespace counterpoise::editor

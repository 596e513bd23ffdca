#include "app/editor/case_panels.hpp"

#include <QObject>

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
  form->addNote(QObject::tr("Two mutually exclusive propositions, framed before the findings are evaluated. Every "
                            "probability in this case is a probability of the findings if one of them is true."));
  std::vector<std::pair<QString, QString>> levels;
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
  form->addText("propositions", "hd", QObject::tr("H&d (defence)"),
                QObject::tr("The defence's proposition, or the alternative the scientist assumes when none is given."), 2);
  form->addText("propositions", "conditioning_information", QObject::tr("&Conditioning information"),
                QObject::tr("What the scientist was told and takes as given: every probability is conditioned on it."), 4);
  form->addText("propositions", "assumptions", QObject::tr("&Assumptions (one per line)"),
                QObject::tr("Assumptions behind the evaluation; the report lists them."), 4, true);
  return form;
}

}  // namespace counterpoise::editor

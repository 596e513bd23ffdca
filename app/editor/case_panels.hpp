#pragma once
// The case details and the propositions panels, as SectionForms.

#include <functional>

#include "app/editor/section_form.hpp"

namespace counterpoise::editor {

// Reference, title, laboratory, examiner, the question asked, who asked, date, and the mode.
SectionForm* make_case_details_panel(CaseDocument* document, EditFacade* edits, QWidget* parent);
// Hp and Hd, their level in the hierarchy, the conditioning information and the assumptions.
SectionForm* make_propositions_panel(CaseDocument* document, EditFacade* edits, QWidget* parent);
// The short first-steps panel a new case shows: propositions, findings, the guard, the report.
// Its links call `show_step` with a tab index (MainWindow::Tab), or -1 for the report.
QWidget* make_first_steps_panel(const std::function<void(int)>& show_step, QWidget* parent);

}  // namespace counterpoise::editor

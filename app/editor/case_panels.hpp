#pragma once
// The case details and the propositions panels, as SectionForms.

#include "app/editor/section_form.hpp"

namespace counterpoise::editor {

// Reference, title, laboratory, examiner, the question asked, who asked, date, and the mode.
SectionForm* make_case_details_panel(CaseDocument* document, EditFacade* edits, QWidget* parent);
// Hp and Hd, their level in the hierarchy, the conditioning information and the assumptions.
SectionForm* make_propositions_panel(CaseDocument* document, EditFacade* edits, QWidget* parent);

}  // namespace counterpoise::editor

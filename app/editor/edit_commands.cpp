#include "app/editor/edit_commands.hpp"

#include <QUndoStack>

#include <algorithm>

#include "app/editor/case_document.hpp"
#include "core/casefile/item_templates.hpp"
#include "core/interchange/case_json.hpp"
#include "core/models/item_fields.hpp"

namespace counterpoise::editor {

using nlohmann::json;

namespace {

// Records the outcome of a command's first redo (run by QUndoStack::push) and marks a failed
// command obsolete so the stack drops it.
void record(QUndoCommand* command, bool*& made, bool ok) {
  if (made) *made = ok;
  made = nullptr;
  if (!ok) command->setObsolete(true);
}

QString field_label(const store::EntityRef& entity, const std::string& field) {
  const QString where = entity.kind == store::EntityKind::item ? QObject::tr("item %1").arg(QString::fromStdString(entity.key))
                                                                : QString::fromStdString(entity.key);
  return field.empty() ? where : QObject::tr("%1, %2").arg(where, QString::fromStdString(field));
}

}  // namespace

SetFieldCommand::SetFieldCommand(CaseDocument* document, store::EntityRef entity, std::string field,
                                 std::optional<json> value, const QString& text, bool* made)
    : QUndoCommand(text.isEmpty() ? QObject::tr("Edit %1").arg(field_label(entity, field)) : text),
      document_(document), entity_(std::move(entity)), field_(std::move(field)),
      old_value_(document->value(entity_, field_)), new_value_(std::move(value)), made_(made) {}

void SetFieldCommand::redo() {
  const bool ok = document_->setField(entity_, field_, new_value_);
  record(this, made_, ok);
}

void SetFieldCommand::undo() { document_->setField(entity_, field_, old_value_); }

AddItemCommand::AddItemCommand(CaseDocument* document, json item, std::size_t position, bool* made)
    : QUndoCommand(QObject::tr("Add item %1").arg(QString::fromStdString(item.value("id", std::string())))),
      document_(document), item_(std::move(item)), position_(position), made_(made) {}

void AddItemCommand::redo() { record(this, made_, document_->addItem(item_, position_)); }
void AddItemCommand::undo() { document_->removeItem(item_.value("id", std::string())); }

RemoveItemCommand::RemoveItemCommand(CaseDocument* document, std::string id, bool* made)
    : QUndoCommand(QObject::tr("Remove item %1").arg(QString::fromStdString(id))), document_(document), id_(std::move(id)),
      made_(made) {
  if (auto body = document->itemBody(id_)) item_ = *body;
  if (auto position = document->state().item_position(id_)) position_ = *position;
}

void RemoveItemCommand::redo() { record(this, made_, !item_.is_null() && document_->removeItem(id_)); }
void RemoveItemCommand::undo() { document_->addItem(item_, position_); }

MoveItemCommand::MoveItemCommand(CaseDocument* document, std::string id, std::size_t to, bool* made)
    : QUndoCommand(QObject::tr("Move item %1").arg(QString::fromStdString(id))), document_(document), id_(std::move(id)),
      to_(to), made_(made) {
  if (auto position = document->state().item_position(id_)) from_ = *position;
}

void MoveItemCommand::redo() { record(this, made_, from_ != to_ && document_->moveItem(id_, to_)); }
void MoveItemCommand::undo() { document_->moveItem(id_, from_); }

ReplaceDocumentCommand::ReplaceDocumentCommand(CaseDocument* document, json replacement, const QString& text, bool* made)
    : QUndoCommand(text), document_(document), old_document_(document->document()), new_document_(std::move(replacement)),
      made_(made) {}

void ReplaceDocumentCommand::redo() { record(this, made_, document_->replaceDocument(new_document_)); }
void ReplaceDocumentCommand::undo() { document_->replaceDocument(old_document_); }

// --- facade ----------------------------------------------------------------------------------

namespace {
bool set_field(CaseDocument* document, QUndoStack* stack, const store::EntityRef& entity, const std::string& field,
               std::optional<json> value) {
  if (document->value(entity, field) == value) return true;
  bool made = false;
  stack->push(new SetFieldCommand(document, entity, field, std::move(value), {}, &made));
  return made;
}
}  // namespace

bool EditFacade::setSectionField(const std::string& section, const std::string& field, std::optional<json> value) {
  return set_field(document_, stack_, store::EntityRef::section(section), field, std::move(value));
}

bool EditFacade::setItemField(const std::string& id, const std::string& field, std::optional<json> value) {
  return set_field(document_, stack_, store::EntityRef::item(id), field, std::move(value));
}

bool EditFacade::setSection(const std::string& section, std::optional<json> value) {
  return setSectionField(section, "", std::move(value));
}

json EditFacade::starting_fields(const std::string& model) { return casefile::starting_fields(model); }

std::string EditFacade::addItem(const std::string& model) {
  const std::string id = document_->freshItemId();
  json item = starting_fields(model);
  item["id"] = id;
  item["model"] = model;
  item["title"] = QObject::tr(casefile::kNewItemTitle).toStdString();
  bool made = false;
  stack_->push(new AddItemCommand(document_, item, document_->state().items().size(), &made));
  return made ? id : std::string();
}

bool EditFacade::removeItem(const std::string& id) {
  bool made = false;
  stack_->push(new RemoveItemCommand(document_, id, &made));
  return made;
}

bool EditFacade::moveItem(const std::string& id, std::size_t position) {
  bool made = false;
  stack_->push(new MoveItemCommand(document_, id, position, &made));
  return made;
}

bool EditFacade::setItemModelFields(const std::string& id, const json& model_fields) {
  auto body = document_->itemBody(id);
  if (!body || !model_fields.is_object()) return false;
  json replaced = json::object();
  for (const auto& common : models::kCommonItemFields) {
    const std::string key(common);
    if (body->contains(key)) replaced[key] = (*body)[key];
  }
  for (auto it = model_fields.begin(); it != model_fields.end(); ++it)
    if (!replaced.contains(it.key())) replaced[it.key()] = it.value();
  if (replaced == *body) return true;
  bool made = false;
  stack_->push(new SetFieldCommand(document_, store::EntityRef::item(id), "", replaced,
                                   QObject::tr("Edit the model of item %1").arg(QString::fromStdString(id)), &made));
  return made;
}

bool EditFacade::changeItemModel(const std::string& id, const std::string& model) {
  auto body = document_->itemBody(id);
  if (!body) return false;
  if (body->value("model", std::string()) == model) return true;
  json fields = starting_fields(model);
  fields["model"] = model;
  json replaced = json::object();
  for (const auto& common : models::kCommonItemFields) {
    const std::string key(common);
    if (key != "model" && body->contains(key)) replaced[key] = (*body)[key];
  }
  replaced.update(fields);
  bool made = false;
  stack_->push(new SetFieldCommand(document_, store::EntityRef::item(id), "", replaced,
                                   QObject::tr("Change the model of item %1").arg(QString::fromStdString(id)), &made));
  return made;
}

QString EditFacade::setAlternatives(const json& alternatives, bool checked, const QString& text) {
  const store::EntityRef propositions = store::EntityRef::section("propositions");
  const auto current = document_->value(propositions, "alternatives");
  if (current == alternatives) return {};
  if (checked) {
    // Only a problem this edit brings is refused: one the list had before (a new alternative's
    // empty text) is the core's to name, and does not block editing another field.
    std::vector<std::string> before;
    if (current)
      for (const auto& problem : interchange::alternatives_problems(*current)) before.push_back(problem.text());
    for (const auto& problem : interchange::alternatives_problems(alternatives))
      if (std::find(before.begin(), before.end(), problem.text()) == before.end())
        return QString::fromStdString(interchange::alternative_problem_words(problem, alternatives));
  }
  QString failure;
  const auto connection = QObject::connect(document_, &CaseDocument::editFailed, [&](const QString& why) { failure = why; });
  bool made = false;
  stack_->push(new SetFieldCommand(document_, propositions, "alternatives", alternatives, text, &made));
  QObject::disconnect(connection);
  return made ? QString() : (failure.isEmpty() ? QObject::tr("The edit was not made.") : failure);
}

bool EditFacade::applyAlternativesEdit(const interchange::AlternativesEdit& edit, const QString& text) {
  const int before = stack_->count();
  stack_->beginMacro(text);
  bool made = false;
  stack_->push(new SetFieldCommand(document_, store::EntityRef::section("propositions"), "", edit.propositions, {}, &made));
  bool all = made;
  for (const auto& [id, body] : edit.items) {
    if (!all) break;
    stack_->push(new SetFieldCommand(document_, store::EntityRef::item(id), "", body, {}, &made));
    all = made;
  }
  stack_->endMacro();
  // A change made in part (the store refused a later step) is taken back whole.
  if (!all && stack_->count() > before) stack_->undo();
  return all;
}

bool EditFacade::replaceDocument(const json& document, const QString& text) {
  bool made = false;
  stack_->push(new ReplaceDocumentCommand(document_, document, text, &made));
  return made;
}

}  // namespace counterpoise::editor

#pragma once
// The edit facade: every change to a case is one of these QUndoCommands pushed on the
// document's QUndoStack, so every edit can be undone and (with a case store) every edit is one
// committed transaction with its audit row — undo included, which the audit shows as a new edit.
// Widgets call EditFacade; nothing else changes a CaseDocument.

#include <QString>
#include <QUndoCommand>

#include <optional>
#include <string>

#include <nlohmann/json.hpp>

#include "core/interchange/alternative_edits.hpp"
#include "core/store/case_state.hpp"

class QUndoStack;

namespace counterpoise::editor {

class CaseDocument;

// Sets (or with nullopt removes) one field of a section or item. One command is one deliberate
// change: typing reaches the facade only when it is committed (see commit_typing), so a command
// is never merged with the next and each undo step is one audit row of a case file.
class SetFieldCommand : public QUndoCommand {
 public:
  SetFieldCommand(CaseDocument* document, store::EntityRef entity, std::string field,
                  std::optional<nlohmann::json> value, const QString& text, bool* made);
  void redo() override;
  void undo() override;

 private:
  CaseDocument* document_;
  store::EntityRef entity_;
  std::string field_;
  std::optional<nlohmann::json> old_value_, new_value_;
  bool* made_;  // set by the first redo (inside push), then forgotten
};

class AddItemCommand : public QUndoCommand {
 public:
  AddItemCommand(CaseDocument* document, nlohmann::json item, std::size_t position, bool* made);
  void redo() override;
  void undo() override;

 private:
  CaseDocument* document_;
  nlohmann::json item_;
  std::size_t position_;
  bool* made_;
};

class RemoveItemCommand : public QUndoCommand {
 public:
  RemoveItemCommand(CaseDocument* document, std::string id, bool* made);
  void redo() override;
  void undo() override;

 private:
  CaseDocument* document_;
  std::string id_;
  nlohmann::json item_;
  std::size_t position_ = 0;
  bool* made_;
};

class MoveItemCommand : public QUndoCommand {
 public:
  MoveItemCommand(CaseDocument* document, std::string id, std::size_t to, bool* made);
  void redo() override;
  void undo() override;

 private:
  CaseDocument* document_;
  std::string id_;
  std::size_t from_ = 0, to_;
  bool* made_;
};

// Replaces the whole document (recovery of unsaved edits of a JSON file).
class ReplaceDocumentCommand : public QUndoCommand {
 public:
  ReplaceDocumentCommand(CaseDocument* document, nlohmann::json replacement, const QString& text, bool* made);
  void redo() override;
  void undo() override;

 private:
  CaseDocument* document_;
  nlohmann::json old_document_, new_document_;
  bool* made_;
};

// The operations widgets may ask for. Each pushes one command (or a macro of several) and
// returns whether the edit was made.
class EditFacade {
 public:
  EditFacade(CaseDocument* document, QUndoStack* stack) : document_(document), stack_(stack) {}

  bool setSectionField(const std::string& section, const std::string& field, std::optional<nlohmann::json> value);
  bool setItemField(const std::string& id, const std::string& field, std::optional<nlohmann::json> value);
  // Sets a whole section's value (e.g. "mode").
  bool setSection(const std::string& section, std::optional<nlohmann::json> value);
  // A new item of `model` after the others; returns its id (empty when not made).
  std::string addItem(const std::string& model);
  bool removeItem(const std::string& id);
  bool moveItem(const std::string& id, std::size_t position);
  // Changes an item's model: replaces its model fields by the new model's starting fields and
  // keeps the common ones (title, description, level, combination, notes, source data).
  bool changeItemModel(const std::string& id, const std::string& model);
  // Replaces an item's model fields by those of `model_fields` (an object), keeping common fields.
  bool setItemModelFields(const std::string& id, const nlohmann::json& model_fields);
  bool replaceDocument(const nlohmann::json& document, const QString& text);

  // The list propositions.alternatives replaced by `alternatives` (one field of the propositions:
  // one undo step, one audit row). Returns "" when made; otherwise the reason, in the user's
  // words (interchange::alternative_problem_words), when `checked` and the list has a problem the
  // current one has not (nothing is changed then), or the reason the document gave.
  QString setAlternatives(const nlohmann::json& alternatives, bool checked, const QString& text);
  // Applies a change of the alternatives that also changes items (interchange/alternative_edits:
  // a switch, a rename, a removal): the propositions and each changed item as one undo step (a
  // case file records one audit row per section or item changed). Returns whether it was made.
  bool applyAlternativesEdit(const interchange::AlternativesEdit& edit, const QString& text);

  CaseDocument* document() const { return document_; }
  QUndoStack* stack() const { return stack_; }

  // The starting fields of a model for a new item (assigned: two point values).
  static nlohmann::json starting_fields(const std::string& model);

 private:
  CaseDocument* document_;
  QUndoStack* stack_;
};

}  // namespace counterpoise::editor

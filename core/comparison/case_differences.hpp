#pragma once
// What differs between two versions of a case, in words, section by section and item by item:
// the propositions and their level, the conditioning information, the assumptions, each input
// value (old → new), items added, removed, included or left out, data files whose bytes changed
// (by SHA-256), and wording. A difference is one top-level member of a section or an item, the
// same granularity as the case store's audited edits (an edit sets one member), so a revision
// compared with its parent lists exactly the members its audited edits changed.

#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/comparison/case_version.hpp"
#include "core/models/data_file.hpp"

namespace counterpoise::comparison {

enum class DifferenceKind {
  propositions,   // Hp, Hd or the level they address
  conditioning,   // the conditioning information
  assumptions,    // the case's assumptions
  case_details,   // reference, title, examiner, purpose, ...
  setting,        // prior odds, uncertainty settings, verbal scale, mode, report, wording rules
  item_added,
  item_removed,
  item_included,  // left out in the first version, included in the combined LR in the second
  item_excluded,  // the reverse
  input_value,    // an input of an item's model, or the model itself
  data_file,      // a data file an item reads: its name or its bytes (SHA-256)
  wording,        // an item's text: title, description, notes, source of the data, reasons
  item_level,     // the level of the hierarchy an item's LR addresses
  item_order,     // the same items in another order
};

// "propositions", "input value", "data file", ... for files; kind_words gives the sentence form.
std::string kind_name(DifferenceKind kind);
// "Propositions changed", "Input changed", "Item added", ... for readers.
std::string kind_words(DifferenceKind kind);

// Where a difference is: the section ("propositions", "items", ...), the item id (items only)
// and the member ("" for the whole section or item).
struct DifferencePath {
  std::string section;
  std::string item_id;
  std::string field;
  friend bool operator==(const DifferencePath&, const DifferencePath&) = default;
};

// A data file named by a changed member, on each side (nullopt: the side reads no such file).
struct DataFileChange {
  std::string field;  // the item field naming the file ("frequencies.file")
  std::optional<models::DataFileUse> old_use, new_use;
};

struct Difference {
  DifferenceKind kind = DifferenceKind::input_value;
  DifferencePath path;
  std::string place;  // in words: "P(E|Hp) of E1", "Hp (propositions)", "item E5"
  std::optional<nlohmann::json> old_value, new_value;  // as written; nullopt: absent
  std::vector<DataFileChange> files;                    // data_file only
  // Whether it can move an item's LR: a model input or data file of an item in both versions,
  // its inclusion in the combined LR, or the item itself when added or removed.
  bool enters_lr() const;
  // Whether it is text a person wrote (propositions, conditioning information, assumptions,
  // an item's wording), which the reasoning guard reads.
  bool is_wording() const;
};

// The differences between `a` (the first version) and `b`, in document order: the case
// details, then the other sections by name, then the items in b's order (removed items where
// they stood in a). Identical cases give none. Never throws for well-formed cases.
std::vector<Difference> list_differences(const CaseVersion& a, const CaseVersion& b);

// A value in words: a number through the one formatter as entered ("0.95", "2 × 10⁴"), text as
// it is, true/false as "yes"/"no", a list in brackets, an object as "key value; ...", an absent
// value as "(absent)". The text is untrusted: escape it (display_text) where it is printed.
std::string value_words(const std::optional<nlohmann::json>& value);

// "vale-str-frequencies.csv (SHA-256 3f2a…, 1 204 bytes)" or "(none)".
std::string data_file_words(const std::optional<models::DataFileUse>& use);

}  // namespace counterpoise::comparison

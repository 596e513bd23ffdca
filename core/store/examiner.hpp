#pragma once
// Who makes a change in a case store. Every audit row records two things: the examiner's
// declared name (given by the person: --examiner, a setting, or the editor's prompt) and the
// operating-system account the program runs under (taken from the system, never from input).
// The name is what the report shows; the account is what the machine knows.

#include <cstddef>
#include <filesystem>
#include <optional>
#include <string>
#include <string_view>

namespace counterpoise::store {

inline constexpr std::size_t kMaxExaminerNameBytes = 200;

// A declared examiner's (or reviewer's) name, checked once so every writing call of the store
// can take it without checking again.
class ExaminerName {
 public:
  // Keeps `name` without surrounding white space. Throws validation::InvalidValue (item
  // "examiner", field "name") when nothing is left, when it is longer than
  // kMaxExaminerNameBytes bytes, is not valid UTF-8, or holds a control character (C0, DEL or
  // C1: a name is printed on terminals and in reports).
  explicit ExaminerName(std::string_view name);
  const std::string& text() const { return text_; }
  friend bool operator==(const ExaminerName&, const ExaminerName&) = default;

 private:
  std::string text_;
};

// The name of the account this process runs under (getpwuid(getuid())), else "uid N".
// Never taken from the environment, which the user can set to anything.
std::string operating_system_account();

// The settings file holding the examiner's name for this user (one line):
// $COUNTERPOISE_CONFIG_DIR/examiner, else $XDG_CONFIG_HOME/counterpoise/examiner, else
// ~/.config/counterpoise/examiner. Empty when no folder can be found.
std::filesystem::path examiner_settings_file();

// The examiner's name configured for this user: $COUNTERPOISE_EXAMINER when set and not empty,
// else the first line of examiner_settings_file() when it exists; nullopt when neither gives a
// name. Throws validation::InvalidValue when the configured text is not a valid name (so a
// mistake in the setting is named, not ignored) and validation::FileError when the settings
// file exists but cannot be read or is larger than 4 KiB.
std::optional<ExaminerName> configured_examiner_name();

}  // namespace counterpoise::store

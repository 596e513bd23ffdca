#include "core/store/examiner.hpp"

#include <cstdlib>
#include <fstream>

#include <pwd.h>
#include <unistd.h>

#include "core/store/canonical_json.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::store {

namespace {

const validation::Location kWhere{"examiner", "name"};

std::string_view trimmed(std::string_view text) {
  const auto blank = [](char c) { return c == ' ' || c == '\t' || c == '\r' || c == '\n'; };
  while (!text.empty() && blank(text.front())) text.remove_prefix(1);
  while (!text.empty() && blank(text.back())) text.remove_suffix(1);
  return text;
}

// C0 controls, DEL, and C1 controls (U+0080..U+009F, encoded C2 80..C2 9F in UTF-8).
bool has_control_character(std::string_view text) {
  for (std::size_t i = 0; i < text.size(); ++i) {
    const auto c = static_cast<unsigned char>(text[i]);
    if (c < 0x20 || c == 0x7f) return true;
    if (c == 0xc2 && i + 1 < text.size() && static_cast<unsigned char>(text[i + 1]) <= 0x9f)
      return true;
  }
  return false;
}

std::filesystem::path from_environment(const char* name) {
  const char* value = std::getenv(name);
  return value && *value ? std::filesystem::path(value) : std::filesystem::path();
}

}  // namespace

ExaminerName::ExaminerName(std::string_view name) {
  const std::string_view text = trimmed(name);
  if (text.empty())
    throw validation::InvalidValue(
        kWhere, "no examiner's name was given; every change to a case file records who made it");
  if (text.size() > kMaxExaminerNameBytes)
    throw validation::InvalidValue(kWhere, "the name is longer than " +
                                               std::to_string(kMaxExaminerNameBytes) + " bytes");
  try {
    canonical_text(nlohmann::json(std::string(text)));
  } catch (const validation::Error&) {
    throw validation::InvalidValue(kWhere, "the name is not valid UTF-8 text");
  }
  if (has_control_character(text))
    throw validation::InvalidValue(kWhere, "the name holds a control character");
  text_ = std::string(text);
}

std::string operating_system_account() {
  if (const passwd* user = ::getpwuid(::getuid()); user && user->pw_name && *user->pw_name)
    return user->pw_name;
  return "uid " + std::to_string(::getuid());
}

std::filesystem::path examiner_settings_file() {
  if (auto dir = from_environment("COUNTERPOISE_CONFIG_DIR"); !dir.empty()) return dir / "examiner";
  if (auto dir = from_environment("XDG_CONFIG_HOME"); !dir.empty())
    return dir / "counterpoise" / "examiner";
  if (auto home = from_environment("HOME"); !home.empty())
    return home / ".config" / "counterpoise" / "examiner";
  return {};
}

std::optional<ExaminerName> configured_examiner_name() {
  if (const char* value = std::getenv("COUNTERPOISE_EXAMINER"); value && *value) {
    try {
      return ExaminerName(value);
    } catch (const validation::InvalidValue& e) {
      throw validation::InvalidValue({"COUNTERPOISE_EXAMINER", {}}, e.bare_message());
    }
  }
  const std::filesystem::path file = examiner_settings_file();
  std::error_code ec;
  if (file.empty() || !std::filesystem::exists(file, ec)) return std::nullopt;
  constexpr std::uintmax_t kMaxBytes = 4096;
  if (!std::filesystem::is_regular_file(file, ec) || std::filesystem::file_size(file, ec) > kMaxBytes || ec)
    throw validation::FileError({}, file.string() + ": the examiner settings file must be a file of at most 4 KiB");
  std::ifstream in(file, std::ios::binary);
  std::string line;
  if (!in || !std::getline(in, line)) {
    if (in.eof()) return std::nullopt;  // an empty file names no one
    throw validation::FileError({}, file.string() + ": cannot read the examiner settings file");
  }
  if (trimmed(line).empty()) return std::nullopt;
  try {
    return ExaminerName(line);
  } catch (const validation::InvalidValue& e) {
    throw validation::InvalidValue({file.string(), "examiner"}, e.bare_message());
  }
}

}  // namespace counterpoise::store

#include "app/editor/guard_findings.hpp"

#include <QObject>
#include <QStringList>

#include "core/guard/case_rules.hpp"

namespace counterpoise::editor {

QString TextFinding::rewritten() const {
  const int from = static_cast<int>(finding.sentence.utf16_begin);
  const int to = static_cast<int>(finding.sentence.utf16_end);
  QString sentence_end;
  // Keep the white space that followed the sentence.
  QString replaced = text;
  QString suggestion = QString::fromStdString(finding.suggestion);
  if (!suggestion.isEmpty() && suggestion.back() != '.' && suggestion.back() != '!' && suggestion.back() != '?')
    suggestion += '.';
  QString original = text.mid(from, to - from);
  int trailing = 0;
  while (trailing < original.size() && original.at(original.size() - 1 - trailing).isSpace()) ++trailing;
  replaced.replace(from, to - from - trailing, suggestion);
  return replaced;
}

std::vector<const TextFinding*> GuardFindings::at(const TextFieldRef& where) const {
  std::vector<const TextFinding*> out;
  for (const auto& f : findings)
    if (f.where == where) out.push_back(&f);
  return out;
}

QString field_text(const std::optional<nlohmann::json>& value) {
  if (!value) return {};
  if (value->is_string()) return QString::fromStdString(value->get<std::string>());
  if (value->is_array()) {
    QStringList lines;
    for (const auto& line : *value)
      if (line.is_string()) lines << QString::fromStdString(line.get<std::string>());
    return lines.join('\n');
  }
  return {};
}

GuardService::GuardService() {
  try {
    checker_ = std::make_shared<const guard::WordingChecker>(guard::WordingChecker::load_default());
  } catch (const std::exception& error) {
    problem_ = QString::fromStdString(error.what());
  }
}

std::vector<TextFieldRef> GuardService::checked_fields(const nlohmann::json& document) {
  std::vector<TextFieldRef> fields;
  for (const char* f : {"title", "purpose"}) fields.push_back({store::EntityRef::section("case"), f});
  for (const char* f : {"hp", "hd", "conditioning_information", "assumptions"})
    fields.push_back({store::EntityRef::section("propositions"), f});
  if (document.is_object() && document.contains("items") && document["items"].is_array())
    for (const auto& item : document["items"])
      if (item.is_object() && item.contains("id") && item["id"].is_string())
        for (const char* f : {"title", "description", "notes"})
          fields.push_back({store::EntityRef::item(item["id"].get<std::string>()), f});
  return fields;
}

namespace {

std::optional<nlohmann::json> lookup(const nlohmann::json& document, const TextFieldRef& where) {
  const nlohmann::json* entity = nullptr;
  if (where.entity.kind == store::EntityKind::section) {
    auto it = document.find(where.entity.key);
    if (it != document.end()) entity = &*it;
  } else {
    for (const auto& item : document["items"])
      if (item.value("id", std::string()) == where.entity.key) entity = &item;
  }
  if (!entity || !entity->is_object()) return std::nullopt;
  auto it = entity->find(where.field);
  if (it == entity->end()) return std::nullopt;
  return *it;
}

std::string text_of(const nlohmann::json& document, const char* section, const char* field) {
  auto s = document.find(section);
  if (s == document.end() || !s->is_object()) return {};
  auto f = s->find(field);
  return f != s->end() && f->is_string() ? f->get<std::string>() : std::string();
}

}  // namespace

void GuardService::useRuleFiles(const std::vector<models::DataFile>& files) {
  const std::string key = guard::rule_files_key(files);
  if (key == rules_key_) return;
  rules_key_ = key;
  cache_.clear();
  try {
    checker_ = std::make_shared<const guard::WordingChecker>(guard::checker_with_rule_files(files));
    rules_note_.clear();
    problem_.clear();
  } catch (const validation::Error& error) {
    rules_note_ = QObject::tr("The case's rule file is not used: %1").arg(QString::fromStdString(error.what()));
    try {
      checker_ = std::make_shared<const guard::WordingChecker>(guard::WordingChecker::load_default());
    } catch (const std::exception& shipped) {
      checker_.reset();
      problem_ = QString::fromStdString(shipped.what());
    }
  }
}

GuardFindings GuardService::check(const nlohmann::json& document) {
  GuardFindings out;
  out.rules_note = rules_note_;
  if (!checker_) {
    out.problem = problem_;
    return out;
  }
  out.available = true;
  if (!document.is_object()) return out;
  guard::CheckOptions options;
  auto mode = document.find("mode");
  if (mode != document.end() && mode->is_string() && *mode == "training") options.mode = guard::CheckMode::training;
  options.hp = text_of(document, "propositions", "hp");
  options.hd = text_of(document, "propositions", "hd");
  // Several alternatives: a rewrite names every one (guard::CheckOptions::alternatives).
  std::string cache_options = std::string(guard::mode_name(options.mode)) + '\n' + options.hp + '\n' + options.hd;
  const auto propositions = document.find("propositions");
  if (propositions != document.end() && propositions->is_object() && propositions->contains("alternatives") &&
      (*propositions)["alternatives"].is_array())
    for (const auto& alternative : (*propositions)["alternatives"])
      if (alternative.is_object() && alternative.contains("text") && alternative["text"].is_string()) {
        options.alternatives.push_back(alternative["text"].get<std::string>());
        cache_options += '\n' + options.alternatives.back();
      }
  if (cache_options != cache_options_ || cache_.size() > 4096) cache_.clear(), cache_options_ = cache_options;
  for (const auto& where : checked_fields(document)) {
    const QString text = field_text(lookup(document, where));
    if (text.isEmpty()) continue;
    const std::string utf8 = text.toStdString();
    const guard::CheckOptions field_options = guard::options_for_field(options, where.field);
    // A title is read differently from prose (CheckOptions::title): the same words in both are
    // cached apart.
    const std::string key = (field_options.title ? "title\n" : "text\n") + utf8;
    auto cached = cache_.find(key);
    if (cached == cache_.end()) {
      std::vector<guard::WordingFinding> found;
      try {
        found = checker_->check(utf8, field_options);
      } catch (const std::exception&) {
        // Text that is not UTF-8 cannot come from a QString; nothing to report.
      }
      cached = cache_.emplace(key, std::move(found)).first;
    }
    for (const auto& finding : cached->second)
      if (finding.severity != guard::Severity::advice) out.findings.push_back({where, text, finding});
  }
  return out;
}

}  // namespace counterpoise::editor

// The case store commands: import, export, verify, history and edit (docs/case-store.md).
// Each takes a case store as a .cpcase file or as a shared-store address
// postgresql://…/DB?case=REFERENCE (case_location.hpp); store init and store member set up
// the shared store.
// import/export convert between the interchange JSON and the .cpcase store; verify re-walks the
// audit chain; history lists revisions, review notes and audit rows; edit makes one scripted,
// audited change; declare-reviewer and review record a reviewer and a reviewer's note.
#include <cstdlib>
#include <ostream>

#include <nlohmann/json.hpp>

#include "app/cli/cli_command.hpp"
#include "app/cli/examiner_option.hpp"
#include "app/cli/json_output.hpp"
#include "core/interchange/case_json.hpp"
#include "core/platform/private_file.hpp"
#include "core/platform/ed25519.hpp"
#include "core/platform/sha256.hpp"
#include "core/reading/json_text.hpp"
#include "core/reading/text_file.hpp"
#include "core/store/anchor_check.hpp"
#include "core/store/audit_row_words.hpp"
#include "core/store/case_location.hpp"
#include "core/store/case_store.hpp"
#include "core/store/database_case.hpp"
#include "core/store/postgres_connection.hpp"
#include "core/store/postgres_schema.hpp"
#include "core/store/report_anchor.hpp"
#include "core/validation/display_text.hpp"

namespace counterpoise::cli {

using nlohmann::json;

namespace {

// Refuses a document the case reader finds problems in, listing them all.
std::function<void(const json&)> case_validator(const std::filesystem::path& base_dir) {
  return [base_dir](const json& document) {
    const auto result = interchange::read_case(document, base_dir);
    if (result.diagnostics.empty()) return;
    std::string text =
        "the case has " + std::to_string(result.diagnostics.problems().size()) + " problem(s):";
    for (const auto& problem : result.diagnostics.problems()) text += "\n  " + problem.text();
    throw validation::InvalidValue({}, text);
  };
}

store::StoreOptions options_for(const std::string& location) {
  store::StoreOptions options;
  options.validate = case_validator(store::case_base_dir(location));
  return options;
}

std::string one_positional(const ParsedArguments& parsed, const char* what) {
  if (parsed.positional.size() != 1) throw UsageError{std::string("expected one ") + what};
  return parsed.positional[0];
}

std::string required(const ParsedArguments& parsed, std::string_view option) {
  if (!parsed.has_flag(option)) throw UsageError{"missing " + std::string(option)};
  return parsed.option_or(option, "");
}

std::size_t position_argument(const std::string& text, std::string_view option = "--position") {
  std::size_t used = 0;
  unsigned long value = 0;
  try {
    value = std::stoul(text, &used);
  } catch (const std::exception&) {
    used = 0;
  }
  if (used != text.size() || text.empty() || text[0] == '-')
    throw UsageError{std::string(option) + " needs a whole number, not '" + text + "'"};
  return value;
}

std::string shorten(const std::optional<std::string>& value, std::size_t width = 48) {
  if (!value) return "(absent)";
  return value->size() <= width ? *value : value->substr(0, width - 3) + "...";
}

}  // namespace

int run_import(const std::vector<std::string>& args, std::ostream& out, std::ostream&) {
  const auto parsed = parse_arguments(args, {}, {"-o", "--output", "--examiner"});
  const std::filesystem::path input = one_positional(parsed, "JSON case file");
  const std::string output = parsed.option_or("-o", parsed.option_or("--output", ""));
  if (output.empty()) throw UsageError{"missing -o CASE.cpcase"};
  const store::ExaminerName examiner = examiner_of(parsed);
  const json document = reading::read_json_file(input);
  // Relative data paths are read against the JSON file's folder, as on every import.
  store::StoreOptions options;
  options.validate = case_validator(input.parent_path());
  store::CaseStore created = store::create_case_store(output, document, examiner, options);
  out << output << ": created from " << input.string() << " (" << created.state().items().size()
      << " items; examiner " << examiner.text() << ", account " << created.account() << ")\n";
  return kExitOk;
}

namespace {

// The report bytes stored with sealed revision `revision`, written to `output`: a report whose
// file was lost (the program killed after sealing, a failed write, a deleted copy) is never lost
// with it, since the store keeps the exact bytes the seal's digest covers.
int export_sealed_report(const store::CaseStore& store, const std::string& input, std::int64_t revision,
                         const std::string& output, std::ostream& out) {
  const std::string bytes = store.sealed_report_bytes(revision);
  platform::write_private_file(output, bytes);
  out << output << ": the report sealed with revision " << revision << " of " << input << " (SHA-256 "
      << platform::sha256_hex(bytes) << "); check it with: verify " << input << " --against " << output << "\n";
  return kExitOk;
}

}  // namespace

int run_export(const std::vector<std::string>& args, std::ostream& out, std::ostream&) {
  const auto parsed = parse_arguments(args, {"--force"}, {"-o", "--output", "--sealed-report"});
  const std::string input = one_positional(parsed, "case store");
  const std::string output = parsed.option_or("-o", parsed.option_or("--output", ""));
  const bool sealed_report = parsed.has_flag("--sealed-report");
  if (output.empty()) throw UsageError{sealed_report ? "missing -o REPORT.pdf" : "missing -o CASE.json"};
  const std::int64_t revision =
      sealed_report ? static_cast<std::int64_t>(position_argument(parsed.option_or("--sealed-report", ""), "--sealed-report"))
                    : 0;
  if (std::filesystem::exists(output) && !parsed.has_flag("--force"))
    throw validation::FileError({}, output + ": already exists (use --force to replace it)");
  const store::CaseStore store = store::open_case_store(input, store::OpenMode::read_only);
  if (sealed_report) return export_sealed_report(store, input, revision, output, out);
  // Case content: written privately (the store's mode) and atomically, never through a link.
  platform::write_private_file(output, store.export_canonical());
  out << output << ": exported revision " << store.current_revision() << " of " << input << "\n";
  return kExitOk;
}

namespace {

std::string fingerprint_of(const std::string& public_key_hex) {
  return platform::grouped_hex(platform::Ed25519PublicKey::from_hex(public_key_hex, "public key").fingerprint());
}

// One line per seal: signed (checked by verify's replay) or unsigned, never silently.
void print_seals(const std::vector<store::CheckedSeal>& seals, std::ostream& out) {
  for (const auto& seal : seals) {
    out << "  revision " << seal.revision << " sealed at " << seal.sealed_at << " by " << seal.sealer << ": ";
    if (seal.signed_seal())
      out << "signature good, key fingerprint " << fingerprint_of(seal.public_key) << "\n";
    else
      out << "unsigned seal (no signature to check: nothing but the audit's declared name shows who sealed it)\n";
  }
}

int verify_against(const store::CaseStore& store, const std::string& path, const std::string& report_path,
                   std::ostream& out, std::ostream& err) {
  const std::string bytes = reading::read_text_file(report_path, {"report", {}});
  const store::SealAnchor anchor = store::read_report_anchor(bytes, report_path);
  const store::AnchorCheck check = store::check_against_report(store, anchor, bytes);
  for (const auto& holds : check.holds) out << "  ok: " << holds << "\n";
  if (!check.ok()) {
    err << path << ": does not match the report " << report_path << ": " << *check.problem << "\n";
    return kExitInvalidInput;
  }
  const auto& s = anchor.statement;
  out << path << ": matches the report " << report_path << " (revision " << s.revision << ", sealed at "
      << s.sealed_at << " by " << s.sealer << ")\n";
  if (!anchor.is_signed())
    out << "  the report's seal is UNSIGNED: the match holds only as far as this copy of the report is trusted\n";
  out << "  not covered: changes after audit row " << s.chain_head_seq + 1
      << " (the seal) are anchored only by a later sealed report\n";
  return kExitOk;
}

}  // namespace

int run_verify(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  const auto parsed = parse_arguments(args, {}, {"--against"});
  const std::string path = one_positional(parsed, "case store");
  const store::CaseStore store = store::open_case_store(path, store::OpenMode::read_only);
  if (parsed.has_flag("--against")) return verify_against(store, path, parsed.option_or("--against", ""), out, err);
  const store::VerifyReport report = store.verify();
  if (!report.ok()) {
    err << path << ": verification failed at audit row " << report.problem->seq << ": "
        << report.problem->reason << "\n";
    return kExitInvalidInput;
  }
  out << path << ": ok (" << report.rows_checked << " audit rows, " << report.revisions
      << " revisions; hash chain, replayed state, sealed revisions and seal signatures agree)\n";
  print_seals(report.seals, out);
  return kExitOk;
}

namespace {

// How history names a seal's signature; history does not check it (verify does).
std::string seal_signature_text(const store::RevisionInfo& r) {
  if (!r.signed_seal()) return "unsigned seal";
  try {
    return "signed with the key of fingerprint " + fingerprint_of(r.public_key);
  } catch (const validation::Error&) {
    return "signed with a damaged public key (run verify)";
  }
}

}  // namespace

int run_history(const std::vector<std::string>& args, std::ostream& out, std::ostream&) {
  const auto parsed = parse_arguments(args, {"--json"}, {});
  const std::string path = one_positional(parsed, "case store");
  const store::CaseStore store = store::open_case_store(path, store::OpenMode::read_only);
  const auto revisions = store.revisions();
  const auto rows = store.audit_rows();
  if (parsed.has_flag("--json")) {
    json result = {{"revisions", json::array()}, {"audit", json::array()}};
    for (const auto& r : revisions) {
      json entry = {{"revision", r.revision}, {"opened_seq", r.opened_seq}, {"sealed", r.sealed()}};
      if (r.sealed())
        entry.update({{"sealed_seq", *r.sealed_seq},
                      {"sealed_at", r.sealed_at},
                      {"sealed_by", r.sealed_by},
                      {"sealed_by_account", r.sealed_by_account},
                      {"report_examiner", r.report_examiner},
                      {"sealer_role", r.sealer_role},
                      {"state_sha256", r.state_sha256},
                      {"report_file_name", r.report_file_name},
                      {"report_sha256", r.report_sha256},
                      {"signed", r.signed_seal()},
                      {"public_key", r.public_key},
                      {"signature", r.signature},
                      {"program", r.program}});
      result["revisions"].push_back(entry);
    }
    for (const auto& row : rows) {
      json entry = {{"seq", row.seq},           {"revision", row.revision}, {"at", row.at},
                    {"examiner", row.examiner}, {"action", row.action},     {"entity", row.entity},
                    {"key", row.key},           {"field", row.field},       {"hash", row.hash}};
      if (row.account) entry["account"] = *row.account;
      // Values as stored (canonical JSON text); a member is left out when the value is absent.
      // The file is untrusted: each value is read with the bounds of an imported case.
      const std::string row_name = "audit row " + std::to_string(row.seq);
      if (row.old_value) entry["old_value"] = reading::parse_json_text(*row.old_value, row_name + ", field old_value");
      if (row.new_value) entry["new_value"] = reading::parse_json_text(*row.new_value, row_name + ", field new_value");
      result["audit"].push_back(entry);
    }
    result["reviewers"] = store.reviewers();
    result["review_notes"] = json::array();
    for (const store::ReviewNote& note : store.review_notes())
      result["review_notes"].push_back({{"seq", note.seq},
                                        {"revision", note.revision},
                                        {"at", note.at},
                                        {"reviewer", note.reviewer},
                                        {"account", note.account},
                                        {"verdict", store::review_verdict_name(note.verdict)},
                                        {"note", note.note}});
    print_json(out, result);
    return kExitOk;
  }
  out << "Revisions of " << path << ":\n";
  for (const auto& r : revisions) {
    out << "  revision " << r.revision << ": opened at audit row " << r.opened_seq;
    if (r.sealed())
      out << ", sealed at row " << *r.sealed_seq << " on " << r.sealed_at << " by " << r.sealed_by
          << (r.sealed_by_account.empty() ? "" : " (account " + r.sealed_by_account + ")")
          << (r.sealer_role == store::kSealerIsReviewer ? " as reviewer" : "")
          << (r.report_examiner.empty() ? "" : " for the report of " + r.report_examiner)
          << " (report " << r.report_file_name << ", sha256 " << r.report_sha256.substr(0, 16)
          << "...), " << seal_signature_text(r);
    else
      out << ", open for edits";
    out << "\n";
  }
  const auto reviewers = store.reviewers();
  out << "Declared reviewers: ";
  for (std::size_t i = 0; i < reviewers.size(); ++i) out << (i ? ", " : "") << reviewers[i];
  out << (reviewers.empty() ? "none\n" : "\n");
  const auto notes = store.review_notes();
  out << "Review notes:" << (notes.empty() ? " none\n" : "\n");
  for (const store::ReviewNote& note : notes)  // a note's line breaks shown as \x0a: one line each
    out << "  revision " << note.revision << ": " << store::review_verdict_name(note.verdict) << " by "
        << note.reviewer << " [" << note.account << "] on " << note.at
        << (note.note.empty() ? "" : ": " + validation::display_text(note.note)) << "\n";
  // Only a case in a shared store has members: a file's history has no such section.
  bool membership_heading = false;
  for (const auto& row : rows) {
    if (row.action != store::action::change_member) continue;
    if (!membership_heading) out << "Membership changes:\n";
    membership_heading = true;
    const store::AuditRowWords words = store::audit_row_words(row);
    out << "  row " << row.seq << " on " << row.at << ": " << words.who
        << (row.account ? " [database role " + *row.account + "]" : "") << " " << words.action
        << ", " << validation::display_text(words.place) << ": " << words.old_value << " -> "
        << validation::display_text(words.new_value) << "\n";
  }
  out << "Audit rows:\n";
  for (const auto& row : rows) {
    out << "  " << row.seq << "  r" << row.revision << "  " << row.at << "  "
        << (row.examiner.empty() ? "(program)" : row.examiner)
        << (row.account ? " [" + *row.account + "]" : "") << "  " << row.action << "  " << row.entity << (row.key.empty() ? "" : " " + row.key)
        << (row.field.empty() ? "" : "." + row.field);
    if (row.action != "import")
      out << "  " << shorten(row.old_value) << " -> " << shorten(row.new_value);
    out << "\n";
  }
  return kExitOk;
}

int run_edit(const std::vector<std::string>& args, std::ostream& out, std::ostream&) {
  const auto parsed = parse_arguments(args, {"--unset"},
                                      {"--item", "--section", "--field", "--value", "--examiner",
                                       "--add-item", "--remove-item", "--move-item", "--position"});
  const std::string path = one_positional(parsed, "case store");
  const int kinds = parsed.has_flag("--field") + parsed.has_flag("--add-item") +
                    parsed.has_flag("--remove-item") + parsed.has_flag("--move-item");
  if (kinds != 1)
    throw UsageError{"give exactly one of --field, --add-item, --remove-item, --move-item"};
  const store::ExaminerName examiner = examiner_of(parsed);
  store::CaseStore store = store::open_case_store(path, store::OpenMode::edit, options_for(path));
  std::int64_t seq = 0;
  if (parsed.has_flag("--field")) {
    if (parsed.has_flag("--item") == parsed.has_flag("--section"))
      throw UsageError{"--field needs exactly one of --item ID or --section NAME"};
    if (parsed.has_flag("--value") == parsed.has_flag("--unset"))
      throw UsageError{"--field needs exactly one of --value JSON or --unset"};
    const store::EntityRef entity = parsed.has_flag("--item")
                                        ? store::EntityRef::item(required(parsed, "--item"))
                                        : store::EntityRef::section(required(parsed, "--section"));
    std::optional<json> value;
    if (parsed.has_flag("--value"))
      value = reading::parse_json_text(parsed.option_or("--value", ""), "--value");
    seq = store.set_field(examiner, entity, parsed.option_or("--field", ""), value);
  } else if (parsed.has_flag("--add-item")) {
    const json item = reading::parse_json_text(parsed.option_or("--add-item", ""), "--add-item");
    std::optional<std::size_t> position;
    if (parsed.has_flag("--position"))
      position = position_argument(parsed.option_or("--position", ""));
    seq = store.add_item(examiner, item, position);
  } else if (parsed.has_flag("--remove-item")) {
    seq = store.remove_item(examiner, parsed.option_or("--remove-item", ""));
  } else {
    seq = store.move_item(examiner, parsed.option_or("--move-item", ""),
                          position_argument(required(parsed, "--position")));
  }
  out << path << ": recorded as audit row " << seq << " (revision "
      << store.current_revision() << ", " << examiner.text() << ", account " << store.account()
      << ")\n";
  return kExitOk;
}

int run_declare_reviewer(const std::vector<std::string>& args, std::ostream& out, std::ostream&) {
  const auto parsed = parse_arguments(args, {}, {"--examiner"});
  if (parsed.positional.size() != 2) throw UsageError{"expected a case store and a reviewer's name"};
  const std::string path = parsed.positional[0];
  const store::ExaminerName examiner = examiner_of(parsed);
  const store::ExaminerName reviewer(parsed.positional[1]);
  store::CaseStore store = store::open_case_store(path, store::OpenMode::edit, options_for(path));
  const std::int64_t seq = store.declare_reviewer(examiner, reviewer);
  out << path << ": " << reviewer.text() << " declared a reviewer by " << examiner.text()
      << " (audit row " << seq << ")\n";
  return kExitOk;
}

int run_review(const std::vector<std::string>& args, std::ostream& out, std::ostream&) {
  const auto parsed = parse_arguments(args, {"--agree", "--disagree", "--comment"},
                                      {"--revision", "--note", "--examiner"});
  const std::string path = one_positional(parsed, "case store");
  const int verdicts =
      parsed.has_flag("--agree") + parsed.has_flag("--disagree") + parsed.has_flag("--comment");
  if (verdicts != 1) throw UsageError{"give exactly one of --agree, --disagree, --comment"};
  const store::ReviewVerdict verdict = parsed.has_flag("--agree")      ? store::ReviewVerdict::agree
                                       : parsed.has_flag("--disagree") ? store::ReviewVerdict::disagree
                                                                       : store::ReviewVerdict::comment;
  const auto revision =
      static_cast<std::int64_t>(position_argument(required(parsed, "--revision"), "--revision"));
  const store::ExaminerName reviewer = examiner_of(parsed);
  store::CaseStore store = store::open_case_store(path, store::OpenMode::edit, options_for(path));
  const std::int64_t seq =
      store.add_review_note(reviewer, revision, verdict, parsed.option_or("--note", ""));
  out << path << ": review note (" << store::review_verdict_name(verdict)
      << ") on revision " << revision << " by " << reviewer.text() << " recorded as audit row "
      << seq << "\n";
  return kExitOk;
}

namespace {

// store init [postgresql://…/DB]: creates (or upgrades) the shared store in a database.
int run_store_init(const std::vector<std::string>& args, std::ostream& out) {
  const auto parsed = parse_arguments(args, {}, {});
  if (parsed.positional.size() > 1) throw UsageError{"expected at most one database address"};
  const std::string address = parsed.positional.empty() ? "" : parsed.positional[0];
  if (!address.empty() && !store::is_database_address(address))
    throw UsageError{"a database address starts with postgresql://"};
  const std::string connection = address.empty() ? "" : store::parse_database_connection(address);
  const std::string label = connection.empty() ? "the database of the PG environment" : connection;
  store::PgConnection database(connection, label);
  const std::int64_t before = store::install_postgres_store(database);
  out << label << ": "
      << (before == 0 ? "case store created"
          : before == store::kPostgresSchemaVersion
              ? "the case store is already at version " + std::to_string(before)
              : "case store upgraded from version " + std::to_string(before))
      << " (version " << store::kPostgresSchemaVersion << "; roles use it as members of "
      << store::kStoreUsersRole << ")\n";
  return kExitOk;
}

// store member postgresql://…/DB?case=REF ROLE (--as examiner|reviewer|reader | --remove)
// [--examiner NAME], run by an examiner of the case: one audit row in the case's chain.
int run_store_member(const std::vector<std::string>& args, std::ostream& out) {
  const auto parsed = parse_arguments(args, {"--remove"}, {"--as", "--examiner"});
  if (parsed.positional.size() != 2)
    throw UsageError{"expected a case address and a database role"};
  const bool remove = parsed.has_flag("--remove");
  if (remove == parsed.has_flag("--as"))
    throw UsageError{"give either --as examiner|reviewer|reader or --remove"};
  const std::string& address = parsed.positional[0];
  if (!store::is_database_address(address))
    throw UsageError{"members belong to a case in a shared store: give a postgresql:// address"};
  const std::string& role = parsed.positional[1];
  const store::ExaminerName examiner = examiner_of(parsed);
  store::CaseStore store = store::open_case_store(address, store::OpenMode::edit, options_for(address));
  const std::optional<std::string> as = remove ? std::nullopt : std::optional(required(parsed, "--as"));
  const std::int64_t seq = store.change_membership(examiner, role, as);
  out << store.where() << ": database role " << validation::display_text(role)
      << (as ? " is now a " + *as + " of the case" : " is no longer a member of the case")
      << ", recorded as audit row " << seq << "\n";
  return kExitOk;
}

}  // namespace

int run_store(const std::vector<std::string>& args, std::ostream& out, std::ostream&) {
  if (args.empty()) throw UsageError{"expected init or member"};
  const std::vector<std::string> rest(args.begin() + 1, args.end());
  if (args[0] == "init") return run_store_init(rest, out);
  if (args[0] == "member") return run_store_member(rest, out);
  throw UsageError{"expected init or member, not '" + args[0] + "'"};
}

}  // namespace counterpoise::cli

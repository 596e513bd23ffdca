// counterpoise-cli report CASE -o OUT.pdf [--mode casework|training] [--text OUT.txt] [--examiner NAME]
//                           [--force] [--confirm-open-points] [--unsigned-seal]
// Writes the evaluative report after printing the issue checklist (core/casefile/issue_checklist);
// a training case sent as casework is refused. For a case store (.cpcase) issuing the report seals
// the revision, so open checklist points must be confirmed with --confirm-open-points. An existing
// output file is replaced only with --force. A seal is signed with the sealer's key
// (core/store/examiner_key.hpp): without one the report is refused, naming how to make one, unless
// --unsigned-seal says the seal is to be unsigned (the report and verify then say so).
// Built only with the reports library (COUNTERPOISE_HAVE_REPORTS, set by app/CMakeLists.txt).
#ifdef COUNTERPOISE_HAVE_REPORTS
#include <QByteArray>
#include <QGuiApplication>

#include <filesystem>
#include <memory>
#include <optional>
#include <ostream>

#include "app/cli/case_loading.hpp"
#include "app/cli/cli_command.hpp"
#include "app/cli/examiner_option.hpp"
#include "app/cli/headless_gui.hpp"
#include "core/casefile/issue_checklist.hpp"
#include "core/evaluation/case_evaluation.hpp"
#include "core/guard/case_rules.hpp"
#include "core/guard/wording_checker.hpp"
#include "core/platform/sha256.hpp"
#include "core/store/case_location.hpp"
#include "core/store/case_store.hpp"
#include "core/store/database_case.hpp"
#include "core/store/examiner_key.hpp"
#include "reports/pdf_writer.hpp"
#include "reports/report_model.hpp"
#include "reports/report_text.hpp"
#include "reports/report_wording.hpp"

namespace counterpoise::cli {

namespace {

reports::ReportMode parse_mode(const std::string& text, casefile::CaseMode fallback) {
  if (text.empty()) return fallback == casefile::CaseMode::training ? reports::ReportMode::training : reports::ReportMode::casework;
  if (text == "casework") return reports::ReportMode::casework;
  if (text == "training") return reports::ReportMode::training;
  throw UsageError{"--mode must be casework or training, not \"" + text + "\""};
}

// Prints the issue checklist, one point a line.
void print_checklist(const std::vector<casefile::ChecklistPoint>& points, std::ostream& out) {
  if (points.empty()) {
    out << "Issue checklist: nothing open.\n";
    return;
  }
  out << "Issue checklist:\n";
  for (const auto& p : points)
    out << (p.severity == casefile::ChecklistPoint::Severity::blocks ? "  refused: " : "  open: ") << p.message << " ("
        << p.item << (p.field.empty() ? "" : ", " + p.field) << ")\n";
}

// The sealer's signing key, or null with --unsigned-seal. Refuses, naming both ways out, when
// the sealer has no key.
std::shared_ptr<const platform::Ed25519PrivateKey> signing_key(const store::ExaminerName& sealer, bool unsigned_seal) {
  if (unsigned_seal) return nullptr;
  auto key = store::find_signing_key(sealer);
  if (!key)
    throw validation::FileError({}, store::missing_signing_key_text(sealer) +
                                        ": a seal is signed with the sealer's key. Make one with `" +
                                        store::key_create_command(sealer) +
                                        "`, or seal without a signature with --unsigned-seal (the report and verify "
                                        "then say the seal is unsigned)");
  return key;
}

void refuse_existing(const std::string& path, bool force) {
  if (!path.empty() && std::filesystem::exists(path) && !force)
    throw validation::FileError({}, path + ": already exists (use --force to replace it)");
}

}  // namespace

int run_report(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  const auto parsed =
      parse_arguments(args, {"--force", "--confirm-open-points", "--unsigned-seal"}, {"-o", "--output", "--mode", "--text", "--examiner"});
  if (parsed.positional.size() != 1) throw UsageError{"expected one case file"};
  const std::string output = parsed.option_or("-o", parsed.option_or("--output", ""));
  if (output.empty()) throw UsageError{"expected -o OUT.pdf"};
  const std::string text_output = parsed.option_or("--text", "");
  const std::string& path = parsed.positional[0];
  refuse_existing(output, parsed.has_flag("--force"));
  refuse_existing(text_output, parsed.has_flag("--force"));

  // A case store is opened for editing, because issuing the report seals its revision.
  std::optional<store::CaseStore> case_store;
  std::optional<store::ExaminerName> sealer;  // who seals: asked for before any work is done
  std::shared_ptr<const platform::Ed25519PrivateKey> key;
  interchange::CaseReadResult read;
  if (store::is_case_file(path) || store::is_database_address(path)) {
    sealer.emplace(examiner_of(parsed));
    case_store.emplace(store::open_case_store(path, store::OpenMode::edit));
    case_store->sealer_role(*sealer);  // who may seal is settled before the key is looked for
    key = signing_key(*sealer, parsed.has_flag("--unsigned-seal"));
    read = interchange::read_case(case_store->document(), store::case_base_dir(path));
  } else {
    read = read_case_argument(path);
  }
  if (!read.diagnostics.empty()) {
    print_problems(path, read.diagnostics, err);
    return kExitInvalidInput;
  }
  const casefile::Case& value = *read.value;
  const auto mode = parse_mode(parsed.option_or("--mode", ""), value.mode_or_default());
  const auto checklist = casefile::issue_checklist(value, mode == reports::ReportMode::casework);
  print_checklist(checklist, out);
  if (casefile::blocks_issuing(checklist)) {
    err << path << ": the report was not written: the issue checklist refuses it\n";
    return kExitInvalidInput;
  }
  if (case_store && !checklist.empty() && !parsed.has_flag("--confirm-open-points")) {
    err << path << ": the report was not issued: " << checklist.size()
        << (checklist.size() == 1 ? " checklist point is" : " checklist points are")
        << " open. " << casefile::sealing_explanation()
        << " Deal with the points, or issue anyway with --confirm-open-points.\n";
    return kExitInvalidInput;
  }

  reports::IssueInfo issue;
  std::optional<store::PreparedSeal> prepared;
  if (case_store) {
    // The seal is fixed (time, revision, chain head) and signed before the report is rendered,
    // since the report prints it; sealing then writes exactly what was prepared.
    prepared = case_store->prepare_seal(*sealer, key);
    issue = reports::issue_info_for_seal(*prepared, case_store->review_notes());
  }

  const auto app = make_headless_gui_application();
  try {
    const auto result = evaluation::evaluate_case(value);
    auto model = reports::build_report_model(value, result, mode, issue);
    auto checker = std::make_shared<const guard::WordingChecker>(guard::checker_for_case(value));
    reports::apply_wording_check(model, value, reports::guard_wording_check(checker, value.propositions),
                                 guard::rules_description(*checker, value.guard_rule_files));
    const auto pdf = reports::render_pdf(model);
    std::optional<std::int64_t> sealed_revision;
    if (case_store) {
      const auto sealed =
          case_store->seal_revision(*prepared, pdf.bytes, std::filesystem::path(output).filename().string());
      if (sealed.state_sha256 != issue.digest) {
        err << path << ": the sealed state digest " << sealed.state_sha256 << " differs from the one printed in the report "
            << issue.digest << "; the report was not written\n";
        return kExitInvalidInput;
      }
      out << "Sealed revision " << sealed.revision << " of " << path << " (report SHA-256 " << sealed.report_sha256 << ")\n";
      if (sealed.signed_seal())
        out << "  signed by " << sealed.sealed_by << ", key fingerprint "
            << platform::grouped_hex(platform::Ed25519PublicKey::from_hex(sealed.public_key, "key").fingerprint()) << "\n";
      else
        out << "  UNSIGNED seal (--unsigned-seal): nothing shows who sealed it beyond the audit's declared name\n";
      sealed_revision = sealed.revision;
    }
    try {
      reports::write_file_atomically(output, pdf.bytes);
    } catch (const validation::Error& error) {
      if (!sealed_revision) throw;
      // The seal is committed with the report's bytes: the report is not lost with its file.
      err << path << ": " << error.what() << "; revision " << *sealed_revision
          << " is sealed with this report and the store keeps its bytes: write them with: export " << path
          << " --sealed-report " << *sealed_revision << " -o " << output << "\n";
      return kExitInvalidInput;
    }
    out << "Report written to " << output << " (" << pdf.pages << (pdf.pages == 1 ? " page" : " pages") << ", "
        << reports::report_mode_name(mode) << " mode)\n";
    if (!text_output.empty()) {
      reports::write_file_atomically(text_output, reports::render_text(model));
      out << "Text version written to " << text_output << "\n";
    }
  } catch (const reports::ReportRefused& refused) {
    err << path << ": " << refused.bare_message() << "\n";
    return kExitFlagged;
  } catch (const validation::Error& error) {
    err << path << ": " << error.what() << "\n";
    return kExitInvalidInput;
  }
  return kExitOk;
}

}  // namespace counterpoise::cli

#endif  // COUNTERPOISE_HAVE_REPORTS

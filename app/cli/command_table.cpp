// The table of sub-commands. A new command: write command_<name>.cpp with a run function and
// add one row here.
#include <iosfwd>

#include "app/cli/cli_command.hpp"

namespace counterpoise::cli {

int run_evaluate(const std::vector<std::string>&, std::ostream&, std::ostream&);
int run_validate(const std::vector<std::string>&, std::ostream&, std::ostream&);
int run_check_wording(const std::vector<std::string>&, std::ostream&, std::ostream&);
int run_import(const std::vector<std::string>&, std::ostream&, std::ostream&);
int run_export(const std::vector<std::string>&, std::ostream&, std::ostream&);
int run_verify(const std::vector<std::string>&, std::ostream&, std::ostream&);
int run_history(const std::vector<std::string>&, std::ostream&, std::ostream&);
int run_edit(const std::vector<std::string>&, std::ostream&, std::ostream&);
int run_method_validation(const std::vector<std::string>&, std::ostream&, std::ostream&);
int run_declare_reviewer(const std::vector<std::string>&, std::ostream&, std::ostream&);
int run_review(const std::vector<std::string>&, std::ostream&, std::ostream&);
int run_store(const std::vector<std::string>&, std::ostream&, std::ostream&);
int run_compare(const std::vector<std::string>&, std::ostream&, std::ostream&);
int run_key(const std::vector<std::string>&, std::ostream&, std::ostream&);
#ifdef COUNTERPOISE_HAVE_REPORTS
int run_report(const std::vector<std::string>&, std::ostream&, std::ostream&);
#endif

namespace {
const Command kCommands[] = {
    {"evaluate", "evaluate CASE [--json] [--cross-check]",
     "LR of each item, the combined LR, its uncertainty, verbal expression and prior sensitivity", run_evaluate},
    {"validate", "validate CASE",
     "list every problem in a case file, and every statement that would make report refuse the report (exit 1 "
     "if any)", run_validate},
    {"check-wording", "check-wording FILE|- [--json] [--mode casework|training] [--rules FILE] [--rules-only] [--hp TEXT] [--hd TEXT]",
     "flag statements that transpose the conditional and related errors (exit 3 if any)", run_check_wording},
    {"compare", "compare A B [--json] [-o MEMO.pdf [--force] [--reviewer NAME]]",
     "what differs between two versions of a case (JSON, .cpcase, or STORE.cpcase@REVISION for a sealed revision) "
     "and how much each difference moved each item's LR and the combined LR, and -o writes the review memo", run_compare},
    {"import", "import CASE.json -o CASE.cpcase|postgresql://…/DB?case=REF [--examiner NAME]",
     "create a case store (audited, 0600) from an interchange JSON case, as a file or in a shared database",
     run_import},
    {"export", "export CASE.cpcase -o CASE.json [--force] | export CASE.cpcase --sealed-report N -o REPORT.pdf [--force]",
     "write the current case as canonical JSON, or the report stored with sealed revision N", run_export},
    {"verify", "verify CASE.cpcase [--against REPORT.pdf]",
     "re-walk the audit hash chain, replay it against the case and check every signed seal (exit 1 with the first "
     "bad row); --against checks the store against a sealed report's printed seal", run_verify},
    {"history", "history CASE.cpcase [--json]", "list the revisions (sealed or open) and every audit row",
     run_history},
    {"edit",
     "edit CASE.cpcase (--item ID | --section NAME) --field NAME (--value JSON | --unset) | --add-item JSON "
     "[--position N] | --remove-item ID | --move-item ID --position N [--examiner NAME]",
     "make one audited change to a case store", run_edit},
    {"method-validation",
     "method-validation RESULTS.csv|RESULTS.json [--json] [-o REPORT.pdf [--force] [--examiner NAME] [--laboratory NAME]] "
     "[--criteria FILE] [--calibrate linear|pav] [--train FILE] [--bootstrap N] [--seed N]",
     "judge an LR method on comparisons of known truth: Cllr, Cllr_min, EER, misleading evidence, criteria (exit 1 "
     "if a criterion fails)", run_method_validation},
    {"declare-reviewer", "declare-reviewer CASE.cpcase NAME [--examiner NAME]",
     "the case's examiner names a reviewer, who may then seal the case's reports", run_declare_reviewer},
    {"review", "review CASE.cpcase --revision N (--agree | --disagree | --comment) [--note TEXT] [--examiner NAME]",
     "a declared reviewer records a review note on a sealed revision (the revision is not changed)", run_review},
    {"store", "store init [postgresql://…/DB] | store member postgresql://…/DB?case=REF ROLE (--as "
     "examiner|reviewer|reader | --remove) [--examiner NAME]",
     "set up the shared case store in a PostgreSQL database, and make a database role a member of a case or "
     "end its membership (run by an examiner of the case; recorded in its audit chain); every command taking CASE.cpcase also takes "
     "postgresql://…/DB?case=REF",
     run_store},
    {"key", "key create [--examiner NAME] | key list | key show [--examiner NAME]",
     "make an examiner's signing key (Ed25519, private key 0600 in the key folder), list the keys, or print one's "
     "public key", run_key},
#ifdef COUNTERPOISE_HAVE_REPORTS
    {"report", "report CASE -o OUT.pdf [--mode casework|training] [--text OUT.txt] [--examiner NAME] [--force] "
     "[--confirm-open-points] [--unsigned-seal]",
     "write the evaluative report (PDF/A-1b) after the issue checklist; for a .cpcase store, issuing it seals the "
     "revision, signed with the sealer's key, and open checklist points must be confirmed (exit 3 if the wording "
     "check refuses it)", run_report},
#endif
};
}  // namespace

std::span<const Command> all_commands() { return kCommands; }

}  // namespace counterpoise::cli

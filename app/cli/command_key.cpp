// counterpoise-cli key create [--examiner NAME] | key list | key show [--examiner NAME]
// An examiner's signing key (core/store/examiner_key.hpp): `create` makes the key pair in the
// per-user key folder (private key 0600, never replacing one), `list` lists the public keys
// there, `show` prints one examiner's public key file for handing to a quality manager or the
// other side. docs/user-guide.md, "Signing seals".
#include <ostream>

#include "app/cli/cli_command.hpp"
#include "app/cli/examiner_option.hpp"
#include "core/platform/ed25519.hpp"
#include "core/reading/text_file.hpp"
#include "core/store/examiner_key.hpp"

namespace counterpoise::cli {

namespace {

std::filesystem::path key_folder() {
  const auto folder = store::examiner_key_folder();
  if (folder.empty())
    throw validation::FileError({}, std::string("no folder for examiner keys: set ") + store::kKeyFolderVariable +
                                        " or HOME");
  return folder;
}

int create_key(const ParsedArguments& parsed, std::ostream& out) {
  const store::ExaminerName examiner = examiner_of(parsed);
  const auto folder = key_folder();
  const auto key = store::create_examiner_key(folder, examiner);
  const auto files = store::examiner_key_files(folder, examiner);
  out << "Made a signing key for " << examiner.text() << ".\n"
      << "  private key: " << files.private_key.string() << " (mode 0600: keep it yours alone; it signs your seals)\n"
      << "  public key:  " << files.public_key.string() << " (give it to whoever checks your reports)\n"
      << "  fingerprint: " << platform::grouped_hex(key.fingerprint()) << "\n";
  return kExitOk;
}

int list_keys(std::ostream& out) {
  const auto folder = key_folder();
  const auto keys = store::list_examiner_keys(folder);
  if (keys.empty()) {
    out << "No examiner keys in " << folder.string()
        << "; make one with: counterpoise-cli key create --examiner NAME\n";
    return kExitOk;
  }
  out << "Examiner keys in " << folder.string() << ":\n";
  for (const auto& key : keys)
    out << "  " << key.examiner << "\n    fingerprint " << platform::grouped_hex(key.fingerprint) << "\n    "
        << key.public_key.filename().string() << "\n";
  return kExitOk;
}

int show_key(const ParsedArguments& parsed, std::ostream& out) {
  const store::ExaminerName examiner = examiner_of(parsed);
  const auto files = store::examiner_key_files(key_folder(), examiner);
  // The private key is read (and its permissions checked) so a public file that does not match
  // it is never handed out.
  const auto key = store::load_private_key_file(files.private_key).public_key();
  out << store::public_key_file_text(examiner, key);
  return kExitOk;
}

}  // namespace

int run_key(const std::vector<std::string>& args, std::ostream& out, std::ostream&) {
  if (args.empty()) throw UsageError{"expected key create, key list or key show"};
  const std::vector<std::string> rest(args.begin() + 1, args.end());
  const auto parsed = parse_arguments(rest, {}, {"--examiner"});
  if (!parsed.positional.empty()) throw UsageError{"unexpected argument \"" + parsed.positional[0] + "\""};
  if (args[0] == "create") return create_key(parsed, out);
  if (args[0] == "list") return list_keys(out);
  if (args[0] == "show") return show_key(parsed, out);
  throw UsageError{"expected key create, key list or key show, not key " + args[0]};
}

}  // namespace counterpoise::cli

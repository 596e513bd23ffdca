// counterpoise-cli report: writes the PDF (and text) for every demo case in both modes, exit
// codes for usage and refusal, and sealing when the case is a store.
#include "core/platform/ed25519.hpp"
#include "core/platform/sha256.hpp"
#include "core/store/case_store.hpp"
#include "core/store/report_anchor.hpp"
#include "report_test_support.hpp"

using namespace counterpoise;
using namespace counterpoise::reports::testing;

namespace {
const std::string kCli = COUNTERPOISE_CLI;
}

TEST_CASE("command: report writes a PDF and a text version for each demo case in both modes") {
  const auto dir = temp_dir("command");
  for (const auto& path : demo_cases()) {
    for (const std::string mode : {"casework", "training"}) {
      INFO(path << " " << mode);
      const auto pdf = dir / (path.stem().string() + "-" + mode + ".pdf");
      const auto txt = dir / (path.stem().string() + "-" + mode + ".txt");
      const auto r = run("env -u QT_QPA_PLATFORM " + kCli + " report " + quoted(path) + " -o " + quoted(pdf) +
                         " --mode " + mode + " --text " + quoted(txt));
      INFO(r.output);
      CHECK(r.output.find("Issue checklist") != std::string::npos);
      if (mode == "casework" && load_case(path).mode_or_default() == casefile::CaseMode::training) {
        // A training case is never issued as casework: the checklist refuses it and nothing is written.
        CHECK(r.exit_code == 1);
        CHECK(r.output.find("training case") != std::string::npos);
        CHECK_FALSE(std::filesystem::exists(pdf));
        continue;
      }
      REQUIRE(r.exit_code == 0);
      CHECK(r.output.find("Report written to") != std::string::npos);
      CHECK(read_file(pdf).rfind("%PDF-1.4", 0) == 0);
      const std::string text = read_file(txt);
      CHECK(text.find("Cautions") != std::string::npos);
      CHECK((text.find(": An illustration of how the findings") != std::string::npos) == (mode == "casework"));
    }
  }
}

TEST_CASE("command: usage errors exit 2, a refused report exits 3 and writes nothing") {
  const auto dir = temp_dir("command-errors");
  const auto demo = demo_dir() / "harwick-vale-breakin.json";
  CHECK(run(kCli + " report " + quoted(demo)).exit_code == 2);
  CHECK(run(kCli + " report " + quoted(demo) + " -o " + quoted(dir / "x.pdf") + " --mode court").exit_code == 2);
  CHECK(run(kCli + " report -o " + quoted(dir / "x.pdf")).exit_code == 2);

  auto document = nlohmann::json::parse(read_file(demo));
  document["items"][0]["notes"] = "There is a 99.9% probability that Mr Ashby broke the window of the bakery.";
  const auto flagged = dir / "flagged.json";
  write_file(flagged, document.dump(2));
  const auto r = run(kCli + " report " + quoted(flagged) + " -o " + quoted(dir / "flagged.pdf"));
  INFO(r.output);
  CHECK(r.exit_code == 3);
  CHECK(r.output.find("item E1, field notes") != std::string::npos);
  CHECK_FALSE(std::filesystem::exists(dir / "flagged.pdf"));
  // The same case as a training report is written, with the flag listed.
  CHECK(run(kCli + " report " + quoted(flagged) + " -o " + quoted(dir / "flagged.pdf") + " --mode training").exit_code == 0);
}

TEST_CASE("command: a report from a case store seals the revision, signed, and prints the sealed state digest") {
  const auto dir = temp_dir("command-store");
  const auto demo = demo_dir() / "harwick-vale-breakin.json";
  const auto cpcase = dir / "breakin.cpcase";
  {
    // The demo break-in case's examiner imports and seals it (invented name).
    const store::ExaminerName examiner("Dr Imogen Tarrant");
    auto created = store::CaseStore::create(cpcase, nlohmann::json::parse(read_file(demo)), examiner);
  }
  const auto pdf = dir / "breakin.pdf";
  const std::string keys = "COUNTERPOISE_KEY_DIR=" + quoted(dir / "keys") + " ";
  const std::string report = keys + kCli + " report " + quoted(cpcase) + " -o " + quoted(pdf) +
                             " --examiner 'Dr Imogen Tarrant'";
  // Without a key the report is refused, naming how to make one and how to seal unsigned.
  const auto refused = run(report);
  INFO(refused.output);
  CHECK(refused.exit_code == 1);
  CHECK(refused.output.find("no signing key for Dr Imogen Tarrant") != std::string::npos);
  CHECK(refused.output.find("counterpoise-cli key create --examiner") != std::string::npos);
  CHECK(refused.output.find("--unsigned-seal") != std::string::npos);
  CHECK_FALSE(std::filesystem::exists(pdf));
  CHECK_FALSE(store::CaseStore::open(cpcase, store::OpenMode::read_only).latest_seal());

  const auto made = run(keys + kCli + " key create --examiner 'Dr Imogen Tarrant'");
  INFO(made.output);
  REQUIRE(made.exit_code == 0);
  const auto r = run(report);
  INFO(r.output);
  REQUIRE(r.exit_code == 0);
  CHECK(r.output.find("signed by Dr Imogen Tarrant, key fingerprint") != std::string::npos);
  const auto opened = store::CaseStore::open(cpcase, store::OpenMode::read_only);
  const auto seal = opened.latest_seal();
  REQUIRE(seal);
  REQUIRE(seal->signed_seal());
  // The sealed report is the file written, byte for byte, and the header shows the sealed state digest.
  CHECK(seal->report_sha256 == platform::sha256_hex(read_file(pdf)));
  CHECK(opened.sealed_report_bytes(seal->revision) == read_file(pdf));
  CHECK(seal->state_sha256 == platform::sha256_hex(opened.export_canonical()));
  const std::string text = pdf_text(pdf);
  CHECK(text.find(seal->state_sha256) != std::string::npos);
  CHECK(text.find("Revision: " + std::to_string(seal->revision) + " of the case store") != std::string::npos);
  CHECK(opened.verify().ok());
  // The seal appendix prints the public key's fingerprint, the key and the signature.
  const auto key = platform::Ed25519PublicKey::from_hex(seal->public_key, "key");
  CHECK(text.find("Seal of this report") != std::string::npos);
  CHECK(text.find(platform::grouped_hex(key.fingerprint()).substr(0, 39)) != std::string::npos);
  CHECK(text.find(seal->public_key.substr(0, 8)) != std::string::npos);
  CHECK(text.find(seal->signature.substr(0, 8) + " " + seal->signature.substr(8, 8)) != std::string::npos);

  // The anchor is in the PDF's XMP metadata, as poppler's pdfinfo reads it, with the PDF/A
  // extension schema that declares its property (ISO 19005-1:2005, 6.7.8).
  const auto meta = run("pdfinfo -meta " + quoted(pdf));
  REQUIRE(meta.exit_code == 0);
  CHECK(meta.output.find("<cpseal:anchor>") != std::string::npos);
  CHECK(meta.output.find("<pdfaSchema:prefix>cpseal</pdfaSchema:prefix>") != std::string::npos);
  const auto anchor = store::read_report_anchor(read_file(pdf), "breakin.pdf");
  CHECK(anchor.signature == seal->signature);
  CHECK(anchor.statement.revision == seal->revision);
  CHECK(anchor.statement.state_sha256 == seal->state_sha256);

  // verify lists the signed seal; verify --against reads the anchor from the PDF and matches it.
  const auto verified = run(kCli + " verify " + quoted(cpcase));
  INFO(verified.output);
  CHECK(verified.exit_code == 0);
  CHECK(verified.output.find("signature good, key fingerprint " + platform::grouped_hex(key.fingerprint())) !=
        std::string::npos);
  const auto against = run(kCli + " verify " + quoted(cpcase) + " --against " + quoted(pdf));
  INFO(against.output);
  CHECK(against.exit_code == 0);
  CHECK(against.output.find("matches the report") != std::string::npos);
  CHECK(against.output.find("not covered: changes after audit row") != std::string::npos);

  // Garbage, and a PDF that is no sealed report, are refused cleanly.
  write_file(dir / "garbage.pdf", std::string("\x00\x01garbage\xff", 11));
  const auto garbage = run(kCli + " verify " + quoted(cpcase) + " --against " + quoted(dir / "garbage.pdf"));
  INFO(garbage.output);
  CHECK(garbage.exit_code == 1);
  CHECK(garbage.output.find("not a PDF file") != std::string::npos);
  const auto working = dir / "working-copy.pdf";
  REQUIRE(run(kCli + " report " + quoted(demo) + " -o " + quoted(working)).exit_code == 0);
  const auto unsealed = run(kCli + " verify " + quoted(cpcase) + " --against " + quoted(working));
  INFO(unsealed.output);
  CHECK(unsealed.exit_code == 1);
  CHECK(unsealed.output.find("carries no seal anchor") != std::string::npos);
}

TEST_CASE("command: a sealed report whose file was not written is kept by the store and written by export") {
  // The report is sealed before its file is written (the report prints its seal); when the write
  // then fails — here a folder that does not exist, as a process killed at that moment would
  // leave it — the sealed bytes are in the store, and export --sealed-report writes them.
  const auto dir = temp_dir("command-sealed-report");
  const auto cpcase = dir / "breakin.cpcase";
  {
    const store::ExaminerName examiner("Dr Imogen Tarrant");
    auto created = store::CaseStore::create(cpcase, nlohmann::json::parse(read_file(demo_dir() / "harwick-vale-breakin.json")),
                                            examiner);
  }
  const auto lost = dir / "no-such-folder" / "breakin.pdf";
  const auto failed = run(kCli + " report " + quoted(cpcase) + " -o " + quoted(lost) +
                          " --examiner 'Dr Imogen Tarrant' --unsigned-seal --confirm-open-points");
  INFO(failed.output);
  CHECK(failed.exit_code == 1);
  CHECK(failed.output.find("Sealed revision 1") != std::string::npos);
  CHECK(failed.output.find("revision 1 is sealed with this report and the store keeps its bytes") != std::string::npos);
  CHECK(failed.output.find("--sealed-report 1 -o") != std::string::npos);
  const auto seal = store::CaseStore::open(cpcase, store::OpenMode::read_only).latest_seal();
  REQUIRE(seal);
  REQUIRE(seal->revision == 1);

  const auto pdf = dir / "breakin.pdf";
  const auto exported = run(kCli + " export " + quoted(cpcase) + " --sealed-report 1 -o " + quoted(pdf));
  INFO(exported.output);
  REQUIRE(exported.exit_code == 0);
  // The bytes the seal row's digest names (SHA-256, FIPS 180-4, through OpenSSL), a PDF, private
  // like every file of case content, and the store matches it as the issued report.
  const std::string bytes = read_file(pdf);
  CHECK(bytes.rfind("%PDF-", 0) == 0);
  CHECK(platform::sha256_hex(bytes) == seal->report_sha256);
  CHECK(exported.output.find(seal->report_sha256) != std::string::npos);
  CHECK((std::filesystem::status(pdf).permissions() & std::filesystem::perms::all) ==
        (std::filesystem::perms::owner_read | std::filesystem::perms::owner_write));
  const auto matched = run(kCli + " verify " + quoted(cpcase) + " --against " + quoted(pdf));
  INFO(matched.output);
  CHECK(matched.exit_code == 0);
  CHECK(matched.output.find("the report file is byte for byte the report sealed with revision 1") != std::string::npos);

  // Refused: a revision that is not sealed, a file that exists, a revision that is no number.
  const auto unsealed = run(kCli + " export " + quoted(cpcase) + " --sealed-report 2 -o " + quoted(dir / "r2.pdf"));
  CHECK(unsealed.exit_code == 1);
  CHECK(unsealed.output.find("revision 2: there is no sealed revision with this number") != std::string::npos);
  CHECK_FALSE(std::filesystem::exists(dir / "r2.pdf"));
  CHECK(run(kCli + " export " + quoted(cpcase) + " --sealed-report 1 -o " + quoted(pdf)).exit_code == 1);
  CHECK(run(kCli + " export " + quoted(cpcase) + " --sealed-report 1 -o " + quoted(pdf) + " --force").exit_code == 0);
  CHECK(run(kCli + " export " + quoted(cpcase) + " --sealed-report one -o " + quoted(dir / "r3.pdf")).exit_code == 2);
}

TEST_CASE("command: an existing report is replaced only with --force") {
  const auto dir = temp_dir("command-force");
  const auto demo = demo_dir() / "harwick-vale-breakin.json";
  const auto pdf = dir / "breakin.pdf";
  write_file(pdf, "an earlier report");
  const auto refused = run(kCli + " report " + quoted(demo) + " -o " + quoted(pdf));
  INFO(refused.output);
  CHECK(refused.exit_code == 1);
  CHECK(refused.output.find("already exists (use --force to replace it)") != std::string::npos);
  CHECK(read_file(pdf) == "an earlier report");
  const auto text = dir / "breakin.txt";
  write_file(text, "an earlier text");
  CHECK(run(kCli + " report " + quoted(demo) + " -o " + quoted(dir / "other.pdf") + " --text " + quoted(text)).exit_code == 1);
  CHECK_FALSE(std::filesystem::exists(dir / "other.pdf"));
  const auto forced = run(kCli + " report " + quoted(demo) + " -o " + quoted(pdf) + " --force");
  INFO(forced.output);
  CHECK(forced.exit_code == 0);
  CHECK(read_file(pdf).rfind("%PDF-1.4", 0) == 0);
}

TEST_CASE("command: a case store with open checklist points is sealed only when they are confirmed") {
  const auto dir = temp_dir("command-checklist");
  auto document = nlohmann::json::parse(read_file(demo_dir() / "harwick-vale-breakin.json"));
  // The examiner stays: only the case's examiner (or a declared reviewer) may seal.
  document["case"].erase("laboratory");
  document["items"][0].erase("description");
  const auto cpcase = dir / "open.cpcase";
  const store::ExaminerName examiner("Dr Imogen Tarrant");  // the demo case's examiner (invented)
  { auto created = store::CaseStore::create(cpcase, document, examiner); }
  const auto pdf = dir / "open.pdf";
  // Sealed without a key on purpose: the report and verify say the seal is unsigned.
  const std::string as_examiner = " --examiner 'Dr Imogen Tarrant' --unsigned-seal";
  const auto refused = run(kCli + " report " + quoted(cpcase) + " -o " + quoted(pdf) + as_examiner);
  INFO(refused.output);
  CHECK(refused.exit_code == 1);
  CHECK(refused.output.find("The laboratory is not recorded. (case, laboratory)") != std::string::npos);
  CHECK(refused.output.find("Item E1 has no description of the findings. (E1, description)") != std::string::npos);
  CHECK(refused.output.find("seals the current revision") != std::string::npos);
  CHECK_FALSE(std::filesystem::exists(pdf));
  CHECK_FALSE(store::CaseStore::open(cpcase, store::OpenMode::read_only).latest_seal());
  const auto confirmed = run(kCli + " report " + quoted(cpcase) + " -o " + quoted(pdf) + " --confirm-open-points" + as_examiner);
  INFO(confirmed.output);
  CHECK(confirmed.exit_code == 0);
  CHECK(confirmed.output.find("UNSIGNED seal") != std::string::npos);
  const auto seal = store::CaseStore::open(cpcase, store::OpenMode::read_only).latest_seal();
  REQUIRE(seal);
  CHECK_FALSE(seal->signed_seal());
  CHECK(pdf_text(pdf).find("This seal is unsigned") != std::string::npos);
  CHECK(run(kCli + " verify " + quoted(cpcase)).output.find("unsigned seal") != std::string::npos);
}

TEST_CASE("command: a report from a case store lists the review notes of earlier revisions, quoted and checked") {
  const auto dir = temp_dir("command-review-notes");
  const auto demo = demo_dir() / "harwick-vale-breakin.json";
  const auto cpcase = dir / "breakin.cpcase";
  // Invented people of the Vale Forensic Laboratory; the note states a probability of a
  // proposition, which the wording check flags wherever it appears.
  const store::ExaminerName examiner("Dr Imogen Tarrant"), reviewer("Dr Owen Pryce");
  const std::string flagged = "There is a 99.9% probability that Mr Ashby broke the window of the bakery.";
  { auto created = store::CaseStore::create(cpcase, nlohmann::json::parse(read_file(demo)), examiner); }
  const auto first = run(kCli + " report " + quoted(cpcase) + " -o " + quoted(dir / "first.pdf") +
                         " --examiner 'Dr Imogen Tarrant' --unsigned-seal");
  INFO(first.output);
  REQUIRE(first.exit_code == 0);
  {
    auto opened = store::CaseStore::open(cpcase, store::OpenMode::edit);
    opened.declare_reviewer(examiner, reviewer);
    opened.add_review_note(reviewer, 1, store::ReviewVerdict::disagree, flagged);
  }
  const auto second = run(kCli + " report " + quoted(cpcase) + " -o " + quoted(dir / "second.pdf") + " --text " +
                          quoted(dir / "second.txt") + " --examiner 'Dr Imogen Tarrant' --unsigned-seal");
  INFO(second.output);
  REQUIRE(second.exit_code == 0);  // a flagged note does not refuse a casework report
  const std::string text = read_file(dir / "second.txt");
  CHECK(text.find("Review notes") != std::string::npos);
  CHECK(text.find("Dr Owen Pryce") != std::string::npos);
  CHECK(text.find("disagree") != std::string::npos);
  CHECK(text.find(flagged) != std::string::npos);
  CHECK(text.find("The wording check points out in this note") != std::string::npos);
  // The first report, issued before the note, has no such section.
  CHECK(pdf_text(dir / "first.pdf").find("Review notes") == std::string::npos);
}

// counterpoise-cli report on a case in the shared PostgreSQL store, end to end against a real
// server: the examiner's report seals the revision in the database, signed, with the PDF's bytes;
// verify --against checks the store against that PDF; a reviewer, whom the database does not
// let seal, gets no report and leaves nothing behind. Needs a server (scripts/pg-cluster);
// without one the test says it was skipped.
#include "core/platform/sha256.hpp"
#include "core/store/case_store.hpp"
#include "core/store/postgres_schema.hpp"
#include "report_test_support.hpp"
#include "tests/core/store/cli_runner.hpp"
#include "tests/core/store/store_backends.hpp"

using namespace counterpoise;
using namespace counterpoise::reports::testing;
using store_test::cli;
using store_test::Run;

namespace {

std::vector<std::string> as_role(const char* role, const std::filesystem::path& keys) {
  return {std::string("PGUSER=") + role, "COUNTERPOISE_KEY_DIR=" + keys.string()};
}

}  // namespace

TEST_CASE("command: a report from a case in the database seals it there, signed, and verify --against matches") {
  auto under_test = store_test::store_for(store_test::Backend::database);
  if (!under_test) return;
  const char* database = std::getenv("PGDATABASE");
  const std::string address =
      std::string("postgresql:///") + (database ? database : "") + "?case=" + under_test->reference();
  const auto dir = temp_dir("command-database");
  const auto demo = demo_dir() / "harwick-vale-breakin.json";
  const auto examiner = as_role(store_test::kExaminerRole, dir / "keys");

  // The demo break-in case's examiner imports it into the database and makes a signing key.
  const Run imported = cli({"import", demo.string(), "-o", address, "--examiner", "Dr Imogen Tarrant"}, examiner);
  INFO(imported.output);
  REQUIRE(imported.code == 0);
  REQUIRE(cli({"key", "create", "--examiner", "Dr Imogen Tarrant"}, examiner).code == 0);

  // A reviewer of the case, declared by its examiner, may seal by the case's own rules, but the
  // database lets only the case's examiners seal: no report is written, nothing is sealed.
  REQUIRE(cli({"declare-reviewer", address, "Dr Owen Pryce", "--examiner", "Dr Imogen Tarrant"}, examiner).code == 0);
  store_test::add_case_member(under_test->reference(), store_test::kReviewerRole, store::member_role::reviewer);
  const auto refused_pdf = dir / "by-reviewer.pdf";
  const Run refused = cli({"report", address, "-o", refused_pdf.string(), "--examiner", "Dr Owen Pryce", "--unsigned-seal"},
                          as_role(store_test::kReviewerRole, dir / "reviewer-keys"));
  INFO(refused.output);
  CHECK(refused.code != 0);
  CHECK(refused.output.find("only the case's examiners edit it and seal it") != std::string::npos);
  CHECK_FALSE(std::filesystem::exists(refused_pdf));
  CHECK_FALSE(under_test->open(store::OpenMode::read_only).latest_seal());

  const auto pdf = dir / "breakin.pdf";
  const Run reported = cli({"report", address, "-o", pdf.string(), "--examiner", "Dr Imogen Tarrant"}, examiner);
  INFO(reported.output);
  REQUIRE(reported.code == 0);
  CHECK(reported.output.find("signed by Dr Imogen Tarrant, key fingerprint") != std::string::npos);

  const auto opened = under_test->open(store::OpenMode::read_only);
  const auto seal = opened.latest_seal();
  REQUIRE(seal);
  CHECK(seal->revision == 1);
  CHECK(seal->signed_seal());
  // The database holds the report written, byte for byte (bytea), and the state it sealed.
  CHECK(seal->report_sha256 == platform::sha256_hex(read_file(pdf)));
  CHECK(opened.sealed_report_bytes(seal->revision) == read_file(pdf));
  CHECK(seal->state_sha256 == platform::sha256_hex(opened.export_canonical()));
  CHECK(pdf_text(pdf).find(seal->state_sha256) != std::string::npos);
  // The seal row records the database role that wrote it.
  CHECK(opened.audit_rows().back().account == std::string(store_test::kExaminerRole));

  const Run verified = cli({"verify", address, "--against", pdf.string()}, examiner);
  INFO(verified.output);
  CHECK(verified.code == 0);
  CHECK(verified.output.find("matches the report") != std::string::npos);
  CHECK(verified.output.find("seal signature verifies") != std::string::npos);
  // The reviewer reads the same seal from the database.
  const Run reviewer_verify = cli({"verify", address, "--against", pdf.string()},
                                  as_role(store_test::kReviewerRole, dir / "reviewer-keys"));
  CHECK(reviewer_verify.code == 0);
}

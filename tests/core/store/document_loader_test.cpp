#include "core/store/document_loader.hpp"

#include <catch2/catch.hpp>

#include "core/store/canonical_json.hpp"
#include "core/store/case_store.hpp"
#include "tests/core/store/store_test_support.hpp"

using store_test::kThwaite;
using namespace counterpoise::store;
using Catch::Matchers::Contains;
using counterpoise::validation::FileError;
using counterpoise::validation::InvalidValue;
using counterpoise::validation::UnsupportedFormat;

TEST_CASE("the loader reads a case store and a JSON file alike", "[store][loader]") {
  store_test::TempDir dir;
  const auto document = store_test::sample_case();
  store_test::write_bytes(dir / "case.json", document.dump(2));
  CaseStore::create(dir / "case.cpcase", document, kThwaite);
  // Extensions do not decide: the content does.
  std::filesystem::copy_file(dir / "case.cpcase", dir / "renamed.json");

  const LoadedDocument from_json = load_case_document(dir / "case.json");
  CHECK(from_json.kind == FileKind::not_sqlite);
  CHECK(from_json.base_dir == dir.path());
  const LoadedDocument from_store = load_case_document(dir / "case.cpcase");
  CHECK(from_store.kind == FileKind::case_file);
  CHECK(canonical_text(from_store.document) == canonical_text(from_json.document));
  CHECK(load_case_document(dir / "renamed.json").kind == FileKind::case_file);
}

TEST_CASE("the loader names what is wrong with a file", "[store][loader]") {
  store_test::TempDir dir;
  store_test::write_bytes(dir / "broken.json",
                          "{\n  \"items\": [\n    {\"id\": \"E1\",}\n  ]\n}\n");
  CHECK_THROWS_WITH(load_case_document(dir / "broken.json"),
                    Contains("broken.json") && Contains("line 3, column"));
  CHECK_THROWS_AS(load_case_document(dir / "missing.json"), FileError);
  store_test::raw_sql(dir / "other.db", "CREATE TABLE t(x); PRAGMA application_id = 1234;");
  CHECK_THROWS_AS(load_case_document(dir / "other.db"), UnsupportedFormat);
}

// How a version to compare is named: a file, a store's current state or its sealed revision N,
// for a case file and for a case in the shared store (an @ before the case parameter is the
// database user's, not a revision).
#include <fstream>

#include <catch2/catch.hpp>

#include "core/comparison/version_location.hpp"
#include "core/validation/input_error.hpp"
#include "tests/core/store/store_test_support.hpp"

using counterpoise::comparison::parse_version_location;
using counterpoise::comparison::VersionLocation;

namespace {
bool same(const VersionLocation& a, const VersionLocation& b) {
  return a.location == b.location && a.revision == b.revision;
}
}  // namespace

TEST_CASE("a version names a file, a store's current state or a sealed revision", "[comparison]") {
  CHECK(same(parse_version_location("case.json"), {"case.json", std::nullopt}));
  CHECK(same(parse_version_location("case.cpcase@2"), {"case.cpcase", 2}));
  CHECK(same(parse_version_location("postgresql:///casework?case=VFL-2026-0417@12"),
             {"postgresql:///casework?case=VFL-2026-0417", 12}));
  // The database user is not a revision.
  CHECK(same(parse_version_location("postgresql://opryce@lab-db/casework?case=VFL-2026-0417"),
             {"postgresql://opryce@lab-db/casework?case=VFL-2026-0417", std::nullopt}));
  CHECK(same(parse_version_location("postgresql://opryce@lab-db/casework?case=VFL-2026-0417@3"),
             {"postgresql://opryce@lab-db/casework?case=VFL-2026-0417", 3}));
  // A file that exists under the whole name is that file.
  store_test::TempDir dir;
  const std::string named = (dir / "copy@2.json").string();
  std::ofstream(named) << "{}";
  CHECK(same(parse_version_location(named), {named, std::nullopt}));
}

TEST_CASE("a revision that is not a whole number is refused, naming the form", "[comparison]") {
  CHECK_THROWS_AS(parse_version_location("case.cpcase@x"), counterpoise::validation::InvalidValue);
  CHECK_THROWS_WITH(parse_version_location("postgresql:///casework?case=R@"),
                    Catch::Matchers::Contains("@N with N a whole number"));
  CHECK_THROWS_AS(parse_version_location("case.cpcase@1234567890"), counterpoise::validation::InvalidValue);
}

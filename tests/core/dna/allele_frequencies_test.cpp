// The frequency-table readers: every accepted shape and every documented error.
#include <catch2/catch.hpp>

#include "core/models/dna/allele_frequencies.hpp"
#include "core/models/dna/str_loci.hpp"
#include "core/reading/csv_table.hpp"
#include "dna_test_support.hpp"

using namespace counterpoise::models::dna;
using counterpoise::validation::FileError;
using counterpoise::validation::InvalidValue;
using Catch::Matchers::Contains;
using nlohmann::json;

namespace {
FrequencyTable from_csv(const std::string& text, const std::map<std::string, std::int64_t>& sizes = {}) {
  const counterpoise::validation::Location where{"D1", "frequencies.file"};
  return frequency_table_from_csv(counterpoise::reading::parse_csv(text, "freq.csv", where), sizes,
                                  kDefaultSumTolerance, where);
}
bool has_warning(const FrequencyTable& table, const std::string& code) {
  for (const auto& note : table.warnings())
    if (note.code == code) return true;
  return false;
}
}  // namespace

TEST_CASE("frequency CSV: locus, allele, frequency", "[dna][frequencies]") {
  const auto table = from_csv("# invented\nlocus,allele,frequency\nD8S1179,13,0.6\nD8S1179,14,0.4\nTH01,9.3,1\n");
  const auto* locus = table.find("D8S1179");
  REQUIRE(locus);
  CHECK(locus->alleles.at("13").frequency == 0.6);
  CHECK(locus->alleles.at("13").origin == "freq.csv line 3");
  CHECK_FALSE(locus->has_counts);
  CHECK_FALSE(locus->allele_total());
  CHECK(table.warnings().empty());
}

TEST_CASE("frequency CSV: counts with and without the database size", "[dna][frequencies]") {
  SECTION("2N from the count total") {
    const auto table = from_csv("locus,allele,count\nTH01,6,30\nTH01,7,70\n");
    const auto* locus = table.find("TH01");
    CHECK(locus->alleles.at("6").frequency == Approx(0.3));
    CHECK(*locus->allele_total() == 100);
    CHECK(locus->has_counts);
  }
  SECTION("database_size column; counts below 2N leave other alleles") {
    const auto table = from_csv("locus,allele,count,database_size\nTH01,6,30,100\nTH01,7,70,100\n");
    CHECK(table.find("TH01")->alleles.at("6").frequency == Approx(0.15));
    CHECK(*table.find("TH01")->allele_total() == 200);
    CHECK(has_warning(table, "partial-counts"));
  }
  SECTION("frequencies with a database size giving whole counts") {
    const auto table = from_csv("locus,allele,frequency\nTH01,6,0.25\nTH01,7,0.75\n", {{"", 50}});
    CHECK(table.find("TH01")->has_counts);
    CHECK(*table.find("TH01")->alleles.at("6").count == 25);
  }
  SECTION("frequencies times 2N not whole: no counts, never rounded") {
    const auto table = from_csv("locus,allele,frequency\nTH01,6,0.2512\nTH01,7,0.7488\n", {{"", 50}});
    CHECK_FALSE(table.find("TH01")->has_counts);
    CHECK(*table.find("TH01")->allele_total() == 100);  // still used for 5/2N
  }
}

TEST_CASE("frequency validation", "[dna][frequencies][errors]") {
  SECTION("frequency 0") {
    CHECK_THROWS_WITH(from_csv("locus,allele,frequency\nTH01,6,0\n"),
                      Contains("freq.csv line 2") && Contains("outside (0, 1]"));
  }
  SECTION("frequency above 1") { CHECK_THROWS_AS(from_csv("locus,allele,frequency\nTH01,6,1.2\n"), InvalidValue); }
  SECTION("not a number") {
    CHECK_THROWS_WITH(from_csv("locus,allele,frequency\nTH01,6,abc\n"),
                      Contains("line 2, column frequency") && Contains("not a number"));
  }
  SECTION("duplicate rows name both lines") {
    CHECK_THROWS_WITH(from_csv("locus,allele,frequency\nTH01,6,0.5\nTH01,7,0.4\nTH01,6,0.1\n"),
                      Contains("freq.csv line 4") && Contains("listed twice (first at freq.csv line 2)"));
  }
  SECTION("duplicate through another spelling of a standard locus") {
    CHECK_THROWS_WITH(from_csv("locus,allele,frequency\nvWA,16,0.5\nVWA,16,0.5\n"), Contains("listed twice"));
  }
  SECTION("both frequency and count columns") {
    CHECK_THROWS_WITH(from_csv("locus,allele,frequency,count\nTH01,6,0.5,3\n"), Contains("exactly one"));
  }
  SECTION("missing locus column") {
    CHECK_THROWS_WITH(from_csv("marker,allele,frequency\nTH01,6,0.5\n"), Contains("no column 'locus'"));
  }
  SECTION("fractional count") { CHECK_THROWS_WITH(from_csv("locus,allele,count\nTH01,6,2.5\n"), Contains("whole number")); }
  SECTION("negative count") { CHECK_THROWS_WITH(from_csv("locus,allele,count\nTH01,6,-1\n"), Contains("at least 0")); }
  SECTION("counts above 2N") {
    CHECK_THROWS_WITH(from_csv("locus,allele,count,database_size\nTH01,6,150,50\nTH01,7,10,50\n"),
                      Contains("more than the 100 alleles"));
  }
  SECTION("database size varying within a locus") {
    CHECK_THROWS_WITH(from_csv("locus,allele,count,database_size\nTH01,6,1,50\nTH01,7,1,60\n"),
                      Contains("line 3") && Contains("differs"));
  }
  SECTION("database size 0") {
    CHECK_THROWS_WITH(from_csv("locus,allele,count,database_size\nTH01,6,1,0\n"), Contains("at least 1"));
  }
  SECTION("database size in both places") {
    CHECK_THROWS_WITH(from_csv("locus,allele,count,database_size\nTH01,6,1,5\n", {{"", 5}}), Contains("as well"));
  }
  SECTION("empty allele") { CHECK_THROWS_WITH(from_csv("locus,allele,frequency\nTH01,,0.5\n"), Contains("empty allele")); }
  SECTION("empty locus") { CHECK_THROWS_WITH(from_csv("locus,allele,frequency\n,6,0.5\n"), Contains("empty locus")); }
  SECTION("all counts zero") { CHECK_THROWS_WITH(from_csv("locus,allele,count\nTH01,6,0\n"), Contains("are zero")); }
}

TEST_CASE("frequency warnings: sums, unknown loci, Amelogenin", "[dna][frequencies]") {
  SECTION("sum beyond the tolerance warns and keeps the values") {
    const auto table = from_csv("locus,allele,frequency\nTH01,6,0.5\nTH01,7,0.4\n");
    CHECK(has_warning(table, "frequency-sum"));
    CHECK(table.find("TH01")->alleles.at("6").frequency == 0.5);
  }
  SECTION("sum within the tolerance is silent") {
    CHECK(from_csv("locus,allele,frequency\nTH01,6,0.5\nTH01,7,0.495\n").warnings().empty());
  }
  SECTION("non-standard locus name") {
    CHECK(has_warning(from_csv("locus,allele,frequency\nD99S99,6,1\n"), "nonstandard-locus"));
  }
  SECTION("Amelogenin rows are dropped with a note") {
    const auto table = from_csv("locus,allele,frequency\nAMEL,X,0.5\nAMEL,Y,0.5\nTH01,6,1\n");
    CHECK(table.find("Amelogenin") == nullptr);
    CHECK(has_warning(table, "amelogenin-ignored"));
  }
}

TEST_CASE("frequencies member of the item", "[dna][frequencies]") {
  dna_test::TempFolder folder;
  folder.write("freq.csv", "locus,allele,frequency\nTH01,6,0.25\nTH01,7,0.75\n");
  const auto ctx = dna_test::context(folder.path());
  SECTION("file relative to the case folder") {
    CHECK(read_frequency_table(json{{"file", "freq.csv"}}, ctx).find("TH01"));
  }
  SECTION("missing file") {
    CHECK_THROWS_AS(read_frequency_table(json{{"file", "nope.csv"}}, ctx), FileError);
  }
  SECTION("inline table") {
    const auto table = read_frequency_table(json::parse(R"({"table": {"D8S1179": {"13": 0.30, "14": 0.21}}})"), ctx);
    CHECK(table.find("D8S1179")->alleles.at("14").frequency == 0.21);
  }
  SECTION("inline counts with database size per locus") {
    const auto table = read_frequency_table(
        json::parse(R"({"counts": {"TH01": {"6": 40, "7": 60}}, "database_size": {"TH01": 100}})"), ctx);
    CHECK(*table.find("TH01")->allele_total() == 200);
    CHECK(table.find("TH01")->alleles.at("6").frequency == Approx(0.2));
  }
  SECTION("errors name the field") {
    CHECK_THROWS_WITH(read_frequency_table(json::parse(R"({"table": {"TH01": {"6": 0}}})"), ctx),
                      Contains("item D1, field frequencies.table.TH01.6"));
    CHECK_THROWS_WITH(read_frequency_table(json::parse(R"({"file": "freq.csv", "table": {}})"), ctx),
                      Contains("exactly one"));
    CHECK_THROWS_WITH(read_frequency_table(json::parse(R"({})"), ctx), Contains("exactly one"));
    CHECK_THROWS_WITH(read_frequency_table(json::parse(R"({"file": "freq.csv", "tolerance": 1})"), ctx),
                      Contains("unknown field"));
    CHECK_THROWS_WITH(read_frequency_table(json::parse(R"({"file": "freq.csv", "sum_tolerance": 2})"), ctx),
                      Contains("must be in [0, 1)"));
    CHECK_THROWS_WITH(read_frequency_table(json::parse(R"({"file": "freq.csv", "database_size": {"FGA": 10}})"), ctx),
                      Contains("not in the frequency table"));
    CHECK_THROWS_WITH(read_frequency_table(json::parse(R"({"counts": {"TH01": {"6": 1.5}}})"), ctx),
                      Contains("whole number"));
    CHECK_THROWS_WITH(read_frequency_table(json::parse(R"({"table": {"TH01": {}}})"), ctx), Contains("no alleles"));
    CHECK_THROWS_WITH(read_frequency_table(json::parse(R"({"file": "freq.csv", "database_size": 0})"), ctx),
                      Contains("at least 1"));
  }
}

TEST_CASE("standard locus names", "[dna][loci]") {
  // CODIS core 20 and the European Standard Set (common practice; see str_loci.hpp).
  CHECK(standard_str_loci().size() == 24);
  CHECK(*canonical_locus_name("VWA") == "vWA");
  CHECK(*canonical_locus_name("penta_d") == "Penta D");
  CHECK(*canonical_locus_name("th01") == "TH01");
  CHECK(is_amelogenin("AMEL"));
  CHECK_FALSE(canonical_locus_name("D8S1197"));
  CHECK(locus_key("D8S1197") == "D8S1197");
}

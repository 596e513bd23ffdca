// The CSV reader: RFC 4180 quoting (Shafranovich 2005, RFC 4180 section 2), comments, line
// numbers in every error.
#include <stdexcept>
#include <string>
#include <vector>

#include <catch2/catch.hpp>

#include "core/reading/csv_table.hpp"

using namespace counterpoise::reading;
using counterpoise::validation::InvalidValue;
using counterpoise::validation::Location;
using Catch::Matchers::Contains;

namespace {
const Location kWhere{"D1", "frequencies.file"};
}

TEST_CASE("CSV: header, rows, quoting, comments, line numbers", "[csv]") {
  const auto table = parse_csv(
      "\xEF\xBB\xBF# comment\r\nlocus, allele ,frequency\r\n\r\n\"Penta D\",\"9.3\",0.25\r\n"
      "\"a \"\"quoted\"\" name\",\"x,y\",1e-3\n\"two\nlines\",b,+0.5\n",
      "t.csv", kWhere);
  CHECK(table.header == std::vector<std::string>{"locus", "allele", "frequency"});
  CHECK(table.header_line == 2);
  REQUIRE(table.row_count() == 3);
  CHECK(table.row_line(0) == 4);
  CHECK(table.field(0, 0) == "Penta D");
  CHECK(table.field(1, 0) == "a \"quoted\" name");  // RFC 4180 2.7: doubled quote
  CHECK(table.field(1, 1) == "x,y");               // RFC 4180 2.6: comma inside quotes
  CHECK(table.field(2, 0) == "two\nlines");        // RFC 4180 2.6: line break inside quotes
  CHECK(table.row_line(2) == 6);
  CHECK(*table.find_column("FREQUENCY") == 2);
  CHECK(csv_number(table, 1, 2, kWhere) == 1e-3);
  CHECK(csv_number(table, 2, 2, kWhere) == 0.5);
}

TEST_CASE("CSV errors", "[csv][errors]") {
  CHECK_THROWS_WITH(parse_csv("# only a comment\n", "t.csv", kWhere), Contains("no header row"));
  CHECK_THROWS_WITH(parse_csv("a,,c\n", "t.csv", kWhere), Contains("t.csv line 1: column 2 has no name"));
  CHECK_THROWS_WITH(parse_csv("a,A\n", "t.csv", kWhere), Contains("appears twice"));
  CHECK_THROWS_WITH(parse_csv("a,b\n1,\"2\n", "t.csv", kWhere), Contains("line 2: quoted field is not closed"));
  CHECK_THROWS_WITH(parse_csv("a,b\n1,\"2\"x\n", "t.csv", kWhere), Contains("line 2: unexpected text"));
  CHECK_THROWS_WITH(parse_csv("a,b\n1,2\n3\n", "t.csv", kWhere), Contains("line 3: 1 fields, but the header has 2"));
  const auto table = parse_csv("a,b\n,nan\n1x,inf\n", "t.csv", kWhere);
  CHECK_THROWS_WITH(csv_number(table, 0, 0, kWhere), Contains("line 2, column a: empty"));
  CHECK_THROWS_WITH(csv_number(table, 0, 1, kWhere), Contains("not a finite number"));
  CHECK_THROWS_WITH(csv_number(table, 1, 0, kWhere), Contains("line 3, column a: '1x' is not a number"));
  CHECK_THROWS_WITH(table.require_column("c", kWhere), Contains("no column 'c' (columns: a, b)"));
  CHECK_THROWS_AS(read_csv_file("/nonexistent/x.csv", kWhere), counterpoise::validation::FileError);
  const auto huge = parse_csv("a\n1e999\n", "t.csv", kWhere);
  CHECK_THROWS_WITH(csv_number(huge, 0, 0, kWhere), Contains("out of the range"));
}

TEST_CASE("CSV: line numbers of rows after comments, blank lines and quoted line breaks", "[csv]") {
  // Line counting as RFC 4180 section 2 defines records: a quoted line break stays in its field.
  const auto table = parse_csv("x,y\n1,a\n2,b\n# note\n\n3,\"c\nd\"\n4,e\n5,f\n", "t.csv", kWhere);
  REQUIRE(table.row_count() == 5);
  CHECK(table.row_line(0) == 2);
  CHECK(table.row_line(1) == 3);
  CHECK(table.row_line(2) == 6);
  CHECK(table.field(2, 1) == "c\nd");
  CHECK(table.row_line(3) == 8);
  CHECK(table.row_line(4) == 9);
  CHECK(table.field(4, 1) == "f");
  CHECK_THROWS_AS(table.row_line(5), std::out_of_range);
  CHECK(csv_numbers(table, 0, kWhere) == std::vector<double>{1, 2, 3, 4, 5});
  CHECK_THROWS_WITH(csv_numbers(table, 1, kWhere), Contains("t.csv line 2, column y: 'a' is not a number"));
  const auto later = parse_csv("x\n1\n# note\n2\n2.5.1\n", "t.csv", kWhere);
  CHECK_THROWS_WITH(csv_numbers(later, 0, kWhere), Contains("t.csv line 5, column x: '2.5.1' is not a number"));
}

// The memory budget (docs/performance.md): a background file of N bytes costs the reader well
// under 20 N. The table's own share is checked here through its reported heap bytes, not by
// timing or by the process's memory: the text of each field plus 4 bytes a cell, with at most
// the doubling slack of a growing std::string or std::vector (common practice: both grow
// geometrically by a factor of 2 in libstdc++ and libc++). A table that kept a string per
// field again (32 bytes each before its text) would exceed the bound several times over.
TEST_CASE("CSV: a parsed table holds at most three bytes per byte of its text", "[csv][memory]") {
  std::string one_column = "measurement\n";
  std::string three_columns = "locus,allele,frequency\n";
  for (int i = 0; i < 100000; ++i) {
    one_column += "0." + std::to_string(100000 + i * 7 % 899999) + "\n";  // 9 bytes a row
    three_columns += "D8S1179," + std::to_string(8 + i % 12) + "," + "0.0" + std::to_string(1000 + i % 8999) + "\n";
  }
  const auto single = parse_csv(one_column, "one.csv", kWhere);
  REQUIRE(single.row_count() == 100000);
  CHECK(single.byte_size() <= 3 * one_column.size());
  const auto triple = parse_csv(three_columns, "three.csv", kWhere);
  REQUIRE(triple.row_count() == 100000);
  CHECK(triple.byte_size() <= 3 * three_columns.size());
  // The fields are all there: the bound is not met by dropping text.
  CHECK(single.field(99999, 0) == "0." + std::to_string(100000 + 99999 * 7 % 899999));
  CHECK(triple.field(12345, 1) == std::to_string(8 + 12345 % 12));
}

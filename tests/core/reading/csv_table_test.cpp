// The CSV reader: RFC 4180 quoting (Shafranovich 2005, RFC 4180 section 2), comments, line
// numbers in every error.
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
  REQUIRE(table.rows.size() == 3);
  CHECK(table.rows[0].line == 4);
  CHECK(table.rows[0].fields[0] == "Penta D");
  CHECK(table.rows[1].fields[0] == "a \"quoted\" name");  // RFC 4180 2.7: doubled quote
  CHECK(table.rows[1].fields[1] == "x,y");               // RFC 4180 2.6: comma inside quotes
  CHECK(table.rows[2].fields[0] == "two\nlines");        // RFC 4180 2.6: line break inside quotes
  CHECK(table.rows[2].line == 6);
  CHECK(*table.find_column("FREQUENCY") == 2);
  CHECK(csv_number(table, table.rows[1], 2, kWhere) == 1e-3);
  CHECK(csv_number(table, table.rows[2], 2, kWhere) == 0.5);
}

TEST_CASE("CSV errors", "[csv][errors]") {
  CHECK_THROWS_WITH(parse_csv("# only a comment\n", "t.csv", kWhere), Contains("no header row"));
  CHECK_THROWS_WITH(parse_csv("a,,c\n", "t.csv", kWhere), Contains("t.csv line 1: column 2 has no name"));
  CHECK_THROWS_WITH(parse_csv("a,A\n", "t.csv", kWhere), Contains("appears twice"));
  CHECK_THROWS_WITH(parse_csv("a,b\n1,\"2\n", "t.csv", kWhere), Contains("line 2: quoted field is not closed"));
  CHECK_THROWS_WITH(parse_csv("a,b\n1,\"2\"x\n", "t.csv", kWhere), Contains("line 2: unexpected text"));
  CHECK_THROWS_WITH(parse_csv("a,b\n1,2\n3\n", "t.csv", kWhere), Contains("line 3: 1 fields, but the header has 2"));
  const auto table = parse_csv("a,b\n,nan\n1x,inf\n", "t.csv", kWhere);
  CHECK_THROWS_WITH(csv_number(table, table.rows[0], 0, kWhere), Contains("line 2, column a: empty"));
  CHECK_THROWS_WITH(csv_number(table, table.rows[0], 1, kWhere), Contains("not a finite number"));
  CHECK_THROWS_WITH(csv_number(table, table.rows[1], 0, kWhere), Contains("line 3, column a: '1x' is not a number"));
  CHECK_THROWS_WITH(table.require_column("c", kWhere), Contains("no column 'c' (columns: a, b)"));
  CHECK_THROWS_AS(read_csv_file("/nonexistent/x.csv", kWhere), counterpoise::validation::FileError);
  const auto huge = parse_csv("a\n1e999\n", "t.csv", kWhere);
  CHECK_THROWS_WITH(csv_number(huge, huge.rows[0], 0, kWhere), Contains("out of the range"));
}

// Column widths from content: each column at least its minimum content width (the widest text
// that cannot be broken), the rest shared out — the automatic table layout of W3C, Cascading Style
// Sheets Level 2 Revision 1 (CSS 2.1) Specification, 2011, section 17.5.2.2, in its simplest form.
#include <catch2/catch.hpp>

#include <numeric>

#include "reports/column_widths.hpp"

using namespace counterpoise::reports;

TEST_CASE("widths: weights alone when every share covers its minimum") {
  const auto w = column_widths({{10, 1}, {10, 3}}, 200);
  CHECK(w[0] == Approx(50));
  CHECK(w[1] == Approx(150));
}

TEST_CASE("widths: a column whose share is too small keeps its minimum, the others share the rest") {
  const auto w = column_widths({{120, 1}, {10, 1}, {10, 2}}, 200);
  CHECK(w[0] == Approx(120));
  CHECK(w[1] == Approx(80.0 / 3));
  CHECK(w[2] == Approx(160.0 / 3));
  CHECK(std::accumulate(w.begin(), w.end(), 0.0) == Approx(200));
}

TEST_CASE("widths: never below a minimum, and the minimums themselves when they do not fit") {
  const std::vector<ColumnNeed> needs{{90, 1}, {80, 5}, {50, 1}};
  CHECK_FALSE(fits_within(needs, 200));
  const auto w = column_widths(needs, 200);
  CHECK(w == std::vector<double>{90, 80, 50});
  for (double total : {220.0, 260.0, 400.0}) {
    const auto fitted = column_widths(needs, total);
    for (std::size_t c = 0; c < needs.size(); ++c) CHECK(fitted[c] >= needs[c].minimum);
    CHECK(std::accumulate(fitted.begin(), fitted.end(), 0.0) == Approx(total));
  }
}

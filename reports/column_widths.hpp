#pragma once
// Column widths of a report table from what its cells need: every column gets at least the width
// of its widest unbreakable text (a number, or the longest word), so no text is shrunk and none
// runs into the next column; the width left over is shared out in proportion to the table's
// relative widths. Pure arithmetic, no Qt, so the rule is tested on its own.

#include <vector>

namespace counterpoise::reports {

struct ColumnNeed {
  double minimum = 0;  // the widest text that cannot be broken, padding included
  double weight = 1;   // the table's relative width for the column
};

// Widths summing to `total` when the minimums fit in it (each column >= its minimum, the rest
// shared by weight); when they do not fit, the minimums themselves (the caller then wraps what it
// can, see fits_within). Columns with weight <= 0 count as weight 1.
std::vector<double> column_widths(const std::vector<ColumnNeed>& needs, double total);

// True when the minimums fit in `total`.
bool fits_within(const std::vector<ColumnNeed>& needs, double total);

}  // namespace counterpoise::reports

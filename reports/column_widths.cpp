#include "reports/column_widths.hpp"

#include <algorithm>

namespace counterpoise::reports {

bool fits_within(const std::vector<ColumnNeed>& needs, double total) {
  double sum = 0;
  for (const auto& n : needs) sum += n.minimum;
  return sum <= total;
}

std::vector<double> column_widths(const std::vector<ColumnNeed>& needs, double total) {
  std::vector<double> widths;
  for (const auto& n : needs) widths.push_back(n.minimum);
  if (!fits_within(needs, total)) return widths;
  // Water filling: share the width by weight; a column whose share is below its minimum keeps the
  // minimum and drops out of the sharing, until every remaining share covers its minimum.
  std::vector<bool> fixed(needs.size(), false);
  for (bool changed = true; changed;) {
    changed = false;
    double free_width = total, free_weight = 0;
    for (std::size_t c = 0; c < needs.size(); ++c) {
      if (fixed[c]) free_width -= needs[c].minimum;
      else free_weight += needs[c].weight > 0 ? needs[c].weight : 1.0;
    }
    for (std::size_t c = 0; c < needs.size(); ++c) {
      if (fixed[c]) continue;
      const double share = free_width * (needs[c].weight > 0 ? needs[c].weight : 1.0) / free_weight;
      if (share < needs[c].minimum) fixed[c] = true, changed = true;
      else widths[c] = share;
    }
  }
  for (std::size_t c = 0; c < needs.size(); ++c)
    if (fixed[c]) widths[c] = needs[c].minimum;
  return widths;
}

}  // namespace counterpoise::reports

#include "core/models/dna/allele_frequencies.hpp"

#include <cmath>

#include "core/models/dna/str_loci.hpp"
#include "core/numbers/number_text.hpp"
#include "core/reading/json_fields.hpp"

namespace counterpoise::models::dna {

using reading::CsvTable;
using nlohmann::json;
using numbers::exact_text;
using validation::InvalidValue;
using validation::Location;

namespace {

// A frequency must lie in (0, 1]: zero is not a frequency but an unseen allele (the minimum
// allele frequency handles those), and more than 1 is impossible.
double check_frequency(double f, const Location& where, const std::string& prefix) {
  if (!(f > 0.0 && f <= 1.0))
    throw InvalidValue(where, prefix + "frequency " + exact_text(f) + " is outside (0, 1]");
  return f;
}

std::int64_t whole_number(double x, const Location& where, const std::string& prefix,
                          const std::string& what, std::int64_t minimum) {
  if (!(x == std::floor(x)) || x > 9.0e15)
    throw InvalidValue(where, prefix + what + " " + exact_text(x) + " must be a whole number");
  if (x < static_cast<double>(minimum))
    throw InvalidValue(where, prefix + what + " " + exact_text(x) + " must be at least " +
                                  std::to_string(minimum));
  return static_cast<std::int64_t>(x);
}

void add_entry(FrequencyTable& table, const std::string& locus, const std::string& allele,
               AlleleEntry entry, const Location& where, const std::string& prefix) {
  if (locus.empty()) throw InvalidValue(where, prefix + "empty locus name");
  if (allele.empty()) throw InvalidValue(where, prefix + "empty allele designation at locus " + locus);
  LocusFrequencies& frequencies = table.locus_for(locus);
  auto [it, inserted] = frequencies.alleles.emplace(allele, entry);
  if (!inserted)
    throw InvalidValue(where, prefix + "locus " + locus + " allele " + allele +
                                  " is listed twice (first at " + it->second.origin + ")");
}

// Reads database_size from the item: a whole number for all loci (key "") or {locus: N}.
std::map<std::string, std::int64_t> read_database_sizes(const json& frequencies, const Location& where) {
  std::map<std::string, std::int64_t> sizes;
  const json* member = reading::find_member(frequencies, "database_size");
  if (!member) return sizes;
  const Location at = where.with_field("database_size");
  auto read_size = [](const json& value, const Location& loc) {
    const std::int64_t n = reading::read_count(value, loc);
    if (n < 1) throw InvalidValue(loc, "database size must be at least 1 person");
    return n;
  };
  if (member->is_object()) {
    for (auto it = member->begin(); it != member->end(); ++it) {
      const std::string key = locus_key(it.key());
      if (!sizes.emplace(key, read_size(it.value(), at.with_field(it.key()))).second)
        throw InvalidValue(at.with_field(it.key()), "locus " + key + " is given twice");
    }
  } else {
    sizes.emplace("", read_size(*member, at));
  }
  return sizes;
}

void apply_database_sizes(FrequencyTable& table, const std::map<std::string, std::int64_t>& sizes,
                          const Location& where) {
  if (sizes.empty()) return;
  for (const auto& [key, n] : sizes) {
    if (key.empty()) continue;
    if (!table.find(key))
      throw InvalidValue(where.with_field("database_size").with_field(key),
                         "locus " + key + " is not in the frequency table");
  }
  for (const auto& [key, locus] : table.loci()) {
    auto it = sizes.find(key);
    if (it == sizes.end()) it = sizes.find("");
    if (it == sizes.end()) continue;
    LocusFrequencies& target = table.locus_for(locus.name);
    if (target.database_size && *target.database_size != it->second)
      throw InvalidValue(where.with_field("database_size"),
                         "database size for locus " + key + " is given both in the table and here");
    target.database_size = it->second;
  }
}

}  // namespace

std::optional<std::int64_t> LocusFrequencies::allele_total() const {
  if (database_size) return 2 * *database_size;
  if (has_counts) {
    std::int64_t total = 0;
    for (const auto& [allele, entry] : alleles) total += entry.count.value_or(0);
    return total;
  }
  return std::nullopt;
}

const LocusFrequencies* FrequencyTable::find(const std::string& locus) const {
  auto it = loci_.find(locus_key(locus));
  return it == loci_.end() ? nullptr : &it->second;
}

LocusFrequencies& FrequencyTable::locus_for(const std::string& name) {
  auto [it, inserted] = loci_.try_emplace(locus_key(name));
  if (inserted) it->second.name = name;
  return it->second;
}

void FrequencyTable::add_warning(std::string code, std::string message) {
  warnings_.push_back(ModelNote{std::move(code), std::move(message)});
}

void FrequencyTable::finish(double sum_tolerance, const Location& where) {
  std::string nonstandard;
  for (auto it = loci_.begin(); it != loci_.end();) {
    if (is_amelogenin(it->first)) {
      add_warning("amelogenin-ignored",
                  "the frequency table lists Amelogenin; it is a sex marker and is not used in the "
                  "match probability");
      it = loci_.erase(it);
      continue;
    }
    if (!canonical_locus_name(it->first))
      nonstandard += (nonstandard.empty() ? "" : ", ") + it->second.name;
    ++it;
  }
  if (!nonstandard.empty())
    add_warning("nonstandard-locus", "the frequency table names loci that are not standard STR locus "
                                     "names (check the spelling): " + nonstandard);

  for (auto& [key, locus] : loci_) {
    bool counted = false;
    for (const auto& [allele, entry] : locus.alleles) counted = counted || entry.count.has_value();
    if (counted) {
      // Count-based: frequencies are count / 2N, 2N from the database size or the count total.
      std::int64_t sum = 0;
      for (const auto& [allele, entry] : locus.alleles) sum += *entry.count;
      const std::int64_t total = locus.database_size ? 2 * *locus.database_size : sum;
      if (sum > total)
        throw InvalidValue(where, "counts at locus " + locus.name + " sum to " + std::to_string(sum) +
                                      ", more than the " + std::to_string(total) +
                                      " alleles of a database of " + std::to_string(*locus.database_size) +
                                      " people");
      if (total == 0) throw InvalidValue(where, "all counts at locus " + locus.name + " are zero");
      for (auto& [allele, entry] : locus.alleles)
        entry.frequency = static_cast<double>(*entry.count) / static_cast<double>(total);
      locus.has_counts = true;
      locus.frequency_sum = static_cast<double>(sum) / static_cast<double>(total);
      if (sum < total)
        add_warning("partial-counts", "counts at locus " + locus.name + " sum to " + std::to_string(sum) +
                                          " of " + std::to_string(total) +
                                          " alleles; the rest are taken as alleles not listed");
      continue;
    }
    double sum = 0.0;
    for (const auto& [allele, entry] : locus.alleles) sum += entry.frequency;
    locus.frequency_sum = sum;
    if (std::fabs(sum - 1.0) > sum_tolerance)
      add_warning("frequency-sum", "frequencies at locus " + locus.name + " sum to " +
                                       numbers::significant_text(sum, 6) + ", more than " +
                                       exact_text(sum_tolerance) +
                                       " from 1; they are used as given, not renormalised");
    if (!locus.database_size) continue;
    // Counts are recovered only when every frequency x 2N is a whole number: rounding a
    // rounded frequency back to a count would invent data.
    const double total = 2.0 * static_cast<double>(*locus.database_size);
    bool whole = true;
    for (const auto& [allele, entry] : locus.alleles) {
      const double x = entry.frequency * total;
      whole = whole && std::fabs(x - std::round(x)) <= 1e-9 * std::max(1.0, x);
    }
    if (!whole) continue;
    for (auto& [allele, entry] : locus.alleles)
      entry.count = static_cast<std::int64_t>(std::round(entry.frequency * total));
    locus.has_counts = true;
  }
}

FrequencyTable frequency_table_from_csv(const CsvTable& csv,
                                        const std::map<std::string, std::int64_t>& database_sizes,
                                        double sum_tolerance, const Location& where) {
  const std::size_t locus_column = csv.require_column("locus", where);
  const std::size_t allele_column = csv.require_column("allele", where);
  const auto frequency_column = csv.find_column("frequency");
  const auto count_column = csv.find_column("count");
  const auto size_column = csv.find_column("database_size");
  if (frequency_column.has_value() == count_column.has_value())
    throw InvalidValue(where, csv.line_label(csv.header_line) +
                                  ": give exactly one of the columns 'frequency' and 'count'");
  if (size_column && !database_sizes.empty())
    throw InvalidValue(where, csv.source + " has a database_size column; do not give database_size in "
                                           "the case file as well");
  FrequencyTable table;
  for (std::size_t row = 0; row < csv.row_count(); ++row) {
    const std::string prefix = csv.row_label(row) + ": ";
    const std::string locus(csv.field(row, locus_column));
    const std::string allele(csv.field(row, allele_column));
    AlleleEntry entry;
    entry.origin = csv.row_label(row);
    if (frequency_column) {
      entry.frequency = check_frequency(reading::csv_number(csv, row, *frequency_column, where), where, prefix);
    } else {
      entry.count = whole_number(reading::csv_number(csv, row, *count_column, where), where, prefix,
                                 "count", 0);
    }
    add_entry(table, locus, allele, entry, where, prefix);
    if (size_column) {
      const std::int64_t n = whole_number(reading::csv_number(csv, row, *size_column, where), where,
                                          prefix, "database size", 1);
      LocusFrequencies& target = table.locus_for(locus);
      if (target.database_size && *target.database_size != n)
        throw InvalidValue(where, prefix + "database size " + std::to_string(n) + " differs from " +
                                      std::to_string(*target.database_size) + " given earlier for locus " +
                                      locus);
      target.database_size = n;
    }
  }
  apply_database_sizes(table, database_sizes, Location{where.item, "frequencies"});
  table.finish(sum_tolerance, where);
  return table;
}

FrequencyTable read_frequency_table(const json& frequencies, const ReadContext& context) {
  const Location where = context.where.with_field("frequencies");
  reading::check_known_members(frequencies, {"file", "table", "counts", "database_size", "sum_tolerance"},
                                   where);
  const json* file = reading::find_member(frequencies, "file");
  const json* inline_table = reading::find_member(frequencies, "table");
  const json* counts = reading::find_member(frequencies, "counts");
  if ((file != nullptr) + (inline_table != nullptr) + (counts != nullptr) != 1)
    throw InvalidValue(where, "give exactly one of 'file', 'table' and 'counts'");

  double tolerance = kDefaultSumTolerance;
  if (auto given = reading::read_optional_number(frequencies, "sum_tolerance", where)) {
    tolerance = *given;
    if (!(tolerance >= 0.0 && tolerance < 1.0))
      throw InvalidValue(where.with_field("sum_tolerance"),
                         "tolerance " + exact_text(tolerance) + " must be in [0, 1)");
  }
  const auto sizes = read_database_sizes(frequencies, where);

  if (file) {
    const Location at = where.with_field("file");
    const std::string name = reading::read_string(*file, at);
    DataFile data = read_data_file(context.base_dir, name, at);
    FrequencyTable table = frequency_table_from_csv(reading::parse_csv(data.text, name, at), sizes, tolerance, at);
    table.set_source_file(std::move(data.use));
    return table;
  }

  const bool by_count = counts != nullptr;
  const json& body = by_count ? *counts : *inline_table;
  const Location at = where.with_field(by_count ? "counts" : "table");
  reading::require_object(body, at);
  FrequencyTable table;
  for (auto locus = body.begin(); locus != body.end(); ++locus) {
    const Location locus_at = at.with_field(locus.key());
    reading::require_object(locus.value(), locus_at);
    if (locus.value().empty()) throw InvalidValue(locus_at, "no alleles listed");
    for (auto allele = locus.value().begin(); allele != locus.value().end(); ++allele) {
      const Location allele_at = locus_at.with_field(allele.key());
      AlleleEntry entry;
      entry.origin = allele_at.field;
      if (by_count) {
        entry.count = reading::read_count(allele.value(), allele_at);
      } else {
        entry.frequency = check_frequency(reading::read_number(allele.value(), allele_at), allele_at, "");
      }
      // Two spellings of one locus ("vWA", "VWA") meet here and are caught as duplicates.
      add_entry(table, locus.key(), allele.key(), entry, allele_at, "");
    }
  }
  apply_database_sizes(table, sizes, where);
  table.finish(tolerance, at);
  return table;
}

}  // namespace counterpoise::models::dna

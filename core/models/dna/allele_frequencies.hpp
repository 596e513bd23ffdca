#pragma once
// An allele frequency table for STR loci, read from a CSV file, an inline JSON table of
// frequencies, or inline allele counts with the database size. Frequencies are used as given:
// a per-locus sum away from 1 gives a warning, never a silent renormalisation. When allele
// counts are known (given, or frequency x 2N whole numbers), the table also carries them for
// the sampling-uncertainty posterior. Accepted shapes: docs/file-formats.md, "Frequency tables".

#include <cstdint>
#include <filesystem>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/models/data_file.hpp"
#include "core/models/evidence_model.hpp"
#include "core/reading/csv_table.hpp"

namespace counterpoise::models::dna {

// The default tolerance of the per-locus frequency-sum check (|sum - 1| <= tolerance).
inline constexpr double kDefaultSumTolerance = 0.01;

struct AlleleEntry {
  double frequency = 0.0;              // as given, or count / allele_total
  std::optional<std::int64_t> count;   // number of copies among the allele_total alleles counted
  std::string origin;                  // "freq.csv line 12" or "frequencies.table.D8S1179.13"
};

struct LocusFrequencies {
  std::string name;                                // as written in the table
  std::map<std::string, AlleleEntry> alleles;      // by allele designation ("9.3", "13")
  std::optional<std::int64_t> database_size;       // N people typed at this locus, when known
  bool has_counts = false;                         // every allele has a count (sampling possible)
  double frequency_sum = 0.0;

  // 2N, the number of alleles counted, when the database size is known or counts were given.
  std::optional<std::int64_t> allele_total() const;
};

class FrequencyTable {
 public:
  // The locus whose canonical name (locus_key) equals that of `locus`, or nullptr.
  const LocusFrequencies* find(const std::string& locus) const;
  const std::map<std::string, LocusFrequencies>& loci() const { return loci_; }
  // Remarks found while reading: sums away from 1, non-standard locus names, ignored rows.
  const std::vector<ModelNote>& warnings() const { return warnings_; }
  // The file the table was read from, with its digest; nullopt for a table given in the case.
  const std::optional<DataFileUse>& source_file() const { return source_file_; }
  void set_source_file(DataFileUse file) { source_file_ = std::move(file); }

  // Building blocks for the readers below (and for tests).
  LocusFrequencies& locus_for(const std::string& name);
  void add_warning(std::string code, std::string message);
  // Checks sums, derives counts from frequencies when database sizes make them whole, and
  // records warnings. Throws validation::InvalidValue at `where` when counts exceed 2N.
  void finish(double sum_tolerance, const validation::Location& where);

 private:
  std::map<std::string, LocusFrequencies> loci_;  // keyed by locus_key(name)
  std::vector<ModelNote> warnings_;
  std::optional<DataFileUse> source_file_;
};

// Reads the item's "frequencies" member: {"file": "freq.csv"}, {"table": {locus: {allele: f}}}
// or {"counts": {locus: {allele: n}}}, each with optional "database_size" (a whole number for
// every locus, or {locus: N}) and "sum_tolerance". The file path is resolved against
// context.base_dir. Throws validation::InvalidValue (naming the item and field, and the file and
// line for a CSV) for: not exactly one of file/table/counts, a frequency outside (0, 1], a
// negative or fractional count, a database size below 1 or not whole, a locus/allele listed
// twice, an empty locus or allele name, counts at a locus exceeding 2N, a database size given
// both in the CSV and in the item, and a database size varying within a locus; and
// validation::FileError when the file cannot be read.
FrequencyTable read_frequency_table(const nlohmann::json& frequencies, const ReadContext& context);

// Builds a table from parsed CSV (columns locus, allele, and frequency or count; optional
// database_size). `database_sizes` are sizes given in the item, by locus key (key "" for all).
// Throws as read_frequency_table.
FrequencyTable frequency_table_from_csv(const reading::CsvTable& csv,
                                        const std::map<std::string, std::int64_t>& database_sizes,
                                        double sum_tolerance, const validation::Location& where);

}  // namespace counterpoise::models::dna

#include "core/method_validation/results_file.hpp"

#include <cctype>
#include <charconv>
#include <cmath>
#include <optional>

#include <nlohmann/json.hpp>

#include "core/reading/csv_table.hpp"
#include "core/reading/json_fields.hpp"
#include "core/reading/json_text.hpp"
#include "core/reading/text_file.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::method_validation {

using validation::InvalidValue;
using validation::Location;

std::string_view result_value_name(ResultValue v) {
  switch (v) {
    case ResultValue::lr: return "lr";
    case ResultValue::log10_lr: return "log10_lr";
    case ResultValue::score: return "score";
  }
  return "?";
}

namespace {

std::string lower(std::string_view s) {
  std::string out(s);
  for (char& c : out) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return out;
}

Truth read_truth(std::string_view text, const Location& where) {
  const std::string t = lower(text);
  if (t == "hp") return Truth::hp;
  if (t == "hd") return Truth::hd;
  throw InvalidValue(where, "the truth label must be hp (Hp true) or hd (Hd true)");
}

// "inf", "+inf", "infinity" (any case) as +1, "-inf", "-infinity" as -1, otherwise 0.
int infinity_sign(std::string_view text) {
  const std::string t = lower(text);
  if (t == "inf" || t == "+inf" || t == "infinity" || t == "+infinity") return 1;
  if (t == "-inf" || t == "-infinity") return -1;
  return 0;
}

// The value a row gives, as a log10 LR (lr, log10_lr) or a score; `number` is the finite parse
// when the text is a finite number.
double to_value(ResultValue kind, std::optional<double> number, int inf_sign, const Location& where) {
  switch (kind) {
    case ResultValue::lr:
      if (inf_sign > 0) return INFINITY;
      if (!number || *number <= 0)
        throw InvalidValue(where, "a likelihood ratio must be a positive number (or inf for an infinite LR)");
      return std::log10(*number);
    case ResultValue::log10_lr:
      if (inf_sign != 0) return inf_sign * INFINITY;
      if (!number) throw InvalidValue(where, "a log10 likelihood ratio must be a number, inf or -inf");
      return *number;
    case ResultValue::score:
      if (!number) throw InvalidValue(where, "a score must be a finite number");
      return *number;
  }
  return 0.0;
}

void add_result(ResultsTable& table, Truth truth, double value, const std::optional<std::string>& condition) {
  table.all.add(truth, value);
  if (condition) table.by_condition[*condition].add(truth, value);
}

void require_rows(const ResultsTable& table) {
  if (table.all.size() == 0) throw InvalidValue({"results", ""}, table.source + " holds no results");
}

}  // namespace

ResultsTable parse_results_csv(std::string_view text, const std::string& source) {
  const Location where{"results", ""};
  const reading::CsvTable csv = reading::parse_csv(text, source, where);
  ResultsTable table;
  table.source = source;
  const std::size_t truth_col = csv.require_column("truth", where.with_field("truth"));
  std::optional<std::size_t> value_col;
  for (ResultValue kind : {ResultValue::lr, ResultValue::log10_lr, ResultValue::score}) {
    if (auto c = csv.find_column(result_value_name(kind))) {
      if (value_col)
        throw InvalidValue(where, source + " has more than one of the columns lr, log10_lr and score; keep one");
      value_col = c;
      table.value = kind;
    }
  }
  if (!value_col) throw InvalidValue(where, source + " needs one column named lr, log10_lr or score");
  const std::optional<std::size_t> condition_col = csv.find_column("condition");
  const std::string value_name(result_value_name(table.value));
  for (std::size_t row = 0; row < csv.row_count(); ++row) {
    const Location row_where{csv.row_label(row), ""};
    const Truth truth = read_truth(csv.field(row, truth_col), row_where.with_field("truth"));
    const std::string_view field = csv.field(row, *value_col);
    const int inf_sign = infinity_sign(field);
    std::optional<double> number;
    if (inf_sign == 0) number = reading::csv_number(csv, row, *value_col, row_where.with_field(value_name));
    const double value = to_value(table.value, number, inf_sign, row_where.with_field(value_name));
    std::optional<std::string> condition;
    if (condition_col) condition = std::string(csv.field(row, *condition_col));
    add_result(table, truth, value, condition);
  }
  require_rows(table);
  return table;
}

ResultsTable parse_results_json(std::string_view text, const std::string& source) {
  using reading::json;
  // The bounded reader of untrusted JSON: size, depth and value limits, line and column in messages.
  const json doc = reading::parse_json_text(text, source);
  const Location top{"results", ""};
  reading::require_object(doc, top);
  reading::check_known_members(doc, {"results"}, top);
  const json& rows = reading::require_member(doc, "results", top);
  if (!rows.is_array()) throw InvalidValue(top, "results must be a list of comparisons");
  ResultsTable table;
  table.source = source;
  std::optional<ResultValue> kind;
  for (std::size_t i = 0; i < rows.size(); ++i) {
    const Location where{"results[" + std::to_string(i) + "]", ""};
    const json& row = rows[i];
    reading::require_object(row, where);
    reading::check_known_members(row, {"truth", "lr", "log10_lr", "score", "condition"}, where);
    const Truth truth = read_truth(reading::read_string(reading::require_member(row, "truth", where),
                                                            where.with_field("truth")),
                                   where.with_field("truth"));
    std::optional<ResultValue> row_kind;
    for (ResultValue k : {ResultValue::lr, ResultValue::log10_lr, ResultValue::score})
      if (row.contains(result_value_name(k))) {
        if (row_kind) throw InvalidValue(where, "give one of lr, log10_lr and score, not several");
        row_kind = k;
      }
    if (!row_kind) throw InvalidValue(where, "missing field: one of lr, log10_lr or score");
    if (kind && *kind != *row_kind)
      throw InvalidValue(where.with_field(std::string(result_value_name(*row_kind))),
                         "every result must give the same kind of value as the first (" +
                             std::string(result_value_name(*kind)) + ")");
    kind = row_kind;
    const std::string name(result_value_name(*row_kind));
    const json& v = row.at(name);
    int inf_sign = v.is_string() ? infinity_sign(v.get<std::string>()) : 0;
    std::optional<double> number;
    if (inf_sign == 0) number = reading::read_number(v, where.with_field(name));
    const double value = to_value(*row_kind, number, inf_sign, where.with_field(name));
    std::optional<std::string> condition;
    if (row.contains("condition"))
      condition = reading::read_string(row.at("condition"), where.with_field("condition"));
    add_result(table, truth, value, condition);
  }
  if (kind) table.value = *kind;
  require_rows(table);
  return table;
}

ResultsTable read_results_file(const std::filesystem::path& path) {
  const Location where{"results", "file"};
  const std::string text = reading::read_text_file(path, where);
  if (lower(path.extension().string()) == ".json") return parse_results_json(text, path.filename().string());
  return parse_results_csv(text, path.filename().string());
}

}  // namespace counterpoise::method_validation

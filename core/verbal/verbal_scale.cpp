#include "core/verbal/verbal_scale.hpp"

#include <cctype>
#include <cmath>

#include "core/numbers/lr_tolerance.hpp"
#include "core/numbers/number_text.hpp"
#include "core/reading/json_fields.hpp"

namespace counterpoise::verbal {

const char* favours_name(Favours favours) {
  switch (favours) {
    case Favours::hp: return "hp";
    case Favours::hd: return "hd";
    case Favours::neither: break;
  }
  return "neither";
}


using nlohmann::json;
using validation::InvalidValue;
using validation::Location;

namespace {
// Kept identical to core/data/verbal_scales/enfsi-2015.json (a test compares them).
const char* const kEnfsi2015 = R"({
  "format": "counterpoise.verbal-scale", "version": 1, "name": "enfsi-2015",
  "title": "ENFSI Guideline for Evaluative Reporting in Forensic Science (2015), verbal equivalents",
  "source": "European Network of Forensic Science Institutes (2015), ENFSI Guideline for Evaluative Reporting in Forensic Science, Strengthening the Evaluation of Forensic Results across Europe (STEOFRAE), table of verbal equivalents",
  "edge_convention": "lower-inclusive",
  "below_first_band": "no appreciable support for either proposition",
  "bands": [ { "from": 2, "label": "weak support" }, { "from": 10, "label": "moderate support" },
             { "from": 100, "label": "moderately strong support" }, { "from": 1000, "label": "strong support" },
             { "from": 10000, "label": "very strong support" }, { "from": 1000000, "label": "extremely strong support" } ]
})";
}  // namespace

VerbalScale VerbalScale::enfsi_2015() { return from_json(json::parse(kEnfsi2015), Location{"verbal_scale", ""}); }

VerbalScale VerbalScale::from_json(const json& document, const Location& where) {
  reading::check_known_members(
      document, {"format", "version", "name", "title", "source", "edge_convention", "below_first_band", "bands"}, where);
  const std::string format = reading::read_string(reading::require_member(document, "format", where),
                                                      where.with_field("format"));
  if (format != "counterpoise.verbal-scale")
    throw validation::UnsupportedFormat(where.with_field("format"),
                                        "not a verbal scale file (format \"" + format + "\")");
  const auto version = reading::read_count(reading::require_member(document, "version", where),
                                               where.with_field("version"));
  if (version != 1)
    throw validation::UnsupportedFormat(where.with_field("version"),
                                        "verbal scale version " + std::to_string(version) + " is not supported (this program reads version 1)");
  const std::string convention = reading::read_string_or(document, "edge_convention", where, "lower-inclusive");
  if (convention != "lower-inclusive")
    throw InvalidValue(where.with_field("edge_convention"), "only \"lower-inclusive\" band edges are supported");
  VerbalScale scale;
  scale.name_ = reading::read_string(reading::require_member(document, "name", where), where.with_field("name"));
  scale.title_ = reading::read_string_or(document, "title", where, scale.name_);
  scale.source_ = reading::read_string_or(document, "source", where);
  scale.below_first_band_ = reading::read_string_or(document, "below_first_band", where,
                                                        "no appreciable support for either proposition");
  const json& bands = reading::require_member(document, "bands", where);
  if (!bands.is_array() || bands.empty())
    throw InvalidValue(where.with_field("bands"), "a scale needs a non-empty array of bands");
  double previous = 0.0;
  for (std::size_t i = 0; i < bands.size(); ++i) {
    const Location at{where.item, "bands[" + std::to_string(i) + "]"};
    reading::check_known_members(bands[i], {"from", "label"}, at);
    const double from = reading::read_number(reading::require_member(bands[i], "from", at), at.with_field("from"));
    if (!(from > 1.0)) throw InvalidValue(at.with_field("from"), "a band must start above LR 1");
    const double log10_from = std::log10(from);
    if (i > 0 && !(log10_from > previous))
      throw InvalidValue(at.with_field("from"), "bands must be in increasing order of LR");
    previous = log10_from;
    std::string label = reading::read_string(reading::require_member(bands[i], "label", at), at.with_field("label"));
    if (label.empty()) throw InvalidValue(at.with_field("label"), "a band needs a label");
    scale.bands_.push_back({log10_from, std::move(label)});
  }
  return scale;
}

json VerbalScale::to_json() const {
  json bands = json::array();
  for (const auto& band : bands_) bands.push_back({{"from", std::pow(10.0, band.log10_from)}, {"label", band.label}});
  return {{"format", "counterpoise.verbal-scale"}, {"version", 1}, {"name", name_}, {"title", title_},
          {"source", source_}, {"edge_convention", "lower-inclusive"}, {"below_first_band", below_first_band_},
          {"bands", bands}};
}

VerbalExpression VerbalScale::express(const numbers::LikelihoodRatio& lr) const {
  if (lr.is_zero())
    return {Favours::hd, "exclusion",
            "The findings would not be expected if Hp were true: they exclude Hp (likelihood ratio of zero)."};
  if (lr.is_infinite())
    return {Favours::hp, "impossible under Hd",
            "The findings would not be expected if Hd were true (infinite likelihood ratio); check the "
            "assumptions, since this is almost never justified."};
  const double magnitude = std::abs(lr.log10());
  if (numbers::is_neutral_log10(lr.log10()))
    return {Favours::neither, "no support", "The findings are equally probable under Hp and Hd; they do not help to distinguish them."};
  const bool for_hp = lr.log10() > 0.0;
  std::string label = below_first_band_;
  bool below = true;
  for (const auto& band : bands_)
    if (numbers::reaches_edge(magnitude, band.log10_from)) label = band.label, below = false;
  if (below)
    return {Favours::neither, label, "The findings provide " + label + " (the likelihood ratio is close to 1)."};
  return {for_hp ? Favours::hp : Favours::hd, label,
          "The findings provide " + label + (for_hp ? " for Hp rather than Hd." : " for Hd rather than Hp.")};
}

namespace {
// `text` with each "Hd" that stands as a word replaced by `name`.
std::string naming(const std::string& text, const std::string& name) {
  std::string out;
  const auto is_word = [](char c) { return std::isalnum(static_cast<unsigned char>(c)) || c == '_'; };
  for (std::size_t i = 0; i < text.size();) {
    const bool word = text.compare(i, 2, "Hd") == 0 && (i == 0 || !is_word(text[i - 1])) &&
                      (i + 2 == text.size() || !is_word(text[i + 2]));
    if (word) out += name, i += 2;
    else out += text[i++];
  }
  return out;
}
}  // namespace

VerbalExpression VerbalScale::express_against(const numbers::LikelihoodRatio& lr, const std::string& alternative) const {
  VerbalExpression expression = express(lr);
  expression.label = naming(expression.label, alternative);
  expression.sentence = naming(expression.sentence, alternative);
  return expression;
}

}  // namespace counterpoise::verbal

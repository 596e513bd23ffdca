#pragma once
// A verbal scale: words that follow an LR's order of magnitude. The default is the scale of
// verbal equivalents of the ENFSI Guideline for Evaluative Reporting in Forensic Science (2015):
// 2-10 weak, 10-100 moderate, 100-1 000 moderately strong, 1 000-10 000 strong,
// 10 000-1 000 000 very strong, above 1 000 000 extremely strong support; for LR < 1 the same
// words apply to 1/LR in favour of Hd. Band-edge convention (ours, documented in
// docs/methods.md): each band includes its lower edge, so LR = 100 is "moderately strong".
// LR = 1 exactly is neutral; 1 < LR < 2 is below the first band of the scale. A computed LR is
// compared with an edge (and with 1) within the relative tolerance of numbers::reaches_edge
// (1e-12 in LR), so 0.3 / 0.003, whose log10 is 1.9999999999999998, is at the edge 100.

#include <filesystem>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/numbers/likelihood_ratio.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::verbal {

enum class Favours { hp, hd, neither };

// "hp", "hd" or "neither", as JSON outputs write a direction.
const char* favours_name(Favours favours);

struct VerbalBand {
  double log10_from;  // the band starts here (inclusive)
  std::string label;  // "moderate support"
};

struct VerbalExpression {
  Favours favours = Favours::neither;
  std::string label;     // "moderate support", "exclusion", ...
  std::string sentence;  // "The findings provide moderate support for Hp rather than Hd."
};

class VerbalScale {
 public:
  // The built-in ENFSI (2015) scale (the same as core/data/verbal_scales/enfsi-2015.json).
  static VerbalScale enfsi_2015();
  // Reads a scale file ("format": "counterpoise.verbal-scale"). Throws validation::InvalidValue or
  // UnsupportedFormat naming the field: bands not increasing, a band starting at or below LR 1,
  // an empty label, an unknown format or a newer version.
  static VerbalScale from_json(const nlohmann::json& document, const validation::Location& where);
  nlohmann::json to_json() const;

  const std::string& name() const { return name_; }
  const std::string& title() const { return title_; }
  const std::string& source() const { return source_; }
  const std::vector<VerbalBand>& bands() const { return bands_; }

  // The words for an LR, in both directions; zero and infinite LRs get their own wording.
  VerbalExpression express(const numbers::LikelihoodRatio& lr) const;
  // The same expression for Hp against one of several alternatives: every "Hd" of the label and
  // the sentence names `alternative` instead ("Hd2", "the weighted set of alternatives").
  VerbalExpression express_against(const numbers::LikelihoodRatio& lr, const std::string& alternative) const;

 private:
  std::string name_, title_, source_, below_first_band_;
  std::vector<VerbalBand> bands_;
};

}  // namespace counterpoise::verbal

#include "core/uncertainty/interval_reading.hpp"

namespace counterpoise::uncertainty {

const std::string& reported_value_and_interval_sentence() {
  static const std::string sentence =
      "The reported likelihood ratio is worked out from the best (average) values of the probabilities the "
      "scientist assigned, and it is the weight given to these findings; the interval only shows how far that "
      "ratio would move if those probabilities were known exactly, so the reported value need not sit in the "
      "middle of the interval, or even inside it.";
  return sentence;
}

}  // namespace counterpoise::uncertainty

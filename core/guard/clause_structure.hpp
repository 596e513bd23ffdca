#pragma once
// The structure of one sentence that decides what a claim in it is conditioned on: its
// segments (clauses joined by ';', ':', brackets, dashes or a contrasting conjunction such as
// "but" or "whereas") and its conditional frames ("if ...", "given that ...", "assuming ...",
// "under the proposition that ...", and the inverted "were he ...", "had the stain come ...").
// A frame runs from its opener to the next comma or the end of its segment. What a frame is
// about (a proposition, the findings, or prior odds) is read from the words inside it.
// The words come from the rule set's classes (a laboratory can extend them); the structure is
// found here, once for every rule and claim.

#include <cstddef>
#include <optional>
#include <string_view>
#include <vector>

#include "core/guard/text_tokens.hpp"
#include "core/guard/token_pattern.hpp"

namespace counterpoise::guard {

// What a frame supposes: a proposition of the case, the findings, prior odds, or a question put
// to the witness ("were the jury to ask me", "if asked"), which conditions nothing.
enum class FrameTopic { proposition, findings, prior, question_put };

struct ConditionalFrame {
  std::size_t begin = 0, end = 0;  // tokens [begin, end), the opener included
  std::size_t segment = 0;
  FrameTopic topic = FrameTopic::proposition;
};

struct ClauseStructure {
  std::vector<std::size_t> segment_of;  // per token: the index of its segment
  std::vector<std::size_t> segment_begin, segment_end;  // per segment: its tokens [begin, end)
  std::vector<ConditionalFrame> frames;
  std::vector<int> frame_of;  // per token: the index of the frame it is in, or -1

  bool in_frame(std::size_t token) const { return frame_of.at(token) >= 0; }
};

// Class names the structure uses: "condition-opener" (phrases that open a frame),
// "clause-break" (words that start a new segment), "findings-noun", "observe-word",
// "findings-summary" (a likelihood ratio, a match) and "posterior-cue" (what a frame is about). A class the table lacks is treated as empty.
ClauseStructure analyse_clauses(const std::vector<const Token*>& tokens, const ClassTable& classes,
                                ClassMatchCache& cache);

// The end of the match of class `name` at `pos` (longest), if the class exists and matches.
std::optional<std::size_t> class_match_end(std::string_view name, const std::vector<const Token*>& tokens,
                                           std::size_t pos, const ClassTable& classes, ClassMatchCache& cache);
// The same for a class already looked up (nullptr: a class the table lacks, which never matches).
std::optional<std::size_t> class_match_end(const WordClass* word_class, const std::vector<const Token*>& tokens,
                                           std::size_t pos, const ClassTable& classes, ClassMatchCache& cache);
// The class called `name`, or nullptr.
const WordClass* find_class(const ClassTable& classes, std::string_view name);

}  // namespace counterpoise::guard

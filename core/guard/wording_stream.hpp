#pragma once
// The wording checker over a text read from a stream, sentence by sentence with bounded memory:
// the stream is read in pieces, each piece is cut after its last complete sentence (the rest is
// kept for the next piece) and checked, and each finding is handed on with its spans in the
// whole text and its line and column. A stretch of more than `max_sentence_bytes` without a
// sentence end (not prose: a table dump, binary noise) is cut at its last space, or at a code
// point boundary, and checked as it is; a finding across such a cut, or a quotation open across
// a cut, is not seen as in a text checked whole.

#include <cstddef>
#include <functional>
#include <istream>

#include "core/guard/wording_checker.hpp"

namespace counterpoise::guard {

// 1-based line and column (in code points) of a finding's first byte, for editor-style places.
struct TextPlace {
  std::size_t line = 1, column = 1;
};

struct StreamLimits {
  std::size_t piece_bytes = std::size_t{1} << 16;         // read this much at a time
  std::size_t max_sentence_bytes = std::size_t{1} << 16;  // a longer run without a sentence end is cut
};

// Checks the text of `in` with `checker`, calling `on_finding` for each finding in text order.
// Returns the number of bytes read. Throws validation::InvalidValue (item "text", field "utf8")
// naming the byte offset in the whole text of the first ill-formed UTF-8 sequence; the findings
// before it have been handed on by then.
std::size_t check_stream(const WordingChecker& checker, std::istream& in, const CheckOptions& options,
                         const std::function<void(const WordingFinding&, const TextPlace&)>& on_finding,
                         const StreamLimits& limits = {});

}  // namespace counterpoise::guard

#include "core/guard/wording_stream.hpp"

#include <string>

#include "core/guard/text_tokens.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::guard {

namespace {

// Where the unread part of the text starts, in the three indexings, with its line and column.
struct Cursor {
  std::size_t byte = 0, code_point = 0, utf16 = 0;
  TextPlace place;

  // Moves over `text` (which starts at this cursor) up to byte `to` of it.
  void advance(std::string_view text, std::size_t from, std::size_t to) {
    for (std::size_t i = from; i < to; ++i) {
      const auto b = static_cast<unsigned char>(text[i]);
      if ((b & 0xC0) == 0x80) continue;  // continuation byte
      ++code_point;
      utf16 += b >= 0xF0 ? 2 : 1;
      if (b == '\n') {
        ++place.line;
        place.column = 1;
      } else {
        ++place.column;
      }
    }
    byte += to - from;
  }
};

// The length of the longest prefix of `text` that does not end inside a multi-byte sequence.
std::size_t complete_prefix(std::string_view text) {
  std::size_t k = text.size();
  for (std::size_t back = 0; back < 4 && k > 0; ++back) {
    const auto b = static_cast<unsigned char>(text[k - 1]);
    if ((b & 0xC0) == 0x80) {
      --k;
      continue;
    }
    const std::size_t length = b >= 0xF0 ? 4 : b >= 0xE0 ? 3 : b >= 0xC0 ? 2 : 1;
    return k - 1 + length <= text.size() ? text.size() : k - 1;
  }
  return text.size();
}

// Where a run without a sentence end is cut: after its last space, else at the end.
std::size_t forced_cut(std::string_view text) {
  const std::size_t space = text.find_last_of(" \t\n");
  return space == std::string_view::npos || space < text.size() / 2 ? text.size() : space + 1;
}

void shift(TextSpan& s, const Cursor& at) {
  s.byte_begin += at.byte, s.byte_end += at.byte;
  s.code_point_begin += at.code_point, s.code_point_end += at.code_point;
  s.utf16_begin += at.utf16, s.utf16_end += at.utf16;
}

}  // namespace

std::size_t check_stream(const WordingChecker& checker, std::istream& in, const CheckOptions& options,
                         const std::function<void(const WordingFinding&, const TextPlace&)>& on_finding,
                         const StreamLimits& limits) {
  std::string buffer;
  Cursor start;  // of the buffer in the whole text
  bool end_of_input = false;
  std::string chunk(limits.piece_bytes, '\0');
  std::size_t wanted = limits.piece_bytes;
  while (true) {
    while (!end_of_input && buffer.size() < wanted) {
      in.read(chunk.data(), static_cast<std::streamsize>(chunk.size()));
      const auto got = static_cast<std::size_t>(in.gcount());
      buffer.append(chunk.data(), got);
      if (got == 0 || !in) end_of_input = true;
    }
    const std::size_t usable = end_of_input ? buffer.size() : complete_prefix(buffer);
    if (const auto bad = first_invalid_utf8(std::string_view(buffer).substr(0, usable)))
      throw validation::InvalidValue({"text", "utf8"}, "the text is not valid UTF-8 (ill-formed byte sequence at byte " +
                                                           std::to_string(start.byte + *bad) + ")");
    std::string_view text(buffer.data(), usable);
    std::vector<Sentence> sentences = split_sentences(text);
    std::size_t cut = usable;
    if (!end_of_input) {
      // The last sentence may go on in the next piece: keep it, unless it is all there is and
      // has grown past the limit.
      if (sentences.size() >= 2) {
        cut = sentences.back().span.byte_begin;
        sentences.pop_back();
      } else if (usable >= limits.max_sentence_bytes) {
        cut = forced_cut(text);
        text = text.substr(0, cut);
        sentences = split_sentences(text);
      } else {
        wanted = buffer.size() + limits.piece_bytes;
        continue;
      }
    }
    Cursor at_finding = start;
    std::size_t walked = 0;
    for (WordingFinding& f : checker.check(text, sentences, options)) {
      at_finding.advance(text, walked, f.span.byte_begin);
      walked = f.span.byte_begin;
      shift(f.span, start);
      shift(f.sentence, start);
      on_finding(f, at_finding.place);
    }
    at_finding.advance(text, walked, cut);
    start = at_finding;
    buffer.erase(0, cut);
    wanted = limits.piece_bytes;
    if (end_of_input) return start.byte;
  }
}

}  // namespace counterpoise::guard

#include "core/guard/claim_analysis.hpp"

#include <algorithm>
#include <optional>

namespace counterpoise::guard {

namespace {

// How far after its start a target's proposition may begin (tokens): further away, the words
// belong to another part of the sentence.
constexpr std::size_t kTargetReach = 14;

bool word_is(const Token* t, std::initializer_list<std::string_view> words) {
  return std::find(words.begin(), words.end(), std::string_view(t->folded)) != words.end();
}

// A regular past tense or participle ("assaulted", "opened"), as a word of five letters or more.
bool past_tense(const Token& t) {
  const std::string& w = t.folded;
  return t.kind == TokenKind::word && !t.capitalised && w.size() >= 5 && w.compare(w.size() - 2, 2, "ed") == 0 &&
         w != "need" && w != "indeed" && w != "speed";
}

// A target to search: tokens of the sentence (by index) with the expression and the
// conditional frames left out, so "he is almost certainly the donor" reads "he is the donor".
struct Target {
  std::vector<std::size_t> index;        // sentence token index of each target token
  std::vector<const Token*> tokens;
  std::size_t expression_at = 0;         // position in `tokens` where the expression stood
  bool barrier_before_expression = true;  // do findings words before the expression count?
};

struct Found {
  ClaimTarget target;
  std::size_t first, last;  // sentence token indices of the proposition phrase (inclusive)
};

class Analyser {
 public:
  Analyser(const std::vector<const Token*>& tokens, const ClauseStructure& structure, const ClassTable& classes,
           ClassMatchCache& cache)
      : tokens_(tokens), s_(structure), classes_(classes), cache_(cache) {}

  std::vector<Claim> run() {
    std::vector<Claim> claims;
    bool posterior = false, court = false;
    for (std::size_t i = 0; i < tokens_.size(); ++i) {
      posterior = posterior || has("posterior-cue", i);
      court = court || has("not-assigned", i);
    }
    for (std::size_t i = 0; i < tokens_.size();) {
      std::optional<Claim> claim;
      std::size_t next = i + 1;
      if (const auto e = expression_at(i, claim)) next = *e;
      if (claim) {
        claim->posterior_words = posterior;
        claim->left_to_court = court;
        claims.push_back(*claim);
      }
      i = next;
    }
    return claims;
  }

 private:
  const std::vector<const Token*>& tokens_;
  const ClauseStructure& s_;
  const ClassTable& classes_;
  ClassMatchCache& cache_;
  mutable std::vector<std::pair<const char*, const WordClass*>> looked_up_;

  // The class called `name` (a string literal of this file), looked up once per sentence.
  const WordClass* lookup(std::string_view name) const {
    for (const auto& [key, word_class] : looked_up_)
      if (key == name.data()) return word_class;
    const WordClass* word_class = find_class(classes_, name);
    looked_up_.emplace_back(name.data(), word_class);
    return word_class;
  }
  std::optional<std::size_t> match(std::string_view cls, std::size_t i) const {
    return class_match_end(lookup(cls), tokens_, i, classes_, cache_);
  }
  bool has(std::string_view cls, std::size_t i) const { return match(cls, i).has_value(); }

  std::size_t segment_end(std::size_t i) const { return s_.segment_end[s_.segment_of[i]]; }
  std::size_t segment_begin(std::size_t i) const { return s_.segment_begin[s_.segment_of[i]]; }

  // The target from `from` to the end of the segment (a complement: "... that he left it").
  Target complement(std::size_t from, std::size_t expression_begin) const {
    Target t;
    for (std::size_t k = from; k < segment_end(expression_begin); ++k)
      if (!s_.in_frame(k)) t.index.push_back(k), t.tokens.push_back(tokens_[k]);
    return t;
  }

  // The whole segment but the expression (a clause the expression modifies).
  Target clause(std::size_t begin, std::size_t end, bool barrier_before) const {
    Target t;
    t.barrier_before_expression = barrier_before;
    for (std::size_t k = segment_begin(begin); k < segment_end(begin); ++k) {
      if (k == begin) t.expression_at = t.tokens.size();
      if ((k >= begin && k < end) || s_.in_frame(k)) continue;
      t.index.push_back(k), t.tokens.push_back(tokens_[k]);
    }
    return t;
  }

  // The proposition the target states, if any, before the findings are named.
  std::optional<Found> proposition_in(const Target& t) const {
    ClassMatchCache cache(t.tokens);
    const auto at = [&](std::string_view cls, std::size_t p) {
      return class_match_end(lookup(cls), t.tokens, p, classes_, cache);
    };
    const std::size_t reach = std::min(t.tokens.size(), std::max(t.expression_at, std::size_t{0}) + kTargetReach);
    struct Kind {
      std::string_view cls;
      ClaimTarget target;
    };
    static constexpr Kind kinds[] = {{"guilt-phrase", ClaimTarget::offence},
                                     {"source-phrase", ClaimTarget::source},
                                     {"hyp-true", ClaimTarget::hypothesis},
                                     {"hyp-word", ClaimTarget::hypothesis},
                                     {"coincidence-end", ClaimTarget::coincidence},
                                     {"activity-phrase", ClaimTarget::activity}};
    std::optional<Found> best;
    std::size_t best_rank = std::size(kinds);
    for (std::size_t p = 0; p < reach; ++p) {
      const bool counts = t.barrier_before_expression || p >= t.expression_at;
      if (counts && (at("findings-noun", p) || at("observe-word", p) || at("random-selection", p))) break;
      // "the chance that someone else would match": what would be observed, not what happened.
      const bool hypothetical = (p > 0 && at("hypothetical", p - 1)) || (p > 1 && at("hypothetical", p - 2));
      if (hypothetical) continue;
      for (std::size_t r = 0; r < std::min(best_rank, std::size(kinds)); ++r) {
        if (const auto end = at(kinds[r].cls, p)) {
          best = Found{kinds[r].target, t.index[p], t.index[*end - 1]};
          best_rank = r;
          break;
        }
      }
      // A person who did something ("Ms Reyes assaulted the complainant"): any verb in the
      // past tense after a person, however the lexicon's list of activities is worded.
      if (!best || best_rank == std::size(kinds) - 1) {
        if (const auto agent_end = at("agent", p)) {
          std::size_t v = *agent_end;
          while (v < t.tokens.size() && v < *agent_end + 2 && word_is(t.tokens[v], {"not", "never", "had", "has", "have"})) ++v;
          if (!best && v < t.tokens.size() && past_tense(*t.tokens[v])) {
            best = Found{ClaimTarget::activity, t.index[p], t.index[v]};
            best_rank = std::size(kinds) - 1;
          }
        }
      }
      if (best && best_rank == 0) break;
    }
    return best;
  }

  // Fills `claim` when the expression starting at `i` is about a proposition; returns the
  // token after the expression when there is an expression at `i`.
  std::optional<std::size_t> expression_at(std::size_t i, std::optional<Claim>& claim) const {
    ClaimForm form;
    std::size_t end;
    Target target;
    if (const auto e = times_at(i)) {
      form = ClaimForm::times;
      end = *e;
      target = end < tokens_.size() && tokens_[end]->folded == "that" ? complement(end + 1, i) : clause(i, end, true);
    } else if (const auto e2 = chance_at(i)) {
      end = i + 1;
      const auto from = complement_start(end);
      if (!from) return end;
      form = tokens_[i]->folded == "odds" && odds_stated(i) ? ClaimForm::odds : ClaimForm::chance;
      // "he is the source with a probability of 0.99": the claim is the clause before.
      const bool with_value = i > 1 && (word_is(tokens_[i - 1], {"with"}) || word_is(tokens_[i - 2], {"with"}));
      target = with_value ? clause(i, end, true) : complement(*from, i);
    } else if (const auto e3 = match("certainty-adverb", i); e3 && !indirect_question(i)) {
      form = ClaimForm::certainty;
      end = *e3;
      target = clause(i, end, false);
    } else if (const auto e4 = match("certainty-adjective", i); e4 && !indirect_question(i)) {
      form = ClaimForm::certainty;
      end = *e4;
      std::optional<std::size_t> that;
      for (std::size_t k = end; k < std::min(end + 3, tokens_.size()); ++k)
        if (tokens_[k]->folded == "that") that = k;
      target = that ? complement(*that + 1, i) : clause(i, end, true);
    } else if (const auto e5 = match("proof-verb", i)) {
      form = ClaimForm::proof;
      end = *e5;
      if (!proof_subject(i)) return end;
      const std::size_t from = end < tokens_.size() && tokens_[end]->folded == "that" ? end + 1 : end;
      target = complement(from, i);
    } else {
      return std::nullopt;
    }
    const auto found = proposition_in(target);
    if (!found) return end;
    Claim c;
    c.begin = std::min(i, found->first);
    c.end = std::max(end, found->last + 1);
    c.form = form;
    c.target = found->target;
    const std::size_t seg = s_.segment_of[i];
    const int frame = s_.frame_of[i];
    c.conditioned_on_proposition = s_.segment_has_frame(seg, FrameTopic::proposition) ||
                                   (frame >= 0 && s_.frames[static_cast<std::size_t>(frame)].topic == FrameTopic::proposition);
    c.conditioned_on_prior = s_.segment_has_frame(seg, FrameTopic::prior);
    c.illustration = c.conditioned_on_prior && hypothetical_in_segment(i);
    if (form == ClaimForm::proof) c.match_as_proof = proof_subject_is_match(i);
    claim = c;
    return end;
  }

  bool hypothetical_in_segment(std::size_t i) const {
    for (std::size_t k = segment_begin(i); k < segment_end(i); ++k)
      if (has("hypothetical", k)) return true;
    return false;
  }

  // "how likely it is that ...", "whether ... probably ...": a question, not a claim.
  bool indirect_question(std::size_t i) const {
    for (std::size_t k = i; k > segment_begin(i) && k + 3 > i; --k)
      if (word_is(tokens_[k - 1], {"how", "whether"})) return true;
    return false;
  }

  // Odds written as odds ("1,000 to 1", "a million to one", "50:1") in the segment, rather than
  // a chance ("odds of 1 in 300").
  bool odds_stated(std::size_t i) const {
    for (std::size_t k = segment_begin(i); k + 2 < segment_end(i); ++k)
      if (tokens_[k]->kind == TokenKind::number && word_is(tokens_[k + 1], {"to", ":"}) &&
          (tokens_[k + 2]->kind == TokenKind::number || word_is(tokens_[k + 2], {"one"})))
        return true;
    return false;
  }

  // "N times more likely/probable": the token after it.
  std::optional<std::size_t> times_at(std::size_t i) const {
    if (tokens_[i]->kind != TokenKind::number || i + 2 >= tokens_.size() || tokens_[i + 1]->folded != "times")
      return std::nullopt;
    for (std::size_t k = i + 2; k < std::min(i + 5, tokens_.size()); ++k)
      if (word_is(tokens_[k], {"likely", "probable", "likelier", "certain"})) return k + 1;
    return std::nullopt;
  }

  // A chance word used as one ("the probability that ..."), not "by chance" or "likelihood ratio".
  std::optional<std::size_t> chance_at(std::size_t i) const {
    if (!has("chance-word", i)) return std::nullopt;
    if (i > 0 && word_is(tokens_[i - 1], {"by", "through", "to", "pure", "mere"})) return std::nullopt;
    if (i + 1 < tokens_.size() && word_is(tokens_[i + 1], {"ratio", "ratios", "distribution", "model"}))
      return std::nullopt;
    return i + 1;
  }

  // Where the proposition of a chance word starts: after "that", "of" or "for"; after a
  // stated value ("the probability is 0.99 that ..."); or at once when a clause follows
  // ("a 1 in 50 chance Ms Sato was ...").
  std::optional<std::size_t> complement_start(std::size_t after) const {
    if (after >= tokens_.size()) return std::nullopt;
    if (word_is(tokens_[after], {"that", "of", "for"})) return after + 1;
    for (std::size_t k = after; k < std::min(after + 8, tokens_.size()); ++k) {
      const Token* t = tokens_[k];
      if (word_is(t, {"that"})) return k + 1;
      if (t->folded == "of" && k > after && word_is(tokens_[k - 1], {"favour", "favor"})) return k + 1;
      const bool filler = t->kind == TokenKind::number || has("be", k) ||
                          word_is(t, {"about", "approximately", "roughly", "around", "only", "just", "less", "more",
                                      "than", "under", "over", "at", "least", "most", "greater", "higher", "lower",
                                      "very", "extremely", "small", "high", "low", "tiny", "negligible", "remote",
                                      "in", "favour", "favor", "to", "on", "a", "an", "one", ","});
      if (!filler) break;
    }
    const Token* t = tokens_[after];
    if (t->kind == TokenKind::word &&
        (t->capitalised || word_is(t, {"he", "she", "they", "someone", "somebody", "anyone", "another"})))
      return after;
    return std::nullopt;
  }

  // A proof verb asserts a proposition when its subject is the findings, a trace, a match or
  // the analysis ("the findings prove", "the DNA confirms", "this shows that").
  bool proof_subject(std::size_t verb) const {
    for (std::size_t k = segment_begin(verb); k < verb; ++k)
      if (has("findings-noun", k) || has("trace-noun", k) || has("proof-subject", k)) return true;
    return false;
  }
  bool proof_subject_is_match(std::size_t verb) const {
    for (std::size_t k = segment_begin(verb); k < verb; ++k)
      if (word_is(tokens_[k], {"match", "matches", "matching", "matched", "consistent"})) return true;
    return false;
  }
};

}  // namespace

std::vector<Claim> find_claims(const std::vector<const Token*>& tokens, const ClauseStructure& structure,
                               const ClassTable& classes, ClassMatchCache& cache) {
  return Analyser(tokens, structure, classes, cache).run();
}

std::string_view claim_family(const Claim& claim, CheckMode mode) {
  if (claim.conditioned_on_proposition || claim.left_to_court) return {};
  if (claim.illustration) return {};  // "if the prior odds were ..., the posterior odds would be ..."
  if (claim.posterior_words || claim.conditioned_on_prior) return mode == CheckMode::casework ? "posterior-in-casework" : "";
  if (claim.match_as_proof) return "match-as-evaluation";
  if (claim.form == ClaimForm::times || claim.form == ClaimForm::odds) return "lr-as-odds";
  switch (claim.target) {
    case ClaimTarget::offence: return "ultimate-issue";
    case ClaimTarget::source: return "source-probability";
    case ClaimTarget::activity:
    case ClaimTarget::hypothesis:
    case ClaimTarget::coincidence: return "transposed-conditional";
  }
  return {};
}

}  // namespace counterpoise::guard

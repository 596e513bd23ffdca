#include "core/guard/claim_analysis.hpp"

#include <algorithm>
#include <optional>

namespace counterpoise::guard {

namespace {

// How far after its start a target's proposition may begin (tokens): further away, the words
// belong to another part of the sentence.
constexpr std::size_t kTargetReach = 14;

// A regular past tense or participle ("assaulted"), or a verb in -ing ("drinking"), as a word
// of five letters or more.
bool past_or_progressive(const Token& t) {
  const std::string& w = t.folded;
  if (t.kind != TokenKind::word || t.capitalised || w.size() < 5) return false;
  const bool past = w.compare(w.size() - 2, 2, "ed") == 0 && w != "indeed" && w != "speed";
  const bool progressive = w.compare(w.size() - 3, 3, "ing") == 0 && w != "nothing" && w != "something" &&
                           w != "anything" && w != "everything" && w != "during";
  return past || progressive;
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
  bool inferred = false;    // read from a person and the words after them only
};

class Analyser {
 public:
  Analyser(const std::vector<const Token*>& tokens, const ClauseStructure& structure, const ClassTable& classes,
           ClassMatchCache& cache, bool question_affirmed)
      : tokens_(tokens), s_(structure), classes_(classes), cache_(cache), question_affirmed_(question_affirmed) {}

  std::vector<Claim> run() {
    std::vector<Claim> claims;
    bool court = false, population = false;
    for (std::size_t i = 0; i < tokens_.size(); ++i) {
      posterior_ = posterior_ || has("posterior-cue", i);
      court = court || has("not-assigned", i);
      population = population || has("population-count", i);
    }
    // A question asks, it does not assert: "So he must have worn the balaclava?"
    const bool question = !tokens_.empty() && tokens_.back()->folded == "?" && !question_affirmed_ && !leading_question();
    for (std::size_t i = 0; i < tokens_.size();) {
      std::optional<Claim> claim;
      std::size_t next = i + 1;
      if (const auto e = expression_at(i, claim)) next = *e;
      if (claim) {
        claim->posterior_words = posterior_;
        claim->left_to_court = court;
        claim->population_count = population;
        claim->negated = claim->negated || question;
        claims.push_back(*claim);
      }
      i = next;
    }
    // "The fingermark on the bottle is Mr Dunstable's": a trace attributed to its source as a
    // plain fact states the source proposition with certainty.
    if (claims.empty() && !question)
      if (std::optional<Claim> stated = categorical_source_claim()) {
        stated->posterior_words = posterior_;
        stated->left_to_court = court;
        stated->population_count = population;
        claims.push_back(*stated);
      }
    // "Q: So in your view the defendant is guilty? A: Yes.": a yes/no question the witness
    // answers yes asserts what it asks, unless a claim already covers the words it asks about
    // (a claim elsewhere in the question, in a reason given for it, does not).
    if (question_affirmed_ && !tokens_.empty() && tokens_.back()->folded == "?")
      if (std::optional<Claim> asked = affirmed_question_claim();
          asked && std::none_of(claims.begin(), claims.end(), [&](const Claim& c) {
            return c.begin < asked->end && asked->begin < c.end;
          })) {
        asked->posterior_words = posterior_;
        asked->left_to_court = court;
        asked->population_count = population;
        claims.push_back(*asked);
      }
    // "The probability of Hp is 300 times that of Hd": the odds form says what the sentence
    // claims; the chances it compares are part of it.
    std::vector<Claim> kept;
    for (const Claim& c : claims) {
      const bool absorbed = (c.form == ClaimForm::chance || c.form == ClaimForm::certainty || c.form == ClaimForm::proof) &&
                            std::any_of(claims.begin(), claims.end(), [&](const Claim& o) {
                              return (o.form == ClaimForm::times || o.form == ClaimForm::odds) &&
                                     s_.segment_of[o.begin] == s_.segment_of[c.begin];
                            });
      if (!absorbed) kept.push_back(c);
    }
    return kept;
  }

 private:
  const std::vector<const Token*>& tokens_;
  const ClauseStructure& s_;
  const ClassTable& classes_;
  ClassMatchCache& cache_;
  bool question_affirmed_;
  bool posterior_ = false;  // priors, posteriors or other evidence named in the sentence
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
    for (std::size_t k = main_clause_begin(begin); k < clause_end(begin, end); ++k) {
      if (k == begin) t.expression_at = t.tokens.size();
      // "is, in all probability, Mr Renwick's": the commas around the expression go with it.
      const bool comma_beside = tokens_[k]->folded == "," && (k + 1 == begin || k == end);
      if ((k >= begin && k < end) || s_.in_frame(k) || comma_beside) continue;
      t.index.push_back(k), t.tokens.push_back(tokens_[k]);
    }
    return t;
  }

  // Where the clause holding the expression at `i` begins: after a leading adjunct closed by a
  // comma ("Combining the DNA likelihood ratio with the eyewitness evidence, the prosecution
  // proposition is virtually certain"; "In my assessment, ..."), which says how the claim was
  // reached, not what it is about.
  std::size_t main_clause_begin(std::size_t i) const {
    const std::size_t b = segment_first_word(i);
    const Token& first = *tokens_[b];
    const std::string& w = first.folded;
    const bool adjunct_opener = first.kind == TokenKind::word &&
                                ((w.size() > 4 && w.compare(w.size() - 3, 3, "ing") == 0) ||
                                 first.is_one_of({"combined", "taken", "in", "on", "from", "after", "with", "based",
                                                  "having", "by", "when", "once"}) ||
                                 opens_with_subordinate(i));
    if (!adjunct_opener || s_.in_frame(b)) return b;
    for (std::size_t k = b + 1; k < i; ++k)
      if (tokens_[k]->folded == ",") return k + 1;
    return b;
  }

  // Whether the segment holding `i` opens with a subordinate clause ("Since ...", "Because ...",
  // "Although ..."), which a comma closes before the main clause.
  bool opens_with_subordinate(std::size_t i) const { return subordinator(*tokens_[segment_first_word(i)]); }
  // A word that opens a subordinate clause of reason or concession. "as" and "while" open one
  // only at the start of a segment: inside it they compare or say when.
  static bool subordinator(const Token& t) {
    return t.is_one_of({"since", "because", "although", "though", "whereas", "as", "while"});
  }
  static bool subordinator_anywhere(const Token& t) { return subordinator(t) && !t.is_one_of({"as", "while"}); }

  // Where the main clause begins when the verb ending at `verb_end` closes a leading "as"
  // clause with no object of its own ("As the laboratory has now confirmed, the DNA ... belongs
  // to Mr Threlfall"): such a clause says its verb of the main clause.
  std::optional<std::size_t> main_clause_of_as_clause(std::size_t verb_end) const {
    if (verb_end == 0 || verb_end >= tokens_.size() || tokens_[verb_end]->folded != ",") return std::nullopt;
    if (tokens_[segment_first_word(verb_end - 1)]->folded != "as" || s_.in_frame(verb_end)) return std::nullopt;
    return verb_end + 1;
  }

  // Whether the question puts its content to the listener as true, as cross-examination does:
  // a negative question ("Dr Vogt, isn't it very likely that ...?") or a tag ("..., didn't
  // it?"). Such a question asserts what it asks.
  bool leading_question() const {
    const std::size_t n = tokens_.size();
    const bool tagged = n >= 4 && tokens_[n - 4]->folded == "," &&
                        tokens_[n - 2]->is_one_of({"it", "he", "she", "they", "we", "you", "there", "i", "that"}) &&
                        (negative_auxiliary(*tokens_[n - 3]) ||
                         tokens_[n - 3]->is_one_of({"is", "was", "did", "does", "would", "could", "will", "has", "have"}));
    return tagged || opening_negative().has_value();
  }
  // The negative auxiliary that opens a question, after a short address ("Dr Vogt, isn't it
  // ...", "So, wasn't he ..."): it asks for agreement and negates nothing.
  std::optional<std::size_t> opening_negative() const {
    const std::size_t n = tokens_.size();
    if (n == 0 || tokens_.back()->folded != "?") return std::nullopt;
    std::size_t first = 0;
    for (std::size_t k = 0; k < std::min<std::size_t>(n, 5); ++k)
      if (tokens_[k]->folded == ",") first = k + 1;
    while (first < n && tokens_[first]->is_one_of({"so", "and", "but", "well", "now"})) ++first;
    if (first < n && negative_auxiliary(*tokens_[first])) return first;
    return std::nullopt;
  }
  static bool negative_auxiliary(const Token& t) {
    return t.is_one_of({"isn't", "wasn't", "aren't", "weren't", "doesn't", "don't", "didn't", "wouldn't", "couldn't",
                        "won't", "can't", "hasn't", "haven't", "hadn't", "shouldn't", "mustn't"});
  }
  // A negation word at `k`, unless it is the opening of a leading question.
  bool negates(std::size_t k) const { return has("negator", k) && opening_negative() != k; }

  // The first token of the segment holding `i` after the punctuation that opened it (": since").
  std::size_t segment_first_word(std::size_t i) const {
    std::size_t k = segment_begin(i);
    while (k < i && tokens_[k]->kind == TokenKind::punctuation) ++k;
    return k;
  }

  // Where the clause holding the expression [begin, end) ends: the end of its segment, or, in a
  // leading subordinate clause, the comma that closes it ("Since the fibres would be improbable
  // if she had not sat in the car, she sat in it": "improbable" is not said of the main clause).
  std::size_t clause_end(std::size_t begin, std::size_t end) const {
    const std::size_t last = segment_end(begin);
    if (!opens_with_subordinate(begin)) return last;
    for (std::size_t k = end + 1; k < last; ++k)
      if (tokens_[k]->folded == "," && !s_.in_frame(k)) return k;
    return last;
  }

  static bool has_people_after(const Target& t, std::size_t p) {
    for (std::size_t q = p + 1; q < std::min(t.tokens.size(), p + 3); ++q)
      if (t.tokens[q]->is_one_of({"people", "persons", "men", "women", "of", "individuals", "samples", "cases"})) return true;
    return false;
  }

  // The subject before the expression ("Mr Wrayburn's guilt is established by ...").
  Target subject(std::size_t begin) const {
    Target t;
    for (std::size_t k = segment_begin(begin); k < begin; ++k)
      if (!s_.in_frame(k)) t.index.push_back(k), t.tokens.push_back(tokens_[k]);
    t.expression_at = t.tokens.size();
    return t;
  }

  // The first "that" within `reach` tokens after `from` in the segment ("likely, on the fibre
  // evidence, that ..."; "established by the glass findings that ...").
  std::optional<std::size_t> that_after(std::size_t from, std::size_t reach) const {
    const std::size_t end = std::min(from + reach, segment_end(from > 0 ? from - 1 : 0));
    for (std::size_t k = from; k < end; ++k)
      if (tokens_[k]->folded == "that") return k;
    return std::nullopt;
  }

  // Whether the observation word at `p` of the target begins what is observed ("of finding",
  // "that we would observe", "obtaining") rather than describing a trace the proposition is
  // about ("the hair recovered from the sink is from Ms Kozak").
  static bool observation_starts(const Target& t, std::size_t p) {
    if (p == 0) return true;
    const Token& before = *t.tokens[p - 1];
    const std::string& w = t.tokens[p]->folded;
    const bool participle = w.size() > 2 && (w.compare(w.size() - 2, 2, "ed") == 0 || w == "found" || w == "seen");
    if (!participle || before.kind != TokenKind::word) return true;
    return before.is_one_of({"of", "that", "to", "would", "we", "i", "be", "is", "are", "was", "were", "been", "being",
                             "have", "has", "had", "not", "be", "will", "could", "might", "they"});
  }

  // Whether a person takes part in the target's words: an
  // activity is something a person did ("he broke the window"), not an event of a thing ("an
  // entry was written to the log", "a cut across the third bar").
  bool person_in(const Target& t) const {
    ClassMatchCache cache(t.tokens);
    for (std::size_t p = 0; p < t.tokens.size(); ++p) {
      if (class_match_end(lookup("agent"), t.tokens, p, classes_, cache) ||
          class_match_end(lookup("person-noun"), t.tokens, p, classes_, cache))
        return true;
      // A name written with a capital inside the sentence ("Ms Kozak", "Wrenfield").
      if (t.tokens[p]->capitalised && t.index[p] > 0 && t.tokens[p]->kind == TokenKind::word) return true;
    }
    return false;
  }

  // Whether the target names the findings, a trace or a result before its proposition
  // ("the findings are 300 times more probable ...").
  bool findings_named(const Target& t) const {
    ClassMatchCache cache(t.tokens);
    for (std::size_t p = 0; p < t.tokens.size(); ++p)
      for (const char* cls : {"findings-noun", "findings-summary", "trace-noun", "observe-word"})
        if (class_match_end(lookup(cls), t.tokens, p, classes_, cache)) return true;
    return false;
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
    bool stopped = false;  // the findings are named before any proposition
    std::size_t best_rank = std::size(kinds);
    // "the survey shows that about 1 in 20 people carry glass": a statistic, not a proposition.
    for (std::size_t p = t.expression_at; p < std::min(t.tokens.size(), t.expression_at + 2); ++p)
      if (t.tokens[p]->kind == TokenKind::number && p + 1 < t.tokens.size() && has_people_after(t, p)) return std::nullopt;
    for (std::size_t p = 0; p < reach; ++p) {
      const bool counts = t.barrier_before_expression || p >= t.expression_at;
      if (counts && (at("findings-noun", p) || (at("observe-word", p) && observation_starts(t, p)) ||
                     at("random-selection", p))) {
        stopped = true;
        break;
      }
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
      // Another person or item with the same trait ("the chance that another car in the
      // county has this paint"): the random match probability misread, unless the trait is
      // the source itself ("someone else left the stain").
      if (p < 3 && (!best || best_rank > 1)) {
        if (const auto other_end = at("other-determiner", p)) {
          for (std::size_t q = *other_end; q < std::min(t.tokens.size(), *other_end + 12); ++q)
            if (at("possess-word", q)) {
              best = Found{ClaimTarget::another_match, t.index[p], t.index[q]};
              best_rank = 1;  // before activities, after the source
              break;
            }
        }
      }
      // A person who did something ("Ms Reyes assaulted the complainant", "he had been
      // drinking"): a verb in the past tense or in -ing after a person, however the lexicon's
      // list of activities is worded.
      if (!best || best_rank == std::size(kinds) - 1) {
        if (const auto agent_end = at("agent", p)) {
          std::size_t v = *agent_end;
          bool did = false;  // "the defendant did not ingest the drug": any verb after "did"
          while (v < t.tokens.size() && v < *agent_end + 3 &&
                 t.tokens[v]->is_one_of({"not", "never", "had", "has", "have", "been", "was", "were", "did", "didn't"})) {
            did = did || t.tokens[v]->is_one_of({"did", "didn't"});
            ++v;
          }
          const bool verb = v < t.tokens.size() && (past_or_progressive(*t.tokens[v]) ||
                                                    (did && t.tokens[v]->kind == TokenKind::word));
          if (!best && verb) {
            best = Found{ClaimTarget::activity, t.index[p], t.index[v]};
            best_rank = std::size(kinds) - 1;
          }
        }
      }
      if (best && best_rank == 0) break;
    }
    if (best && best->target == ClaimTarget::activity && !person_in(t)) return std::nullopt;
    // "that Ms Nkemelu took part in the robbery", "that he was one of the burglars": an act that
    // is the offence itself is the ultimate issue, however it is worded; being at the scene of
    // it ("at the robbery", "present during the raid") stays a claim of presence.
    if (best && best->target == ClaimTarget::activity) {
      const auto from = static_cast<std::size_t>(std::find(t.index.begin(), t.index.end(), best->first) - t.index.begin());
      for (std::size_t q = from; q < std::min(t.tokens.size(), from + 10); ++q) {
        if (t.tokens[q]->is_one_of({"at", "present", "scene", "near", "inside", "outside", "there", "during", "nearby"}))
          break;
        if (at("offence-noun", q) || at("offender-noun", q)) {
          best->target = ClaimTarget::offence;
          break;
        }
      }
    }
    // Last: a person in the target with words after them, however the act is worded ("that Mr
    // Pryce handled it", "that she was at the flat"), when nothing marks it as an observation.
    if (!best && !stopped)
      for (std::size_t p = 0; p < reach; ++p)
        if (const auto agent_end = at("agent", p); agent_end && *agent_end < t.tokens.size() &&
                                                    t.tokens[*agent_end]->kind == TokenKind::word) {
          if (p > 0 && t.tokens[p - 1]->is_one_of({"of", "for", "to", "from", "with", "by", "than", "and", "or"})) continue;
          best = Found{ClaimTarget::activity, t.index[p], t.index[*agent_end], true};
          break;
        }
    return best;
  }

  // Fills `claim` when the expression starting at `i` is about a proposition; returns the
  // token after the expression when there is an expression at `i`.
  std::optional<std::size_t> expression_at(std::size_t i, std::optional<Claim>& claim) const {
    ClaimForm form;
    std::size_t end;
    Target target;
    bool opinion = false;
    std::optional<Found> found_directly;  // named by the expression itself (a verdict or association verb)
    if (const auto e0 = conclusion_tag_at(i)) {
      // "(1) Mr Threlfall was present at the jeweller's — highly probable", "Source of the mark:
      // Mr Blakemore (certain)": a tag standing alone qualifies the clause before it.
      form = ClaimForm::certainty;
      end = *e0;
      target = tagged_clause(i);
    } else if (const auto e = times_at(i)) {
      form = ClaimForm::times;
      end = *e;
      target = end < tokens_.size() && tokens_[end]->folded == "that" ? complement(end + 1, i) : times_target(i, end);
    } else if (const auto e2 = chance_at(i)) {
      end = i + 1;
      form = tokens_[i]->is_one_of({"odds", "chances"}) && odds_stated(i) ? ClaimForm::odds : ClaimForm::chance;
      // "he is the source with a probability of 0.99", "to a probability of": the claim is the
      // clause around it.
      bool with_value = false;
      for (std::size_t k = i; k > 0 && k + 3 > i; --k) with_value = with_value || tokens_[k - 1]->is_one_of({"with", "to"});
      // "Posterior probability of Hp" as a heading or an axis label names a quantity; a claim
      // states it ("is 0.99", "is high").
      if (!states_something(i)) return end;
      // "blood on the doorframe is the suspect's, certainty 99.99 per cent": a value right after
      // the word, with no complement, qualifies the clause.
      const bool value_after = end < tokens_.size() && tokens_[end]->kind == TokenKind::number &&
                               !(end + 1 < tokens_.size() && tokens_[end + 1]->is_one_of({"that", "of"}));
      if (with_value || (value_after && !complement_start(end))) {
        target = clause(i, end, true);
      } else {
        const auto from = complement_start(end);
        // "Another person having the same profile is a one-in-ten-million chance": the chance
        // is said of the subject.
        const auto be = from ? std::nullopt : predicate_be(i);
        if (!from && !be) return end;
        target = from ? complement(*from, i) : subject(*be);
      }
    } else if (const auto e3 = certainty_adverb_at(i); e3 && !indirect_question(i)) {
      form = ClaimForm::certainty;
      end = *e3;
      target = clause(i, end, false);
    } else if (const auto e4 = match("certainty-adjective", i); e4 && !indirect_question(i)) {
      form = ClaimForm::certainty;
      end = *e4;
      const auto that = that_after(end, 10);
      // "The fibres are, to a reasonable degree of scientific certainty, from the scarf": set off
      // like an adverb, it qualifies its clause, traces and all.
      const bool parenthetical = i > 0 && tokens_[i - 1]->is_one_of({",", "to", "a", "with"});
      // "that much is certain from the striations": what follows says what the certainty rests
      // on, so the claim is its subject alone.
      const bool basis_after = end < tokens_.size() && tokens_[end]->is_one_of({"from", "on", "given"});
      target = that                             ? complement(*that + 1, i)
               : parenthetical                  ? clause(i, end, false)
               : basis_after && i > 0 && has("be", i - 1) ? subject(i)
                                                : times_target(i, end);
    } else if (const auto e6 = match("opinion-frame", i); e6 && !indirect_question(i)) {
      // "In my opinion, on the DNA alone, Ms Oduya is guilty", "I am satisfied that he forged
      // the will": the scientist states the proposition as their own conclusion.
      form = ClaimForm::certainty;
      opinion = true;
      end = *e6;
      // "In my opinion he is almost certainly the burglar": the inner expression states the claim.
      if (expression_between(end, segment_end(i))) return end;
      // "The fragments came, in my opinion, from the window": set off by commas inside its
      // clause, the frame qualifies the clause around it, as an adverb does.
      const bool parenthetical = i > segment_first_word(i) && tokens_[i - 1]->folded == "," &&
                                 end < tokens_.size() && tokens_[end]->folded == ",";
      target = parenthetical ? clause(i, end, false) : complement(after_opener(end), i);
    } else if (const auto e7 = match("verdict-verb", i); e7 && !indirect_question(i)) {
      // "The digital evidence exonerates Ms Trethowan": the verb itself is the verdict.
      form = ClaimForm::proof;
      end = *e7;
      if (!(match("agent", end) || name_at(end)) || !proof_subject(i) || (i > 0 && has("hypothetical", i - 1)))
        return end;
      found_directly = Found{ClaimTarget::offence, end, end};
    } else if (const auto e8 = match("association-verb", i);
               e8 && !indirect_question(i) && (found_directly = association_target(i, *e8))) {
      // "The soil ties Ms Szabo to the burglary", "..., which places him at the break-in": said
      // by the findings of a person, the verb states where the person was or what they did.
      form = ClaimForm::proof;
      end = *e8;
    } else if (const auto e5 = match("proof-verb", i); e5 && !indirect_question(i)) {
      form = ClaimForm::proof;
      end = *e5;
      // "a randomly chosen tyre would show this wear": what would be observed, not a proof.
      if (i > 0 && has("hypothetical", i - 1)) return end;
      const bool passive = i > 0 && has("be", i - 1);
      if (!passive && !proof_subject(i)) return end;
      if (passive) {
        // "X is established by the findings", unless "it is established ... that X".
        const auto that = that_after(end, 10);
        target = that ? complement(*that + 1, i) : subject(i - 1);
        // "The offence is shown by the footwear evidence to have been committed by Mr Quist": the
        // subject and the infinitive clause make the proposition.
        // "The profile has been confirmed as Ms Varley's": the "as" phrase says what the subject
        // was shown to be.
        std::optional<std::size_t> rest_from;
        if (!that) rest_from = infinitive_after(end);
        if (rest_from) ++*rest_from;
        else if (!that && end < tokens_.size() && tokens_[end]->folded == "as") rest_from = end;
        if (rest_from) {
          const Target rest = complement(*rest_from, i);
          target.index.insert(target.index.end(), rest.index.begin(), rest.index.end());
          target.tokens.insert(target.tokens.end(), rest.tokens.begin(), rest.tokens.end());
        }
      } else {
        // "shows that", "indicated that": the verb's phrase may hold its own "that".
        const auto that = tokens_[end - 1]->folded == "that" ? std::optional<std::size_t>(end - 1) : that_after(end, 8);
        if (const auto main = main_clause_of_as_clause(end); !that && main) {
          target = complement(*main, i);
        } else {
          // Without "that" the verb must be followed by a person ("these results show Ms Voss is
          // guilty"), not by what is seen ("the profile shows every allele").
          if (!that && !match("agent", end) && !name_at(end)) return end;
          target = complement(that ? *that + 1 : end, i);
        }
      }
    } else {
      return std::nullopt;
    }
    // "The statement that "the DNA is almost certainly his" is not a conclusion": a claim inside a
    // quotation is about what the quotation says, not what follows it.
    // A few words in quotation marks inside a sentence of reported speech ("Lab: '99.9 %
    // certain' paint came from accused's van", "'definitely' spiked the drink") quote the
    // expression, not a claim: what it qualifies is the sentence around it.
    if (tokens_[i]->quoted && !scare_quoted(i, end)) keep_quoted(target);
    std::optional<Found> found = found_directly ? found_directly : proposition_in(target);
    // "The prosecution's version is 300 times more probable than the defence's": odds stated on
    // whatever is not the findings are odds on a proposition, however the proposition is worded.
    if (!found && form == ClaimForm::times && !target.tokens.empty() && !findings_named(target))
      found = Found{ClaimTarget::hypothesis, target.index.front(), target.index.back()};
    // "the posterior probability that the ledger entries are forgeries is 0.85": with priors or
    // posteriors in the sentence, a chance of anything but the findings is a posterior claim.
    if (!found && posterior_sentence() && (form == ClaimForm::chance || form == ClaimForm::certainty) &&
        words_in(target) >= 2 && !findings_named(target))
      found = Found{ClaimTarget::hypothesis, target.index.front(), target.index.back()};
    if (!found) return end;
    Claim c;
    c.begin = std::min(i, found->first);
    c.end = std::max(end, found->last + 1);
    c.form = form;
    c.target = found->target;
    c.inferred = found->inferred;
    set_conditioning(c, i);
    c.illustration = c.conditioned_on_prior && hypothetical_in_segment(i);
    if (form == ClaimForm::proof) c.match_as_proof = proof_subject_is_match(i);
    c.negated = negated_before(i) || (opinion && negated_between(end, found->first));
    c.hypothetical = hypothetical_in_segment(i) && supposition_in_sentence();
    claim = c;
    return end;
  }

  // The proposition a yes/no question asks about, read as a certainty: the question's last
  // clause (after a leading address or adjunct closed by a comma), with an inverted "is he the
  // donor" read as "he is the donor".
  std::optional<Claim> affirmed_question_claim() const {
    const std::size_t mark = tokens_.size() - 1;
    if (mark == 0) return std::nullopt;
    std::size_t from = segment_begin(mark - 1);
    for (std::size_t k = mark; k > from + 1; --k)
      if (tokens_[k - 1]->folded == "," && mark - k >= 3) {
        from = k;
        break;
      }
    Target t;
    for (std::size_t k = from; k < mark; ++k)
      if (!s_.in_frame(k)) t.index.push_back(k), t.tokens.push_back(tokens_[k]);
    if (t.tokens.size() >= 2 && t.tokens[0]->is_one_of({"is", "was", "are", "were"})) {
      ClassMatchCache cache(t.tokens);
      if (const auto person_end = class_match_end(lookup("agent"), t.tokens, 1, classes_, cache)) {
        std::rotate(t.index.begin(), t.index.begin() + 1, t.index.begin() + static_cast<std::ptrdiff_t>(*person_end));
        std::rotate(t.tokens.begin(), t.tokens.begin() + 1, t.tokens.begin() + static_cast<std::ptrdiff_t>(*person_end));
      }
    }
    const std::optional<Found> found = proposition_in(t);
    if (!found) return std::nullopt;
    Claim c;
    c.begin = std::min({from, found->first, found->last});
    c.end = mark;
    c.form = ClaimForm::certainty;
    c.target = found->target;
    c.inferred = found->inferred;
    set_conditioning(c, mark - 1);
    return c;
  }

  // What conditions a claim whose expression ends at or stands on token `i`: a frame about a
  // proposition or about prior odds that conditions it, or the frame the expression itself is in.
  void set_conditioning(Claim& c, std::size_t i) const {
    const int frame = s_.frame_of[i];
    c.conditioned_on_proposition = frame_conditions(i, FrameTopic::proposition) ||
                                   (frame >= 0 && s_.frames[static_cast<std::size_t>(frame)].topic == FrameTopic::proposition);
    c.conditioned_on_prior = frame_conditions(i, FrameTopic::prior);
  }

  // The proposition an association verb at [verb, end) states: a person right after it, then
  // "to", "at", "in" or "with" and what they are tied to — the offence when an offence is named
  // ("ties Ms Szabo to the burglary"), else where they were or what they did ("places him at
  // the scene"). Only the findings or a comparison may be its subject (not a party, a person or
  // a supposition), either before it in its clause or, after a comma, the clause before it
  // ("the profile matches Mr Cradock, linking him to the scene").
  std::optional<Found> association_target(std::size_t verb, std::size_t end) const {
    if (verb > 0 && has("hypothetical", verb - 1)) return std::nullopt;
    const bool after_comma = verb >= 1 && (tokens_[verb - 1]->folded == "," ||
                                           (verb >= 2 && tokens_[verb - 1]->folded == "which" && tokens_[verb - 2]->folded == ","));
    if (!proof_subject(verb) && !(after_comma && findings_before(verb))) return std::nullopt;
    std::size_t person_end = end;
    if (const auto agent = match("agent", end)) person_end = *agent;
    else
      while (name_at(person_end)) ++person_end;
    if (person_end == end || person_end >= segment_end(verb)) return std::nullopt;
    if (!tokens_[person_end]->is_one_of({"to", "at", "in", "with", "inside"})) return std::nullopt;
    const std::size_t last = std::min(segment_end(verb), person_end + 6);
    bool offence = false;
    for (std::size_t k = person_end + 1; k < last; ++k)
      offence = offence || has("offence-noun", k) || has("guilt-phrase", k);
    return Found{offence ? ClaimTarget::offence : ClaimTarget::activity, end, last - 1};
  }

  // Whether the findings, a trace or a comparison is named before `verb` in its segment, and no
  // party tells it.
  bool findings_before(std::size_t verb) const {
    bool named = false;
    for (std::size_t k = segment_begin(verb); k < verb; ++k) {
      if (has("party", k) && !s_.in_frame(k)) return false;
      named = named || has("findings-noun", k) || has("trace-noun", k) || has("proof-subject", k) ||
              comparison_word(*tokens_[k]);
    }
    return named;
  }

  // Whether a frame about `topic` conditions the expression at `i`: one in its segment, unless
  // the frame sits in a subordinate clause closed before the expression ("Since the findings
  // would be very improbable if he had not been in the car, he was very probably in the car":
  // the "if" conditions the reason, not the conclusion drawn from it).
  bool frame_conditions(std::size_t i, FrameTopic topic) const {
    const std::size_t seg = s_.segment_of[i];
    return std::any_of(s_.frames.begin(), s_.frames.end(), [&](const ConditionalFrame& f) {
      return f.segment == seg && f.topic == topic && !closed_before(f, i);
    });
  }
  bool closed_before(const ConditionalFrame& f, std::size_t i) const {
    if (f.end > i) return false;
    bool subordinate = false;
    for (std::size_t k = segment_begin(i); k < f.begin; ++k)
      subordinate = subordinate || subordinator_anywhere(*tokens_[k]) || (k == segment_begin(i) && subordinator(*tokens_[k]));
    if (!subordinate) return false;
    for (std::size_t k = f.end; k < i; ++k)
      if (tokens_[k]->folded == ",") return true;
    return false;
  }

  // Whether the quoted run holding the expression [i, end) is a short fragment (at most five
  // tokens, nothing quoted after the expression) set inside an unquoted sentence; "must have
  // fired the gun" quotes a claim.
  bool scare_quoted(std::size_t i, std::size_t end) const {
    std::size_t first = i, last = i;
    while (first > 0 && tokens_[first - 1]->quoted) --first;
    while (last + 1 < tokens_.size() && tokens_[last + 1]->quoted) ++last;
    const bool words_around = (first > 0 && tokens_[first - 1]->kind == TokenKind::word) ||
                              (last + 1 < tokens_.size() && tokens_[last + 1]->kind == TokenKind::word);
    return last - first < 5 && last < end && words_around;
  }
  static void keep_quoted(Target& t) {
    Target kept;
    kept.barrier_before_expression = t.barrier_before_expression;
    kept.expression_at = 0;
    for (std::size_t k = 0; k < t.tokens.size(); ++k) {
      if (k == t.expression_at) kept.expression_at = kept.tokens.size();
      if (t.tokens[k]->quoted) kept.index.push_back(t.index[k]), kept.tokens.push_back(t.tokens[k]);
    }
    if (t.expression_at >= t.tokens.size()) kept.expression_at = kept.tokens.size();
    t = std::move(kept);
  }

  // Where what an opinion frame asserts begins: after "that" and commas, and after an adjunct
  // that says what the opinion rests on ("on the DNA evidence alone, ...", "having examined the
  // handwriting, that ...").
  std::size_t after_opener(std::size_t from) const {
    const std::size_t end = segment_end(from > 0 ? from - 1 : 0);
    std::size_t k = from;
    while (k < end && tokens_[k]->is_one_of({",", "that"})) ++k;
    if (k < end && tokens_[k]->is_one_of({"on", "from", "having", "based", "given", "in", "after", "taking", "judging",
                                         "considering", "with"}))
      for (std::size_t m = k + 1; m < std::min(end, k + 14); ++m)
        if (tokens_[m]->folded == ",") {
          k = m + 1;
          break;
        }
    while (k < end && tokens_[k]->is_one_of({",", "that"})) ++k;
    return k;
  }

  // A negation between an opinion frame and the proposition it introduces ("in my view it is
  // not possible to say that ..."): the opinion is withheld, not stated.
  bool negated_between(std::size_t from, std::size_t to) const {
    for (std::size_t k = from; k < to && k < tokens_.size(); ++k)
      if (has("negator", k)) return true;
    return false;
  }

  // Whether token `k` is part of an opinion frame ("I would say", "I'd say that"): the
  // speaker's own conclusion, so its "would" and "say" do not make a supposition.
  bool in_opinion_frame(std::size_t k) const {
    for (std::size_t m = k >= 3 ? k - 3 : 0; m <= k; ++m)
      if (const auto e = match("opinion-frame", m); e && *e > k) return true;
    return false;
  }

  // The "to" of an infinitive clause shortly after `from` ("shown by the findings to have ...").
  std::optional<std::size_t> infinitive_after(std::size_t from) const {
    for (std::size_t k = from; k < std::min(segment_end(from > 0 ? from - 1 : 0), from + 8); ++k)
      if (tokens_[k]->folded == "to" && k + 1 < tokens_.size() && tokens_[k + 1]->is_one_of({"have", "be", "been"}))
        return k;
    return std::nullopt;
  }

  // Whether an expression of belief or chance other than an opinion frame lies in [from, to).
  bool expression_between(std::size_t from, std::size_t to) const {
    for (std::size_t k = from; k < to; ++k)
      if (times_at(k) || chance_at(k) || certainty_adverb_at(k) || has("certainty-adjective", k) ||
          has("proof-verb", k))
        return true;
    return false;
  }

  // A name written with a capital inside the sentence ("proves Penhallow is the arsonist").
  bool name_at(std::size_t k) const {
    return k > 0 && k < tokens_.size() && tokens_[k]->kind == TokenKind::word && tokens_[k]->capitalised;
  }

  // The "is" of "... is a one-in-ten-million chance", "... is only a remote possibility": the
  // verb before a chance word used as the predicate, with only its article, value and
  // qualifiers between.
  std::optional<std::size_t> predicate_be(std::size_t i) const {
    std::size_t k = i;
    while (k > segment_begin(i) && (tokens_[k - 1]->kind == TokenKind::number ||
                                    tokens_[k - 1]->is_one_of({"a", "an", "only", "just", "merely", "very", "small",
                                                             "tiny", "remote", "slim", "slight", "real", "good", "high",
                                                             "low", "negligible"})))
      --k;
    if (k == i || k <= segment_begin(i) + 1 || !has("be", k - 1)) return std::nullopt;
    return k - 1;
  }

  bool states_something(std::size_t i) const {
    for (std::size_t k = segment_begin(i); k < segment_end(i); ++k)
      if (tokens_[k]->kind == TokenKind::number || has("be", k)) return true;
    return false;
  }

  // A main clause whose subject is a trace ("The shoe mark on the floor", "The fibres") and
  // whose predicate names its source with a person or an object ("was made by the trainer
  // seized from Mr Calloway", "is Mr Dunstable's"), in a clause with no supposition, modal,
  // negation or reference material: a categorical attribution, certainty without the word.
  std::optional<Claim> categorical_source_claim() const {
    // A sentence that names the propositions ("Hp: the blood came from Mr Doyle") states them,
    // it does not assert them.
    for (std::size_t q = 0; q < tokens_.size(); ++q)
      if (has("hyp-word", q) || tokens_[q]->is_one_of({"proposition", "propositions", "hypothesis", "alternative"}))
        return std::nullopt;
    for (std::size_t segment = 0; segment < s_.segment_begin.size(); ++segment) {
      std::size_t k = s_.segment_begin[segment];
      const std::size_t end = s_.segment_end[segment];
      while (k < end && (tokens_[k]->kind == TokenKind::punctuation ||
                         tokens_[k]->is_one_of({"the", "this", "these", "those", "all", "both", "each"})))
        ++k;
      if (k >= end || !has("trace-noun", k) || s_.in_frame(k)) continue;
      bool guarded = false;
      for (std::size_t q = s_.segment_begin[segment]; q < end && !guarded; ++q)
        guarded = has("hypothetical", q) || negates(q) || has("condition-opener", q) || has("report-verb", q) ||
                  tokens_[q]->is_one_of({"reference", "control", "known", "buccal", "swab", "elimination", "may",
                                         "might", "could", "would", "whether", "if", "unless", "?"});
      if (guarded) continue;
      for (std::size_t q = k + 1; q < std::min(end, k + kTargetReach); ++q) {
        // "The DNA findings favour ...": the findings, not a trace, are the subject.
        if (has("findings-noun", q) || has("findings-summary", q) || tokens_[q]->folded == "that") break;
        const auto source_end = match("source-phrase", q);
        if (!source_end) continue;
        bool owner = false;  // a person or an object named as the source
        for (std::size_t r = q; r < std::min(end, *source_end + 6) && !owner; ++r)
          owner = match("agent", r) || name_at(r) || has("source-object", r) || tokens_[r]->folded == "'s";
        if (!owner) break;
        Claim c;
        c.begin = k;
        c.end = *source_end;
        c.form = ClaimForm::certainty;
        c.target = ClaimTarget::source;
        c.categorical = true;
        set_conditioning(c, q);
        return c;
      }
    }
    return std::nullopt;
  }

  // A conclusion tag (class `conclusion-tag`: "certain", "highly probable", "established",
  // "very strong") that fills its segment after a clause, as in a list of conclusions; the end
  // of the tag.
  std::optional<std::size_t> conclusion_tag_at(std::size_t i) const {
    if (s_.segment_of[i] == 0 || segment_first_word(i) != i || i == 0) return std::nullopt;
    // Set off by a bracket, a dash, a colon or a semicolon, as a list writes it; a table's
    // column ("[2.02, 2.34]  moderately strong support", "2.07  -  moderately strong support")
    // is not a tag.
    if (!tokens_[i - 1]->is_one_of({"(", "-", ":", ";"})) return std::nullopt;
    if (tokens_[i - 1]->folded == "-" && (i < 2 || tokens_[i - 2]->kind == TokenKind::number)) return std::nullopt;
    const auto end = match("conclusion-tag", i);
    if (!end) return std::nullopt;
    for (std::size_t k = *end; k < segment_end(i); ++k)
      if (tokens_[k]->kind != TokenKind::punctuation) return std::nullopt;
    return end;
  }
  // The clause a conclusion tag at `i` qualifies: the segment before it, with the heading before
  // that when the clause is a short answer to it ("Source of the fingermark: Mr Blakemore").
  Target tagged_clause(std::size_t i) const {
    std::size_t previous = s_.segment_of[i] - 1;
    while (previous > 0 && words_in_segment(previous) == 0) --previous;
    std::size_t from = s_.segment_begin[previous];
    if (previous > 0 && words_in_segment(previous) < 4 && tokens_[from]->folded == ":")
      from = s_.segment_begin[previous - 1];
    Target t;
    for (std::size_t k = from; k < s_.segment_end[previous]; ++k)
      if (!s_.in_frame(k) && !(k == from && tokens_[k]->kind == TokenKind::punctuation))
        t.index.push_back(k), t.tokens.push_back(tokens_[k]);
    t.expression_at = 0;
    return t;
  }
  std::size_t words_in_segment(std::size_t segment) const {
    std::size_t n = 0;
    for (std::size_t k = s_.segment_begin[segment]; k < s_.segment_end[segment]; ++k)
      n += tokens_[k]->kind == TokenKind::word ? 1 : 0;
    return n;
  }

  // A certainty adverb, or "must be" / "must have" (a modal of certainty).
  std::optional<std::size_t> certainty_adverb_at(std::size_t i) const {
    if (tokens_[i]->folded == "must" && i + 1 < tokens_.size() && tokens_[i + 1]->is_one_of({"be", "have"}))
      return i + 1;  // "must" alone, so "she must be guilty" reads "she be guilty"
    return match("certainty-adverb", i);
  }

  // A negation shortly before the expression in its segment: "do not, assess the probability",
  // "the findings do not establish that", "it is not certain that".
  bool negated_before(std::size_t i) const {
    if (negated_complement(i)) return true;
    const std::size_t first = std::max(segment_begin(i), i >= 5 ? i - 5 : std::size_t{0});
    for (std::size_t k = first; k < i; ++k)
      // "no realistic possibility that ..." states a certainty; it does not negate one.
      if (negates(k) && !(tokens_[k]->folded == "no" && i - k <= 2 && has("chance-word", i)) &&
          !has("other-determiner", k))
        return true;
    return false;
  }

  // "I am not in a position to say that the DNA is more likely than not his": a negation
  // shortly before the "that" opening the clause the expression is in withholds the clause.
  bool negated_complement(std::size_t i) const {
    for (std::size_t t = i; t > segment_begin(i); --t) {
      if (tokens_[t - 1]->folded != "that") continue;
      const std::size_t that = t - 1;
      const std::size_t first = std::max(segment_begin(i), that >= 8 ? that - 8 : std::size_t{0});
      for (std::size_t k = first; k < that; ++k)
        if (negates(k) && !has("other-determiner", k)) return true;
      return false;
    }
    return false;
  }

  // "N times more likely": the clause, or when something "makes" it so, what is made
  // ("the findings make the prosecution case 50 times more probable").
  Target times_target(std::size_t i, std::size_t end) const {
    for (std::size_t k = i; k > segment_begin(i); --k)
      if (tokens_[k - 1]->is_one_of({"make", "makes", "made", "making", "render", "renders", "rendered"}) &&
          evidence_before(k - 1)) {
        Target t;
        for (std::size_t m = k; m < segment_end(i); ++m) {
          if (m == i) t.expression_at = t.tokens.size();
          if ((m >= i && m < end) || s_.in_frame(m)) continue;
          t.index.push_back(m), t.tokens.push_back(tokens_[m]);
        }
        return t;
      }
    // "..., the proposition that Mr Hale forced the lock, which is 80 times more likely than the
    // alternative": a relative clause's subject is the phrase before its comma.
    if (const auto antecedent = relative_antecedent(i)) return *antecedent;
    Target t = after_last_that(clause(i, end, true), i);
    // "2,500 times more likely than a randomly chosen man to have fired": the comparison is
    // not the target.
    if (end < tokens_.size() && tokens_[end]->folded == "than") {
      Target kept;
      kept.expression_at = t.expression_at;
      bool skipping = false;
      for (std::size_t k = 0; k < t.tokens.size(); ++k) {
        if (t.index[k] == end) skipping = true;
        if (skipping && t.tokens[k]->is_one_of({"to", "that", ","})) skipping = false;
        if (!skipping) kept.index.push_back(t.index[k]), kept.tokens.push_back(t.tokens[k]);
      }
      return kept;
    }
    return t;
  }

  // "My LR means that Mr Voyle's having fired a gun is 30 times more likely than ...": when a
  // "that" opens a complement before the expression at `i`, the clause compared is the
  // complement, not the words that introduce it ("my LR means").
  static Target after_last_that(Target t, std::size_t i) {
    std::size_t drop = 0;
    for (std::size_t k = 0; k < t.tokens.size() && t.index[k] < i; ++k)
      if (t.tokens[k]->folded == "that" && k + 1 < t.tokens.size() && t.index[k + 1] < i) drop = k + 1;
    if (drop == 0) return t;
    t.index.erase(t.index.begin(), t.index.begin() + static_cast<std::ptrdiff_t>(drop));
    t.tokens.erase(t.tokens.begin(), t.tokens.begin() + static_cast<std::ptrdiff_t>(drop));
    t.expression_at -= std::min(t.expression_at, drop);
    return t;
  }

  // The phrase a relative "which"/"that" right before the expression at `i` refers to: from the
  // last "that" or proposition word before the comma up to the comma.
  std::optional<Target> relative_antecedent(std::size_t i) const {
    std::size_t k = i;
    while (k > segment_begin(i) && has("be", k - 1)) --k;
    if (k < 2 || !tokens_[k - 1]->is_one_of({"which", "who"}) || tokens_[k - 2]->folded != ",") return std::nullopt;
    const std::size_t comma = k - 2;
    std::size_t from = segment_begin(i);
    for (std::size_t m = comma; m > segment_begin(i); --m)
      if (tokens_[m - 1]->is_one_of({"that", "proposition", "hypothesis"})) {
        from = tokens_[m - 1]->folded == "that" ? m : m - 1;
        break;
      }
    Target t;
    t.barrier_before_expression = false;
    for (std::size_t m = from; m < comma; ++m)
      if (!s_.in_frame(m)) t.index.push_back(m), t.tokens.push_back(tokens_[m]);
    t.expression_at = t.tokens.size();
    return t;
  }

  // Whether the findings, a trace or a result come before `verb` in its segment: "the findings
  // make ... more probable" (they are what makes it), not "Mr Hale made the toolmark".
  static std::size_t words_in(const Target& t) {
    return static_cast<std::size_t>(std::count_if(t.tokens.begin(), t.tokens.end(),
                                                  [](const Token* k) { return k->kind == TokenKind::word; }));
  }

  bool posterior_sentence() const { return posterior_; }

  bool evidence_before(std::size_t verb) const {
    for (std::size_t k = segment_begin(verb); k < verb; ++k)
      if (has("findings-noun", k) || has("trace-noun", k) || has("findings-summary", k) || has("proof-subject", k))
        return true;
    return false;
  }

  // A supposed starting point ("a court that began with prior odds of ...", "say the prior
  // were ..."), which makes "would" an illustration rather than the scientist's estimate.
  bool supposition_in_sentence() const {
    for (std::size_t k = 0; k < tokens_.size(); ++k)
      if (!in_opinion_frame(k) && tokens_[k]->is_one_of({"began", "begin", "begins", "beginning", "start", "starts", "started", "starting", "say",
                      "suppose", "supposing", "imagine"}))
        return true;
    return !s_.frames.empty();
  }

  bool hypothetical_in_segment(std::size_t i) const {
    for (std::size_t k = segment_begin(i); k < segment_end(i); ++k)
      if (has("hypothetical", k) && !in_opinion_frame(k)) return true;
    return false;
  }

  // "how likely it is that ...", "whether ... proved ...": a question, not a claim.
  bool indirect_question(std::size_t i) const {
    for (std::size_t k = i; k > segment_begin(i); --k) {
      if (tokens_[k - 1]->is_one_of({"whether"})) return true;
      if (k + 3 > i && tokens_[k - 1]->is_one_of({"how"})) return true;
    }
    return false;
  }

  // Odds written as odds ("1,000 to 1", "a million to one", "50:1") in the segment, rather than
  // a chance ("odds of 1 in 300").
  bool odds_stated(std::size_t i) const {
    for (std::size_t k = segment_begin(i); k + 2 < segment_end(i); ++k)
      if (tokens_[k]->kind == TokenKind::number && tokens_[k + 1]->is_one_of({"to", ":"}) &&
          (tokens_[k + 2]->kind == TokenKind::number || tokens_[k + 2]->is_one_of({"one"})))
        return true;
    return false;
  }

  // "N times more likely/probable": the token after it.
  std::optional<std::size_t> times_at(std::size_t i) const {
    if (tokens_[i]->kind != TokenKind::number || i + 2 >= tokens_.size() ||
        !tokens_[i + 1]->is_one_of({"times", "x", "×", "fold"}))
      return std::nullopt;
    for (std::size_t k = i + 2; k < std::min(i + 5, tokens_.size()); ++k)
      if (tokens_[k]->is_one_of({"likely", "probable", "probably", "likelier", "certain", "greater", "higher", "larger",
                                 "credible", "plausible", "believable", "surer", "sure", "confident"}))
        return k + 1;
    // "the probability of Hp is 300 times that of Hd", "... 250 times the probability that ..."
    if (tokens_[i + 2]->is_one_of({"that", "those"})) return i + 2;
    if (i + 3 < tokens_.size() && tokens_[i + 2]->folded == "the" && has("chance-word", i + 3)) return i + 2;
    return std::nullopt;
  }

  // A chance word used as one ("the probability that ..."), not "by chance" or "likelihood ratio".
  std::optional<std::size_t> chance_at(std::size_t i) const {
    if (!has("chance-word", i)) return std::nullopt;
    if (i > 0 && tokens_[i - 1]->is_one_of({"by", "through", "to", "pure", "mere"})) return std::nullopt;
    // "the conditional match probability for another person": the name of a quantity.
    if (i > 0 && tokens_[i - 1]->is_one_of({"match", "matching"})) return std::nullopt;
    if (i + 1 < tokens_.size() && tokens_[i + 1]->is_one_of({"ratio", "ratios", "distribution", "model"}))
      return std::nullopt;
    return i + 1;
  }

  // Where the proposition of a chance word starts: after "that", "of" or "for"; after a
  // stated value ("the probability is 0.99 that ..."); or at once when a clause follows
  // ("a 1 in 50 chance Ms Sato was ...").
  std::optional<std::size_t> complement_start(std::size_t after) const {
    if (after >= tokens_.size()) return std::nullopt;
    if (tokens_[after]->is_one_of({"that", "of", "for"})) return after + 1;
    // "the odds on Mr X being the donor are a billion to one": odds laid, with their value, on
    // what follows ("move the odds on Hp" lays none).
    if (tokens_[after]->folded == "on" && after > 0 && tokens_[after - 1]->folded == "odds" && odds_stated(after - 1))
      return after + 1;
    for (std::size_t k = after; k < std::min(after + 8, tokens_.size()); ++k) {
      const Token* t = tokens_[k];
      if (t->is_one_of({"that"})) return k + 1;
      if (t->folded == "of" && k > after && tokens_[k - 1]->is_one_of({"favour", "favor"})) return k + 1;
      if (t->folded == "against" && k > after) return k + 1;
      const bool filler = t->kind == TokenKind::number || has("be", k) ||
                          t->is_one_of({"about", "approximately", "roughly", "around", "only", "just", "less", "more",
                                      "than", "under", "over", "at", "least", "most", "greater", "higher", "lower",
                                      "very", "extremely", "small", "high", "low", "tiny", "negligible", "remote",
                                      "in", "favour", "favor", "to", "on", "a", "an", "one", ","});
      if (!filler) break;
    }
    const Token* t = tokens_[after];
    if (t->kind == TokenKind::word &&
        (t->capitalised || t->is_one_of({"he", "she", "they", "someone", "somebody", "anyone", "another", "the", "this",
                                        "his", "her", "there", "theres", "it", "its", "my", "your", "our", "their"})))
      return after;
    return std::nullopt;
  }

  // A proof verb asserts a proposition when its subject is the findings, a trace, a match or
  // the analysis ("the findings prove", "the DNA confirms", "this shows that").
  // (not a person who tells it: "the witness confirmed that ...", "we showed that ...").
  bool proof_subject(std::size_t verb) const {
    bool any = false;
    // A party anywhere before it reports what someone else said ("the reporter's summary, that
    // the tests had proved ..."). A person or pronoun tells it only in the verb's own clause,
    // after the last "that" ("I would tell them that the hair proves ..." asserts what the hair
    // proves; "the witness confirmed that ..." does not).
    std::size_t from = segment_begin(verb);
    for (std::size_t k = verb; k > segment_begin(verb); --k)
      if (tokens_[k - 1]->folded == "that") {
        from = k;
        break;
      }
    for (std::size_t k = segment_begin(verb); k < verb; ++k)
      if (has("party", k) && !s_.in_frame(k)) return false;
    for (std::size_t k = from; k < verb; ++k) {
      if (has("agent", k) || tokens_[k]->is_one_of({"i", "we", "you", "they"})) return false;
      any = any || has("findings-noun", k) || has("trace-noun", k) || has("proof-subject", k) ||
            tokens_[k]->kind == TokenKind::word;
    }
    return any;
  }
  bool proof_subject_is_match(std::size_t verb) const {
    for (std::size_t k = segment_begin(verb); k < verb; ++k)
      if (comparison_word(*tokens_[k])) return true;
    return false;
  }
  // A word that names a comparison's outcome ("the match", "consistent").
  static bool comparison_word(const Token& t) {
    return t.is_one_of({"match", "matches", "matching", "matched", "consistent"});
  }
};

}  // namespace

std::vector<Claim> find_claims(const std::vector<const Token*>& tokens, const ClauseStructure& structure,
                               const ClassTable& classes, ClassMatchCache& cache, bool question_affirmed) {
  return Analyser(tokens, structure, classes, cache, question_affirmed).run();
}

std::string_view claim_family(const Claim& claim, CheckMode mode) {
  if (claim.conditioned_on_proposition || claim.left_to_court) return {};
  // "if the prior odds were ..., the posterior odds would be ...", "a court that began with
  // prior odds of ... would hold ...": an illustration of Bayes' theorem, not a statement.
  if (claim.illustration || (claim.posterior_words && claim.hypothetical)) return {};
  if (claim.posterior_words || claim.conditioned_on_prior) return mode == CheckMode::casework ? "posterior-in-casework" : "";
  if (claim.match_as_proof) return "match-as-evaluation";
  if (claim.target == ClaimTarget::another_match) return "another-match";
  if (claim.population_count && (claim.form == ClaimForm::chance || claim.form == ClaimForm::odds) &&
      claim.target != ClaimTarget::coincidence)
    return "defence-fallacy";
  // "odds of a million to one against the mark being there by chance": a chance match stated
  // as odds is still the coincidence read as a proposition.
  if (claim.form == ClaimForm::odds && claim.target == ClaimTarget::coincidence) return "transposed-conditional";
  if (claim.form == ClaimForm::times || claim.form == ClaimForm::odds) return "lr-as-odds";
  switch (claim.target) {
    case ClaimTarget::offence: return "ultimate-issue";
    case ClaimTarget::source: return "source-probability";
    case ClaimTarget::activity:
    case ClaimTarget::hypothesis:
    case ClaimTarget::coincidence: return "transposed-conditional";
    case ClaimTarget::another_match: return "another-match";
  }
  return {};
}

}  // namespace counterpoise::guard

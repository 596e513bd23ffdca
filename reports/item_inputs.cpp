#include "reports/item_inputs.hpp"

#include <cmath>
#include <optional>
#include <regex>

#include "core/numbers/number_text.hpp"
#include "core/numbers/operand_text.hpp"
#include "core/probability/probability_assignment.hpp"
#include "reports/mixture_recomputation.hpp"
#include "core/validation/word_list.hpp"

namespace counterpoise::reports {

namespace {

using nlohmann::json;
using numbers::decimal_for_readers;
using numbers::entered_for_readers;
using numbers::kWorkingFigures;
using numbers::probability_for_readers;

Paragraph text(std::string words, Paragraph::Style style = Paragraph::Style::body, std::string label = {}) {
  return Paragraph{std::move(words), style, std::move(label), TextSource{}, {}};
}

std::string working(double x) { return decimal_for_readers(x, kWorkingFigures); }

std::string join(const std::vector<std::string>& parts, const std::string& separator = ", ") {
  std::string out;
  for (std::size_t i = 0; i < parts.size(); ++i) out += (i ? separator : "") + parts[i];
  return out;
}

const json* member(const json& object, const char* name) {
  if (!object.is_object()) return nullptr;
  const auto it = object.find(name);
  return it == object.end() ? nullptr : &*it;
}

double number_or(const json* value, double fallback) { return value && value->is_number() ? value->get<double>() : fallback; }

// --- Probabilities assigned as a point, an interval, a Beta distribution or counts ---------------

// The mean of an assignment as an expression a calculator can evaluate: "(3 + 1)/(412 + 2)";
// empty for a point value (the value is its own mean).
std::string mean_expression(const probability::Assignment& a) {
  using namespace probability;
  if (const auto* v = std::get_if<IntervalValue>(&a)) {
    const std::string lo = entered_for_readers(v->low), hi = entered_for_readers(v->high);
    return v->linear ? "(" + lo + " + " + hi + ")/2" : "(" + hi + " \u2212 " + lo + ")/ln(" + numbers::operand_for_readers(hi) + "/" +
                                                                    numbers::operand_for_readers(lo) + ")";
  }
  if (const auto* v = std::get_if<BetaValue>(&a))
    return entered_for_readers(v->a) + "/(" + entered_for_readers(v->a) + " + " + entered_for_readers(v->b) + ")";
  if (const auto* v = std::get_if<CountsValue>(&a))
    return "(" + numbers::count_for_readers(v->k) + " + " + entered_for_readers(v->prior_a) + ")/(" +
           numbers::count_for_readers(v->n) + " + " + entered_for_readers(v->prior_a + v->prior_b) + ")";
  return {};
}

// The value the point LR uses: the mean, with the same text as in the findings table.
std::string mean_text(const probability::Assignment& a) { return probability_for_readers(probability::log10_mean(a)); }

// "assigned as 3 of 412, (3 + 1)/(412 + 2) = 0.00966, the rule of succession (Laplace)".
std::string assignment_words(const probability::Assignment& a) {
  using namespace probability;
  const std::string mean = mean_text(a);
  if (std::holds_alternative<PointValue>(a)) return "assigned as the single value " + mean;
  if (const auto* v = std::get_if<IntervalValue>(&a))
    return "assigned as uniform between " + entered_for_readers(v->low) + " and " + entered_for_readers(v->high) +
           (v->linear ? "" : " on the logarithmic scale") + "; its mean, " + mean_expression(a) + " = " + mean +
           ", is used for the point value";
  if (const auto* v = std::get_if<BetaValue>(&a))
    return "assigned as a Beta(" + entered_for_readers(v->a) + ", " + entered_for_readers(v->b) +
           ") distribution; its mean, " + mean_expression(a) + " = " + mean + ", is used for the point value";
  const auto& c = std::get<CountsValue>(a);
  std::string words = "assigned from " + numbers::count_for_readers(c.k) + " of " + numbers::count_for_readers(c.n) +
                      " as " + mean_expression(a) + " = " + mean;
  if (c.prior_a == 1.0 && c.prior_b == 1.0) return words + ", the rule of succession (Laplace)";
  return words + ", the mean of the Beta(" + entered_for_readers(c.prior_a) + ", " + entered_for_readers(c.prior_b) +
         ") prior updated by the counts";
}

std::optional<probability::Assignment> assignment_of(const json& fields, const char* name, const casefile::Item& item) {
  const json* value = member(fields, name);
  if (!value) return std::nullopt;
  // Read again from the model's own fields: they were read and checked when the case was read.
  return probability::read_assignment(*value, validation::Location{item.id, name});
}

void assigned_inputs(const casefile::Item& item, const evaluation::ItemEvaluation& e, ItemInputs& out) {
  const json fields = item.model->to_json();
  const auto hp = assignment_of(fields, "p_given_hp", item);
  const auto hd = assignment_of(fields, "p_given_hd", item);
  if (!hp || !hd) return;
  out.body.push_back(text("P(E|Hp) was " + assignment_words(*hp) + ". P(E|Hd) was " + assignment_words(*hd) + ".",
                          Paragraph::Style::body, "Inputs as used"));
  const std::string hp_expr = mean_expression(*hp).empty() ? mean_text(*hp) : mean_expression(*hp);
  const std::string hd_expr = mean_expression(*hd).empty() ? mean_text(*hd) : mean_expression(*hd);
  out.recomputation.push_back(text(
      "The likelihood ratio is the ratio of the mean probabilities of the findings (Taroni, Bozza, Biedermann & "
      "Aitken 2016, Law, Probability and Risk 15:1): LR = P(E|Hp) / P(E|Hd) = (" + hp_expr + ") / (" + hd_expr + ") = " +
      numbers::operand_for_readers(mean_text(*hp)) + " / " + numbers::operand_for_readers(mean_text(*hd)) + " = " +
      numbers::lr_for_readers(e.point.lr) + "."));
}

// --- A likelihood ratio taken as reported ---------------------------------------------------------

void reported_inputs(const evaluation::ItemEvaluation& e, ItemInputs& out) {
  const json& d = e.point.detail;
  std::string words = "The likelihood ratio was taken as reported: " + numbers::lr_for_readers(e.point.lr);
  if (const json* interval = member(d, "reported_interval_log10"); interval && interval->is_array() && interval->size() == 2)
    words += ", with the interval " + numbers::magnitude_for_readers((*interval)[0].get<double>()) + " to " +
             numbers::magnitude_for_readers((*interval)[1].get<double>()) + ", treated as uniform on the logarithmic scale";
  words += ".";
  if (const json* method = member(d, "method"); method && method->is_string())
    words += " Method as stated: " + method->get<std::string>() + ".";
  out.body.push_back(text(words, Paragraph::Style::body, "Inputs as used"));
  out.recomputation.push_back(text(
      "No calculation: the likelihood ratio is taken as reported by the method named with the findings (recomputing it "
      "needs that method's own report), LR = " + numbers::lr_for_readers(e.point.lr) + "."));
}

// --- DNA, single-source profile -----------------------------------------------------------------

std::string genotype_text(const json* alleles) {
  if (!alleles || !alleles->is_array()) return "\u2013";
  std::vector<std::string> parts;
  for (const auto& a : *alleles) parts.push_back(a.get<std::string>());
  return join(parts);
}

std::string locus_status_words(const std::string& status) {
  if (status == "not-interpretable") return "not used: not interpretable";
  if (status == "differs") return "differs from the reference";
  if (status == "not-compared") return "not used: no reference genotype";
  if (status == "sex-marker") return "not used: sex marker";
  return status;
}

std::string relationship_words(const std::string& name) {
  if (name == "unrelated") return "a person unrelated to the person of interest";
  if (name == "parent-child") return "a parent or child of the person of interest";
  if (name == "full-sibling") return "a full sibling of the person of interest";
  if (name == "half-sibling") return "a half sibling of the person of interest";
  if (name == "first-cousin") return "a first cousin of the person of interest";
  return "a relative of the person of interest with the IBD coefficients stated";
}

// The published formula for an unrelated person's match probability at one locus given theta.
std::string unrelated_formula(double theta) {
  if (theta == 0.0) return "the product rule, p\u00b2 for a homozygote and 2pq for a heterozygote (NRC II 1996, eq. 4.1a/b)";
  return "the Balding\u2013Nichols conditional match probability, [2\u03b8 + (1 \u2212 \u03b8)p][3\u03b8 + (1 \u2212 \u03b8)p] "
         "/ [(1 + \u03b8)(1 + 2\u03b8)] for a homozygote and 2[\u03b8 + (1 \u2212 \u03b8)p][\u03b8 + (1 \u2212 \u03b8)q] / "
         "[(1 + \u03b8)(1 + 2\u03b8)] for a heterozygote (NRC II 1996, eq. 4.10a/b)";
}

// The published formula for one locus's match probability given theta and the relationship: for a
// relative, the IBD-weighted sum, whose P0 term is the unrelated formula.
std::string dna_formula(double theta, double k0) {
  if (k0 == 1.0) return unrelated_formula(theta);
  return "for a relative, k0 P0 + k1 P1 + k2, with P1 = [2\u03b8 + (1 \u2212 \u03b8)p] / (1 + \u03b8) for a homozygote "
         "or [2\u03b8 + (1 \u2212 \u03b8)(p + q)] / [2(1 + \u03b8)] for a heterozygote (Fung & Hu 2005, Forensic "
         "Science Communications 7(2), Tables 2\u20133; with \u03b8 = 0 the formulas of NRC II 1996, section 4.4), and "
         "P0, the match probability of an unrelated person, " + unrelated_formula(theta);
}

// "Allele frequencies are from the frequency table F. The minimum allele frequency was used for ...".
std::string frequency_source_words(const casefile::Item& item, const std::vector<std::string>& floors) {
  std::vector<std::string> files;
  for (const auto& f : item.model->data_files()) files.push_back(f.name);
  return " Allele frequencies are from " +
         (files.empty() ? std::string("the table given in the case file") : "the frequency table " + join(files)) + "." +
         (floors.empty() ? " No allele needed the minimum frequency." : " The minimum allele frequency was used for " + join(floors) + ".");
}

// The "Inputs as used" paragraph, citing the inputs appendix by page, and the item's table there.
void inputs_with_appendix_table(const casefile::Item& item, std::string words, const std::string& appendix_id, Table table,
                                ItemInputs& out) {
  Paragraph body = text(std::move(words), Paragraph::Style::body, "Inputs as used");
  body.page_of = appendix_id;
  out.body.push_back(body);
  out.appendix.push_back(text("Item " + item.id + ": " + item.title_or_id(), Paragraph::Style::lead));
  out.appendix.push_back(std::move(table));
}

void dna_inputs(const casefile::Item& item, const evaluation::ItemEvaluation& e, const std::string& appendix_id,
                ItemInputs& out) {
  const json& d = e.point.detail;
  const double theta = number_or(member(d, "theta"), 0.0);
  std::string relationship = "unrelated";
  std::vector<double> ibd{1.0, 0.0, 0.0};
  if (const json* r = member(d, "relationship")) {
    if (const json* name = member(*r, "name"); name && name->is_string()) relationship = name->get<std::string>();
    if (const json* k = member(*r, "ibd"); k && k->is_array() && k->size() == 3)
      ibd = {(*k)[0].get<double>(), (*k)[1].get<double>(), (*k)[2].get<double>()};
  }

  Table table;
  table.header = {"Locus", "Questioned", "Reference", "Allele frequencies used", "Match probability", "LR"};
  table.widths = {1.1, 1.0, 1.0, 2.6, 1.3, 1.2};
  table.no_wrap = {true, false, false, false, true, true};
  std::vector<std::string> floors;
  std::vector<std::string> unused;
  if (const json* loci = member(d, "loci"); loci && loci->is_array()) {
    for (const auto& row : *loci) {
      const std::string locus = row.value("locus", "");
      const std::string status = row.value("status", "used");
      std::vector<std::string> cells{locus, genotype_text(member(row, "genotype")), genotype_text(member(row, "reference_genotype"))};
      if (status != "used") {
        cells.insert(cells.end(), {locus_status_words(status), "\u2013", "\u2013"});
        unused.push_back(locus + " (" + locus_status_words(status) + ")");
        table.rows.push_back(std::move(cells));
        continue;
      }
      std::vector<std::string> alleles;
      const json* used = member(row, "frequencies_used");
      const json* listed = member(row, "table_frequencies");
      const double floor = number_or(member(row, "minimum_frequency"), 0.0);
      if (used && used->is_object())
        for (const auto& [allele, p] : used->items()) {
          const json* in_table = listed ? member(*listed, allele.c_str()) : nullptr;
          const bool floored = floor > 0.0 && p.get<double>() == floor &&
                               (!in_table || !in_table->is_number() || in_table->get<double>() < floor);
          std::string cell = allele + ": " + entered_for_readers(p.get<double>());
          if (floored) {
            cell += " (minimum frequency; table: " +
                    (in_table && in_table->is_number() ? entered_for_readers(in_table->get<double>()) : std::string("not listed")) + ")";
            floors.push_back(locus + " " + allele + " (" + row.value("minimum_frequency_rule", "") + ")");
          }
          alleles.push_back(cell);
        }
      const double log10_mp = number_or(member(row, "log10_match_probability"), 0.0);
      cells.push_back(join(alleles, "; "));
      cells.push_back(probability_for_readers(log10_mp));
      cells.push_back(numbers::magnitude_for_readers(-log10_mp));
      table.rows.push_back(std::move(cells));
    }
  }

  std::string words = "The alternative donor under Hd is " + relationship_words(relationship) +
                      ", with IBD coefficients (k0, k1, k2) = (" + entered_for_readers(ibd[0]) + ", " +
                      entered_for_readers(ibd[1]) + ", " + entered_for_readers(ibd[2]) + "); the co-ancestry coefficient \u03b8 = " +
                      entered_for_readers(theta) + "." + frequency_source_words(item, floors);
  if (!unused.empty()) words += " Loci not used: " + join(unused) + ".";
  words += " The genotypes, the frequencies used and each locus's match probability and likelihood ratio are listed "
           "in the appendix on the inputs as used.";
  inputs_with_appendix_table(item, words, appendix_id, table, out);
  out.appendix.push_back(text("Frequencies marked \"minimum frequency\" replace a rarer or unlisted allele by the floor "
                              "stated; every other frequency is the table's. The likelihood ratio of a locus is 1 / its "
                              "match probability.",
                              Paragraph::Style::note));

  std::string recompute = "The match probability at each locus is " + dna_formula(theta, ibd[0]) + ", with \u03b8 = " +
                          entered_for_readers(theta) + " and (k0, k1, k2) = (" + entered_for_readers(ibd[0]) + ", " +
                          entered_for_readers(ibd[1]) + ", " + entered_for_readers(ibd[2]) +
                          "). The profile's match probability is the product over the loci used (the loci are taken as "
                          "independent, NRC II 1996, section 4.2), and LR = 1 / match probability";
  if (e.point.lr.is_zero())
    recompute += ". A locus differs from the reference, so the findings exclude Hp and the likelihood ratio is 0.";
  else if (const json* total = member(d, "log10_match_probability"); total && total->is_number())
    recompute += ". The log10 match probability is the sum of the loci's log10 values, " +
                 numbers::log10_for_readers(total->get<double>()) + "; the match probability is " +
                 probability_for_readers(total->get<double>()) + ", and LR = 1 / " +
                 numbers::operand_for_readers(probability_for_readers(total->get<double>())) + " = " + numbers::lr_for_readers(e.point.lr) + ".";
  Paragraph p = text(recompute);
  out.recomputation.push_back(p);
}

// --- Continuous measurements, two-level model ---------------------------------------------------

std::string values_text(const json* values) {
  if (!values || !values->is_array()) return "\u2013";
  std::vector<std::string> parts;
  for (const auto& v : *values) parts.push_back(entered_for_readers(v.get<double>()));
  return join(parts);
}

void continuous_inputs(const casefile::Item& item, const evaluation::ItemEvaluation& e, const std::string& appendix_id,
                       ItemInputs& out) {
  const json fields = item.model->to_json();
  const json& d = e.point.detail;
  const json* control = member(d, "control");
  const json* recovered = member(d, "recovered");
  const json* within = member(d, "within_sd");
  const json* variances = member(d, "variances");
  const json* population = member(d, "population");
  if (!control || !recovered || !within || !variances || !population) return;
  const double xbar = number_or(member(*control, "mean"), 0), ybar = number_or(member(*recovered, "mean"), 0);
  const double sigma = number_or(member(*within, "value"), 0);
  const double a = number_or(member(*variances, "control_mean"), 0), b = number_or(member(*variances, "recovered_mean"), 0);
  const double w = number_or(member(d, "pooled_mean"), 0);

  std::string words = "Control measurements (" + std::to_string(member(*control, "count")->get<int>()) + "): " +
                      values_text(member(fields, "control")) + "; mean x\u0304 = " + working(xbar) +
                      ". Recovered measurements (" + std::to_string(member(*recovered, "count")->get<int>()) + "): " +
                      values_text(member(fields, "recovered")) + "; mean y\u0304 = " + working(ybar) + ". ";
  const bool pooled = member(*within, "degrees_of_freedom") != nullptr;
  if (pooled) {
    words += "Within-source standard deviation \u03c3 = " + working(sigma) + ", pooled from " +
             std::to_string(number_or(member(*within, "replicate_groups"), 0) > 0 ? member(*within, "replicate_groups")->get<int>() : 0) +
             " groups of replicate measurements (" + std::to_string(member(*within, "degrees_of_freedom")->get<int>()) +
             " degrees of freedom).";
  } else {
    words += "Within-source standard deviation \u03c3 = " + working(sigma) + ", as given.";
  }
  const json* normal = member(*population, "normal");
  const json* kde = member(*population, "kde");
  if (normal) {
    words += " Between-source population: normal with mean \u03bc = " + entered_for_readers(number_or(member(*normal, "mean"), 0)) +
             " and standard deviation \u03c4 = " + entered_for_readers(number_or(member(*normal, "sd"), 0)) + ".";
  } else if (kde) {
    words += " Between-source population: a kernel density estimate from " +
             std::to_string(number_or(member(*kde, "values"), 0) > 0 ? member(*kde, "values")->get<int>() : 0) +
             " background values (file " + kde->value("file", "") + ", column " + kde->value("column", "") + ", from " +
             entered_for_readers(number_or(member(*kde, "min"), 0)) + " to " + entered_for_readers(number_or(member(*kde, "max"), 0)) +
             "), with normal kernels of bandwidth h = " + working(number_or(member(*kde, "bandwidth"), 0)) + " (" +
             kde->value("bandwidth_rule", "") + ").";
  }
  out.body.push_back(text(words, Paragraph::Style::body, "Inputs as used"));
  if (pooled) {
    Paragraph see = text("The replicate measurements behind \u03c3 are listed in the appendix on the inputs as used.");
    see.page_of = appendix_id;
    out.body.push_back(see);
  }

  if (pooled) {
    Table groups;
    groups.header = {"Group", "Replicate measurements"};
    groups.widths = {0.8, 6.0};
    groups.no_wrap = {true, false};
    if (const json* replicates = member(fields, "within_replicates"); replicates && replicates->is_array())
      for (std::size_t i = 0; i < replicates->size(); ++i)
        groups.rows.push_back({std::to_string(i + 1), values_text(&(*replicates)[i])});
    out.appendix.push_back(text("Item " + item.id + ": " + item.title_or_id() + ", replicate groups for \u03c3",
                                Paragraph::Style::lead));
    out.appendix.push_back(groups);
    out.appendix.push_back(text("\u03c3\u00b2 is pooled as the sum over the groups of the squared deviations from each "
                                "group's mean, divided by the degrees of freedom (the number of measurements less the "
                                "number of groups).",
                                Paragraph::Style::note));
  }

  std::string recompute = "With m = " + std::to_string(member(*control, "count")->get<int>()) + " control and n = " +
                          std::to_string(member(*recovered, "count")->get<int>()) +
                          " recovered measurements, the means have variances a = \u03c3\u00b2/m = " + working(a) +
                          " and b = \u03c3\u00b2/n = " + working(b) + "; x\u0304 \u2212 y\u0304 = " + working(xbar - ybar) +
                          " and w = (b x\u0304 + a y\u0304)/(a + b) = " + working(w) +
                          ". \u03c6(x; c, v) is the normal density at x with mean c and variance v. ";
  const double numerator = number_or(member(*member(d, "numerator"), "log10"), 0);
  const double denominator = number_or(member(*member(d, "denominator"), "log10"), 0);
  const std::string densities = " The numerator is " + working(std::pow(10.0, numerator)) + " and the denominator " +
                                working(std::pow(10.0, denominator)) + ", so LR = " + numbers::lr_for_readers(e.point.lr) + ".";
  if (normal) {
    const double mu = number_or(member(*normal, "mean"), 0), tau = number_or(member(*normal, "sd"), 0);
    const bool approximate = d.value("method", "").find("approximate") != std::string::npos;
    if (approximate)
      recompute += "Lindley's approximation (Lindley 1977, Biometrika 64:207): LR \u2248 \u03c6(x\u0304 \u2212 y\u0304; 0, a + b) / "
                   "\u03c6(w; \u03bc, \u03c4\u00b2), with \u03bc = " + entered_for_readers(mu) + " and \u03c4\u00b2 = " +
                   working(tau * tau) + ".";
    else
      recompute += "The two-level model with a normal population, exact form (Lindley 1977, Biometrika 64:207): LR = "
                   "\u03c6(x\u0304 \u2212 y\u0304; 0, a + b) \u00d7 \u03c6(w; \u03bc, \u03c4\u00b2 + ab/(a + b)) / "
                   "[\u03c6(x\u0304; \u03bc, \u03c4\u00b2 + a) \u00d7 \u03c6(y\u0304; \u03bc, \u03c4\u00b2 + b)], with \u03bc = " +
                   entered_for_readers(mu) + " and \u03c4\u00b2 = " + working(tau * tau) + ".";
  } else if (kde) {
    const double h = number_or(member(*kde, "bandwidth"), 0);
    const json* at = member(d, "kernel_log10_density");
    const auto density_at = [&](const char* name) { return at ? working(std::pow(10.0, number_or(member(*at, name), 0))) : std::string("-"); };
    recompute += "The two-level model with a kernel density population (Aitken & Lucy 2004, Applied Statistics "
                 "53:109): LR = \u03c6(x\u0304 \u2212 y\u0304; 0, a + b) \u00d7 f(w; h\u00b2 + ab/(a + b)) / [f(x\u0304; h\u00b2 + a) "
                 "\u00d7 f(y\u0304; h\u00b2 + b)], where f(x; v) is the mean over the N background values z of \u03c6(x; z, v), "
                 "and h = " + working(h) + ". Here f(w; h\u00b2 + ab/(a + b)) = " + density_at("pooled_mean") +
                 ", f(x\u0304; h\u00b2 + a) = " + density_at("control_mean") + " and f(y\u0304; h\u00b2 + b) = " +
                 density_at("recovered_mean") + ".";
  }
  out.recomputation.push_back(text(recompute + densities));
}

// --- Transfer at activity level -----------------------------------------------------------------

struct TransferTerm {
  const char* field;
  const char* symbol;
  const char* meaning;
};

constexpr TransferTerm kTransferTerms[] = {
    {"t0", "t0", "no item transferred, persisted and was recovered, if Hp is true"},
    {"tn", "tn", "a group of n items was transferred, persisted and was recovered, if Hp is true"},
    {"p0", "P0", "a person has no group of such items by chance (background)"},
    {"p1", "P1", "a person has one group of such items by chance (background)"},
    {"sn", "Sn", "a background group has n items"},
    {"gamma", "\u03b3", "a background group has the characteristics of the control (their frequency)"},
    // Only when what the person did if Hd is true may transfer material too.
    {"t0_hd", "t0_hd", "no item transferred, persisted and was recovered, if Hd is true"},
    {"tn_hd", "tn_hd", "a group of n items was transferred, persisted and was recovered, if Hd is true"},
};

void transfer_inputs(const casefile::Item& item, const evaluation::ItemEvaluation& e, ItemInputs& out) {
  const json fields = item.model->to_json();
  const bool group = e.point.detail.value("found", "group") == "group";
  Table table;
  table.header = {"Term", "Probability that", "As assigned", "Value used"};
  table.widths = {0.6, 3.0, 3.2, 1.0};
  table.no_wrap = {true, false, false, true};
  std::vector<std::pair<std::string, std::string>> values;  // symbol, expression
  for (const auto& term : kTransferTerms) {
    const auto a = assignment_of(fields, term.field, item);
    if (!a) continue;
    std::string assigned = assignment_words(*a);
    table.rows.push_back({term.symbol, term.meaning, assigned, mean_text(*a)});
    values.push_back({term.symbol, mean_expression(*a).empty() ? mean_text(*a) : mean_expression(*a)});
  }
  std::string lead = group ? "Findings: one group of " +
                                 (member(fields, "n") ? numbers::count_for_readers(member(fields, "n")->get<std::int64_t>()) + " " : std::string()) +
                                 "items matching the control, and no other group."
                           : "Findings: no items matching the control were found.";
  lead += " The source of the survey counts and experiments is given with the findings (Data).";
  out.body.push_back(text(lead, Paragraph::Style::body, "Inputs as used"));
  out.body.push_back(table);

  // With a transfer of its own under Hd the denominator has the same two branches as the
  // numerator (docs/methods.md, transfer): the short forms no longer hold.
  const bool hd_transfer = member(fields, "t0_hd") != nullptr;
  const char* source = "(Evett 1986, Journal of the Forensic Science Society 26:3; Aitken, Taroni & Bozza 2021, "
                       "Statistics and the Evaluation of Evidence for Forensic Scientists, 3rd ed.)";
  std::string recompute =
      group ? std::string("Evett's formula for one group found ") + source +
                  (hd_transfer ? ", with a transfer under Hd too: LR = (tn P0 + t0 P1 Sn \u03b3) / (tn_hd P0 + t0_hd P1 Sn \u03b3)"
                               : ": LR = t0 + P0 tn / (P1 Sn \u03b3)")
            : (hd_transfer ? "For no items found, with a transfer under Hd too (Evett 1986): LR = t0 P0 / (t0_hd P0) = t0 / t0_hd"
                           : "For no items found (Evett 1986): LR = t0 P0 / P0 = t0");
  std::vector<std::string> substituted;
  for (const auto& [symbol, expression] : values) substituted.push_back(symbol + " = " + expression);
  recompute += ", with " + join(substituted) + ".";
  // The two branches of the event tree as intermediate values, so that a calculator reaches the
  // LR in two steps: the probability of the findings under each proposition, then their ratio.
  if (e.point.log10_p_given_hp && e.point.log10_p_given_hd && e.point.lr.is_finite() && !e.point.lr.is_zero()) {
    const std::string hp = working(std::pow(10.0, *e.point.log10_p_given_hp));
    const std::string hd = working(std::pow(10.0, *e.point.log10_p_given_hd));
    const std::string hp_formula = group ? "tn P0 + t0 P1 Sn \u03b3" : "t0 P0";
    const std::string hd_formula = group ? (hd_transfer ? "tn_hd P0 + t0_hd P1 Sn \u03b3" : "P1 Sn \u03b3")
                                         : (hd_transfer ? "t0_hd P0" : "P0");
    recompute += " Then P(E|Hp) = " + hp_formula + " = " + hp + " and P(E|Hd) = " + hd_formula + " = " + hd +
                 ", so LR = " + numbers::operand_for_readers(hp) + " / " + numbers::operand_for_readers(hd) + " = " +
                 numbers::lr_for_readers(e.point.lr) + ".";
  } else {
    recompute += " LR = " + numbers::lr_for_readers(e.point.lr) + ".";
  }
  out.recomputation.push_back(text(recompute));
}

// --- DNA, mixture (semi-continuous) ---------------------------------------------------------------

// "Mr Dray, Ms Venn and 1 unknown person" from a proposition in the model's detail.
std::string contributors_text(const json& side) {
  std::vector<std::string> parts;
  if (const json* named = member(side, "contributors"); named && named->is_array())
    for (const auto& name : *named) parts.push_back(name.get<std::string>());
  const auto unknowns = static_cast<std::int64_t>(number_or(member(side, "unknowns"), 0));
  if (unknowns > 0) parts.push_back(numbers::count_for_readers(unknowns) + (unknowns == 1 ? " unknown person" : " unknown people"));
  return validation::list_in_words(parts);
}

void mixture_inputs(const casefile::Item& item, const evaluation::ItemEvaluation& e, const std::string& appendix_id,
                    ItemInputs& out) {
  const json& d = e.point.detail;
  const json* dropout = member(d, "dropout");

  Table table;
  table.header = {"Locus", "Alleles observed", "Allele frequencies used (Q: every other allele)"};
  table.widths = {1.1, 1.6, 4.5};
  table.no_wrap = {true, false, false};
  std::vector<std::string> floors;
  if (const json* loci = member(d, "loci"); loci && loci->is_array())
    for (const auto& locus : *loci) {
      std::vector<std::string> observed, frequencies;
      if (const json* o = member(locus, "observed"); o && o->is_array())
        for (const auto& a : *o) observed.push_back(a.get<std::string>());
      if (const json* u = member(locus, "uncertain"); u && u->is_array())
        for (const auto& a : *u) observed.push_back(a.get<std::string>() + " (uncertain)");
      if (const json* classes = member(locus, "classes"); classes && classes->is_array())
        for (const auto& c : *classes) {
          const std::string allele = c.value("allele", "");
          // Q (every other allele) is not entered but computed, 1 minus the listed frequencies, so it
          // is an intermediate value of 6 significant figures, never the last bits of a subtraction.
          const double frequency = number_or(member(c, "frequency"), 0.0);
          std::string cell = allele + ": " + (c.value("other_alleles", false) ? working(frequency) : entered_for_readers(frequency));
          if (c.value("minimum_frequency_applied", false)) {
            cell += " (minimum frequency)";
            floors.push_back(locus.value("locus", "") + " " + allele);
          }
          frequencies.push_back(cell);
        }
      table.rows.push_back({locus.value("locus", ""), join(observed), join(frequencies, "; ")});
    }

  std::string words = "Under Hp the contributors are " + (member(d, "hp") ? contributors_text(d["hp"]) : std::string()) +
                      "; under Hd " + (member(d, "hd") ? contributors_text(d["hd"]) : std::string()) +
                      ". The co-ancestry coefficient \u03b8 = " + entered_for_readers(number_or(member(d, "theta"), 0.0)) +
                      "; the drop-out probability d is ";
  if (dropout && dropout->value("integrated", false))
    words += "described by " + dropout->value("assignment", std::string()) + ", whose mean is " +
             decimal_for_readers(number_or(member(*dropout, "point"), 0.0));
  else
    words += entered_for_readers(dropout ? number_or(member(*dropout, "point"), 0.0) : 0.0);
  if (const json* own = dropout ? member(*dropout, "by_contributor") : nullptr; own && own->is_object() && !own->empty()) {
    std::vector<std::string> rates;
    for (auto it = own->begin(); it != own->end(); ++it)
      rates.push_back(it.key() + "'s " + entered_for_readers(number_or(member(it.value(), "dropout"), 0.0)));
    words += " for the unknown contributors and every named person without one of their own (" + join(rates) + ")";
  }
  words += "; the drop-in probability is " + entered_for_readers(number_or(member(d, "dropin"), 0.0)) + "." +
           frequency_source_words(item, floors);
  words += " The people's genotypes and each locus's likelihood ratio are in the section on the DNA mixture that follows "
           "the findings; the frequencies used at each locus are in the appendix on the inputs as used.";
  inputs_with_appendix_table(item, words, appendix_id, table, out);

  std::string recompute =
      "The semi-continuous model (Gill et al. 2012, DNA commission of the ISFG, Forensic "
      "Science International: Genetics 6:679): at each locus, P(E|H, d) is the sum, over the genotypes the unknown "
      "contributors could have, of the genotypes' probability (the Balding\u2013Nichols sampling formula with \u03b8, "
      "conditioned on the named people's alleles) times the probability of the alleles observed given every "
      "contributor's genotypes (each allele copy dropping out with probability d, or with its carrier's own drop-out "
      "probability where one is stated, an allele dropping in with the drop-in probability times its frequency, an "
      "allele marked uncertain counting neither way). The loci multiply";
  if (dropout && dropout->value("integrated", false))
    recompute += ", and each proposition's probability is averaged over d: P(E|H) = \u222b \u03a0 P(E|H, d) f(d) dd "
                 "with one d for the whole profile (numerical quadrature). This average is not a product of per-locus "
                 "values, so a calculator recomputation is practical only at a fixed d: at the mean d the loci's "
                 "likelihood ratios in the section on the DNA mixture multiply to " +
                 (member(d, "lr_at_point_dropout") && d["lr_at_point_dropout"].value("state", "") == "finite"
                      ? numbers::magnitude_for_readers(d["lr_at_point_dropout"]["log10_lr"].get<double>())
                      : std::string("the value stated there"));
  if (e.point.log10_p_given_hp && e.point.log10_p_given_hd)
    recompute += ". P(E|Hp) = " + probability_for_readers(*e.point.log10_p_given_hp) + " and P(E|Hd) = " +
                 probability_for_readers(*e.point.log10_p_given_hd);
  recompute += ", so LR = " + numbers::lr_for_readers(e.point.lr) + ".";
  out.recomputation.push_back(text(recompute));
  for (auto& block : mixture_recomputation(item)) out.recomputation.push_back(std::move(block));
}

// --- Networks -----------------------------------------------------------------------------------

void network_inputs(const evaluation::ItemEvaluation& e, ItemInputs& out) {
  Paragraph inputs = text("The network's drawing and the entries that move its likelihood ratio most follow the "
                          "findings; every probability table of the network is in the appendix on the probability "
                          "tables of the networks.",
                          Paragraph::Style::body, "Inputs as used");
  inputs.page_of = kNetworkTablesAppendix;
  out.body.push_back(inputs);
  std::string recompute =
      "P(E|Hp) and P(E|Hd) are the probabilities of the observed states with the proposition node set to Hp and to Hd: "
      "the sum, over the states of the nodes not observed, of the product of one entry from each node's table (exact "
      "summation by variable elimination; Taroni, Biedermann, Bozza, Garbolino & Aitken 2014, Bayesian Networks for "
      "Probabilistic Inference and Decision Analysis in Forensic Science, 2nd ed., ch. 2)";
  if (e.point.log10_p_given_hp && e.point.log10_p_given_hd)
    recompute += ". P(E|Hp) = " + probability_for_readers(*e.point.log10_p_given_hp) + " and P(E|Hd) = " +
                 probability_for_readers(*e.point.log10_p_given_hd) + ", so LR = " + numbers::lr_for_readers(e.point.lr);
  out.recomputation.push_back(text(recompute + "."));
}

}  // namespace

std::string model_title(std::string_view kind) {
  if (kind == "assigned") return "Probabilities assigned by the scientist";
  if (kind == "reported-lr") return "Likelihood ratio taken as reported";
  if (kind == "dna-single-source") return "DNA profile from a single person";
  if (kind == "dna-mixture") return "DNA profile from a mixture of people";
  if (kind == "continuous-two-level") return "Measurements compared by a two-level model";
  if (kind == "transfer") return "Transfer, persistence and background";
  if (kind == "network") return "Bayesian network";
  return std::string(kind);
}

ItemInputs item_inputs(const casefile::Item& item, const evaluation::ItemEvaluation& evaluation,
                       const std::string& appendix_id) {
  ItemInputs out;
  const std::string kind = item.model->kind();
  if (kind == "assigned") assigned_inputs(item, evaluation, out);
  else if (kind == "reported-lr") reported_inputs(evaluation, out);
  else if (kind == "dna-single-source") dna_inputs(item, evaluation, appendix_id, out);
  else if (kind == "continuous-two-level") continuous_inputs(item, evaluation, appendix_id, out);
  else if (kind == "transfer") transfer_inputs(item, evaluation, out);
  else if (kind == "network") network_inputs(evaluation, out);
  else if (kind == "dna-mixture") mixture_inputs(item, evaluation, appendix_id, out);
  return out;
}

std::string naming_alternative(const std::string& sentence, const std::string& alternative) {
  static const std::regex kHd("\\bHd\\b");
  return std::regex_replace(sentence, kHd, alternative);
}

namespace {

// The blocks of one alternative's part: every paragraph names the alternative; the first
// paragraph's label (or a lead's text, in the appendix) says which alternative the part is about.
void name_part(std::vector<Block>& blocks, const std::string& id, bool label_first) {
  bool first = true;
  for (auto& block : blocks) {
    // A table's words too ("if Hd is true" beside t0_hd, "Under Hd"): each names the alternative.
    if (auto* table = std::get_if<Table>(&block)) {
      for (auto& cell : table->header) cell = naming_alternative(cell, id);
      for (auto& row : table->rows)
        for (auto& cell : row) cell = naming_alternative(cell, id);
      continue;
    }
    auto* p = std::get_if<Paragraph>(&block);
    if (!p) continue;
    p->text = naming_alternative(p->text, id);
    if (p->style == Paragraph::Style::lead) p->text += ", Hp against " + id;
    else if (first && label_first) p->label = p->label.empty() ? "Hp against " + id : p->label + ", Hp against " + id;
    first = false;
  }
}

}  // namespace

ItemInputs item_inputs_by_alternative(const casefile::Item& item, const evaluation::ItemEvaluation& evaluation,
                                      const casefile::Propositions& propositions, const std::string& appendix_id) {
  if (!propositions.has_alternatives() || item.alternative_models.size() != propositions.alternatives.size())
    return item_inputs(item, evaluation, appendix_id);
  ItemInputs out;
  for (std::size_t i = 0; i < propositions.alternatives.size(); ++i) {
    const std::string& id = propositions.alternatives[i].id;
    casefile::Item against = item;
    against.model = item.alternative_models[i];
    evaluation::ItemEvaluation e = evaluation;
    e.point = against.model->evaluate();
    ItemInputs part = item_inputs(against, e, appendix_id);
    name_part(part.body, id, true);
    name_part(part.appendix, id, false);
    name_part(part.recomputation, id, true);
    out.body.insert(out.body.end(), part.body.begin(), part.body.end());
    out.appendix.insert(out.appendix.end(), part.appendix.begin(), part.appendix.end());
    out.recomputation.insert(out.recomputation.end(), part.recomputation.begin(), part.recomputation.end());
  }
  return out;
}

}  // namespace counterpoise::reports

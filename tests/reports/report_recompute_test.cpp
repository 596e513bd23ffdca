// A second scientist's reading of the PDF: for every demo case in both modes, the text that
// pdftotext extracts holds each item's inputs as used, and each item's likelihood ratio recomputed
// here — from the case's own inputs by the published formula, written out independently of the
// program's models — is the value printed, at the printed precision (3 significant figures, the
// rounding policy the report states). Sources of the formulas:
// - Laplace's rule of succession (k + 1)/(n + 2) and the Beta mean a/(a + b): e.g. Jaynes 2003,
//   Probability Theory: The Logic of Science, eq. 18.15 (from memory for the number); the mean of a
//   uniform distribution (a + b)/2 and of a log-uniform one (b − a)/ln(b/a) (common practice).
// - The ratio of mean probabilities as the point LR: Taroni, Bozza, Biedermann & Aitken 2016, Law,
//   Probability and Risk 15:1.
// - DNA: NRC II 1996, The Evaluation of Forensic DNA Evidence, eq. 4.10a/b (θ-corrected match
//   probabilities) and the minimum allele frequency 5/2N (p. 148); relatives k0 P0 + k1 P1 + k2
//   (Fung & Hu 2005, Forensic Science Communications 7(2), Tables 2–3); loci multiply (NRC II 4.2).
// - Continuous: Lindley 1977, Biometrika 64:207 (normal two-level model, exact form); Aitken &
//   Lucy 2004, Applied Statistics 53:109 (kernel between-source density); Silverman 1986, Density
//   Estimation, eq. 3.31 (bandwidth 0.9 min(sd, IQR/1.34) n^(−1/5)); the pooled within-source
//   variance (common practice). Normal densities and quantiles from GSL.
// - Transfer: Evett 1986, J. Forensic Sci. Soc. 26:3 (from memory, as cited in the model):
//   LR = t0 + P0 tn / (P1 Sn γ), and t0 when nothing is found; with a transfer under Hd too the
//   same event tree on both sides, (tn P0 + t0 P1 Sn γ) / (tn_hd P0 + t0_hd P1 Sn γ), and t0 / t0_hd
//   when nothing is found (common practice: the tree's branches written out).
#include <gsl/gsl_randist.h>
#include <gsl/gsl_statistics_double.h>

#include <cctype>
#include <cmath>
#include <map>
#include <regex>

#include "core/numbers/number_text.hpp"
#include "reports/pdf_writer.hpp"
#include "report_test_support.hpp"

using namespace counterpoise;
using namespace counterpoise::reports::testing;
using nlohmann::json;

namespace {

std::string lr_text(double lr) { return numbers::lr_for_readers(numbers::LikelihoodRatio::from_value(lr)); }

// The mean of a probability as the case assigns it.
double assigned_mean(const json& a) {
  if (a.is_number()) return a.get<double>();
  if (a.contains("beta")) return a["beta"][0].get<double>() / (a["beta"][0].get<double>() + a["beta"][1].get<double>());
  if (a.contains("counts")) {
    const double k = a["counts"]["k"].get<double>(), n = a["counts"]["n"].get<double>();
    const double a0 = a["counts"].contains("prior") ? a["counts"]["prior"][0].get<double>() : 1.0;
    const double b0 = a["counts"].contains("prior") ? a["counts"]["prior"][1].get<double>() : 1.0;
    return (k + a0) / (n + a0 + b0);
  }
  const double lo = a["interval"][0].get<double>(), hi = a["interval"][1].get<double>();
  if (a.value("scale", "log") == "linear") return (lo + hi) / 2;
  return (hi - lo) / std::log(hi / lo);
}

// What the reader must find for an assignment: its inputs as entered and, for counts, the rule.
std::vector<std::string> assignment_inputs(const json& a) {
  if (a.is_number()) return {numbers::entered_for_readers(a.get<double>())};
  if (a.contains("beta"))
    return {"Beta(" + numbers::entered_for_readers(a["beta"][0].get<double>()) + ", " +
            numbers::entered_for_readers(a["beta"][1].get<double>()) + ")"};
  if (a.contains("counts")) {
    const auto k = a["counts"]["k"].get<std::int64_t>(), n = a["counts"]["n"].get<std::int64_t>();
    return {numbers::count_for_readers(k) + " of " + numbers::count_for_readers(n),
            "(" + numbers::count_for_readers(k) + " + 1)/(" + numbers::count_for_readers(n) + " + 2)",
            "the rule of succession (Laplace)"};
  }
  return {"between " + numbers::entered_for_readers(a["interval"][0].get<double>()) + " and " +
          numbers::entered_for_readers(a["interval"][1].get<double>())};
}

// Allele frequencies count / 2N from the demo's frequency file, read here on its own.
std::map<std::string, std::map<std::string, double>> frequencies_from_csv(const std::filesystem::path& path, double& two_n) {
  std::map<std::string, std::map<std::string, double>> table;
  std::istringstream in(read_file(path));
  std::string line;
  while (std::getline(in, line)) {
    if (line.empty() || line[0] == '#' || line.rfind("locus,", 0) == 0) continue;
    std::vector<std::string> cells;
    std::stringstream row(line);
    for (std::string cell; std::getline(row, cell, ',');) cells.push_back(cell);
    two_n = 2 * std::stod(cells[3]);
    table[cells[0]][cells[1]] = std::stod(cells[2]) / two_n;
  }
  return table;
}

// NRC II eq. 4.10a/b, and k0 P0 + k1 P1 + k2 for relatives.
double locus_match_probability(bool homozygote, double p, double q, double t, const std::vector<double>& k) {
  const double d = (1 + t) * (1 + 2 * t);
  const double p0 = homozygote ? (2 * t + (1 - t) * p) * (3 * t + (1 - t) * p) / d
                               : 2 * (t + (1 - t) * p) * (t + (1 - t) * q) / d;
  const double p1 = homozygote ? (2 * t + (1 - t) * p) / (1 + t) : (2 * t + (1 - t) * (p + q)) / (2 * (1 + t));
  return k[0] * p0 + k[1] * p1 + k[2];
}

std::vector<double> ibd_of(const std::string& relationship) {
  if (relationship == "full-sibling") return {0.25, 0.5, 0.25};
  if (relationship == "half-sibling") return {0.5, 0.5, 0.0};
  if (relationship == "parent-child") return {0.0, 1.0, 0.0};
  if (relationship == "first-cousin") return {0.75, 0.25, 0.0};
  return {1.0, 0.0, 0.0};
}

double normal(double x, double mean, double variance) { return gsl_ran_gaussian_pdf(x - mean, std::sqrt(variance)); }

double mean_of(const json& values) {
  std::vector<double> v = values.get<std::vector<double>>();
  return gsl_stats_mean(v.data(), 1, v.size());
}

// A reviewer's likelihood ratio for one item, with the input texts that must be printed.
struct Expected {
  std::optional<double> lr;  // nullopt: not recomputed here (networks)
  std::vector<std::string> inputs;
  std::vector<std::string> table_rows;  // text a row of a table must show (pdftotext -layout, spaces collapsed)
};

// `alternative` is the id of one of several alternatives to Hp, or empty for a case with
// Hp and Hd: the values expected for Hp against that alternative.
Expected expected_for(const json& item, const std::filesystem::path& case_dir, const std::string& alternative) {
  Expected e;
  const std::string model = item["model"];
  if (model == "assigned") {
    const json hp = alternative.empty() ? item["p_given_hp"] : item["p_given"]["Hp"];
    const json hd = alternative.empty() ? item["p_given_hd"] : item["p_given"][alternative];
    e.lr = assigned_mean(hp) / assigned_mean(hd);
    for (const json* side : {&hp, &hd})
      for (const auto& text : assignment_inputs(*side)) e.inputs.push_back(text);
  } else if (model == "reported-lr") {
    e.lr = item.contains("lr") ? item["lr"].get<double>() : std::pow(10.0, item["log10_lr"].get<double>());
    if (item.contains("method")) e.inputs.push_back(item["method"].get<std::string>());
  } else if (model == "transfer") {
    // The transfer under Hd (t0_hd, tn_hd) is the item's, or the alternative's entry's.
    const json own = alternative.empty() ? item : item["alternatives"][alternative];
    const auto m = [&](const char* name) { return assigned_mean(item[name]); };
    const bool group = item.value("found", "group") == "group";
    if (own.contains("t0_hd")) {
      const auto hd = [&](const char* name) { return assigned_mean(own[name]); };
      e.lr = group ? (m("tn") * m("p0") + m("t0") * m("p1") * m("sn") * m("gamma")) /
                         (hd("tn_hd") * m("p0") + hd("t0_hd") * m("p1") * m("sn") * m("gamma"))
                   : m("t0") / hd("t0_hd");
      for (const char* name : {"t0_hd", "tn_hd"})
        if (own.contains(name))
          for (const auto& text : assignment_inputs(own[name])) e.inputs.push_back(text);
    } else {
      e.lr = group ? m("t0") + m("p0") * m("tn") / (m("p1") * m("sn") * m("gamma")) : m("t0");
    }
    // The event tree's two branches, printed as the intermediate values P(E|Hp) and P(E|Hd)
    // (6 significant figures) before their ratio.
    const json& hd_side = own.contains("t0_hd") ? own : item;
    const auto hd_mean = [&](const char* name, const char* fallback) {
      return own.contains("t0_hd") ? assigned_mean(hd_side[name]) : (std::string(fallback) == "1" ? 1.0 : 0.0);
    };
    const double background = group ? m("p1") * m("sn") * m("gamma") : 0.0;
    const double p_hp = group ? m("tn") * m("p0") + m("t0") * background : m("t0") * m("p0");
    // Without a transfer under Hd: t0_hd = 1 and tn_hd = 0 (nothing transferred if Hd is true).
    const double p_hd = group ? hd_mean("tn_hd", "0") * m("p0") + hd_mean("t0_hd", "1") * background
                              : hd_mean("t0_hd", "1") * m("p0");
    e.inputs.push_back(" = " + numbers::decimal_for_readers(p_hp, numbers::kWorkingFigures) + " and P(E|");
    e.inputs.push_back(" = " + numbers::decimal_for_readers(p_hd, numbers::kWorkingFigures) + ", so LR = ");
    for (const char* name : {"t0", "tn", "p0", "p1", "sn", "gamma"})
      if (item.contains(name))
        for (const auto& text : assignment_inputs(item[name])) e.inputs.push_back(text);
  } else if (model == "dna-single-source") {
    double two_n = 0;
    const auto table = frequencies_from_csv(case_dir / item["frequencies"]["file"].get<std::string>(), two_n);
    const double floor = 5.0 / two_n;  // NRC II's minimum allele frequency 5/2N
    const double t = item["theta"];
    const auto k = ibd_of(alternative.empty() ? item.value("relationship", "unrelated")
                                                    : item["alternatives"][alternative].value("relationship", "unrelated"));
    double mp = 1;
    for (const auto& [locus, alleles] : item["profile"].items()) {
      if (!table.count(locus)) continue;  // the sex marker
      const std::string a = alleles[0], b = alleles.size() > 1 ? alleles[1].get<std::string>() : a;
      const auto freq = [&](const std::string& allele) {
        const auto it = table.at(locus).find(allele);
        return std::max(it == table.at(locus).end() ? 0.0 : it->second, floor);
      };
      const double locus_mp = locus_match_probability(a == b, freq(a), freq(b), t, k);
      mp *= locus_mp;
      e.inputs.push_back(a + ": " + numbers::entered_for_readers(freq(a)));
      e.table_rows.push_back(numbers::probability_for_readers(std::log10(locus_mp)) + " " + lr_text(1 / locus_mp));
    }
    e.lr = 1 / mp;
    e.inputs.push_back("\u03b8 = " + numbers::entered_for_readers(t));
  } else if (model == "dna-mixture") {
    // Not recomputed here (the drop-out average needs the full semi-continuous sum); the inputs a
    // reviewer needs are checked: each observed allele's frequency from the table, read here on
    // its own, with NRC II's 5/2N floor; θ, the drop-in probability and the drop-out assessment.
    double two_n = 0;
    const auto table = frequencies_from_csv(case_dir / item["frequencies"]["file"].get<std::string>(), two_n);
    const double floor = 5.0 / two_n;
    for (const auto& [locus, alleles] : item["observed"].items()) {
      if (!table.count(locus)) continue;  // the sex marker
      for (const auto& allele : alleles) {
        const auto it = table.at(locus).find(allele.get<std::string>());
        const double p = std::max(it == table.at(locus).end() ? 0.0 : it->second, floor);
        e.inputs.push_back(allele.get<std::string>() + ": " + numbers::entered_for_readers(p));
      }
    }
    e.inputs.push_back("\u03b8 = " + numbers::entered_for_readers(item["theta"].get<double>()));
    e.inputs.push_back("drop-in probability is " + numbers::entered_for_readers(item["dropin"].get<double>()));
    for (const auto& text : assignment_inputs(item["dropout"])) e.inputs.push_back(text);
  } else if (model == "continuous-two-level") {
    const double xbar = mean_of(item["control"]), ybar = mean_of(item["recovered"]);
    const double m = item["control"].size(), n = item["recovered"].size();
    double sigma = 0;
    if (item.contains("within_sd")) {
      sigma = item["within_sd"];
    } else {  // pooled within-group variance of the replicate groups
      double squares = 0, df = 0;
      for (const auto& group : item["within_replicates"]) {
        std::vector<double> v = group.get<std::vector<double>>();
        squares += gsl_stats_variance(v.data(), 1, v.size()) * (v.size() - 1.0);
        df += v.size() - 1.0;
      }
      sigma = std::sqrt(squares / df);
    }
    const double a = sigma * sigma / m, b = sigma * sigma / n, w = (b * xbar + a * ybar) / (a + b);
    for (const auto& v : item["control"]) e.inputs.push_back(numbers::entered_for_readers(v.get<double>()));
    for (const auto& v : item["recovered"]) e.inputs.push_back(numbers::entered_for_readers(v.get<double>()));
    const json& population = item["population"];
    if (population.contains("normal")) {
      const double mu = population["normal"]["mean"], tau2 = std::pow(population["normal"]["sd"].get<double>(), 2);
      e.lr = normal(xbar - ybar, 0, a + b) * normal(w, mu, tau2 + a * b / (a + b)) /
             (normal(xbar, mu, tau2 + a) * normal(ybar, mu, tau2 + b));
    } else {
      std::vector<double> z;
      std::istringstream in(read_file(case_dir / population["kde"]["file"].get<std::string>()));
      std::string line;
      std::size_t column = 0;
      bool header = false;
      while (std::getline(in, line)) {
        if (line.empty() || line[0] == '#') continue;
        std::vector<std::string> cells;
        std::stringstream row(line);
        for (std::string cell; std::getline(row, cell, ',');) cells.push_back(cell);
        if (!header) {
          column = std::find(cells.begin(), cells.end(), population["kde"]["column"].get<std::string>()) - cells.begin();
          header = true;
          continue;
        }
        z.push_back(std::stod(cells[column]));
      }
      std::sort(z.begin(), z.end());
      const double sd = gsl_stats_sd(z.data(), 1, z.size());
      const double iqr = gsl_stats_quantile_from_sorted_data(z.data(), 1, z.size(), 0.75) -
                         gsl_stats_quantile_from_sorted_data(z.data(), 1, z.size(), 0.25);
      const double h = 0.9 * std::min(sd, iqr / 1.34) * std::pow(static_cast<double>(z.size()), -0.2);
      const auto f = [&](double x, double variance) {
        double sum = 0;
        for (double zi : z) sum += normal(x, zi, variance);
        return sum / static_cast<double>(z.size());
      };
      e.lr = normal(xbar - ybar, 0, a + b) * f(w, h * h + a * b / (a + b)) / (f(xbar, h * h + a) * f(ybar, h * h + b));
    }
  }
  return e;
}

std::string layout_text(const std::filesystem::path& pdf) {
  const auto r = run("pdftotext -layout -enc UTF-8 " + quoted(pdf) + " -");
  REQUIRE(r.exit_code == 0);
  std::string out;
  for (char c : r.output) {
    const char d = c == '\n' || c == '\f' ? ' ' : c;
    if (d == ' ' && !out.empty() && out.back() == ' ') continue;
    out += d;
  }
  return out;
}

// True when `number` occurs in `text` as a whole number: not the tail of a longer one ("9 × 10¹⁸"
// inside "4.49 × 10¹⁸") and followed by a space or a full stop.
bool occurs_as_number(const std::string& text, const std::string& number) {
  for (auto at = text.find(number); at != std::string::npos; at = text.find(number, at + 1)) {
    const char before = at == 0 ? ' ' : text[at - 1];
    const char after = at + number.size() < text.size() ? text[at + number.size()] : ' ';
    const bool starts = !std::isdigit(static_cast<unsigned char>(before)) && before != '.';
    if (starts && (after == ' ' || after == '.')) return true;
  }
  return false;
}

}  // namespace

TEST_CASE("recompute: every item's inputs are printed and its LR recomputes to the printed value") {
  ensure_gui();
  const auto dir = temp_dir("recompute");
  for (const auto& path : demo_cases()) {
    const auto document = json::parse(read_file(path));
    const auto value = load_case(path);
    const auto result = evaluation::evaluate_case(value);
    for (const auto mode : {reports::ReportMode::casework, reports::ReportMode::training}) {
      INFO(path.filename() << " " << reports::report_mode_name(mode));
      const auto model = reports::build_report_model(value, result, mode);
      const auto pdf = dir / (path.stem().string() + "-" + std::string(reports::report_mode_name(mode)) + ".pdf");
      write_file(pdf, reports::render_pdf(model).bytes);
      const std::string text = pdf_text(pdf);
      const std::string layout = layout_text(pdf);

      // Court typography and no program-internal words.
      CHECK(text.find('^') == std::string::npos);
      for (const char* internal : {"reported-lr", "continuous-two-level", "dna-single-source", "lattice convolution",
                                   "Monte Carlo", "one of 2.00", "e-0", "e+0", "Illustration: Illustration"})
        CHECK(text.find(internal) == std::string::npos);
      // No number with the last bits of binary arithmetic ("Q: 0.3560000000000001"): no value the
      // report prints has more than 8 decimals (6 significant figures from 0.001 up, below that
      // a power of ten).
      CHECK_FALSE(std::regex_search(text, std::regex("[0-9]\\.[0-9]{9,}")));
      // Every whole number of five digits or more has its digits grouped ("100 000 draws", never
      // "100000"); a run of digits inside a hexadecimal digest touches a letter and is not one.
      {
        std::smatch ungrouped;
        const bool found = std::regex_search(text, ungrouped, std::regex("(^|[^0-9A-Za-z.])[0-9]{5,}($|[^0-9A-Za-z])"));
        INFO("ungrouped number: " << (found ? ungrouped.str() : std::string()));
        CHECK_FALSE(found);
      }
      CHECK_FALSE(std::regex_search(text, std::regex("(^|[ (])-[0-9]")));  // a minus is U+2212, never a hyphen
      // A divisor written with a power of ten is bracketed: "1 / (1.13 × 10⁻¹⁹)", never "1 / 1.13 × 10⁻¹⁹",
      // which a calculator reads as (1 / 1.13) × 10⁻¹⁹ (common practice: operator precedence).
      CHECK_FALSE(std::regex_search(text, std::regex("/ ?[0-9][0-9.]* \u00d7")));
      // A sentence with a part left out ("P0 is , with θ") shows as a space before a comma.
      CHECK(text.find(" ,") == std::string::npos);
      CHECK(text.find("rounded to 3 significant figures") != std::string::npos);
      CHECK(text.find("Counterpoise " COUNTERPOISE_VERSION) != std::string::npos);
      CHECK(text.find(model.header.digest) != std::string::npos);

      // Every item against every alternative (one "alternative", empty, for Hp and Hd): the
      // report recomputes each, so each LR is checked from the printed inputs.
      const auto& propositions = document["propositions"];
      std::vector<std::string> alternatives{""};
      if (propositions.contains("alternatives")) {
        alternatives.clear();
        for (const auto& a : propositions["alternatives"]) alternatives.push_back(a["id"]);
      }
      for (const auto& item : document["items"]) {
        const std::string id = item["id"];
        for (const auto& alternative : alternatives) {
          INFO("item " << id << " against " << (alternative.empty() ? "Hd" : alternative));
          const auto e = expected_for(item, path.parent_path(), alternative);
          for (const auto& input : e.inputs) {
            INFO(input);
            CHECK(text.find(as_extracted(input)) != std::string::npos);
          }
          for (const auto& row : e.table_rows) {
            INFO(row);
            CHECK(layout.find(as_extracted(row)) != std::string::npos);
          }
          if (e.lr) {
            // The recomputation appendix ends each item's calculation with "= LR.", and the
            // findings table shows the same text.
            const std::string printed = lr_text(*e.lr);
            INFO("recomputed LR " << *e.lr << " printed as " << printed);
            CHECK(text.find(as_extracted("= " + printed + ".")) != std::string::npos);
          }
        }
      }
    }
  }
}

TEST_CASE("recompute: one quantity, one text — the combined LR is written alike wherever it appears") {
  for (const auto& path : demo_cases()) {
    INFO(path.filename());
    const auto value = load_case(path);
    const auto result = evaluation::evaluate_case(value);
    const auto model = reports::build_report_model(value, result, reports::ReportMode::casework);
    const std::string combined = numbers::lr_for_readers(result.combined.lr);
    // The evaluation's sentence, the contribution table's last running total and the
    // recomputation appendix all carry the same text (the fibres report once said 200 and 190).
    CHECK(section_text(model, "evaluation").find(combined) != std::string::npos);
    CHECK(section_text(model, "recomputation").find("LR = " + combined + ".") != std::string::npos);
    const auto* contribution = model.find("contribution");
    REQUIRE(contribution);
    for (const auto& block : contribution->blocks)
      if (const auto* table = std::get_if<reports::Table>(&block); table && !table->rows.empty() && result.combined.lr.is_finite())
        CHECK(table->rows.back().back() == combined);
    // The prior odds at which the posterior reaches one half are 1 / LR, written with the LR's text.
    if (result.combined.lr.is_finite() && result.combined.lr.log10() > 0)
      CHECK(section_text(model, "sensitivity").find("P(Hp|E) would reach 0.5 from prior odds of about 1 to " + combined) !=
            std::string::npos);
    // No other precision of the combined LR appears anywhere (2 × 10⁶ and 2.3 × 10⁶ beside 2.27 × 10⁶).
    const std::string all = all_text(model);
    if (result.combined.lr.is_finite() && std::abs(result.combined.lr.log10()) >= 6)
      for (int figures : {1, 2, 4}) {
        char buffer[32];
        std::snprintf(buffer, sizeof buffer, "%.*e", figures - 1, std::pow(10.0, result.combined.lr.log10()));
        const std::string mantissa = std::string(buffer).substr(0, std::string(buffer).find('e'));
        const std::string other = mantissa + " \u00d7 " +
                                  numbers::power_of_ten_text(static_cast<int>(std::floor(result.combined.lr.log10())));
        if (combined.rfind(other, 0) == 0 && combined.size() == other.size()) continue;
        INFO(other);
        CHECK_FALSE(occurs_as_number(all, other));
      }
  }
}

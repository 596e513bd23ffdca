// The bound on one factor of a network's calculation (core/models/network/factor_limit.hpp,
// docs/file-formats.md "Limits"): a densely connected network is refused before any factor is
// built, naming the item, the field, the factor's nodes and size, the limit and how to raise it;
// a network whose largest factor is exactly at the limit is evaluated, and its LR equals the sum
// over every configuration of the product of the CPTs (the factorisation of a Bayesian network,
// Pearl 1988, Probabilistic Reasoning in Intelligent Systems, section 3.3 — from memory for the
// section), enumerated here without elimination.
#include <catch2/catch.hpp>

#include <cmath>
#include <string>
#include <vector>

#include "core/models/network/factor_limit.hpp"
#include "core/validation/input_error.hpp"
#include "network_test_support.hpp"
#include "tests/core/scoped_environment.hpp"

using Catch::Matchers::Contains;
using counterpoise::models::network::factor_limit_entries;
using counterpoise::models::network::kDefaultFactorLimitBytes;
using counterpoise::models::network::kFactorLimitVariable;
using counterpoise::validation::InvalidValue;
using nlohmann::json;
using network_test::read_model;
using test_support::ScopedEnvironment;

namespace {

// P(C_ij = yes | A_i = a, A_j = b): the findings depend on whether the two causes agree.
double p_agree(int a, int b) { return a == b ? 0.7 : 0.2; }
// P(A_1 = 1 | H) and P(A_i = 1) for the other causes.
constexpr double kA1GivenHp = 0.9, kA1GivenHd = 0.3, kOtherA = 0.4;

// k binary causes A1..Ak (A1 a child of the proposition H, the others roots) and an observed
// finding C_i_j = yes for every pair i < j, with parents A_i and A_j. Every CPT has at most 4
// rows, but the findings join every pair of causes, so summing out any cause first forms a
// factor over all k of them: exactly 2^k entries (min-fill takes A2, whose neighbours are the
// other causes, at no fill; each later step is smaller).
json all_pairs_network(int k) {
  json nodes = json::array();
  nodes.push_back({{"name", "H"}, {"states", {"hp", "hd"}}, {"cpt", {{0.5, 0.5}}}});
  for (int i = 1; i <= k; ++i) {
    const std::string name = "A" + std::to_string(i);
    if (i == 1)
      nodes.push_back({{"name", name}, {"states", {"0", "1"}}, {"parents", {"H"}},
                       {"cpt", {{1 - kA1GivenHp, kA1GivenHp}, {1 - kA1GivenHd, kA1GivenHd}}}});
    else
      nodes.push_back({{"name", name}, {"states", {"0", "1"}}, {"cpt", {{1 - kOtherA, kOtherA}}}});
  }
  json observed = json::object();
  for (int i = 1; i <= k; ++i)
    for (int j = i + 1; j <= k; ++j) {
      const std::string name = "C" + std::to_string(i) + "_" + std::to_string(j);
      json cpt = json::array();
      for (int a = 0; a < 2; ++a)
        for (int b = 0; b < 2; ++b) cpt.push_back({p_agree(a, b), 1 - p_agree(a, b)});
      nodes.push_back({{"name", name},
                       {"states", {"yes", "no"}},
                       {"parents", {"A" + std::to_string(i), "A" + std::to_string(j)}},
                       {"cpt", cpt}});
      observed[name] = "yes";
    }
  return {{"id", "N1"}, {"model", "network"}, {"nodes", nodes},
          {"proposition", {{"node", "H"}, {"hp", "hp"}, {"hd", "hd"}}}, {"observed", observed}};
}

// log10 P(all C = yes | H) by enumerating the 2^k configurations of the causes.
double log10_p_findings(int k, double p_a1) {
  double total = 0.0;
  for (unsigned long config = 0; config < (1ul << k); ++config) {
    const auto bit = [&](int i) { return static_cast<int>((config >> (i - 1)) & 1u); };
    double p = bit(1) ? p_a1 : 1 - p_a1;
    for (int i = 2; i <= k; ++i) p *= bit(i) ? kOtherA : 1 - kOtherA;
    for (int i = 1; i <= k; ++i)
      for (int j = i + 1; j <= k; ++j) p *= p_agree(bit(i), bit(j));
    total += p;
  }
  return std::log10(total);
}

}  // namespace

TEST_CASE("the default factor limit is 128 MiB of values", "[network][limits]") {
  CHECK(kDefaultFactorLimitBytes == 128ull * 1024 * 1024);
  CHECK(factor_limit_entries() == (std::size_t{1} << 24));
}

TEST_CASE("a densely connected network is refused before any factor is built", "[network][limits]") {
  // 29 causes: 2^29 entries (4 GiB of values) for the first product, as the hostile case asked.
  const json item = all_pairs_network(29);
  CHECK(item.dump().size() < 64 * 1024);  // a small file
  CHECK_THROWS_AS(read_model(item), InvalidValue);
  CHECK_THROWS_WITH(read_model(item),
                    Contains("item N1, field nodes") && Contains("needs a table (factor) over 29 nodes (A1, A2, A3") &&
                        Contains("and 17 more") && Contains("5.37 × 10⁸ entries") && Contains("4\u202f100 MiB") &&
                        Contains("more than the limit of 16\u202f777\u202f216 entries (128 MiB)") &&
                        Contains("raise the limit with COUNTERPOISE_NETWORK_FACTOR_LIMIT_MIB (in MiB)"));
}

TEST_CASE("a network whose largest factor is at the limit is evaluated exactly", "[network][limits]") {
  // 1 MiB holds 2^17 values: 17 causes need exactly that, 18 need twice as much.
  const ScopedEnvironment one_mib(kFactorLimitVariable, "1");
  CHECK(factor_limit_entries() == (std::size_t{1} << 17));
  CHECK_THROWS_WITH(read_model(all_pairs_network(18)),
                    Contains("over 18 nodes") && Contains("262\u202f000 entries") &&
                        Contains("limit of 131\u202f072 entries (1 MiB)"));
  const auto model = read_model(all_pairs_network(17));
  const auto result = model->evaluate();
  CHECK(result.detail.at("largest_factor_size").get<std::size_t>() == (std::size_t{1} << 17));
  // Enumeration and elimination add the same 2^17 positive terms in different orders; 1e-9 in
  // log10 is far above the rounding of either sum.
  CHECK(*result.log10_p_given_hp == Approx(log10_p_findings(17, kA1GivenHp)).margin(1e-9));
  CHECK(*result.log10_p_given_hd == Approx(log10_p_findings(17, kA1GivenHd)).margin(1e-9));
}

TEST_CASE("a CPT with more rows than any integer holds is refused, not wrapped to zero rows", "[network][limits]") {
  // 64 binary parents give 2^64 rows, which a 64-bit count wraps to 0: an empty CPT once passed.
  json nodes = json::array();
  nodes.push_back({{"name", "H"}, {"states", {"hp", "hd"}}, {"cpt", {{0.5, 0.5}}}});
  json parents = json::array();
  for (int i = 1; i <= 64; ++i) {
    nodes.push_back({{"name", "R" + std::to_string(i)}, {"states", {"y", "n"}}, {"cpt", {{0.5, 0.5}}}});
    parents.push_back("R" + std::to_string(i));
  }
  parents.push_back("H");
  nodes.push_back({{"name", "F"}, {"states", {"y", "n"}}, {"parents", parents}, {"cpt", json::array()}});
  const json item = {{"id", "N1"}, {"model", "network"}, {"nodes", nodes},
                     {"proposition", {{"node", "H"}, {"hp", "hp"}, {"hd", "hd"}}}, {"observed", {{"F", "y"}}}};
  CHECK_THROWS_WITH(read_model(item), Contains("item N1, field nodes.F.cpt") &&
                                          Contains("node F's CPT would be a table") && Contains("over 66 nodes") &&
                                          Contains("COUNTERPOISE_NETWORK_FACTOR_LIMIT_MIB"));
}

TEST_CASE("a factor limit that is not a whole number of MiB is refused, naming the variable", "[network][limits]") {
  for (const char* value : {"abc", "0", "-5", "1e3", "128MiB"}) {
    const ScopedEnvironment given(kFactorLimitVariable, value);
    CHECK_THROWS_AS(factor_limit_entries(), InvalidValue);
    CHECK_THROWS_WITH(factor_limit_entries(), Contains("COUNTERPOISE_NETWORK_FACTOR_LIMIT_MIB"));
    CHECK_THROWS_WITH(read_model(network_test::burglary_network()), Contains("COUNTERPOISE_NETWORK_FACTOR_LIMIT_MIB"));
  }
}

#include "core/evaluation/joint_monte_carlo.hpp"

#include <exception>
#include <thread>

#include "core/evaluation/case_evaluation.hpp"
#include "core/numbers/vector_state.hpp"

namespace counterpoise::evaluation {

namespace {

// Adds the draws of each item in `items` into `sum`, in order, through `buffer`.
void add_item_draws(const casefile::Case& value, std::span<const std::size_t> items, std::uint64_t seed,
                    std::vector<double>& sum, std::vector<double>& buffer) {
  for (std::size_t index : items) {
    auto rng = item_generator(seed, index);
    value.items[index].model->draw_log10_lr(rng, buffer);
    for (std::size_t k = 0; k < sum.size(); ++k) sum[k] += buffer[k];
  }
}

}  // namespace

std::vector<double> joint_log10_lr_draws(const casefile::Case& value, std::span<const std::size_t> item_indices,
                                         unsigned threads) {
  const auto settings = value.uncertainty_or_default();
  const auto draws = static_cast<std::size_t>(settings.draws_or_default());
  const std::uint64_t seed = settings.seed_or_default();
  const std::size_t half = item_indices.size() / 2;
  const auto first = item_indices.first(half), second = item_indices.subspan(half);
  if (threads == 0) threads = std::thread::hardware_concurrency() >= 2 ? 2 : 1;

  std::vector<double> first_sum(draws, 0.0), second_sum(draws, 0.0);
  std::vector<double> first_buffer(draws), second_buffer(draws);
  if (threads >= 2 && !first.empty()) {
    std::exception_ptr failure;
    {
      // jthread joins on every way out of this block, also when the first half throws.
      std::jthread worker([&] {
        numbers::clear_upper_vector_state();
        try {
          add_item_draws(value, second, seed, second_sum, second_buffer);
        } catch (...) {
          failure = std::current_exception();
        }
      });
      add_item_draws(value, first, seed, first_sum, first_buffer);
    }
    if (failure) std::rethrow_exception(failure);
  } else {
    add_item_draws(value, first, seed, first_sum, first_buffer);
    add_item_draws(value, second, seed, second_sum, second_buffer);
  }
  for (std::size_t k = 0; k < draws; ++k) first_sum[k] += second_sum[k];
  return first_sum;
}

}  // namespace counterpoise::evaluation

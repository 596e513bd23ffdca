#include "app/editor/spread_runner.hpp"

#include <QtConcurrent/QtConcurrentRun>

#include <chrono>

namespace counterpoise::editor {

SpreadRunner::SpreadRunner(QObject* parent) : QObject(parent) {
  connect(&watcher_, &QFutureWatcher<SpreadResult>::finished, this, &SpreadRunner::onRunFinished);
}

SpreadRunner::~SpreadRunner() { watcher_.waitForFinished(); }

void SpreadRunner::request(std::uint64_t generation, std::optional<casefile::Case> value) {
  latest_ = generation;
  if (!value) {
    waiting_.reset();
    if (!running_) {
      delivered_ = generation;
      SpreadResult empty;
      empty.generation = generation;
      emit finished(empty);
    }
    return;
  }
  if (running_) {
    waiting_.emplace(generation, std::move(*value));
    return;
  }
  start(generation, std::move(*value));
}

void SpreadRunner::start(std::uint64_t generation, casefile::Case value) {
  running_ = true;
  watcher_.setFuture(QtConcurrent::run([generation, value = std::move(value)]() {
    SpreadResult result;
    result.generation = generation;
    const auto begin = std::chrono::steady_clock::now();
    try {
      result.evaluation = evaluation::evaluate_case(value);
    } catch (const std::exception& error) {
      result.problem = error.what();
    }
    result.milliseconds = std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - begin).count();
    return result;
  }));
}

void SpreadRunner::onRunFinished() {
  running_ = false;
  SpreadResult result = watcher_.result();
  if (waiting_) {
    auto next = std::move(*waiting_);
    waiting_.reset();
    start(next.first, std::move(next.second));
  } else if (result.generation != latest_) {
    // The latest request had nothing to evaluate: deliver an empty result for it.
    SpreadResult empty;
    empty.generation = latest_;
    delivered_ = latest_;
    emit finished(empty);
    return;
  }
  if (result.generation == latest_) {
    delivered_ = latest_;
    emit finished(result);
  }
}

}  // namespace counterpoise::editor

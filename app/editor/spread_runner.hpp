#pragma once
// Runs the core's full evaluation (uncertainty by lattice convolution or Monte Carlo, and the
// prior sweep) off the GUI thread. Each request carries a generation number; at most one run is
// in flight, a newer request replaces any waiting one, and a result whose generation is no longer
// the latest is dropped, so a burst of typing costs at most one stale run.

#include <QFutureWatcher>
#include <QObject>

#include <cstdint>
#include <optional>
#include <string>

#include "core/casefile/case_model.hpp"
#include "core/evaluation/case_evaluation.hpp"

namespace counterpoise::editor {

struct SpreadResult {
  std::uint64_t generation = 0;
  std::optional<evaluation::CaseEvaluation> evaluation;  // absent until a run finished, or on error
  std::string problem;                                   // the core's message when the run threw
  double milliseconds = 0.0;                             // how long the run took
};

class SpreadRunner : public QObject {
  Q_OBJECT
 public:
  explicit SpreadRunner(QObject* parent = nullptr);
  ~SpreadRunner() override;

  // Asks for an evaluation of `value` as generation `generation` (increasing). nullopt: nothing to
  // evaluate (the result is empty for that generation).
  void request(std::uint64_t generation, std::optional<casefile::Case> value);
  // The latest generation requested and whether its result has been delivered.
  std::uint64_t latestGeneration() const { return latest_; }
  bool idle() const { return delivered_ == latest_; }

 signals:
  void finished(const counterpoise::editor::SpreadResult& result);

 private:
  void start(std::uint64_t generation, casefile::Case value);
  void onRunFinished();

  QFutureWatcher<SpreadResult> watcher_;
  bool running_ = false;
  std::uint64_t latest_ = 0, delivered_ = 0;
  std::optional<std::pair<std::uint64_t, casefile::Case>> waiting_;
};

}  // namespace counterpoise::editor

Q_DECLARE_METATYPE(counterpoise::editor::SpreadResult)

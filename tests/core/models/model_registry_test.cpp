// The table of models: every model reads its inputs per alternative to Hp, so neither the case
// reader nor the comparison has a path for a model that cannot (they call the reader unchecked).
#include <catch2/catch.hpp>

#include <string>

#include "core/models/model_registry.hpp"

using namespace counterpoise;

TEST_CASE("every model in the registry reads its inputs per alternative", "[models][alternatives]") {
  // common practice: a table row added without its reader must fail here, not crash a reader.
  REQUIRE_FALSE(models::all_models().empty());
  for (const auto& entry : models::all_models()) {
    INFO("model " << std::string(entry.name));
    CHECK(entry.read_alternatives != nullptr);
    CHECK(models::find_model(entry.name) == &entry);
  }
}

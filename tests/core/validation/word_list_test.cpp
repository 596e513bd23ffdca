// A list in running text, as the reports and messages write it: commas between the items and
// "and" before the last, no comma before "and" (common practice in British usage, which the
// reports follow).
#include <catch2/catch.hpp>

#include "core/validation/word_list.hpp"

using counterpoise::validation::list_in_words;

TEST_CASE("list in words: none, one, two and three items") {
  CHECK(list_in_words({}).empty());
  CHECK(list_in_words({"Hd1"}) == "Hd1");
  CHECK(list_in_words({"Hd1", "Hd2"}) == "Hd1 and Hd2");
  CHECK(list_in_words({"Hd1", "Hd2", "Hd3"}) == "Hd1, Hd2 and Hd3");
  CHECK(list_in_words({"Mr Dray", "Ms Venn", "1 unknown person"}) == "Mr Dray, Ms Venn and 1 unknown person");
}

// The examiner's declared name and where the command line and the editor find it configured.
#include "core/store/examiner.hpp"

#include <cstdlib>
#include <fstream>

#include <catch2/catch.hpp>

#include "core/validation/input_error.hpp"
#include "tests/core/scoped_environment.hpp"
#include "tests/core/store/store_test_support.hpp"

using namespace counterpoise::store;
using Catch::Matchers::Contains;
using counterpoise::validation::FileError;
using counterpoise::validation::InvalidValue;
using test_support::ScopedEnvironment;

TEST_CASE("an examiner's name is kept without surrounding white space", "[store][examiner]") {
  CHECK(ExaminerName("  Dr Imogen Thwaite \t").text() == "Dr Imogen Thwaite");
  CHECK(ExaminerName("Dr Ifan Llŷr").text() == "Dr Ifan Llŷr");  // UTF-8 beyond ASCII is a name
  CHECK(ExaminerName("Dr Owen Pryce") == ExaminerName(" Dr Owen Pryce"));
}

TEST_CASE("a name that is empty, too long, not UTF-8 or holds control characters is refused",
          "[store][examiner]") {
  CHECK_THROWS_WITH(ExaminerName(""), Contains("no examiner's name"));
  CHECK_THROWS_WITH(ExaminerName(" \t "), Contains("no examiner's name"));
  CHECK_THROWS_WITH(ExaminerName(std::string(kMaxExaminerNameBytes + 1, 'a')),
                    Contains("longer than 200 bytes"));
  CHECK_NOTHROW(ExaminerName(std::string(kMaxExaminerNameBytes, 'a')));
  CHECK_THROWS_WITH(ExaminerName("Dr \xff Pryce"), Contains("not valid UTF-8"));
  // A terminal title sequence (ESC ] 0 ; ... BEL), a line break, DEL and a C1 control (U+009B).
  CHECK_THROWS_WITH(ExaminerName("Dr \x1b]0;owned\x07 Pryce"), Contains("control character"));
  CHECK_THROWS_WITH(ExaminerName("Dr Owen\nPryce"), Contains("control character"));
  CHECK_THROWS_WITH(ExaminerName("Dr \x7f Pryce"), Contains("control character"));
  CHECK_THROWS_WITH(ExaminerName("Dr \xc2\x9b Pryce"), Contains("control character"));
  try {
    ExaminerName("");
  } catch (const InvalidValue& e) {
    CHECK(e.where().item == "examiner");
    CHECK(e.where().field == "name");
  }
}

TEST_CASE("the configured name comes from COUNTERPOISE_EXAMINER, else the settings file",
          "[store][examiner]") {
  store_test::TempDir dir;
  ScopedEnvironment config("COUNTERPOISE_CONFIG_DIR", dir.path().c_str());
  CHECK(examiner_settings_file() == dir / "examiner");
  {
    ScopedEnvironment name("COUNTERPOISE_EXAMINER", nullptr);
    CHECK_FALSE(configured_examiner_name().has_value());  // no variable, no file
    store_test::write_bytes(dir / "examiner", "Dr Owen Pryce\nsecond line ignored\n");
    REQUIRE(configured_examiner_name().has_value());
    CHECK(configured_examiner_name()->text() == "Dr Owen Pryce");
    store_test::write_bytes(dir / "examiner", "");
    CHECK_FALSE(configured_examiner_name().has_value());
    store_test::write_bytes(dir / "examiner", "Dr \x1b[2J Pryce\n");
    CHECK_THROWS_WITH(configured_examiner_name(), Contains("control character"));
    store_test::write_bytes(dir / "examiner", std::string(5000, 'a'));
    CHECK_THROWS_AS(configured_examiner_name(), FileError);
  }
  {
    ScopedEnvironment name("COUNTERPOISE_EXAMINER", "Dr Imogen Thwaite");
    CHECK(configured_examiner_name()->text() == "Dr Imogen Thwaite");  // before the file
  }
  {
    ScopedEnvironment name("COUNTERPOISE_EXAMINER", "\x1b[2J");
    CHECK_THROWS_WITH(configured_examiner_name(), Contains("COUNTERPOISE_EXAMINER"));
  }
}

TEST_CASE("the operating-system account is the system's name for this process's user",
          "[store][examiner]") {
  // getpwuid is the system's answer; the environment ($USER) is not consulted.
  ScopedEnvironment user("USER", "someone-else");
  CHECK_FALSE(operating_system_account().empty());
  CHECK(operating_system_account() != "someone-else");
}

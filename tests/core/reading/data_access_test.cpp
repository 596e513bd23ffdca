// Which files a case may make the program read (docs/file-formats.md, "Trust model"): the case's
// folder and the configured laboratory data folders, after symbolic links are resolved; anything
// else only when the user allows it for the run. Paths are compared after resolution as POSIX
// realpath(3) does (IEEE Std 1003.1-2017), which std::filesystem::weakly_canonical follows.
#include "core/reading/data_access.hpp"

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <string>
#include <vector>

#include <unistd.h>

#include <catch2/catch.hpp>

#include "core/validation/input_error.hpp"

using counterpoise::reading::locate_data_file;
using counterpoise::validation::FileError;
using counterpoise::validation::Location;
namespace fs = std::filesystem;
namespace reading = counterpoise::reading;

namespace {

// A fresh folder tree: case/ (the case's folder, with data.csv) and lab/ and elsewhere/ beside it.
// The run's permissions are reset before and after, so each test starts from the default rules.
struct Tree {
  fs::path root = fs::temp_directory_path() / ("counterpoise-access-" + std::to_string(::getpid()));
  fs::path case_folder = root / "case";
  fs::path lab = root / "lab";
  fs::path elsewhere = root / "elsewhere";
  Tree() {
    reading::reset_data_permissions();
    fs::remove_all(root);
    for (const auto& folder : {case_folder, lab, elsewhere}) fs::create_directories(folder);
    for (const auto& file : {case_folder / "data.csv", lab / "alleles.csv", elsewhere / "secret.txt"})
      std::ofstream(file) << "a,b\n1,2\n";
  }
  ~Tree() {
    reading::reset_data_permissions();
    fs::remove_all(root);
  }
  Tree(const Tree&) = delete;
  Tree& operator=(const Tree&) = delete;
};

const Location kField{"D1", "frequencies.file"};

// The message of the FileError locate_data_file throws, or "" when it does not throw.
std::string refusal(const fs::path& case_folder, const std::string& name) {
  try {
    locate_data_file(case_folder, name, kField);
  } catch (const FileError& error) {
    CHECK(error.where().item == "D1");
    CHECK(error.where().field == "frequencies.file");
    return error.what();
  }
  return "";
}

}  // namespace

TEST_CASE("a file inside the case's folder is read, named relatively or absolutely", "[reading][access]") {
  const Tree tree;
  const auto data = fs::canonical(tree.case_folder / "data.csv");
  CHECK(locate_data_file(tree.case_folder, "data.csv", kField) == data);
  CHECK(locate_data_file(tree.case_folder, (tree.case_folder / "data.csv").string(), kField) == data);
  CHECK(locate_data_file(tree.case_folder, "./sub/../data.csv", kField) == data);
}

TEST_CASE("a path that climbs out, an absolute path elsewhere and a link pointing out are refused", "[reading][access]") {
  const Tree tree;
  const std::string climbing = refusal(tree.case_folder, "../elsewhere/secret.txt");
  CHECK_THAT(climbing, Catch::Contains("item D1, field frequencies.file: '../elsewhere/secret.txt'"));
  CHECK_THAT(climbing, Catch::Contains("lies outside the case's folder"));
  CHECK_THAT(climbing, Catch::Contains("--allow-data-outside"));
  CHECK_THAT(refusal(tree.case_folder, "/etc/passwd"), Catch::Contains("'/etc/passwd' lies outside"));
  CHECK_THAT(refusal(tree.case_folder, "/proc/self/environ"), Catch::Contains("lies outside"));
  // A folder whose name starts like the case folder's is not inside it.
  fs::create_directories(tree.root / "case-other");
  std::ofstream(tree.root / "case-other" / "x.csv") << "a\n";
  CHECK_THAT(refusal(tree.case_folder, "../case-other/x.csv"), Catch::Contains("lies outside"));

  fs::create_symlink(tree.elsewhere / "secret.txt", tree.case_folder / "innocent.csv");
  CHECK_THAT(refusal(tree.case_folder, "innocent.csv"),
             Catch::Contains("which leads to '" + fs::canonical(tree.elsewhere / "secret.txt").string()));
  fs::create_directory_symlink(tree.elsewhere, tree.case_folder / "more");
  CHECK_THAT(refusal(tree.case_folder, "more/secret.txt"), Catch::Contains("lies outside"));
}

TEST_CASE("a link that stays inside the folder, and a case folder reached through a link, are fine", "[reading][access]") {
  const Tree tree;
  fs::create_symlink(tree.case_folder / "data.csv", tree.case_folder / "alias.csv");
  CHECK(locate_data_file(tree.case_folder, "alias.csv", kField) == fs::canonical(tree.case_folder / "data.csv"));
  fs::create_directory_symlink(tree.case_folder, tree.root / "linked-case");
  CHECK(locate_data_file(tree.root / "linked-case", "data.csv", kField) == fs::canonical(tree.case_folder / "data.csv"));
}

TEST_CASE("a laboratory data folder, a folder or file allowed for the run, or every file when the user says so", "[reading][access]") {
  const Tree tree;
  const std::string lab_file = (tree.lab / "alleles.csv").string();
  CHECK_THAT(refusal(tree.case_folder, lab_file), Catch::Contains("lies outside"));
  ::setenv(reading::kDataFoldersVariable, tree.lab.c_str(), 1);
  CHECK(locate_data_file(tree.case_folder, lab_file, kField) == fs::canonical(lab_file));
  ::unsetenv(reading::kDataFoldersVariable);

  reading::allow_folder_for_this_run(tree.lab);
  CHECK(locate_data_file(tree.case_folder, lab_file, kField) == fs::canonical(lab_file));
  CHECK_THAT(refusal(tree.case_folder, "../elsewhere/secret.txt"), Catch::Contains("lies outside"));
  reading::allow_file_for_this_run(tree.elsewhere / "secret.txt");
  CHECK(locate_data_file(tree.case_folder, "../elsewhere/secret.txt", kField) ==
        fs::canonical(tree.elsewhere / "secret.txt"));
  CHECK_THAT(refusal(tree.case_folder, "/etc/passwd"), Catch::Contains("lies outside"));
  reading::allow_data_outside_for_this_run();
  CHECK(locate_data_file(tree.case_folder, "/etc/passwd", kField) == fs::canonical("/etc/passwd"));
}

TEST_CASE("the laboratory data folders come from COUNTERPOISE_DATA_FOLDERS, separated by colons", "[reading][access]") {
  ::setenv(reading::kDataFoldersVariable, "/srv/lab-a::/srv/lab b", 1);
  const auto folders = reading::configured_data_folders();
  ::unsetenv(reading::kDataFoldersVariable);
  REQUIRE(folders.size() == 2);
  CHECK(folders[0] == "/srv/lab-a");
  CHECK(folders[1] == "/srv/lab b");
  CHECK(reading::configured_data_folders().empty());
}

TEST_CASE("refused files are recorded for the caller that asks, once per field, and only while it asks", "[reading]") {
  Tree tree;
  refusal(tree.case_folder, "../elsewhere/secret.txt");  // no recorder: nothing kept, nothing fails
  std::vector<reading::RefusedDataFile> recorded;
  {
    reading::RefusedDataFiles refused;
    CHECK(refusal(tree.case_folder, "data.csv").empty());  // allowed: not recorded
    CHECK_FALSE(refusal(tree.case_folder, "../elsewhere/secret.txt").empty());  // still refused
    CHECK_FALSE(refusal(tree.case_folder, (tree.elsewhere / "secret.txt").string()).empty());  // same file, same field
    {
      reading::RefusedDataFiles inner;  // the innermost recorder takes what is refused meanwhile
      refusal(tree.case_folder, "/etc/hostname");
      CHECK(inner.files().size() == 1);
    }
    recorded = refused.files();
  }
  REQUIRE(recorded.size() == 1);
  CHECK(recorded[0].where.item == "D1");
  CHECK(recorded[0].where.field == "frequencies.file");
  CHECK(recorded[0].written == "../elsewhere/secret.txt");
  CHECK(recorded[0].resolved == fs::weakly_canonical(tree.elsewhere / "secret.txt"));

  // Allowing what was recorded lets it be read (the editor's "read these files" answer).
  reading::allow_file_for_this_run(recorded[0].resolved);
  CHECK(refusal(tree.case_folder, "../elsewhere/secret.txt").empty());
}

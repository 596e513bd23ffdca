// Seeds for the store opener's corpus: each case file given is imported into a case store of
// the current schema (import, a reviewer declared, revision 1 sealed with stand-in report bytes,
// one edit), so the fuzzer starts from files that open and verify. Usage:
//   fuzz_store_seeds OUTPUT_DIR CASE.json...
#include <exception>
#include <filesystem>
#include <iostream>
#include <string>

#include "core/reading/json_text.hpp"
#include "core/store/case_store.hpp"

int main(int argc, char** argv) {
  using namespace counterpoise::store;
  if (argc < 3) {
    std::cerr << "usage: fuzz_store_seeds OUTPUT_DIR CASE.json...\n";
    return 2;
  }
  const std::filesystem::path out_dir = argv[1];
  std::filesystem::create_directories(out_dir);
  int made = 0;
  for (int i = 2; i < argc; ++i) {
    const std::filesystem::path source = argv[i];
    const auto target = out_dir / (source.stem().string() + ".cpcase");
    std::filesystem::remove(target);
    try {
      const auto document = counterpoise::reading::read_json_file(source);
      const ExaminerName examiner(document.at("case").value("examiner", "Dr Imogen Thwaite"));
      CaseStore store = CaseStore::create(target, document, examiner);
      store.declare_reviewer(examiner, ExaminerName("Dr Owen Pryce"));
      store.seal_revision(examiner, "%PDF-1.4 stand-in report bytes\n", source.stem().string() + "-r1.pdf");
      store.set_field(examiner, EntityRef::section("case"), "title", nlohmann::json("Seed for fuzzing"));
      ++made;
    } catch (const std::exception& e) {
      std::cerr << source.string() << ": not used as a seed: " << e.what() << "\n";
    }
  }
  std::cout << made << " seed stores in " << out_dir.string() << "\n";
  return made > 0 ? 0 : 1;
}

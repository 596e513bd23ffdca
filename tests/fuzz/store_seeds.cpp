// Seeds for the store opener's corpus: each case file given is imported into a case store of
// the current schema (import, a reviewer declared, revision 1 sealed with stand-in report bytes,
// one edit), so the fuzzer starts from files that open and verify. With --anchors DIR it also
// writes seeds for the anchor reader's corpus: each store's revision 2 prepared for sealing with
// a fresh key, its anchor as a PDF carrying it and as the anchor's JSON text (the two input forms
// of fuzz_report_anchor: a first byte odd or even). Usage:
//   fuzz_store_seeds [--anchors DIR] OUTPUT_DIR CASE.json...
#include <exception>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <memory>
#include <string>

#include "core/platform/ed25519.hpp"
#include "core/reading/json_text.hpp"
#include "core/store/canonical_json.hpp"
#include "core/store/case_store.hpp"
#include "core/store/report_anchor.hpp"

namespace {

void write_file(const std::filesystem::path& path, const std::string& bytes) {
  std::ofstream(path, std::ios::binary) << bytes;
}

// The two forms fuzz_report_anchor reads, for the anchor of `store`'s next seal.
void write_anchor_seeds(const counterpoise::store::CaseStore& store, const counterpoise::store::ExaminerName& sealer,
                        const std::filesystem::path& dir, const std::string& stem) {
  using namespace counterpoise;
  const auto key = std::make_shared<const platform::Ed25519PrivateKey>(platform::Ed25519PrivateKey::generate());
  const auto prepared = store.prepare_seal(sealer, key);
  write_file(dir / (stem + "-pdf"), "\x01%PDF-1.7\n1 0 obj\n<< /Type /Metadata /Subtype /XML >>\nstream\n<cpseal:anchor>" +
                                        store::anchor_element_text(prepared.anchor) +
                                        "</cpseal:anchor>\nendstream\nendobj\n%%EOF\n");
  write_file(dir / (stem + "-json"), std::string(1, '\x00') + store::canonical_text(prepared.anchor.to_json()));
}

}  // namespace

int main(int argc, char** argv) {
  using namespace counterpoise::store;
  std::filesystem::path anchor_dir;
  int first = 1;
  if (argc > 2 && std::string(argv[1]) == "--anchors") {
    anchor_dir = argv[2];
    std::filesystem::create_directories(anchor_dir);
    first = 3;
  }
  if (argc < first + 2) {
    std::cerr << "usage: fuzz_store_seeds [--anchors DIR] OUTPUT_DIR CASE.json...\n";
    return 2;
  }
  const std::filesystem::path out_dir = argv[first];
  std::filesystem::create_directories(out_dir);
  int made = 0;
  for (int i = first + 1; i < argc; ++i) {
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
      if (!anchor_dir.empty()) write_anchor_seeds(store, examiner, anchor_dir, source.stem().string());
      ++made;
    } catch (const std::exception& e) {
      std::cerr << source.string() << ": not used as a seed: " << e.what() << "\n";
    }
  }
  std::cout << made << " seed stores in " << out_dir.string() << "\n";
  return made > 0 ? 0 : 1;
}

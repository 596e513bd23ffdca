#pragma once
// Where the programs find the data they ship (the wording rule file, the verbal scale files):
//  1. $COUNTERPOISE_DATA_DIR when it is set (a laboratory's own copy, tests);
//  2. <prefix>/share/counterpoise for a program installed as <prefix>/bin/<program>
//     (`cmake --install`), found from the program's own path;
//  3. the source tree's core/data, compiled in, for a program run from its build folder.

#include <filesystem>

namespace counterpoise::platform {

std::filesystem::path shipped_data_dir();

// The folder the running program was started from (/proc/self/exe's folder); empty when the
// system does not say.
std::filesystem::path program_dir();

}  // namespace counterpoise::platform

#pragma once
// Test data shared by the continuous-model tests: 60 invented refractive-index values (two
// clusters), generated once with Python's random.gauss (seed 7) and rounded to 5 decimals.
// Reference values computed from them are pasted beside each check with the library used.

#include <vector>

namespace counterpoise::test {

inline const std::vector<double> kInventedBackground = {
    1.5176,  1.52029, 1.51771, 1.5174,  1.51524, 1.51775, 1.52239, 1.51998, 1.52213, 1.51937,
    1.51988, 1.51915, 1.51267, 1.52149, 1.52027, 1.52025, 1.51258, 1.5124,  1.51539, 1.51686,
    1.51957, 1.51834, 1.52032, 1.51625, 1.51958, 1.51988, 1.51619, 1.52451, 1.52045, 1.52269,
    1.51633, 1.51591, 1.5173,  1.51813, 1.52071, 1.51937, 1.51693, 1.51515, 1.51668, 1.52277,
    1.52203, 1.52329, 1.52351, 1.52121, 1.52306, 1.52457, 1.52058, 1.52261, 1.52287, 1.52202,
    1.5236,  1.52293, 1.52124, 1.52399, 1.5238,  1.52414, 1.52473, 1.52343, 1.52314, 1.52144};

}  // namespace counterpoise::test

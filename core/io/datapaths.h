// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Where the shipped data (demos, parts, texts) lives: installed next to the executable under
// ../share/ampwright, or in the source tree when running from a build folder.

#include <filesystem>
#include <vector>

namespace amp {

/// The first folder that holds `resources/demos` (source tree) or `demos` (installed):
/// candidates are <exeDir>/../share/ampwright, then `sourceDir`. Empty when none is found.
/// Returns the folder that contains `demos/` and `parts/`-style children as a DataPaths.
struct DataPaths {
    std::filesystem::path demos;    ///< folder of the demo projects
    std::filesystem::path parts;    ///< shipped parts library
    std::filesystem::path resources; ///< texts, schema, icons
    bool found() const { return !demos.empty(); }
};

DataPaths findDataPaths(const std::filesystem::path& exeDir, const std::filesystem::path& sourceDir);

} // namespace amp

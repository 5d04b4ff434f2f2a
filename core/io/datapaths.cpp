// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/io/datapaths.h"

namespace amp {

DataPaths findDataPaths(const std::filesystem::path& exeDir, const std::filesystem::path& sourceDir) {
    namespace fs = std::filesystem;
    std::error_code ec;
    const fs::path installed = exeDir / ".." / "share" / "ampwright";
    if (fs::is_directory(installed / "demos", ec))
        return {fs::weakly_canonical(installed / "demos", ec), fs::weakly_canonical(installed / "parts", ec),
                fs::weakly_canonical(installed / "resources", ec)};
    if (!sourceDir.empty() && fs::is_directory(sourceDir / "resources" / "demos", ec))
        return {sourceDir / "resources" / "demos", sourceDir / "parts", sourceDir / "resources"};
    return {};
}

} // namespace amp

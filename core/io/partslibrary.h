// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The parts library: JSON files under parts/ (shipped) and a user folder read after it. Each file
// holds one or more parts of one kind; values are numbers in the unit of their key's suffix or
// strings with a unit ("4.2 mΩ"), converted to SI on load. A bad file is reported by file and field
// and skipped; the rest of the library still loads.

#include "core/model/parts.h"
#include "core/model/problem.h"

#include <filesystem>
#include <string>
#include <string_view>
#include <vector>

namespace amp {

/// A problem in one part file.
struct PartFileProblem {
    std::filesystem::path file;
    Problem problem;
};

struct PartsLibrary {
    std::vector<SwitchPart> switches;
    std::vector<DiodePart> diodes;
    std::vector<InterfacePart> interfaces;
    std::vector<HeatsinkPart> heatsinks;
    std::vector<ContactorPart> contactors;
    std::vector<PartFileProblem> problems; ///< files or parts skipped, with the reason

    const SwitchPart* findSwitch(std::string_view id) const;
    const DiodePart* findDiode(std::string_view id) const;
    const InterfacePart* findInterface(std::string_view id) const;
    const HeatsinkPart* findHeatsink(std::string_view id) const;
    const ContactorPart* findContactor(std::string_view id) const;
};

/// Load every *.json file of each folder in order; a part whose id repeats one already loaded
/// replaces it (so a user part can override a shipped one) and is noted in `problems`.
PartsLibrary loadPartsLibrary(const std::vector<std::filesystem::path>& folders);

/// Read one part file into `library` (used by loadPartsLibrary and the part editor's validation).
void loadPartFile(const std::filesystem::path& file, PartsLibrary& library);

/// Read the text of one part file into `library`; `file` only names it in the problems (used by
/// loadPartFile and the fuzz target).
void loadPartText(std::string_view text, const std::filesystem::path& file, PartsLibrary& library);

} // namespace amp

// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Project files (.ampw): versioned JSON. Loading migrates older versions step by step on the raw
// JSON, validates every field and reports every problem with its path; a file from a newer
// version is refused. Saving is atomic (temporary file, flush, rename) and keeps a backup.

#include "core/model/design.h"
#include "core/model/problem.h"

#include <nlohmann/json.hpp>

#include <filesystem>
#include <functional>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace amp {

/// The project-file format version this build writes.
inline constexpr int kProjectFormatVersion = 1;

/// One migration step: rewrites a raw project of version `from` into version `from + 1`.
struct MigrationStep {
    int from = 0;
    std::string description;
    std::function<void(nlohmann::json&)> apply;
};

/// The chain of steps up to `current`. The default chain is defaultMigrations(); tests build
/// their own to exercise the mechanism.
struct MigrationChain {
    int current = kProjectFormatVersion;
    std::vector<MigrationStep> steps;
};
MigrationChain defaultMigrations();

/// Outcome of a load. `design` is set only when there are no problems.
struct LoadResult {
    std::optional<Design> design;
    std::vector<Problem> problems;
    std::vector<std::string> migrationsApplied;
    int fileVersion = 0;
    explicit operator bool() const { return design.has_value(); }
};

/// Parse project text. `sourceName` is used in messages (a file name).
LoadResult parseProject(std::string_view text, const MigrationChain& chain = defaultMigrations());

/// Read and parse a project file.
LoadResult loadProject(const std::filesystem::path& file, const MigrationChain& chain = defaultMigrations());

/// Validate a raw, already-migrated project JSON and turn it into a design.
LoadResult designFromJson(const nlohmann::json& project);

/// The project JSON of a design (current format version).
nlohmann::json projectToJson(const Design& design);

/// Atomic save options. `hook` is called at each stage ("open", "write", "flush", "backup",
/// "rename"); it may throw to simulate a failure there (tests) or sleep (crash-safety tests).
struct SaveOptions {
    bool keepBackup = true;         ///< keep the previous file as FILE.bak
    std::function<void(std::string_view stage)> hook;
};

struct SaveResult {
    bool ok = false;
    std::string error;
    explicit operator bool() const { return ok; }
};

/// Write text atomically to `file`: write FILE.tmp, flush and sync, keep the old file as
/// FILE.bak, rename over. On failure the old file is untouched and the temporary is removed.
SaveResult writeFileAtomically(const std::filesystem::path& file, std::string_view text,
                               const SaveOptions& options = {});

/// Save a design (pretty-printed project JSON) atomically.
SaveResult saveProject(const Design& design, const std::filesystem::path& file,
                       const SaveOptions& options = {});

/// Apply a dotted-path override ("bank.count=3", "dutyProfile[0].duration_s=20",
/// "bank.device.mosfet.rdsOn25_ohm=3.5 mΩ") to a raw project JSON. The value is JSON or a number
/// with a unit. Problems name the path.
std::vector<Problem> applyOverride(nlohmann::json& project, std::string_view assignment);

} // namespace amp

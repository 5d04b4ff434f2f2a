// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Project files (.ampw): versioned JSON. Loading migrates older versions step by step on the raw
// JSON, validates every field and reports every problem with its path; a file from a newer
// version is refused. Saving is atomic (temporary file, flush, rename) and keeps a backup.
//
// Format 2 (current) holds named variants of the design:
//   {"formatVersion": 2, "activeVariant": "Main",
//    "variants": [{"name": "Main", "design": {...}}, {"name": "Eight FETs", "design": {...}}]}
// Format 1 was a bare design object beside "formatVersion"; the 1 -> 2 step wraps it as the one
// variant "Main". Problem paths inside a variant read "variants[1].design.supply.nominal_V"; in a
// project with a single variant they read as the design's own path ("supply.nominal_V"), which is
// also where a format-1 file holds the field.

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
inline constexpr int kProjectFormatVersion = 2;

/// The name a format-1 file's design gets as the one variant of a format-2 project.
inline constexpr const char* kDefaultVariantName = "Main";

/// A named version of the design, kept in the same project.
struct Variant {
    std::string name;
    Design design;
    bool operator==(const Variant&) const = default;
};

/// What a project file holds: one or more variants, one of them active.
struct Project {
    std::vector<Variant> variants; ///< at least one, names unique and not empty
    std::string active;            ///< the active variant's name

    /// The variant of that name, or nullptr.
    const Variant* find(std::string_view name) const;
    /// Index of the active variant (0 when `active` names none).
    std::size_t activeIndex() const;
    const Design& activeDesign() const { return variants.at(activeIndex()).design; }
    std::vector<std::string> names() const;
    bool operator==(const Project&) const = default;
};

/// A project holding `design` as its only variant.
Project singleVariantProject(const Design& design, std::string name = kDefaultVariantName);

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

/// Outcome of a load. `design` (the active variant) and `project` (every variant) are set only
/// when there are no problems. designFromJson() sets `design` alone.
struct LoadResult {
    std::optional<Design> design;
    std::optional<Project> project;
    std::vector<Problem> problems;
    std::vector<std::string> migrationsApplied;
    int fileVersion = 0;
    explicit operator bool() const { return design.has_value(); }
};

/// Parse project text. `sourceName` is used in messages (a file name).
LoadResult parseProject(std::string_view text, const MigrationChain& chain = defaultMigrations());

/// Read and parse a project file.
LoadResult loadProject(const std::filesystem::path& file, const MigrationChain& chain = defaultMigrations());

/// Validate a raw, already-migrated project JSON (current format) and turn it into a project.
/// Every variant is checked; problem paths are prefixed "variants[i].design." when there is more
/// than one variant.
LoadResult projectFromJson(const nlohmann::json& project);

/// Validate a raw design object (the "design" of one variant; a "formatVersion" beside the fields
/// is tolerated) and turn it into a design.
LoadResult designFromJson(const nlohmann::json& design);

/// The project JSON (current format version).
nlohmann::json projectToJson(const Project& project);
/// The project JSON of a single design, as the one variant "Main".
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

/// Save a project (pretty-printed project JSON) atomically.
SaveResult saveProject(const Project& project, const std::filesystem::path& file,
                       const SaveOptions& options = {});
/// Save a single design as a project with the one variant "Main".
SaveResult saveProject(const Design& design, const std::filesystem::path& file,
                       const SaveOptions& options = {});

/// Apply a dotted-path override ("bank.count=3", "dutyProfile[0].duration_s=20",
/// "bank.device.mosfet.rdsOn25_ohm=3.5 mΩ") to a raw design JSON (one variant's "design"). The value is JSON or a number
/// with a unit. Problems name the path.
std::vector<Problem> applyOverride(nlohmann::json& project, std::string_view assignment);

} // namespace amp

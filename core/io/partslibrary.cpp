// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/io/partslibrary.h"

#include "core/model/design_json.h"
#include "core/model/fields.h"

#include <nlohmann/json.hpp>
#include <spdlog/spdlog.h>

#include <algorithm>
#include <fstream>
#include <sstream>

namespace amp {

namespace {

namespace fs = std::filesystem;
using nlohmann::json;

/// The part-file format version this build reads.
constexpr int kPartsFormatVersion = 1;

void report(PartsLibrary& lib, const fs::path& file, std::string path, std::string message) {
    spdlog::warn("parts library: {}: {}{}{}", file.string(), path, path.empty() ? "" : ": ", message);
    lib.problems.push_back({file, Problem{std::move(path), std::move(message)}});
}

template <class Part>
const Part* findById(const std::vector<Part>& parts, std::string_view id) {
    const auto it = std::find_if(parts.begin(), parts.end(), [&](const Part& p) { return p.partId == id; });
    return it == parts.end() ? nullptr : &*it;
}

/// Add a part, replacing an earlier one with the same id (a user part overrides a shipped one).
template <class Part>
void upsert(std::vector<Part>& parts, Part part, PartsLibrary& lib, const fs::path& file, const std::string& path) {
    const auto it =
        std::find_if(parts.begin(), parts.end(), [&](const Part& p) { return p.partId == part.partId; });
    if (it == parts.end()) {
        parts.push_back(std::move(part));
        return;
    }
    const std::string msg = "part '" + part.partId + "' replaces the one loaded earlier with the same id";
    spdlog::info("parts library: {}: {}", file.string(), msg);
    lib.problems.push_back({file, Problem{path, msg}});
    *it = std::move(part);
}

template <class Part>
void addPart(std::vector<Part>& parts, const json& j, const std::string& id, PartsLibrary& lib,
             const fs::path& file, const std::string& path) {
    Part part = j.get<Part>();
    part.partId = id;
    upsert(parts, std::move(part), lib, file, path);
}

std::string shortJsonError(const std::exception& e) {
    // nlohmann prefixes "[json.exception.parse_error.101] "; the rest says where and what.
    std::string s = e.what();
    if (const auto close = s.find("] "); s.rfind("[json.exception", 0) == 0 && close != std::string::npos)
        s = s.substr(close + 2);
    return s;
}

} // namespace

const SwitchPart* PartsLibrary::findSwitch(std::string_view id) const { return findById(switches, id); }
const DiodePart* PartsLibrary::findDiode(std::string_view id) const { return findById(diodes, id); }
const InterfacePart* PartsLibrary::findInterface(std::string_view id) const { return findById(interfaces, id); }
const HeatsinkPart* PartsLibrary::findHeatsink(std::string_view id) const { return findById(heatsinks, id); }
const ContactorPart* PartsLibrary::findContactor(std::string_view id) const { return findById(contactors, id); }

void loadPartFile(const fs::path& file, PartsLibrary& lib) {
    std::ifstream in(file, std::ios::binary);
    if (!in) {
        report(lib, file, "", "cannot open the file");
        return;
    }
    std::ostringstream ss;
    ss << in.rdbuf();
    loadPartText(ss.str(), file, lib);
}

void loadPartText(std::string_view text, const fs::path& file, PartsLibrary& lib) {
    json doc;
    try {
        doc = json::parse(text.begin(), text.end());
    } catch (const json::exception& e) {
        report(lib, file, "", "not valid JSON: " + shortJsonError(e));
        return;
    }
    if (!doc.is_object()) {
        report(lib, file, "", "a part file must be a JSON object with formatVersion, kind and parts");
        return;
    }

    const auto version = doc.find("formatVersion");
    if (version == doc.end() || !version->is_number_integer()) {
        report(lib, file, "formatVersion", "missing or not a whole number (this program reads version " +
                                               std::to_string(kPartsFormatVersion) + ")");
        return;
    }
    if (version->get<long long>() > kPartsFormatVersion) {
        report(lib, file, "formatVersion",
               "version " + std::to_string(version->get<long long>()) +
                   " is newer than this program reads (" + std::to_string(kPartsFormatVersion) + "): update Ampwright");
        return;
    }
    if (version->get<long long>() < 1) {
        report(lib, file, "formatVersion", "version " + std::to_string(version->get<long long>()) + " is not valid");
        return;
    }

    const auto kindIt = doc.find("kind");
    const std::string kind = kindIt != doc.end() && kindIt->is_string() ? kindIt->get<std::string>() : "";
    if (kind != "switch" && kind != "diode" && kind != "interface" && kind != "heatsink" && kind != "contactor") {
        report(lib, file, "kind",
               (kind.empty() ? std::string("missing") : "'" + kind + "' is not a part kind") +
                   " (expected switch, diode, interface, heatsink or contactor)");
        return;
    }
    for (const auto& [key, value] : doc.items())
        if (key != "formatVersion" && key != "kind" && key != "parts" && key != "note")
            report(lib, file, key, "unknown field '" + key + "' (ignored)");

    const auto partsIt = doc.find("parts");
    if (partsIt == doc.end() || !partsIt->is_array()) {
        report(lib, file, "parts", "missing or not a list of parts");
        return;
    }

    for (std::size_t i = 0; i < partsIt->size(); ++i) {
        const std::string prefix = "parts[" + std::to_string(i) + "]";
        json part = (*partsIt)[i];
        std::vector<Problem> problems;
        if (part.is_object()) {
            problems = convertUnitStrings(part, prefix);
            // Only fields that converted cleanly are checked for range; a failed conversion was
            // already reported for its path.
            for (auto& p : validatePartJson(part, kind, prefix))
                if (std::none_of(problems.begin(), problems.end(), [&](const Problem& q) { return q.path == p.path; }))
                    problems.push_back(std::move(p));
        } else {
            problems = validatePartJson(part, kind, prefix);
        }
        std::string id;
        if (part.is_object())
            if (const auto it = part.find("id"); it != part.end() && it->is_string())
                id = it->get<std::string>();
        if (!problems.empty()) {
            const std::string which = id.empty() ? " (part skipped)" : " (part '" + id + "' skipped)";
            for (auto& p : problems)
                report(lib, file, p.path, p.message + which);
            continue;
        }
        json body = part;
        body.erase("id");
        body.erase("note");
        body.erase("invented");
        try {
            if (kind == "switch")
                addPart(lib.switches, body, id, lib, file, prefix);
            else if (kind == "diode")
                addPart(lib.diodes, body, id, lib, file, prefix);
            else if (kind == "interface")
                addPart(lib.interfaces, body, id, lib, file, prefix);
            else if (kind == "heatsink")
                addPart(lib.heatsinks, body, id, lib, file, prefix);
            else
                addPart(lib.contactors, body, id, lib, file, prefix);
        } catch (const json::exception& e) {
            // The validator should have caught it; never let one part stop the library.
            report(lib, file, prefix, "cannot read the part: " + shortJsonError(e));
        }
    }
}

PartsLibrary loadPartsLibrary(const std::vector<fs::path>& folders) {
    PartsLibrary lib;
    for (const auto& folder : folders) {
        std::error_code ec;
        if (!fs::exists(folder, ec)) {
            spdlog::debug("parts library: folder {} does not exist, skipped", folder.string());
            continue;
        }
        if (!fs::is_directory(folder, ec)) {
            report(lib, folder, "", "not a folder");
            continue;
        }
        std::vector<fs::path> files;
        for (fs::directory_iterator it(folder, ec), end; !ec && it != end; it.increment(ec)) {
            if (it->path().extension() == ".json" && it->is_regular_file(ec))
                files.push_back(it->path());
        }
        if (ec)
            report(lib, folder, "", "cannot list the folder: " + ec.message());
        // A fixed order, so that overrides within one folder do not depend on the file system.
        std::sort(files.begin(), files.end());
        for (const auto& f : files)
            loadPartFile(f, lib);
    }
    spdlog::info("parts library: {} switches, {} diodes, {} interfaces, {} heatsinks, {} contactors, {} problems",
                 lib.switches.size(), lib.diodes.size(), lib.interfaces.size(), lib.heatsinks.size(),
                 lib.contactors.size(), lib.problems.size());
    return lib;
}

} // namespace amp

// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/io/projectfile.h"

#include "core/model/design_json.h"
#include "core/model/fields.h"
#include "core/units/units.h"

#include <spdlog/spdlog.h>

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <fstream>
#include <sstream>
#include <stdexcept>
#include <system_error>

#if defined(__unix__) || defined(__APPLE__)
#include <fcntl.h>
#include <unistd.h>
#endif

namespace amp {

using nlohmann::json;

namespace {

/// 1 -> 2: the bare design becomes the one variant "Main" of a project.
void wrapDesignAsVariant(json& project) {
    json design = project;
    design.erase("formatVersion");
    json wrapped = json::object();
    wrapped["formatVersion"] = project.value("formatVersion", 1);
    wrapped["activeVariant"] = kDefaultVariantName;
    wrapped["variants"] = json::array({json{{"name", kDefaultVariantName}, {"design", std::move(design)}}});
    project = std::move(wrapped);
}

} // namespace

MigrationChain defaultMigrations() {
    // Each step rewrites version N into N + 1 (from = N), with a fixture of version N under
    // tests/data/migrations/.
    return MigrationChain{kProjectFormatVersion,
                          {{1, "format 1 -> 2: the design becomes the variant \"Main\"", wrapDesignAsVariant}}};
}

const Variant* Project::find(std::string_view name) const {
    for (const auto& v : variants)
        if (v.name == name)
            return &v;
    return nullptr;
}

std::size_t Project::activeIndex() const {
    for (std::size_t i = 0; i < variants.size(); ++i)
        if (variants[i].name == active)
            return i;
    return 0;
}

std::vector<std::string> Project::names() const {
    std::vector<std::string> out;
    for (const auto& v : variants)
        out.push_back(v.name);
    return out;
}

Project singleVariantProject(const Design& design, std::string name) {
    Project p;
    p.active = name;
    p.variants.push_back({std::move(name), design});
    return p;
}

namespace {

// Line and column of a byte offset, for parse-error messages a user can act on.
std::string position(std::string_view text, std::size_t byte) {
    std::size_t line = 1, column = 1;
    for (std::size_t i = 0; i < byte && i < text.size(); ++i) {
        if (text[i] == '\n') {
            ++line;
            column = 1;
        } else {
            ++column;
        }
    }
    return "line " + std::to_string(line) + ", column " + std::to_string(column);
}

LoadResult failure(std::string path, std::string message) {
    LoadResult r;
    r.problems.push_back({std::move(path), std::move(message)});
    return r;
}

} // namespace

LoadResult designFromJson(const json& designJson) {
    LoadResult result;
    if (!designJson.is_object())
        return failure("", "the design must be a JSON object");
    json body = designJson;
    body.erase("formatVersion");
    result.problems = validateDesignJson(body);
    if (!result.problems.empty())
        return result;
    Design design;
    try {
        design = body.get<Design>();
    } catch (const std::exception& e) {
        // The validator should have caught every type problem; this is the safety net.
        return failure("", std::string("the project does not match the design structure: ") + e.what());
    }
    normalizeBank(design.bank);
    result.problems = validateDesign(design);
    if (result.problems.empty())
        result.design = std::move(design);
    return result;
}

namespace {

constexpr std::size_t kMaxVariants = 64;

std::string prefixed(const std::string& prefix, const std::string& path) {
    if (prefix.empty())
        return path;
    return path.empty() ? prefix : prefix + "." + path;
}

} // namespace

LoadResult projectFromJson(const json& project) {
    LoadResult result;
    if (!project.is_object())
        return failure("", "the project must be a JSON object");
    auto problem = [&](std::string path, std::string message) {
        result.problems.push_back({std::move(path), std::move(message)});
    };
    for (const auto& [key, value] : project.items())
        if (key != "formatVersion" && key != "activeVariant" && key != "variants")
            problem(key, "unknown field '" + key + "' (a project holds formatVersion, activeVariant and variants)");
    const auto variants = project.find("variants");
    if (variants == project.end())
        return failure("variants", "missing: a project lists its variants, each with a name and a design");
    if (!variants->is_array())
        return failure("variants", std::string("must be a list of variants, found ") + variants->type_name());
    if (variants->empty())
        return failure("variants", "the list is empty: a project needs at least one variant");
    if (variants->size() > kMaxVariants)
        return failure("variants", std::to_string(variants->size()) + " variants; at most " +
                                       std::to_string(kMaxVariants) + " are allowed");

    Project out;
    const bool single = variants->size() == 1;
    for (std::size_t i = 0; i < variants->size(); ++i) {
        const json& v = (*variants)[i];
        const std::string at = "variants[" + std::to_string(i) + "]";
        if (!v.is_object()) {
            problem(at, "must be a group with a name and a design");
            continue;
        }
        for (const auto& [key, value] : v.items())
            if (key != "name" && key != "design")
                problem(at + "." + key, "unknown field '" + key + "' (a variant holds name and design)");
        std::string name;
        const auto n = v.find("name");
        if (n == v.end() || !n->is_string() || n->get<std::string>().find_first_not_of(" \t") == std::string::npos) {
            problem(at + ".name", "every variant needs a name (text that is not empty)");
        } else {
            name = n->get<std::string>();
            if (out.find(name) != nullptr)
                problem(at + ".name", "the name '" + name + "' is used by an earlier variant; names must differ");
        }
        const auto d = v.find("design");
        if (d == v.end()) {
            problem(at + ".design", "missing: the variant has no design");
            continue;
        }
        // A project of one variant names its fields as the design does ("supply.nominal_V"),
        // as a format-1 file did; with several, the variant is part of the path.
        const std::string prefix = single ? std::string() : at + ".design";
        LoadResult one = designFromJson(*d);
        for (auto& p : one.problems)
            problem(prefixed(prefix, p.path), std::move(p.message));
        if (one.design)
            out.variants.push_back({name, std::move(*one.design)});
    }
    if (const auto a = project.find("activeVariant"); a != project.end()) {
        if (!a->is_string())
            problem("activeVariant", "must be the name of a variant, found " + a->dump());
        else if (result.problems.empty() && out.find(a->get<std::string>()) == nullptr) {
            std::string names;
            for (const auto& v : out.variants)
                names += (names.empty() ? "" : ", ") + v.name;
            problem("activeVariant", "'" + a->get<std::string>() + "' is not one of the variants (" + names + ")");
        } else {
            out.active = a->get<std::string>();
        }
    }
    if (!result.problems.empty())
        return result;
    if (out.active.empty())
        out.active = out.variants.front().name; // documented default: the first variant
    result.design = out.activeDesign();
    result.project = std::move(out);
    return result;
}

LoadResult parseProject(std::string_view text, const MigrationChain& chain) {
    json project;
    try {
        project = json::parse(text.begin(), text.end());
    } catch (const json::parse_error& e) {
        std::string what = e.what();
        // nlohmann's message starts with "[json.exception.parse_error.101] parse error at line…";
        // keep the readable part after the last ']'.
        const auto cut = what.find("] ");
        if (cut != std::string::npos)
            what = what.substr(cut + 2);
        return failure("", "not valid JSON (" + position(text, e.byte == 0 ? 0 : e.byte - 1) + "): " + what);
    } catch (const json::exception& e) {
        // Not a syntax error but still no JSON we can hold, e.g. a number beyond a double (1e999),
        // which nlohmann reports as out_of_range.
        std::string what = e.what();
        const auto cut = what.find("] ");
        if (cut != std::string::npos)
            what = what.substr(cut + 2);
        return failure("", "not valid JSON: " + what);
    }
    if (!project.is_object())
        return failure("", "the file must hold a JSON object with a formatVersion");
    const auto version = project.find("formatVersion");
    if (version == project.end())
        return failure("formatVersion", "missing: this does not look like an Ampwright project");
    if (!version->is_number_integer())
        return failure("formatVersion", "must be a whole number, found " + version->dump());
    const int fileVersion = version->get<int>();
    if (fileVersion > chain.current)
        return failure("formatVersion",
                       "the file was written by a newer Ampwright (format " + std::to_string(fileVersion) +
                           "); this version reads formats up to " + std::to_string(chain.current) +
                           ". Open it with a newer Ampwright.");
    if (fileVersion < 1)
        return failure("formatVersion", "must be 1 or more, found " + std::to_string(fileVersion));

    std::vector<std::string> applied;
    for (int v = fileVersion; v < chain.current; ++v) {
        const MigrationStep* step = nullptr;
        for (const auto& s : chain.steps)
            if (s.from == v)
                step = &s;
        if (step == nullptr)
            return failure("formatVersion", "no migration from format " + std::to_string(v) + " to " +
                                                std::to_string(v + 1));
        try {
            step->apply(project);
        } catch (const std::exception& e) {
            return failure("formatVersion", "migration from format " + std::to_string(v) + " failed: " + e.what());
        }
        project["formatVersion"] = v + 1;
        applied.push_back(step->description);
    }
    LoadResult result = projectFromJson(project);
    result.fileVersion = fileVersion;
    result.migrationsApplied = std::move(applied);
    return result;
}

LoadResult loadProject(const std::filesystem::path& file, const MigrationChain& chain) {
    std::ifstream in(file, std::ios::binary);
    if (!in)
        return failure("", "cannot open " + file.string() + ": " + std::strerror(errno));
    std::ostringstream ss;
    ss << in.rdbuf();
    if (in.bad())
        return failure("", "cannot read " + file.string());
    return parseProject(ss.str(), chain);
}

json projectToJson(const Project& project) {
    json j = json::object();
    j["formatVersion"] = kProjectFormatVersion;
    j["activeVariant"] = project.active;
    json list = json::array();
    for (const auto& v : project.variants)
        list.push_back(json{{"name", v.name}, {"design", v.design}});
    j["variants"] = std::move(list);
    return j;
}

json projectToJson(const Design& design) { return projectToJson(singleVariantProject(design)); }

SaveResult writeFileAtomically(const std::filesystem::path& file, std::string_view text,
                               const SaveOptions& options) {
    namespace fs = std::filesystem;
    const fs::path tmp = file.string() + ".tmp";
    const fs::path backup = file.string() + ".bak";
    auto stage = [&](std::string_view name) {
        if (options.hook)
            options.hook(name);
    };
    std::FILE* f = nullptr;
    try {
        stage("open");
        f = std::fopen(tmp.c_str(), "wb");
        if (f == nullptr)
            throw std::runtime_error("cannot create " + tmp.string() + ": " + std::strerror(errno));
        // Write in chunks so that a crash-safety test can stop the process in the middle of a write.
        constexpr std::size_t chunk = 4096;
        for (std::size_t at = 0; at < text.size(); at += chunk) {
            stage("write");
            const std::size_t n = std::min(chunk, text.size() - at);
            if (std::fwrite(text.data() + at, 1, n, f) != n)
                throw std::runtime_error("cannot write " + tmp.string() + ": " + std::strerror(errno));
        }
        stage("flush");
        if (std::fflush(f) != 0)
            throw std::runtime_error("cannot flush " + tmp.string() + ": " + std::strerror(errno));
#if defined(__unix__) || defined(__APPLE__)
        if (::fsync(::fileno(f)) != 0)
            throw std::runtime_error("cannot sync " + tmp.string() + ": " + std::strerror(errno));
#endif
        const int closed = std::fclose(f);
        f = nullptr;
        if (closed != 0)
            throw std::runtime_error("cannot close " + tmp.string() + ": " + std::strerror(errno));
        std::error_code ec;
        if (options.keepBackup && fs::exists(file, ec)) {
            stage("backup");
            // Copy, then rename: a crash during the copy leaves the previous backup whole (the
            // crash-safety test found an empty FILE.bak after a kill inside a plain copy).
            const fs::path backupTmp = backup.string() + ".tmp";
            fs::copy_file(file, backupTmp, fs::copy_options::overwrite_existing, ec);
            if (!ec)
                fs::rename(backupTmp, backup, ec);
            if (ec) {
                std::error_code ignored;
                fs::remove(backupTmp, ignored);
                throw std::runtime_error("cannot keep a backup " + backup.string() + ": " + ec.message());
            }
        }
        stage("rename");
        fs::rename(tmp, file, ec);
        if (ec)
            throw std::runtime_error("cannot replace " + file.string() + ": " + ec.message());
#if defined(__unix__) || defined(__APPLE__)
        // Make the rename itself durable.
        const auto dir = file.has_parent_path() ? file.parent_path() : fs::path(".");
        const int dfd = ::open(dir.c_str(), O_RDONLY | O_DIRECTORY);
        if (dfd >= 0) {
            ::fsync(dfd);
            ::close(dfd);
        }
#endif
        return {true, {}};
    } catch (const std::exception& e) {
        if (f != nullptr)
            std::fclose(f);
        std::error_code ec;
        fs::remove(tmp, ec);
        spdlog::warn("save of {} failed: {}", file.string(), e.what());
        return {false, e.what()};
    }
}

SaveResult saveProject(const Project& project, const std::filesystem::path& file, const SaveOptions& options) {
    return writeFileAtomically(file, projectToJson(project).dump(2) + "\n", options);
}

SaveResult saveProject(const Design& design, const std::filesystem::path& file, const SaveOptions& options) {
    return saveProject(singleVariantProject(design), file, options);
}

namespace {

struct PathToken {
    std::string key;
    std::optional<std::size_t> index;
};

// "dutyProfile[0].duration_s" -> {dutyProfile,[0]}, {duration_s}
std::optional<std::vector<PathToken>> splitPath(std::string_view path, std::string& error) {
    std::vector<PathToken> tokens;
    std::size_t i = 0;
    while (i < path.size()) {
        std::size_t end = path.find_first_of(".[", i);
        std::string key(path.substr(i, end == std::string_view::npos ? std::string_view::npos : end - i));
        if (key.empty()) {
            error = "empty name in the path";
            return std::nullopt;
        }
        tokens.push_back({key, std::nullopt});
        i = end == std::string_view::npos ? path.size() : end;
        while (i < path.size() && path[i] == '[') {
            const auto close = path.find(']', i);
            if (close == std::string_view::npos) {
                error = "missing ']' in the path";
                return std::nullopt;
            }
            const std::string digits(path.substr(i + 1, close - i - 1));
            if (digits.empty() || digits.find_first_not_of("0123456789") != std::string::npos) {
                error = "list index '" + digits + "' is not a whole number";
                return std::nullopt;
            }
            tokens.push_back({"", static_cast<std::size_t>(std::stoul(digits))});
            i = close + 1;
        }
        if (i < path.size()) {
            if (path[i] != '.') {
                error = "unexpected '" + std::string(1, path[i]) + "' in the path";
                return std::nullopt;
            }
            ++i;
            if (i == path.size()) {
                error = "the path ends with '.'";
                return std::nullopt;
            }
        }
    }
    if (tokens.empty()) {
        error = "empty path";
        return std::nullopt;
    }
    return tokens;
}

} // namespace

std::vector<Problem> applyOverride(json& project, std::string_view assignment) {
    const auto eq = assignment.find('=');
    if (eq == std::string_view::npos || eq == 0)
        return {{std::string(assignment), "an override must read path=value, e.g. bank.count=3"}};
    const std::string path(assignment.substr(0, eq));
    const std::string text(assignment.substr(eq + 1));
    std::string error;
    const auto tokens = splitPath(path, error);
    if (!tokens)
        return {{path, error}};

    // Walk to the parent of the last token.
    json* node = &project;
    for (std::size_t t = 0; t + 1 < tokens->size(); ++t) {
        const auto& tok = (*tokens)[t];
        if (tok.index) {
            if (!node->is_array())
                return {{path, "'" + path + "' indexes something that is not a list"}};
            if (*tok.index >= node->size())
                return {{path, "item " + std::to_string(*tok.index) + " does not exist: the list has " +
                                   std::to_string(node->size()) + " items"}};
            node = &(*node)[*tok.index];
        } else {
            if (!node->is_object() || !node->contains(tok.key))
                return {{path, "unknown field '" + path + "'"}};
            node = &(*node)[tok.key];
        }
    }
    const auto& last = tokens->back();
    const FieldSpec* spec = findField(path);
    if (last.index) {
        if (!node->is_array() || *last.index >= node->size())
            return {{path, "item " + std::to_string(*last.index) + " does not exist"}};
    } else if (!node->is_object() || (!node->contains(last.key) && spec == nullptr)) {
        return {{path, "unknown field '" + path + "'"}};
    }

    // The value: JSON when it parses as such, else a number with a unit, else plain text.
    json value;
    bool parsedJson = false;
    try {
        value = json::parse(text);
        parsedJson = true;
    } catch (const json::exception&) {
        // Not JSON (or a number beyond a double, out_of_range): read it as a value with a unit.
    }
    const auto unit = last.index ? std::nullopt : units::unitFromKey(last.key);
    if (unit && (!parsedJson || value.is_string())) {
        const auto parsed = units::parse(parsedJson ? value.get<std::string>() : text, *unit);
        if (!parsed)
            return {{path, parsed.error}};
        value = *parsed.value;
    } else if (!parsedJson) {
        value = text; // text and choice fields take the raw words
    }
    json& target = last.index ? (*node)[*last.index] : (*node)[last.key];
    target = std::move(value);
    return {};
}

} // namespace amp

// SPDX-License-Identifier: GPL-3.0-or-later
// libFuzzer target for the part-file loader. Any input must come back as parts or as problems,
// never as a crash, a hang or a sanitizer report; every part that loads holds finite numbers
// only and loads again, alone in a file of its own, to the same part.
#include "core/io/partslibrary.h"
#include "core/model/design_json.h"

#include <nlohmann/json.hpp>
#include <spdlog/spdlog.h>

#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <string_view>

namespace {

using nlohmann::json;

[[noreturn]] void fail(const char* what) {
    std::fprintf(stderr, "fuzz_partfile: %s\n", what);
    std::abort();
}

bool allFinite(const json& j) {
    if (j.is_number_float())
        return std::isfinite(j.get<double>());
    if (j.is_structured()) {
        for (const auto& item : j)
            if (!allFinite(item))
                return false;
    }
    return true;
}

template <class Part>
void checkParts(const std::vector<Part>& parts, const char* kind,
                std::vector<Part> amp::PartsLibrary::*member) {
    for (const Part& part : parts) {
        json j = part;
        if (!allFinite(j))
            fail("a loaded part holds a number that is not finite");
        j.erase("partId");
        j["id"] = part.partId;
        const json file = {{"formatVersion", 1}, {"kind", kind}, {"parts", json::array({j})}};
        amp::PartsLibrary again;
        amp::loadPartText(file.dump(), "again.json", again);
        const auto& reloaded = again.*member;
        if (!again.problems.empty() || reloaded.size() != 1)
            fail("a loaded part does not load again on its own");
        if (!(reloaded.front() == part))
            fail("a loaded part changes when written and read again");
    }
}

} // namespace

extern "C" int LLVMFuzzerInitialize(int*, char***) {
    spdlog::set_level(spdlog::level::off);
    return 0;
}

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    const std::string_view text(reinterpret_cast<const char*>(data), size);
    amp::PartsLibrary lib;
    amp::loadPartText(text, "fuzz.json", lib);
    for (const auto& p : lib.problems)
        if (p.problem.message.empty())
            fail("a problem without a message");
    checkParts(lib.switches, "switch", &amp::PartsLibrary::switches);
    checkParts(lib.diodes, "diode", &amp::PartsLibrary::diodes);
    checkParts(lib.interfaces, "interface", &amp::PartsLibrary::interfaces);
    checkParts(lib.heatsinks, "heatsink", &amp::PartsLibrary::heatsinks);
    checkParts(lib.contactors, "contactor", &amp::PartsLibrary::contactors);
    return 0;
}

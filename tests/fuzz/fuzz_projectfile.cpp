// SPDX-License-Identifier: GPL-3.0-or-later
// libFuzzer target for the project-file loader. Any input must come back as a design or as
// problems that say why, never as a crash, a hang or a sanitizer report; a design that loads
// must save and load again to the same design.
#include "core/io/projectfile.h"

#include <spdlog/spdlog.h>

#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <string_view>

namespace {

[[noreturn]] void fail(const char* what) {
    std::fprintf(stderr, "fuzz_projectfile: %s\n", what);
    std::abort();
}

} // namespace

extern "C" int LLVMFuzzerInitialize(int*, char***) {
    // The loader logs every problem; at a million inputs that is all the fuzzer would do.
    spdlog::set_level(spdlog::level::off);
    return 0;
}

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    const std::string_view text(reinterpret_cast<const char*>(data), size);
    const amp::LoadResult loaded = amp::parseProject(text);
    if (!loaded) {
        if (loaded.problems.empty())
            fail("a refused file came back without a problem");
        for (const auto& p : loaded.problems)
            if (p.message.empty())
                fail("a problem without a message");
        return 0;
    }
    if (!loaded.problems.empty())
        fail("a loaded design also carries problems");
    const std::string saved = amp::projectToJson(*loaded.design).dump(2);
    const amp::LoadResult again = amp::parseProject(saved);
    if (!again)
        fail("a loaded design does not load again after saving");
    if (!(*again.design == *loaded.design))
        fail("a loaded design changes when saved and loaded again");
    return 0;
}

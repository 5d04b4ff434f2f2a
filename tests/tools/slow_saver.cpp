// SPDX-License-Identifier: GPL-3.0-or-later
// Test helper for the crash-safety test: load a design, change its revision, and save it over
// the same file with a save hook that reports every stage on stdout and sleeps in each "write"
// chunk, so that the test can kill this process in the middle of the write.
//   slow_saver FILE REVISION DELAY_MS
// Prints "size N" (bytes to write), then "stage NAME" for each stage ("stage write K" for the
// K-th chunk, from 1), then "saved". Exit status 0 when saved, 1 on any failure.
#include "core/io/projectfile.h"

#include <spdlog/sinks/stdout_sinks.h>
#include <spdlog/spdlog.h>

#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <string>
#include <thread>

int main(int argc, char** argv) {
    if (argc != 4) {
        std::fprintf(stderr, "usage: slow_saver FILE REVISION DELAY_MS\n");
        return 1;
    }
    // stdout carries the stage protocol; log lines go to stderr.
    spdlog::set_default_logger(spdlog::stderr_logger_st("slow_saver"));
    const std::string file = argv[1];
    const int delay_ms = std::atoi(argv[3]);

    amp::LoadResult loaded = amp::loadProject(file);
    if (!loaded) {
        std::fprintf(stderr, "slow_saver: cannot load %s: %s\n", file.c_str(),
                     loaded.problems.empty() ? "?" : loaded.problems.front().message.c_str());
        return 1;
    }
    amp::Design design = std::move(*loaded.design);
    design.meta.revision = argv[2];

    std::printf("size %zu\n", amp::projectToJson(design).dump(2).size() + 1);
    std::fflush(stdout);
    int chunk = 0;
    amp::SaveOptions options;
    options.hook = [&](std::string_view stage) {
        if (stage == "write") {
            std::printf("stage write %d\n", ++chunk);
            std::fflush(stdout);
            std::this_thread::sleep_for(std::chrono::milliseconds(delay_ms));
        } else {
            std::printf("stage %.*s\n", static_cast<int>(stage.size()), stage.data());
            std::fflush(stdout);
        }
    };
    const amp::SaveResult saved = amp::saveProject(design, file, options);
    if (!saved) {
        std::fprintf(stderr, "slow_saver: %s\n", saved.error.c_str());
        return 1;
    }
    std::printf("saved\n");
    std::fflush(stdout);
    return 0;
}

// SPDX-License-Identifier: GPL-3.0-or-later
#include "support/testsupport.h"

#include <spdlog/sinks/base_sink.h>
#include <spdlog/spdlog.h>

#include <atomic>
#include <cmath>
#include <fstream>
#include <mutex>
#include <random>
#include <sstream>

namespace amp::test {

namespace {
std::atomic<int> g_unexpected{0};
std::atomic<int> g_expectDepth{0};

class GuardSink : public spdlog::sinks::base_sink<std::mutex> {
  protected:
    void sink_it_(const spdlog::details::log_msg& msg) override {
        if (msg.level >= spdlog::level::err && g_expectDepth.load() == 0) {
            ++g_unexpected;
            std::fprintf(stderr, "unexpected error log: %.*s\n", static_cast<int>(msg.payload.size()),
                         msg.payload.data());
        }
    }
    void flush_() override {}
};
} // namespace

std::filesystem::path sourceDir() { return AMPWRIGHT_SOURCE_DIR; }
std::filesystem::path dataDir() { return sourceDir() / "tests" / "data"; }
std::filesystem::path demoDir() { return sourceDir() / "resources" / "demos"; }

std::filesystem::path tempDir() {
    static std::mt19937_64 rng{std::random_device{}()};
    auto dir = std::filesystem::temp_directory_path() / ("ampwright-test-" + std::to_string(rng()));
    std::filesystem::create_directories(dir);
    return dir;
}

std::string readText(const std::filesystem::path& file) {
    std::ifstream in(file, std::ios::binary);
    std::ostringstream ss;
    ss << in.rdbuf();
    return ss.str();
}

void installLogGuard() {
    auto logger = std::make_shared<spdlog::logger>("test", std::make_shared<GuardSink>());
    logger->set_level(spdlog::level::trace);
    spdlog::set_default_logger(logger);
}

int unexpectedErrorLogs() { return g_unexpected.load(); }
ExpectErrors::ExpectErrors() { ++g_expectDepth; }
ExpectErrors::~ExpectErrors() { --g_expectDepth; }

double relDiff(double a, double b) { return std::abs(a - b) / std::abs(b); }

} // namespace amp::test

// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Helpers shared by the tests: paths to the source tree and an spdlog sink that turns an
// unexpected error-level log line into a test failure.

#include <filesystem>
#include <string>

namespace amp::test {

std::filesystem::path sourceDir();           ///< the project's source folder
std::filesystem::path dataDir();             ///< tests/data
std::filesystem::path demoDir();             ///< resources/demos
std::filesystem::path tempDir();             ///< a fresh folder per call, removed at exit
std::string readText(const std::filesystem::path& file);

/// Install the failing log sink (call in initTestCase). Error-level lines logged while
/// `expectErrors` is held are allowed.
void installLogGuard();
/// Number of unexpected error-level log lines since installLogGuard(); tests check it is 0 in
/// cleanupTestCase().
int unexpectedErrorLogs();
struct ExpectErrors {
    ExpectErrors();
    ~ExpectErrors();
};

/// Relative difference |a − b| / |b|.
double relDiff(double a, double b);

} // namespace amp::test

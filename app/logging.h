// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
#include <string>

namespace amp::app {

/// Route spdlog to a rotating file in the app data folder (or $AMPWRIGHT_LOG_DIR) and, for the
/// command line, to stderr (warnings; everything with --verbose). Returns the log file path.
std::string setupLogging(bool console, bool verbose);

} // namespace amp::app

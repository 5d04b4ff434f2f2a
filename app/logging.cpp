// SPDX-License-Identifier: GPL-3.0-or-later
#include "app/logging.h"

#include <QDir>
#include <QStandardPaths>

#include <spdlog/sinks/rotating_file_sink.h>
#include <spdlog/sinks/stdout_color_sinks.h>
#include <spdlog/spdlog.h>

namespace amp::app {

std::string setupLogging(bool console, bool verbose) {
    QString dir = qEnvironmentVariable("AMPWRIGHT_LOG_DIR");
    if (dir.isEmpty())
        dir = QStandardPaths::writableLocation(QStandardPaths::AppDataLocation) + "/logs";
    QDir().mkpath(dir);
    const std::string file = (dir + "/ampwright.log").toStdString();

    std::vector<spdlog::sink_ptr> sinks;
    try {
        auto rotating = std::make_shared<spdlog::sinks::rotating_file_sink_mt>(file, 1024 * 1024, 3);
        rotating->set_level(spdlog::level::debug);
        sinks.push_back(rotating);
    } catch (const spdlog::spdlog_ex&) {
        // An unwritable log folder must not stop the program; the console sink still works.
    }
    if (console) {
        auto err = std::make_shared<spdlog::sinks::stderr_color_sink_mt>();
        err->set_level(verbose ? spdlog::level::debug : spdlog::level::warn);
        err->set_pattern("ampwright: %l: %v");
        sinks.push_back(err);
    }
    auto logger = std::make_shared<spdlog::logger>("ampwright", sinks.begin(), sinks.end());
    logger->set_level(spdlog::level::debug);
    logger->flush_on(spdlog::level::warn);
    spdlog::set_default_logger(logger);
    return file;
}

} // namespace amp::app

// SPDX-License-Identifier: GPL-3.0-or-later
// Entry point: a headless command (evaluate, fields, parts, ...) or the workbench.
#include "app/cli.h"
#include "app/logging.h"

#include <QCoreApplication>
#include <QFileInfo>

#ifdef AMPWRIGHT_WITH_UI
#include <QApplication>
#include <QGuiApplication>
#include "ui/workbench.h"
#endif

#include <cstdio>

namespace {

bool hasDisplay() {
    return !qEnvironmentVariableIsEmpty("DISPLAY") || !qEnvironmentVariableIsEmpty("WAYLAND_DISPLAY") ||
           !qEnvironmentVariableIsEmpty("QT_QPA_PLATFORM");
}

} // namespace

int main(int argc, char** argv) {
    QStringList args;
    for (int i = 0; i < argc; ++i)
        args << QString::fromLocal8Bit(argv[i]);
    const bool verbose = args.contains("--verbose");
    args.removeAll("--verbose");

    if (args.contains("-h") || args.contains("--help") || args.contains("--help-all")) {
        if (args.size() < 3 || !amp::app::isCommand(args.value(1))) {
            std::fputs(amp::app::helpText().toLocal8Bit().constData(), stdout);
            return 0;
        }
    }
    if (args.contains("-v") || args.contains("--version")) {
        std::printf("ampwright %s\n", AMPWRIGHT_VERSION);
        return 0;
    }

    QCoreApplication::setOrganizationName("Ampwright");
    QCoreApplication::setApplicationName("ampwright");
    QCoreApplication::setApplicationVersion(AMPWRIGHT_VERSION);

#ifdef AMPWRIGHT_WITH_UI
    // The design sheet lays text out with Qt's fonts: a GUI application, without a window. The
    // offscreen platform needs no display.
    if (args.size() > 1 && args[1] == "sheet") {
        if (qEnvironmentVariableIsEmpty("QT_QPA_PLATFORM"))
            qputenv("QT_QPA_PLATFORM", "offscreen");
        QGuiApplication app(argc, argv);
        amp::app::setupLogging(true, verbose);
        return amp::app::runCommand(args);
    }
#endif
    if (args.size() > 1 && amp::app::isCommand(args[1])) {
        QCoreApplication app(argc, argv);
        amp::app::setupLogging(true, verbose);
        return amp::app::runCommand(args);
    }

    QString file = args.value(1);
    if (!file.isEmpty() && file.startsWith('-')) {
        std::fprintf(stderr, "ampwright: unknown option '%s' (see ampwright --help)\n", argv[1]);
        return 2;
    }
    if (!hasDisplay()) {
        // The application object first: the demo is found beside the executable.
#ifdef AMPWRIGHT_WITH_UI
        qputenv("QT_QPA_PLATFORM", "offscreen");
        QGuiApplication app(argc, argv);
#else
        QCoreApplication app(argc, argv);
#endif
        amp::app::setupLogging(true, verbose);
        if (file.isEmpty())
            file = amp::app::demoProject();
        const QString base = QFileInfo(file).completeBaseName();
#ifdef AMPWRIGHT_WITH_UI
        return amp::app::runHeadless(file, base + "-results.json", base + "-sheet.pdf");
#else
        return amp::app::runHeadless(file, base + "-results.json");
#endif
    }
#ifdef AMPWRIGHT_WITH_UI
    QApplication app(argc, argv);
    // Lets desktops match the window to the installed desktop entry and its icon.
    QGuiApplication::setDesktopFileName("ampwright");
    amp::app::setupLogging(false, verbose);
    return amp::ui::runWorkbench(app, file);
#else
    std::fputs("ampwright: built without the workbench; use a command (see ampwright --help)\n", stderr);
    return 2;
#endif
}

// SPDX-License-Identifier: GPL-3.0-or-later
#include "app/cli.h"

#include "core/checks/catalogue.h"
#include "core/engine/evaluate.h"
#include "core/engine/results_json.h"
#include "core/engine/sweep.h"
#include "core/io/datapaths.h"
#include "core/io/partslibrary.h"
#include "core/io/projectfile.h"
#include "core/model/design_json.h"
#include "core/model/fields.h"
#include "core/units/units.h"

#ifdef AMPWRIGHT_WITH_UI
#include "ui/designsheet.h"
#endif

#include <QCommandLineParser>
#include <QCoreApplication>
#include <QDir>
#include <QFileInfo>
#include <QStandardPaths>

#include <nlohmann/json.hpp>
#include <spdlog/spdlog.h>

#include <cctype>
#include <chrono>
#include <cstdio>
#include <fstream>

namespace amp::app {

namespace {

void out(const QString& text) {
    std::fputs(text.toLocal8Bit().constData(), stdout);
    std::fputc('\n', stdout);
}

void err(const QString& text) {
    std::fputs(("ampwright: " + text).toLocal8Bit().constData(), stderr);
    std::fputc('\n', stderr);
}

DataPaths dataPaths() {
    const auto exeDir = QCoreApplication::applicationDirPath().toStdString();
    return findDataPaths(exeDir, AMPWRIGHT_SOURCE_DIR);
}

QString fmt(double v, units::Unit u, int digits = 3) { return QString::fromStdString(units::format(v, u, digits)); }

/// The design to evaluate: one variant of a project, with --set overrides applied.
struct Chosen {
    Design design;
    std::string variant;
};

// Load a project, choose the variant (the active one, or `variant` when given), apply --set
// overrides to it (validated like a file); report problems on stderr.
std::optional<Chosen> loadWithOverrides(const QString& file, const QStringList& overrides,
                                        const QString& variant = {}) {
    const std::string name = QFileInfo(file).fileName().toStdString();
    auto reportAll = [&](const std::vector<Problem>& problems) {
        for (const auto& p : problems)
            err(QString::fromStdString(name + ": " + (p.path.empty() ? "" : p.path + ": ") + p.message));
    };
    const LoadResult loaded = loadProject(file.toStdString());
    if (!loaded) {
        reportAll(loaded.problems);
        return std::nullopt;
    }
    const Project& project = *loaded.project;
    const Variant* chosen = &project.variants.at(project.activeIndex());
    if (!variant.isEmpty()) {
        chosen = project.find(variant.toStdString());
        if (chosen == nullptr) {
            QStringList names;
            for (const auto& n : project.names())
                names << "\"" + QString::fromStdString(n) + "\"";
            err(QString::fromStdString(name) + ": --variant: there is no variant \"" + variant +
                "\"; the variants are " + names.join(", "));
            return std::nullopt;
        }
    }
    if (overrides.isEmpty())
        return Chosen{chosen->design, chosen->name};
    nlohmann::json design = chosen->design;
    for (const auto& o : overrides) {
        const auto problems = applyOverride(design, o.toStdString());
        if (!problems.empty()) {
            for (const auto& p : problems)
                err(QString::fromStdString("--set " + p.path + ": " + p.message));
            return std::nullopt;
        }
    }
    const LoadResult changed = designFromJson(design);
    if (!changed) {
        for (const auto& p : changed.problems)
            err(QString::fromStdString("--set: " + (p.path.empty() ? "" : p.path + ": ") + p.message));
        return std::nullopt;
    }
    return Chosen{*changed.design, chosen->name};
}

// The full evaluation of a chosen design, its results labelled with the variant.
Results evaluateChosen(const Chosen& chosen) {
    Results results = evaluateFull(chosen.design);
    results.variant = chosen.variant;
    return results;
}

// Parse a command's own arguments. An exit status when the command is done already (2 after a
// bad command line, 0 after printing its help); nothing when it should go on.
std::optional<int> parseArguments(QCommandLineParser& p, const QStringList& args) {
    if (!p.parse(args)) {
        err(p.errorText());
        return 2;
    }
    if (p.isSet("help")) {
        out(p.helpText());
        return 0;
    }
    return std::nullopt;
}

// A field's choice in words: "lowSideChopper" → "low side chopper".
QString words(const std::string& camel) {
    QString text;
    for (const char ch : camel) {
        if (std::isupper(static_cast<unsigned char>(ch)) && !text.isEmpty())
            text += QChar(' ');
        text += QChar(static_cast<char>(std::tolower(static_cast<unsigned char>(ch))));
    }
    return text;
}

void printSummary(const Results& r) {
    out(QString("%1%2  [%3]")
            .arg(QString::fromStdString(r.design),
                 r.variant.empty() ? QString() : QString(" · variant \"%1\"").arg(QString::fromStdString(r.variant)),
                 words(r.topology)));
    for (const auto& op : r.operatingPoints) {
        double tjMax = 0.0;
        for (const auto& d : op.devices)
            tjMax = std::max(tjMax, d.tj_C);
        out(QString("  %1: motor %2, duty %3 %, battery %4, loss %5, hottest junction %6%7")
                .arg(QString::fromStdString(op.name), fmt(op.motorCurrent_A, units::Unit::Ampere),
                     QString::number(op.duty * 100.0, 'f', 1), fmt(op.batteryCurrent_A, units::Unit::Ampere),
                     fmt(op.totalLoss_W, units::Unit::Watt), fmt(tjMax, units::Unit::Celsius),
                     op.valid ? QString() : QString("  (not reached)")));
    }
    int counts[4] = {0, 0, 0, 0};
    for (const auto& c : r.checks)
        ++counts[static_cast<int>(c.severity)];
    out(QString("  checks: %1 pass, %2 advice, %3 warning, %4 fail")
            .arg(counts[0])
            .arg(counts[1])
            .arg(counts[2])
            .arg(counts[3]));
    for (const auto& c : r.checks)
        if (c.severity == Severity::Fail || c.severity == Severity::Warning)
            out(QString("    %1 %2: %3")
                    .arg(QString::fromLatin1(toString(c.severity)).toUpper(), QString::fromStdString(c.id),
                         QString::fromStdString(c.message)));
}

bool writeJson(const Results& r, const QString& path) {
    const std::string text = resultsToJson(r).dump(2) + "\n";
    const SaveResult saved = writeFileAtomically(path.toStdString(), text, SaveOptions{false, {}});
    if (!saved)
        err("cannot write the results JSON: " + QString::fromStdString(saved.error));
    return saved.ok;
}

int evaluateCommand(const QStringList& args) {
    QCommandLineParser p;
    p.setApplicationDescription("Evaluate a design and write its results JSON.");
    p.addHelpOption();
    p.addPositionalArgument("evaluate", "The command.");
    p.addPositionalArgument("design", "The design file (.ampw).");
    QCommandLineOption json("json", "Write the results JSON to <file>.", "file");
    QCommandLineOption set("set", "Override a design field: path=value, e.g. bank.count=3 or "
                                  "bank.device.mosfet.rdsOn25_ohm=\"3.5 mΩ\". Repeatable.",
                           "path=value");
    QCommandLineOption variant("variant", "Evaluate the variant <name> instead of the active one.", "name");
    QCommandLineOption quiet("quiet", "Print nothing but errors.");
    QCommandLineOption verbose("verbose", "Log details to the console.");
    p.addOptions({json, set, variant, quiet, verbose});
    if (const auto done = parseArguments(p, args))
        return *done;
    const QStringList pos = p.positionalArguments();
    if (pos.size() != 2) {
        err("evaluate needs exactly one design file (see ampwright evaluate --help)");
        return 2;
    }
    const auto chosen = loadWithOverrides(pos[1], p.values(set), p.value(variant));
    if (!chosen)
        return 1;
    const Results results = evaluateChosen(*chosen);
    if (!p.isSet(quiet))
        printSummary(results);
    if (p.isSet(json)) {
        if (!writeJson(results, p.value(json)))
            return 1;
        if (!p.isSet(quiet))
            out("results written to " + QFileInfo(p.value(json)).absoluteFilePath());
    }
    return 0;
}

// "A:B" for counts; "F1:F2:N" for frequencies, each frequency with or without its unit
// ("2k", "2 kHz"). False with the reason in `why`.
bool parseCounts(const QString& text, CountFrequencyGrid& g, QString& why) {
    const QStringList parts = text.split(':');
    bool okA = false, okB = parts.size() == 1;
    const int a = parts.value(0).trimmed().toInt(&okA);
    const int b = parts.size() > 1 ? parts.value(1).trimmed().toInt(&okB) : a;
    if (parts.size() > 2 || !okA || !okB) {
        why = "--counts: \"" + text + "\" is not a range of whole numbers such as 1:16";
        return false;
    }
    g.countMin = a;
    g.countMax = b;
    return true;
}

bool parseFrequencies(const QString& text, CountFrequencyGrid& g, QString& why) {
    const QStringList parts = text.split(':');
    if (parts.size() != 3) {
        why = "--frequencies: \"" + text + "\" is not LOW:HIGH:STEPS such as 2k:40k:20";
        return false;
    }
    for (int i = 0; i < 2; ++i) {
        const units::Parsed f = units::parse(parts[i].toStdString(), units::Unit::Hertz);
        if (!f) {
            why = QString("--frequencies: %1 frequency: %2").arg(i == 0 ? "low" : "high", QString::fromStdString(f.error));
            return false;
        }
        (i == 0 ? g.frequencyMin_Hz : g.frequencyMax_Hz) = *f.value;
    }
    bool ok = false;
    g.frequencies = parts[2].trimmed().toInt(&ok);
    if (!ok) {
        why = "--frequencies: the steps \"" + parts[2] + "\" are not a whole number";
        return false;
    }
    return true;
}

std::string sweepCsv(const SweepResult& r) {
    std::string text = "count,frequency_Hz,valid,tjMax_C,heatsink_C,bankLoss_W,totalLoss_W,efficiency,stable,"
                       "maxMinCurrentRatio,failedChecks,reason\n";
    auto quoted = [](std::string t) {
        std::string q = "\"";
        for (const char c : t)
            q += c == '"' ? std::string("\"\"") : std::string(1, c);
        return q + "\"";
    };
    for (const SweepCell& c : r.cells) {
        char row[320];
        std::snprintf(row, sizeof row, "%d,%.6g,%d,%.6g,%.6g,%.6g,%.6g,%.6g,%d,%.6g,%d,", c.count, c.frequency_Hz,
                      c.valid ? 1 : 0, c.tjMax_C, c.heatsink_C, c.bankLoss_W, c.totalLoss_W, c.efficiency,
                      c.stable ? 1 : 0, c.maxMinCurrentRatio, c.failedChecks);
        text += row + quoted(c.valid ? c.firstFailure : c.reason) + "\n";
    }
    return text;
}

int sweepCommand(const QStringList& args) {
    QCommandLineParser p;
    p.setApplicationDescription("Map one operating point over the number of switches and the PWM frequency.");
    p.addHelpOption();
    p.addPositionalArgument("sweep", "The command.");
    p.addPositionalArgument("design", "The design file (.ampw).");
    QCommandLineOption counts("counts", "Devices in parallel, A:B (default 1:16).", "A:B", "1:16");
    QCommandLineOption freqs("frequencies", "PWM frequencies LOW:HIGH:STEPS (default 2k:40k:20).", "range",
                             "2k:40k:20");
    QCommandLineOption log("log", "Geometric frequency steps instead of even ones.");
    QCommandLineOption point("point", "The duty-profile segment, by name or number from 1 (default 1).", "segment");
    QCommandLineOption csv("csv", "Write every cell to <file> (CSV).", "file");
    QCommandLineOption threads("threads", "Worker threads (default: every core).", "n", "0");
    QCommandLineOption set("set", "Override a design field: path=value. Repeatable.", "path=value");
    QCommandLineOption variant("variant", "Sweep the variant <name> instead of the active one.", "name");
    QCommandLineOption quiet("quiet", "Print nothing but errors.");
    QCommandLineOption verbose("verbose", "Log details to the console.");
    p.addOptions({counts, freqs, log, point, csv, threads, set, variant, quiet, verbose});
    if (const auto done = parseArguments(p, args))
        return *done;
    const QStringList pos = p.positionalArguments();
    if (pos.size() != 2) {
        err("sweep needs exactly one design file (see ampwright sweep --help)");
        return 2;
    }
    CountFrequencyGrid grid;
    QString why;
    if (!parseCounts(p.value(counts), grid, why) || !parseFrequencies(p.value(freqs), grid, why)) {
        err(why);
        return 2;
    }
    grid.logarithmic = p.isSet(log);
    bool okThreads = false;
    grid.threads = p.value(threads).toInt(&okThreads);
    if (!okThreads) {
        err("--threads: \"" + p.value(threads) + "\" is not a whole number");
        return 2;
    }
    const auto chosen = loadWithOverrides(pos[1], p.values(set), p.value(variant));
    if (!chosen)
        return 1;
    if (p.isSet(point)) {
        const QString wanted = p.value(point);
        bool isNumber = false;
        const int number = wanted.toInt(&isNumber);
        bool found = false;
        for (std::size_t i = 0; i < chosen->design.dutyProfile.size() && !found; ++i)
            if ((isNumber && number == static_cast<int>(i) + 1) ||
                QString::fromStdString(chosen->design.dutyProfile[i].name) == wanted) {
                grid.point = i;
                found = true;
            }
        if (!found) {
            err("--point: the design has no segment \"" + wanted + "\"");
            return 2;
        }
    }
    const auto start = std::chrono::steady_clock::now();
    const SweepResult r = sweepCountAndFrequency(chosen->design, grid);
    const double ms = std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - start).count();
    if (!r.ok()) {
        for (const Problem& pr : r.problems)
            err(QString::fromStdString("sweep: " + pr.path + ": " + pr.message));
        return 2;
    }
    if (!p.isSet(quiet)) {
        int reached = 0, clean = 0;
        const SweepCell* coolest = nullptr;
        const SweepCell* leanest = nullptr;
        for (const SweepCell& c : r.cells) {
            reached += c.valid ? 1 : 0;
            if (!c.valid || c.failedChecks > 0)
                continue;
            ++clean;
            if (!coolest || c.tjMax_C < coolest->tjMax_C)
                coolest = &c;
            if (!leanest || c.totalLoss_W < leanest->totalLoss_W)
                leanest = &c;
        }
        out(QString("%1: segment \"%2\", %3 to %4 devices × %5 frequencies from %6 to %7: %8 cells in %9 ms")
                .arg(QFileInfo(pos[1]).fileName(), QString::fromStdString(r.pointName))
                .arg(grid.countMin)
                .arg(grid.countMax)
                .arg(grid.frequencies)
                .arg(fmt(grid.frequencyMin_Hz, units::Unit::Hertz), fmt(grid.frequencyMax_Hz, units::Unit::Hertz))
                .arg(r.cells.size())
                .arg(ms, 0, 'f', 0));
        out(QString("  reached in %1 cells; no failed check in %2").arg(reached).arg(clean));
        if (coolest)
            out(QString("  coolest without a failed check: %1 devices at %2, T_j %3")
                    .arg(coolest->count)
                    .arg(fmt(coolest->frequency_Hz, units::Unit::Hertz), fmt(coolest->tjMax_C, units::Unit::Celsius)));
        if (leanest)
            out(QString("  least loss without a failed check: %1 devices at %2, %3")
                    .arg(leanest->count)
                    .arg(fmt(leanest->frequency_Hz, units::Unit::Hertz), fmt(leanest->totalLoss_W, units::Unit::Watt)));
    }
    if (p.isSet(csv)) {
        const SaveResult saved = writeFileAtomically(p.value(csv).toStdString(), sweepCsv(r), SaveOptions{false, {}});
        if (!saved) {
            err("cannot write the sweep CSV: " + QString::fromStdString(saved.error));
            return 1;
        }
        if (!p.isSet(quiet))
            out("cells written to " + QFileInfo(p.value(csv)).absoluteFilePath());
    }
    return 0;
}

// Write the design sheet; false with the reason on stderr.
bool writeSheet(const Design& design, const Results& results, const QString& pdf, const QString& paperName) {
#ifdef AMPWRIGHT_WITH_UI
    QPageSize::PageSizeId paper = QPageSize::A4;
    if (!ui::paperFromName(paperName, &paper)) {
        err("--paper must be a4 or letter, not '" + paperName + "'");
        return false;
    }
    QString reason;
    if (!ui::writeDesignSheetPdf(design, results, pdf, paper, &reason)) {
        err("cannot write the design sheet: " + reason);
        return false;
    }
    return true;
#else
    (void)design;
    (void)results;
    (void)pdf;
    (void)paperName;
    err("this build has no workbench library (ui/), which renders the design sheet");
    return false;
#endif
}

int sheetCommand(const QStringList& args) {
    QCommandLineParser p;
    p.setApplicationDescription("Evaluate a design and write its printable design sheet (PDF).");
    p.addHelpOption();
    p.addPositionalArgument("sheet", "The command.");
    p.addPositionalArgument("design", "The design file (.ampw).");
    QCommandLineOption pdf("pdf", "Write the design sheet to <file>.", "file");
    QCommandLineOption paper("paper", "Paper size: a4 (default) or letter.", "size", "a4");
    QCommandLineOption set("set", "Override a design field: path=value (as for evaluate). Repeatable.", "path=value");
    QCommandLineOption variant("variant", "The sheet of the variant <name> instead of the active one.", "name");
    QCommandLineOption quiet("quiet", "Print nothing but errors.");
    QCommandLineOption verbose("verbose", "Log details to the console.");
    p.addOptions({pdf, paper, set, variant, quiet, verbose});
    if (const auto done = parseArguments(p, args))
        return *done;
    const QStringList pos = p.positionalArguments();
    if (pos.size() != 2 || !p.isSet(pdf)) {
        err("sheet needs one design file and --pdf OUT.pdf (see ampwright sheet --help)");
        return 2;
    }
    const QString paperName = p.value(paper).trimmed().toLower();
    if (paperName != "a4" && paperName != "letter") {
        err("--paper must be a4 or letter, not '" + p.value(paper) + "'");
        return 2;
    }
    const auto chosen = loadWithOverrides(pos[1], p.values(set), p.value(variant));
    if (!chosen)
        return 1;
    const Results results = evaluateChosen(*chosen);
    if (!writeSheet(chosen->design, results, p.value(pdf), paperName))
        return 1;
    if (!p.isSet(quiet))
        out("design sheet written to " + QFileInfo(p.value(pdf)).absoluteFilePath());
    return 0;
}

int fieldsCommand(const QStringList&) {
    out(QString::fromStdString(fieldsMarkdown()));
    return 0;
}

int checksCommand(const QStringList&) {
    out(QString::fromStdString(checksMarkdown()));
    return 0;
}

int partsCommand(const QStringList& args) {
    QCommandLineParser p;
    p.setApplicationDescription("List the parts library (shipped parts, then the user parts folder).");
    p.addHelpOption();
    p.addPositionalArgument("parts", "The command.");
    QCommandLineOption user("user", "Read user parts from <folder> instead of the default.", "folder");
    p.addOption(user);
    if (const auto done = parseArguments(p, args))
        return *done;
    const QString userDir = p.isSet(user) ? p.value(user)
                                          : QStandardPaths::writableLocation(QStandardPaths::AppDataLocation) +
                                                "/parts";
    const auto lib = loadPartsLibrary({dataPaths().parts, userDir.toStdString()});
    for (const auto& s : lib.switches)
        out(QString("switch     %1  %2").arg(QString::fromStdString(s.partId), -22).arg(QString::fromStdString(s.name)));
    for (const auto& d : lib.diodes)
        out(QString("diode      %1  %2").arg(QString::fromStdString(d.partId), -22).arg(QString::fromStdString(d.name)));
    for (const auto& i : lib.interfaces)
        out(QString("interface  %1  %2").arg(QString::fromStdString(i.partId), -22).arg(QString::fromStdString(i.name)));
    for (const auto& h : lib.heatsinks)
        out(QString("heatsink   %1  %2").arg(QString::fromStdString(h.partId), -22).arg(QString::fromStdString(h.name)));
    for (const auto& c : lib.contactors)
        out(QString("contactor  %1  %2").arg(QString::fromStdString(c.partId), -22).arg(QString::fromStdString(c.name)));
    for (const auto& pr : lib.problems)
        err(QString::fromStdString(pr.file.string() + ": " + (pr.problem.path.empty() ? "" : pr.problem.path + ": ") +
                                   pr.problem.message));
    out(QString("user parts folder: %1").arg(userDir));
    return lib.problems.empty() ? 0 : 1;
}

} // namespace

QString demoProject() {
    return QString::fromStdString((dataPaths().demos / "garden-cart.ampw").string());
}

bool isCommand(const QString& word) {
    return word == "evaluate" || word == "sheet" || word == "sweep" || word == "fields" || word == "parts" ||
           word == "checks";
}

QString helpText() {
    return QStringLiteral(
        "Usage: ampwright [DESIGN.ampw]\n"
        "       ampwright COMMAND [options]\n"
        "\n"
        "Ampwright designs the power stage of brushed DC motor drives: a parallel switch bank under PWM,\n"
        "its losses and junction temperatures, heatsink, drive, capacitors and reversing contactor.\n"
        "\n"
        "Without a command, opens the workbench on DESIGN (or the demo project). With no display\n"
        "(DISPLAY and WAYLAND_DISPLAY unset) it evaluates the design headless instead, prints a summary\n"
        "and writes <name>-results.json and <name>-sheet.pdf in the current folder.\n"
        "\n"
        "Commands:\n"
        "  evaluate DESIGN [--json OUT] [--variant NAME] [--set path=value ...]\n"
        "        Evaluate a design; print a summary; write the results JSON to OUT.\n"
        "        The project's active variant, or the one named by --variant.\n"
        "        --set overrides a field by its dotted path, [i] for list items, e.g.\n"
        "        --set bank.count=3  --set dutyProfile[0].duration_s=20\n"
        "        --set bank.device.mosfet.rdsOn25_ohm=\"3.5 mΩ\"   (JSON, or a number with a unit)\n"
        "  sheet DESIGN --pdf OUT.pdf [--paper a4|letter] [--variant NAME] [--set path=value ...]\n"
        "        Evaluate a design and write its printable design sheet: inputs, results per\n"
        "        operating point and device, charts, every check, the safety cautions.\n"
        "  sweep DESIGN [--counts A:B] [--frequencies LOW:HIGH:STEPS] [--log] [--point SEGMENT]\n"
        "        [--csv OUT.csv] [--threads N] [--variant NAME] [--set path=value ...]\n"
        "        Map one duty-profile segment over the number of switches and the PWM frequency\n"
        "        (default 1:16 devices, 2k:40k:20): hottest T_j, losses, stability and failed checks\n"
        "        per cell; prints the best cells and writes every cell to OUT.csv.\n"
        "  fields\n"
        "        Print every design field with its unit, range and meaning (Markdown).\n"
        "  checks\n"
        "        Print the catalogue of design checks: id, what it compares, where the limit comes\n"
        "        from and the field to change (Markdown).\n"
        "  parts [--user FOLDER]\n"
        "        List the parts library and any part file that was skipped, with the reason.\n"
        "\n"
        "Options:\n"
        "  -h, --help     This text (COMMAND --help for one command).\n"
        "  -v, --version  The version.\n"
        "  --verbose      Log details to the console.\n"
        "\n"
        "Exit status: 0 on success; 1 when a design, part or output file is bad (the message names the\n"
        "file and the field); 2 for a bad command line.\n"
        "\n"
        "Ampwright assists a competent person. Local codes, the machine's or vehicle's regulations and\n"
        "licensed practice decide.\n");
}

int runHeadless(const QString& designFile, const QString& jsonOut, const QString& sheetOut) {
    const auto chosen = loadWithOverrides(designFile, {});
    if (!chosen)
        return 1;
    out("No display: evaluating " + QFileInfo(designFile).absoluteFilePath() + " headless.");
    const Results results = evaluateChosen(*chosen);
    printSummary(results);
    if (!writeJson(results, jsonOut))
        return 1;
    out("results written to " + QFileInfo(jsonOut).absoluteFilePath());
    if (!sheetOut.isEmpty()) {
        if (!writeSheet(chosen->design, results, sheetOut, QStringLiteral("a4")))
            return 1;
        out("design sheet written to " + QFileInfo(sheetOut).absoluteFilePath());
    }
    return 0;
}

int runCommand(const QStringList& args) {
    const QString verb = args.value(1);
    if (verb == "evaluate")
        return evaluateCommand(args);
    if (verb == "sheet")
        return sheetCommand(args);
    if (verb == "sweep")
        return sweepCommand(args);
    if (verb == "fields")
        return fieldsCommand(args);
    if (verb == "parts")
        return partsCommand(args);
    if (verb == "checks")
        return checksCommand(args);
    err("unknown command '" + verb + "' (see ampwright --help)");
    return 2;
}

} // namespace amp::app

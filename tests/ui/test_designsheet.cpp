// SPDX-License-Identifier: GPL-3.0-or-later
// The printed design sheet, read back as a person would: the PDF's page count and size with
// pdfinfo, its text with pdftotext (poppler-utils). The numbers to find come from the results JSON
// that `ampwright evaluate --json` writes for the same design, formatted the way the sheet prints
// them (units::format with kSheetDigits).
#include "core/checks/cautions.h"
#include "core/engine/evaluate.h"
#include "core/io/projectfile.h"
#include "core/units/units.h"
#include "support/testsupport.h"
#include "ui/designdocument.h"
#include "ui/designsheet.h"
#include "ui/mainwindow.h"
#include "ui/sheetactions.h"
#include "ui/sheetcharts.h"

#include <QAction>
#include <QImage>
#include <QMenuBar>
#include <QPainter>
#include <QPrinter>
#include <QtTest>

#include <nlohmann/json.hpp>

#include <filesystem>

using namespace amp;
using nlohmann::json;

namespace {

QString tool(const QString& name) { return QStandardPaths::findExecutable(name); }

// Run a program; its standard output, or a null string when it failed.
QString capture(const QString& program, const QStringList& args, int* code = nullptr,
                const QProcessEnvironment& env = QProcessEnvironment::systemEnvironment(), const QString& dir = {}) {
    QProcess p;
    p.setProcessEnvironment(env);
    if (!dir.isEmpty())
        p.setWorkingDirectory(dir);
    p.start(program, args);
    if (!p.waitForFinished(120000))
        return {};
    if (code)
        *code = p.exitCode();
    return QString::fromUtf8(p.readAllStandardOutput());
}

// Compatibility forms folded (ligatures such as "ﬁ" that pdftotext returns, no-break spaces),
// a line broken after a hyphen joined again, and every run of white space made one space: a
// phrase wrapped over two lines still matches.
QString normalised(const QString& text) {
    QString t = text.normalized(QString::NormalizationForm_KC);
    t.replace(QStringLiteral("-\n"), QStringLiteral("-"));
    return t.simplified();
}

struct Pdf {
    int pages = 0;
    QString pageSize; // "595 x 842 pts (A4)"
    QString text;     // normalised
    QStringList pageTexts;
};

Pdf readPdf(const QString& file) {
    Pdf pdf;
    const QString info = capture(tool("pdfinfo"), {file});
    for (const QString& line : info.split('\n')) {
        if (line.startsWith("Pages:"))
            pdf.pages = line.section(':', 1).trimmed().toInt();
        if (line.startsWith("Page size:"))
            pdf.pageSize = line.section(':', 1).trimmed();
    }
    // -raw keeps the order in which the text was drawn, so a wrapped table cell stays together.
    const QString raw = capture(tool("pdftotext"), {"-raw", "-enc", "UTF-8", file, "-"});
    pdf.text = normalised(raw);
    for (const QString& page : raw.split(QChar('\f')))
        pdf.pageTexts << normalised(page);
    return pdf;
}

Design demo() {
    const LoadResult loaded = loadProject(test::demoDir() / "garden-cart.ampw");
    if (!loaded)
        qFatal("the demo does not load");
    return *loaded.design;
}

QString sheetNumber(double v, units::Unit u) {
    return normalised(QString::fromStdString(units::format(v, u, ui::kSheetDigits)));
}

QString q(const std::string& s) { return QString::fromStdString(s); }

// What the command line and the printed sheet compute: everything, the transient included.
Results evaluateAll(const Design& d) { return evaluateFull(d); }

} // namespace

class TestDesignSheet : public QObject {
    Q_OBJECT
    std::filesystem::path m_dir;

    QString out(const QString& name) const { return QString::fromStdString((m_dir / name.toStdString()).string()); }

    Pdf render(const Design& d, const QString& name, QPageSize::PageSizeId paper = QPageSize::A4) {
        return render(d, evaluateAll(d), name, paper);
    }

    Pdf render(const Design& d, const Results& r, const QString& name, QPageSize::PageSizeId paper = QPageSize::A4) {
        QString error;
        const bool ok = ui::writeDesignSheetPdf(d, r, out(name), paper, &error);
        if (!ok)
            qWarning("%s", qPrintable(error));
        return ok ? readPdf(out(name)) : Pdf{};
    }

  private slots:
    void initTestCase() {
        test::installLogGuard();
        QVERIFY2(!tool("pdftotext").isEmpty() && !tool("pdfinfo").isEmpty(),
                 "pdftotext and pdfinfo (poppler-utils) are needed: packaging/setup.sh installs them");
        m_dir = test::tempDir();
    }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    void demoSheetHasEverySectionAndNumberedPages() {
        const Design d = demo();
        const Pdf pdf = render(d, "demo-a4.pdf");
        QVERIFY2(pdf.pages >= 2, qPrintable(QString::number(pdf.pages)));
        QVERIFY2(pdf.pageSize.contains("595 x 842"), qPrintable(pdf.pageSize)); // ISO 216 A4 in points
        const QStringList sections = ui::designSheetSections(d, evaluateAll(d));
        // The sections the demo's sheet has (a solved design with a reversing contactor), named
        // here rather than taken from the code under test.
        for (const char* always : {"What this sheet is", "At a glance", "Inputs", "Results by operating point",
                                   "Devices of the bank", "Current and temperature per device", "Where the losses go",
                                   "Junction temperatures over the duty profile", "Heatsink and power cycling",
                                   "Contactors, fuse and cables", "Reversal sequence", "Checks", "Safety cautions",
                                   "Limits of this record"})
            QVERIFY2(sections.contains(always), always);
        for (const QString& s : sections)
            QVERIFY2(pdf.text.contains(s), qPrintable("missing heading: " + s));
        // Each numbered heading is in the text once: a block moved to the next page is not also
        // drawn (clipped, but extractable) at the foot of the page before.
        for (int i = 0; i < sections.size(); ++i) {
            const QString numbered = QString("%1 %2").arg(i + 1).arg(sections[i]);
            QVERIFY2(pdf.text.count(numbered) == 1, qPrintable(numbered));
        }
        // The title block.
        for (const std::string& v : {d.meta.title, d.meta.author, d.meta.revision})
            QVERIFY2(pdf.text.contains(normalised(q(v))), v.c_str());
        // Header and footer on every page, "page k of N" with N from pdfinfo.
        QCOMPARE(pdf.pageTexts.size() - 1, pdf.pages); // pdftotext ends every page with a form feed
        for (int k = 1; k <= pdf.pages; ++k) {
            const QString& page = pdf.pageTexts[k - 1];
            QVERIFY2(page.contains(QString("page %1 of %2").arg(k).arg(pdf.pages)), qPrintable(page.left(200)));
            QVERIFY2(page.contains(normalised(q(d.meta.title) + " — design sheet")), qPrintable(page.left(200)));
        }
        QCOMPARE(pdf.pageTexts.last(), QString()); // nothing after the last form feed
    }

    void keyNumbersOfTheResultsJson() {
        // The results JSON from the command line, the same door a user takes.
        const QString json = out("demo-results.json");
        int code = -1;
        capture(AMPWRIGHT_CLI, {"evaluate", QString::fromStdString((test::demoDir() / "garden-cart.ampw").string()),
                                "--json", json, "--quiet"},
                &code);
        QCOMPARE(code, 0);
        const auto j = json::parse(test::readText(json.toStdString()));
        const Pdf pdf = render(demo(), "demo-numbers.pdf");
        using units::Unit;
        const QString tj = sheetNumber(j.at("maxJunction_C").get<double>(), Unit::Celsius);
        QVERIFY2(pdf.text.contains(tj), qPrintable(tj));
        const QString loss = sheetNumber(j.at("maxTotalLoss_W").get<double>(), Unit::Watt);
        QVERIFY2(pdf.text.contains(loss), qPrintable(loss));
        const QString transient = sheetNumber(j.at("transient").at("tjMax_C").get<double>(), Unit::Celsius);
        QVERIFY2(pdf.text.contains(transient), qPrintable(transient));
        int devices = 0;
        for (const auto& op : j.at("operatingPoints")) {
            const QString opLoss = sheetNumber(op.at("totalLoss_W").get<double>(), Unit::Watt);
            QVERIFY2(pdf.text.contains(opLoss), qPrintable(opLoss));
            for (const auto& dv : op.at("devices")) {
                const QString i = sheetNumber(dv.at("current_A").get<double>(), Unit::Ampere);
                QVERIFY2(pdf.text.contains(i), qPrintable(q(op.at("name").get<std::string>()) + ": " + i));
                const QString t = sheetNumber(dv.at("tj_C").get<double>(), Unit::Celsius);
                QVERIFY2(pdf.text.contains(t), qPrintable(t));
                ++devices;
            }
        }
        QVERIFY(devices >= 6);
        // Every check is printed with its reading (a lost block of the layout would drop one).
        for (const auto& c : j.at("checks"))
            QVERIFY2(pdf.text.contains(normalised(q(c.at("message").get<std::string>()))),
                     c.at("message").get<std::string>().c_str());
    }

    void bankStudiesOfTheResultsJson() {
        // The bipolar demo runs away in its heavy segment. The sheet must say so, with the onset,
        // the first device, the smallest ballast and the Monte Carlo spread, each number as the
        // results JSON of `ampwright evaluate` has it (README, "Results JSON": bank.runawayLoad_A,
        // firstToFail, minimumBallast_ohm, spread.tjMax_C.p50, spread.runawayFraction).
        const QString file = QString::fromStdString((test::demoDir() / "yard-robot-bipolar.ampw").string());
        const QString json = out("bipolar-results.json");
        int code = -1;
        capture(AMPWRIGHT_CLI, {"evaluate", file, "--json", json, "--quiet"}, &code);
        QCOMPARE(code, 0);
        const auto j = json::parse(test::readText(json.toStdString()));
        const LoadResult loaded = loadProject(file.toStdString());
        QVERIFY(loaded);
        const Pdf pdf = render(*loaded.design, "bipolar-bank.pdf");
        QVERIFY(pdf.text.contains("Bank stability, ballast and spread"));
        using units::Unit;
        int unstable = 0;
        for (const auto& op : j.at("operatingPoints")) {
            const auto& b = op.at("bank");
            const QString name = q(op.at("name").get<std::string>());
            if (!b.at("stable").get<bool>()) {
                ++unstable;
                // The headline names the point, the first device and the onset load.
                QVERIFY(!b.at("runawayLoad_A").is_null() && !b.at("firstToFail").is_null());
                const QString line = QStringLiteral("The bank runs away in “%1”, device %2 first: the onset is at %3")
                                         .arg(name)
                                         .arg(b.at("firstToFail").get<int>())
                                         .arg(sheetNumber(b.at("runawayLoad_A").get<double>(), Unit::Ampere));
                QVERIFY2(pdf.text.contains(line), qPrintable(line));
            }
            for (const char* key : {"runawayLoad_A", "minimumBallast_ohm"})
                if (!b.at(key).is_null() && b.at(key).get<double>() > 0.0) {
                    const QString v = sheetNumber(b.at(key).get<double>(), key[0] == 'r' ? Unit::Ampere : Unit::Ohm);
                    QVERIFY2(pdf.text.contains(v), qPrintable(name + ": " + key + " " + v));
                }
            const auto& sp = b.at("spread");
            QVERIFY(!sp.is_null());
            const QString fraction = sheetNumber(sp.at("runawayFraction").get<double>(), Unit::Percent);
            QVERIFY2(pdf.text.contains("Samples without a stable state"), "runaway fraction row");
            QVERIFY2(pdf.text.contains(fraction), qPrintable(fraction));
            if (!sp.at("tjMax_C").at("p50").is_null()) {
                const QString p50 = sheetNumber(sp.at("tjMax_C").at("p50").get<double>(), Unit::Celsius);
                QVERIFY2(pdf.text.contains(p50), qPrintable(p50));
            }
        }
        QVERIFY2(unstable >= 1, "the bipolar demo is meant to run away in one segment");
        QVERIFY(pdf.text.contains("Thermal runaway of the bank runs away"));
    }

    void spreadChartExactlyWhereASpreadWasComputed() {
        // The bipolar demo's heavy segment runs away in part of the Monte Carlo samples, its light
        // one in none. The chart's caption names the run as the design file states it (bank.spread
        // samples and seed), and under each point the share of samples that run away, as the
        // results carry it.
        const LoadResult loaded = loadProject(test::demoDir() / "yard-robot-bipolar.ampw");
        QVERIFY(loaded);
        const Design& d = *loaded.design;
        const Results full = evaluateAll(d);
        int withSpread = 0;
        QStringList shares;
        for (const auto& op : full.operatingPoints)
            if (op.bank.spread) {
                ++withSpread;
                QCOMPARE(op.bank.spread->samples, d.bank.spread.samples);
                QCOMPARE(op.bank.spread->seed, static_cast<long long>(d.bank.spread.seed));
                shares << (op.bank.spread->runawayFraction > 0.0
                               ? sheetNumber(op.bank.spread->runawayFraction, units::Unit::Percent) +
                                     " of samples run away"
                               : QStringLiteral("no sample runs away"));
            }
        QVERIFY2(withSpread >= 2, "evaluateFull runs the spread at every point of the demo");
        QVERIFY2(shares.contains("no sample runs away") && shares.size() > shares.count("no sample runs away"),
                 qPrintable(shares.join(" | ")));
        const QString run = QStringLiteral("Monte Carlo run: %1 samples, seed %2")
                                .arg(d.bank.spread.samples)
                                .arg(d.bank.spread.seed);
        const QString legend = QStringLiteral("hatched: runs away (no stable state)");

        const Pdf pdf = render(d, full, "spread-chart.pdf");
        QVERIFY2(pdf.text.contains(run), qPrintable(run));
        QVERIFY(pdf.text.contains(legend));
        QVERIFY(pdf.text.contains("percentile over the Monte Carlo samples of the parts' stated tolerances"));
        for (const QString& share : shares)
            QVERIFY2(pdf.text.contains(share), qPrintable(share));
        // Chart and caption stand in the bank's section: after its heading, before the next one.
        const int section = pdf.text.indexOf("Bank stability, ballast and spread");
        const int next = pdf.text.indexOf("Current and temperature per device", section);
        QVERIFY(section >= 0 && next > section);
        QVERIFY(pdf.text.indexOf(run) > section && pdf.text.indexOf(run) < next);
        QVERIFY(pdf.text.indexOf(legend) > section && pdf.text.indexOf(legend) < next);

        // The quick evaluation has the bank's table but no Monte Carlo run: no chart, no caption.
        const Results quick = evaluate(d);
        QVERIFY(std::none_of(quick.operatingPoints.begin(), quick.operatingPoints.end(),
                             [](const auto& op) { return op.bank.spread.has_value(); }));
        QVERIFY(ui::designSheetSections(d, quick).contains("Bank stability, ballast and spread"));
        const Pdf plain = render(d, quick, "spread-chart-quick.pdf");
        QVERIFY(plain.text.contains("Bank stability, ballast and spread"));
        QVERIFY(!plain.text.contains("Monte Carlo run:"));
        QVERIFY(!plain.text.contains(legend));
        QVERIFY(!plain.text.contains("of samples run away") && !plain.text.contains("no sample runs away"));

        // Only the points that carry a spread are drawn: drop it where samples run away.
        Results partial = full;
        for (auto& op : partial.operatingPoints)
            if (op.bank.spread && op.bank.spread->runawayFraction > 0.0)
                op.bank.spread.reset();
        const Pdf some = render(d, partial, "spread-chart-partial.pdf");
        QVERIFY(some.text.contains(run));
        QVERIFY(some.text.contains("no sample runs away"));
        QVERIFY(!some.text.contains("of samples run away"));
    }

    void spreadChartBarHeights() {
        // Two points: every value known in the first; in the second the upper percentiles and the
        // corner run away. On a 72 dpi image one point is one pixel.
        const double tjMax = 150.0;
        std::vector<ui::SpreadPoint> points(2);
        points[0].name = "Steady";
        points[0].tj_C = {80.0, 90.0, 100.0, 110.0, 120.0};
        points[1].name = "Hard pull";
        points[1].tj_C = {60.0, 70.0, std::nullopt, std::nullopt, std::nullopt};
        points[1].runawayFraction = 0.07;
        QImage image(900, 420, QImage::Format_ARGB32);
        image.setDotsPerMeterX(2835); // 72 per inch
        image.setDotsPerMeterY(2835);
        image.fill(Qt::white);
        const QRectF r(10, 10, 880, 400);
        const ui::SpreadChartLayout l = ui::layoutSpreadChart(&image, r, 1.0, points, tjMax);
        QCOMPARE(l.bars.size(), std::size_t{10});
        QVERIFY(r.contains(l.plot));
        // All temperatures positive: the axis starts at 0 °C, so a bar's height is proportional
        // to its temperature (a bar chart's length starts at zero: common practice).
        QCOMPARE(l.lo_C, 0.0);
        QVERIFY(l.hi_C >= tjMax);
        const auto& ref = l.bars[0]; // nominal of the first point, 80 °C
        QVERIFY(ref.rect.height() > 50.0);
        for (const auto& b : l.bars) {
            const auto& v = points[b.point].tj_C[b.statistic];
            QCOMPARE(b.runaway, !v.has_value());
            // Bars of one point side by side in the order nominal … corner, the points left to right.
            QVERIFY(l.plot.contains(b.rect.center()));
            QCOMPARE(b.rect.bottom(), l.plot.bottom());
            // Exact: a linear axis from 0 maps T to T / (hi − lo) of the plot's height, so heights
            // stand in the ratio of the temperatures; a runaway bar reaches T_j,max. 1e-9 relative.
            const double expected = (v ? *v : tjMax) / 80.0;
            QVERIFY2(std::abs(b.rect.height() / ref.rect.height() - expected) < 1e-9 * expected,
                     qPrintable(QString("point %1 bar %2: %3 vs %4")
                                    .arg(b.point).arg(b.statistic).arg(b.rect.height() / ref.rect.height()).arg(expected)));
            if (b.runaway)
                QCOMPARE(b.rect.top(), l.limitY);
        }
        for (std::size_t i = 1; i < l.bars.size(); ++i)
            QVERIFY(l.bars[i - 1].rect.right() <= l.bars[i].rect.left());
        QVERIFY(std::abs((l.plot.bottom() - l.limitY) / ref.rect.height() - tjMax / 80.0) < 1e-9);

        // The drawing puts the bars where the layout says: inside the top of a known bar its
        // colour, just above it not; a runaway bar is hatched (white and its colour), not filled.
        {
            QPainter p(&image);
            p.setRenderHint(QPainter::Antialiasing);
            ui::drawSpreadChart(p, r, 1.0, points, tjMax);
        }
        for (const auto& b : l.bars) {
            const QColor c = ui::spreadStatisticColour(b.statistic);
            const int x = static_cast<int>(b.rect.center().x());
            if (!b.runaway) {
                QCOMPARE(image.pixelColor(x, static_cast<int>(b.rect.top() + 3.0)), c);
                QCOMPARE(image.pixelColor(x, static_cast<int>(b.rect.bottom() - 3.0)), c);
                QVERIFY(image.pixelColor(x, static_cast<int>(std::floor(b.rect.top() - 1.5))) != c);
            } else {
                int white = 0, ink = 0;
                for (int y = static_cast<int>(b.rect.top() + 3.0); y < static_cast<int>(b.rect.bottom() - 3.0); ++y) {
                    const QColor px = image.pixelColor(x, y);
                    white += px == QColor(Qt::white);
                    ink += px == c || (px.red() < 250 && std::abs(px.hue() - c.hue()) < 20);
                }
                QVERIFY2(white > 10 && ink > 10, qPrintable(QString("bar %1: %2 white, %3 ink").arg(b.statistic).arg(white).arg(ink)));
            }
        }
    }

    void failedChecksAndCautionsArePrinted() {
        // One device on a small heatsink, magnets limited to 150 A: the junction, derating, lead
        // and demagnetisation checks fail (see test_checks_catalogue for the estimates).
        Design d = demo();
        d.bank.count = 1;
        d.heatsink.mode = "stated";
        d.heatsink.part.rthSa_KperW = 5.0;
        d.motor.demagCurrent_A = 150.0;
        d.heatsink.exposed = true;
        const Results r = evaluateAll(d);
        QStringList failed;
        for (const auto& c : r.checks)
            if (c.severity == Severity::Fail)
                failed << q(c.id);
        failed.removeDuplicates();
        QVERIFY2(failed.size() >= 4, qPrintable(failed.join(", ")));
        const Pdf pdf = render(d, "failing.pdf");
        QVERIFY(pdf.pages >= 2);
        for (const QString& id : failed)
            QVERIFY2(pdf.text.contains(id), qPrintable(id));
        QVERIFY(pdf.text.contains("FAIL"));
        const auto cautions = cautionsFor(d, r);
        QVERIFY(cautions.size() >= 3);
        for (const auto& c : cautions) {
            QVERIFY2(pdf.text.contains(normalised(q(c.title))), c.title.c_str());
            QVERIFY2(pdf.text.contains(normalised(q(c.text))), c.text.c_str());
        }
        QVERIFY(pdf.text.contains("licensed practice decide"));
    }

    void hazardousVoltageOnlyAboveSixtyVolts() {
        // No basic protection is needed up to 60 V DC in dry locations (IEC 60364-4-41 §414.4.5,
        // from memory): the demo's 57.6 V bus has no such caution, a 72 V pack charged to 84 V has.
        const Pdf low = render(demo(), "low-voltage.pdf");
        QVERIFY(low.pages >= 2);
        QVERIFY(!low.text.contains("Hazardous DC voltage"));
        Design high = demo();
        high.supply.nominal_V = 72.0;
        high.supply.max_V = 84.0;
        high.supply.min_V = 62.0;
        const Pdf pdf = render(high, "high-voltage.pdf");
        QVERIFY(pdf.text.contains("Hazardous DC voltage"));
        QVERIFY(pdf.text.contains(sheetNumber(84.0, units::Unit::Volt) + ", above 60 V"));
    }

    void everyDemoOnA4AndLetter() {
        int demos = 0;
        for (const auto& e : std::filesystem::directory_iterator(test::demoDir())) {
            if (e.path().extension() != ".ampw")
                continue;
            const LoadResult loaded = loadProject(e.path());
            QVERIFY2(loaded, e.path().string().c_str());
            const QString stem = QString::fromStdString(e.path().stem().string());
            const Pdf a4 = render(*loaded.design, stem + "-a4.pdf", QPageSize::A4);
            QVERIFY2(a4.pages >= 2, qPrintable(stem));
            const Pdf letter = render(*loaded.design, stem + "-letter.pdf", QPageSize::Letter);
            QVERIFY2(letter.pages >= 2, qPrintable(stem));
            QVERIFY2(letter.pageSize.contains("612 x 792"), qPrintable(letter.pageSize)); // 8.5 × 11 in
            QVERIFY(letter.text.contains(QString("page %1 of %1").arg(letter.pages)));
            ++demos;
        }
        QVERIFY(demos >= 1);
    }

    void designWithoutResultsStillPrints() {
        // A design the engine refuses: the sheet records the inputs and the failed input check and
        // leaves out the sections that need results.
        Design d = demo();
        d.supply.nominal_V = -48.0;
        const Results r = evaluateAll(d);
        QVERIFY(r.operatingPoints.empty());
        const QStringList sections = ui::designSheetSections(d, r);
        QVERIFY(!sections.contains("Devices of the bank"));
        QVERIFY(!sections.contains("Where the losses go"));
        const Pdf pdf = render(d, "refused.pdf");
        QVERIFY(pdf.pages >= 1);
        QVERIFY(pdf.text.contains("design.input"));
        QVERIFY(pdf.text.contains("supply.nominal_V"));
        QVERIFY(!pdf.text.contains("Devices of the bank"));
        for (const QString& s : sections)
            QVERIFY2(pdf.text.contains(s), qPrintable(s));
    }

    void unwritableFileIsReported() {
        QString error;
        const Design d = demo();
        QVERIFY(!ui::writeDesignSheetPdf(d, evaluateAll(d), "/nonexistent-folder/x.pdf", QPageSize::A4, &error));
        QVERIFY2(error.contains("/nonexistent-folder"), qPrintable(error));
    }

    void workbenchExportsAndPreviews() {
        ui::MainWindow window;
        QVERIFY(window.document()->load(QString::fromStdString((test::demoDir() / "garden-cart.ampw").string())));
        // Both actions sit in the File menu.
        QMenu* file = nullptr;
        for (QAction* a : window.menuBar()->actions())
            if (a->menu() && a->text().remove('&') == "File")
                file = a->menu();
        QVERIFY(file);
        QStringList names;
        for (QAction* a : file->actions())
            names << a->objectName();
        QVERIFY2(names.contains("designSheetPreview") && names.contains("designSheetExport"), qPrintable(names.join(",")));
        const QString pdf = out("workbench.pdf");
        QVERIFY(ui::exportDesignSheet(window.document(), &window, pdf, QPageSize::Letter));
        const Pdf read = readPdf(pdf);
        QVERIFY(read.pages >= 2);
        QVERIFY(read.pageSize.contains("612 x 792"));
        QVERIFY(read.text.contains(normalised(q(window.document()->design().meta.title))));
        // The preview paints on a QPrinter: the same renderer, here sent to a PDF file.
        QPrinter printer(QPrinter::HighResolution);
        printer.setOutputFormat(QPrinter::PdfFormat);
        printer.setOutputFileName(out("printer.pdf"));
        printer.setPageSize(QPageSize(QPageSize::A4));
        const int pages = ui::renderDesignSheet(&printer, window.document()->design(), *window.document()->results());
        QVERIFY(pages >= 2);
        QCOMPARE(readPdf(out("printer.pdf")).pages, pages);
    }

    void commandLineSheet() {
        QProcessEnvironment env = QProcessEnvironment::systemEnvironment();
        env.remove("DISPLAY");
        env.remove("WAYLAND_DISPLAY");
        env.remove("QT_QPA_PLATFORM");
        const QString demoFile = QString::fromStdString((test::demoDir() / "garden-cart.ampw").string());
        int code = -1;
        const QString help = capture(AMPWRIGHT_CLI, {"--help"}, &code, env);
        QCOMPARE(code, 0);
        for (const char* word : {"sheet", "--pdf", "--paper", "checks", "-sheet.pdf"})
            QVERIFY2(help.contains(word), word);
        const QString pdf = out("cli-letter.pdf");
        const QString text = capture(AMPWRIGHT_CLI,
                                     {"sheet", demoFile, "--pdf", pdf, "--paper", "letter", "--set", "bank.count=4"},
                                     &code, env);
        QCOMPARE(code, 0);
        QVERIFY2(text.contains("design sheet written to"), qPrintable(text));
        const Pdf read = readPdf(pdf);
        QVERIFY(read.pages >= 2);
        QVERIFY(read.pageSize.contains("612 x 792"));
        QVERIFY(read.text.contains("four MOSFETs in parallel")); // the --set reached the sheet
        capture(AMPWRIGHT_CLI, {"sheet", demoFile, "--pdf", out("x.pdf"), "--paper", "a3"}, &code, env);
        QCOMPARE(code, 2);
        capture(AMPWRIGHT_CLI, {"sheet", demoFile}, &code, env);
        QCOMPARE(code, 2);
        // Without a display the plain run writes the sheet beside the results JSON.
        const QString dir = QString::fromStdString(test::tempDir().string());
        const QString headless = capture(AMPWRIGHT_CLI, {demoFile}, &code, env, dir);
        QCOMPARE(code, 0);
        QVERIFY2(headless.contains("garden-cart-sheet.pdf"), qPrintable(headless));
        QVERIFY(readPdf(dir + "/garden-cart-sheet.pdf").pages >= 2);
    }
};

QTEST_MAIN(TestDesignSheet)
#include "test_designsheet.moc"

// SPDX-License-Identifier: GPL-3.0-or-later
// The headless command line, run as a user would: the real executable in a child process.
#include "support/testsupport.h"

#include <QtTest>

#include <nlohmann/json.hpp>

using nlohmann::json;

class TestCli : public QObject {
    Q_OBJECT

    struct Run {
        int code = -1;
        QString out;
        QString err;
    };

    Run run(const QStringList& args, const QString& workDir = {}, bool display = false) {
        QProcess p;
        QProcessEnvironment env = QProcessEnvironment::systemEnvironment();
        if (!display) {
            env.remove("DISPLAY");
            env.remove("WAYLAND_DISPLAY");
            env.remove("QT_QPA_PLATFORM");
        }
        p.setProcessEnvironment(env);
        if (!workDir.isEmpty())
            p.setWorkingDirectory(workDir);
        p.start(AMPWRIGHT_CLI, args);
        if (!p.waitForFinished(120000))
            return {};
        return {p.exitCode(), QString::fromUtf8(p.readAllStandardOutput()), QString::fromUtf8(p.readAllStandardError())};
    }

    QString demo() const { return QString::fromStdString((amp::test::demoDir() / "garden-cart.ampw").string()); }

    json readJson(const QString& file) { return json::parse(amp::test::readText(file.toStdString())); }

  private slots:
    void help() {
        const Run r = run({"--help"});
        QCOMPARE(r.code, 0);
        for (const char* word : {"evaluate", "--json", "--set", "--variant", "sweep", "fields", "parts"})
            QVERIFY2(r.out.contains(word), word);
    }

    void evaluateDemoWritesResults() {
        const QString out = QString::fromStdString((amp::test::tempDir() / "r.json").string());
        const Run r = run({"evaluate", demo(), "--json", out});
        QVERIFY2(r.code == 0, qPrintable(r.err));
        QVERIFY(r.out.contains("results written to"));
        const json j = readJson(out);
        QCOMPARE(j.at("formatVersion").get<int>(), 1);
        QVERIFY(j.at("operatingPoints").size() >= 2);
        for (const auto& op : j.at("operatingPoints")) {
            for (const char* key : {"name", "motorCurrent_A", "batteryCurrent_A", "duty", "ripplePeakToPeak_A",
                                    "conductionMode", "totalLoss_W", "devices"})
                QVERIFY2(op.contains(key), key);
            QVERIFY(op.at("conductionMode") == "continuous" || op.at("conductionMode") == "discontinuous");
            QVERIFY(!op.at("devices").empty());
            for (const auto& d : op.at("devices"))
                for (const char* key : {"current_A", "loss_W", "tj_C"})
                    QVERIFY2(d.at(key).is_number(), key);
        }
        QVERIFY(j.at("checks").is_array());
        for (const auto& c : j.at("checks")) {
            for (const char* key : {"id", "severity", "value", "limit", "message"})
                QVERIFY2(c.contains(key), key);
            const auto sev = c.at("severity").get<std::string>();
            QVERIFY(sev == "pass" || sev == "advice" || sev == "warning" || sev == "fail");
        }
    }

    void sweepWritesEveryCell() {
        const QString out = QString::fromStdString((amp::test::tempDir() / "map.csv").string());
        const Run r = run({"sweep", demo(), "--counts", "2:5", "--frequencies", "4 kHz:16k:3", "--point", "2", "--csv", out});
        QVERIFY2(r.code == 0, qPrintable(r.err));
        QVERIFY2(r.out.contains("12 cells"), qPrintable(r.out));
        const QStringList lines = QString::fromStdString(amp::test::readText(out.toStdString())).split('\n', Qt::SkipEmptyParts);
        QCOMPARE(lines.size(), 1 + 4 * 3);
        QVERIFY(lines[0].startsWith("count,frequency_Hz,valid,tjMax_C"));
        QVERIFY2(lines[1].startsWith("2,4000,1,"), qPrintable(lines[1]));
        QVERIFY2(lines[12].startsWith("5,16000,"), qPrintable(lines[12]));
        // Bad grids: exit status 2 and the option or grid field named.
        Run bad = run({"sweep", demo(), "--counts", "0:4"});
        QCOMPARE(bad.code, 2);
        QVERIFY2(bad.err.contains("countMin"), qPrintable(bad.err));
        bad = run({"sweep", demo(), "--frequencies", "4 parsecs:16k:3"});
        QCOMPARE(bad.code, 2);
        QVERIFY2(bad.err.contains("--frequencies"), qPrintable(bad.err));
        bad = run({"sweep", demo(), "--point", "no such segment"});
        QCOMPARE(bad.code, 2);
        QVERIFY2(bad.err.contains("--point"), qPrintable(bad.err));
    }

    void brokenFileNamesFileAndField() {
        const QString broken =
            QString::fromStdString((amp::test::dataDir() / "broken" / "negative-voltage.ampw").string());
        const Run r = run({"evaluate", broken, "--json", "/dev/null"});
        QCOMPARE(r.code, 1);
        const QString first = r.err.section('\n', 0, 0);
        QVERIFY2(first.contains("negative-voltage.ampw") && first.contains("supply.nominal_V"), qPrintable(r.err));
    }

    void setOverridesPathAndUnitForms() {
        const auto dir = amp::test::tempDir();
        const QString base = QString::fromStdString((dir / "base.json").string());
        const QString three = QString::fromStdString((dir / "three.json").string());
        const QString lowR = QString::fromStdString((dir / "lowr.json").string());
        QCOMPARE(run({"evaluate", demo(), "--json", base, "--quiet"}).code, 0);
        const Run r3 = run({"evaluate", demo(), "--json", three, "--set", "bank.count=3", "--set",
                            "dutyProfile[0].duration_s=20"});
        QVERIFY2(r3.code == 0, qPrintable(r3.err));
        QCOMPARE(readJson(three).at("operatingPoints")[0].at("devices").size(), std::size_t{3});
        // Half the on-resistance, typed with a unit: every operating point loses less in the bank.
        const json b = readJson(base);
        const Run rl = run({"evaluate", demo(), "--json", lowR, "--set", "bank.device.mosfet.rdsOn25_ohm=1.5 mΩ"});
        QVERIFY2(rl.code == 0, qPrintable(rl.err));
        const json l = readJson(lowR);
        QVERIFY(l.at("operatingPoints")[1].at("totalLoss_W").get<double>() <
                b.at("operatingPoints")[1].at("totalLoss_W").get<double>());
    }

    void badSetIsRefused() {
        const Run r = run({"evaluate", demo(), "--set", "pwm.frequency_Hz=12 parsecs"});
        QCOMPARE(r.code, 1);
        QVERIFY2(r.err.contains("pwm.frequency_Hz"), qPrintable(r.err));
        const Run range = run({"evaluate", demo(), "--set", "bank.count=0"});
        QCOMPARE(range.code, 1);
        QVERIFY2(range.err.contains("bank.count"), qPrintable(range.err));
    }

    void headlessWithoutDisplay() {
        const auto dir = amp::test::tempDir();
        const Run r = run({demo()}, QString::fromStdString(dir.string()));
        QVERIFY2(r.code == 0, qPrintable(r.err));
        QVERIFY(r.out.contains("No display"));
        QVERIFY(QFile::exists(QString::fromStdString((dir / "garden-cart-results.json").string())));
    }

    void variantOption() {
        // A project with two variants: "Main" (the demo, active) and "Eight devices" (bank.count 8).
        const auto dir = amp::test::tempDir();
        json project = readJson(demo());
        json second = project.at("variants")[0];
        second["name"] = "Eight devices";
        second["design"]["bank"]["count"] = 8;
        second["design"]["bank"].erase("devices"); // filled with nominal devices to the count
        project["variants"].push_back(second);
        const QString file = QString::fromStdString((dir / "two.ampw").string());
        {
            QFile f(file);
            QVERIFY(f.open(QIODevice::WriteOnly));
            f.write(QByteArray::fromStdString(project.dump(2)));
        }
        const int mainCount = project["variants"][0]["design"]["bank"]["count"].get<int>();
        QVERIFY(mainCount != 8);

        const QString active = QString::fromStdString((dir / "active.json").string());
        const Run ra = run({"evaluate", file, "--json", active});
        QVERIFY2(ra.code == 0, qPrintable(ra.err));
        const json a = readJson(active);
        QCOMPARE(QString::fromStdString(a.at("variant").get<std::string>()), QString("Main"));
        QCOMPARE(a.at("operatingPoints")[0].at("devices").size(), std::size_t(mainCount));

        const QString named = QString::fromStdString((dir / "named.json").string());
        const Run rn = run({"evaluate", file, "--variant", "Eight devices", "--json", named, "--set", "pwm.frequency_Hz=20k"});
        QVERIFY2(rn.code == 0, qPrintable(rn.err));
        QVERIFY(rn.out.contains("Eight devices"));
        const json n = readJson(named);
        QCOMPARE(QString::fromStdString(n.at("variant").get<std::string>()), QString("Eight devices"));
        QCOMPARE(n.at("operatingPoints")[0].at("devices").size(), std::size_t{8});
        // Same shape as without --variant: the same keys at the top level.
        for (const auto& [key, value] : a.items())
            QVERIFY2(n.contains(key), key.c_str());
        QCOMPARE(n.size(), a.size());

        const Run bad = run({"evaluate", file, "--variant", "Nine"});
        QCOMPARE(bad.code, 1);
        QVERIFY2(bad.err.contains("Nine") && bad.err.contains("\"Main\"") && bad.err.contains("\"Eight devices\""),
                 qPrintable(bad.err));
    }

    void unknownCommandOption() {
        QCOMPARE(run({"--frobnicate"}).code, 2);
        QCOMPARE(run({"evaluate"}).code, 2);
    }
};

QTEST_GUILESS_MAIN(TestCli)
#include "test_cli.moc"

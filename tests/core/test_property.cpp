// SPDX-License-Identifier: GPL-3.0-or-later
// Property tests over random valid designs (fixed seed). Cases: 10,000 in the normal build, 1,000
// under the sanitizers, AMPWRIGHT_PROPERTY_CASES in the long run (DEVELOPERS.md). ctest runs the
// round trip as one test and evaluate() over all the cases in shards of consecutive cases
// (AMPWRIGHT_PROPERTY_SHARD=i/n: 10 in the normal build, 4 under the sanitizers), side by side.
#include "core/engine/evaluate.h"
#include "core/engine/results_json.h"
#include "core/io/partslibrary.h"
#include "core/io/projectfile.h"
#include "support/randomdesign.h"
#include "support/testsupport.h"

#include <nlohmann/json.hpp>
#include <spdlog/sinks/base_sink.h>
#include <spdlog/spdlog.h>

#include <QDir>
#include <QtTest>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <exception>
#include <fstream>
#include <mutex>
#include <random>
#include <string>
#include <vector>

using namespace amp;

namespace {

/// The path of the first number in `j` that is not finite ("" when all are finite).
std::string firstNonFinite(const nlohmann::json& j, const std::string& path = "") {
    if (j.is_number_float())
        return std::isfinite(j.get<double>()) ? std::string() : (path.empty() ? "(top)" : path);
    if (j.is_object()) {
        for (const auto& [key, value] : j.items())
            if (auto p = firstNonFinite(value, path.empty() ? key : path + "." + key); !p.empty())
                return p;
    } else if (j.is_array()) {
        for (std::size_t i = 0; i < j.size(); ++i)
            if (auto p = firstNonFinite(j[i], path + "[" + std::to_string(i) + "]"); !p.empty())
                return p;
    }
    return {};
}

/// Collects the results writer's "non-finite value" warnings (it writes such a value as null,
/// which would hide it from a look at the JSON).
class NonFiniteSink : public spdlog::sinks::base_sink<std::mutex> {
  public:
    std::vector<std::string> messages;

  protected:
    void sink_it_(const spdlog::details::log_msg& msg) override {
        const std::string text(msg.payload.data(), msg.payload.size());
        if (text.find("non-finite") != std::string::npos)
            messages.push_back(text);
    }
    void flush_() override {}
};

} // namespace

class TestProperty : public QObject {
    Q_OBJECT
    PartsLibrary m_parts;
    int m_cases = 0;

  private slots:
    void initTestCase() {
        test::installLogGuard();
        m_parts = loadPartsLibrary({test::sourceDir() / "parts"});
        QVERIFY(!m_parts.switches.empty() && !m_parts.diodes.empty() && !m_parts.interfaces.empty() &&
                !m_parts.heatsinks.empty() && !m_parts.contactors.empty());
        m_cases = test::propertyCases("AMPWRIGHT_PROPERTY_CASES", 10000, 1000);
        qInfo("%d cases", m_cases);
    }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    // The generator keeps to the field table and the cross-field rules (checkDesign), and every
    // such design saves and loads back to itself (a file round trip, DEVELOPERS.md).
    void randomDesignsAreValidAndRoundTrip() {
        std::mt19937_64 rng(0x5eed0001);
        int wide = 0;
        for (int i = 0; i < m_cases; ++i) {
            const test::RandomDesign r = test::randomDesign(rng, m_parts);
            QVERIFY2(r.problems.empty(), ("case " + std::to_string(i) + ": " + describe(r.problems)).c_str());
            wide += r.wide ? 1 : 0;
            const LoadResult back = parseProject(projectToJson(r.design).dump());
            QVERIFY2(back, ("case " + std::to_string(i) + ": " + describe(back.problems)).c_str());
            QVERIFY2(*back.design == r.design, ("case " + std::to_string(i) + " changed in the round trip").c_str());
        }
        // Both kinds of design are drawn (about a third wide).
        QVERIFY(wide > m_cases / 5 && wide < m_cases / 2);
    }

    // evaluate() over random valid designs: no exception escapes, no NaN or Inf anywhere in the
    // results, one result per duty-profile segment, and the energy balance of each solved point.
    // The balance, with the input taken on the supply side (bus voltage × battery current, not the
    // sum of the parts): V_bus·I_bat = P_motor-output + Σ(device + ballast + leg) + P_freewheel.
    // It is conservation of energy over one PWM period in the periodic steady state, where the
    // inductor's and the bus capacitor's stored energies return to their start (Erickson &
    // Maksimović, "Fundamentals of Power Electronics", 2nd ed., inductor volt-second and capacitor
    // charge balance; from memory). Tolerance 1e-6 relative to the larger side (1 W floor): every
    // term comes from the same exact waveform, so only the solvers' convergence (duty and
    // temperature iterations to about 1e-9) and rounding separate the two sides; a missing or
    // doubled loss term is at least a part in 1e4 of the input in any design that carries current.
    // A failing random design, written whole to the temporary folder (a message would cut it).
    static std::string keep(const Design& d, int index) {
        const std::string path =
            QDir::temp().filePath(QStringLiteral("ampwright-property-case-%1.ampw").arg(index)).toStdString();
        std::ofstream(path) << projectToJson(d).dump(1);
        return path;
    }

    void evaluateRandomDesigns() {
        // Found and fixed (2 December 2026): a crash on a synchronous-topology point with no bus
        // voltage left (evaluate.cpp); case 53, a bank's conduction time counted per Simpson sample
        // so a sample on the zero crossing flipped the base drive (losses/topology.cpp); case 125,
        // the bank coupling creeping past its 40 rounds (devices' shares and junctions now mixed);
        // case 207, a MOSFET gate current's I_G·V_S in the source paths not drawn from the battery;
        // case 330, the avalanche heat hopping between devices; case 424, the stage's bus current
        // ringing unsettled; case 473, losses above what the battery can give (now an invalid
        // point); case 1235, an overdriven bipolar bank at a small load whose devices with a
        // negative share (base current out by the collector) had their edges refused while the
        // others counted several times the bank's current, so the coupling never settled
        // (engine/stage_losses.cpp; a point whose coupling does not settle is now invalid with
        // the reason); case 1462, a MOSFET gate path with no resistance at all, which the table let
        // through and evaluate() refused (now a cross-field rule). The first 5,500 cases of this
        // seed pass, with every balance within 1e-6, discontinuous points included (worst 7.6e-8).
        // Time (2 December 2026): the stall search's steps were held at 20 s over horizons of days
        // (a heavy heatsink in still air; cases 488, 3794, 4275: one to six minutes each, now one
        // or two seconds: core/thermal/stall.cpp). All 10,000 cases pass, every balance within
        // 1e-6 (worst 5.0e-7), discontinuous points included (worst 3.3e-7 there): the 1e-4 once
        // allowed in discontinuous conduction (its output-capacitance energy is an estimate) is
        // not needed. Time of the ten shards and the round trip with ctest -j2 on the shared
        // 2-core machine: 601 s of test time, about 5 minutes of wall time, in the whole suite's
        // run (5 min 58 s for all 57 tests) with the machine nearly free; 15.8 minutes under other
        // builds. The slowest cases (times under that load): 1938 (91 s), 3017 (51 s), 7401, 4859,
        // 9854, 4343 (34–42 s), 722 (32 s; profiled: a bipolar bank whose electrical solves spend
        // their time in the loss stage, its input checks and the bipolar edge and base-drive
        // models).
        // AMPWRIGHT_PROPERTY_SHARD=i/n evaluates the i-th of n runs of consecutive cases (ctest
        // runs the shards side by side: tests/CMakeLists.txt); without it, all of them.
        int begin = 0, cases = m_cases;
        if (const QByteArray shard = qgetenv("AMPWRIGHT_PROPERTY_SHARD"); !shard.isEmpty()) {
            const QList<QByteArray> parts = shard.split('/');
            const int index = parts.size() == 2 ? parts[0].toInt() : -1;
            const int count = parts.size() == 2 ? parts[1].toInt() : 0;
            QVERIFY2(count > 0 && index >= 0 && index < count, "AMPWRIGHT_PROPERTY_SHARD must be i/n with 0 <= i < n");
            begin = static_cast<int>(static_cast<long long>(m_cases) * index / count);
            cases = static_cast<int>(static_cast<long long>(m_cases) * (index + 1) / count);
        }
        qInfo("evaluate(): cases %d to %d of %d", begin, cases - 1, m_cases);
        auto sink = std::make_shared<NonFiniteSink>();
        spdlog::default_logger()->sinks().push_back(sink);
        std::mt19937_64 rng(0x5eed0002);
        int points = 0, solved = 0, discontinuous = 0, limited = 0;
        double worstBalance = 0.0, worstDiscontinuous = 0.0;
        double slowest = 0.0;
        // AMPWRIGHT_PROPERTY_FIRST=k draws (without evaluating) the designs before case k: for
        // going straight to a reported case.
        const int first = std::max(begin, qEnvironmentVariableIntValue("AMPWRIGHT_PROPERTY_FIRST"));
        for (int i = 0; i < cases; ++i) {
            const test::RandomDesign r = test::randomDesign(rng, m_parts);
            if (i < first)
                continue;
            const std::string which = "case " + std::to_string(i) + (r.wide ? " (wide)" : "");
            QVERIFY2(r.problems.empty(), (which + ": " + describe(r.problems)).c_str());
            Results res;
            const auto started = std::chrono::steady_clock::now();
            try {
                res = evaluate(r.design);
            } catch (const std::exception& e) {
                QFAIL((which + ": evaluate threw: " + e.what() + "\n" + projectToJson(r.design).dump()).c_str());
            } catch (...) {
                QFAIL((which + ": evaluate threw something that is not a std::exception").c_str());
            }
            // The interactive evaluation answers within a fraction of a second; a design that takes
            // longer points at a solver that iterates without need (printed, not failed: the
            // machine may be busy).
            const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - started).count();
            slowest = std::max(slowest, seconds);
            if (seconds > 1.0)
                qInfo("%s: evaluate took %.2f s (%s)", which.c_str(), seconds, keep(r.design, i).c_str());
            const nlohmann::json j = resultsToJson(res);
            const std::string bad = firstNonFinite(j);
            QVERIFY2(bad.empty(), (which + ": not finite at " + bad + "\n" + projectToJson(r.design).dump()).c_str());
            QVERIFY2(sink->messages.empty(),
                     (which + ": " + (sink->messages.empty() ? "" : sink->messages.front()) + "\n" +
                      projectToJson(r.design).dump()).c_str());
            // A design the field table accepts is not refused as a whole by the engine as having bad
            // fields (a point it cannot solve may come back invalid with its reason: evaluate.h).
            for (const auto& c : res.checks)
                QVERIFY2(c.id != "design.input" || !c.operatingPoint.empty(), (which + ": evaluate refuses a valid design: " + c.field + ": " +
                                                  c.message)
                                                     .c_str());
            QCOMPARE(res.operatingPoints.size(), r.design.dutyProfile.size());
            for (const auto& p : res.operatingPoints) {
                ++points;
                if (!p.valid)
                    continue;
                ++solved;
                discontinuous += p.conductionMode == "discontinuous" ? 1 : 0;
                limited += p.currentLimited ? 1 : 0;
                const double input = p.busVoltage_V * p.batteryCurrent_A;
                double bank = 0.0;
                for (const auto& dv : p.devices)
                    bank += dv.loss_W + dv.ballast_W + dv.leg_W;
                const double parts = p.motorInputPower_W + bank + p.freewheelDiode.loss_W;
                const double scale = std::max({1.0, std::abs(input), std::abs(parts)});
                const double rel = std::abs(input - parts) / scale;
                worstBalance = std::max(worstBalance, rel);
                if (p.conductionMode == "discontinuous")
                    worstDiscontinuous = std::max(worstDiscontinuous, rel);
                if (rel > 1e-6)
                    QFAIL((which + " point '" + p.name + "': V_bus·I_bat " + std::to_string(input) + " W vs parts " +
                           std::to_string(parts) + " W; the design: " + keep(r.design, i))
                              .c_str());
            }
        }
        spdlog::default_logger()->sinks().pop_back();
        qInfo("%d points, %d solved (%d discontinuous, %d at the current limit); worst balance %.3g relative "
              "(%.3g in discontinuous conduction); slowest evaluation %.3f s",
              points, solved, discontinuous, limited, worstBalance, worstDiscontinuous, slowest);
        // The generator must reach the engine's main paths (about half the points solve; the rest ask
        // for more than the supply or the limit gives), or the property proves little.
        QVERIFY(solved > points * 2 / 5);
        QVERIFY(discontinuous > 0);
        QVERIFY(limited > 0);
    }
};

// Qt Test stops a test function after 5 minutes by default; the long run (and a busy machine)
// needs more.
int main(int argc, char** argv) {
    if (qEnvironmentVariableIsEmpty("QTEST_FUNCTION_TIMEOUT"))
        qputenv("QTEST_FUNCTION_TIMEOUT", "7200000");
    QCoreApplication app(argc, argv);
    TestProperty test;
    return QTest::qExec(&test, argc, argv);
}
#include "test_property.moc"

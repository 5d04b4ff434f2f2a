// SPDX-License-Identifier: GPL-3.0-or-later
// Property tests over random valid designs (fixed seed). Cases: 10,000 in the normal build, 1,000
// under the sanitizers, AMPWRIGHT_PROPERTY_CASES in the long run (DEVELOPERS.md).
#include "core/io/partslibrary.h"
#include "core/io/projectfile.h"
#include "support/randomdesign.h"
#include "support/testsupport.h"

#include <QtTest>

#include <random>

using namespace amp;

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
};

QTEST_GUILESS_MAIN(TestProperty)
#include "test_property.moc"

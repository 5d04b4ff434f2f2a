// SPDX-License-Identifier: GPL-3.0-or-later
// resources/fields.md is the field table as `ampwright fields` prints it: it must not drift.
#include "core/model/fields.h"
#include "support/testsupport.h"

#include <QtTest>

class TestFieldsDoc : public QObject {
    Q_OBJECT
  private slots:
    void documentMatchesTheTable() {
        const std::string doc = amp::test::readText(amp::test::sourceDir() / "resources" / "fields.md");
        const std::string table = amp::fieldsMarkdown();
        QVERIFY2(doc.find(table) != std::string::npos,
                 "resources/fields.md is out of date: regenerate it with "
                 "tests/tools/update-fields-doc.sh (it runs `ampwright fields`)");
    }
};

QTEST_GUILESS_MAIN(TestFieldsDoc)
#include "test_fieldsdoc.moc"

// SPDX-License-Identifier: GPL-3.0-or-later
// Shared assertions of the loss tests: a relative comparison that prints both values, and the
// lookup of a problem by its field path. Include after <QtTest>.
#pragma once

#include "core/model/problem.h"
#include "support/testsupport.h"

#include <string>
#include <vector>

#define CHECK_REL(actual, expected, tol)                                                                    \
    QVERIFY2(amp::test::relDiff((actual), (expected)) <= (tol),                                            \
             qPrintable(QString("%1 = %2, expected %3 within %4 %")                                         \
                            .arg(#actual)                                                                   \
                            .arg((actual), 0, 'g', 8)                                                       \
                            .arg((expected), 0, 'g', 8)                                                     \
                            .arg((tol) * 100.0)))

namespace amp::test {

/// Whether `problems` name `path` with a message.
inline bool hasProblem(const std::vector<Problem>& problems, const std::string& path) {
    for (const Problem& p : problems)
        if (p.path == path && !p.message.empty())
            return true;
    return false;
}

} // namespace amp::test

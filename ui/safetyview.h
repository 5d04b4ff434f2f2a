// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The safety cautions of the design in the workbench, as the design sheet prints them: each with
// what to do and why it is shown for this design, closing with the statement that local codes,
// the machine's or vehicle's regulations and licensed practice decide. Reads results only.

#include "core/engine/results.h"
#include "core/model/design.h"

#include <QTextBrowser>

namespace amp::ui {

/// The cautions as HTML (numbered, heading, text, reason); `count` receives how many there are.
QString cautionsHtml(const Design& design, const Results& results, int* count = nullptr);

class SafetyView : public QTextBrowser {
    Q_OBJECT
  public:
    explicit SafetyView(QWidget* parent = nullptr);
    /// Show the cautions for these results; returns how many there are.
    int setResults(const Design& design, const Results& results);
    /// No results: the standing statement only.
    void clearResults();

  private:
    QString m_html; ///< as last given to setHtml()
};

} // namespace amp::ui

// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/safetyview.h"

#include "core/checks/cautions.h"

namespace amp::ui {

namespace {

QString esc(const std::string& s) { return QString::fromStdString(s).toHtmlEscaped(); }

QString standing() {
    return QObject::tr("<p><b>Ampwright assists a competent person with calculations. It does not certify a design, a "
                       "part or an installation. Local codes, the machine's or vehicle's regulations and licensed "
                       "practice decide.</b></p>");
}

} // namespace

QString cautionsHtml(const Design& design, const Results& results, int* count) {
    const std::vector<Caution> list = cautionsFor(design, results);
    QString html = QObject::tr("<p>The cautions that apply to this design, with its numbers. They are printed on the "
                               "design sheet too.</p>");
    html += QStringLiteral("<ol>");
    for (const auto& c : list)
        html += QStringLiteral("<li><p><b>%1</b><br/>%2<br/><i>Shown because: %3</i></p></li>")
                    .arg(esc(c.title), esc(c.text), esc(c.reason));
    html += QStringLiteral("</ol>");
    if (count)
        *count = static_cast<int>(list.size());
    return html; // the last caution is the statement that local codes and licensed practice decide
}

SafetyView::SafetyView(QWidget* parent) : QTextBrowser(parent) {
    setObjectName(QStringLiteral("safetyView"));
    setOpenLinks(false);
    clearResults();
}

int SafetyView::setResults(const Design& design, const Results& results) {
    int n = 0;
    QString html = cautionsHtml(design, results, &n);
    if (html != m_html) { // the document is laid out afresh on every setHtml()
        m_html = std::move(html);
        setHtml(m_html);
    }
    return n;
}

void SafetyView::clearResults() {
    m_html = tr("<p>No results, so no cautions computed for this design.</p>") + standing();
    setHtml(m_html);
}

} // namespace amp::ui

// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/sectionpage.h"

#include "core/model/fields.h"
#include "ui/designdocument.h"
#include "ui/fieldeditor.h"

#include <QFormLayout>
#include <QGroupBox>
#include <QLabel>
#include <QVBoxLayout>

namespace amp::ui {

SectionPage::SectionPage(DesignDocument* document, const SectionSpec& section, QWidget* parent)
    : QScrollArea(parent), m_document(document), m_section(section) {
    setObjectName(QStringLiteral("page:") + section.id);
    setWidgetResizable(true);
    setFrameShape(QFrame::NoFrame);

    auto* body = new QWidget;
    auto* column = new QVBoxLayout(body);
    column->setContentsMargins(10, 8, 10, 10);
    column->setSpacing(10);

    auto* title = new QLabel(section.title, body);
    QFont big = title->font();
    big.setPointSizeF(big.pointSizeF() * 1.35);
    big.setBold(true);
    title->setFont(big);
    column->addWidget(title);
    auto* summary = new QLabel(section.summary, body);
    summary->setWordWrap(true);
    summary->setForegroundRole(QPalette::PlaceholderText);
    column->addWidget(summary);

    auto addGroup = [&](const QString& name, const std::vector<const FieldSpec*>& fields,
                        std::function<bool(const Design&)> visibleWhen, const QString& prefix) {
        if (fields.empty())
            return; // the field table has nothing here (yet)
        auto* box = new QGroupBox(name, body);
        auto* form = new QFormLayout(box);
        form->setRowWrapPolicy(QFormLayout::DontWrapRows);
        form->setFieldGrowthPolicy(QFormLayout::AllNonFixedFieldsGrow);
        form->setLabelAlignment(Qt::AlignLeft | Qt::AlignVCenter);
        for (const FieldSpec* spec : fields) {
            auto* editor = new FieldEditor(document, *spec, box);
            const QString text = QString::fromStdString(spec->label.empty() ? spec->path : spec->label);
            auto* label = new QLabel(text, box);
            label->setToolTip(FieldEditor::tooltipFor(*spec));
            label->setBuddy(editor->input());
            form->addRow(label, editor);
            m_editors.push_back(editor);
        }
        column->addWidget(box);
        m_groups.push_back({box, std::move(visibleWhen), prefix});
    };
    for (const auto& g : section.groups)
        addGroup(g.title, groupFields(g), g.visibleWhen, g.prefix);
    addGroup(tr("More"), unlistedFields(section), {}, QString());
    if (m_editors.empty()) {
        auto* none = new QLabel(tr("No fields of this section are in the field table."), body);
        none->setWordWrap(true);
        column->addWidget(none);
    }
    column->addStretch(1);
    setWidget(body);
    refresh(true);
}

void SectionPage::refresh(bool force) {
    for (auto* e : m_editors)
        e->refresh(force);
    for (const auto& g : m_groups)
        g.box->setVisible(!g.visibleWhen || g.visibleWhen(m_document->design()));
}

QGroupBox* SectionPage::groupBox(const QString& prefix) const {
    for (const auto& g : m_groups)
        if (g.prefix == prefix)
            return g.box;
    return nullptr;
}

FieldEditor* SectionPage::editor(const QString& path) const {
    for (auto* e : m_editors)
        if (e->path() == path)
            return e;
    return nullptr;
}

} // namespace amp::ui

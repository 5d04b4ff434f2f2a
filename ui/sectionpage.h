// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// One editor page: a titled, scrollable column of groups, each a form of FieldEditors generated
// from the field table.

#include "ui/sections.h"

#include <QScrollArea>

#include <vector>

class QGroupBox;

namespace amp::ui {

class DesignDocument;
class FieldEditor;

class SectionPage : public QScrollArea {
    Q_OBJECT
  public:
    SectionPage(DesignDocument* document, const SectionSpec& section, QWidget* parent = nullptr);

    const SectionSpec& section() const { return m_section; }
    /// Show the design's values (force: also drop refused entries) and the groups that apply.
    void refresh(bool force);
    FieldEditor* editor(const QString& path) const;
    const std::vector<FieldEditor*>& editors() const { return m_editors; }
    /// The first group box of fields under `prefix` ("bank.device"), or nullptr.
    QGroupBox* groupBox(const QString& prefix) const;

  private:
    struct Group {
        QGroupBox* box;
        std::function<bool(const Design&)> visibleWhen;
        QString prefix;
    };
    DesignDocument* m_document;
    SectionSpec m_section;
    std::vector<FieldEditor*> m_editors;
    std::vector<Group> m_groups;
};

} // namespace amp::ui

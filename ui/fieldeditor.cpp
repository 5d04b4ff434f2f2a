// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/fieldeditor.h"

#include "ui/designdocument.h"
#include "ui/errorlabel.h"
#include "ui/palette.h"

#include <nlohmann/json.hpp>

#include <QCheckBox>
#include <QComboBox>
#include <QEvent>
#include <QKeyEvent>
#include <QLabel>
#include <QLineEdit>
#include <QVBoxLayout>

namespace amp::ui {

namespace {
QString toQ(const std::string& s) { return QString::fromStdString(s); }
} // namespace

FieldEditor::FieldEditor(DesignDocument* document, const FieldSpec& spec, QWidget* parent)
    : QWidget(parent), m_document(document), m_spec(spec), m_path(toQ(spec.path)) {
    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->setSpacing(2);
    setObjectName(QStringLiteral("field:") + toQ(spec.path));

    switch (spec.type) {
    case FieldSpec::Type::Boolean:
        m_check = new QCheckBox(this);
        layout->addWidget(m_check);
        connect(m_check, &QCheckBox::clicked, this, [this](bool on) {
            const EditOutcome r = m_document->setFieldValue(path(), on);
            if (!r) {
                showError(r.error);
                const QSignalBlocker block(m_check);
                m_check->setChecked(!on);
            } else {
                showError({});
            }
        });
        break;
    case FieldSpec::Type::Choice:
        m_combo = new QComboBox(this);
        for (const auto& c : spec.choices)
            m_combo->addItem(choiceLabel(c), toQ(c));
        layout->addWidget(m_combo);
        connect(m_combo, &QComboBox::activated, this, [this](int index) {
            const EditOutcome r = m_document->setFieldText(path(), m_combo->itemData(index).toString());
            refresh(true); // a refused choice snaps back to the design's value ...
            showError(r ? QString() : r.error); // ... with the reason beside it
        });
        break;
    default:
        m_edit = new QLineEdit(this);
        m_edit->installEventFilter(this);
        if (spec.type == FieldSpec::Type::Number && spec.unit != units::Unit::None)
            m_edit->setPlaceholderText(tr("value in %1").arg(toQ(std::string(units::symbol(spec.unit)))));
        layout->addWidget(m_edit);
        connect(m_edit, &QLineEdit::editingFinished, this, &FieldEditor::commitText);
        break;
    }

    m_error = makeErrorLabel(QStringLiteral("fieldError"), this);
    QFont small = m_error->font();
    small.setPointSizeF(small.pointSizeF() * 0.9);
    m_error->setFont(small);
    layout->addWidget(m_error);

    const QString tip = tooltipFor(spec);
    input()->setToolTip(tip);
    refresh(true);
}

QString FieldEditor::path() const { return m_path; }

QWidget* FieldEditor::input() const {
    if (m_edit)
        return m_edit;
    if (m_check)
        return m_check;
    return m_combo;
}

QString FieldEditor::errorText() const { return m_error->isHidden() ? QString() : m_error->text(); }

void FieldEditor::refresh(bool force) {
    if (!force && !m_error->isHidden())
        return; // a refused entry stays on screen until the user edits or reverts it
    m_refreshing = true;
    if (force)
        showError({});
    const nlohmann::json value = m_document->fieldValue(path());
    if (m_edit) {
        // The same text, untouched and with the cursor at its start, is left as it is: setText()
        // would lay the line out again (every editor of every page follows every edit).
        const QString text = formatFieldValue(m_spec, value);
        if (text != m_edit->text() || m_edit->isModified() || m_edit->cursorPosition() != 0 ||
            m_edit->hasSelectedText()) {
            m_edit->setText(text);
            m_edit->setCursorPosition(0);
        }
    } else if (m_check) {
        const QSignalBlocker block(m_check);
        m_check->setChecked(value.is_boolean() && value.get<bool>());
    } else if (m_combo) {
        const QSignalBlocker block(m_combo);
        const int index = value.is_string() ? m_combo->findData(toQ(value.get<std::string>())) : -1;
        m_combo->setCurrentIndex(index);
    }
    m_refreshing = false;
}

void FieldEditor::commitText() {
    if (m_refreshing || !m_edit)
        return;
    // Leaving a field that was not typed in changes nothing (the shown text may be rounded).
    if (!m_edit->isModified() && m_error->isHidden())
        return;
    const EditOutcome r = m_document->setFieldText(path(), m_edit->text());
    if (!r) {
        showError(r.error);
        return;
    }
    // Taken: show the value as the design holds it ("4k7" becomes "4.7 Ω").
    refresh(true);
}

bool FieldEditor::enterText(const QString& text) {
    if (m_edit) {
        m_edit->setText(text);
        m_edit->setModified(true);
        commitText();
    } else {
        const EditOutcome r = m_document->setFieldText(path(), text);
        refresh(true);
        if (!r)
            showError(r.error);
    }
    return m_error->isHidden();
}

void FieldEditor::showError(const QString& message) {
    m_error->setText(message);
    m_error->setVisible(!message.isEmpty());
    if (m_edit) {
        QPalette pal = m_edit->palette();
        pal.setColor(QPalette::Base, message.isEmpty() ? palette().color(QPalette::Base) : colours::errorField());
        m_edit->setPalette(pal);
    }
}

bool FieldEditor::eventFilter(QObject* watched, QEvent* event) {
    if (watched == m_edit && event->type() == QEvent::KeyPress) {
        if (static_cast<QKeyEvent*>(event)->key() == Qt::Key_Escape) {
            refresh(true); // give up the entry: back to the design's value
            return true;
        }
    }
    return QWidget::eventFilter(watched, event);
}

QString FieldEditor::tooltipFor(const FieldSpec& spec) {
    QString tip = QStringLiteral("<b>%1</b>").arg(toQ(spec.label.empty() ? spec.path : spec.label).toHtmlEscaped());
    if (!spec.help.empty())
        tip += QStringLiteral("<br>") + toQ(spec.help).toHtmlEscaped();
    QStringList facts;
    if (spec.type == FieldSpec::Type::Number || spec.type == FieldSpec::Type::Integer) {
        const std::string_view sym = units::symbol(spec.unit);
        if (!sym.empty())
            facts << tr("Unit: %1").arg(toQ(std::string(sym)).toHtmlEscaped());
        if (spec.max > spec.min) {
            const QString lo = formatFieldValue(spec, spec.min);
            const QString hi = formatFieldValue(spec, spec.max);
            facts << (spec.minExclusive ? tr("Allowed: above %1, up to %2") : tr("Allowed: %1 … %2"))
                         .arg(lo.toHtmlEscaped(), hi.toHtmlEscaped());
        }
    }
    if (spec.type == FieldSpec::Type::Choice) {
        QStringList names;
        for (const auto& c : spec.choices)
            names << choiceLabel(c).toHtmlEscaped();
        facts << tr("One of: %1").arg(names.join(QStringLiteral(", ")));
    }
    if (!facts.isEmpty())
        tip += QStringLiteral("<br>") + facts.join(QStringLiteral(" · "));
    if (spec.type == FieldSpec::Type::Number && spec.unit != units::Unit::None)
        tip += QStringLiteral("<br><i>%1</i>")
                   .arg(tr("Type a number with a prefix and/or the unit, e.g. 3.5m, 16 kHz, 4k7. "
                           "Esc restores the value."));
    tip += QStringLiteral("<br><span style='color:gray'>%1</span>").arg(toQ(spec.path).toHtmlEscaped());
    return tip;
}

QString FieldEditor::choiceLabel(const std::string& choice) {
    // Abbreviations the trade writes in capitals.
    if (choice == "mosfet")
        return QStringLiteral("MOSFET");
    if (choice == "pvc" || choice == "xlpe" || choice == "tvs")
        return toQ(choice).toUpper();
    // Pairs read as pairs.
    if (choice == "torqueSpeed")
        return tr("Torque & speed");
    if (choice == "currentSpeed")
        return tr("Current & speed");
    if (choice == "currentDuty")
        return tr("Current & duty");
    if (choice == "diodeZener")
        return tr("Diode + Zener");
    QString out;
    for (const QChar c : toQ(choice)) {
        if (c.isUpper() && !out.isEmpty())
            out += QLatin1Char(' ');
        out += c.toLower();
    }
    if (!out.isEmpty())
        out[0] = out[0].toUpper();
    return out;
}

} // namespace amp::ui

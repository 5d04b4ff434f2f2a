// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/parteditor.h"

#include "core/io/partslibrary.h"
#include "core/io/projectfile.h"
#include "core/model/fields.h"
#include "core/units/units.h"
#include "ui/designdocument.h"
#include "ui/errorlabel.h"
#include "ui/fieldeditor.h"
#include "ui/palette.h"
#include "ui/partpicker.h"

#include <QCheckBox>
#include <QComboBox>
#include <QDialogButtonBox>
#include <QDir>
#include <QFileInfo>
#include <QFormLayout>
#include <QGroupBox>
#include <QLabel>
#include <QLineEdit>
#include <QPushButton>
#include <QScrollArea>
#include <QVBoxLayout>

#include <algorithm>

namespace amp::ui {

namespace {

QString toQ(const std::string& s) { return QString::fromStdString(s); }

bool isScalar(const FieldSpec& f) {
    return f.type != FieldSpec::Type::List && f.path.find("[]") == std::string::npos;
}

/// The group a part field belongs to: "" (the part itself) or its parameter set.
QString groupOf(const FieldSpec& f) {
    const QString path = toQ(f.path);
    const int dot = path.indexOf(QLatin1Char('.'));
    return dot < 0 ? QString() : path.left(dot);
}

const nlohmann::json* at(const nlohmann::json& j, const QString& path) {
    const nlohmann::json* node = &j;
    for (const QString& key : path.split(QLatin1Char('.'))) {
        if (!node->is_object())
            return nullptr;
        const auto it = node->find(key.toStdString());
        if (it == node->end())
            return nullptr;
        node = &*it;
    }
    return node;
}

void put(nlohmann::json& j, const QString& path, nlohmann::json value) {
    nlohmann::json* node = &j;
    const QStringList keys = path.split(QLatin1Char('.'));
    for (int i = 0; i + 1 < keys.size(); ++i) {
        nlohmann::json& child = (*node)[keys[i].toStdString()];
        if (!child.is_object())
            child = nlohmann::json::object();
        node = &child;
    }
    (*node)[keys.back().toStdString()] = std::move(value);
}

} // namespace

QString partFileName(const QString& id) {
    QString out;
    for (const QChar c : id.trimmed())
        out += (c.isLetterOrNumber() && c.unicode() < 128) || c == QLatin1Char('-') || c == QLatin1Char('_') ||
                       c == QLatin1Char('.')
                   ? c
                   : QLatin1Char('-');
    if (out.isEmpty() || out.startsWith(QLatin1Char('.')))
        out.prepend(QStringLiteral("part"));
    return out + QStringLiteral(".json");
}

PartEditorDialog::PartEditorDialog(const QString& kind, const nlohmann::json& start, const QString& folder,
                                   QWidget* parent)
    : QDialog(parent), m_kind(kind), m_folder(folder) {
    setObjectName(QStringLiteral("partEditor"));
    setWindowTitle(tr("My own %1 part").arg(kind));
    resize(640, 760);

    // The starting values in part-file form: "partId" becomes a suggested id of one's own.
    m_start = start.is_object() ? start : nlohmann::json::object();
    std::string fromId;
    if (auto it = m_start.find("partId"); it != m_start.end()) {
        if (it->is_string())
            fromId = it->get<std::string>();
        m_start.erase(it);
    }
    if (!m_start.contains("id"))
        m_start["id"] = fromId.empty() ? std::string("my-") + kind.toStdString() : "my-" + fromId;
    m_start.erase("invented"); // one's own part is a real one from a datasheet
    if (!fromId.empty() && m_start.contains("name") && m_start["name"].is_string())
        m_start["note"] = "Entered from a datasheet, starting from library part " + fromId + ".";

    auto* outer = new QVBoxLayout(this);
    auto* intro = new QLabel(tr("Enter the values from the datasheet. Numbers take a unit or prefix (3.5 mΩ, "
                                "80n, 1.2 kA). The part is saved to %1 and checked exactly as the library "
                                "checks its files. Foster stages, SOA points and tables are kept from the "
                                "part you started from.")
                                 .arg(QDir::toNativeSeparators(folder)),
                             this);
    intro->setWordWrap(true);
    outer->addWidget(intro);

    auto* scroll = new QScrollArea(this);
    scroll->setWidgetResizable(true);
    scroll->setFrameShape(QFrame::NoFrame);
    auto* body = new QWidget;
    auto* column = new QVBoxLayout(body);
    QMap<QString, QFormLayout*> forms;
    auto formFor = [&](const QString& group) {
        if (auto it = forms.find(group); it != forms.end())
            return *it;
        QString title = tr("Part");
        if (group == QLatin1String("mosfet"))
            title = tr("MOSFET data");
        else if (group == QLatin1String("bjt"))
            title = tr("Bipolar output stage");
        else if (group == QLatin1String("driver"))
            title = tr("Darlington driver stage");
        else if (!group.isEmpty())
            title = group;
        auto* box = new QGroupBox(title, body);
        auto* form = new QFormLayout(box);
        form->setFieldGrowthPolicy(QFormLayout::AllNonFixedFieldsGrow);
        column->addWidget(box);
        forms.insert(group, form);
        if (!group.isEmpty())
            m_kindGroups.insert(group, box);
        return form;
    };
    for (const FieldSpec& spec : partFields(kind.toStdString())) {
        if (!isScalar(spec) || spec.path == "invented")
            continue;
        QFormLayout* form = formFor(groupOf(spec));
        addField(spec, form->parentWidget(), form);
    }
    column->addStretch(1);
    scroll->setWidget(body);
    outer->addWidget(scroll, 1);

    m_problems = makeErrorLabel(QStringLiteral("partProblems"), this);
    outer->addWidget(m_problems);

    auto* buttons = new QDialogButtonBox(QDialogButtonBox::Save | QDialogButtonBox::Cancel, this);
    buttons->button(QDialogButtonBox::Save)->setText(tr("Save to my parts"));
    connect(buttons, &QDialogButtonBox::accepted, this, &PartEditorDialog::accept);
    connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
    outer->addWidget(buttons);

    if (auto* kindCombo = qobject_cast<QComboBox*>(m_inputs.value(QStringLiteral("kind"))); kindCombo && kind == "switch")
        connect(kindCombo, &QComboBox::currentIndexChanged, this, [this] { showKindGroups(); });
    showKindGroups();
}

void PartEditorDialog::addField(const FieldSpec& spec, QWidget* parent, QFormLayout* form) {
    const QString path = toQ(spec.path);
    const nlohmann::json* value = at(m_start, path);
    QWidget* input = nullptr;
    switch (spec.type) {
    case FieldSpec::Type::Boolean: {
        auto* check = new QCheckBox(parent);
        check->setChecked(value && value->is_boolean() && value->get<bool>());
        input = check;
        break;
    }
    case FieldSpec::Type::Choice: {
        auto* combo = new QComboBox(parent);
        for (const auto& c : spec.choices)
            combo->addItem(c.empty() ? tr("(not stated)") : FieldEditor::choiceLabel(c), toQ(c));
        if (value && value->is_string())
            combo->setCurrentIndex(std::max(0, combo->findData(toQ(value->get<std::string>()))));
        input = combo;
        break;
    }
    default: {
        auto* edit = new QLineEdit(parent);
        if (value)
            edit->setText(value->is_string() ? toQ(value->get<std::string>()) : formatFieldValue(spec, *value));
        if (spec.type == FieldSpec::Type::Number && spec.unit != units::Unit::None)
            edit->setPlaceholderText(tr("value in %1").arg(toQ(std::string(units::symbol(spec.unit)))));
        edit->setCursorPosition(0);
        input = edit;
        break;
    }
    }
    input->setObjectName(QStringLiteral("part:") + path);
    input->setToolTip(FieldEditor::tooltipFor(spec));
    QString label = toQ(spec.label.empty() ? spec.path : spec.label);
    if (spec.required)
        label += QStringLiteral(" *");
    auto* l = new QLabel(label, parent);
    l->setToolTip(input->toolTip());
    form->addRow(l, input);
    m_inputs.insert(path, input);
    m_specs.insert(path, &spec);
}

void PartEditorDialog::showKindGroups() {
    if (m_kind != QLatin1String("switch"))
        return;
    const QString k = fieldText(QStringLiteral("kind"));
    if (auto* g = m_kindGroups.value(QStringLiteral("mosfet")))
        g->setVisible(k == QLatin1String("mosfet"));
    if (auto* g = m_kindGroups.value(QStringLiteral("bjt")))
        g->setVisible(k == QLatin1String("bipolar") || k == QLatin1String("darlington"));
    if (auto* g = m_kindGroups.value(QStringLiteral("driver")))
        g->setVisible(k == QLatin1String("darlington"));
}

QWidget* PartEditorDialog::fieldInput(const QString& path) const { return m_inputs.value(path); }

QString PartEditorDialog::fieldText(const QString& path) const {
    QWidget* w = m_inputs.value(path);
    if (auto* e = qobject_cast<QLineEdit*>(w))
        return e->text();
    if (auto* c = qobject_cast<QCheckBox*>(w))
        return c->isChecked() ? QStringLiteral("yes") : QStringLiteral("no");
    if (auto* c = qobject_cast<QComboBox*>(w))
        return c->currentData().toString();
    return {};
}

bool PartEditorDialog::setFieldText(const QString& path, const QString& text) {
    QWidget* w = m_inputs.value(path);
    if (auto* e = qobject_cast<QLineEdit*>(w)) {
        e->setText(text);
        return true;
    }
    if (auto* c = qobject_cast<QCheckBox*>(w)) {
        c->setChecked(text == QLatin1String("yes") || text == QLatin1String("true"));
        return true;
    }
    if (auto* c = qobject_cast<QComboBox*>(w)) {
        const int i = c->findData(text);
        if (i < 0)
            return false;
        c->setCurrentIndex(i);
        return true;
    }
    return false;
}

nlohmann::json PartEditorDialog::partObject(QStringList* problems) const {
    // Start from the part begun with, so that its lists and any field this build does not show
    // travel along; then every entry of the form.
    nlohmann::json part = m_start;
    const bool isSwitch = m_kind == QLatin1String("switch");
    const QString switchKind = isSwitch ? fieldText(QStringLiteral("kind")) : QString();
    for (auto it = m_specs.constBegin(); it != m_specs.constEnd(); ++it) {
        const QString& path = it.key();
        const FieldSpec& spec = *it.value();
        // A switch states the parameter set of its own kind only.
        if (isSwitch) {
            const QString group = groupOf(spec);
            if ((group == QLatin1String("mosfet") && switchKind != QLatin1String("mosfet")) ||
                (group == QLatin1String("bjt") && switchKind == QLatin1String("mosfet")) ||
                (group == QLatin1String("driver") && switchKind != QLatin1String("darlington")))
                continue;
        }
        const QString text = fieldText(path).trimmed();
        switch (spec.type) {
        case FieldSpec::Type::Boolean:
            put(part, path, text == QLatin1String("yes"));
            break;
        case FieldSpec::Type::Choice:
            put(part, path, text.toStdString());
            break;
        case FieldSpec::Type::Text:
            if (text.isEmpty() && !spec.required) {
                // an optional text left empty is not stated
                if (path == QLatin1String("note"))
                    part.erase("note");
                break;
            }
            put(part, path, text.toStdString());
            break;
        case FieldSpec::Type::Number:
        case FieldSpec::Type::Integer: {
            if (text.isEmpty()) {
                if (spec.required && problems)
                    *problems << tr("%1 (%2): missing").arg(path, toQ(spec.label));
                continue;
            }
            const units::Parsed parsed = units::parse(text.toStdString(), spec.unit);
            if (!parsed) {
                if (problems)
                    *problems << tr("%1 (%2): %3").arg(path, toQ(spec.label), toQ(parsed.error));
                continue;
            }
            put(part, path, *parsed.value);
            break;
        }
        case FieldSpec::Type::List:
            break;
        }
    }
    if (isSwitch) {
        // Parameter sets of the other kinds are not part of this part.
        if (switchKind != QLatin1String("mosfet"))
            part.erase("mosfet");
        if (switchKind == QLatin1String("mosfet"))
            part.erase("bjt");
        if (switchKind != QLatin1String("darlington"))
            part.erase("driver");
    }
    if (problems) {
        // The part file's own checks, as loadPartFile applies them.
        nlohmann::json checked = part;
        for (const auto& p : convertUnitStrings(checked))
            *problems << tr("%1: %2").arg(toQ(p.path), toQ(p.message));
        for (const auto& p : validatePartJson(checked, m_kind.toStdString())) {
            const QString line = tr("%1: %2").arg(toQ(p.path), toQ(p.message));
            if (!problems->contains(line) &&
                std::none_of(problems->begin(), problems->end(),
                             [&](const QString& q) { return q.startsWith(toQ(p.path) + QLatin1Char(' ')); }))
                *problems << line;
        }
    }
    return part;
}

QStringList PartEditorDialog::save() {
    QStringList problems;
    const nlohmann::json part = partObject(&problems);
    if (problems.isEmpty()) {
        const QString id = toQ(part.value("id", std::string()));
        nlohmann::json file = nlohmann::json::object();
        file["formatVersion"] = 1;
        file["kind"] = m_kind.toStdString();
        file["note"] = "Own part entered in the Ampwright part editor.";
        file["parts"] = nlohmann::json::array({part});
        if (!QDir().mkpath(m_folder)) {
            problems << tr("cannot create the folder %1").arg(QDir::toNativeSeparators(m_folder));
        } else {
            const QString path = QDir(m_folder).absoluteFilePath(partFileName(id));
            const SaveResult saved = writeFileAtomically(path.toStdString(), file.dump(2) + "\n");
            if (!saved) {
                problems << tr("cannot save %1: %2").arg(QDir::toNativeSeparators(path), toQ(saved.error));
            } else {
                // Read back as the library will: the file must load without a problem.
                PartsLibrary check;
                loadPartFile(path.toStdString(), check);
                for (const auto& p : check.problems)
                    problems << tr("%1: %2").arg(toQ(p.problem.path), toQ(p.problem.message));
                if (problems.isEmpty()) {
                    m_savedFile = path;
                    m_savedId = id;
                    reloadWorkbenchLibrary();
                }
            }
        }
    }
    QStringList paths;
    for (const auto& p : problems)
        paths << p.section(QLatin1Char(' '), 0, 0).remove(QLatin1Char(':'));
    markProblems(paths);
    m_problems->setText(problems.join(QLatin1Char('\n')));
    m_problems->setVisible(!problems.isEmpty());
    return problems;
}

QString PartEditorDialog::problemText() const { return m_problems->isHidden() ? QString() : m_problems->text(); }

void PartEditorDialog::markProblems(const QStringList& paths) {
    for (auto it = m_inputs.constBegin(); it != m_inputs.constEnd(); ++it) {
        auto* edit = qobject_cast<QLineEdit*>(it.value());
        if (!edit)
            continue;
        QPalette pal = edit->palette();
        pal.setColor(QPalette::Base,
                     paths.contains(it.key()) ? colours::errorField() : palette().color(QPalette::Base));
        edit->setPalette(pal);
    }
}

void PartEditorDialog::accept() {
    if (save().isEmpty())
        QDialog::accept();
}

} // namespace amp::ui

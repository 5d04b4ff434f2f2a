// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/sections.h"

#include "core/model/fields.h"

#include <QCoreApplication>

namespace amp::ui {

namespace {

QString tr(const char* text) { return QCoreApplication::translate("amp::ui::sections", text); }

bool isScalar(const FieldSpec& f) {
    return f.type != FieldSpec::Type::List && f.path.find("[]") == std::string::npos;
}

std::vector<SectionSpec> buildSections() {
    auto kindIs = [](std::initializer_list<const char*> kinds) {
        std::vector<std::string> list(kinds.begin(), kinds.end());
        return [list](const Design& d) {
            for (const auto& k : list)
                if (d.bank.device.kind == k)
                    return true;
            return false;
        };
    };
    std::vector<SectionSpec> s;
    s.push_back({QStringLiteral("supply"), tr("Supply & PWM"),
                 tr("The battery as the bank sees it, and how the controller chops it."),
                 {{QStringLiteral("supply"), tr("Battery"), {}},
                  {QStringLiteral("pwm"), tr("Modulation and current limit"), {}}}});
    s.push_back({QStringLiteral("motor"), tr("Motor"),
                 tr("The brushed machine on the other end of the cable."),
                 {{QStringLiteral("motor"), tr("Armature and magnets"), {}}}});
    s.push_back({QStringLiteral("bank"), tr("Switch bank"),
                 tr("How many switches share the current, what they are and how they are driven."),
                 {{QStringLiteral("bank"), tr("Bank"), {}},
                  {QStringLiteral("bank.device"), tr("Nominal device"), {}},
                  {QStringLiteral("bank.device.mosfet"), tr("MOSFET data"), kindIs({"mosfet"})},
                  {QStringLiteral("bank.device.bjt"), tr("Bipolar output stage"), kindIs({"bipolar", "darlington"})},
                  {QStringLiteral("bank.device.driver"), tr("Darlington driver stage"), kindIs({"darlington"})},
                  {QStringLiteral("drive"), tr("Gate / base drive"), {}},
                  {QStringLiteral("bank.freewheelDiode"), tr("Freewheel diode"), {}},
                  {QStringLiteral("bank.spread"), tr("Spread between devices"), {}}}});
    s.push_back({QStringLiteral("heatsink"), tr("Heatsink"),
                 tr("Where the heat of the bank goes: interface, sink and the air around it."),
                 {{QStringLiteral("heatsink"), tr("Mounting and surroundings"), {}},
                  {QStringLiteral("heatsink.part"), tr("Heatsink as stated"), {}},
                  {QStringLiteral("bank.interface"), tr("Thermal interface (per device)"), {}}}});
    s.push_back({QStringLiteral("reversing"), tr("Reversing contactor"),
                 tr("Direction change by swapping the armature leads, never under load."),
                 {{QStringLiteral("reversing"), tr("Change-over"), {}},
                  {QStringLiteral("reversing.contactor"), tr("Contactor ratings"), {}}}});
    auto keyHas = [](std::initializer_list<const char*> words) {
        QStringList list;
        for (const char* w : words)
            list << QString::fromLatin1(w);
        return [list](const QString& key) {
            for (const auto& w : list)
                if (key.contains(w, Qt::CaseInsensitive))
                    return true;
            return false;
        };
    };
    s.push_back({QStringLiteral("wiring"), tr("Wiring & protection"),
                 tr("What sits between the battery, the controller and the motor: cables, the bus capacitors, "
                    "the main contactor with its pre-charge, and the fuse."),
                 {{QStringLiteral("wiring"), tr("Cables"), {}, keyHas({"cable"})},
                  {QStringLiteral("wiring"), tr("Bus capacitors"), {}, keyHas({"capacit", "esr", "loop", "ripple"})},
                  {QStringLiteral("wiring.mainContactor"), tr("Main contactor"), {}, {}},
                  {QStringLiteral("wiring"), tr("Pre-charge"), {}, keyHas({"precharge"})},
                  {QStringLiteral("wiring"), tr("Fuse and short circuit"), {}, keyHas({"fuse", "i2t", "withstand"})}}});
    s.push_back({QStringLiteral("sheet"), tr("Title block"),
                 tr("Names and notes printed on the design sheet."),
                 {{QStringLiteral("meta"), tr("Design"), {}}}});
    return s;
}

} // namespace

const std::vector<SectionSpec>& editorSections() {
    static const std::vector<SectionSpec> sections = buildSections();
    return sections;
}

QString parentPath(const QString& path) {
    const int dot = path.lastIndexOf(QLatin1Char('.'));
    return dot < 0 ? QString() : path.left(dot);
}

std::vector<const FieldSpec*> fieldsWithParent(const QString& prefix) {
    std::vector<const FieldSpec*> out;
    for (const auto& f : designFields())
        if (isScalar(f) && parentPath(QString::fromStdString(f.path)) == prefix)
            out.push_back(&f);
    return out;
}

std::vector<const FieldSpec*> groupFields(const GroupSpec& group) {
    std::vector<const FieldSpec*> out;
    for (const FieldSpec* f : fieldsWithParent(group.prefix)) {
        const QString path = QString::fromStdString(f->path);
        if (!group.includes || group.includes(path.mid(path.lastIndexOf(QLatin1Char('.')) + 1)))
            out.push_back(f);
    }
    return out;
}

std::vector<const FieldSpec*> unlistedFields(const SectionSpec& section) {
    std::vector<const FieldSpec*> out;
    for (const auto& f : designFields()) {
        if (!isScalar(f))
            continue;
        const QString path = QString::fromStdString(f.path);
        if (sectionForField(path) != &section)
            continue;
        const QString parent = parentPath(path);
        const QString key = path.mid(parent.size() + 1);
        bool listed = false;
        for (const auto& g : section.groups)
            listed = listed || (g.prefix == parent && (!g.includes || g.includes(key)));
        if (!listed)
            out.push_back(&f);
    }
    return out;
}

const SectionSpec* sectionForField(const QString& path) {
    // The section whose group prefix is the longest match wins (bank.interface -> Heatsink).
    const SectionSpec* best = nullptr;
    qsizetype bestLength = -1;
    for (const auto& s : editorSections())
        for (const auto& g : s.groups)
            if ((path == g.prefix || path.startsWith(g.prefix + QLatin1Char('.'))) && g.prefix.size() > bestLength) {
                best = &s;
                bestLength = g.prefix.size();
            }
    return best;
}

} // namespace amp::ui

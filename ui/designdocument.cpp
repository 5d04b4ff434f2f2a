// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/designdocument.h"

#include "core/engine/evaluate.h"
#include "core/io/projectfile.h"
#include "core/model/design_json.h"
#include "core/model/fields.h"
#include "core/units/units.h"
#include "ui/designeditcommand.h"

#include <nlohmann/json.hpp>

#include <QFileInfo>
#include <QUndoStack>

#include <algorithm>
#include <chrono>
#include <cmath>

namespace amp::ui {

namespace {

QString toQ(const std::string& s) { return QString::fromStdString(s); }

QString labelOf(const FieldSpec& spec) {
    return spec.label.empty() ? toQ(spec.path) : toQ(spec.label);
}

QString problemLine(const Problem& p) {
    return p.path.empty() ? toQ(p.message) : toQ(p.path) + QStringLiteral(": ") + toQ(p.message);
}

/// Problems in `after` that were not already in `before` (so that a quirk of an untouched field
/// never blocks an edit elsewhere).
std::vector<Problem> newProblems(const std::vector<Problem>& before, const std::vector<Problem>& after) {
    std::vector<Problem> out;
    for (const auto& p : after)
        if (std::find(before.begin(), before.end(), p) == before.end())
            out.push_back(p);
    return out;
}

QString describeNew(const std::vector<Problem>& problems, const QString& editedPath) {
    // The edited field's own message first; a conflict with another field names that field.
    QStringList own;
    QStringList others;
    for (const auto& p : problems) {
        if (toQ(p.path) == editedPath || p.path.empty())
            own << toQ(p.message);
        else
            others << problemLine(p);
    }
    return (own + others).join(QStringLiteral("; "));
}

std::optional<bool> parseBool(const QString& text) {
    const QString t = text.trimmed().toLower();
    if (t == "true" || t == "yes" || t == "on" || t == "1")
        return true;
    if (t == "false" || t == "no" || t == "off" || t == "0")
        return false;
    return std::nullopt;
}

QString rangeText(const FieldSpec& spec) {
    const QString lo = formatFieldValue(spec, spec.min);
    const QString hi = formatFieldValue(spec, spec.max);
    return spec.minExclusive ? QStringLiteral("above %1, up to %2").arg(lo, hi)
                             : QStringLiteral("%1 … %2").arg(lo, hi);
}

/// Range check from the field table; empty when the value is allowed.
QString rangeError(const FieldSpec& spec, double value) {
    if (!(spec.max > spec.min))
        return {}; // the table states no range for this field
    const bool below = spec.minExclusive ? value <= spec.min : value < spec.min;
    if (below || value > spec.max)
        return QStringLiteral("%1 is outside the allowed range (%2)")
            .arg(formatFieldValue(spec, value), rangeText(spec));
    return {};
}

/// Equal values, with numbers equal to within rounding of the text they were typed as ("3.5m"
/// parses to 3.5·10⁻³ give or take an ulp of the stored 0.0035).
bool sameValue(const nlohmann::json& a, const nlohmann::json& b) {
    if (a.is_number() && b.is_number()) {
        const double x = a.get<double>();
        const double y = b.get<double>();
        return std::abs(x - y) <= 1e-12 * std::max(std::abs(x), std::abs(y));
    }
    return a == b;
}

} // namespace

std::string jsonPointerFor(const QString& path) {
    std::string out;
    const std::string p = path.toStdString();
    if (p.empty())
        return out;
    out.reserve(p.size() + 4);
    out += '/';
    for (char c : p) {
        if (c == '.' || c == '[')
            out += '/';
        else if (c == ']')
            continue;
        else if (c == '~')
            out += "~0";
        else if (c == '/')
            out += "~1";
        else
            out += c;
    }
    // "a[2].b" became "/a/2//b": collapse the doubled separator left by "]."
    std::string collapsed;
    collapsed.reserve(out.size());
    for (char c : out)
        if (!(c == '/' && !collapsed.empty() && collapsed.back() == '/'))
            collapsed += c;
    return collapsed;
}

QString formatFieldValue(const FieldSpec& spec, const nlohmann::json& value) {
    if (value.is_boolean())
        return value.get<bool>() ? QStringLiteral("yes") : QStringLiteral("no");
    if (value.is_string())
        return toQ(value.get<std::string>());
    if (value.is_number_integer() && spec.type == FieldSpec::Type::Integer)
        return QString::number(value.get<long long>());
    if (value.is_number()) {
        const double v = value.get<double>();
        if (spec.type == FieldSpec::Type::Integer)
            return QString::number(std::llround(v));
        if (spec.unit == units::Unit::None) {
            // Whole counts in full ("100000", "1000000" rather than "1e+06"); ratios as typed.
            if (std::abs(v) < 1e12 && v == std::round(v))
                return QString::number(static_cast<long long>(v));
            return QString::number(v, 'g', 6);
        }
        return toQ(units::format(v, spec.unit, 6)); // an editor shows what the design holds
    }
    if (value.is_null())
        return {};
    return toQ(value.dump());
}

Design freshDesign() {
    Design d;
    normalizeBank(d.bank);
    d.dutyProfile = {Segment{}};
    return d;
}

DesignDocument::DesignDocument(QObject* parent) : QObject(parent), m_undo(new QUndoStack(this)) {
    connect(m_undo, &QUndoStack::cleanChanged, this, [this](bool clean) { emit modifiedChanged(!clean); });
    m_design = freshDesign();
    m_variants = {Variant{kDefaultVariantName, m_design}};
    m_untitledName = tr("Untitled");
    reevaluate();
}

DesignDocument::~DesignDocument() = default;

const nlohmann::json& DesignDocument::designJson() const {
    if (!m_json)
        m_json = std::make_unique<nlohmann::json>(m_design);
    return *m_json;
}

nlohmann::json DesignDocument::fieldValue(const QString& path) const {
    try {
        const nlohmann::json::json_pointer ptr(jsonPointerFor(path));
        const auto& j = designJson();
        if (!path.isEmpty() && j.contains(ptr))
            return j.at(ptr);
    } catch (const std::exception&) {
        // a malformed path is an unknown field
    }
    return nullptr;
}

QString DesignDocument::fieldText(const QString& path) const {
    const nlohmann::json value = fieldValue(path);
    if (const FieldSpec* spec = findField(path.toStdString()))
        return formatFieldValue(*spec, value);
    FieldSpec plain;
    return formatFieldValue(plain, value);
}

EditOutcome DesignDocument::setFieldText(const QString& path, const QString& text, const QString& commandText) {
    EditOutcome out;
    const FieldSpec* spec = findField(path.toStdString());
    if (!spec) {
        out.error = tr("%1 is not a field of the design").arg(path);
        return out;
    }
    const QString label = labelOf(*spec);
    nlohmann::json value;
    switch (spec->type) {
    case FieldSpec::Type::Number:
    case FieldSpec::Type::Integer: {
        const units::Parsed parsed = units::parse(text.trimmed().toStdString(), spec->unit);
        if (!parsed) {
            out.error = toQ(parsed.error);
            return out;
        }
        const double v = *parsed.value;
        if (spec->type == FieldSpec::Type::Integer) {
            if (std::abs(v - std::round(v)) > 1e-9) {
                out.error = tr("%1 must be a whole number, not %2").arg(label, text.trimmed());
                return out;
            }
            if (const QString e = rangeError(*spec, std::round(v)); !e.isEmpty()) {
                out.error = e;
                return out;
            }
            value = static_cast<long long>(std::llround(v));
        } else {
            if (const QString e = rangeError(*spec, v); !e.isEmpty()) {
                out.error = e;
                return out;
            }
            value = v;
        }
        break;
    }
    case FieldSpec::Type::Boolean: {
        const auto b = parseBool(text);
        if (!b) {
            out.error = tr("%1 takes yes or no, not \"%2\"").arg(label, text.trimmed());
            return out;
        }
        value = *b;
        break;
    }
    case FieldSpec::Type::Choice: {
        const QString t = text.trimmed();
        const auto it = std::find_if(spec->choices.begin(), spec->choices.end(), [&](const std::string& c) {
            return toQ(c).compare(t, Qt::CaseInsensitive) == 0;
        });
        if (it == spec->choices.end()) {
            QStringList allowed;
            for (const auto& c : spec->choices)
                allowed << toQ(c);
            out.error = tr("\"%1\" is not one of: %2").arg(t, allowed.join(QStringLiteral(", ")));
            return out;
        }
        value = *it;
        break;
    }
    case FieldSpec::Type::Text:
        value = text.toStdString();
        break;
    case FieldSpec::Type::List:
        out.error = tr("%1 is a list and is edited in its own table").arg(label);
        return out;
    }
    return setFieldValue(path, value, commandText);
}

EditOutcome DesignDocument::setFieldValue(const QString& path, const nlohmann::json& value,
                                          const QString& commandText) {
    EditOutcome out;
    const std::string pointerText = jsonPointerFor(path);
    nlohmann::json::json_pointer ptr;
    try {
        ptr = nlohmann::json::json_pointer(pointerText);
    } catch (const std::exception&) {
        out.error = tr("%1 is not a field of the design").arg(path);
        return out;
    }
    const nlohmann::json& current = designJson();
    if (pointerText.empty() || !current.contains(ptr)) {
        out.error = tr("%1 is not a field of the design").arg(path);
        return out;
    }
    if (sameValue(current.at(ptr), value)) { // nothing to change: no command
        out.accepted = true;
        return out;
    }

    nlohmann::json next = current;
    next[ptr] = value;
    if (auto problems = newProblems(validateDesignJson(current), validateDesignJson(next)); !problems.empty()) {
        out.error = describeNew(problems, path);
        return out;
    }
    Design nextDesign;
    try {
        nextDesign = next.get<Design>();
    } catch (const std::exception& e) {
        out.error = tr("%1: %2").arg(path, QString::fromUtf8(e.what()));
        return out;
    }
    if (path == QLatin1String("bank.count"))
        normalizeBank(nextDesign.bank);
    if (auto problems = newProblems(validateDesign(m_design), validateDesign(nextDesign)); !problems.empty()) {
        out.error = describeNew(problems, path);
        return out;
    }
    out.accepted = true;
    if (nextDesign == m_design)
        return out;

    const FieldSpec* spec = findField(path.toStdString());
    const QString label = spec ? labelOf(*spec) : path;
    const QString shown = spec ? formatFieldValue(*spec, value) : QString();
    const QString text = !commandText.isEmpty()                  ? commandText
                         : shown.isEmpty() || shown.size() > 40 ? tr("Change %1").arg(label)
                                                                : tr("Set %1 to %2").arg(label, shown);
    m_undo->push(new DesignEditCommand(this, m_design, std::move(nextDesign), text, path));
    out.changed = true;
    return out;
}

void DesignDocument::applyDesign(const Design& design, int variant) {
    const bool switched = variant >= 0 && variant != m_active && variant < static_cast<int>(m_variants.size());
    if (switched)
        m_active = variant;
    m_design = design;
    m_variants[static_cast<std::size_t>(m_active)].design = design;
    m_json.reset();
    reevaluate();
    emit designChanged();
    if (switched)
        emit variantsChanged();
}

void DesignDocument::applyVariants(const std::vector<Variant>& variants, int active) {
    m_variants = variants;
    m_active = std::clamp(active, 0, static_cast<int>(m_variants.size()) - 1);
    m_design = m_variants[static_cast<std::size_t>(m_active)].design;
    m_json.reset();
    reevaluate();
    emit designChanged();
    emit variantsChanged();
}

Project DesignDocument::project() const {
    Project p;
    p.variants = m_variants;
    p.variants[static_cast<std::size_t>(m_active)].design = m_design;
    p.active = p.variants[static_cast<std::size_t>(m_active)].name;
    return p;
}

QStringList DesignDocument::variantNames() const {
    QStringList out;
    for (const auto& v : m_variants)
        out << toQ(v.name);
    return out;
}

QString DesignDocument::activeVariantName() const { return toQ(m_variants[static_cast<std::size_t>(m_active)].name); }

bool DesignDocument::switchVariant(int index) {
    if (index < 0 || index >= static_cast<int>(m_variants.size()))
        return false;
    if (index == m_active)
        return true;
    m_variants[static_cast<std::size_t>(m_active)].design = m_design;
    applyDesign(m_variants[static_cast<std::size_t>(index)].design, index);
    return true;
}

void DesignDocument::reevaluate() {
    const auto start = std::chrono::steady_clock::now();
    try {
        m_results = amp::evaluate(m_design);
        m_evaluationError.clear();
    } catch (const std::exception& e) {
        // evaluate() should not throw for a validated design; if it does, say so and keep going
        m_results.reset();
        m_evaluationError = QString::fromUtf8(e.what());
    }
    m_evaluationMs = std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - start).count();
    emit resultsChanged();
}

QString DesignDocument::displayName() const {
    if (!m_filePath.isEmpty())
        return QFileInfo(m_filePath).completeBaseName();
    return m_untitledName.isEmpty() ? tr("Untitled") : m_untitledName;
}

bool DesignDocument::isModified() const { return !m_undo->isClean(); }

void DesignDocument::takeProject(Project project, const QString& filePath, const QString& untitledName) {
    m_undo->clear();
    m_undo->setClean();
    m_filePath = filePath;
    m_untitledName = untitledName;
    if (project.variants.empty())
        project = singleVariantProject(freshDesign());
    applyVariants(project.variants, static_cast<int>(project.activeIndex()));
    emit fileChanged();
    emit modifiedChanged(false);
}

void DesignDocument::newDesign() { takeProject(singleVariantProject(freshDesign()), {}, tr("Untitled")); }

LoadOutcome DesignDocument::load(const QString& file) {
    LoadOutcome out;
    LoadResult loaded;
    try {
        loaded = loadProject(std::filesystem::path(file.toStdString()));
    } catch (const std::exception& e) {
        out.problems << QString::fromUtf8(e.what());
        return out;
    }
    if (!loaded.project) {
        for (const auto& p : loaded.problems)
            out.problems << problemLine(p);
        if (out.problems.isEmpty())
            out.problems << tr("the file could not be read");
        return out;
    }
    takeProject(std::move(*loaded.project), QFileInfo(file).absoluteFilePath(), {});
    out.ok = true;
    return out;
}

LoadOutcome DesignDocument::loadAsCopy(const QString& file, const QString& untitledName) {
    LoadOutcome out = load(file);
    if (out) {
        m_filePath.clear();
        m_untitledName = untitledName;
        emit fileChanged();
    }
    return out;
}

QString DesignDocument::save(const QString& file) {
    SaveResult saved;
    try {
        saved = saveProject(project(), std::filesystem::path(file.toStdString()));
    } catch (const std::exception& e) {
        return QString::fromUtf8(e.what());
    }
    if (!saved)
        return saved.error.empty() ? tr("the file could not be written") : toQ(saved.error);
    m_filePath = QFileInfo(file).absoluteFilePath();
    m_untitledName.clear();
    m_undo->setClean();
    emit fileChanged();
    return {};
}

} // namespace amp::ui

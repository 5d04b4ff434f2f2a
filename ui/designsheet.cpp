// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/designsheet.h"

#include "ui/bankstudies.h"
#include "ui/fieldeditor.h"
#include "ui/sheetcharts.h"

#include "core/checks/catalogue.h"
#include "core/checks/cautions.h"
#include "core/engine/results.h"
#include "core/model/design.h"
#include "core/model/design_json.h"
#include "core/model/fields.h"
#include "core/units/units.h"

#include <QAbstractTextDocumentLayout>
#include <QDateTime>
#include <QDir>
#include <QFileInfo>
#include <QFontMetricsF>
#include <QGuiApplication>
#include <QPainter>
#include <QPdfWriter>
#include <QTextBlock>
#include <QTextCursor>
#include <QTextDocument>

#include <nlohmann/json.hpp>

#include <algorithm>
#include <cmath>
#include <functional>
#include <map>
#include <optional>
#include <vector>

namespace amp::ui {

namespace {

using units::Unit;

// ---- Section headings (the test reads them through designSheetSections) -------------------------

const QString kJob = QStringLiteral("What this sheet is");
const QString kGlance = QStringLiteral("At a glance");
const QString kInputs = QStringLiteral("Inputs");
const QString kPoints = QStringLiteral("Results by operating point");
const QString kDevices = QStringLiteral("Devices of the bank");
const QString kBankStudies = QStringLiteral("Bank stability, ballast and spread");
const QString kSharingChart = QStringLiteral("Current and temperature per device");
const QString kLossChart = QStringLiteral("Where the losses go");
const QString kTransient = QStringLiteral("Junction temperatures over the duty profile");
const QString kHeatsink = QStringLiteral("Heatsink and power cycling");
const QString kProtection = QStringLiteral("Contactors, fuse and cables");
const QString kReversal = QStringLiteral("Reversal sequence");
const QString kChecks = QStringLiteral("Checks");
const QString kCautions = QStringLiteral("Safety cautions");
const QString kLimits = QStringLiteral("Limits of this record");

// ---- Page geometry (millimetres and points; converted to device pixels when drawn) ------------

constexpr double kMarginSide_mm = 16.0;
constexpr double kMarginTop_mm = 12.0;
constexpr double kMarginBottom_mm = 12.0;
constexpr double kBodyFont_pt = 8.5;
constexpr double kHeaderGap_mm = 5.0; // between the header rule and the body, and body and footer
constexpr int kPdfResolution_dpi = 600;
constexpr int kPointsPerTable = 4;
constexpr std::size_t kPointsPerSpreadChart = 8; // at most, groups of five bars side by side in one chart
constexpr std::size_t kLifeCyclesShown = 12; // rows of the power-cycling table    // operating points side by side in the results table

QString fmt(double v, Unit u) { return QString::fromStdString(units::format(v, u, kSheetDigits)); }
// In running text a number keeps its unit on the same line.
QString fmtProse(double v, Unit u) { return fmt(v, u).replace(QChar(' '), QChar(0x00A0)); }
QString esc(const std::string& s) { return QString::fromStdString(s).toHtmlEscaped(); }
QString esc(const QString& s) { return s.toHtmlEscaped(); }
QString dash() { return QStringLiteral("—"); }

bool hasDevices(const Results& r) {
    return std::any_of(r.operatingPoints.begin(), r.operatingPoints.end(),
                       [](const OperatingPointResult& op) { return !op.devices.empty(); });
}

bool hasProtection(const Results& r) {
    const auto& p = r.protection;
    return p.contactor || p.mainDisconnect || p.precharge || p.cable || p.motorCable || p.fuse ||
           !p.bridgeComparison.empty();
}

double hottestDevice(const OperatingPointResult& op, int* index = nullptr) {
    double t = -1e300;
    for (std::size_t k = 0; k < op.devices.size(); ++k)
        if (op.devices[k].tj_C > t) {
            t = op.devices[k].tj_C;
            if (index)
                *index = static_cast<int>(k);
        }
    return t;
}

// The SI symbol a Check carries, back to its unit (for formatting with a prefix).
std::optional<Unit> unitOfSymbol(const std::string& symbol) {
    static const std::map<std::string, Unit> known = {
        {"V", Unit::Volt},     {"A", Unit::Ampere},  {"Ω", Unit::Ohm},          {"W", Unit::Watt},
        {"J", Unit::Joule},    {"°C", Unit::Celsius}, {"K", Unit::Kelvin},       {"K/W", Unit::KelvinPerWatt},
        {"s", Unit::Second},   {"Hz", Unit::Hertz},  {"H", Unit::Henry},         {"F", Unit::Farad},
        {"m", Unit::Metre},    {"mm²", Unit::SquareMillimetre}, {"N·m", Unit::NewtonMetre},
        {"rpm", Unit::Rpm},    {"%", Unit::Percent}, {"V/m", Unit::VoltPerMetre}, {"", Unit::None},
    };
    const auto it = known.find(symbol);
    if (it == known.end())
        return std::nullopt;
    return it->second;
}

QString checkNumber(double v, const std::string& unit) {
    if (const auto u = unitOfSymbol(unit))
        return fmt(v, *u);
    return fmt(v, Unit::None) + " " + esc(unit);
}

QString severityWord(Severity s) { return QString::fromLatin1(toString(s)).toUpper(); }

QString severityColour(Severity s) {
    switch (s) {
    case Severity::Fail: return QStringLiteral("#f4c7c3");
    case Severity::Warning: return QStringLiteral("#fbe3b0");
    case Severity::Advice: return QStringLiteral("#d4e4f4");
    case Severity::Pass: return QStringLiteral("#dcedd5");
    }
    return QStringLiteral("#ffffff");
}

QString topologyWords(const std::string& t) {
    if (t == "lowSideChopper")
        return QStringLiteral("low-side chopper");
    if (t == "synchronousHalfBridge")
        return QStringLiteral("synchronous half-bridge");
    if (t == "fullBridge")
        return QStringLiteral("full bridge");
    return QString::fromStdString(t);
}

QString deviceWords(const std::string& kind, int count) {
    const QString noun = kind == "mosfet" ? QStringLiteral("MOSFET") : kind == "bipolar" ? QStringLiteral("bipolar transistor")
                                                                                         : QStringLiteral("Darlington");
    return count == 1 ? noun : noun + "s";
}

QString numberWord(int n) {
    static const char* words[] = {"no", "one", "two", "three", "four", "five", "six", "seven", "eight", "nine",
                                  "ten", "eleven", "twelve"};
    return n >= 0 && n <= 12 ? QString::fromLatin1(words[n]) : QString::number(n);
}

// The charts are drawn by ui/sheetcharts.h.

QString stepWords(const std::string& id) {
    static const std::map<std::string, QString> words = {
        {"pwmOffCurrentDecay", "PWM off, armature current decays"},
        {"slowToStopSpeed", "motor slows to the change-over speed"},
        {"coilDropout", "contactor coil drops out"},
        {"changeoverMargin", "wait before the change-over"},
        {"pickupAndBounce", "other coil picks up, contacts bounce"},
        {"softRestartRamp", "PWM restarts on a soft ramp"},
    };
    const auto it = words.find(id);
    return it == words.end() ? QString::fromStdString(id) : it->second;
}

// ---- The document ------------------------------------------------------------------------------

/// Builds the HTML of the sheet; charts are recorded in `charts` and appear as placeholders.
class SheetWriter {
  public:
    SheetWriter(const Design& d, const Results& r, SheetCharts* charts) : m_d(d), m_r(r), m_charts(charts) {}

    QString html();
    QStringList sections() const { return m_sections; }
    std::vector<int> chartIds() const { return m_chartIds; }
    static QString placeholder(int id) { return QStringLiteral("@@chart-%1@@").arg(id); }

  private:
    // Lengths in the HTML are CSS pixels at 96 per inch; the layout scales them to the device.
    static double px(double pt) { return pt * 96.0 / 72.0; }
    void heading(const QString& title);
    void sub(const QString& title) { m_html += "<h3>" + esc(title) + "</h3>"; }
    void chart(SheetCharts::Draw draw, double height_mm);
    QString tableOpen(double widthPercent = 100.0) const;

    void titleBlock();
    void jobStatement();
    void glance();
    void inputs();
    void pointResults();
    void deviceTables();
    void bankStudies();
    void spreadChart();
    void sharingChart();
    void lossChart();
    void transient();
    void heatsinkAndLife();
    void protection();
    void reversal();
    void checks();
    void cautions();
    void limits();

    const Design& m_d;
    const Results& m_r;
    SheetCharts* m_charts;
    QString m_html;
    QStringList m_sections;
    std::vector<int> m_chartIds;
};

void SheetWriter::heading(const QString& title) {
    m_sections << title;
    m_html += QStringLiteral("<h2>%1&#160;&#160;%2</h2>").arg(m_sections.size()).arg(esc(title));
}

void SheetWriter::chart(SheetCharts::Draw draw, double height_mm) {
    const int id = m_charts ? m_charts->add(std::move(draw), height_mm) : -1;
    m_chartIds.push_back(id);
    m_html += "<p class=\"chart\">" + placeholder(id) + "</p>";
}

QString SheetWriter::tableOpen(double widthPercent) const {
    return QStringLiteral("<table width=\"%1%\" cellspacing=\"0\" cellpadding=\"%2\" border=\"%3\" "
                          "style=\"border-collapse: collapse; border-color: #9a9a9a; border-style: solid;\">")
        .arg(widthPercent, 0, 'f', 1)
        .arg(px(2.2), 0, 'f', 1)
        .arg(px(0.5), 0, 'f', 1);
}

void SheetWriter::titleBlock() {
    const auto& m = m_d.meta;
    const QString printed = QDateTime::currentDateTime().toString(QStringLiteral("yyyy-MM-dd HH:mm"));
    const Severity worst = worstSeverity(m_r.checks);
    int counts[4] = {0, 0, 0, 0};
    for (const auto& c : m_r.checks)
        ++counts[static_cast<int>(c.severity)];
    m_html += "<p class=\"kicker\">Ampwright design sheet</p>";
    m_html += "<h1>" + esc(m.title) + "</h1>";
    m_html += tableOpen();
    auto row = [&](const QString& a, const QString& av, const QString& b, const QString& bv) {
        m_html += "<tr><td class=\"key\" width=\"16%\">" + a + "</td><td width=\"34%\">" + av +
                  "</td><td class=\"key\" width=\"16%\">" + b + "</td><td width=\"34%\">" + bv + "</td></tr>";
    };
    row("Project", esc(m.title), "Revision", m.revision.empty() ? dash() : esc(m.revision));
    row("Author", m.author.empty() ? dash() : esc(m.author), "Date", m.date.empty() ? "not stated" : esc(m.date));
    row("Printed", esc(printed), "Computed by", QStringLiteral("Ampwright %1").arg(AMPWRIGHT_VERSION));
    row("Variant", m_r.variant.empty() ? QStringLiteral("as designed") : esc(m_r.variant), "Checks",
        QStringLiteral("<span style=\"background-color:%1\">&#160;%2&#160;</span>&#160; %3 fail, %4 warning, %5 advice, "
                       "%6 pass")
            .arg(severityColour(worst), severityWord(worst))
            .arg(counts[3])
            .arg(counts[2])
            .arg(counts[1])
            .arg(counts[0]));
    if (!m.notes.empty())
        m_html += "<tr><td class=\"key\">Notes</td><td colspan=\"3\">" + esc(m.notes).replace('\n', "<br/>") +
                  "</td></tr>";
    m_html += "</table>";
}

void SheetWriter::jobStatement() {
    heading(kJob);
    const auto& d = m_d;
    const QString motor = d.motor.kind == "seriesWound" ? QStringLiteral("a series-wound") : QStringLiteral("a permanent-magnet");
    const int points = static_cast<int>(d.dutyProfile.size());
    QString text = QStringLiteral(
                       "This sheet records the power stage of a brushed DC motor drive as designed and computed in "
                       "Ampwright: a %1 with %2 %3 in parallel (%4) switching at %5, fed from a %6 %7 battery "
                       "(highest %8, lowest %9) and driving %10 motor over a duty profile of %11 operating %12. ")
                       .arg(topologyWords(d.pwm.topology), numberWord(d.bank.count), deviceWords(d.bank.device.kind, d.bank.count),
                            esc(d.bank.device.name), fmtProse(d.pwm.frequency_Hz, Unit::Hertz), fmtProse(d.supply.nominal_V, Unit::Volt),
                            esc(d.supply.chemistry), fmtProse(d.supply.max_V, Unit::Volt), fmtProse(d.supply.min_V, Unit::Volt))
                       .arg(motor, numberWord(points), points == 1 ? QStringLiteral("point") : QStringLiteral("points"));
    text += QStringLiteral(
        "It lists every input with its unit, the currents, losses and temperatures computed for each operating "
        "point and each device, every design check with its number, its limit and where the limit comes from, "
        "and the safety cautions that apply. It is a calculation record for a build log, to be read and checked "
        "by the person who builds the drive; it certifies nothing.");
    m_html += "<p>" + text + "</p>";
}

void SheetWriter::glance() {
    heading(kGlance);
    m_html += tableOpen();
    auto row = [&](const QString& what, const QString& value, const QString& note) {
        m_html += "<tr><td class=\"key\" width=\"34%\">" + what + "</td><td class=\"num\" width=\"18%\">" + value +
                  "</td><td width=\"48%\">" + note + "</td></tr>";
    };
    const OperatingPointResult* hottest = nullptr;
    const OperatingPointResult* lossiest = nullptr;
    const OperatingPointResult* sinkHot = nullptr;
    for (const auto& op : m_r.operatingPoints) {
        if (op.devices.empty())
            continue;
        if (!hottest || hottestDevice(op) > hottestDevice(*hottest))
            hottest = &op;
        if (!lossiest || op.totalLoss_W > lossiest->totalLoss_W)
            lossiest = &op;
        if (!sinkHot || op.heatsinkTemperature_C > sinkHot->heatsinkTemperature_C)
            sinkHot = &op;
    }
    if (hottest) {
        int k = 0;
        hottestDevice(*hottest, &k);
        row("Hottest switch junction", fmt(m_r.maxJunction_C, Unit::Celsius),
            QStringLiteral("device %1 in “%2”; T_j,max of the part %3")
                .arg(k)
                .arg(esc(hottest->name), fmt(m_d.bank.device.tjMax_C, Unit::Celsius)));
        row("Highest power-stage loss", fmt(m_r.maxTotalLoss_W, Unit::Watt),
            QStringLiteral("in “%1” (bank, ballast and freewheel diodes)").arg(esc(lossiest->name)));
        row("Hottest heatsink", fmt(sinkHot->heatsinkTemperature_C, Unit::Celsius),
            QStringLiteral("in “%1”, ambient %2").arg(esc(sinkHot->name), fmt(m_d.heatsink.ambient_C, Unit::Celsius)));
        double diode = -1e300;
        const OperatingPointResult* dOp = nullptr;
        for (const auto& op : m_r.operatingPoints)
            if (!op.devices.empty() && op.freewheelDiode.tj_C > diode) {
                diode = op.freewheelDiode.tj_C;
                dOp = &op;
            }
        if (dOp)
            row("Hottest freewheel diode", fmt(diode, Unit::Celsius),
                QStringLiteral("in “%1”; T_j,max of the part %2")
                    .arg(esc(dOp->name), fmt(m_d.bank.freewheelDiode.tjMax_C, Unit::Celsius)));
        double peak = 0.0;
        for (const auto& op : m_r.operatingPoints)
            peak = std::max(peak, op.motorPeakCurrent_A);
        row("Highest armature current", fmt(peak, Unit::Ampere), QStringLiteral("peak of the ripple, any point"));
        if (m_r.transient)
            row("Hottest junction over the duty profile", fmt(m_r.transient->tjMax_C, Unit::Celsius),
                QStringLiteral("%1, %2 into the profile (transient)")
                    .arg(esc(m_r.transient->tjMaxSource), fmt(m_r.transient->tjMaxTime_s, Unit::Second)));
        const QString runaway = runawaySummary(m_d, m_r, fmt);
        bool unstable = false;
        std::optional<double> onset;
        for (const auto& op : m_r.operatingPoints) {
            unstable = unstable || (op.valid && !op.devices.empty() && (!op.bank.converged || !op.bank.stable));
            if (op.bank.runawayLoad_A && (!onset || *op.bank.runawayLoad_A < *onset))
                onset = op.bank.runawayLoad_A;
        }
        row("Thermal runaway of the bank",
            unstable ? QStringLiteral("<b>runs away</b>") : (onset ? fmt(*onset, Unit::Ampere) : QStringLiteral("none")),
            runaway.isEmpty() ? QStringLiteral("stable in every point, up to the current limit") : esc(runaway));
        if (m_r.stallTimeToLimit_s)
            row("Stall at the current limit", fmt(*m_r.stallTimeToLimit_s, Unit::Second),
                QStringLiteral("until the first junction reaches its T_j,max"));
    } else {
        row("Results", dash(), QStringLiteral("no operating point was computed: see the checks"));
    }
    // Non-passing checks in one line each.
    QStringList raised;
    for (const auto& c : m_r.checks)
        if (c.severity == Severity::Fail || c.severity == Severity::Warning)
            raised << QStringLiteral("%1 %2%3")
                          .arg(severityWord(c.severity), esc(c.id),
                               c.operatingPoint.empty() ? QString() : QStringLiteral(" (%1)").arg(esc(c.operatingPoint)));
    raised.removeDuplicates();
    row("Failed and warning checks", QString::number(raised.size()),
        raised.isEmpty() ? QStringLiteral("none") : raised.join(QStringLiteral("<br/>")));
    m_html += "</table>";
}

// The value of a design field as printed: a number with its unit, a word, or yes/no.
QString fieldValue(const FieldSpec& f, const nlohmann::json& v) {
    if (v.is_boolean())
        return v.get<bool>() ? QStringLiteral("yes") : QStringLiteral("no");
    if (v.is_number()) {
        if (f.type == FieldSpec::Type::Integer)
            return QString::number(v.get<long long>());
        return fmt(v.get<double>(), f.unit);
    }
    if (v.is_string())
        return esc(f.type == FieldSpec::Type::Choice ? FieldEditor::choiceLabel(v.get<std::string>())
                                                     : QString::fromStdString(v.get<std::string>()));
    return dash();
}

const nlohmann::json* at(const nlohmann::json& root, const std::string& path) {
    const nlohmann::json* node = &root;
    std::size_t start = 0;
    while (start <= path.size()) {
        const std::size_t dot = path.find('.', start);
        const std::string key = path.substr(start, dot == std::string::npos ? std::string::npos : dot - start);
        if (!node->is_object() || !node->contains(key))
            return nullptr;
        node = &(*node)[key];
        if (dot == std::string::npos)
            break;
        start = dot + 1;
    }
    return node;
}

bool startsWith(const std::string& s, const std::string& prefix) { return s.rfind(prefix, 0) == 0; }

// Which fields the sheet shows for this design: the ones the chosen device, topology and options use.
bool fieldShown(const Design& d, const FieldSpec& f) {
    const std::string& p = f.path;
    if (p.find("[]") != std::string::npos || startsWith(p, "meta.") || startsWith(p, "bank.spread.") ||
        p == "bank.devices" || p == "dutyProfile")
        return false;
    const std::string& kind = d.bank.device.kind;
    if (startsWith(p, "bank.device.mosfet.") && kind != "mosfet")
        return false;
    if (startsWith(p, "bank.device.bjt.") && kind == "mosfet")
        return false;
    if (startsWith(p, "bank.device.driver.") && kind != "darlington")
        return false;
    if ((p == "drive.baseDriveCurrent_A" || p == "drive.forcedBeta") && kind == "mosfet")
        return false;
    if (p == "pwm.deadTime_s" && d.pwm.topology == "lowSideChopper")
        return false;
    if (p == "motor.magnetisation" && d.motor.kind != "seriesWound")
        return false;
    if (p == "motor.torqueConstant_NmPerA" && d.motor.kind == "seriesWound")
        return false;
    if (startsWith(p, "reversing.") && p != "reversing.present" && !d.reversing.present)
        return false;
    if (p == "bank.interface.dielectricStrength_Vperm" && !d.bank.interface.insulating)
        return false;
    return true;
}

// A list field in one cell: "r 0.3 K/W, τ 10 ms; …".
QString listValue(const std::string& path, const nlohmann::json& v) {
    if (!v.is_array() || v.empty())
        return QStringLiteral("none");
    QStringList items;
    for (const auto& item : v) {
        QStringList parts;
        if (path.ends_with("zthJc"))
            parts << fmt(item.value("r_KperW", 0.0), Unit::KelvinPerWatt) << fmt(item.value("tau_s", 0.0), Unit::Second);
        else if (path.ends_with("soa")) {
            const double pulse = item.value("pulse_s", 0.0);
            parts << fmt(item.value("voltage_V", 0.0), Unit::Volt) << fmt(item.value("current_A", 0.0), Unit::Ampere)
                  << (pulse > 0.0 ? fmt(pulse, Unit::Second) : QStringLiteral("DC"));
        } else if (path.ends_with("rdsOnTable"))
            parts << fmt(item.value("tj_C", 0.0), Unit::Celsius) << QStringLiteral("× %1").arg(item.value("factor", 1.0));
        else if (path.ends_with("magnetisation"))
            parts << fmt(item.value("current_A", 0.0), Unit::Ampere)
                  << fmt(item.value("torqueConstant_NmPerA", 0.0), Unit::NewtonMetrePerAmpere);
        else
            parts << esc(item.dump());
        items << parts.join(QStringLiteral(" "));
    }
    return items.join(QStringLiteral("; "));
}

void SheetWriter::inputs() {
    heading(kInputs);
    m_html += "<p class=\"small\">Values as entered, in SI with engineering prefixes; temperatures in °C. Fields the "
              "chosen device type, topology and options do not use are left out.</p>";
    const nlohmann::json j = m_d;
    struct Group {
        std::string prefix;
        QString title;
        std::vector<std::string> exclude;
    };
    const std::vector<Group> groups = {
        {"supply.", "Battery", {}},
        {"motor.", "Motor", {}},
        {"pwm.", "Modulation and control", {}},
        {"drive.", "Gate or base drive", {}},
        {"bank.", "Bank", {"bank.device.", "bank.freewheelDiode.", "bank.interface."}},
        {"bank.device.", "Switch part", {}},
        {"bank.freewheelDiode.", "Freewheel diode", {}},
        {"bank.interface.", "Thermal interface", {}},
        {"heatsink.", "Heatsink", {}},
        {"reversing.", "Reversing contactor", {}},
        {"wiring.", "Wiring, bus capacitors and fuse", {"wiring.mainContactor."}},
        {"wiring.mainContactor.", "Main contactor", {}},
    };
    for (const auto& g : groups) {
        std::vector<std::pair<QString, QString>> wide; // a row of their own (part names)
        std::vector<std::pair<QString, QString>> cells;
        for (const auto& f : designFields()) {
            if (!startsWith(f.path, g.prefix) || !fieldShown(m_d, f))
                continue;
            if (std::any_of(g.exclude.begin(), g.exclude.end(), [&](const std::string& e) { return startsWith(f.path, e); }))
                continue;
            const nlohmann::json* v = at(j, f.path);
            if (!v)
                continue;
            if (f.path.ends_with(".cost") && v->is_number() && v->get<double>() == 0.0)
                continue;
            if (v->is_string() && v->get<std::string>().empty())
                continue;
            QString value = f.type == FieldSpec::Type::List ? listValue(f.path, *v) : fieldValue(f, *v);
            if (f.path.ends_with("_A2s") && v->is_number())
                value += QStringLiteral(" A²s"); // no prefix form for A²s in units::Unit
            if (f.path.ends_with(".name"))
                wide.emplace_back(esc(f.label), value);
            else
                cells.emplace_back(esc(f.label), value);
        }
        if (g.prefix == "bank.") {
            QStringList dev;
            for (std::size_t k = 0; k < m_d.bank.devices.size(); ++k) {
                const auto& b = m_d.bank.devices[k];
                QStringList parts;
                if (b.rdsOnDeviation != 0.0)
                    parts << QStringLiteral("R_ds(on) %1%2").arg(b.rdsOnDeviation > 0 ? "+" : "").arg(fmt(b.rdsOnDeviation, Unit::Percent));
                if (b.vthDeviation_V != 0.0)
                    parts << QStringLiteral("V_th %1").arg(fmt(b.vthDeviation_V, Unit::Volt));
                if (b.vbeDeviation_V != 0.0)
                    parts << QStringLiteral("V_BE %1").arg(fmt(b.vbeDeviation_V, Unit::Volt));
                if (b.betaDeviation != 0.0)
                    parts << QStringLiteral("β %1").arg(fmt(b.betaDeviation, Unit::Percent));
                if (b.gateResistorDeviation_ohm != 0.0)
                    parts << QStringLiteral("gate resistor %1").arg(fmt(b.gateResistorDeviation_ohm, Unit::Ohm));
                if (b.ballastDeviation_ohm != 0.0)
                    parts << QStringLiteral("ballast %1").arg(fmt(b.ballastDeviation_ohm, Unit::Ohm));
                if (b.legResistanceDeviation_ohm != 0.0)
                    parts << QStringLiteral("leg %1").arg(fmt(b.legResistanceDeviation_ohm, Unit::Ohm));
                if (!parts.isEmpty())
                    dev << QStringLiteral("device %1: %2").arg(k).arg(parts.join(", "));
            }
            cells.emplace_back(QStringLiteral("Per-device deviations"),
                               dev.isEmpty() ? QStringLiteral("none: every device nominal") : dev.join("<br/>"));
        }
        if (cells.empty() && wide.empty())
            continue;
        sub(g.title);
        m_html += tableOpen();
        for (const auto& [label, value] : wide)
            m_html += "<tr><td class=\"key\" width=\"27%\">" + label + "</td><td colspan=\"3\">" + value + "</td></tr>";
        for (std::size_t i = 0; i < cells.size(); i += 2) {
            m_html += "<tr><td class=\"key\" width=\"27%\">" + cells[i].first + "</td><td width=\"23%\">" +
                      cells[i].second + "</td>";
            if (i + 1 < cells.size())
                m_html += "<td class=\"key\" width=\"27%\">" + cells[i + 1].first + "</td><td width=\"23%\">" +
                          cells[i + 1].second + "</td>";
            else
                m_html += "<td width=\"27%\"></td><td width=\"23%\"></td>";
            m_html += "</tr>";
        }
        m_html += "</table>";
    }

    sub(QStringLiteral("Duty profile"));
    if (m_d.dutyProfile.empty()) {
        m_html += "<p>No operating point is given.</p>";
        return;
    }
    m_html += tableOpen();
    m_html += "<thead><tr class=\"head\"><td>Segment</td><td>Held for</td><td>Given as</td><td>Torque</td><td>Speed</td>"
              "<td>Motor current</td><td>Duty</td><td>Direction</td></tr></thead>";
    for (const auto& s : m_d.dutyProfile) {
        const bool ts = s.mode == "torqueSpeed";
        const bool cs = s.mode == "currentSpeed";
        const bool cd = s.mode == "currentDuty";
        const QString given = ts ? "torque and speed" : cs ? "current and speed" : cd ? "current and duty" : s.mode == "stall" ? "stall at the limit" : esc(s.mode);
        m_html += "<tr><td>" + esc(s.name) + "</td><td class=\"num\">" + fmt(s.duration_s, Unit::Second) + "</td><td>" +
                  given + "</td><td class=\"num\">" + (ts ? fmt(s.torque_Nm, Unit::NewtonMetre) : dash()) +
                  "</td><td class=\"num\">" + (ts || cs ? fmt(s.speed_rpm, Unit::Rpm) : dash()) + "</td><td class=\"num\">" +
                  (cs || cd ? fmt(s.motorCurrent_A, Unit::Ampere) : dash()) + "</td><td class=\"num\">" +
                  (cd ? fmt(s.duty, Unit::Percent) : dash()) + "</td><td>" + esc(s.direction) + "</td></tr>";
    }
    m_html += "</table>";
}

void SheetWriter::pointResults() {
    heading(kPoints);
    const auto& ops = m_r.operatingPoints;
    if (ops.empty()) {
        m_html += "<p>No operating point was computed.</p>";
        return;
    }
    struct Row {
        QString label;
        std::function<QString(const OperatingPointResult&)> value;
    };
    const std::vector<Row> rows = {
        {"Motor current (average)", [](const auto& o) { return fmt(o.motorCurrent_A, Unit::Ampere); }},
        {"Motor current (peak)", [](const auto& o) { return fmt(o.motorPeakCurrent_A, Unit::Ampere); }},
        {"Ripple, peak to peak", [](const auto& o) { return fmt(o.ripplePeakToPeak_A, Unit::Ampere); }},
        {"Conduction", [](const auto& o) { return QString::fromStdString(o.conductionMode); }},
        {"Duty", [](const auto& o) { return fmt(o.duty, Unit::Percent); }},
        {"Held by the current limit", [](const auto& o) { return o.currentLimited ? QStringLiteral("yes") : QStringLiteral("no"); }},
        {"Speed", [](const auto& o) { return fmt(o.speed_rpm, Unit::Rpm); }},
        {"Shaft torque", [](const auto& o) { return fmt(o.torque_Nm, Unit::NewtonMetre); }},
        {"Back-EMF", [](const auto& o) { return fmt(o.backEmf_V, Unit::Volt); }},
        {"Bus voltage", [](const auto& o) { return fmt(o.busVoltage_V, Unit::Volt); }},
        {"Battery current", [](const auto& o) { return fmt(o.batteryCurrent_A, Unit::Ampere); }},
        {"Bank RMS current", [](const auto& o) { return fmt(o.switchRmsCurrent_A, Unit::Ampere); }},
        {"Freewheel diode average current", [](const auto& o) { return fmt(o.diodeAverageCurrent_A, Unit::Ampere); }},
        {"Bus capacitor RMS current", [](const auto& o) { return fmt(o.capacitorRmsCurrent_A, Unit::Ampere); }},
        {"Bus capacitor ripple (with the cable's share)",
         [](const auto& o) { return fmt(o.busCapacitorRipple_A, Unit::Ampere); }},
        {"Turn-off overshoot above the bus", [](const auto& o) { return fmt(o.overshoot_V, Unit::Volt); }},
        {"Avalanche energy per turn-off", [](const auto& o) { return fmt(o.avalancheEnergy_J, Unit::Joule); }},
        {"Power from the bus", [](const auto& o) { return fmt(o.inputPower_W, Unit::Watt); }},
        {"Shaft power", [](const auto& o) { return fmt(o.mechanicalPower_W, Unit::Watt); }},
        {"Bank loss (with ballast and legs)", [](const auto& o) { return fmt(o.bankLoss_W, Unit::Watt); }},
        {"Freewheel diode loss", [](const auto& o) { return fmt(o.freewheelDiode.loss_W, Unit::Watt); }},
        {"Power-stage loss", [](const auto& o) { return "<b>" + fmt(o.totalLoss_W, Unit::Watt) + "</b>"; }},
        {"Stage efficiency to the motor",
         [](const auto& o) { return o.efficiency ? fmt(*o.efficiency, Unit::Percent) : dash(); }},
        {"Heatsink temperature", [](const auto& o) { return fmt(o.heatsinkTemperature_C, Unit::Celsius); }},
        {"Hottest switch junction", [](const auto& o) { return "<b>" + fmt(hottestDevice(o), Unit::Celsius) + "</b>"; }},
        {"Freewheel diode junction", [](const auto& o) { return fmt(o.freewheelDiode.tj_C, Unit::Celsius); }},
        {"Electrothermal loop gain",
         [](const auto& o) {
             if (!o.bank.converged)
                 return QStringLiteral("<b>runs away</b>");
             const QString gain = o.bank.loopGain ? fmt(*o.bank.loopGain, Unit::None) : dash();
             // A gain below 1 with no state below T_j,max is still a runaway (see section "Bank stability").
             return o.bank.stable ? gain : gain + QStringLiteral(" <b>runs away</b>");
         }},
        {"Highest / lowest device current", [](const auto& o) { return fmt(o.bank.maxMinCurrentRatio, Unit::None); }},
    };
    for (std::size_t start = 0; start < ops.size(); start += kPointsPerTable) {
        const std::size_t end = std::min(ops.size(), start + kPointsPerTable);
        // A last table with fewer points keeps the columns of the full ones, and is narrower.
        const double labelW = 34.0;
        const double colW = (100.0 - labelW) / kPointsPerTable;
        const double tableW = labelW + colW * static_cast<double>(end - start);
        m_html += tableOpen(tableW);
        m_html += QStringLiteral("<thead><tr class=\"head\"><td width=\"%1%\">Operating point</td>")
                      .arg(100.0 * labelW / tableW, 0, 'f', 1);
        for (std::size_t i = start; i < end; ++i)
            m_html += QStringLiteral("<td width=\"%1%\" class=\"right\">%2</td>")
                          .arg(100.0 * colW / tableW, 0, 'f', 1)
                          .arg(esc(ops[i].name));
        m_html += "</tr></thead>";
        for (const auto& row : rows) {
            m_html += "<tr><td class=\"key\">" + esc(row.label) + "</td>";
            for (std::size_t i = start; i < end; ++i)
                m_html += "<td class=\"num\">" + (ops[i].devices.empty() ? dash() : row.value(ops[i])) + "</td>";
            m_html += "</tr>";
        }
        m_html += "</table><p class=\"gap\"></p>";
    }
    QStringList notes;
    for (const auto& op : ops)
        for (const auto& n : op.notes)
            notes << "<b>" + esc(op.name) + "</b>: " + esc(n);
    if (!ops.empty() && !notes.isEmpty())
        m_html += "<p class=\"small\">" + notes.join("<br/>") + "</p>";
}

void SheetWriter::deviceTables() {
    heading(kDevices);
    m_html += QStringLiteral("<p class=\"small\">Per device, in bank order, numbered from 0 as in the check messages and the results JSON. On-state current: the device's share of the "
                             "motor current while the bank conducts; of rating: against its %1 rating; T_case at the "
                             "device's case.</p>")
                  .arg(fmt(m_d.bank.device.currentRating_A, Unit::Ampere));
    for (const auto& op : m_r.operatingPoints) {
        if (op.devices.empty())
            continue;
        sub(QString::fromStdString(op.name));
        m_html += tableOpen();
        m_html += "<thead><tr class=\"head\"><td width=\"16%\">Device</td><td class=\"num\" width=\"12%\">On-state "
                  "current</td><td class=\"num\" width=\"11%\">RMS current</td><td class=\"num\" width=\"10%\">Share</td>"
                  "<td class=\"num\" width=\"10%\">Of rating</td><td class=\"num\" width=\"10%\">Drop</td>"
                  "<td class=\"num\" width=\"10%\">Loss</td><td class=\"num\" width=\"10%\">T_j</td><td class=\"num\" "
                  "width=\"11%\">T_case</td></tr></thead>";
        int hot = -1;
        hottestDevice(op, &hot);
        for (std::size_t k = 0; k < op.devices.size(); ++k) {
            const auto& dv = op.devices[k];
            const QString tj = fmt(dv.tj_C, Unit::Celsius);
            // Topologies with several banks name the bank of each device.
            const QString name = dv.bank == "switch" || dv.bank.empty()
                                     ? QString::number(k)
                                     : QStringLiteral("%1 (%2 bank)").arg(k).arg(esc(dv.bank));
            m_html += "<tr><td>" + name + "</td><td class=\"num\">" + fmt(dv.current_A, Unit::Ampere) +
                      "</td><td class=\"num\">" + fmt(dv.rmsCurrent_A, Unit::Ampere) + "</td><td class=\"num\">" +
                      fmt(dv.share, Unit::Percent) + "</td><td class=\"num\">" + fmt(dv.ratingShare, Unit::Percent) +
                      "</td><td class=\"num\">" + fmt(dv.voltage_V, Unit::Volt) + "</td><td class=\"num\">" +
                      fmt(dv.loss_W, Unit::Watt) + "</td><td class=\"num\">" +
                      (static_cast<int>(k) == hot ? "<b>" + tj + "</b>" : tj) + "</td><td class=\"num\">" +
                      fmt(dv.tcase_C, Unit::Celsius) + "</td></tr>";
        }
        const auto& fd = op.freewheelDiode;
        m_html += QStringLiteral("<tr class=\"diode\"><td>Freewheel diodes (%1)</td>").arg(m_d.bank.diodeCount) +
                  "<td class=\"num\">" + fmt(fd.averageCurrent_A, Unit::Ampere) + " avg</td><td class=\"num\">" +
                  fmt(fd.rmsCurrent_A, Unit::Ampere) + "</td><td class=\"num\">" + dash() + "</td><td class=\"num\">" +
                  dash() + "</td><td class=\"num\">" + dash() + "</td><td class=\"num\">" + fmt(fd.loss_W, Unit::Watt) +
                  "</td><td class=\"num\">" + fmt(fd.tj_C, Unit::Celsius) + "</td><td class=\"num\">" + dash() + "</td></tr>";
        m_html += "</table>";
    }
}

void SheetWriter::bankStudies() {
    const BankStudyTable t = bankStudyTable(m_d, m_r, fmt);
    if (t.rows.empty())
        return;
    heading(kBankStudies);
    m_html += "<p class=\"small\">The bank's electrothermal fixed point in each operating point. Loop gain: the "
              "largest eigenvalue of (∂P/∂T)·Z_th with the bank current and duty held, dimensionless; at 1 or "
              "more, or with no steady state below T_j,max, the bank runs away. Runaway onset: the lowest bank "
              "on-state current at which that happens, scanned up to the current limit. Ballast: the smallest "
              "source or emitter resistor per device that keeps the bank stable and within the sharing target, "
              "the largest power in one of them and their loss against the bank's input power. Monte Carlo: the "
              "parts drawn within bank.spread; a percentile that falls among samples without a stable state reads "
              "“runs away”. Worst corner: every tolerance at the extreme that favours one device.</p>";
    const QString summary = runawaySummary(m_d, m_r, fmt);
    if (!summary.isEmpty())
        m_html += "<p><b>" + esc(summary) + "</b></p>";
    for (qsizetype start = 0; start < t.points.size(); start += kPointsPerTable) {
        const qsizetype end = std::min<qsizetype>(t.points.size(), start + kPointsPerTable);
        const double labelW = 42.0;
        const double colW = (100.0 - labelW) / kPointsPerTable;
        const double tableW = std::max(70.0, labelW + colW * static_cast<double>(end - start));
        m_html += tableOpen(tableW);
        m_html += QStringLiteral("<thead><tr class=\"head\"><td width=\"%1%\">Operating point</td>")
                      .arg(100.0 * labelW / tableW, 0, 'f', 1);
        for (qsizetype i = start; i < end; ++i)
            m_html += QStringLiteral("<td width=\"%1%\" class=\"right\">%2</td>")
                          .arg(100.0 * colW / tableW, 0, 'f', 1)
                          .arg(esc(t.points[i]));
        m_html += "</tr></thead>";
        for (const auto& row : t.rows) {
            m_html += "<tr><td class=\"key\">" + esc(row.label) + "</td>";
            for (qsizetype i = start; i < end; ++i) {
                const QString& v = row.values[i];
                const bool bad = v.contains(QStringLiteral("runs away"));
                m_html += "<td class=\"num\">" + (bad ? "<b>" + esc(v) + "</b>" : esc(v)) + "</td>";
            }
            m_html += "</tr>";
        }
        m_html += "</table><p class=\"gap\"></p>";
    }
    spreadChart();
}

void SheetWriter::spreadChart() {
    std::vector<SpreadPoint> points;
    QStringList runs; // "N samples, seed S" of each point; one entry when they all agree
    QStringList runsByPoint;
    for (const auto& op : m_r.operatingPoints) {
        if (!op.valid || op.devices.empty() || !op.bank.spread)
            continue;
        const BankSpreadResult& sp = *op.bank.spread;
        SpreadPoint pnt;
        pnt.name = QString::fromStdString(op.name);
        // The nominal bank without a stable state runs away as a sample does (no fixed point,
        // loop gain of 1 or more, or no state below T_j,max): its temperatures mean nothing.
        if (op.bank.converged && op.bank.stable)
            pnt.tj_C[0] = hottestDevice(op);
        pnt.tj_C[1] = sp.tjMax_C.p50;
        pnt.tj_C[2] = sp.tjMax_C.p95;
        pnt.tj_C[3] = sp.tjMax_C.p99;
        pnt.tj_C[4] = sp.cornerTjMax_C;
        pnt.runawayFraction = sp.runawayFraction;
        points.push_back(std::move(pnt));
        const QString run = QStringLiteral("%1 samples, seed %2").arg(sp.samples).arg(sp.seed);
        if (!runs.contains(run))
            runs << run;
        runsByPoint << esc(op.name) + ": " + run;
    }
    if (points.empty())
        return;
    const double tjMax = m_d.bank.device.tjMax_C;
    // More points than one chart holds are shared out evenly over as few charts as needed.
    const std::size_t charts = (points.size() + kPointsPerSpreadChart - 1) / kPointsPerSpreadChart;
    for (std::size_t c = 0; c < charts; ++c) {
        const std::size_t from = points.size() * c / charts, to = points.size() * (c + 1) / charts;
        const std::vector<SpreadPoint> part(points.begin() + static_cast<std::ptrdiff_t>(from),
                                            points.begin() + static_cast<std::ptrdiff_t>(to));
        chart([part, tjMax](QPainter& p, const QRectF& r, double pt) { drawSpreadChart(p, r, pt, part, tjMax); },
              72.0);
    }
    const QString drawn = m_d.bank.spread.distribution == "uniform"
                              ? QStringLiteral("uniformly within their stated bands")
                              : QStringLiteral("from normal distributions with their stated standard deviations");
    m_html += QStringLiteral("<p class=\"small\">The bank's hottest junction in each operating point: nominal (every "
                             "part as stated), the median, 95th and 99th percentile over the Monte Carlo samples of "
                             "the parts' stated tolerances (bank.spread, drawn %1) and the worst-case corner. Monte "
                             "Carlo run: %2; the same seed draws the same samples, so the figures can be reproduced. "
                             "A hatched bar drawn to the dashed T_j,max reads “runs away”: that rank falls among the "
                             "samples without a stable state; the share of those samples stands under each point's "
                             "name.</p>")
                  .arg(drawn, runs.size() == 1 ? runs.front() : runsByPoint.join(QStringLiteral("; ")));
}

void SheetWriter::sharingChart() {
    heading(kSharingChart);
    std::vector<SharingSeries> series;
    for (const auto& op : m_r.operatingPoints) {
        if (op.devices.empty())
            continue;
        SharingSeries s;
        s.name = QString::fromStdString(op.name);
        for (const auto& dv : op.devices) {
            s.current_A.push_back(dv.current_A);
            s.tj_C.push_back(dv.tj_C);
        }
        series.push_back(std::move(s));
    }
    const double tjMax = m_d.bank.device.tjMax_C;
    chart([series, tjMax](QPainter& p, const QRectF& r, double pt) { drawSharingChart(p, r, pt, series, tjMax); },
          66.0);
    m_html += "<p class=\"small\">Each device's on-state current and junction temperature in every computed operating "
              "point. Equal bars mean the bank shares; a device that stands out takes more than its share.</p>";
}

void SheetWriter::lossChart() {
    heading(kLossChart);
    struct Component {
        QString name;
        std::function<double(const OperatingPointResult&)> sum;
    };
    auto perDevice = [](double DeviceResult::*member) {
        return [member](const OperatingPointResult& op) {
            double s = 0.0;
            for (const auto& dv : op.devices)
                s += dv.*member;
            return s;
        };
    };
    const std::vector<Component> all = {
        {"switch conduction", perDevice(&DeviceResult::conduction_W)},
        {"switching", perDevice(&DeviceResult::switching_W)},
        {"body diode", perDevice(&DeviceResult::diode_W)},
        {"gate or base drive", perDevice(&DeviceResult::drive_W)},
        {"ballast resistors", perDevice(&DeviceResult::ballast_W)},
        {"device legs", perDevice(&DeviceResult::leg_W)},
        {"freewheel diodes", [](const OperatingPointResult& op) { return op.freewheelDiode.loss_W; }},
    };
    std::vector<const Component*> used;
    for (const auto& c : all)
        for (const auto& op : m_r.operatingPoints)
            if (!op.devices.empty() && c.sum(op) > 0.0) {
                used.push_back(&c);
                break;
            }
    QStringList names;
    for (const auto* c : used)
        names << c->name;
    std::vector<LossRow> rows;
    for (const auto& op : m_r.operatingPoints) {
        if (op.devices.empty())
            continue;
        LossRow row{QString::fromStdString(op.name), {}};
        for (const auto* c : used)
            row.parts_W.push_back(c->sum(op));
        rows.push_back(std::move(row));
    }
    const double height = 26.0 + 9.0 * static_cast<double>(rows.size());
    chart([names, rows](QPainter& p, const QRectF& r, double pt) { drawLossChart(p, r, pt, names, rows); },
          std::min(height, 120.0));
    m_html += "<p class=\"small\">The power-stage loss of each operating point, split by where it arises. The total "
              "stands at the end of each bar.</p>";
}

void SheetWriter::transient() {
    heading(kTransient);
    const auto& t = *m_r.transient;
    // Every junction when they are few; otherwise the hottest and the coolest switch and the diode.
    const std::size_t sources = std::min(t.sources.size(), t.tj_C.size());
    auto peak = [&](std::size_t k) {
        double m = -1e300;
        for (double v : t.tj_C[k])
            m = std::max(m, v);
        return m;
    };
    std::vector<std::size_t> shown;
    const std::size_t switches = sources > 0 ? sources - 1 : 0; // the last source is the diode
    if (switches <= 6) {
        for (std::size_t k = 0; k < sources; ++k)
            shown.push_back(k);
    } else {
        std::size_t hot = 0, cool = 0;
        for (std::size_t k = 1; k < switches; ++k) {
            if (peak(k) > peak(hot))
                hot = k;
            if (peak(k) < peak(cool))
                cool = k;
        }
        shown = {hot, cool, sources - 1};
    }
    std::vector<TimeSeries> series;
    for (std::size_t k : shown)
        series.push_back({QString::fromStdString(t.sources[k]), t.tj_C[k], false});
    series.push_back({QStringLiteral("heatsink"), t.heatsink_C, true});
    const double tjMax = m_d.bank.device.tjMax_C;
    const std::vector<double> time = t.time_s;
    chart(
        [time, series, tjMax](QPainter& p, const QRectF& r, double pt) {
            drawTimeSeries(p, r, pt, time, series, QStringLiteral("Junction temperature, °C"), tjMax,
                           QStringLiteral("switch T_j,max ") + fmt(tjMax, Unit::Celsius));
        },
        70.0);
    m_html += QStringLiteral("<p class=\"small\">The last repetition of the duty profile (%1 simulated, %2). Q1 … Qn "
                             "are the switches in bank order (devices 0 … n−1 of the tables above), D a freewheel "
                             "diode.%3</p>")
                  .arg(t.repetitions)
                  .arg(t.periodic ? QStringLiteral("it repeats itself") : QStringLiteral("not yet periodic"))
                  .arg(shown.size() < sources ? QStringLiteral(" Of the switches, the hottest and the coolest are drawn.")
                                              : QString());
    m_html += tableOpen();
    auto row = [&](const QString& k, const QString& v) {
        m_html += "<tr><td class=\"key\" width=\"62%\">" + k + "</td><td class=\"num\" width=\"38%\">" + v + "</td></tr>";
    };
    row(QStringLiteral("Hottest junction over the profile (%1)").arg(esc(t.tjMaxSource)),
        fmt(t.tjMax_C, Unit::Celsius) + ", at " + fmt(t.tjMaxTime_s, Unit::Second));
    row(QStringLiteral("Hottest heatsink over the profile"),
        fmt(t.heatsinkMax_C, Unit::Celsius) + ", at " + fmt(t.heatsinkMaxTime_s, Unit::Second));
    m_html += "</table>";
}

void SheetWriter::heatsinkAndLife() {
    heading(kHeatsink);
    m_html += tableOpen();
    auto row = [&](const QString& k, const QString& v) {
        m_html += "<tr><td class=\"key\" width=\"62%\">" + k + "</td><td class=\"num\" width=\"38%\">" + v + "</td></tr>";
    };
    if (const auto& h = m_r.heatsink) {
        row(QStringLiteral("Heatsink given by"), h->mode == "geometry" ? QStringLiteral("its geometry") : QStringLiteral("a stated R_th,sa"));
        row(QStringLiteral("R_th,sa at the heat of “%1”").arg(esc(h->operatingPoint)), fmt(h->rthSa_KperW, Unit::KelvinPerWatt));
        row(QStringLiteral("Heat into the heatsink there"), fmt(h->heat_W, Unit::Watt));
        row(QStringLiteral("Heatsink temperature there (steady)"), fmt(h->temperature_C, Unit::Celsius));
        row(QStringLiteral("Heat capacity"), fmt(h->heatCapacity_JperK, Unit::None) + " J/K");
        if (h->finSpacing_m)
            row(QStringLiteral("Fin spacing"), fmt(*h->finSpacing_m, Unit::Metre));
        if (h->optimumFinSpacing_m)
            row(QStringLiteral("Optimum fin spacing (natural convection)"), fmt(*h->optimumFinSpacing_m, Unit::Metre));
        if (h->optimumFinCount)
            row(QStringLiteral("Fins at the optimum spacing"), QString::number(std::floor(*h->optimumFinCount)));
    }
    if (m_r.stallTimeToLimit_s)
        row(QStringLiteral("Stall at the current limit: time to the first T_j,max"), fmt(*m_r.stallTimeToLimit_s, Unit::Second));
    if (const auto& l = m_r.life) {
        row(QStringLiteral("Power cycling: first to wear out"), esc(l->source));
        row(QStringLiteral("Damage per repetition of the profile"), fmt(l->damagePerRepetition, Unit::None));
        if (l->repetitionsToEnd)
            row(QStringLiteral("Repetitions of the profile to the end of life"), fmt(*l->repetitionsToEnd, Unit::None));
        if (l->hoursToEnd)
            row(QStringLiteral("Hours of this duty to the end of life"), fmt(*l->hoursToEnd, Unit::None) + " h");
    }
    m_html += "</table>";
    if (const auto& h = m_r.heatsink)
        for (const auto& n : h->notes)
            m_html += "<p class=\"small\">" + esc(n) + "</p>";
    if (const auto& l = m_r.life) {
        if (!l->cycles.empty()) {
            // The cycles that wear the junction most (Miner's rule: count / cycles to failure); a
            // profile with many small ripples would otherwise fill pages with rows that do not matter.
            std::vector<const LifeCycleResult*> order;
            for (const auto& c : l->cycles)
                order.push_back(&c);
            auto damage = [](const LifeCycleResult* c) { return c->cyclesToFailure > 0.0 ? c->count / c->cyclesToFailure : 0.0; };
            std::stable_sort(order.begin(), order.end(), [&](auto* a, auto* b) { return damage(a) > damage(b); });
            double total = 0.0;
            for (auto* c : order)
                total += damage(c);
            const std::size_t shown = std::min<std::size_t>(order.size(), kLifeCyclesShown);
            sub(QStringLiteral("Junction cycles of %1 per repetition").arg(esc(l->source)));
            if (shown < order.size())
                m_html += QStringLiteral("<p class=\"small\">The %1 cycles that wear the junction most, of %2 counted "
                                         "(the results JSON lists them all).</p>")
                              .arg(shown)
                              .arg(order.size());
            m_html += tableOpen(80.0);
            m_html += "<thead><tr class=\"head\"><td class=\"right\">Swing ΔT_j</td><td class=\"right\">Mean T_j</td>"
                      "<td class=\"right\">Count</td><td class=\"right\">Cycles to failure</td>"
                      "<td class=\"right\">Share of the wear</td></tr></thead>";
            double listed = 0.0;
            for (std::size_t i = 0; i < shown; ++i) {
                const LifeCycleResult& c = *order[i];
                listed += damage(&c);
                m_html += "<tr><td class=\"num\">" + fmt(c.range_K, Unit::Kelvin) + "</td><td class=\"num\">" +
                          fmt(c.mean_C, Unit::Celsius) + "</td><td class=\"num\">" + fmt(c.count, Unit::None) +
                          "</td><td class=\"num\">" + fmt(c.cyclesToFailure, Unit::None) + "</td><td class=\"num\">" +
                          (total > 0.0 ? fmt(damage(&c) / total, Unit::Percent) : dash()) + "</td></tr>";
            }
            if (shown < order.size())
                m_html += QStringLiteral("<tr><td colspan=\"4\">%1 smaller cycles</td><td class=\"num\">%2</td></tr>")
                              .arg(order.size() - shown)
                              .arg(total > 0.0 ? fmt((total - listed) / total, Unit::Percent) : dash());
            m_html += "</table>";
        }
        if (!l->note.empty())
            m_html += "<p class=\"small\">" + esc(l->note) + "</p>";
    }
}

void SheetWriter::protection() {
    heading(kProtection);
    const auto& pr = m_r.protection;
    auto table = [&](const QString& title, const std::vector<std::pair<QString, QString>>& rows) {
        if (rows.empty())
            return;
        sub(title);
        m_html += tableOpen();
        for (const auto& [k, v] : rows)
            m_html += "<tr><td class=\"key\" width=\"62%\">" + k + "</td><td class=\"num\" width=\"38%\">" + v +
                      "</td></tr>";
        m_html += "</table>";
    };
    auto a2s = [](double v) { return fmt(v, Unit::None) + QStringLiteral(" A²s"); };
    if (const auto& c = pr.contactor) {
        std::vector<std::pair<QString, QString>> rows = {
            {"Armature circuit L/R", fmt(c->motorTimeConstant_s, Unit::Second)},
            {"Test-circuit L/R of its utilisation category", fmt(c->categoryTimeConstant_s, Unit::Second)},
            {"Thermal current / motor RMS current over the profile",
             c->continuousMargin ? fmt(*c->continuousMargin, Unit::None) : dash()},
            {"Coil current and power", fmt(c->coilCurrent_A, Unit::Ampere) + ", " + fmt(c->coilPower_W, Unit::Watt)},
            {"Contact loss", fmt(c->contactLoss_W, Unit::Watt)},
            {"Electrical life at the stated reversals",
             c->electricalLife_years ? fmt(*c->electricalLife_years, Unit::None) + " years" : dash()},
            {"Must not break load", c->mustNotBreakLoad ? QStringLiteral("yes") : QStringLiteral("no")},
        };
        table(QStringLiteral("Reversing contactor"), rows);
        if (!c->reason.empty())
            m_html += "<p class=\"small\">" + esc(c->reason) + "</p>";
    }
    if (const auto& m = pr.mainDisconnect)
        table(QStringLiteral("Main disconnect"),
              {{"Current it must break", fmt(m->requiredBreak_A, Unit::Ampere)},
               {"Stall current with the bank failed short", fmt(m->stallCurrent_A, Unit::Ampere)},
               {"Prospective short-circuit current", fmt(m->shortCircuitCurrent_A, Unit::Ampere)}});
    if (const auto& p = pr.precharge)
        table(QStringLiteral("Pre-charge of the bus capacitors"),
              {{"Pre-charge resistor fitted", p->present ? QStringLiteral("yes") : QStringLiteral("no")},
               {"Resistor", fmt(p->resistor_ohm, Unit::Ohm)},
               {"Time to the closing voltage", fmt(p->time_s, Unit::Second)},
               {"Peak current and power in the resistor",
                fmt(p->peakCurrent_A, Unit::Ampere) + ", " + fmt(p->peakPower_W, Unit::Watt)},
               {"Energy into the resistor", fmt(p->energy_J, Unit::Joule)},
               {"Current step when the main contactor closes", fmt(p->closingCurrent_A, Unit::Ampere)},
               {"Inrush closing onto uncharged capacitors", fmt(p->inrushUncharged_A, Unit::Ampere)}});
    for (const auto* cable : {&pr.cable, &pr.motorCable}) {
        if (!*cable)
            continue;
        const auto& c = **cable;
        table(QStringLiteral("Cable: %1").arg(esc(c.name)),
              {{"Cross-section", fmt(c.crossSection_mm2 * 1e-6, Unit::SquareMetre)},
               {"Drop at the highest current", fmt(c.drop_V, Unit::Volt)},
               {"Loss", fmt(c.loss_W, Unit::Watt)},
               {"Conductor temperature over the profile", fmt(c.conductorTemperature_C, Unit::Celsius)},
               {"Ampacity", fmt(c.ampacity_A, Unit::Ampere)},
               {"Smallest standard size that meets drop and temperature",
                c.requiredCrossSection_mm2 ? fmt(*c.requiredCrossSection_mm2 * 1e-6, Unit::SquareMetre) : dash()}});
    }
    if (const auto& f = pr.fuse)
        table(QStringLiteral("Battery fuse"),
              {{"Prospective short-circuit current", fmt(f->prospectiveShortCircuit_A, Unit::Ampere)},
               {"Fuse rating / battery RMS current", f->continuousMargin ? fmt(*f->continuousMargin, Unit::None) : dash()},
               {"Battery cable adiabatic withstand", a2s(f->cableWithstand_A2s)}});
    if (!pr.bridgeComparison.empty()) {
        sub(QStringLiteral("Bank and contactor against a full bridge"));
        m_html += tableOpen();
        m_html += "<thead><tr class=\"head\"><td width=\"30%\">Arrangement</td><td class=\"num\" width=\"10%\">Switches</td>"
                  "<td class=\"num\" width=\"10%\">Diodes</td><td class=\"num\" width=\"10%\">Contactors</td>"
                  "<td class=\"num\" width=\"14%\">Conduction loss</td><td class=\"num\" width=\"13%\">Reversal</td>"
                  "<td class=\"num\" width=\"13%\">Parts cost</td></tr></thead>";
        for (const auto& o : pr.bridgeComparison)
            m_html += "<tr><td><b>" + esc(o.name) + QStringLiteral("</b></td><td class=\"num\">%1</td><td class=\"num\">%2</td>"
                                                                   "<td class=\"num\">%3</td>")
                                                        .arg(o.switchCount)
                                                        .arg(o.diodeCount)
                                                        .arg(o.contactorCount) +
                      "<td class=\"num\">" + fmt(o.conductionLoss_W, Unit::Watt) + "</td><td class=\"num\">" +
                      fmt(o.reversal_s, Unit::Second) + "</td><td class=\"num\">" +
                      (o.cost > 0.0 ? fmt(o.cost, Unit::None) + (o.costComplete ? QString() : QStringLiteral(" +"))
                                    : dash()) +
                      "</td></tr><tr><td colspan=\"7\" class=\"detail\"><i>Braking:</i> " + esc(o.braking) +
                      "</td></tr>";
        m_html += "</table><p class=\"small\">Conduction loss averaged over the duty profile; cost from the parts' "
                  "unit prices (+ where a price is missing).</p>";
    }
}

void SheetWriter::reversal() {
    heading(kReversal);
    const auto& rv = *m_r.protection.reversal;
    std::vector<TimelineStep> steps;
    for (const auto& st : rv.steps)
        steps.push_back({stepWords(st.name), st.duration_s});
    chart([steps](QPainter& p, const QRectF& r, double pt) { drawTimeline(p, r, pt, steps); },
          16.0 + 6.5 * static_cast<double>(steps.size()));
    m_html += QStringLiteral("<p class=\"small\">The longest reversal of the duty profile, starting from “%1”: %2 in "
                             "all. The contactor changes over at or below %3, where (E − V_f)/R through the freewheel "
                             "path would be %4; restarting at that speed draws %5 before the current limit acts.</p>")
                  .arg(esc(rv.fromPoint), fmt(rv.total_s, Unit::Second), fmt(rv.changeoverSpeed_rpm, Unit::Rpm),
                       fmt(rv.changeoverAtSpeedCurrent_A, Unit::Ampere), fmt(rv.pluggingCurrent_A, Unit::Ampere));
}

void SheetWriter::checks() {
    heading(kChecks);
    m_html += "<p class=\"small\">Every check of every operating point, grouped by check, the most severe first. Value "
              "and limit are the numbers compared; the reading says what they mean. The group's heading says where the "
              "limit comes from and what to change.</p>";
    if (m_r.checks.empty()) {
        m_html += "<p>No check was run.</p>";
        return;
    }
    // Group by id in order of first appearance, then order the groups by their worst outcome.
    std::vector<std::string> ids;
    std::map<std::string, std::vector<const Check*>> byId;
    for (const auto& c : m_r.checks) {
        if (!byId.count(c.id))
            ids.push_back(c.id);
        byId[c.id].push_back(&c);
    }
    auto worstOf = [&](const std::string& id) {
        int w = 0;
        for (const Check* c : byId[id])
            w = std::max(w, static_cast<int>(c->severity));
        return w;
    };
    std::stable_sort(ids.begin(), ids.end(), [&](const std::string& a, const std::string& b) { return worstOf(a) > worstOf(b); });

    m_html += tableOpen();
    m_html += "<thead><tr class=\"head\"><td width=\"10%\">Outcome</td><td width=\"17%\">Operating point</td>"
              "<td class=\"num\" width=\"12%\">Value</td><td class=\"num\" width=\"12%\">Limit</td><td width=\"49%\">"
              "Reading</td></tr></thead>";
    for (const auto& id : ids) {
        auto& group = byId[id];
        std::stable_sort(group.begin(), group.end(), [](const Check* a, const Check* b) {
            return static_cast<int>(a->severity) > static_cast<int>(b->severity);
        });
        const Check& first = *group.front();
        const CheckInfo* info = findCheckInfo(id);
        QString head = "<span class=\"id\">" + esc(id) + "</span>" + (info ? " — " + esc(info->title) : QString());
        if (!first.source.empty())
            head += "<br/><i>Limit from:</i> " + esc(first.source);
        if (!first.fix.empty())
            head += "<br/><i>To change it:</i> " + esc(first.fix) +
                    (first.field.empty() ? QString() : " — field <span class=\"id\">" + esc(first.field) + "</span>");
        m_html += "<tr class=\"group\"><td colspan=\"5\">" + head + "</td></tr>";
        for (const Check* c : group) {
            const bool numbers = !(c->value == 0.0 && c->limit == 0.0 && c->unit.empty());
            m_html += QStringLiteral("<tr><td style=\"background-color:%1\"><b>%2</b></td>")
                          .arg(severityColour(c->severity), severityWord(c->severity)) +
                      "<td>" + (c->operatingPoint.empty() ? QStringLiteral("whole design") : esc(c->operatingPoint)) +
                      "</td><td class=\"num\">" + (numbers ? checkNumber(c->value, c->unit) : dash()) +
                      "</td><td class=\"num\">" + (numbers ? checkNumber(c->limit, c->unit) : dash()) +
                      "</td><td class=\"detail\">" + esc(c->message);
            // A check whose source or fix differs from its group's heading says so in its own row.
            if (c->source != first.source && !c->source.empty())
                m_html += "<br/><i>Limit from:</i> " + esc(c->source);
            if (c->fix != first.fix && !c->fix.empty())
                m_html += "<br/><i>To change it:</i> " + esc(c->fix);
            m_html += "</td></tr>";
        }
    }
    m_html += "</table>";
}

void SheetWriter::cautions() {
    heading(kCautions);
    const auto list = cautionsFor(m_d, m_r);
    m_html += tableOpen();
    int n = 0;
    for (const auto& c : list) {
        ++n;
        m_html += QStringLiteral("<tr><td width=\"4%\" class=\"caution\"><b>%1</b></td><td width=\"96%\"><b>%2</b><br/>%3"
                                 "<br/><span class=\"small\"><i>Shown because: %4</i></span></td></tr>")
                      .arg(n)
                      .arg(esc(c.title), esc(c.text), esc(c.reason));
    }
    m_html += "</table>";
}

void SheetWriter::limits() {
    heading(kLimits);
    m_html += "<p>The numbers on this sheet come from models with stated assumptions: an averaged PWM chopper in "
              "steady state at each operating point, part values as entered (the shipped parts are invented "
              "archetypes, not real components), and the thermal path as described. Check the result against "
              "measurements on the bench: currents with a clamp meter, temperatures with a thermocouple on the case, "
              "before the drive carries a person or a load.</p>";
    if (!m_r.warnings.empty()) {
        m_html += "<p><b>Model notes for this design</b> (what these models leave out is not in the numbers)</p><ul>";
        for (const auto& w : m_r.warnings)
            m_html += "<li>" + esc(w) + "</li>";
        m_html += "</ul>";
    }
    m_html += "<p><b>Ampwright assists a competent person with calculations. It does not certify a design, a part or an "
              "installation. Local codes, the machine's or vehicle's regulations and licensed practice decide.</b></p>";
}

QString SheetWriter::html() {
    m_html.clear();
    m_sections.clear();
    titleBlock();
    jobStatement();
    glance();
    inputs();
    pointResults();
    if (hasDevices(m_r)) {
        deviceTables();
        bankStudies();
        sharingChart();
        lossChart();
    }
    if (m_r.transient && !m_r.transient->time_s.empty())
        transient();
    if (m_r.heatsink || m_r.life || m_r.stallTimeToLimit_s)
        heatsinkAndLife();
    if (hasProtection(m_r))
        protection();
    if (m_r.protection.reversal)
        reversal();
    checks();
    cautions();
    limits();
    return m_html;
}

QString styleSheet() {
    auto px = [](double pt) { return QString::number(pt * 96.0 / 72.0, 'f', 1); };
    return QStringLiteral(
               "h1 { font-size: 17pt; font-weight: bold; color: #1b2d3f; margin-top: 0px; margin-bottom: %1px; }"
               "h2 { font-size: 12pt; font-weight: bold; color: #1b2d3f; margin-top: %2px; margin-bottom: %3px; }"
               "h3 { font-size: 9.5pt; font-weight: bold; color: #2b3d4f; margin-top: %4px; margin-bottom: %5px; }"
               "p { margin-top: 0px; margin-bottom: %5px; }"
               "p.kicker { font-size: 8pt; color: #6a6a6a; margin-bottom: 0px; }"
               "p.small, span.small { font-size: 7.5pt; color: #444444; }"
               "p.gap { margin-bottom: %5px; font-size: 2pt; }"
               "p.chart { margin-top: %4px; margin-bottom: %4px; }"
               "td { font-size: 8pt; vertical-align: top; }"
               "td.key { color: #333333; background-color: #f2f4f6; }"
               "td.num { text-align: right; white-space: nowrap; }"
               "td.right { text-align: right; }"
               "td.detail { font-size: 7.5pt; color: #333333; }"
               "td.caution { background-color: #fbe3b0; text-align: center; }"
               "tr.head td { font-weight: bold; background-color: #dfe6ec; }"
               "tr.diode td { background-color: #f6f6f0; }"
               "span.id { font-weight: bold; white-space: nowrap; }"
               "tr.group td { background-color: #eef1f4; font-size: 7.5pt; }"
               "td { border-width: %7px; border-style: solid; border-color: #b9c1c9; }"
               "li { margin-bottom: %6px; }")
        .arg(px(4), px(12), px(5), px(7), px(3), px(1.5), px(0.4));
}

// ---- Paging ------------------------------------------------------------------------------------

struct PageFrame {
    double width = 0.0;   // device pixels
    double height = 0.0;
    double header = 0.0;  // height of the header band, gap included
    double footer = 0.0;
    double body() const { return height - header - footer; }
};

void drawHeaderFooter(QPainter& p, const PageFrame& f, double dpi, const Design& d, int page, int pages,
                      const QString& printed) {
    const double pt = dpi / 72.0;
    QFont font(QStringLiteral("DejaVu Sans"));
    font.setStyleHint(QFont::SansSerif);
    font.setPointSizeF(7.5);
    p.setFont(font);
    const QFontMetricsF fm(font, p.device());
    p.setPen(QColor("#333333"));
    const QString left = QString::fromStdString(d.meta.title) + QStringLiteral(" — design sheet");
    const QString right = QStringLiteral("revision %1").arg(QString::fromStdString(d.meta.revision.empty() ? "—" : d.meta.revision));
    const double base = fm.ascent();
    p.drawText(QPointF(0, base), fm.elidedText(left, Qt::ElideRight, f.width * 0.7));
    p.drawText(QPointF(f.width - fm.horizontalAdvance(right), base), right);
    p.setPen(QPen(QColor("#7a8a99"), 0.6 * pt));
    p.drawLine(QPointF(0, fm.height() + 1.5 * pt), QPointF(f.width, fm.height() + 1.5 * pt));

    const double top = f.height - fm.height();
    p.drawLine(QPointF(0, top - 2.0 * pt), QPointF(f.width, top - 2.0 * pt));
    p.setPen(QColor("#333333"));
    const QString fl = QStringLiteral("Ampwright %1 · printed %2 · a calculation record, not a certificate")
                           .arg(AMPWRIGHT_VERSION, printed);
    const QString fr = QStringLiteral("page %1 of %2").arg(page).arg(pages);
    p.drawText(QPointF(0, top + base), fl);
    p.drawText(QPointF(f.width - fm.horizontalAdvance(fr), top + base), fr);
}

/// Page breaks the layout does not make by itself: a block whose first line was pushed to the next
/// page starts there as a whole (otherwise its text is drawn, clipped, on both pages and a text
/// extractor finds it twice), and a heading (or a run of headings) moves to the next page with
/// what follows it.
void paginate(QTextDocument& doc, double pageHeight) {
    QAbstractTextDocumentLayout* layout = doc.documentLayout();
    auto page = [&](double y) { return static_cast<int>((y + 1.0) / pageHeight); };
    auto blockTop = [&](const QTextBlock& b) { return layout->blockBoundingRect(b).top(); };
    auto lineTop = [&](const QTextBlock& b) {
        double y = blockTop(b);
        if (b.layout() && b.layout()->lineCount() > 0)
            y += b.layout()->lineAt(0).y();
        return y;
    };
    auto breakBefore = [&](const QTextBlock& b) {
        QTextCursor c(b);
        QTextBlockFormat f = b.blockFormat();
        f.setPageBreakPolicy(QTextFormat::PageBreak_AlwaysBefore);
        c.setBlockFormat(f);
        // The incremental relayout after a format change leaves some later blocks without their
        // lines; lay the whole document out again.
        doc.markContentsDirty(0, doc.characterCount());
    };
    for (QTextBlock b = doc.begin(); b.isValid(); b = b.next()) {
        if (QTextCursor(b).currentTable())
            continue; // table rows move to the next page whole
        if (page(blockTop(b)) < page(lineTop(b)))
            breakBefore(b);
        if (b.blockFormat().headingLevel() == 0)
            continue;
        QTextBlock next = b.next();
        while (next.isValid() && next.blockFormat().headingLevel() != 0)
            next = next.next();
        if (next.isValid() && page(lineTop(next)) > page(lineTop(b)))
            breakBefore(b);
    }
}

} // namespace

QStringList designSheetSections(const Design& design, const Results& results) {
    SheetWriter w(design, results, nullptr);
    w.html();
    return w.sections();
}

int renderDesignSheet(QPagedPaintDevice* device, const Design& design, const Results& results, QString* error) {
    if (!qGuiApp) {
        if (error)
            *error = QStringLiteral("the design sheet needs a QGuiApplication");
        return 0;
    }
    if (!device) {
        if (error)
            *error = QStringLiteral("no device to print on");
        return 0;
    }
    QPainter painter;
    if (!painter.begin(device)) {
        if (error)
            *error = QStringLiteral("cannot paint on the output (is the file writable?)");
        return 0;
    }
    const double dpi = device->logicalDpiY();
    const double pt = dpi / 72.0;

    QFont base(QStringLiteral("DejaVu Sans"));
    base.setStyleHint(QFont::SansSerif);
    base.setPointSizeF(kBodyFont_pt);

    QFont small = base;
    small.setPointSizeF(7.5);
    const QFontMetricsF fm(small, device);
    PageFrame frame;
    frame.width = device->width();
    frame.height = device->height();
    frame.header = fm.height() + 1.5 * pt + kHeaderGap_mm / 25.4 * dpi;
    frame.footer = fm.height() + 2.0 * pt + kHeaderGap_mm / 25.4 * dpi;

    QTextDocument doc;
    doc.documentLayout()->setPaintDevice(device);
    doc.setDefaultFont(base);
    doc.setDocumentMargin(0);
    doc.setPageSize(QSizeF(frame.width, frame.body()));
    auto* charts = new SheetCharts(&doc);
    doc.documentLayout()->registerHandler(kChartObject, charts);
    doc.setDefaultStyleSheet(styleSheet());

    SheetWriter writer(design, results, charts);
    doc.setHtml(writer.html());
    for (int id : writer.chartIds()) {
        QTextCursor c = doc.find(SheetWriter::placeholder(id));
        if (c.isNull())
            continue;
        QTextCharFormat f;
        f.setObjectType(kChartObject);
        f.setProperty(kChartIdProperty, id);
        c.insertText(QString(QChar::ObjectReplacementCharacter), f);
    }
    doc.setPageSize(QSizeF(frame.width, frame.body()));
    paginate(doc, frame.body());

    const int pages = doc.pageCount();
    const QString printed = QDateTime::currentDateTime().toString(QStringLiteral("yyyy-MM-dd HH:mm"));
    for (int i = 0; i < pages; ++i) {
        if (i > 0)
            device->newPage();
        drawHeaderFooter(painter, frame, dpi, design, i + 1, pages, printed);
        painter.save();
        const QRectF clip(0, i * frame.body(), frame.width, frame.body());
        painter.translate(0, frame.header - i * frame.body());
        painter.setClipRect(clip);
        QAbstractTextDocumentLayout::PaintContext ctx;
        ctx.clip = clip;
        ctx.palette.setColor(QPalette::Text, Qt::black);
        doc.documentLayout()->draw(&painter, ctx);
        painter.restore();
    }
    painter.end();
    return pages;
}

bool paperFromName(const QString& name, QPageSize::PageSizeId* paper) {
    const QString n = name.trimmed().toLower();
    if (n == "a4") {
        *paper = QPageSize::A4;
        return true;
    }
    if (n == "letter") {
        *paper = QPageSize::Letter;
        return true;
    }
    return false;
}

bool writeDesignSheetPdf(const Design& design, const Results& results, const QString& file, QPageSize::PageSizeId paper,
                         QString* error) {
    const QFileInfo info(file);
    if (!info.absoluteDir().exists()) {
        if (error)
            *error = QStringLiteral("%1: the folder %2 does not exist").arg(file, info.absolutePath());
        return false;
    }
    QString reason;
    int pages = 0;
    {
        QPdfWriter writer(file);
        writer.setPageSize(QPageSize(paper));
        writer.setPageMargins(QMarginsF(kMarginSide_mm, kMarginTop_mm, kMarginSide_mm, kMarginBottom_mm),
                              QPageLayout::Millimeter);
        writer.setResolution(kPdfResolution_dpi);
        writer.setTitle(QString::fromStdString(design.meta.title) + QStringLiteral(" — design sheet"));
        writer.setCreator(QStringLiteral("Ampwright %1").arg(AMPWRIGHT_VERSION));
        pages = renderDesignSheet(&writer, design, results, &reason);
    }
    if (pages <= 0 || QFileInfo(file).size() == 0) {
        if (error)
            *error = QStringLiteral("%1: %2").arg(file, reason.isEmpty() ? QStringLiteral("nothing was written") : reason);
        return false;
    }
    return true;
}

} // namespace amp::ui


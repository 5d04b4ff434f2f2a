// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/engine/stage_protection.h"

#include "core/checks/makecheck.h"
#include "core/engine/results.h"
#include "core/model/design.h"
#include "core/physics/copper.h"
#include "core/physics/motor.h"
#include "core/protection/bridgecomparison.h"
#include "core/protection/cable.h"
#include "core/protection/contactor.h"
#include "core/protection/disconnect.h"
#include "core/protection/fuse.h"
#include "core/protection/precharge.h"
#include "core/protection/reversal.h"
#include "core/units/units.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <map>
#include <string>
#include <utility>
#include <vector>

namespace amp {

namespace {

using namespace amp::protection;

// Required margins, common practice: contactor thermal current and fuse rating some 25 % above the
// continuous current they carry.
constexpr double kContactorMargin = 1.25;
constexpr double kFuseMargin = 1.25;
// Advice when the contactor's electrical life is used up within a year of reversals.
constexpr double kLifeAdvice_years = 1.0;
// Advice when the motor, slowed only by its own no-load torque, takes longer than this to stop.
constexpr double kLongSlowDown_s = 5.0;

std::string num(double v, int digits = 3) { return units::plain(v, digits); }

// The makeCheck of core/checks, with a value or limit that a model left undefined (not finite)
// shown as 0.
template <class... Args>
Check check(Args&&... args) {
    Check c = makeCheck(std::forward<Args>(args)...);
    c.value = std::isfinite(c.value) ? c.value : 0.0;
    c.limit = std::isfinite(c.limit) ? c.limit : 0.0;
    return c;
}

// Model input problems become failed checks naming the design field (models name their own inputs;
// `paths` maps those names to design paths).
void reportProblems(const std::vector<Problem>& problems, const std::map<std::string, std::string>& paths,
                    const std::string& what, std::vector<Check>& out) {
    for (const auto& p : problems) {
        const auto it = paths.find(p.path);
        const std::string field = it != paths.end() ? it->second : std::string{};
        out.push_back(check("protection.input", Severity::Fail, 0.0, 0.0, "", "input ranges",
                            fmt::format("{}: {}", what, p.message),
                            field.empty() ? "Correct the input named in the message" : "Correct " + field,
                            field));
    }
}

struct Context {
    const Design* d = nullptr;
    std::vector<std::size_t> points; // indices of solved operating points
    MotorModel motor;
    double armature_ohm = 0.0;       // at the winding temperature
    double motorCable_ohm = 0.0;     // ideal copper at the stated cable temperature
    double contacts_ohm = 0.0;       // reversing contacts in the armature path
    double diodeRd_ohm = 0.0;        // freewheel path
    double batteryCable20_ohm = 0.0; // for short-circuit currents
    double maxMotorRms_A = 0.0;      // highest over the points
    double maxMotorPeak_A = 0.0;
    double maxBattery_A = 0.0;
    double profileMotorRms_A = 0.0; // over the repeating duty profile, time-weighted
    double profileBatteryRms_A = 0.0;
    std::vector<CableLoadStep> motorSteps; // (motor RMS, duration) per solved point
    std::vector<CableLoadStep> batterySteps;
    double maxSpeed_radps = 0.0;
    std::size_t worstRmsPoint = 0;
};

constexpr int kContactsInPath = 2; // a reversing pair swaps both armature leads

Context makeContext(const Design& d, const Results& r) {
    Context c;
    c.d = &d;
    for (std::size_t i = 0; i < r.operatingPoints.size(); ++i)
        if (r.operatingPoints[i].valid && !r.operatingPoints[i].devices.empty())
            c.points.push_back(i);
    c.motor = makeMotorModel(d.motor);
    c.armature_ohm = c.motor.armatureResistance_ohm;
    c.motorCable_ohm = copper::conductorResistance(d.wiring.motorCableLength_m, d.wiring.motorCable_mm2,
                                                   d.wiring.cableTemperature_C);
    c.contacts_ohm =
        d.reversing.present ? kContactsInPath * d.reversing.contactor.contactResistance_ohm : 0.0;
    c.diodeRd_ohm = d.bank.freewheelDiode.rd_ohm / std::max(1, d.bank.diodeCount);
    c.batteryCable20_ohm =
        copper::conductorResistance(d.wiring.batteryCableLength_m, d.wiring.batteryCable_mm2, 20.0);
    for (const auto i : c.points) {
        const auto& op = r.operatingPoints[i];
        if (op.motorRmsCurrent_A > c.maxMotorRms_A) {
            c.maxMotorRms_A = op.motorRmsCurrent_A;
            c.worstRmsPoint = i;
        }
        c.maxMotorPeak_A = std::max(c.maxMotorPeak_A, op.motorCurrent_A + 0.5 * op.ripplePeakToPeak_A);
        c.maxBattery_A = std::max(c.maxBattery_A, op.batteryCurrent_A);
        c.maxSpeed_radps = std::max(c.maxSpeed_radps, op.speed_rpm * kRadPerSecPerRpm);
        const double t = i < d.dutyProfile.size() ? std::max(0.0, d.dutyProfile[i].duration_s) : 0.0;
        c.motorSteps.push_back({op.motorRmsCurrent_A, t});
        c.batterySteps.push_back({op.batteryCurrent_A, t});
    }
    // The profile repeats: the equivalent heating current is the time-weighted RMS.
    double t = 0.0, m2 = 0.0, b2 = 0.0;
    for (std::size_t k = 0; k < c.motorSteps.size(); ++k) {
        t += c.motorSteps[k].duration_s;
        m2 += c.motorSteps[k].current_A * c.motorSteps[k].current_A * c.motorSteps[k].duration_s;
        b2 += c.batterySteps[k].current_A * c.batterySteps[k].current_A * c.batterySteps[k].duration_s;
    }
    c.profileMotorRms_A = t > 0.0 ? std::sqrt(m2 / t) : c.maxMotorRms_A;
    c.profileBatteryRms_A = t > 0.0 ? std::sqrt(b2 / t) : c.maxBattery_A;
    if (!(t > 0.0)) { // no durations: every point counts as continuous
        c.motorSteps.clear();
        c.batterySteps.clear();
    }
    return c;
}

double coilVoltage(const Reversing& rv) {
    return rv.coilSupplyMax_V > 0.0 ? rv.coilSupplyMax_V : rv.contactor.coilVoltage_V;
}

CoilSuppressionInput coilInput(const Reversing& rv) {
    CoilSuppressionInput in;
    in.kind = rv.suppression;
    in.coilVoltage_V = coilVoltage(rv);
    in.coilResistance_ohm = rv.contactor.coilResistance_ohm;
    in.coilTimeConstant_s = rv.coilTimeConstant_s;
    in.releaseFraction = rv.coilReleaseFraction;
    in.unsuppressedDropout_s = rv.contactor.dropoutTime_s;
    in.zener_V = rv.zener_V > 0.0 ? rv.zener_V : rv.contactor.coilVoltage_V;
    in.tvs_V = rv.tvs_V > 0.0 ? rv.tvs_V : 1.5 * in.coilVoltage_V;
    return in;
}

const std::map<std::string, std::string> kReversalPaths = {
    {"decay.inductance_H", "motor.inductance_H"},
    {"decay.resistance_ohm", "motor.armatureResistance20_ohm"},
    {"coast.inertia_kgm2", "motor.rotorInertia_kgm2"},
    {"coast.stopSpeed_radps", "reversing.stopSpeed_rpm"},
    {"coast.retardingTorque_Nm", "reversing.retardingTorque_Nm"},
    {"coast.statedStopTime_s", "reversing.stopTime_s"},
    {"coil.suppression", "reversing.suppression"},
    {"coil.coilVoltage_V", "reversing.contactor.coilVoltage_V"},
    {"coil.coilResistance_ohm", "reversing.contactor.coilResistance_ohm"},
    {"coil.coilTimeConstant_s", "reversing.coilTimeConstant_s"},
    {"coil.releaseFraction", "reversing.coilReleaseFraction"},
    {"coil.unsuppressedDropout_s", "reversing.contactor.dropoutTime_s"},
    {"coil.zener_V", "reversing.zener_V"},
    {"coil.tvs_V", "reversing.tvs_V"},
    {"changeoverMargin_s", "reversing.changeoverMargin_s"},
    {"pickup_s", "reversing.contactor.pickupTime_s"},
    {"bounce_s", "reversing.contactor.bounceTime_s"},
    {"softStartRamp_s", "reversing.softStartRamp_s"},
    {"torqueConstant_NmPerA", "motor.torqueConstant_NmPerA"},
};

// ---------------------------------------------------------------------------------------------

void slowDownAdvice(const Design& d, const ReversalSummary& sum, Results& r);

void reversalStage(const Context& c, Results& r) {
    const Design& d = *c.d;
    const Reversing& rv = d.reversing;
    if (!rv.present || c.points.empty())
        return;

    // Starting points: those followed by a change of direction; every point when the profile has none.
    struct Start {
        std::size_t point;
        double restartDuty;
    };
    std::vector<Start> starts;
    for (std::size_t k = 0; k + 1 < c.points.size(); ++k) {
        const auto i = c.points[k], j = c.points[k + 1];
        if (j == i + 1 && d.dutyProfile[i].direction != d.dutyProfile[j].direction)
            starts.push_back({i, r.operatingPoints[j].duty});
    }
    if (starts.empty())
        for (const auto i : c.points)
            starts.push_back({i, r.operatingPoints[i].duty});

    std::optional<ReversalResult> worst;
    std::string worstName;
    for (const auto& s : starts) {
        const auto& op = r.operatingPoints[s.point];
        ReversalInput in;
        in.decay.current_A = std::max(0.0, op.motorCurrent_A);
        in.decay.inductance_H = d.motor.inductance_H;
        in.decay.resistance_ohm = c.armature_ohm + c.motorCable_ohm + c.contacts_ohm + c.diodeRd_ohm;
        in.decay.backEmf_V = std::max(0.0, op.backEmf_V);
        in.decay.diodeDrop_V = d.bank.freewheelDiode.vf0_V;
        in.coast.inertia_kgm2 = d.motor.rotorInertia_kgm2 + d.motor.loadInertia_kgm2;
        in.coast.initialSpeed_radps = std::max(0.0, op.speed_rpm * kRadPerSecPerRpm);
        in.coast.stopSpeed_radps = rv.stopSpeed_rpm * kRadPerSecPerRpm;
        const double k = torqueConstant(c.motor, op.motorCurrent_A);
        in.coast.retardingTorque_Nm = k * d.motor.noLoadCurrent_A + rv.retardingTorque_Nm;
        in.coast.statedStopTime_s = rv.stopTime_s;
        in.coil = coilInput(rv);
        in.waitForStop = rv.waitForStop;
        in.changeoverMargin_s = rv.changeoverMargin_s;
        in.pickup_s = rv.contactor.pickupTime_s;
        in.bounce_s = rv.contactor.bounceTime_s;
        in.softStartRamp_s = rv.softStartRamp_s;
        in.torqueConstant_NmPerA = k;
        in.supply_V = d.supply.max_V;
        in.restartDuty = std::clamp(s.restartDuty, 0.0, 1.0);
        auto res = reversalSequence(in);
        if (!res.valid) {
            reportProblems(res.problems, kReversalPaths, "reversal sequence from " + op.name, r.checks);
            return;
        }
        if (!worst || res.total_s > worst->total_s) {
            worst = std::move(res);
            worstName = op.name;
        }
    }
    const auto& w = *worst;
    ReversalSummary sum;
    sum.fromPoint = worstName;
    for (const auto& st : w.steps)
        sum.steps.push_back({st.name, st.duration_s});
    sum.total_s = w.total_s;
    sum.coilDropout_s = w.coil.dropout_s;
    sum.changeoverSpeed_rpm = w.changeoverSpeed_radps / kRadPerSecPerRpm;
    sum.changeoverAtSpeedCurrent_A = w.changeoverAtSpeedCurrent_A;
    sum.pluggingCurrent_A = w.pluggingCurrent_A;
    sum.allowsReversalAboveStop = w.allowsReversalAboveStop;
    r.protection.reversal = sum;
    slowDownAdvice(d, sum, r);

    const std::string src =
        "circuit of the freewheel path: (E − V_f)/R with the armature swapped; (D·V + E)/R at "
        "restart";
    if (w.allowsReversalAboveStop) {
        const bool noWait = !rv.waitForStop;
        r.checks.push_back(check(
            "contactor.reversal-at-speed", Severity::Fail, w.changeoverAtSpeedCurrent_A, 0.0, "A", src,
            fmt::format(
                "the contactor can change over at {} rpm, above the stop speed {} rpm: the back-EMF {} V "
                "drives {} A through the freewheel diode and contacts with PWM off",
                num(sum.changeoverSpeed_rpm), num(rv.stopSpeed_rpm), num(w.changeoverEmf_V),
                num(w.changeoverAtSpeedCurrent_A)),
            noWait ? "Make the sequence wait for the stop speed"
                   : "Lengthen the stated stop time or clear it to compute it",
            noWait ? "reversing.waitForStop" : "reversing.stopTime_s", worstName));
        r.checks.push_back(
            check("contactor.plugging", Severity::Fail, w.pluggingCurrent_A, d.pwm.currentLimit_A, "A", src,
                  fmt::format("restarting into the motor still turning at {} rpm draws (D·V + E)/R = {} A",
                              num(sum.changeoverSpeed_rpm), num(w.pluggingCurrent_A)),
                  noWait ? "Make the sequence wait for the stop speed"
                         : "Lengthen the stated stop time or clear it to compute it",
                  noWait ? "reversing.waitForStop" : "reversing.stopTime_s", worstName));
    } else if (w.changeoverAtSpeedCurrent_A > 0.0) {
        const double k = w.changeoverEmf_V / std::max(1e-12, w.changeoverSpeed_radps);
        r.checks.push_back(check(
            "contactor.reversal-at-speed", Severity::Warning, w.changeoverAtSpeedCurrent_A, 0.0, "A", src,
            fmt::format("at the stop speed {} rpm the back-EMF {} V exceeds the diode drop: changing over "
                        "there still "
                        "drives {} A through the freewheel diode and contacts",
                        num(rv.stopSpeed_rpm), num(w.changeoverEmf_V), num(w.changeoverAtSpeedCurrent_A)),
            fmt::format("Lower the stop speed below {} rpm (E = V_f)",
                        num(d.bank.freewheelDiode.vf0_V / std::max(1e-12, k) / kRadPerSecPerRpm)),
            "reversing.stopSpeed_rpm", worstName));
    } else {
        r.checks.push_back(
            check("contactor.reversal-at-speed", Severity::Pass, 0.0, 0.0, "A", src,
                  fmt::format("the sequence changes over at or below {} rpm, where the back-EMF "
                              "cannot forward-bias the freewheel diode; total reversal {} s",
                              num(rv.stopSpeed_rpm), num(w.total_s)),
                  "", "reversing.stopSpeed_rpm", worstName));
    }
}

void slowDownAdvice(const Design& d, const ReversalSummary& sum, Results& r) {
    const Reversing& rv = d.reversing;
    const double slow = sum.steps.size() > 1 ? sum.steps[1].duration_s : 0.0;
    if (!rv.waitForStop || rv.stopTime_s > 0.0 || rv.retardingTorque_Nm > 0.0 || slow <= kLongSlowDown_s)
        return;
    r.checks.push_back(check(
        "contactor.slow-down", Severity::Advice, slow, kLongSlowDown_s, "s",
        "J·Δω/T_r with only the motor's no-load torque k·I0 (Newton's second law for rotation)",
        fmt::format(
            "slowed only by its own no-load torque, the motor with its load inertia takes {} s to coast "
            "down to {} rpm after \"{}\" before the contactor may change over",
            num(slow), num(rv.stopSpeed_rpm), sum.fromPoint),
        "State the friction and load torque, or a stop time with braking", "reversing.retardingTorque_Nm",
        sum.fromPoint));
}

void contactorStage(const Context& c, Results& r) {
    const Design& d = *c.d;
    const Reversing& rv = d.reversing;
    if (!rv.present)
        return;
    const ContactorPart& p = rv.contactor;
    ContactorInput in;
    in.continuousCurrent_A = p.continuousCurrent_A;
    in.motorRmsCurrent_A = c.profileMotorRms_A;
    in.requiredMargin = kContactorMargin;
    in.coilVoltage_V = p.coilVoltage_V;
    in.coilResistance_ohm = p.coilResistance_ohm;
    in.appliedCoilMin_V = rv.coilSupplyMin_V;
    in.appliedCoilMax_V = rv.coilSupplyMax_V;
    in.contactResistance_ohm = p.contactResistance_ohm;
    in.contactsInPath = kContactsInPath;
    in.electricalLife_ops = p.electricalLife_ops;
    in.mechanicalLife_ops = p.mechanicalLife_ops;
    in.reversalsPerDay = rv.reversalsPerDay;
    in.armatureInductance_H = d.motor.inductance_H;
    in.loopResistance_ohm = c.armature_ohm + c.motorCable_ohm + c.contacts_ohm;
    in.category = rv.category;
    in.dcBreaking_A = p.dcBreaking_A;
    const auto res = rateContactor(in);
    if (!res.valid) {
        reportProblems(res.problems,
                       {{"continuousCurrent_A", "reversing.contactor.continuousCurrent_A"},
                        {"coilVoltage_V", "reversing.contactor.coilVoltage_V"},
                        {"coilResistance_ohm", "reversing.contactor.coilResistance_ohm"},
                        {"appliedCoilMin_V", "reversing.coilSupplyMin_V"},
                        {"appliedCoilMax_V", "reversing.coilSupplyMax_V"},
                        {"contactResistance_ohm", "reversing.contactor.contactResistance_ohm"},
                        {"electricalLife_ops", "reversing.contactor.electricalLife_ops"},
                        {"mechanicalLife_ops", "reversing.contactor.mechanicalLife_ops"},
                        {"reversalsPerDay", "reversing.reversalsPerDay"},
                        {"armatureInductance_H", "motor.inductance_H"},
                        {"loopResistance_ohm", "motor.armatureResistance20_ohm"},
                        {"category", "reversing.category"},
                        {"dcBreaking_A", "reversing.contactor.dcBreaking_A"}},
                       "reversing contactor", r.checks);
        return;
    }
    ContactorSummary s;
    s.motorTimeConstant_s = res.motorTimeConstant_s;
    s.categoryTimeConstant_s = res.categoryTimeConstant_s;
    s.continuousMargin = res.continuousMargin;
    s.mustNotBreakLoad = res.mustNotBreakLoad;
    s.reason = res.reason;
    s.coilCurrent_A = res.coilCurrent_A;
    s.coilPower_W = res.coilPower_W;
    s.contactLoss_W = res.contactLoss_W;
    s.electricalLife_years = res.electricalLife_years;
    r.protection.contactor = s;

    if (res.continuousMargin) {
        const double m = *res.continuousMargin;
        const Severity sev = m < 1.0                ? Severity::Fail
                             : m < kContactorMargin ? Severity::Warning
                                                    : Severity::Pass;
        r.checks.push_back(check(
            "contactor.continuous", sev, m, kContactorMargin, "",
            "thermal current ≥ 1.25 × the motor RMS current over the repeating duty profile (common "
            "practice)",
            fmt::format(
                "thermal current {} A against the motor's RMS current over the duty profile {} A: margin "
                "{} (highest in one segment: {} A)",
                num(p.continuousCurrent_A), num(c.profileMotorRms_A), num(m), num(c.maxMotorRms_A)),
            sev == Severity::Pass ? ""
                                  : fmt::format("Choose a contactor rated at least {} A",
                                                num(kContactorMargin * c.profileMotorRms_A)),
            "reversing.contactor.continuousCurrent_A"));
    }
    r.checks.push_back(
        check("contactor.coil-voltage", res.coilVoltageOk ? Severity::Pass : Severity::Warning,
              res.coilVoltageRatioMin, kCoilCloseMin, "",
              "IEC 60947-4-1 operating band of the coil, 85–110 % of rated (from memory)",
              fmt::format("the coil gets {}–{} % of its rated {} V; it draws {} A, {} W",
                          num(100 * res.coilVoltageRatioMin), num(100 * res.coilVoltageRatioMax),
                          num(p.coilVoltage_V), num(res.coilCurrent_A), num(res.coilPower_W)),
              res.coilVoltageOk ? "" : "Choose a coil voltage that suits the supply (85–110 % of rated)",
              "reversing.contactor.coilVoltage_V"));
    r.checks.push_back(
        check("contactor.break-load", res.mustNotBreakLoad ? Severity::Advice : Severity::Pass,
              res.motorTimeConstant_s, res.categoryTimeConstant_s, "s",
              "IEC 60947-4-1 DC utilisation categories (test-circuit L/R)", res.reason,
              res.mustNotBreakLoad
                  ? "Keep the sequence: PWM off and the armature current decayed before the coil drops out"
                  : "",
              "reversing.category"));
    if (res.electricalLife_years) {
        const double y = *res.electricalLife_years;
        r.checks.push_back(check(
            "contactor.life", y < kLifeAdvice_years ? Severity::Advice : Severity::Pass, y, kLifeAdvice_years,
            "", "part's electrical life / (reversals per day × 365)",
            fmt::format("{} operations at {} reversals a day last {} years; contact loss {} W",
                        num(p.electricalLife_ops), num(rv.reversalsPerDay), num(y), num(res.contactLoss_W)),
            y < kLifeAdvice_years ? "Plan contactor replacement or choose a longer-lived part" : "",
            "reversing.contactor.electricalLife_ops"));
    }
}

BridgeComparisonResult comparePoint(const Context& c, const Results& r, std::size_t point);

void bridgeStage(const Context& c, Results& r) {
    const Design& d = *c.d;
    if (!d.reversing.present || c.points.empty() || d.pwm.topology == "fullBridge")
        return;
    // Conduction losses averaged over the duty profile (each point weighted by its duration); the
    // other columns do not depend on the point.
    std::vector<BridgeOption> avg;
    double total_s = 0.0;
    for (const auto i : c.points) {
        const double t = std::max(0.0, d.dutyProfile[i].duration_s);
        const auto res = comparePoint(c, r, i);
        if (!res.valid)
            return; // a comparison only: its inputs come from solved points and checked fields
        if (avg.empty()) {
            avg = res.options;
            for (auto& o : avg)
                o.conductionLoss_W = 0.0;
        }
        for (std::size_t k = 0; k < avg.size(); ++k)
            avg[k].conductionLoss_W += t * res.options[k].conductionLoss_W;
        total_s += t;
    }
    for (auto& o : avg) {
        o.conductionLoss_W = total_s > 0.0 ? o.conductionLoss_W / total_s : 0.0;
        r.protection.bridgeComparison.push_back({o.id, o.name, o.switchCount, o.diodeCount, o.contactorCount,
                                                 o.conductionLoss_W, o.reversal_s, o.braking, o.cost,
                                                 o.costComplete});
    }
}

BridgeComparisonResult comparePoint(const Context& c, const Results& r, std::size_t point) {
    const Design& d = *c.d;
    const auto& op = r.operatingPoints[point];
    double conduction = 0.0;
    for (const auto& dv : op.devices)
        conduction += dv.conduction_W + dv.ballast_W;
    BridgeComparisonInput in;
    in.topology = d.pwm.topology == "synchronousHalfBridge" ? "synchronousHalfBridge" : "lowSideChopper";
    in.devicesPerBank = d.bank.count;
    in.diodeCount = d.bank.diodeCount;
    in.contactsInPath = kContactsInPath;
    // The bank's effective on-state resistance, from the engine's own conduction loss.
    in.bankResistance_ohm =
        op.switchRmsCurrent_A > 0.0 ? conduction / (op.switchRmsCurrent_A * op.switchRmsCurrent_A) : 0.0;
    in.contactResistance_ohm = d.reversing.contactor.contactResistance_ohm;
    in.motorRmsCurrent_A = op.motorRmsCurrent_A;
    in.switchRmsCurrent_A = op.switchRmsCurrent_A;
    in.diodeAverageCurrent_A = op.diodeAverageCurrent_A;
    in.diodeRmsCurrent_A = op.diodeRmsCurrent_A;
    in.diodeVf0_V = d.bank.freewheelDiode.vf0_V;
    in.diodeRd_ohm = c.diodeRd_ohm;
    in.contactorReversal_s = r.protection.reversal ? r.protection.reversal->total_s : 0.0;
    in.inertia_kgm2 = d.motor.rotorInertia_kgm2 + d.motor.loadInertia_kgm2;
    in.initialSpeed_radps = c.maxSpeed_radps;
    in.currentLimit_A = d.pwm.currentLimit_A > 0.0 ? d.pwm.currentLimit_A : op.motorCurrent_A;
    in.torqueConstant_NmPerA = torqueConstant(c.motor, in.currentLimit_A); // braking at the limit
    in.retardingTorque_Nm =
        in.torqueConstant_NmPerA * d.motor.noLoadCurrent_A + d.reversing.retardingTorque_Nm;
    in.softStartRamp_s = d.reversing.softStartRamp_s;
    in.devicePrice = d.bank.device.cost;
    in.diodePrice = d.bank.freewheelDiode.cost;
    in.contactorPrice = d.reversing.contactor.cost;
    return compareWithFullBridge(in);
}

void disconnectStage(const Context& c, Results& r) {
    const Design& d = *c.d;
    const ContactorPart& m = d.wiring.mainContactor;
    DisconnectInput in;
    in.maxBus_V = d.supply.max_V;
    in.batteryResistance_ohm = d.supply.internalResistance_ohm;
    in.cableResistance_ohm = c.batteryCable20_ohm;
    in.motorResistance_ohm = c.armature_ohm + c.motorCable_ohm + c.contacts_ohm;
    in.ratedVoltage_V = m.ratedVoltage_V;
    in.dcBreaking_A = m.dcBreaking_A;
    const auto res = rateDisconnect(in);
    if (!res.valid) {
        reportProblems(res.problems,
                       {{"maxBus_V", "supply.max_V"},
                        {"batteryResistance_ohm", "supply.internalResistance_ohm"},
                        {"ratedVoltage_V", "wiring.mainContactor.ratedVoltage_V"},
                        {"dcBreaking_A", "wiring.mainContactor.dcBreaking_A"}},
                       "main disconnect", r.checks);
        return;
    }
    r.protection.mainDisconnect =
        DisconnectSummary{res.requiredBreak_A, res.stallCurrent_A, res.shortCircuitCurrent_A};
    const std::string src =
        "V_max over the battery and cable resistance (Ohm's law); DC rating needed, no current zero";
    r.checks.push_back(
        check("disconnect.voltage", res.voltageOk ? Severity::Pass : Severity::Fail, m.ratedVoltage_V,
              d.supply.max_V, "V", "highest bus voltage",
              fmt::format("main contactor DC rating {} V against the highest bus voltage {} V",
                          num(m.ratedVoltage_V), num(d.supply.max_V)),
              res.voltageOk ? "" : "Choose a main contactor DC-rated for the highest bus voltage",
              "wiring.mainContactor.ratedVoltage_V"));
    Severity sev = Severity::Pass;
    std::string fix;
    if (m.dcBreaking_A <= 0.0) {
        sev = Severity::Warning;
        fix = fmt::format("State the main contactor's DC breaking capacity (it must break {} A)",
                          num(res.requiredBreak_A));
    } else if (!res.breaksStall || !res.breaksShortCircuit) {
        sev = Severity::Fail;
        fix = fmt::format("Choose a disconnect that breaks at least {} A DC at {} V",
                          num(res.requiredBreak_A), num(d.supply.max_V));
    }
    r.checks.push_back(check(
        "disconnect.breaking", sev, m.dcBreaking_A, res.requiredBreak_A, "A", src,
        fmt::format(
            "with the bank failed short the main contactor is the only way to stop the machine: it must "
            "break "
            "the stall current {} A and the prospective short-circuit current {} A at {} V; its DC breaking "
            "capacity is {}",
            num(res.stallCurrent_A), num(res.shortCircuitCurrent_A), num(d.supply.max_V),
            m.dcBreaking_A > 0.0 ? num(m.dcBreaking_A) + " A" : std::string("not stated")),
        fix, "wiring.mainContactor.dcBreaking_A"));
}

void prechargeStage(const Context& c, Results& r) {
    const Design& d = *c.d;
    const Wiring& w = d.wiring;
    if (!(w.busCapacitance_F > 0.0))
        return; // nothing to charge
    PrechargeInput in;
    in.bus_V = d.supply.max_V;
    in.capacitance_F = w.busCapacitance_F;
    in.targetFraction = w.prechargeFraction;
    in.targetTime_s = w.prechargeTime_s;
    in.resistor_ohm = w.prechargeResistor_ohm;
    in.sourceResistance_ohm = d.supply.internalResistance_ohm + c.batteryCable20_ohm;
    const auto res = precharge(in);
    if (!res.valid) {
        reportProblems(res.problems,
                       {{"bus_V", "supply.max_V"},
                        {"capacitance_F", "wiring.busCapacitance_F"},
                        {"targetFraction", "wiring.prechargeFraction"},
                        {"targetTime_s", "wiring.prechargeTime_s"},
                        {"resistor_ohm", "wiring.prechargeResistor_ohm"},
                        {"sourceResistance_ohm", "supply.internalResistance_ohm"}},
                       "pre-charge", r.checks);
        return;
    }
    PrechargeSummary s;
    s.present = w.prechargePresent;
    s.resistor_ohm = res.resistor_ohm;
    s.time_s = res.time_s;
    s.peakCurrent_A = res.peakCurrent_A;
    s.peakPower_W = res.peakPower_W;
    s.energy_J = res.energy_J;
    s.closingCurrent_A = res.closingCurrent_A;
    s.inrushUncharged_A = res.inrushUncharged_A;
    r.protection.precharge = s;
    const double limit = w.mainContactor.continuousCurrent_A;
    const std::string src =
        "RC charge through the battery and wiring resistance; contacts weld when they close onto "
        "a current far above their rating (common practice)";
    if (!w.prechargePresent) {
        r.checks.push_back(
            check("precharge.inrush", Severity::Fail, res.inrushUncharged_A, limit, "A", src,
                  fmt::format("the main contactor closes onto {} mF of uncharged capacitors: {} A flows, "
                              "limited only by the "
                              "battery and wiring ({} mΩ)",
                              num(1e3 * w.busCapacitance_F), num(res.inrushUncharged_A),
                              num(1e3 * in.sourceResistance_ohm)),
                  fmt::format(
                      "Fit a pre-charge resistor of about {} Ω ({} J pulse, {} W peak) and close after {} s",
                      num(res.resistor_ohm), num(res.energy_J), num(res.peakPower_W), num(res.time_s)),
                  "wiring.prechargePresent"));
    } else {
        const bool ok = res.closingCurrent_A <= limit;
        r.checks.push_back(
            check("precharge.inrush", ok ? Severity::Pass : Severity::Warning, res.closingCurrent_A, limit,
                  "A", src,
                  fmt::format("pre-charge through {} Ω to {} % in {} s (peak {} W, {} J); the main contactor "
                              "then closes onto "
                              "a {} A step",
                              num(res.resistor_ohm), num(100 * w.prechargeFraction), num(res.time_s),
                              num(res.peakPower_W), num(res.energy_J), num(res.closingCurrent_A)),
                  ok ? "" : "Raise the pre-charge fraction (wait longer) before closing",
                  "wiring.prechargeFraction"));
    }
}

struct CableSpec {
    const char* name;
    const char* field;
    const char* lengthField;
    double current_A; // equivalent heating current (its loss is reported)
    double peak_A;    // for the drop
    double length_m;
    double area_mm2;
    std::vector<CableLoadStep> steps; // repeating profile for the conductor temperature
};

double conductorLimit_C(const Wiring& w) {
    return w.cableInsulation == "xlpe" ? 90.0 : 70.0;
}
double adiabaticK(const Wiring& w) {
    return w.cableInsulation == "xlpe" ? 143.0 : 115.0;
}

std::optional<CableSummary> cableStage(const Context& c, const CableSpec& spec, Results& r) {
    const Design& d = *c.d;
    const Wiring& w = d.wiring;
    CableInput in;
    in.current_A = spec.current_A;
    in.peakCurrent_A = spec.peak_A;
    in.length_m = spec.length_m;
    in.area_mm2 = spec.area_mm2;
    in.allowedDrop_V = w.allowedCableDrop * d.supply.nominal_V;
    in.ambient_C = d.heatsink.ambient_C;
    in.conductorLimit_C = conductorLimit_C(w);
    in.profile = spec.steps;
    const auto res = rateCable(in);
    const std::string field = spec.field;
    const std::string lengthField = spec.lengthField;
    if (!res.valid || !res.installed) {
        reportProblems(res.problems,
                       {{"length_m", lengthField},
                        {"area_mm2", field},
                        {"allowedDrop_V", "wiring.allowedCableDrop"},
                        {"ambient_C", "heatsink.ambient_C"}},
                       std::string(spec.name) + " cable", r.checks);
        return std::nullopt;
    }
    const auto& ins = *res.installed;
    CableSummary s;
    s.name = spec.name;
    s.crossSection_mm2 = ins.area_mm2;
    s.drop_V = ins.drop_V;
    s.loss_W = ins.loss_W;
    s.conductorTemperature_C = ins.conductorTemperature_C;
    s.ampacity_A = ins.ampacity_A;
    if (res.required)
        s.requiredCrossSection_mm2 = res.required->area_mm2;
    const std::string sizeFix =
        res.required ? fmt::format("Use at least {} mm² (IEC 60228 class 5)", num(res.required->area_mm2))
                     : std::string("No standard size up to 240 mm² meets both limits: shorten "
                                   "the cable or run conductors in parallel");
    r.checks.push_back(check(
        "cable.drop", ins.dropOk ? Severity::Pass : Severity::Warning, ins.drop_V, in.allowedDrop_V, "V",
        "IEC 60228 class 5 maximum resistance at the conductor temperature; allowed drop as stated",
        fmt::format("{} cable {} mm², {} m of conductor at {} A: drop {} V (allowed {} V), loss {} W",
                    spec.name, num(spec.area_mm2), num(spec.length_m), num(spec.peak_A), num(ins.drop_V),
                    num(in.allowedDrop_V), num(ins.loss_W)),
        ins.dropOk ? "" : sizeFix, field));
    r.checks.push_back(check(
        "cable.temperature", ins.temperatureOk ? Severity::Pass : Severity::Fail, ins.conductorTemperature_C,
        in.conductorLimit_C, "°C",
        "conductor limit of the insulation, IEC 60364-5-52 Table 52.1; heat balance in still air (estimate)",
        ins.runaway
            ? fmt::format("{} cable {} mm² keeps heating over the repeating duty profile (RMS {} A, "
                          "ampacity {} A)",
                          spec.name, num(spec.area_mm2), num(spec.current_A), num(ins.ampacity_A))
            : fmt::format("{} cable {} mm² peaks at about {} °C over the repeating duty profile (RMS {} A, "
                          "highest {} A; limit {} °C, ampacity {} A)",
                          spec.name, num(spec.area_mm2), num(ins.conductorTemperature_C), num(spec.current_A),
                          num(spec.peak_A), num(in.conductorLimit_C), num(ins.ampacity_A)),
        ins.temperatureOk ? "" : sizeFix, field));
    return s;
}

void fuseStage(const Context& c, Results& r) {
    const Design& d = *c.d;
    const Wiring& w = d.wiring;
    FuseInput in;
    in.maxBus_V = d.supply.max_V;
    in.ratedVoltage_V =
        w.fuseVoltage_V > 0.0 ? w.fuseVoltage_V : 1.0; // a missing rating fails the check below
    in.ratedCurrent_A = w.fuseRating_A > 0.0 ? w.fuseRating_A : 1.0;
    in.rmsCurrent_A = c.profileBatteryRms_A;
    in.requiredMargin = kFuseMargin;
    in.breakingCapacity_A = w.fuseBreaking_A;
    in.batteryResistance_ohm = d.supply.internalResistance_ohm;
    in.cableResistance_ohm = c.batteryCable20_ohm;
    in.clearingI2t_A2s = w.fuseI2t_A2s;
    in.bankWithstandI2t_A2s = w.bankWithstandI2t_A2s;
    in.cableArea_mm2 = w.batteryCable_mm2;
    in.cableK = adiabaticK(w);
    in.cableAmpacity_A = r.protection.cable ? r.protection.cable->ampacity_A : 0.0;
    const auto res = rateFuse(in);
    if (!res.valid) {
        reportProblems(res.problems,
                       {{"maxBus_V", "supply.max_V"},
                        {"breakingCapacity_A", "wiring.fuseBreaking_A"},
                        {"batteryResistance_ohm", "supply.internalResistance_ohm"},
                        {"clearingI2t_A2s", "wiring.fuseI2t_A2s"},
                        {"bankWithstandI2t_A2s", "wiring.bankWithstandI2t_A2s"},
                        {"cableArea_mm2", "wiring.batteryCable_mm2"}},
                       "fuse", r.checks);
        return;
    }
    FuseSummary s;
    s.prospectiveShortCircuit_A = res.prospectiveShortCircuit_A;
    s.cableWithstand_A2s = res.cableWithstand_A2s;
    if (w.fuseRating_A > 0.0)
        s.continuousMargin = res.continuousMargin;
    r.protection.fuse = s;

    if (!(w.fuseRating_A > 0.0)) {
        r.checks.push_back(
            check("fuse.present", Severity::Warning, 0.0, res.prospectiveShortCircuit_A, "A",
                  "battery short circuit V_max/(R_bat + R_cable)",
                  fmt::format("no battery fuse is stated; a short at the controller would draw about {} A",
                              num(res.prospectiveShortCircuit_A)),
                  "State the battery fuse (rating, DC voltage, breaking capacity) and fit it at the battery "
                  "terminal",
                  "wiring.fuseRating_A"));
        return;
    }
    const bool voltageStated = w.fuseVoltage_V > 0.0;
    r.checks.push_back(check(
        "fuse.voltage", res.voltageOk && voltageStated ? Severity::Pass : Severity::Fail, w.fuseVoltage_V,
        d.supply.max_V, "V", "highest bus voltage; a DC fault has no current zero",
        voltageStated ? fmt::format("fuse DC rating {} V against the highest bus voltage {} V",
                                    num(w.fuseVoltage_V), num(d.supply.max_V))
                      : std::string("the fuse's DC voltage rating is not stated"),
        res.voltageOk && voltageStated ? "" : "Choose a fuse DC-rated at or above the highest bus voltage",
        "wiring.fuseVoltage_V"));
    if (res.continuousMargin) {
        const double m = *res.continuousMargin;
        const Severity sev = m < 1.0 ? Severity::Fail : m < kFuseMargin ? Severity::Warning : Severity::Pass;
        r.checks.push_back(
            check("fuse.continuous", sev, m, kFuseMargin, "",
                  "fuse rating ≥ 1.25 × the RMS current over the repeating duty profile (common "
                  "practice)",
                  fmt::format("fuse {} A against the battery's RMS current over the duty profile {} A: "
                              "margin {}",
                              num(w.fuseRating_A), num(c.profileBatteryRms_A), num(m)),
                  sev == Severity::Pass ? ""
                                        : fmt::format("Choose a fuse of at least {} A (and a cable to "
                                                      "match)",
                                                      num(kFuseMargin * c.profileBatteryRms_A)),
                  "wiring.fuseRating_A"));
    }
    if (c.maxBattery_A > w.fuseRating_A)
        r.checks.push_back(
            check("fuse.segment-current", Severity::Advice, c.maxBattery_A, w.fuseRating_A, "A",
                  "the fuse's time–current curve (maker's data)",
                  fmt::format("one segment draws {} A from the battery, above the fuse's {} A rating",
                              num(c.maxBattery_A), num(w.fuseRating_A)),
                  "Check on the fuse's time–current curve that it holds for the segment's duration",
                  "wiring.fuseRating_A"));
    if (res.protectsCable)
        r.checks.push_back(check("fuse.cable", *res.protectsCable ? Severity::Pass : Severity::Fail,
                                 w.fuseRating_A, in.cableAmpacity_A, "A",
                                 "IEC 60364-4-43 §433.1: I_B ≤ I_n ≤ I_z",
                                 fmt::format("fuse {} A against the battery cable's ampacity {} A",
                                             num(w.fuseRating_A), num(in.cableAmpacity_A)),
                                 *res.protectsCable ? "" : "Use a larger battery cable or a smaller fuse",
                                 "wiring.batteryCable_mm2"));
    if (res.breakingOk)
        r.checks.push_back(
            check("fuse.breaking", *res.breakingOk ? Severity::Pass : Severity::Fail, w.fuseBreaking_A,
                  res.prospectiveShortCircuit_A, "A",
                  "prospective short circuit V_max/(R_bat + R_cable), cable at 20 °C",
                  fmt::format("breaking capacity {} A against the prospective short-circuit current {} A",
                              num(w.fuseBreaking_A), num(res.prospectiveShortCircuit_A)),
                  *res.breakingOk
                      ? ""
                      : "Choose a fuse whose DC breaking capacity exceeds the prospective short circuit",
                  "wiring.fuseBreaking_A"));
    else
        r.checks.push_back(
            check("fuse.breaking", Severity::Warning, 0.0, res.prospectiveShortCircuit_A, "A",
                  "prospective short circuit V_max/(R_bat + R_cable), cable at 20 °C",
                  fmt::format("the fuse's breaking capacity is not stated; it must exceed {} A",
                              num(res.prospectiveShortCircuit_A)),
                  "State the fuse's DC breaking capacity", "wiring.fuseBreaking_A"));
    if (res.i2tCableOk)
        r.checks.push_back(
            check("fuse.i2t-cable", *res.i2tCableOk ? Severity::Pass : Severity::Fail, w.fuseI2t_A2s,
                  res.cableWithstand_A2s, "A²s",
                  fmt::format("adiabatic withstand k²S², k = {} (IEC 60364-4-43 §434.5.2)", num(in.cableK)),
                  fmt::format("fuse clearing I²t {} A²s against the battery cable's {} A²s",
                              num(w.fuseI2t_A2s), num(res.cableWithstand_A2s)),
                  *res.i2tCableOk ? "" : "Use a faster fuse or a larger cable", "wiring.fuseI2t_A2s"));
    if (res.i2tBankOk)
        r.checks.push_back(
            check("fuse.i2t-bank", *res.i2tBankOk ? Severity::Pass : Severity::Fail, w.fuseI2t_A2s,
                  w.bankWithstandI2t_A2s, "A²s", "the bank's stated short-circuit withstand",
                  fmt::format("fuse clearing I²t {} A²s against the bank's {} A²s", num(w.fuseI2t_A2s),
                              num(w.bankWithstandI2t_A2s)),
                  *res.i2tBankOk ? "" : "Use a faster fuse (lower I²t)", "wiring.fuseI2t_A2s"));
}

} // namespace

void addProtection(const Design& design, Results& results) {
    const Context c = makeContext(design, results);
    reversalStage(c, results);
    contactorStage(c, results);
    bridgeStage(c, results);
    disconnectStage(c, results);
    prechargeStage(c, results);
    const Wiring& w = design.wiring;
    results.protection.cable = cableStage(
        c,
        {"battery", "wiring.batteryCable_mm2", "wiring.batteryCableLength_m", c.profileBatteryRms_A,
         c.maxBattery_A, w.batteryCableLength_m, w.batteryCable_mm2, c.batterySteps},
        results);
    results.protection.motorCable =
        cableStage(c,
                   {"motor", "wiring.motorCable_mm2", "wiring.motorCableLength_m", c.profileMotorRms_A,
                    c.maxMotorPeak_A, w.motorCableLength_m, w.motorCable_mm2, c.motorSteps},
                   results);
    fuseStage(c, results);
}

} // namespace amp

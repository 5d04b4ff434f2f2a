// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/engine/evaluate.h"
#include "core/engine/evaluate_nearby.h"
#include "core/engine/stage_losses.h"
#include "core/engine/stage_protection.h"

#include "core/engine/stage_bank.h"
#include "core/engine/stage_thermal.h"

#include "core/bank/banksolver.h"
#include "core/bank/thermalnetwork.h"
#include "core/checks/makecheck.h"
#include "core/physics/bank_sharing.h"
#include "core/physics/bipolar_on_state.h"
#include "core/physics/chopper.h"
#include "core/physics/copper.h"
#include "core/physics/diode_conduction.h"
#include "core/physics/mosfet_rdson.h"
#include "core/physics/motor.h"
#include "core/physics/thermal_chain.h"
#include "core/units/units.h"

// GCC 12 reports a false use-after-free inside <complex> when it inlines Eigen's eigen-solver.
#if defined(__GNUC__) && !defined(__clang__) && __GNUC__ == 12
#pragma GCC diagnostic ignored "-Wuse-after-free"
#endif
#include <Eigen/Dense>
#include <Eigen/Eigenvalues>
#include <fmt/format.h>
#include <spdlog/spdlog.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <limits>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace amp {

namespace {

// A junction above this has no physical fixed point worth reporting: the bank has run away.
constexpr double kRunawayLimit_C = 400.0;
constexpr int kMaxIterations = 500;
constexpr double kConverged_K = 1e-7;
// Above this many devices the dense Jacobian and its eigenvalues cost more than an edit should
// wait for; the network solver (core/bank/) takes over such banks.
constexpr std::size_t kMaxLoopGainDevices = 64;
// Perturbation for the loop-gain Jacobian; the map is smooth, 10 mK keeps rounding far below it.
constexpr double kJacobianStep_K = 0.01;
// Junction margin below the part's T_j,max that raises a warning (common practice).
constexpr double kJunctionMargin_K = 15.0;

bool finite(double v) { return std::isfinite(v); }

std::string num(double v, int digits = 3) { return units::plain(v, digits); }

// ---------------------------------------------------------------------------------------------
// Input problems: evaluate() must give a clear message instead of NaN for any design that slipped
// past validation (or was built in code).

struct InputProblem {
    std::string field;
    std::string message;
};

class ProblemList {
  public:
    void need(bool ok, std::string field, std::string message) {
        if (!ok)
            m_problems.push_back({std::move(field), std::move(message)});
    }
    /// need() with the message made only when !ok.
    template <class Message> void needOr(bool ok, const char* field, Message message) {
        if (!ok)
            m_problems.push_back({field, message()});
    }
    // The messages are formatted only for a field that fails (evaluate() checks every field of
    // every design it is given, and most pass).
    void positive(double v, const std::string& field, const char* what) {
        if (!(finite(v) && v > 0.0))
            need(false, field, fmt::format("{} is {}: {} must be a positive number", field, num(v), what));
    }
    void nonNegative(double v, const std::string& field, const char* what) {
        if (!(finite(v) && v >= 0.0))
            need(false, field, fmt::format("{} is {}: {} must be zero or positive", field, num(v), what));
    }
    void isFinite(double v, const std::string& field, const char* what) {
        if (!finite(v))
            need(false, field, fmt::format("{} is not a number: {} must be finite", field, what));
    }
    const std::vector<InputProblem>& problems() const { return m_problems; }

  private:
    std::vector<InputProblem> m_problems;
};

std::vector<InputProblem> designProblems(const Design& d) {
    ProblemList p;
    p.positive(d.supply.nominal_V, "supply.nominal_V", "the battery voltage");
    p.nonNegative(d.supply.internalResistance_ohm, "supply.internalResistance_ohm", "the battery resistance");

    const auto& m = d.motor;
    p.needOr(m.kind == "permanentMagnet" || m.kind == "seriesWound", "motor.kind",
             [&] { return fmt::format("motor.kind is \"{}\": it must be \"permanentMagnet\" or \"seriesWound\"", m.kind); });
    p.nonNegative(m.armatureResistance20_ohm, "motor.armatureResistance20_ohm", "the armature resistance");
    p.isFinite(m.windingTemperature_C, "motor.windingTemperature_C", "the winding temperature");
    p.positive(m.inductance_H, "motor.inductance_H", "the armature inductance");
    p.nonNegative(m.noLoadCurrent_A, "motor.noLoadCurrent_A", "the no-load current");
    if (m.kind == "seriesWound") {
        p.need(!m.magnetisation.empty(), "motor.magnetisation",
               "motor.magnetisation is empty: a series-wound motor needs its k(I) table");
        for (std::size_t i = 0; i < m.magnetisation.size(); ++i) {
            const std::string f = fmt::format("motor.magnetisation[{}]", i);
            p.nonNegative(m.magnetisation[i].current_A, f + ".current_A", "the table current");
            p.positive(m.magnetisation[i].torqueConstant_NmPerA, f + ".torqueConstant_NmPerA", "k");
        }
    } else {
        p.positive(m.torqueConstant_NmPerA, "motor.torqueConstant_NmPerA", "the torque constant");
    }

    p.positive(d.pwm.frequency_Hz, "pwm.frequency_Hz", "the PWM frequency");
    p.needOr(finite(d.pwm.maxDuty) && d.pwm.maxDuty > 0.0 && d.pwm.maxDuty <= 1.0, "pwm.maxDuty",
             [&] { return fmt::format("pwm.maxDuty is {}: it must lie in (0, 1]", num(d.pwm.maxDuty)); });
    p.nonNegative(d.pwm.currentLimit_A, "pwm.currentLimit_A", "the current limit (0 = none)");

    const auto& b = d.bank;
    p.needOr(b.count >= 1, "bank.count",
             [&] { return fmt::format("bank.count is {}: the bank needs at least one device", b.count); });
    const auto& s = b.device;
    p.needOr(s.kind == "mosfet" || s.kind == "bipolar" || s.kind == "darlington", "bank.device.kind",
             [&] { return fmt::format("bank.device.kind is \"{}\": it must be \"mosfet\", \"bipolar\" or \"darlington\"", s.kind); });
    if (s.kind == "mosfet") {
        p.positive(s.mosfet.rdsOn25_ohm, "bank.device.mosfet.rdsOn25_ohm", "R_ds(on) at 25 °C");
        p.isFinite(s.mosfet.rdsOnTempExponent, "bank.device.mosfet.rdsOnTempExponent", "the R_ds(on) exponent");
        for (std::size_t i = 0; i < s.mosfet.rdsOnTable.size(); ++i) {
            const std::string f = fmt::format("bank.device.mosfet.rdsOnTable[{}]", i);
            p.isFinite(s.mosfet.rdsOnTable[i].tj_C, f + ".tj_C", "the table temperature");
            p.positive(s.mosfet.rdsOnTable[i].factor, f + ".factor", "the normalised R_ds(on)");
        }
    } else {
        p.nonNegative(s.bjt.vceSat_V, "bank.device.bjt.vceSat_V", "V_CE(sat)");
        p.nonNegative(s.bjt.collectorResistance_ohm, "bank.device.bjt.collectorResistance_ohm", "r_C");
        p.nonNegative(s.bjt.emitterResistance_ohm, "bank.device.bjt.emitterResistance_ohm", "r_E");
    }
    p.positive(s.currentRating_A, "bank.device.currentRating_A", "the device's current rating");
    p.nonNegative(s.leadLimit_A, "bank.device.leadLimit_A", "the package lead limit (0 = not stated)");
    p.isFinite(s.tjMax_C, "bank.device.tjMax_C", "the highest junction temperature");
    p.nonNegative(s.rthJc_KperW, "bank.device.rthJc_KperW", "R_th,jc");
    p.nonNegative(b.ballast_ohm, "bank.ballast_ohm", "the ballast resistance");
    p.nonNegative(b.legResistance_ohm, "bank.legResistance_ohm", "the leg resistance");
    p.needOr(finite(b.derating) && b.derating > 0.0 && b.derating <= 1.0, "bank.derating",
             [&] { return fmt::format("bank.derating is {}: it must lie in (0, 1]", num(b.derating)); });
    p.positive(b.sharingTarget, "bank.sharingTarget", "the accepted max/min current ratio");
    for (std::size_t k = 0; k < b.devices.size(); ++k) {
        const auto& dev = b.devices[k];
        if (finite(dev.rdsOnDeviation) && dev.rdsOnDeviation > -1.0 && finite(dev.ballastDeviation_ohm) &&
            finite(dev.legResistanceDeviation_ohm))
            continue; // the usual case: no field names to build
        const std::string f = fmt::format("bank.devices[{}]", k);
        p.need(finite(dev.rdsOnDeviation) && dev.rdsOnDeviation > -1.0, f + ".rdsOnDeviation",
               fmt::format("{}.rdsOnDeviation is {}: it must be above −1 (R_ds(on) stays positive)", f,
                           num(dev.rdsOnDeviation)));
        p.isFinite(dev.ballastDeviation_ohm, f + ".ballastDeviation_ohm", "the ballast deviation");
        p.isFinite(dev.legResistanceDeviation_ohm, f + ".legResistanceDeviation_ohm", "the leg deviation");
    }
    p.needOr(b.diodeCount >= 1, "bank.diodeCount",
             [&] { return fmt::format("bank.diodeCount is {}: the low-side chopper needs a freewheel diode", b.diodeCount); });
    p.nonNegative(b.freewheelDiode.vf0_V, "bank.freewheelDiode.vf0_V", "the diode threshold voltage");
    p.nonNegative(b.freewheelDiode.rd_ohm, "bank.freewheelDiode.rd_ohm", "the diode resistance");
    p.isFinite(b.freewheelDiode.vfTempCoeff_VperK, "bank.freewheelDiode.vfTempCoeff_VperK", "dV_f/dT");
    p.nonNegative(b.freewheelDiode.rthJc_KperW, "bank.freewheelDiode.rthJc_KperW", "the diode's R_th,jc");
    p.isFinite(b.freewheelDiode.tjMax_C, "bank.freewheelDiode.tjMax_C", "the diode's highest junction temperature");
    p.positive(b.interface.conductivity_WperMK, "bank.interface.conductivity_WperMK", "the interface conductivity");
    p.positive(b.interface.area_m2, "bank.interface.area_m2", "the interface area");
    p.nonNegative(b.interface.thickness_m, "bank.interface.thickness_m", "the interface thickness");
    p.nonNegative(b.interface.contactResistance_KperW, "bank.interface.contactResistance_KperW",
                  "the contact resistance");

    p.nonNegative(d.heatsink.part.rthSa_KperW, "heatsink.part.rthSa_KperW", "R_th,sa");
    p.isFinite(d.heatsink.ambient_C, "heatsink.ambient_C", "the ambient temperature");
    if (d.reversing.present)
        p.nonNegative(d.reversing.contactor.contactResistance_ohm, "reversing.contactor.contactResistance_ohm",
                      "the contact resistance");

    const auto& w = d.wiring;
    p.nonNegative(w.batteryCableLength_m, "wiring.batteryCableLength_m", "the battery cable length");
    p.positive(w.batteryCable_mm2, "wiring.batteryCable_mm2", "the battery cable cross-section");
    p.nonNegative(w.motorCableLength_m, "wiring.motorCableLength_m", "the motor cable length");
    p.positive(w.motorCable_mm2, "wiring.motorCable_mm2", "the motor cable cross-section");
    p.isFinite(w.cableTemperature_C, "wiring.cableTemperature_C", "the cable temperature");
    return p.problems();
}

std::vector<InputProblem> segmentProblems(const Segment& s, std::size_t index) {
    ProblemList p;
    const std::string f = fmt::format("dutyProfile[{}]", index);
    const bool known = s.mode == "torqueSpeed" || s.mode == "currentSpeed" || s.mode == "currentDuty" || s.mode == "stall";
    p.need(known, f + ".mode",
           fmt::format("{}.mode is \"{}\": it must be \"torqueSpeed\", \"currentSpeed\", \"currentDuty\" or \"stall\"", f,
                       s.mode));
    if (s.mode == "torqueSpeed")
        p.nonNegative(s.torque_Nm, f + ".torque_Nm",
                      "the shaft torque (braking needs a topology that returns energy)");
    if (s.mode == "torqueSpeed" || s.mode == "currentSpeed")
        p.nonNegative(s.speed_rpm, f + ".speed_rpm", "the speed (the direction is set by the contactor)");
    if (s.mode == "currentSpeed" || s.mode == "currentDuty")
        p.nonNegative(s.motorCurrent_A, f + ".motorCurrent_A", "the motor current");
    if (s.mode == "currentDuty")
        p.need(finite(s.duty) && s.duty >= 0.0 && s.duty <= 1.0, f + ".duty",
               fmt::format("{}.duty is {}: it must lie in [0, 1]", f, num(s.duty)));
    return p.problems();
}

// ---------------------------------------------------------------------------------------------
// The design reduced to the numbers the operating-point solve needs.

struct Context {
    const Design* design = nullptr;
    MotorModel motor;
    double armature_ohm = 0.0;
    double motorCable_ohm = 0.0;
    double contactor_ohm = 0.0;
    double motorBranch_ohm = 0.0;       // armature + motor cable + contacts
    double batteryCable_ohm = 0.0;
    ChopperSupply supply;               // battery EMF, internal + cable resistance
    bool mosfet = true;
    BipolarOnState bipolar;
    double rthCs_KperW = 0.0;
    HeatsinkModel heatsink;             // stated or plate-fin geometry (stage_thermal.h)
    int diodes = 1;
    std::vector<double> ballast_ohm;    // per device
    std::vector<double> leg_ohm;        // per device
    LossPlan losses;                    // switching, drive, topology (engine/stage_losses.h)
    BankProblem bankProblem;            // the bank as a network (core/bank/), no load yet
};

Context makeContext(const Design& d, EvaluationMemory* memory) {
    Context c;
    c.design = &d;
    c.motor = makeMotorModel(d.motor);
    c.armature_ohm = c.motor.armatureResistance_ohm;
    // Wiring lengths are total conductor lengths, both poles counted (design.h: "both poles").
    c.motorCable_ohm = copper::conductorResistance(d.wiring.motorCableLength_m, d.wiring.motorCable_mm2,
                                                   d.wiring.cableTemperature_C);
    c.batteryCable_ohm = copper::conductorResistance(d.wiring.batteryCableLength_m, d.wiring.batteryCable_mm2,
                                                     d.wiring.cableTemperature_C);
    // The reversing contactor puts one contact in each armature lead.
    c.contactor_ohm = d.reversing.present ? 2.0 * std::max(0.0, d.reversing.contactor.contactResistance_ohm) : 0.0;
    c.motorBranch_ohm = c.armature_ohm + c.motorCable_ohm + c.contactor_ohm;
    c.supply.voltage_V = d.supply.nominal_V;
    c.supply.resistance_ohm = std::max(0.0, d.supply.internalResistance_ohm) + c.batteryCable_ohm;
    c.mosfet = d.bank.device.kind == "mosfet";
    c.bipolar = bipolarOnState(d.bank.device);
    c.rthCs_KperW = interfaceResistance(d.bank.interface);
    c.diodes = std::max(1, d.bank.diodeCount);
    c.losses = planLosses(d);
    c.bankProblem = bankProblemFor(d);
    if (memory && memory->heatsink && memory->heatsinkOf == d.heatsink && memory->heatsinkCount == d.bank.count &&
        memory->heatsinkDiodes == d.bank.diodeCount && memory->heatsinkArea_m2 == d.bank.interface.area_m2)
        c.heatsink = *memory->heatsink; // the same model, with the grid points it has solved
    else
        c.heatsink = HeatsinkModel(d);
    for (const auto& dev : d.bank.devices) {
        c.ballast_ohm.push_back(std::max(0.0, d.bank.ballast_ohm + dev.ballastDeviation_ohm));
        c.leg_ohm.push_back(std::max(0.0, d.bank.legResistance_ohm + dev.legResistanceDeviation_ohm));
    }
    return c;
}

// What an operating point holds fixed while the temperatures settle.
enum class Hold {
    CurrentAtEmf,   // the controller sets the duty for a current at a known speed
    CurrentAtDuty,  // current and duty stated: the speed follows
    DutyAtEmf,      // stall without a current limit: full duty, the current follows
};

struct Demand {
    Hold hold = Hold::CurrentAtEmf;
    double current_A = 0.0;
    double emf_V = 0.0;
    double duty = 0.0;
};

struct Electrical {
    ChopperSolution chopper;
    Sharing sharing;
    std::vector<double> device_ohm;     // on-state resistance of each device alone
    double switchDrop_V = 0.0;
    std::vector<double> conduction_W;   // per device
    double diodeThreshold_V = 0.0;
    double diodeLoss_W = 0.0;           // all freewheel diodes
    LossPoint losses;                   // switching, drive, recovery; every bank of the topology
                                        // (numbers only: checksOf() adds the checks)
    LossPointInput lossInput;           // what `losses` was computed from
    double busExtraUsed_A = 0.0;        // the bus current for those losses this solve assumed
    double busExtra_A = 0.0;            // the bus current they draw (V_bus·I = their power)
    bool busSettled = true;             // the bus current of those losses found (solveElectrical)
    double peakStageLoss_W = 0.0;       // the largest of those losses over the bus passes (the
                                        // last pass of an unsettled bus may have none left)
};

// The motor circuit the chopper drives, with the bank's on-state drop and resistance and the
// freewheel diode's threshold.
ChopperCircuit chopperCircuit(const Context& c, const Demand& demand, double switchDrop_V,
                              double switchResistance_ohm, double diodeDrop_V) {
    const Design& d = *c.design;
    ChopperCircuit circuit;
    circuit.frequency_Hz = d.pwm.frequency_Hz;
    circuit.inductance_H = d.motor.inductance_H;
    circuit.loadResistance_ohm = c.motorBranch_ohm;
    circuit.backEmf_V = demand.emf_V;
    circuit.switchDrop_V = switchDrop_V;
    circuit.switchResistance_ohm = switchResistance_ohm;
    circuit.diodeDrop_V = diodeDrop_V;
    circuit.diodeResistance_ohm = std::max(0.0, d.bank.freewheelDiode.rd_ohm) / c.diodes;
    return circuit;
}

// The chopper at the demand, by what the demand holds.
ChopperSolution solveChopper(const ChopperCircuit& circuit, const ChopperSupply& supply, const Demand& demand,
                             double maxDuty) {
    switch (demand.hold) {
    case Hold::CurrentAtEmf: return chopperForCurrent(circuit, supply, demand.current_A, maxDuty);
    case Hold::CurrentAtDuty: return chopperEmfForCurrent(circuit, supply, demand.duty, demand.current_A);
    case Hold::DutyAtEmf: return chopperAtDuty(circuit, supply, demand.duty);
    }
    return {};
}

// The loss stage's input at a chopper solution: its bus voltage and waveform, the bank's fixed
// resistors and the freewheel diode's junction; the caller adds the devices' drop, shares,
// resistances and junctions.
LossPointInput lossInputAt(const Context& c, const ChopperSolution& chopper, double tjDiode_C) {
    const auto& w = chopper.waveform;
    LossPointInput li;
    li.busVoltage_V = chopper.busVoltage_V;
    li.motorCurrent_A = w.motorAverage_A;
    li.duty = w.duty;
    li.minCurrent_A = w.iMin_A;
    li.maxCurrent_A = w.iMax_A;
    li.capacitorRms_A = w.capacitorRms_A;
    li.ballast_ohm = c.ballast_ohm;
    li.leg_ohm = c.leg_ohm;
    li.diodeTj_C = tjDiode_C;
    return li;
}

Electrical solveElectrical(const Context& c, const Demand& demand, const std::vector<double>& tj_C, double tjDiode_C,
                           const std::vector<double>& otherTj_C, double busExtra_A) {
    const Design& d = *c.design;
    const std::size_t n = d.bank.devices.size();
    Electrical e;
    std::vector<double> path(n);
    e.device_ohm.resize(n);
    for (std::size_t k = 0; k < n; ++k) {
        const double r = c.mosfet ? rdsOn(d.bank.device.mosfet, tj_C[k]) * (1.0 + d.bank.devices[k].rdsOnDeviation)
                                  : c.bipolar.resistance_ohm;
        e.device_ohm[k] = std::max(0.0, r);
        path[k] = e.device_ohm[k] + c.ballast_ohm[k] + c.leg_ohm[k];
    }
    e.sharing = shareByConductance(path);
    e.switchDrop_V = c.mosfet ? 0.0 : c.bipolar.drop_V;
    e.diodeThreshold_V = diodeThreshold(d.bank.freewheelDiode, tjDiode_C);

    ChopperCircuit circuit =
        chopperCircuit(c, demand, e.switchDrop_V, e.sharing.resistance_ohm, e.diodeThreshold_V);
    adaptStandIn(c.losses, d, e.sharing.resistance_ohm, e.switchDrop_V,
                 tj_C.empty() ? d.heatsink.ambient_C : *std::max_element(tj_C.begin(), tj_C.end()), circuit);
    // The stage's losses draw their bus current from the battery too: V_bus = V − R·(I_sw + I_x).
    // I_x depends on V_bus only weakly (the edge energies scale with it): a few passes settle it.
    // Where the losses are large against what the battery can give, the sag they cause cuts them
    // back (P_x ∝ V_bus² for the edges) and plain passes overshoot and ring: secant steps on
    // I_x − G(I_x) from the second pass settle it either way.
    double extra = busExtra_A;
    double lastExtra = 0.0, lastResidual = 0.0;
    for (int pass = 0; pass < 20; ++pass) {
        ChopperSupply supply = c.supply;
        supply.voltage_V -= supply.resistance_ohm * extra;
        e.busExtraUsed_A = extra;
        e.chopper = solveChopper(circuit, supply, demand, d.pwm.maxDuty);
        const auto& w = e.chopper.waveform;
        e.conduction_W.resize(n);
        for (std::size_t k = 0; k < n; ++k) {
            const double avg = e.sharing.share[k] * w.switchAverage_A;
            const double rms = e.sharing.share[k] * w.switchRms_A;
            e.conduction_W[k] = e.switchDrop_V * avg + e.device_ohm[k] * rms * rms;
        }
        e.diodeLoss_W = diodeConductionLoss(d.bank.freewheelDiode, c.diodes, w.diodeAverage_A, w.diodeRms_A, tjDiode_C);

        LossPointInput li = lossInputAt(c, e.chopper, tjDiode_C);
        li.onDrop_V = e.switchDrop_V;
        li.share = e.sharing.share;
        li.resistance_ohm = e.device_ohm;
        li.tj_C = tj_C;
        li.otherTj_C = otherTj_C;
        li.withChecks = false;
        e.losses = computeLossPoint(c.losses, d, li);
        e.peakStageLoss_W = std::max(e.peakStageLoss_W, e.losses.stageLoss_W);
        e.lossInput = std::move(li);
        // Synchronous topologies: the stage has every bank's conduction (none when it could not
        // compute the point, e.g. with no bus voltage left).
        if (e.losses.computesConduction && !e.losses.banks.empty()) {
            for (std::size_t k = 0; k < n && k < e.losses.banks.front().size(); ++k)
                e.conduction_W[k] = e.losses.banks.front()[k].conduction_W;
            e.diodeLoss_W = 0.0;
        }
        const double busPower = e.losses.busPower_W(standInConduction(circuit, w));
        e.busExtra_A = e.chopper.busVoltage_V > 0.0 ? busPower / e.chopper.busVoltage_V : 0.0;
        const double residual = e.busExtra_A - extra;
        e.busSettled = std::abs(residual) <= 1e-12 * std::max(1.0, std::abs(extra));
        if (e.busSettled)
            break;
        double next = e.busExtra_A;
        if (pass > 0 && residual != lastResidual) {
            const double secant = extra - residual * (extra - lastExtra) / (residual - lastResidual);
            if (std::isfinite(secant) && secant >= 0.0)
                next = secant;
        }
        lastExtra = extra;
        lastResidual = residual;
        extra = next;
    }
    return e;
}

// Heat in each device's junction: its conduction and what the loss stage adds (which holds the
// conduction itself for the synchronous topologies).
std::vector<double> junctionHeat(const Electrical& e) {
    const auto& lp = e.losses;
    std::vector<double> device(e.conduction_W.size());
    for (std::size_t k = 0; k < device.size(); ++k) {
        const double extra = lp.banks.empty() || k >= lp.banks.front().size() ? 0.0 : lp.banks.front()[k].junction_W;
        device[k] = (lp.computesConduction ? 0.0 : e.conduction_W[k]) + extra;
    }
    return device;
}

ThermalChainResult solveThermal(const Context& c, const Electrical& e) {
    const Design& d = *c.design;
    ThermalChainInput in;
    in.ambient_C = d.heatsink.ambient_C;
    const auto& lp = e.losses;
    const std::vector<double> device = junctionHeat(e);
    double heat_W = e.diodeLoss_W + lp.freewheelRecovery_W; // into the sink: R_th,sa may depend on it
    for (const double p : device)
        heat_W += p;
    for (std::size_t b = 1; b < lp.banks.size(); ++b)
        for (const auto& dl : lp.banks[b])
            heat_W += dl.junction_W;
    in.rthSa_KperW = std::max(0.0, c.heatsink.rthSa(heat_W));
    for (const double p : device)
        in.branches.push_back({p, std::max(0.0, d.bank.device.rthJc_KperW), c.rthCs_KperW, 1});
    in.branches.push_back({(e.diodeLoss_W + lp.freewheelRecovery_W) / c.diodes,
                           std::max(0.0, d.bank.freewheelDiode.rthJc_KperW), c.rthCs_KperW, c.diodes});
    // The topology's other banks after the diode, device by device.
    for (std::size_t b = 1; b < lp.banks.size(); ++b)
        for (const auto& dl : lp.banks[b])
            in.branches.push_back({dl.junction_W, std::max(0.0, d.bank.device.rthJc_KperW), c.rthCs_KperW, 1});
    return solveThermalChain(in);
}

// One pass of the electrothermal map: temperatures → losses → temperatures. The state holds the
// devices, then the freewheel diodes' junction, then the devices of the topology's other banks.
std::vector<double> thermalMap(const Context& c, const Demand& demand, const std::vector<double>& t, double busExtra_A) {
    const std::size_t n = c.design->bank.devices.size();
    const std::vector<double> devices(t.begin(), t.begin() + static_cast<std::ptrdiff_t>(n));
    const std::vector<double> others(t.begin() + static_cast<std::ptrdiff_t>(n + 1), t.end());
    const auto e = solveElectrical(c, demand, devices, t[n], others, busExtra_A);
    return solveThermal(c, e).junction_C;
}

void networkLosses(const Context& c, const Demand& demand, const std::vector<double>& tj, std::vector<double>& p,
                   std::vector<double>& memory);

// Per-unit losses of the switches and of one freewheel diode at given junction temperatures, for
// the thermal stage's transients (the bank network and the loss stage, as at the steady points):
// a computed point holds its current and back-EMF; point == profile size is a stall at the
// current limit (at full duty when there is none).
void sourceLosses(const Context& c, const Results& r, std::size_t point, const std::vector<double>& tj,
                  std::vector<double>& p, std::vector<double>& memory) {
    Demand demand;
    if (point < r.operatingPoints.size()) {
        demand.current_A = r.operatingPoints[point].motorCurrent_A;
        demand.emf_V = r.operatingPoints[point].backEmf_V;
    } else if (c.design->pwm.currentLimit_A > 0.0) {
        demand.current_A = c.design->pwm.currentLimit_A;
    } else {
        demand.hold = Hold::DutyAtEmf;
        demand.duty = c.design->pwm.maxDuty;
    }
    networkLosses(c, demand, tj, p, memory);
}

struct BankSolve {
    Electrical electrical;
    ThermalChainResult thermal;         // simple model only
    std::vector<double> temperatures;   // simple model only: devices, then diode, then the other banks
    BankResult bank;
    int iterations = 0;
    bool network = false;               // the network solution below is the one reported
    std::string unsettled;              // why the bank and the chopper found no common point ("" if they did)
    BankSolution solution;              // core/bank/ network at the point
    BankProblem problem;                // the point's bank problem (for the bank studies)
    double tjDiode_C = 0.0;
};

// The simple model's fixed point (resistive sharing, saturated bipolar drop): the synchronous
// topologies' solve, and the fallback when the network has no state to report (a base drive that
// cannot hold the bank on). Starting cold, the iterates rise monotonically towards the lowest
// fixed point; when there is none they pass the runaway limit.
BankSolve solveBankSimple(const Context& c, const Demand& demand) {
    const Design& d = *c.design;
    const std::size_t n = d.bank.devices.size();
    BankSolve s;
    std::vector<double> t(n + 1 + static_cast<std::size_t>(c.losses.banks - 1) * n, d.heatsink.ambient_C);
    bool converged = false;
    bool runaway = false;
    double busExtra = 0.0; // the stage's bus current (settled inside each electrical solve)
    for (int it = 0; it < kMaxIterations; ++it) {
        s.iterations = it + 1;
        const std::vector<double> devices(t.begin(), t.begin() + static_cast<std::ptrdiff_t>(n));
        const std::vector<double> others(t.begin() + static_cast<std::ptrdiff_t>(n + 1), t.end());
        s.electrical = solveElectrical(c, demand, devices, t[n], others, busExtra);
        s.thermal = solveThermal(c, s.electrical);
        std::vector<double> next = s.thermal.junction_C;
        double delta = 0.0;
        busExtra = s.electrical.busExtra_A; // warm start for the next pass
        // The thermal stage may return more temperatures than the first guess laid out (its
        // layout is the one kept from here on): a pass whose layout changed has not converged.
        if (next.size() != t.size())
            delta = std::numeric_limits<double>::infinity();
        for (std::size_t k = 0; k < next.size(); ++k) {
            if (!finite(next[k]) || next[k] > kRunawayLimit_C)
                runaway = true;
            if (k < t.size())
                delta = std::max(delta, std::abs(next[k] - t[k]));
        }
        s.temperatures = next;
        if (runaway)
            break;
        t = std::move(next);
        if (delta < kConverged_K) {
            converged = true;
            break;
        }
    }

    BankResult& b = s.bank;
    const auto& share = s.electrical.sharing.share;
    if (!share.empty()) {
        const auto [lo, hi] = std::minmax_element(share.begin(), share.end());
        b.maxMinCurrentRatio = *lo > 0.0 ? *hi / *lo : 0.0;
    }
    auto hottest = [&]() {
        const auto it = std::max_element(s.temperatures.begin(), s.temperatures.begin() + static_cast<std::ptrdiff_t>(n));
        return static_cast<int>(it - s.temperatures.begin());
    };
    if (runaway) {
        b.converged = false;
        b.stable = false;
        b.firstToFail = n > 0 ? std::optional<int>(hottest()) : std::nullopt;
        b.failure = fmt::format("no thermal fixed point below {} °C: the junctions heat without bound at {} A "
                                "(device {} first)",
                                num(kRunawayLimit_C), num(s.electrical.chopper.waveform.motorAverage_A),
                                b.firstToFail.value_or(0));
        return s;
    }
    if (!converged) {
        b.converged = false;
        b.stable = false;
        b.failure = fmt::format("the temperatures did not settle in {} iterations (loop gain close to 1)", kMaxIterations);
        return s;
    }
    if (!c.mosfet || n == 0 || n > kMaxLoopGainDevices)
        return s; // the simple bipolar model has no temperature feedback to measure

    // Loop gain: spectral radius of the Jacobian of the map (∂P/∂T·Z_th), with what `demand`
    // holds fixed (the motor current, or the duty at stall without a limit).
    const std::size_t m = n + 1;
    Eigen::MatrixXd jac(static_cast<Eigen::Index>(m), static_cast<Eigen::Index>(m));
    const std::vector<double> base = thermalMap(c, demand, t, busExtra);
    for (std::size_t j = 0; j < m; ++j) {
        std::vector<double> tp = t;
        tp[j] += kJacobianStep_K;
        const std::vector<double> moved = thermalMap(c, demand, tp, busExtra);
        for (std::size_t i = 0; i < m; ++i)
            jac(static_cast<Eigen::Index>(i), static_cast<Eigen::Index>(j)) = (moved[i] - base[i]) / kJacobianStep_K;
    }
    if (!jac.allFinite())
        return s;
    Eigen::EigenSolver<Eigen::MatrixXd> eig(jac);
    if (eig.info() != Eigen::Success)
        return s;
    Eigen::Index dominant = 0;
    for (Eigen::Index i = 1; i < eig.eigenvalues().size(); ++i)
        if (std::abs(eig.eigenvalues()(i)) > std::abs(eig.eigenvalues()(dominant)))
            dominant = i;
    const double gain = std::abs(eig.eigenvalues()(dominant));
    b.loopGain = gain;
    b.stable = gain < 1.0;
    // Common mode when every device moves the same way in the dominant eigenvector.
    const Eigen::VectorXcd vec = eig.eigenvectors().col(dominant); // eigenvectors() returns a temporary: copy the column
    double largest = 0.0;
    for (std::size_t k = 0; k < n; ++k)
        largest = std::max(largest, std::abs(vec(static_cast<Eigen::Index>(k)).real()));
    bool positive = false, negative = false;
    for (std::size_t k = 0; k < n; ++k) {
        const double v = vec(static_cast<Eigen::Index>(k)).real();
        if (v > 1e-6 * largest)
            positive = true;
        if (v < -1e-6 * largest)
            negative = true;
    }
    b.dominantMode = (positive && negative) ? "differential" : "common";
    if (!b.stable)
        b.firstToFail = hottest();
    return s;
}

// ---------------------------------------------------------------------------------------------
// The bank as an electrothermal network (core/bank/), coupled with the chopper and the loss stage
// (low-side chopper). The chopper sees the bank's drop linearised at its on-state current,
// V_C(i) ≈ V0 + R_b·i with R_b = dV_C/dI, and gives back the duty, the on-state current and the
// waveform's RMS factor; the loss stage adds each device's switching, recovery and drive heat and
// the bus current they draw; the network, with the diode's heat on the sink, gives back the
// temperatures, V0 and R_b. The rounds settle in a few; the bank's losses then balance the
// chopper's energy exactly (banksolver.h: r_eff).
constexpr int kMaxCouplingRounds = 40;
constexpr std::size_t kMixingDepth = 5;

void bankResultFrom(const BankSolution& b, BankResult& r) {
    r.converged = b.converged;
    r.failure = b.converged ? std::string() : b.reason;
    r.stable = b.stable;
    r.loopGain.reset();
    if (b.fixedPoint && b.stability.valid)
        r.loopGain = b.stability.dominantEigenvalue;
    r.dominantMode = toString(b.stability.mode);
    r.maxMinCurrentRatio = b.maxMinCurrentRatio;
    r.firstToFail.reset();
    if (!b.stable && !b.devices.empty())
        r.firstToFail = b.hottest;
}

// The loss stage's heat in each device of the reported bank beyond its conduction. A bipolar
// bank's base drive is the network's own (its base currents flow in the solve), so the stage's
// estimate of it is left out here.
std::vector<double> stageExtraHeat(const Context& c, const Electrical& e) {
    const std::size_t n = c.design->bank.devices.size();
    std::vector<double> extra(n, 0.0);
    if (e.losses.banks.empty())
        return extra;
    const auto& bank = e.losses.banks.front();
    for (std::size_t k = 0; k < n && k < bank.size(); ++k)
        extra[k] = std::max(0.0, bank[k].junction_W - (c.mosfet ? 0.0 : bank[k].drive_W));
    return extra;
}

// Power the driver delivers into a bipolar bank, averaged: I_B·V_B at each base pin (device and
// emitter path). The loss stage counts drive power as drawn from the battery; so does this.
double baseDrivePower(const Context& c, const BankSolution& b) {
    if (c.mosfet)
        return 0.0;
    double w = 0.0;
    for (const auto& dv : b.devices)
        w += b.powerScale * dv.driveCurrent_A * (dv.controlVoltage_V + b.commonNode_V - dv.voltage_V);
    return w;
}

// Power a MOSFET bank's gate circuit puts into the source paths, averaged: the DC gate current
// through each pull-down returns through the device's ballast and leg (banknetwork.cpp), where the
// network books I_S² = (I_D + I_G)² of heat; the bus pays only for I_D, the driver (fed from the
// battery, as for the drive power) for I_G·V_S. The pull-down's own I_G²·R_pd stays the driver's.
double gateSourcePower(const Context& c, const BankSolution& b) {
    if (!c.mosfet)
        return 0.0;
    double w = 0.0;
    for (const auto& dv : b.devices)
        w += b.powerScale * dv.driveCurrent_A * (b.commonNode_V - dv.voltage_V);
    return w;
}

// The chopper with the bank's tangent drop V0 + R·i, the freewheel path at tjDiode_C and the loss
// stage's bus current busExtra_A; then the loss stage at the network's last state (shares,
// on-state resistances V/I, junctions).
Electrical chopperWithBank(const Context& c, const Demand& demand, double drop_V, double resistance_ohm,
                           double tjDiode_C, double busExtra_A, const std::vector<double>& share,
                           const std::vector<double>& deviceResistance_ohm, const std::vector<double>& tj_C) {
    const Design& d = *c.design;
    const std::size_t n = d.bank.devices.size();
    Electrical e;
    e.switchDrop_V = drop_V;
    e.sharing.share = share;
    e.sharing.resistance_ohm = resistance_ohm;
    e.device_ohm = deviceResistance_ohm;
    e.conduction_W.assign(n, 0.0); // the network's, not the stand-in's
    e.diodeThreshold_V = diodeThreshold(d.bank.freewheelDiode, tjDiode_C);
    const ChopperCircuit circuit = chopperCircuit(c, demand, drop_V, resistance_ohm, e.diodeThreshold_V);
    ChopperSupply supply = c.supply;
    supply.voltage_V -= supply.resistance_ohm * busExtra_A;
    e.busExtraUsed_A = busExtra_A;
    e.chopper = solveChopper(circuit, supply, demand, d.pwm.maxDuty);
    const auto& w = e.chopper.waveform;
    e.diodeLoss_W = diodeConductionLoss(d.bank.freewheelDiode, c.diodes, w.diodeAverage_A, w.diodeRms_A, tjDiode_C);
    LossPointInput li = lossInputAt(c, e.chopper, tjDiode_C);
    li.onDrop_V = 0.0; // the network's drop is all in the device resistances V/I
    li.share = share;
    li.resistance_ohm = deviceResistance_ohm;
    li.tj_C = tj_C;
    li.withChecks = false;
    e.losses = computeLossPoint(c.losses, d, li);
    e.lossInput = std::move(li);
    e.busExtra_A = e.busExtraUsed_A;
    return e;
}

// The reported pass of the loss stage: the same input as the iteration's last, now with the
// checks and their messages (the iterations leave them out for speed; the numbers are the same).
LossPoint lossesWithChecks(const Context& c, const Electrical& e) {
    LossPointInput li = e.lossInput;
    li.withChecks = true;
    return computeLossPoint(c.losses, *c.design, li);
}

// A device's on-state V/I (0 when it carries next to nothing): the loss stage's SOA point.
double onStateResistance(const BankDeviceState& dv) {
    return dv.current_A > 1e-9 ? std::max(dv.voltage_V / dv.current_A, 0.0) : 0.0;
}

// The settled states a point keeps for the next nearby design: four, so that the frequency's
// extrapolation is cubic. On the demo's row of 50 devices (200 steps from 2 to 40 kHz) the
// coupling rounds per point fell from 4.6 with a quadratic prediction to 2.0 with a cubic one;
// five or six states added more of the earlier points' settling error (each is settled only to
// the rounds' tolerance) than they took off the truncation error, and the map took longer.
constexpr std::size_t kExtrapolationStates = 4;

// The state at frequency f predicted from the kept ones (newest last, each at its own frequency,
// all of one shape: the memory keeps no other): the polynomial in f through them (Lagrange's form),
// constant through one, linear through two, and so on. Along a row of the map the states move
// smoothly with the frequency and the prediction's error is of the order of the step to the power
// of the number of states.
PointState extrapolatedState(const std::vector<PointState>& kept, double f) {
    const PointState& last = kept.back();
    PointState out = last;
    out.frequency_Hz = f;
    if (kept.size() < 2)
        return out;
    std::vector<double> weight(kept.size(), 1.0);
    for (std::size_t i = 0; i < kept.size(); ++i)
        for (std::size_t j = 0; j < kept.size(); ++j)
            if (j != i)
                weight[i] *= (f - kept[j].frequency_Hz) / (kept[i].frequency_Hz - kept[j].frequency_Hz);
    auto combine = [&](std::vector<double> PointState::*field) {
        std::vector<double>& v = out.*field;
        for (std::size_t k = 0; k < v.size(); ++k) {
            double sum = 0.0;
            for (std::size_t i = 0; i < kept.size(); ++i)
                sum += weight[i] * (kept[i].*field)[k];
            v[k] = sum;
        }
    };
    combine(&PointState::y);
    combine(&PointState::bankState);
    combine(&PointState::resistance_ohm);
    return out;
}

BankSolve solveBankPoint(const Context& c, const Demand& demand, PointMemory* memory) {
    const Design& d = *c.design;
    const std::size_t n = d.bank.devices.size();
    const double diodeR = std::max(0.0, d.bank.freewheelDiode.rthJc_KperW) + c.rthCs_KperW;
    constexpr std::size_t kY = 5; // the coupling state's leading entries (see y below)
    const std::size_t ny = kY + 2 * n;
    // A warm start: the settled states of the same point of nearby designs (EvaluationMemory),
    // extrapolated in the PWM frequency through the last ones that have this bank's shape.
    // Until this point settles (the early returns below leave it so) the next design starts cold:
    // the states are given back only when this one settles.
    std::vector<PointState> kept;
    if (memory)
        kept.swap(memory->settled);
    const bool warm = !kept.empty() && kept.back().y.size() == ny && kept.back().resistance_ohm.size() == n &&
                      memory->mosfet == c.mosfet;
    PointState start;
    if (warm)
        start = extrapolatedState(kept, d.pwm.frequency_Hz);
    // First waveform and loss point: one chopper solve with the simple model's bank at ambient (the
    // rounds below settle the bus current of the stage's losses with everything else), or with the
    // remembered state.
    const std::vector<double> ambient(n, d.heatsink.ambient_C);
    Electrical e;
    if (warm) {
        const std::vector<double>& y0 = start.y;
        const std::vector<double> share(y0.begin() + kY, y0.begin() + static_cast<std::ptrdiff_t>(kY + n));
        const std::vector<double> tj(y0.begin() + static_cast<std::ptrdiff_t>(kY + n), y0.end());
        e = chopperWithBank(c, demand, y0[0], std::max(y0[1], 0.0), y0[2], y0[4], share, start.resistance_ohm, tj);
    } else {
        std::vector<double> path(n), deviceOhm(n);
        for (std::size_t k = 0; k < n; ++k) {
            const double r = c.mosfet ? rdsOn(d.bank.device.mosfet, ambient[k]) * (1.0 + d.bank.devices[k].rdsOnDeviation)
                                      : c.bipolar.resistance_ohm;
            deviceOhm[k] = std::max(0.0, r);
            path[k] = deviceOhm[k] + c.ballast_ohm[k] + c.leg_ohm[k];
        }
        const Sharing sharing = shareByConductance(path);
        e = chopperWithBank(c, demand, c.mosfet ? 0.0 : c.bipolar.drop_V, sharing.resistance_ohm,
                            d.heatsink.ambient_C, 0.0, sharing.share, deviceOhm, ambient);
    }
    BankSolve s;
    s.problem = c.bankProblem;
    BankProblem& p = s.problem;
    p.stabilityAnalysis = false; // the rounds want losses; the reported solution is judged below
    BankSolution b;
    bool have = false;
    if (warm) {
        b.state = start.bankState; // solveBank's warm start reads the state alone
        have = true;
    }
    bool settled = false;
    bool runaway = false;
    BankSolution runawayState;
    // y = what the chopper sees of the bank and the diode, the heatsink's R_th,sa at the heat it
    // takes, and the bus current of the stage's other losses: (V0, R_b, T_diode, R_th,sa, I_x); then
    // the state the loss stage takes from the network, per device: share and junction temperature
    // (the stage's switching and drive heat follow each device's share and feed back into the
    // network: left out of y, that loop iterated unmixed, and a bank whose switching heat moves its
    // shares strongly crept along for more rounds than allowed). One
    // round maps the chopper at y through the network to g(y); the rounds settle at g(y) = y.
    // Anderson mixing on the scaled residual g − y over the last kMixingDepth rounds (Walker & Ni,
    // SIAM J. Numer. Anal. 49, 2011) cuts the rounds of this mildly contracting map to a few; with
    // the devices' states in y it needs more than one past round to capture the slow modes of a
    // bank whose switching heat moves its shares (depth 1 crept for tens of rounds).
    std::vector<double> y(ny, 0.0), g(ny, 0.0), scale(ny, 1.0), f(ny, 0.0);
    std::vector<std::vector<double>> histF, histG; // the last rounds' residuals and maps
    std::vector<double> yKept; // what the memory keeps of a settled point (see below)
    if (warm) {
        y = start.y;
    } else {
        for (std::size_t k = 0; k < n; ++k) {
            y[kY + k] = e.sharing.share[k];
            y[kY + n + k] = d.heatsink.ambient_C;
        }
        double heat = e.diodeLoss_W + e.losses.freewheelRecovery_W;
        for (const double w : junctionHeat(e))
            heat += w;
        y[3] = std::max(0.0, c.heatsink.rthSa(heat));
        y[4] = e.busExtraUsed_A;
    }
    for (int round = 0; round < kMaxCouplingRounds; ++round) {
        s.iterations = round + 1;
        const ChopperWaveform& w = e.chopper.waveform;
        if (!w.valid)
            return solveBankSimple(c, demand); // no steady state: reported by the caller
        const double duty = w.duty;
        const double iOn = duty > 0.0 ? w.switchAverage_A / duty : 0.0;
        p.load_A = iOn;
        p.duty = duty;
        p.rmsFactor = duty > 0.0 && iOn > 0.0 ? w.switchRms_A * w.switchRms_A / (duty * iOn * iOn) : 0.0;
        p.sinkExtraPower_W = e.diodeLoss_W + e.losses.freewheelRecovery_W;
        p.extraPowerPerDevice_W = stageExtraHeat(c, e);
        p.rthSa_KperW = y[3];
        BankSolution next = solveBank(p, have ? &b : nullptr);
        if (!next.converged && !runaway && next.failure == BankFailure::ThermalRunaway && next.devices.size() == n) {
            // No fixed point. Report the bank as the runaway left it: the junctions held at the
            // temperatures it reached, the chopper and the losses consistent with them, and the
            // junction temperatures those losses would produce (one step of the thermal map).
            runaway = true;
            runawayState = next;
            p.isothermal = true;
            p.isothermalTjPerDevice_C.clear();
            for (const auto& dv : next.devices)
                p.isothermalTjPerDevice_C.push_back(dv.tj_C);
            next = solveBank(p, &runawayState);
        }
        if (!next.converged) {
            // No state to report: the simple model's numbers, with the network's verdict.
            BankSolve simple = solveBankSimple(c, demand);
            simple.problem = p;
            simple.problem.stabilityAnalysis = true;
            simple.bank.converged = false;
            simple.bank.stable = false;
            simple.bank.failure = next.reason;
            simple.bank.loopGain.reset();
            return simple;
        }
        b = std::move(next);
        have = true;
        double heat = p.sinkExtraPower_W;
        for (const auto& dv : b.devices)
            heat += dv.loss_W;
        double stageBus = e.losses.busPower_W(0.0);
        if (!c.mosfet && !e.losses.banks.empty())
            for (const auto& dl : e.losses.banks.front())
                stageBus -= dl.drive_W;
        const double vBus = e.chopper.busVoltage_V;
        g[0] = b.commonNode_V - b.incrementalResistance_ohm * b.load_A;
        g[1] = b.incrementalResistance_ohm;
        g[2] = b.heatsink_C + p.sinkExtraPower_W / c.diodes * diodeR;
        g[3] = std::max(0.0, c.heatsink.rthSa(heat));
        g[4] = vBus > 0.0 ? (stageBus + baseDrivePower(c, b) + gateSourcePower(c, b)) / vBus : 0.0;
        scale[0] = std::max(std::abs(b.commonNode_V), 0.01);
        scale[1] = std::max(std::abs(b.incrementalResistance_ohm), 1e-6);
        scale[2] = 1.0;
        scale[3] = std::max(g[3], 1e-3);
        scale[4] = std::max(std::abs(g[4]), 1e-3);
        for (std::size_t k = 0; k < n; ++k) {
            const BankDeviceState& dv = b.devices[k];
            g[kY + k] = dv.share;
            g[kY + n + k] = dv.tj_C;
            scale[kY + k] = 1.0 / static_cast<double>(n); // the average device's share
            scale[kY + n + k] = 1.0;
        }
        double fmax = 0.0;
        for (std::size_t i = 0; i < ny; ++i) {
            f[i] = (g[i] - y[i]) / scale[i];
            fmax = std::max(fmax, std::abs(f[i]));
        }
        // Settled (relative 1e-6: the bank's losses then balance the chopper's energy to well below
        // 1e-6 of the input power); a cold first round's waveform came from the simple model, not y.
        const bool settledHere = (round > 0 || warm) && fmax <= 1e-6;
        if (settledHere && !memory) {
            settled = true;
            break;
        }
        std::vector<double> yNext = g;
        if (!histF.empty()) {
            // γ = argmin ‖f − Σ_j γ_j·(f − f_j)‖ over the kept rounds j; y ← g − Σ_j γ_j·(g − g_j).
            const auto m = static_cast<Eigen::Index>(histF.size());
            Eigen::MatrixXd dF(static_cast<Eigen::Index>(ny), m);
            Eigen::VectorXd fv(static_cast<Eigen::Index>(ny));
            for (std::size_t i = 0; i < ny; ++i) {
                fv(static_cast<Eigen::Index>(i)) = f[i];
                for (Eigen::Index j = 0; j < m; ++j)
                    dF(static_cast<Eigen::Index>(i), j) = f[i] - histF[static_cast<std::size_t>(j)][i];
            }
            const Eigen::VectorXd gamma = dF.completeOrthogonalDecomposition().solve(fv);
            if (gamma.allFinite())
                for (std::size_t i = 0; i < ny; ++i)
                    for (Eigen::Index j = 0; j < m; ++j)
                        yNext[i] -= gamma(j) * (g[i] - histG[static_cast<std::size_t>(j)][i]);
        }
        if (settledHere) {
            // The state kept for the next nearby design is the one the next round would take: the
            // mixing's estimate of the fixed point is closer than y, which is only within the
            // tolerance, and the next design's extrapolation multiplies the states' errors.
            settled = true;
            if (std::all_of(yNext.begin(), yNext.end(), [](double v) { return std::isfinite(v); }))
                yKept = std::move(yNext);
            break;
        }
        if (round > 0 || warm) {
            histF.push_back(f);
            histG.push_back(g);
            if (histF.size() > kMixingDepth) {
                histF.erase(histF.begin());
                histG.erase(histG.begin());
            }
        }
        y = std::move(yNext);
        std::vector<double> share(n), resistance(n), tj(n);
        for (std::size_t k = 0; k < n; ++k) {
            const BankDeviceState& dv = b.devices[k];
            share[k] = y[kY + k];
            // The on-state resistance V/I only sets the stage's SOA point: the network's latest.
            resistance[k] = onStateResistance(dv);
            tj[k] = y[kY + n + k];
        }
        e = chopperWithBank(c, demand, y[0], std::max(y[1], 0.0), y[2], y[4], share, resistance, tj);
    }
    if (memory && settled && !runaway && b.converged && b.devices.size() == n) {
        // What the next nearby design starts from: only a settled, regular state (a runaway or an
        // unsettled point starts the next one cold). The states kept before stay when they have
        // this bank's shape and kind, each at its own frequency.
        std::vector<PointState>& states = memory->settled;
        states = std::move(kept);
        if (memory->mosfet != c.mosfet)
            states.clear();
        memory->mosfet = c.mosfet;
        std::erase_if(states, [&](const PointState& s) {
            return s.frequency_Hz == d.pwm.frequency_Hz || s.y.size() != ny || s.bankState.size() != b.state.size();
        });
        PointState last;
        last.frequency_Hz = d.pwm.frequency_Hz;
        last.y = yKept.size() == ny ? yKept : y;
        last.bankState = b.state;
        for (const BankDeviceState& dv : b.devices)
            last.resistance_ohm.push_back(onStateResistance(dv));
        states.push_back(std::move(last));
        if (states.size() > kExtrapolationStates)
            states.erase(states.begin(), states.end() - static_cast<std::ptrdiff_t>(kExtrapolationStates));
    }
    p.stabilityAnalysis = true;
    completeStability(p, b);
    s.network = true;
    s.electrical = std::move(e);
    s.solution = std::move(b);
    // Junctions, cases and sink from the thermal network of the reported losses and diode heat
    // (T = T_amb + Z·P + z_s·P_diode). At a fixed point this moves them by less than the solves'
    // tolerance; after a runaway it is one step of the thermal map from where the bank ran away.
    {
        const BankProblem& bp = s.problem;
        const double diodeHeat = s.electrical.diodeLoss_W + s.electrical.losses.freewheelRecovery_W;
        const ThermalMatrices th = buildThermalMatrices(
            {static_cast<int>(n), bp.part.rthJc_KperW, bp.rthCs_KperW, bp.rthSa_KperW, bp.neighbourCoupling_KperW});
        double total = diodeHeat;
        for (std::size_t k = 0; k < n; ++k) {
            double t = bp.ambient_C + th.zSink[k] * diodeHeat;
            for (std::size_t j = 0; j < n; ++j)
                t += th.at(static_cast<int>(k), static_cast<int>(j)) * s.solution.devices[j].loss_W;
            s.solution.devices[k].tj_C = t;
            s.solution.devices[k].tcase_C = t - bp.part.rthJc_KperW * s.solution.devices[k].loss_W;
            total += s.solution.devices[k].loss_W;
        }
        s.solution.heatsink_C = bp.ambient_C + bp.rthSa_KperW * total;
        s.tjDiode_C = s.solution.heatsink_C + diodeHeat / c.diodes * diodeR;
    }
    if (runaway) {
        bankResultFrom(runawayState, s.bank);
        // Held at the runaway's junctions the rounds must still settle, or the state is no point.
        if (!settled)
            s.unsettled = fmt::format("{}; held at the junctions it reached, the bank and the chopper did not settle "
                                      "together in {} rounds",
                                      s.bank.failure, kMaxCouplingRounds);
        s.bank.maxMinCurrentRatio = s.solution.maxMinCurrentRatio;
        return s;
    }
    bankResultFrom(s.solution, s.bank);
    if (s.solution.converged && !settled) {
        s.bank.converged = false;
        s.bank.stable = false;
        s.bank.failure = fmt::format("the bank and the chopper did not settle together in {} rounds",
                                     kMaxCouplingRounds);
        s.unsettled = s.bank.failure;
    }
    return s;
}

void networkLosses(const Context& c, const Demand& demand, const std::vector<double>& tj, std::vector<double>& p,
                   std::vector<double>& memory) {
    // One round, for speed (the transient asks often): the chopper with the simple bank model and
    // the loss stage at these temperatures give the waveform and the switching heat; the network,
    // held at the same junction temperatures, splits the conduction. The coupled rounds of
    // solveBankPoint would move the duty by the difference of the two bank drops over the bus
    // voltage: a second-order change in the losses.
    const std::size_t n = c.design->bank.devices.size();
    const std::vector<double> devices(tj.begin(), tj.end() - 1);
    const Electrical e = solveElectrical(c, demand, devices, tj.back(), {}, 0.0);
    const ChopperWaveform& w = e.chopper.waveform;
    p.clear();
    if (c.losses.topology != StageTopology::LowSideChopper || !w.valid) {
        p = junctionHeat(e);
        p.push_back((e.diodeLoss_W + e.losses.freewheelRecovery_W) / c.diodes);
        return;
    }
    BankProblem bp = c.bankProblem;
    bp.isothermal = true;
    bp.isothermalTjPerDevice_C = devices;
    bp.duty = w.duty;
    bp.load_A = w.duty > 0.0 ? w.switchAverage_A / w.duty : 0.0;
    bp.rmsFactor = w.duty > 0.0 && bp.load_A > 0.0 ? w.switchRms_A * w.switchRms_A / (w.duty * bp.load_A * bp.load_A) : 0.0;
    bp.extraPowerPerDevice_W = stageExtraHeat(c, e);
    bp.stabilityAnalysis = false; // losses, and the spectral radius below
    // memory: the last call's losses (n), then its network state (the warm start of this solve:
    // a transient's steps move the junctions a little each, and a cold start costs a bipolar bank
    // tens of Newton steps).
    BankSolution warm;
    if (memory.size() > n)
        warm.state.assign(memory.begin() + static_cast<std::ptrdiff_t>(n), memory.end());
    const BankSolution b = solveBank(bp, warm.state.empty() ? nullptr : &warm);
    if (b.converged && b.devices.size() == n) {
        for (const auto& dv : b.devices)
            p.push_back(dv.loss_W);
        // The transient updates the losses explicitly, once per step, with the junctions settled
        // against them (Z_th,jc ≪ the step). Where the losses react to temperature by more than the
        // thermal path can damp (spectral radius ρ of Z·dP/dT above 1, e.g. a drive-starved bipolar
        // bank whose V_CE falls steeply as it warms), that update would ring. Relaxing the change
        // by 1/(1 + ρ) makes it contract; the fixed point (the steady state) is unchanged, and the
        // losses lag the junctions by about ρ steps. (Below ρ = 1 nothing is relaxed: the stall
        // search's 1 K slope probe must see the losses as they are.)
        const double rho = spectralRadiusAbove(bp, b, 1.0);
        if (rho > 1.0 && memory.size() >= n) {
            const double alpha = 1.0 / (1.0 + rho);
            for (std::size_t k = 0; k < n; ++k)
                p[k] = memory[k] + alpha * (p[k] - memory[k]);
        }
        memory.assign(p.begin(), p.end());
        memory.insert(memory.end(), b.state.begin(), b.state.end());
    } else {
        p = junctionHeat(e);
    }
    p.push_back((e.diodeLoss_W + e.losses.freewheelRecovery_W) / c.diodes);
}

// ---------------------------------------------------------------------------------------------
// Checks

void pointChecks(const Design& d, const OperatingPointResult& op, std::size_t index, std::vector<Check>& out) {
    const std::string& name = op.name;
    const auto& part = d.bank.device;
    const auto& diode = d.bank.freewheelDiode;

    if (!op.valid) {
        out.push_back(makeCheck("motor.operating-point", Severity::Fail, op.motorCurrent_A, op.motorCurrent_A, "A",
                                "operating-point solve",
                                fmt::format("{} cannot be reached: {}", name, op.notes.empty() ? "" : op.notes.back()),
                                "Lower the requested torque or speed of this segment, or raise the supply voltage",
                                fmt::format("dutyProfile[{}]", index), name));
    }

    // Switch junction against the part's rating, with a margin.
    double tjMax = -1e300;
    int hottest = 0;
    for (std::size_t k = 0; k < op.devices.size(); ++k)
        if (op.devices[k].tj_C > tjMax) {
            tjMax = op.devices[k].tj_C;
            hottest = static_cast<int>(k);
        }
    if (!op.devices.empty()) {
        const double limit = part.tjMax_C;
        const Severity sev = tjMax > limit ? Severity::Fail
                             : tjMax > limit - kJunctionMargin_K ? Severity::Warning
                                                                 : Severity::Pass;
        out.push_back(makeCheck(
            "thermal.switch-junction", sev, tjMax, limit, "°C",
            "part rating bank.device.tjMax_C; a 15 K margin below it is common practice",
            fmt::format("{}: hottest switch (device {}) at {} °C against T_j,max {} °C ({} K margin; {} K wanted)", name,
                        hottest, num(tjMax, 4), num(limit, 4), num(limit - tjMax, 3), num(kJunctionMargin_K)),
            "Spread or remove heat: more devices in parallel (bank.count), a heatsink with a lower R_th,sa "
            "(heatsink.part.rthSa_KperW) or a thinner interface (bank.interface.thickness_m)",
            "bank.count", name));
    }

    // Freewheel diode junction.
    {
        const double tj = op.freewheelDiode.tj_C;
        const double limit = diode.tjMax_C;
        const Severity sev = tj > limit ? Severity::Fail
                             : tj > limit - kJunctionMargin_K ? Severity::Warning
                                                              : Severity::Pass;
        out.push_back(makeCheck(
            "thermal.diode-junction", sev, tj, limit, "°C",
            "part rating bank.freewheelDiode.tjMax_C; a 15 K margin below it is common practice",
            fmt::format("{}: freewheel diode at {} °C against T_j,max {} °C; the diodes carry {} A on average and "
                        "dissipate {} W together",
                        name, num(tj, 4), num(limit, 4), num(op.freewheelDiode.averageCurrent_A), num(op.freewheelDiode.loss_W)),
            "More freewheel diodes in parallel (bank.diodeCount), a diode with a lower drop, or a better heatsink "
            "(heatsink.part.rthSa_KperW)",
            "bank.diodeCount", name));
    }

    // On-state current per device against the derated rating.
    if (!op.devices.empty()) {
        double worst = 0.0;
        for (const auto& dv : op.devices)
            worst = std::max(worst, dv.current_A);
        const double derated = d.bank.derating * part.currentRating_A;
        const Severity sev = worst > part.currentRating_A ? Severity::Fail
                             : worst > derated             ? Severity::Warning
                                                           : Severity::Pass;
        out.push_back(makeCheck(
            "bank.current-derating", sev, worst, derated, "A",
            "common practice: run each device at one third to one half of its rated current (bank.derating)",
            fmt::format("{}: the most loaded device carries {} A while on, against {} A ({} × the {} A rating)", name,
                        num(worst), num(derated), num(d.bank.derating), num(part.currentRating_A)),
            "More devices in parallel (bank.count) or a part with a higher current rating (bank.device)", "bank.count",
            name));
    }

    // Package lead limit against the RMS current each device's leads carry.
    if (!op.devices.empty() && part.leadLimit_A > 0.0) {
        double worst = 0.0;
        for (const auto& dv : op.devices)
            worst = std::max(worst, dv.rmsCurrent_A);
        const Severity sev = worst > part.leadLimit_A ? Severity::Fail : Severity::Pass;
        out.push_back(makeCheck(
            "bank.lead-limit", sev, worst, part.leadLimit_A, "A",
            "part's package lead limit (bank.device.leadLimit_A); TO-220-class leads carry about 75–100 A: common "
            "practice",
            fmt::format("{}: the most loaded device's leads carry {} A RMS against the package limit of {} A", name,
                        num(worst), num(part.leadLimit_A)),
            "More devices in parallel (bank.count) or a package with heavier leads (bank.device)", "bank.count", name));
    }

    // Discontinuous conduction: advice, the waveform is computed as it is.
    {
        const bool dcm = op.conductionMode == "discontinuous" && op.motorCurrent_A > 0.0;
        out.push_back(makeCheck(
            "chopper.discontinuous", dcm ? Severity::Advice : Severity::Pass, op.motorMinCurrent_A, 0.0, "A",
            "exact chopper waveform: conduction is discontinuous when the current reaches zero within a period",
            dcm ? fmt::format("{}: the armature current falls to zero every period (average {} A, peak {} A): the "
                              "results use the discontinuous waveform; torque ripple and brush wear rise",
                              name, num(op.motorCurrent_A), num(op.motorPeakCurrent_A))
                : fmt::format("{}: continuous conduction, lowest current {} A", name, num(op.motorMinCurrent_A)),
            "Raise the PWM frequency (pwm.frequency_Hz) or add series inductance to keep the current continuous",
            "pwm.frequency_Hz", name));
    }

    // Demagnetisation of the magnets by the peak armature current.
    if (d.motor.demagCurrent_A > 0.0) {
        const double peak = op.motorPeakCurrent_A;
        out.push_back(makeCheck(
            "motor.demagnetisation", peak > d.motor.demagCurrent_A ? Severity::Fail : Severity::Pass, peak,
            d.motor.demagCurrent_A, "A", "motor.demagCurrent_A (the highest current the magnets tolerate, as stated)",
            fmt::format("{}: peak armature current {} A against the magnets' limit of {} A", name, num(peak, 4),
                        num(d.motor.demagCurrent_A, 4)),
            "Lower the controller's current limit (pwm.currentLimit_A)", "pwm.currentLimit_A", name));
    }

    // Thermal runaway of the bank (core/bank/banksolver.h).
    {
        const auto& b = op.bank;
        Severity sev = Severity::Pass;
        std::string message;
        const std::string onset =
            b.runawayLoad_A ? fmt::format("; it runs away above {} A (device {} first)", num(*b.runawayLoad_A, 4),
                                          b.firstToFail.value_or(0))
                            : std::string();
        if (!b.converged) {
            sev = Severity::Fail;
            message = fmt::format("{}: {}{}", name, b.failure,
                                  b.firstToFail ? fmt::format(" (device {} first)", *b.firstToFail) : std::string());
        } else if (!b.stable) {
            sev = Severity::Fail;
            message = b.loopGain && *b.loopGain >= 1.0
                          ? fmt::format("{}: electrothermal loop gain {} ≥ 1 ({} mode): the bank runs away, device {} "
                                        "first{}",
                                        name, num(*b.loopGain), b.dominantMode, b.firstToFail.value_or(0), onset)
                          : fmt::format("{}: no steady state below T_j,max: device {} would pass it (loop gain {}){}",
                                        name, b.firstToFail.value_or(0), num(b.loopGain.value_or(0.0)), onset);
        } else {
            message = fmt::format("{}: electrothermal loop gain {} ({} mode), bank current and duty held{}", name,
                                  num(b.loopGain.value_or(0.0)), b.dominantMode, onset);
        }
        out.push_back(makeCheck(
            "bank.runaway", sev, b.loopGain.value_or(1.0), 1.0, "",
            "electrothermal fixed point below T_j,max; loop gain = the largest eigenvalue of (∂P/∂T)·Z_th with the "
            "bank current and duty held (core/bank/banksolver.h)",
            std::move(message),
            "Add emitter/source ballast (bank.ballast_ohm), lower the thermal resistance (heatsink.part.rthSa_KperW) "
            "or add devices (bank.count)",
            "bank.ballast_ohm", name));
    }

    // Current sharing between the devices.
    if (op.devices.size() > 1) {
        const double ratio = op.bank.maxMinCurrentRatio;
        out.push_back(makeCheck(
            "bank.sharing", ratio > d.bank.sharingTarget ? Severity::Warning : Severity::Pass, ratio,
            d.bank.sharingTarget, "", "bank.sharingTarget (accepted max/min device current ratio)",
            fmt::format("{}: the most and least loaded devices carry currents in the ratio {}{}", name, num(ratio, 4),
                        op.bank.minimumBallast_ohm && *op.bank.minimumBallast_ohm > 0.0
                            ? fmt::format("; {} Ω of ballast per device brings it within {}",
                                          num(*op.bank.minimumBallast_ohm, 3), num(d.bank.sharingTarget, 3))
                            : std::string()),
            "Match the devices or add source/emitter ballast (bank.ballast_ohm)", "bank.ballast_ohm", name));
    }

    addBankStudyChecks(d, op, out); // evaluateFull only: the spread and the runaway onset
}

// ---------------------------------------------------------------------------------------------
// One duty-profile segment.

// Two segments ask for the same operating point when they have the same mode and the same values
// of the fields that mode reads (evaluateSegment): torque and speed, current and speed, current
// and duty, or none at a stall. Their names, durations and directions may differ.
bool sameOperatingPoint(const Segment& a, const Segment& b) {
    if (a.mode != b.mode)
        return false;
    if (a.mode == "torqueSpeed")
        return a.torque_Nm == b.torque_Nm && a.speed_rpm == b.speed_rpm;
    if (a.mode == "currentSpeed")
        return a.motorCurrent_A == b.motorCurrent_A && a.speed_rpm == b.speed_rpm;
    if (a.mode == "currentDuty")
        return a.motorCurrent_A == b.motorCurrent_A && a.duty == b.duty;
    return a.mode == "stall";
}

OperatingPointResult evaluateSegment(const Context& c, const Segment& seg, std::size_t index, std::vector<Check>& checks,
                                      bool full, PointMemory* memory) {
    const Design& d = *c.design;
    OperatingPointResult op;
    op.name = seg.name.empty() ? fmt::format("Segment {}", index + 1) : seg.name;
    op.mode = seg.mode;

    if (const auto problems = segmentProblems(seg, index); !problems.empty()) {
        op.valid = false;
        for (const auto& p : problems)
            op.notes.push_back(p.message);
        return op;
    }

    const double limit = d.pwm.currentLimit_A;
    double speed_radps = 0.0;
    Demand demand;
    auto clampToLimit = [&](double requested) {
        if (limit > 0.0 && requested > limit) {
            op.currentLimited = true;
            op.notes.push_back(fmt::format("the current limit ({} A) holds the current below the {} A asked for",
                                           num(limit), num(requested)));
            return limit;
        }
        return requested;
    };

    if (seg.mode == "torqueSpeed" || seg.mode == "currentSpeed") {
        speed_radps = seg.speed_rpm * kRadPerSecPerRpm;
        const double requested =
            seg.mode == "torqueSpeed" ? currentForTorque(c.motor, seg.torque_Nm) : seg.motorCurrent_A;
        demand.hold = Hold::CurrentAtEmf;
        demand.current_A = clampToLimit(requested);
        demand.emf_V = backEmf(c.motor, demand.current_A, speed_radps);
    } else if (seg.mode == "currentDuty") {
        demand.hold = Hold::CurrentAtDuty;
        demand.current_A = clampToLimit(seg.motorCurrent_A);
        demand.duty = seg.duty;
        if (demand.duty > d.pwm.maxDuty) {
            op.notes.push_back(fmt::format("the duty {} is above pwm.maxDuty {}: the controller holds {}", num(seg.duty),
                                           num(d.pwm.maxDuty), num(d.pwm.maxDuty)));
            demand.duty = d.pwm.maxDuty;
        }
    } else { // stall
        if (limit > 0.0) {
            demand.hold = Hold::CurrentAtEmf;
            demand.current_A = limit;
            op.currentLimited = true;
            op.notes.push_back(fmt::format("stall: the current limit holds {} A by reducing the duty", num(limit)));
        } else {
            demand.hold = Hold::DutyAtEmf;
            demand.duty = d.pwm.maxDuty;
            op.notes.push_back("stall without a current limit: the circuit resistance alone sets the current (V/R)");
        }
    }

    const bool chopper = c.losses.topology == StageTopology::LowSideChopper;
    BankSolve s = chopper ? solveBankPoint(c, demand, memory) : solveBankSimple(c, demand);
    const Electrical& e = s.electrical;
    const ChopperSolution& ch = e.chopper;
    const ChopperWaveform& w = ch.waveform;
    if (!w.valid) {
        op.valid = false;
        op.notes.push_back(w.problem + " (motor.armatureResistance20_ohm)");
        return op;
    }
    if (!e.busSettled) {
        // No bus current carries the stage's losses with the motor's draw: together they take more
        // than the battery can give (at most V²/(4·R) into any load), so the bus collapses and there
        // is no steady point. The losses quoted are the largest the passes met: the last pass, on a
        // collapsed bus, may have none left.
        op.valid = false;
        op.notes.push_back(fmt::format("the bus current does not settle: the switching, drive and recovery losses "
                                       "(up to {} W) with the motor's draw take more than the battery can give "
                                       "through its {} Ω (at most {} W): the bus collapses",
                                       num(e.peakStageLoss_W), num(c.supply.resistance_ohm),
                                       num(c.supply.resistance_ohm > 0.0
                                               ? c.supply.voltage_V * c.supply.voltage_V / (4.0 * c.supply.resistance_ohm)
                                               : 0.0)));
        return op;
    }
    if (!s.unsettled.empty()) {
        // The reported state is the last round's, not a steady point: its losses and the battery's
        // current do not belong together, so no figure of it holds.
        op.valid = false;
        op.notes.push_back(fmt::format("no steady point: {} (the bank's network, the chopper and the stage's "
                                       "losses; the last round's bus {} V)",
                                       s.unsettled, num(ch.busVoltage_V)));
        return op;
    }
    if (!ch.reached) {
        if (seg.mode == "stall") {
            op.currentLimited = false;
            op.notes.push_back(fmt::format("the battery cannot drive the {} A limit into the stalled motor; it "
                                           "takes {} A at the highest duty",
                                           num(demand.current_A), num(w.motorAverage_A)));
        } else {
            op.valid = false;
            op.notes.push_back(
                seg.mode == "currentDuty"
                    ? fmt::format("duty {} drives only {} A even into a stalled motor, not the {} A asked for",
                                  num(demand.duty), num(w.motorAverage_A), num(demand.current_A))
                    : fmt::format("{} A at {} rpm needs more than the supply gives: at the highest duty {} the "
                                  "motor takes {} A (back-EMF {} V, bus {} V)",
                                  num(demand.current_A), num(seg.speed_rpm), num(w.duty), num(w.motorAverage_A),
                                  num(ch.backEmf_V), num(ch.busVoltage_V)));
        }
    }
    if (seg.mode == "currentDuty")
        speed_radps = speedForBackEmf(c.motor, w.motorAverage_A, ch.backEmf_V);
    if (w.mode == ConductionMode::NoCurrent)
        op.notes.push_back("no current flows: the back-EMF is at or above the bus voltage, or the duty is zero");
    if (!s.network)
        op.notes.push_back(
            chopper ? fmt::format("the bank's network has no state to report ({}); the device figures use the simple "
                                  "resistive model{}",
                                  s.bank.failure,
                                  c.mosfet ? "" : " V_CE = V_CE(sat) + (r_C + r_E)·I of a saturated bipolar")
                    : fmt::format("{}: the devices share as resistors{}; the bank's network solve covers the low-side "
                                  "chopper",
                                  d.pwm.topology,
                                  c.mosfet ? "" : ", with the saturated bipolar drop V_CE(sat) + (r_C + r_E)·I"));
    if (const std::string drive = baseDriveNote(d, c.bankProblem); !drive.empty() && s.network)
        op.notes.push_back(drive);

    const double iAvg = w.motorAverage_A;
    const double iRms = w.motorRms_A;
    op.motorCurrent_A = iAvg;
    op.batteryCurrent_A = ch.batteryCurrent_A + e.busExtraUsed_A; // + what the switching losses draw
    op.duty = w.duty;
    op.speed_rpm = speed_radps / kRadPerSecPerRpm;
    op.backEmf_V = ch.backEmf_V;
    op.busVoltage_V = ch.busVoltage_V;
    op.ripplePeakToPeak_A = w.ripplePeakToPeak_A;
    op.motorPeakCurrent_A = w.iMax_A;
    op.motorMinCurrent_A = w.iMin_A;
    op.rippleLinear_A = w.rippleLinear_A;
    op.conductionMode = w.mode == ConductionMode::Continuous ? "continuous" : "discontinuous";
    op.motorRmsCurrent_A = iRms;
    op.switchAverageCurrent_A = w.switchAverage_A;
    op.switchRmsCurrent_A = w.switchRms_A;
    op.diodeAverageCurrent_A = w.diodeAverage_A;
    op.diodeRmsCurrent_A = w.diodeRms_A;
    op.capacitorRmsCurrent_A = w.capacitorRms_A;
    op.inputPower_W = ch.busVoltage_V * op.batteryCurrent_A;
    op.batteryLoss_W = op.batteryCurrent_A * op.batteryCurrent_A * c.supply.resistance_ohm;

    const MotorPower mp = motorPower(c.motor, iAvg, iRms, speed_radps);
    op.torque_Nm = mp.torque_Nm;
    op.mechanicalPower_W = mp.mechanical_W;
    op.motorMechanicalLoss_W = mp.noLoadLoss_W;
    op.motorCopperLoss_W = mp.copperLoss_W;
    op.motorCableLoss_W = iRms * iRms * c.motorCable_ohm;
    op.contactorLoss_W = iRms * iRms * c.contactor_ohm;
    // E·I_avg + I_rms²·R_m: what leaves the controller's motor output (L·di/dt·i averages to zero).
    op.motorInputPower_W = ch.backEmf_V * iAvg + iRms * iRms * c.motorBranch_ohm;

    const std::size_t n = d.bank.devices.size();
    const double duty = w.duty;
    op.devices.resize(n);
    if (s.network) {
        // The network's per-device state (core/bank/): on-state current and drop, conduction averaged
        // with the waveform's RMS factor, junctions from the shared thermal network.
        const BankSolution& b = s.solution;
        for (std::size_t k = 0; k < n; ++k) {
            DeviceResult& dv = op.devices[k];
            const BankDeviceState& bd = b.devices[k];
            dv.share = bd.share;
            dv.averageCurrent_A = bd.share * w.switchAverage_A;
            dv.rmsCurrent_A = bd.share * w.switchRms_A;
            dv.current_A = bd.current_A;
            dv.ratingShare = bd.ratingShare;
            dv.voltage_V = bd.voltage_V;
            // A bipolar device's base drive I_B·V_BE (at its pins) heats it: the network's own.
            if (!c.mosfet)
                dv.drive_W = b.powerScale * bd.driveCurrent_A * bd.controlVoltage_V;
            dv.conduction_W = bd.conduction_W - dv.drive_W;
            dv.ballast_W = bd.ballast_W;
            dv.leg_W = bd.leg_W;
            dv.loss_W = dv.conduction_W + dv.drive_W;
            dv.tj_C = bd.tj_C;
            dv.tcase_C = bd.tcase_C;
        }
        op.baseDrive_W = baseDrivePower(c, b);
    } else {
        for (std::size_t k = 0; k < n; ++k) {
            DeviceResult& dv = op.devices[k];
            const double share = e.sharing.share[k];
            dv.share = share;
            dv.averageCurrent_A = share * w.switchAverage_A;
            dv.rmsCurrent_A = share * w.switchRms_A;
            dv.current_A = duty > 0.0 ? dv.averageCurrent_A / duty : 0.0;
            dv.ratingShare =
                d.bank.device.currentRating_A > 0.0 ? dv.current_A / d.bank.device.currentRating_A : 0.0;
            dv.voltage_V = dv.current_A > 0.0 ? e.switchDrop_V + e.device_ohm[k] * dv.current_A : 0.0;
            dv.conduction_W = e.conduction_W[k];
            dv.ballast_W = c.ballast_ohm[k] * dv.rmsCurrent_A * dv.rmsCurrent_A;
            dv.leg_W = c.leg_ohm[k] * dv.rmsCurrent_A * dv.rmsCurrent_A;
            dv.loss_W = dv.conduction_W + dv.switching_W + dv.diode_W + dv.drive_W;
            dv.tj_C = s.thermal.junction_C[k];
            dv.tcase_C = s.thermal.case_C[k];
            op.bankLoss_W += dv.loss_W + dv.ballast_W + dv.leg_W;
        }
    }
    op.freewheelDiode.averageCurrent_A = w.diodeAverage_A;
    op.freewheelDiode.rmsCurrent_A = w.diodeRms_A;
    op.freewheelDiode.loss_W = e.diodeLoss_W;
    op.freewheelDiode.tj_C = s.network ? s.tjDiode_C : s.thermal.junction_C[n];
    if (e.losses.computesConduction) { // no freewheel diodes: the synchronous banks carry that current
        op.freewheelDiode.averageCurrent_A = 0.0;
        op.freewheelDiode.rmsCurrent_A = 0.0;
    }
    if (s.network) {
        // The stage's switching, recovery and (MOSFET) gate heat, as the network took it; a bipolar
        // device keeps the network's base drive.
        std::vector<double> drive(n);
        for (std::size_t k = 0; k < n; ++k)
            drive[k] = op.devices[k].drive_W;
        recordLossPoint(lossesWithChecks(c, e), {}, {}, op, checks);
        for (std::size_t k = 0; k < n; ++k) {
            DeviceResult& dv = op.devices[k];
            if (!c.mosfet)
                dv.drive_W = drive[k];
            dv.loss_W = dv.conduction_W + dv.switching_W + dv.diode_W + dv.drive_W;
        }
    } else {
        const std::vector<double> otherTj(s.thermal.junction_C.begin() + static_cast<std::ptrdiff_t>(n + 1),
                                          s.thermal.junction_C.end());
        const std::vector<double> otherTcase(s.thermal.case_C.begin() + static_cast<std::ptrdiff_t>(n + 1),
                                             s.thermal.case_C.end());
        recordLossPoint(lossesWithChecks(c, e), otherTj, otherTcase, op, checks);
    }
    op.bankLoss_W = 0.0;
    for (const auto& dv : op.devices)
        op.bankLoss_W += dv.loss_W + dv.ballast_W + dv.leg_W;
    op.totalLoss_W = op.bankLoss_W + op.freewheelDiode.loss_W;
    if (op.inputPower_W > 1e-9 && op.motorCurrent_A > 0.0) // null when no current flows
        op.efficiency = op.motorInputPower_W / op.inputPower_W;
    op.heatsinkTemperature_C = s.network ? s.solution.heatsink_C : s.thermal.heatsink_C;
    op.bank = s.bank;
    if (full && s.network)
        addBankStudies(d, s.problem, op.bank);
    spdlog::debug("evaluate: {} settled in {} iterations", op.name, s.iterations);
    return op;
}

} // namespace

namespace {

Results evaluateWith(const Design& input, const EvaluateOptions& options, EvaluationMemory* memory) {
    const bool full = options.bankStudies;
    Results r;
    r.design = input.meta.title;
    r.topology = input.pwm.topology;

    Design d = input;
    normalizeBank(d.bank);

    if (const auto problems = designProblems(d); !problems.empty()) {
        for (const auto& p : problems)
            r.checks.push_back(makeCheck("design.input", Severity::Fail, 0.0, 0.0, "", "field ranges", p.message,
                                         "Correct the field", p.field, ""));
        r.warnings.push_back("the design has invalid fields; no operating point was computed");
        return r;
    }
    const Context context = makeContext(d, memory);
    if (!context.losses.problems.empty()) {
        for (const auto& p : context.losses.problems)
            r.checks.push_back(makeCheck("design.input", Severity::Fail, 0.0, 0.0, "", "field ranges", p.message,
                                         "Correct the field", p.path, ""));
        r.warnings.push_back("the design has invalid fields; no operating point was computed");
        return r;
    }
    r.warnings.insert(r.warnings.end(), context.losses.notes.begin(), context.losses.notes.end());
    r.checks.insert(r.checks.end(), context.losses.checks.begin(), context.losses.checks.end());
    if (d.bank.device.kind == "mosfet" && context.losses.topology != StageTopology::LowSideChopper)
        r.warnings.push_back("the MOSFETs are taken as fully enhanced by the gate drive");
    if (d.dutyProfile.empty())
        r.warnings.push_back("the duty profile is empty: no operating point to evaluate");

    bool any = false;
    if (memory && memory->points.size() != d.dutyProfile.size())
        memory->points.assign(d.dutyProfile.size(), PointMemory{});
    // A segment that asks for the same operating point as an earlier one (sameOperatingPoint) is
    // not solved again: it takes that result, and the checks found while solving it, under its
    // own name. Where this point's checks begin and end in r.checks, per segment.
    // Whether each segment so far passed its own input checks (only those are shared).
    std::vector<std::pair<std::size_t, std::size_t>> pointChecksAt(d.dutyProfile.size(), {0, 0});
    std::vector<bool> wellFormed(d.dutyProfile.size(), false);
    for (std::size_t i = 0; i < d.dutyProfile.size(); ++i) {
        const Segment& seg = d.dutyProfile[i];
        std::optional<std::size_t> same;
        wellFormed[i] = !memory && segmentProblems(seg, i).empty();
        if (wellFormed[i])
            for (std::size_t j = 0; j < i && !same; ++j)
                if (wellFormed[j] && sameOperatingPoint(d.dutyProfile[j], seg))
                    same = j;
        const std::size_t checksBegin = r.checks.size();
        OperatingPointResult op;
        if (same) {
            op = r.operatingPoints[*same];
            const std::string from = op.name;
            op.name = seg.name.empty() ? fmt::format("Segment {}", i + 1) : seg.name;
            for (std::size_t k = pointChecksAt[*same].first; k < pointChecksAt[*same].second; ++k) {
                Check ch = r.checks[k];
                if (ch.operatingPoint == from)
                    ch.operatingPoint = op.name;
                if (ch.message.starts_with(from + ": "))
                    ch.message = op.name + ch.message.substr(from.size());
                r.checks.push_back(std::move(ch));
            }
        } else {
            op = evaluateSegment(context, seg, i, r.checks, full, memory ? &memory->points[i] : nullptr);
        }
        pointChecksAt[i] = {checksBegin, r.checks.size()};
        if (!op.notes.empty() && op.devices.empty()) {
            // The segment could not be set up: its reasons are input problems.
            for (const auto& note : op.notes)
                r.checks.push_back(makeCheck("design.input", Severity::Fail, 0.0, 0.0, "", "field ranges", note,
                                             "Correct the segment", fmt::format("dutyProfile[{}]", i), op.name));
        } else {
            pointChecks(d, op, i, r.checks);
            for (const auto& dv : op.devices)
                if (!any || dv.tj_C > r.maxJunction_C) {
                    r.maxJunction_C = dv.tj_C;
                    any = true;
                }
            r.maxTotalLoss_W = std::max(r.maxTotalLoss_W, op.totalLoss_W);
        }
        r.operatingPoints.push_back(std::move(op));
    }
    if (options.designStudies)
        addProtection(d, r);
    std::vector<std::vector<double>> lossMemory(r.operatingPoints.size() + 1); // per point, then the stall
    addThermalResults(
        d, context.heatsink,
        [&](std::size_t i, const std::vector<double>& tj, std::vector<double>& p) {
            sourceLosses(context, r, i, tj, p, lossMemory[std::min(i, lossMemory.size() - 1)]);
        },
        {options.thermalTransient, options.designStudies}, r);
    if (memory) {
        memory->heatsink = context.heatsink;
        memory->heatsinkOf = d.heatsink;
        memory->heatsinkCount = d.bank.count;
        memory->heatsinkDiodes = d.bank.diodeCount;
        memory->heatsinkArea_m2 = d.bank.interface.area_m2;
    }
    return r;
}

} // namespace

Results evaluate(const Design& design, const EvaluateOptions& options) {
    return evaluateWith(design, options, nullptr);
}

Results evaluateNear(const Design& design, const EvaluateOptions& options, EvaluationMemory& memory) {
    return evaluateWith(design, options, &memory);
}

Results evaluateFull(const Design& design) {
    EvaluateOptions options;
    options.thermalTransient = true;
    options.bankStudies = true;
    return evaluate(design, options);
}

} // namespace amp

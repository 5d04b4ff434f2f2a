// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/engine/stage_losses.h"

#include "core/checks/makecheck.h"
#include "core/losses/busrise.h"
#include "core/losses/capacitors.h"
#include "core/losses/diode.h"
#include "core/losses/gate_drive.h"
#include "core/losses/lineinductance.h"
#include "core/losses/overshoot.h"
#include "core/losses/soa.h"
#include "core/losses/switching_bipolar.h"
#include "core/losses/switching_mosfet.h"
#include "core/losses/topology.h"
#include "core/physics/chopper.h"
#include "core/physics/mosfet_rdson.h"
#include "core/units/units.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <numbers>

namespace amp {

namespace {

using losses::Topology;

std::string num(double v, int digits = 3) { return units::plain(v, digits); }

Topology modelTopology(StageTopology t) {
    switch (t) {
    case StageTopology::LowSideChopper: return Topology::LowSideChopper;
    case StageTopology::SynchronousHalfBridge: return Topology::SynchronousHalfBridge;
    case StageTopology::FullBridgeUnipolar: return Topology::FullBridgeUnipolar;
    case StageTopology::FullBridgeBipolar: return Topology::FullBridgeBipolar;
    }
    return Topology::LowSideChopper;
}

const char* bankRole(StageTopology t, int bank) {
    static const char* const bridge[] = {"highA", "lowA", "highB", "lowB"};
    switch (t) {
    case StageTopology::LowSideChopper: return "switch";
    case StageTopology::SynchronousHalfBridge: return bank == 0 ? "high" : "low";
    default: return bridge[std::clamp(bank, 0, 3)];
    }
}

bool isDarlington(const Design& d) { return d.bank.device.kind == "darlington"; }

/// Base-emitter saturation voltage of a driven bipolar device (trade values: ≈ 0.9 V for a single
/// power transistor, ≈ 1.8 V across the two junctions of a Darlington).
double baseEmitterSat(const Design& d) { return isDarlington(d) ? 1.8 : 0.9; }

/// β_F at a collector current and junction temperature: Gummel–Poon roll-off above the knee and
/// the XTB temperature law (bank/bjtmodel.h uses the same laws); a Darlington multiplies its stages.
double bipolarGain(const Design& d, double ic_A, double tj_C) {
    auto gain = [&](const BjtParams& b, double i) {
        const double t = (tj_C + 273.15) / 298.15;
        double beta = b.betaF * std::pow(t, b.betaTempExponent);
        if (b.highCurrentKnee_A > 0.0)
            beta /= 1.0 + std::max(0.0, i) / b.highCurrentKnee_A;
        return std::max(beta, 1e-3);
    };
    const double out = gain(d.bank.device.bjt, ic_A);
    if (!isDarlington(d))
        return out;
    return out * gain(d.bank.device.driver, ic_A / out);
}

/// The diode in anti-parallel with each device of a synchronous bank: the MOSFET's body diode, or
/// (bipolar banks) the freewheel diode part, bank.diodeCount of them per bank.
struct Antiparallel {
    double vf0_V = 0.0;                 ///< per diode, 25 °C
    double rd_ohm = 0.0;
    double tempco_VperK = -2e-3;
    double qrr_As = 0.0;                ///< per diode
    int count = 1;                      ///< per bank
};

Antiparallel antiparallel(const Design& d, bool mosfet) {
    Antiparallel a;
    if (mosfet) {
        const auto& m = d.bank.device.mosfet;
        a.vf0_V = std::max(0.0, m.bodyDiodeVf_V);
        a.rd_ohm = std::max(0.0, m.bodyDiodeRd_ohm);
        // No coefficient is stated for a body diode: a silicon junction at constant current moves
        // about −2 mV/K (Sedra & Smith, "Microelectronic Circuits", from memory).
        a.tempco_VperK = -2e-3;
        a.qrr_As = std::max(0.0, m.bodyDiodeQrr_As);
        a.count = std::max(1, d.bank.count);
    } else {
        const auto& fw = d.bank.freewheelDiode;
        a.vf0_V = std::max(0.0, fw.vf0_V);
        a.rd_ohm = std::max(0.0, fw.rd_ohm);
        a.tempco_VperK = fw.vfTempCoeff_VperK;
        a.qrr_As = std::max(0.0, fw.qrr_As);
        a.count = std::max(1, d.bank.diodeCount);
    }
    return a;
}

losses::MosfetSwitchingInput mosfetEdgeInput(const Design& d, int device, double bus_V) {
    const auto& m = d.bank.device.mosfet;
    losses::MosfetSwitchingInput in;
    in.busVoltage_V = bus_V;
    in.frequency_Hz = d.pwm.frequency_Hz;
    in.driveHigh_V = d.drive.supply_V;
    in.driveLow_V = 0.0;
    // n gates on one driver output: each sees n·R_out (losses/switching_mosfet.h).
    in.driverResistance_ohm = std::max(1, d.bank.count) * std::max(0.0, d.drive.driverResistance_ohm);
    double rExt = d.bank.gateResistor_ohm;
    if (device >= 0 && device < static_cast<int>(d.bank.devices.size()))
        rExt += d.bank.devices[static_cast<std::size_t>(device)].gateResistorDeviation_ohm;
    in.gateResistorExternal_ohm = std::max(0.0, rExt);
    in.gateResistorInternal_ohm = std::max(0.0, m.rgInternal_ohm);
    in.plateau_V = m.plateau_V;
    in.qgs2_As = m.qgs2_As;
    in.qgd_As = m.qgd_As;
    in.coss_F = m.coss_F;
    in.cossRef_V = m.cossRef_V;
    losses::parseCossLaw(m.cossLaw, in.cossLaw);
    return in;
}

/// A switching event's energy in one device.
struct EdgeResult {
    double energy_J = 0.0;
    double currentFall_s = 0.0;         ///< turn-off current fall (for the overshoot)
    std::string problem;
};

EdgeResult mosfetEdge(const Design& d, int device, double bus_V, double current_A, bool turnOn,
                      double recoveryCharge_As) {
    losses::MosfetSwitchingInput in = mosfetEdgeInput(d, device, bus_V);
    in.turnOnCurrent_A = turnOn ? current_A : 0.0;
    in.turnOffCurrent_A = turnOn ? 0.0 : current_A;
    in.recoveryCharge_As = turnOn ? recoveryCharge_As : 0.0;
    const auto r = losses::mosfetSwitching(in);
    EdgeResult e;
    if (!r.ok()) {
        e.problem = r.problems.front().path + ": " + r.problems.front().message;
        return e;
    }
    e.energy_J = turnOn ? r.turnOnEnergy_J + r.cossEnergy_J + r.recoveryEnergy_J : r.turnOffEnergy_J;
    e.currentFall_s = r.turnOffCurrentFall_s;
    return e;
}

/// Base current of one bipolar device and the reverse-drive ratio of its turn-off.
struct BaseDrive {
    losses::BipolarBaseDriveResult result;
    double reverseRatio = 0.0;
};

BaseDrive baseDrive(const Design& d, int device, double ic_A, double tj_C, double duty, bool messages) {
    losses::BipolarBaseDriveInput in;
    in.messages = messages;
    in.devices = std::max(1, d.bank.count);
    in.collectorCurrent_A = std::max(0.0, ic_A);
    in.dcBeta = bipolarGain(d, ic_A, tj_C);
    in.forcedBeta = d.drive.forcedBeta;
    in.baseCurrent_A = d.drive.baseDriveCurrent_A / in.devices;
    double rb = d.bank.gateResistor_ohm;
    if (device >= 0 && device < static_cast<int>(d.bank.devices.size()))
        rb += d.bank.devices[static_cast<std::size_t>(device)].gateResistorDeviation_ohm;
    // A base resistor from the driver output (as the bank solver has it) sets the current from the
    // driver voltage; without one the drive is a current source (forced β or the stated current).
    in.baseResistor_ohm = std::max(0.0, rb);
    in.baseEmitter_V = baseEmitterSat(d);
    in.driveHigh_V = d.drive.supply_V;
    in.driveMin_V = d.drive.minSupply_V;
    in.driverResistance_ohm = std::max(0.0, d.drive.driverResistance_ohm);
    in.duty = std::clamp(duty, 0.0, 1.0);
    BaseDrive b;
    b.result = losses::bipolarBaseDrive(in);
    // A resistive drive pulled to 0 V at turn-off draws V_BE/R_b out of the base: I_B2/I_B1 =
    // V_BE/(V_drv − V_BE); a current drive simply stops (passive turn-off).
    if (in.baseResistor_ohm > 0.0 && d.drive.supply_V > in.baseEmitter_V)
        b.reverseRatio = in.baseEmitter_V / (d.drive.supply_V - in.baseEmitter_V);
    return b;
}

EdgeResult bipolarEdge(const Design& d, double bus_V, double current_A, bool turnOn, double recoveryCharge_As,
                       double forcedBeta, double reverseRatio, double dcBeta, double duty, double* storage_s) {
    const auto& b = d.bank.device.bjt;
    losses::BipolarSwitchingInput in;
    in.busVoltage_V = bus_V;
    in.turnOnCurrent_A = turnOn ? current_A : 0.0;
    in.turnOffCurrent_A = turnOn ? 0.0 : current_A;
    in.frequency_Hz = d.pwm.frequency_Hz;
    in.duty = std::clamp(duty, 0.0, 1.0);
    in.riseTime_s = b.riseTime_s;
    in.fallTime_s = b.fallTime_s;
    in.storageTime_s = b.storageTime_s;
    // The stated times are taken at I_C/I_B = 10 with I_B2 = −I_B1, the common datasheet condition.
    in.referenceForcedBeta = std::min(10.0, 0.5 * dcBeta);
    in.referenceReverseRatio = 1.0;
    in.forcedBeta = forcedBeta > 0.0 ? forcedBeta : 1e9;
    in.reverseRatio = reverseRatio;
    in.dcBeta = dcBeta;
    const auto r = losses::bipolarSwitching(in);
    EdgeResult e;
    if (!r.ok()) {
        e.problem = r.problems.front().path + ": " + r.problems.front().message;
        return e;
    }
    // The bipolar model leaves the commutated diode's recovery out: Q_rr·V on the turn-on, as for
    // a MOSFET (losses/switching_mosfet.h).
    e.energy_J = turnOn ? r.turnOnEnergy_J + recoveryCharge_As * bus_V : r.turnOffEnergy_J;
    e.currentFall_s = b.fallTime_s;
    if (storage_s)
        *storage_s = r.storageTime_s;
    return e;
}

} // namespace

// ---------------------------------------------------------------------------------------------

LossPlan planLosses(const Design& d) {
    LossPlan p;
    const std::string& t = d.pwm.topology;
    if (t == "synchronousHalfBridge")
        p.topology = StageTopology::SynchronousHalfBridge;
    else if (t == "fullBridge")
        p.topology = d.pwm.fullBridgeModulation == "bipolar" ? StageTopology::FullBridgeBipolar
                                                              : StageTopology::FullBridgeUnipolar;
    else
        p.topology = StageTopology::LowSideChopper;
    if (t == "fullBridge" && d.pwm.fullBridgeModulation != "bipolar" && d.pwm.fullBridgeModulation != "unipolar")
        p.problems.push_back({"pwm.fullBridgeModulation", "pwm.fullBridgeModulation is \"" + d.pwm.fullBridgeModulation +
                                                              "\": it must be \"unipolar\" or \"bipolar\""});
    p.mosfet = d.bank.device.kind == "mosfet";
    p.banks = p.topology == StageTopology::LowSideChopper ? 1 : p.topology == StageTopology::SynchronousHalfBridge ? 2 : 4;
    p.devices = std::max(1, d.bank.count);
    const auto& m = d.bank.device.mosfet;
    losses::CossLaw law{};
    if (p.mosfet && !losses::parseCossLaw(m.cossLaw, law))
        p.problems.push_back({"bank.device.mosfet.cossLaw",
                              "bank.device.mosfet.cossLaw is \"" + m.cossLaw + "\": it must be \"constant\" or \"sqrt\""});

    // Commutation loop: stated, or from the layout.
    const auto& lay = d.layout;
    losses::CommutationLoopInput loop;
    loop.stated_H = lay.commutationLoopInductance_H;
    loop.layout = lay.loopLayout;
    loop.length_m = lay.loopLength_m;
    loop.radius_m = lay.loopConductorRadius_m;
    loop.spacing_m = lay.loopSpacing_m;
    loop.width_m = lay.loopPlateWidth_m;
    loop.separation_m = lay.loopPlateSeparation_m;
    loop.packageInductance_H = lay.packageInductance_H;
    loop.devices = p.devices;
    loop.capacitorInductance_H = lay.capacitorInductance_H;
    loop.capacitors = 1; // capacitorInductance_H is the bank's ESL already
    const auto l = losses::commutationLoopInductance(loop);
    static const std::pair<const char*, const char*> kLoopFields[] = {
        {"stated_H", "layout.commutationLoopInductance_H"}, {"layout", "layout.loopLayout"},
        {"length_m", "layout.loopLength_m"}, {"radius_m", "layout.loopConductorRadius_m"},
        {"spacing_m", "layout.loopSpacing_m"}, {"separation_m", "layout.loopPlateSeparation_m"},
        {"width_m", "layout.loopPlateWidth_m"}, {"packageInductance_H", "layout.packageInductance_H"},
        {"capacitorInductance_H", "layout.capacitorInductance_H"}, {"devices", "bank.count"},
        {"capacitors", "layout.capacitorCount"}};
    for (const auto& pr : l.problems) {
        std::string field = "layout";
        for (const auto& [model, design] : kLoopFields)
            if (pr.path == model)
                field = design;
        p.problems.push_back({field, field + ": " + pr.message});
    }
    p.loopInductance_H = l.ok() ? l.inductance_H : 0.0;

    // Battery cable pair (lengths count both poles).
    const double cableLength = 0.5 * d.wiring.batteryCableLength_m;
    if (cableLength > 0.0 && d.wiring.batteryCable_mm2 > 0.0 && lay.batteryCableSpacing_m > 0.0) {
        const auto b = losses::twoWireInductance(cableLength, losses::conductorRadius(d.wiring.batteryCable_mm2 * 1e-6),
                                                 lay.batteryCableSpacing_m);
        if (b.ok())
            p.batteryLoopInductance_H = b.inductance_H;
        else
            p.problems.push_back({"layout.batteryCableSpacing_m", "layout.batteryCableSpacing_m: " + b.problems.front().message});
    }

    if (p.topology != StageTopology::LowSideChopper && !p.mosfet)
        p.notes.push_back(fmt::format("a {} bank has no body diode: each bank of the {} topology uses "
                                      "bank.diodeCount freewheel diodes as its anti-parallel diodes",
                                      d.bank.device.kind, t));
    if (p.topology != StageTopology::LowSideChopper)
        p.notes.push_back("the duty-profile transient heats the sink with the solved bank and its freewheel path; the "
                          "topology's other banks are in the steady-state points only");
    if (p.topology == StageTopology::FullBridgeBipolar)
        p.notes.push_back("full bridge with bipolar PWM: the mean currents come from the averaged bridge; the "
                          "ripple, the switched currents and the capacitor current from the ±V waveform");

    // ---- Design-wide checks ----
    const auto& part = d.bank.device;
    if (p.mosfet) {
        losses::MosfetGateDriveInput g;
        g.devices = p.devices;
        g.gateCharge_As = m.qg_As;
        g.driveHigh_V = d.drive.supply_V;
        g.driveMin_V = d.drive.minSupply_V;
        g.frequency_Hz = d.pwm.frequency_Hz;
        g.driverResistance_ohm = d.drive.driverResistance_ohm;
        g.driverPeakRating_A = d.drive.driverPeakCurrent_A;
        g.gateResistorExternal_ohm = d.bank.gateResistor_ohm;
        g.gateResistorInternal_ohm = m.rgInternal_ohm;
        g.pulldown_ohm = d.drive.pulldown_ohm;
        g.specGate_V = m.rdsOnSpecGate_V;
        const auto r = losses::mosfetGateDrive(g);
        if (r.ok()) {
            p.checks.push_back(makeCheck(
                "drive.weak-at-min-supply", r.enhancement.failed ? Severity::Fail : Severity::Pass,
                r.gateVoltageAtMinSupply_V, m.rdsOnSpecGate_V, "V",
                "the part's R_ds(on) holds only at the gate voltage it is stated at (bank.device.mosfet.rdsOnSpecGate_V)",
                r.enhancement.failed
                    ? r.enhancement.message + "; R_ds(on), and with it the conduction loss, is higher than computed"
                    : fmt::format("at the lowest supply the gates reach {} V, at least the {} V R_ds(on) is stated at",
                                  num(r.gateVoltageAtMinSupply_V), num(m.rdsOnSpecGate_V)),
                "Feed the driver from a regulated rail that holds up at the lowest battery voltage "
                "(drive.minSupply_V), or choose a logic-level part",
                "drive.minSupply_V"));
            p.checks.push_back(makeCheck(
                "drive.pulldown", r.pulldown.failed ? Severity::Warning : Severity::Pass, d.drive.pulldown_ohm, 0.0, "Ω",
                "common practice: a gate-source pull-down turns the bank off when the drive is lost",
                r.pulldown.failed ? r.pulldown.message
                                  : fmt::format("each gate has a {} Ω pull-down", num(d.drive.pulldown_ohm)),
                "Fit a 4.7–22 kΩ resistor from each gate to its source (drive.pulldown_ohm)", "drive.pulldown_ohm"));
            if (r.driverPeak.rated)
                p.checks.push_back(makeCheck(
                    "drive.driver-peak", r.driverPeak.failed ? Severity::Warning : Severity::Pass, r.driverPeak_A,
                    d.drive.driverPeakCurrent_A, "A", "driver's rated peak current (drive.driverPeakCurrent_A)",
                    r.driverPeak.failed ? r.driverPeak.message + ": the edges will be slower than computed"
                                        : fmt::format("the driver sources {} A peak into {} gates", num(r.driverPeak_A),
                                                      p.devices),
                    "A stronger driver, larger gate resistors (bank.gateResistor_ohm) or one driver per few devices",
                    "bank.gateResistor_ohm"));
        } else {
            for (const auto& pr : r.problems)
                p.problems.push_back({"drive", "drive: " + pr.path + ": " + pr.message});
        }
    }

    if (part.shortCircuitTime_s > 0.0 || d.drive.shortCircuitResponse_s > 0.0) {
        losses::SoaInput s;
        s.voltageRating_V = std::max(1.0, part.voltageRating_V);
        s.shortCircuitTime_s = std::max(0.0, part.shortCircuitTime_s);
        s.protectionResponse_s = std::max(0.0, d.drive.shortCircuitResponse_s);
        const auto r = losses::checkStress(s);
        if (r.ok()) {
            const bool stated = r.shortCircuit.rated;
            p.checks.push_back(makeCheck(
                "switch.short-circuit", !stated ? Severity::Advice : r.shortCircuit.failed ? Severity::Fail : Severity::Pass,
                d.drive.shortCircuitResponse_s, part.shortCircuitTime_s, "s",
                "the part's short-circuit withstand time (bank.device.shortCircuitTime_s)",
                !stated ? std::string("the short-circuit withstand or the protection's response time is not stated: "
                                      "a shorted motor lead is not judged")
                : r.shortCircuit.failed
                    ? r.shortCircuit.message
                    : fmt::format("the protection acts in {} µs, within the {} µs the part withstands",
                                  num(d.drive.shortCircuitResponse_s * 1e6), num(part.shortCircuitTime_s * 1e6)),
                "A faster desaturation/overcurrent trip (drive.shortCircuitResponse_s) or a part rated for a longer "
                "short circuit",
                "drive.shortCircuitResponse_s"));
        }
    }

    {
        const double allowed = lay.capacitorDerating * lay.capacitorVoltageRating_V;
        const bool over = d.supply.max_V > allowed;
        p.checks.push_back(makeCheck(
            "capacitor.voltage", over ? Severity::Fail : Severity::Pass, d.supply.max_V, allowed, "V",
            "layout.capacitorDerating × layout.capacitorVoltageRating_V; about 80 % is common practice",
            fmt::format("the highest bus voltage {} V against {} V ({} × the capacitors' {} V rating)", num(d.supply.max_V),
                        num(allowed), num(lay.capacitorDerating), num(lay.capacitorVoltageRating_V)),
            "Capacitors with a higher voltage rating (layout.capacitorVoltageRating_V)",
            "layout.capacitorVoltageRating_V"));
    }

    // Bus rise when the battery is lost while braking through a synchronous bridge: worst case at
    // the current limit with the back-EMF at the bus (ringing energy ½·L·I² on top of the bus).
    if (p.topology != StageTopology::LowSideChopper && d.wiring.busCapacitance_F > 0.0) {
        losses::BusRiseInput b;
        const double limit = d.pwm.currentLimit_A > 0.0 ? d.pwm.currentLimit_A : part.currentRating_A * p.devices;
        b.busVoltage_V = d.supply.max_V;
        b.backEmf_V = d.supply.max_V;
        b.armatureCurrent_A = limit;
        b.busCurrent_A = limit * d.pwm.maxDuty;
        b.reactionTime_s = d.pwm.brakingCutoutDelay_s;
        b.capacitance_F = d.wiring.busCapacitance_F;
        b.inductance_H = d.motor.inductance_H;
        b.voltageRating_V = std::min(part.voltageRating_V, lay.capacitorVoltageRating_V);
        const auto r = losses::brakingBusRise(b);
        if (r.ok())
            p.checks.push_back(makeCheck(
                "bus.braking-rise", r.rating.failed ? Severity::Fail : Severity::Pass, r.peak_V, b.voltageRating_V, "V",
                "L–C energy balance of the braking armature into the bus capacitors; the lower of the switch and "
                "capacitor voltage ratings",
                fmt::format("if the battery is lost while braking at {} A from {} V, the bus rises to {} V ({} J into "
                            "the capacitors) against a {} V rating",
                            num(limit), num(d.supply.max_V), num(r.peak_V, 4), num(r.absorbedEnergy_J), num(b.voltageRating_V)),
                "More bus capacitance (wiring.busCapacitance_F), a faster braking cut-out (pwm.brakingCutoutDelay_s) "
                "or a clamp/brake chopper on the bus",
                "wiring.busCapacitance_F"));
    }
    return p;
}

ChopperStandIn chopperStandIn(const LossPlan& plan) {
    ChopperStandIn s;
    switch (plan.topology) {
    case StageTopology::LowSideChopper: break;
    case StageTopology::SynchronousHalfBridge:
        s.offPathBanks = 1;
        break;
    case StageTopology::FullBridgeUnipolar:
        s.frequencyFactor = 2.0;
        s.onPathBanks = 2;
        s.offPathBanks = 2;
        break;
    case StageTopology::FullBridgeBipolar:
        // The mean values of the bipolar bridge equal those of the unipolar one (same mean voltage,
        // two banks in every path); the ripple-dependent numbers come from the ±V waveform.
        s.frequencyFactor = 2.0;
        s.onPathBanks = 2;
        s.offPathBanks = 2;
        break;
    }
    return s;
}

void adaptStandIn(const LossPlan& plan, const Design& d, double bankResistance_ohm, double bankDrop_V, double bankTj_C,
                  ChopperCircuit& circuit) {
    const ChopperStandIn s = chopperStandIn(plan);
    circuit.frequency_Hz *= s.frequencyFactor;
    circuit.switchResistance_ohm = s.onPathBanks * bankResistance_ohm;
    circuit.switchDrop_V = s.onPathBanks * bankDrop_V;
    if (s.offPathBanks > 0) {
        if (plan.mosfet) {
            // The synchronous banks' channels carry the off-time current (their body diodes the dead
            // times: the stage adds the difference).
            circuit.diodeDrop_V = 0.0;
            circuit.diodeResistance_ohm = s.offPathBanks * bankResistance_ohm;
        } else {
            const Antiparallel a = antiparallel(d, false);
            circuit.diodeDrop_V = s.offPathBanks * losses::diodeThreshold(a.vf0_V, a.tempco_VperK, bankTj_C);
            circuit.diodeResistance_ohm = s.offPathBanks * a.rd_ohm / a.count;
        }
    }
}

double standInConduction(const ChopperCircuit& c, const ChopperWaveform& w) {
    return c.switchDrop_V * w.switchAverage_A + c.switchResistance_ohm * w.switchRms_A * w.switchRms_A +
           c.diodeDrop_V * w.diodeAverage_A + c.diodeResistance_ohm * w.diodeRms_A * w.diodeRms_A;
}

// ---------------------------------------------------------------------------------------------

LossPoint computeLossPoint(const LossPlan& plan, const Design& d, const LossPointInput& in) {
    LossPoint lp;
    const int n = plan.devices;
    const auto nz = static_cast<std::size_t>(n);
    const double v = std::max(0.0, in.busVoltage_V);
    const double f = d.pwm.frequency_Hz;
    const auto& part = d.bank.device;
    const bool chopper = plan.topology == StageTopology::LowSideChopper;
    lp.computesConduction = !chopper;
    if (!(v > 0.0) || !(f > 0.0) || !plan.problems.empty())
        return lp;

    // Shares and on-state resistances of every bank: the solver's bank as solved, the others equal.
    std::vector<std::vector<double>> share(static_cast<std::size_t>(plan.banks));
    std::vector<std::vector<double>> rOn(share.size());
    std::vector<double> bankTj(share.size(), in.tj_C.empty() ? 25.0 : in.tj_C.front());
    for (std::size_t b = 0; b < share.size(); ++b) {
        share[b].assign(nz, 1.0 / n);
        if (b == 0) {
            if (in.share.size() == nz)
                share[0] = in.share;
            rOn[0] = in.resistance_ohm;
            if (!in.tj_C.empty())
                bankTj[0] = *std::max_element(in.tj_C.begin(), in.tj_C.end());
        } else {
            bankTj[b] = bankTj[0];
            rOn[b].resize(nz);
            for (std::size_t k = 0; k < nz; ++k) {
                const std::size_t at = (b - 1) * nz + k;
                const double tj = at < in.otherTj_C.size() ? in.otherTj_C[at] : bankTj[0];
                if (k == 0 || tj > bankTj[b])
                    bankTj[b] = tj;
                rOn[b][k] = plan.mosfet ? rdsOn(part.mosfet, tj)
                                        : std::max(0.0, part.bjt.collectorResistance_ohm + part.bjt.emitterResistance_ohm);
            }
        }
        rOn[b].resize(nz, rOn[b].empty() ? 0.0 : rOn[b].back());
    }
    auto ballast = [&](std::size_t k) { return k < in.ballast_ohm.size() ? in.ballast_ohm[k] : std::max(0.0, d.bank.ballast_ohm); };
    auto leg = [&](std::size_t k) { return k < in.leg_ohm.size() ? in.leg_ohm[k] : std::max(0.0, d.bank.legResistance_ohm); };
    double conductance = 0.0;
    for (std::size_t k = 0; k < nz; ++k)
        conductance += 1.0 / std::max(1e-12, rOn[0][k] + ballast(k) + leg(k));
    const double pathResistance = 1.0 / conductance;

    lp.banks.assign(share.size(), std::vector<DeviceLoss>(nz));
    for (std::size_t b = 0; b < share.size(); ++b)
        for (std::size_t k = 0; k < nz; ++k) {
            lp.banks[b][k].bank = bankRole(plan.topology, static_cast<int>(b));
            lp.banks[b][k].share = share[b][k];
        }

    const Antiparallel anti = antiparallel(d, plan.mosfet);
    const auto& fw = d.bank.freewheelDiode;

    // ---- Currents and switching events of the period ----
    std::vector<losses::SwitchEvent> events;
    std::vector<double> channelFraction(share.size(), 0.0);
    losses::TopologyResult topo;
    if (chopper) {
        channelFraction[0] = in.duty;
        if (in.duty > 0.0 && in.duty < 1.0) {
            events.push_back({0, true, std::max(0.0, in.minCurrent_A), in.minCurrent_A > 0.0 ? -1 : -2});
            events.push_back({0, false, std::max(0.0, in.maxCurrent_A), -2});
        }
    } else {
        losses::TopologyInput ti;
        ti.topology = modelTopology(plan.topology);
        ti.busVoltage_V = v;
        ti.duty = std::clamp(in.duty, 0.0, 1.0);
        ti.motorCurrent_A = in.motorCurrent_A;
        ti.inductance_H = d.motor.inductance_H;
        ti.frequency_Hz = f;
        ti.deadTime_s = d.pwm.deadTime_s;
        ti.paths.bankResistance_ohm = pathResistance;
        ti.paths.bodyVf0_V = losses::diodeThreshold(anti.vf0_V, anti.tempco_VperK, bankTj[0]);
        ti.paths.bodyRd_ohm = anti.rd_ohm / anti.count;
        ti.paths.reverseChannel = plan.mosfet;
        topo = losses::topologyCurrents(ti);
        if (!topo.ok()) {
            for (const auto& pr : topo.problems)
                lp.notes.push_back("the topology's currents could not be computed: " + pr.path + ": " + pr.message);
            return lp;
        }
        events = topo.events;
        for (std::size_t b = 0; b < share.size(); ++b)
            channelFraction[b] = topo.banks[b].channelFraction;
        lp.notes.insert(lp.notes.end(), topo.notes.begin(), topo.notes.end());
    }

    // ---- Switching edges ----
    double offCurrentMax = 0.0, fall_s = 0.0;
    std::vector<double> recoveringDiodes(share.size(), 0.0); // recoveries of each bank's diodes per period
    double freewheelRecoveries = 0.0;
    double storage_s = 0.0;
    std::vector<BaseDrive> base(nz);
    if (!plan.mosfet)
        for (std::size_t k = 0; k < nz; ++k) {
            const double ic = share[0][k] * std::max(0.0, in.motorCurrent_A);
            base[k] = baseDrive(d, static_cast<int>(k), ic, k < in.tj_C.size() ? in.tj_C[k] : bankTj[0], channelFraction[0],
                                in.withChecks);
        }
    // The current each device switches: its share of the bank's, among the devices that carry the
    // load current forward. A deeply overdriven bipolar bank at a small load has devices whose base
    // current leaves through the collector (a negative on-state share, V_BC forward): they switch
    // none of the load current, and the bank's edges still switch all of it, ½·V·I·t in all (the
    // parallel devices swing the same voltage). Taken as the signed shares, the negative devices'
    // edges were refused and the others counted several times the bank's current.
    std::vector<std::vector<double>> switched(share.size());
    for (std::size_t b = 0; b < share.size(); ++b) {
        double forward = 0.0;
        for (const double s : share[b])
            forward += std::max(0.0, s);
        switched[b].resize(share[b].size(), 0.0);
        for (std::size_t k = 0; k < share[b].size(); ++k)
            switched[b][k] = forward > 0.0 ? std::max(0.0, share[b][k]) / forward : 0.0;
    }
    std::string edgeProblem;
    for (const auto& e : events) {
        const auto b = static_cast<std::size_t>(e.bank);
        double qrr = 0.0;
        if (e.turnOn && e.recoveringBank == -1) {
            qrr = std::max(0.0, fw.qrr_As) * std::max(1, d.bank.diodeCount);
            freewheelRecoveries += 1.0;
        } else if (e.turnOn && e.recoveringBank >= 0) {
            qrr = anti.qrr_As * anti.count;
            recoveringDiodes[static_cast<std::size_t>(e.recoveringBank)] += 1.0;
        }
        if (!e.turnOn && e.current_A > offCurrentMax)
            offCurrentMax = e.current_A;
        for (std::size_t k = 0; k < nz; ++k) {
            const double s = switched[b][k];
            const double i = e.current_A * s;
            EdgeResult edge;
            if (plan.mosfet) {
                edge = mosfetEdge(d, static_cast<int>(k), v, i, e.turnOn, qrr * s);
            } else {
                const auto& bd = base[k].result;
                const double ic = std::max(1e-9, share[0][k] * std::max(0.0, in.motorCurrent_A));
                const double forced = bd.baseCurrent_A > 0.0 ? ic / bd.baseCurrent_A : 0.0;
                double ts = 0.0;
                edge = bipolarEdge(d, v, i, e.turnOn, qrr * s, forced, base[k].reverseRatio,
                                   bipolarGain(d, ic, bankTj[b]), channelFraction[b], &ts);
                storage_s = std::max(storage_s, ts);
            }
            if (!edge.problem.empty())
                edgeProblem = edge.problem;
            lp.banks[b][k].switching_W += f * edge.energy_J;
            if (!e.turnOn && b == 0)
                fall_s = std::max(fall_s, edge.currentFall_s);
        }
    }
    if (!edgeProblem.empty())
        lp.notes.push_back("switching loss not computed for an edge: " + edgeProblem);
    if (!plan.mosfet && storage_s * f > 0.02)
        lp.notes.push_back(fmt::format("the storage time ({} µs at this drive) keeps the bank on {} % of the period "
                                       "longer than commanded; the current loop takes it out of the duty",
                                       num(storage_s * 1e6), num(100.0 * storage_s * f)));

    // The recovering diodes' own share (¼·Q_rr·V each).
    lp.freewheelRecovery_W = freewheelRecoveries * f * 0.25 * std::max(0.0, fw.qrr_As) * v * std::max(1, d.bank.diodeCount);

    // ---- Conduction of every bank (synchronous topologies) and the anti-parallel diodes ----
    if (!chopper) {
        for (std::size_t b = 0; b < share.size(); ++b) {
            const auto& bc = topo.banks[b];
            for (std::size_t k = 0; k < nz; ++k) {
                DeviceLoss& dl = lp.banks[b][k];
                const double s = share[b][k];
                dl.averageCurrent_A = s * bc.channelAverage_A;
                dl.rmsCurrent_A = s * bc.channelRms_A;
                dl.current_A = bc.channelFraction > 0.0 ? dl.averageCurrent_A / bc.channelFraction : 0.0;
                const double ms = dl.rmsCurrent_A * dl.rmsCurrent_A;
                dl.conduction_W = in.onDrop_V * dl.averageCurrent_A + rOn[b][k] * ms;
                dl.ballast_W = ballast(k) * ms;
                dl.leg_W = leg(k) * ms;
                losses::DiodeInput di;
                di.count = anti.count;
                di.vf0_V = anti.vf0_V;
                di.rd_ohm = anti.rd_ohm;
                di.vfTempCoeff_VperK = anti.tempco_VperK;
                di.tj_C = std::clamp(bankTj[b], -55.0, 250.0);
                di.averageCurrent_A = bc.diodeAverage_A;
                di.rmsCurrent_A = std::max(bc.diodeRms_A, bc.diodeAverage_A);
                di.recoveryCharge_As = anti.qrr_As;
                di.reverseVoltage_V = v;
                di.frequency_Hz = recoveringDiodes[b] * f;
                const auto dr = losses::diodeLoss(di);
                if (dr.ok())
                    dl.diode_W = dr.total_W / n; // the bank's diodes, shared by its devices
            }
        }
    }

    // ---- Gate / base drive (a bank that never switches draws none) ----
    for (std::size_t b = 0; b < share.size(); ++b) {
        const double duty = channelFraction[b];
        const bool switches = duty > 0.0 && duty < 1.0;
        for (std::size_t k = 0; k < nz && switches; ++k) {
            DeviceLoss& dl = lp.banks[b][k];
            double inDie = 0.0;
            if (plan.mosfet) {
                losses::MosfetGateDriveInput g;
                g.devices = n;
                g.gateCharge_As = part.mosfet.qg_As;
                g.driveHigh_V = d.drive.supply_V;
                g.driveMin_V = d.drive.minSupply_V;
                g.frequency_Hz = f;
                g.duty = std::clamp(duty, 0.0, 1.0);
                g.driverResistance_ohm = d.drive.driverResistance_ohm;
                g.gateResistorExternal_ohm = std::max(0.0, d.bank.gateResistor_ohm +
                                                               (k < d.bank.devices.size() ? d.bank.devices[k].gateResistorDeviation_ohm : 0.0));
                g.gateResistorInternal_ohm = part.mosfet.rgInternal_ohm;
                g.pulldown_ohm = d.drive.pulldown_ohm;
                g.specGate_V = part.mosfet.rdsOnSpecGate_V;
                g.messages = false; // only the power inside the die is read here
                const auto r = losses::mosfetGateDrive(g);
                if (r.ok())
                    inDie = r.internal_W; // the gate resistance inside the die
            } else {
                // The other banks' base drive runs over their own conduction time at their own current.
                const BaseDrive bd =
                    b == 0 ? base[k] : baseDrive(d, static_cast<int>(k), dl.current_A, bankTj[b], duty, in.withChecks);
                if (bd.result.ok())
                    inDie = bd.result.baseEmitter_W;
            }
            dl.drive_W = inDie;
            dl.junction_W = (lp.computesConduction ? dl.conduction_W : 0.0) + dl.switching_W + dl.diode_W + dl.drive_W;
        }
    }

    // ---- Turn-off overshoot and avalanche ----
    losses::OvershootInput oi;
    oi.busVoltage_V = v;
    oi.current_A = offCurrentMax;
    oi.currentFallTime_s = fall_s > 0.0 ? fall_s : 1e-9;
    oi.loopInductance_H = plan.loopInductance_H;
    oi.voltageRating_V = part.voltageRating_V;
    oi.breakdown_V = plan.mosfet ? part.mosfet.breakdown_V : part.voltageRating_V;
    oi.frequency_Hz = f;
    oi.repetitiveAvalanche_J = plan.mosfet ? std::max(0.0, part.mosfet.avalancheRepetitive_J) : 0.0;
    oi.derating = d.layout.overshootDerating;
    oi.avalancheRated = plan.mosfet;
    oi.messages = in.withChecks; // the texts are read by the checks below only
    losses::OvershootResult atPoint;
    losses::OvershootResult atMax;
    if (offCurrentMax > 0.0 && fall_s > 0.0) {
        atPoint = losses::turnOffOvershoot(oi);
        losses::OvershootInput hi = oi;
        hi.busVoltage_V = std::max(v, d.supply.max_V);
        atMax = losses::turnOffOvershoot(hi);
        if (atPoint.ok()) {
            lp.overshoot_V = atPoint.overshoot_V;
            lp.avalancheEnergy_J = atPoint.avalancheEnergy_J;
            if (atPoint.avalanches) {
                // Every hard turn-off clamps, and one device takes it all (worst case): the one that
                // carries the most current at equal junction temperatures (the lowest on-state path
                // at 25 °C; in a bipolar bank the lowest V_BE). A fixed choice: picked by the shares
                // at the solved temperatures, the clamp heat hopped to whichever device its own
                // heating had just made the largest, and the coupled solve had no fixed point.
                std::size_t worst = 0;
                auto rank = [&](std::size_t k) {
                    if (k >= d.bank.devices.size())
                        return 0.0;
                    const auto& dev = d.bank.devices[k];
                    return plan.mosfet ? part.mosfet.rdsOn25_ohm * (1.0 + dev.rdsOnDeviation) + ballast(k) + leg(k)
                                       : dev.vbeDeviation_V;
                };
                for (std::size_t k = 1; k < nz; ++k)
                    if (rank(k) < rank(worst))
                        worst = k;
                for (std::size_t b = 0; b < share.size(); ++b) {
                    int offs = 0;
                    for (const auto& e : events)
                        if (!e.turnOn && e.bank == static_cast<int>(b) && e.current_A > 0.0)
                            ++offs;
                    if (offs == 0)
                        continue;
                    const double p = offs * atPoint.avalanche_W;
                    lp.banks[b][worst].switching_W += p;
                    lp.banks[b][worst].junction_W += p;
                }
            }
        }
    }

    // ---- Bus capacitors ----
    losses::CapacitorInput ci;
    ci.rmsCurrent_A = chopper ? std::max(0.0, in.capacitorRms_A) : topo.capacitorRms_A;
    ci.rippleFrequency_Hz = plan.topology == StageTopology::FullBridgeUnipolar ? 2.0 * f : f;
    ci.batteryLoopInductance_H = plan.batteryLoopInductance_H;
    ci.maxBusVoltage_V = d.supply.max_V;
    ci.ratedVoltage_V = d.layout.capacitorVoltageRating_V;
    ci.voltageDerating = d.layout.capacitorDerating;
    ci.rippleRating_A = d.layout.capacitorRippleRating_A;
    ci.esr_ohm = d.layout.capacitorEsr_ohm;
    ci.count = d.layout.capacitorCount;
    ci.capacitance_F = d.wiring.busCapacitance_F > 0.0 && d.layout.capacitorCount > 0
                           ? d.wiring.busCapacitance_F / d.layout.capacitorCount
                           : 470e-6;
    ci.totalCapacitance_F = d.wiring.busCapacitance_F;
    ci.thermalResistance_KperW = d.layout.capacitorThermalResistance_KperW;
    ci.ambient_C = d.heatsink.ambient_C;
    ci.maxTemperature_C = d.layout.capacitorMaxTemperature_C;
    ci.messages = in.withChecks;
    const auto caps = losses::busCapacitors(ci);
    if (caps.ok()) {
        lp.busCapacitorRipple_A = caps.capacitorRms_A;
    }
    if (caps.ok() && in.withChecks) {
        const bool fitted = d.layout.capacitorCount > 0;
        lp.checks.push_back(makeCheck(
            "capacitor.ripple", caps.ripple.failed ? Severity::Fail : Severity::Pass, caps.perCapacitorRms_A,
            d.layout.capacitorRippleRating_A, "A", "the capacitors' ripple-current rating (layout.capacitorRippleRating_A)",
            fitted ? fmt::format("{} A RMS in the bus capacitors, {} A in each of {} against {} A; ESR loss {} W",
                                 num(caps.capacitorRms_A), num(caps.perCapacitorRms_A), caps.count,
                                 num(d.layout.capacitorRippleRating_A), num(caps.esrLoss_W))
                   : fmt::format("{} A RMS in the bus capacitors needs {} of them at {} A each; ESR loss {} W",
                                 num(caps.capacitorRms_A), caps.requiredForRipple, num(d.layout.capacitorRippleRating_A),
                                 num(caps.esrLoss_W)),
            fmt::format("Fit at least {} capacitors (layout.capacitorCount) or ones with a higher ripple rating",
                        caps.requiredForRipple),
            "layout.capacitorCount"));
        lp.checks.push_back(makeCheck(
            "capacitor.temperature", caps.temperature.failed ? Severity::Fail : Severity::Pass, caps.hotSpot_C,
            d.layout.capacitorMaxTemperature_C, "°C", "the capacitors' rated temperature (layout.capacitorMaxTemperature_C)",
            fmt::format("each capacitor dissipates {} W in its ESR: hot spot {} °C", num(caps.perCapacitorLoss_W),
                        num(caps.hotSpot_C, 4)),
            "More capacitors in parallel (layout.capacitorCount) or lower-ESR parts (layout.capacitorEsr_ohm)",
            "layout.capacitorCount"));
        if (caps.decoupling.rated)
            lp.checks.push_back(makeCheck(
                "capacitor.decoupling", caps.decoupling.failed ? Severity::Warning : Severity::Pass,
                ci.rippleFrequency_Hz, caps.decoupling.limit, "Hz",
                "current divider between the battery-cable inductance and the bus capacitance (circuit theory)",
                caps.decoupling.failed ? caps.decoupling.message
                                       : fmt::format("the battery cable ({} µH) and the capacitors resonate at {} Hz, well "
                                                     "below the {} Hz ripple; the capacitors carry {} × the switches' AC "
                                                     "current",
                                                     num(plan.batteryLoopInductance_H * 1e6), num(caps.resonance_Hz),
                                                     num(ci.rippleFrequency_Hz), num(caps.cableShare, 4)),
                "More bus capacitance (wiring.busCapacitance_F) or a higher PWM frequency", "wiring.busCapacitance_F"));
    }

    // ---- Overshoot and avalanche checks (at the highest bus voltage) ----
    if (in.withChecks && atMax.ok() && offCurrentMax > 0.0) {
        const double allowed = d.layout.overshootDerating * part.voltageRating_V;
        const bool high = atMax.peak_V > allowed;
        const bool over = atMax.peak_V > part.voltageRating_V;
        lp.checks.push_back(makeCheck(
            "switch.overshoot", over ? Severity::Fail : high ? Severity::Warning : Severity::Pass, atMax.peak_V, allowed, "V",
            "layout.overshootDerating × bank.device.voltageRating_V (about 80 % is common practice); L·di/dt of the "
            "commutation loop",
            fmt::format("turning off {} A in {} ns through {} nH at the highest bus voltage {} V peaks at {} V",
                        num(offCurrentMax), num(fall_s * 1e9), num(plan.loopInductance_H * 1e9), num(std::max(v, d.supply.max_V)),
                        num(atMax.peak_V, 4)) +
                (atMax.snubberSuggested
                     ? fmt::format("; an RC snubber of about {} nF with {} Ω (losing {} W) would hold it", num(atMax.snubberCapacitance_F * 1e9),
                                   num(atMax.snubberResistance_ohm), num(atMax.snubberLoss_W))
                     : std::string()),
            "Shorten the commutation loop (layout.loopLength_m, laminated busbars), slow the turn-off "
            "(bank.gateResistor_ohm) or add a snubber",
            "layout.loopLength_m"));
        if (atMax.avalanches || atPoint.avalanches) {
            const auto& a = atMax.avalanches ? atMax : atPoint;
            lp.checks.push_back(makeCheck(
                "switch.avalanche", a.avalanche.failed ? Severity::Fail : Severity::Warning, a.avalancheEnergy_J,
                a.avalanche.limit, "J",
                "clamped energy ½·L·I²·V_BR/(V_BR − V_bus) against the part's repetitive avalanche rating "
                "(bank.device.mosfet.avalancheRepetitive_J)",
                a.avalanche.failed ? a.avalanche.message
                                   : fmt::format("the device clamps at {} V and absorbs {} µJ every turn-off, within its "
                                                 "repetitive rating",
                                                 num(a.breakdown_V), num(a.avalancheEnergy_J * 1e6)),
                "Shorten the commutation loop, slow the turn-off or add an RC snubber / clamp", "layout.commutationLoopInductance_H"));
        }
    }

    // ---- Safe operating area of the solver's bank ----
    if (in.withChecks && !part.soa.empty()) {
        double worstRatio = 0.0;
        std::string worstMessage;
        bool failed = false;
        bool judged = false;
        for (std::size_t k = 0; k < nz; ++k) {
            const double s = share[0][k];
            const double ion = chopper ? s * std::max(0.0, in.motorCurrent_A) : lp.banks[0][k].current_A;
            const double von = in.onDrop_V + rOn[0][k] * ion;
            losses::SoaInput si;
            si.soa = part.soa;
            si.voltageRating_V = part.voltageRating_V;
            const double onTime = channelFraction[0] / f;
            si.points.push_back({"on-state", von, ion, onTime});
            const auto r = losses::checkStress(si);
            if (!r.ok())
                continue;
            for (const auto& pt : r.points) {
                if (!pt.check.rated)
                    continue;
                judged = true;
                const double ratio = pt.check.limit > 0.0 ? pt.check.value / pt.check.limit : 1e9;
                if (ratio > worstRatio || (pt.check.failed && !failed)) {
                    worstRatio = ratio;
                    worstMessage = fmt::format("device {} {}: {} A at {} V for {} against the SOA limit of {} A ({})", k,
                                               pt.name, num(pt.check.value), num(von), units::format(onTime, units::Unit::Second, 3),
                                               num(pt.check.limit),
                                               pt.curvePulse_s > 0.0 ? "curve of " + units::format(pt.curvePulse_s, units::Unit::Second, 3) + " pulses"
                                                                     : std::string("DC curve"));
                }
                failed = failed || pt.check.failed;
            }
        }
        if (judged)
            lp.checks.push_back(makeCheck(
                "switch.soa", failed ? Severity::Fail : Severity::Pass, worstRatio, 1.0, "",
                "the part's safe operating area points (bank.device.soa), log-log interpolation, the curve of the "
                "shortest pulse at least as long as the stress",
                worstMessage + (failed ? ": outside the safe operating area" : ""),
                "More devices in parallel (bank.count), a faster edge (bank.gateResistor_ohm) or a part with a larger "
                "safe operating area",
                "bank.count"));
    }

    // ---- Bipolar drive at the lowest supply (needs the point's current) ----
    if (in.withChecks && !plan.mosfet) {
        double worstMargin = 1e300, value = 0.0, limit = 0.0;
        std::string message;
        bool failed = false;
        for (std::size_t k = 0; k < nz; ++k) {
            const auto& r = base[k].result;
            if (!r.ok())
                continue;
            const double margin = r.saturation.value - r.saturation.limit;
            if (margin < worstMargin) {
                worstMargin = margin;
                value = r.saturation.value;
                limit = r.saturation.limit;
                message = r.saturation.failed ? fmt::format("device {}: {}", k, r.saturation.message)
                                              : fmt::format("at the lowest supply device {} still gets {} A of base current, "
                                                            "{} A needed",
                                                            k, num(value), num(limit));
                failed = r.saturation.failed;
            }
        }
        if (worstMargin < 1e300)
            lp.checks.push_back(makeCheck(
                "drive.weak-at-min-supply", failed ? Severity::Fail : Severity::Pass, value, limit, "A",
                "saturation needs I_B ≥ I_C/β_F(I_C, T_j) (Gummel–Poon gain with its high-current roll-off)",
                message,
                "A smaller base resistor (bank.gateResistor_ohm), a higher drive voltage at the lowest supply "
                "(drive.minSupply_V) or a Darlington",
                "drive.minSupply_V"));
    }

    for (const auto& bank : lp.banks)
        for (const auto& dl : bank)
            lp.stageLoss_W += dl.switching_W + dl.diode_W + dl.drive_W +
                              (lp.computesConduction ? dl.conduction_W + dl.ballast_W + dl.leg_W : 0.0);
    lp.stageLoss_W += lp.freewheelRecovery_W;
    return lp;
}

namespace {

// The loss stage's figures of one device into its result; the conduction figures only when the
// stage computed them (else the chopper's stay).
void takeLosses(const DeviceLoss& dl, bool withConduction, DeviceResult& dv) {
    dv.bank = dl.bank;
    if (withConduction) {
        dv.current_A = dl.current_A;
        dv.averageCurrent_A = dl.averageCurrent_A;
        dv.rmsCurrent_A = dl.rmsCurrent_A;
        dv.conduction_W = dl.conduction_W;
        dv.ballast_W = dl.ballast_W;
        dv.leg_W = dl.leg_W;
    }
    dv.switching_W = dl.switching_W;
    dv.diode_W = dl.diode_W;
    dv.drive_W = dl.drive_W;
    dv.loss_W = dv.conduction_W + dv.switching_W + dv.diode_W + dv.drive_W;
}

} // namespace

void recordLossPoint(const LossPoint& lp, const std::vector<double>& otherTj_C, const std::vector<double>& otherTcase_C,
                     OperatingPointResult& op, std::vector<Check>& checks) {
    if (!lp.banks.empty()) {
        const auto& main = lp.banks.front();
        for (std::size_t k = 0; k < op.devices.size() && k < main.size(); ++k) {
            takeLosses(main[k], lp.computesConduction, op.devices[k]);
        }
        const DeviceResult proto = op.devices.empty() ? DeviceResult{} : op.devices.front();
        std::size_t at = 0; // index into the other banks' temperatures, device by device
        for (std::size_t b = 1; b < lp.banks.size(); ++b) {
            for (const DeviceLoss& dl : lp.banks[b]) {
                DeviceResult dv;
                takeLosses(dl, true, dv);
                dv.share = dl.share;
                dv.ratingShare = proto.current_A > 0.0 ? proto.ratingShare * dl.current_A / proto.current_A : 0.0;
                dv.voltage_V = proto.current_A > 0.0 ? proto.voltage_V * dl.current_A / proto.current_A : 0.0;
                dv.tj_C = at < otherTj_C.size() ? otherTj_C[at] : proto.tj_C;
                dv.tcase_C = at < otherTcase_C.size() ? otherTcase_C[at] : proto.tcase_C;
                ++at;
                op.devices.push_back(dv);
            }
        }
    }
    op.freewheelDiode.loss_W += lp.freewheelRecovery_W;
    op.busCapacitorRipple_A = lp.busCapacitorRipple_A;
    op.overshoot_V = lp.overshoot_V;
    op.avalancheEnergy_J = lp.avalancheEnergy_J;
    op.notes.insert(op.notes.end(), lp.notes.begin(), lp.notes.end());
    for (Check c : lp.checks) {
        c.operatingPoint = op.name;
        c.message = op.name + ": " + c.message;
        checks.push_back(std::move(c));
    }
}

} // namespace amp

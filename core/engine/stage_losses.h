// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The loss and stress stage of evaluate(): switching, gate/base drive and recovery losses of every
// device, the synchronous half-bridge and full-bridge banks, bus capacitors, turn-off overshoot and
// avalanche, the safe operating area and the drive at the lowest supply, with their checks (ids
// "switch.*", "drive.*", "capacitor.*", "bus.*"). The models are in core/losses/; this file maps
// the design onto them and their results onto Results.
//
// How it joins the averaged operating-point solve (evaluate.cpp):
//  - The low-side chopper solve stays as it is; the stage adds, per device of the bank, the
//    switching energy of each edge (gate-charge method or bipolar times, C_oss, the freewheel
//    diodes' Q_rr charged to the switch turning on, clamped avalanche energy), the gate or base
//    drive, and the freewheel diodes' own recovery share.
//  - Synchronous half-bridge and full bridge: the averaged solve runs on a stand-in chopper with
//    the same mean motor voltage (chopperStandIn: the synchronous bank as the freewheel path, two
//    banks in series in a bridge, twice the frequency for unipolar PWM); the stage then takes the
//    current of every bank and body diode from the topology's own waveform (losses/topology.h:
//    dead times, reverse conduction, bipolar PWM's ±V ripple) and reports every bank's devices.
//  - Energy: everything the stage reports that the stand-in's source did not already pay for is
//    drawn from the bus on top of the conduction current (LossPoint::busPower_W), so that
//    V_bus × battery current = motor input + every loss. The drive power that ends in the dies is
//    counted as drawn from the battery (the driver rail is fed from it); the driver's own loss and
//    its external gate/base resistors' share are the driver's and stay outside the balance.
// The safe operating area is judged at the conducting state (linear mode, second breakdown); the
// switching transitions of a clamped inductive load are judged by the overshoot and avalanche
// checks.
// Parts of a bank switch together and share the switched current as they share the on-state
// current; the device that avalanches takes the whole clamp energy (worst case).
// Left out: a hard turn-on in a half-bridge also charges the opposite bank's output capacitance
// (up to Q_oss·V in all, against the ½·C·V²-type own share counted here); the gate charge is taken
// at the drive voltage as stated; the storage time of a bipolar bank is reported, not fed back.

#include "core/engine/results.h"
#include "core/model/design.h"
#include "core/model/problem.h"

#include <string>
#include <vector>

namespace amp {

enum class StageTopology { LowSideChopper, SynchronousHalfBridge, FullBridgeUnipolar, FullBridgeBipolar };

/// What the stage needs from the design, worked out once per evaluation.
struct LossPlan {
    StageTopology topology = StageTopology::LowSideChopper;
    bool mosfet = true;
    int banks = 1;                      ///< 1, 2 or 4
    int devices = 1;                    ///< per bank
    double loopInductance_H = 0.0;      ///< commutation loop
    double batteryLoopInductance_H = 0.0;
    std::vector<Problem> problems;      ///< design fields the stage cannot use
    std::vector<std::string> notes;     ///< assumptions worth a line in Results::warnings
    std::vector<Check> checks;          ///< design-wide checks
};

LossPlan planLosses(const Design& design);

/// The chopper the averaged solve runs on in place of the topology.
struct ChopperStandIn {
    double frequencyFactor = 1.0;       ///< the motor voltage's switching frequency / the carrier
    int onPathBanks = 1;                ///< banks in series while the motor is driven
    int offPathBanks = 0;               ///< banks in series while it freewheels (0: the freewheel diodes)
};
ChopperStandIn chopperStandIn(const LossPlan& plan);

struct ChopperCircuit;
struct ChopperWaveform;

/// Set the stand-in's frequency and paths from one bank's on-state (resistance of its devices in
/// parallel with ballast and legs, constant drop, junction temperature). Unchanged for the chopper.
void adaptStandIn(const LossPlan& plan, const Design& design, double bankResistance_ohm, double bankDrop_V,
                  double bankTj_C, ChopperCircuit& circuit);

/// The conduction loss the stand-in's source pays in its on and off paths.
double standInConduction(const ChopperCircuit& circuit, const ChopperWaveform& waveform);

/// One operating point from the averaged solve (bank totals, SI, °C).
struct LossPointInput {
    double busVoltage_V = 0.0;
    double motorCurrent_A = 0.0;        ///< mean armature current
    double duty = 0.0;                  ///< output duty (mean motor voltage / bus)
    double minCurrent_A = 0.0;          ///< lowest armature current (0 in discontinuous conduction)
    double maxCurrent_A = 0.0;
    double capacitorRms_A = 0.0;        ///< of the stand-in's waveform (used for the chopper)
    double onDrop_V = 0.0;              ///< constant part of a device's on-state drop (bipolar V_CE(sat))
    /// The bank the solver reports, per device.
    std::vector<double> share;
    std::vector<double> resistance_ohm; ///< on-state, at its junction temperature
    std::vector<double> ballast_ohm;
    std::vector<double> leg_ohm;
    std::vector<double> tj_C;
    /// Junction temperature of each device of the other banks (bank by bank) from the previous pass.
    std::vector<double> otherTj_C;
    double diodeTj_C = 25.0;            ///< freewheel diodes
    /// false: the numbers only, without the checks and their messages (the engine's iterations ask
    /// so; the reported pass runs again with them, and gets the same numbers).
    bool withChecks = true;
};

/// One device's share of the stage's losses in one operating point.
struct DeviceLoss {
    std::string bank;                   ///< role: "switch", "high", "low", "highA", "lowA", "highB", "lowB"
    double share = 0.0;                 ///< of its bank's current
    double current_A = 0.0;             ///< on-state (synchronous topologies)
    double averageCurrent_A = 0.0;
    double rmsCurrent_A = 0.0;
    double conduction_W = 0.0;          ///< synchronous topologies (the chopper's comes from the solve)
    double ballast_W = 0.0;
    double leg_W = 0.0;
    double switching_W = 0.0;
    double diode_W = 0.0;               ///< body or anti-parallel diode: conduction + own recovery share
    double drive_W = 0.0;               ///< gate/base drive dissipated in the die (internal R_g, V_BE·I_B)
    double junction_W = 0.0;            ///< what heats its junction: conduction (when given) + switching
                                        ///< + diode + drive
};

struct LossPoint {
    bool computesConduction = false;    ///< the stage gives every bank's conduction (synchronous)
    std::vector<std::vector<DeviceLoss>> banks; ///< [0] the bank the solver reports, then the others
    double freewheelRecovery_W = 0.0;   ///< the freewheel diodes' own recovery share (chopper)
    double stageLoss_W = 0.0;           ///< everything above, all devices
    double busCapacitorRipple_A = 0.0;  ///< RMS current in the bus capacitors, cable share included
    double overshoot_V = 0.0;           ///< L·di/dt at the point's bus voltage (clamped at breakdown)
    double avalancheEnergy_J = 0.0;     ///< per turn-off event
    std::vector<std::string> notes;
    std::vector<Check> checks;          ///< this point's checks (operatingPoint left empty)

    /// What the bus supplies on top of the stand-in's conduction current, given the conduction loss
    /// the stand-in's source already paid for (on and off path; only used when computesConduction).
    double busPower_W(double standInConduction_W) const {
        return computesConduction ? stageLoss_W - standInConduction_W : stageLoss_W;
    }
};

LossPoint computeLossPoint(const LossPlan& plan, const Design& design, const LossPointInput& in);

/// Write the stage's numbers into a solved operating point: the reported bank's device entries
/// gain switching, diode and drive losses (and, for synchronous topologies, their conduction and
/// currents); the other banks' devices are appended with their junction and case temperatures
/// (device by device, bank by bank); the freewheel diode gains its recovery share; the point's
/// checks are added.
void recordLossPoint(const LossPoint& point, const std::vector<double>& otherTj_C,
                     const std::vector<double>& otherTcase_C, OperatingPointResult& op,
                     std::vector<Check>& checks);

} // namespace amp

// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Currents in every bank and diode of the three power-stage topologies over one PWM period, the
// switching events (which bank turns on or off hard, at what current, which diode recovers), the
// bus current the capacitors see, and the conduction losses when resistances are given.
//
// Topologies (centre-aligned PWM, carrier frequency f, motor current i(t) piecewise linear):
//  - low-side chopper: one bank, on for D·T; the freewheel diode carries i in the off-time.
//    ΔI = V·D(1 − D)/(L·f).
//  - synchronous half-bridge: high and low bank; the high bank is on for D·T, the low bank for
//    (1 − D)·T − 2·t_d; each dead time t_d conducts in a body diode (the low one while i > 0, the
//    high one while braking, i < 0). Same ripple as the chopper.
//  - full bridge, bipolar PWM: diagonal pairs switch together with duty d = (1 + D)/2; the motor
//    sees ±V: ΔI = 2·V·d(1 − d)/(L·f)  (Mohan, Undeland & Robbins, "Power Electronics", from memory).
//  - full bridge, unipolar PWM: leg duties (1 ± D)/2; the motor sees 0 or +V twice per carrier
//    period: ΔI = V·D(1 − D)/(2·L·f), the half-bridge formula at the doubled frequency.
// D is the output duty: mean motor voltage over V (0 … 1; reverse direction is the mirror image).
// The current is piecewise linear (the linear ripple approximation, valid for R ≪ f·L); it slopes
// up by (v − v̄)/L in each voltage state, v̄ the mean. Integrals of |i| and i² over each linear piece
// are exact. Hard switching: a bank turning off while it carries current out of its own path
// hands the current to the opposite diode (hard turn-off); a bank turning on against a conducting
// diode commutates it and takes its recovery (hard turn-on); the other edges are soft.
// A channel conducting in reverse (synchronous rectification) shares the current with its body
// diode once R·i exceeds the diode threshold (a bipolar bank has no reverse channel: its anti-parallel
// diode carries the reverse current alone). Dead-time voltage follows the sign of the mean current.
// Sources: the switching-cell analysis of Mohan, Undeland & Robbins, "Power Electronics", dc-dc
// converter and full-bridge chapters (from memory); piecewise-linear diode model, same book.
//
// Units and valid ranges: V in V (> 0), D 0 … 1, current in A (signed; ≥ 0 for the chopper),
// L in H (> 0), f in Hz (> 0), t_d in s (0 ≤ 2·t_d < 1/f), resistances in Ω (≥ 0), V_f0 in V (≥ 0).

#include "core/losses/inputcheck.h"

#include <string>
#include <vector>

namespace amp::losses {

enum class Topology { LowSideChopper, SynchronousHalfBridge, FullBridgeBipolar, FullBridgeUnipolar };

/// "lowSideChopper", "synchronousHalfBridge", "fullBridge" (+ modulation "bipolar"/"unipolar").
bool parseTopology(const std::string& topology, const std::string& modulation, Topology& out);
const char* toString(Topology t);

/// Linear-ripple formulas (peak to peak, A): V in V, duty 0 … 1, L in H, f in Hz.
double rippleHalfBridge(double v_V, double duty, double l_H, double f_Hz);
/// d is the duty of one diagonal pair (not the output duty).
double rippleFullBridgeBipolar(double v_V, double diagonalDuty, double l_H, double f_Hz);
/// duty is the output duty D.
double rippleFullBridgeUnipolar(double v_V, double duty, double l_H, double f_Hz);

/// On-state parameters of the paths, for conduction losses (0 = ideal path).
struct PathParams {
    double bankResistance_ohm = 0.0;     ///< one bank's channel (devices in parallel, legs)
    double bodyVf0_V = 0.0;              ///< one bank's body diodes together
    double bodyRd_ohm = 0.0;
    double freewheelVf0_V = 0.0;         ///< the chopper's freewheel diodes together
    double freewheelRd_ohm = 0.0;
    bool reverseChannel = true;          ///< the channel conducts in reverse (MOSFET); false: the diode alone (bipolar)
};

struct TopologyInput {
    Topology topology = Topology::LowSideChopper;
    double busVoltage_V = 48.0;
    double duty = 0.5;                   ///< output duty D
    double motorCurrent_A = 0.0;         ///< mean armature current, signed (< 0 = braking)
    double inductance_H = 0.5e-3;        ///< armature + motor cable
    double frequency_Hz = 16e3;          ///< carrier frequency
    double deadTime_s = 0.0;
    PathParams paths;
};

/// One switching event in the period.
struct SwitchEvent {
    int bank = 0;                        ///< index into TopologyResult::banks
    bool turnOn = true;
    double current_A = 0.0;              ///< magnitude switched
    int recoveringBank = -1;             ///< bank whose body diode recovers (-1: the freewheel diode, -2: none)
};

/// One bank's share of the period. Currents are magnitudes.
struct BankCurrents {
    std::string role;                    ///< "switch", "high", "low", "highA", "lowA", "highB", "lowB"
    double channelFraction = 0.0;        ///< of the period the channel conducts
    double channelAverage_A = 0.0;
    double channelRms_A = 0.0;
    double diodeFraction = 0.0;          ///< of the period its body diode conducts
    double diodeAverage_A = 0.0;
    double diodeRms_A = 0.0;
    double channelLoss_W = 0.0;          ///< with PathParams (0 when not given)
    double diodeLoss_W = 0.0;            ///< body diode conduction
    int hardTurnOns = 0;                 ///< per period
    int hardTurnOffs = 0;
};

struct FreewheelCurrents {
    double fraction = 0.0;
    double average_A = 0.0;
    double rms_A = 0.0;
    double loss_W = 0.0;                 ///< conduction, with PathParams
};

struct TopologyResult {
    std::vector<Problem> problems;
    std::vector<std::string> notes;
    Topology topology = Topology::LowSideChopper;
    double ripplePeakToPeak_A = 0.0;
    double rippleFrequency_Hz = 0.0;     ///< f, or 2·f for unipolar PWM
    double currentMin_A = 0.0;
    double currentMax_A = 0.0;
    double motorRms_A = 0.0;
    bool discontinuous = false;          ///< chopper: the current would reach zero (CCM results invalid)
    bool currentReverses = false;        ///< synchronous topologies: the current changes sign in the period
    double effectiveDuty = 0.0;          ///< output duty after the dead time (mean motor voltage / V)
    std::vector<BankCurrents> banks;     ///< 1, 2 or 4
    FreewheelCurrents freewheelDiode;    ///< chopper only
    std::vector<SwitchEvent> events;     ///< per period
    double busAverage_A = 0.0;           ///< drawn from the bus (negative when braking)
    double busRms_A = 0.0;
    double capacitorRms_A = 0.0;         ///< √(I_bus,rms² − I_bus,avg²): the capacitors take the AC part
    double conductionLoss_W = 0.0;       ///< all channels, body diodes and freewheel diodes
    bool ok() const { return problems.empty(); }
};

TopologyResult topologyCurrents(const TopologyInput& in);

} // namespace amp::losses

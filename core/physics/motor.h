// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Brushed DC motor in steady state (averaged over the PWM period).
//
// Permanent-magnet (or separately excited) motor, torque constant k in N·m/A = V·s/rad:
//   E = k·ω                       back-EMF, V (ω in rad/s)
//   T = k·(I − I0)                shaft torque, N·m; I0 (A) is the no-load current that stands for
//                                 friction and iron loss, P_nl = k·I0·ω = E·I0
//   V_terminal = E + I·R_a        R_a = R_a,20·(1 + 0.00393·(T_w − 20 °C)) (copper, IEC 60028)
//   Power: E·I = T·ω + k·I0·ω; copper loss I_rms²·R_a.
// (Standard DC-machine equations, e.g. A. E. Fitzgerald, C. Kingsley, S. Umans, "Electric
// Machinery", DC machine chapter; from memory.)
//
// Series-wound motor: the flux follows the armature current, so k = k(I) from the user's
// magnetisation table (linear interpolation, the end values held outside the table):
//   E = k(I)·ω,  T = k(I)·(I − I0). The same chopper maths applies. Torque ripple from the current
//   ripple is ignored (k is taken at the average current).
//
// Operating points: from torque and speed (solve I from T), from current and speed, from current
// and duty (the chopper gives E, then ω = E/k(I)), and stall (ω = 0, E = 0: the controller's current
// limit sets I, without a limit the circuit resistance does, V/R). The chopper-dependent solves live
// in the engine; this model gives the motor's side.
//
// Units: SI (A, V, Ω, N·m, rad/s, W), winding temperature in °C. Valid for I ≥ 0, ω ≥ 0
// (motoring; braking needs a topology that returns energy).

#include "core/model/design.h"

#include <vector>

namespace amp {

inline constexpr double kRadPerSecPerRpm = 2.0 * 3.14159265358979323846 / 60.0;

struct MotorModel {
    double armatureResistance_ohm = 0.0; ///< at the winding temperature
    double torqueConstant_NmPerA = 0.0;  ///< permanent magnet; unused when the table is set
    double noLoadCurrent_A = 0.0;
    std::vector<MagnetisationPoint> magnetisation; ///< series wound: k(I), sorted by current
    bool seriesWound = false;
};

/// The model from the design's motor: R_a at the winding temperature, the table sorted.
MotorModel makeMotorModel(const Motor& motor);

/// k at an armature current (constant for a permanent-magnet motor). Never negative.
double torqueConstant(const MotorModel& motor, double current_A);

/// Shaft torque T = k(I)·(I − I0).
double shaftTorque(const MotorModel& motor, double current_A);

/// The armature current that gives a shaft torque: I = T/k + I0 (permanent magnet), or the root of
/// k(I)·(I − I0) = T (series wound; the product rises with I wherever k(I) does not fall faster than
/// 1/I). Torque ≤ 0 gives I0.
double currentForTorque(const MotorModel& motor, double torque_Nm);

/// Back-EMF at a current and speed.
double backEmf(const MotorModel& motor, double current_A, double speed_radps);

/// Speed that gives a back-EMF at a current (0 when k is 0 or E ≤ 0).
double speedForBackEmf(const MotorModel& motor, double current_A, double emf_V);

/// The motor's share of the power balance at an operating point.
struct MotorPower {
    double torque_Nm = 0.0;
    double mechanical_W = 0.0;          ///< T·ω
    double noLoadLoss_W = 0.0;          ///< k·I0·ω (friction, iron)
    double copperLoss_W = 0.0;          ///< I_rms²·R_a
    double input_W = 0.0;               ///< E·I_avg + I_rms²·R_a
};

MotorPower motorPower(const MotorModel& motor, double averageCurrent_A, double rmsCurrent_A, double speed_radps);

} // namespace amp

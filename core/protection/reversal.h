// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The safe reversal sequence of a drive reversed by a contactor, with computed waits.
//
// Steps (each a duration; the total is their sum, taken one after another, which is conservative
// because the motor already slows while its current decays):
//   1. PWM off, armature current decays through the freewheel path (freewheeldecay.h):
//        t1 = (L/R)·ln(1 + R·I0/(E + V_f))
//   2. the motor slows to the stop speed (coastdown.h), or a stated stop time
//   3. coil drop-out of the energised direction, with its suppression (coilsuppression.h)
//   4. change-over margin (stated; covers contact travel and spread of the drop-out time)
//   5. pick-up of the other direction and contact bounce (part data)
//   6. soft-restart ramp (stated)
// Changing over while the motor still turns at ω (armature swapped, PWM off): the back-EMF
// E = k·ω now forward-biases the freewheel diode and drives
//        I_co = (E − V_f)/R   (0 when E ≤ V_f)
// through diode and contacts, limited by nothing but R; restarting into the turning motor draws
//        I_plug = (D·V + E)/R
// through the switches. Both are computed at the highest speed at which the design lets the
// contactor change over: the stop speed when the sequence waits for it, the running speed when
// it does not (or when a stated stop time is shorter than the motor needs). Sources: the circuit
// of the low-side chopper with a freewheel diode (E with the armature reversed adds to the
// supply); plugging current as in electric-drives texts (e.g. Dubey, "Fundamentals of Electrical
// Drives", DC motor braking). Stopping the PWM, letting the current decay and the motor stop before
// changing over is common practice.
//
// Inputs and valid ranges: see the member comments; R > 0 and L > 0; V ≥ 0; 0 ≤ D ≤ 1;
// k > 0 (N·m/A = V·s/rad); times ≥ 0.

#include "core/model/problem.h"
#include "core/protection/coastdown.h"
#include "core/protection/coilsuppression.h"
#include "core/protection/freewheeldecay.h"

#include <string>
#include <vector>

namespace amp::protection {

struct ReversalInput {
    FreewheelDecayInput decay;          ///< current, L, loop R, back-EMF and V_f when the PWM stops
    CoastDownInput coast;               ///< inertia, speeds, retarding torque or a stated stop time
    CoilSuppressionInput coil;          ///< drop-out of the energised direction
    bool waitForStop = true;            ///< false: the sequence changes over without waiting for the stop
    double changeoverMargin_s = 0.05;   ///< ≥ 0
    double pickup_s = 0.03;             ///< ≥ 0, part's pick-up time
    double bounce_s = 0.003;            ///< ≥ 0, part's bounce time
    double softStartRamp_s = 0.5;       ///< ≥ 0
    double torqueConstant_NmPerA = 0.0; ///< k > 0
    double supply_V = 0.0;              ///< V ≥ 0, highest bus voltage for the restart
    double restartDuty = 1.0;           ///< D the restart applies at once (no ramp, no limit: worst case)
};

struct ReversalStep {
    std::string name;
    double duration_s = 0.0;
};

struct ReversalResult {
    bool valid = false;
    std::vector<Problem> problems; ///< paths as "decay.x", "coast.x", "coil.x" or the member name
    std::vector<ReversalStep> steps;
    double total_s = 0.0;
    FreewheelDecayResult decay;
    CoastDownResult coast;
    CoilSuppressionResult coil;
    double changeoverSpeed_radps = 0.0; ///< highest speed at which the contactor may change over
    double changeoverEmf_V = 0.0;
    double changeoverAtSpeedCurrent_A = 0.0; ///< (E − V_f)/R, ≥ 0
    double pluggingCurrent_A = 0.0;          ///< (D·V + E)/R
    bool allowsReversalAboveStop = false;    ///< the design can change over above its stop speed
};

/// Step names, stable (they appear in the results JSON).
inline constexpr const char* kStepCurrentDecay = "pwmOffCurrentDecay";
inline constexpr const char* kStepSlowDown = "slowToStopSpeed";
inline constexpr const char* kStepDropout = "coilDropout";
inline constexpr const char* kStepMargin = "changeoverMargin";
inline constexpr const char* kStepPickup = "pickupAndBounce";
inline constexpr const char* kStepRamp = "softRestartRamp";

ReversalResult reversalSequence(const ReversalInput& in);

} // namespace amp::protection

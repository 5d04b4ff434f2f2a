// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Low-side chopper feeding a brushed DC motor (R-L-EMF load), with every voltage drop kept where it
// conducts. The switch bank connects the motor's negative lead to the bus; the freewheel diode
// sits across the motor branch (motor cable, contacts, armature).
//
//   on  (0 ≤ t < D·T):   L·di/dt = (V_bus − V_sw0 − E) − (R_m + R_sw)·i
//   off (D·T ≤ t < T):   L·di/dt = −(V_f0 + E) − (R_m + r_d)·i   (while i > 0)
//
// Each phase is a first-order exponential, i(s) = i0·e^(−x) + (V/L)·s·(1 − e^(−x))/x with
// x = R·s/L. Continuous conduction (CCM): the periodic solution
//   I_max = (A1 + a·B1)/(1 − a·b),  I_min = b·I_max + B1,
//   a = e^(−x_on), b = e^(−x_off), A1 and B1 the phases' responses from zero current.
// With R_sw = r_d = V_sw0 = V_f0 = 0 this is the textbook result, z = R/(f·L):
//   I_max = (V/R)(1 − e^(−D·z))/(1 − e^(−z)) − E/R,  I_min = (V/R)(e^(D·z) − 1)/(e^z − 1) − E/R,
//   maximum ripple at D = 0.5: (V/R)·tanh(z/4)
// (M. H. Rashid, "Power Electronics", dc-dc converter chapter, from memory; the formula is standard).
// Discontinuous conduction (DCM): when the CCM solution has I_min ≤ 0 the diode stops at zero
// current; the waveform is computed as it is: rise from zero in the on-time, fall to zero at the
// extinction time t_x = (L/R_off)·ln(1 + I_pk·R_off/(V_f0 + E)), zero (motor voltage = E) for the
// rest of the period. Averages and RMS values are exact integrals of these waveforms.
//
// Linear (triangular) forms, for comparison and hand checks (N. Mohan, T. Undeland, W. Robbins,
// "Power Electronics", dc-dc chapter, from memory):
//   ΔI ≈ (V_bus − V_sw0 − E − I·R_on)·D/(L·f)  (≈ V·D·(1 − D)/(L·f) when the drops are small)
//   switch: I_avg = D·I,  I_rms² = D·(I² + ΔI²/12);  diode: (1 − D) in place of D.
//
// The battery supplies the switch's average current (the bus capacitors take the ripple):
//   V_bus = V_bat − R_bat·I_sw,avg,   battery current = I_sw,avg,
//   capacitor RMS ≈ sqrt(I_sw,rms² − I_sw,avg²)   (capacitor voltage ripple neglected).
//
// Units: SI (V, A, Ω, H, Hz, s). Valid for f > 0, L > 0, resistances ≥ 0, 0 ≤ D ≤ 1, E ≥ 0 and
// motoring current (i ≥ 0: the circuit has no path for reverse current in the off-time).

#include <string>

namespace amp {

enum class ConductionMode { Continuous, Discontinuous, NoCurrent };
const char* toString(ConductionMode mode); ///< "continuous", "discontinuous", "none"

/// The motor branch and the two conduction paths at a given bus voltage.
struct ChopperCircuit {
    double frequency_Hz = 16000.0;
    double inductance_H = 0.5e-3;
    double loadResistance_ohm = 0.05;   ///< R_m: armature + motor cable + contacts
    double backEmf_V = 0.0;             ///< E
    double busVoltage_V = 48.0;         ///< V_bus at the capacitors (ignored by the supply solvers)
    double switchDrop_V = 0.0;          ///< V_sw0: constant part of the bank's on-state drop
    double switchResistance_ohm = 0.0;  ///< R_sw: bank on-state resistance (devices ∥, with ballast, legs)
    double diodeDrop_V = 0.0;           ///< V_f0 of the freewheel path at its temperature
    double diodeResistance_ohm = 0.0;   ///< r_d of the freewheel path (parallel diodes combined)
};

/// Triangular-ripple approximation of the switch, diode and capacitor currents.
struct TriangularCurrents {
    double switchAverage_A = 0.0;
    double switchRms_A = 0.0;
    double diodeAverage_A = 0.0;
    double diodeRms_A = 0.0;
    double capacitorRms_A = 0.0;
};

/// The linear forms for an average current I, peak-to-peak ripple ΔI and duty D.
TriangularCurrents triangularCurrents(double average_A, double ripple_A, double duty);

/// Linear ripple V·D·(1 − D)/(L·f) (0 for non-positive L or f).
double linearRipple(double voltage_V, double duty, double inductance_H, double frequency_Hz);

/// The exact periodic current waveform at a duty.
struct ChopperWaveform {
    bool valid = true;
    std::string problem;                ///< why there is no steady state (when !valid)
    ConductionMode mode = ConductionMode::NoCurrent;
    double duty = 0.0;
    double iMin_A = 0.0;                ///< lowest motor current (0 in DCM)
    double iMax_A = 0.0;                ///< highest motor current
    double diodeConduction_s = 0.0;     ///< time the freewheel path conducts per period
    double ripplePeakToPeak_A = 0.0;
    double motorAverage_A = 0.0;
    double motorRms_A = 0.0;
    double switchAverage_A = 0.0;       ///< whole bank, over the period
    double switchRms_A = 0.0;
    double diodeAverage_A = 0.0;        ///< whole freewheel path, over the period
    double diodeRms_A = 0.0;
    double capacitorRms_A = 0.0;
    double rippleLinear_A = 0.0;        ///< linear estimate (on-time slope × D/f)
    TriangularCurrents linear;          ///< linear forms at the same average current
};

ChopperWaveform chopperWaveform(const ChopperCircuit& circuit, double duty);

/// Battery behind the bus: EMF and its series resistance (internal + battery cable).
struct ChopperSupply {
    double voltage_V = 48.0;
    double resistance_ohm = 0.0;
};

/// A waveform together with the bus voltage it settles at.
struct ChopperSolution {
    ChopperWaveform waveform;
    double busVoltage_V = 0.0;
    double batteryCurrent_A = 0.0;      ///< = switch average current
    double backEmf_V = 0.0;             ///< E of this solution (solved by chopperEmfForCurrent)
    bool reached = true;                ///< false when the requested current is out of reach
};

/// The waveform at a duty with the bus voltage solved: V_bus = V − R_bat·I_sw,avg.
ChopperSolution chopperAtDuty(const ChopperCircuit& circuit, const ChopperSupply& supply, double duty);

/// The lowest duty in [0, maxDuty] whose average motor current equals `current_A`. When the
/// current cannot be reached, the solution with the highest current is returned, reached = false.
ChopperSolution chopperForCurrent(const ChopperCircuit& circuit, const ChopperSupply& supply,
                                  double current_A, double maxDuty);

/// The back-EMF at which the duty gives the average motor current `current_A` (E ∈ [0, V]). When
/// even E = 0 gives less current, that solution is returned with reached = false.
ChopperSolution chopperEmfForCurrent(const ChopperCircuit& circuit, const ChopperSupply& supply,
                                     double duty, double current_A);

} // namespace amp

// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The parallel switch bank as an electrothermal network: per-device currents, voltages, losses and
// junction temperatures, and the stability of that state (thermal runaway, current hogging).
//
// Electrical network (DC, the on-state of the PWM period). Device k (MOSFET: bank/mosfetmodel.h,
// bipolar: bank/bjtmodel.h, Darlington: bank/darlingtonmodel.h) with its own parameters (nominal
// part + its BankDevice deviations) sits between the common drain/collector node C and the common
// return; its source/emitter goes through its ballast and its leg resistance (both outside the
// die, in that order, so the leg degenerates the drive like a ballast: the driver is referenced to
// the common return). Its gate/base is fed from the common drive node G through its own gate/base
// resistor; G is fed by the driver, an open-circuit voltage V_drv behind R_drv. MOSFET gates have a
// pull-down to their source (DC: a divider); the bipolar base pull-down draws ≪ the base current
// and is left out. Three ways to feed the bank (BankFeed):
//   Current — the load current I is forced into C (a switch that is on: the motor current of the
//             on-time); V_C floats. The load current is held in the loop gain.
//   Voltage — C is held at V_C (e.g. a fixed collector voltage); I follows. V_C held.
//   Linear  — C is held at V_C and I is forced; the drive node G is whatever carries I (a control
//             loop around a linear bank). V_C and I held.
// Unknowns: V_G, V_C and per device its channel current (MOSFET), its two internal junction
// voltages (bipolar) or four (Darlington). Newton with the exact Jacobian (forward-mode automatic
// differentiation, bank/dual.h), Eigen dense LU, SPICE junction-voltage limiting, step limits on
// V_G/V_C and backtracking on the residual; at most maxNewtonIterations.
//
// Thermal network: bank/thermalnetwork.h (junction → case → interface → shared heatsink →
// ambient, optional neighbour coupling; extra heat on the sink, e.g. the freewheel diode).
// Average junction power P_k = duty·r_eff·P_on,k + P_sw,k where P_on,k is the on-state dissipation
// inside the device (junction(s) and the die's own series resistances; ballast and leg heat is
// reported but not put on the heatsink), r = I_rms²/(duty·I²) the waveform's RMS factor
// (triangular ripple: 1 + (ΔI_pp/I)²/12) and r_eff = 1 + (R_b·I/V_C)·(r − 1) with R_b = dV_C/dI the
// bank's incremental resistance: the ripple adds loss only through the resistive part of the drop.
// For a bank V_C(i) ≈ V0 + R_b·i this reproduces V0·I_avg + R_b·I_rms² exactly (a chopper model
// with the same V0 and R_b balances its energy with these losses).
//
// Electrothermal solution: Newton on the junction temperatures of
//   G(T) = T − T_amb − Z·P(T) − z_s·P_s = 0,   Jacobian I − Z·S,   S = dP/dT
// where S is the total derivative along the electrical solution (implicit-function theorem on the
// converged network, with the feed's held quantities held). Each step re-solves the network
// (warm start) from ambient, steps are limited to 100 K and halved while the largest residual does
// not fall, and T is capped at T_j,max + 125 K: a bank whose heat
// still outgrows the sink there has no fixed point (thermal runaway). Newton, unlike the plain
// fixed-point iteration T ← T_amb + Z·P(T), also finds fixed points that are unstable; stability
// is then judged separately:
//   loop gain = spectral radius of Z·S (Eigen eigen-solver), with what is held stated;
//   the dominant eigenvalue λ_d = the eigenvalue of Z·S with the largest real part: the
//   disturbance that grows. It equals the loop gain whenever the feedback is positive (heating
//   raises the heat: a MOSFET's R_ds(on), a bipolar's falling V_BE), which is every case of
//   runaway. A negative eigenvalue is negative feedback: its modulus can exceed 1 (a bipolar bank
//   at the edge of its drive, where heating raises β and lowers V_CE) and then the plain
//   iteration T ← T_amb + Z·P would oscillate, but the bank itself, with its heat capacities,
//   settles. So stability is judged on λ_d, and both numbers are reported;
//   dominant mode from λ_d's eigenvector: "common" when all its components have one sign (the
//   whole bank heats together), "differential" otherwise (one device takes over from the others);
//   stable ⇔ a fixed point exists, every T_j < T_j,max and λ_d < 1.
// Failures (bad input, runaway, a load the drive cannot hold on, non-convergence) come back in
// the solution with the reason; no NaN reaches the results.

#include "core/model/design.h"
#include "core/model/problem.h"

#include <string>
#include <vector>

namespace amp {

enum class BankFeed { Current, Voltage, Linear };

/// Everything one electrothermal solve of a bank needs. SI units (°C in _C names).
struct BankProblem {
    SwitchPart part;                   ///< nominal device
    std::vector<BankDevice> devices;   ///< one per device (size = N ≥ 1): deviations
    double gateResistor_ohm = 4.7;     ///< external gate/base resistor per device
    double ballast_ohm = 0.0;          ///< source/emitter ballast per device
    double legResistance_ohm = 0.3e-3; ///< each device's leg (busbar/trace)
    double pulldown_ohm = 10e3;        ///< MOSFET gate pull-down (0 = none)
    /// Forward Early voltage V_AF of bipolar transistors (0 = none). The part data have no field
    /// for it yet; 100 V is a typical power-transistor value (from memory) and only matters when
    /// the base drive falls short of the load (quasi-linear operation, see bjtmodel.h).
    double earlyVoltage_V = 100.0;
    double driveVoltage_V = 12.0;     ///< driver open-circuit voltage
    double driveResistance_ohm = 2.0; ///< shared resistance between driver and drive node
    BankFeed feed = BankFeed::Current;
    double load_A = 0.0;             ///< on-state bank current (Current, Linear)
    double commonNode_V = 0.0;       ///< held drain/collector voltage (Voltage, Linear)
    double busVoltage_V = 0.0;       ///< highest V_C the circuit can give (0 = no limit)
    double duty = 1.0;               ///< fraction of the period the bank conducts
    double ripplePeakToPeak_A = 0.0; ///< on-time current ripple (for the RMS factor)
    /// r = I_rms²/(duty·I²) of the switch current, when known from a waveform (0 = from the
    /// triangular ripple: 1 + (ΔI_pp/I)²/12).
    double rmsFactor = 0.0;
    double switchingPowerPerDevice_W = 0.0;    ///< further heat in each junction (switching, body diode)
    std::vector<double> extraPowerPerDevice_W; ///< when its size is N: added to each junction's heat
    double sinkExtraPower_W = 0.0;             ///< heat put straight on the heatsink (freewheel diode)
    double ambient_C = 30.0;
    double rthCs_KperW = 0.35;            ///< interface, case to sink, per device
    double rthSa_KperW = 0.3;             ///< heatsink to ambient
    double neighbourCoupling_KperW = 0.0; ///< case to neighbouring case (0 = none)
    bool isothermal = false;              ///< hold every junction at isothermalTj_C (no thermal solve)
    double isothermalTj_C = 25.0;
    std::vector<double> isothermalTjPerDevice_C; ///< when its size is N: each junction's held temperature
    double derating = 0.5;                       ///< highest share of the rated current per device
    double sharingTarget = 1.10;                 ///< accepted max/min device current ratio
    int maxNewtonIterations = 100;
    int maxThermalIterations = 60;
    /// false skips the loop gain / dominant mode and the verdict text when the caller only wants
    /// currents, powers and temperatures (e.g. a loss iteration): the solution's stability is left
    /// invalid (its sensitivity_WperK is still filled), `stable` false and `verdict` empty;
    /// completeStability() adds them afterwards, the same as a full solve.
    bool stabilityAnalysis = true;
};

enum class BankFailure { None, InvalidInput, ThermalRunaway, CannotCarryLoad, NoConvergence };
const char* toString(BankFailure f); ///< "none", "invalidInput", "thermalRunaway", ...

enum class BankMode { Common, Differential };
const char* toString(BankMode m); ///< "common" or "differential"

/// Loop gain of the electrothermal feedback at one state.
struct BankStability {
    bool valid = false;              ///< computed (needs an electrical solution)
    double loopGain = 0.0;           ///< spectral radius of Z·S
    double dominantEigenvalue = 0.0; ///< largest real part of an eigenvalue of Z·S (runaway ≥ 1)
    BankMode mode = BankMode::Common;
    std::vector<double> modeShape;         ///< its eigenvector (real part), largest |component| = +1
    std::string held;                      ///< what is held fixed while T varies
    std::vector<double> sensitivity_WperK; ///< S = dP/dT of the average junction powers, N×N row-major
};

/// One device in one solution.
struct BankDeviceState {
    double current_A = 0.0;        ///< on-state drain/collector current
    double share = 0.0;            ///< of the bank's current
    double ratingShare = 0.0;      ///< current / rated current
    double deratedShare = 0.0;     ///< current / (derating × rated current)
    double voltage_V = 0.0;        ///< on-state drop, drain–source or collector–emitter terminals
    double controlVoltage_V = 0.0; ///< V_GS at the die (MOSFET) or V_BE at the terminals (bipolar)
    double driveCurrent_A = 0.0;   ///< gate (pull-down) or base current
    double onStatePower_W = 0.0;   ///< dissipated in the die while conducting
    double conduction_W = 0.0;     ///< average over the period (duty, ripple)
    double switching_W = 0.0;      ///< as given (switching + extra power)
    double loss_W = 0.0;           ///< conduction + switching: the junction's heat
    double ballast_W = 0.0;        ///< average, in the ballast resistor
    double leg_W = 0.0;            ///< average, in the leg
    double drive_W = 0.0;          ///< average, in the gate/base resistor
    double tj_C = 0.0;
    double tcase_C = 0.0;
    std::string region; ///< "ohmic", "saturation" (MOSFET), "saturated", "active" (bipolar), "off"
};

struct BankSolution {
    bool converged = false; ///< an electrical (and, unless isothermal, thermal) solution
    BankFailure failure = BankFailure::None;
    std::string reason;           ///< why not, in words with numbers
    bool fixedPoint = false;      ///< an electrothermal fixed point was found
    bool overTemperature = false; ///< a junction at or above T_j,max at the fixed point
    bool stable = false;          ///< fixed point, all T_j < T_j,max and λ_d < 1
    std::string verdict;          ///< one sentence for the user
    std::vector<BankDeviceState> devices;
    double load_A = 0.0;       ///< bank on-state current
    double commonNode_V = 0.0; ///< V_C
    double driveNode_V = 0.0;  ///< V_G
    double heatsink_C = 0.0;
    double maxMinCurrentRatio = 1.0; ///< capped at 1e6 when a device carries nothing
    double maxShare = 0.0;
    int hottest = 0;                        ///< device with the highest T_j
    double incrementalResistance_ohm = 0.0; ///< dV_C/dI at the solution (current feed)
    double powerScale = 1.0;                ///< duty·r_eff: average over on-state power
    double deviceLoss_W = 0.0;              ///< all junctions, average
    double ballastLoss_W = 0.0;             ///< all ballast resistors, average
    BankStability stability;
    int newtonIterations = 0; ///< electrical Newton steps in all
    int thermalIterations = 0;
    std::vector<std::string> notes;
    std::vector<double> state; ///< internal: network unknowns for warm starts
};

/// Every problem with the input, naming the design field (empty when valid).
std::vector<Problem> validateBankProblem(const BankProblem& problem);

/// Solve the bank. `warmStart` (a solution of a nearby problem with the same device count and
/// kind) speeds up scans; the answer does not depend on it except where the network has more than
/// one solution.
BankSolution solveBank(const BankProblem& problem, const BankSolution* warmStart = nullptr);

/// The loop gain at the junction temperatures of `at` (re-solves the network there).
BankStability analyseStability(const BankProblem& problem, const BankSolution& at);

/// For a solution of `problem` solved with stabilityAnalysis = false: the loop gain, dominant mode,
/// `stable` and verdict from its stored sensitivity, without re-solving (identical to what the
/// full solve gives). Does nothing to a solution that has its stability already.
void completeStability(const BankProblem& problem, BankSolution& solution);

/// Only the spectral radius of Z·S (BankStability::loopGain) of such a solution, from its stored
/// sensitivity: what a loss iteration needs to damp itself. 0 when there is no sensitivity.
double spectralRadius(const BankProblem& problem, const BankSolution& solution);
/// The same when it exceeds `limit` (> 0), else 0: a matrix norm of Z·S rules out most cases without
/// the eigenvalues (a loss iteration only damps itself above 1).
double spectralRadiusAbove(const BankProblem& problem, const BankSolution& solution, double limit);

} // namespace amp

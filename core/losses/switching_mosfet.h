// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// MOSFET switching loss in a hard-switched leg with a clamped inductive load, by the gate-charge
// method, plus the output-capacitance energy and the reverse recovery of the diode that the
// turning-on switch commutates.
//
// Gate current through the total gate resistance R_g = R_drv + R_g,ext + R_g,int against the
// Miller plateau V_pl (driver swinging between V_off and V_drv):
//   turn-on:  current rise  t_ri = Q_gs2·R_g/(V_drv − V_pl),  voltage fall t_fv = Q_gd·R_g/(V_drv − V_pl)
//   turn-off: voltage rise  t_rv = Q_gd·R_g/(V_pl − V_off),   current fall t_fi = Q_gs2·R_g/(V_pl − V_off)
//   E_on = ½·V·I_on·(t_ri + t_fv),  E_off = ½·V·I_off·(t_rv + t_fi)
// Output capacitance, discharged in the channel at each turn-on:
//   constant C:  E_oss = ½·C·V²
//   C ∝ V^−½ referenced to C_ref at V_ref:  C(V) = C_ref·√(V_ref/V),  E_oss = ∫v·C(v)dv = (2/3)·C(V)·V²
// Reverse recovery of the commutated diode, charged to the switch turning on: E_rr = Q_rr·V.
// P = f·(E_on + E_off + E_oss + E_rr).
// Sources: Balogh, "Fundamentals of MOSFET and IGBT Gate Driver Circuits" (gate-charge timing);
// Erickson & Maksimović, "Fundamentals of Power Electronics", 2nd ed., switching-loss chapter
// (E_oss for both laws, Q_rr·V) — both from memory, the formulas are standard.
//
// Units and valid ranges: voltages in V (bus > 0, V_off < V_pl < V_drv), currents in A (≥ 0, the
// current this device switches: a bank of n devices switching together gives each I/n), charges in
// A·s (≥ 0), resistances in Ω (≥ 0, total > 0), C in F (≥ 0), f in Hz (> 0).
// R_drv is the driver output resistance seen by this device: n gates sharing one driver output see
// n·R_out each. The model ignores the gate-current change while V_gs crosses Q_gs2 (plateau taken
// as the whole interval) and the tail of the current fall; it suits 10 V … 200 V parts.

#include "core/losses/inputcheck.h"

#include <string>
#include <vector>

namespace amp::losses {

enum class CossLaw {
    Constant,                       ///< C_oss independent of voltage
    InverseSqrt,                    ///< C_oss ∝ V^−½ (abrupt junction)
};

/// Parse "constant" / "sqrt" (the part file's cossLaw); anything else is reported by the caller.
bool parseCossLaw(const std::string& text, CossLaw& law);

struct MosfetSwitchingInput {
    double busVoltage_V = 48.0;     ///< voltage the device switches against
    double turnOnCurrent_A = 0.0;   ///< device current at turn-on
    double turnOffCurrent_A = 0.0;  ///< device current at turn-off
    double frequency_Hz = 20e3;
    double driveHigh_V = 12.0;      ///< driver output high level
    double driveLow_V = 0.0;        ///< driver output low level (0 or negative)
    double driverResistance_ohm = 0.0;   ///< as seen by this device
    double gateResistorExternal_ohm = 0.0;
    double gateResistorInternal_ohm = 0.0;
    double plateau_V = 5.0;
    double qgs2_As = 10e-9;
    double qgd_As = 20e-9;
    double coss_F = 0.0;            ///< at cossRef_V
    double cossRef_V = 25.0;
    CossLaw cossLaw = CossLaw::InverseSqrt;
    double recoveryCharge_As = 0.0; ///< Q_rr of the diode this device commutates at turn-on
};

struct MosfetSwitchingResult {
    std::vector<Problem> problems;  ///< bad inputs; every number below is 0 when not empty
    double gateResistance_ohm = 0.0;     ///< R_drv + R_g,ext + R_g,int
    double turnOnCurrentRise_s = 0.0;
    double turnOnVoltageFall_s = 0.0;
    double turnOffVoltageRise_s = 0.0;
    double turnOffCurrentFall_s = 0.0;
    double turnOffCurrentSlope_Aps = 0.0; ///< di/dt during the current fall (for the overshoot)
    double turnOnEnergy_J = 0.0;
    double turnOffEnergy_J = 0.0;
    double cossEnergy_J = 0.0;
    double recoveryEnergy_J = 0.0;
    double overlap_W = 0.0;         ///< f·(E_on + E_off)
    double coss_W = 0.0;
    double recovery_W = 0.0;
    double total_W = 0.0;
    bool ok() const { return problems.empty(); }
};

/// Energy stored in the output capacitance at `voltage_V` (for either law).
double cossEnergy(double coss_F, double cossRef_V, CossLaw law, double voltage_V);

MosfetSwitchingResult mosfetSwitching(const MosfetSwitchingInput& in);

} // namespace amp::losses

// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Copper cable: resistance at temperature, conductor temperature and ampacity, voltage drop and
// loss, and the smallest standard cross-section that meets an allowed drop and a conductor
// temperature limit.
//
// Resistance: IEC 60228 (conductors of insulated cables) gives the maximum DC resistance at 20 °C
// per size and class; class 5 (flexible) is the battery- and motor-cable class. Between sizes the
// product R20·A is interpolated linearly in A (outside the table the nearest end's product is
// used). Temperature correction (IEC 60228 Annex B; α20 = 0.00393 /K, IEC 60028), from
// physics/copper.h:
//     R(t) = R20/k_t,  k_t = 254.5/(234.5 + t)
// Conductor temperature: steady heat balance of a round insulated conductor in air (an estimate):
//     I²·R'(T) = (T − T_a)/R_th',  R_th' = ln(r_o/r_c)/(2π·k_ins) + 1/(h·2π·r_o)
//     r_c = √(A/π) (stranding ignored), r_o = r_c + insulation thickness
// With R'(T) = R20'·(234.5 + T)/254.5 this is linear in T:
//     a = I²·R20'·R_th'/254.5,  T = (T_a + 234.5·a)/(1 − a)   (a ≥ 1: thermal runaway)
//     ampacity I_z = √((T_lim − T_a)·254.5/(R20'·R_th'·(234.5 + T_lim)))
// h is a combined convection + radiation coefficient in still air. The default 12 W/m²K is an
// estimate: the Churchill–Chu correlation for a horizontal cylinder of ≈ 9 mm at 40 K rise gives
// ≈ 9 W/m²K, radiation at emissivity 0.9 about 6 more; 12 keeps a margin (bundled or enclosed
// cables need a lower h). This gives ampacities some 10–20 % below the free-air tables of
// IEC 60364-5-52 (from memory), i.e. on the safe side. The insulation's conductivity defaults to
// 0.2 W/(m·K) (PVC: thermal resistivity 5 K·m/W in IEC 60287-2-1, from memory). Conductor
// temperature limits (IEC 60364-5-52 Table 52.1): PVC 70 °C, XLPE/EPR 90 °C.
// Over a repeating duty profile (steps of current and duration) the conductor follows the same
// balance with its heat capacity C' = ρ_Cu·c_Cu·A per metre (ρ_Cu 8933 kg/m³, c_Cu 385 J/(kg·K),
// pure copper at 300 K, Incropera & DeWitt, appendix table A.1; the insulation's heat capacity is
// left out, so the conductor heats faster than it does: the safe side):
//     C'·dT/dt = I²·R20'·(234.5 + T)/254.5 − (T − T_a)/R_th'  =  s − k·T   (linear in T)
// solved exactly per step, T(t) = s/k + (T0 − s/k)·e^(−k·t). Each step is an affine map of the
// start temperature; the profile is their composition T ↦ α·T + β, whose fixed point β/(1 − α) is
// the periodic steady state (α ≥ 1: the temperature grows cycle after cycle, runaway). The peak is
// the highest step-end temperature of that cycle. With no profile the steady state at current_A
// is used.
// Drop and loss use the conductor temperature at the heating current:
//     ΔV = I_peak·R'(T)·ℓ,  P = I_rms²·R'(T)·ℓ   (ℓ: conductor length, both poles)
//
// Inputs and valid ranges:
//   current_A ≥ 0 (RMS, heats the conductor; with a profile: the loss is taken at it); peakCurrent_A ≥ 0
//   (for the drop; 0 = current_A); profile steps: current_A ≥ 0, duration_s ≥ 0, some duration > 0
//   length_m ≥ 0; area_mm2 ≥ 0 (0 = only size); allowedDrop_V > 0
//   ambient_C −50…150; conductorLimit_C > ambient_C, ≤ 250
//   insulationThickness_m > 0; insulationConductivity_WperMK > 0; surfaceCoefficient_WperM2K > 0

#include "core/model/problem.h"

#include <optional>
#include <vector>

namespace amp::protection {

/// One row of the IEC 60228 class 5 table (plain annealed copper).
struct CableSize {
    double area_mm2 = 0.0;
    double maxResistance20_ohmPerKm = 0.0;
};

/// IEC 60228 class 5, plain copper, maximum resistance at 20 °C, 1.5 … 240 mm², ascending.
/// 2.5, 16, 35 and 50 mm² as read in the standard; the other rows as remembered from its Table 3
/// (each consistent with ρ20/A of annealed copper plus the class-5 stranding allowance).
const std::vector<CableSize>& iec60228Class5();

/// Maximum resistance of a class 5 copper conductor, Ω/m, at t (°C). 0 for area ≤ 0.
double class5Resistance_ohmPerM(double area_mm2, double t_C);

/// One step of a repeating load profile.
struct CableLoadStep {
    double current_A = 0.0;  ///< RMS over the step, ≥ 0
    double duration_s = 0.0; ///< ≥ 0
};

struct CableInput {
    double current_A = 0.0;
    double peakCurrent_A = 0.0;
    double length_m = 0.0;
    double area_mm2 = 0.0;
    double allowedDrop_V = 1.0;
    double ambient_C = 30.0;
    double conductorLimit_C = 70.0;
    double insulationThickness_m = 1.2e-3;
    double insulationConductivity_WperMK = 0.2;
    double surfaceCoefficient_WperM2K = 12.0;
    std::vector<CableLoadStep> profile; ///< repeating profile; empty = steady at current_A
};

/// Performance of one cross-section.
struct CableRating {
    double area_mm2 = 0.0;
    double thermalResistance_KmPerW = 0.0; ///< R_th' per metre
    bool runaway = false;                  ///< no steady temperature (at current_A, or over the profile)
    double conductorTemperature_C = 0.0;   ///< at current_A, or the peak over the repeating profile
                                           ///< (the limit's value when runaway)
    double ampacity_A = 0.0;               ///< at conductorLimit_C
    double resistance_ohmPerM = 0.0;       ///< at the conductor temperature
    double drop_V = 0.0;
    double loss_W = 0.0;
    bool dropOk = false;
    bool temperatureOk = false;
};

struct CableResult {
    bool valid = false;
    std::vector<Problem> problems;
    std::optional<CableRating> installed; ///< the stated cross-section (when area_mm2 > 0)
    std::optional<CableRating> required;  ///< the smallest standard size that meets both limits
};

CableResult rateCable(const CableInput& in);

} // namespace amp::protection

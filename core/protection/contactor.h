// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Ratings of the reversing contactor against the design.
//
//   continuous margin   m = I_th / I_rms        (I_th: thermal current rating, I_rms: motor RMS)
//   coil                I_coil = U_c/R_coil,  P_coil = U_c²/R_coil (at the applied coil voltage)
//   contact loss        P_c = n·I_rms²·R_contact  (n contacts in series with the armature; a
//                                                  reversing pair that swaps both leads has n = 2)
//   electrical life     years = N_el / (ops per reversal · reversals per day · days per year)
//   motor L/R           τ_m = L_a/R_loop, set beside the test-circuit L/R of the contactor's DC
//                       utilisation category (IEC 60947-4-1, see utilisationcategory.h)
//   must not break load τ_m above the category's test L/R, above every category (DC-5 at 4·I_e,
//                       15 ms) when no category is stated, or no DC breaking rating at all.
// The required margin is common practice (choose the thermal current some 25 % above the load's
// continuous RMS current); the 85–110 % band of the rated coil voltage in which a contactor must
// close is the IEC 60947-4-1 operating-limit band for electromagnetic contactors (from memory).
//
// Inputs and valid ranges (SI):
//   continuousCurrent_A > 0; motorRmsCurrent_A ≥ 0; requiredMargin ≥ 1
//   coilVoltage_V > 0 (rated); coilResistance_ohm > 0 (at 20 °C); appliedCoilMin_V, appliedCoilMax_V ≥ 0
//     (0 = the rated voltage)
//   contactResistance_ohm ≥ 0 (per contact); contactsInPath ≥ 1
//   electricalLife_ops ≥ 0, mechanicalLife_ops ≥ 0 (0 = not stated: no life figure);
//   reversalsPerDay ≥ 0; operationsPerReversal > 0;
//   operatingDaysPerYear in (0, 366]
//   armatureInductance_H > 0; loopResistance_ohm > 0 (armature at temperature + cable + contacts)
//   category "", "DC-1", "DC-3" or "DC-5"; dcBreaking_A ≥ 0 (0 = no DC breaking rating stated)

#include "core/model/problem.h"

#include <optional>
#include <string>
#include <vector>

namespace amp::protection {

struct ContactorInput {
    double continuousCurrent_A = 0.0;
    double motorRmsCurrent_A = 0.0;
    double requiredMargin = 1.25;
    double coilVoltage_V = 0.0;
    double coilResistance_ohm = 0.0;
    double appliedCoilMin_V = 0.0;
    double appliedCoilMax_V = 0.0;
    double contactResistance_ohm = 0.0;
    int contactsInPath = 2;
    double electricalLife_ops = 1e5;
    double mechanicalLife_ops = 1e6;
    double reversalsPerDay = 0.0;
    double operationsPerReversal = 1.0;
    double operatingDaysPerYear = 365.0;
    double armatureInductance_H = 0.0;
    double loopResistance_ohm = 0.0;
    std::string category;
    double dcBreaking_A = 0.0;
};

struct ContactorResult {
    bool valid = false;
    std::vector<Problem> problems;
    std::optional<double> continuousMargin; ///< I_th/I_rms (empty when I_rms = 0)
    bool continuousOk = false;              ///< margin ≥ required
    double coilCurrent_A = 0.0;             ///< at the rated coil voltage
    double coilPower_W = 0.0;               ///< at the rated coil voltage
    double coilPowerMax_W = 0.0;            ///< at the highest applied coil voltage
    double coilVoltageRatioMin = 1.0;       ///< lowest applied / rated
    double coilVoltageRatioMax = 1.0;       ///< highest applied / rated
    bool coilVoltageOk = false;             ///< both inside the 85–110 % band
    double contactLoss_W = 0.0;
    std::optional<double> electricalLife_years; ///< empty when there are no reversals or no life stated
    std::optional<double> mechanicalLife_years;
    double motorTimeConstant_s = 0.0;
    double categoryTimeConstant_s = 0.0; ///< the limit τ_m is compared with
    bool beyondCategories = false;       ///< τ_m > the largest test L/R of any category
    bool mustNotBreakLoad = false;
    std::string reason; ///< why it must not break load (or why it may)
};

/// Close band of the coil voltage, fraction of the rated value.
inline constexpr double kCoilCloseMin = 0.85;
inline constexpr double kCoilCloseMax = 1.10;

ContactorResult rateContactor(const ContactorInput& in);

} // namespace amp::protection

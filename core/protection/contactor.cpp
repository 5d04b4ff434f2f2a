// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/protection/contactor.h"

#include "core/protection/inputcheck.h"
#include "core/protection/utilisationcategory.h"

#include <cstdio>

namespace amp::protection {

namespace {
std::string ms(double s) {
    char buf[48];
    std::snprintf(buf, sizeof buf, "%.3g ms", s * 1e3);
    return buf;
}
} // namespace

ContactorResult rateContactor(const ContactorInput& in) {
    ContactorResult r;
    InputCheck c;
    c.positive("continuousCurrent_A", in.continuousCurrent_A);
    c.nonNegative("motorRmsCurrent_A", in.motorRmsCurrent_A);
    c.range("requiredMargin", in.requiredMargin, 1.0, 10.0);
    c.positive("coilVoltage_V", in.coilVoltage_V);
    c.positive("coilResistance_ohm", in.coilResistance_ohm);
    c.nonNegative("appliedCoilMin_V", in.appliedCoilMin_V);
    c.nonNegative("appliedCoilMax_V", in.appliedCoilMax_V);
    c.nonNegative("contactResistance_ohm", in.contactResistance_ohm);
    if (in.contactsInPath < 1)
        c.add("contactsInPath", "must be 1 or more (got " + std::to_string(in.contactsInPath) + ")");
    c.nonNegative("electricalLife_ops", in.electricalLife_ops);
    c.nonNegative("mechanicalLife_ops", in.mechanicalLife_ops);
    c.nonNegative("reversalsPerDay", in.reversalsPerDay);
    c.positive("operationsPerReversal", in.operationsPerReversal);
    c.range("operatingDaysPerYear", in.operatingDaysPerYear, 0.0, 366.0, true);
    c.positive("armatureInductance_H", in.armatureInductance_H);
    c.positive("loopResistance_ohm", in.loopResistance_ohm);
    c.nonNegative("dcBreaking_A", in.dcBreaking_A);
    const auto category = dcUtilisationCategory(in.category);
    if (!in.category.empty() && !category)
        c.add("category", "must be empty, \"DC-1\", \"DC-3\" or \"DC-5\" (got \"" + in.category + "\")");
    r.problems = c.take();
    if (!r.problems.empty())
        return r;
    r.valid = true;

    const double irms = in.motorRmsCurrent_A;
    if (irms > 0.0) {
        r.continuousMargin = in.continuousCurrent_A / irms;
        r.continuousOk = *r.continuousMargin >= in.requiredMargin;
    } else {
        r.continuousOk = true;
    }

    const double uMin = in.appliedCoilMin_V > 0.0 ? in.appliedCoilMin_V : in.coilVoltage_V;
    const double uMax = in.appliedCoilMax_V > 0.0 ? in.appliedCoilMax_V : in.coilVoltage_V;
    r.coilCurrent_A = in.coilVoltage_V / in.coilResistance_ohm;
    r.coilPower_W = in.coilVoltage_V * in.coilVoltage_V / in.coilResistance_ohm;
    r.coilPowerMax_W = uMax * uMax / in.coilResistance_ohm;
    r.coilVoltageRatioMin = uMin / in.coilVoltage_V;
    r.coilVoltageRatioMax = uMax / in.coilVoltage_V;
    r.coilVoltageOk = r.coilVoltageRatioMin >= kCoilCloseMin && r.coilVoltageRatioMax <= kCoilCloseMax;

    r.contactLoss_W = in.contactsInPath * irms * irms * in.contactResistance_ohm;

    const double opsPerYear = in.reversalsPerDay * in.operationsPerReversal * in.operatingDaysPerYear;
    if (opsPerYear > 0.0 && in.electricalLife_ops > 0.0)
        r.electricalLife_years = in.electricalLife_ops / opsPerYear;
    if (opsPerYear > 0.0 && in.mechanicalLife_ops > 0.0)
        r.mechanicalLife_years = in.mechanicalLife_ops / opsPerYear;

    r.motorTimeConstant_s = in.armatureInductance_H / in.loopResistance_ohm;
    const double largest = largestCategoryTimeConstant_s();
    r.beyondCategories = r.motorTimeConstant_s > largest;
    const std::string tauText = "the motor's L/R is " + ms(r.motorTimeConstant_s);
    if (in.dcBreaking_A <= 0.0) {
        r.categoryTimeConstant_s = category ? category->timeConstant_s : largest;
        r.mustNotBreakLoad = true;
        r.reason = tauText + " and the contactor states no DC breaking capacity: it must never break "
                             "load current; the reversing sequence (PWM off, current decayed) guarantees it";
    } else if (category) {
        r.categoryTimeConstant_s = category->timeConstant_s;
        r.mustNotBreakLoad = r.motorTimeConstant_s > category->timeConstant_s;
        r.reason =
            tauText + ", the " + std::string(category->id) + " test circuit's " +
            ms(category->timeConstant_s) +
            (r.mustNotBreakLoad ? ": beyond the category, so the contactor must never break load "
                                  "current; the reversing sequence, not the contactor, guarantees it"
                                : ": within the category; breaking load is still avoided by the sequence");
    } else {
        r.categoryTimeConstant_s = largest;
        r.mustNotBreakLoad = r.beyondCategories;
        r.reason = tauText +
                   "; no utilisation category stated, compared with the most inductive test "
                   "circuit (DC-5 at 4·I_e, " +
                   ms(largest) + ")" +
                   (r.mustNotBreakLoad ? ": beyond it, so the contactor must never break load current; "
                                         "the reversing sequence, not the contactor, guarantees it"
                                       : "");
    }
    return r;
}

} // namespace amp::protection

// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/protection/fuse.h"

#include "core/protection/inputcheck.h"

namespace amp::protection {

FuseResult rateFuse(const FuseInput& in) {
    FuseResult r;
    InputCheck c;
    c.positive("maxBus_V", in.maxBus_V);
    c.positive("ratedVoltage_V", in.ratedVoltage_V);
    c.positive("ratedCurrent_A", in.ratedCurrent_A);
    c.nonNegative("rmsCurrent_A", in.rmsCurrent_A);
    c.range("requiredMargin", in.requiredMargin, 1.0, 10.0);
    c.nonNegative("breakingCapacity_A", in.breakingCapacity_A);
    c.nonNegative("batteryResistance_ohm", in.batteryResistance_ohm);
    c.nonNegative("cableResistance_ohm", in.cableResistance_ohm);
    c.nonNegative("clearingI2t_A2s", in.clearingI2t_A2s);
    c.nonNegative("bankWithstandI2t_A2s", in.bankWithstandI2t_A2s);
    c.nonNegative("cableArea_mm2", in.cableArea_mm2);
    c.positive("cableK", in.cableK);
    c.nonNegative("cableAmpacity_A", in.cableAmpacity_A);
    c.boundedFault(in.batteryResistance_ohm, in.cableResistance_ohm);
    r.problems = c.take();
    if (!r.problems.empty())
        return r;
    r.valid = true;
    using T = InputCheck;
    auto flag = [&](const char* field, const std::string& msg) { r.flags.push_back({field, msg}); };

    r.prospectiveShortCircuit_A = in.maxBus_V / (in.batteryResistance_ohm + in.cableResistance_ohm);

    r.voltageOk = in.ratedVoltage_V >= in.maxBus_V;
    if (!r.voltageOk)
        flag("ratedVoltage_V", "fuse DC voltage rating " + T::text(in.ratedVoltage_V) +
                                   " V is below the highest bus voltage " + T::text(in.maxBus_V) +
                                   " V: it may not clear a DC fault");

    if (in.rmsCurrent_A > 0.0) {
        r.continuousMargin = in.ratedCurrent_A / in.rmsCurrent_A;
        r.continuousOk = *r.continuousMargin >= in.requiredMargin;
    } else {
        r.continuousOk = true;
    }
    if (!r.continuousOk)
        flag("ratedCurrent_A", "fuse rating " + T::text(in.ratedCurrent_A) + " A is less than " +
                                   T::text(in.requiredMargin) + " × the RMS current " +
                                   T::text(in.rmsCurrent_A) + " A");

    if (in.cableAmpacity_A > 0.0) {
        r.protectsCable = in.ratedCurrent_A <= in.cableAmpacity_A;
        if (!*r.protectsCable)
            flag("ratedCurrent_A", "fuse rating " + T::text(in.ratedCurrent_A) +
                                       " A is above the cable's ampacity " + T::text(in.cableAmpacity_A) +
                                       " A: the cable can overheat without the fuse opening");
    }

    if (in.breakingCapacity_A > 0.0) {
        r.breakingOk = in.breakingCapacity_A >= r.prospectiveShortCircuit_A;
        if (!*r.breakingOk)
            flag("breakingCapacity_A", "breaking capacity " + T::text(in.breakingCapacity_A) +
                                           " A is below the prospective short-circuit current " +
                                           T::text(r.prospectiveShortCircuit_A) + " A");
    }

    r.cableWithstand_A2s = in.cableK * in.cableK * in.cableArea_mm2 * in.cableArea_mm2;
    if (in.clearingI2t_A2s > 0.0 && in.cableArea_mm2 > 0.0) {
        r.i2tCableOk = in.clearingI2t_A2s <= r.cableWithstand_A2s;
        if (!*r.i2tCableOk)
            flag("clearingI2t_A2s", "fuse clearing I²t " + T::text(in.clearingI2t_A2s) +
                                        " A²s exceeds the cable's withstand k²S² " +
                                        T::text(r.cableWithstand_A2s) + " A²s");
    }
    if (in.clearingI2t_A2s > 0.0 && in.bankWithstandI2t_A2s > 0.0) {
        r.i2tBankOk = in.clearingI2t_A2s <= in.bankWithstandI2t_A2s;
        if (!*r.i2tBankOk)
            flag("clearingI2t_A2s", "fuse clearing I²t " + T::text(in.clearingI2t_A2s) +
                                        " A²s exceeds the bank's withstand " +
                                        T::text(in.bankWithstandI2t_A2s) + " A²s");
    }
    r.placementCaution = "Fit the fuse at the battery terminal: the cable before it is unprotected, and a "
                         "battery short delivers about " +
                         T::text(r.prospectiveShortCircuit_A) + " A.";
    return r;
}

} // namespace amp::protection

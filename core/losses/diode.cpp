// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/losses/diode.h"

#include <algorithm>

namespace amp::losses {

double diodeThreshold(double vf0_V, double tempCoeff_VperK, double tj_C) {
    return std::max(0.0, vf0_V + tempCoeff_VperK * (tj_C - 25.0));
}

DiodeResult diodeLoss(const DiodeInput& in) {
    DiodeResult r;
    InputCheck c;
    if (in.count < 1)
        c.fail("count", "the number of diodes in parallel must be at least 1, got " + std::to_string(in.count));
    c.inRange("vf0_V", in.vf0_V, 0.0, 3.0, "the diode threshold voltage");
    c.nonNegative("rd_ohm", in.rd_ohm, "the diode slope resistance");
    c.inRange("vfTempCoeff_VperK", in.vfTempCoeff_VperK, -0.01, 0.01, "the forward-voltage temperature coefficient");
    c.inRange("tj_C", in.tj_C, -55.0, 250.0, "the diode junction temperature");
    c.nonNegative("averageCurrent_A", in.averageCurrent_A, "the average diode current");
    c.nonNegative("rmsCurrent_A", in.rmsCurrent_A, "the RMS diode current");
    c.nonNegative("recoveryCharge_As", in.recoveryCharge_As, "the recovery charge (Q_rr)");
    c.nonNegative("reverseVoltage_V", in.reverseVoltage_V, "the reverse voltage");
    c.nonNegative("frequency_Hz", in.frequency_Hz, "the switching frequency");
    // An RMS value below the average is impossible; allow rounding in the caller's sums.
    if (c.ok() && in.rmsCurrent_A < in.averageCurrent_A * (1.0 - 1e-9))
        c.fail("rmsCurrent_A", "the RMS diode current (" + num(in.rmsCurrent_A) +
                                   " A) cannot be below its average (" + num(in.averageCurrent_A) + " A)");
    if (!c.ok()) {
        r.problems = c.take();
        return r;
    }

    const double n = in.count;
    const double iAvg = in.averageCurrent_A / n;
    const double iRms = in.rmsCurrent_A / n;
    r.vf0AtTj_V = diodeThreshold(in.vf0_V, in.vfTempCoeff_VperK, in.tj_C);
    r.forwardVoltage_V = r.vf0AtTj_V + in.rd_ohm * iAvg;
    const double conductionEach = r.vf0AtTj_V * iAvg + in.rd_ohm * iRms * iRms;
    const double recoveryEach = 0.25 * in.recoveryCharge_As * in.reverseVoltage_V * in.frequency_Hz;
    r.conduction_W = n * conductionEach;
    r.recovery_W = n * recoveryEach;
    r.total_W = r.conduction_W + r.recovery_W;
    r.perDiode_W = conductionEach + recoveryEach;
    return r;
}

} // namespace amp::losses

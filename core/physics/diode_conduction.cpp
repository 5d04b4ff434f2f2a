// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/physics/diode_conduction.h"

#include <algorithm>

namespace amp {

double diodeThreshold(const DiodePart& diode, double tj_C) {
    return std::max(0.0, diode.vf0_V + diode.vfTempCoeff_VperK * (tj_C - 25.0));
}

double diodeForwardVoltage(const DiodePart& diode, double current_A, double tj_C) {
    return diodeThreshold(diode, tj_C) + diode.rd_ohm * current_A;
}

double diodeConductionLoss(const DiodePart& diode, int count, double average_A, double rms_A, double tj_C) {
    const int n = std::max(1, count);
    return diodeThreshold(diode, tj_C) * average_A + diode.rd_ohm / n * rms_A * rms_A;
}

} // namespace amp

// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/losses/seriesmotor.h"

#include <cmath>

namespace amp::losses {

double torqueConstantAt(const std::vector<MagnetisationPoint>& table, double current_A) {
    if (table.empty())
        return 0.0;
    if (current_A <= table.front().current_A)
        return table.front().torqueConstant_NmPerA;
    for (std::size_t k = 1; k < table.size(); ++k) {
        const MagnetisationPoint& a = table[k - 1];
        const MagnetisationPoint& b = table[k];
        if (current_A <= b.current_A) {
            const double u = (current_A - a.current_A) / (b.current_A - a.current_A);
            return a.torqueConstant_NmPerA + u * (b.torqueConstant_NmPerA - a.torqueConstant_NmPerA);
        }
    }
    return table.back().torqueConstant_NmPerA;
}

SeriesMotorResult seriesMotor(const SeriesMotorInput& in) {
    SeriesMotorResult r;
    InputCheck c;
    if (in.magnetisation.empty())
        c.fail("magnetisation", "a series-wound motor needs a magnetisation table (at least one point)");
    for (std::size_t k = 0; k < in.magnetisation.size(); ++k) {
        const std::string at = "magnetisation[" + std::to_string(k) + "]";
        c.nonNegative(at + ".current_A", in.magnetisation[k].current_A, "the table current");
        c.positive(at + ".torqueConstant_NmPerA", in.magnetisation[k].torqueConstant_NmPerA, "the torque constant");
        if (k > 0 && !(in.magnetisation[k].current_A > in.magnetisation[k - 1].current_A))
            c.fail(at + ".current_A", "the table's currents must rise strictly from one point to the next");
    }
    c.nonNegative("resistance_ohm", in.resistance_ohm, "the motor resistance");
    c.nonNegative("noLoadCurrent_A", in.noLoadCurrent_A, "the no-load current");
    c.nonNegative("speed_radps", in.speed_radps, "the speed");
    if (in.mode == "torqueSpeed")
        c.nonNegative("torque_Nm", in.torque_Nm, "the torque");
    else if (in.mode == "currentSpeed")
        c.nonNegative("current_A", in.current_A, "the current");
    else
        c.fail("mode", "the mode must be \"torqueSpeed\" or \"currentSpeed\", got \"" + in.mode + "\"");
    if (!c.ok()) {
        r.problems = c.take();
        return r;
    }

    const auto& table = in.magnetisation;
    auto torqueAt = [&](double i) { return torqueConstantAt(table, i) * (i - in.noLoadCurrent_A); };
    double current = in.current_A;
    if (in.mode == "torqueSpeed") {
        double lo = in.noLoadCurrent_A, hi = in.noLoadCurrent_A + 1.0;
        while (torqueAt(hi) < in.torque_Nm && hi < 1e7)
            hi *= 2.0;
        for (int it = 0; it < 200 && hi - lo > 1e-12 * hi; ++it) {
            const double mid = 0.5 * (lo + hi);
            (torqueAt(mid) < in.torque_Nm ? lo : hi) = mid;
        }
        current = 0.5 * (lo + hi);
    }
    r.current_A = current;
    r.torqueConstant_NmPerA = torqueConstantAt(table, current);
    r.backEmf_V = r.torqueConstant_NmPerA * in.speed_radps;
    r.torque_Nm = r.torqueConstant_NmPerA * (current - in.noLoadCurrent_A);
    r.terminalVoltage_V = r.backEmf_V + current * in.resistance_ohm;
    return r;
}

} // namespace amp::losses

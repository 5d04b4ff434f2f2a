// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/physics/motor.h"

#include "core/physics/copper.h"
#include "core/physics/numerics.h"

#include <algorithm>
#include <cmath>
#include <utility>

namespace amp {

MotorModel makeMotorModel(const Motor& motor) {
    MotorModel m;
    m.armatureResistance_ohm = copper::resistanceAt(std::max(0.0, motor.armatureResistance20_ohm),
                                                    motor.windingTemperature_C);
    m.torqueConstant_NmPerA = std::max(0.0, motor.torqueConstant_NmPerA);
    m.noLoadCurrent_A = std::max(0.0, motor.noLoadCurrent_A);
    m.seriesWound = motor.kind == "seriesWound" && !motor.magnetisation.empty();
    if (m.seriesWound) {
        m.magnetisation = motor.magnetisation;
        std::sort(m.magnetisation.begin(), m.magnetisation.end(),
                  [](const auto& a, const auto& b) { return a.current_A < b.current_A; });
    }
    return m;
}

double torqueConstant(const MotorModel& motor, double current_A) {
    if (!motor.seriesWound)
        return motor.torqueConstant_NmPerA;
    std::vector<std::pair<double, double>> table;
    table.reserve(motor.magnetisation.size());
    for (const auto& p : motor.magnetisation)
        table.emplace_back(p.current_A, p.torqueConstant_NmPerA);
    return std::max(0.0, numerics::interpolate(table, current_A, false, 0.0));
}

double shaftTorque(const MotorModel& motor, double current_A) {
    return torqueConstant(motor, current_A) * (current_A - motor.noLoadCurrent_A);
}

double currentForTorque(const MotorModel& motor, double torque_Nm) {
    const double i0 = motor.noLoadCurrent_A;
    if (!(torque_Nm > 0.0))
        return i0;
    if (!motor.seriesWound) {
        const double k = motor.torqueConstant_NmPerA;
        return k > 0.0 ? torque_Nm / k + i0 : i0;
    }
    // Series wound: bracket the root by doubling, then Brent.
    auto f = [&](double i) { return shaftTorque(motor, i) - torque_Nm; };
    double hi = std::max(2.0 * i0, 1.0);
    for (int n = 0; n < 60 && f(hi) < 0.0; ++n)
        hi *= 2.0;
    const auto root = numerics::findRoot(f, i0, hi, 1e-9);
    return root.value_or(hi);
}

double backEmf(const MotorModel& motor, double current_A, double speed_radps) {
    return torqueConstant(motor, current_A) * speed_radps;
}

double speedForBackEmf(const MotorModel& motor, double current_A, double emf_V) {
    const double k = torqueConstant(motor, current_A);
    return (k > 0.0 && emf_V > 0.0) ? emf_V / k : 0.0;
}

MotorPower motorPower(const MotorModel& motor, double averageCurrent_A, double rmsCurrent_A, double speed_radps) {
    MotorPower p;
    const double k = torqueConstant(motor, averageCurrent_A);
    p.torque_Nm = k * (averageCurrent_A - motor.noLoadCurrent_A);
    p.mechanical_W = p.torque_Nm * speed_radps;
    p.noLoadLoss_W = k * motor.noLoadCurrent_A * speed_radps;
    p.copperLoss_W = rmsCurrent_A * rmsCurrent_A * motor.armatureResistance_ohm;
    p.input_W = k * speed_radps * averageCurrent_A + p.copperLoss_W;
    return p;
}

} // namespace amp

// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/losses/capacitors.h"

#include <algorithm>
#include <cmath>
#include <numbers>

namespace amp::losses {

CapacitorResult busCapacitors(const CapacitorInput& in) {
    CapacitorResult r;
    InputCheck c;
    c.nonNegative("rmsCurrent_A", in.rmsCurrent_A, "the capacitor RMS current");
    c.nonNegative("rippleFrequency_Hz", in.rippleFrequency_Hz, "the ripple frequency");
    c.nonNegative("batteryLoopInductance_H", in.batteryLoopInductance_H, "the battery-loop inductance");
    c.positive("maxBusVoltage_V", in.maxBusVoltage_V, "the highest bus voltage");
    c.positive("ratedVoltage_V", in.ratedVoltage_V, "the capacitor voltage rating");
    c.inRange("voltageDerating", in.voltageDerating, 0.05, 1.0, "the capacitor voltage derating");
    c.positive("rippleRating_A", in.rippleRating_A, "the capacitor ripple-current rating");
    c.nonNegative("esr_ohm", in.esr_ohm, "the capacitor ESR");
    c.positive("capacitance_F", in.capacitance_F, "the capacitance per capacitor");
    c.nonNegative("totalCapacitance_F", in.totalCapacitance_F, "the total bus capacitance");
    if (in.count < 0)
        c.fail("count", "the number of capacitors must not be negative, got " + std::to_string(in.count));
    c.nonNegative("thermalResistance_KperW", in.thermalResistance_KperW, "the capacitor thermal resistance");
    c.inRange("ambient_C", in.ambient_C, -55.0, 150.0, "the ambient temperature");
    c.inRange("maxTemperature_C", in.maxTemperature_C, 0.0, 200.0, "the capacitor's rated temperature");
    if (!c.ok()) {
        r.problems = c.take();
        return r;
    }

    // First the count for the ripple with the cable ignored, then the divider with that bank.
    auto countFor = [&](double rms) { return std::max(1, static_cast<int>(std::ceil(rms / in.rippleRating_A - 1e-12))); };
    int n = in.count > 0 ? in.count : countFor(in.rmsCurrent_A);
    double share = 1.0;
    const bool cable = in.batteryLoopInductance_H > 0.0 && in.rippleFrequency_Hz > 0.0;
    for (int pass = 0; pass < 4; ++pass) { // the share depends on the count; settles in a step or two
        share = 1.0;
        if (cable) {
            const double capTotal = in.totalCapacitance_F > 0.0 ? in.totalCapacitance_F : n * in.capacitance_F;
            const double x = std::pow(2.0 * std::numbers::pi * in.rippleFrequency_Hz, 2) * in.batteryLoopInductance_H * capTotal;
            share = std::abs(x - 1.0) > 1e-6 ? std::abs(x / (x - 1.0)) : 1e6;
        }
        if (in.count > 0)
            break;
        const int needed = countFor(share * in.rmsCurrent_A);
        if (needed == n)
            break;
        n = needed;
    }
    const double capTotal = in.totalCapacitance_F > 0.0 ? in.totalCapacitance_F : n * in.capacitance_F;
    if (in.batteryLoopInductance_H > 0.0)
        r.resonance_Hz = 1.0 / (2.0 * std::numbers::pi * std::sqrt(in.batteryLoopInductance_H * capTotal));
    r.cableShare = share;
    r.capacitorRms_A = share * in.rmsCurrent_A;
    r.requiredForRipple = countFor(r.capacitorRms_A);
    r.count = n;
    r.perCapacitorRms_A = r.capacitorRms_A / n;
    r.perCapacitorLoss_W = r.perCapacitorRms_A * r.perCapacitorRms_A * in.esr_ohm;
    r.esrLoss_W = n * r.perCapacitorLoss_W;
    r.temperatureRise_K = r.perCapacitorLoss_W * in.thermalResistance_KperW;
    r.hotSpot_C = in.ambient_C + r.temperatureRise_K;

    r.ripple = {true, r.perCapacitorRms_A > in.rippleRating_A, r.perCapacitorRms_A, in.rippleRating_A, {}};
    if (r.ripple.failed && in.messages)
        r.ripple.message = "each of the " + std::to_string(n) + " capacitors carries " + num(r.perCapacitorRms_A) +
                           " A RMS, above its " + num(in.rippleRating_A) + " A rating; " +
                           std::to_string(r.requiredForRipple) + " are needed";
    const double allowed = in.voltageDerating * in.ratedVoltage_V;
    r.voltage = {true, in.maxBusVoltage_V > allowed, in.maxBusVoltage_V, allowed, {}};
    if (r.voltage.failed && in.messages)
        r.voltage.message = "the highest bus voltage " + num(in.maxBusVoltage_V) + " V exceeds " +
                            num(in.voltageDerating * 100.0) + " % of the " + num(in.ratedVoltage_V) +
                            " V capacitor rating (" + num(allowed) + " V)";
    r.temperature = {true, r.hotSpot_C > in.maxTemperature_C, r.hotSpot_C, in.maxTemperature_C, {}};
    if (r.temperature.failed && in.messages)
        r.temperature.message = "the capacitors' hot spot reaches " + num(r.hotSpot_C) + " °C, above their " +
                                num(in.maxTemperature_C) + " °C rating";
    r.decoupling.rated = cable;
    r.decoupling.value = in.rippleFrequency_Hz;
    r.decoupling.limit = 2.0 * r.resonance_Hz;
    r.decoupling.failed = cable && in.rippleFrequency_Hz <= 2.0 * r.resonance_Hz;
    if (r.decoupling.failed && in.messages)
        r.decoupling.message = "the ripple frequency " + num(in.rippleFrequency_Hz) + " Hz is not well above the " +
                               num(r.resonance_Hz) + " Hz resonance of the battery cable with the capacitors: "
                               "the cable carries ripple and the capacitors ring";
    return r;
}

} // namespace amp::losses

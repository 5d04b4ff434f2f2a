// SPDX-License-Identifier: GPL-3.0-or-later
#include "support/randomdesign.h"

#include "core/model/design_json.h"
#include "core/model/fields.h"

#include <nlohmann/json.hpp>

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <string>

namespace amp::test {

namespace {

using nlohmann::json;
using Type = FieldSpec::Type;

double uniform(std::mt19937_64& rng, double a, double b) { return std::uniform_real_distribution<double>(a, b)(rng); }
bool chance(std::mt19937_64& rng, double p) { return uniform(rng, 0.0, 1.0) < p; }
int integer(std::mt19937_64& rng, int a, int b) { return std::uniform_int_distribution<int>(a, b)(rng); }

template <class T>
const T& pick(std::mt19937_64& rng, const std::vector<T>& v) {
    return v[static_cast<std::size_t>(integer(rng, 0, static_cast<int>(v.size()) - 1))];
}

bool isTemperature(const FieldSpec& f) { return f.unit == units::Unit::Celsius; }

/// Anywhere in [lo, hi]: log-uniform when the range spans decades above zero, with an exact
/// zero now and then where zero is allowed ("0 = none" is a case of its own).
double wideValue(std::mt19937_64& rng, const FieldSpec& f) {
    const double lo = f.min, hi = f.max;
    if (isTemperature(f) || lo < 0.0)
        return uniform(rng, lo, hi);
    if (lo == 0.0) {
        if (chance(rng, 0.1) && !f.minExclusive)
            return 0.0;
        const double floor = hi * 1e-6;
        return std::exp(uniform(rng, std::log(floor), std::log(hi)));
    }
    if (hi / lo > 100.0)
        return std::exp(uniform(rng, std::log(lo), std::log(hi)));
    return uniform(rng, lo, hi);
}

/// Near `v`: ×[1/3, 3] for magnitudes, ±30 K for temperatures; clipped into the range.
double typicalValue(std::mt19937_64& rng, const FieldSpec& f, double v) {
    double x = v;
    if (isTemperature(f))
        x = v + uniform(rng, -30.0, 30.0);
    else if (v != 0.0)
        x = v * std::exp(uniform(rng, -std::log(3.0), std::log(3.0)));
    x = std::clamp(x, f.min, f.max);
    if (f.minExclusive && x <= f.min)
        x = f.min + (f.max - f.min) * 1e-3;
    return x;
}

json::json_pointer pointer(const std::string& dotted) {
    std::string p;
    std::size_t i = 0;
    while (i <= dotted.size()) {
        const auto dot = dotted.find('.', i);
        p += "/" + dotted.substr(i, dot == std::string::npos ? std::string::npos : dot - i);
        if (dot == std::string::npos)
            break;
        i = dot + 1;
    }
    return json::json_pointer(p);
}

/// Draw every scalar field of the table that sits below one of `prefixes` (lists are drawn apart).
void drawScalars(std::mt19937_64& rng, json& j, bool wide, const std::vector<std::string>& skip) {
    for (const FieldSpec& f : designFields()) {
        if (f.path.find("[]") != std::string::npos || f.type == Type::List || f.type == Type::Text)
            continue;
        if (std::any_of(skip.begin(), skip.end(), [&](const std::string& s) { return f.path.rfind(s, 0) == 0; }))
            continue;
        const auto ptr = pointer(f.path);
        if (!j.contains(ptr))
            continue;
        json& v = j[ptr];
        switch (f.type) {
        case Type::Number:
            v = wide ? wideValue(rng, f) : typicalValue(rng, f, v.get<double>());
            break;
        case Type::Integer:
            break; // counts are drawn on their own below
        case Type::Boolean:
            v = chance(rng, 0.5);
            break;
        case Type::Choice:
            if (wide || chance(rng, 0.3))
                v = pick(rng, f.choices);
            break;
        default:
            break;
        }
    }
}

const FieldSpec& spec(const std::string& path) {
    const FieldSpec* f = findField(path);
    if (f == nullptr)
        std::abort(); // the generator names a field the table does not know: fix the generator
    return *f;
}

double draw(std::mt19937_64& rng, const std::string& path, bool wide, double typicalLo, double typicalHi) {
    const FieldSpec& f = spec(path);
    if (wide)
        return wideValue(rng, f);
    return std::clamp(uniform(rng, typicalLo, typicalHi), f.min, f.max);
}

Segment randomSegment(std::mt19937_64& rng, const Design& d, bool wide, int index) {
    Segment s;
    s.name = "Segment " + std::to_string(index + 1);
    s.mode = pick(rng, spec("dutyProfile[].mode").choices);
    s.direction = pick(rng, spec("dutyProfile[].direction").choices);
    s.duration_s = wide ? wideValue(rng, spec("dutyProfile[].duration_s"))
                        : std::exp(uniform(rng, std::log(1.0), std::log(3600.0)));
    // Typical requests mostly within reach, some beyond it (the engine reports those): currents
    // up to 1.2 × the limit (or 400 A without one), torque from k·I, speeds up to the no-load
    // speed at the nominal voltage, n0 = V/k (in rad/s).
    const double iTop = d.pwm.currentLimit_A > 0.0 ? 1.2 * d.pwm.currentLimit_A : 400.0;
    const double k = d.motor.kind == "seriesWound" && !d.motor.magnetisation.empty()
                         ? d.motor.magnetisation.back().torqueConstant_NmPerA
                         : d.motor.torqueConstant_NmPerA;
    const double n0_rpm = d.supply.nominal_V / k * 60.0 / (2.0 * 3.141592653589793);
    s.motorCurrent_A = draw(rng, "dutyProfile[].motorCurrent_A", wide, 0.0, iTop);
    // The table allows a braking (negative) torque, but evaluate() refuses it until a topology
    // that returns energy is modelled: draw driving torques only (see randomdesign.h).
    s.torque_Nm = std::abs(draw(rng, "dutyProfile[].torque_Nm", wide, 0.0, k * iTop));
    s.speed_rpm = draw(rng, "dutyProfile[].speed_rpm", wide, 0.0, n0_rpm);
    s.duty = draw(rng, "dutyProfile[].duty", wide, 0.0, 1.0);
    return s;
}

BankDevice randomDevice(std::mt19937_64& rng, bool wide) {
    BankDevice b;
    auto normal = [&](double sigma) { return std::normal_distribution<double>(0.0, sigma)(rng); };
    auto clip = [&](const char* path, double v) { const FieldSpec& f = spec(path); return std::clamp(v, f.min, f.max); };
    if (wide) {
        b.rdsOnDeviation = wideValue(rng, spec("bank.devices[].rdsOnDeviation"));
        b.vthDeviation_V = wideValue(rng, spec("bank.devices[].vthDeviation_V"));
        b.vbeDeviation_V = wideValue(rng, spec("bank.devices[].vbeDeviation_V"));
        b.betaDeviation = wideValue(rng, spec("bank.devices[].betaDeviation"));
        b.gateResistorDeviation_ohm = wideValue(rng, spec("bank.devices[].gateResistorDeviation_ohm"));
        b.ballastDeviation_ohm = wideValue(rng, spec("bank.devices[].ballastDeviation_ohm"));
        b.legResistanceDeviation_ohm = wideValue(rng, spec("bank.devices[].legResistanceDeviation_ohm"));
    } else {
        b.rdsOnDeviation = clip("bank.devices[].rdsOnDeviation", normal(0.1));
        b.vthDeviation_V = clip("bank.devices[].vthDeviation_V", normal(0.2));
        b.vbeDeviation_V = clip("bank.devices[].vbeDeviation_V", normal(0.015));
        b.betaDeviation = clip("bank.devices[].betaDeviation", normal(0.2));
        b.gateResistorDeviation_ohm = clip("bank.devices[].gateResistorDeviation_ohm", normal(0.2));
        b.ballastDeviation_ohm = clip("bank.devices[].ballastDeviation_ohm", normal(0.005));
        b.legResistanceDeviation_ohm = clip("bank.devices[].legResistanceDeviation_ohm", normal(5e-5));
    }
    return b;
}

/// Make the cross-field rules of validateDesign() hold, keeping every value in its range.
void repair(Design& d) {
    auto sort3 = [](double& a, double& b, double& c) {
        if (a > b) std::swap(a, b);
        if (b > c) std::swap(b, c);
        if (a > b) std::swap(a, b);
    };
    sort3(d.supply.min_V, d.supply.nominal_V, d.supply.max_V);
    // supply.min_V may go down to 0.1 V, the others only to 1 V.
    d.supply.nominal_V = std::max(d.supply.nominal_V, spec("supply.nominal_V").min);
    d.supply.max_V = std::max(d.supply.max_V, d.supply.nominal_V);
    d.supply.min_V = std::min(d.supply.min_V, d.supply.nominal_V);
    if (d.drive.minSupply_V > d.drive.supply_V)
        std::swap(d.drive.minSupply_V, d.drive.supply_V);

    for (auto& s : d.dutyProfile)
        s.duty = std::min(s.duty, d.pwm.maxDuty);
    d.pwm.deadTime_s = std::min(d.pwm.deadTime_s, 0.25 / d.pwm.frequency_Hz);
    if (d.pwm.topology == "lowSideChopper")
        d.bank.diodeCount = std::max(d.bank.diodeCount, 1);

    auto& m = d.bank.device.mosfet;
    const double qMax = spec("bank.device.mosfet.qg_As").max;
    if (m.qgs_As + m.qgd_As > qMax) {
        const double f = 0.99 * qMax / (m.qgs_As + m.qgd_As);
        m.qgs_As *= f;
        m.qgd_As *= f;
    }
    m.qgs2_As = std::min(m.qgs2_As, m.qgs_As);
    m.qg_As = std::max(m.qg_As, m.qgs_As + m.qgd_As);
    if (m.plateau_V <= m.vth_V)
        m.plateau_V = std::min(spec("bank.device.mosfet.plateau_V").max, 1.5 * m.vth_V + 0.5);
    // Some resistance in every gate path (validateDesign): the die's own, 1 Ω (common practice).
    if (d.bank.device.kind == "mosfet" && d.drive.driverResistance_ohm <= 0.0 && m.rgInternal_ohm <= 0.0)
        m.rgInternal_ohm = 1.0;

    // Conductor pairs do not overlap: centre spacing at least the diameter (2r); the layout
    // fields reach 1 m, and a 1000 mm² conductor is 35.7 mm across.
    auto& lay = d.layout;
    if (lay.loopSpacing_m < 2.0 * lay.loopConductorRadius_m)
        lay.loopSpacing_m = std::min(spec("layout.loopSpacing_m").max, 2.5 * lay.loopConductorRadius_m);
    const double cableDiameter_m = 2.0 * std::sqrt(d.wiring.batteryCable_mm2 * 1e-6 / 3.141592653589793);
    if (lay.batteryCableSpacing_m < cableDiameter_m)
        lay.batteryCableSpacing_m = std::min(spec("layout.batteryCableSpacing_m").max, 1.5 * cableDiameter_m);

    d.heatsink.ambient_C = std::min(d.heatsink.ambient_C, d.bank.device.tjMax_C - 10.0);
    if (d.bank.interface.insulating && d.bank.interface.dielectricStrength_Vperm <= 0.0)
        d.bank.interface.dielectricStrength_Vperm = 20e6; // silicone pads ≈ 10–20 kV/mm (fields.cpp)
}

} // namespace

RandomDesign randomDesign(std::mt19937_64& rng, const PartsLibrary& parts) {
    RandomDesign out;
    out.wide = chance(rng, 1.0 / 3.0);
    const bool wide = out.wide;

    Design d;
    d.meta.title = "Random design";
    d.bank.device = pick(rng, parts.switches);
    d.bank.freewheelDiode = pick(rng, parts.diodes);
    d.bank.interface = pick(rng, parts.interfaces);
    d.heatsink.part = pick(rng, parts.heatsinks);
    d.reversing.contactor = pick(rng, parts.contactors);

    json j = d;
    // Keep the switch kind of the chosen part unless the design is wide: a MOSFET part's
    // bipolar parameters are only defaults.
    std::vector<std::string> skip = {"meta."};
    if (!wide)
        skip.push_back("bank.device.kind");
    drawScalars(rng, j, wide, skip);
    d = j.get<Design>();

    d.bank.count = wide ? integer(rng, 1, 64) : integer(rng, 1, 16);
    // At least one freewheel diode: evaluate() computes every topology as a low-side chopper for
    // now and refuses a bank without one, which the table allows for synchronous topologies.
    d.bank.diodeCount = wide ? integer(rng, 1, 64) : integer(rng, 1, 6);
    // Monte Carlo work grows with the samples; the range's top (1e6) is a speed question for the
    // benchmark, not a property of one evaluation.
    d.bank.spread.samples = integer(rng, 1, 2000);
    d.bank.spread.seed = integer(rng, 0, 1 << 30);
    d.bank.devices.clear();
    for (int k = 0; k < d.bank.count; ++k)
        d.bank.devices.push_back(randomDevice(rng, wide));

    if (d.motor.kind == "seriesWound") {
        // k(I) rising then saturating, ascending currents.
        const int points = integer(rng, 2, 8);
        double current = 0.0;
        const double kTop = d.motor.torqueConstant_NmPerA;
        const double iSat = wide ? wideValue(rng, spec("motor.magnetisation[].current_A")) / points
                                 : uniform(rng, 20.0, 150.0);
        for (int i = 0; i < points; ++i) {
            current += iSat * uniform(rng, 0.2, 1.0);
            const double k = std::max(1e-4, kTop * (1.0 - std::exp(-current / iSat)));
            d.motor.magnetisation.push_back({std::min(current, spec("motor.magnetisation[].current_A").max),
                                             std::min(k, spec("motor.magnetisation[].torqueConstant_NmPerA").max)});
        }
        // Keep strictly ascending after the clip to the range's top.
        for (std::size_t i = 1; i < d.motor.magnetisation.size(); ++i)
            if (!(d.motor.magnetisation[i].current_A > d.motor.magnetisation[i - 1].current_A))
                d.motor.magnetisation.resize(i);
        if (d.motor.magnetisation.size() < 2)
            d.motor.magnetisation = {{1.0, kTop * 0.5}, {2.0, kTop}};
    }

    const int segments = wide ? integer(rng, 1, 12) : integer(rng, 1, 6);
    for (int i = 0; i < segments; ++i)
        d.dutyProfile.push_back(randomSegment(rng, d, wide, i));

    repair(d);
    out.problems = checkDesign(d);
    out.design = std::move(d);
    return out;
}

int propertyCases(const char* envName, int normal, int sanitized) {
    if (const char* env = std::getenv(envName); env != nullptr && *env != '\0') {
        const int n = std::atoi(env);
        if (n > 0)
            return n;
    }
#ifdef AMPWRIGHT_SANITIZED
    (void)normal;
    return sanitized;
#else
    (void)sanitized;
    return normal;
#endif
}

} // namespace amp::test

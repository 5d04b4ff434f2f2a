// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/physics/chopper.h"

#include "core/physics/numerics.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <limits>

namespace amp {

const char* toString(ConductionMode mode) {
    switch (mode) {
    case ConductionMode::Continuous: return "continuous";
    case ConductionMode::Discontinuous: return "discontinuous";
    case ConductionMode::NoCurrent: return "none";
    }
    return "none";
}

TriangularCurrents triangularCurrents(double average_A, double ripple_A, double duty) {
    TriangularCurrents t;
    const double d = std::clamp(duty, 0.0, 1.0);
    const double meanSquare = average_A * average_A + ripple_A * ripple_A / 12.0;
    t.switchAverage_A = d * average_A;
    t.switchRms_A = std::sqrt(d * meanSquare);
    t.diodeAverage_A = (1.0 - d) * average_A;
    t.diodeRms_A = std::sqrt((1.0 - d) * meanSquare);
    t.capacitorRms_A = std::sqrt(std::max(0.0, t.switchRms_A * t.switchRms_A - t.switchAverage_A * t.switchAverage_A));
    return t;
}

double linearRipple(double voltage_V, double duty, double inductance_H, double frequency_Hz) {
    if (!(inductance_H > 0.0) || !(frequency_Hz > 0.0))
        return 0.0;
    return voltage_V * duty * (1.0 - duty) / (inductance_H * frequency_Hz);
}

namespace {

// (1 − e^(−x))/x, 1 at x = 0, without cancellation for small x.
double oneMinusExpOverX(double x) { return x > 1e-12 ? -std::expm1(-x) / x : 1.0 - 0.5 * x; }

// One conduction phase: L·di/dt = V − R·i from i0 for a time t.
struct Phase {
    double i0 = 0.0;
    double source_V = 0.0;
    double r_ohm = 0.0;
    double l_H = 1.0;
    double t_s = 0.0;

    double current(double s) const {
        const double x = r_ohm * s / l_H;
        return i0 * std::exp(-x) + source_V / l_H * s * oneMinusExpOverX(x);
    }
};

struct PhaseIntegrals {
    double end = 0.0;       // i(t)
    double integral = 0.0;  // ∫ i ds
    double square = 0.0;    // ∫ i² ds
};

PhaseIntegrals integrate(const Phase& p) {
    PhaseIntegrals r;
    r.end = p.current(p.t_s);
    if (p.t_s <= 0.0)
        return r;
    const double x = p.r_ohm * p.t_s / p.l_H;
    if (x > 1.0) {
        // Closed form; no cancellation when x > 1.
        const double c = p.source_V / p.r_ohm;
        const double d = p.i0 - c;
        const double tau = p.l_H / p.r_ohm;
        const double e1 = -std::expm1(-x);
        const double e2 = -std::expm1(-2.0 * x);
        r.integral = c * p.t_s + d * tau * e1;
        r.square = c * c * p.t_s + 2.0 * c * d * tau * e1 + d * d * 0.5 * tau * e2;
        return r;
    }
    // Small x: 10-point Gauss–Legendre on the smooth exponential is exact to rounding
    // (the error term scales with x^20/20!).
    static constexpr std::array<double, 5> nodes{0.1488743389816312, 0.4333953941292472, 0.6794095682990244,
                                                 0.8650633666889845, 0.9739065285171717};
    static constexpr std::array<double, 5> weights{0.2955242247147529, 0.2692667193099963, 0.2190863625159820,
                                                   0.1494513491505806, 0.0666713443086881};
    const double half = 0.5 * p.t_s;
    for (std::size_t k = 0; k < nodes.size(); ++k) {
        for (const double sign : {-1.0, 1.0}) {
            const double i = p.current(half * (1.0 + sign * nodes[k]));
            r.integral += weights[k] * i;
            r.square += weights[k] * i * i;
        }
    }
    r.integral *= half;
    r.square *= half;
    return r;
}

// Time for the off-phase current to fall from i0 > 0 to zero under a source V < 0.
double extinctionTime(double i0, double source_V, double r_ohm, double l_H) {
    const double drive = -source_V;
    if (!(drive > 0.0))
        return std::numeric_limits<double>::infinity();
    const double y = i0 * r_ohm / drive;
    const double linear = i0 * l_H / drive;
    return y > 1e-12 ? linear * std::log1p(y) / y : linear;
}

} // namespace

ChopperWaveform chopperWaveform(const ChopperCircuit& c, double duty) {
    ChopperWaveform w;
    w.duty = std::clamp(std::isfinite(duty) ? duty : 0.0, 0.0, 1.0);
    if (!(c.frequency_Hz > 0.0) || !(c.inductance_H > 0.0)) {
        w.valid = false;
        w.problem = "the PWM frequency and the motor inductance must be positive";
        return w;
    }
    const double period = 1.0 / c.frequency_Hz;
    const double tOn = w.duty * period;
    const double tOff = period - tOn;
    const double rOn = std::max(0.0, c.loadResistance_ohm) + std::max(0.0, c.switchResistance_ohm);
    const double rOff = std::max(0.0, c.loadResistance_ohm) + std::max(0.0, c.diodeResistance_ohm);
    const double vOn = c.busVoltage_V - c.switchDrop_V - c.backEmf_V;
    const double vOff = -(std::max(0.0, c.diodeDrop_V) + c.backEmf_V);

    Phase on{0.0, vOn, rOn, c.inductance_H, tOn};
    Phase off{0.0, vOff, rOff, c.inductance_H, tOff};
    const double xOn = rOn * tOn / c.inductance_H;
    const double xOff = rOff * tOff / c.inductance_H;
    const double a1 = on.current(tOn);   // on-phase response from zero current
    const double b1 = off.current(tOff); // off-phase response from zero current
    const double oneMinusAB = -std::expm1(-(xOn + xOff));

    PhaseIntegrals onI, offI;
    if (tOn <= 0.0 || a1 <= 0.0) {
        // No forward drive (duty 0, or the back-EMF at or above the bus): no current.
        w.mode = ConductionMode::NoCurrent;
        w.linear = triangularCurrents(0.0, 0.0, w.duty);
        return w;
    }
    bool continuous = false;
    double iMax = 0.0, iMin = 0.0;
    if (oneMinusAB > 1e-14) {
        iMax = (a1 + std::exp(-xOn) * b1) / oneMinusAB;
        iMin = std::exp(-xOff) * iMax + b1;
        continuous = iMin > 0.0;
    } else if (vOff >= 0.0) {
        // No resistance anywhere and nothing to bring the current down: it grows without bound.
        w.valid = false;
        w.problem = "no steady state: the motor circuit has no resistance and nothing opposes the current";
        return w;
    }

    if (continuous) {
        w.mode = ConductionMode::Continuous;
        on.i0 = iMin;
        off.i0 = iMax;
        onI = integrate(on);
        offI = integrate(off);
        w.iMin_A = iMin;
        w.iMax_A = iMax;
        w.diodeConduction_s = tOff;
    } else {
        w.mode = ConductionMode::Discontinuous;
        on.i0 = 0.0;
        onI = integrate(on);
        const double peak = onI.end;
        off.i0 = peak;
        const double tx = extinctionTime(peak, vOff, rOff, c.inductance_H);
        if (tx > tOff * (1.0 + 1e-9)) {
            // Only reachable without resistance: the off-time cannot bring the current back to zero.
            w.valid = false;
            w.problem = "no steady state: the motor circuit has no resistance and the current grows every period";
            return w;
        }
        off.t_s = std::min(tOff, tx);
        offI = integrate(off);
        w.iMin_A = 0.0;
        w.iMax_A = peak;
        w.diodeConduction_s = off.t_s;
    }

    w.ripplePeakToPeak_A = w.iMax_A - w.iMin_A;
    w.switchAverage_A = onI.integral / period;
    w.switchRms_A = std::sqrt(std::max(0.0, onI.square / period));
    w.diodeAverage_A = offI.integral / period;
    w.diodeRms_A = std::sqrt(std::max(0.0, offI.square / period));
    w.motorAverage_A = w.switchAverage_A + w.diodeAverage_A;
    w.motorRms_A = std::sqrt(std::max(0.0, (onI.square + offI.square) / period));
    w.capacitorRms_A = std::sqrt(std::max(0.0, w.switchRms_A * w.switchRms_A - w.switchAverage_A * w.switchAverage_A));
    w.rippleLinear_A = std::max(0.0, (vOn - rOn * w.motorAverage_A) * w.duty / (c.inductance_H * c.frequency_Hz));
    w.linear = triangularCurrents(w.motorAverage_A, w.rippleLinear_A, w.duty);
    return w;
}

ChopperSolution chopperAtDuty(const ChopperCircuit& circuit, const ChopperSupply& supply, double duty) {
    ChopperSolution s;
    ChopperCircuit c = circuit;
    const double v = std::max(0.0, supply.voltage_V);
    const double rBat = std::max(0.0, supply.resistance_ohm);
    c.busVoltage_V = v;
    if (rBat > 0.0 && v > 0.0) {
        // V_bus − V + R_bat·I_sw,avg(V_bus) rises monotonically with V_bus: one root in [0, V].
        auto g = [&](double vBus) {
            ChopperCircuit t = c;
            t.busVoltage_V = vBus;
            return vBus - v + rBat * chopperWaveform(t, duty).switchAverage_A;
        };
        if (const auto root = numerics::findRoot(g, 0.0, v, 1e-12 * std::max(1.0, v)))
            c.busVoltage_V = *root;
    }
    s.waveform = chopperWaveform(c, duty);
    s.busVoltage_V = c.busVoltage_V;
    s.batteryCurrent_A = s.waveform.switchAverage_A;
    s.backEmf_V = c.backEmf_V;
    return s;
}

ChopperSolution chopperForCurrent(const ChopperCircuit& circuit, const ChopperSupply& supply, double current_A,
                                  double maxDuty) {
    const double dMax = std::clamp(std::isfinite(maxDuty) ? maxDuty : 1.0, 0.0, 1.0);
    if (!(current_A > 0.0))
        return chopperAtDuty(circuit, supply, 0.0);
    // Battery sag can make I(D) fall again near full duty (the source's maximum power point), so
    // scan for the first crossing, then refine it.
    constexpr int kSteps = 24;
    double dLow = 0.0;
    ChopperSolution best = chopperAtDuty(circuit, supply, 0.0);
    for (int k = 1; k <= kSteps; ++k) {
        const double d = dMax * k / kSteps;
        ChopperSolution s = chopperAtDuty(circuit, supply, d);
        if (!s.waveform.valid)
            return s;
        if (s.waveform.motorAverage_A >= current_A) {
            auto f = [&](double dd) { return chopperAtDuty(circuit, supply, dd).waveform.motorAverage_A - current_A; };
            const auto root = numerics::findRoot(f, dLow, d, 1e-13);
            return root ? chopperAtDuty(circuit, supply, *root) : s;
        }
        if (s.waveform.motorAverage_A > best.waveform.motorAverage_A)
            best = s;
        dLow = d;
    }
    best.reached = false;
    return best;
}

ChopperSolution chopperEmfForCurrent(const ChopperCircuit& circuit, const ChopperSupply& supply, double duty,
                                     double current_A) {
    ChopperCircuit c = circuit;
    c.backEmf_V = 0.0;
    ChopperSolution atZero = chopperAtDuty(c, supply, duty);
    if (!atZero.waveform.valid || !(current_A > 0.0) || atZero.waveform.motorAverage_A < current_A) {
        atZero.reached = current_A <= 0.0 || atZero.waveform.motorAverage_A >= current_A;
        return atZero;
    }
    const double v = std::max(0.0, supply.voltage_V);
    auto f = [&](double e) {
        ChopperCircuit t = c;
        t.backEmf_V = e;
        return chopperAtDuty(t, supply, duty).waveform.motorAverage_A - current_A;
    };
    const auto root = numerics::findRoot(f, 0.0, v, 1e-12 * std::max(1.0, v));
    c.backEmf_V = root.value_or(0.0);
    return chopperAtDuty(c, supply, duty);
}

} // namespace amp

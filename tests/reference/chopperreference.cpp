// SPDX-License-Identifier: GPL-3.0-or-later
#include "reference/chopperreference.h"

#include <boost/numeric/odeint.hpp>

#include <algorithm>
#include <array>
#include <cmath>

namespace amp::reference {

namespace {

// State: motor current, bus voltage, then the running integrals over the period of
// i_sw, i_sw², i_d, i_d², i, i², v_bus, and the battery current.
enum : std::size_t { I, V, SW, SW2, D, D2, M, M2, VB, BAT, N };
using State = std::array<double, N>;
using Stepper = boost::numeric::odeint::runge_kutta4<State>;

enum class Phase { On, Off };

struct Model {
    CycleCircuit c;
    double stiffBus_V = 0.0; // bus voltage when C = 0

    bool capacitor() const { return c.busCapacitance_F > 0.0 && c.batteryResistance_ohm > 0.0; }

    // `blocked`: the diode (or the switch, against a back-EMF above the bus) holds the current
    // at zero; it stays there while the circuit would drive it negative.
    void rhs(const State& x, State& dx, Phase phase, bool blocked) const {
        const double i = blocked ? 0.0 : x[I];
        const double v = capacitor() ? x[V] : stiffBus_V;
        double di = 0.0, isw = 0.0, id = 0.0;
        if (phase == Phase::On) {
            di = (v - c.switchDrop_V - c.switchResistance_ohm * i - c.backEmf_V - c.loadResistance_ohm * i) /
                 c.inductance_H;
            isw = i;
        } else {
            di = (-(c.diodeDrop_V + c.diodeResistance_ohm * i) - c.backEmf_V - c.loadResistance_ohm * i) /
                 c.inductance_H;
            id = i;
        }
        if (blocked)
            di = 0.0;
        const double ibat = capacitor() ? (c.batteryVoltage_V - v) / c.batteryResistance_ohm : isw + c.busLoad_A;
        dx[I] = di;
        dx[V] = capacitor() ? (ibat - isw - c.busLoad_A) / c.busCapacitance_F : 0.0;
        dx[SW] = isw;
        dx[SW2] = isw * isw;
        dx[D] = id;
        dx[D2] = id * id;
        dx[M] = i;
        dx[M2] = i * i;
        dx[VB] = v;
        dx[BAT] = ibat;
    }
};

struct PeriodOut {
    State end{};
    double iMin = 0.0, iMax = 0.0;
    bool zeroReached = false;
    double blocked_s = 0.0;
};

// One step of `h` from x in `phase`. At zero current with the circuit driving it negative, the
// step is taken blocked. When the current crosses zero inside the step (the diode stops), the
// crossing is found by bisection on the step length and the rest of the step is taken blocked.
void stepWithBlocking(const Model& m, Stepper& stepper, State& x, double h, Phase phase, bool& zeroReached,
                      double& blocked_s) {
    auto free = [&](const State& s, State& ds, double) { m.rhs(s, ds, phase, false); };
    auto held = [&](const State& s, State& ds, double) { m.rhs(s, ds, phase, true); };
    if (x[I] <= 0.0) {
        x[I] = 0.0;
        State dx{};
        m.rhs(x, dx, phase, false);
        if (dx[I] <= 0.0) {
            zeroReached = true;
            stepper.do_step(held, x, 0.0, h);
            x[I] = 0.0;
            blocked_s += h;
            return;
        }
    }
    State trial = x;
    stepper.do_step(free, trial, 0.0, h);
    if (trial[I] >= 0.0) {
        x = trial;
        return;
    }
    zeroReached = true;
    double lo = 0.0, hi = h;
    for (int k = 0; k < 200 && hi - lo > h * 1e-15; ++k) {
        const double mid = 0.5 * (lo + hi);
        State probe = x;
        stepper.do_step(free, probe, 0.0, mid);
        (probe[I] > 0.0 ? lo : hi) = mid;
    }
    State atZero = x;
    stepper.do_step(free, atZero, 0.0, hi);
    atZero[I] = 0.0;
    if (h - hi > 0.0) {
        stepper.do_step(held, atZero, 0.0, h - hi);
        blocked_s += h - hi;
    }
    atZero[I] = 0.0;
    x = atZero;
}

PeriodOut period(const Model& m, double i0, double v0, int steps) {
    const double T = 1.0 / m.c.frequency_Hz;
    const double d = std::clamp(m.c.duty, 0.0, 1.0);
    const int nOn = d <= 0.0 ? 0 : std::max(1, static_cast<int>(std::ceil(steps * d)));
    const int nOff = d >= 1.0 ? 0 : std::max(1, static_cast<int>(std::ceil(steps * (1.0 - d))));
    Stepper stepper;
    PeriodOut out;
    State x{};
    x[I] = i0;
    x[V] = v0;
    out.iMin = out.iMax = i0;
    for (int k = 0; k < nOn; ++k) {
        stepWithBlocking(m, stepper, x, d * T / nOn, Phase::On, out.zeroReached, out.blocked_s);
        out.iMin = std::min(out.iMin, x[I]);
        out.iMax = std::max(out.iMax, x[I]);
    }
    bool offZero = false;
    for (int k = 0; k < nOff; ++k) {
        stepWithBlocking(m, stepper, x, (1.0 - d) * T / nOff, Phase::Off, offZero, out.blocked_s);
        out.iMin = std::min(out.iMin, x[I]);
        out.iMax = std::max(out.iMax, x[I]);
    }
    out.zeroReached = out.zeroReached || offZero;
    out.end = x;
    return out;
}

// Newton shooting for x0 = (i0[, v0]) with P(x0) = x0.
struct Periodic {
    bool ok = false;
    double i0 = 0.0, v0 = 0.0;
    int periods = 0;
};

Periodic shoot(const Model& m, const CycleOptions& o, double scale_A) {
    Periodic p;
    const bool cap = m.capacitor();
    double i0 = 0.0;
    double v0 = cap ? m.c.batteryVoltage_V : m.stiffBus_V;
    const double vScale = std::max(1.0, std::abs(m.c.batteryVoltage_V));
    for (int it = 0; it < o.maxShootingIterations; ++it) {
        const PeriodOut base = period(m, i0, v0, o.stepsPerPeriod);
        ++p.periods;
        const double gi = base.end[I] - i0;
        const double gv = cap ? base.end[V] - v0 : 0.0;
        if (std::abs(gi) <= o.tolerance * scale_A && std::abs(gv) <= o.tolerance * vScale) {
            p.ok = true;
            p.i0 = i0;
            p.v0 = v0;
            return p;
        }
        // Finite-difference Jacobian of g(x) = P(x) − x.
        const double hi = std::max(1e-6 * scale_A, 1e-9);
        const PeriodOut di = period(m, i0 + hi, v0, o.stepsPerPeriod);
        ++p.periods;
        const double a11 = (di.end[I] - (i0 + hi) - gi) / hi;
        double ni = 0.0, nv = v0;
        if (cap) {
            const double hv = 1e-6 * vScale;
            const PeriodOut dv = period(m, i0, v0 + hv, o.stepsPerPeriod);
            ++p.periods;
            const double a21 = (di.end[V] - v0 - gv) / hi;
            const double a12 = (dv.end[I] - i0 - gi) / hv;
            const double a22 = (dv.end[V] - (v0 + hv) - gv) / hv;
            const double det = a11 * a22 - a12 * a21;
            if (det == 0.0 || !std::isfinite(det))
                break;
            ni = i0 - (a22 * gi - a12 * gv) / det;
            nv = v0 - (-a21 * gi + a11 * gv) / det;
        } else {
            if (a11 == 0.0 || !std::isfinite(a11)) {
                ni = base.end[I]; // flat map (current at zero): take the plain iterate
            } else {
                ni = i0 - gi / a11;
            }
        }
        // The map is piecewise smooth (the diode may block): never below zero current.
        i0 = std::max(0.0, ni);
        v0 = nv;
    }
    return p;
}

CycleResult summarise(const Model& m, const CycleOptions& o, const Periodic& p) {
    CycleResult r;
    const PeriodOut last = period(m, p.i0, p.v0, o.stepsPerPeriod);
    const double f = m.c.frequency_Hz;
    const State& s = last.end;
    r.converged = true;
    r.discontinuous = last.zeroReached || last.iMin <= 0.0;
    r.zeroCurrentTime_s = last.blocked_s;
    r.iMin_A = last.iMin;
    r.iMax_A = last.iMax;
    r.ripplePeakToPeak_A = last.iMax - last.iMin;
    r.switchAverage_A = s[SW] * f;
    r.switchRms_A = std::sqrt(s[SW2] * f);
    r.diodeAverage_A = s[D] * f;
    r.diodeRms_A = std::sqrt(s[D2] * f);
    r.motorAverage_A = s[M] * f;
    r.motorRms_A = std::sqrt(s[M2] * f);
    r.busVoltage_V = s[VB] * f;
    r.batteryCurrent_A = s[BAT] * f;
    r.switchLoss_W = m.c.switchDrop_V * r.switchAverage_A + m.c.switchResistance_ohm * s[SW2] * f;
    r.diodeLoss_W = m.c.diodeDrop_V * r.diodeAverage_A + m.c.diodeResistance_ohm * s[D2] * f;
    r.periodsSimulated = p.periods + 1;
    return r;
}

} // namespace

CycleResult simulateChopper(const CycleCircuit& circuit, const CycleOptions& options) {
    Model m;
    m.c = circuit;
    CycleResult fail;
    if (!(circuit.frequency_Hz > 0.0) || !(circuit.inductance_H > 0.0) || options.stepsPerPeriod < 1) {
        fail.problem = "frequency, inductance and steps per period must be positive";
        return fail;
    }
    // A current scale for the tolerances: the larger of the stall current and 1 A.
    const double rTotal = circuit.loadResistance_ohm + circuit.switchResistance_ohm + circuit.batteryResistance_ohm;
    const double scale_A = std::max(1.0, rTotal > 0.0 ? circuit.batteryVoltage_V / rTotal * 1e-3 : 1.0);

    if (m.capacitor() || circuit.batteryResistance_ohm == 0.0) {
        m.stiffBus_V = circuit.batteryVoltage_V;
        const Periodic p = shoot(m, options, scale_A);
        if (!p.ok) {
            fail.problem = "no periodic steady state found";
            return fail;
        }
        return summarise(m, options, p);
    }

    // Stiff bus with a battery resistance: v = V_bat − R_bat·⟨i_sw⟩(v), a scalar root by secant.
    int periods = 0;
    auto residual = [&](double v, CycleResult* out) {
        m.stiffBus_V = v;
        const Periodic p = shoot(m, options, scale_A);
        periods += p.periods + 1;
        if (!p.ok)
            return std::nan("");
        CycleResult r = summarise(m, options, p);
        if (out != nullptr)
            *out = r;
        return v - (circuit.batteryVoltage_V - circuit.batteryResistance_ohm * (r.switchAverage_A + circuit.busLoad_A));
    };
    double v0 = circuit.batteryVoltage_V;
    CycleResult r0;
    double g0 = residual(v0, &r0);
    double v1 = circuit.batteryVoltage_V - circuit.batteryResistance_ohm * (r0.switchAverage_A + circuit.busLoad_A);
    CycleResult r1 = r0;
    double g1 = residual(v1, &r1);
    for (int it = 0; it < 50 && std::isfinite(g1); ++it) {
        if (std::abs(g1) <= options.tolerance * std::max(1.0, circuit.batteryVoltage_V)) {
            r1.busVoltage_V = v1;
            r1.batteryCurrent_A = r1.switchAverage_A + circuit.busLoad_A;
            r1.periodsSimulated = periods;
            return r1;
        }
        const double denom = g1 - g0;
        const double v2 = denom != 0.0 ? v1 - g1 * (v1 - v0) / denom
                                       : circuit.batteryVoltage_V -
                                             circuit.batteryResistance_ohm * (r1.switchAverage_A + circuit.busLoad_A);
        v0 = v1;
        g0 = g1;
        v1 = v2;
        g1 = residual(v1, &r1);
    }
    fail.problem = "the bus voltage did not settle";
    return fail;
}

} // namespace amp::reference

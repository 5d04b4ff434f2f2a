// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/physics/chopper.h"

#include "core/physics/numerics.h"

#include <algorithm>
#include <array>
#include <optional>
#include <utility>
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

// Above this R·t/L a phase's integrals use the closed form, below it Taylor series.
constexpr double kClosedFormFrom = 0.01;

// What a conduction phase's response over its whole time t depends on besides its source and
// start current: functions of x = R·t/L only. The bus-voltage search of one duty evaluates the
// waveform at several bus voltages with the same phases; these are computed once for all of them.
struct PhaseFactors {
    double x = 0.0;
    double decay = 1.0;     // e^(−x)
    double phi = 1.0;       // (1 − e^(−x))/x
    bool closed = false;    // x > kClosedFormFrom: closed-form integrals
    double e1 = 0.0, e2 = 0.0;                                  // closed form: 1 − e^(−x), 1 − e^(−2x)
    double phi1 = 0.0, phi2 = 0.0, a = 0.0, b = 0.0, cc = 0.0;  // series (see integrate)
};

PhaseFactors phaseFactors(double r_ohm, double l_H, double t_s) {
    PhaseFactors f;
    f.x = r_ohm * t_s / l_H;
    f.decay = std::exp(-f.x);
    f.phi = oneMinusExpOverX(f.x);
    if (t_s <= 0.0)
        return f;
    const double x = f.x;
    if (x > kClosedFormFrom) {
        f.closed = true;
        f.e1 = -std::expm1(-x);
        f.e2 = -std::expm1(-2.0 * x);
        return f;
    }
    // Small x (≤ 0.01): with i(s) = i0·e^(−ks) + (V/L)·s·φ(ks), k = R/L, φ(x) = (1 − e^(−x))/x,
    //   ∫i  = i0·t·φ(x) + (V/L)·t²·A(x),
    //   ∫i² = i0²·t·φ(2x) + 2·i0·(V/L)·t²·B(x) + (V/L)²·t³·C(x),
    // A = (1 − φ(x))/x, B = (φ(x) − φ(2x))/x, C = (1 − 2φ(x) + φ(2x))/x², summed as their Taylor
    // series to x^7 (the first term left out is below 1e-20 of its sum at x = 0.01).
    double term = 1.0; // (−x)^m
    double f1 = 1.0;   // (m+1)!
    double two = 1.0;  // 2^m
    for (int m = 0; m < 8; ++m, two *= 2.0) {
        const double f2 = f1 * (m + 2), f3 = f2 * (m + 3);
        f.phi1 += term / f1;
        f.phi2 += two * term / f1;
        f.a += term / f2;
        f.b += (2.0 * two - 1.0) * term / f2;
        f.cc += (4.0 * two - 2.0) * term / f3;
        term *= -x;
        f1 = f2;
    }
    return f;
}

// One conduction phase: L·di/dt = V − R·i from i0 for a time t, with its factors.
struct Phase {
    double i0 = 0.0;
    double source_V = 0.0;
    double r_ohm = 0.0;
    double l_H = 1.0;
    double t_s = 0.0;
    const PhaseFactors* f = nullptr;

    double end() const { return i0 * f->decay + source_V / l_H * t_s * f->phi; }
};

struct PhaseIntegrals {
    double end = 0.0;       // i(t)
    double integral = 0.0;  // ∫ i ds
    double square = 0.0;    // ∫ i² ds
};

PhaseIntegrals integrate(const Phase& p) {
    PhaseIntegrals r;
    r.end = p.end();
    if (p.t_s <= 0.0)
        return r;
    const PhaseFactors& f = *p.f;
    if (f.closed) {
        // Closed form. Its terms cancel as x falls: the relative rounding error is about
        // ε/x for ∫i and ε/x² for ∫i² (ε = 2.2e-16), so 4e-12 at worst above x = 0.01.
        const double c = p.source_V / p.r_ohm;
        const double d = p.i0 - c;
        const double tau = p.l_H / p.r_ohm;
        r.integral = c * p.t_s + d * tau * f.e1;
        r.square = c * c * p.t_s + 2.0 * c * d * tau * f.e1 + d * d * 0.5 * tau * f.e2;
        return r;
    }
    const double t = p.t_s;
    const double slope = p.source_V / p.l_H;
    r.integral = p.i0 * t * f.phi1 + slope * t * t * f.a;
    r.square = p.i0 * p.i0 * t * f.phi2 + 2.0 * p.i0 * slope * t * t * f.b + slope * slope * t * t * t * f.cc;
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

// Everything of chopperWaveform() that does not depend on the bus voltage.
struct DutyFactors {
    bool valid = true;
    double duty = 0.0, period = 0.0, tOn = 0.0, tOff = 0.0;
    double rOn = 0.0, rOff = 0.0, vOff = 0.0, oneMinusAB = 0.0;
    PhaseFactors on, off;
};

DutyFactors dutyFactors(const ChopperCircuit& c, double duty) {
    DutyFactors k;
    k.duty = std::clamp(std::isfinite(duty) ? duty : 0.0, 0.0, 1.0);
    if (!(c.frequency_Hz > 0.0) || !(c.inductance_H > 0.0)) {
        k.valid = false;
        return k;
    }
    k.period = 1.0 / c.frequency_Hz;
    k.tOn = k.duty * k.period;
    k.tOff = k.period - k.tOn;
    k.rOn = std::max(0.0, c.loadResistance_ohm) + std::max(0.0, c.switchResistance_ohm);
    k.rOff = std::max(0.0, c.loadResistance_ohm) + std::max(0.0, c.diodeResistance_ohm);
    k.vOff = -(std::max(0.0, c.diodeDrop_V) + c.backEmf_V);
    k.on = phaseFactors(k.rOn, c.inductance_H, k.tOn);
    k.off = phaseFactors(k.rOff, c.inductance_H, k.tOff);
    k.oneMinusAB = -std::expm1(-(k.on.x + k.off.x));
    return k;
}

ChopperWaveform waveformWith(const ChopperCircuit& c, const DutyFactors& k) {
    ChopperWaveform w;
    w.duty = k.duty;
    if (!k.valid) {
        w.valid = false;
        w.problem = "the PWM frequency and the motor inductance must be positive";
        return w;
    }
    const double period = k.period;
    const double tOn = k.tOn;
    const double tOff = k.tOff;
    const double rOn = k.rOn;
    const double rOff = k.rOff;
    const double vOn = c.busVoltage_V - c.switchDrop_V - c.backEmf_V;
    const double vOff = k.vOff;

    Phase on{0.0, vOn, rOn, c.inductance_H, tOn, &k.on};
    Phase off{0.0, vOff, rOff, c.inductance_H, tOff, &k.off};
    const double a1 = on.end();   // on-phase response from zero current
    const double b1 = off.end();  // off-phase response from zero current
    const double oneMinusAB = k.oneMinusAB;

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
        iMax = (a1 + k.on.decay * b1) / oneMinusAB;
        iMin = k.off.decay * iMax + b1;
        continuous = iMin > 0.0;
    } else if (vOff >= 0.0) {
        // No resistance anywhere and nothing to bring the current down: it grows without bound.
        w.valid = false;
        w.problem = "no steady state: the motor circuit has no resistance and nothing opposes the current";
        return w;
    }

    PhaseFactors extinct;
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
        if (off.t_s != tOff) {
            extinct = phaseFactors(rOff, c.inductance_H, off.t_s);
            off.f = &extinct;
        }
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

} // namespace

ChopperWaveform chopperWaveform(const ChopperCircuit& c, double duty) { return waveformWith(c, dutyFactors(c, duty)); }

ChopperSolution chopperAtDuty(const ChopperCircuit& circuit, const ChopperSupply& supply, double duty) {
    ChopperSolution s;
    ChopperCircuit c = circuit;
    const double v = std::max(0.0, supply.voltage_V);
    const double rBat = std::max(0.0, supply.resistance_ohm);
    c.busVoltage_V = v;
    if (rBat > 0.0 && v > 0.0) {
        // g(V_bus) = V_bus − V + R_bat·I_sw,avg(V_bus) rises with slope ≥ 1: one root in [0, V],
        // and |g| bounds the distance to it. In continuous conduction the periodic currents are
        // affine in the bus voltage, so secant steps land on the root at once; discontinuous
        // conduction bends g, and a secant that does not settle hands over to the bracketed search.
        // The waveform of the last evaluation is kept: where the search settles on it, it is the
        // answer and need not be computed again.
        ChopperWaveform last;
        double lastBus = std::numeric_limits<double>::quiet_NaN();
        const DutyFactors factors = dutyFactors(c, duty); // the bus voltage does not enter them
        auto g = [&](double vBus) {
            ChopperCircuit t = c;
            t.busVoltage_V = vBus;
            last = waveformWith(t, factors);
            lastBus = vBus;
            return vBus - v + rBat * last.switchAverage_A;
        };
        const double tolerance = 1e-12 * std::max(1.0, v);
        double x0 = v, g0 = g(v);
        bool settled = std::abs(g0) <= tolerance;
        if (!settled && std::isfinite(g0)) {
            double x1 = std::clamp(v - g0, 0.0, v), g1 = g(x1);
            for (int k = 0; k < 6 && std::isfinite(g1); ++k) {
                if (std::abs(g1) <= tolerance) {
                    settled = true;
                    c.busVoltage_V = x1;
                    break;
                }
                if (g1 == g0)
                    break;
                const double x2 = std::clamp(x1 - g1 * (x1 - x0) / (g1 - g0), 0.0, v);
                x0 = x1;
                g0 = g1;
                x1 = x2;
                g1 = g(x1);
            }
        }
        if (!settled)
            if (const auto root = numerics::findRoot(g, 0.0, v, tolerance))
                c.busVoltage_V = *root;
        if (c.busVoltage_V == lastBus)
            s.waveform = std::move(last);
        else
            s.waveform = chopperWaveform(c, duty);
    } else {
        s.waveform = chopperWaveform(c, duty);
    }
    s.busVoltage_V = c.busVoltage_V;
    s.batteryCurrent_A = s.waveform.switchAverage_A;
    s.backEmf_V = c.backEmf_V;
    return s;
}

namespace {

// The averaged circuit's duty for an average motor current I, with the switch and diode carrying
// D·I and (1 − D)·I: over a period the inductor's volt-seconds balance,
//   D·(V_bus − V_sw0 − E) − (1 − D)·(V_f0 + E) = R_m·I + R_sw·D·I + r_d·(1 − D)·I,
// with V_bus = V − R_bat·D·I: R_bat·I·D² − b·D + c = 0, b = V − V_sw0 + V_f0 + (r_d − R_sw)·I,
// c = V_f0 + E + (R_m + r_d)·I; the smaller root. Exact in continuous conduction but for the
// ripple's share in the switch and diode averages; only a starting point for the exact search.
// Also the slope dI/dD of the averaged circuit there. Empty when the averaged circuit cannot
// carry the current.
struct AveragedDuty {
    double duty = 0.0;
    double slope_AperUnit = 0.0;
};
std::optional<AveragedDuty> averagedDuty(const ChopperCircuit& c, const ChopperSupply& supply, double current_A) {
    const double rm = std::max(0.0, c.loadResistance_ohm), rsw = std::max(0.0, c.switchResistance_ohm);
    const double rd = std::max(0.0, c.diodeResistance_ohm), rb = std::max(0.0, supply.resistance_ohm);
    const double vf = std::max(0.0, c.diodeDrop_V);
    const double v = std::max(0.0, supply.voltage_V);
    const double b0 = v - c.switchDrop_V + vf, c0 = vf + c.backEmf_V;
    const double a = rb * current_A, b = b0 + (rd - rsw) * current_A, cc = c0 + (rm + rd) * current_A;
    const double disc = b * b - 4.0 * a * cc;
    if (!(disc >= 0.0) || !(b > 0.0))
        return std::nullopt;
    const double duty = 2.0 * cc / (b + std::sqrt(disc));
    // I(D) = (D·b0 − c0)/M(D), M = R_m + r_d + D·(R_sw − r_d) + R_bat·D².
    const double m = rm + rd + duty * (rsw - rd) + rb * duty * duty;
    const double dm = rsw - rd + 2.0 * rb * duty;
    if (!(m > 0.0) || !std::isfinite(duty))
        return std::nullopt;
    const double slope = (b0 * m - (duty * b0 - c0) * dm) / (m * m);
    if (!(slope > 0.0) || !std::isfinite(slope))
        return std::nullopt;
    return AveragedDuty{duty, slope};
}

// The duty in (0, dHigh] where the average motor current crosses `current_A`, I(dHigh) ≥ current_A
// and a single crossing below dHigh (see chopperForCurrent). Secant steps from the averaged
// circuit's duty bring the bracket [lo, hi] (I(lo) < current_A ≤ I(hi)) close around the crossing;
// Brent's method on that bracket then gives it to 1e-13 in duty, as a search over [0, dHigh] would.
// Every solution computed is kept, so the bracket's ends and the root are not computed twice.
ChopperSolution crossingBelow(const ChopperCircuit& circuit, const ChopperSupply& supply, double current_A,
                              double dHigh, const ChopperSolution& high) {
    constexpr std::size_t kKept = 8;
    std::array<std::pair<double, ChopperSolution>, kKept> kept;
    std::size_t keptCount = 0, keptNext = 0;
    auto solutionAt = [&](double d) -> const ChopperSolution& {
        for (std::size_t i = 0; i < keptCount; ++i)
            if (kept[i].first == d)
                return kept[i].second;
        auto& slot = kept[keptNext];
        slot = {d, chopperAtDuty(circuit, supply, d)};
        keptNext = (keptNext + 1) % kKept;
        keptCount = std::min(keptCount + 1, kKept);
        return slot.second;
    };
    auto f = [&](double d) { return solutionAt(d).waveform.motorAverage_A - current_A; };

    double lo = 0.0, hi = dHigh;
    const double fHigh = high.waveform.motorAverage_A - current_A;
    if (fHigh > 0.0) {
        kept[0] = {dHigh, high};
        keptCount = 1;
        keptNext = 1;
        if (const auto avg = averagedDuty(circuit, supply, current_A)) {
            double x = avg->duty, slope = avg->slope_AperUnit;
            double xPrev = 0.0, fPrev = 0.0;
            bool havePrev = false;
            for (int k = 0; k < 6 && hi - lo > 1e-11; ++k) {
                if (!(x > lo && x < hi))
                    x = 0.5 * (lo + hi);
                const double fx = f(x);
                if (!std::isfinite(fx))
                    break;
                if (fx < 0.0)
                    lo = x;
                else if (fx > 0.0)
                    hi = x;
                else {
                    lo = hi = x;
                    break;
                }
                if (havePrev && fx != fPrev)
                    slope = (fx - fPrev) / (x - xPrev);
                xPrev = x;
                fPrev = fx;
                havePrev = true;
                const double step = -fx / slope;
                // A converged secant step lands within its own size of the crossing: step a
                // little past it, so that the crossing is bracketed closely.
                x += step + (std::abs(step) < 1e-11 ? std::copysign(2e-13, step) : 0.0);
            }
        }
        if (lo == hi)
            return solutionAt(lo);
    }
    const auto root = numerics::findRoot(f, lo, hi, 1e-13);
    return root ? solutionAt(*root) : high;
}

} // namespace

ChopperSolution chopperForCurrent(const ChopperCircuit& circuit, const ChopperSupply& supply, double current_A,
                                  double maxDuty) {
    const double dMax = std::clamp(std::isfinite(maxDuty) ? maxDuty : 1.0, 0.0, 1.0);
    if (!(current_A > 0.0))
        return chopperAtDuty(circuit, supply, 0.0);
    // I(D) rises from zero (after a flat stretch while the back-EMF exceeds the drive) to one
    // peak, the source's maximum-power point, and may fall after it when the battery sags (the
    // averaged circuit gives I = (D·V − E′)/(R + D²·R_bat): one maximum). So: when full duty
    // reaches the current, the single crossing lies in [0, D_max]; otherwise find the peak first
    // and the crossing on its rising side, if the peak reaches the current at all.
    auto currentAt = [&](double d) { return chopperAtDuty(circuit, supply, d).waveform.motorAverage_A; };
    auto crossing = [&](double dHigh, const ChopperSolution& high) {
        return crossingBelow(circuit, supply, current_A, dHigh, high);
    };
    ChopperSolution top = chopperAtDuty(circuit, supply, dMax);
    if (!top.waveform.valid || top.waveform.motorAverage_A >= current_A)
        return top.waveform.valid ? crossing(dMax, top) : top;
    // Golden-section search for the peak; on a tie keep the upper part, since a tie is the flat
    // zero stretch at low duty.
    constexpr double kInvPhi = 0.6180339887498949;
    double a = 0.0, b = dMax;
    double x1 = b - kInvPhi * (b - a), x2 = a + kInvPhi * (b - a);
    double f1 = currentAt(x1), f2 = currentAt(x2);
    while (b - a > 1e-7 * std::max(dMax, 1e-3)) {
        if (f1 > f2) {
            b = x2;
            x2 = x1;
            f2 = f1;
            x1 = b - kInvPhi * (b - a);
            f1 = currentAt(x1);
        } else {
            a = x1;
            x1 = x2;
            f1 = f2;
            x2 = a + kInvPhi * (b - a);
            f2 = currentAt(x2);
        }
    }
    const double dPeak = f1 > f2 ? x1 : x2;
    ChopperSolution peak = chopperAtDuty(circuit, supply, dPeak);
    if (top.waveform.motorAverage_A >= peak.waveform.motorAverage_A)
        peak = top;
    if (peak.waveform.valid && peak.waveform.motorAverage_A >= current_A)
        return crossing(peak.waveform.duty, peak);
    peak.reached = false;
    return peak;
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

// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/thermal/transient.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace amp::thermal {

namespace {

// A step in which a junction moves more than this (or 4 × the re-solve step) is redone in parts.
constexpr double kMaxStepRise_K = 10.0;
constexpr double kMaxSubSteps = 50.0;
// ... when the losses at the end of that step differ by more than this share from those it held,
constexpr double kHeldLossChange = 0.2;
// ... while a run has solves left of this many for it.
constexpr int kSubStepBudget = 2000;
// Most steps one segment is split into. A segment of hours or days (a parked load, a long cruise)
// at the usual 10 ms would take tens of millions of steps, and a repeated profile many times that;
// its junctions and sink settle within the first minutes, and the exact exponential steps stay
// exact for a held power at any length. 10^6 steps of 10 ms are 2.8 h: shorter segments keep
// their steps of step_s.
constexpr double kMaxStepsPerSegment = 1e6;

double masslessJc(const TransientSource& s) {
    return s.zthJc.empty() ? s.rthJc_KperW : 0.0;
}

// Turning points of a signal, online, with a hysteresis gate so that step-to-step noise of the
// loss rescale does not count as cycles.
class ReversalTracker {
  public:
    explicit ReversalTracker(double hysteresis) : m_h(hysteresis) {}
    void add(double v) {
        if (m_points.empty()) {
            m_points.push_back(v);
            m_candidate = v;
            return;
        }
        if (m_dir == 0) {
            if (std::abs(v - m_points.front()) > m_h) {
                m_dir = v > m_points.front() ? 1 : -1;
                m_candidate = v;
            }
        } else if (m_dir > 0) {
            if (v > m_candidate) {
                m_candidate = v;
            } else if (m_candidate - v > m_h) {
                m_points.push_back(m_candidate);
                m_dir = -1;
                m_candidate = v;
            }
        } else {
            if (v < m_candidate) {
                m_candidate = v;
            } else if (v - m_candidate > m_h) {
                m_points.push_back(m_candidate);
                m_dir = 1;
                m_candidate = v;
            }
        }
    }
    std::vector<double> finish() const {
        std::vector<double> p = m_points;
        if (m_dir != 0)
            p.push_back(m_candidate);
        return p;
    }

  private:
    double m_h;
    int m_dir = 0;
    double m_candidate = 0.0;
    std::vector<double> m_points;
};

// rise = P·R(rise) for the heatsink's curve; R falls with the rise, so the fixed point contracts.
double sinkRise(const RsaCurve& rsa, double heat_W) {
    if (!(heat_W > 0.0))
        return 0.0;
    double rise = heat_W * rsa.at(1.0);
    for (int i = 0; i < 200; ++i) {
        const double next = heat_W * rsa.at(rise);
        if (std::abs(next - rise) < 1e-9 * std::max(1.0, rise))
            return next;
        rise = next;
    }
    return rise;
}

} // namespace

TransientState restState(const TransientNetwork& net, double heatsink_C) {
    TransientState s;
    s.heatsink_C = heatsink_C;
    for (const TransientSource& src : net.sources)
        s.stageRise_K.emplace_back(src.zthJc.size(), 0.0);
    s.power_W.assign(net.sources.size(), 0.0);
    return s;
}

double junctionTemperature(const TransientNetwork& net, const TransientState& s, std::size_t k) {
    const TransientSource& src = net.sources[k];
    double t = s.heatsink_C;
    const double p = k < s.power_W.size() ? s.power_W[k] : 0.0;
    t += p * (src.rthCs_KperW + masslessJc(src));
    if (k < s.stageRise_K.size())
        for (double th : s.stageRise_K[k])
            t += th;
    return t;
}

std::vector<std::string> validateNetwork(const TransientNetwork& net) {
    std::vector<std::string> p;
    if (net.sources.empty())
        p.push_back("No heat source on the heatsink");
    for (const TransientSource& s : net.sources) {
        const std::string who = s.name.empty() ? std::string("a source") : s.name;
        if (!std::isfinite(s.rthCs_KperW) || s.rthCs_KperW < 0.0)
            p.push_back(who + ": the interface resistance must be zero or positive");
        if (!std::isfinite(s.rthJc_KperW) || s.rthJc_KperW < 0.0)
            p.push_back(who + ": R_th,jc must be zero or positive");
        if (!std::isfinite(s.count) || s.count <= 0.0)
            p.push_back(who + ": the unit count must be positive");
        for (std::size_t i = 0; i < s.zthJc.size(); ++i) {
            const FosterStage& f = s.zthJc[i];
            if (!std::isfinite(f.r_KperW) || f.r_KperW < 0.0 || !std::isfinite(f.tau_s) || f.tau_s < 0.0)
                p.push_back(who + ": Foster stage " + std::to_string(i + 1) + " needs R ≥ 0 and τ ≥ 0");
        }
    }
    if (net.rsa.rise_K.empty() || net.rsa.rise_K.size() != net.rsa.rth_KperW.size())
        p.push_back("The heatsink has no resistance to ambient");
    for (double r : net.rsa.rth_KperW)
        if (!std::isfinite(r) || r <= 0.0) {
            p.push_back("The heatsink resistance to ambient must be positive");
            break;
        }
    if (!std::isfinite(net.heatsinkCapacity_JperK) || net.heatsinkCapacity_JperK < 0.0)
        p.push_back("The heatsink heat capacity must be zero or positive");
    return p;
}

TransientStepper::TransientStepper(const TransientNetwork& net, TransientState state)
    : m_net(net), m_state(std::move(state)) {
    if (m_state.stageRise_K.size() != net.sources.size())
        m_state = restState(net, m_state.heatsink_C);
    m_state.power_W.resize(net.sources.size(), 0.0);
    const RsaCurve& c = net.rsa;
    for (std::size_t i = 0; i < c.rise_K.size(); ++i) {
        m_lnRise.push_back(std::log(c.rise_K[i]));
        m_lnR.push_back(std::log(c.rth_KperW[i]));
    }
    for (std::size_t i = 0; i + 1 < m_lnRise.size(); ++i)
        m_slope.push_back((m_lnR[i + 1] - m_lnR[i]) / (m_lnRise[i + 1] - m_lnRise[i]));
    m_before = m_state;
}

// The same law as RsaCurve::at (log-log interpolation, constant beyond the ends), with the
// logarithms precomputed and the interval found from the last one: this runs every step.
double TransientStepper::sinkResistance(double rise) {
    const std::size_t n = m_lnRise.size();
    if (n == 1 || !(rise > m_net.rsa.rise_K.front()))
        return m_net.rsa.rth_KperW.front();
    if (rise >= m_net.rsa.rise_K.back())
        return m_net.rsa.rth_KperW.back();
    const auto& x = m_net.rsa.rise_K;
    std::size_t i = std::min(m_segment, n - 2);
    while (i > 0 && rise < x[i])
        --i;
    while (i + 2 < n && rise >= x[i + 1])
        ++i;
    m_segment = i;
    return std::exp(m_lnR[i] + m_slope[i] * (std::log(rise) - m_lnRise[i]));
}

void TransientStepper::advance(double dt, const std::vector<double>& power, double ambient_C) {
    advanceRamp(dt, power, power, ambient_C);
}

// Exact for a power that moves linearly from p0 to p1 over the step (first-order hold): with
// s = (p1 − p0)/Δt, θ(Δt) = θ0·a + R·[p1 − a·p0 − s·τ·(1 − a)], a = e^(−Δt/τ). It reduces to the
// zero-order hold when p1 = p0; fast parts (τ ≪ Δt) end at R·p1, slow ones integrate the mean.
void TransientStepper::advanceRamp(double dt, const std::vector<double>& p0, const std::vector<double>& p1,
                                   double ambient_C) {
    const std::size_t n = m_net.sources.size();
    if (dt != m_cachedDt) {
        m_decay.resize(n);
        m_lag.resize(n);
        for (std::size_t k = 0; k < n; ++k) {
            const auto& z = m_net.sources[k].zthJc;
            m_decay[k].resize(z.size());
            m_lag[k].resize(z.size());
            for (std::size_t i = 0; i < z.size(); ++i) {
                m_decay[k][i] = z[i].tau_s > 0.0 ? std::exp(-dt / z[i].tau_s) : 0.0;
                m_lag[k][i] = z[i].tau_s / dt * (1.0 - m_decay[k][i]); // τ·(1 − a)/Δt
            }
        }
        m_cachedDt = dt;
    }
    const bool ramp = &p0 != &p1;
    // The new state is written into m_before (reading m_state), then the two swap: m_before keeps
    // the state this step started from, for undo(). setState() may have changed m_state's shape.
    if (m_before.stageRise_K.size() != n || m_before.power_W.size() != n)
        m_before = m_state;
    for (std::size_t k = 0; k < n; ++k)
        m_before.stageRise_K[k].resize(m_state.stageRise_K[k].size());
    double total0 = 0.0, total1 = 0.0;
    for (std::size_t k = 0; k < n; ++k) {
        const auto& z = m_net.sources[k].zthJc;
        const auto& th = m_state.stageRise_K[k];
        auto& out = m_before.stageRise_K[k];
        const auto& a = m_decay[k];
        if (ramp) {
            const double dp = p1[k] - p0[k];
            for (std::size_t i = 0; i < z.size(); ++i)
                out[i] = th[i] * a[i] + z[i].r_KperW * (p1[k] - a[i] * p0[k] - dp * m_lag[k][i]);
        } else {
            for (std::size_t i = 0; i < z.size(); ++i)
                out[i] = th[i] * a[i] + z[i].r_KperW * p0[k] * (1.0 - a[i]);
        }
        m_before.power_W[k] = p1[k];
        total0 += m_net.sources[k].count * p0[k];
        total1 += m_net.sources[k].count * p1[k];
    }
    const double c = m_net.heatsinkCapacity_JperK;
    double rise = m_state.heatsink_C - ambient_C;
    if (c > 0.0) {
        const double r = sinkResistance(rise);
        const double tau = r * c;
        const double a = std::exp(-dt / tau);
        rise = ramp ? rise * a + r * (total1 - a * total0 - (total1 - total0) * tau / dt * (1.0 - a))
                    : rise * a + total0 * r * (1.0 - a);
    } else {
        rise = sinkRise(m_net.rsa, total1);
    }
    m_before.heatsink_C = ambient_C + rise;
    std::swap(m_state, m_before);
}

double TransientStepper::junction_C(std::size_t k) const {
    return junctionTemperature(m_net, m_state, k);
}

SteadyState steadyState(const TransientNetwork& net, std::size_t segment, double ambient_C,
                        const ResolveLosses& losses, double tolerance_K,
                        const std::vector<double>* startTj_C) {
    SteadyState out;
    const std::size_t n = net.sources.size();
    out.state = restState(net, ambient_C);
    out.tj_C.assign(n, ambient_C);
    if (startTj_C && startTj_C->size() == n)
        out.tj_C = *startTj_C;
    std::vector<double> p(n, 0.0);
    for (int it = 0; it < 1000; ++it) {
        losses(segment, out.tj_C, p);
        double total = 0.0;
        for (std::size_t k = 0; k < n; ++k)
            total += net.sources[k].count * p[k];
        out.state.heatsink_C = ambient_C + sinkRise(net.rsa, total);
        out.state.power_W = p;
        double change = 0.0;
        for (std::size_t k = 0; k < n; ++k) {
            const auto& z = net.sources[k].zthJc;
            for (std::size_t i = 0; i < z.size(); ++i)
                out.state.stageRise_K[k][i] = z[i].r_KperW * p[k];
            const double tj = junctionTemperature(net, out.state, k);
            if (!std::isfinite(tj) || tj > 1000.0)
                return out; // runaway: no fixed point in reach
            change = std::max(change, std::abs(tj - out.tj_C[k]));
            out.tj_C[k] = tj;
        }
        if (change < tolerance_K) {
            out.converged = true;
            return out;
        }
    }
    return out;
}

TransientResult runTransient(const TransientNetwork& net, const std::vector<TransientSegment>& segments,
                             const TransientLosses& losses, const TransientOptions& opt,
                             const TransientState& initial) {
    TransientResult out;
    out.problems = validateNetwork(net);
    double profile_s = 0.0;
    for (std::size_t i = 0; i < segments.size(); ++i) {
        const TransientSegment& s = segments[i];
        if (!std::isfinite(s.duration_s) || s.duration_s <= 0.0)
            out.problems.push_back("Segment " + std::to_string(i + 1) + ": the duration must be positive");
        if (!std::isfinite(s.ambient_C))
            out.problems.push_back("Segment " + std::to_string(i + 1) + ": the ambient is not a number");
        profile_s += s.duration_s;
    }
    if (segments.empty())
        out.problems.push_back("The duty profile has no segment");
    if (!std::isfinite(opt.step_s) || opt.step_s <= 0.0)
        out.problems.push_back("The time step must be positive");
    if (!losses.resolve)
        out.problems.push_back("No loss model was given");
    if (!out.problems.empty())
        return out;

    const std::size_t n = net.sources.size();
    TransientStepper stepper(net, initial);
    std::vector<double> tj(n), tjRef(n), tjEnd(n), powerRef(n, 0.0), power(n, 0.0);
    out.tjMax_C.assign(n, -std::numeric_limits<double>::infinity());
    out.tjMaxTime_s.assign(n, 0.0);
    out.heatsinkMax_C = stepper.state().heatsink_C;
    for (std::size_t k = 0; k < n; ++k) {
        out.tjMax_C[k] = stepper.junction_C(k);
    }
    const double sampleEvery = opt.maxSamples > 0 ? profile_s / static_cast<double>(opt.maxSamples) : 0.0;
    const int reps = std::max(1, opt.repetitions);
    double time = 0.0;

    double lastSinkDrift = std::numeric_limits<double>::quiet_NaN();
    int subStepBudget = kSubStepBudget;
    for (int rep = 0; rep < reps; ++rep) {
        const TransientState start = stepper.state();
        std::vector<ReversalTracker> rev(n, ReversalTracker(opt.reversalHysteresis_K));
        out.time_s.clear();
        out.heatsink_C.clear();
        out.tj_C.assign(n, {});
        double repTime = 0.0, nextSample = 0.0;
        for (std::size_t k = 0; k < n; ++k)
            tj[k] = stepper.junction_C(k);
        auto sample = [&]() {
            out.time_s.push_back(repTime);
            out.heatsink_C.push_back(stepper.state().heatsink_C);
            for (std::size_t k = 0; k < n; ++k)
                out.tj_C[k].push_back(tj[k]);
            nextSample += sampleEvery;
        };
        if (opt.maxSamples > 0)
            sample();
        for (std::size_t k = 0; k < n; ++k)
            rev[k].add(tj[k]);

        for (std::size_t si = 0; si < segments.size(); ++si) {
            const TransientSegment& seg = segments[si];
            const auto steps = static_cast<std::size_t>(
                std::clamp(std::ceil(seg.duration_s / opt.step_s - 1e-9), 1.0, kMaxStepsPerSegment));
            const double dt = seg.duration_s / static_cast<double>(steps);
            bool segmentStart = true;
            for (std::size_t step = 0; step < steps; ++step) {
                // tj holds the junctions at the start of this step (end of the last one).
                bool full = segmentStart || opt.resolveStep_K <= 0.0;
                if (!full)
                    for (std::size_t k = 0; k < n && !full; ++k)
                        full = std::abs(tj[k] - tjRef[k]) > opt.resolveStep_K;
                if (full) {
                    losses.resolve(si, tj, powerRef);
                    tjRef = tj;
                    power = powerRef;
                    ++out.resolves;
                    segmentStart = false;
                } else if (losses.rescale) {
                    losses.rescale(si, tjRef, powerRef, tj, power);
                } else {
                    power = powerRef;
                }
                if (power.size() != n) {
                    out.problems.push_back("The loss model returned " + std::to_string(power.size()) +
                                           " powers for " + std::to_string(n) + " sources");
                    return out;
                }
                for (double p : power)
                    if (!std::isfinite(p)) {
                        out.problems.push_back(
                            "The loss model returned a power that is not a number in segment " +
                            std::to_string(si + 1) + " at " + std::to_string(time) + " s");
                        return out;
                    }
                stepper.advance(dt, power, seg.ambient_C);
                double jump = 0.0;
                for (std::size_t k = 0; k < n; ++k) {
                    tjEnd[k] = stepper.junction_C(k);
                    jump = std::max(jump, std::abs(tjEnd[k] - tj[k]));
                }
                const double allowed = std::max(kMaxStepRise_K, 4.0 * opt.resolveStep_K);
                bool redo = false;
                if (jump > allowed) {
                    // The losses were held through a step in which a junction moved far. Where they
                    // change steeply with the junction (a cold bipolar bank leaving its active region
                    // falls, a bank near runaway rises), holding the start value over- or undershoots:
                    // such a step is redone in parts with the losses solved afresh at each, within a
                    // budget of extra solves per run (a bank that runs away would otherwise ask for
                    // parts at every step). Losses that hardly move keep the one step: the next step
                    // starts from the losses at its end.
                    std::vector<double> endPower;
                    losses.resolve(si, tjEnd, endPower);
                    ++out.resolves;
                    for (std::size_t k = 0; k < n && k < endPower.size(); ++k)
                        redo = redo || !(std::abs(endPower[k] - power[k]) <= kHeldLossChange * std::abs(power[k]));
                    redo = redo && subStepBudget > 0;
                    if (!redo && endPower.size() == n) {
                        tjRef = tjEnd;
                        powerRef = endPower;
                    }
                }
                if (redo) {
                    stepper.undo();
                    const int parts = static_cast<int>(std::min(kMaxSubSteps, 2.0 * std::ceil(jump / allowed)));
                    subStepBudget -= parts;
                    const double h = dt / parts;
                    std::vector<double> now = tj;
                    for (int m = 0; m < parts; ++m) {
                        losses.resolve(si, now, power);
                        ++out.resolves;
                        if (power.size() != n || std::any_of(power.begin(), power.end(),
                                                             [](double p) { return !std::isfinite(p); })) {
                            out.problems.push_back("The loss model returned a power that is not a number in segment " +
                                                   std::to_string(si + 1) + " at " + std::to_string(time) + " s");
                            return out;
                        }
                        tjRef = now;
                        powerRef = power;
                        stepper.advance(h, power, seg.ambient_C);
                        for (std::size_t k = 0; k < n; ++k)
                            now[k] = stepper.junction_C(k);
                    }
                    tjEnd = now;
                }
                time += dt;
                repTime += dt;
                ++out.steps;
                for (std::size_t k = 0; k < n; ++k) {
                    const double t = tjEnd[k];
                    tj[k] = t;
                    if (t > out.tjMax_C[k]) {
                        out.tjMax_C[k] = t;
                        out.tjMaxTime_s[k] = time;
                    }
                    rev[k].add(t);
                }
                if (stepper.state().heatsink_C > out.heatsinkMax_C) {
                    out.heatsinkMax_C = stepper.state().heatsink_C;
                    out.heatsinkMaxTime_s = time;
                }
                if (opt.maxSamples > 0 && repTime >= nextSample - 1e-9 * profile_s)
                    sample();
            }
        }
        if (opt.maxSamples > 0 && (out.time_s.empty() || out.time_s.back() < repTime - 1e-9 * profile_s))
            sample();
        out.reversals_C.clear();
        for (std::size_t k = 0; k < n; ++k)
            out.reversals_C.push_back(rev[k].finish());
        out.repetitionsRun = rep + 1;

        double drift = std::abs(stepper.state().heatsink_C - start.heatsink_C);
        for (std::size_t k = 0; k < n; ++k)
            for (std::size_t i = 0; i < start.stageRise_K[k].size(); ++i)
                drift =
                    std::max(drift, std::abs(stepper.state().stageRise_K[k][i] - start.stageRise_K[k][i]));
        out.periodic = drift < opt.periodicTolerance_K;
        if (opt.untilPeriodic && out.periodic)
            break;
        const double sinkDrift = stepper.state().heatsink_C - start.heatsink_C;
        if (opt.untilPeriodic && opt.accelerate && std::isfinite(lastSinkDrift) && lastSinkDrift != 0.0) {
            const double rho = sinkDrift / lastSinkDrift;
            if (rho > 0.0 && rho < 0.98) {
                stepper.setHeatsink(stepper.state().heatsink_C + sinkDrift * rho / (1.0 - rho));
                ++out.extrapolations;
                lastSinkDrift = std::numeric_limits<double>::quiet_NaN(); // measure afresh after a jump
                continue;
            }
        }
        lastSinkDrift = sinkDrift;
    }
    out.finalState = stepper.state();
    out.ok = true;
    return out;
}

} // namespace amp::thermal

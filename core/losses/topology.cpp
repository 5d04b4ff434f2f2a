// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/losses/topology.h"

#include <algorithm>
#include <array>
#include <cmath>

namespace amp::losses {

bool parseTopology(const std::string& topology, const std::string& modulation, Topology& out) {
    if (topology == "lowSideChopper")
        out = Topology::LowSideChopper;
    else if (topology == "synchronousHalfBridge")
        out = Topology::SynchronousHalfBridge;
    else if (topology == "fullBridge" && (modulation == "bipolar"))
        out = Topology::FullBridgeBipolar;
    else if (topology == "fullBridge" && (modulation == "unipolar" || modulation.empty()))
        out = Topology::FullBridgeUnipolar;
    else
        return false;
    return true;
}

const char* toString(Topology t) {
    switch (t) {
    case Topology::LowSideChopper: return "lowSideChopper";
    case Topology::SynchronousHalfBridge: return "synchronousHalfBridge";
    case Topology::FullBridgeBipolar: return "fullBridgeBipolar";
    case Topology::FullBridgeUnipolar: return "fullBridgeUnipolar";
    }
    return "";
}

double rippleHalfBridge(double v_V, double duty, double l_H, double f_Hz) {
    return v_V * duty * (1.0 - duty) / (l_H * f_Hz);
}

double rippleFullBridgeBipolar(double v_V, double diagonalDuty, double l_H, double f_Hz) {
    return 2.0 * v_V * diagonalDuty * (1.0 - diagonalDuty) / (l_H * f_Hz);
}

double rippleFullBridgeUnipolar(double v_V, double duty, double l_H, double f_Hz) {
    return v_V * duty * (1.0 - duty) / (2.0 * l_H * f_Hz);
}

namespace {

enum class LegState { High, Low, Dead };

/// A half-bridge leg: its high bank is on over the arc [centre − width/2, centre + width/2) of the
/// normalised period; `sign` maps the motor current to the current out of the leg's midpoint.
struct Leg {
    double centre = 0.5;
    double width = 0.5;
    double sign = 1.0;
    int highBank = 0;
    int lowBank = 1;
};

double wrap(double t) {
    t = std::fmod(t, 1.0);
    return t < 0.0 ? t + 1.0 : t;
}

bool inArc(double t, double start, double length) {
    if (length <= 0.0)
        return false;
    if (length >= 1.0)
        return true;
    return wrap(t - start) < length;
}

LegState legState(const Leg& leg, double t, double dead) {
    if (leg.width >= 1.0)
        return LegState::High;
    if (leg.width <= 0.0)
        return LegState::Low;
    const double start = leg.centre - 0.5 * leg.width;
    if (inArc(t, start, leg.width))
        return LegState::High;
    if (inArc(t, start + leg.width, dead) || inArc(t, start - dead, dead))
        return LegState::Dead;
    return LegState::Low;
}

/// How a path carries a current magnitude x ≥ 0.
struct PathSample {
    double channel_A = 0.0, channelLoss_W = 0.0, diode_A = 0.0, diodeLoss_W = 0.0;
};

PathSample channelForward(double x, double r) { return {x, r * x * x, 0.0, 0.0}; }

PathSample diodeOnly(double x, double vf0, double rd) { return {0.0, 0.0, x, vf0 * x + rd * x * x}; }

/// A channel conducting in reverse with its body diode in parallel: the diode takes the excess once
/// the channel drop exceeds its threshold.
PathSample channelReverse(double x, double r, double vf0, double rd, bool reverseChannel) {
    if (!reverseChannel)
        return diodeOnly(x, vf0, rd);
    const bool diodeGiven = vf0 > 0.0 || rd > 0.0;
    if (!diodeGiven || r <= 0.0 || r * x <= vf0)
        return channelForward(x, r);
    double v = vf0;
    if (rd > 0.0)
        v = (vf0 / rd + x) / (1.0 / r + 1.0 / rd);
    const double ich = std::min(x, v / r);
    const double id = x - ich;
    return {ich, r * ich * ich, id, vf0 * id + rd * id * id};
}

/// Running integrals over the normalised period for one element.
struct Accum {
    double fraction = 0.0, avg = 0.0, sq = 0.0, loss = 0.0;
};

struct BankAccum {
    Accum channel, diode;
};

} // namespace

TopologyResult topologyCurrents(const TopologyInput& in) {
    TopologyResult r;
    r.topology = in.topology;
    InputCheck c;
    c.positive("busVoltage_V", in.busVoltage_V, "the bus voltage");
    c.inRange("duty", in.duty, 0.0, 1.0, "the output duty");
    c.finite("motorCurrent_A", in.motorCurrent_A, "the motor current");
    c.positive("inductance_H", in.inductance_H, "the armature inductance");
    c.positive("frequency_Hz", in.frequency_Hz, "the PWM frequency");
    c.nonNegative("deadTime_s", in.deadTime_s, "the dead time");
    c.nonNegative("paths.bankResistance_ohm", in.paths.bankResistance_ohm, "the bank on-resistance");
    c.nonNegative("paths.bodyVf0_V", in.paths.bodyVf0_V, "the body-diode threshold");
    c.nonNegative("paths.bodyRd_ohm", in.paths.bodyRd_ohm, "the body-diode slope resistance");
    c.nonNegative("paths.freewheelVf0_V", in.paths.freewheelVf0_V, "the freewheel-diode threshold");
    c.nonNegative("paths.freewheelRd_ohm", in.paths.freewheelRd_ohm, "the freewheel-diode slope resistance");
    const bool chopper = in.topology == Topology::LowSideChopper;
    if (c.ok() && chopper && in.motorCurrent_A < 0.0)
        c.fail("motorCurrent_A", "the low-side chopper has no path for a braking (negative) current, got " +
                                     num(in.motorCurrent_A) + " A");
    if (c.ok() && !chopper && 2.0 * in.deadTime_s * in.frequency_Hz >= 1.0)
        c.fail("deadTime_s", "the dead time (" + num(in.deadTime_s) + " s) must be shorter than half the PWM period (" +
                                 num(0.5 / in.frequency_Hz) + " s at " + num(in.frequency_Hz) + " Hz)");
    if (!c.ok()) {
        r.problems = c.take();
        return r;
    }

    const double v = in.busVoltage_V;
    const double f = in.frequency_Hz;
    const double iMean = in.motorCurrent_A;
    const double dead = chopper ? 0.0 : in.deadTime_s * f; // normalised
    const PathParams& p = in.paths;

    // Legs and banks of the topology.
    std::vector<Leg> legs;
    switch (in.topology) {
    case Topology::LowSideChopper:
        r.banks.resize(1);
        r.banks[0].role = "switch";
        legs.push_back(Leg{0.5, in.duty, 1.0, 0, -1});
        break;
    case Topology::SynchronousHalfBridge:
        r.banks.resize(2);
        r.banks[0].role = "high";
        r.banks[1].role = "low";
        legs.push_back(Leg{0.5, in.duty, 1.0, 0, 1});
        break;
    case Topology::FullBridgeBipolar: {
        const double d = 0.5 * (1.0 + in.duty);
        r.banks.resize(4);
        legs.push_back(Leg{0.5, d, 1.0, 0, 1});
        legs.push_back(Leg{0.0, 1.0 - d, -1.0, 2, 3});
        break;
    }
    case Topology::FullBridgeUnipolar:
        r.banks.resize(4);
        legs.push_back(Leg{0.5, 0.5 * (1.0 + in.duty), 1.0, 0, 1});
        legs.push_back(Leg{0.5, 0.5 * (1.0 - in.duty), -1.0, 2, 3});
        break;
    }
    if (r.banks.size() == 4) {
        r.banks[0].role = "highA";
        r.banks[1].role = "lowA";
        r.banks[2].role = "highB";
        r.banks[3].role = "lowB";
    }
    if (!chopper) {
        for (Leg& leg : legs) {
            if (leg.width > 0.0 && leg.width < 1.0 && leg.width > 1.0 - 2.0 * dead) {
                leg.width = 1.0 - 2.0 * dead;
                r.notes.push_back("a leg's duty is limited to " + num(leg.width) + " by the dead time");
            }
        }
    }

    // Breakpoints of the period: every edge of every leg and of its dead times.
    std::vector<double> t{0.0, 1.0};
    for (const Leg& leg : legs) {
        if (leg.width <= 0.0 || leg.width >= 1.0)
            continue;
        const double start = leg.centre - 0.5 * leg.width;
        for (double e : {start, start + leg.width, start + leg.width + dead, start - dead})
            t.push_back(wrap(e));
    }
    std::sort(t.begin(), t.end());
    t.erase(std::unique(t.begin(), t.end(), [](double a, double b) { return std::abs(a - b) < 1e-12; }), t.end());
    if (t.back() < 1.0 - 1e-12)
        t.push_back(1.0);
    t.back() = 1.0;
    const std::size_t pieces = t.size() - 1;

    // Leg states and motor voltage (in units of V) in each piece.
    std::vector<std::vector<LegState>> states(pieces, std::vector<LegState>(legs.size()));
    std::vector<double> motorV(pieces, 0.0);
    for (std::size_t k = 0; k < pieces; ++k) {
        const double mid = 0.5 * (t[k] + t[k + 1]);
        double vm = 0.0;
        for (std::size_t l = 0; l < legs.size(); ++l) {
            const LegState s = legState(legs[l], mid, dead); // dead == 0 for the chopper
            states[k][l] = s;
            double legV = 0.0;
            if (s == LegState::High)
                legV = 1.0;
            else if (s == LegState::Dead)
                legV = legs[l].sign * iMean < 0.0 ? 1.0 : 0.0; // the conducting body diode sets the leg
            vm += legs[l].sign * legV;
        }
        motorV[k] = vm;
    }
    double meanV = 0.0;
    for (std::size_t k = 0; k < pieces; ++k)
        meanV += motorV[k] * (t[k + 1] - t[k]);
    r.effectiveDuty = meanV;

    // Current at the breakpoints: slope (v − v̄)·V/L, then shifted to the mean current.
    std::vector<double> i(t.size(), 0.0);
    for (std::size_t k = 0; k < pieces; ++k)
        i[k + 1] = i[k] + (motorV[k] - meanV) * v * (t[k + 1] - t[k]) / (in.inductance_H * f);
    double mean = 0.0;
    for (std::size_t k = 0; k < pieces; ++k)
        mean += 0.5 * (i[k] + i[k + 1]) * (t[k + 1] - t[k]);
    for (double& x : i)
        x += iMean - mean;
    r.currentMin_A = *std::min_element(i.begin(), i.end());
    r.currentMax_A = *std::max_element(i.begin(), i.end());
    r.ripplePeakToPeak_A = r.currentMax_A - r.currentMin_A;
    r.rippleFrequency_Hz = in.topology == Topology::FullBridgeUnipolar ? 2.0 * f : f;
    if (chopper && r.currentMin_A < 0.0) {
        r.discontinuous = true;
        r.notes.push_back("the current (mean " + num(iMean) + " A, ripple " + num(r.ripplePeakToPeak_A) +
                          " A) reaches zero in the off-time: discontinuous conduction, the continuous-"
                          "conduction results here do not apply");
    }
    if (!chopper && r.currentMin_A < 0.0 && r.currentMax_A > 0.0) {
        r.currentReverses = true;
        r.notes.push_back("the current changes sign within the period; dead-time voltage follows the mean "
                          "current's sign");
    }

    // Integrate every element over each linear piece (split where the current crosses zero).
    std::vector<BankAccum> acc(r.banks.size());
    Accum freewheel;
    double busAvg = 0.0, busSq = 0.0, motorSq = 0.0;
    constexpr int kPanels = 16; // Simpson: exact for the linear and quadratic parts
    for (std::size_t k = 0; k < pieces; ++k) {
        std::vector<std::array<double, 2>> parts; // sub-spans with one current sign
        const double a = i[k], b = i[k + 1];
        if (a * b < 0.0) {
            const double tz = t[k] + (t[k + 1] - t[k]) * a / (a - b);
            parts.push_back({t[k], tz});
            parts.push_back({tz, t[k + 1]});
        } else {
            parts.push_back({t[k], t[k + 1]});
        }
        for (const auto& part : parts) {
            const double t0 = part[0], t1 = part[1];
            const double span = t1 - t0;
            if (span <= 0.0)
                continue;
            const double h = span / kPanels;
            const double slope = (b - a) / (t[k + 1] - t[k]);
            const double midI = a + slope * (0.5 * (t0 + t1) - t[k]);
            for (int n = 0; n <= kPanels; ++n) {
                const double w = (n == 0 || n == kPanels) ? 1.0 : (n % 2 ? 4.0 : 2.0);
                const double weight = w * h / 3.0;
                const double ti = t0 + n * h;
                const double cur = a + slope * (ti - t[k]);
                motorSq += weight * cur * cur;
                double bus = 0.0;
                if (chopper) {
                    const double x = std::max(0.0, cur);
                    if (states[k][0] == LegState::High) {
                        const PathSample s = channelForward(x, p.bankResistance_ohm);
                        acc[0].channel.avg += weight * s.channel_A;
                        acc[0].channel.sq += weight * s.channel_A * s.channel_A;
                        acc[0].channel.loss += weight * s.channelLoss_W;
                        bus = x;
                    } else {
                        const PathSample s = diodeOnly(x, p.freewheelVf0_V, p.freewheelRd_ohm);
                        freewheel.avg += weight * s.diode_A;
                        freewheel.sq += weight * s.diode_A * s.diode_A;
                        freewheel.loss += weight * s.diodeLoss_W;
                    }
                } else {
                    for (std::size_t l = 0; l < legs.size(); ++l) {
                        const Leg& leg = legs[l];
                        const double out = leg.sign * cur;
                        const double x = std::abs(out);
                        const double outSign = leg.sign * midI; // sign over the whole part
                        int bank = -1;
                        PathSample s;
                        switch (states[k][l]) {
                        case LegState::High:
                            bank = leg.highBank;
                            s = outSign >= 0.0 ? channelForward(x, p.bankResistance_ohm)
                                               : channelReverse(x, p.bankResistance_ohm, p.bodyVf0_V, p.bodyRd_ohm, p.reverseChannel);
                            bus += out;
                            break;
                        case LegState::Low:
                            bank = leg.lowBank;
                            s = outSign <= 0.0 ? channelForward(x, p.bankResistance_ohm)
                                               : channelReverse(x, p.bankResistance_ohm, p.bodyVf0_V, p.bodyRd_ohm, p.reverseChannel);
                            break;
                        case LegState::Dead:
                            bank = outSign > 0.0 ? leg.lowBank : leg.highBank;
                            s = diodeOnly(x, p.bodyVf0_V, p.bodyRd_ohm);
                            if (outSign < 0.0)
                                bus += out; // the high body diode returns the current to the bus
                            break;
                        }
                        BankAccum& ba = acc[static_cast<std::size_t>(bank)];
                        ba.channel.avg += weight * s.channel_A;
                        ba.channel.sq += weight * s.channel_A * s.channel_A;
                        ba.channel.loss += weight * s.channelLoss_W;
                        ba.diode.avg += weight * s.diode_A;
                        ba.diode.sq += weight * s.diode_A * s.diode_A;
                        ba.diode.loss += weight * s.diodeLoss_W;
                    }
                }
                busAvg += weight * bus;
                busSq += weight * bus * bus;
            }
            // Conduction times: a part keeps one current sign, so its channel either carries over
            // all of it or not at all, and a diode carries where the current's magnitude, linear in
            // time, exceeds the level at which it takes over. Decided per part, not per Simpson
            // sample: a sample that lands on the zero crossing (0 or ±1e-17 A by rounding) would
            // otherwise add or drop a sample weight of conduction time, and with it the base or
            // gate drive that scales with it.
            if (!chopper) {
                const double ia = a + slope * (t0 - t[k]), ib = a + slope * (t1 - t[k]);
                for (std::size_t l = 0; l < legs.size(); ++l) {
                    const Leg& leg = legs[l];
                    const double outSign = leg.sign * midI;
                    const LegState st = states[k][l];
                    const bool forward = (st == LegState::High && outSign >= 0.0) || (st == LegState::Low && outSign <= 0.0);
                    const int bank = st == LegState::High  ? leg.highBank
                                     : st == LegState::Low ? leg.lowBank
                                     : outSign > 0.0       ? leg.lowBank
                                                           : leg.highBank;
                    BankAccum& ba = acc[static_cast<std::size_t>(bank)];
                    // Gated on and carrying (or no current at all): forward, or in reverse through a
                    // channel that conducts both ways (channelReverse gives it a share of any current).
                    if (st != LegState::Dead && (forward || p.reverseChannel || midI == 0.0))
                        ba.channel.fraction += span;
                    // The diode: always in the dead time and in reverse without a reverse channel;
                    // with one, above the current where the channel's drop reaches the diode's threshold.
                    double level = -1.0; // no diode conduction
                    if (st == LegState::Dead || (!forward && !p.reverseChannel))
                        level = 0.0;
                    else if (!forward && (p.bodyVf0_V > 0.0 || p.bodyRd_ohm > 0.0) && p.bankResistance_ohm > 0.0)
                        level = p.bodyVf0_V / p.bankResistance_ohm;
                    if (level >= 0.0) {
                        const double xa = std::abs(ia), xb = std::abs(ib);
                        const double lo = std::min(xa, xb), hi = std::max(xa, xb);
                        if (hi > level)
                            ba.diode.fraction += lo >= level ? span : span * (hi - level) / (hi - lo);
                    }
                }
            }
            if (chopper) {
                if (states[k][0] == LegState::High)
                    acc[0].channel.fraction += span;
                else
                    freewheel.fraction += span;
            }
        }
    }

    for (std::size_t b = 0; b < r.banks.size(); ++b) {
        BankCurrents& bc = r.banks[b];
        bc.channelFraction = acc[b].channel.fraction;
        bc.channelAverage_A = acc[b].channel.avg;
        bc.channelRms_A = std::sqrt(std::max(0.0, acc[b].channel.sq));
        bc.channelLoss_W = acc[b].channel.loss;
        bc.diodeFraction = acc[b].diode.fraction;
        bc.diodeAverage_A = acc[b].diode.avg;
        bc.diodeRms_A = std::sqrt(std::max(0.0, acc[b].diode.sq));
        bc.diodeLoss_W = acc[b].diode.loss;
        r.conductionLoss_W += bc.channelLoss_W + bc.diodeLoss_W;
    }
    r.freewheelDiode.fraction = freewheel.fraction;
    r.freewheelDiode.average_A = freewheel.avg;
    r.freewheelDiode.rms_A = std::sqrt(std::max(0.0, freewheel.sq));
    r.freewheelDiode.loss_W = freewheel.loss;
    r.conductionLoss_W += freewheel.loss;
    r.motorRms_A = std::sqrt(std::max(0.0, motorSq));
    r.busAverage_A = busAvg;
    r.busRms_A = std::sqrt(std::max(0.0, busSq));
    r.capacitorRms_A = std::sqrt(std::max(0.0, busSq - busAvg * busAvg));

    // Switching events at each breakpoint (t = 0 and t = 1 are the same instant).
    auto addEvent = [&](int bank, bool on, double current, int recovering) {
        r.events.push_back(SwitchEvent{bank, on, current, recovering});
        if (on)
            ++r.banks[static_cast<std::size_t>(bank)].hardTurnOns;
        else
            ++r.banks[static_cast<std::size_t>(bank)].hardTurnOffs;
    };
    for (std::size_t k = 0; k < pieces; ++k) {
        const std::size_t before = k == 0 ? pieces - 1 : k - 1;
        const double cur = i[k];
        for (std::size_t l = 0; l < legs.size(); ++l) {
            const LegState s0 = states[before][l], s1 = states[k][l];
            if (s0 == s1)
                continue;
            const Leg& leg = legs[l];
            if (chopper) {
                if (s1 == LegState::High && cur > 0.0)
                    addEvent(0, true, cur, -1);
                else if (s0 == LegState::High && cur > 0.0)
                    addEvent(0, false, cur, -2);
                continue;
            }
            const double out = leg.sign * cur;
            const bool highOff = s0 == LegState::High;
            const bool lowOn = s1 == LegState::Low;
            const bool lowOff = s0 == LegState::Low;
            const bool highOn = s1 == LegState::High;
            if (highOff && out > 0.0)
                addEvent(leg.highBank, false, out, -2);
            if (lowOff && out < 0.0)
                addEvent(leg.lowBank, false, -out, -2);
            if (lowOn && out < 0.0)
                addEvent(leg.lowBank, true, -out, leg.highBank);
            if (highOn && out > 0.0)
                addEvent(leg.highBank, true, out, leg.lowBank);
        }
    }
    return r;
}

} // namespace amp::losses

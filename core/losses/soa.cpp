// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/losses/soa.h"

#include "core/units/units.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <set>

namespace amp::losses {

double soaLimit(const std::vector<SoaPoint>& curve, double voltage_V, double voltageRating_V) {
    if (curve.empty() || voltage_V > voltageRating_V)
        return 0.0;
    std::vector<SoaPoint> pts = curve;
    std::sort(pts.begin(), pts.end(), [](const SoaPoint& a, const SoaPoint& b) { return a.voltage_V < b.voltage_V; });
    if (voltage_V <= pts.front().voltage_V)
        return pts.front().current_A;
    auto logInterp = [](const SoaPoint& a, const SoaPoint& b, double v) {
        const double slope = std::log(b.current_A / a.current_A) / std::log(b.voltage_V / a.voltage_V);
        return a.current_A * std::pow(v / a.voltage_V, slope);
    };
    for (std::size_t k = 1; k < pts.size(); ++k)
        if (voltage_V <= pts[k].voltage_V)
            return logInterp(pts[k - 1], pts[k], voltage_V);
    if (pts.size() == 1)
        return pts[0].current_A * pts[0].voltage_V / voltage_V; // constant power beyond a lone point
    return logInterp(pts[pts.size() - 2], pts.back(), voltage_V);
}

SoaResult checkStress(const SoaInput& in) {
    SoaResult r;
    // The field-by-field messages are built only when a value is off: this runs inside the
    // engine's thermal iterations.
    auto positive = [](double v) { return std::isfinite(v) && v > 0.0; };
    auto nonNegative = [](double v) { return std::isfinite(v) && v >= 0.0; };
    bool plausible = positive(in.voltageRating_V) && nonNegative(in.leadLimit_A) && nonNegative(in.rmsCurrent_A) &&
                     nonNegative(in.shortCircuitTime_s) && nonNegative(in.protectionResponse_s);
    for (const SoaPoint& p : in.soa)
        plausible = plausible && positive(p.voltage_V) && positive(p.current_A) && nonNegative(p.pulse_s);
    for (const StressPoint& p : in.points)
        plausible = plausible && nonNegative(p.voltage_V) && nonNegative(p.current_A) && nonNegative(p.duration_s);
    InputCheck c;
    if (!plausible)
        c.positive("voltageRating_V", in.voltageRating_V, "the voltage rating");
    for (std::size_t k = 0; k < in.soa.size() && !plausible; ++k) {
        const std::string at = "soa[" + std::to_string(k) + "]";
        c.positive(at + ".voltage_V", in.soa[k].voltage_V, "the SOA point's voltage");
        c.positive(at + ".current_A", in.soa[k].current_A, "the SOA point's current");
        c.nonNegative(at + ".pulse_s", in.soa[k].pulse_s, "the SOA point's pulse length");
    }
    for (std::size_t k = 0; k < in.points.size() && !plausible; ++k) {
        const std::string at = "points[" + std::to_string(k) + "]";
        c.nonNegative(at + ".voltage_V", in.points[k].voltage_V, "the operating voltage");
        c.nonNegative(at + ".current_A", in.points[k].current_A, "the operating current");
        c.nonNegative(at + ".duration_s", in.points[k].duration_s, "the operating duration");
    }
    if (!plausible) {
        c.nonNegative("leadLimit_A", in.leadLimit_A, "the package lead limit");
        c.nonNegative("rmsCurrent_A", in.rmsCurrent_A, "the device RMS current");
        c.nonNegative("shortCircuitTime_s", in.shortCircuitTime_s, "the short-circuit withstand time");
        c.nonNegative("protectionResponse_s", in.protectionResponse_s, "the protection response time");
    }
    if (!c.ok()) {
        r.problems = c.take();
        return r;
    }

    std::set<double> pulses;
    for (const SoaPoint& p : in.soa)
        pulses.insert(p.pulse_s);
    auto curveOf = [&](double pulse) {
        std::vector<SoaPoint> curve;
        for (const SoaPoint& p : in.soa)
            if (p.pulse_s == pulse)
                curve.push_back(p);
        return curve;
    };

    for (const StressPoint& sp : in.points) {
        SoaPointResult pr;
        pr.name = sp.name;
        pr.check.value = sp.current_A;
        // The shortest pulsed curve that lasts at least as long, else DC.
        double chosen = -1.0;
        if (sp.duration_s > 0.0)
            for (double p : pulses)
                if (p > 0.0 && p >= sp.duration_s) {
                    chosen = p;
                    break;
                }
        if (chosen < 0.0 && pulses.count(0.0))
            chosen = 0.0;
        if (sp.voltage_V > in.voltageRating_V) {
            pr.check.rated = true;
            pr.check.failed = true;
            pr.check.limit = 0.0;
            pr.check.message = sp.name + ": " + num(sp.voltage_V) + " V is above the device's " +
                               num(in.voltageRating_V) + " V rating";
        } else if (chosen < 0.0) {
            pr.check.rated = false;
            pr.check.message = in.soa.empty()
                                   ? "the part states no safe operating area"
                                   : sp.name + ": no SOA curve covers a " +
                                         units::format(sp.duration_s, units::Unit::Second) + " stress";
        } else {
            pr.curvePulse_s = chosen;
            pr.check.limit = soaLimit(curveOf(chosen), sp.voltage_V, in.voltageRating_V);
            pr.check.failed = sp.current_A > pr.check.limit;
            if (pr.check.failed)
                pr.check.message =
                    sp.name + ": " + num(sp.current_A) + " A at " + num(sp.voltage_V) + " V for " +
                    (chosen > 0.0 ? units::format(sp.duration_s, units::Unit::Second) : std::string("DC")) +
                    " is outside the safe operating area (limit " + num(pr.check.limit) + " A)";
        }
        r.anyFailed = r.anyFailed || pr.check.failed;
        r.points.push_back(pr);
    }

    r.lead.rated = in.leadLimit_A > 0.0;
    r.lead.value = in.rmsCurrent_A;
    r.lead.limit = in.leadLimit_A;
    r.lead.failed = r.lead.rated && in.rmsCurrent_A > in.leadLimit_A;
    if (r.lead.failed)
        r.lead.message = "each device carries " + num(in.rmsCurrent_A) + " A RMS, above the package lead limit of " +
                         num(in.leadLimit_A) + " A";

    r.shortCircuit.rated = in.shortCircuitTime_s > 0.0 && in.protectionResponse_s > 0.0;
    r.shortCircuit.value = in.protectionResponse_s;
    r.shortCircuit.limit = in.shortCircuitTime_s;
    r.shortCircuit.failed = r.shortCircuit.rated && in.protectionResponse_s > in.shortCircuitTime_s;
    if (r.shortCircuit.failed)
        r.shortCircuit.message = "the protection needs " + num(in.protectionResponse_s * 1e6) +
                                 " µs, longer than the device's " + num(in.shortCircuitTime_s * 1e6) +
                                 " µs short-circuit withstand";
    r.anyFailed = r.anyFailed || r.lead.failed || r.shortCircuit.failed;
    return r;
}

} // namespace amp::losses

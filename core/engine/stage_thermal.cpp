// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/engine/stage_thermal.h"

#include "core/checks/makecheck.h"
#include "core/thermal/creepage.h"
#include "core/thermal/cycling_life.h"
#include "core/thermal/interface.h"
#include "core/thermal/live_heatsink.h"
#include "core/thermal/rainflow.h"
#include "core/thermal/stall.h"
#include "core/thermal/touch_temperature.h"
#include "core/thermal/transient.h"
#include "core/units/units.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

namespace amp {

namespace {

constexpr double kGridPerDecade = 16.0;
constexpr double kSmallestHeat_W = 1e-3;
// Junction margin below T_j,max that raises a warning: the steady check uses the same (common
// practice).
constexpr double kJunctionMargin_K = 15.0;
constexpr std::size_t kSamples = 1000;
// A fin spacing this far from the optimum earns an advice.
constexpr double kSpacingAdvice = 0.3;

std::string num(double v, int digits = 3) { return units::plain(v, digits); }

bool computed(const OperatingPointResult& op) {
    return op.valid && !op.devices.empty();
}

double heatIntoSink(const OperatingPointResult& op) {
    double p = op.freewheelDiode.loss_W;
    for (const auto& dv : op.devices)
        p += dv.loss_W; // ballast and leg resistors are not on the heatsink
    return p;
}

double interfaceRth(const InterfacePart& i) {
    const thermal::InterfaceResult r = thermal::interfaceResistance(
        {i.conductivity_WperMK, i.thickness_m, i.area_m2, i.contactResistance_KperW});
    // Same fallback as the steady chain: an unusable layer leaves the contact term (the input
    // check names the field).
    return r.ok ? r.rthCs_KperW : std::max(0.0, i.contactResistance_KperW);
}

thermal::TransientNetwork network(const Design& d, const HeatsinkModel& hs, double maxHeat_W) {
    thermal::TransientNetwork net;
    const double rcs = interfaceRth(d.bank.interface);
    const SwitchPart& sw = d.bank.device;
    for (int k = 0; k < d.bank.count; ++k)
        net.sources.push_back(
            {"Q" + std::to_string(k + 1), sw.zthJc, std::max(0.0, sw.rthJc_KperW), rcs, 1.0});
    const DiodePart& di = d.bank.freewheelDiode;
    net.sources.push_back({"D", di.zthJc, std::max(0.0, di.rthJc_KperW), rcs,
                           static_cast<double>(std::max(1, d.bank.diodeCount))});
    net.rsa = hs.curve(maxHeat_W);
    net.heatsinkCapacity_JperK = hs.heatCapacity_JperK();
    return net;
}

// Full solves through the caller's losses; in between, a linear rescale with the slopes dP/dT_j
// at the last full solve (one more solve with every junction 1 K warmer, made when the first
// rescale needs it: a steady-state iteration never does). Between full solves the junctions move
// less than the resolve step, where P(T_j) is close to linear.
struct Losses {
    const SourceLosses* source = nullptr;
    std::function<std::size_t(std::size_t)> pointOf; // transient segment -> losses point
    std::function<bool(std::size_t)> active;         // false: the point was not computed, no loss
    std::vector<double> slope, warm, tjAt;
    std::size_t pointAt = 0;
    bool pointActive = false, slopeKnown = false;

    void resolve(std::size_t seg, const std::vector<double>& tj, std::vector<double>& p) {
        pointAt = pointOf(seg);
        pointActive = active(pointAt);
        slopeKnown = false;
        tjAt = tj;
        if (!pointActive) {
            p.assign(tj.size(), 0.0);
            return;
        }
        (*source)(pointAt, tj, p);
    }
    void rescale(const std::vector<double>& tRef, const std::vector<double>& pRef,
                 const std::vector<double>& tj, std::vector<double>& p) {
        if (!slopeKnown) {
            slope.assign(pRef.size(), 0.0);
            if (pointActive) {
                std::vector<double> t1 = tjAt;
                for (double& t : t1)
                    t += 1.0;
                (*source)(pointAt, t1, warm);
                for (std::size_t k = 0; k < pRef.size() && k < warm.size(); ++k)
                    slope[k] = warm[k] - pRef[k];
            }
            slopeKnown = true;
        }
        p.resize(pRef.size());
        for (std::size_t k = 0; k < pRef.size(); ++k)
            p[k] = std::max(0.0, pRef[k] + slope[k] * (tj[k] - tRef[k]));
    }
    thermal::TransientLosses callbacks() {
        thermal::TransientLosses l;
        l.resolve = [this](std::size_t s, const std::vector<double>& tj, std::vector<double>& p) {
            resolve(s, tj, p);
        };
        l.rescale = [this](std::size_t, const std::vector<double>& tr, const std::vector<double>& pr,
                           const std::vector<double>& tj, std::vector<double>& p) { rescale(tr, pr, tj, p); };
        return l;
    }
};

void geometryChecks(const HeatsinkModel& hs, Results& r) {
    for (const Problem& p : hs.problems())
        r.checks.push_back(
            makeCheck("heatsink.geometry", Severity::Fail, 0.0, 0.0, "", "plate-fin geometry",
                      p.message + "; the stated heatsink part stands in until this is corrected",
                      "Correct the heatsink geometry", p.path));
}

void heatsinkSummary(const Design& d, const HeatsinkModel& hs, std::size_t hottest, Results& r) {
    const OperatingPointResult& op = r.operatingPoints[hottest];
    HeatsinkSummary s;
    s.mode = hs.geometryMode() ? "geometry" : "stated";
    s.operatingPoint = op.name;
    s.heat_W = heatIntoSink(op);
    s.rthSa_KperW = hs.rthSa(s.heat_W);
    s.temperature_C = op.heatsinkTemperature_C;
    s.heatCapacity_JperK = hs.heatCapacity_JperK();
    if (hs.geometryMode()) {
        const thermal::PlateFinResult g = hs.solve(s.heat_W);
        s.notes = g.notes;
        if (d.heatsink.geometry.finCount >= 2)
            s.finSpacing_m = g.finSpacing_m;
        if (g.optimumFinSpacing_m > 0.0) {
            s.optimumFinSpacing_m = g.optimumFinSpacing_m;
            s.optimumFinCount = g.optimumFinCount;
        }
        if (s.finSpacing_m && s.optimumFinSpacing_m) {
            const double ratio = *s.finSpacing_m / *s.optimumFinSpacing_m;
            const bool off = std::abs(ratio - 1.0) > kSpacingAdvice;
            r.checks.push_back(makeCheck(
                "heatsink.fin-spacing", off ? Severity::Advice : Severity::Pass, *s.finSpacing_m,
                *s.optimumFinSpacing_m, "m", "Bar-Cohen & Rohsenow optimum spacing S_opt = 2.714·L/Ra_L^¼",
                fmt::format(
                    "{}: the fins stand {} mm apart; for this fin length and a {} K rise the optimum is "
                    "{} mm, about {} fins across the {} mm base",
                    op.name, num(*s.finSpacing_m * 1e3), num(g.finRootTemperature_C - d.heatsink.ambient_C),
                    num(*s.optimumFinSpacing_m * 1e3), num(std::floor(*s.optimumFinCount)),
                    num(d.heatsink.geometry.baseWidth_m * 1e3)),
                ratio < 1.0 ? "Fewer fins (wider channels) let the air through: heatsink.geometry.finCount"
                            : "More fins use the width better: heatsink.geometry.finCount",
                "heatsink.geometry.finCount", op.name));
        }
    }
    r.heatsink = std::move(s);
}

void insulationChecks(const Design& d, Results& r) {
    const InterfacePart& in = d.bank.interface;
    const double vMax = d.supply.max_V;
    const bool anyLive = d.bank.device.tabLive || (d.bank.diodeCount > 0 && d.bank.freewheelDiode.tabLive);

    if (in.insulating) {
        const thermal::DielectricResult de =
            thermal::dielectricCheck({in.dielectricStrength_Vperm, in.thickness_m, vMax});
        const Severity sev = !de.withstandsBus ? Severity::Fail
                             : !de.meetsMargin ? Severity::Warning
                                               : Severity::Pass;
        r.checks.push_back(makeCheck(
            "interface.dielectric", sev, de.breakdown_V, de.required_V, "V",
            "breakdown = dielectric strength × thickness; wanted 2·V_max + 1000 V (common practice, from "
            "memory of "
            "the dielectric test voltage of basic insulation in IEC 60950-1-era equipment standards)",
            fmt::format(
                "the {} breaks down at about {} V ({} kV/mm × {} mm) against the highest bus voltage {} V; "
                "{} V wanted",
                in.name, num(de.breakdown_V), num(in.dielectricStrength_Vperm * 1e-6),
                num(in.thickness_m * 1e3), num(vMax), num(de.required_V)),
            "A thicker insulator or one with a higher dielectric strength (bank.interface)",
            "bank.interface.dielectricStrength_Vperm"));
    }
    if (anyLive && (in.insulating || d.heatsink.insulatedFromTabs)) {
        const thermal::CreepageResult c = thermal::requiredCreepage(vMax);
        r.checks.push_back(makeCheck(
            "interface.creepage", Severity::Advice, c.required_m, c.required_m, "m",
            "IEC 60664-1 Table F.4, pollution degree 2, material group III (50 V 1.2 mm, 63 V 1.25 mm, 100 V "
            "1.4 mm; "
            "interpolated between rows, the 50 V value below 50 V)",
            fmt::format(
                "keep at least {} mm along the insulator's surface between every live tab (and its screw) "
                "and the heatsink at {} V{}",
                num(c.required_m * 1e3), num(vMax),
                c.interpolated ? " (interpolated between the table's rows)" : ""),
            "Let the pad overhang the tab by at least that distance; use a shouldered bush under the screw",
            "bank.interface"));
    }

    thermal::LiveHeatsinkInput live;
    live.wetLocation = d.heatsink.wetLocation;
    live.heatsinkInsulated = d.heatsink.insulatedFromTabs;
    // Low-side chopper: drains/collectors on the switching node (motor −, up to V_max when off),
    // the freewheel diode's cathode on the positive bus.
    live.tabs.push_back({"switch tabs (motor −)", d.bank.device.tabLive, in.insulating, "motor-", vMax});
    if (d.bank.diodeCount > 0)
        live.tabs.push_back(
            {"freewheel diode tabs (bus +)", d.bank.freewheelDiode.tabLive, in.insulating, "bus+", vMax});
    const thermal::LiveHeatsinkResult lr = thermal::liveHeatsink(live);
    if (lr.tabsShorted)
        r.checks.push_back(makeCheck(
            "heatsink.tab-short", Severity::Fail, vMax, 0.0, "V", "circuit: two live tabs on different nodes",
            fmt::format(
                "the {} and the {} sit bare on one heatsink: it joins the motor's terminals, and with the "
                "switches on it shorts the battery through the bank",
                lr.shortedFirst, lr.shortedSecond),
            "Insulate the tabs (an insulating pad or washer: bank.interface) or mount the diode on its own "
            "heatsink",
            "bank.interface.insulating"));
    {
        Severity sev = Severity::Pass;
        std::string msg;
        if (!lr.live) {
            msg = "the heatsink is not connected to any live tab";
        } else if (!lr.aboveLimit) {
            sev = Severity::Advice;
            msg = fmt::format(
                "the heatsink is live at up to {} V through the {}, below the {} V DC touch limit{}; "
                "keep it off the chassis",
                num(lr.voltage_V), lr.liveTab, num(lr.limit_V), d.heatsink.wetLocation ? " (wet)" : "");
        } else {
            sev = d.heatsink.exposed ? Severity::Fail : Severity::Warning;
            msg = fmt::format(
                "the heatsink is live at up to {} V through the {}, above the {} V DC touch limit for {} "
                "locations{}",
                num(lr.voltage_V), lr.liveTab, num(lr.limit_V), d.heatsink.wetLocation ? "wet" : "dry",
                d.heatsink.exposed ? " and it can be touched"
                                   : "; it is enclosed: keep the enclosure closed and marked");
        }
        r.checks.push_back(makeCheck(
            "heatsink.live-touch-voltage", sev, lr.live ? lr.voltage_V : 0.0, lr.limit_V, "V",
            "IEC 60364-4-41 §414.4.5 (from memory): no protection against direct contact needed up to 60 V "
            "DC in dry "
            "locations, 30 V DC in wet ones",
            std::move(msg), "Insulate the tabs from the heatsink (bank.interface) or enclose the heatsink",
            "bank.interface.insulating"));
    }
}

void touchCheck(const Design& d, double hottest_C, const std::string& where, Results& r) {
    using thermal::TouchClass;
    const TouchClass c = thermal::classifyTouch(hottest_C);
    Severity sev = Severity::Pass;
    double limit = thermal::burnThreshold_C(600.0);
    std::string what = "safe to touch";
    if (c == TouchClass::BriefTouch) {
        sev = Severity::Fail;
        limit = thermal::burnThreshold_C(1.0);
        what = "burns on a brief touch (1 s)";
    } else if (c == TouchClass::RestingHand) {
        sev = Severity::Warning;
        limit = thermal::burnThreshold_C(10.0);
        what = "burns a hand resting on it for 10 s";
    } else if (c == TouchClass::LongContact) {
        sev = Severity::Advice;
        what = "burns on contact of some minutes";
    }
    if (!d.heatsink.exposed)
        sev = sev == Severity::Pass ? Severity::Pass : Severity::Advice;
    r.checks.push_back(makeCheck(
        "heatsink.touch-temperature", sev, hottest_C, limit, "°C",
        "burn thresholds of bare metal, ISO 13732-1 (from memory): 65 °C for 1 s, 55 °C for 10 s, 51 °C for "
        "1 min, "
        "48 °C for 10 min",
        fmt::format("the heatsink reaches {} °C ({}): it {}{}", num(hottest_C), where, what,
                    d.heatsink.exposed ? ""
                                       : "; it is not exposed in use, but mind it when the cover is open"),
        "Guard or enclose the heatsink, or lower its temperature (a larger heatsink)", "heatsink.exposed"));
}

} // namespace

HeatsinkModel::HeatsinkModel(const Design& d) {
    const Heatsink& h = d.heatsink;
    m_stated = {h.part.rthSa_KperW, h.rthReferenceRise_K, h.rthRiseExponent};
    m_capacity_JperK = std::max(0.0, h.part.mass_kg * h.part.specificHeat_JperKgK);
    if (h.mode != "geometry")
        return;
    const HeatsinkGeometry& g = h.geometry;
    m_plateFin.geometry = {g.baseWidth_m, g.baseLength_m,   g.baseThickness_m, g.finCount,
                           g.finHeight_m, g.finThickness_m, g.material,        g.orientation,
                           g.emissivity,  g.airVelocity_mps};
    m_plateFin.ambient_C = h.ambient_C;
    m_plateFin.sourceCount = std::max(1, d.bank.count + std::max(0, d.bank.diodeCount));
    m_plateFin.sourceArea_m2 =
        std::isfinite(d.bank.interface.area_m2) ? std::max(0.0, d.bank.interface.area_m2) : 0.0;
    for (const Problem& p : thermal::validatePlateFin(m_plateFin.geometry))
        m_problems.push_back({"heatsink.geometry." + p.path, p.message});
    if (!std::isfinite(h.ambient_C) || h.ambient_C < -60.0 || h.ambient_C > 200.0)
        m_problems.push_back(
            {"heatsink.ambient_C", "The ambient temperature must lie between −60 °C and 200 °C"});
    if (!m_problems.empty())
        return;
    m_geometry = true;
    m_capacity_JperK = solve(10.0).heatCapacity_JperK;
}

thermal::PlateFinResult HeatsinkModel::solve(double heat_W) const {
    thermal::PlateFinInput in = m_plateFin;
    in.heat_W = std::max(0.0, heat_W);
    return thermal::solvePlateFin(in);
}

double HeatsinkModel::rthSa(double heat_W) const {
    if (!m_geometry)
        return thermal::statedRth(m_stated, thermal::statedRise(m_stated, std::max(0.0, heat_W)));
    const double x = std::log10(std::max(heat_W, kSmallestHeat_W)) * kGridPerDecade;
    const double lo = std::floor(x);
    auto at = [this](int i) {
        const auto it = m_grid.find(i);
        if (it != m_grid.end())
            return it->second;
        const double r = solve(std::pow(10.0, i / kGridPerDecade)).rthSa_KperW;
        m_grid.emplace(i, r);
        return r;
    };
    const double a = at(static_cast<int>(lo));
    const double b = at(static_cast<int>(lo) + 1);
    return a * std::pow(b / a, x - lo);
}

thermal::RsaCurve HeatsinkModel::curve(double maxHeat_W) const {
    if (!m_geometry)
        return thermal::rsaCurve(m_stated, std::max(300.0, 3.0 * maxHeat_W * m_stated.rthSa_KperW));
    return thermal::rsaCurve(m_plateFin, maxHeat_W);
}

void addThermalResults(const Design& d, const HeatsinkModel& hs, const SourceLosses& losses,
                       const ThermalStageOptions& options, Results& r) {
    geometryChecks(hs, r);
    insulationChecks(d, r);

    const std::size_t points = r.operatingPoints.size();
    // hottestDrive: the hottest point that is not itself a stall, where a stall starts from.
    std::size_t hottestSink = points, hottestDrive = points;
    double maxHeat = 0.0, sinkMax = -1e300;
    for (std::size_t i = 0; i < points; ++i) {
        const OperatingPointResult& op = r.operatingPoints[i];
        if (!computed(op))
            continue;
        maxHeat = std::max(maxHeat, heatIntoSink(op));
        if (hottestSink == points || op.heatsinkTemperature_C > sinkMax) {
            hottestSink = i;
            sinkMax = op.heatsinkTemperature_C;
        }
        auto tjOf = [](const OperatingPointResult& p) {
            double t = p.freewheelDiode.tj_C;
            for (const auto& dv : p.devices)
                t = std::max(t, dv.tj_C);
            return t;
        };
        const bool stall = i < d.dutyProfile.size() && d.dutyProfile[i].mode == "stall";
        if (!stall && (hottestDrive == points || tjOf(op) > tjOf(r.operatingPoints[hottestDrive])))
            hottestDrive = i;
    }
    if (hottestSink == points) {
        r.warnings.push_back("no operating point was computed: no heatsink, stall or transient results");
        return;
    }
    heatsinkSummary(d, hs, hottestSink, r);
    double touch_C = sinkMax;
    std::string touchWhere = "steady state of " + r.operatingPoints[hottestSink].name;

    // The network and the loss adapter shared by the stall study and the transient.
    const double ambient = d.heatsink.ambient_C;
    Losses adapter;
    adapter.source = &losses;
    adapter.active = [&r, points](std::size_t p) { return p >= points || computed(r.operatingPoints[p]); };

    // Stall at the current limit, from the chosen start.
    if (options.stall) {
        std::vector<double> probe(static_cast<std::size_t>(d.bank.count) + 1, ambient), p;
        losses(points, probe, p);
        double stallHeat = 0.0;
        for (std::size_t k = 0; k < p.size(); ++k)
            stallHeat += p[k] * (k + 1 == p.size() ? std::max(1, d.bank.diodeCount) : 1);
        const thermal::TransientNetwork net = network(d, hs, std::max(maxHeat, 2.0 * stallHeat));
        std::vector<double> limits(net.sources.size(), d.bank.device.tjMax_C);
        limits.back() = d.bank.freewheelDiode.tjMax_C;
        thermal::TransientState start = thermal::restState(net, ambient);
        std::string from = "from ambient";
        if (d.thermal.stallStart != "ambient" && hottestDrive < points &&
            r.operatingPoints[hottestDrive].bank.converged) {
            // The point's steady state as the bank solve found it: every Foster stage at R_i·P and
            // the sink at its temperature.
            const OperatingPointResult& op = r.operatingPoints[hottestDrive];
            for (std::size_t k = 0; k < net.sources.size(); ++k) {
                const double pk = k < op.devices.size() ? op.devices[k].loss_W
                                                        : op.freewheelDiode.loss_W / net.sources[k].count;
                start.power_W[k] = pk;
                for (std::size_t i = 0; i < net.sources[k].zthJc.size(); ++i)
                    start.stageRise_K[k][i] = net.sources[k].zthJc[i].r_KperW * pk;
            }
            start.heatsink_C = op.heatsinkTemperature_C;
            from = "from the steady state of " + op.name;
        }
        adapter.pointOf = [points](std::size_t) { return points; };
        const thermal::StallResult st =
            stallHeat > 0.0 ? thermal::stallTimeToLimit(net, start, ambient, adapter.callbacks(), limits)
                            : thermal::StallResult{};
        if (!st.ok) {
            r.warnings.push_back(
                stallHeat > 0.0 && !st.problems.empty()
                    ? "stall time not computed: " + st.problems.front()
                    : std::string("stall time not computed: the stall has no loss to heat with"));
        } else {
            r.stallTimeToLimit_s = st.timeToLimit_s;
            double required = 0.0;
            std::string requiredBy;
            for (const Segment& s : d.dutyProfile)
                if (s.mode == "stall" && s.duration_s > required) {
                    required = s.duration_s;
                    requiredBy = s.name;
                }
            const std::string limitText = d.pwm.currentLimit_A > 0.0
                                              ? fmt::format("at the {} A limit", num(d.pwm.currentLimit_A))
                                              : std::string("without a current limit (full duty)");
            if (st.timeToLimit_s) {
                const std::string who = net.sources[*st.firstSource].name;
                const bool massless = net.sources[*st.firstSource].zthJc.empty();
                const Severity sev = *st.timeToLimit_s < required ? Severity::Fail : Severity::Advice;
                r.checks.push_back(makeCheck(
                    "thermal.stall-time", sev, *st.timeToLimit_s, required, "s",
                    "transient of the Foster networks and the heatsink's heat capacity; the limit is the "
                    "part's "
                    "T_j,max",
                    fmt::format("stalled {} {}, {} reaches its T_j,max after {} s{}{}", limitText, from, who,
                                num(*st.timeToLimit_s),
                                required > 0.0 ? fmt::format("; the profile's stall \"{}\" lasts {} s",
                                                             requiredBy, num(required))
                                               : std::string(),
                                massless
                                    ? " (no Z_th,jc data for it: its junction follows the power at once; "
                                      "the datasheet's Foster stages give a truer figure)"
                                    : ""),
                    "Lower the current limit (pwm.currentLimit_A), add devices (bank.count) or heatsink mass",
                    "pwm.currentLimit_A"));
            } else {
                r.checks.push_back(makeCheck(
                    "thermal.stall-time", Severity::Pass, st.steadyTj_C.value_or(0.0), d.bank.device.tjMax_C,
                    "°C", "steady state of the stall at the limit",
                    fmt::format(
                        "stalled {} the junctions settle at {} °C, below their limits: the stall can last",
                        limitText, num(st.steadyTj_C.value_or(0.0))),
                    "", "pwm.currentLimit_A"));
            }
        }
    }

    if (options.transient) {
        const thermal::TransientNetwork net = network(d, hs, maxHeat);
        std::vector<thermal::TransientSegment> segments;
        double profile_s = 0.0;
        for (const Segment& s : d.dutyProfile) {
            segments.push_back({s.duration_s, ambient});
            profile_s += s.duration_s;
        }
        thermal::TransientOptions opt;
        opt.step_s = d.thermal.step_s;
        opt.resolveStep_K = d.thermal.resolveStep_K;
        opt.repetitions = std::max(1, d.thermal.repetitions);
        opt.untilPeriodic = d.thermal.untilPeriodic;
        opt.maxSamples = kSamples;
        adapter.pointOf = [](std::size_t s) { return s; };
        const thermal::TransientResult tr =
            thermal::runTransient(net, segments, adapter.callbacks(), opt, thermal::restState(net, ambient));
        if (!tr.ok) {
            for (const std::string& p : tr.problems)
                r.warnings.push_back("transient: " + p);
        } else {
            TransientSummary t;
            for (const auto& s : net.sources)
                t.sources.push_back(s.name);
            std::size_t top = 0;
            for (std::size_t k = 1; k < tr.tjMax_C.size(); ++k)
                if (tr.tjMax_C[k] > tr.tjMax_C[top])
                    top = k;
            t.tjMax_C = tr.tjMax_C[top];
            t.tjMaxTime_s = std::fmod(tr.tjMaxTime_s[top], profile_s);
            t.tjMaxSource = net.sources[top].name;
            t.heatsinkMax_C = tr.heatsinkMax_C;
            t.heatsinkMaxTime_s = std::fmod(tr.heatsinkMaxTime_s, profile_s);
            t.time_s = tr.time_s;
            t.tj_C = tr.tj_C;
            t.heatsink_C = tr.heatsink_C;
            t.repetitions = tr.repetitionsRun;
            t.periodic = tr.periodic;
            t.steps = tr.steps;
            t.fullSolves = tr.resolves;
            if (d.thermal.untilPeriodic && !tr.periodic)
                r.warnings.push_back(
                    fmt::format("transient: not periodic after {} repetitions of the profile; raise "
                                "thermal.repetitions",
                                tr.repetitionsRun));

            // Junction peaks of the switches and of the diode against their ratings.
            const std::size_t n = net.sources.size() - 1;
            std::size_t sw = 0;
            for (std::size_t k = 1; k < n; ++k)
                if (tr.tjMax_C[k] > tr.tjMax_C[sw])
                    sw = k;
            auto junctionCheck = [&](const char* id, std::size_t k, double limit, const char* field) {
                const double tj = tr.tjMax_C[k];
                const Severity sev = tj > limit                       ? Severity::Fail
                                     : tj > limit - kJunctionMargin_K ? Severity::Warning
                                                                      : Severity::Pass;
                r.checks.push_back(makeCheck(
                    id, sev, tj, limit, "°C", "part rating; a 15 K margin below it is common practice",
                    fmt::format(
                        "over the duty profile {} peaks at {} °C, {} s into the profile, against T_j,max {} "
                        "°C",
                        net.sources[k].name, num(tj, 4), num(std::fmod(tr.tjMaxTime_s[k], profile_s)),
                        num(limit, 4)),
                    "Shorten the hardest segment, add devices (bank.count) or heatsink mass", field));
            };
            junctionCheck("thermal.transient-junction", sw, d.bank.device.tjMax_C, "bank.count");
            junctionCheck("thermal.transient-diode-junction", n, d.bank.freewheelDiode.tjMax_C,
                          "bank.diodeCount");
            // The duty itself decides how hot the sink gets: a short hard segment never reaches
            // its steady temperature, so the transient's peak replaces the steady worst case.
            {
                touch_C = t.heatsinkMax_C;
                touchWhere = "peak over the duty profile";
            }

            // Power-cycling life of each source over one repetition; the shortest is reported.
            const thermal::CyclingModel model{d.thermal.lifeCoefficient, d.thermal.lifeExponent,
                                              d.thermal.lifeActivation_eV, 1.0};
            const bool closed = tr.periodic || tr.repetitionsRun > 1;
            std::optional<LifeSummary> worst;
            for (std::size_t k = 0; k < net.sources.size(); ++k) {
                const thermal::LifeResult life =
                    thermal::cyclingLife(model, thermal::rainflow(tr.reversals_C[k], closed));
                if (worst && !(life.damagePerRepetition > worst->damagePerRepetition))
                    continue;
                LifeSummary l;
                l.source = net.sources[k].name;
                l.damagePerRepetition = life.damagePerRepetition;
                l.repetitionsToEnd = life.repetitionsToEnd;
                if (life.repetitionsToEnd)
                    l.hoursToEnd = *life.repetitionsToEnd * profile_s / 3600.0;
                l.note = life.note;
                for (const auto& c : life.cycles)
                    l.cycles.push_back({c.range_K, c.mean_C, c.count, c.cyclesToFailure});
                worst = std::move(l);
            }
            if (worst) {
                r.checks.push_back(makeCheck(
                    "thermal.cycling-life", Severity::Advice, worst->hoursToEnd.value_or(0.0), 0.0, "h",
                    "power cycling after Held et al. (PEDS 1997), N_f = A·ΔT^α·exp(E_a/(k_B·T_m)), Miner's "
                    "rule; "
                    "uncertain by an order of magnitude",
                    worst->repetitionsToEnd
                        ? fmt::format(
                              "{} wears out first: about {} repetitions of the profile ({} h of this duty) "
                              "from {} counted cycles per repetition. {}",
                              worst->source, num(*worst->repetitionsToEnd), num(*worst->hoursToEnd),
                              num(static_cast<double>(worst->cycles.size())), worst->note)
                        : std::string("no junction swing above 1 K: no power-cycling wear to count"),
                    "Smaller junction swings (more devices, a heavier heatsink) lengthen the life steeply "
                    "(ΔT^−5)",
                    "thermal.lifeCoefficient"));
                r.life = std::move(worst);
            }
            r.transient = std::move(t);
        }
    }
    touchCheck(d, touch_C, touchWhere, r);
}

} // namespace amp

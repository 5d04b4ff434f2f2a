// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/engine/stage_bank.h"

#include "core/bank/ballast.h"
#include "core/bank/bjtmodel.h"
#include "core/bank/darlingtonmodel.h"
#include "core/bank/runaway.h"
#include "core/bank/spread.h"
#include "core/bank/switchingimbalance.h"
#include "core/bank/thermalvoltage.h"
#include "core/checks/makecheck.h"
#include "core/physics/thermal_chain.h"
#include "core/units/units.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

namespace amp {

namespace {

// bank.spread-runaway: the share of Monte Carlo banks that may run away before the check fails
// (this tool's choice, see the header).
constexpr double kSpreadRunawayFail = 0.01;
// bank.runaway-margin: the highest on-state load, as a fraction of the runaway onset, that passes
// (this tool's choice: 20 % of headroom, see the header).
constexpr double kRunawayLoadFraction = 0.8;

// The collector current the base drive is built for (see the header).
double designCollectorCurrent(const Design& d) {
    if (d.pwm.currentLimit_A > 0.0)
        return d.pwm.currentLimit_A;
    return std::max(1, d.bank.count) * d.bank.derating * d.bank.device.currentRating_A;
}

double designBaseCurrent(const Design& d) {
    if (d.drive.baseDriveCurrent_A > 0.0)
        return d.drive.baseDriveCurrent_A;
    return designCollectorCurrent(d) / std::max(d.drive.forcedBeta, 1e-3);
}

// Forward voltage from the base terminal to the common return at a collector current, 25 °C.
double baseVoltage(const Design& d, double ic_A, double earlyVoltage_V) {
    const double t = kPartReference_K;
    const double ext = std::max(0.0, d.bank.ballast_ohm) + std::max(0.0, d.bank.legResistance_ohm);
    if (d.bank.device.kind == "darlington") {
        const DarlingtonModel m =
            DarlingtonModel::make(d.bank.device.driver, d.bank.device.bjt, 0.0, 0.0, earlyVoltage_V);
        return m.inputVoltage(ic_A, t) + ic_A * ext;
    }
    const BjtModel q = BjtModel::make(d.bank.device.bjt, 0.0, 0.0, earlyVoltage_V);
    const double ib = ic_A / q.betaAt(ic_A, t);
    return q.junctionVoltage(ic_A, t) + ib * q.rb_ohm + (ic_A + ib) * (q.re_ohm + ext);
}

} // namespace

// The shared base-drive resistance of a bipolar/Darlington bank (see the header); the design's
// driver resistance for MOSFETs.
double driveResistanceFor(const Design& d, double ballast_ohm, double earlyVoltage_V) {
    if (d.bank.device.kind != "bipolar" && d.bank.device.kind != "darlington")
        return d.drive.driverResistance_ohm;
    Design sized = d;
    sized.bank.ballast_ohm = ballast_ohm;
    const int n = std::max(d.bank.count, 1);
    const double ib = designBaseCurrent(d);
    const double vb = baseVoltage(sized, designCollectorCurrent(d) / n, earlyVoltage_V);
    if (ib > 0.0 && d.drive.supply_V > vb)
        return std::max(0.0, (d.drive.supply_V - vb) / ib - d.bank.gateResistor_ohm / n);
    return d.drive.driverResistance_ohm;
}

BankProblem bankProblemFor(const Design& d) {
    BankProblem p;
    p.part = d.bank.device;
    p.devices = d.bank.devices;
    p.devices.resize(static_cast<std::size_t>(std::max(d.bank.count, 0)));
    p.gateResistor_ohm = d.bank.gateResistor_ohm;
    p.ballast_ohm = d.bank.ballast_ohm;
    p.legResistance_ohm = d.bank.legResistance_ohm;
    p.pulldown_ohm = d.drive.pulldown_ohm;
    p.driveVoltage_V = d.drive.supply_V;
    p.driveResistance_ohm = driveResistanceFor(d, d.bank.ballast_ohm, p.earlyVoltage_V);
    p.feed = BankFeed::Current;
    p.busVoltage_V = d.supply.nominal_V;
    p.ambient_C = d.heatsink.ambient_C;
    p.rthCs_KperW = interfaceResistance(d.bank.interface);
    p.rthSa_KperW = std::max(0.0, d.heatsink.part.rthSa_KperW);
    p.neighbourCoupling_KperW = d.bank.neighbourCoupling_KperW;
    p.derating = d.bank.derating;
    p.sharingTarget = d.bank.sharingTarget;
    return p;
}

std::string baseDriveNote(const Design& d, const BankProblem& p) {
    if (d.bank.device.kind != "bipolar" && d.bank.device.kind != "darlington")
        return {};
    const double ib = designBaseCurrent(d);
    const std::string basis =
        d.drive.baseDriveCurrent_A > 0.0
            ? std::string("drive.baseDriveCurrent_A")
            : fmt::format("{} A / forced β {}", units::plain(designCollectorCurrent(d)),
                          units::plain(d.drive.forcedBeta));
    return fmt::format(
        "base drive: {} V behind {} Ω shared{}, built for {} A of base current in all ({})",
        units::plain(p.driveVoltage_V), units::plain(p.driveResistance_ohm),
        p.gateResistor_ohm > 0.0 ? fmt::format(" and {} Ω per base", units::plain(p.gateResistor_ohm))
                                 : std::string(", bases tied together"),
        units::plain(ib), basis);
}

void addBankStudies(const Design& d, const BankProblem& p, BankResult& bank) {
    const int n = static_cast<int>(p.devices.size());
    if (n < 1 || !validateBankProblem(p).empty())
        return;
    // Runaway load up to the controller's current limit (or the bank's rating without one).
    const double maxLoad = d.pwm.currentLimit_A > 0.0 ? d.pwm.currentLimit_A : n * p.part.currentRating_A;
    const RunawaySearch run = findRunawayLoad(p, std::max(maxLoad, p.load_A));
    bank.runawayLoad_A = run.load_A;
    if (!bank.firstToFail && run.firstToFail)
        bank.firstToFail = run.firstToFail;

    // The design's base drive is sized with its ballast in the path: each trial value re-sizes it
    // as the design would be (bankProblemFor).
    const BallastSearch ballast = findMinimumBallast(p, d.bank.sharingTarget, 10.0, [&](double ohm) {
        BankProblem q = p;
        q.ballast_ohm = ohm;
        q.driveResistance_ohm = driveResistanceFor(d, ohm, p.earlyVoltage_V);
        return q;
    });
    bank.minimumBallast_ohm = ballast.ballast_ohm;
    if (ballast.ballast_ohm) {
        bank.minimumBallastPower_W = ballast.ballastPower_W;
        bank.minimumBallastEfficiencyCost = ballast.efficiencyCost;
    }

    if (d.bank.spread.samples > 0) {
        BankSpreadResult s;
        const MonteCarloResult mc = runMonteCarlo(p, d.bank.spread);
        s.samples = mc.samples;
        s.seed = mc.seed;
        s.tjMax_C = {mc.tjMax_C.p50, mc.tjMax_C.p95, mc.tjMax_C.p99};
        s.maxShare = {mc.maxShare.p50, mc.maxShare.p95, mc.maxShare.p99};
        s.runawayFraction = mc.runawayFraction;
        const CornerResult corner = worstCaseCorner(p, d.bank.spread);
        s.cornerDevice = corner.favoured;
        if (corner.solution.stable) {
            double t = -1e300;
            for (const auto& dv : corner.solution.devices)
                t = std::max(t, dv.tj_C);
            s.cornerTjMax_C = t;
        }
        s.cornerMaxMinCurrentRatio = corner.solution.maxMinCurrentRatio;
        bank.spread = s;
    }

    const SwitchingImbalance sw = estimateSwitchingImbalance(p, d.pwm.frequency_Hz, p.busVoltage_V);
    if (sw.applicable)
        bank.switchingImbalance_W = sw.extraPower_W;
}

void addBankStudyChecks(const Design&, const OperatingPointResult& op, std::vector<Check>& out) {
    const std::string& name = op.name;
    const BankResult& b = op.bank;
    using units::plain;

    if (b.spread && b.spread->samples > 0) {
        const BankSpreadResult& s = *b.spread;
        const double fraction = std::clamp(s.runawayFraction, 0.0, 1.0);
        const long long running = std::llround(fraction * s.samples);
        const bool cornerRuns = !s.cornerTjMax_C.has_value();
        const Severity sev = fraction >= kSpreadRunawayFail   ? Severity::Fail
                             : fraction > 0.0 || cornerRuns ? Severity::Warning
                                                            : Severity::Pass;
        const std::string corner =
            cornerRuns ? fmt::format("the worst-case corner (device {} favoured) runs away too",
                                     s.cornerDevice.value_or(0))
                       : fmt::format("the worst-case corner (device {} favoured) settles with its hottest "
                                     "junction at {} °C",
                                     s.cornerDevice.value_or(0), plain(*s.cornerTjMax_C, 4));
        std::string message =
            fmt::format("{}: {} of {} banks drawn from the stated spread ({} %) run away or pass T_j,max; {}", name,
                        running, s.samples, plain(100.0 * fraction), corner);
        if (sev != Severity::Pass && b.stable)
            message += ", although the bank with the stated parts is stable";
        out.push_back(makeCheck(
            "bank.spread-runaway", sev, fraction, kSpreadRunawayFail, "",
            "this tool's rule: fail when 1 % or more of the Monte Carlo banks run away, warning when fewer do "
            "or only the worst-case corner does (bank.spread, core/bank/spread.h)",
            std::move(message),
            "Add emitter/source ballast (bank.ballast_ohm), stiffen the gate/base drive, lower the thermal "
            "resistance (heatsink.part.rthSa_KperW), add devices (bank.count) or buy matched parts (bank.spread)",
            "bank.ballast_ohm", name));
    }

    if (b.runawayLoad_A && *b.runawayLoad_A > 0.0) {
        double load = 0.0; // on-state bank current, as the runaway scan counts it
        for (const auto& dv : op.devices)
            load += dv.current_A;
        if (load > 0.0) {
            const double onset = *b.runawayLoad_A;
            const double ratio = load / onset;
            const Severity sev = ratio > kRunawayLoadFraction ? Severity::Warning : Severity::Pass;
            out.push_back(makeCheck(
                "bank.runaway-margin", sev, ratio, kRunawayLoadFraction, "",
                "this tool's rule: the on-state load at most 80 % of the runaway onset (20 % headroom for a "
                "warmer day, a fouled heatsink or parts at their spread, which the onset does not include)",
                fmt::format("{}: the bank runs away above {} A of on-state current (device {} first); this "
                            "point's {} A is {} % of that onset, {} % allowed",
                            name, plain(onset, 4), b.firstToFail.value_or(0), plain(load, 4), plain(100.0 * ratio),
                            plain(100.0 * kRunawayLoadFraction)),
                "Add emitter/source ballast (bank.ballast_ohm), add devices (bank.count) or lower the thermal "
                "resistance (heatsink.part.rthSa_KperW)",
                "bank.ballast_ohm", name));
        }
    }
}

} // namespace amp

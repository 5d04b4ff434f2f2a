// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/engine/stage_bank.h"

#include "core/bank/ballast.h"
#include "core/bank/bjtmodel.h"
#include "core/bank/darlingtonmodel.h"
#include "core/bank/runaway.h"
#include "core/bank/spread.h"
#include "core/bank/switchingimbalance.h"
#include "core/bank/thermalvoltage.h"
#include "core/physics/thermal_chain.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

namespace amp {

namespace {

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
            : fmt::format("{:.3g} A / forced β {:.3g}", designCollectorCurrent(d), d.drive.forcedBeta);
    return fmt::format(
        "base drive: {:.3g} V behind {:.3g} Ω shared{}, built for {:.3g} A of base current in all ({})",
        p.driveVoltage_V, p.driveResistance_ohm,
        p.gateResistor_ohm > 0.0 ? fmt::format(" and {:.3g} Ω per base", p.gateResistor_ohm)
                                 : std::string(", bases tied together"),
        ib, basis);
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

} // namespace amp

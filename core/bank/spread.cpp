// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/bank/spread.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace amp {

double RandomStream::uniform() {
    // Top 53 bits: exactly representable, the same on every platform.
    return static_cast<double>(m_engine() >> 11) * (1.0 / 9007199254740992.0);
}

double RandomStream::uniformSymmetric() {
    return 2.0 * uniform() - 1.0;
}

double RandomStream::normal() {
    if (m_hasSpare) {
        m_hasSpare = false;
        return m_spare;
    }
    double u, v, s;
    do {
        u = uniformSymmetric();
        v = uniformSymmetric();
        s = u * u + v * v;
    } while (s >= 1.0 || s == 0.0);
    const double f = std::sqrt(-2.0 * std::log(s) / s);
    m_spare = v * f;
    m_hasSpare = true;
    return u * f;
}

namespace {

bool isNormal(const Spread& s) {
    return s.distribution != "uniform";
}

double draw(const Spread& s, RandomStream& r) {
    return isNormal(s) ? r.normal() : r.uniformSymmetric();
}

// Thermal reasons for not being stable (as opposed to a drive that cannot hold the load).
bool thermallyUnstable(const BankSolution& s) {
    if (s.failure == BankFailure::CannotCarryLoad || s.failure == BankFailure::InvalidInput)
        return false;
    return !s.stable;
}

} // namespace

void drawDeviations(BankProblem& p, const Spread& spread, RandomStream& random) {
    for (BankDevice& d : p.devices) {
        const double zR = draw(spread, random);
        const double zVth = draw(spread, random);
        const double zVbe = draw(spread, random);
        const double zBeta = draw(spread, random);
        const double zGate = draw(spread, random);
        d.rdsOnDeviation = std::max(spread.rdsOn * zR, -0.9);
        d.vthDeviation_V = spread.vth_V * zVth;
        d.vbeDeviation_V = spread.vbe_V * zVbe;
        d.betaDeviation = std::max(spread.beta * zBeta, -0.9);
        d.gateResistorDeviation_ohm = std::max(spread.gateResistor * zGate, -0.9) * p.gateResistor_ohm;
    }
}

std::optional<double> percentile(std::vector<double> values, double fraction) {
    if (values.empty())
        return std::nullopt;
    std::sort(values.begin(), values.end());
    const auto n = values.size();
    auto rank = static_cast<std::size_t>(std::ceil(fraction * static_cast<double>(n)));
    rank = std::clamp<std::size_t>(rank, 1, n);
    const double v = values[rank - 1];
    if (!std::isfinite(v))
        return std::nullopt;
    return v;
}

MonteCarloResult runMonteCarlo(const BankProblem& problem, const Spread& spread) {
    MonteCarloResult r;
    r.samples = std::max(spread.samples, 0);
    r.seed = spread.seed;
    const BankSolution nominal = solveBank(problem);
    for (const auto& d : nominal.devices)
        r.nominalTjMax_C = std::max(r.nominalTjMax_C, d.tj_C);
    if (r.samples == 0)
        return r;
    RandomStream random(static_cast<std::uint64_t>(static_cast<std::int64_t>(spread.seed)));
    std::vector<double> tj, share;
    tj.reserve(static_cast<std::size_t>(r.samples));
    share.reserve(static_cast<std::size_t>(r.samples));
    int runaway = 0, drive = 0;
    const double inf = std::numeric_limits<double>::infinity();
    BankProblem p = problem;
    for (int i = 0; i < r.samples; ++i) {
        drawDeviations(p, spread, random);
        const BankSolution s = solveBank(p, nominal.converged ? &nominal : nullptr);
        if (s.failure == BankFailure::CannotCarryLoad)
            ++drive;
        if (thermallyUnstable(s))
            ++runaway;
        if (s.stable) {
            double t = -inf;
            for (const auto& d : s.devices)
                t = std::max(t, d.tj_C);
            tj.push_back(t);
            share.push_back(s.maxShare);
        } else {
            tj.push_back(inf);
            share.push_back(inf);
        }
    }
    r.tjMax_C = {percentile(tj, 0.50), percentile(tj, 0.95), percentile(tj, 0.99)};
    r.maxShare = {percentile(share, 0.50), percentile(share, 0.95), percentile(share, 0.99)};
    r.runawayFraction = static_cast<double>(runaway) / r.samples;
    r.driveFailureFraction = static_cast<double>(drive) / r.samples;
    return r;
}

BankProblem cornerProblem(const BankProblem& problem, const Spread& spread, int favoured, double sigmas) {
    BankProblem p = problem;
    const double k = isNormal(spread) ? sigmas : 1.0;
    for (std::size_t i = 0; i < p.devices.size(); ++i) {
        BankDevice& d = p.devices[i];
        const double s = static_cast<int>(i) == favoured ? -1.0 : 1.0; // −: takes more current
        d.rdsOnDeviation = std::max(s * k * spread.rdsOn, -0.9);
        d.vthDeviation_V = s * k * spread.vth_V;
        d.vbeDeviation_V = s * k * spread.vbe_V;
        d.betaDeviation = std::max(-s * k * spread.beta, -0.9);
        d.gateResistorDeviation_ohm = std::max(s * k * spread.gateResistor, -0.9) * p.gateResistor_ohm;
    }
    return p;
}

CornerResult worstCaseCorner(const BankProblem& problem, const Spread& spread, double sigmas) {
    CornerResult worst;
    worst.extent = isNormal(spread) ? sigmas : 1.0;
    const int n = static_cast<int>(problem.devices.size());
    // Positions differ only through coupling or per-device resistances; otherwise one will do.
    bool positionsDiffer = problem.neighbourCoupling_KperW > 0.0 && n > 2;
    for (const BankDevice& d : problem.devices)
        if (d.ballastDeviation_ohm != 0.0 || d.legResistanceDeviation_ohm != 0.0)
            positionsDiffer = true;
    const int tries = positionsDiffer ? n : std::min(n, 1);
    bool have = false;
    auto worse = [](const BankSolution& a, const BankSolution& b) {
        if (a.stable != b.stable)
            return !a.stable;
        double ta = -1e300, tb = -1e300;
        for (const auto& d : a.devices)
            ta = std::max(ta, d.tj_C);
        for (const auto& d : b.devices)
            tb = std::max(tb, d.tj_C);
        return ta > tb;
    };
    for (int h = 0; h < tries; ++h) {
        BankProblem p = cornerProblem(problem, spread, h, sigmas);
        BankSolution s = solveBank(p);
        if (!have || worse(s, worst.solution)) {
            worst.favoured = h;
            worst.problem = std::move(p);
            worst.solution = std::move(s);
            have = true;
        }
    }
    return worst;
}

} // namespace amp

// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Parameter spread of a bank: a worst-case corner and a Monte Carlo run.
//
// Spread (model/design.h): per parameter a normal σ or a uniform ± band — R_ds(on) (relative),
// V_th (V), V_BE (V), β (relative), gate/base resistor (relative).
// Random numbers: std::mt19937_64, whose output sequence the C++ standard fixes (the 10000th
// draw from the default seed is 9981545732273789042), with our own transforms so every platform
// draws the same sequence: uniform in [0, 1) from the top 53 bits; normal by Marsaglia's polar
// method (Marsaglia & Bray, SIAM Review 6, 1964), which needs only log and sqrt. The same seed
// gives the same results.
// Each device draws, in this order, R_ds(on), V_th, V_BE, β and gate-resistor deviations (all five
// whatever the device kind, so the sequence does not depend on it); relative deviations are held
// above −0.9. Ballast and leg deviations stay as stated.
// Worst-case corner: one device at the extreme that makes it take more current (R_ds(on) −e,
// V_th −e, V_BE −e, β +e, gate resistor −e) and all others at the opposite extreme, with
// e = k·σ (normal, default k = 3) or the band (uniform). Every position is tried when positions
// differ thermally or electrically (neighbour coupling, per-device resistances); the worst is kept
// (not stable first, then the highest T_j).
// Monte Carlo: each sample is a full electrothermal solve (warm-started from the nominal bank).
// Reported: nearest-rank p50/p95/p99 of the bank's highest T_j and of the largest device share;
// samples without a stable fixed point count as +∞ in those rankings (a percentile that lands
// among them is empty: "beyond runaway"); the runaway fraction is the share of samples that are
// not stable for thermal reasons (loop gain ≥ 1, no fixed point, or T_j ≥ T_j,max).

#include "core/bank/banksolver.h"

#include <cstdint>
#include <optional>
#include <random>
#include <vector>

namespace amp {

class RandomStream {
  public:
    explicit RandomStream(std::uint64_t seed) : m_engine(seed) {}
    double uniform();          ///< [0, 1)
    double uniformSymmetric(); ///< [−1, 1)
    double normal();           ///< standard normal

  private:
    std::mt19937_64 m_engine;
    bool m_hasSpare = false;
    double m_spare = 0.0;
};

/// Fresh deviations for every device of `problem` (ballast and leg deviations kept).
void drawDeviations(BankProblem& problem, const Spread& spread, RandomStream& random);

struct Percentiles {
    std::optional<double> p50, p95, p99; ///< empty: the rank falls among unstable samples
};

/// Nearest-rank percentile of `values` (+∞ for unstable samples); empty when it lands on +∞.
std::optional<double> percentile(std::vector<double> values, double fraction);

struct MonteCarloResult {
    int samples = 0;
    std::int64_t seed = 0;
    Percentiles tjMax_C;
    Percentiles maxShare;
    double runawayFraction = 0.0;
    double driveFailureFraction = 0.0; ///< samples the drive cannot hold on
    double nominalTjMax_C = 0.0;
};

MonteCarloResult runMonteCarlo(const BankProblem& problem, const Spread& spread);

struct CornerResult {
    int favoured = 0;    ///< the device at the favourable extreme
    double extent = 0.0; ///< k·σ or the band, relative/volts as the parameter
    BankProblem problem; ///< the corner bank
    BankSolution solution;
};

CornerResult worstCaseCorner(const BankProblem& problem, const Spread& spread, double sigmas = 3.0);

/// The corner bank with device `favoured` at the favourable extreme.
BankProblem cornerProblem(const BankProblem& problem, const Spread& spread, int favoured,
                          double sigmas = 3.0);

} // namespace amp

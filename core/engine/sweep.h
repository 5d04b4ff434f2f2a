// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// A design-space map: one operating point of a design evaluated for every combination of the
// number of parallel switches and the PWM frequency, on every core. Each cell is the design with
// bank.count and pwm.frequency_Hz replaced (devices added by normalizeBank are nominal parts) and
// the duty profile cut to the chosen segment, evaluated without the design-wide studies (stall,
// protection sizing: they do not change with the point's figures shown here). A thread takes a
// whole row (one device count) and goes along it in order of frequency, each cell starting its
// coupled solve from its left neighbours' settled states (core/engine/evaluate_nearby.h): the
// cells agree with a cold evaluate() of the same design within the solvers' tolerances, and the
// map is the same whatever the number of threads.
// The answer per cell is what a builder reads off such a map: can the point be reached, how hot
// the hottest junction runs, what the stage dissipates, whether the bank is stable, and how many
// checks fail there.

#include "core/model/design.h"
#include "core/model/problem.h"

#include <cstddef>
#include <string>
#include <vector>

namespace amp {

struct CountFrequencyGrid {
    int countMin = 1;                  ///< fewest devices in parallel, 1…64
    int countMax = 16;                 ///< most devices in parallel, countMin…64
    double frequencyMin_Hz = 2000.0;   ///< lowest PWM frequency, > 0
    double frequencyMax_Hz = 40000.0;  ///< highest PWM frequency, ≥ frequencyMin_Hz
    int frequencies = 20;              ///< frequency steps, 1…2000 (1: frequencyMin_Hz alone)
    bool logarithmic = false;          ///< geometric instead of even frequency steps
    std::size_t point = 0;             ///< index of the duty-profile segment evaluated
    int threads = 0;                   ///< worker threads; 0 = every hardware thread
};

struct SweepCell {
    int count = 0;
    double frequency_Hz = 0.0;
    bool valid = false;                ///< the point could be reached and solved
    std::string reason;                ///< why not, when !valid
    double tjMax_C = 0.0;              ///< hottest switch junction
    double heatsink_C = 0.0;
    double bankLoss_W = 0.0;           ///< switches, ballast and legs
    double totalLoss_W = 0.0;          ///< the power stage
    double efficiency = 0.0;           ///< motor-terminal power / battery power (0 when not defined)
    bool stable = false;               ///< the bank's electrothermal state is stable
    double maxMinCurrentRatio = 0.0;
    int failedChecks = 0;              ///< checks of severity "fail" at this point and design-wide
    std::string firstFailure;          ///< the first of them (its message), for a tooltip
};

struct SweepResult {
    std::vector<Problem> problems;     ///< the grid or the design cannot be swept (nothing computed)
    std::string pointName;             ///< the segment evaluated
    int counts = 0;                    ///< rows: countMin…countMax
    int frequencies = 0;               ///< columns
    std::vector<SweepCell> cells;      ///< row-major: cells[(count − countMin)·frequencies + j]
    bool ok() const { return problems.empty(); }
    const SweepCell& at(int count, int frequencyIndex) const;
};

/// The frequencies of the grid's columns, in Hz.
std::vector<double> gridFrequencies(const CountFrequencyGrid& grid);

/// Evaluate every cell; deterministic (each cell depends on its own row only, whatever the number
/// of threads).
SweepResult sweepCountAndFrequency(const Design& design, const CountFrequencyGrid& grid);

} // namespace amp

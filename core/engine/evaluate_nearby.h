// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// evaluate() along a sequence of nearby designs (the count × frequency map, core/engine/sweep.h:
// one row, the same bank at rising PWM frequencies). Each evaluation starts its operating points'
// coupled solve (the bank's network, the chopper and the loss stage: evaluate.cpp, solveBankPoint)
// from the state the previous one settled at, instead of from ambient. The fixed point is the
// same; the answer differs from a cold evaluate() only within the solvers' tolerances (the rounds
// settle to 1e-6 relative, the bank's junctions to 1e-6 K), and it depends on the order of the
// sequence only that far.

#include "core/engine/evaluate.h"
#include "core/engine/stage_thermal.h"

#include <optional>
#include <vector>

namespace amp {

/// The settled coupled state of one operating point.
struct PointState {
    double frequency_Hz = 0.0;          ///< the PWM frequency it was settled at
    std::vector<double> y;              ///< V0, R_b, T_diode, R_th,sa, I_x; the shares; the junctions
    std::vector<double> resistance_ohm; ///< each device's on-state V/I
    std::vector<double> bankState;      ///< the bank network's unknowns and junctions (solveBank's warm start)
};

/// The last settled states of one operating point (at most four, each at its own PWM frequency,
/// newest last): the next design starts from their polynomial extrapolation in the frequency
/// (along a row of the map the states move smoothly with it; through four states the
/// prediction's error is fourth order in the step). Emptied when a design's point does not settle
/// or runs away: the next one then starts cold.
struct PointMemory {
    bool mosfet = true;                 ///< the bank's kind they belong to
    std::vector<PointState> settled;
};

/// What one evaluation leaves for the next; one per sequence (and thread).
struct EvaluationMemory {
    std::vector<PointMemory> points;    ///< per duty-profile segment
    /// The heatsink as the engine uses it, with the R_th,sa grid points it has solved (a plate-fin
    /// heatsink costs a few solves per evaluation otherwise), and what it was made from: reused
    /// only by a design with the same heatsink, bank size, diode count and interface area.
    std::optional<HeatsinkModel> heatsink;
    Heatsink heatsinkOf;
    int heatsinkCount = 0, heatsinkDiodes = 0;
    double heatsinkArea_m2 = 0.0;
};

/// evaluate() with the warm starts above; `memory` is read and then holds this design's states.
/// A state is used only by a design with the same bank size and device kind.
Results evaluateNear(const Design& design, const EvaluateOptions& options, EvaluationMemory& memory);

} // namespace amp

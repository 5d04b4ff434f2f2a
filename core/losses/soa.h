// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Electrical stress limits of one switching device: the safe operating area (linear-mode
// operation, bipolar second breakdown), the short-circuit withstand time and the package lead
// current limit.
//
// SOA: the part's points (V, I, pulse) form one curve per pulse length (pulse 0 = DC). An
// operating point of duration t is checked against the curve of the shortest pulse ≥ t (the DC
// curve for t = 0 or longer than every pulsed curve). Between points the current limit is
// interpolated on log-log axes (the SOA boundaries are straight lines there: constant power,
// second breakdown); below the first point's voltage the limit is that point's current; beyond the
// last point the last segment's slope continues (−1, constant power, for a single point); no
// point is allowed above the voltage rating.
// Short circuit: the protection must act within the stated withstand time.
// Lead limit: the device's RMS current against the package lead (bond wire, pin) limit.
// Sources: SOA reading and log-log interpolation as in power-semiconductor datasheets
// (common practice); the package lead limit of 75–100 A for TO-220-class packages is trade
// knowledge; Baliga, "Fundamentals of Power Semiconductor Devices", for second breakdown (from
// memory).
//
// Units and valid ranges: V in V (≥ 0), I in A (≥ 0), durations in s (≥ 0, 0 = DC), SOA points
// with V > 0 and I > 0.

#include "core/losses/inputcheck.h"
#include "core/model/parts.h"

#include <string>
#include <vector>

namespace amp::losses {

/// A point the device passes through: on-state, a switching transition, a linear-mode hold.
struct StressPoint {
    std::string name;
    double voltage_V = 0.0;
    double current_A = 0.0;
    double duration_s = 0.0;            ///< 0 = continuous
};

struct SoaInput {
    std::vector<SoaPoint> soa;
    double voltageRating_V = 100.0;
    std::vector<StressPoint> points;
    double leadLimit_A = 0.0;           ///< 0 = not stated
    double rmsCurrent_A = 0.0;          ///< per device, for the lead check
    double shortCircuitTime_s = 0.0;    ///< withstand (0 = not rated)
    double protectionResponse_s = 0.0;  ///< time the short-circuit protection needs (0 = none given)
};

struct SoaPointResult {
    std::string name;
    LimitCheck check;                   ///< current against the interpolated limit (rated = a curve applies)
    double curvePulse_s = 0.0;          ///< the curve used (0 = DC)
};

struct SoaResult {
    std::vector<Problem> problems;
    std::vector<SoaPointResult> points;
    LimitCheck lead;
    LimitCheck shortCircuit;            ///< protection response against the withstand time
    bool anyFailed = false;
    bool ok() const { return problems.empty(); }
};

/// The SOA current limit at `voltage_V` on the curve of one pulse length (points of that pulse).
/// Returns 0 above the voltage rating.
double soaLimit(const std::vector<SoaPoint>& curve, double voltage_V, double voltageRating_V);

SoaResult checkStress(const SoaInput& in);

} // namespace amp::losses

// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Results of the protection stage (engine/stage_protection.h): reversing contactor and its
// sequence, main disconnect, pre-charge, cables, fuse and the full-bridge comparison. Plain data,
// SI units (°C in _C names, mm² in _mm2 names). Each part is empty when the design has nothing to
// compute it from (no reversing contactor, no fuse stated, ...); the JSON then holds null.

#include <optional>
#include <string>
#include <vector>

namespace amp {

struct ReversalStepResult {
    std::string name; ///< stable id of the step, e.g. "pwmOffCurrentDecay"
    double duration_s = 0.0;
};

/// The reversal timeline from the worst operating point (the longest sequence).
struct ReversalSummary {
    std::string fromPoint; ///< the operating point the reversal starts from
    std::vector<ReversalStepResult> steps;
    double total_s = 0.0;
    double coilDropout_s = 0.0;              ///< with the chosen coil suppression
    double changeoverSpeed_rpm = 0.0;        ///< highest speed at which the contactor may change over
    double changeoverAtSpeedCurrent_A = 0.0; ///< (E − V_f)/R at that speed, PWM off
    double pluggingCurrent_A = 0.0;          ///< (D·V + E)/R at restart
    bool allowsReversalAboveStop = false;
};

struct ContactorSummary {
    double motorTimeConstant_s = 0.0;
    double categoryTimeConstant_s = 0.0;    ///< test-circuit L/R it is compared with
    std::optional<double> continuousMargin; ///< thermal current / motor RMS current
    bool mustNotBreakLoad = false;
    std::string reason;
    double coilCurrent_A = 0.0;
    double coilPower_W = 0.0;
    double contactLoss_W = 0.0;
    std::optional<double> electricalLife_years;
};

struct DisconnectSummary {
    double requiredBreak_A = 0.0;
    double stallCurrent_A = 0.0; ///< shorted bank, stalled motor, highest bus voltage
    double shortCircuitCurrent_A = 0.0;
};

struct PrechargeSummary {
    bool present = true;
    double resistor_ohm = 0.0;
    double time_s = 0.0;
    double peakCurrent_A = 0.0;
    double peakPower_W = 0.0;
    double energy_J = 0.0;          ///< into the resistor for a full charge
    double closingCurrent_A = 0.0;  ///< when the main contactor closes at the target
    double inrushUncharged_A = 0.0; ///< closing with no pre-charge
};

struct CableSummary {
    std::string name;              ///< "battery" or "motor"
    double crossSection_mm2 = 0.0; ///< as installed
    double drop_V = 0.0;
    double loss_W = 0.0;
    double conductorTemperature_C = 0.0;
    double ampacity_A = 0.0;
    std::optional<double> requiredCrossSection_mm2; ///< smallest standard size meeting drop and temperature
};

struct FuseSummary {
    double prospectiveShortCircuit_A = 0.0;
    std::optional<double> continuousMargin;
    double cableWithstand_A2s = 0.0;
};

struct BridgeOptionSummary {
    std::string id;
    std::string name;
    int switchCount = 0;
    int diodeCount = 0;
    int contactorCount = 0;
    double conductionLoss_W = 0.0;
    double reversal_s = 0.0;
    std::string braking;
    double cost = 0.0;
    bool costComplete = true;
};

struct ProtectionResults {
    std::optional<ReversalSummary> reversal;
    std::optional<ContactorSummary> contactor;
    std::optional<DisconnectSummary> mainDisconnect;
    std::optional<PrechargeSummary> precharge;
    std::optional<CableSummary> cable; ///< the battery cable
    std::optional<CableSummary> motorCable;
    std::optional<FuseSummary> fuse;
    std::vector<BridgeOptionSummary> bridgeComparison;
};

} // namespace amp

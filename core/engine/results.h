// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// What the engine returns: plain data, SI units (°C in _C names). The results JSON is written
// from these structs by engine/results_json.h and documented in the README.

#include "core/engine/protection_results.h"

#include <optional>
#include <string>
#include <vector>

namespace amp {

enum class Severity { Pass, Advice, Warning, Fail };
const char* toString(Severity s); ///< "pass", "advice", "warning", "fail"

/// One design check: the number behind it, the limit and where the limit comes from, what it
/// means and what to change.
struct Check {
    std::string id;                 ///< stable id of our own, e.g. "thermal.junction-margin"
    Severity severity = Severity::Pass;
    double value = 0.0;
    double limit = 0.0;
    std::string unit;               ///< SI symbol of value and limit ("" for ratios)
    std::string source;             ///< where the limit comes from
    std::string message;            ///< plain explanation with the numbers
    std::string fix;                ///< what to change
    std::string field;              ///< design field path to change, e.g. "bank.count"
    std::string operatingPoint;     ///< segment name ("" for design-wide checks)
};

/// Per-device results in one operating point.
struct DeviceResult {
    std::string bank = "switch";    ///< bank role: "switch" (chopper), "high"/"low", "highA"/"lowA"/"highB"/"lowB"
    double current_A = 0.0;         ///< average current while the switch conducts (motor share)
    double averageCurrent_A = 0.0;  ///< over the PWM period
    double rmsCurrent_A = 0.0;      ///< over the PWM period
    double share = 0.0;             ///< fraction of the bank current
    double ratingShare = 0.0;       ///< on-state current / rated current
    double voltage_V = 0.0;         ///< on-state drop across the device
    double conduction_W = 0.0;
    double switching_W = 0.0;
    double diode_W = 0.0;           ///< body diode (synchronous topologies)
    double ballast_W = 0.0;
    double leg_W = 0.0;             ///< in the device's leg (busbar/trace); not on the heatsink
    double drive_W = 0.0;           ///< gate/base drive dissipated in the die (internal gate resistance,
                                    ///< base-emitter); the driver's own and its resistors' share are not here
    double loss_W = 0.0;            ///< device total (without ballast)
    double tj_C = 0.0;
    double tcase_C = 0.0;
};

/// The freewheel diode (all diodes of the freewheel path together, per-diode T_j).
struct DiodeResult {
    double averageCurrent_A = 0.0;
    double rmsCurrent_A = 0.0;
    double loss_W = 0.0;            ///< all freewheel diodes together
    double tj_C = 0.0;
};

/// Results of the bank's electrothermal solve in one operating point (see bank/).
struct BankResult {
    bool converged = true;
    std::string failure;            ///< reason when not converged
    bool stable = true;
    std::optional<double> loopGain; ///< empty when there is no fixed point
    std::string dominantMode = "common"; ///< "common" or "differential"
    std::optional<double> runawayLoad_A;
    std::optional<int> firstToFail;
    double maxMinCurrentRatio = 1.0;
    std::optional<double> minimumBallast_ohm;
};

/// One operating point (one duty-profile segment).
struct OperatingPointResult {
    std::string name;
    std::string mode;
    bool valid = true;              ///< false when the point cannot be reached (message in notes)
    std::vector<std::string> notes;
    bool currentLimited = false;    ///< the controller's limit holds the current
    double motorCurrent_A = 0.0;    ///< average armature current
    double batteryCurrent_A = 0.0;  ///< average current drawn from the battery
    double duty = 0.0;
    double speed_rpm = 0.0;
    double torque_Nm = 0.0;         ///< shaft torque
    double backEmf_V = 0.0;
    double busVoltage_V = 0.0;      ///< at the bus capacitors, after the battery and cable drop
    double ripplePeakToPeak_A = 0.0;
    double motorPeakCurrent_A = 0.0; ///< highest instantaneous armature current
    double motorMinCurrent_A = 0.0; ///< lowest instantaneous armature current (0 in DCM)
    double rippleLinear_A = 0.0;    ///< the linear approximation, for comparison
    std::string conductionMode = "continuous"; ///< "continuous" or "discontinuous"
    double motorRmsCurrent_A = 0.0;
    double switchAverageCurrent_A = 0.0; ///< whole bank
    double switchRmsCurrent_A = 0.0;
    double diodeAverageCurrent_A = 0.0;
    double diodeRmsCurrent_A = 0.0;
    double capacitorRmsCurrent_A = 0.0;
    double busCapacitorRipple_A = 0.0; ///< RMS in the bus capacitors, with the battery cable's share
    double overshoot_V = 0.0;       ///< turn-off L·di/dt above the bus (clamped at breakdown)
    double avalancheEnergy_J = 0.0; ///< clamped energy per turn-off (0 when the peak stays below breakdown)
    double inputPower_W = 0.0;      ///< at the bus: busVoltage × batteryCurrent
    double batteryLoss_W = 0.0;     ///< in the battery's internal resistance and battery cable
    double motorInputPower_W = 0.0; ///< at the controller's motor output: cable, contacts, motor
    double mechanicalPower_W = 0.0; ///< shaft output
    double motorCopperLoss_W = 0.0;
    double motorCableLoss_W = 0.0;
    double contactorLoss_W = 0.0;   ///< reversing contactor contacts in the armature path
    double motorMechanicalLoss_W = 0.0; ///< no-load (friction, iron) loss k·I0·ω
    double bankLoss_W = 0.0;        ///< switches + ballast + legs
    double totalLoss_W = 0.0;       ///< power stage: bank + ballast + freewheel diodes
    std::optional<double> efficiency; ///< motor-terminal power / battery power
    double heatsinkTemperature_C = 0.0;
    std::vector<DeviceResult> devices;
    DiodeResult freewheelDiode;
    BankResult bank;
};

/// The heatsink at the hottest steady operating point (thermal/heatsink.h).
struct HeatsinkSummary {
    std::string mode;               ///< "stated" or "geometry"
    double rthSa_KperW = 0.0;       ///< at the heat load of that point
    double temperature_C = 0.0;     ///< mounting surface at that point
    std::string operatingPoint;     ///< the point
    double heat_W = 0.0;            ///< heat into the sink there
    double heatCapacity_JperK = 0.0;
    std::optional<double> finSpacing_m;        ///< geometry mode
    std::optional<double> optimumFinSpacing_m; ///< geometry mode, natural convection
    std::optional<double> optimumFinCount;     ///< fins of the given thickness at the optimum spacing
    std::vector<std::string> notes;
};

/// The duty-profile transient (thermal/transient.h): series over the last profile repetition.
struct TransientSummary {
    std::vector<std::string> sources; ///< "Q1" … "Qn", then "D" (one freewheel diode)
    double tjMax_C = 0.0;           ///< hottest junction (switches and diode) over the run
    double tjMaxTime_s = 0.0;       ///< when, from the start of the profile
    std::string tjMaxSource;
    double heatsinkMax_C = 0.0;
    double heatsinkMaxTime_s = 0.0; ///< from the start of the profile
    std::vector<double> time_s;
    std::vector<std::vector<double>> tj_C; ///< [source][sample]
    std::vector<double> heatsink_C;
    int repetitions = 0;            ///< profile repetitions simulated
    bool periodic = false;          ///< the last repetition ended where it started
    std::size_t steps = 0;
    std::size_t fullSolves = 0;
};

/// One counted junction-temperature cycle and its life (thermal/cycling_life.h).
struct LifeCycleResult {
    double range_K = 0.0;
    double mean_C = 0.0;
    double count = 0.0;             ///< per profile repetition
    double cyclesToFailure = 0.0;
};

/// Power-cycling life of the most stressed source over one profile repetition.
struct LifeSummary {
    std::string source;
    std::vector<LifeCycleResult> cycles;
    double damagePerRepetition = 0.0;
    std::optional<double> repetitionsToEnd;
    std::optional<double> hoursToEnd; ///< repetitions × profile duration
    std::string note;               ///< the model's uncertainty, for display
};

/// Everything evaluate() computes for one design.
struct Results {
    int formatVersion = 1;
    std::string design;             ///< the design's title
    std::string variant;            ///< active variant ("" when the design has none)
    std::string topology;
    std::vector<OperatingPointResult> operatingPoints;
    std::vector<Check> checks;
    double maxJunction_C = 0.0;     ///< hottest switch junction over all points
    double maxTotalLoss_W = 0.0;
    std::vector<std::string> warnings; ///< solver notes that are not checks
    ProtectionResults protection;   ///< contactors, reversal, pre-charge, cables, fuse (engine/stage_protection.h)
    std::optional<HeatsinkSummary> heatsink;
    std::optional<TransientSummary> transient; ///< full evaluation only
    std::optional<double> stallTimeToLimit_s;  ///< empty when the limit is never reached
    std::optional<LifeSummary> life;           ///< full evaluation only
};

/// The worst severity among the checks (Pass when there are none).
Severity worstSeverity(const std::vector<Check>& checks);

} // namespace amp

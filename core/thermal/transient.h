// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Transient temperatures of a bank of devices (and the freewheel diode) on one shared heatsink.
//
// Network, per source k (a switch, or the freewheel diodes as one group):
//   junction → case: the Foster network of Z_th,jc (R_i, τ_i), or the steady R_th,jc as a
//     massless resistor when no Foster data is given;
//   case → heatsink: the interface R_th,cs (massless);
//   one heatsink node with heat capacity C = m·c_p and R_sa(ΔT) to ambient (heatsink.h curve).
//   T_j,k = T_hs + P_k·R_cs,k + Σ_i θ_k,i,   τ_i·dθ_k,i/dt = R_i·P_k − θ_k,i
//   C·dT_hs/dt = Σ_k n_k·P_k − (T_hs − T_amb)/R_sa
//
// How the Foster fit is joined to the heatsink: a Foster network is a curve fit of the
// junction's response with the case held at a fixed temperature; its inner nodes are not
// physical and it cannot be chained with the heatsink's network (doing so would give wrong
// temperatures). So each device's Foster network rides on top of the case temperature, which is
// the heatsink temperature plus the interface drop, and the heatsink node receives the devices'
// instantaneous power. This superposition ignores the package's own delay of heat on its way to
// the sink, so the sink warms slightly early: conservative for the heatsink and, since the
// junction rides on it, for the junction. Converting the fit to a Cauer ladder would chain, but
// the conversion is ill-conditioned for typical datasheet fits and the ladder is still not the
// package's physical structure, so it buys little for these time scales.
//
// Integration: steps of at most `step_s`, aligned to segment boundaries (each segment is split into
// equal steps, at most 10^6 of them: a segment longer than 10^6·step_s takes longer steps). Within a step the power is held (zero-order hold) and every RC part is advanced by
// its exact exponential: θ' = θ·e^(−Δt/τ) + R·P·(1 − e^(−Δt/τ)); the heatsink likewise with
// τ = R_sa(ΔT)·C at the start of the step. Losses come from the caller: a full solve (the bank's
// electrothermal network) at each segment start and whenever any junction has moved more than
// `resolveStep_K` since the last full solve, and a cheap rescale from the present T_j in every
// other step (e.g. conduction loss × R_ds(on)(T_j)/R_ds(on)(T_ref)). The error of the rescale
// against a full solve in every step is bounded by a test (≤ 0.5 K).
//
// Units: W, K/W, J/K, s, °C. Ranges: τ_i ≥ 0, R ≥ 0, C ≥ 0 (0 = massless sink), step > 0.

#include "core/model/parts.h"
#include "core/thermal/heatsink.h"

#include <cstddef>
#include <functional>
#include <string>
#include <vector>

namespace amp::thermal {

/// One heat source on the heatsink.
struct TransientSource {
    std::string name;
    std::vector<FosterStage> zthJc; ///< empty: rthJc_KperW acts as a massless resistor
    double rthJc_KperW = 0.0;
    double rthCs_KperW = 0.0; ///< interface, per unit
    double count = 1.0;       ///< identical units this source stands for
};

struct TransientNetwork {
    std::vector<TransientSource> sources;
    RsaCurve rsa; ///< heatsink to ambient versus rise
    double heatsinkCapacity_JperK = 0.0;
};

struct TransientSegment {
    double duration_s = 1.0;
    double ambient_C = 30.0;
};

/// The network's state: the rise of every Foster stage, and the heatsink temperature.
struct TransientState {
    std::vector<std::vector<double>> stageRise_K; ///< [source][stage]
    double heatsink_C = 0.0;
    std::vector<double> power_W; ///< last power per unit (for the massless drops)
};

/// Full solve: powers per unit of every source at the junction temperatures given.
using ResolveLosses =
    std::function<void(std::size_t segment, const std::vector<double>& tj_C, std::vector<double>& power_W)>;
/// Rescale: powers at tj_C from the last full solve (its temperatures and powers).
using RescaleLosses = std::function<void(std::size_t segment, const std::vector<double>& tjRef_C,
                                         const std::vector<double>& powerRef_W,
                                         const std::vector<double>& tj_C, std::vector<double>& power_W)>;

struct TransientLosses {
    ResolveLosses resolve; ///< required
    RescaleLosses rescale; ///< optional: without it the powers stay at the last full solve
};

struct TransientOptions {
    double step_s = 0.01;
    double resolveStep_K = 2.0; ///< ≤ 0: full solve in every step
    int repetitions = 1;        ///< profile repetitions (upper bound with untilPeriodic)
    bool untilPeriodic = false; ///< stop once a repetition ends where it started
    double periodicTolerance_K = 0.05;
    /// With untilPeriodic: after two repetitions whose heatsink drifts shrink by a steady ratio ρ
    /// (the sink is a first-order system, so x_(k+1) − x* = ρ·(x_k − x*)), jump the heatsink to the
    /// extrapolated x* = x_k + Δ_k·ρ/(1 − ρ) (Aitken's Δ²). The Foster stages settle within a
    /// repetition; the next repetitions confirm the periodic state.
    bool accelerate = true;
    std::size_t maxSamples = 2000;      ///< sampled series length (per repetition)
    double reversalHysteresis_K = 0.05; ///< turning points closer than this are merged
};

struct TransientResult {
    bool ok = false;
    std::vector<std::string> problems;
    std::vector<double> time_s;            ///< sample times from the start of the last repetition
    std::vector<std::vector<double>> tj_C; ///< [source][sample]
    std::vector<double> heatsink_C;        ///< [sample]
    std::vector<double> tjMax_C;           ///< per source, over the whole run, every step
    std::vector<double> tjMaxTime_s;       ///< from the start of the run
    double heatsinkMax_C = 0.0;
    double heatsinkMaxTime_s = 0.0;
    std::vector<std::vector<double>> reversals_C; ///< [source] T_j turning points, last repetition
    int repetitionsRun = 0;
    int extrapolations = 0; ///< heatsink jumps made by `accelerate`
    bool periodic = false;  ///< the last repetition ended where it started
    std::size_t steps = 0;
    std::size_t resolves = 0;
    TransientState finalState;
};

/// Every stage at rest and the heatsink at `heatsink_C`.
TransientState restState(const TransientNetwork& net, double heatsink_C);

/// Junction temperature of a source in a state (using the state's last power for massless drops).
double junctionTemperature(const TransientNetwork& net, const TransientState& s, std::size_t source);

/// Steady state for one segment: fixed point of losses(T_j) and the network. `converged` false
/// when the losses run away (no fixed point below 1000 °C).
struct SteadyState {
    TransientState state;
    std::vector<double> tj_C;
    bool converged = false;
};
/// The iteration starts from `startTj_C` when given (else from ambient) and stops when no junction
/// moves more than `tolerance_K` in an iteration.
SteadyState steadyState(const TransientNetwork& net, std::size_t segment, double ambient_C,
                        const ResolveLosses& losses, double tolerance_K = 1e-7,
                        const std::vector<double>* startTj_C = nullptr);

/// Low-level stepper, shared by the profile run and the stall-time search.
class TransientStepper {
  public:
    TransientStepper(const TransientNetwork& net, TransientState state);
    /// Advance by dt with the powers per unit held; ambient for this step.
    void advance(double dt_s, const std::vector<double>& power_W, double ambient_C);
    /// Advance by dt with the powers moving linearly from p0 to p1 (exact for every RC part).
    void advanceRamp(double dt_s, const std::vector<double>& p0_W, const std::vector<double>& p1_W,
                     double ambient_C);
    double junction_C(std::size_t source) const;
    void setHeatsink(double heatsink_C) { m_state.heatsink_C = heatsink_C; }
    void setState(const TransientState& state) { m_state = state; }
    const TransientState& state() const { return m_state; }
    /// Back to the state before the last advance (once per advance: the stepper keeps one
    /// earlier state, so that a step can be redone without copying the state every step).
    void undo() { std::swap(m_state, m_before); }

  private:
    double sinkResistance(double rise_K);

    const TransientNetwork& m_net;
    TransientState m_state;
    TransientState m_before; ///< the state before the last advance (same shape as m_state)
    double m_cachedDt = -1.0;
    std::vector<std::vector<double>> m_decay;     ///< e^(−dt/τ) per stage for m_cachedDt
    std::vector<std::vector<double>> m_lag;       ///< τ·(1 − e^(−dt/τ))/dt per stage
    std::vector<double> m_lnRise, m_lnR, m_slope; ///< the R_sa curve in log-log form
    std::size_t m_segment = 0;                    ///< last curve interval used (the rise moves slowly)
};

/// Validate the network (names the source and stage at fault).
std::vector<std::string> validateNetwork(const TransientNetwork& net);

TransientResult runTransient(const TransientNetwork& net, const std::vector<TransientSegment>& segments,
                             const TransientLosses& losses, const TransientOptions& options,
                             const TransientState& initial);

} // namespace amp::thermal

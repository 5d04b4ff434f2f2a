// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Internal to core/bank: the bank's DC network at given junction temperatures (equations in
// bank/banksolver.h). One Newton solve returns the per-device electrical state and, on request,
// the total derivative S_on = dP_on/dT of the on-state device powers with the feed's held
// quantities held.

#include "core/bank/banksolver.h"

#include <memory>
#include <string>
#include <vector>

namespace amp::detail {

struct ElectricalPoint {
    bool ok = false;
    BankFailure failure = BankFailure::None;
    std::string reason;
    int iterations = 0;
    std::vector<double> x; ///< unknowns at the solution (warm start)
    double vG = 0.0;
    double vC = 0.0;
    std::vector<double> current_A; ///< per device
    std::vector<double> voltage_V;
    std::vector<double> control_V;
    std::vector<double> drive_A;
    std::vector<double> pDevice_W;  ///< on-state, in the die
    std::vector<double> pBallast_W; ///< on-state
    std::vector<double> pLeg_W;
    std::vector<double> pDrive_W;
    std::vector<std::string> region; ///< filled by fillRegions()
    std::vector<double> sOn;         ///< N×N row-major dP_on,k/dT_j (when requested and not sFactored)
    std::vector<double> dxdT;        ///< n×N row-major dX/dT_j of the unknowns (the same)
    /// The same two derivatives factored (when requested, for the legs that allow it). A leg's
    /// unknowns depend on another leg's temperature only through the two shared nodes, so with
    /// xg_j = d(V_G, V_C)/dT_j (sRight, 2×N row-major):
    ///   dP_on,k/dT_j = δ_kj·sDiag_k + sLeft_k·xg_j       (sLeft N×2 row-major)
    ///   dX_u/dT_j    = δ_k(u)j·xDiag_u + xLeft_u·xg_j     (each leg unknown u of leg k(u); xLeft (n−2)×2)
    /// and dX/dT of V_G, V_C are xg itself: S is a diagonal plus a rank-2 term, which lets the
    /// thermal Newton form Z·S and its first-order predictions in O(N²) and O(N).
    bool sFactored = false;
    std::vector<double> sDiag;
    std::vector<double> sLeft;
    std::vector<double> sRight;
    std::vector<double> xDiag;
    std::vector<double> xLeft;
    double dVcdLoad = 0.0;           ///< dV_C/dI_load at fixed temperatures (current and linear feeds)
};

/// dP_on/dT as the N×N row-major matrix, from whichever form the point carries (sOn, or the
/// factored form); empty when the point has no sensitivity.
std::vector<double> denseSensitivity(const ElectricalPoint& pt);

class BankNetwork {
  public:
    explicit BankNetwork(const BankProblem& problem);
    ~BankNetwork();
    BankNetwork(const BankNetwork&) = delete;
    BankNetwork& operator=(const BankNetwork&) = delete;

    int count() const;
    const std::vector<std::string>& notes() const;
    /// Solve at junction temperatures tj_K (size N). x0: previous unknowns (may be null or of the
    /// wrong size, then a built-in guess is used).
    ElectricalPoint solve(const std::vector<double>& tj_K, const std::vector<double>* x0, bool sensitivity);
    /// Operating region of each device at a solution (for the report only: it costs an evaluation).
    void fillRegions(ElectricalPoint& pt, const std::vector<double>& tj_K) const;

    struct Impl;

  private:
    std::unique_ptr<Impl> m_impl;
};

} // namespace amp::detail

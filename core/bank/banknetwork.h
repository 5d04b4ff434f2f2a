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
    std::vector<double> sOn;         ///< N×N row-major dP_on,k/dT_j (when requested)
    std::vector<double> dxdT;        ///< n×N row-major dX/dT_j of the unknowns (when requested)
    double dVcdLoad = 0.0;           ///< dV_C/dI_load at fixed temperatures (current and linear feeds)
};

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

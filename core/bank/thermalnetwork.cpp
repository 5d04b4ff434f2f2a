// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/bank/thermalnetwork.h"

#include <Eigen/Dense>

#include <algorithm>

namespace amp {

ThermalMatrices buildThermalMatrices(const ThermalNetworkSpec& spec) {
    const int n = std::max(spec.count, 1);
    ThermalMatrices m;
    m.count = n;
    m.zSink.assign(static_cast<std::size_t>(n), spec.rthSa_KperW);

    if (spec.neighbour_KperW <= 0.0 || n == 1) {
        m.uniform = true;
        m.zSelf = spec.rthJc_KperW + spec.rthCs_KperW;
        m.zCommon = spec.rthSa_KperW;
        return m;
    }
    m.z.assign(static_cast<std::size_t>(n * n), 0.0);

    // Nodes 0..n−1: cases; node n: heatsink. Ambient is the reference.
    constexpr double kFloor = 1e-9;
    const double gcs = 1.0 / std::max(spec.rthCs_KperW, kFloor);
    const double gsa = 1.0 / std::max(spec.rthSa_KperW, kFloor);
    const double gnb = 1.0 / std::max(spec.neighbour_KperW, kFloor);
    Eigen::MatrixXd g = Eigen::MatrixXd::Zero(n + 1, n + 1);
    for (int k = 0; k < n; ++k) {
        g(k, k) += gcs;
        g(n, n) += gcs;
        g(k, n) -= gcs;
        g(n, k) -= gcs;
        if (k + 1 < n) {
            g(k, k) += gnb;
            g(k + 1, k + 1) += gnb;
            g(k, k + 1) -= gnb;
            g(k + 1, k) -= gnb;
        }
    }
    g(n, n) += gsa;
    const Eigen::MatrixXd inv = g.partialPivLu().inverse();
    for (int k = 0; k < n; ++k) {
        for (int j = 0; j < n; ++j)
            m.z[static_cast<std::size_t>(k * n + j)] = inv(k, j) + (k == j ? spec.rthJc_KperW : 0.0);
        m.zSink[static_cast<std::size_t>(k)] = inv(k, n);
    }
    return m;
}

} // namespace amp

// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/bank/mosfetmodel.h"

#include "core/bank/dual.h"
#include "core/bank/thermalvoltage.h"

#include <algorithm>
#include <cmath>

namespace amp {

namespace {

// s·ln(1 + e^(x/s)) without overflow; equals x to double precision for x ≫ s.
template <class S> S softplus(const S& x, const S& s) {
    using std::exp;
    using std::log1p;
    const S u = x / s;
    if (ad::val(u) > 30.0)
        return x + s * log1p(exp(-u));
    return s * log1p(exp(u));
}

template <class S> S tableFactor(const std::vector<RdsOnPoint>& table, const S& t_K) {
    const S tC = t_K - kZeroCelsius_K;
    if (table.size() == 1)
        return S(std::max(table.front().factor, 0.05));
    // Segment containing T (or the end segment, extrapolated linearly).
    std::size_t i = 1;
    while (i + 1 < table.size() && ad::val(tC) > table[i].tj_C)
        ++i;
    const RdsOnPoint& a = table[i - 1];
    const RdsOnPoint& b = table[i];
    const double slope = (b.factor - a.factor) / (b.tj_C - a.tj_C);
    const S f = a.factor + (tC - a.tj_C) * slope;
    if (ad::val(f) < 0.05)
        return S(0.05); // a table extrapolated below zero means nonsense; hold a floor
    return f;
}

} // namespace

MosfetModel MosfetModel::make(const MosfetParams& p, double rdsOnDeviation, double vthDeviation_V,
                              double tMax_K) {
    return make(p, rdsOnDeviation, vthDeviation_V, tMax_K, consistencyRaise(p, tMax_K));
}

MosfetModel MosfetModel::make(const MosfetParams& p, double rdsOnDeviation, double vthDeviation_V,
                              double /*tMax_K*/, double knownRaise) {
    MosfetModel m;
    m.rdsOn25_ohm = p.rdsOn25_ohm;
    m.tempExponent = p.rdsOnTempExponent;
    m.table = p.rdsOnTable;
    std::sort(m.table.begin(), m.table.end(),
              [](const RdsOnPoint& a, const RdsOnPoint& b) { return a.tj_C < b.tj_C; });
    // Repeated temperatures would make a zero-width segment.
    m.table.erase(std::unique(m.table.begin(), m.table.end(),
                              [](const RdsOnPoint& a, const RdsOnPoint& b) { return a.tj_C == b.tj_C; }),
                  m.table.end());
    m.specGate_V = p.rdsOnSpecGate_V;
    m.vth25_V = p.vth_V;
    m.vthTempCoeff_VperK = p.vthTempCoeff_VperK;
    m.kRaise = std::max(knownRaise, 1.0);
    m.k25_AperV2 = p.transconductance_AperV2 * m.kRaise;
    m.scale = 1.0 + rdsOnDeviation;
    m.vthShift_V = vthDeviation_V;
    return m;
}

double MosfetModel::consistencyRaise(const MosfetParams& p, double tMax_K) {
    // A pure function of the part and the range, asked by every bank solve (a design's evaluation
    // solves the same part tens of times): each thread keeps its last answer.
    struct Last {
        bool valid = false;
        MosfetParams part;
        double tMax_K = 0.0;
        double raise = 1.0;
    };
    thread_local Last last;
    if (last.valid && last.tMax_K == tMax_K && last.part == p)
        return last.raise;
    // The channel alone must not take more than 90 % of R_ds(on) anywhere in range.
    const MosfetModel m = make(p, 0.0, 0.0, tMax_K, 1.0);
    double worst = 0.0;
    for (double t = 233.15; t <= tMax_K + 1e-9; t += 10.0) {
        // channelK(t) and overdrive(specGate_V, t) of the nominal die, written out as in
        // atTemperature (a bank solve runs this loop every time: no drift term needed here).
        const double r = t / kPartReference_K;
        const double k = m.k25_AperV2 / (r * std::sqrt(r)) / m.scale;
        const double vth = (m.vth25_V + m.vthTempCoeff_VperK * (t - kPartReference_K)) + m.vthShift_V;
        const double vovSpec = softplus(m.specGate_V - vth, 3.0 * thermalVoltage(t));
        const double rch = 1.0 / (2.0 * k * (vovSpec + kEnhancementWidth_V));
        worst = std::max(worst, rch / m.nominalOnResistance(t));
    }
    last.part = p;
    last.tMax_K = tMax_K;
    last.raise = worst > 0.9 ? worst / 0.9 : 1.0;
    last.valid = true;
    return last.raise;
}

double MosfetModel::nominalOnResistance(double t_K) const {
    if (!table.empty())
        return rdsOn25_ohm * tableFactor(table, t_K);
    return rdsOn25_ohm * std::pow(t_K / kPartReference_K, tempExponent);
}

template <class S> MosfetModel::AtTemperature<S> MosfetModel::atTemperature(const S& t_K) const {
    using std::pow;
    using std::sqrt;
    const S r = t_K / kPartReference_K;
    const S kNom = k25_AperV2 / (r * sqrt(r)); // mobility ∝ T^−1.5
    const S vthNom = vth25_V + vthTempCoeff_VperK * (t_K - kPartReference_K);
    AtTemperature<S> at;
    at.smooth = 3.0 * thermalVoltage(t_K);
    at.k = kNom / scale;
    at.vth = vthNom + vthShift_V;
    // Nominal die: R_ds(on) law minus the nominal channel at the specified gate voltage.
    const S ron = table.empty() ? rdsOn25_ohm * pow(r, tempExponent) : rdsOn25_ohm * tableFactor(table, t_K);
    const S vovFull = softplus(specGate_V - vthNom, at.smooth) + kEnhancementWidth_V;
    at.drift = scale * (ron - 1.0 / (2.0 * kNom * vovFull));
    at.vovSpec = softplus(specGate_V - at.vth, at.smooth);
    return at;
}

template <class S>
S MosfetModel::channelCurrent(const AtTemperature<S>& at, const S& vgs, const S& vds) const {
    S vov = softplus(vgs - at.vth, at.smooth);
    // Full enhancement: the overdrive saturates within 2w above its value at the specified gate.
    const double w = kEnhancementWidth_V;
    if (ad::val(vov) >= ad::val(at.vovSpec) + 2.0 * w) {
        vov = at.vovSpec + w;
    } else if (ad::val(vov) > ad::val(at.vovSpec)) {
        const S e = vov - at.vovSpec;
        vov = vov - e * e / (4.0 * w);
    }
    const bool reverse = ad::val(vds) < 0.0;
    const S v = reverse ? -vds : vds;
    S i;
    if (ad::val(v) < ad::val(vov))
        i = at.k * (2.0 * vov * v - v * v);
    else
        i = at.k * vov * vov;
    return reverse ? -i : i;
}

template <class S> S MosfetModel::threshold(const S& t_K) const {
    return (vth25_V + vthShift_V) + vthTempCoeff_VperK * (t_K - kPartReference_K);
}

template <class S> S MosfetModel::channelK(const S& t_K) const {
    return atTemperature(t_K).k;
}

template <class S> S MosfetModel::overdrive(const S& vgs, const S& t_K) const {
    return softplus(vgs - threshold(t_K), 3.0 * thermalVoltage(t_K));
}

template <class S> S MosfetModel::driftResistance(const S& t_K) const {
    return atTemperature(t_K).drift;
}

template <class S> S MosfetModel::onResistance(const S& t_K) const {
    const AtTemperature<S> at = atTemperature(t_K);
    return at.drift + 1.0 / (2.0 * at.k * (at.vovSpec + kEnhancementWidth_V));
}

template <class S> S MosfetModel::channelCurrent(const S& vgs, const S& vds, const S& t_K) const {
    return channelCurrent(atTemperature(t_K), vgs, vds);
}

#define AMP_MOSFET_INSTANTIATE(S)                                                                            \
    template S MosfetModel::onResistance<S>(const S&) const;                                                 \
    template S MosfetModel::threshold<S>(const S&) const;                                                    \
    template S MosfetModel::channelK<S>(const S&) const;                                                     \
    template S MosfetModel::overdrive<S>(const S&, const S&) const;                                          \
    template S MosfetModel::driftResistance<S>(const S&) const;                                              \
    template S MosfetModel::channelCurrent<S>(const S&, const S&, const S&) const;                           \
    template MosfetModel::AtTemperature<S> MosfetModel::atTemperature<S>(const S&) const;                    \
    template S MosfetModel::channelCurrent<S>(const AtTemperature<S>&, const S&, const S&) const;

AMP_MOSFET_INSTANTIATE(double)
AMP_MOSFET_INSTANTIATE(ad::Dual<4>)
AMP_MOSFET_INSTANTIATE(ad::Dual<1>) // the temperature state alone (bank network cache)

} // namespace amp

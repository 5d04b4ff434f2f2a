// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/bank/bjtmodel.h"

#include "core/bank/dual.h"
#include "core/bank/thermalvoltage.h"

#include <algorithm>
#include <cmath>

namespace amp {

namespace {

constexpr double kExpLimit = 80.0;

// exp(x), continued linearly (C¹) above x = 80 so that a wild Newton iterate never overflows.
template <class S> S limitedExp(const S& x) {
    using std::exp;
    if (ad::val(x) > kExpLimit) {
        const double e = std::exp(kExpLimit);
        return e * (1.0 + (x - kExpLimit));
    }
    return exp(x);
}

} // namespace

BjtModel BjtModel::make(const BjtParams& p, double vbeDeviation_V, double betaDeviation,
                        double earlyVoltage_V) {
    BjtModel m;
    m.vaf_V = earlyVoltage_V > 0.0 ? earlyVoltage_V : 0.0;
    m.n = p.emissionCoefficient;
    m.is25_A = p.saturationCurrent25_A * std::exp(-vbeDeviation_V / (m.n * thermalVoltage(kPartReference_K)));
    m.betaF25 = p.betaF * (1.0 + betaDeviation);
    m.betaR25 = p.betaR;
    m.ikf_A = p.highCurrentKnee_A;
    m.rb_ohm = p.baseResistance_ohm;
    m.re_ohm = p.emitterResistance_ohm;
    m.rc_ohm = p.collectorResistance_ohm;
    m.xti = p.xti;
    m.eg_eV = p.bandgap_eV;
    m.xtb = p.betaTempExponent;
    return m;
}

template <class S> S BjtModel::saturationCurrent(const S& t_K) const {
    using std::exp;
    using std::pow;
    const S ratio = t_K / kPartReference_K;
    return is25_A * pow(ratio, xti / n) * exp((ratio - 1.0) * eg_eV / (n * thermalVoltage(t_K)));
}

template <class S> S BjtModel::betaForward(const S& t_K) const {
    using std::pow;
    return betaF25 * pow(t_K / kPartReference_K, xtb);
}

template <class S> S BjtModel::betaReverse(const S& t_K) const {
    using std::pow;
    return betaR25 * pow(t_K / kPartReference_K, xtb);
}

template <class S> void BjtModel::intrinsic(const S& vbe, const S& vbc, const S& t_K, S& ic, S& ib) const {
    using std::sqrt;
    const S nvt = n * thermalVoltage(t_K);
    const S is = saturationCurrent(t_K);
    const S iF = is * (limitedExp(vbe / nvt) - 1.0);
    const S iR = is * (limitedExp(vbc / nvt) - 1.0);
    S qb(1.0);
    if (ikf_A > 0.0) {
        S arg = 1.0 + 4.0 * iF / ikf_A;
        if (ad::val(arg) < 1e-12) // only for I_KF below 4·I_S, i.e. a nonsense knee
            arg = S(1e-12);
        qb = 0.5 * (1.0 + sqrt(arg));
    }
    if (vaf_V > 0.0) {
        // q_1 = 1/(1 − V_BC/V_AF); held finite for a (nonsensical) V_BC near V_AF.
        S den = 1.0 - vbc / vaf_V;
        if (ad::val(den) < 0.1)
            den = S(0.1);
        qb = qb / den;
    }
    const S betaF = betaForward(t_K);
    const S betaR = betaReverse(t_K);
    ic = (iF - iR) / qb - iR / betaR - gmin_S * vbc;
    ib = iF / betaF + iR / betaR + gmin_S * (vbe + vbc);
}

double BjtModel::junctionVoltage(double ic_A, double t_K) const {
    const double qb = ikf_A > 0.0 ? 1.0 + std::max(ic_A, 0.0) / ikf_A : 1.0;
    const double is = saturationCurrent(t_K);
    return n * thermalVoltage(t_K) * std::log1p(std::max(ic_A, 0.0) * qb / is);
}

double BjtModel::betaAt(double ic_A, double t_K) const {
    const double knee = ikf_A > 0.0 ? 1.0 + std::max(ic_A, 0.0) / ikf_A : 1.0;
    return betaForward(t_K) / knee;
}

double BjtModel::criticalVoltage(double t_K) const {
    const double nvt = n * thermalVoltage(t_K);
    return nvt * std::log(nvt / (std::sqrt(2.0) * saturationCurrent(t_K)));
}

double limitJunctionStep(double vNew, double vOld, double nvt, double vcrit) {
    if (vNew > vcrit && std::abs(vNew - vOld) > 2.0 * nvt) {
        if (vOld > 0.0) {
            const double arg = 1.0 + (vNew - vOld) / nvt;
            vNew = arg > 0.0 ? vOld + nvt * std::log(arg) : vcrit;
        } else {
            vNew = nvt * std::log(vNew / nvt);
        }
    }
    return vNew;
}

#define AMP_BJT_INSTANTIATE(S)                                                                               \
    template S BjtModel::saturationCurrent<S>(const S&) const;                                               \
    template S BjtModel::betaForward<S>(const S&) const;                                                     \
    template S BjtModel::betaReverse<S>(const S&) const;                                                     \
    template void BjtModel::intrinsic<S>(const S&, const S&, const S&, S&, S&) const;

AMP_BJT_INSTANTIATE(double)
AMP_BJT_INSTANTIATE(ad::Dual<5>)
AMP_BJT_INSTANTIATE(ad::Dual<7>)

} // namespace amp

// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/bank/banknetwork.h"

#include "core/bank/bjtmodel.h"
#include "core/bank/darlingtonmodel.h"
#include "core/bank/dual.h"
#include "core/bank/mosfetmodel.h"
#include "core/bank/thermalvoltage.h"

#include <Eigen/Dense>

#include <algorithm>
#include <array>
#include <cmath>
#include <limits>
#include <sstream>

namespace amp::detail {

namespace {

template <class S> struct LegOut {
    std::array<S, 4> r{};
    S ig, ic, pDev, pBallast, pLeg, pDrive, vDev, vControl;
};

// What a leg reports at the solution besides its equations.
struct LegReport {
    std::string region;
};

std::string fmt(double v, int precision = 4) {
    std::ostringstream s;
    s.precision(precision);
    s << v;
    return s.str();
}

// ---------------------------------------------------------------------------------------------
// MOSFET leg: unknown = channel (drain) current.
struct MosfetLeg {
    static constexpr int kUnknowns = 1;
    static constexpr int kDual = 4; // V_G, V_C, I, T
    static constexpr std::array<bool, 1> kCurrentRow{true};

    MosfetModel model;
    double gate_ohm = 0.0;
    double ballast_ohm = 0.0;
    double leg_ohm = 0.0;
    double pulldown_ohm = 0.0;

    // The temperature-dependent parameters with their derivative wrt T, for the last junction
    // temperature seen: T is fixed through one network solve, so the Newton iterations reuse them.
    // Lifted to the caller's scalar by the chain rule (d/dx_i = dX/dT · dT/dx_i), which gives the
    // same numbers as evaluating atTemperature with that scalar.
    mutable double m_cacheT_K = std::numeric_limits<double>::quiet_NaN();
    mutable MosfetModel::AtTemperature<ad::Dual<1>> m_cache{};

    template <class S> MosfetModel::AtTemperature<S> temperatureState(const S& t) const {
        const double tv = ad::val(t);
        if (!(tv == m_cacheT_K)) {
            m_cache = model.atTemperature(ad::Dual<1>::variable(tv, 0));
            m_cacheT_K = tv;
        }
        return {lift(m_cache.k, t), lift(m_cache.vth, t), lift(m_cache.drift, t), lift(m_cache.smooth, t),
                lift(m_cache.vovSpec, t)};
    }
    static double lift(const ad::Dual<1>& x, double /*t*/) { return x.v; }
    template <int M> static ad::Dual<M> lift(const ad::Dual<1>& x, const ad::Dual<M>& t) {
        return ad::chain(t, x.v, x.d[0]);
    }

    template <class S> void eval(const S& vg, const S& vc, const S* u, const S& t, LegOut<S>& o) const {
        const S& i = u[0];
        const double rs = ballast_ohm + leg_ohm;
        S ig(0.0);
        S vgs;
        if (pulldown_ohm > 0.0) {
            // Gate current through the gate resistor and the pull-down to the source, then rs.
            ig = (vg - i * rs) / (gate_ohm + pulldown_ohm + rs);
            vgs = ig * pulldown_ohm;
        } else {
            vgs = vg - i * rs;
        }
        const S is = i + ig;
        const S vs = is * rs;
        const MosfetModel::AtTemperature<S> at = temperatureState(t);
        const S& rd = at.drift;
        const S vch = vc - i * rd - vs;
        const S ich = model.channelCurrent(at, vgs, vch) + model.gmin_S * vch;
        o.r[0] = i - ich;
        o.ig = ig;
        o.ic = i;
        o.pDev = i * vch + i * i * rd;
        // Reported values only (no derivative of these is read): the same numbers in plain arithmetic.
        const double isv = ad::val(is), igv = ad::val(ig);
        o.pBallast = S(isv * isv * ballast_ohm);
        o.pLeg = S(isv * isv * leg_ohm);
        o.pDrive = S(igv * igv * gate_ohm);
        o.vDev = S(ad::val(vch) + ad::val(i) * ad::val(rd));
        o.vControl = vgs;
    }

    static constexpr bool kBaseCurrent = false;
    double baseSeriesResistance() const { return 0.0; }
    double baseGuess(double /*share*/, double /*t*/) const { return 0.0; }
    double onPath(double t) const { return model.onResistance(t) + ballast_ohm + leg_ohm; }
    double nodeGuess(double share, double t) const { return share * onPath(t); }
    double gateGuess(double share, double t) const {
        const double vgs = model.threshold(t) + std::sqrt(std::max(share, 0.0) / model.channelK(t)) + 0.1;
        const double rs = ballast_ohm + leg_ohm;
        const double factor = pulldown_ohm > 0.0 ? (gate_ohm + pulldown_ohm + rs) / pulldown_ohm : 1.0;
        return vgs * factor + share * rs;
    }
    void guess(double share, double /*vg*/, double /*vc*/, double /*t*/, double* u) const { u[0] = share; }
    double voltageFedShare(double vg, double vc, double t) const {
        const double vov = model.overdrive(vg, t);
        const double sat = model.channelK(t) * vov * vov;
        return std::max(0.0, std::min(vc / onPath(t), sat));
    }
    void limit(const double* /*uOld*/, double* /*uNew*/, double /*t*/) const {}
    std::string region(double vg, double vc, const double* u, double t) const {
        LegOut<double> o;
        eval(vg, vc, u, t, o);
        const double vov = model.overdrive(o.vControl, t);
        const MosfetModel::AtTemperature<double> at = temperatureState(t);
        const double vch = o.vDev - u[0] * at.drift;
        if (model.channelCurrent(at, o.vControl, vch) <= 1e-9 * std::max(1.0, std::abs(u[0])) && vov < 0.05)
            return "off";
        return vch >= vov ? "saturation" : "ohmic";
    }
};

// ---------------------------------------------------------------------------------------------
// Bipolar leg: unknowns = internal V_BE', V_BC'.
struct BipolarLeg {
    static constexpr int kUnknowns = 2;
    static constexpr int kDual = 5; // V_G, V_C, V_BE', V_BC', T
    static constexpr std::array<bool, 2> kCurrentRow{false, false};

    BjtModel q;
    double gate_ohm = 0.0;
    double ballast_ohm = 0.0;
    double leg_ohm = 0.0;

    template <class S> void eval(const S& vg, const S& vc, const S* u, const S& t, LegOut<S>& o) const {
        S ic, ib;
        q.intrinsic(u[0], u[1], t, ic, ib);
        const S ie = ic + ib;
        const double rext = ballast_ohm + leg_ohm;
        const S ve = ie * (q.re_ohm + rext);
        const S vb = ve + u[0];
        o.r[0] = vg - ib * (gate_ohm + q.rb_ohm) - vb;
        o.r[1] = vc - ic * q.rc_ohm - (vb - u[1]);
        o.pDev =
            ic * (u[0] - u[1]) + ib * u[0] + ic * ic * q.rc_ohm + ib * ib * q.rb_ohm + ie * ie * q.re_ohm;
        o.pBallast = ie * ie * ballast_ohm;
        o.pLeg = ie * ie * leg_ohm;
        o.pDrive = ib * ib * gate_ohm;
        o.ig = ib;
        o.ic = ic;
        o.vDev = vc - ie * rext;
        o.vControl = vb + ib * q.rb_ohm - ie * rext;
    }

    struct Position {
        double vbe, ic, ib, ve, vb;
    };
    static constexpr bool kBaseCurrent = true;
    double baseSeriesResistance() const { return gate_ohm + q.rb_ohm; }
    double baseGuess(double share, double t) const { return position(share, t).vb; }
    Position position(double share, double t) const {
        const double vbe = std::min(q.junctionVoltage(share, t), 1.5);
        const double ib = share / q.betaAt(share, t);
        const double ve = (share + ib) * (q.re_ohm + ballast_ohm + leg_ohm);
        return {vbe, share, ib, ve, ve + vbe};
    }
    double nodeGuess(double share, double t) const {
        const Position p = position(share, t);
        return p.vb - (p.vbe - 0.25) + p.ic * q.rc_ohm;
    }
    double gateGuess(double share, double t) const {
        const Position p = position(share, t);
        return p.vb + p.ib * (gate_ohm + q.rb_ohm);
    }
    void guess(double share, double /*vg*/, double vc, double t, double* u) const {
        const Position p = position(share, t);
        u[0] = p.vbe;
        u[1] = p.vb - (vc - p.ic * q.rc_ohm);
    }
    // Collector current for a base node held at vg (forward active), by bisection on V_BE'.
    double voltageFedShare(double vg, double /*vc*/, double t) const {
        double lo = 0.0, hi = std::max(vg, 0.0);
        for (int i = 0; i < 60; ++i) {
            const double vbe = 0.5 * (lo + hi);
            double ic, ib;
            q.intrinsic(vbe, vbe - 10.0, t, ic, ib);
            const double need =
                vbe + (ic + ib) * (q.re_ohm + ballast_ohm + leg_ohm) + ib * (gate_ohm + q.rb_ohm);
            (need > vg ? hi : lo) = vbe;
        }
        double ic, ib;
        q.intrinsic(lo, lo - 10.0, t, ic, ib);
        return std::max(ic, 1e-9);
    }
    void limit(const double* uOld, double* uNew, double t) const {
        const double nvt = q.n * thermalVoltage(t);
        const double vcrit = q.criticalVoltage(t);
        uNew[0] = limitJunctionStep(uNew[0], uOld[0], nvt, vcrit);
        uNew[1] = limitJunctionStep(uNew[1], uOld[1], nvt, vcrit);
    }
    std::string region(double vg, double vc, const double* u, double t) const {
        LegOut<double> o;
        eval(vg, vc, u, t, o);
        if (o.ic <= 1e-9 * std::max(1.0, std::abs(o.ic)) || u[0] < 0.2)
            return "off";
        // Saturation: I_B > I_C/β_F(I_C, T), with 5 % margin so the edge of saturation reads "active".
        return q.betaAt(o.ic, t) * o.ig > 1.05 * o.ic ? "saturated" : "active";
    }
};

// ---------------------------------------------------------------------------------------------
// Darlington leg: unknowns = V_BE1', V_BC1', V_BE2', V_BC2'.
struct DarlingtonLeg {
    static constexpr int kUnknowns = 4;
    static constexpr int kDual = 7;
    static constexpr std::array<bool, 4> kCurrentRow{true, false, false, false};

    DarlingtonModel m;
    double gate_ohm = 0.0;
    double ballast_ohm = 0.0;
    double leg_ohm = 0.0;

    template <class S> void eval(const S& vg, const S& vc, const S* u, const S& t, LegOut<S>& o) const {
        const BjtModel& q1 = m.driver;
        const BjtModel& q2 = m.output;
        S ic1, ib1, ic2, ib2;
        q1.intrinsic(u[0], u[1], t, ic1, ib1);
        q2.intrinsic(u[2], u[3], t, ic2, ib2);
        const S ie1 = ic1 + ib1;
        const S ie2 = ic2 + ib2;
        const double rext = ballast_ohm + leg_ohm;
        const S ve2 = ie2 * (q2.re_ohm + rext);
        const S vb2 = ve2 + u[2];
        const S x = vb2 + ib2 * q2.rb_ohm;
        const S ve1 = x + ie1 * q1.re_ohm;
        const S vb1 = ve1 + u[0];
        o.r[0] = ie1 - ib2;
        o.r[1] = vg - ib1 * (gate_ohm + q1.rb_ohm) - vb1;
        o.r[2] = vc - ic1 * q1.rc_ohm - (vb1 - u[1]);
        o.r[3] = vc - ic2 * q2.rc_ohm - (vb2 - u[3]);
        o.pDev = ic1 * (u[0] - u[1]) + ib1 * u[0] + ic1 * ic1 * q1.rc_ohm + ib1 * ib1 * q1.rb_ohm +
                 ie1 * ie1 * q1.re_ohm + ic2 * (u[2] - u[3]) + ib2 * u[2] + ic2 * ic2 * q2.rc_ohm +
                 ib2 * ib2 * q2.rb_ohm + ie2 * ie2 * q2.re_ohm;
        o.pBallast = ie2 * ie2 * ballast_ohm;
        o.pLeg = ie2 * ie2 * leg_ohm;
        o.pDrive = ib1 * ib1 * gate_ohm;
        o.ig = ib1;
        o.ic = ic1 + ic2;
        o.vDev = vc - ie2 * rext;
        o.vControl = vb1 + ib1 * q1.rb_ohm - ie2 * rext;
    }

    struct Position {
        double v1, v2, ic1, ic2, ib1, vb1, vb2;
    };
    static constexpr bool kBaseCurrent = true;
    double baseSeriesResistance() const { return gate_ohm + m.driver.rb_ohm; }
    double baseGuess(double share, double t) const { return position(share, t).vb1; }
    Position position(double share, double t) const {
        const DarlingtonModel::Split s = m.split(share, t);
        const double v1 = std::min(m.driver.junctionVoltage(s.ic1_A, t), 1.5);
        const double v2 = std::min(m.output.junctionVoltage(s.ic2_A, t), 1.5);
        const double ib1 = s.ic1_A / m.driver.betaAt(s.ic1_A, t);
        const double ie1 = s.ic1_A + ib1;
        const double ie2 = s.ic2_A + ie1;
        const double vb2 = ie2 * (m.output.re_ohm + ballast_ohm + leg_ohm) + v2;
        const double vb1 = vb2 + ie1 * m.output.rb_ohm + ie1 * m.driver.re_ohm + v1;
        return {v1, v2, s.ic1_A, s.ic2_A, ib1, vb1, vb2};
    }
    double nodeGuess(double share, double t) const {
        const Position p = position(share, t);
        return p.vb1 - p.v1 + 0.25 + p.ic1 * m.driver.rc_ohm;
    }
    double gateGuess(double share, double t) const {
        const Position p = position(share, t);
        return p.vb1 + p.ib1 * (gate_ohm + m.driver.rb_ohm);
    }
    void guess(double share, double /*vg*/, double vc, double t, double* u) const {
        const Position p = position(share, t);
        u[0] = p.v1;
        u[1] = p.vb1 - (vc - p.ic1 * m.driver.rc_ohm);
        u[2] = p.v2;
        u[3] = p.vb2 - (vc - p.ic2 * m.output.rc_ohm);
    }
    double voltageFedShare(double vg, double /*vc*/, double t) const {
        // Bisection on log I_C for the composite input voltage.
        double lo = -20.0, hi = 4.0;
        for (int i = 0; i < 60; ++i) {
            const double mid = 0.5 * (lo + hi);
            const double ic = std::pow(10.0, mid);
            const double ib1 = ic / m.compositeBeta(ic, t);
            const double need = m.inputVoltage(ic, t) + ib1 * gate_ohm + ic * (ballast_ohm + leg_ohm);
            (need > vg ? hi : lo) = mid;
        }
        return std::pow(10.0, lo);
    }
    void limit(const double* uOld, double* uNew, double t) const {
        const BjtModel* qs[2] = {&m.driver, &m.output};
        for (int j = 0; j < 2; ++j) {
            const double nvt = qs[j]->n * thermalVoltage(t);
            const double vcrit = qs[j]->criticalVoltage(t);
            uNew[2 * j] = limitJunctionStep(uNew[2 * j], uOld[2 * j], nvt, vcrit);
            uNew[2 * j + 1] = limitJunctionStep(uNew[2 * j + 1], uOld[2 * j + 1], nvt, vcrit);
        }
    }
    std::string region(double vg, double vc, const double* u, double t) const {
        LegOut<double> o;
        eval(vg, vc, u, t, o);
        if (o.ic <= 1e-9 * std::max(1.0, std::abs(o.ic)) || u[2] < 0.2)
            return "off";
        double ic2, ib2;
        m.output.intrinsic(u[2], u[3], t, ic2, ib2);
        return m.output.betaAt(ic2, t) * ib2 > 1.05 * ic2 ? "saturated" : "active";
    }
};

} // namespace

// ---------------------------------------------------------------------------------------------
struct BankNetwork::Impl {
    virtual ~Impl() = default;
    virtual ElectricalPoint solve(const std::vector<double>& tj_K, const std::vector<double>* x0,
                                  bool sensitivity) = 0;
    virtual void fillRegions(ElectricalPoint& pt, const std::vector<double>& tj_K) const = 0;
    int n = 0;
    std::vector<std::string> notes;
};

namespace {

template <class Leg> class TypedNetwork final : public BankNetwork::Impl {
  public:
    static constexpr int m = Leg::kUnknowns;
    using D = ad::Dual<Leg::kDual>;

    TypedNetwork(const BankProblem& p, std::vector<Leg> legs) : m_legs(std::move(legs)) {
        n = static_cast<int>(m_legs.size());
        m_nx = 2 + n * m;
        m_feed = p.feed;
        m_vDrv = p.driveVoltage_V;
        m_rDrv = p.driveResistance_ohm;
        m_load = p.load_A;
        m_vFixed = p.commonNode_V;
        m_bus = p.busVoltage_V;
        m_maxIt = std::max(p.maxNewtonIterations, 1);
        m_rating = p.part.currentRating_A;
        m_iRef = std::max(p.load_A / n, 1e-3);
        const double ceiling = p.busVoltage_V > 0.0 ? p.busVoltage_V : std::max(p.part.voltageRating_V, 1.0);
        m_vAbort = 20.0 * ceiling + 100.0;
        // Entries outside the border rows and the leg blocks are never written: zero them once.
        m_J = Eigen::MatrixXd::Zero(m_nx, m_nx);
        m_r.resize(m_nx);
        m_trial.resize(static_cast<std::size_t>(m_nx));
        m_currentRow.assign(static_cast<std::size_t>(m_nx), false);
        m_currentRow[0] = m_feed == BankFeed::Linear;
        m_currentRow[1] = m_feed == BankFeed::Current;
        for (int k = 0; k < n; ++k)
            for (int i = 0; i < m; ++i)
                m_currentRow[static_cast<std::size_t>(2 + k * m + i)] =
                    Leg::kCurrentRow[static_cast<std::size_t>(i)];
        m_out.resize(static_cast<std::size_t>(n));
        m_dT.resize(static_cast<std::size_t>(n));
    }

    ElectricalPoint solve(const std::vector<double>& tj, const std::vector<double>* x0,
                          bool sensitivity) override {
        ElectricalPoint pt;
        const bool warm = x0 && static_cast<int>(x0->size()) == m_nx && allFinite(*x0);
        std::vector<double> x = warm ? *x0 : initialGuess(tj);
        int total = 0;
        bool ok = newton(x, tj, pt, total);
        if (!ok && pt.failure == BankFailure::NoConvergence && warm) {
            x = initialGuess(tj);
            ok = newton(x, tj, pt, total);
        }
        if (!ok && pt.failure == BankFailure::NoConvergence && m_feed != BankFeed::Voltage) {
            // Load stepping: start from a comfortable load and walk to the one asked for.
            const double target = m_load;
            const double start = std::max(target, 0.05 * m_rating * n);
            if (start > target) {
                m_load = start;
                x = initialGuess(tj);
                ok = true;
                for (int step = 0; step <= 8 && ok; ++step) {
                    m_load = start + (target - start) * step / 8.0;
                    ok = newton(x, tj, pt, total);
                }
                m_load = target;
            }
        }
        pt.iterations = total;
        if (!ok)
            return pt;
        // Outputs.
        pt.ok = true;
        pt.x = x;
        pt.vG = x[0];
        pt.vC = x[1];
        const auto nn = static_cast<std::size_t>(n);
        pt.current_A.resize(nn);
        pt.voltage_V.resize(nn);
        pt.control_V.resize(nn);
        pt.drive_A.resize(nn);
        pt.pDevice_W.resize(nn);
        pt.pBallast_W.resize(nn);
        pt.pLeg_W.resize(nn);
        pt.pDrive_W.resize(nn);
        for (std::size_t k = 0; k < nn; ++k) {
            const LegOut<D>& o = m_out[k];
            pt.current_A[k] = o.ic.v;
            pt.voltage_V[k] = o.vDev.v;
            pt.control_V[k] = o.vControl.v;
            pt.drive_A[k] = o.ig.v;
            pt.pDevice_W[k] = o.pDev.v;
            pt.pBallast_W[k] = o.pBallast.v;
            pt.pLeg_W[k] = o.pLeg.v;
            pt.pDrive_W[k] = o.pDrive.v;
        }
        if (sensitivity)
            computeSensitivity(pt);
        return pt;
    }

    // Damped Newton from x; on success x is the solution and m_out/m_J belong to it.
    bool newton(std::vector<double>& x, const std::vector<double>& tj, ElectricalPoint& pt, int& total) {
        if (m_feed != BankFeed::Current)
            x[1] = m_vFixed;
        double merit = evaluate(x, tj);
        bool converged = false;
        int it = 0;
        Eigen::VectorXd dx(m_nx);
        // Stagnation: Newton with an exact Jacobian converges quadratically once close, and the
        // damped steps far away lower the merit steadily; a merit that has not halved over the last
        // kStall steps (after kStall steps) is a crawl that the remaining steps would not end (a
        // bipolar or Darlington bank near the edge of carrying its load at a hot junction). Giving
        // up then leaves the caller's retries (cold start, load steps) their turn sooner.
        constexpr int kStall = 20;
        std::array<double, kStall> meritAgo{};
        for (; it <= m_maxIt; ++it) {
            if (!std::isfinite(merit)) {
                fail(pt, BankFailure::NoConvergence, "the network equations gave a non-finite value",
                     total += it);
                return false;
            }
            if (residualConverged(x)) {
                converged = true;
                break;
            }
            if (it == m_maxIt)
                break;
            if (it >= 2 * kStall && !(merit < 0.5 * meritAgo[static_cast<std::size_t>(it % kStall)]))
                break;
            meritAgo[static_cast<std::size_t>(it % kStall)] = merit;
            bool solved = false;
            if constexpr (m == 1)
                solved = scalarFactor() && scalarStep(dx);
            else
                solved = useArrow() && arrowSolve(-m_r, dx);
            if (!solved) {
                m_lu.compute(m_J);
                dx = m_lu.solve(-m_r);
            }
            if (!dx.allFinite()) {
                fail(pt, BankFailure::NoConvergence, "singular network Jacobian", total += it);
                return false;
            }
            // Limited trial point; back off while the residual grows markedly.
            std::vector<double>& trial = m_trial;
            double alpha = 1.0;
            double trialMerit = merit;
            bool tiny = true;
            for (int bt = 0; bt < 7; ++bt) {
                makeStep(x, dx, alpha, tj, trial);
                trialMerit = evaluate(trial, tj);
                if (std::isfinite(trialMerit) && (trialMerit < merit || bt == 6))
                    break;
                alpha *= 0.5;
            }
            for (int i = 0; i < m_nx; ++i)
                if (std::abs(trial[static_cast<std::size_t>(i)] - x[static_cast<std::size_t>(i)]) >
                    1e-13 * (1.0 + std::abs(x[static_cast<std::size_t>(i)])))
                    tiny = false;
            x.swap(trial);
            merit = trialMerit;
            if (m_feed == BankFeed::Current && std::abs(x[1]) > m_vAbort) {
                std::ostringstream s;
                s << "the bank cannot carry " << fmt(m_load)
                  << " A with this drive: the drain/collector voltage "
                  << "runs past " << fmt(m_vAbort) << " V";
                if (m_bus > 0.0)
                    s << ", far above the bus voltage " << fmt(m_bus) << " V";
                s << " (the devices would leave conduction)";
                fail(pt, BankFailure::CannotCarryLoad, s.str(), total += it + 1);
                return false;
            }
            if (tiny && std::isfinite(merit) && merit < 1e-6) {
                converged = true;
                ++it;
                break;
            }
        }
        total += it;
        if (!converged) {
            std::ostringstream s;
            s << "the network solve did not converge in " << it << " Newton steps";
            fail(pt, BankFailure::NoConvergence, s.str(), total);
            return false;
        }
        pt.ok = true;
        pt.failure = BankFailure::None;
        pt.reason.clear();
        return true;
    }

    void fillRegions(ElectricalPoint& pt, const std::vector<double>& tj) const override {
        pt.region.assign(static_cast<std::size_t>(n), std::string());
        if (static_cast<int>(pt.x.size()) != m_nx || static_cast<int>(tj.size()) != n)
            return;
        for (int k = 0; k < n; ++k)
            pt.region[static_cast<std::size_t>(k)] = m_legs[static_cast<std::size_t>(k)].region(
                pt.x[0], pt.x[1], &pt.x[static_cast<std::size_t>(2 + k * m)],
                tj[static_cast<std::size_t>(k)]);
    }

  private:
    static bool allFinite(const std::vector<double>& v) {
        return std::all_of(v.begin(), v.end(), [](double a) { return std::isfinite(a); });
    }

    ElectricalPoint& fail(ElectricalPoint& pt, BankFailure f, std::string reason, int it) {
        pt.ok = false;
        pt.failure = f;
        pt.reason = std::move(reason);
        pt.iterations = it;
        return pt;
    }

    std::vector<double> initialGuess(const std::vector<double>& tj) const {
        std::vector<double> x(static_cast<std::size_t>(m_nx), 0.0);
        // A bank that is driven on conducts: guess at least a small current per device so that
        // the junctions start forward-biased even at zero load.
        const double share = std::max(m_load / n, 1e-3);
        double vc = m_vFixed;
        double vg = m_vDrv;
        switch (m_feed) {
        case BankFeed::Current: {
            vc = 0.0;
            for (int k = 0; k < n; ++k)
                vc = std::max(vc, m_legs[static_cast<std::size_t>(k)].nodeGuess(
                                      share, tj[static_cast<std::size_t>(k)]));
            if constexpr (Leg::kBaseCurrent)
                vg = driveNodeGuess(share, tj);
            break;
        }
        case BankFeed::Voltage:
            if constexpr (Leg::kBaseCurrent)
                vg = driveNodeGuess(share, tj);
            break;
        case BankFeed::Linear: {
            double needG = 0.0;
            for (int k = 0; k < n; ++k)
                needG = std::max(needG, m_legs[static_cast<std::size_t>(k)].gateGuess(
                                            share, tj[static_cast<std::size_t>(k)]));
            vg = needG;
            break;
        }
        }
        x[0] = vg;
        x[1] = vc;
        for (int k = 0; k < n; ++k) {
            double s = share;
            if (m_feed == BankFeed::Voltage)
                s = m_legs[static_cast<std::size_t>(k)].voltageFedShare(vg, vc,
                                                                        tj[static_cast<std::size_t>(k)]);
            m_legs[static_cast<std::size_t>(k)].guess(s, vg, vc, tj[static_cast<std::size_t>(k)],
                                                      &x[static_cast<std::size_t>(2 + k * m)]);
        }
        return x;
    }

    // The drive node of a bipolar bank as a divider: (V_drv − V_G)/R_drv = Σ max(V_G − V_b,k, 0)/R_b,k
    // with each base at its forward voltage for `share` (bisection; a leg with no base resistance
    // pins V_G to its base).
    double driveNodeGuess(double share, const std::vector<double>& tj) const {
        double lo = m_vDrv, hi = m_vDrv;
        std::vector<double> vb(static_cast<std::size_t>(n)), rb(static_cast<std::size_t>(n));
        for (int k = 0; k < n; ++k) {
            const auto kk = static_cast<std::size_t>(k);
            vb[kk] = m_legs[kk].baseGuess(share, tj[kk]);
            rb[kk] = m_legs[kk].baseSeriesResistance();
            lo = std::min(lo, vb[kk]);
        }
        if (m_rDrv <= 0.0 || lo >= hi)
            return m_vDrv;
        for (int i = 0; i < 60; ++i) {
            const double vg = 0.5 * (lo + hi);
            double drawn = 0.0;
            for (std::size_t k = 0; k < vb.size(); ++k)
                drawn += vg > vb[k] ? (rb[k] > 0.0 ? (vg - vb[k]) / rb[k] : 1e30) : 0.0;
            ((m_vDrv - vg) / m_rDrv > drawn ? lo : hi) = vg;
        }
        return lo;
    }

    // Residual, Jacobian and per-leg outputs at x; returns the scaled merit Σ(r/scale)².
    double evaluate(const std::vector<double>& x, const std::vector<double>& tj) {
        const D vg = D::variable(x[0], 0);
        const D vc = D::variable(x[1], 1);
        D sumIg(0.0), sumIc(0.0);
        std::array<D, m> u;
        for (int k = 0; k < n; ++k) {
            const int base = 2 + k * m;
            for (int i = 0; i < m; ++i)
                u[static_cast<std::size_t>(i)] = D::variable(x[static_cast<std::size_t>(base + i)], 2 + i);
            const D t = D::variable(tj[static_cast<std::size_t>(k)], 2 + m);
            LegOut<D>& o = m_out[static_cast<std::size_t>(k)];
            m_legs[static_cast<std::size_t>(k)].eval(vg, vc, u.data(), t, o);
            for (int i = 0; i < m; ++i) {
                const D& r = o.r[static_cast<std::size_t>(i)];
                m_r(base + i) = r.v;
                m_J(base + i, 0) = r.d[0];
                m_J(base + i, 1) = r.d[1];
                for (int j = 0; j < m; ++j)
                    m_J(base + i, base + j) = r.d[static_cast<std::size_t>(2 + j)];
                m_dT[static_cast<std::size_t>(k)][static_cast<std::size_t>(i)] = r.d[2 + m];
            }
            // Border rows: the drive node and the collector node see this leg's currents.
            for (int j = 0; j < m; ++j) {
                const auto dj = static_cast<std::size_t>(2 + j);
                m_J(0, base + j) = rowZeroWeight() * (m_feed == BankFeed::Linear ? o.ic.d[dj] : o.ig.d[dj]);
                m_J(1, base + j) = m_feed == BankFeed::Current ? o.ic.d[dj] : 0.0;
            }
            sumIg = sumIg + o.ig;
            sumIc = sumIc + o.ic;
        }
        switch (m_feed) {
        case BankFeed::Current:
        case BankFeed::Voltage:
            // (V_drv − V_G) − R_drv·ΣI_G = 0; with R_drv = 0 this pins V_G = V_drv.
            m_r(0) = (m_vDrv - x[0]) - m_rDrv * sumIg.v;
            m_J(0, 0) = -1.0 - m_rDrv * sumIg.d[0];
            m_J(0, 1) = -m_rDrv * sumIg.d[1];
            break;
        case BankFeed::Linear:
            m_r(0) = sumIc.v - m_load;
            m_J(0, 0) = sumIc.d[0];
            m_J(0, 1) = sumIc.d[1];
            break;
        }
        if (m_feed == BankFeed::Current) {
            m_r(1) = sumIc.v - m_load;
            m_J(1, 0) = sumIc.d[0];
            m_J(1, 1) = sumIc.d[1];
        } else {
            m_r(1) = x[1] - m_vFixed;
            m_J(1, 0) = 0.0;
            m_J(1, 1) = 1.0;
        }
        double merit = 0.0;
        for (int i = 0; i < m_nx; ++i) {
            const double s = m_currentRow[static_cast<std::size_t>(i)] ? m_iRef : 0.025;
            merit += (m_r(i) / s) * (m_r(i) / s);
        }
        return merit;
    }

    // Row 0 couples to leg unknowns through −R_drv·I_G (drive feeds) or +I_C (linear feed).
    double rowZeroWeight() const { return m_feed == BankFeed::Linear ? 1.0 : -m_rDrv; }

    bool residualConverged(const std::vector<double>& x) const {
        const double tolV = 1e-9 + 1e-12 * (std::abs(x[0]) + std::abs(x[1]));
        const double tolI = 1e-10 * m_iRef + 1e-13;
        for (int i = 0; i < m_nx; ++i)
            if (std::abs(m_r(i)) > (m_currentRow[static_cast<std::size_t>(i)] ? tolI : tolV))
                return false;
        return true;
    }

    void makeStep(const std::vector<double>& x, const Eigen::VectorXd& dx, double alpha,
                  const std::vector<double>& tj, std::vector<double>& out) const {
        for (int i = 0; i < m_nx; ++i)
            out[static_cast<std::size_t>(i)] = x[static_cast<std::size_t>(i)] + alpha * dx(i);
        // Global node steps: at most 2 V or half the present value, whichever is larger.
        for (int i = 0; i < 2; ++i) {
            const double lim = std::max(2.0, 0.5 * std::abs(x[static_cast<std::size_t>(i)]));
            const double d = out[static_cast<std::size_t>(i)] - x[static_cast<std::size_t>(i)];
            out[static_cast<std::size_t>(i)] = x[static_cast<std::size_t>(i)] + std::clamp(d, -lim, lim);
        }
        if (m_feed != BankFeed::Current)
            out[1] = m_vFixed;
        for (int k = 0; k < n; ++k) {
            const auto base = static_cast<std::size_t>(2 + k * m);
            m_legs[static_cast<std::size_t>(k)].limit(&x[base], &out[base], tj[static_cast<std::size_t>(k)]);
        }
    }

    // J·X = B by the arrow structure of J: each leg's rows touch only its own m unknowns and the
    // two shared nodes (V_G, V_C), and only the two border rows touch every leg. Eliminating the
    // legs leaves the 2×2 Schur complement S = J_gg − Σ_k J_gk·J_kk⁻¹·J_kg for the shared nodes,
    // then each leg's unknowns follow from its own block: O(N·m³) instead of the dense LU's
    // O((2 + m·N)³) (Golub & Van Loan, "Matrix Computations", block elimination; from memory).
    // false when a leg block or S is singular or the solution does not satisfy J·X = B to working
    // accuracy (no pivoting across legs): the caller then takes the dense LU.
    // For legs of several unknowns (bipolar, Darlington) in banks beyond a few devices. A MOSFET
    // leg has one unknown and its dense LU is faster at every bank size here (measured with the
    // sweep of the garden-cart demo, 8 to 50 devices, and the eight-MOSFET solve: 57 µs with the
    // block elimination, 36 µs without).
    bool useArrow() const { return m > 1 && m_nx > 24; }

    template <class Rhs, class Out> bool arrowSolve(const Rhs& bIn, Out& out) {
        using Block = Eigen::Matrix<double, m, m>;
        using Border = Eigen::Matrix<double, m, 2>;
        const Eigen::MatrixXd b = bIn;
        const Eigen::Index cols = b.cols();
        Eigen::Matrix2d schur = m_J.template topLeftCorner<2, 2>();
        Eigen::MatrixXd rhsG = b.topRows(2);
        m_legLu.resize(static_cast<std::size_t>(n));
        m_legInvB.resize(static_cast<std::size_t>(n));
        m_legInvR.resize(static_cast<std::size_t>(n));
        for (int k = 0; k < n; ++k) {
            const auto kk = static_cast<std::size_t>(k);
            const int base = 2 + k * m;
            const Block a = m_J.template block<m, m>(base, base);
            // Any non-zero pivot will do: the accuracy test below judges the result (a bipolar leg
            // whose junctions are off has pivots far below its largest; the solve stays accurate).
            m_legLu[kk].setThreshold(std::numeric_limits<double>::min());
            m_legLu[kk].compute(a);
            if (!m_legLu[kk].isInvertible())
                return false;
            const Border bk = m_J.template block<m, 2>(base, 0);
            m_legInvB[kk] = m_legLu[kk].solve(bk);
            m_legInvR[kk] = m_legLu[kk].solve(b.middleRows(base, m));
            const Eigen::Matrix<double, 2, m> ck = m_J.template block<2, m>(0, base);
            schur.noalias() -= ck * m_legInvB[kk];
            rhsG.noalias() -= ck * m_legInvR[kk];
        }
        const Eigen::FullPivLU<Eigen::Matrix2d> slu(schur);
        if (!slu.isInvertible())
            return false;
        const Eigen::MatrixXd xg = slu.solve(rhsG);
        Eigen::MatrixXd x(m_nx, cols);
        x.topRows(2) = xg;
        for (int k = 0; k < n; ++k) {
            const auto kk = static_cast<std::size_t>(k);
            x.middleRows(2 + k * m, m) = m_legInvR[kk] - m_legInvB[kk] * xg;
        }
        if (!x.allFinite())
            return false;
        // Accuracy: the residual of J·X = B, row by row against the size of the row's terms.
        Eigen::MatrixXd resG = m_J.template topLeftCorner<2, 2>() * xg - b.topRows(2);
        Eigen::MatrixXd sizeG = m_J.template topLeftCorner<2, 2>().cwiseAbs() * xg.cwiseAbs() + b.topRows(2).cwiseAbs();
        for (int k = 0; k < n; ++k) {
            const int base = 2 + k * m;
            const auto xk = x.middleRows(base, m);
            const Eigen::Matrix<double, 2, m> ck = m_J.template block<2, m>(0, base);
            resG.noalias() += ck * xk;
            sizeG.noalias() += ck.cwiseAbs() * xk.cwiseAbs();
            const Eigen::MatrixXd rk = m_J.template block<m, m>(base, base) * xk +
                                       m_J.template block<m, 2>(base, 0) * xg - b.middleRows(base, m);
            const Eigen::MatrixXd sk = m_J.template block<m, m>(base, base).cwiseAbs() * xk.cwiseAbs() +
                                       m_J.template block<m, 2>(base, 0).cwiseAbs() * xg.cwiseAbs() +
                                       b.middleRows(base, m).cwiseAbs();
            if (!(rk.cwiseAbs().array() <= 1e-10 * sk.array() + 1e-300).all())
                return false;
        }
        if (!(resG.cwiseAbs().array() <= 1e-10 * sizeG.array() + 1e-300).all())
            return false;
        out = std::move(x);
        return true;
    }

    // One-unknown legs (MOSFET): the arrow elimination above in scalar arithmetic, without
    // allocations. Leg row k reads a_k·x_k + J_k0·x_0 + J_k1·x_1 = b_k (a_k = ∂r_k/∂I_k, the only
    // entry of the leg block), so x_k = b_k/a_k − w_k0·x_0 − w_k1·x_1 with w_k = J_kg/a_k, and the
    // border rows reduce to the 2×2 Schur complement S = J_gg − Σ_k J_gk·w_kᵀ (Golub & Van Loan,
    // "Matrix Computations", block elimination of a bordered block-diagonal matrix; from memory).
    // O(N) per right-hand side instead of the dense LU's O(N³).
    // There is no pivoting across legs, so the factorisation is accepted only when it is safe,
    // judged by pivot sizes (Gaussian elimination's error is bounded by eps times the growth of the
    // eliminated entries; Golub & Van Loan, ibid., from memory): every leg pivot a_k non-zero and
    // its multipliers finite (for a MOSFET a_k = 1 + channel conductances × series resistances
    // ≥ 1), each row of S not cancelled below 1e-8 of the sum of magnitudes it was formed from
    // (S then keeps about eight significant digits), and S's own second pivot not cancelled
    // below 1e-12 (S, and so J, numerically singular). Otherwise the caller takes the dense LU.
    bool scalarFactor() {
        static_assert(m == 1);
        const auto nn = static_cast<std::size_t>(n);
        m_inv.resize(nn);
        m_w0.resize(nn);
        m_w1.resize(nn);
        double s00 = m_J(0, 0), s01 = m_J(0, 1), s10 = m_J(1, 0), s11 = m_J(1, 1);
        double g00 = std::abs(s00), g01 = std::abs(s01), g10 = std::abs(s10), g11 = std::abs(s11);
        for (int k = 0; k < n; ++k) {
            const auto kk = static_cast<std::size_t>(k);
            const int b = 2 + k;
            const double a = m_J(b, b);
            if (!(a != 0.0))
                return false;
            const double inv = 1.0 / a;
            const double w0 = m_J(b, 0) * inv, w1 = m_J(b, 1) * inv;
            m_inv[kk] = inv;
            m_w0[kk] = w0;
            m_w1[kk] = w1;
            const double c0 = m_J(0, b), c1 = m_J(1, b);
            s00 -= c0 * w0;
            s01 -= c0 * w1;
            s10 -= c1 * w0;
            s11 -= c1 * w1;
            g00 += std::abs(c0 * w0);
            g01 += std::abs(c0 * w1);
            g10 += std::abs(c1 * w0);
            g11 += std::abs(c1 * w1);
        }
        if (!std::isfinite(g00 + g01 + g10 + g11))
            return false;
        if (!(std::max(std::abs(s00), std::abs(s01)) >= 1e-8 * std::max(g00, g01)) ||
            !(std::max(std::abs(s10), std::abs(s11)) >= 1e-8 * std::max(g10, g11)))
            return false;
        // 2×2 LU of S with row pivoting.
        m_schurSwap = std::abs(s10) > std::abs(s00);
        if (m_schurSwap) {
            std::swap(s00, s10);
            std::swap(s01, s11);
        }
        if (!(s00 != 0.0))
            return false;
        m_schurL = s10 / s00;
        m_schurU00 = s00;
        m_schurU01 = s01;
        m_schurU11 = s11 - m_schurL * s01;
        return std::abs(m_schurU11) > 1e-12 * std::max(std::abs(s11), std::abs(m_schurL * s01));
    }

    // The shared-node unknowns from the reduced border right-hand side (r0, r1) = b_g − Σ J_gk·b_k/a_k.
    void schurSolve(double r0, double r1, double& x0, double& x1) const {
        if (m_schurSwap)
            std::swap(r0, r1);
        r1 -= m_schurL * r0;
        x1 = r1 / m_schurU11;
        x0 = (r0 - m_schurU01 * x1) / m_schurU00;
    }

    // Newton step J·dx = −r after scalarFactor().
    bool scalarStep(Eigen::VectorXd& dx) const {
        double r0 = -m_r(0), r1 = -m_r(1);
        for (int k = 0; k < n; ++k) {
            const int b = 2 + k;
            const double y = -m_r(b) * m_inv[static_cast<std::size_t>(k)];
            dx(b) = y;
            r0 -= m_J(0, b) * y;
            r1 -= m_J(1, b) * y;
        }
        double x0, x1;
        schurSolve(r0, r1, x0, x1);
        dx(0) = x0;
        dx(1) = x1;
        for (int k = 0; k < n; ++k) {
            const auto kk = static_cast<std::size_t>(k);
            dx(2 + k) -= m_w0[kk] * x0 + m_w1[kk] * x1;
        }
        return dx.allFinite();
    }

    // The sensitivity of one-unknown legs by the scalar elimination. Right-hand side j < N is
    // −∂F/∂T_j: non-zero only in the border rows and leg j's row, so its reduced border
    // right-hand side costs O(1); only the shared nodes' d(V_G, V_C)/dT_j = xg_j are kept per
    // column, and the rest comes out factored (see ElectricalPoint::sFactored), O(N) in all:
    //   dI_k/dT_j = δ_kj·y_k − w_k·xg_j  with y_k = −(∂r_k/∂T)/a_k,
    //   S_kj = dP_k/dT_j = δ_kj·(∂P_k/∂T + ∂P_k/∂I_k·y_k) + (∂P_k/∂V_g − ∂P_k/∂I_k·w_k)·xg_j.
    bool scalarSensitivity(ElectricalPoint& pt) {
        static_assert(m == 1);
        if (!scalarFactor())
            return false;
        const auto nn = static_cast<std::size_t>(n);
        pt.sRight.resize(2 * nn);
        pt.sDiag.resize(nn);
        pt.sLeft.resize(2 * nn);
        pt.xDiag.resize(nn);
        pt.xLeft.resize(2 * nn);
        for (std::size_t j = 0; j < nn; ++j) {
            const LegOut<D>& o = m_out[j];
            const double dIg = o.ig.d[3];
            const double dIc = o.ic.d[3];
            const double b0 = -(m_feed == BankFeed::Linear ? dIc : -m_rDrv * dIg);
            const double b1 = m_feed == BankFeed::Current ? -dIc : 0.0;
            const double y = -m_dT[j][0] * m_inv[j];
            const int col = 2 + static_cast<int>(j);
            double x0, x1;
            schurSolve(b0 - m_J(0, col) * y, b1 - m_J(1, col) * y, x0, x1);
            pt.sRight[j] = x0;
            pt.sRight[nn + j] = x1;
            const D& p = o.pDev;
            pt.xDiag[j] = y;
            pt.xLeft[2 * j] = -m_w0[j];
            pt.xLeft[2 * j + 1] = -m_w1[j];
            pt.sDiag[j] = p.d[3] + p.d[2] * y;
            pt.sLeft[2 * j] = p.d[0] - p.d[2] * m_w0[j];
            pt.sLeft[2 * j + 1] = p.d[1] - p.d[2] * m_w1[j];
        }
        // The load current's right-hand side: only the border rows.
        double x0, x1;
        schurSolve(m_feed == BankFeed::Linear ? 1.0 : 0.0, m_feed == BankFeed::Current ? 1.0 : 0.0, x0, x1);
        const auto finite = [](const std::vector<double>& v) {
            return std::all_of(v.begin(), v.end(), [](double a) { return std::isfinite(a); });
        };
        if (!std::isfinite(x1) || !finite(pt.sRight) || !finite(pt.sDiag) || !finite(pt.sLeft) ||
            !finite(pt.xDiag) || !finite(pt.xLeft))
            return false;
        pt.dVcdLoad = x1;
        pt.sFactored = true;
        pt.sOn.clear();
        pt.dxdT.clear();
        return true;
    }

    void computeSensitivity(ElectricalPoint& pt) {
        if constexpr (m == 1) {
            if (scalarSensitivity(pt))
                return;
        }
        pt.sFactored = false;
        // dX/dT_j = −J⁻¹·∂F/∂T_j at the converged point (m_J, m_out are at pt.x).
        // One more right-hand side: the load current (the incremental resistance dV_C/dI).
        Eigen::MatrixXd b = Eigen::MatrixXd::Zero(m_nx, n + 1);
        if (m_feed == BankFeed::Current)
            b(1, n) = 1.0;
        else if (m_feed == BankFeed::Linear)
            b(0, n) = 1.0;
        for (int j = 0; j < n; ++j) {
            const LegOut<D>& o = m_out[static_cast<std::size_t>(j)];
            const int base = 2 + j * m;
            for (int i = 0; i < m; ++i)
                b(base + i, j) = -m_dT[static_cast<std::size_t>(j)][static_cast<std::size_t>(i)];
            const double dIg = o.ig.d[2 + m];
            const double dIc = o.ic.d[2 + m];
            b(0, j) = -(m_feed == BankFeed::Linear ? dIc : -m_rDrv * dIg);
            b(1, j) = m_feed == BankFeed::Current ? -dIc : 0.0;
        }
        Eigen::MatrixXd dx;
        if (!useArrow() || !arrowSolve(b, dx)) {
            m_lu.compute(m_J);
            dx = m_lu.solve(b);
        }
        pt.dVcdLoad = std::isfinite(dx(1, n)) ? dx(1, n) : 0.0;
        pt.dxdT.resize(static_cast<std::size_t>(m_nx * n));
        for (int i = 0; i < m_nx; ++i)
            for (int j = 0; j < n; ++j)
                pt.dxdT[static_cast<std::size_t>(i * n + j)] = std::isfinite(dx(i, j)) ? dx(i, j) : 0.0;
        pt.sOn.assign(static_cast<std::size_t>(n * n), 0.0);
        for (int k = 0; k < n; ++k) {
            const D& p = m_out[static_cast<std::size_t>(k)].pDev;
            const int base = 2 + k * m;
            for (int j = 0; j < n; ++j) {
                double s = p.d[0] * dx(0, j) + p.d[1] * dx(1, j);
                for (int i = 0; i < m; ++i)
                    s += p.d[static_cast<std::size_t>(2 + i)] * dx(base + i, j);
                if (k == j)
                    s += p.d[2 + m];
                pt.sOn[static_cast<std::size_t>(k * n + j)] = std::isfinite(s) ? s : 0.0;
            }
        }
    }

    std::vector<Leg> m_legs;
    int m_nx = 0;
    BankFeed m_feed = BankFeed::Current;
    double m_vDrv = 0.0, m_rDrv = 0.0, m_load = 0.0, m_vFixed = 0.0, m_bus = 0.0;
    double m_iRef = 1.0, m_vAbort = 1e4, m_rating = 1.0;
    int m_maxIt = 100;
    std::vector<bool> m_currentRow;
    Eigen::MatrixXd m_J;
    Eigen::VectorXd m_r;
    Eigen::PartialPivLU<Eigen::MatrixXd> m_lu;
    std::vector<Eigen::FullPivLU<Eigen::Matrix<double, m, m>>> m_legLu;     ///< arrowSolve's leg blocks
    std::vector<Eigen::Matrix<double, m, 2>> m_legInvB;                      ///< J_kk⁻¹·J_kg
    std::vector<Eigen::Matrix<double, m, Eigen::Dynamic>> m_legInvR;        ///< J_kk⁻¹·B_k
    std::vector<double> m_inv, m_w0, m_w1; ///< scalarFactor: 1/a_k, J_k0/a_k, J_k1/a_k
    bool m_schurSwap = false;                ///< scalarFactor: the 2×2 Schur complement's LU
    double m_schurL = 0.0, m_schurU00 = 1.0, m_schurU01 = 0.0, m_schurU11 = 1.0;
    std::vector<LegOut<D>> m_out;
    std::vector<double> m_trial;
    std::vector<std::array<double, m>> m_dT; ///< ∂r/∂T of each leg row
};

double deviceTopK(const BankProblem& p) {
    return toKelvin(p.part.tjMax_C) + 125.0;
}

} // namespace

BankNetwork::BankNetwork(const BankProblem& p) {
    const int n = static_cast<int>(p.devices.size());
    auto devGate = [&](const BankDevice& d) {
        return std::max(p.gateResistor_ohm + d.gateResistorDeviation_ohm, 0.0);
    };
    auto devBallast = [&](const BankDevice& d) {
        return std::max(p.ballast_ohm + d.ballastDeviation_ohm, 0.0);
    };
    auto devLeg = [&](const BankDevice& d) {
        return std::max(p.legResistance_ohm + d.legResistanceDeviation_ohm, 0.0);
    };
    if (p.part.kind == "mosfet") {
        std::vector<MosfetLeg> legs(static_cast<std::size_t>(n));
        const double raise = MosfetModel::consistencyRaise(p.part.mosfet, deviceTopK(p));
        for (int k = 0; k < n; ++k) {
            const BankDevice& d = p.devices[static_cast<std::size_t>(k)];
            MosfetLeg& l = legs[static_cast<std::size_t>(k)];
            l.model =
                MosfetModel::make(p.part.mosfet, d.rdsOnDeviation, d.vthDeviation_V, deviceTopK(p), raise);
            l.gate_ohm = devGate(d);
            l.ballast_ohm = devBallast(d);
            l.leg_ohm = devLeg(d);
            l.pulldown_ohm = p.pulldown_ohm;
        }
        std::vector<std::string> notes;
        if (n > 0 && legs.front().model.kRaise > 1.0)
            notes.push_back("The part's transconductance K makes the channel alone exceed 90 % of R_ds(on); "
                            "K was raised ×" +
                            fmt(legs.front().model.kRaise, 3) + " so the square-law region joins R_ds(on).");
        m_impl = std::make_unique<TypedNetwork<MosfetLeg>>(p, std::move(legs));
        m_impl->notes = std::move(notes);
    } else if (p.part.kind == "darlington") {
        std::vector<DarlingtonLeg> legs(static_cast<std::size_t>(n));
        for (int k = 0; k < n; ++k) {
            const BankDevice& d = p.devices[static_cast<std::size_t>(k)];
            DarlingtonLeg& l = legs[static_cast<std::size_t>(k)];
            l.m = DarlingtonModel::make(p.part.driver, p.part.bjt, d.vbeDeviation_V, d.betaDeviation,
                                        p.earlyVoltage_V);
            l.gate_ohm = devGate(d);
            l.ballast_ohm = devBallast(d);
            l.leg_ohm = devLeg(d);
        }
        m_impl = std::make_unique<TypedNetwork<DarlingtonLeg>>(p, std::move(legs));
    } else {
        std::vector<BipolarLeg> legs(static_cast<std::size_t>(n));
        for (int k = 0; k < n; ++k) {
            const BankDevice& d = p.devices[static_cast<std::size_t>(k)];
            BipolarLeg& l = legs[static_cast<std::size_t>(k)];
            l.q = BjtModel::make(p.part.bjt, d.vbeDeviation_V, d.betaDeviation, p.earlyVoltage_V);
            l.gate_ohm = devGate(d);
            l.ballast_ohm = devBallast(d);
            l.leg_ohm = devLeg(d);
        }
        m_impl = std::make_unique<TypedNetwork<BipolarLeg>>(p, std::move(legs));
    }
}

std::vector<double> denseSensitivity(const ElectricalPoint& pt) {
    if (!pt.sFactored)
        return pt.sOn;
    const std::size_t nn = pt.sDiag.size();
    std::vector<double> s(nn * nn);
    for (std::size_t k = 0; k < nn; ++k) {
        const double l0 = pt.sLeft[2 * k], l1 = pt.sLeft[2 * k + 1];
        for (std::size_t j = 0; j < nn; ++j) {
            const double v = l0 * pt.sRight[j] + l1 * pt.sRight[nn + j] + (k == j ? pt.sDiag[k] : 0.0);
            s[k * nn + j] = std::isfinite(v) ? v : 0.0;
        }
    }
    return s;
}

BankNetwork::~BankNetwork() = default;

int BankNetwork::count() const {
    return m_impl->n;
}
const std::vector<std::string>& BankNetwork::notes() const {
    return m_impl->notes;
}

ElectricalPoint BankNetwork::solve(const std::vector<double>& tj_K, const std::vector<double>* x0,
                                   bool sensitivity) {
    return m_impl->solve(tj_K, x0, sensitivity);
}

void BankNetwork::fillRegions(ElectricalPoint& pt, const std::vector<double>& tj_K) const {
    m_impl->fillRegions(pt, tj_K);
}

} // namespace amp::detail

// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/bank/banksolver.h"

#include "core/bank/banknetwork.h"
#include "core/bank/thermalnetwork.h"
#include "core/bank/thermalvoltage.h"
#include "core/units/units.h"

#include <Eigen/Dense>

#include <algorithm>
#include <cmath>
#include <complex>
#include <optional>

namespace amp {

const char* toString(BankFailure f) {
    switch (f) {
    case BankFailure::None:
        return "none";
    case BankFailure::InvalidInput:
        return "invalidInput";
    case BankFailure::ThermalRunaway:
        return "thermalRunaway";
    case BankFailure::CannotCarryLoad:
        return "cannotCarryLoad";
    case BankFailure::NoConvergence:
        return "noConvergence";
    }
    return "none";
}

const char* toString(BankMode m) {
    return m == BankMode::Differential ? "differential" : "common";
}

namespace {

std::string num(double v, int precision = 4) { return units::plain(v, precision); }

// A field path given as text, or as a function that builds it: the checks run on every solve, so
// a path is only put together when its check fails.
inline std::string pathText(const std::string& path) { return path; }
inline std::string pathText(const char* path) { return path; }
template <class F> std::string pathText(const F& path) { return path(); }

class Checker {
  public:
    explicit Checker(std::vector<Problem>& out) : m_out(out) {}
    template <class Path>
    void range(double v, double lo, double hi, const Path& path, const char* unit = "") {
        if (!std::isfinite(v)) {
            m_out.push_back({pathText(path), "is not a finite number"});
        } else if (v < lo || v > hi) {
            m_out.push_back({pathText(path), "is " + num(v) + unit + "; it must lie between " + num(lo) +
                                                 unit + " and " + num(hi) + unit});
        }
    }
    template <class Path>
    void above(double v, double lo, double hi, const Path& path, const char* unit = "") {
        if (!std::isfinite(v)) {
            m_out.push_back({pathText(path), "is not a finite number"});
        } else if (v <= lo || v > hi) {
            m_out.push_back({pathText(path), "is " + num(v) + unit + "; it must be above " + num(lo) + unit +
                                                 " and at most " + num(hi) + unit});
        }
    }
    void fail(const std::string& path, const std::string& message) { m_out.push_back({path, message}); }

  private:
    std::vector<Problem>& m_out;
};

void checkBjt(Checker& c, const BjtParams& b, const std::string& prefix) {
    c.above(b.saturationCurrent25_A, 0.0, 1.0, prefix + ".saturationCurrent25_A", " A");
    c.above(b.betaF, 0.0, 1e12, prefix + ".betaF");
    c.above(b.betaR, 0.0, 1e6, prefix + ".betaR");
    c.range(b.highCurrentKnee_A, 0.0, 1e6, prefix + ".highCurrentKnee_A", " A");
    c.range(b.emissionCoefficient, 0.5, 4.0, prefix + ".emissionCoefficient");
    c.range(b.baseResistance_ohm, 0.0, 1e6, prefix + ".baseResistance_ohm", " Ω");
    c.range(b.emitterResistance_ohm, 0.0, 1e3, prefix + ".emitterResistance_ohm", " Ω");
    c.range(b.collectorResistance_ohm, 0.0, 1e3, prefix + ".collectorResistance_ohm", " Ω");
    c.range(b.xti, -5.0, 10.0, prefix + ".xti");
    c.range(b.bandgap_eV, 0.1, 3.0, prefix + ".bandgap_eV", " eV");
    c.range(b.betaTempExponent, -5.0, 5.0, prefix + ".betaTempExponent");
}

// r = I_rms²/(duty·I²) of the switch current over the on-time.
double rippleFactor(const BankProblem& p) {
    if (p.feed == BankFeed::Voltage || p.load_A <= 0.0)
        return 1.0;
    if (p.rmsFactor > 0.0)
        return p.rmsFactor;
    const double r = p.ripplePeakToPeak_A / p.load_A;
    return 1.0 + r * r / 12.0;
}

// duty × r_eff with r_eff = 1 + (R_b·I/V_C)·(r − 1): the ripple raises only the resistive part
// of the bank's drop (R_b the incremental resistance dV_C/dI). For a linear bank V = V0 + R_b·i
// this is exactly the average of v·i over the waveform, V0·I_avg + R_b·I_rms², split in the
// proportion of the on-state powers.
double powerScale(const BankProblem& p, const detail::ElectricalPoint& pt) {
    const double r = rippleFactor(p);
    if (r == 1.0 || p.feed != BankFeed::Current || !(pt.vC > 0.0) || !(p.load_A > 0.0))
        return p.duty * r;
    const double resistive = std::max(pt.dVcdLoad * p.load_A / pt.vC, 0.0);
    return p.duty * (1.0 + resistive * (r - 1.0));
}

// S of the average junction powers: the on-state sensitivity times the waveform's power scale.
std::vector<double> scaledSensitivity(const BankProblem& p, const detail::ElectricalPoint& pt) {
    std::vector<double> s = detail::denseSensitivity(pt);
    const double scale = powerScale(p, pt);
    for (double& v : s)
        v *= scale;
    return s;
}

std::string heldText(BankFeed f) {
    switch (f) {
    case BankFeed::Current:
        return "bank current and duty held";
    case BankFeed::Voltage:
        return "drain/collector voltage and drive held";
    case BankFeed::Linear:
        return "bank current and drain/collector voltage held";
    }
    return "";
}

// Eigenvector of m for its eigenvalue lambda by inverse iteration: solve (m − σ·I)·v = v twice
// from a start vector without symmetry (a symmetric bank's modes are (anti)symmetric, so a start
// of ones would miss a differential mode), σ a hair off lambda so the matrix is not singular to
// the last bit. Each solve multiplies the wanted component by 1/|λ − σ| and every other by at
// most 1/gap, so two solves leave the others below (|λ − σ|/gap)² of it. Cheaper than every
// eigenvector of the full eigen-decomposition, and the same vector to rounding wherever the
// eigenvalue is simple.
template <class Matrix, class Scalar>
Eigen::Matrix<Scalar, Eigen::Dynamic, 1> inverseIteration(const Matrix& m, Scalar lambda) {
    using CMatrix = Eigen::Matrix<Scalar, Eigen::Dynamic, Eigen::Dynamic>;
    using CVector = Eigen::Matrix<Scalar, Eigen::Dynamic, 1>;
    const Eigen::Index n = m.rows();
    const double size = std::max(m.cwiseAbs().maxCoeff(), std::abs(lambda));
    if (!(size > 0.0))
        return CVector(); // no heat feedback at all: every vector is an eigenvector
    const Scalar sigma = lambda + Scalar(1e-10 * size);
    CMatrix a = m.template cast<Scalar>();
    a.diagonal().array() -= sigma;
    const Eigen::PartialPivLU<CMatrix> lu(a);
    CVector v(n);
    for (Eigen::Index i = 0; i < n; ++i)
        v(i) = Scalar(1.0 + 0.5 * std::sin(1.0 + 2.0 * static_cast<double>(i))); // no symmetry
    for (int pass = 0; pass < 2; ++pass) {
        v = lu.solve(v);
        const double norm = v.cwiseAbs().maxCoeff();
        if (!(norm > 0.0) || !std::isfinite(norm))
            return CVector();
        v /= Scalar(norm);
    }
    return v;
}

// Z·S; S is the N×N average-power sensitivity. Without neighbour coupling Z = z_self·I +
// z_common·11ᵀ and Z·S = z_self·S + z_common·1·(1ᵀS): O(N²) instead of the O(N³) product.
Eigen::MatrixXd loopMatrix(const ThermalMatrices& th, const std::vector<double>& s) {
    const int n = th.count;
    if (th.uniform) {
        Eigen::MatrixXd m(n, n);
        Eigen::RowVectorXd columnSums = Eigen::RowVectorXd::Zero(n);
        for (int k = 0; k < n; ++k)
            for (int j = 0; j < n; ++j)
                columnSums(j) += s[static_cast<std::size_t>(k * n + j)];
        for (int k = 0; k < n; ++k)
            for (int j = 0; j < n; ++j)
                m(k, j) = th.zSelf * s[static_cast<std::size_t>(k * n + j)] + th.zCommon * columnSums(j);
        return m;
    }
    Eigen::MatrixXd z(n, n), sm(n, n);
    for (int k = 0; k < n; ++k)
        for (int j = 0; j < n; ++j) {
            z(k, j) = th.at(k, j);
            sm(k, j) = s[static_cast<std::size_t>(k * n + j)];
        }
    return z * sm;
}

// Eigenvalues only (the real Schur form, without accumulating its vectors); the one eigenvector
// needed comes from inverse iteration. Empty when they cannot be had.
template <class Matrix> Eigen::VectorXcd eigenvaluesIn(const Eigen::MatrixXd& m) {
    const Eigen::EigenSolver<Matrix> es(Matrix(m), false);
    if (es.info() != Eigen::Success)
        return {};
    return es.eigenvalues();
}

Eigen::VectorXcd eigenvaluesOf(const Eigen::MatrixXd& m) {
    if (!m.allFinite())
        return {};
    // Up to 16 devices the solver's work arrays live on the stack (no allocations).
    if (m.rows() <= 16)
        return eigenvaluesIn<Eigen::Matrix<double, Eigen::Dynamic, Eigen::Dynamic, 0, 16, 16>>(m);
    return eigenvaluesIn<Eigen::MatrixXd>(m);
}

// Devices that the loop matrix cannot tell apart: k and j are interchangeable when swapping them
// leaves M unchanged (M_kk = M_jj, M_kj = M_jk, and M_ki = M_ji, M_ik = M_ij for every other i), to
// a tolerance far below any real spread of parts. The classes of such devices partition the bank
// equitably, so (Cvetković, Rowlinson & Simić, An Introduction to the Theory of Graph Spectra,
// §3.9, for the equitable partition; from memory)
//   * the vectors constant within each class are invariant: M acts on them as the p×p matrix
//     M_red(a, b) = Σ_{j ∈ class b} M_{r_a j}, r_a any device of class a;
//   * e_k − e_j for k, j in one class is an eigenvector with eigenvalue M_kk − M_kj,
//     m − 1 of them in a class of m.
// A bank of identical parts at identical states (the map's added devices are nominal parts) then
// needs the eigenvalues of a small matrix instead of an N×N eigen-decomposition.
struct Lumping {
    std::vector<int> classOf;        ///< per device
    std::vector<int> representative; ///< per class: its first device
    std::vector<int> size;           ///< per class
    Eigen::MatrixXd reduced;         ///< M_red
};

bool interchangeable(const Eigen::MatrixXd& m, int k, int j, double tol) {
    if (std::abs(m(k, k) - m(j, j)) > tol || std::abs(m(k, j) - m(j, k)) > tol)
        return false;
    for (Eigen::Index i = 0; i < m.rows(); ++i)
        if (i != k && i != j && (std::abs(m(k, i) - m(j, i)) > tol || std::abs(m(i, k) - m(i, j)) > tol))
            return false;
    return true;
}

// The classes, or nothing when every device is its own class (no reduction).
std::optional<Lumping> lumpingOf(const Eigen::MatrixXd& m) {
    const int n = static_cast<int>(m.rows());
    if (n < 2 || !m.allFinite())
        return std::nullopt;
    const double tol = 1e-13 * m.cwiseAbs().maxCoeff();
    Lumping l;
    l.classOf.assign(static_cast<std::size_t>(n), -1);
    for (int k = 0; k < n; ++k) {
        if (l.classOf[static_cast<std::size_t>(k)] >= 0)
            continue;
        const int c = static_cast<int>(l.representative.size());
        l.classOf[static_cast<std::size_t>(k)] = c;
        l.representative.push_back(k);
        l.size.push_back(1);
        for (int j = k + 1; j < n; ++j)
            if (l.classOf[static_cast<std::size_t>(j)] < 0 && interchangeable(m, k, j, tol)) {
                l.classOf[static_cast<std::size_t>(j)] = c;
                ++l.size.back();
            }
    }
    const auto p = static_cast<Eigen::Index>(l.representative.size());
    if (p == n)
        return std::nullopt;
    l.reduced = Eigen::MatrixXd::Zero(p, p);
    for (Eigen::Index a = 0; a < p; ++a)
        for (Eigen::Index j = 0; j < n; ++j)
            l.reduced(a, l.classOf[static_cast<std::size_t>(j)]) += m(l.representative[static_cast<std::size_t>(a)], j);
    return l;
}

// Every eigenvalue of M with its multiplicity: the reduced matrix's first (in Eigen's order), then
// each class's differential one; the full decomposition when there are no classes.
Eigen::VectorXcd spectrumOf(const Eigen::MatrixXd& m, const std::optional<Lumping>& lumping) {
    if (!lumping)
        return eigenvaluesOf(m);
    const Eigen::VectorXcd reduced = eigenvaluesOf(lumping->reduced);
    const auto p = static_cast<Eigen::Index>(lumping->representative.size());
    if (reduced.size() != p)
        return {};
    Eigen::VectorXcd ev(m.rows());
    ev.head(p) = reduced;
    Eigen::Index next = p;
    for (Eigen::Index a = 0; a < p; ++a) {
        const int r = lumping->representative[static_cast<std::size_t>(a)];
        if (lumping->size[static_cast<std::size_t>(a)] < 2)
            continue;
        int other = r + 1;
        while (lumping->classOf[static_cast<std::size_t>(other)] != a)
            ++other;
        const double mu = m(r, r) - m(r, other);
        for (int c = 1; c < lumping->size[static_cast<std::size_t>(a)]; ++c)
            ev(next++) = mu;
    }
    return ev;
}

// Loop gain of Z·S; S is the N×N average-power sensitivity.
BankStability stabilityOf(const ThermalMatrices& th, const std::vector<double>& s, BankFeed feed) {
    const int n = th.count;
    BankStability st;
    st.held = heldText(feed);
    st.sensitivity_WperK = s;
    const Eigen::MatrixXd m = loopMatrix(th, s);
    const std::optional<Lumping> lumping = lumpingOf(m);
    const Eigen::VectorXcd ev = spectrumOf(m, lumping);
    if (ev.size() != n)
        return st;
    // Spectral radius, and the eigenvalue with the largest real part: the mode that grows.
    int grow = 0;
    double radius = 0.0;
    for (int i = 0; i < n; ++i) {
        radius = std::max(radius, std::abs(ev(i)));
        if (ev(i).real() > ev(grow).real())
            grow = i;
    }
    const std::complex<double> lambda = ev(grow);
    Eigen::VectorXcd v;
    // With classes, an eigenvalue of the reduced matrix that is simple in M has its eigenvector
    // constant within each class: the reduced matrix's, spread over the classes. Otherwise (and for
    // a class's differential eigenvalue, whose space has many vectors) inverse iteration on M.
    const auto p = lumping ? static_cast<Eigen::Index>(lumping->representative.size()) : Eigen::Index(0);
    bool simple = lumping && grow < p;
    for (Eigen::Index i = 0; simple && i < n; ++i)
        if (i != grow && std::abs(ev(i) - lambda) <= 1e-9 * std::max(radius, 1e-300))
            simple = false;
    if (simple) {
        const Eigen::MatrixXd& r = lumping->reduced;
        const Eigen::VectorXcd w = lambda.imag() == 0.0
                                       ? Eigen::VectorXcd(inverseIteration(r, lambda.real()).cast<std::complex<double>>())
                                       : Eigen::VectorXcd(inverseIteration(r, lambda));
        if (w.size() == p) {
            v.resize(n);
            for (Eigen::Index i = 0; i < n; ++i)
                v(i) = w(lumping->classOf[static_cast<std::size_t>(i)]);
        }
    } else if (lambda.imag() == 0.0) {
        v = inverseIteration(m, lambda.real()).cast<std::complex<double>>();
    } else {
        v = inverseIteration(m, lambda);
    }
    if (v.size() != n) {
        // Z·S = 0, or (not expected) a solve that overflows: the full decomposition's vector.
        const Eigen::EigenSolver<Eigen::MatrixXd> full(m, true);
        if (full.info() != Eigen::Success)
            return st;
        Eigen::Index column = 0; // the decomposition's own order: its eigenvalue nearest λ
        for (Eigen::Index i = 1; i < n; ++i)
            if (std::abs(full.eigenvalues()(i) - lambda) < std::abs(full.eigenvalues()(column) - lambda))
                column = i;
        v = full.eigenvectors().col(column);
    }
    int big = 0;
    for (int i = 1; i < n; ++i)
        if (std::abs(v(i)) > std::abs(v(big)))
            big = i;
    if (std::abs(v(big)) > 0.0)
        v /= v(big);
    st.valid = true;
    st.loopGain = radius;
    st.dominantEigenvalue = lambda.real();
    st.modeShape.resize(static_cast<std::size_t>(n));
    bool mixed = false;
    for (int i = 0; i < n; ++i) {
        st.modeShape[static_cast<std::size_t>(i)] = v(i).real();
        if (v(i).real() < -1e-3)
            mixed = true;
    }
    st.mode = mixed ? BankMode::Differential : BankMode::Common;
    return st;
}

// The Newton step (I − Z·S)·ΔT = rhs in O(N) when Z = z_self·I + z_common·11ᵀ (no neighbour
// coupling) and S, times the power scale, is the factored diag(d) + L·R of detail::ElectricalPoint:
// then I − Z·S = Δ − U·W with Δ diagonal, U (N×3) and W (3×N), where with c = 1ᵀL
//   Δ_k = 1 − s·z_self·d_k,  U_k = s·(z_self·L_k0, z_self·L_k1, z_common),
//   W_·j = (R_0j, R_1j, d_j + c_0·R_0j + c_1·R_1j),
// solved by the Sherman–Morrison–Woodbury identity with its determinant from the matrix
// determinant lemma (Golub & Van Loan, Matrix Computations, 4th ed., §2.1.4; from memory).
// False where that is not safe (a Δ_k near zero, a residual above rounding): the caller factors
// the dense matrix instead.
bool structuredNewtonStep(const ThermalMatrices& th, const detail::ElectricalPoint& pt, double s,
                          const Eigen::VectorXd& rhs, Eigen::VectorXd& dt, double& det) {
    const int n = th.count;
    const auto nn = static_cast<std::size_t>(n);
    if (!th.uniform || !pt.sFactored || pt.sDiag.size() != nn || pt.sLeft.size() != 2 * nn ||
        pt.sRight.size() != 2 * nn)
        return false;
    const double a = th.zSelf, b = th.zCommon;
    double c0 = 0.0, c1 = 0.0;
    for (std::size_t k = 0; k < nn; ++k) {
        c0 += pt.sLeft[2 * k];
        c1 += pt.sLeft[2 * k + 1];
    }
    auto uOf = [&](std::size_t k) {
        return Eigen::Vector3d(s * a * pt.sLeft[2 * k], s * a * pt.sLeft[2 * k + 1], s * b);
    };
    auto wOf = [&](std::size_t k) {
        const double r0 = pt.sRight[k], r1 = pt.sRight[nn + k];
        return Eigen::Vector3d(r0, r1, pt.sDiag[k] + c0 * r0 + c1 * r1);
    };
    Eigen::VectorXd delta(n), y(n);
    Eigen::Matrix<double, Eigen::Dynamic, 3> yU(n, 3);
    Eigen::Matrix3d cap = Eigen::Matrix3d::Identity();
    Eigen::Vector3d wy = Eigen::Vector3d::Zero();
    det = 1.0;
    for (std::size_t k = 0; k < nn; ++k) {
        const auto i = static_cast<Eigen::Index>(k);
        delta(i) = 1.0 - s * a * pt.sDiag[k];
        if (!(std::abs(delta(i)) >= 1e-3))
            return false;
        det *= delta(i);
        const Eigen::Vector3d u = uOf(k) / delta(i);
        const Eigen::Vector3d w = wOf(k);
        yU.row(i) = u.transpose();
        y(i) = rhs(i) / delta(i);
        cap -= w * u.transpose();
        wy += w * y(i);
    }
    const Eigen::FullPivLU<Eigen::Matrix3d> lu(cap);
    if (!lu.isInvertible())
        return false;
    det *= lu.determinant();
    dt = y + yU * lu.solve(wy);
    if (!dt.allFinite() || !std::isfinite(det))
        return false;
    // The residual Δ·ΔT − U·(W·ΔT) − rhs against the size of its terms.
    Eigen::Vector3d wdt = Eigen::Vector3d::Zero();
    for (std::size_t k = 0; k < nn; ++k)
        wdt += wOf(k) * dt(static_cast<Eigen::Index>(k));
    double worst = 0.0, size = 0.0;
    for (std::size_t k = 0; k < nn; ++k) {
        const auto i = static_cast<Eigen::Index>(k);
        const Eigen::Vector3d u = uOf(k);
        worst = std::max(worst, std::abs(delta(i) * dt(i) - u.dot(wdt) - rhs(i)));
        size = std::max(size, std::abs(delta(i) * dt(i)) + u.cwiseAbs().dot(wdt.cwiseAbs()) + std::abs(rhs(i)));
    }
    return worst <= 1e-10 * size;
}

// The same step with the dense matrix I − Z·S (in `a`, N×N) and its LU: with neighbour coupling,
// or where the structured solve is not safe.
void denseNewtonStep(const ThermalMatrices& th, const detail::ElectricalPoint& pt, double scale,
                     const Eigen::VectorXd& rhs, Eigen::MatrixXd& a, Eigen::VectorXd& dt, double& det) {
    const int n = th.count;
    const auto nn = static_cast<std::size_t>(n);
    if (pt.sFactored) {
        // S = diag(d) + L·R (L: N×2, R: 2×N; see detail::ElectricalPoint), so
        // Z·S = Z·diag(d) + (Z·L)·R: O(N²) instead of the O(N³) product.
        for (int k = 0; k < n; ++k) {
            double zl0 = 0.0, zl1 = 0.0;
            for (int l = 0; l < n; ++l) {
                const double z = th.at(k, l);
                zl0 += z * pt.sLeft[static_cast<std::size_t>(2 * l)];
                zl1 += z * pt.sLeft[static_cast<std::size_t>(2 * l + 1)];
            }
            zl0 *= scale;
            zl1 *= scale;
            for (int j = 0; j < n; ++j) {
                const auto jj = static_cast<std::size_t>(j);
                const double zs =
                    scale * th.at(k, j) * pt.sDiag[jj] + zl0 * pt.sRight[jj] + zl1 * pt.sRight[nn + jj];
                a(k, j) = (k == j ? 1.0 : 0.0) - zs;
            }
        }
    } else {
        // (Row by row, each sum Σ_l Z_kl·scale·S_lj accumulated in the order of l.)
        std::vector<double> zs(nn);
        for (int k = 0; k < n; ++k) {
            std::fill(zs.begin(), zs.end(), 0.0);
            for (int l = 0; l < n; ++l) {
                const double zl = th.at(k, l) * scale;
                const double* sRow = &pt.sOn[static_cast<std::size_t>(l * n)];
                for (std::size_t j = 0; j < nn; ++j)
                    zs[j] += zl * sRow[j];
            }
            for (int j = 0; j < n; ++j)
                a(k, j) = (k == j ? 1.0 : 0.0) - zs[static_cast<std::size_t>(j)];
        }
    }
    const Eigen::PartialPivLU<Eigen::MatrixXd> lu(a);
    dt = lu.solve(rhs);
    det = lu.determinant();
}

struct Context {
    const BankProblem& p;
    ThermalMatrices th;
    double ta_K = 0.0;
    double cap_K = 0.0;
};

// Heat beyond conduction in device k (switching, recovery, gate drive in the die).
double extraPower(const BankProblem& p, std::size_t k) {
    const double extra =
        p.extraPowerPerDevice_W.size() == p.devices.size() ? p.extraPowerPerDevice_W[k] : 0.0;
    return p.switchingPowerPerDevice_W + extra;
}

std::vector<double> averagePower(const Context& c, const detail::ElectricalPoint& pt) {
    std::vector<double> pw(pt.pDevice_W.size());
    const double scale = powerScale(c.p, pt);
    for (std::size_t k = 0; k < pw.size(); ++k)
        pw[k] = scale * pt.pDevice_W[k] + extraPower(c.p, k);
    return pw;
}

std::vector<double> thermalResidual(const Context& c, const std::vector<double>& t,
                                    const std::vector<double>& pw) {
    const int n = c.th.count;
    std::vector<double> g(static_cast<std::size_t>(n));
    for (int k = 0; k < n; ++k) {
        double rise = c.th.zSink[static_cast<std::size_t>(k)] * c.p.sinkExtraPower_W;
        for (int j = 0; j < n; ++j)
            rise += c.th.at(k, j) * pw[static_cast<std::size_t>(j)];
        g[static_cast<std::size_t>(k)] = t[static_cast<std::size_t>(k)] - c.ta_K - rise;
    }
    return g;
}

void fillDevices(const Context& c, const detail::ElectricalPoint& pt, const std::vector<double>& t,
                 BankSolution& sol) {
    const BankProblem& p = c.p;
    const std::size_t n = t.size();
    sol.devices.assign(n, BankDeviceState{});
    double total = 0.0;
    for (std::size_t k = 0; k < n && k < pt.current_A.size(); ++k)
        total += pt.current_A[k];
    const std::vector<double> pw =
        pt.pDevice_W.size() == n ? averagePower(c, pt) : std::vector<double>(n, 0.0);
    const double scale = powerScale(p, pt);
    sol.powerScale = scale;
    sol.incrementalResistance_ohm = pt.dVcdLoad;
    double sumP = 0.0;
    sol.deviceLoss_W = 0.0;
    sol.ballastLoss_W = 0.0;
    for (std::size_t k = 0; k < n; ++k) {
        BankDeviceState& d = sol.devices[k];
        d.tj_C = toCelsius(t[k]);
        d.switching_W = extraPower(p, k);
        if (k < pt.current_A.size()) {
            d.current_A = pt.current_A[k];
            d.share = std::abs(total) > 0.0 ? d.current_A / total : 1.0 / static_cast<double>(n);
            d.ratingShare = d.current_A / p.part.currentRating_A;
            d.deratedShare = d.current_A / (p.derating * p.part.currentRating_A);
            d.voltage_V = pt.voltage_V[k];
            d.controlVoltage_V = pt.control_V[k];
            d.driveCurrent_A = pt.drive_A[k];
            d.onStatePower_W = pt.pDevice_W[k];
            d.conduction_W = scale * pt.pDevice_W[k];
            d.ballast_W = scale * pt.pBallast_W[k];
            d.leg_W = scale * pt.pLeg_W[k];
            d.drive_W = p.duty * pt.pDrive_W[k];
            d.region = k < pt.region.size() ? pt.region[k] : std::string();
        }
        d.loss_W = d.conduction_W + d.switching_W;
        d.tcase_C = d.tj_C - p.part.rthJc_KperW * pw[k];
        sumP += pw[k];
        sol.deviceLoss_W += d.loss_W;
        sol.ballastLoss_W += d.ballast_W;
    }
    sol.heatsink_C = toCelsius(c.ta_K) + p.rthSa_KperW * (sumP + p.sinkExtraPower_W);
    if (p.isothermal)
        for (auto& d : sol.devices)
            d.tcase_C = d.tj_C;
    double imax = 0.0, imin = 0.0, tmax = -1e300;
    for (std::size_t k = 0; k < n; ++k) {
        const double i = sol.devices[k].current_A;
        if (k == 0 || i > imax)
            imax = i;
        if (k == 0 || i < imin)
            imin = i;
        if (sol.devices[k].tj_C > tmax) {
            tmax = sol.devices[k].tj_C;
            sol.hottest = static_cast<int>(k);
        }
        sol.maxShare = std::max(sol.maxShare, sol.devices[k].share);
    }
    if (imax <= 0.0)
        sol.maxMinCurrentRatio = 1.0;
    else if (imin <= 1e-6 * imax)
        sol.maxMinCurrentRatio = 1e6;
    else
        sol.maxMinCurrentRatio = imax / imin;
    sol.load_A = total;
    sol.commonNode_V = pt.vC;
    sol.driveNode_V = pt.vG;
}

void fillVerdict(const BankProblem& p, BankSolution& sol) {
    std::string s;
    const std::string device = std::to_string(sol.hottest + 1);
    if (sol.failure == BankFailure::InvalidInput) {
        s = "Not solved: " + sol.reason;
    } else if (sol.failure == BankFailure::ThermalRunaway) {
        s = "Thermal runaway: no steady state below " + num(p.part.tjMax_C + 125.0, 4) + " °C; device " +
            device + " heats first.";
    } else if (!sol.converged) {
        s = "Not solved: " + sol.reason;
    } else if (sol.stability.valid && sol.stability.dominantEigenvalue >= 1.0) {
        s = "Unstable: loop gain " + num(sol.stability.dominantEigenvalue, 3) + " ≥ 1 (" +
            (sol.stability.mode == BankMode::Differential ? "one device takes over from the others"
                                                          : "the whole bank heats up together") +
            "); device " + device + " goes first.";
    } else if (sol.overTemperature) {
        s = "Over temperature: device " + device + " reaches " +
            num(sol.devices[static_cast<std::size_t>(sol.hottest)].tj_C, 4) + " °C, above T_j,max " +
            num(p.part.tjMax_C, 4) + " °C.";
    } else {
        s = "Stable: loop gain " + num(sol.stability.dominantEigenvalue, 3);
        if (sol.stability.loopGain > std::max(sol.stability.dominantEigenvalue, 0.0) * 1.001)
            s += " (spectral radius " + num(sol.stability.loopGain, 3) + " from negative feedback)";
        s += ", max/min current " + num(sol.maxMinCurrentRatio, 4) + ".";
    }
    sol.verdict = std::move(s);
}

// The drive cannot hold the bank on when the solution needs more than the bus across it. Judged
// at the final state only: a cold bipolar bank may be short of gain where a warm one is not.
bool overBus(const BankProblem& p, const detail::ElectricalPoint& pt, BankSolution& sol) {
    if (p.feed != BankFeed::Current || p.busVoltage_V <= 0.0 || pt.vC <= p.busVoltage_V)
        return false;
    sol.converged = false;
    sol.fixedPoint = false;
    sol.stable = false;
    sol.failure = BankFailure::CannotCarryLoad;
    sol.reason = "the bank cannot carry " + num(p.load_A) + " A with this drive: it would need " +
                 num(pt.vC) + " V across it, more than the bus voltage " + num(p.busVoltage_V) + " V";
    return true;
}

void finishStability(const BankProblem& p, BankSolution& sol) {
    sol.overTemperature = false;
    for (const auto& d : sol.devices)
        if (d.tj_C >= p.part.tjMax_C)
            sol.overTemperature = true;
    sol.stable = sol.fixedPoint && !sol.overTemperature && sol.stability.valid &&
                 sol.stability.dominantEigenvalue < 1.0;
}

void verdictIfAsked(const BankProblem& p, BankSolution& sol) {
    if (p.stabilityAnalysis)
        fillVerdict(p, sol);
}

// Stability, `stable` and verdict of a converged solution (or only its sensitivity when the
// caller skips the analysis).
void judge(const Context& c, const detail::ElectricalPoint& pt, BankSolution& sol) {
    const BankProblem& p = c.p;
    std::vector<double> s = scaledSensitivity(p, pt);
    if (p.stabilityAnalysis) {
        sol.stability = stabilityOf(c.th, s, p.feed);
    } else {
        sol.stability = BankStability{};
        sol.stability.held = heldText(p.feed);
        sol.stability.sensitivity_WperK = std::move(s);
    }
    finishStability(p, sol);
    verdictIfAsked(p, sol);
}

ThermalMatrices thermalMatricesOf(const BankProblem& p) {
    return buildThermalMatrices({static_cast<int>(p.devices.size()), p.part.rthJc_KperW, p.rthCs_KperW,
                                 p.rthSa_KperW, p.neighbourCoupling_KperW});
}

// The solution carries a sensitivity for this problem's bank but no stability yet.
bool stabilityPending(const BankProblem& p, const BankSolution& sol) {
    const std::size_t n = p.devices.size();
    return sol.converged && sol.fixedPoint && !sol.stability.valid && n > 0 && sol.devices.size() == n &&
           sol.stability.sensitivity_WperK.size() == n * n;
}

} // namespace

void completeStability(const BankProblem& p, BankSolution& sol) {
    if (!stabilityPending(p, sol))
        return;
    sol.stability = stabilityOf(thermalMatricesOf(p), sol.stability.sensitivity_WperK, p.feed);
    finishStability(p, sol);
    fillVerdict(p, sol);
}

double spectralRadius(const BankProblem& p, const BankSolution& sol) {
    return spectralRadiusAbove(p, sol, -1.0);
}

double spectralRadiusAbove(const BankProblem& p, const BankSolution& sol, double limit) {
    if (sol.stability.valid)
        return sol.stability.loopGain > limit ? sol.stability.loopGain : 0.0;
    if (!stabilityPending(p, sol))
        return 0.0;
    const Eigen::MatrixXd m = loopMatrix(thermalMatricesOf(p), sol.stability.sensitivity_WperK);
    // Every induced norm bounds the spectral radius (Horn & Johnson, Matrix Analysis, Thm 5.6.9):
    // when the smaller of ‖M‖_1 and ‖M‖_∞ is clearly below the limit, so is the radius (the 0.1 %
    // margin covers the rounding of M), and the eigenvalues are not needed.
    if (limit > 0.0 && m.allFinite()) {
        const double norm1 = m.cwiseAbs().colwise().sum().maxCoeff();
        const double normInf = m.cwiseAbs().rowwise().sum().maxCoeff();
        const double norm = std::min(norm1, normInf);
        if (norm < 0.999 * limit)
            return 0.0;
    }
    const Eigen::VectorXcd ev = spectrumOf(m, lumpingOf(m));
    double radius = 0.0;
    for (Eigen::Index i = 0; i < ev.size(); ++i)
        radius = std::max(radius, std::abs(ev(i)));
    return radius > limit ? radius : 0.0;
}

std::vector<Problem> validateBankProblem(const BankProblem& p) {
    std::vector<Problem> out;
    Checker c(out);
    const int n = static_cast<int>(p.devices.size());
    if (n < 1 || n > 256)
        c.fail("bank.count", "is " + std::to_string(n) + "; a bank has 1 to 256 devices");
    const SwitchPart& s = p.part;
    if (s.kind != "mosfet" && s.kind != "bipolar" && s.kind != "darlington")
        c.fail("bank.device.kind",
               "is \"" + s.kind + "\"; it must be \"mosfet\", \"bipolar\" or \"darlington\"");
    c.above(s.currentRating_A, 0.0, 1e6, "bank.device.currentRating_A", " A");
    c.range(s.tjMax_C, 25.0, 400.0, "bank.device.tjMax_C", " °C");
    c.range(s.rthJc_KperW, 0.0, 1e3, "bank.device.rthJc_KperW", " K/W");
    c.range(s.voltageRating_V, 0.0, 1e5, "bank.device.voltageRating_V", " V");
    if (s.kind == "mosfet") {
        const MosfetParams& m = s.mosfet;
        c.above(m.rdsOn25_ohm, 0.0, 1e3, "bank.device.mosfet.rdsOn25_ohm", " Ω");
        c.range(m.rdsOnTempExponent, -1.0, 5.0, "bank.device.mosfet.rdsOnTempExponent");
        c.above(m.rdsOnSpecGate_V, 0.0, 100.0, "bank.device.mosfet.rdsOnSpecGate_V", " V");
        c.range(m.vth_V, -5.0, 30.0, "bank.device.mosfet.vth_V", " V");
        c.range(m.vthTempCoeff_VperK, -0.05, 0.02, "bank.device.mosfet.vthTempCoeff_VperK", " V/K");
        c.above(m.transconductance_AperV2, 0.0, 1e6, "bank.device.mosfet.transconductance_AperV2", " A/V²");
        for (std::size_t i = 0; i < m.rdsOnTable.size(); ++i) {
            auto path = [i](const char* field) {
                return [i, field] {
                    return "bank.device.mosfet.rdsOnTable[" + std::to_string(i) + "]" + field;
                };
            };
            c.range(m.rdsOnTable[i].tj_C, -100.0, 500.0, path(".tj_C"), " °C");
            c.above(m.rdsOnTable[i].factor, 0.0, 100.0, path(".factor"));
        }
    } else if (s.kind == "bipolar" || s.kind == "darlington") {
        checkBjt(c, s.bjt, "bank.device.bjt");
        if (s.kind == "darlington")
            checkBjt(c, s.driver, "bank.device.driver");
    }
    c.range(p.gateResistor_ohm, 0.0, 1e6, "bank.gateResistor_ohm", " Ω");
    c.range(p.ballast_ohm, 0.0, 1e6, "bank.ballast_ohm", " Ω");
    c.range(p.legResistance_ohm, 0.0, 1e3, "bank.legResistance_ohm", " Ω");
    c.range(p.pulldown_ohm, 0.0, 1e9, "drive.pulldown_ohm", " Ω");
    c.range(p.earlyVoltage_V, 0.0, 1e5, "earlyVoltage_V", " V");
    c.range(p.driveVoltage_V, -100.0, 1e3, "drive.supply_V", " V");
    c.range(p.driveResistance_ohm, 0.0, 1e9, "drive.driverResistance_ohm", " Ω");
    for (int k = 0; k < n && k <= 256; ++k) {
        const BankDevice& d = p.devices[static_cast<std::size_t>(k)];
        auto path = [k](const char* field) {
            return [k, field] { return "bank.devices[" + std::to_string(k) + "]" + field; };
        };
        c.above(d.rdsOnDeviation, -0.95, 100.0, path(".rdsOnDeviation"));
        c.range(d.vthDeviation_V, -20.0, 20.0, path(".vthDeviation_V"), " V");
        c.range(d.vbeDeviation_V, -1.0, 1.0, path(".vbeDeviation_V"), " V");
        c.above(d.betaDeviation, -0.95, 100.0, path(".betaDeviation"));
        c.range(d.gateResistorDeviation_ohm, -1e6, 1e6, path(".gateResistorDeviation_ohm"), " Ω");
        c.range(d.ballastDeviation_ohm, -1e6, 1e6, path(".ballastDeviation_ohm"), " Ω");
        c.range(d.legResistanceDeviation_ohm, -1e3, 1e3, path(".legResistanceDeviation_ohm"), " Ω");
    }
    c.range(p.load_A, 0.0, 1e6, "load_A", " A");
    if (p.feed != BankFeed::Current)
        c.range(p.commonNode_V, 0.0, 1e5, "commonNode_V", " V");
    c.range(p.busVoltage_V, 0.0, 1e5, "supply.max_V", " V");
    c.range(p.duty, 0.0, 1.0, "duty");
    c.range(p.ripplePeakToPeak_A, 0.0, 1e6, "ripplePeakToPeak_A", " A");
    c.range(p.rmsFactor, 0.0, 1e3, "rmsFactor");
    c.range(p.switchingPowerPerDevice_W, 0.0, 1e6, "switchingPowerPerDevice_W", " W");
    for (std::size_t k = 0; k < p.extraPowerPerDevice_W.size(); ++k)
        c.range(p.extraPowerPerDevice_W[k], 0.0, 1e6, "extraPowerPerDevice_W", " W");
    c.range(p.sinkExtraPower_W, 0.0, 1e6, "sinkExtraPower_W", " W");
    c.range(p.ambient_C, -60.0, 200.0, "heatsink.ambient_C", " °C");
    c.range(p.rthCs_KperW, 0.0, 1e3, "bank.interface", " K/W");
    c.range(p.rthSa_KperW, 0.0, 1e3, "heatsink.part.rthSa_KperW", " K/W");
    c.range(p.neighbourCoupling_KperW, 0.0, 1e6, "bank.neighbourCoupling_KperW", " K/W");
    c.range(p.isothermalTj_C, -60.0, 400.0, "isothermalTj_C", " °C");
    for (std::size_t k = 0; k < p.isothermalTjPerDevice_C.size(); ++k)
        c.range(p.isothermalTjPerDevice_C[k], -60.0, 1000.0, "isothermalTjPerDevice_C", " °C");
    c.above(p.derating, 0.0, 2.0, "bank.derating");
    c.range(p.sharingTarget, 1.0, 1e3, "bank.sharingTarget");
    if (p.maxNewtonIterations < 1 || p.maxNewtonIterations > 10000)
        c.fail("maxNewtonIterations", "must be 1 to 10000");
    if (p.maxThermalIterations < 1 || p.maxThermalIterations > 10000)
        c.fail("maxThermalIterations", "must be 1 to 10000");
    return out;
}

BankSolution solveBank(const BankProblem& p, const BankSolution* warmStart) {
    BankSolution sol;
    const std::vector<Problem> problems = validateBankProblem(p);
    if (!problems.empty()) {
        sol.failure = BankFailure::InvalidInput;
        std::string msg;
        for (const Problem& pr : problems)
            msg += (msg.empty() ? "" : "; ") + pr.path + " " + pr.message;
        sol.reason = msg;
        verdictIfAsked(p, sol);
        return sol;
    }
    const int n = static_cast<int>(p.devices.size());
    const auto nn = static_cast<std::size_t>(n);
    detail::BankNetwork net(p);
    sol.notes = net.notes();
    Context c{p,
              buildThermalMatrices(
                  {n, p.part.rthJc_KperW, p.rthCs_KperW, p.rthSa_KperW, p.neighbourCoupling_KperW}),
              toKelvin(p.ambient_C), toKelvin(p.part.tjMax_C) + 125.0};

    // Warm start: [network unknowns..., junction temperatures (K)...].
    std::vector<double> x;
    std::vector<double> t;
    if (warmStart && warmStart->state.size() > nn) {
        x.assign(warmStart->state.begin(), warmStart->state.end() - static_cast<long>(nn));
        t.assign(warmStart->state.end() - static_cast<long>(nn), warmStart->state.end());
    }
    // (The point is the caller's: fillRegions only adds its regions, which nothing reads before.)
    auto finish = [&](detail::ElectricalPoint& pt, const std::vector<double>& temps) {
        net.fillRegions(pt, temps);
        fillDevices(c, pt, temps, sol);
        sol.state = pt.x;
        sol.state.insert(sol.state.end(), temps.begin(), temps.end());
    };

    if (p.isothermal) {
        t.assign(nn, toKelvin(p.isothermalTj_C));
        if (p.isothermalTjPerDevice_C.size() == nn)
            for (std::size_t k = 0; k < nn; ++k)
                t[k] = toKelvin(p.isothermalTjPerDevice_C[k]);
        detail::ElectricalPoint pt = net.solve(t, x.empty() ? nullptr : &x, true);
        sol.newtonIterations = pt.iterations;
        if (!pt.ok) {
            sol.failure = pt.failure;
            sol.reason = pt.reason;
            fillDevices(c, pt, t, sol);
            verdictIfAsked(p, sol);
            return sol;
        }
        sol.converged = true;
        sol.fixedPoint = true;
        finish(pt, t);
        if (overBus(p, pt, sol)) {
            verdictIfAsked(p, sol);
            return sol;
        }
        judge(c, pt, sol);
        return sol;
    }

    // Start at ambient unless a warm start gives temperatures. When the heat rises with
    // temperature G(T) is concave and Newton from below approaches the stable fixed point from
    // below without overshoot.
    detail::ElectricalPoint pt;
    if (t.size() != nn || !std::all_of(t.begin(), t.end(), [](double v) { return std::isfinite(v); }))
        t.assign(nn, c.ta_K);

    const double tol_K = 1e-6;
    const double stepMax_K = 100.0;
    int atCap = 0;
    double lastCorrection = 0.0;
    Eigen::MatrixXd a(n, n);
    Eigen::VectorXd gv(n);
    std::vector<double> g;
    auto solveAt = [&](const std::vector<double>& temps, detail::ElectricalPoint& out,
                       std::vector<double>& gOut) {
        out = net.solve(temps, x.empty() ? nullptr : &x, true);
        sol.newtonIterations += out.iterations;
        if (!out.ok)
            return false;
        gOut = thermalResidual(c, temps, averagePower(c, out));
        return true;
    };
    auto electricalFailure = [&](const detail::ElectricalPoint& bad, const std::vector<double>& temps) {
        sol.failure = bad.failure;
        sol.reason = bad.reason + " (at junction temperatures up to " +
                     num(toCelsius(*std::max_element(temps.begin(), temps.end())), 4) + " °C)";
    };
    if (!solveAt(t, pt, g)) {
        electricalFailure(pt, t);
        fillDevices(c, pt, t, sol);
        verdictIfAsked(p, sol);
        return sol;
    }
    x = pt.x;
    for (int it = 0; it < p.maxThermalIterations; ++it) {
        sol.thermalIterations = it + 1;
        double gmax = 0.0;
        bool heatingEverywhere = true;
        for (std::size_t k = 0; k < nn; ++k) {
            gmax = std::max(gmax, std::abs(g[k]));
            if (g[k] > 0.0)
                heatingEverywhere = false;
        }
        if (gmax < tol_K) {
            sol.converged = true;
            sol.fixedPoint = true;
            // Close the last step: report T = T_amb + Z·P(T), so the temperatures and the reported
            // powers satisfy the thermal network exactly (they moved < tol_K).
            for (std::size_t k = 0; k < nn; ++k)
                t[k] -= g[k];
            finish(pt, t);
            if (overBus(p, pt, sol)) {
                verdictIfAsked(p, sol);
                return sol;
            }
            judge(c, pt, sol);
            return sol;
        }
        // A junction held at the cap whose heat still exceeds what the sink removes there.
        bool capped = false;
        for (std::size_t k = 0; k < nn; ++k)
            if (t[k] >= c.cap_K - 1e-9 && g[k] < 0.0)
                capped = true;
        atCap = capped ? atCap + 1 : 0;
        if (atCap >= 3) {
            sol.failure = BankFailure::ThermalRunaway;
            sol.reason = "no electrothermal fixed point below " + num(toCelsius(c.cap_K), 4) +
                         " °C: the devices' heat grows faster with temperature than the heatsink removes it";
            finish(pt, t);
            verdictIfAsked(p, sol);
            return sol;
        }
        // Newton step on G(T) = T − T_amb − Z·P(T): (I − Z·S)·ΔT = −G. (The ripple scale's own
        // temperature dependence, of order (r − 1)·d(R_b·I/V_C)/dT, is left out of S.)
        const double scale = powerScale(p, pt);
        for (int k = 0; k < n; ++k)
            gv(k) = -g[static_cast<std::size_t>(k)];
        Eigen::VectorXd dt;
        double det = 0.0;
        if (!structuredNewtonStep(c.th, pt, scale, gv, dt, det))
            denseNewtonStep(c.th, pt, scale, gv, a, dt, det);
        // Past a fold (det ≤ 0) with every junction still heating, Newton would point back down
        // the curve; follow the heating instead (a fixed-point step, taken whole).
        const bool heatingStep = !dt.allFinite() || (det <= 0.0 && heatingEverywhere);
        if (heatingStep)
            dt = gv;
        const double big = dt.cwiseAbs().maxCoeff();
        if (big > stepMax_K)
            dt *= stepMax_K / big;
        lastCorrection = dt.cwiseAbs().maxCoeff();
        // Backtracking: halve the step while the largest temperature residual does not fall (the
        // network can switch region steeply, e.g. a bipolar bank leaving saturation).
        double alpha = 1.0;
        std::vector<double> tTrial(nn), gTrial;
        detail::ElectricalPoint trial;
        const std::vector<double> xHere = pt.x;
        for (int bt = 0;; ++bt) {
            for (std::size_t k = 0; k < nn; ++k)
                tTrial[k] = std::clamp(t[k] + alpha * dt(static_cast<long>(k)), c.ta_K - 50.0, c.cap_K);
            // Start the network from its first-order prediction x + dX/dT·ΔT.
            x = xHere;
            if (pt.sFactored && xHere.size() > 2 && pt.xDiag.size() == xHere.size() - 2 &&
                pt.xLeft.size() == 2 * pt.xDiag.size() && pt.sRight.size() == 2 * nn) {
                // The factored form (see detail::ElectricalPoint): O(n).
                double dg0 = 0.0, dg1 = 0.0;
                for (std::size_t k = 0; k < nn; ++k) {
                    dg0 += pt.sRight[k] * (tTrial[k] - t[k]);
                    dg1 += pt.sRight[nn + k] * (tTrial[k] - t[k]);
                }
                x[0] += dg0;
                x[1] += dg1;
                const std::size_t perLeg = pt.xDiag.size() / nn;
                for (std::size_t u = 0; u < pt.xDiag.size(); ++u)
                    x[2 + u] += pt.xDiag[u] * (tTrial[u / perLeg] - t[u / perLeg]) + pt.xLeft[2 * u] * dg0 +
                                pt.xLeft[2 * u + 1] * dg1;
            } else if (pt.dxdT.size() == xHere.size() * nn) {
                for (std::size_t i = 0; i < x.size(); ++i)
                    for (std::size_t k = 0; k < nn; ++k)
                        x[i] += pt.dxdT[i * nn + k] * (tTrial[k] - t[k]);
            }
            const bool ok = solveAt(tTrial, trial, gTrial);
            if (ok) {
                double trialMax = 0.0;
                for (double v : gTrial)
                    trialMax = std::max(trialMax, std::abs(v));
                if (heatingStep || trialMax < gmax || bt >= 6)
                    break;
            } else if (bt >= 6) {
                electricalFailure(trial, tTrial);
                finish(pt, t);
                sol.converged = false;
                verdictIfAsked(p, sol);
                return sol;
            }
            alpha *= 0.5;
        }
        t = tTrial;
        pt = std::move(trial);
        g = std::move(gTrial);
        x = pt.x;
    }
    // Out of iterations.
    const double tmax = *std::max_element(t.begin(), t.end());
    if (tmax >= c.cap_K - 1.0) {
        sol.failure = BankFailure::ThermalRunaway;
        sol.reason = "no electrothermal fixed point below " + num(toCelsius(c.cap_K), 4) + " °C";
    } else {
        sol.failure = BankFailure::NoConvergence;
        sol.reason = "the electrothermal iteration did not settle in " +
                     std::to_string(p.maxThermalIterations) + " steps (last correction " +
                     num(lastCorrection, 3) + " K)";
    }
    finish(pt, t);
    verdictIfAsked(p, sol);
    return sol;
}

BankStability analyseStability(const BankProblem& p, const BankSolution& at) {
    if (!validateBankProblem(p).empty() || at.devices.size() != p.devices.size())
        return {};
    detail::BankNetwork net(p);
    const std::size_t nn = p.devices.size();
    std::vector<double> t(nn), x;
    for (std::size_t k = 0; k < nn; ++k)
        t[k] = toKelvin(at.devices[k].tj_C);
    if (at.state.size() > nn)
        x.assign(at.state.begin(), at.state.end() - static_cast<long>(nn));
    const detail::ElectricalPoint pt = net.solve(t, x.empty() ? nullptr : &x, true);
    if (!pt.ok)
        return {};
    const ThermalMatrices th = buildThermalMatrices(
        {static_cast<int>(nn), p.part.rthJc_KperW, p.rthCs_KperW, p.rthSa_KperW, p.neighbourCoupling_KperW});
    std::vector<double> s = scaledSensitivity(p, pt);
    return stabilityOf(th, s, p.feed);
}

} // namespace amp

// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Forward-mode automatic differentiation for the bank's device models: a value with its partial
// derivatives with respect to M seeded inputs. The device equations are written once as
// templates over the scalar type; evaluated with double they give values, with Dual<M> they also
// give the exact Jacobian the Newton solver and the loop-gain analysis need (no finite
// differences, so the derivative of the power with respect to temperature is as accurate as the
// model itself). Internal to core/bank.

#include <array>
#include <cmath>

namespace amp::ad {

template <int M> struct Dual {
    double v = 0.0;
    std::array<double, M> d{};

    Dual() = default;
    Dual(double value) : v(value) {} // NOLINT: constants promote implicitly
    /// An input: value `value`, seeded as the `index`-th independent variable.
    static Dual variable(double value, int index) {
        Dual x(value);
        x.d[static_cast<std::size_t>(index)] = 1.0;
        return x;
    }
};

inline double val(double x) {
    return x;
}
template <int M> double val(const Dual<M>& x) {
    return x.v;
}

template <int M> Dual<M> operator-(const Dual<M>& a) {
    Dual<M> r;
    r.v = -a.v;
    for (int i = 0; i < M; ++i)
        r.d[i] = -a.d[i];
    return r;
}
template <int M> Dual<M> operator+(const Dual<M>& a, const Dual<M>& b) {
    Dual<M> r;
    r.v = a.v + b.v;
    for (int i = 0; i < M; ++i)
        r.d[i] = a.d[i] + b.d[i];
    return r;
}
template <int M> Dual<M> operator-(const Dual<M>& a, const Dual<M>& b) {
    Dual<M> r;
    r.v = a.v - b.v;
    for (int i = 0; i < M; ++i)
        r.d[i] = a.d[i] - b.d[i];
    return r;
}
template <int M> Dual<M> operator*(const Dual<M>& a, const Dual<M>& b) {
    Dual<M> r;
    r.v = a.v * b.v;
    for (int i = 0; i < M; ++i)
        r.d[i] = a.d[i] * b.v + a.v * b.d[i];
    return r;
}
template <int M> Dual<M> operator/(const Dual<M>& a, const Dual<M>& b) {
    Dual<M> r;
    r.v = a.v / b.v;
    const double inv = 1.0 / b.v;
    for (int i = 0; i < M; ++i)
        r.d[i] = (a.d[i] - r.v * b.d[i]) * inv;
    return r;
}
template <int M> Dual<M> operator+(const Dual<M>& a, double b) {
    Dual<M> r = a;
    r.v += b;
    return r;
}
template <int M> Dual<M> operator+(double a, const Dual<M>& b) {
    return b + a;
}
template <int M> Dual<M> operator-(const Dual<M>& a, double b) {
    Dual<M> r = a;
    r.v -= b;
    return r;
}
template <int M> Dual<M> operator-(double a, const Dual<M>& b) {
    Dual<M> r = -b;
    r.v += a;
    return r;
}
template <int M> Dual<M> operator*(const Dual<M>& a, double b) {
    Dual<M> r;
    r.v = a.v * b;
    for (int i = 0; i < M; ++i)
        r.d[i] = a.d[i] * b;
    return r;
}
template <int M> Dual<M> operator*(double a, const Dual<M>& b) {
    return b * a;
}
template <int M> Dual<M> operator/(const Dual<M>& a, double b) {
    return a * (1.0 / b);
}
template <int M> Dual<M> operator/(double a, const Dual<M>& b) {
    Dual<M> r;
    r.v = a / b.v;
    const double k = -r.v / b.v;
    for (int i = 0; i < M; ++i)
        r.d[i] = k * b.d[i];
    return r;
}

/// Apply a scalar function with value f and derivative df at a.v (chain rule).
template <int M> Dual<M> chain(const Dual<M>& a, double f, double df) {
    Dual<M> r;
    r.v = f;
    for (int i = 0; i < M; ++i)
        r.d[i] = df * a.d[i];
    return r;
}

template <int M> Dual<M> exp(const Dual<M>& a) {
    const double e = std::exp(a.v);
    return chain(a, e, e);
}
template <int M> Dual<M> log(const Dual<M>& a) {
    return chain(a, std::log(a.v), 1.0 / a.v);
}
template <int M> Dual<M> log1p(const Dual<M>& a) {
    return chain(a, std::log1p(a.v), 1.0 / (1.0 + a.v));
}
template <int M> Dual<M> sqrt(const Dual<M>& a) {
    const double s = std::sqrt(a.v);
    return chain(a, s, s > 0.0 ? 0.5 / s : 0.0);
}
template <int M> Dual<M> pow(const Dual<M>& a, double p) {
    const double f = std::pow(a.v, p);
    return chain(a, f, a.v != 0.0 ? p * f / a.v : 0.0);
}

} // namespace amp::ad

// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The thermal voltage V_T = k·T/q from the exact SI constants.
//
// Source: BIPM, "The International System of Units (SI)", 9th edition (2019), which fixes
// k = 1.380649e-23 J/K and e = 1.602176634e-19 C exactly. V_T(300 K) = 25.852 mV.
// Valid for any absolute temperature T > 0 K; the bank models use it from −60 °C to ≈ 450 °C.

namespace amp {

inline constexpr double kBoltzmann_JperK = 1.380649e-23;        ///< exact (SI 2019)
inline constexpr double kElementaryCharge_As = 1.602176634e-19; ///< exact (SI 2019)
inline constexpr double kZeroCelsius_K = 273.15;
inline constexpr double kPartReference_K = 298.15; ///< 25 °C, where part data are stated

/// V_T in volts at the absolute temperature t_K (kelvin).
template <class S> S thermalVoltage(const S& t_K) {
    return t_K * (kBoltzmann_JperK / kElementaryCharge_As);
}

inline double toKelvin(double t_C) {
    return t_C + kZeroCelsius_K;
}
inline double toCelsius(double t_K) {
    return t_K - kZeroCelsius_K;
}

} // namespace amp

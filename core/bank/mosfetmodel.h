// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Temperature-dependent DC model of one power MOSFET: a level-1 (square-law) channel in series
// with a drift resistance, joined so that the device's resistance at the specified gate voltage
// equals the part's R_ds(on)(T_j) exactly.
//
// Channel (Shichman–Hodges level-1 law, as in Sedra & Smith, "Microelectronic Circuits", and the
// SPICE level-1 MOSFET):
//   V_ov   = softplus(V_GS − V_th(T)) = s·ln(1 + exp((V_GS − V_th)/s)),  s = 3·V_T(T)
//            (a smooth threshold: for V_GS well above V_th it is V_GS − V_th; below it the current
//            falls exponentially with a subthreshold slope factor n = 1.5, so Newton never meets a
//            kink or a zero derivative)
//   triode      (0 ≤ V_DS < V_ov): I_D = K(T)·(2·V_ov·V_DS − V_DS²)
//   saturation  (V_DS ≥ V_ov):     I_D = K(T)·V_ov²          (C¹-continuous at V_DS = V_ov)
//   V_DS < 0: odd extension, I_D(−V) = −I_D(V) (the channel conducts both ways; body diode ignored)
//   V_th(T) = V_th(25 °C) + dV_th/dT·(T − 298.15 K)             (dV_th/dT ≈ −2…−7 mV/K)
//   K(T)    = K(25 °C)·(T/298.15 K)^−1.5                          (mobility ∝ T^−1.5)
// Drift (series, drain side, inside the die, heated with the junction):
//   R_drift(T) = R_ds(on)(T) − R_ch,spec(T),   R_ch,spec(T) = 1/(2·K(T)·V_ov(V_spec, T))
//   R_ds(on)(T) = R_25·((T)/298.15 K)^a  (drift-dominated silicon: a ≈ 2.3–2.5, Baliga,
//                 "Fundamentals of Power Semiconductor Devices"), or R_25·table(T_j) when the part
//                 has a normalised table (linear interpolation, linear extrapolation, ≥ 0.05).
// How the two join: a datasheet's R_ds(on) is the full-enhancement value, so the channel's
// overdrive saturates smoothly (C¹) a little above the specified gate voltage (real channels
// flatten there: mobility degradation at high gate fields):
//   V_ov,eff = V_ov − (V_ov − V_ov,spec)²/(4w) for V_ov,spec < V_ov < V_ov,spec + 2w, and
//   V_ov,spec + w above, with w = 0.25 V,
// and the drift takes the rest of R_ds(on)(T) at full enhancement:
//   R_drift(T) = R_ds(on)(T) − R_ch,full(T),  R_ch,full(T) = 1/(2·K(T)·(V_ov(V_spec, T) + w)).
// So from V_spec + 2w up the device is exactly R_ds(on)(T) at small V_DS; at V_spec itself the
// channel is w/V_ov,spec (a few %) higher. Below, the channel is the square law: at a low gate
// voltage it saturates and the device becomes a current source whose current rises with
// temperature below the zero-temperature-coefficient overdrive V_ov,ZTC ≈ (4/3)·|dV_th/dT|·T
// (from dI/dT = 0 of K(T)·V_ov²): a weakly driven bank hogs current.
// If the stated K makes the full channel alone exceed 90 % of R_ds(on) anywhere from −40 °C to the top
// of the solver's range, K is raised until it does not (the datasheet pair is inconsistent);
// `kRaise` records the factor and the bank solver reports it.
// Spread: a device's relative R_ds(on) deviation scales the whole die (R_drift·(1 + d),
// K/(1 + d)); its V_th deviation shifts V_th; the drift is computed with the nominal V_th, so a
// device with a higher V_th also has a higher R_ds(on) at the same gate voltage.
// Ranges: R_25 > 0 (typ. 0.5 mΩ–1 Ω); a 0…3; V_th 0.5…6 V; dV_th/dT −20…0 mV/K; K > 0 A/V²;
// T from 200 K to ≈ 700 K.

#include "core/model/parts.h"

#include <vector>

namespace amp {

struct MosfetModel {
    double rdsOn25_ohm = 4e-3;     ///< nominal R_ds(on) at 25 °C, specified gate voltage
    double tempExponent = 2.0;     ///< a
    std::vector<RdsOnPoint> table; ///< sorted by tj_C; replaces the exponent law when not empty
    double specGate_V = 10.0;
    double vth25_V = 3.0;    ///< nominal threshold at 25 °C
    double vthShift_V = 0.0; ///< this device's deviation
    double vthTempCoeff_VperK = -5e-3;
    double k25_AperV2 = 60.0; ///< nominal channel K at 25 °C (after kRaise)
    double scale = 1.0;       ///< 1 + relative R_ds(on) deviation
    double kRaise = 1.0;      ///< factor K was raised by for consistency (1 = as stated)
    double gmin_S = 1e-9;     ///< conductance across the channel (keeps the Jacobian regular)
    static constexpr double kEnhancementWidth_V = 0.25; ///< w of the full-enhancement knee

    /// Build from part data and one device's deviations. `tMax_K` is the top of the temperature
    /// range over which the K/R_ds(on) consistency is checked.
    static MosfetModel make(const MosfetParams& p, double rdsOnDeviation = 0.0, double vthDeviation_V = 0.0,
                            double tMax_K = 573.15);
    /// The same with the consistency factor already known (a bank computes it once per part).
    static MosfetModel make(const MosfetParams& p, double rdsOnDeviation, double vthDeviation_V,
                            double tMax_K, double knownRaise);
    /// The factor K must be raised by for consistency with R_ds(on) over −40 °C … tMax_K (1 = none).
    static double consistencyRaise(const MosfetParams& p, double tMax_K);

    /// R_ds(on)(T) of this device at full enhancement (drift + channel), the datasheet's value.
    template <class S> S onResistance(const S& t_K) const;
    /// V_th(T) of this device.
    template <class S> S threshold(const S& t_K) const;
    /// K(T) of this device's channel.
    template <class S> S channelK(const S& t_K) const;
    /// Smoothed overdrive V_ov for a given V_GS.
    template <class S> S overdrive(const S& vgs, const S& t_K) const;
    /// Drift resistance of this device.
    template <class S> S driftResistance(const S& t_K) const;
    /// Channel current for intrinsic V_GS and V_DS (across the channel, after the drift).
    template <class S> S channelCurrent(const S& vgs, const S& vds, const S& t_K) const;

    /// Nominal R_ds(on)(T) law of the part (no deviation), exponent or table.
    double nominalOnResistance(double t_K) const;

    /// Everything that depends on temperature alone, evaluated once per temperature.
    template <class S> struct AtTemperature {
        S k;       ///< K(T) of this device
        S vth;     ///< V_th(T) of this device
        S drift;   ///< R_drift(T) of this device
        S smooth;  ///< softplus width s = 3·V_T
        S vovSpec; ///< this device's overdrive at the specified gate voltage (the knee's start)
    };
    template <class S> AtTemperature<S> atTemperature(const S& t_K) const;
    /// Channel current with the temperature state already evaluated.
    template <class S> S channelCurrent(const AtTemperature<S>& at, const S& vgs, const S& vds) const;
};

} // namespace amp

// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Part parameter sets. A design keeps its own copy of every part it uses (so a project opens
// anywhere); `partId` records which library part it came from. All values SI, temperatures in °C.
// Parts shipped in parts/ are invented archetypes; users add their own from datasheets.

#include <string>
#include <vector>

namespace amp {

/// One stage of a Foster network: Z(t) = Σ r·(1 − exp(−t/τ)).
struct FosterStage {
    double r_KperW = 0.0;
    double tau_s = 0.0;
    bool operator==(const FosterStage&) const = default;
};

/// One safe-operating-area point: the device may carry current_A at voltage_V for pulse_s
/// (pulse_s == 0 means DC).
struct SoaPoint {
    double voltage_V = 0.0;
    double current_A = 0.0;
    double pulse_s = 0.0;
    bool operator==(const SoaPoint&) const = default;
};

/// A point of a normalised on-resistance table: R(tj)/R(25 °C).
struct RdsOnPoint {
    double tj_C = 25.0;
    double factor = 1.0;
    bool operator==(const RdsOnPoint&) const = default;
};

/// MOSFET parameters (ohmic region, square-law region, gate charge, body diode).
struct MosfetParams {
    double rdsOn25_ohm = 4.0e-3;        ///< R_ds(on) at T_j = 25 °C and the specified gate voltage
    double rdsOnTempExponent = 2.0;     ///< a in R(T) = R25·((T+273.15)/298.15)^a
    std::vector<RdsOnPoint> rdsOnTable; ///< optional; replaces the exponent law when not empty
    double rdsOnSpecGate_V = 10.0;      ///< gate voltage at which R_ds(on) is specified
    double vth_V = 3.0;                 ///< threshold voltage at 25 °C
    double vthTempCoeff_VperK = -5e-3;  ///< dV_th/dT
    double transconductance_AperV2 = 60.0; ///< K in I_D = K·(V_GS − V_th)² (saturation, 25 °C)
    double qg_As = 80e-9;                ///< total gate charge at the drive voltage
    double qgs_As = 25e-9;
    double qgs2_As = 10e-9;              ///< gate charge from V_th to the plateau
    double qgd_As = 25e-9;               ///< Miller charge
    double plateau_V = 5.0;             ///< Miller plateau voltage
    double rgInternal_ohm = 1.5;
    double coss_F = 1.0e-9;             ///< output capacitance at cossRef_V
    double cossRef_V = 25.0;
    std::string cossLaw = "sqrt";       ///< "constant" or "sqrt" (C ∝ V^−½)
    double bodyDiodeVf_V = 0.8;         ///< body diode forward drop at low current, 25 °C
    double bodyDiodeRd_ohm = 3e-3;
    double bodyDiodeQrr_As = 100e-9;
    double avalancheRepetitive_J = 0.0; ///< repetitive avalanche energy rating (0 = not rated)
    double breakdown_V = 0.0;           ///< avalanche breakdown (0 = 1.2 × the voltage rating)
    bool operator==(const MosfetParams&) const = default;
};

/// Bipolar transistor (Ebers–Moll transport model, Gummel–Poon temperature law).
struct BjtParams {
    double saturationCurrent25_A = 1e-11; ///< I_S at 25 °C
    double betaF = 40.0;                ///< forward current gain at low current
    double betaR = 2.0;                 ///< reverse current gain
    double highCurrentKnee_A = 20.0;    ///< I_KF: β_F rolls off above this collector current
    double emissionCoefficient = 1.0;   ///< N_F
    double baseResistance_ohm = 0.5;
    double emitterResistance_ohm = 0.01;
    double collectorResistance_ohm = 0.02;
    double xti = 3.0;                   ///< saturation-current temperature exponent
    double bandgap_eV = 1.11;           ///< E_g for the I_S temperature law
    double betaTempExponent = 1.5;      ///< XTB: β ∝ (T/T0)^XTB
    double storageTime_s = 1.0e-6;      ///< at the reference forced β
    double fallTime_s = 0.3e-6;
    double riseTime_s = 0.3e-6;
    double vceSat_V = 0.5;              ///< datasheet saturation voltage (informative)
    bool operator==(const BjtParams&) const = default;
};

/// A switching device: MOSFET, bipolar or Darlington, with its ratings and thermal data.
struct SwitchPart {
    std::string partId;                 ///< library id this copy came from ("" for a custom part)
    std::string name = "Custom switch";
    std::string kind = "mosfet";        ///< "mosfet", "bipolar" or "darlington"
    std::string package = "TO-220";
    bool tabLive = true;                ///< tab tied to drain/collector
    double voltageRating_V = 100.0;     ///< V_DS(max) or V_CEO
    double currentRating_A = 100.0;     ///< continuous rating, case at 25 °C
    double leadLimit_A = 75.0;          ///< package lead (wire/pin) current limit
    double tjMax_C = 175.0;
    double rthJc_KperW = 0.5;
    std::vector<FosterStage> zthJc;     ///< optional Foster fit of Z_th,jc
    std::vector<SoaPoint> soa;
    double shortCircuitTime_s = 0.0;    ///< short-circuit withstand time (0 = not rated)
    double cost = 0.0;                  ///< unit price in the user's currency (optional)
    MosfetParams mosfet;                ///< used when kind == "mosfet"
    BjtParams bjt;                      ///< output transistor for "bipolar" and "darlington"
    BjtParams driver;                   ///< driver transistor of a "darlington"
    bool operator==(const SwitchPart&) const = default;
};

/// A rectifier used as the freewheel diode.
struct DiodePart {
    std::string partId;
    std::string name = "Custom diode";
    std::string package = "TO-247";
    bool tabLive = true;                ///< tab tied to cathode
    double vf0_V = 0.55;                ///< V_f = vf0 + rd·I at 25 °C
    double rd_ohm = 4e-3;
    double vfTempCoeff_VperK = -1.5e-3; ///< dV_f0/dT
    double qrr_As = 100e-9;
    double currentRating_A = 60.0;      ///< average forward current rating
    double voltageRating_V = 200.0;
    double tjMax_C = 175.0;
    double rthJc_KperW = 0.6;
    std::vector<FosterStage> zthJc;
    double cost = 0.0;
    bool operator==(const DiodePart&) const = default;
};

/// Thermal interface between a device case and the heatsink.
struct InterfacePart {
    std::string partId;
    std::string name = "Thermal grease";
    std::string kind = "grease";        ///< "grease", "pad" or "washer"
    double conductivity_WperMK = 1.0;
    double thickness_m = 50e-6;
    double area_m2 = 1.6e-4;            ///< contact area per device
    double contactResistance_KperW = 0.05; ///< per device, added to t/(k·A)
    bool insulating = false;
    double dielectricStrength_Vperm = 0.0; ///< breakdown field (insulating parts)
    bool operator==(const InterfacePart&) const = default;
};

/// A contactor (reversing or main).
struct ContactorPart {
    std::string partId;
    std::string name = "Custom contactor";
    double continuousCurrent_A = 150.0; ///< thermal (continuous) current rating
    double ratedVoltage_V = 80.0;       ///< DC voltage rating of the contacts
    double dcBreaking_A = 0.0;          ///< DC breaking capacity at the rated voltage (0 = none stated)
    double coilVoltage_V = 24.0;
    double coilResistance_ohm = 60.0;
    double contactResistance_ohm = 0.3e-3;
    double pickupTime_s = 30e-3;
    double dropoutTime_s = 15e-3;       ///< with no coil suppression
    double bounceTime_s = 3e-3;
    double electricalLife_ops = 1e5;
    double mechanicalLife_ops = 1e6;
    double cost = 0.0;
    bool operator==(const ContactorPart&) const = default;
};

/// A heatsink as stated by its maker (geometry mode arrives with the thermal models).
struct HeatsinkPart {
    std::string partId;
    std::string name = "Custom heatsink";
    double rthSa_KperW = 0.3;           ///< sink to ambient at the reference temperature rise
    double mass_kg = 1.0;
    double specificHeat_JperKgK = 900.0; ///< aluminium ≈ 900 J/(kg·K) (Incropera, appendix)
    double cost = 0.0;
    bool operator==(const HeatsinkPart&) const = default;
};

} // namespace amp

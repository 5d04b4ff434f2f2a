// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/model/design_json.h"

#include <nlohmann/json.hpp>

// Like nlohmann's NON_INTRUSIVE_WITH_DEFAULT, but with out-of-line definitions so that the
// declarations in design_json.h link from every translation unit.
#define AMP_JSON(Type, ...)                                                                          \
    void to_json(nlohmann::json& nlohmann_json_j, const Type& nlohmann_json_t) {                     \
        NLOHMANN_JSON_EXPAND(NLOHMANN_JSON_PASTE(NLOHMANN_JSON_TO, __VA_ARGS__))                      \
    }                                                                                                \
    void from_json(const nlohmann::json& nlohmann_json_j, Type& nlohmann_json_t) {                   \
        const Type nlohmann_json_default_obj{};                                                      \
        NLOHMANN_JSON_EXPAND(NLOHMANN_JSON_PASTE(NLOHMANN_JSON_FROM_WITH_DEFAULT, __VA_ARGS__))       \
    }

namespace amp {

// Missing keys keep the default member value; the validator has already checked types and ranges.
AMP_JSON(FosterStage, r_KperW, tau_s)
AMP_JSON(SoaPoint, voltage_V, current_A, pulse_s)
AMP_JSON(RdsOnPoint, tj_C, factor)
AMP_JSON(MosfetParams, rdsOn25_ohm, rdsOnTempExponent, rdsOnTable,
                                                rdsOnSpecGate_V, vth_V, vthTempCoeff_VperK,
                                                transconductance_AperV2, qg_As, qgs_As, qgs2_As, qgd_As,
                                                plateau_V, rgInternal_ohm, coss_F, cossRef_V, cossLaw,
                                                bodyDiodeVf_V, bodyDiodeRd_ohm, bodyDiodeQrr_As,
                                                avalancheRepetitive_J, breakdown_V)
AMP_JSON(BjtParams, saturationCurrent25_A, betaF, betaR,
                                                highCurrentKnee_A, emissionCoefficient, baseResistance_ohm,
                                                emitterResistance_ohm, collectorResistance_ohm, xti,
                                                bandgap_eV, betaTempExponent, storageTime_s, fallTime_s,
                                                riseTime_s, vceSat_V)
AMP_JSON(SwitchPart, partId, name, kind, package, tabLive,
                                                voltageRating_V, currentRating_A, leadLimit_A, tjMax_C,
                                                rthJc_KperW, zthJc, soa, shortCircuitTime_s, cost, mosfet,
                                                bjt, driver)
AMP_JSON(DiodePart, partId, name, package, tabLive, vf0_V, rd_ohm,
                                                vfTempCoeff_VperK, qrr_As, currentRating_A, voltageRating_V,
                                                tjMax_C, rthJc_KperW, zthJc, cost)
AMP_JSON(InterfacePart, partId, name, kind, conductivity_WperMK,
                                                thickness_m, area_m2, contactResistance_KperW, insulating,
                                                dielectricStrength_Vperm)
AMP_JSON(ContactorPart, partId, name, continuousCurrent_A,
                                                ratedVoltage_V, dcBreaking_A, coilVoltage_V,
                                                coilResistance_ohm, contactResistance_ohm, pickupTime_s,
                                                dropoutTime_s, bounceTime_s, electricalLife_ops,
                                                mechanicalLife_ops, cost)
AMP_JSON(HeatsinkPart, partId, name, rthSa_KperW, mass_kg,
                                                specificHeat_JperKgK, cost)

AMP_JSON(Meta, title, author, revision, date, notes)
AMP_JSON(Supply, nominal_V, max_V, min_V, internalResistance_ohm,
                                                chemistry)
AMP_JSON(MagnetisationPoint, current_A, torqueConstant_NmPerA)
AMP_JSON(Motor, kind, armatureResistance20_ohm, windingTemperature_C,
                                                inductance_H, torqueConstant_NmPerA, noLoadCurrent_A,
                                                rotorInertia_kgm2, loadInertia_kgm2, demagCurrent_A,
                                                magnetisation)
AMP_JSON(Pwm, frequency_Hz, topology, currentLimit_A, maxDuty,
                                                deadTime_s, fullBridgeModulation, brakingCutoutDelay_s)
AMP_JSON(Drive, supply_V, minSupply_V, driverResistance_ohm,
                                                driverPeakCurrent_A, pulldown_ohm, baseDriveCurrent_A,
                                                forcedBeta, shortCircuitResponse_s)
AMP_JSON(BankDevice, rdsOnDeviation, vthDeviation_V, vbeDeviation_V,
                                                betaDeviation, gateResistorDeviation_ohm,
                                                ballastDeviation_ohm, legResistanceDeviation_ohm)
AMP_JSON(Spread, distribution, rdsOn, vth_V, vbe_V, beta,
                                                gateResistor, samples, seed)
AMP_JSON(Bank, device, count, devices, gateResistor_ohm, ballast_ohm,
                                                legResistance_ohm, derating, sharingTarget,
                                                neighbourCoupling_KperW, interface, freewheelDiode,
                                                diodeCount, spread)
AMP_JSON(HeatsinkGeometry, baseWidth_m, baseLength_m, baseThickness_m, finCount, finHeight_m,
         finThickness_m, material, orientation, emissivity, airVelocity_mps)
AMP_JSON(Heatsink, part, ambient_C, insulatedFromTabs, wetLocation,
                                                exposed, mode, rthReferenceRise_K, rthRiseExponent, geometry)
AMP_JSON(ThermalStudy, step_s, resolveStep_K, repetitions, untilPeriodic, stallStart, lifeCoefficient,
         lifeExponent, lifeActivation_eV)
AMP_JSON(Reversing, present, contactor, suppression, reversalsPerDay,
                                                stopSpeed_rpm, category, coilSupplyMin_V, coilSupplyMax_V,
                                                coilTimeConstant_s, coilReleaseFraction, zener_V, tvs_V,
                                                waitForStop, stopTime_s, retardingTorque_Nm,
                                                changeoverMargin_s, softStartRamp_s)
AMP_JSON(Segment, name, duration_s, mode, torque_Nm, speed_rpm,
                                                motorCurrent_A, duty, direction)
AMP_JSON(Wiring, batteryCableLength_m, batteryCable_mm2,
                                                motorCableLength_m, motorCable_mm2, cableTemperature_C,
                                                busCapacitance_F, mainContactor, prechargePresent,
                                                prechargeResistor_ohm, prechargeTime_s, prechargeFraction,
                                                fuseRating_A, fuseVoltage_V, fuseBreaking_A, fuseI2t_A2s,
                                                bankWithstandI2t_A2s, allowedCableDrop, cableInsulation)
AMP_JSON(PowerLayout, capacitorCount, capacitorRippleRating_A, capacitorEsr_ohm,
                                                capacitorVoltageRating_V, capacitorDerating,
                                                capacitorThermalResistance_KperW, capacitorMaxTemperature_C,
                                                capacitorInductance_H, commutationLoopInductance_H, loopLayout,
                                                loopLength_m, loopConductorRadius_m, loopSpacing_m,
                                                loopPlateWidth_m, loopPlateSeparation_m, packageInductance_H,
                                                batteryCableSpacing_m,
                                                overshootDerating)
AMP_JSON(Design, meta, supply, motor, pwm, drive, bank, heatsink,
                                                reversing, dutyProfile, wiring, thermal, layout)

void normalizeBank(Bank& bank) {
    if (bank.count < 0)
        bank.count = 0;
    bank.devices.resize(static_cast<std::size_t>(bank.count));
}

} // namespace amp

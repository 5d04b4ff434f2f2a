// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The design: everything the user states about one power stage. Plain data, SI units (°C where a
// name ends in _C, mm² where it ends in _mm2, rpm where it ends in _rpm). The member names are the
// project file's keys. Defaults are the documented values a field takes when a file omits it.
// Ranges, units and descriptions of every field live in model/fields.h.

#include "core/model/parts.h"

#include <string>
#include <vector>

namespace amp {

/// Title block of the design sheet.
struct Meta {
    std::string title = "Untitled design";
    std::string author;
    std::string revision = "A";
    std::string date;                   ///< ISO date as typed by the user
    std::string notes;
    bool operator==(const Meta&) const = default;
};

/// The traction battery and its wiring resistance to the bus capacitors.
struct Supply {
    double nominal_V = 48.0;
    double max_V = 54.6;                ///< highest: full charge, charger connected, braking
    double min_V = 42.0;                ///< lowest under load (sag, discharged)
    double internalResistance_ohm = 0.02; ///< battery internal resistance (cables are in Wiring)
    std::string chemistry = "lead-acid"; ///< "lead-acid", "lithium", "nickel" or "other"
    bool operator==(const Supply&) const = default;
};

/// One point of a series motor's magnetisation table: torque constant at a current.
struct MagnetisationPoint {
    double current_A = 0.0;
    double torqueConstant_NmPerA = 0.0;
    bool operator==(const MagnetisationPoint&) const = default;
};

/// The brushed DC motor.
struct Motor {
    std::string kind = "permanentMagnet"; ///< "permanentMagnet" or "seriesWound"
    double armatureResistance20_ohm = 0.05; ///< armature (+ brushes, + series field) at 20 °C
    double windingTemperature_C = 80.0; ///< winding temperature used for R_a
    double inductance_H = 0.5e-3;
    double torqueConstant_NmPerA = 0.12; ///< k in N·m/A = V·s/rad (permanent magnet)
    double noLoadCurrent_A = 4.0;
    double rotorInertia_kgm2 = 0.01;
    double loadInertia_kgm2 = 0.0;      ///< reflected to the motor shaft
    double demagCurrent_A = 0.0;        ///< highest current the magnets tolerate (0 = not stated)
    std::vector<MagnetisationPoint> magnetisation; ///< series-wound k(I), ascending current
    bool operator==(const Motor&) const = default;
};

/// Modulation and control.
struct Pwm {
    double frequency_Hz = 16000.0;
    std::string topology = "lowSideChopper"; ///< "lowSideChopper", "synchronousHalfBridge", "fullBridge"
    double currentLimit_A = 200.0;      ///< controller current limit (0 = none)
    double maxDuty = 0.98;
    double deadTime_s = 500e-9;         ///< synchronous topologies only
    std::string fullBridgeModulation = "unipolar"; ///< full bridge: "unipolar" or "bipolar" PWM
    double brakingCutoutDelay_s = 0.0;  ///< braking goes on this long after the battery is lost (bus rise)
    bool operator==(const Pwm&) const = default;
};

/// Gate or base drive shared by the bank.
struct Drive {
    double supply_V = 12.0;             ///< driver output high level at nominal battery voltage
    double minSupply_V = 11.0;          ///< driver output at the lowest battery voltage
    double driverResistance_ohm = 2.0;  ///< driver output resistance
    double driverPeakCurrent_A = 2.0;   ///< driver's rated peak current
    double pulldown_ohm = 10e3;         ///< gate pull-down per device (0 = none)
    double baseDriveCurrent_A = 0.0;    ///< bipolar/Darlington: total base current (0 = from forced β)
    double forcedBeta = 10.0;           ///< bipolar: I_C/I_B the drive is designed for
    double shortCircuitResponse_s = 0.0; ///< time the driver's short-circuit protection needs (0 = none stated)
    bool operator==(const Drive&) const = default;
};

/// One device of the bank: its deviation from the nominal part and its own resistors.
struct BankDevice {
    double rdsOnDeviation = 0.0;        ///< relative: R_ds(on) = nominal·(1 + deviation)
    double vthDeviation_V = 0.0;
    double vbeDeviation_V = 0.0;        ///< bipolar: shift of V_BE at fixed I_C (via I_S)
    double betaDeviation = 0.0;         ///< relative
    double gateResistorDeviation_ohm = 0.0;
    double ballastDeviation_ohm = 0.0;
    double legResistanceDeviation_ohm = 0.0;
    bool operator==(const BankDevice&) const = default;
};

/// Statistical spread of the bank's parameters, for corners and Monte Carlo.
struct Spread {
    std::string distribution = "normal"; ///< "normal" (σ) or "uniform" (± band)
    double rdsOn = 0.05;                ///< relative σ or band
    double vth_V = 0.15;
    double vbe_V = 0.01;
    double beta = 0.2;                  ///< relative
    double gateResistor = 0.05;         ///< relative
    int samples = 1000;
    int seed = 12345;
    bool operator==(const Spread&) const = default;
};

/// The parallel switch bank, its freewheel diode and the interface to the heatsink.
struct Bank {
    SwitchPart device;                  ///< the nominal part, copied from the library
    int count = 6;
    std::vector<BankDevice> devices;    ///< one entry per device, size == count
    double gateResistor_ohm = 4.7;      ///< external gate/base resistor per device
    double ballast_ohm = 0.0;           ///< source/emitter ballast resistor per device
    double legResistance_ohm = 0.3e-3;  ///< busbar/trace resistance of each device's leg
    double derating = 0.5;              ///< highest share of the rated current per device
    double sharingTarget = 1.10;        ///< accepted max/min device current ratio
    double neighbourCoupling_KperW = 0.0; ///< case-to-case coupling to adjacent devices (0 = none)
    InterfacePart interface;
    DiodePart freewheelDiode;
    int diodeCount = 2;                 ///< freewheel diodes in parallel
    Spread spread;
    bool operator==(const Bank&) const = default;
};

/// A plate-fin extrusion, for heatsink.mode == "geometry" (model: thermal/heatsink.h).
struct HeatsinkGeometry {
    double baseWidth_m = 0.15;          ///< across the fins
    double baseLength_m = 0.10;         ///< along the fins (vertical in natural convection)
    double baseThickness_m = 8e-3;
    int finCount = 12;                  ///< 0 = flat plate
    double finHeight_m = 35e-3;         ///< above the base
    double finThickness_m = 2e-3;
    std::string material = "al6063-t5"; ///< "al6063-t5", "al6063-t6", "al6063-o", "aluminium", "copper"
    std::string orientation = "vertical"; ///< "vertical" (fins vertical) or "horizontal" (base flat, fins up)
    double emissivity = 0.8;            ///< finish: anodised ≈ 0.8, bare extrusion ≈ 0.1
    double airVelocity_mps = 0.0;       ///< approach velocity of forced air; 0 = natural convection
    bool operator==(const HeatsinkGeometry&) const = default;
};

/// The heatsink and where it sits.
struct Heatsink {
    HeatsinkPart part;
    double ambient_C = 30.0;
    bool insulatedFromTabs = false;     ///< heatsink isolated from every live tab
    bool wetLocation = false;           ///< boats, outdoor wash-down: lower touch-voltage limit
    bool exposed = true;                ///< can be touched in use
    std::string mode = "stated";        ///< "stated" (part.rthSa_KperW, part.mass_kg) or "geometry"
    double rthReferenceRise_K = 50.0;   ///< stated mode: the rise at which part.rthSa_KperW holds
    double rthRiseExponent = 0.0;       ///< stated mode: n in R ∝ (ΔT/ΔT_ref)^−n; 0 = constant
    HeatsinkGeometry geometry;          ///< geometry mode
    bool operator==(const Heatsink&) const = default;
};

/// Settings of the thermal studies after the steady operating points: the duty-profile
/// transient, the stall time and the power-cycling life (models in thermal/).
struct ThermalStudy {
    double step_s = 0.01;               ///< transient time step (segments split into equal steps)
    double resolveStep_K = 2.0;         ///< full bank solve when a junction moved this much
    int repetitions = 20;               ///< profile repetitions (the most tried with untilPeriodic)
    bool untilPeriodic = true;          ///< run the profile until it repeats itself
    std::string stallStart = "hottestPoint"; ///< "ambient" or "hottestPoint" (hottest non-stall point)
    double lifeCoefficient = 640.0;     ///< A in N_f = A·ΔT^α·exp(E_a/(k_B·T_m))
    double lifeExponent = -5.0;         ///< α
    double lifeActivation_eV = 0.8;     ///< E_a
    bool operator==(const ThermalStudy&) const = default;
};

/// The reversing contactor.
struct Reversing {
    bool present = true;
    ContactorPart contactor;
    std::string suppression = "diodeZener"; ///< coil suppression: "none", "diode", "diodeZener", "tvs"
    double reversalsPerDay = 50.0;
    double stopSpeed_rpm = 30.0;        ///< speed below which a change-over is allowed
    std::string category;               ///< DC utilisation category of the contactor: "", "DC-1", "DC-3", "DC-5"
    double coilSupplyMin_V = 0.0;       ///< lowest voltage the coil gets (0 = its rated voltage)
    double coilSupplyMax_V = 0.0;       ///< highest voltage the coil gets (0 = its rated voltage)
    double coilTimeConstant_s = 0.02;   ///< coil L/R with the armature closed (estimate when unknown)
    double coilReleaseFraction = 0.2;   ///< release current / holding current
    double zener_V = 0.0;               ///< diodeZener: Zener voltage (0 = the coil voltage)
    double tvs_V = 0.0;                 ///< tvs: clamp voltage (0 = 1.5 × the coil voltage)
    bool waitForStop = true;            ///< the sequence waits for the stop speed before changing over
    double stopTime_s = 0.0;            ///< stated slow-down time (0 = from inertia and retarding torque)
    double retardingTorque_Nm = 0.0;    ///< friction and load torque beyond the motor's own k·I0
    double changeoverMargin_s = 0.05;   ///< wait between drop-out and pick-up
    double softStartRamp_s = 0.5;       ///< restart ramp after the change-over
    bool operator==(const Reversing&) const = default;
};

/// One segment of the duty profile: an operating point held for a duration.
struct Segment {
    std::string name = "Cruise";
    double duration_s = 60.0;
    std::string mode = "torqueSpeed";   ///< "torqueSpeed", "currentSpeed", "currentDuty", "stall"
    double torque_Nm = 10.0;
    double speed_rpm = 2000.0;
    double motorCurrent_A = 80.0;
    double duty = 0.5;
    std::string direction = "forward"; ///< "forward" or "reverse"
    bool operator==(const Segment&) const = default;
};

/// Cables, bus capacitors, fuse.
struct Wiring {
    double batteryCableLength_m = 1.5;  ///< conductor length battery → controller, both poles
    double batteryCable_mm2 = 35.0;
    double motorCableLength_m = 1.0;    ///< conductor length controller → motor, both poles
    double motorCable_mm2 = 35.0;
    double cableTemperature_C = 60.0;   ///< conductor temperature used for its resistance
    double busCapacitance_F = 2.0e-3;
    ContactorPart mainContactor;        ///< main contactor or disconnect (dcBreaking_A 0 = not stated)
    bool prechargePresent = true;       ///< a pre-charge resistor charges the bus before the main closes
    double prechargeResistor_ohm = 0.0; ///< 0 = size it for prechargeTime_s
    double prechargeTime_s = 1.0;       ///< target pre-charge time
    double prechargeFraction = 0.99;    ///< bus fraction reached before the main closes (5·R·C ≈ 99.3 %)
    double fuseRating_A = 0.0;          ///< battery fuse rated current (0 = no fuse stated)
    double fuseVoltage_V = 0.0;         ///< its DC voltage rating
    double fuseBreaking_A = 0.0;        ///< its DC breaking capacity (0 = not stated)
    double fuseI2t_A2s = 0.0;           ///< its total clearing I²t (0 = not stated)
    double bankWithstandI2t_A2s = 0.0;  ///< the bank's short-circuit I²t withstand (0 = not stated)
    double allowedCableDrop = 0.03;     ///< allowed drop per cable, fraction of the nominal voltage
    std::string cableInsulation = "pvc"; ///< "pvc" (70 °C, k 115) or "xlpe" (90 °C, k 143)
    bool operator==(const Wiring&) const = default;
};

/// Bus capacitor bank and the power layout's inductances (turn-off overshoot, cable ringing).
struct PowerLayout {
    int capacitorCount = 0;             ///< bus capacitors fitted (0 = as many as the ripple needs)
    double capacitorRippleRating_A = 2.5; ///< RMS ripple rating per capacitor
    double capacitorEsr_ohm = 0.03;     ///< ESR per capacitor at the PWM frequency
    double capacitorVoltageRating_V = 100.0;
    double capacitorDerating = 0.8;     ///< highest fraction of the voltage rating in use
    double capacitorThermalResistance_KperW = 15.0; ///< per capacitor, hot spot to ambient
    double capacitorMaxTemperature_C = 105.0;
    double capacitorInductance_H = 3e-9; ///< ESL of the capacitor bank as the loop sees it (one ESL / number in parallel)
    double commutationLoopInductance_H = 0.0; ///< capacitor → bank → diode loop (0 = from the layout below)
    std::string loopLayout = "platePair"; ///< "platePair" (laminated bars, board planes) or "wirePair" (round conductors)
    double loopLength_m = 0.05;         ///< loop conductor length, one way
    double loopConductorRadius_m = 1.5e-3; ///< wirePair
    double loopSpacing_m = 8e-3;        ///< wirePair: centre spacing
    double loopPlateWidth_m = 20e-3;    ///< platePair
    double loopPlateSeparation_m = 0.5e-3; ///< platePair: insulation between the plates
    double packageInductance_H = 7e-9;  ///< lead inductance per device
    double batteryCableSpacing_m = 10e-3; ///< centre spacing of the battery cable pair
    double overshootDerating = 0.8;     ///< highest fraction of the device rating the turn-off peak may reach
    bool operator==(const PowerLayout&) const = default;
};

/// A complete design.
struct Design {
    Meta meta;
    Supply supply;
    Motor motor;
    Pwm pwm;
    Drive drive;
    Bank bank;
    Heatsink heatsink;
    Reversing reversing;
    std::vector<Segment> dutyProfile;
    Wiring wiring;
    ThermalStudy thermal;               ///< optional: defaults apply to older files
    PowerLayout layout;
    bool operator==(const Design&) const = default;
};

/// Make the per-device list match the count: entries beyond it are dropped, new ones are nominal.
void normalizeBank(Bank& bank);

} // namespace amp

// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Gate drive of a MOSFET bank and base drive of a bipolar/Darlington bank: the power the driver
// supplies, where it is dissipated, the driver's peak current, the gate pull-down, and whether the
// drive still turns the bank fully on at the lowest supply voltage.
//
// MOSFET (per device, n devices sharing one driver output of resistance R_out):
//   R_g,tot = n·R_out + R_g,ext + R_g,int (the driver resistance seen by each gate)
//   P_gate = Q_g·ΔV·f, ΔV = V_high − V_low, split in proportion to the resistances:
//   P_ext = P_gate·R_g,ext/R_g,tot, P_int = P_gate·R_g,int/R_g,tot (in the die), rest in the driver;
//   peak gate current I_pk = ΔV/R_g,tot per device, n·I_pk from the driver;
//   pull-down R_pd: static gate level V_g = V_drv·R_pd/(R_pd + n·R_out + R_g,ext), loss D·V_g²/R_pd;
//   fully enhanced when V_g at the lowest supply ≥ the gate voltage R_ds(on) is stated at.
// Bipolar (per device): base current I_B from a base resistor, (V_drv − V_BE)/(R_b + n·R_out), or
//   from a current drive (I_C/β_forced or a stated current); saturated while I_B ≥ I_C/β_F;
//   losses over the on-time: P_Rb = D·I_B²·R_b, P_BE = D·I_B·V_BE (in the device), driver supply
//   D·V_drv·I_B.
// Sources: Q_g·V·f and the resistive split — Balogh, "Fundamentals of MOSFET and IGBT Gate Driver
// Circuits" (from memory); the pull-down and the enhancement check are common practice; the
// base-drive sums are Ohm's law.
//
// Units and valid ranges: charges A·s (≥ 0), voltages V, resistances Ω (≥ 0; pull-down 0 = none),
// f Hz (> 0), duty 0 … 1, device count ≥ 1. Q_g is taken at the drive voltage; a Q_g stated at
// another gate voltage makes P_gate an estimate.

#include "core/losses/inputcheck.h"

#include <vector>

namespace amp::losses {

struct MosfetGateDriveInput {
    int devices = 1;                ///< gates sharing the driver output
    double gateCharge_As = 80e-9;   ///< Q_g per device
    double driveHigh_V = 12.0;      ///< driver high level at nominal supply
    double driveLow_V = 0.0;
    double driveMin_V = 11.0;       ///< driver high level at the lowest battery voltage
    double frequency_Hz = 16e3;
    double duty = 0.5;
    double driverResistance_ohm = 2.0;   ///< driver output resistance (shared)
    double driverPeakRating_A = 0.0;     ///< driver's rated peak current (0 = not stated)
    double gateResistorExternal_ohm = 4.7;
    double gateResistorInternal_ohm = 1.5;
    double pulldown_ohm = 10e3;     ///< per device (0 = none)
    double specGate_V = 10.0;       ///< gate voltage at which R_ds(on) is stated
    bool messages = true;           ///< false: verdicts without their text (callers in a loop)
};

struct MosfetGateDriveResult {
    std::vector<Problem> problems;
    double gateResistance_ohm = 0.0;     ///< per device, driver share included
    double perDevice_W = 0.0;            ///< Q_g·ΔV·f
    double bank_W = 0.0;                 ///< all devices, what the driver supply delivers
    double externalResistor_W = 0.0;     ///< per device
    double internal_W = 0.0;             ///< per device, in the die (adds to its loss)
    double driver_W = 0.0;               ///< in the driver, all devices
    double pulldown_W = 0.0;             ///< per device
    double peakCurrentPerDevice_A = 0.0;
    double driverPeak_A = 0.0;
    LimitCheck driverPeak;               ///< driverPeak_A against the driver's rating
    bool pulldownPresent = false;
    LimitCheck pulldown;                 ///< failed when there is none: a lost drive leaves gates floating
    double gateVoltage_V = 0.0;          ///< static gate level at nominal supply
    double gateVoltageAtMinSupply_V = 0.0;
    LimitCheck enhancement;              ///< gate level at the lowest supply against specGate_V
    bool ok() const { return problems.empty(); }
};

MosfetGateDriveResult mosfetGateDrive(const MosfetGateDriveInput& in);

struct BipolarBaseDriveInput {
    int devices = 1;
    double collectorCurrent_A = 10.0;    ///< on-state current per device
    double dcBeta = 40.0;                ///< β_F at that current and temperature
    double forcedBeta = 10.0;            ///< the drive's design ratio I_C/I_B (current drive)
    double baseCurrent_A = 0.0;          ///< stated per-device base current (0 = I_C/forcedBeta)
    double baseResistor_ohm = 0.0;       ///< > 0: resistive drive from the driver supply
    double baseEmitter_V = 0.9;          ///< V_BE(sat) (≈ 0.9 V single, ≈ 1.8 V Darlington)
    double driveHigh_V = 12.0;
    double driveMin_V = 11.0;
    double driverResistance_ohm = 0.0;   ///< driver output resistance (shared)
    double duty = 0.5;
    bool messages = true;                ///< false: verdicts without their text (callers in a loop)
};

struct BipolarBaseDriveResult {
    std::vector<Problem> problems;
    double baseCurrent_A = 0.0;          ///< per device at nominal supply
    double baseCurrentAtMinSupply_A = 0.0;
    double actualForcedBeta = 0.0;       ///< I_C/I_B at nominal supply
    double requiredBaseCurrent_A = 0.0;  ///< I_C/β_F: the least that saturates the device
    LimitCheck saturation;               ///< I_B at the lowest supply against I_C/β_F
    double baseResistor_W = 0.0;         ///< per device
    double baseEmitter_W = 0.0;          ///< per device, in the device
    double driverSupply_W = 0.0;         ///< all devices
    bool ok() const { return problems.empty(); }
};

BipolarBaseDriveResult bipolarBaseDrive(const BipolarBaseDriveInput& in);

} // namespace amp::losses

// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/losses/gate_drive.h"

#include <algorithm>

namespace amp::losses {

MosfetGateDriveResult mosfetGateDrive(const MosfetGateDriveInput& in) {
    MosfetGateDriveResult r;
    InputCheck c;
    if (in.devices < 1)
        c.fail("devices", "the number of devices on the driver must be at least 1, got " +
                              std::to_string(in.devices));
    c.nonNegative("gateCharge_As", in.gateCharge_As, "the total gate charge (Q_g)");
    c.finite("driveHigh_V", in.driveHigh_V, "the driver high level");
    c.finite("driveLow_V", in.driveLow_V, "the driver low level");
    c.finite("driveMin_V", in.driveMin_V, "the driver high level at the lowest supply");
    c.positive("frequency_Hz", in.frequency_Hz, "the switching frequency");
    c.inRange("duty", in.duty, 0.0, 1.0, "the duty cycle");
    c.nonNegative("driverResistance_ohm", in.driverResistance_ohm, "the driver output resistance");
    c.nonNegative("driverPeakRating_A", in.driverPeakRating_A, "the driver's peak current rating");
    c.nonNegative("gateResistorExternal_ohm", in.gateResistorExternal_ohm, "the external gate resistor");
    c.nonNegative("gateResistorInternal_ohm", in.gateResistorInternal_ohm, "the internal gate resistance");
    c.nonNegative("pulldown_ohm", in.pulldown_ohm, "the gate pull-down resistor");
    c.positive("specGate_V", in.specGate_V, "the gate voltage at which R_ds(on) is stated");
    if (c.ok() && in.driveHigh_V <= in.driveLow_V)
        c.fail("driveHigh_V", "the driver high level (" + num(in.driveHigh_V) +
                                  " V) must exceed its low level (" + num(in.driveLow_V) + " V)");
    const double n = in.devices;
    const double seriesR = n * in.driverResistance_ohm + in.gateResistorExternal_ohm; // outside the die
    const double rTot = seriesR + in.gateResistorInternal_ohm;
    if (c.ok() && !(rTot > 0.0))
        c.fail("gateResistorExternal_ohm",
               "the gate path has no resistance at all (driver, external and internal are all zero)");
    if (!c.ok()) {
        r.problems = c.take();
        return r;
    }

    const double swing = in.driveHigh_V - in.driveLow_V;
    r.gateResistance_ohm = rTot;
    r.perDevice_W = in.gateCharge_As * swing * in.frequency_Hz;
    r.bank_W = n * r.perDevice_W;
    r.externalResistor_W = r.perDevice_W * in.gateResistorExternal_ohm / rTot;
    r.internal_W = r.perDevice_W * in.gateResistorInternal_ohm / rTot;
    r.driver_W = n * r.perDevice_W * (n * in.driverResistance_ohm) / rTot;

    r.peakCurrentPerDevice_A = swing / rTot;
    r.driverPeak_A = n * r.peakCurrentPerDevice_A;
    r.driverPeak.rated = in.driverPeakRating_A > 0.0;
    r.driverPeak.value = r.driverPeak_A;
    r.driverPeak.limit = in.driverPeakRating_A;
    r.driverPeak.failed = r.driverPeak.rated && r.driverPeak_A > in.driverPeakRating_A;
    if (r.driverPeak.failed && in.messages)
        r.driverPeak.message = "the driver must source " + num(r.driverPeak_A) + " A peak into " +
                               std::to_string(in.devices) + " gates, above its " + num(in.driverPeakRating_A) +
                               " A rating";

    r.pulldownPresent = in.pulldown_ohm > 0.0;
    r.pulldown.value = in.pulldown_ohm;
    r.pulldown.failed = !r.pulldownPresent;
    if (r.pulldown.failed && in.messages)
        r.pulldown.message = "no gate pull-down: if the drive is lost (connector, driver supply) the gates "
                             "float and the bank can turn on or run linear";

    // The pull-down and the resistors outside the die form a divider on the static gate level
    // (no current flows in R_g,int once the gate is charged except through R_pd, which sits on the pins).
    auto gateLevel = [&](double drive_V) {
        if (!r.pulldownPresent)
            return drive_V;
        return drive_V * in.pulldown_ohm / (in.pulldown_ohm + seriesR);
    };
    r.gateVoltage_V = gateLevel(in.driveHigh_V);
    r.gateVoltageAtMinSupply_V = gateLevel(in.driveMin_V);
    if (r.pulldownPresent)
        r.pulldown_W = in.duty * r.gateVoltage_V * r.gateVoltage_V / in.pulldown_ohm;

    r.enhancement.value = r.gateVoltageAtMinSupply_V;
    r.enhancement.limit = in.specGate_V;
    r.enhancement.failed = r.gateVoltageAtMinSupply_V < in.specGate_V;
    if (r.enhancement.failed && in.messages)
        r.enhancement.message = "at the lowest supply the gates reach " + num(r.gateVoltageAtMinSupply_V) +
                                " V, below the " + num(in.specGate_V) +
                                " V at which R_ds(on) is stated: the bank is not fully enhanced";
    return r;
}

BipolarBaseDriveResult bipolarBaseDrive(const BipolarBaseDriveInput& in) {
    BipolarBaseDriveResult r;
    InputCheck c;
    if (in.devices < 1)
        c.fail("devices", "the number of devices on the driver must be at least 1, got " +
                              std::to_string(in.devices));
    c.nonNegative("collectorCurrent_A", in.collectorCurrent_A, "the collector current");
    c.positive("dcBeta", in.dcBeta, "the current gain");
    c.positive("forcedBeta", in.forcedBeta, "the forced gain of the drive");
    c.nonNegative("baseCurrent_A", in.baseCurrent_A, "the stated base current");
    c.nonNegative("baseResistor_ohm", in.baseResistor_ohm, "the base resistor");
    c.nonNegative("baseEmitter_V", in.baseEmitter_V, "the base-emitter saturation voltage");
    c.finite("driveHigh_V", in.driveHigh_V, "the driver high level");
    c.finite("driveMin_V", in.driveMin_V, "the driver high level at the lowest supply");
    c.nonNegative("driverResistance_ohm", in.driverResistance_ohm, "the driver output resistance");
    c.inRange("duty", in.duty, 0.0, 1.0, "the duty cycle");
    if (!c.ok()) {
        r.problems = c.take();
        return r;
    }

    const double n = in.devices;
    const double rDrv = n * in.driverResistance_ohm;
    auto resistiveBase = [&](double drive_V) {
        return std::max(0.0, (drive_V - in.baseEmitter_V) / (in.baseResistor_ohm + rDrv));
    };
    if (in.baseResistor_ohm > 0.0) {
        r.baseCurrent_A = resistiveBase(in.driveHigh_V);
        r.baseCurrentAtMinSupply_A = resistiveBase(in.driveMin_V);
    } else {
        // A current drive holds its current until its output runs out of headroom.
        r.baseCurrent_A = in.baseCurrent_A > 0.0 ? in.baseCurrent_A : in.collectorCurrent_A / in.forcedBeta;
        r.baseCurrentAtMinSupply_A = r.baseCurrent_A;
        if (rDrv > 0.0)
            r.baseCurrentAtMinSupply_A =
                std::min(r.baseCurrent_A, std::max(0.0, (in.driveMin_V - in.baseEmitter_V) / rDrv));
        else if (in.driveMin_V <= in.baseEmitter_V)
            r.baseCurrentAtMinSupply_A = 0.0;
    }
    r.actualForcedBeta = r.baseCurrent_A > 0.0 ? in.collectorCurrent_A / r.baseCurrent_A : 0.0;
    r.requiredBaseCurrent_A = in.collectorCurrent_A / in.dcBeta;
    r.saturation.value = r.baseCurrentAtMinSupply_A;
    r.saturation.limit = r.requiredBaseCurrent_A;
    r.saturation.failed = r.baseCurrentAtMinSupply_A < r.requiredBaseCurrent_A;
    if (r.saturation.failed && in.messages)
        r.saturation.message = "at the lowest supply the base current is " + num(r.baseCurrentAtMinSupply_A) +
                               " A per device, below the " + num(r.requiredBaseCurrent_A) + " A that " +
                               num(in.collectorCurrent_A) +
                               " A needs at this gain: the device leaves saturation and runs linear";

    const double ib = r.baseCurrent_A;
    r.baseResistor_W = in.duty * ib * ib * in.baseResistor_ohm;
    r.baseEmitter_W = in.duty * ib * in.baseEmitter_V;
    r.driverSupply_W = n * in.duty * in.driveHigh_V * ib;
    return r;
}

} // namespace amp::losses

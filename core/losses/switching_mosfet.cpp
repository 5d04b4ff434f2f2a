// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/losses/switching_mosfet.h"

#include <cmath>

namespace amp::losses {

bool parseCossLaw(const std::string& text, CossLaw& law) {
    if (text == "constant") {
        law = CossLaw::Constant;
        return true;
    }
    if (text == "sqrt") {
        law = CossLaw::InverseSqrt;
        return true;
    }
    return false;
}

double cossEnergy(double coss_F, double cossRef_V, CossLaw law, double voltage_V) {
    if (!(coss_F > 0.0) || !(voltage_V > 0.0))
        return 0.0;
    if (law == CossLaw::Constant || !(cossRef_V > 0.0))
        return 0.5 * coss_F * voltage_V * voltage_V;
    // C(V) = C_ref·√(V_ref/V); ∫0^V v·C(v) dv = (2/3)·C(V)·V².
    const double cAtV = coss_F * std::sqrt(cossRef_V / voltage_V);
    return 2.0 / 3.0 * cAtV * voltage_V * voltage_V;
}

MosfetSwitchingResult mosfetSwitching(const MosfetSwitchingInput& in) {
    MosfetSwitchingResult r;
    InputCheck c;
    c.positive("busVoltage_V", in.busVoltage_V, "the switched voltage");
    c.nonNegative("turnOnCurrent_A", in.turnOnCurrent_A, "the turn-on current");
    c.nonNegative("turnOffCurrent_A", in.turnOffCurrent_A, "the turn-off current");
    c.positive("frequency_Hz", in.frequency_Hz, "the switching frequency");
    c.finite("driveHigh_V", in.driveHigh_V, "the driver high level");
    c.finite("driveLow_V", in.driveLow_V, "the driver low level");
    c.nonNegative("driverResistance_ohm", in.driverResistance_ohm, "the driver output resistance");
    c.nonNegative("gateResistorExternal_ohm", in.gateResistorExternal_ohm, "the external gate resistor");
    c.nonNegative("gateResistorInternal_ohm", in.gateResistorInternal_ohm, "the internal gate resistance");
    c.finite("plateau_V", in.plateau_V, "the Miller plateau voltage");
    c.nonNegative("qgs2_As", in.qgs2_As, "the gate charge from threshold to plateau (Q_gs2)");
    c.nonNegative("qgd_As", in.qgd_As, "the Miller charge (Q_gd)");
    c.nonNegative("coss_F", in.coss_F, "the output capacitance");
    c.nonNegative("recoveryCharge_As", in.recoveryCharge_As, "the diode recovery charge (Q_rr)");
    if (in.cossLaw == CossLaw::InverseSqrt)
        c.positive("cossRef_V", in.cossRef_V, "the voltage at which C_oss is stated");
    if (c.ok()) {
        if (in.driveHigh_V <= in.plateau_V)
            c.fail("driveHigh_V", "the driver high level (" + num(in.driveHigh_V) +
                                      " V) must exceed the Miller plateau (" + num(in.plateau_V) +
                                      " V), or the device never turns fully on");
        if (in.plateau_V <= in.driveLow_V)
            c.fail("plateau_V", "the Miller plateau (" + num(in.plateau_V) +
                                    " V) must exceed the driver low level (" + num(in.driveLow_V) +
                                    " V), or the device never turns off");
        const double rg = in.driverResistance_ohm + in.gateResistorExternal_ohm + in.gateResistorInternal_ohm;
        if (!(rg > 0.0))
            c.fail("gateResistorExternal_ohm",
                   "the total gate resistance (driver + external + internal) must be greater than zero");
    }
    if (!c.ok()) {
        r.problems = c.take();
        return r;
    }

    const double v = in.busVoltage_V;
    const double rg = in.driverResistance_ohm + in.gateResistorExternal_ohm + in.gateResistorInternal_ohm;
    const double onDrive = in.driveHigh_V - in.plateau_V;  // voltage across R_g on the plateau, turning on
    const double offDrive = in.plateau_V - in.driveLow_V;  // ... turning off
    r.gateResistance_ohm = rg;
    r.turnOnCurrentRise_s = in.qgs2_As * rg / onDrive;
    r.turnOnVoltageFall_s = in.qgd_As * rg / onDrive;
    r.turnOffVoltageRise_s = in.qgd_As * rg / offDrive;
    r.turnOffCurrentFall_s = in.qgs2_As * rg / offDrive;
    r.turnOffCurrentSlope_Aps =
        r.turnOffCurrentFall_s > 0.0 ? in.turnOffCurrent_A / r.turnOffCurrentFall_s : 0.0;

    r.turnOnEnergy_J = 0.5 * v * in.turnOnCurrent_A * (r.turnOnCurrentRise_s + r.turnOnVoltageFall_s);
    r.turnOffEnergy_J = 0.5 * v * in.turnOffCurrent_A * (r.turnOffVoltageRise_s + r.turnOffCurrentFall_s);
    r.cossEnergy_J = cossEnergy(in.coss_F, in.cossRef_V, in.cossLaw, v);
    r.recoveryEnergy_J = in.recoveryCharge_As * v;

    const double f = in.frequency_Hz;
    r.overlap_W = f * (r.turnOnEnergy_J + r.turnOffEnergy_J);
    r.coss_W = f * r.cossEnergy_J;
    r.recovery_W = f * r.recoveryEnergy_J;
    r.total_W = r.overlap_W + r.coss_W + r.recovery_W;
    return r;
}

} // namespace amp::losses

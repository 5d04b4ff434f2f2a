// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/protection/bridgecomparison.h"

#include "core/protection/inputcheck.h"

namespace amp::protection {

BridgeComparisonResult compareWithFullBridge(const BridgeComparisonInput& in) {
    BridgeComparisonResult r;
    InputCheck c;
    const bool chopper = in.topology == "lowSideChopper";
    if (!chopper && in.topology != "synchronousHalfBridge")
        c.add("topology", "must be \"lowSideChopper\" or \"synchronousHalfBridge\" for the contactor option "
                          "(got \"" +
                              in.topology + "\")");
    if (in.devicesPerBank < 1)
        c.add("devicesPerBank", "must be 1 or more (got " + std::to_string(in.devicesPerBank) + ")");
    if (in.diodeCount < 0)
        c.add("diodeCount", "must be 0 or more (got " + std::to_string(in.diodeCount) + ")");
    if (in.contactsInPath < 0)
        c.add("contactsInPath", "must be 0 or more (got " + std::to_string(in.contactsInPath) + ")");
    c.nonNegative("bankResistance_ohm", in.bankResistance_ohm);
    c.nonNegative("contactResistance_ohm", in.contactResistance_ohm);
    c.nonNegative("motorRmsCurrent_A", in.motorRmsCurrent_A);
    c.nonNegative("switchRmsCurrent_A", in.switchRmsCurrent_A);
    c.nonNegative("diodeAverageCurrent_A", in.diodeAverageCurrent_A);
    c.nonNegative("diodeRmsCurrent_A", in.diodeRmsCurrent_A);
    c.nonNegative("diodeVf0_V", in.diodeVf0_V);
    c.nonNegative("diodeRd_ohm", in.diodeRd_ohm);
    c.nonNegative("contactorReversal_s", in.contactorReversal_s);
    c.positive("inertia_kgm2", in.inertia_kgm2);
    c.nonNegative("initialSpeed_radps", in.initialSpeed_radps);
    c.positive("torqueConstant_NmPerA", in.torqueConstant_NmPerA);
    c.positive("currentLimit_A", in.currentLimit_A);
    c.nonNegative("retardingTorque_Nm", in.retardingTorque_Nm);
    c.nonNegative("softStartRamp_s", in.softStartRamp_s);
    c.nonNegative("devicePrice", in.devicePrice);
    c.nonNegative("diodePrice", in.diodePrice);
    c.nonNegative("contactorPrice", in.contactorPrice);
    r.problems = c.take();
    if (!r.problems.empty())
        return r;
    r.valid = true;

    const double im2 = in.motorRmsCurrent_A * in.motorRmsCurrent_A;
    const double contacts = in.contactsInPath * im2 * in.contactResistance_ohm;

    BridgeOption a;
    a.id = "bankContactor";
    a.contactorCount = 1;
    a.reversal_s = in.contactorReversal_s;
    if (chopper) {
        a.name = "Low-side bank + reversing contactor";
        a.switchCount = in.devicesPerBank;
        a.diodeCount = in.diodeCount;
        a.conductionLoss_W = in.switchRmsCurrent_A * in.switchRmsCurrent_A * in.bankResistance_ohm +
                             in.diodeVf0_V * in.diodeAverageCurrent_A +
                             in.diodeRd_ohm * in.diodeRmsCurrent_A * in.diodeRmsCurrent_A + contacts;
        a.braking = "none: the current only decays through the freewheel diode; the motor coasts";
    } else {
        a.name = "Half-bridge banks + reversing contactor";
        a.switchCount = 2 * in.devicesPerBank;
        a.diodeCount = 0;
        a.conductionLoss_W = im2 * in.bankResistance_ohm + contacts;
        a.braking = "regenerative in the running direction; reversing still waits for the stop";
    }
    a.cost = a.switchCount * in.devicePrice + a.diodeCount * in.diodePrice + in.contactorPrice;
    a.costComplete =
        in.devicePrice > 0.0 && (a.diodeCount == 0 || in.diodePrice > 0.0) && in.contactorPrice > 0.0;

    BridgeOption b;
    b.id = "fullBridge";
    b.name = "Full bridge (four banks)";
    b.switchCount = 4 * in.devicesPerBank;
    b.conductionLoss_W = 2.0 * im2 * in.bankResistance_ohm;
    const double brakingTorque = in.torqueConstant_NmPerA * in.currentLimit_A + in.retardingTorque_Nm;
    b.reversal_s = in.inertia_kgm2 * in.initialSpeed_radps / brakingTorque + in.softStartRamp_s;
    b.braking = "regenerative and reverse braking under current control in both directions";
    b.cost = b.switchCount * in.devicePrice;
    b.costComplete = in.devicePrice > 0.0;

    r.options = {a, b};
    return r;
}

} // namespace amp::protection

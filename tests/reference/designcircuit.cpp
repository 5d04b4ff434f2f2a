// SPDX-License-Identifier: GPL-3.0-or-later
#include "reference/designcircuit.h"

#include "core/engine/results.h"
#include "core/model/design.h"
#include "core/physics/copper.h"
#include "core/physics/diode_conduction.h"
#include "core/physics/mosfet_rdson.h"
#include "core/physics/motor.h"

#include <algorithm>

namespace amp::reference {

std::optional<CycleCircuit> circuitOfPoint(const Design& d, const OperatingPointResult& p) {
    if (d.bank.device.kind != "mosfet" || p.devices.empty())
        return std::nullopt;
    CycleCircuit c;
    c.batteryVoltage_V = d.supply.nominal_V;
    c.batteryResistance_ohm =
        d.supply.internalResistance_ohm +
        copper::conductorResistance(d.wiring.batteryCableLength_m, d.wiring.batteryCable_mm2, d.wiring.cableTemperature_C);
    c.frequency_Hz = d.pwm.frequency_Hz;
    c.duty = p.duty;
    c.inductance_H = d.motor.inductance_H;
    c.loadResistance_ohm =
        makeMotorModel(d.motor).armatureResistance_ohm +
        copper::conductorResistance(d.wiring.motorCableLength_m, d.wiring.motorCable_mm2, d.wiring.cableTemperature_C) +
        (d.reversing.present ? 2.0 * d.reversing.contactor.contactResistance_ohm : 0.0);
    c.backEmf_V = p.backEmf_V;
    double g = 0.0;
    for (std::size_t k = 0; k < p.devices.size() && k < d.bank.devices.size(); ++k) {
        const auto& dev = d.bank.devices[k];
        g += 1.0 / (rdsOn(d.bank.device.mosfet, p.devices[k].tj_C) * (1.0 + dev.rdsOnDeviation) +
                    std::max(0.0, d.bank.ballast_ohm + dev.ballastDeviation_ohm) +
                    std::max(0.0, d.bank.legResistance_ohm + dev.legResistanceDeviation_ohm));
    }
    c.switchResistance_ohm = 1.0 / g;
    c.diodeDrop_V = diodeThreshold(d.bank.freewheelDiode, p.freewheelDiode.tj_C);
    c.diodeResistance_ohm = d.bank.freewheelDiode.rd_ohm / std::max(1, d.bank.diodeCount);
    // The switching, drive and recovery losses draw their power from the bus as well; the engine
    // charges it as a bus current beside the switch's (README, results). A fixed load here, like
    // the junction temperatures.
    c.busLoad_A = std::max(0.0, p.batteryCurrent_A - p.switchAverageCurrent_A);
    return c;
}

} // namespace amp::reference

// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/checks/cautions.h"

#include "core/units/units.h"

#include <algorithm>

namespace amp {

double touchVoltageLimit_V(bool wetLocation) { return wetLocation ? 30.0 : 60.0; }

double batteryShortCircuit_A(const Supply& supply) {
    return supply.internalResistance_ohm > 0.0 ? supply.max_V / supply.internalResistance_ohm : 0.0;
}

std::vector<Caution> cautionsFor(const Design& d, const Results& r) {
    using units::format;
    using units::Unit;
    std::vector<Caution> out;
    const double limit = touchVoltageLimit_V(d.heatsink.wetLocation);
    const double isc = batteryShortCircuit_A(d.supply);

    out.push_back({"caution.battery-short-circuit", "Battery short circuit",
                   "The battery can drive about " + format(isc, Unit::Ampere, 2) +
                       " into a short circuit. Put a DC-rated fuse or breaker as close to the battery terminal as "
                       "you can, insulate tools, take off rings and watches, and cover terminals while you work.",
                   "always: a traction battery stores enough energy to melt tools and burn"});
    if (d.supply.chemistry == "lithium")
        out.push_back({"caution.lithium-cells", "Lithium cells",
                       "Use a battery management system that disconnects on over-current, over- and under-voltage "
                       "and over-temperature; a damaged or overheated lithium pack can vent and burn.",
                       "the supply is marked as lithium"});
    if (d.supply.max_V > limit)
        out.push_back({"caution.hazardous-voltage", "Hazardous DC voltage",
                       "The bus reaches " + format(d.supply.max_V, Unit::Volt, 3) + ", above " +
                           format(limit, Unit::Volt, 2) +
                           " DC: exposed live parts need basic protection (enclosure, insulation). Disconnect the "
                           "battery before working on the controller.",
                       "highest bus voltage above the touch-voltage limit (IEC 60364-4-41, from memory)"});
    if (d.wiring.busCapacitance_F > 0.0) {
        const double energy = 0.5 * d.wiring.busCapacitance_F * d.supply.max_V * d.supply.max_V;
        out.push_back({"caution.charged-capacitors", "Charged capacitors",
                       "The bus capacitors hold " + format(energy, Unit::Joule, 2) +
                           " at the highest voltage and stay charged after the battery is disconnected. Fit a "
                           "bleed resistor and measure the bus before touching it.",
                       "the design has bus capacitance"});
    }
    const bool liveTab = d.bank.device.tabLive || d.bank.freewheelDiode.tabLive;
    if (liveTab && !d.heatsink.insulatedFromTabs)
        out.push_back({"caution.live-heatsink", "Live heatsink",
                       "Device tabs are tied to drain/collector or cathode and the heatsink is not insulated from "
                       "them: the heatsink sits at bus potential. Insulate it from the frame and from touch, or "
                       "use insulating pads and check their dielectric strength.",
                       "a live tab touches an uninsulated heatsink"});
    double hottestSink = 0.0;
    for (const auto& op : r.operatingPoints)
        hottestSink = std::max(hottestSink, op.heatsinkTemperature_C);
    if (d.heatsink.exposed && hottestSink > 48.0)
        out.push_back({"caution.hot-surface", "Hot surfaces",
                       "The heatsink reaches " + format(hottestSink, Unit::Celsius, 3) +
                           "; bare metal above about 48 °C can burn on long contact and above about 65 °C within a "
                           "second (ISO 13732-1, from memory). Guard it or mark it.",
                       "the exposed heatsink runs above the long-contact burn threshold"});
    out.push_back({"caution.moving-machine", "Rotating machinery and runaway",
                   "A failed-short bank runs the motor at full speed with PWM off. Fit an emergency disconnect "
                   "that breaks the full stall current at the highest voltage, within reach of the operator, and "
                   "test it. Lift driven wheels or block the machine on the bench.",
                   "always: the drive moves a machine"});
    if (d.reversing.present)
        out.push_back({"caution.reverse-at-rest", "Reverse only at rest",
                       "Never change direction under load or while the motor turns: switch the PWM off, let the "
                       "current decay and the motor stop, then change over. The contactor is not made to break "
                       "armature current.",
                       "the design reverses with a contactor"});
    out.push_back({"caution.competent-person", "Your responsibility",
                   "Ampwright assists a competent person with calculations. It does not certify a design. Local "
                   "codes, the machine's or vehicle's regulations and licensed practice decide.",
                   "always"});
    return out;
}

} // namespace amp

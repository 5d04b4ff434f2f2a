// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/checks/catalogue.h"

#include "core/io/markdown.h"

#include <algorithm>

namespace amp {

namespace {

std::vector<CheckInfo> buildCatalogue() {
    return {
        // Input and model coverage
        {"design.input", "Input out of range",
         "each design field and duty-profile segment against its type and allowed range",
         "the field table (ampwright fields)", "the field named in the message", Severity::Fail},
        {"motor.operating-point", "Operating point out of reach",
         "the current or speed a segment asks for against what the supply can drive at the highest duty",
         "operating-point solve", "dutyProfile[i]", Severity::Fail},

        // Gate and base drive
        {"drive.weak-at-min-supply", "Drive at the lowest supply",
         "MOSFET: gate voltage at the lowest battery voltage against the gate voltage R_ds(on) is stated at; "
         "bipolar: base current there against I_C/β_F",
         "the part's R_ds(on) rating voltage; saturation I_B ≥ I_C/β_F (Gummel–Poon gain)", "drive.minSupply_V",
         Severity::Fail},
        {"drive.pulldown", "Gate pull-down", "whether each gate has a pull-down that turns the bank off when the drive "
         "is lost", "common practice: 4.7–22 kΩ gate to source", "drive.pulldown_ohm", Severity::Warning},
        {"drive.driver-peak", "Driver peak current",
         "peak gate current the bank draws from the driver against the driver's rating",
         "driver's rated peak current (drive.driverPeakCurrent_A)", "bank.gateResistor_ohm", Severity::Warning},

        // Switching stress
        {"switch.overshoot", "Turn-off overshoot",
         "turn-off peak V_bus + L·di/dt at the highest bus voltage against derating × the device's voltage "
         "rating (fail above the rating)",
         "layout.overshootDerating (about 80 %, common practice) × bank.device.voltageRating_V",
         "layout.loopLength_m", Severity::Fail},
        {"switch.avalanche", "Repetitive avalanche",
         "clamped energy ½·L·I²·V_BR/(V_BR − V_bus) per turn-off against the part's repetitive avalanche "
         "rating (warning whenever the device avalanches)",
         "the part's repetitive avalanche rating", "layout.commutationLoopInductance_H", Severity::Fail},
        {"switch.soa", "Safe operating area",
         "on-state voltage and current of each device against the part's SOA points",
         "the part's SOA points (bank.device.soa), log-log interpolation", "bank.count", Severity::Fail},
        {"switch.short-circuit", "Short-circuit withstand",
         "response time of the driver's short-circuit protection against the part's withstand time (advice "
         "when either is not stated)",
         "the part's short-circuit withstand time", "drive.shortCircuitResponse_s", Severity::Fail},

        // Bus capacitors
        {"capacitor.voltage", "Bus capacitor voltage",
         "highest bus voltage against derating × the capacitors' voltage rating",
         "layout.capacitorDerating (about 80 %, common practice)", "layout.capacitorVoltageRating_V",
         Severity::Fail},
        {"capacitor.ripple", "Bus capacitor ripple current",
         "RMS ripple current per capacitor against its rating", "the capacitors' ripple-current rating",
         "layout.capacitorCount", Severity::Fail},
        {"capacitor.temperature", "Bus capacitor temperature",
         "hot spot from the ESR loss against the capacitors' rated temperature",
         "the capacitors' rated temperature", "layout.capacitorCount", Severity::Fail},
        {"capacitor.decoupling", "Bus capacitors against the battery cable",
         "ripple frequency against the resonance of the battery-cable inductance with the bus capacitance",
         "current divider between cable inductance and capacitance (circuit theory)", "wiring.busCapacitance_F",
         Severity::Warning},
        {"bus.braking-rise", "Bus rise when braking without the battery",
         "bus peak when the battery is lost while braking through a synchronous bridge, against the lower of "
         "the switch and capacitor ratings",
         "L–C energy balance of the braking armature into the bus capacitors", "wiring.busCapacitance_F",
         Severity::Fail},

        // Temperatures
        {"thermal.switch-junction", "Switch junction temperature",
         "hottest switch junction against the part's T_j,max, warning inside a 15 K margin",
         "part rating; the 15 K margin is common practice", "bank.count", Severity::Fail},
        {"thermal.diode-junction", "Freewheel diode junction temperature",
         "freewheel diode junction against its T_j,max, warning inside a 15 K margin",
         "part rating; the 15 K margin is common practice", "bank.diodeCount", Severity::Fail},

        // The bank
        {"bank.current-derating", "Device current against its derated rating",
         "on-state current of the most loaded device against derating × rated current (fail above the "
         "rating itself)",
         "common practice: one third to one half of the rating (bank.derating)", "bank.count", Severity::Fail},
        {"bank.lead-limit", "Package lead current",
         "RMS current in the leads of the most loaded device against the package lead limit",
         "part's lead limit; TO-220-class leads carry about 75–100 A (common practice)", "bank.count",
         Severity::Fail},
        {"bank.runaway", "Thermal runaway",
         "electrothermal loop gain (largest eigenvalue of ∂P/∂T·Z_th, bank current and duty held) against 1, "
         "or no fixed point below T_j,max",
         "stability of the electrothermal fixed point (core/bank/)", "bank.ballast_ohm", Severity::Fail},
        {"bank.sharing", "Current sharing",
         "ratio of the highest to the lowest device current against the sharing target",
         "bank.sharingTarget (user's choice; 1.05–1.2 typical)", "bank.ballast_ohm", Severity::Warning},
        {"bank.spread-runaway", "Runaway across the parts' spread",
         "share of the Monte Carlo banks drawn from bank.spread that run away or pass T_j,max, and the "
         "worst-case corner (full evaluation only)",
         "this tool's rule, not a standard: fail at 1 % of the samples or more, warning below that or when "
         "only the corner runs away",
         "bank.ballast_ohm", Severity::Fail},
        {"bank.runaway-margin", "Headroom to the runaway onset",
         "the point's on-state bank current against the load where the bank starts to run away (full "
         "evaluation, when an onset is found below the current limit)",
         "this tool's choice: warning when the load is above 80 % of the onset, 20 % headroom for ambient, "
         "heatsink and part spread the onset leaves out",
         "bank.ballast_ohm", Severity::Warning},

        // Chopper and motor
        {"chopper.discontinuous", "Discontinuous conduction",
         "lowest instantaneous armature current against zero within a PWM period",
         "exact chopper waveform", "pwm.frequency_Hz", Severity::Advice},
        {"motor.demagnetisation", "Magnet demagnetisation",
         "peak armature current against the current the magnets tolerate",
         "motor.demagCurrent_A as stated for the motor", "pwm.currentLimit_A", Severity::Fail},

        // Reversing contactor and its sequence
        {"contactor.reversal-at-speed", "Change-over while the motor turns",
         "current (E − V_f)/R driven through the freewheel diode and contacts if the contactor changes over at "
         "the speed the sequence allows, PWM off",
         "circuit of the freewheel path with the armature swapped", "reversing.stopSpeed_rpm", Severity::Fail},
        {"contactor.plugging", "Restart into a turning motor",
         "restart current (D·V + E)/R when the sequence lets the motor restart before it has stopped, against "
         "the current limit",
         "circuit at restart; the controller's current limit", "reversing.waitForStop", Severity::Fail},
        {"contactor.slow-down", "Long coast-down before a reversal",
         "time for the motor and load to coast to the change-over speed on the motor's no-load torque alone",
         "J·Δω/T (rotation); 5 s taken as long", "reversing.retardingTorque_Nm", Severity::Advice},
        {"contactor.continuous", "Contactor thermal current",
         "contactor thermal current against the motor's RMS current over the repeating duty profile (warning "
         "below 1.25×, fail below 1×)",
         "common practice: 25 % above the continuous current", "reversing.contactor.continuousCurrent_A",
         Severity::Fail},
        {"contactor.coil-voltage", "Contactor coil voltage",
         "lowest and highest coil voltage against the coil's operating band",
         "IEC 60947-4-1 operating band, 85–110 % of rated (from memory)", "reversing.contactor.coilVoltage_V",
         Severity::Warning},
        {"contactor.break-load", "Contactor must not break load",
         "armature L/R against the test-circuit L/R of the contactor's DC utilisation category",
         "IEC 60947-4-1 DC utilisation categories", "reversing.category", Severity::Advice},
        {"contactor.life", "Contactor electrical life",
         "electrical life in years at the stated reversals per day against one year",
         "part's electrical life / (reversals per day × 365)", "reversing.contactor.electricalLife_ops",
         Severity::Advice},

        // Main disconnect and pre-charge
        {"disconnect.voltage", "Main disconnect voltage rating",
         "main contactor DC voltage rating against the highest bus voltage", "highest bus voltage (supply.max_V)",
         "wiring.mainContactor.ratedVoltage_V", Severity::Fail},
        {"disconnect.breaking", "Main disconnect breaking capacity",
         "main contactor DC breaking capacity against the stall current with the bank failed short and the "
         "prospective short-circuit current (warning when not stated)",
         "Ohm's law over the battery, cable and motor resistances at the highest voltage",
         "wiring.mainContactor.dcBreaking_A", Severity::Fail},
        {"precharge.inrush", "Bus capacitor inrush",
         "current when the main contactor closes onto the bus capacitors (uncharged without pre-charge, or the "
         "remaining step after it) against the contactor's rating",
         "RC charge through the battery and wiring; contacts weld on large inrush (common practice)",
         "wiring.prechargePresent", Severity::Fail},

        // Cables
        {"cable.drop", "Cable voltage drop",
         "drop along the battery or motor cable at the highest current against the allowed drop",
         "IEC 60228 class 5 resistance at the conductor temperature; allowed drop as stated",
         "wiring.batteryCable_mm2", Severity::Warning},
        {"cable.temperature", "Cable conductor temperature",
         "conductor temperature over the repeating duty profile against the insulation's limit",
         "IEC 60364-5-52 Table 52.1 conductor limits; still-air heat balance (estimate)",
         "wiring.batteryCable_mm2", Severity::Fail},

        // Battery fuse
        {"fuse.present", "Battery fuse stated",
         "whether a battery fuse is stated, against the prospective short-circuit current",
         "battery short circuit V_max/(R_bat + R_cable)", "wiring.fuseRating_A", Severity::Warning},
        {"fuse.voltage", "Fuse DC voltage rating",
         "fuse DC voltage rating against the highest bus voltage", "highest bus voltage; a DC arc has no current zero",
         "wiring.fuseVoltage_V", Severity::Fail},
        {"fuse.continuous", "Fuse continuous rating",
         "fuse rating against the battery's RMS current over the repeating duty profile (warning below 1.25×, "
         "fail below 1×)",
         "common practice: 25 % above the continuous current", "wiring.fuseRating_A", Severity::Fail},
        {"fuse.segment-current", "Segment above the fuse rating",
         "highest battery current of a segment against the fuse rating",
         "the fuse's time–current curve (maker's data)", "wiring.fuseRating_A", Severity::Advice},
        {"fuse.cable", "Fuse protects the cable",
         "fuse rating against the battery cable's ampacity", "IEC 60364-4-43 §433.1: I_B ≤ I_n ≤ I_z",
         "wiring.batteryCable_mm2", Severity::Fail},
        {"fuse.breaking", "Fuse breaking capacity",
         "fuse DC breaking capacity against the prospective short-circuit current (warning when not stated)",
         "V_max/(R_bat + R_cable), cable at 20 °C", "wiring.fuseBreaking_A", Severity::Fail},
        {"fuse.i2t-cable", "Fuse I²t against the cable",
         "fuse clearing I²t against the battery cable's adiabatic withstand k²S²",
         "IEC 60364-4-43 §434.5.2", "wiring.fuseI2t_A2s", Severity::Fail},
        {"fuse.i2t-bank", "Fuse I²t against the bank",
         "fuse clearing I²t against the bank's stated short-circuit withstand",
         "the bank's stated withstand (wiring.bankWithstandI2t_A2s)", "wiring.fuseI2t_A2s", Severity::Fail},
        // Heatsink, insulation and touch
        {"heatsink.geometry", "Heatsink geometry",
         "the plate-fin heatsink's dimensions against each other (fins that fit on the base, …)",
         "the plate-fin model's geometry", "heatsink.geometry", Severity::Fail},
        {"heatsink.fin-spacing", "Fin spacing",
         "the gap between fins against the optimum for natural convection",
         "Bar-Cohen & Rohsenow optimum spacing S_opt = 2.714·L/Ra_L^¼", "heatsink.geometry.finCount",
         Severity::Advice},
        {"interface.dielectric", "Insulating pad strength",
         "breakdown voltage of the insulating layer (strength × thickness) against the highest bus voltage "
         "(fail) and 2·V_max + 1000 V (warning)",
         "dielectric test voltage of basic insulation (common practice, from memory)",
         "bank.interface.dielectricStrength_Vperm", Severity::Fail},
        {"interface.creepage", "Creepage along the insulator",
         "the surface distance a live tab needs to the heatsink at the highest bus voltage (stated for the "
         "builder to keep)",
         "IEC 60664-1 Table F.4, pollution degree 2, material group III", "bank.interface", Severity::Advice,
         true},
        {"heatsink.tab-short", "Tabs shorted by the heatsink",
         "whether live tabs of different circuit nodes sit bare on one heatsink",
         "the circuit: drain/collector and cathode are different nodes", "bank.interface.insulating",
         Severity::Fail},
        {"heatsink.live-touch-voltage", "Live heatsink",
         "voltage of a heatsink tied to a live tab against the touch limit (60 V DC dry, 30 V DC wet)",
         "IEC 60364-4-41 §414.4.5 (from memory)", "bank.interface.insulating", Severity::Fail},
        {"heatsink.touch-temperature", "Heatsink touch temperature",
         "hottest heatsink temperature against the burn thresholds of bare metal",
         "ISO 13732-1 (from memory): 65 °C for 1 s … 48 °C for 10 min", "heatsink.exposed", Severity::Fail},

        // Transients and life
        {"thermal.stall-time", "Time to the junction limit at stall",
         "time a stall at the current limit takes to bring a junction to its T_j,max, against the longest "
         "stall of the duty profile",
         "transient of the Foster networks and the heatsink's heat capacity", "pwm.currentLimit_A",
         Severity::Fail},
        {"thermal.transient-junction", "Switch junction over the duty profile",
         "highest switch junction temperature of the duty-profile transient against T_j,max (warning inside "
         "15 K)",
         "part rating; the 15 K margin is common practice", "bank.count", Severity::Fail},
        {"thermal.transient-diode-junction", "Diode junction over the duty profile",
         "highest freewheel diode junction of the duty-profile transient against its T_j,max (warning "
         "inside 15 K)",
         "part rating; the 15 K margin is common practice", "bank.diodeCount", Severity::Fail},
        {"thermal.cycling-life", "Power-cycling life",
         "hours of this duty until the most stressed junction wears out by temperature cycling",
         "Held et al. (PEDS 1997) with Miner's rule; uncertain by an order of magnitude", "bank.count",
         Severity::Advice, true},

        {"protection.input", "Protection input out of range",
         "inputs of the contactor, reversal, disconnect, pre-charge, cable and fuse models against their ranges",
         "the models' input ranges", "the field named in the message", Severity::Fail},
    };
}

} // namespace

const std::vector<CheckInfo>& checkCatalogue() {
    static const std::vector<CheckInfo> catalogue = buildCatalogue();
    return catalogue;
}

const CheckInfo* findCheckInfo(std::string_view id) {
    const auto& list = checkCatalogue();
    const auto it = std::find_if(list.begin(), list.end(), [&](const CheckInfo& c) { return c.id == id; });
    return it == list.end() ? nullptr : &*it;
}

std::string checksMarkdown() {
    std::string out = "| id | check | compares | limit from | change first | at worst |\n"
                      "| --- | --- | --- | --- | --- | --- |\n";
    for (const auto& c : checkCatalogue())
        out += "| `" + c.id + "` | " + markdownCell(c.title) + " | " + markdownCell(c.compares) + " | " +
               markdownCell(c.limitSource) + " | " +
               (c.field.find(' ') == std::string::npos ? "`" + markdownCell(c.field) + "`"
                                                       : markdownCell(c.field)) +
               " | " + toString(c.highest) + (c.informational ? " (always, when it applies)" : "") + " |\n";
    return out;
}

} // namespace amp

// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/checks/catalogue.h"

#include <algorithm>

namespace amp {

namespace {

std::vector<CheckInfo> buildCatalogue() {
    return {
        // Input and model coverage
        {"design.input", "Input out of range",
         "each design field and duty-profile segment against its type and allowed range",
         "the field table (ampwright fields)", "the field named in the message", Severity::Fail},
        {"model.topology", "Topology not modelled yet",
         "the chosen topology against the topologies the engine computes",
         "engine coverage", "pwm.topology", Severity::Warning},
        {"motor.operating-point", "Operating point out of reach",
         "the current or speed a segment asks for against what the supply can drive at the highest duty",
         "operating-point solve", "dutyProfile[i]", Severity::Fail},

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
        {"bank.thermal-runaway", "Thermal runaway",
         "electrothermal loop gain (spectral radius of ∂P/∂T·Z_th, motor current held) against 1, or no "
         "thermal fixed point",
         "stability of the electrothermal fixed point", "bank.ballast_ohm", Severity::Fail},
        {"bank.sharing", "Current sharing",
         "ratio of the highest to the lowest device current against the sharing target",
         "bank.sharingTarget (user's choice; 1.05–1.2 typical)", "bank.ballast_ohm", Severity::Warning},

        // Chopper and motor
        {"chopper.discontinuous", "Discontinuous conduction",
         "lowest instantaneous armature current against zero within a PWM period",
         "exact chopper waveform", "pwm.frequency_Hz", Severity::Advice},
        {"motor.demagnetisation", "Magnet demagnetisation",
         "peak armature current against the current the magnets tolerate",
         "motor.demagCurrent_A as stated for the motor", "pwm.currentLimit_A", Severity::Fail},
    };
}

std::string cell(std::string text) {
    // Keep a Markdown table cell on one line and its pipes literal.
    std::string out;
    for (char c : text) {
        if (c == '|')
            out += "\\|";
        else if (c == '\n')
            out += ' ';
        else
            out += c;
    }
    return out;
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
        out += "| `" + c.id + "` | " + cell(c.title) + " | " + cell(c.compares) + " | " + cell(c.limitSource) +
               " | " + (c.field.find(' ') == std::string::npos ? "`" + cell(c.field) + "`" : cell(c.field)) + " | " +
               toString(c.highest) + " |\n";
    return out;
}

} // namespace amp

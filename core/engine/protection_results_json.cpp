// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/engine/protection_results_json.h"

#include <nlohmann/json.hpp>

namespace amp {

namespace {
using nlohmann::json;

json opt(const std::optional<double>& v) {
    return v ? json(*v) : json(nullptr);
}

json cableJson(const CableSummary& c) {
    return {{"name", c.name},
            {"crossSection_mm2", c.crossSection_mm2},
            {"drop_V", c.drop_V},
            {"loss_W", c.loss_W},
            {"conductorTemperature_C", c.conductorTemperature_C},
            {"ampacity_A", c.ampacity_A},
            {"requiredCrossSection_mm2", opt(c.requiredCrossSection_mm2)}};
}
} // namespace

void addProtectionJson(const ProtectionResults& p, nlohmann::json& j) {
    j["reversal"] = nullptr;
    if (const auto& r = p.reversal) {
        json steps = json::array();
        for (const auto& s : r->steps)
            steps.push_back({{"name", s.name}, {"duration_s", s.duration_s}});
        j["reversal"] = {{"fromPoint", r->fromPoint},
                         {"steps", steps},
                         {"total_s", r->total_s},
                         {"coilDropout_s", r->coilDropout_s},
                         {"changeoverSpeed_rpm", r->changeoverSpeed_rpm},
                         {"changeoverAtSpeedCurrent_A", r->changeoverAtSpeedCurrent_A},
                         {"pluggingCurrent_A", r->pluggingCurrent_A},
                         {"allowsReversalAboveStop", r->allowsReversalAboveStop}};
    }
    j["contactor"] = nullptr;
    if (const auto& c = p.contactor)
        j["contactor"] = {{"motorTimeConstant_s", c->motorTimeConstant_s},
                          {"categoryTimeConstant_s", c->categoryTimeConstant_s},
                          {"continuousMargin", opt(c->continuousMargin)},
                          {"mustNotBreakLoad", c->mustNotBreakLoad},
                          {"reason", c->reason},
                          {"coilCurrent_A", c->coilCurrent_A},
                          {"coilPower_W", c->coilPower_W},
                          {"contactLoss_W", c->contactLoss_W},
                          {"electricalLife_years", opt(c->electricalLife_years)}};
    j["mainDisconnect"] = nullptr;
    if (const auto& d = p.mainDisconnect)
        j["mainDisconnect"] = {{"requiredBreak_A", d->requiredBreak_A},
                               {"stallCurrent_A", d->stallCurrent_A},
                               {"shortCircuitCurrent_A", d->shortCircuitCurrent_A}};
    j["precharge"] = nullptr;
    if (const auto& q = p.precharge)
        j["precharge"] = {{"present", q->present},
                          {"resistor_ohm", q->resistor_ohm},
                          {"time_s", q->time_s},
                          {"peakCurrent_A", q->peakCurrent_A},
                          {"peakPower_W", q->peakPower_W},
                          {"energy_J", q->energy_J},
                          {"closingCurrent_A", q->closingCurrent_A},
                          {"inrushUncharged_A", q->inrushUncharged_A}};
    j["cable"] = p.cable ? cableJson(*p.cable) : json(nullptr);
    j["motorCable"] = p.motorCable ? cableJson(*p.motorCable) : json(nullptr);
    j["fuse"] = nullptr;
    if (const auto& f = p.fuse)
        j["fuse"] = {{"prospectiveShortCircuit_A", f->prospectiveShortCircuit_A},
                     {"continuousMargin", opt(f->continuousMargin)},
                     {"cableWithstand_A2s", f->cableWithstand_A2s}};
    json options = json::array();
    for (const auto& o : p.bridgeComparison)
        options.push_back({{"id", o.id},
                           {"name", o.name},
                           {"switchCount", o.switchCount},
                           {"diodeCount", o.diodeCount},
                           {"contactorCount", o.contactorCount},
                           {"conductionLoss_W", o.conductionLoss_W},
                           {"reversal_s", o.reversal_s},
                           {"braking", o.braking},
                           {"cost", o.cost},
                           {"costComplete", o.costComplete}});
    j["bridgeComparison"] = options;
}

} // namespace amp

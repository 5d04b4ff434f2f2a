// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/engine/results_json.h"
#include "core/engine/protection_results_json.h"
#include "core/engine/resultsjson_numbers.h"
#include "core/engine/stage_thermal.h"

#include <nlohmann/json.hpp>

#include <optional>
#include <string>

namespace amp {

namespace {

using nlohmann::json;

// Every number goes through here (null and a warning for a non-finite one).
using resultsjson::number;

json deviceJson(const DeviceResult& d, const std::string& where) {
    json j;
    j["bank"] = d.bank;
    j["current_A"] = number(d.current_A, where + ".current_A");
    j["averageCurrent_A"] = number(d.averageCurrent_A, where + ".averageCurrent_A");
    j["rmsCurrent_A"] = number(d.rmsCurrent_A, where + ".rmsCurrent_A");
    j["share"] = number(d.share, where + ".share");
    j["ratingShare"] = number(d.ratingShare, where + ".ratingShare");
    j["voltage_V"] = number(d.voltage_V, where + ".voltage_V");
    j["conduction_W"] = number(d.conduction_W, where + ".conduction_W");
    j["switching_W"] = number(d.switching_W, where + ".switching_W");
    j["diode_W"] = number(d.diode_W, where + ".diode_W");
    j["ballast_W"] = number(d.ballast_W, where + ".ballast_W");
    j["leg_W"] = number(d.leg_W, where + ".leg_W");
    j["drive_W"] = number(d.drive_W, where + ".drive_W");
    j["loss_W"] = number(d.loss_W, where + ".loss_W");
    j["tj_C"] = number(d.tj_C, where + ".tj_C");
    j["tcase_C"] = number(d.tcase_C, where + ".tcase_C");
    return j;
}

json bankJson(const BankResult& b, const std::string& where) {
    json j;
    j["converged"] = b.converged;
    j["failure"] = b.failure;
    j["stable"] = b.stable;
    j["loopGain"] = number(b.loopGain, where + ".loopGain");
    j["dominantMode"] = b.dominantMode;
    j["runawayLoad_A"] = number(b.runawayLoad_A, where + ".runawayLoad_A");
    j["firstToFail"] = b.firstToFail ? json(*b.firstToFail) : json(nullptr);
    j["maxMinCurrentRatio"] = number(b.maxMinCurrentRatio, where + ".maxMinCurrentRatio");
    j["minimumBallast_ohm"] = number(b.minimumBallast_ohm, where + ".minimumBallast_ohm");
    json ballast = json::array();
    for (std::size_t k = 0; k < b.minimumBallastPower_W.size(); ++k)
        ballast.push_back(number(b.minimumBallastPower_W[k], where + ".minimumBallastPower_W"));
    j["minimumBallastPower_W"] = std::move(ballast);
    j["minimumBallastEfficiencyCost"] = number(b.minimumBallastEfficiencyCost, where + ".minimumBallastEfficiencyCost");
    j["switchingImbalance_W"] = number(b.switchingImbalance_W, where + ".switchingImbalance_W");
    if (b.spread) {
        const BankSpreadResult& s = *b.spread;
        auto pct = [&](const BankPercentiles& p, const std::string& at) {
            json o;
            o["p50"] = number(p.p50, at + ".p50");
            o["p95"] = number(p.p95, at + ".p95");
            o["p99"] = number(p.p99, at + ".p99");
            return o;
        };
        json o;
        o["samples"] = s.samples;
        o["seed"] = s.seed;
        o["tjMax_C"] = pct(s.tjMax_C, where + ".spread.tjMax_C");
        o["maxShare"] = pct(s.maxShare, where + ".spread.maxShare");
        o["runawayFraction"] = number(s.runawayFraction, where + ".spread.runawayFraction");
        o["cornerTjMax_C"] = number(s.cornerTjMax_C, where + ".spread.cornerTjMax_C");
        o["cornerMaxMinCurrentRatio"] = number(s.cornerMaxMinCurrentRatio, where + ".spread.cornerMaxMinCurrentRatio");
        o["cornerDevice"] = s.cornerDevice ? json(*s.cornerDevice) : json(nullptr);
        j["spread"] = std::move(o);
    } else {
        j["spread"] = nullptr;
    }
    return j;
}

json pointJson(const OperatingPointResult& p, const std::string& where) {
    json j;
    auto put = [&](const char* key, double v) { j[key] = number(v, where + "." + key); };
    j["name"] = p.name;
    j["mode"] = p.mode;
    j["valid"] = p.valid;
    j["notes"] = p.notes;
    j["currentLimited"] = p.currentLimited;
    put("motorCurrent_A", p.motorCurrent_A);
    put("batteryCurrent_A", p.batteryCurrent_A);
    put("duty", p.duty);
    put("speed_rpm", p.speed_rpm);
    put("torque_Nm", p.torque_Nm);
    put("backEmf_V", p.backEmf_V);
    put("busVoltage_V", p.busVoltage_V);
    put("ripplePeakToPeak_A", p.ripplePeakToPeak_A);
    put("motorPeakCurrent_A", p.motorPeakCurrent_A);
    put("motorMinCurrent_A", p.motorMinCurrent_A);
    put("rippleLinear_A", p.rippleLinear_A);
    j["conductionMode"] = p.conductionMode;
    put("motorRmsCurrent_A", p.motorRmsCurrent_A);
    put("switchAverageCurrent_A", p.switchAverageCurrent_A);
    put("switchRmsCurrent_A", p.switchRmsCurrent_A);
    put("diodeAverageCurrent_A", p.diodeAverageCurrent_A);
    put("diodeRmsCurrent_A", p.diodeRmsCurrent_A);
    put("capacitorRmsCurrent_A", p.capacitorRmsCurrent_A);
    put("busCapacitorRipple_A", p.busCapacitorRipple_A);
    put("overshoot_V", p.overshoot_V);
    put("avalancheEnergy_J", p.avalancheEnergy_J);
    put("inputPower_W", p.inputPower_W);
    put("batteryLoss_W", p.batteryLoss_W);
    put("motorInputPower_W", p.motorInputPower_W);
    put("mechanicalPower_W", p.mechanicalPower_W);
    put("motorCopperLoss_W", p.motorCopperLoss_W);
    put("motorCableLoss_W", p.motorCableLoss_W);
    put("contactorLoss_W", p.contactorLoss_W);
    put("baseDrive_W", p.baseDrive_W);
    put("motorMechanicalLoss_W", p.motorMechanicalLoss_W);
    put("bankLoss_W", p.bankLoss_W);
    put("totalLoss_W", p.totalLoss_W);
    j["efficiency"] = number(p.efficiency, where + ".efficiency");
    put("heatsinkTemperature_C", p.heatsinkTemperature_C);
    json devices = json::array();
    for (std::size_t k = 0; k < p.devices.size(); ++k)
        devices.push_back(deviceJson(p.devices[k], where + ".devices[" + std::to_string(k) + "]"));
    j["devices"] = std::move(devices);
    json diode;
    diode["averageCurrent_A"] = number(p.freewheelDiode.averageCurrent_A, where + ".freewheelDiode.averageCurrent_A");
    diode["rmsCurrent_A"] = number(p.freewheelDiode.rmsCurrent_A, where + ".freewheelDiode.rmsCurrent_A");
    diode["loss_W"] = number(p.freewheelDiode.loss_W, where + ".freewheelDiode.loss_W");
    diode["tj_C"] = number(p.freewheelDiode.tj_C, where + ".freewheelDiode.tj_C");
    j["freewheelDiode"] = std::move(diode);
    j["bank"] = bankJson(p.bank, where + ".bank");
    return j;
}

json checkJson(const Check& c, const std::string& where) {
    json j;
    j["id"] = c.id;
    j["severity"] = toString(c.severity);
    j["value"] = number(c.value, where + ".value");
    j["limit"] = number(c.limit, where + ".limit");
    j["unit"] = c.unit;
    j["source"] = c.source;
    j["message"] = c.message;
    j["fix"] = c.fix;
    j["field"] = c.field;
    j["operatingPoint"] = c.operatingPoint;
    return j;
}

} // namespace

nlohmann::json resultsToJson(const Results& results) {
    json j;
    j["formatVersion"] = results.formatVersion;
    j["design"] = results.design;
    j["variant"] = results.variant;
    j["topology"] = results.topology;
    json points = json::array();
    for (std::size_t i = 0; i < results.operatingPoints.size(); ++i)
        points.push_back(pointJson(results.operatingPoints[i], "operatingPoints[" + std::to_string(i) + "]"));
    j["operatingPoints"] = std::move(points);
    json checks = json::array();
    for (std::size_t i = 0; i < results.checks.size(); ++i)
        checks.push_back(checkJson(results.checks[i], "checks[" + std::to_string(i) + "]"));
    j["checks"] = std::move(checks);
    j["worstSeverity"] = toString(worstSeverity(results.checks));
    j["maxJunction_C"] = number(results.maxJunction_C, "maxJunction_C");
    j["maxTotalLoss_W"] = number(results.maxTotalLoss_W, "maxTotalLoss_W");
    j["warnings"] = results.warnings;
    addProtectionJson(results.protection, j);
    addThermalJson(results, j);
    return j;
}

} // namespace amp

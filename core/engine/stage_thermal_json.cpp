// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/engine/stage_thermal.h"

#include <nlohmann/json.hpp>
#include <spdlog/spdlog.h>

#include <cmath>

namespace amp {

namespace {

using nlohmann::json;

// Non-finite numbers never reach the file (as in results_json.cpp).
json number(double v, const char* where) {
    if (std::isfinite(v))
        return v;
    spdlog::warn("results JSON: non-finite value at {} written as null", where);
    return nullptr;
}

json number(const std::optional<double>& v, const char* where) {
    return v ? number(*v, where) : json(nullptr);
}

json series(const std::vector<double>& v, const char* where) {
    json a = json::array();
    for (double x : v)
        a.push_back(number(x, where));
    return a;
}

} // namespace

void addThermalJson(const Results& r, nlohmann::json& out) {
    if (r.heatsink) {
        const HeatsinkSummary& h = *r.heatsink;
        json j;
        j["mode"] = h.mode;
        j["rthSa_KperW"] = number(h.rthSa_KperW, "heatsink.rthSa_KperW");
        j["temperature_C"] = number(h.temperature_C, "heatsink.temperature_C");
        j["operatingPoint"] = h.operatingPoint;
        j["heat_W"] = number(h.heat_W, "heatsink.heat_W");
        j["heatCapacity_JperK"] = number(h.heatCapacity_JperK, "heatsink.heatCapacity_JperK");
        j["finSpacing_m"] = number(h.finSpacing_m, "heatsink.finSpacing_m");
        j["optimumFinSpacing_m"] = number(h.optimumFinSpacing_m, "heatsink.optimumFinSpacing_m");
        j["optimumFinCount"] = number(h.optimumFinCount, "heatsink.optimumFinCount");
        j["notes"] = h.notes;
        out["heatsink"] = std::move(j);
    } else {
        out["heatsink"] = nullptr;
    }

    if (r.transient) {
        const TransientSummary& t = *r.transient;
        json j;
        j["sources"] = t.sources;
        j["tjMax_C"] = number(t.tjMax_C, "transient.tjMax_C");
        j["tjMaxTime_s"] = number(t.tjMaxTime_s, "transient.tjMaxTime_s");
        j["tjMaxSource"] = t.tjMaxSource;
        j["heatsinkMax_C"] = number(t.heatsinkMax_C, "transient.heatsinkMax_C");
        j["heatsinkMaxTime_s"] = number(t.heatsinkMaxTime_s, "transient.heatsinkMaxTime_s");
        j["time_s"] = series(t.time_s, "transient.time_s");
        json tj = json::array();
        for (const auto& s : t.tj_C)
            tj.push_back(series(s, "transient.tj_C"));
        j["tj_C"] = std::move(tj);
        j["heatsink_C"] = series(t.heatsink_C, "transient.heatsink_C");
        j["repetitions"] = t.repetitions;
        j["periodic"] = t.periodic;
        j["steps"] = t.steps;
        j["fullSolves"] = t.fullSolves;
        out["transient"] = std::move(j);
    } else {
        out["transient"] = nullptr;
    }

    out["stallTimeToLimit_s"] = number(r.stallTimeToLimit_s, "stallTimeToLimit_s");

    if (r.life) {
        const LifeSummary& l = *r.life;
        json j;
        j["source"] = l.source;
        json cycles = json::array();
        for (const auto& c : l.cycles) {
            json cj;
            cj["range_K"] = number(c.range_K, "life.cycles.range_K");
            cj["mean_C"] = number(c.mean_C, "life.cycles.mean_C");
            cj["count"] = number(c.count, "life.cycles.count");
            cj["cyclesToFailure"] = number(c.cyclesToFailure, "life.cycles.cyclesToFailure");
            cycles.push_back(std::move(cj));
        }
        j["cycles"] = std::move(cycles);
        j["damagePerRepetition"] = number(l.damagePerRepetition, "life.damagePerRepetition");
        j["repetitionsToEnd"] = number(l.repetitionsToEnd, "life.repetitionsToEnd");
        j["hoursToEnd"] = number(l.hoursToEnd, "life.hoursToEnd");
        j["note"] = l.note;
        out["life"] = std::move(j);
    } else {
        out["life"] = nullptr;
    }
}

} // namespace amp

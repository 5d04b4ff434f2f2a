// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/engine/stage_thermal.h"

#include "core/engine/resultsjson_numbers.h"

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <string>
#include <string_view>

namespace amp {

namespace {

using nlohmann::json;

// Non-finite numbers never reach the file (null and a warning, as everywhere in the results).
using resultsjson::number;
using resultsjson::series;

// Writes the numbers of one object of the file under their keys; a non-finite one is named
// "<section>.<key>" in the warning.
class Fields {
  public:
    Fields(json& j, std::string_view section) : m_j(j), m_section(section) {}

    template <class Number>
    void number(const char* key, const Number& v) {
        m_j[key] = resultsjson::number(v, where(key));
    }
    void series(const char* key, const std::vector<double>& v) {
        m_j[key] = resultsjson::series(v, where(key));
    }

  private:
    std::string where(const char* key) const { return fmt::format("{}.{}", m_section, key); }

    json& m_j;
    std::string_view m_section;
};

} // namespace

void addThermalJson(const Results& r, nlohmann::json& out) {
    if (r.heatsink) {
        const HeatsinkSummary& h = *r.heatsink;
        json j;
        Fields f(j, "heatsink");
        j["mode"] = h.mode;
        f.number("rthSa_KperW", h.rthSa_KperW);
        f.number("temperature_C", h.temperature_C);
        j["operatingPoint"] = h.operatingPoint;
        f.number("heat_W", h.heat_W);
        f.number("heatCapacity_JperK", h.heatCapacity_JperK);
        f.number("finSpacing_m", h.finSpacing_m);
        f.number("optimumFinSpacing_m", h.optimumFinSpacing_m);
        f.number("optimumFinCount", h.optimumFinCount);
        j["notes"] = h.notes;
        out["heatsink"] = std::move(j);
    } else {
        out["heatsink"] = nullptr;
    }

    if (r.transient) {
        const TransientSummary& t = *r.transient;
        json j;
        Fields f(j, "transient");
        j["sources"] = t.sources;
        f.number("tjMax_C", t.tjMax_C);
        f.number("tjMaxTime_s", t.tjMaxTime_s);
        j["tjMaxSource"] = t.tjMaxSource;
        f.number("heatsinkMax_C", t.heatsinkMax_C);
        f.number("heatsinkMaxTime_s", t.heatsinkMaxTime_s);
        f.series("time_s", t.time_s);
        json tj = json::array();
        for (const auto& s : t.tj_C)
            tj.push_back(series(s, "transient.tj_C"));
        j["tj_C"] = std::move(tj);
        f.series("heatsink_C", t.heatsink_C);
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
        Fields f(j, "life");
        j["source"] = l.source;
        json cycles = json::array();
        for (const auto& c : l.cycles) {
            json cj;
            Fields fc(cj, "life.cycles");
            fc.number("range_K", c.range_K);
            fc.number("mean_C", c.mean_C);
            fc.number("count", c.count);
            fc.number("cyclesToFailure", c.cyclesToFailure);
            cycles.push_back(std::move(cj));
        }
        j["cycles"] = std::move(cycles);
        f.number("damagePerRepetition", l.damagePerRepetition);
        f.number("repetitionsToEnd", l.repetitionsToEnd);
        f.number("hoursToEnd", l.hoursToEnd);
        j["note"] = l.note;
        out["life"] = std::move(j);
    } else {
        out["life"] = nullptr;
    }
}

} // namespace amp

// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The thermal stage of evaluate(). Before the operating points: the heatsink as the steady chain
// sees it (stated R_th,sa with its optional rise exponent, or a plate-fin extrusion). After them:
// the heatsink summary at the hottest point, the insulation, creepage, live-heatsink and
// touch-temperature checks, the stall time to the junction limit, and — in a full evaluation —
// the duty-profile transient of every junction and the heatsink, and the power-cycling life.
// The models live in core/thermal/; this file only joins them to the design and the results.

#include "core/engine/results.h"
#include "core/model/design.h"
#include "core/model/problem.h"
#include "core/thermal/heatsink.h"

#include <nlohmann/json_fwd.hpp>

#include <cstddef>
#include <functional>
#include <map>
#include <vector>

namespace amp {

/// The heatsink as the engine uses it.
class HeatsinkModel {
  public:
    HeatsinkModel() = default;
    explicit HeatsinkModel(const Design& d);

    /// R_th,sa (mounting surface to ambient) for a heat load. Geometry mode: the plate-fin model
    /// solved on a grid of heat loads 1/16 decade apart and interpolated log-log between them
    /// (the grid points are solved once, when first needed).
    double rthSa(double heat_W) const;
    double heatCapacity_JperK() const { return m_capacity_JperK; }
    bool geometryMode() const { return m_geometry; }
    /// Geometry problems, paths from the design root; the stated part stands in while any remain.
    const std::vector<Problem>& problems() const { return m_problems; }
    /// Direct plate-fin solve at a heat load (geometry mode).
    thermal::PlateFinResult solve(double heat_W) const;
    /// R_th,sa versus rise, for transients, up to a heat load.
    thermal::RsaCurve curve(double maxHeat_W) const;

  private:
    bool m_geometry = false;
    thermal::StatedHeatsink m_stated;
    thermal::PlateFinInput m_plateFin;
    double m_capacity_JperK = 0.0;
    std::vector<Problem> m_problems;
    mutable std::map<int, double> m_grid; ///< log-heat index -> R_th,sa
};

/// Per-unit losses of every heat source at the junction temperatures given: the bank's devices
/// in order, then one freewheel diode (last). `point` is a duty-profile segment index;
/// dutyProfile.size() stands for a stall at the controller's current limit.
using SourceLosses =
    std::function<void(std::size_t point, const std::vector<double>& tj_C, std::vector<double>& power_W)>;

struct ThermalStageOptions {
    bool transient = false; ///< duty-profile transient and life
    bool stall = true;      ///< the stall's time to the junction limit
};

/// Fill Results::heatsink, stallTimeToLimit_s, (transient, life) and the thermal checks from the
/// operating points already in `r`.
void addThermalResults(const Design& d, const HeatsinkModel& heatsink, const SourceLosses& losses,
                       const ThermalStageOptions& options, Results& r);

/// Write the thermal results into the results JSON object: "heatsink", "transient",
/// "stallTimeToLimit_s" and "life" (null when not computed).
void addThermalJson(const Results& r, nlohmann::json& out);

} // namespace amp

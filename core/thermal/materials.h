// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Heatsink metals: thermal conductivity, density and specific heat near room temperature.
//
// Conductivity, W/(m·K): aluminium alloy 6063 in tempers O 218, T5 209, T6 200 (Aluminum
// Association, "Aluminum Standards and Data", typical properties); pure aluminium 237 and copper
// 401 at 300 K (Incropera & DeWitt, appendix Table A.1).
// Density: 6063 2700 kg/m³ (Aluminum Association); pure aluminium 2702 kg/m³ and copper
// 8933 kg/m³ (Incropera, Table A.1).
// Specific heat: aluminium 903 J/(kg·K) and copper 385 J/(kg·K) at 300 K (Incropera, Table A.1);
// the 6063 alloys are taken at the pure-aluminium value (their handbook c_p, about 900, differs by
// less than 1 %).
//
// Material ids (stable, stored in project files): "al6063-t5", "al6063-t6", "al6063-o",
// "aluminium", "copper".

#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace amp::thermal {

struct HeatsinkMaterial {
    std::string id;
    std::string name;
    double conductivity_WperMK = 0.0;
    double density_kgPerM3 = 0.0;
    double specificHeat_JperKgK = 0.0;
    std::string source;
};

/// The material for an id, or nothing for an unknown id.
std::optional<HeatsinkMaterial> heatsinkMaterial(std::string_view id);
/// The same without a copy (the table lives as long as the program); null for an unknown id.
const HeatsinkMaterial* findHeatsinkMaterial(std::string_view id);

/// Every material id, in display order.
const std::vector<std::string>& heatsinkMaterialIds();

} // namespace amp::thermal

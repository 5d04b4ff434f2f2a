// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/thermal/materials.h"

namespace amp::thermal {

namespace {

const std::vector<HeatsinkMaterial>& table() {
    static const std::vector<HeatsinkMaterial> kMaterials{
        {"al6063-t5", "Aluminium 6063-T5", 209.0, 2700.0, 903.0,
         "Aluminum Association typical values; c_p of aluminium from Incropera Table A.1"},
        {"al6063-t6", "Aluminium 6063-T6", 200.0, 2700.0, 903.0,
         "Aluminum Association typical values; c_p of aluminium from Incropera Table A.1"},
        {"al6063-o", "Aluminium 6063-O (annealed)", 218.0, 2700.0, 903.0,
         "Aluminum Association typical values; c_p of aluminium from Incropera Table A.1"},
        {"aluminium", "Pure aluminium", 237.0, 2702.0, 903.0, "Incropera & DeWitt Table A.1, 300 K"},
        {"copper", "Pure copper", 401.0, 8933.0, 385.0, "Incropera & DeWitt Table A.1, 300 K"},
    };
    return kMaterials;
}

} // namespace

const HeatsinkMaterial* findHeatsinkMaterial(std::string_view id) {
    for (const auto& m : table())
        if (m.id == id)
            return &m;
    return nullptr;
}

std::optional<HeatsinkMaterial> heatsinkMaterial(std::string_view id) {
    if (const HeatsinkMaterial* m = findHeatsinkMaterial(id))
        return *m;
    return std::nullopt;
}

const std::vector<std::string>& heatsinkMaterialIds() {
    static const std::vector<std::string> kIds = [] {
        std::vector<std::string> ids;
        for (const auto& m : table())
            ids.push_back(m.id);
        return ids;
    }();
    return kIds;
}

} // namespace amp::thermal

// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// JSON mapping of the design and the parts: keys are the member names; a missing key takes the
// member's default. Validation of ranges and types happens before from_json (model/fields.h).

#include "core/model/design.h"

#include <nlohmann/json_fwd.hpp>

namespace amp {

void to_json(nlohmann::json& j, const FosterStage& v);
void from_json(const nlohmann::json& j, FosterStage& v);
void to_json(nlohmann::json& j, const SoaPoint& v);
void from_json(const nlohmann::json& j, SoaPoint& v);
void to_json(nlohmann::json& j, const RdsOnPoint& v);
void from_json(const nlohmann::json& j, RdsOnPoint& v);
void to_json(nlohmann::json& j, const MosfetParams& v);
void from_json(const nlohmann::json& j, MosfetParams& v);
void to_json(nlohmann::json& j, const BjtParams& v);
void from_json(const nlohmann::json& j, BjtParams& v);
void to_json(nlohmann::json& j, const SwitchPart& v);
void from_json(const nlohmann::json& j, SwitchPart& v);
void to_json(nlohmann::json& j, const DiodePart& v);
void from_json(const nlohmann::json& j, DiodePart& v);
void to_json(nlohmann::json& j, const InterfacePart& v);
void from_json(const nlohmann::json& j, InterfacePart& v);
void to_json(nlohmann::json& j, const ContactorPart& v);
void from_json(const nlohmann::json& j, ContactorPart& v);
void to_json(nlohmann::json& j, const HeatsinkPart& v);
void from_json(const nlohmann::json& j, HeatsinkPart& v);

void to_json(nlohmann::json& j, const Meta& v);
void from_json(const nlohmann::json& j, Meta& v);
void to_json(nlohmann::json& j, const Supply& v);
void from_json(const nlohmann::json& j, Supply& v);
void to_json(nlohmann::json& j, const MagnetisationPoint& v);
void from_json(const nlohmann::json& j, MagnetisationPoint& v);
void to_json(nlohmann::json& j, const Motor& v);
void from_json(const nlohmann::json& j, Motor& v);
void to_json(nlohmann::json& j, const Pwm& v);
void from_json(const nlohmann::json& j, Pwm& v);
void to_json(nlohmann::json& j, const Drive& v);
void from_json(const nlohmann::json& j, Drive& v);
void to_json(nlohmann::json& j, const BankDevice& v);
void from_json(const nlohmann::json& j, BankDevice& v);
void to_json(nlohmann::json& j, const Spread& v);
void from_json(const nlohmann::json& j, Spread& v);
void to_json(nlohmann::json& j, const Bank& v);
void from_json(const nlohmann::json& j, Bank& v);
void to_json(nlohmann::json& j, const HeatsinkGeometry& v);
void from_json(const nlohmann::json& j, HeatsinkGeometry& v);
void to_json(nlohmann::json& j, const Heatsink& v);
void from_json(const nlohmann::json& j, Heatsink& v);
void to_json(nlohmann::json& j, const ThermalStudy& v);
void from_json(const nlohmann::json& j, ThermalStudy& v);
void to_json(nlohmann::json& j, const Reversing& v);
void from_json(const nlohmann::json& j, Reversing& v);
void to_json(nlohmann::json& j, const Segment& v);
void from_json(const nlohmann::json& j, Segment& v);
void to_json(nlohmann::json& j, const Wiring& v);
void from_json(const nlohmann::json& j, Wiring& v);
void to_json(nlohmann::json& j, const PowerLayout& v);
void from_json(const nlohmann::json& j, PowerLayout& v);
void to_json(nlohmann::json& j, const Design& v);
void from_json(const nlohmann::json& j, Design& v);

} // namespace amp

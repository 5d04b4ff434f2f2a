// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Creepage distance required to avoid tracking, IEC 60664-1 Table F.4, pollution degree 2
// (non-conductive pollution, occasional condensation), material group III (CTI 100–400, most
// insulating pads, washers and glass-epoxy boards). The voltage is the working voltage, here the
// highest bus voltage (DC taken at its value, as the table allows for DC and RMS).
//
// Rows reproduced: 50 V 1.20 mm, 63 V 1.25 mm, 100 V 1.40 mm (as reproduced in a connector
// maker's catalogue), and 200 V 2.0 mm, 250 V 2.5 mm, 400 V 4.0 mm (from memory of the
// standard). Between rows the value is interpolated linearly (the standard permits linear
// interpolation between adjacent rows); the intermediate rows that were not reproduced (80, 125,
// 160, 320 V) are thereby estimated, which errs on the long (safe) side between 100 V and 200 V.
// Below 50 V the 50 V value is used (conservative: the table's lower rows are smaller); above
// 400 V the result is not given (`inTable` false, value at 400 V scaled by voltage).

namespace amp::thermal {

struct CreepageResult {
    double required_m = 0.0;
    bool interpolated = false; ///< the voltage is not one of the reproduced rows
    bool inTable = true;       ///< false above 400 V (or for a voltage that is not a number)
};

CreepageResult requiredCreepage(double workingVoltage_V);

} // namespace amp::thermal

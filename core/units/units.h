// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Units at the edges of the engine. Inside core every value is SI (temperatures in °C where the
// name ends in _C, as the trade does). Text typed by a user or written in a part file is parsed
// here into SI; results are formatted here with engineering prefixes.

#include <optional>
#include <string>
#include <string_view>

namespace amp::units {

/// The physical quantities the design and the parts use. Each has one SI base symbol.
enum class Unit {
    None,             ///< dimensionless (ratio, count, exponent)
    Volt,             ///< V
    Ampere,           ///< A
    Ohm,              ///< Ω (also "ohm", "R" as in 4R7)
    Watt,             ///< W
    Joule,            ///< J
    Coulomb,          ///< C (charge)
    Celsius,          ///< °C (absolute temperature, trade convention)
    Kelvin,           ///< K (temperature difference or absolute kelvin)
    KelvinPerWatt,    ///< K/W
    Second,           ///< s
    Hertz,            ///< Hz
    Henry,            ///< H
    Farad,            ///< F
    Metre,            ///< m
    SquareMetre,      ///< m²
    SquareMillimetre, ///< mm² (cable cross-sections, trade convention)
    Kilogram,         ///< kg
    NewtonMetre,      ///< N·m
    NewtonMetrePerAmpere, ///< N·m/A (= V·s/rad)
    KilogramSquareMetre,  ///< kg·m²
    RadianPerSecond,  ///< rad/s
    Rpm,              ///< rpm (speeds typed by users, converted to rad/s by the caller)
    VoltPerKelvin,    ///< V/K
    VoltPerMetre,     ///< V/m (dielectric strength; kV/mm accepted)
    WattPerMetreKelvin,   ///< W/(m·K)
    JoulePerKilogramKelvin, ///< J/(kg·K)
    KelvinSquareMetrePerWatt, ///< K·m²/W (contact resistance)
    AmperePerSquareVolt,  ///< A/V² (square-law transconductance parameter)
    MetrePerSecond,   ///< m/s
    ElectronVolt,     ///< eV
    Percent,          ///< % (parsed into a fraction: "5 %" -> 0.05)
};

/// Outcome of parsing: a value in SI or a message that says what is wrong with the text.
struct Parsed {
    std::optional<double> value;
    std::string error; ///< empty when value is set
    explicit operator bool() const { return value.has_value(); }
};

/// Parse user or file text into the SI value of the expected unit.
/// Accepts: plain numbers ("3.5", "1e-3"), engineering prefixes with or without a unit
/// ("3.5m", "3.5 mΩ", "16 kHz", "4k7", "4R7", "2.2 K/W", "85 °C", "85 C", "10 mm²", "10 mm2").
/// Rejects with a message: empty text, "3..5", an unknown or mismatched unit ("12 parsecs"),
/// NaN, Inf, trailing garbage.
Parsed parse(std::string_view text, Unit expected);

/// Format an SI value with an engineering prefix and the unit's symbol: format(0.0035, Ohm) ==
/// "3.5 mΩ"; temperatures as "85 °C"; significant digits as given (trailing zeros removed).
std::string format(double si, Unit unit, int significant = 4);

/// A plain number for messages: `significant` digits, trailing zeros removed, fixed notation for
/// 1e-3 ≤ |v| < 1e7 ("10000", "3720", "0.0042") and an exponent only outside that range ("2e-05",
/// "1.5e+08"); "not a number" and "∞" for the non-finite values.
std::string plain(double v, int significant = 3);

/// The unit's display symbol ("Ω", "K/W", "°C", "" for None).
std::string_view symbol(Unit unit);

/// The unit implied by a JSON key's suffix: "rdsOn25_ohm" -> Ohm, "tjMax_C" -> Celsius,
/// "frequency_Hz" -> Hertz, "crossSection_mm2" -> SquareMillimetre. std::nullopt when the key
/// carries no unit suffix.
std::optional<Unit> unitFromKey(std::string_view key);

} // namespace amp::units

// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/units/units.h"

#include <algorithm>
#include <array>
#include <charconv>
#include <cmath>
#include <cstdio>
#include <vector>

namespace amp::units {

namespace {

constexpr double kPi = 3.14159265358979323846;
constexpr double kZeroCelsius_K = 273.15;

/// One accepted spelling of a unit: SI = number · prefix · scale + offset.
struct Spelling {
    std::string_view text;
    double scale = 1.0;
    bool prefixable = true; ///< "mΩ" yes; "°C", "mm²", "rpm" no
    double offset = 0.0;
};

struct UnitInfo {
    Unit unit;
    std::string_view symbol;
    /// Prefix range used by format(): exponents (multiples of 3) from minExp to maxExp; a unit
    /// with minExp == maxExp == 0 is shown without prefixes.
    int minExp = -12;
    int maxExp = 9;
    std::vector<Spelling> spellings;
};

// The table is built once; it is constant data, not state.
const std::vector<UnitInfo>& unitTable() {
    static const std::vector<UnitInfo> table = {
        {Unit::None, "", 0, 0, {{"%", 0.01, false}}},
        {Unit::Volt, "V", -12, 9, {{"V"}}},
        {Unit::Ampere, "A", -12, 9, {{"A"}}},
        {Unit::Ohm, "Ω", -12, 9,
         {{"Ω"}, {"\u2126"}, {"ohm"}, {"ohms"}, {"Ohm"}, {"Ohms"}, {"R"}}},
        {Unit::Watt, "W", -12, 9, {{"W"}}},
        {Unit::Joule, "J", -12, 9, {{"J"}}},
        {Unit::Coulomb, "C", -12, 0, {{"C"}, {"As"}, {"A·s"}, {"A*s"}}},
        {Unit::Celsius, "°C", 0, 0,
         {{"°C", 1.0, false}, {"℃", 1.0, false}, {"C", 1.0, false}, {"degC", 1.0, false},
          {"K", 1.0, false, -kZeroCelsius_K}}},
        {Unit::Kelvin, "K", 0, 0, {{"K"}}},
        {Unit::KelvinPerWatt, "K/W", 0, 0, {{"K/W"}, {"°C/W", 1.0, false}, {"C/W", 1.0, false}}},
        {Unit::Second, "s", -12, 0,
         {{"s"}, {"min", 60.0, false}, {"h", 3600.0, false}}},
        {Unit::Hertz, "Hz", -3, 9, {{"Hz"}}},
        {Unit::Henry, "H", -12, 0, {{"H"}}},
        {Unit::Farad, "F", -12, 0, {{"F"}}},
        {Unit::Metre, "m", -9, 3, {{"m"}}},
        {Unit::SquareMetre, "m²", 0, 0,
         {{"m²", 1.0, false}, {"m2", 1.0, false}, {"m^2", 1.0, false}, {"cm²", 1e-4, false},
          {"cm2", 1e-4, false}, {"mm²", 1e-6, false}, {"mm2", 1e-6, false}, {"mm^2", 1e-6, false}}},
        {Unit::SquareMillimetre, "mm²", 0, 0,
         {{"mm²", 1.0, false}, {"mm2", 1.0, false}, {"mm^2", 1.0, false}, {"m²", 1e6, false},
          {"m2", 1e6, false}}},
        {Unit::Kilogram, "kg", 0, 0, {{"kg", 1.0, false}, {"g", 1e-3, true}}},
        {Unit::NewtonMetre, "N·m", -3, 3, {{"N·m"}, {"Nm"}, {"N*m"}, {"N.m"}}},
        {Unit::NewtonMetrePerAmpere, "N·m/A", 0, 0,
         {{"N·m/A", 1.0, false}, {"Nm/A", 1.0, false}, {"N*m/A", 1.0, false}, {"V·s/rad", 1.0, false},
          {"Vs/rad", 1.0, false}, {"V·s", 1.0, false}, {"Vs", 1.0, false}}},
        {Unit::KilogramSquareMetre, "kg·m²", 0, 0,
         {{"kg·m²", 1.0, false}, {"kgm²", 1.0, false}, {"kg·m2", 1.0, false}, {"kgm2", 1.0, false},
          {"kg*m^2", 1.0, false}, {"kg*m2", 1.0, false}}},
        {Unit::RadianPerSecond, "rad/s", 0, 0,
         {{"rad/s", 1.0, false}, {"rpm", 2.0 * kPi / 60.0, false}, {"1/min", 2.0 * kPi / 60.0, false}}},
        {Unit::Rpm, "rpm", 0, 0,
         {{"rpm", 1.0, false}, {"1/min", 1.0, false}, {"r/min", 1.0, false},
          {"rad/s", 60.0 / (2.0 * kPi), false}}},
        {Unit::VoltPerKelvin, "V/K", -6, 0, {{"V/K"}, {"V/°C"}}},
        {Unit::VoltPerMetre, "V/m", 0, 9,
         {{"V/m"}, {"kV/mm", 1e6, false}, {"V/mm", 1e3, false}, {"V/µm", 1e6, false}}},
        {Unit::WattPerMetreKelvin, "W/(m·K)", 0, 0,
         {{"W/(m·K)", 1.0, false}, {"W/m·K", 1.0, false}, {"W/mK", 1.0, false}, {"W/(mK)", 1.0, false},
          {"W/m/K", 1.0, false}, {"W/(m*K)", 1.0, false}}},
        {Unit::JoulePerKilogramKelvin, "J/(kg·K)", 0, 3,
         {{"J/(kg·K)"}, {"J/kg·K"}, {"J/kgK"}, {"J/(kgK)"}, {"J/kg/K"}, {"J/(kg*K)"}}},
        {Unit::KelvinSquareMetrePerWatt, "K·m²/W", 0, 0,
         {{"K·m²/W", 1.0, false}, {"Km²/W", 1.0, false}, {"K·m2/W", 1.0, false}, {"Km2/W", 1.0, false},
          {"m²K/W", 1.0, false}, {"m2K/W", 1.0, false}, {"K·cm²/W", 1e-4, false},
          {"Kcm2/W", 1e-4, false}, {"K·mm²/W", 1e-6, false}, {"Kmm2/W", 1e-6, false}}},
        {Unit::AmperePerSquareVolt, "A/V²", -3, 3, {{"A/V²"}, {"A/V2"}, {"A/V^2"}}},
        {Unit::MetrePerSecond, "m/s", 0, 0, {{"m/s", 1.0, false}, {"km/h", 1.0 / 3.6, false}}},
        {Unit::ElectronVolt, "eV", -3, 0, {{"eV"}}},
        {Unit::Percent, "%", 0, 0, {{"%", 0.01, false}}},
    };
    return table;
}

const UnitInfo& info(Unit unit) {
    for (const auto& u : unitTable())
        if (u.unit == unit)
            return u;
    return unitTable().front();
}

struct Prefix {
    std::string_view text;
    int exponent;
};
constexpr std::array<Prefix, 9> kPrefixes{{{"p", -12},
                                           {"n", -9},
                                           {"µ", -6},
                                           {"μ", -6}, // Greek small mu, often typed instead of µ
                                           {"u", -6},
                                           {"m", -3},
                                           {"k", 3},
                                           {"M", 6},
                                           {"G", 9}}};

std::string_view trim(std::string_view s) {
    const auto isSpace = [](char c) { return c == ' ' || c == '\t' || c == '\n' || c == '\r'; };
    while (!s.empty() && isSpace(s.front()))
        s.remove_prefix(1);
    while (!s.empty() && isSpace(s.back()))
        s.remove_suffix(1);
    // A no-break space (U+00A0, "\xC2\xA0") is common between number and unit in copied text.
    while (s.size() >= 2 && s.substr(s.size() - 2) == "\xC2\xA0")
        s.remove_suffix(2);
    return s;
}

std::string withoutSpaces(std::string_view s) {
    std::string out;
    for (std::size_t i = 0; i < s.size(); ++i) {
        if (s[i] == ' ' || s[i] == '\t')
            continue;
        if (s.substr(i, 2) == "\xC2\xA0") {
            ++i;
            continue;
        }
        out += s[i];
    }
    return out;
}

bool isDigit(char c) { return c >= '0' && c <= '9'; }

std::string lower(std::string_view s) {
    std::string out(s);
    for (auto& c : out)
        if (c >= 'A' && c <= 'Z')
            c = static_cast<char>(c - 'A' + 'a');
    return out;
}

std::string quoted(std::string_view s) { return "'" + std::string(s) + "'"; }

std::string expectedName(Unit unit) {
    if (unit == Unit::None)
        return "a plain number";
    return std::string(symbol(unit));
}

/// A matched unit text: the multiplier and offset that turn the number into SI.
struct UnitMatch {
    double factor = 1.0;
    double offset = 0.0;
};

/// Match `text` (spaces removed) against the spellings of `unit`, with an optional prefix on the
/// prefixable ones. A bare prefix ("3.5m") is accepted for every unit.
std::optional<UnitMatch> matchUnit(std::string_view text, Unit unit, bool allowPrefix = true) {
    const UnitInfo& u = info(unit);
    // An exact spelling wins over a prefix reading: "3 m" is metres where metres are expected.
    for (const auto& sp : u.spellings)
        if (text == sp.text)
            return UnitMatch{sp.scale, sp.offset};
    if (!allowPrefix)
        return std::nullopt;
    for (const auto& p : kPrefixes) {
        if (text.substr(0, p.text.size()) != p.text)
            continue;
        const std::string_view rest = text.substr(p.text.size());
        const double mult = std::pow(10.0, p.exponent);
        if (rest.empty())
            return UnitMatch{mult, 0.0};
        for (const auto& sp : u.spellings)
            if (sp.prefixable && rest == sp.text)
                return UnitMatch{mult * sp.scale, sp.offset};
    }
    return std::nullopt;
}

/// The unit some other quantity would use for `text`, to say "V given where Ω is expected".
std::optional<Unit> otherUnitFor(std::string_view text, Unit expected) {
    for (const auto& u : unitTable()) {
        if (u.unit == expected || u.unit == Unit::None)
            continue;
        const auto m = matchUnit(text, u.unit);
        // A bare prefix matches every unit; it says nothing about which quantity was meant.
        if (!m)
            continue;
        bool barePrefix = false;
        for (const auto& p : kPrefixes)
            if (text == p.text)
                barePrefix = true;
        if (!barePrefix)
            return u.unit;
    }
    return std::nullopt;
}

std::optional<double> prefixValue(std::string_view text) {
    for (const auto& p : kPrefixes)
        if (text == p.text)
            return std::pow(10.0, p.exponent);
    return std::nullopt;
}

Parsed fail(std::string message) { return Parsed{std::nullopt, std::move(message)}; }

// printf's %.*f, %.*e and %.*g of a double, through std::to_chars: the standard specifies its
// output with a precision as that of printf in the "C" locale ([charconv.to.chars]), and it
// skips printf's format parsing and stream machinery (the messages of the checks format numbers
// inside the engine's iterations). printf stays as the fallback should the buffer not suffice.
std::string printed(double v, std::chars_format style, int precision) {
    char buf[400];
    const auto [end, ec] = std::to_chars(buf, buf + sizeof buf, v, style, precision);
    if (ec == std::errc())
        return std::string(buf, end);
    const char* spec = style == std::chars_format::fixed        ? "%.*f"
                       : style == std::chars_format::scientific ? "%.*e"
                                                                : "%.*g";
    std::vector<char> big(static_cast<std::size_t>(std::snprintf(nullptr, 0, spec, precision, v)) + 1);
    std::snprintf(big.data(), big.size(), spec, precision, v);
    return big.data();
}

/// Round to `sig` significant digits and print without trailing zeros, in plain notation.
std::string fixedDigits(double v, int sig) {
    if (v == 0.0)
        return "0";
    const int mag = static_cast<int>(std::floor(std::log10(std::abs(v))));
    const int decimals = std::max(0, sig - 1 - mag);
    std::string s = printed(v, std::chars_format::fixed, decimals);
    // The text has always been cut at 63 characters (a 64-byte buffer): only absurd magnitudes
    // reach it ("0 pg" for 1e-132 kg), and they keep printing as before.
    if (s.size() > 63)
        s.resize(63);
    if (s.find('.') != std::string::npos) {
        while (!s.empty() && s.back() == '0')
            s.pop_back();
        if (!s.empty() && s.back() == '.')
            s.pop_back();
    }
    if (s == "-0")
        s = "0";
    return s;
}

/// Round to `sig` significant digits; returns the rounded value.
double roundSignificant(double v, int sig) {
    if (v == 0.0 || !std::isfinite(v))
        return v;
    // The decimal text of %.*e read back: from_chars rounds correctly, as strtod does; where the
    // rounded text leaves the range of double ("2e+308") strtod's overflow to infinity is kept.
    char buf[64];
    const auto [end, ec] = std::to_chars(buf, buf + sizeof buf - 1, v, std::chars_format::scientific, sig - 1);
    if (ec != std::errc()) {
        std::snprintf(buf, sizeof buf, "%.*e", sig - 1, v);
        return std::strtod(buf, nullptr);
    }
    double r = v;
    if (std::from_chars(buf, end, r).ec != std::errc()) {
        *end = '\0';
        return std::strtod(buf, nullptr);
    }
    return r;
}

/// Plain number: fixed notation for 1e-3 ≤ |v| < 1e6, otherwise "1.5e7".
std::string plainNumber(double v, int sig) {
    v = roundSignificant(v, sig);
    const double a = std::abs(v);
    if (a == 0.0 || (a >= 1e-3 && a < 1e6))
        return fixedDigits(v, sig);
    const int exp = static_cast<int>(std::floor(std::log10(a)));
    const double mant = v / std::pow(10.0, exp);
    std::string m = fixedDigits(roundSignificant(mant, sig), sig);
    // Rounding may carry the mantissa to 10 ("9.9999e6" at 4 digits).
    if (m == "10" || m == "-10")
        return fixedDigits(v < 0 ? -1.0 : 1.0, sig) + "e" + std::to_string(exp + 1);
    return m + "e" + std::to_string(exp);
}

std::string joinUnit(const std::string& number, std::string_view sym) {
    if (sym.empty())
        return number;
    return number + " " + std::string(sym);
}

} // namespace

std::string_view symbol(Unit unit) { return info(unit).symbol; }

std::string plain(double v, int significant) {
    if (std::isnan(v))
        return "not a number";
    if (std::isinf(v))
        return v > 0 ? "∞" : "−∞";
    significant = std::clamp(significant, 1, 15);
    if (v != 0.0) {
        // The common case without a second conversion: %.*e gives the digits d₀.d₁…d_p and the
        // decade X; r is that decimal as a double. When floor(log10|r|) is X, the %.*f that
        // fixedDigits would print at max(0, p − X) decimals shows exactly those digits (r lies
        // within half an ulp of the decimal, far less than half a unit of its last digit, for
        // p ≤ 14; for X > p, r is an integer below 1e7, exact in a double), so the text is put
        // together from them. Any other case takes the general path below.
        char buf[48];
        const int p = significant - 1;
        const auto [end, ec] = std::to_chars(buf, buf + sizeof buf, v, std::chars_format::scientific, p);
        double r = 0.0;
        const char* ePos = ec == std::errc() ? std::find(buf, end, 'e') : end;
        int x = 0;
        if (ePos != end && std::from_chars(buf, end, r).ec == std::errc() &&
            std::from_chars(ePos + (ePos[1] == '+' ? 2 : 1), end, x).ec == std::errc()) {
            const double a = std::abs(r);
            if (!(a >= 1e-3 && a < 1e7))
                return printed(r, std::chars_format::general, significant);
            if (static_cast<int>(std::floor(std::log10(a))) == x) {
                const bool negative = buf[0] == '-';
                // The digits without sign and point: d₀ then d₁…d_p.
                char digits[20];
                int nd = 0;
                for (const char* c = buf + (negative ? 1 : 0); c != ePos; ++c)
                    if (*c != '.')
                        digits[nd++] = *c;
                while (nd > 1 && digits[nd - 1] == '0' && nd - 1 > x)
                    --nd; // trailing zeros after the decimal point
                std::string out;
                out.reserve(24);
                if (negative)
                    out += '-';
                if (x >= 0) {
                    for (int i = 0; i <= x; ++i)
                        out += i < nd ? digits[i] : '0';
                    if (nd > x + 1) {
                        out += '.';
                        out.append(digits + x + 1, digits + nd);
                    }
                } else {
                    out += "0.";
                    out.append(static_cast<std::size_t>(-x - 1), '0');
                    out.append(digits, digits + nd);
                }
                return out;
            }
        }
    }
    const double r = roundSignificant(v, significant);
    const double a = std::abs(r);
    if (a == 0.0 || (a >= 1e-3 && a < 1e7))
        return fixedDigits(r, significant);
    return printed(r, std::chars_format::general, significant);
}

Parsed parse(std::string_view text, Unit expected) {
    const std::string_view t = trim(text);
    if (t.empty())
        return fail("empty: a number is expected" +
                    (expected == Unit::None ? std::string() : " (in " + expectedName(expected) + ")"));

    // Reject NaN and infinity by name before reading any number.
    {
        std::string_view body = t;
        if (!body.empty() && (body.front() == '+' || body.front() == '-'))
            body.remove_prefix(1);
        const std::string l = lower(body);
        if (l.rfind("nan", 0) == 0 || l.rfind("inf", 0) == 0 || body.rfind("∞", 0) == 0)
            return fail(quoted(t) + " is not a finite number");
    }

    // Scan the number: [sign] digits [. digits] [e [sign] digits], or resistor notation
    // digits PREFIX digits ("4k7", "4R7", "3m3").
    std::size_t i = 0;
    bool negative = false;
    if (i < t.size() && (t[i] == '+' || t[i] == '-')) {
        negative = t[i] == '-';
        ++i;
    }
    const std::size_t intStart = i;
    while (i < t.size() && isDigit(t[i]))
        ++i;
    const std::string_view intDigits = t.substr(intStart, i - intStart);
    std::string_view fracDigits;
    bool hasPoint = false;
    if (i < t.size() && t[i] == '.') {
        hasPoint = true;
        ++i;
        const std::size_t fracStart = i;
        while (i < t.size() && isDigit(t[i]))
            ++i;
        fracDigits = t.substr(fracStart, i - fracStart);
    }
    if (intDigits.empty() && fracDigits.empty())
        return fail(quoted(t) + " is not a number");

    std::string numberText(intDigits);
    if (hasPoint)
        numberText += "." + std::string(fracDigits);
    double multiplier = 1.0;
    bool resistorNotation = false;

    // Resistor notation: a prefix letter (or R) in place of the decimal point.
    if (!hasPoint && !intDigits.empty()) {
        std::string_view letter;
        double letterValue = 0.0;
        const std::string_view after = t.substr(i);
        if (!after.empty() && after.front() == 'R') {
            letter = after.substr(0, 1);
            letterValue = 1.0;
        } else {
            for (const auto& p : kPrefixes)
                if (after.substr(0, p.text.size()) == p.text) {
                    letter = p.text;
                    letterValue = std::pow(10.0, p.exponent);
                    break;
                }
        }
        // "35m2" where m² is expected is a unit, not 35.2 milli: a valid unit spelling wins.
        const bool isUnitText = matchUnit(withoutSpaces(after), expected).has_value();
        if (!letter.empty() && !isUnitText && after.size() > letter.size() &&
            isDigit(after[letter.size()])) {
            if (letter == "R" && expected != Unit::Ohm && expected != Unit::None)
                return fail(quoted(t) + ": the R notation (as in 4R7) is for resistances, but " +
                            expectedName(expected) + " is expected");
            std::size_t j = i + letter.size();
            const std::size_t fracStart = j;
            while (j < t.size() && isDigit(t[j]))
                ++j;
            numberText += "." + std::string(t.substr(fracStart, j - fracStart));
            multiplier = letterValue;
            resistorNotation = true;
            i = j;
        }
    }

    // Exponent: only when 'e' is followed by digits, so "3 eV" stays electronvolts.
    if (!resistorNotation && i < t.size() && (t[i] == 'e' || t[i] == 'E')) {
        std::size_t j = i + 1;
        if (j < t.size() && (t[j] == '+' || t[j] == '-'))
            ++j;
        if (j < t.size() && isDigit(t[j])) {
            while (j < t.size() && isDigit(t[j]))
                ++j;
            numberText += "e" + std::string(t.substr(i + 1, j - i - 1));
            i = j;
        }
    }

    double number = 0.0;
    {
        const char* first = numberText.data();
        const char* last = numberText.data() + numberText.size();
        const auto [ptr, ec] = std::from_chars(first, last, number);
        if (ec == std::errc::result_out_of_range)
            return fail(quoted(t) + " is out of range");
        if (ec != std::errc() || ptr != last)
            return fail(quoted(t) + " is not a number");
    }
    if (negative)
        number = -number;

    const std::string_view restRaw = trim(t.substr(i));
    if (!restRaw.empty()) {
        const char c = restRaw.front();
        if (isDigit(c) || c == '.' || c == ',' || c == '+' || c == '-' || c == 'e' || c == 'E') {
            // "3..5", "1,5", "1e", "2-3": a malformed number rather than a unit.
            if (c == ',')
                return fail(quoted(t) + " is not a number: use a decimal point, not a comma");
            if (!(c == 'e' && restRaw.size() > 1 && restRaw[1] == 'V'))
                return fail(quoted(t) + " is not a number");
        }
    }

    double si = number * multiplier;
    double offset = 0.0;
    if (!restRaw.empty()) {
        const std::string rest = withoutSpaces(restRaw);
        // After resistor notation the prefix is already used: only the bare symbol may follow.
        auto m = matchUnit(rest, expected, !resistorNotation);
        if (!m) {
            // Trailing text after a valid unit: "5 Ω xyz".
            const std::size_t space = restRaw.find_first_of(" \t");
            if (space != std::string_view::npos) {
                const std::string_view head = restRaw.substr(0, space);
                const std::string_view tail = trim(restRaw.substr(space));
                if (matchUnit(head, expected, !resistorNotation))
                    return fail(quoted(t) + ": unexpected text " + quoted(tail) + " after the unit");
            }
            if (resistorNotation && prefixValue(rest))
                return fail(quoted(t) + ": a second prefix after " +
                            std::string(t.substr(0, i)) + " is not allowed");
            if (const auto other = otherUnitFor(rest, expected))
                return fail(quoted(t) + " is in " + std::string(symbol(*other)) + ", but " +
                            expectedName(expected) + " is expected");
            return fail(quoted(t) + ": unknown unit " + quoted(rest) + " (expected " +
                        expectedName(expected) + ")");
        }
        si *= m->factor;
        offset = m->offset;
    }
    si += offset;
    if (!std::isfinite(si))
        return fail(quoted(t) + " is out of range");
    return Parsed{si, {}};
}

std::string format(double si, Unit unit, int significant) {
    if (std::isnan(si))
        return "not a number";
    if (std::isinf(si))
        return si > 0 ? "∞" : "−∞";
    significant = std::clamp(significant, 1, 15);
    const UnitInfo& u = info(unit);

    if (unit == Unit::Percent)
        return plainNumber(si * 100.0, significant) + " %";
    if (unit == Unit::SquareMetre && si != 0.0 && std::abs(si) < 1e-2)
        return plainNumber(si * 1e6, significant) + " mm²";
    if (unit == Unit::Kilogram && si != 0.0 && std::abs(si) < 1.0) {
        // Grams with a prefix below one kilogram ("250 g", "12 mg").
        const double g = roundSignificant(si * 1e3, significant);
        int exp = static_cast<int>(std::floor(std::log10(std::abs(g)) / 3.0)) * 3;
        exp = std::clamp(exp, -12, 0);
        std::string pre;
        for (const auto& p : kPrefixes)
            if (p.exponent == exp && p.text != "μ" && p.text != "u")
                pre = p.text;
        return fixedDigits(roundSignificant(g / std::pow(10.0, exp), significant), significant) + " " +
               pre + "g";
    }
    if (u.minExp == 0 && u.maxExp == 0)
        return joinUnit(plainNumber(si, significant), u.symbol);

    const double r = roundSignificant(si, significant);
    if (r == 0.0)
        return joinUnit("0", u.symbol);
    int exp = static_cast<int>(std::floor(std::log10(std::abs(r)) / 3.0)) * 3;
    if (exp < u.minExp || exp > u.maxExp) {
        // Outside the unit's prefix range: clamp, and fall back to an exponent when even that
        // leaves an unwieldy mantissa.
        exp = std::clamp(exp, u.minExp, u.maxExp);
        const double mant = r / std::pow(10.0, exp);
        std::string pre;
        for (const auto& p : kPrefixes)
            if (p.exponent == exp && p.text != "μ" && p.text != "u")
                pre = p.text;
        return plainNumber(mant, significant) + " " + pre + std::string(u.symbol);
    }
    double mant = roundSignificant(r / std::pow(10.0, exp), significant);
    if (std::abs(mant) >= 1000.0 && exp + 3 <= u.maxExp) {
        exp += 3;
        mant /= 1000.0;
    }
    std::string pre;
    for (const auto& p : kPrefixes)
        if (p.exponent == exp && p.text != "μ" && p.text != "u")
            pre = p.text;
    return fixedDigits(mant, significant) + " " + pre + std::string(u.symbol);
}

std::optional<Unit> unitFromKey(std::string_view key) {
    const std::size_t us = key.rfind('_');
    if (us == std::string_view::npos || us + 1 >= key.size())
        return std::nullopt;
    const std::string_view s = key.substr(us + 1);
    struct Entry {
        std::string_view suffix;
        Unit unit;
    };
    static constexpr std::array<Entry, 32> kSuffixes{{
        {"V", Unit::Volt},
        {"A", Unit::Ampere},
        {"ohm", Unit::Ohm},
        {"W", Unit::Watt},
        {"J", Unit::Joule},
        {"As", Unit::Coulomb}, // ampere-seconds: "_C" is taken by °C
        {"C", Unit::Celsius},
        {"K", Unit::Kelvin},
        {"KperW", Unit::KelvinPerWatt},
        {"s", Unit::Second},
        {"Hz", Unit::Hertz},
        {"H", Unit::Henry},
        {"F", Unit::Farad},
        {"m", Unit::Metre},
        {"m2", Unit::SquareMetre},
        {"mm2", Unit::SquareMillimetre},
        {"kg", Unit::Kilogram},
        {"Nm", Unit::NewtonMetre},
        {"NmPerA", Unit::NewtonMetrePerAmpere},
        {"kgm2", Unit::KilogramSquareMetre},
        {"radPerS", Unit::RadianPerSecond},
        {"rpm", Unit::Rpm},
        {"VperK", Unit::VoltPerKelvin},
        {"Vperm", Unit::VoltPerMetre},
        {"WperMK", Unit::WattPerMetreKelvin},
        {"JperKgK", Unit::JoulePerKilogramKelvin},
        {"Km2perW", Unit::KelvinSquareMetrePerWatt},
        {"AperV2", Unit::AmperePerSquareVolt},
        {"mps", Unit::MetrePerSecond},
        {"eV", Unit::ElectronVolt},
        {"pct", Unit::Percent},
        {"ops", Unit::None}, // operation counts (contactor life): dimensionless
    }};
    for (const auto& e : kSuffixes)
        if (e.suffix == s)
            return e.unit;
    return std::nullopt;
}

} // namespace amp::units

// SPDX-License-Identifier: GPL-3.0-or-later
// Parsing and formatting of values with units. Reference values: the SI prefixes and the
// kelvin–Celsius offset from the SI Brochure (BIPM, 9th ed., 2019, tables 7 and §2.3.1); the
// resistor code "4k7"/"4R7" from IEC 60062 (letter in place of the decimal sign); 1 rpm = 2π/60
// rad/s and 1 kV/mm = 1e6 V/m are exact definitions.

#include "core/units/units.h"
#include "support/testsupport.h"

#include <QTest>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <numbers>
#include <string>
#include <vector>

using amp::units::Unit;

Q_DECLARE_METATYPE(amp::units::Unit)

class TestUnits : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { amp::test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(amp::test::unexpectedErrorLogs(), 0); }

    void parseGood_data() {
        QTest::addColumn<QString>("text");
        QTest::addColumn<Unit>("unit");
        QTest::addColumn<double>("expected");
        // SI Brochure table 7: m = 1e-3, k = 1e3, M = 1e6, µ = 1e-6, n = 1e-9, p = 1e-12, G = 1e9.
        QTest::newRow("plain") << "3.5" << Unit::Ohm << 3.5;
        QTest::newRow("exponent") << "1e-3" << Unit::Ampere << 1e-3;
        QTest::newRow("exponent upper") << "2.5E3" << Unit::Volt << 2500.0;
        QTest::newRow("bare milli") << "3.5m" << Unit::Ohm << 3.5e-3;
        QTest::newRow("milliohm symbol") << "3.5 mΩ" << Unit::Ohm << 3.5e-3;
        QTest::newRow("milliohm word") << "3.5 mohm" << Unit::Ohm << 3.5e-3;
        QTest::newRow("ohms word") << "120 ohms" << Unit::Ohm << 120.0;
        QTest::newRow("kilohertz") << "16 kHz" << Unit::Hertz << 16000.0;
        QTest::newRow("megahertz") << "1MHz" << Unit::Hertz << 1e6;
        QTest::newRow("nanocoulomb") << "80 nC" << Unit::Coulomb << 80e-9;
        QTest::newRow("micro sign") << "500 µH" << Unit::Henry << 500e-6;
        QTest::newRow("micro u") << "500 uH" << Unit::Henry << 500e-6;
        QTest::newRow("picofarad") << "1500 pF" << Unit::Farad << 1.5e-9;
        QTest::newRow("gigaohm") << "2 GΩ" << Unit::Ohm << 2e9;
        // IEC 60062: the letter stands for the decimal sign and the multiplier.
        QTest::newRow("4k7") << "4k7" << Unit::Ohm << 4700.0;
        QTest::newRow("4R7") << "4R7" << Unit::Ohm << 4.7;
        QTest::newRow("3m3") << "3m3" << Unit::Ohm << 0.0033;
        QTest::newRow("1M5 with symbol") << "1M5 Ω" << Unit::Ohm << 1.5e6;
        QTest::newRow("10R") << "10R" << Unit::Ohm << 10.0;
        QTest::newRow("celsius") << "85 °C" << Unit::Celsius << 85.0;
        QTest::newRow("celsius C") << "85 C" << Unit::Celsius << 85.0;
        QTest::newRow("celsius degC") << "-40 degC" << Unit::Celsius << -40.0;
        // SI Brochure §2.3.1: t/°C = T/K − 273.15.
        QTest::newRow("kelvin as celsius") << "373.15 K" << Unit::Celsius << 100.0;
        QTest::newRow("K/W") << "2.2 K/W" << Unit::KelvinPerWatt << 2.2;
        QTest::newRow("°C/W") << "0.5 °C/W" << Unit::KelvinPerWatt << 0.5;
        QTest::newRow("mm²") << "10 mm²" << Unit::SquareMillimetre << 10.0;
        QTest::newRow("mm2") << "35mm2" << Unit::SquareMillimetre << 35.0;
        QTest::newRow("mm² as m²") << "160 mm²" << Unit::SquareMetre << 160e-6;
        QTest::newRow("m2 is a unit, not 35.2 milli") << "35m2" << Unit::SquareMetre << 35.0;
        QTest::newRow("mV/K") << "-2 mV/K" << Unit::VoltPerKelvin << -2e-3;
        QTest::newRow("kV/mm") << "20 kV/mm" << Unit::VoltPerMetre << 20e6;
        QTest::newRow("percent") << "5 %" << Unit::Percent << 0.05;
        QTest::newRow("percent ratio") << "50%" << Unit::None << 0.5;
        QTest::newRow("rpm") << "3000 rpm" << Unit::Rpm << 3000.0;
        // 1 rpm = 2π/60 rad/s, exact.
        QTest::newRow("rpm as rad/s") << "60 rpm" << Unit::RadianPerSecond << 2.0 * std::numbers::pi;
        QTest::newRow("metre is not milli") << "3 m" << Unit::Metre << 3.0;
        QTest::newRow("micrometre") << "50 µm" << Unit::Metre << 50e-6;
        QTest::newRow("grams") << "250 g" << Unit::Kilogram << 0.25;
        QTest::newRow("W/mK") << "1.6 W/(m·K)" << Unit::WattPerMetreKelvin << 1.6;
        QTest::newRow("eV") << "1.11 eV" << Unit::ElectronVolt << 1.11;
        QTest::newRow("A/V²") << "60 A/V²" << Unit::AmperePerSquareVolt << 60.0;
        QTest::newRow("ampere-seconds") << "100 nAs" << Unit::Coulomb << 100e-9;
        QTest::newRow("minutes") << "2 min" << Unit::Second << 120.0;
        QTest::newRow("spaces around") << "  12 V  " << Unit::Volt << 12.0;
        QTest::newRow("leading point") << ".5 A" << Unit::Ampere << 0.5;
        QTest::newRow("plus sign") << "+3 V" << Unit::Volt << 3.0;
    }
    void parseGood() {
        QFETCH(QString, text);
        QFETCH(Unit, unit);
        QFETCH(double, expected);
        const auto p = amp::units::parse(text.toStdString(), unit);
        QVERIFY2(p, p.error.c_str());
        QVERIFY(p.error.empty());
        // Exact decimal conversions: equal within a few ulps (relative 1e-12).
        QVERIFY2(std::abs(*p.value - expected) <= 1e-12 * std::max(1.0, std::abs(expected)),
                 qPrintable(QString("%1 -> %2, expected %3").arg(text).arg(*p.value, 0, 'g', 17).arg(expected)));
    }

    void parseBad_data() {
        QTest::addColumn<QString>("text");
        QTest::addColumn<Unit>("unit");
        QTest::addColumn<QString>("fragment"); // must appear in the message
        QTest::newRow("empty") << "" << Unit::Ohm << "empty";
        QTest::newRow("blank") << "   " << Unit::Volt << "empty";
        QTest::newRow("double point") << "3..5" << Unit::None << "'3..5' is not a number";
        QTest::newRow("comma") << "1,5" << Unit::Volt << "decimal point";
        QTest::newRow("parsecs") << "12 parsecs" << Unit::Metre << "unknown unit 'parsecs'";
        QTest::newRow("volts for ohms") << "5 V" << Unit::Ohm << "is in V, but Ω is expected";
        QTest::newRow("millivolts for ohms") << "5 mV" << Unit::Ohm << "is in V, but Ω is expected";
        QTest::newRow("unit on a plain number") << "5 A" << Unit::None << "plain number";
        QTest::newRow("nan") << "NaN" << Unit::Volt << "not a finite number";
        QTest::newRow("negative nan") << "-nan" << Unit::Volt << "not a finite number";
        QTest::newRow("inf") << "inf" << Unit::Ampere << "not a finite number";
        QTest::newRow("Infinity") << "-Infinity V" << Unit::Volt << "not a finite number";
        QTest::newRow("overflow") << "1e999" << Unit::Volt << "out of range";
        QTest::newRow("overflow by prefix") << "1e305 G" << Unit::Volt << "out of range";
        QTest::newRow("trailing garbage") << "5 Ω xyz" << Unit::Ohm << "unexpected text 'xyz'";
        QTest::newRow("trailing glued") << "5Ωx" << Unit::Ohm << "unknown unit 'Ωx'";
        QTest::newRow("words") << "five" << Unit::Volt << "'five' is not a number";
        QTest::newRow("lone point") << "." << Unit::Volt << "is not a number";
        QTest::newRow("dangling exponent") << "1e" << Unit::Volt << "is not a number";
        QTest::newRow("two numbers") << "3 4" << Unit::Volt << "is not a number";
        QTest::newRow("R notation for volts") << "4R7" << Unit::Volt << "for resistances";
        QTest::newRow("prefix after 4k7") << "4k7 k" << Unit::Ohm << "second prefix";
        QTest::newRow("prefixed celsius") << "85 m°C" << Unit::Celsius << "unknown unit";
    }
    void parseBad() {
        QFETCH(QString, text);
        QFETCH(Unit, unit);
        QFETCH(QString, fragment);
        const auto p = amp::units::parse(text.toStdString(), unit);
        QVERIFY2(!p, qPrintable(text + " was accepted"));
        QVERIFY(!p.value.has_value());
        QVERIFY2(QString::fromStdString(p.error).contains(fragment),
                 qPrintable("message was: " + QString::fromStdString(p.error)));
    }

    void format_data() {
        QTest::addColumn<double>("si");
        QTest::addColumn<Unit>("unit");
        QTest::addColumn<int>("digits");
        QTest::addColumn<QString>("expected");
        QTest::newRow("milliohm") << 0.0035 << Unit::Ohm << 4 << "3.5 mΩ";
        QTest::newRow("kilohm") << 4700.0 << Unit::Ohm << 4 << "4.7 kΩ";
        QTest::newRow("celsius") << 85.0 << Unit::Celsius << 4 << "85 °C";
        QTest::newRow("K/W") << 2.2 << Unit::KelvinPerWatt << 4 << "2.2 K/W";
        QTest::newRow("kHz") << 16000.0 << Unit::Hertz << 4 << "16 kHz";
        QTest::newRow("nC") << 80e-9 << Unit::Coulomb << 4 << "80 nC";
        QTest::newRow("ns") << 500e-9 << Unit::Second << 4 << "500 ns";
        QTest::newRow("long time, no ks") << 1e7 << Unit::Second << 4 << "1e7 s";
        QTest::newRow("rounding 3 digits") << 0.0123456 << Unit::Ampere << 3 << "12.3 mA";
        QTest::newRow("rounding carries prefix") << 999.96 << Unit::Volt << 4 << "1 kV";
        QTest::newRow("negative") << -2e-3 << Unit::VoltPerKelvin << 4 << "-2 mV/K";
        QTest::newRow("zero") << 0.0 << Unit::Watt << 4 << "0 W";
        QTest::newRow("mm²") << 35.0 << Unit::SquareMillimetre << 4 << "35 mm²";
        QTest::newRow("small m² as mm²") << 1.6e-4 << Unit::SquareMetre << 4 << "160 mm²";
        QTest::newRow("percent") << 0.05 << Unit::Percent << 4 << "5 %";
        QTest::newRow("ratio") << 0.98 << Unit::None << 4 << "0.98";
        QTest::newRow("tiny ratio") << 1e-11 << Unit::None << 4 << "1e-11";
        QTest::newRow("micrometre") << 50e-6 << Unit::Metre << 4 << "50 µm";
        QTest::newRow("grams") << 0.25 << Unit::Kilogram << 4 << "250 g";
        QTest::newRow("rpm") << 2000.0 << Unit::Rpm << 4 << "2000 rpm";
        QTest::newRow("W/(m·K)") << 0.6 << Unit::WattPerMetreKelvin << 4 << "0.6 W/(m·K)";
        QTest::newRow("one digit") << 4.75 << Unit::Volt << 1 << "5 V";
    }
    void format() {
        QFETCH(double, si);
        QFETCH(Unit, unit);
        QFETCH(int, digits);
        QFETCH(QString, expected);
        QCOMPARE(QString::fromStdString(amp::units::format(si, unit, digits)), expected);
    }

    void formatNeverNaN() {
        // Bad numbers are shown as words, never as "nan".
        const std::string s = amp::units::format(std::nan(""), Unit::Volt);
        QVERIFY(s.find("nan") == std::string::npos);
        QVERIFY(!s.empty());
    }

    void plainNumbers() {
        // Messages print plain decimals between 1e-3 and 1e7 (this project's rule); the expected
        // text is the value written out in decimal by hand, rounded to the digits asked for.
        QCOMPARE(QString::fromStdString(amp::units::plain(1e4)), QString("10000"));
        QCOMPARE(QString::fromStdString(amp::units::plain(3721.6)), QString("3720"));
        QCOMPARE(QString::fromStdString(amp::units::plain(9999999.0, 7)), QString("9999999"));
        QCOMPARE(QString::fromStdString(amp::units::plain(0.0042)), QString("0.0042"));
        QCOMPARE(QString::fromStdString(amp::units::plain(-14.06)), QString("-14.1"));
        QCOMPARE(QString::fromStdString(amp::units::plain(0.0)), QString("0"));
        QCOMPARE(QString::fromStdString(amp::units::plain(89.9713, 4)), QString("89.97"));
        // Outside the band an exponent is clearer than a run of zeros.
        QCOMPARE(QString::fromStdString(amp::units::plain(2e-5)), QString("2e-05"));
        QCOMPARE(QString::fromStdString(amp::units::plain(1.5e8)), QString("1.5e+08"));
        // Rounding that carries into the band's edge stays readable.
        QCOMPARE(QString::fromStdString(amp::units::plain(9996.0)), QString("10000"));
        QCOMPARE(QString::fromStdString(amp::units::plain(std::nan(""))), QString("not a number"));
    }

    void plainMatchesPrintf() {
        // plain() is specified by C's printf conversions (ISO C 7.21.6.1): round to `sig`
        // significant digits as "%.*e" prints them and read the text back (strtod), print that
        // with "%.*f" at sig − 1 − floor(log10|r|) decimals and drop trailing zeros, or "%.*g"
        // outside 1e-3 ≤ |r| < 1e7. The reference below is that recipe written with snprintf and
        // strtod; plain() must give the same bytes on the tricky values (rounding that carries into
        // the next decade, the band's edges, halfway cases, negatives, −0, subnormals) and on a
        // sweep of pseudo-random values over the whole range of magnitudes.
        const auto reference = [](double v, int sig) -> std::string {
            if (std::isnan(v))
                return "not a number";
            if (std::isinf(v))
                return v > 0 ? "∞" : "−∞";
            sig = std::clamp(sig, 1, 15);
            char buf[512];
            double r = v;
            if (v != 0.0) {
                std::snprintf(buf, sizeof buf, "%.*e", sig - 1, v);
                r = std::strtod(buf, nullptr);
            }
            const double a = std::abs(r);
            if (!(a == 0.0 || (a >= 1e-3 && a < 1e7))) {
                std::snprintf(buf, sizeof buf, "%.*g", sig, r);
                return buf;
            }
            if (r == 0.0)
                return "0";
            const int mag = static_cast<int>(std::floor(std::log10(a)));
            std::snprintf(buf, sizeof buf, "%.*f", std::max(0, sig - 1 - mag), r);
            std::string s = buf;
            if (s.find('.') != std::string::npos) {
                while (s.back() == '0')
                    s.pop_back();
                if (s.back() == '.')
                    s.pop_back();
            }
            return s == "-0" ? "0" : s;
        };
        const std::vector<double> tricky = {9.9995,     0.00099995, 0.0009995,  0.00099949, 9999999.4, 9999999.5,
                                            9999995.0,  1e7,        1e7 - 1e-9, 0.001,      0.00099999, 1e-3 - 1e-19,
                                            -9.9995,    -0.0,       0.0,        0.5,        2.5,        0.125,
                                            1.0005,     1.0015,     99.95,      999.5,      0.015,      1e-320,
                                            1.7e308,    -1.7e308,   123456.5,   3721.6,     89.9713,    -14.06,
                                            1e-7,       1e15,       5e-324,     0.1 + 0.2,  1.0 / 3.0,  2.0 / 3.0};
        for (const double v : tricky)
            for (int sig = 0; sig <= 16; ++sig)
                QCOMPARE(QString::fromStdString(amp::units::plain(v, sig)),
                         QString::fromStdString(reference(v, sig)));
        // xorshift64 (G. Marsaglia, J. Stat. Softw. 8(14), 2003): random bit patterns of finite
        // doubles, and random mantissas at decade-spread magnitudes.
        std::uint64_t x = 0x9E3779B97F4A7C15ULL;
        const auto next = [&x]() {
            x ^= x << 13;
            x ^= x >> 7;
            x ^= x << 17;
            return x;
        };
        for (int i = 0; i < 40000; ++i) {
            double bits = 0.0;
            const std::uint64_t raw = next();
            std::memcpy(&bits, &raw, sizeof bits);
            const double scaled = (static_cast<double>(next() >> 11) / 9007199254740992.0 - 0.5) *
                                  std::pow(10.0, static_cast<int>(next() % 40) - 20);
            const int sig = 1 + static_cast<int>(next() % 15);
            for (const double v : {bits, scaled})
                if (std::isfinite(v) && amp::units::plain(v, sig) != reference(v, sig))
                    QFAIL(qPrintable(QString("plain(%1, %2) = %3, printf gives %4")
                                         .arg(v, 0, 'g', 17)
                                         .arg(sig)
                                         .arg(QString::fromStdString(amp::units::plain(v, sig)))
                                         .arg(QString::fromStdString(reference(v, sig)))));
        }
    }

    void roundTrip() {
        // format() output parses back to the value within the formatted precision (4 digits:
        // relative 5e-4).
        const double values[] = {0.0035, 4700.0, 1.25e-7, 16000.0, 2.2, 85.0, 3.3e-12, 123456.0};
        const Unit units[] = {Unit::Ohm, Unit::Ohm, Unit::Farad, Unit::Hertz, Unit::KelvinPerWatt,
                              Unit::Celsius, Unit::Coulomb, Unit::Volt};
        for (std::size_t i = 0; i < std::size(values); ++i) {
            const std::string text = amp::units::format(values[i], units[i]);
            const auto p = amp::units::parse(text, units[i]);
            QVERIFY2(p, (text + ": " + p.error).c_str());
            QVERIFY2(amp::test::relDiff(*p.value, values[i]) < 5e-4, text.c_str());
        }
    }

    void unitFromKey_data() {
        QTest::addColumn<QString>("key");
        QTest::addColumn<int>("unit"); // -1 = no unit suffix
        QTest::newRow("ohm") << "rdsOn25_ohm" << int(Unit::Ohm);
        QTest::newRow("celsius") << "tjMax_C" << int(Unit::Celsius);
        QTest::newRow("charge") << "qg_As" << int(Unit::Coulomb);
        QTest::newRow("hertz") << "frequency_Hz" << int(Unit::Hertz);
        QTest::newRow("mm2") << "crossSection_mm2" << int(Unit::SquareMillimetre);
        QTest::newRow("m2") << "area_m2" << int(Unit::SquareMetre);
        QTest::newRow("KperW") << "rthJc_KperW" << int(Unit::KelvinPerWatt);
        QTest::newRow("last underscore") << "some_name_V" << int(Unit::Volt);
        QTest::newRow("Vperm") << "dielectricStrength_Vperm" << int(Unit::VoltPerMetre);
        QTest::newRow("NmPerA") << "torqueConstant_NmPerA" << int(Unit::NewtonMetrePerAmpere);
        QTest::newRow("none") << "betaF" << -1;
        QTest::newRow("unknown suffix") << "thing_parsec" << -1;
        QTest::newRow("trailing underscore") << "thing_" << -1;
    }
    void unitFromKey() {
        QFETCH(QString, key);
        QFETCH(int, unit);
        const auto u = amp::units::unitFromKey(key.toStdString());
        if (unit < 0)
            QVERIFY(!u.has_value());
        else {
            QVERIFY(u.has_value());
            QCOMPARE(int(*u), unit);
        }
    }

    void symbols() {
        QCOMPARE(QString::fromStdString(std::string(amp::units::symbol(Unit::Ohm))), QString("Ω"));
        QCOMPARE(QString::fromStdString(std::string(amp::units::symbol(Unit::Celsius))), QString("°C"));
        QVERIFY(amp::units::symbol(Unit::None).empty());
    }
};

QTEST_GUILESS_MAIN(TestUnits)
#include "test_units.moc"

// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/model/fields.h"

#include "core/io/markdown.h"
#include "core/model/design.h"
#include "core/model/design_json.h"

#include <nlohmann/json.hpp>

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>
#include <set>
#include <sstream>
#include <unordered_map>

namespace amp {

namespace {

using units::Unit;
using Type = FieldSpec::Type;
using Table = std::vector<FieldSpec>;

// ---- Builders -------------------------------------------------------------------------------

FieldSpec num(std::string path, Unit unit, double min, double max, std::string label, std::string help,
              bool minExclusive = false) {
    FieldSpec f;
    f.path = std::move(path);
    f.type = Type::Number;
    f.unit = unit;
    f.min = min;
    f.max = max;
    f.minExclusive = minExclusive;
    f.label = std::move(label);
    f.help = std::move(help);
    return f;
}

FieldSpec whole(std::string path, double min, double max, std::string label, std::string help) {
    FieldSpec f = num(std::move(path), Unit::None, min, max, std::move(label), std::move(help));
    f.type = Type::Integer;
    return f;
}

FieldSpec flag(std::string path, std::string label, std::string help) {
    FieldSpec f;
    f.path = std::move(path);
    f.type = Type::Boolean;
    f.label = std::move(label);
    f.help = std::move(help);
    return f;
}

FieldSpec text(std::string path, std::string label, std::string help) {
    FieldSpec f;
    f.path = std::move(path);
    f.type = Type::Text;
    f.label = std::move(label);
    f.help = std::move(help);
    return f;
}

FieldSpec choice(std::string path, std::vector<std::string> choices, std::string label, std::string help) {
    FieldSpec f;
    f.path = std::move(path);
    f.type = Type::Choice;
    f.choices = std::move(choices);
    f.label = std::move(label);
    f.help = std::move(help);
    return f;
}

/// A list of objects; min/max are the allowed numbers of items.
FieldSpec list(std::string path, double minItems, double maxItems, std::string label, std::string help) {
    FieldSpec f;
    f.path = std::move(path);
    f.type = Type::List;
    f.min = minItems;
    f.max = maxItems;
    f.label = std::move(label);
    f.help = std::move(help);
    return f;
}

FieldSpec req(FieldSpec f) {
    f.required = true;
    return f;
}

void append(Table& out, const std::string& prefix, const Table& fields) {
    for (FieldSpec f : fields) {
        f.path = prefix + f.path;
        out.push_back(std::move(f));
    }
}

// ---- Part bodies (paths relative to the part) ------------------------------------------------

Table fosterFields(const std::string& what) {
    return {
        list("zthJc", 0, 10, "Z_th,jc Foster stages",
             "Optional Foster fit of the " + what +
                 "'s junction-to-case transient thermal impedance, Z(t) = Σ r·(1 − e^(−t/τ)). "
                 "2–5 stages are usual. A Foster fit reproduces the curve only and does not chain with the "
                 "heatsink's network: the junction rides on the case (heatsink plus interface drop) and the "
                 "device's power goes straight into the heatsink. Empty: R_th,jc acts at once, as if the die "
                 "had no heat capacity (pessimistic for short pulses)."),
        num("zthJc[].r_KperW", Unit::KelvinPerWatt, 0.0, 100.0, "Stage resistance",
            "Thermal resistance r_i of one Foster stage; the stages add up to about R_th,jc."),
        num("zthJc[].tau_s", Unit::Second, 1e-9, 1e4, "Stage time constant",
            "Time constant τ_i of one Foster stage; a die and case span about 10 µs … 1 s."),
    };
}

Table bjtFields(bool isDriver) {
    const std::string who = isDriver ? "driver transistor" : "output transistor";
    // Which of these a part file must state depends on the switch kind: see validatePartJson().
    return {
        num("saturationCurrent25_A", Unit::Ampere, 1e-20, 1e-3, "I_S at 25 °C",
            "Transport saturation current of the " + who +
                " at 25 °C; sets V_BE at a given collector current. Power devices: 1e-13 … 1e-9 A."),
        num("betaF", Unit::None, 1.0, 1e4, "β_F",
            "Forward current gain of the " + who + " at low current. Power bipolars 20–100; small "
            "driver transistors 50–300."),
        num("betaR", Unit::None, 0.01, 1000.0, "β_R",
            "Reverse current gain (collector and emitter swapped), usually 1–10."),
        num("highCurrentKnee_A", Unit::Ampere, 1e-3, 1e4, "High-current knee I_KF",
            "Collector current above which β_F rolls off (high injection); often about half the "
            "rated current of a power transistor."),
        num("emissionCoefficient", Unit::None, 0.5, 3.0, "Emission coefficient N_F",
            "Ideality factor of the forward emission law, I_C ∝ exp(V_BE/(N_F·V_T)); 1.0–1.3."),
        num("baseResistance_ohm", Unit::Ohm, 0.0, 1000.0, "Base resistance",
            "Internal series base resistance r_b; 0.01–1 Ω for power devices, more for drivers."),
        num("emitterResistance_ohm", Unit::Ohm, 0.0, 100.0, "Emitter resistance",
            "Internal series emitter resistance r_e (bond wires, metallisation); 1–50 mΩ."),
        num("collectorResistance_ohm", Unit::Ohm, 0.0, 100.0, "Collector resistance",
            "Internal series collector resistance r_c (substrate, leads); 5–100 mΩ."),
        num("xti", Unit::None, 0.0, 10.0, "XTI",
            "Saturation-current temperature exponent of the Gummel–Poon law; 3 for silicon."),
        num("bandgap_eV", Unit::ElectronVolt, 0.5, 3.5, "Band gap E_g",
            "Energy gap in the I_S temperature law; 1.11 eV for silicon."),
        num("betaTempExponent", Unit::None, -5.0, 5.0, "XTB",
            "Temperature exponent of β: β ∝ (T/T0)^XTB; 1–2 for silicon power bipolars."),
        num("storageTime_s", Unit::Second, 0.0, 1e-3, "Storage time t_s",
            "Turn-off storage time at the reference forced β; 0.5–3 µs (Darlingtons 2–10 µs)."),
        num("fallTime_s", Unit::Second, 0.0, 1e-3, "Fall time t_f",
            "Collector current fall time at turn-off; 0.1–1 µs (Darlingtons up to 3 µs)."),
        num("riseTime_s", Unit::Second, 0.0, 1e-3, "Rise time t_r",
            "Collector current rise time at turn-on; 0.1–1 µs."),
        num("vceSat_V", Unit::Volt, 0.0, 10.0, "V_CE(sat)",
            "Datasheet saturation voltage at rated current (informative); 0.3–1 V, Darlingtons 1.5–3 V."),
    };
}

Table mosfetFields() {
    return {
        req(num("rdsOn25_ohm", Unit::Ohm, 1e-5, 100.0, "R_ds(on) at 25 °C",
                "On-resistance at T_j = 25 °C at the specified gate voltage. TO-220-class parts: about "
                "1–3 mΩ (40 V) to 5–15 mΩ (150 V).")),
        num("rdsOnTempExponent", Unit::None, 0.0, 4.0, "R_ds(on) temperature exponent a",
            "R(T) = R25·((T + 273.15)/298.15)^a. Drift-dominated silicon ≈ 2.3–2.5 (electron "
            "mobility ∝ T^−2.42), low-voltage parts lower (≈ 1.5–2)."),
        list("rdsOnTable", 0, 50, "R_ds(on) table",
             "Optional normalised R_ds(on)(T_j)/R_ds(on)(25 °C) points, ascending in T_j; replaces the "
             "exponent law when not empty."),
        num("rdsOnTable[].tj_C", Unit::Celsius, -60.0, 250.0, "Junction temperature",
            "Junction temperature of this table point."),
        num("rdsOnTable[].factor", Unit::None, 0.1, 10.0, "R(T)/R(25 °C)",
            "On-resistance relative to 25 °C; about 1.5–2.3 at 150 °C."),
        num("rdsOnSpecGate_V", Unit::Volt, 1.0, 30.0, "Gate voltage of the R_ds(on) rating",
            "Gate-source voltage at which R_ds(on) is specified; 10 V standard, 4.5 V logic level."),
        req(num("vth_V", Unit::Volt, 0.3, 10.0, "Threshold V_th",
                "Gate threshold voltage at 25 °C; 2–4 V standard level, 1–2.5 V logic level.")),
        num("vthTempCoeff_VperK", Unit::VoltPerKelvin, -0.05, 0.01, "dV_th/dT",
            "Temperature coefficient of the threshold; about −4 … −8 mV/K."),
        num("transconductance_AperV2", Unit::AmperePerSquareVolt, 1e-3, 1e4, "Square-law K",
            "K in I_D = K·(V_GS − V_th)² in saturation at 25 °C; 10–100 A/V² for power MOSFETs."),
        req(num("qg_As", Unit::Coulomb, 0.0, 1e-5, "Total gate charge Q_g",
                "Total gate charge at the drive voltage; 20–200 nC for TO-220-class parts.")),
        num("qgs_As", Unit::Coulomb, 0.0, 1e-5, "Gate-source charge Q_gs",
            "Gate charge up to the start of the Miller plateau."),
        num("qgs2_As", Unit::Coulomb, 0.0, 1e-5, "Q_gs2 (V_th to plateau)",
            "Gate charge from the threshold to the plateau; sets the current rise and fall times."),
        req(num("qgd_As", Unit::Coulomb, 0.0, 1e-5, "Miller charge Q_gd",
                "Gate-drain (Miller) charge; sets the voltage rise and fall times.")),
        num("plateau_V", Unit::Volt, 0.5, 15.0, "Miller plateau voltage",
            "Gate voltage during the Miller plateau at the switched current; 3–6 V."),
        num("rgInternal_ohm", Unit::Ohm, 0.0, 100.0, "Internal gate resistance",
            "Gate resistance inside the package; 0.5–5 Ω."),
        num("coss_F", Unit::Farad, 0.0, 1e-6, "C_oss",
            "Output capacitance at the reference voltage; 0.3–3 nF for TO-220-class parts."),
        num("cossRef_V", Unit::Volt, 0.1, 1e4, "C_oss reference voltage",
            "Drain-source voltage at which C_oss is stated, often half the rating."),
        choice("cossLaw", {"constant", "sqrt"}, "C_oss voltage law",
               "How C_oss varies with voltage: \"constant\" or \"sqrt\" (C ∝ V^−½, abrupt junction)."),
        num("bodyDiodeVf_V", Unit::Volt, 0.0, 3.0, "Body diode V_f0",
            "Body-diode forward drop at low current, 25 °C; 0.6–0.9 V."),
        num("bodyDiodeRd_ohm", Unit::Ohm, 0.0, 1.0, "Body diode r_d",
            "Body-diode slope resistance; a few mΩ."),
        num("bodyDiodeQrr_As", Unit::Coulomb, 0.0, 1e-4, "Body diode Q_rr",
            "Body-diode reverse-recovery charge; 30 nC … 1 µC."),
        num("avalancheRepetitive_J", Unit::Joule, 0.0, 100.0, "Repetitive avalanche energy",
            "Repetitive avalanche energy rating per pulse; 0 = not rated."),
        num("breakdown_V", Unit::Volt, 0.0, 1e4, "Avalanche breakdown voltage",
            "Breakdown voltage in avalanche; 0 = take 1.2 × the voltage rating."),
    };
}

Table switchBody() {
    Table t = {
        req(choice("kind", {"mosfet", "bipolar", "darlington"}, "Device type",
                   "Switch technology: \"mosfet\", \"bipolar\" or \"darlington\".")),
        text("package", "Package", "Package outline, e.g. TO-220, TO-247 (informative)."),
        flag("tabLive", "Tab tied to drain/collector",
             "True when the mounting tab is the drain or collector: the heatsink is live unless insulated."),
        req(num("voltageRating_V", Unit::Volt, 1.0, 1e4, "Voltage rating",
                "V_DS(max) or V_CEO. Choose at least 1.5–2 × the highest bus voltage.")),
        req(num("currentRating_A", Unit::Ampere, 0.01, 1e4, "Continuous current rating",
                "Continuous drain/collector current at a case temperature of 25 °C (silicon limit).")),
        num("leadLimit_A", Unit::Ampere, 0.0, 1e4, "Package lead limit",
            "Current the package leads and bond wires carry; TO-220 class ≈ 75–100 A; 0 = not stated."),
        req(num("tjMax_C", Unit::Celsius, 50.0, 250.0, "Maximum junction temperature",
                "Highest rated junction temperature; 150–175 °C for silicon.")),
        req(num("rthJc_KperW", Unit::KelvinPerWatt, 1e-3, 100.0, "R_th,jc",
                "Junction-to-case thermal resistance; 0.3–1.5 K/W for TO-220/TO-247 parts.")),
    };
    append(t, "", fosterFields("switch"));
    Table soa = {
        list("soa", 0, 100, "Safe operating area",
             "Points of the safe operating area (DC and pulsed); an operating point beyond them fails."),
        num("soa[].voltage_V", Unit::Volt, 0.0, 1e4, "SOA voltage", "Drain/collector voltage of the point."),
        num("soa[].current_A", Unit::Ampere, 0.0, 1e5, "SOA current", "Current allowed at that voltage."),
        num("soa[].pulse_s", Unit::Second, 0.0, 1e4, "SOA pulse length",
            "Pulse length for this point; 0 = DC."),
        num("shortCircuitTime_s", Unit::Second, 0.0, 1e-2, "Short-circuit withstand time",
            "Time the device survives a short circuit at the rated voltage; 0 = not rated (usual for "
            "MOSFETs)."),
        num("cost", Unit::None, 0.0, 1e6, "Unit cost", "Unit price in your currency (optional)."),
    };
    append(t, "", soa);
    append(t, "mosfet.", mosfetFields());
    append(t, "bjt.", bjtFields(false));
    append(t, "driver.", bjtFields(true));
    return t;
}

Table diodeBody() {
    Table t = {
        text("package", "Package", "Package outline, e.g. TO-247 (informative)."),
        flag("tabLive", "Tab tied to cathode", "True when the tab is the cathode (live heatsink)."),
        req(num("vf0_V", Unit::Volt, 0.0, 5.0, "V_f0",
                "Forward voltage intercept at 25 °C in V_f = V_f0 + r_d·I; Schottky 0.3–0.5 V, "
                "fast-recovery pn 0.6–0.9 V.")),
        req(num("rd_ohm", Unit::Ohm, 0.0, 10.0, "Slope resistance r_d",
                "Forward slope resistance at 25 °C; a few mΩ for 30–60 A diodes.")),
        num("vfTempCoeff_VperK", Unit::VoltPerKelvin, -0.01, 0.01, "dV_f0/dT",
            "Temperature coefficient of V_f0; about −1 … −2 mV/K."),
        num("qrr_As", Unit::Coulomb, 0.0, 1e-4, "Reverse-recovery charge Q_rr",
            "Charge drawn at turn-off; Schottky tens of nC (capacitive), fast pn 0.1–1 µC."),
        req(num("currentRating_A", Unit::Ampere, 0.01, 1e4, "Average current rating",
                "Average forward current rating.")),
        req(num("voltageRating_V", Unit::Volt, 1.0, 1e4, "Reverse voltage rating",
                "Repetitive peak reverse voltage; at least 1.5 × the highest bus voltage.")),
        num("tjMax_C", Unit::Celsius, 50.0, 250.0, "Maximum junction temperature",
            "Highest rated junction temperature; 150–175 °C."),
        req(num("rthJc_KperW", Unit::KelvinPerWatt, 1e-3, 100.0, "R_th,jc",
                "Junction-to-case thermal resistance; 0.4–2 K/W.")),
    };
    append(t, "", fosterFields("diode"));
    t.push_back(num("cost", Unit::None, 0.0, 1e6, "Unit cost", "Unit price in your currency (optional)."));
    return t;
}

Table interfaceBody() {
    return {
        req(choice("kind", {"grease", "pad", "washer"}, "Interface type",
                   "\"grease\" (not insulating), \"pad\" (silicone elastomer) or \"washer\" (mica, polyimide).")),
        req(num("conductivity_WperMK", Unit::WattPerMetreKelvin, 0.01, 500.0, "Thermal conductivity",
                "Bulk conductivity k; grease 0.4–3, silicone pad 1–5, mica 0.5–0.7 W/(m·K).")),
        req(num("thickness_m", Unit::Metre, 1e-6, 0.01, "Thickness",
                "Layer thickness t; grease 25–100 µm, pads 0.1–0.5 mm, mica 50–100 µm.")),
        req(num("area_m2", Unit::SquareMetre, 1e-6, 0.1, "Contact area",
                "Contact area per device; TO-220 ≈ 100–160 mm², TO-247 ≈ 250–350 mm².")),
        num("contactResistance_KperW", Unit::KelvinPerWatt, 0.0, 100.0, "Contact resistance",
            "Per device, added to t/(k·A): surface flatness and mounting pressure; 0.02–0.5 K/W."),
        flag("insulating", "Electrically insulating",
             "True when the layer isolates the tab from the heatsink."),
        num("dielectricStrength_Vperm", Unit::VoltPerMetre, 0.0, 1e9, "Dielectric strength",
            "Breakdown field of an insulating layer (enter kV/mm); silicone pads ≈ 10–20 kV/mm, "
            "mica higher; 0 = not insulating."),
    };
}

Table contactorBody() {
    return {
        req(num("continuousCurrent_A", Unit::Ampere, 0.1, 1e4, "Continuous current",
                "Thermal (continuous) current rating of the contacts.")),
        req(num("ratedVoltage_V", Unit::Volt, 1.0, 1e4, "Rated DC voltage",
                "DC voltage rating of the contacts; must cover the highest bus voltage.")),
        num("dcBreaking_A", Unit::Ampere, 0.0, 1e5, "DC breaking capacity",
            "Current the contacts can break at the rated voltage; 0 = not stated (must not break load)."),
        req(num("coilVoltage_V", Unit::Volt, 1.0, 1000.0, "Coil voltage", "Rated coil voltage; 12–96 V.")),
        req(num("coilResistance_ohm", Unit::Ohm, 0.1, 1e5, "Coil resistance",
                "Coil resistance at 20 °C; coil power = V²/R, typically 5–30 W.")),
        num("contactResistance_ohm", Unit::Ohm, 0.0, 1.0, "Contact resistance",
            "Resistance of one closed current path; 0.1–1 mΩ."),
        num("pickupTime_s", Unit::Second, 0.0, 1.0, "Pick-up time", "Coil energised to contacts closed; 10–50 ms."),
        num("dropoutTime_s", Unit::Second, 0.0, 1.0, "Drop-out time",
            "Coil released to contacts open, without suppression; 5–30 ms (a plain diode slows it several-fold)."),
        num("bounceTime_s", Unit::Second, 0.0, 0.1, "Bounce time", "Contact bounce after closing; 1–5 ms."),
        num("electricalLife_ops", Unit::None, 0.0, 1e9, "Electrical life",
            "Operations at rated current; 1e4–1e6."),
        num("mechanicalLife_ops", Unit::None, 0.0, 1e10, "Mechanical life",
            "Operations without load; 1e5–1e7."),
        num("cost", Unit::None, 0.0, 1e6, "Unit cost", "Unit price in your currency (optional)."),
    };
}

Table heatsinkBody() {
    return {
        req(num("rthSa_KperW", Unit::KelvinPerWatt, 1e-3, 100.0, "R_th,sa",
                "Sink-to-ambient thermal resistance as stated (natural convection unless noted); "
                "0.1–3 K/W for extrusions.")),
        req(num("mass_kg", Unit::Kilogram, 1e-3, 1000.0, "Mass", "Heatsink mass, for its heat capacity.")),
        num("specificHeat_JperKgK", Unit::JoulePerKilogramKelvin, 100.0, 5000.0, "Specific heat",
            "Specific heat of the material; aluminium ≈ 900 J/(kg·K), copper ≈ 385 J/(kg·K)."),
        num("cost", Unit::None, 0.0, 1e6, "Unit cost", "Unit price in your currency (optional)."),
    };
}

Table partBody(std::string_view kind) {
    if (kind == "switch")
        return switchBody();
    if (kind == "diode")
        return diodeBody();
    if (kind == "interface")
        return interfaceBody();
    if (kind == "contactor")
        return contactorBody();
    if (kind == "heatsink")
        return heatsinkBody();
    return {};
}

std::string kindWord(std::string_view kind) {
    if (kind == "switch")
        return "switch";
    if (kind == "diode")
        return "diode";
    if (kind == "interface")
        return "thermal interface";
    if (kind == "contactor")
        return "contactor";
    return "heatsink";
}

/// A design keeps its own copy of a part: the library id it came from and its name.
Table designPart(std::string_view kind) {
    Table t = {
        text("partId", "Library id", "Id of the library part this copy came from; empty for a custom part."),
        text("name", "Name", "Name of the " + kindWord(kind) + "."),
    };
    for (auto& f : partBody(kind)) {
        f.required = false; // a design's fields are optional with defaults
        t.push_back(std::move(f));
    }
    return t;
}

/// A part file entry: identity, provenance, then the body.
Table partFileTable(std::string_view kind) {
    Table t = {
        req(text("id", "Id", "Unique id of the part in the library, e.g. \"mos-100v-a\".")),
        req(text("name", "Name", "Name shown in the part chooser.")),
        text("note", "Note", "Where the values come from: datasheet, measurement or the scaling rule used."),
        flag("invented", "Invented archetype",
             "True for a generic archetype with invented values (the shipped library); false for a real part."),
    };
    append(t, "", partBody(kind));
    return t;
}

// ---- The design table ----------------------------------------------------------------------

Table buildDesignFields() {
    Table t = {
        text("meta.title", "Title", "Title of the design sheet."),
        text("meta.author", "Author", "Who made the design."),
        text("meta.revision", "Revision", "Revision letter or number."),
        text("meta.date", "Date", "Date as typed (ISO 8601 recommended)."),
        text("meta.notes", "Notes", "Free text for the build log."),

        num("supply.nominal_V", Unit::Volt, 1.0, 1000.0, "Nominal voltage",
            "Battery nominal voltage; 12–120 V for traction batteries."),
        num("supply.max_V", Unit::Volt, 1.0, 1000.0, "Highest voltage",
            "Highest bus voltage: full charge, charger connected, braking. Ratings are checked against it."),
        num("supply.min_V", Unit::Volt, 0.1, 1000.0, "Lowest voltage",
            "Lowest voltage under load (sag, discharged). Drive and performance are checked at it."),
        num("supply.internalResistance_ohm", Unit::Ohm, 0.0, 10.0, "Internal resistance",
            "Battery internal resistance (cables are in Wiring); 5–100 mΩ for traction packs."),
        choice("supply.chemistry", {"lead-acid", "lithium", "nickel", "other"}, "Chemistry",
               "Battery chemistry: \"lead-acid\", \"lithium\", \"nickel\" or \"other\"."),

        choice("motor.kind", {"permanentMagnet", "seriesWound"}, "Motor type",
               "\"permanentMagnet\" (or separately excited, constant k) or \"seriesWound\" (k from the "
               "magnetisation table)."),
        num("motor.armatureResistance20_ohm", Unit::Ohm, 1e-5, 100.0, "Armature resistance at 20 °C",
            "Armature plus brushes (plus series field) at 20 °C; 5–200 mΩ for traction motors."),
        num("motor.windingTemperature_C", Unit::Celsius, -40.0, 250.0, "Winding temperature",
            "Winding temperature at which R_a is used (copper 0.00393/K); 60–120 °C hot."),
        num("motor.inductance_H", Unit::Henry, 1e-7, 10.0, "Armature inductance",
            "Armature inductance L_a; 0.05–5 mH for traction motors."),
        num("motor.torqueConstant_NmPerA", Unit::NewtonMetrePerAmpere, 1e-4, 100.0, "Torque constant k",
            "k in N·m/A, equal to the EMF constant in V·s/rad; 0.02–0.5 for 1–10 kW motors."),
        num("motor.noLoadCurrent_A", Unit::Ampere, 0.0, 1000.0, "No-load current I_0",
            "Current drawn at no load (friction, windage, iron losses); 2–10 % of the rated current."),
        num("motor.rotorInertia_kgm2", Unit::KilogramSquareMetre, 0.0, 100.0, "Rotor inertia",
            "Moment of inertia of the armature; 1e-3–0.1 kg·m²."),
        num("motor.loadInertia_kgm2", Unit::KilogramSquareMetre, 0.0, 1e4, "Load inertia",
            "Load inertia reflected to the motor shaft (vehicle mass through the gearing)."),
        num("motor.demagCurrent_A", Unit::Ampere, 0.0, 1e5, "Demagnetisation current",
            "Highest current the magnets tolerate; 0 = not stated."),
        list("motor.magnetisation", 0, 100, "Magnetisation table",
             "Series-wound motors: torque constant k at each current, ascending in current (at least 2 points)."),
        num("motor.magnetisation[].current_A", Unit::Ampere, 0.0, 1e5, "Current", "Armature (= field) current."),
        num("motor.magnetisation[].torqueConstant_NmPerA", Unit::NewtonMetrePerAmpere, 0.0, 100.0,
            "Torque constant", "k at that current; rises then saturates."),

        num("pwm.frequency_Hz", Unit::Hertz, 10.0, 1e6, "PWM frequency",
            "Switching frequency; 1–20 kHz typical (above 16 kHz is inaudible)."),
        choice("pwm.topology", {"lowSideChopper", "synchronousHalfBridge", "fullBridge"}, "Topology",
               "\"lowSideChopper\" (bank + freewheel diode, contactor reversing), \"synchronousHalfBridge\" "
               "(low bank conducts in the off-time) or \"fullBridge\" (four banks, no contactor)."),
        num("pwm.currentLimit_A", Unit::Ampere, 0.0, 1e5, "Current limit",
            "Controller current limit: at stall or overload the duty is reduced to hold it; 0 = none."),
        num("pwm.maxDuty", Unit::None, 0.0, 1.0, "Maximum duty",
            "Highest duty cycle the controller applies (bootstrap or current sensing may need < 1); 0.9–1.",
            true),
        num("pwm.deadTime_s", Unit::Second, 0.0, 1e-4, "Dead time",
            "Synchronous topologies: both switches off between transitions; 100 ns – 2 µs."),
        choice("pwm.fullBridgeModulation", {"unipolar", "bipolar"}, "Full-bridge PWM",
               "Full bridge only: \"unipolar\" (legs switched apart, the motor sees 0/+V at twice the "
               "carrier) or \"bipolar\" (diagonals together, the motor sees ±V: twice the ripple)."),
        num("pwm.brakingCutoutDelay_s", Unit::Second, 0.0, 10.0, "Braking cut-out delay",
            "Synchronous topologies: how long braking goes on after the battery is lost before the "
            "controller stops it; sets the bus rise. 0 = at once (only the armature's energy); 1–10 ms typical."),

        num("drive.supply_V", Unit::Volt, 1.0, 100.0, "Drive voltage",
            "Gate/base driver output high level at nominal battery voltage; 10–15 V for MOSFETs."),
        num("drive.minSupply_V", Unit::Volt, 0.0, 100.0, "Drive voltage at lowest supply",
            "Driver output at the lowest battery voltage (a sagging 12 V rail)."),
        num("drive.driverResistance_ohm", Unit::Ohm, 0.0, 1000.0, "Driver output resistance",
            "Output resistance of the driver stage; 0.5–10 Ω."),
        num("drive.driverPeakCurrent_A", Unit::Ampere, 1e-3, 100.0, "Driver peak current",
            "Rated peak output current of the driver; 0.5–10 A."),
        num("drive.pulldown_ohm", Unit::Ohm, 0.0, 1e7, "Gate pull-down",
            "Gate-source pull-down per device so a lost drive turns the bank off; 4.7–22 kΩ; 0 = none."),
        num("drive.baseDriveCurrent_A", Unit::Ampere, 0.0, 1000.0, "Base drive current",
            "Bipolar/Darlington banks: total base current; 0 = from the forced β."),
        num("drive.forcedBeta", Unit::None, 1.0, 1000.0, "Forced β",
            "Bipolar banks: I_C/I_B the drive is designed for; 5–20 for hard saturation."),
        num("drive.shortCircuitResponse_s", Unit::Second, 0.0, 1e-3, "Short-circuit response",
            "Time the driver's short-circuit (desaturation) protection needs to turn the bank off; checked "
            "against the part's withstand time. 0 = none stated; 2–10 µs typical."),

        whole("bank.count", 1.0, 64.0, "Devices in parallel", "Number of switches in parallel in the bank; 1–64."),
        list("bank.devices", 0, 64, "Per-device deviations",
             "One entry per device (as many as bank.count): its deviation from the nominal part."),
        num("bank.devices[].rdsOnDeviation", Unit::None, -0.9, 9.0, "R_ds(on) deviation",
            "Relative: R_ds(on) = nominal·(1 + deviation); ±0.05–0.2 between devices."),
        num("bank.devices[].vthDeviation_V", Unit::Volt, -5.0, 5.0, "V_th deviation",
            "Threshold shift of this device; ±0.1–0.5 V."),
        num("bank.devices[].vbeDeviation_V", Unit::Volt, -0.5, 0.5, "V_BE deviation",
            "Bipolar: V_BE shift at fixed I_C (via I_S); ±5–30 mV."),
        num("bank.devices[].betaDeviation", Unit::None, -0.9, 9.0, "β deviation", "Relative β deviation; ±0.1–0.5."),
        num("bank.devices[].gateResistorDeviation_ohm", Unit::Ohm, -1000.0, 1000.0, "Gate resistor deviation",
            "Added to the gate/base resistor of this device."),
        num("bank.devices[].ballastDeviation_ohm", Unit::Ohm, -10.0, 10.0, "Ballast deviation",
            "Added to the ballast resistor of this device."),
        num("bank.devices[].legResistanceDeviation_ohm", Unit::Ohm, -1.0, 1.0, "Leg resistance deviation",
            "Added to the leg (busbar/trace) resistance of this device."),
        num("bank.gateResistor_ohm", Unit::Ohm, 0.0, 1e4, "Gate/base resistor",
            "External gate (or base) resistor per device; 2–22 Ω for MOSFETs."),
        num("bank.ballast_ohm", Unit::Ohm, 0.0, 10.0, "Ballast resistor",
            "Source/emitter ballast resistor per device; 0 for MOSFETs, 0.1–1 Ω for bipolar banks."),
        num("bank.legResistance_ohm", Unit::Ohm, 0.0, 1.0, "Leg resistance",
            "Busbar/trace resistance of each device's leg; 0.1–2 mΩ."),
        num("bank.derating", Unit::None, 0.05, 1.0, "Derating",
            "Highest share of the rated current per device; common practice 1/3–1/2."),
        num("bank.sharingTarget", Unit::None, 1.0, 10.0, "Sharing target",
            "Accepted ratio of the highest to the lowest device current; 1.05–1.2."),
        num("bank.neighbourCoupling_KperW", Unit::KelvinPerWatt, 0.0, 1000.0, "Neighbour coupling",
            "Case-to-case thermal coupling to adjacent devices; 0 = none."),
        whole("bank.diodeCount", 0.0, 64.0, "Freewheel diodes",
              "Freewheel diodes in parallel; at least 1 for a low-side chopper."),
        choice("bank.spread.distribution", {"normal", "uniform"}, "Spread distribution",
               "\"normal\" (values are σ) or \"uniform\" (values are ± half-bands)."),
        num("bank.spread.rdsOn", Unit::None, 0.0, 1.0, "R_ds(on) spread", "Relative spread; 0.03–0.1."),
        num("bank.spread.vth_V", Unit::Volt, 0.0, 2.0, "V_th spread", "Threshold spread; 0.1–0.3 V."),
        num("bank.spread.vbe_V", Unit::Volt, 0.0, 0.5, "V_BE spread", "Bipolar V_BE spread; 5–20 mV."),
        num("bank.spread.beta", Unit::None, 0.0, 1.0, "β spread", "Relative β spread; 0.1–0.3."),
        num("bank.spread.gateResistor", Unit::None, 0.0, 1.0, "Gate resistor spread",
            "Relative resistor tolerance; 0.01–0.05."),
        whole("bank.spread.samples", 1.0, 1e6, "Monte Carlo samples", "Number of Monte Carlo samples; 100–10000."),
        whole("bank.spread.seed", 0.0, 2147483647.0, "Random seed",
              "Seed of the Monte Carlo generator (same seed, same result)."),
    };
    append(t, "bank.device.", designPart("switch"));
    append(t, "bank.interface.", designPart("interface"));
    append(t, "bank.freewheelDiode.", designPart("diode"));

    append(t, "heatsink.part.", designPart("heatsink"));
    Table hs = {
        num("heatsink.ambient_C", Unit::Celsius, -50.0, 150.0, "Ambient temperature",
            "Air temperature around the heatsink (inside an enclosure, the enclosure air); 25–50 °C."),
        flag("heatsink.insulatedFromTabs", "Insulated from the tabs",
             "True when every live tab is insulated from the heatsink."),
        flag("heatsink.wetLocation", "Wet location",
             "Boats, outdoor wash-down: the touch-voltage limit drops from 60 V DC to 30 V DC."),
        flag("heatsink.exposed", "Can be touched", "True when the heatsink can be touched in use."),
        choice("heatsink.mode", {"stated", "geometry"}, "Heatsink given by",
               "\"stated\": R_th,sa and mass of the part as its maker states them; \"geometry\": computed "
               "from the plate-fin extrusion below (optional; default \"stated\")."),
        num("heatsink.rthReferenceRise_K", Unit::Kelvin, 1.0, 500.0, "R_th,sa reference rise",
            "Stated mode: the sink's temperature rise at which R_th,sa is stated; catalogues often use 50–75 K "
            "(optional; default 50 K)."),
        num("heatsink.rthRiseExponent", Unit::None, 0.0, 0.5, "R_th,sa rise exponent",
            "Stated mode: n in R_th,sa ∝ (ΔT/ΔT_ref)^−n; 0 = constant (forced air), about 0.25 for natural "
            "convection (optional; default 0)."),
        num("heatsink.geometry.baseWidth_m", Unit::Metre, 1e-3, 2.0, "Base width",
            "Geometry mode: width of the base across the fins; 50–300 mm (optional; default 150 mm).", true),
        num("heatsink.geometry.baseLength_m", Unit::Metre, 1e-3, 2.0, "Base length",
            "Geometry mode: length along the fins, vertical in natural convection; 50–300 mm (optional; "
            "default 100 mm).",
            true),
        num("heatsink.geometry.baseThickness_m", Unit::Metre, 1e-4, 0.2, "Base thickness",
            "Geometry mode: thickness of the base plate; 4–15 mm (optional; default 8 mm).", true),
        whole("heatsink.geometry.finCount", 0.0, 500.0, "Fin count",
              "Geometry mode: number of fins, 0 for a flat plate, otherwise at least 2 (optional; default 12)."),
        num("heatsink.geometry.finHeight_m", Unit::Metre, 0.0, 0.5, "Fin height",
            "Geometry mode: fin height above the base; 15–60 mm (optional; default 35 mm)."),
        num("heatsink.geometry.finThickness_m", Unit::Metre, 0.0, 0.05, "Fin thickness",
            "Geometry mode: fin thickness; 1–3 mm for extrusions (optional; default 2 mm)."),
        choice("heatsink.geometry.material", {"al6063-t5", "al6063-t6", "al6063-o", "aluminium", "copper"},
               "Material",
               "Geometry mode: aluminium 6063-T5 (209 W/m·K), -T6 (200), -O (218) (Aluminum Association), pure "
               "aluminium (237) or copper (401) (Incropera) (optional; default 6063-T5)."),
        choice("heatsink.geometry.orientation", {"vertical", "horizontal"}, "Orientation",
               "Geometry mode: \"vertical\" (base and fins vertical, air rises along the fins) or "
               "\"horizontal\" (base flat, fins up; derated, a common-practice estimate) (optional; default "
               "vertical)."),
        num("heatsink.geometry.emissivity", Unit::None, 0.0, 1.0, "Emissivity",
            "Geometry mode: surface finish; anodised ≈ 0.8, bare or polished extrusion 0.05–0.1 (optional; "
            "default 0.8)."),
        num("heatsink.geometry.airVelocity_mps", Unit::MetrePerSecond, 0.0, 50.0, "Air velocity",
            "Geometry mode: approach velocity of forced air through the fins (ducted); 0 = natural convection "
            "(optional; default 0)."),
        flag("reversing.present", "Reversing contactor fitted", "True when a contactor reverses the armature."),
    };
    append(t, "", hs);
    append(t, "reversing.contactor.", designPart("contactor"));
    Table rest = {
        choice("reversing.suppression", {"none", "diode", "diodeZener", "tvs"}, "Coil suppression",
               "\"none\", \"diode\" (slow drop-out), \"diodeZener\" or \"tvs\" (fast drop-out)."),
        num("reversing.reversalsPerDay", Unit::None, 0.0, 1e5, "Reversals per day",
            "Direction changes per day, for contactor life; 10–500."),
        num("reversing.stopSpeed_rpm", Unit::Rpm, 0.0, 1e5, "Change-over speed",
            "Motor speed below which a change-over is allowed; 0–100 rpm."),
        choice("reversing.category", {"", "DC-1", "DC-3", "DC-5"}, "DC utilisation category",
               "The contactor's IEC 60947-4-1 DC category (test-circuit L/R 1, 2 and 7.5 ms); empty when not "
               "stated. A motor L/R beyond it means the contactor must never break load."),
        num("reversing.coilSupplyMin_V", Unit::Volt, 0.0, 1000.0, "Lowest coil supply",
            "Lowest voltage the coil gets (battery sag); 0 = the rated coil voltage. Should be ≥ 85 % of rated."),
        num("reversing.coilSupplyMax_V", Unit::Volt, 0.0, 1000.0, "Highest coil supply",
            "Highest voltage the coil gets (full charge); 0 = the rated coil voltage. Should be ≤ 110 % of rated."),
        num("reversing.coilTimeConstant_s", Unit::Second, 1e-4, 1.0, "Coil time constant",
            "Coil L/R with the armature closed, for the suppressed drop-out time; 5–50 ms (20 ms is an estimate)."),
        num("reversing.coilReleaseFraction", Unit::None, 0.01, 0.9, "Coil release fraction",
            "Coil current at which the armature releases, as a fraction of the holding current; 0.1–0.3."),
        num("reversing.zener_V", Unit::Volt, 0.0, 1000.0, "Suppression Zener voltage",
            "Zener voltage of a diode + Zener suppressor; 0 = the coil voltage."),
        num("reversing.tvs_V", Unit::Volt, 0.0, 2000.0, "Suppression TVS voltage",
            "Clamp voltage of a TVS across the coil; 0 = 1.5 × the coil voltage. Must exceed the coil supply."),
        flag("reversing.waitForStop", "Wait for the stop",
             "True when the sequence waits for the stop speed before changing over (never reverse at speed)."),
        num("reversing.stopTime_s", Unit::Second, 0.0, 600.0, "Stated stop time",
            "Time allowed for the motor to slow to the stop speed; 0 = computed from the inertia, the motor's "
            "no-load torque and the retarding torque."),
        num("reversing.retardingTorque_Nm", Unit::NewtonMetre, 0.0, 1e4, "Retarding torque",
            "Friction and load torque that slow the coasting motor, beyond its own k·I0; 0 when unknown."),
        num("reversing.changeoverMargin_s", Unit::Second, 0.0, 10.0, "Change-over margin",
            "Wait between the drop-out of one direction and the pick-up of the other; 20–100 ms."),
        num("reversing.softStartRamp_s", Unit::Second, 0.0, 60.0, "Soft restart ramp",
            "Duty ramp after the change-over; 0.2–2 s."),

        list("dutyProfile", 0, 1000, "Duty profile",
             "Operating-point segments (start, cruise, hill, stall) held for their durations; at least one."),
        text("dutyProfile[].name", "Segment name", "Name of the segment, e.g. \"Cruise\"."),
        num("dutyProfile[].duration_s", Unit::Second, 1e-3, 1e7, "Duration",
            "How long the operating point is held; 1 s – hours."),
        choice("dutyProfile[].mode", {"torqueSpeed", "currentSpeed", "currentDuty", "stall"}, "Given as",
               "How the operating point is stated: \"torqueSpeed\", \"currentSpeed\", \"currentDuty\" or "
               "\"stall\" (zero speed at the current limit)."),
        num("dutyProfile[].torque_Nm", Unit::NewtonMetre, -1e4, 1e4, "Torque", "Shaft torque (torqueSpeed mode)."),
        num("dutyProfile[].speed_rpm", Unit::Rpm, 0.0, 1e5, "Speed", "Shaft speed (torqueSpeed, currentSpeed)."),
        num("dutyProfile[].motorCurrent_A", Unit::Ampere, 0.0, 1e5, "Motor current",
            "Armature current (currentSpeed, currentDuty)."),
        num("dutyProfile[].duty", Unit::None, 0.0, 1.0, "Duty", "Duty cycle (currentDuty mode); 0–1."),
        choice("dutyProfile[].direction", {"forward", "reverse"}, "Direction", "\"forward\" or \"reverse\"."),

        num("wiring.batteryCableLength_m", Unit::Metre, 0.0, 100.0, "Battery cable length",
            "Conductor length battery → controller, both poles added; 0.5–5 m."),
        num("wiring.batteryCable_mm2", Unit::SquareMillimetre, 0.1, 1000.0, "Battery cable cross-section",
            "Copper cross-section; 16–95 mm² for 100–300 A."),
        num("wiring.motorCableLength_m", Unit::Metre, 0.0, 100.0, "Motor cable length",
            "Conductor length controller → motor, both poles added."),
        num("wiring.motorCable_mm2", Unit::SquareMillimetre, 0.1, 1000.0, "Motor cable cross-section",
            "Copper cross-section of the motor leads."),
        num("wiring.cableTemperature_C", Unit::Celsius, -40.0, 250.0, "Cable temperature",
            "Conductor temperature for its resistance; 40–90 °C."),
        num("wiring.busCapacitance_F", Unit::Farad, 0.0, 10.0, "Bus capacitance",
            "Bus capacitors at the bank; 0.5–10 mF."),
        flag("wiring.prechargePresent", "Pre-charge fitted",
             "True when a resistor charges the bus capacitors before the main contactor closes."),
        num("wiring.prechargeResistor_ohm", Unit::Ohm, 0.0, 1e6, "Pre-charge resistor",
            "Stated pre-charge resistor; 0 = sized for the target time. 20–500 Ω."),
        num("wiring.prechargeTime_s", Unit::Second, 1e-3, 600.0, "Pre-charge time",
            "Target time to reach the pre-charge fraction; 0.5–3 s."),
        num("wiring.prechargeFraction", Unit::None, 0.5, 0.9999, "Pre-charge fraction",
            "Bus fraction reached before the main contactor closes; 0.9–0.99 (5·R·C gives 0.993)."),
        num("wiring.fuseRating_A", Unit::Ampere, 0.0, 1e5, "Fuse rating",
            "Rated current of the battery fuse; 0 = no fuse stated."),
        num("wiring.fuseVoltage_V", Unit::Volt, 0.0, 1e4, "Fuse DC voltage",
            "DC voltage rating of the fuse; must cover the highest bus voltage."),
        num("wiring.fuseBreaking_A", Unit::Ampere, 0.0, 1e7, "Fuse breaking capacity",
            "DC breaking capacity of the fuse; 0 = not stated. Must exceed the prospective short circuit."),
        num("wiring.fuseI2t_A2s", Unit::None, 0.0, 1e12, "Fuse clearing I²t",
            "Total clearing I²t of the fuse in A²s at the prospective fault; 0 = not stated."),
        num("wiring.bankWithstandI2t_A2s", Unit::None, 0.0, 1e12, "Bank I²t withstand",
            "Short-circuit I²t in A²s the switch bank survives; 0 = not stated."),
        num("wiring.allowedCableDrop", Unit::None, 0.001, 0.5, "Allowed cable drop",
            "Voltage drop allowed in each cable, as a fraction of the nominal voltage; 0.01–0.05."),
        choice("wiring.cableInsulation", {"pvc", "xlpe"}, "Cable insulation",
               "\"pvc\" (conductor limit 70 °C, k = 115) or \"xlpe\" (90 °C, k = 143)."),

        num("thermal.step_s", Unit::Second, 1e-4, 10.0, "Transient time step",
            "Largest time step of the duty-profile transient; segments are split into equal steps, "
            "at most a million per segment (optional; default 10 ms).",
            true),
        num("thermal.resolveStep_K", Unit::Kelvin, 0.0, 50.0, "Full solve every",
            "The transient repeats the full bank solve when a junction has moved this much since the last; "
            "0 = every step (optional; default 2 K)."),
        whole("thermal.repetitions", 1.0, 1000.0, "Profile repetitions",
              "Times the duty profile is run back to back; with \"run until periodic\" the most tried "
              "(optional; default 20)."),
        flag("thermal.untilPeriodic", "Run until periodic",
             "Repeat the profile until it ends where it started (the state of a long working day) "
             "(optional; default true)."),
        choice("thermal.stallStart", {"ambient", "hottestPoint"}, "Stall starts from",
               "State the stall-time study starts from: \"ambient\" (cold) or \"hottestPoint\" (the steady "
               "state of the hottest operating point that is not itself a stall) (optional; default "
               "hottestPoint)."),
        num("thermal.lifeCoefficient", Unit::None, 1e-30, 1e30, "Life coefficient A",
            "A in N_f = A·ΔT^α·exp(E_a/(k_B·T_m)) (Held et al. 1997: 640 for wire-bonded modules, from memory; "
            "uncertain by an order of magnitude) (optional; default 640).",
            true),
        num("thermal.lifeExponent", Unit::None, -20.0, 0.0, "Life exponent α",
            "α in the power-cycling law; about −5 (Held et al. 1997) (optional; default −5)."),
        num("thermal.lifeActivation_eV", Unit::ElectronVolt, 0.0, 5.0, "Activation energy E_a",
            "E_a in the power-cycling law; about 0.8 eV (Held et al. 1997) (optional; default 0.8 eV)."),
        whole("layout.capacitorCount", 0.0, 1000.0, "Bus capacitors",
              "Number of bus capacitors fitted; 0 = as many as the ripple current needs."),
        num("layout.capacitorRippleRating_A", Unit::Ampere, 0.0, 1000.0, "Capacitor ripple rating",
            "RMS ripple-current rating of one capacitor at its rated temperature and frequency; 1–5 A for "
            "electrolytics.", true),
        num("layout.capacitorEsr_ohm", Unit::Ohm, 0.0, 10.0, "Capacitor ESR",
            "Equivalent series resistance of one capacitor at the PWM frequency; 10–100 mΩ."),
        num("layout.capacitorVoltageRating_V", Unit::Volt, 1.0, 2000.0, "Capacitor voltage rating",
            "Rated DC voltage of one capacitor (one series string)."),
        num("layout.capacitorDerating", Unit::None, 0.05, 1.0, "Capacitor voltage derating",
            "Highest fraction of the capacitor rating the highest bus voltage may reach; 0.8 is common practice."),
        num("layout.capacitorThermalResistance_KperW", Unit::KelvinPerWatt, 0.0, 1000.0,
            "Capacitor thermal resistance", "Hot spot to ambient of one capacitor; 10–40 K/W for can sizes."),
        num("layout.capacitorMaxTemperature_C", Unit::Celsius, 0.0, 200.0, "Capacitor rated temperature",
            "Rated hot-spot temperature; 85 or 105 °C."),
        num("layout.capacitorInductance_H", Unit::Henry, 0.0, 1e-6, "Capacitor bank ESL",
            "Series inductance of the bus capacitor bank as the commutation loop sees it: one capacitor's ESL "
            "(10–30 nH for electrolytics) over the number in parallel next to the bank; 1–10 nH."),
        num("layout.commutationLoopInductance_H", Unit::Henry, 0.0, 1e-5, "Commutation-loop inductance",
            "Capacitor → bank → freewheel diode loop, if measured or known; 0 = from the layout fields. "
            "10–50 nH for a compact layout."),
        choice("layout.loopLayout", {"platePair", "wirePair"}, "Loop conductors",
               "\"platePair\" (laminated busbars or board planes) or \"wirePair\" (round conductors side by side)."),
        num("layout.loopLength_m", Unit::Metre, 0.0, 10.0, "Loop length",
            "Length of the commutation loop's conductors, one way; 0.03–0.3 m.", true),
        num("layout.loopConductorRadius_m", Unit::Metre, 0.0, 0.1, "Loop conductor radius",
            "Wire pair: conductor radius.", true),
        num("layout.loopSpacing_m", Unit::Metre, 0.0, 1.0, "Loop spacing",
            "Wire pair: centre spacing of the conductors (at least twice the radius).", true),
        num("layout.loopPlateWidth_m", Unit::Metre, 0.0, 1.0, "Busbar width", "Plate pair: busbar width.", true),
        num("layout.loopPlateSeparation_m", Unit::Metre, 0.0, 0.1, "Busbar separation",
            "Plate pair: insulation thickness between the two plates; 0.1–1 mm.", true),
        num("layout.packageInductance_H", Unit::Henry, 0.0, 1e-6, "Package inductance",
            "Lead inductance of one device in the loop; TO-220-class packages 5–10 nH (common practice)."),
        num("layout.batteryCableSpacing_m", Unit::Metre, 0.0, 1.0, "Battery cable spacing",
            "Centre spacing of the battery cable pair (sets its inductance and the capacitors' share of the "
            "ripple).", true),
        num("layout.overshootDerating", Unit::None, 0.1, 1.0, "Overshoot derating",
            "Highest fraction of the device voltage rating the turn-off peak may reach; 0.8 is common practice."),
    };
    append(t, "", rest);
    append(t, "wiring.mainContactor.", designPart("contactor"));
    return t;
}

// ---- Lookup --------------------------------------------------------------------------------

struct Index {
    const Table* table = nullptr;
    std::unordered_map<std::string, const FieldSpec*> byPattern;
    std::set<std::string> sections;                           ///< group objects ("bank.device")
    std::map<std::string, std::vector<std::string>> children; ///< parent pattern -> key names
};

Index makeIndex(const Table& table) {
    Index idx;
    idx.table = &table;
    for (const auto& f : table) {
        idx.byPattern[f.path] = &f;
        std::size_t pos = 0;
        std::string parent;
        while (true) {
            const std::size_t dot = f.path.find('.', pos);
            const std::string name =
                f.path.substr(pos, dot == std::string::npos ? std::string::npos : dot - pos);
            auto& kids = idx.children[parent];
            const std::string bare = name.size() > 2 && name.ends_with("[]") ? name.substr(0, name.size() - 2) : name;
            if (std::find(kids.begin(), kids.end(), bare) == kids.end())
                kids.push_back(bare);
            if (dot == std::string::npos)
                break;
            parent = f.path.substr(0, dot);
            if (!parent.ends_with("[]"))
                idx.sections.insert(parent);
            pos = dot + 1;
        }
    }
    return idx;
}

const Index& designIndex() {
    static const Index idx = makeIndex(designFields());
    return idx;
}

const Index* partIndex(std::string_view kind) {
    static const Index sw = makeIndex(partFields("switch"));
    static const Index di = makeIndex(partFields("diode"));
    static const Index in = makeIndex(partFields("interface"));
    static const Index co = makeIndex(partFields("contactor"));
    static const Index hs = makeIndex(partFields("heatsink"));
    if (kind == "switch")
        return &sw;
    if (kind == "diode")
        return &di;
    if (kind == "interface")
        return &in;
    if (kind == "contactor")
        return &co;
    if (kind == "heatsink")
        return &hs;
    return nullptr;
}

const FieldSpec* lookup(const Index& idx, std::string_view concretePath) {
    const auto it = idx.byPattern.find(fieldPattern(concretePath));
    return it == idx.byPattern.end() ? nullptr : it->second;
}

// ---- Messages ------------------------------------------------------------------------------

std::string joinPath(std::string_view prefix, std::string_view path) {
    if (prefix.empty())
        return std::string(path);
    if (path.empty())
        return std::string(prefix);
    return std::string(prefix) + "." + std::string(path);
}

std::string fmt(double v, Unit unit, int digits = 4) { return units::format(v, unit, digits); }

/// A short description of what a JSON value is, for "expected a number, got …".
std::string describeJson(const nlohmann::json& v) {
    if (v.is_null())
        return "null";
    if (v.is_boolean())
        return v.get<bool>() ? "true" : "false";
    if (v.is_string()) {
        std::string s = v.get<std::string>();
        if (s.size() > 40)
            s = s.substr(0, 37) + "...";
        return "the text '" + s + "'";
    }
    if (v.is_array())
        return "a list";
    if (v.is_object())
        return "a group of fields";
    return v.dump();
}

std::size_t editDistance(std::string_view a, std::string_view b) {
    std::vector<std::size_t> prev(b.size() + 1), cur(b.size() + 1);
    for (std::size_t j = 0; j <= b.size(); ++j)
        prev[j] = j;
    for (std::size_t i = 1; i <= a.size(); ++i) {
        cur[0] = i;
        for (std::size_t j = 1; j <= b.size(); ++j) {
            const auto lower = [](char c) { return (c >= 'A' && c <= 'Z') ? char(c - 'A' + 'a') : c; };
            const std::size_t cost = lower(a[i - 1]) == lower(b[j - 1]) ? 0 : 1;
            cur[j] = std::min({prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + cost});
        }
        std::swap(prev, cur);
    }
    return prev[b.size()];
}

/// " (did you mean 'supply.nominal_V'?)" when a known key of the same group is close.
std::string suggestion(const Index& idx, const std::string& parentPattern, const std::string& parentShown,
                       const std::string& key) {
    const auto it = idx.children.find(parentPattern);
    if (it == idx.children.end())
        return {};
    std::string best;
    std::size_t bestDist = std::numeric_limits<std::size_t>::max();
    for (const auto& k : it->second) {
        const std::size_t d = editDistance(key, k);
        if (d < bestDist) {
            bestDist = d;
            best = k;
        }
    }
    const std::size_t limit = std::max<std::size_t>(2, key.size() / 3);
    if (best.empty() || bestDist > limit)
        return {};
    return " (did you mean '" + joinPath(parentShown, best) + "'?)";
}

void checkValue(const FieldSpec& spec, const nlohmann::json& v, const std::string& shown,
                std::vector<Problem>& out) {
    switch (spec.type) {
    case Type::Number:
    case Type::Integer: {
        if (!v.is_number()) {
            std::string msg = "expected a number";
            if (spec.unit != Unit::None)
                msg += " in " + std::string(units::symbol(spec.unit));
            msg += ", got " + describeJson(v);
            out.push_back({shown, msg});
            return;
        }
        const double x = v.get<double>();
        if (!std::isfinite(x)) {
            out.push_back({shown, "the value is not a finite number"});
            return;
        }
        if (spec.type == Type::Integer && std::floor(x) != x) {
            out.push_back({shown, fmt(x, Unit::None, 6) + " is not a whole number"});
            return;
        }
        const bool low = spec.minExclusive ? x <= spec.min : x < spec.min;
        if (low || x > spec.max)
            out.push_back({shown, fmt(x, spec.unit, 6) + " is outside " + describeRange(spec)});
        return;
    }
    case Type::Boolean:
        if (!v.is_boolean())
            out.push_back({shown, "expected true or false, got " + describeJson(v)});
        return;
    case Type::Text:
        if (!v.is_string())
            out.push_back({shown, "expected text, got " + describeJson(v)});
        return;
    case Type::Choice: {
        if (!v.is_string()) {
            out.push_back({shown, "expected one of " + describeRange(spec) + ", got " + describeJson(v)});
            return;
        }
        const std::string s = v.get<std::string>();
        if (std::find(spec.choices.begin(), spec.choices.end(), s) == spec.choices.end())
            out.push_back({shown, "'" + s + "' is not " + describeRange(spec)});
        return;
    }
    case Type::List:
        if (!v.is_array()) {
            out.push_back({shown, "expected a list, got " + describeJson(v)});
            return;
        }
        if (double(v.size()) < spec.min || double(v.size()) > spec.max)
            out.push_back({shown, std::to_string(v.size()) + " items is outside " + describeRange(spec)});
        return;
    }
}

void walkObject(const nlohmann::json& obj, const std::string& rel, const Index& idx, std::string_view prefix,
                std::vector<Problem>& out) {
    for (const auto& [key, value] : obj.items()) {
        const std::string childRel = rel.empty() ? key : rel + "." + key;
        const std::string shown = joinPath(prefix, childRel);
        const std::string pattern = fieldPattern(childRel);
        if (const auto it = idx.byPattern.find(pattern); it != idx.byPattern.end()) {
            const FieldSpec& spec = *it->second;
            checkValue(spec, value, shown, out);
            if (spec.type == Type::List && value.is_array()) {
                for (std::size_t i = 0; i < value.size(); ++i) {
                    const std::string itemRel = childRel + "[" + std::to_string(i) + "]";
                    if (!value[i].is_object())
                        out.push_back({joinPath(prefix, itemRel),
                                       "expected a group of fields, got " + describeJson(value[i])});
                    else
                        walkObject(value[i], itemRel, idx, prefix, out);
                }
            }
            continue;
        }
        if (idx.sections.count(pattern)) {
            if (!value.is_object())
                out.push_back({shown, "expected a group of fields, got " + describeJson(value)});
            else
                walkObject(value, childRel, idx, prefix, out);
            continue;
        }
        const std::string parentPattern = fieldPattern(rel);
        out.push_back({shown, "unknown field '" + shown + "'" +
                                  suggestion(idx, parentPattern, joinPath(prefix, rel), key)});
    }
}

const nlohmann::json* jsonAt(const nlohmann::json& root, std::string_view dotted) {
    const nlohmann::json* cur = &root;
    std::size_t pos = 0;
    while (true) {
        const std::size_t dot = dotted.find('.', pos);
        const std::string key(dotted.substr(pos, dot == std::string_view::npos ? std::string_view::npos : dot - pos));
        if (!cur->is_object())
            return nullptr;
        const auto it = cur->find(key);
        if (it == cur->end())
            return nullptr;
        cur = &*it;
        if (dot == std::string_view::npos)
            return cur;
        pos = dot + 1;
    }
}

void convertRecursive(nlohmann::json& j, const std::string& rel, std::string_view prefix,
                      std::vector<Problem>& out) {
    if (j.is_object()) {
        for (auto it = j.begin(); it != j.end(); ++it) {
            const std::string childRel = rel.empty() ? it.key() : rel + "." + it.key();
            nlohmann::json& value = it.value();
            if (value.is_string()) {
                std::optional<Unit> unit = units::unitFromKey(it.key());
                const FieldSpec* spec = findField(childRel);
                if (spec && spec->type != Type::Number && spec->type != Type::Integer)
                    continue; // text and choices stay text
                if (!unit && spec)
                    unit = spec->unit;
                if (!unit)
                    continue;
                const std::string textValue = value.get<std::string>();
                const auto parsed = units::parse(textValue, *unit);
                if (!parsed) {
                    out.push_back({joinPath(prefix, childRel), parsed.error});
                    continue;
                }
                const double x = *parsed.value;
                if (spec && spec->type == Type::Integer && std::floor(x) == x && std::abs(x) < 9e15)
                    value = static_cast<long long>(x);
                else
                    value = x;
            } else if (value.is_structured()) {
                convertRecursive(value, childRel, prefix, out);
            }
        }
    } else if (j.is_array()) {
        for (std::size_t i = 0; i < j.size(); ++i)
            if (j[i].is_structured())
                convertRecursive(j[i], rel + "[" + std::to_string(i) + "]", prefix, out);
    }
}

} // namespace

// ---- Public API ----------------------------------------------------------------------------

const std::vector<FieldSpec>& designFields() {
    static const Table table = buildDesignFields();
    return table;
}

const std::vector<FieldSpec>& partFields(std::string_view partKind) {
    static const Table sw = partFileTable("switch");
    static const Table di = partFileTable("diode");
    static const Table in = partFileTable("interface");
    static const Table co = partFileTable("contactor");
    static const Table hs = partFileTable("heatsink");
    static const Table none;
    if (partKind == "switch")
        return sw;
    if (partKind == "diode")
        return di;
    if (partKind == "interface")
        return in;
    if (partKind == "contactor")
        return co;
    if (partKind == "heatsink")
        return hs;
    return none;
}

std::string fieldPattern(std::string_view concretePath) {
    std::string out;
    out.reserve(concretePath.size());
    for (std::size_t i = 0; i < concretePath.size(); ++i) {
        const char c = concretePath[i];
        if (c == '[') {
            const std::size_t close = concretePath.find(']', i);
            if (close == std::string_view::npos) {
                out.append(concretePath.substr(i));
                break;
            }
            out += "[]";
            i = close;
            continue;
        }
        out += c;
    }
    return out;
}

const FieldSpec* findField(std::string_view concretePath) { return lookup(designIndex(), concretePath); }

const FieldSpec* findPartField(std::string_view partKind, std::string_view concretePath) {
    const Index* idx = partIndex(partKind);
    return idx ? lookup(*idx, concretePath) : nullptr;
}

std::string describeRange(const FieldSpec& spec) {
    switch (spec.type) {
    case Type::Integer:
        return std::to_string(static_cast<long long>(spec.min)) + " … " +
               std::to_string(static_cast<long long>(spec.max));
    case Type::Number: {
        const std::string lo = fmt(spec.min, spec.unit);
        const std::string hi = fmt(spec.max, spec.unit);
        if (spec.minExclusive)
            return "above " + lo + " up to " + hi;
        return lo + " … " + hi;
    }
    case Type::Boolean:
        return "true or false";
    case Type::Text:
        return "text";
    case Type::Choice: {
        std::string s = "one of: ";
        for (std::size_t i = 0; i < spec.choices.size(); ++i)
            s += (i ? ", " : "") + spec.choices[i];
        return s;
    }
    case Type::List:
        return std::to_string(static_cast<long long>(spec.min)) + " … " +
               std::to_string(static_cast<long long>(spec.max)) + " items";
    }
    return {};
}

std::vector<Problem> checkFieldValue(const FieldSpec& spec, const nlohmann::json& value, std::string_view path) {
    std::vector<Problem> out;
    checkValue(spec, value, std::string(path), out);
    return out;
}

std::vector<Problem> validateDesignJson(const nlohmann::json& design) {
    std::vector<Problem> out;
    if (!design.is_object()) {
        out.push_back({"", "the design must be a JSON object (a group of fields), got " + describeJson(design)});
        return out;
    }
    nlohmann::json body = design;
    if (const auto it = body.find("formatVersion"); it != body.end()) {
        if (!it->is_number_integer())
            out.push_back({"formatVersion", "expected a whole number, got " + describeJson(*it)});
        body.erase("formatVersion");
    }
    walkObject(body, "", designIndex(), "", out);
    return out;
}

std::vector<Problem> validatePartJson(const nlohmann::json& part, std::string_view partKind,
                                      std::string_view prefix) {
    std::vector<Problem> out;
    const Index* idx = partIndex(partKind);
    if (!idx) {
        out.push_back({std::string(prefix), "unknown part kind '" + std::string(partKind) +
                                                "' (expected switch, diode, interface, contactor or heatsink)"});
        return out;
    }
    if (!part.is_object()) {
        out.push_back({std::string(prefix), "a part must be a group of fields, got " + describeJson(part)});
        return out;
    }
    walkObject(part, "", *idx, prefix, out);

    // Required keys. A switch needs the parameter group of its own kind only.
    std::string switchKind = "mosfet";
    if (partKind == "switch")
        if (const auto it = part.find("kind"); it != part.end() && it->is_string())
            switchKind = it->get<std::string>();
    for (const auto& f : *idx->table) {
        if (!f.required)
            continue;
        if (f.path.starts_with("mosfet.") && switchKind != "mosfet")
            continue;
        if (f.path.starts_with("bjt.") && switchKind == "mosfet")
            continue;
        if (f.path.starts_with("driver.") && switchKind != "darlington")
            continue;
        const nlohmann::json* v = jsonAt(part, f.path);
        if (!v)
            out.push_back({joinPath(prefix, f.path), "missing: a " + kindWord(partKind) + " part needs '" + f.path +
                                                         "' (" + f.label + ")"});
    }
    if (const auto it = part.find("id"); it != part.end() && it->is_string() && it->get<std::string>().empty())
        out.push_back({joinPath(prefix, "id"), "the id must not be empty"});
    // Bipolar kinds: the transistor's own core parameters.
    if (partKind == "switch" && (switchKind == "bipolar" || switchKind == "darlington")) {
        for (const char* key : {"saturationCurrent25_A", "betaF", "highCurrentKnee_A"}) {
            if (!jsonAt(part, std::string("bjt.") + key))
                out.push_back({joinPath(prefix, std::string("bjt.") + key),
                               "missing: a " + switchKind + " part needs 'bjt." + key + "'"});
            if (switchKind == "darlington" && !jsonAt(part, std::string("driver.") + key))
                out.push_back({joinPath(prefix, std::string("driver.") + key),
                               "missing: a darlington part needs 'driver." + std::string(key) + "'"});
        }
    }
    return out;
}

std::vector<Problem> validateDesign(const Design& d) {
    std::vector<Problem> out;
    const auto V = [](double v) { return fmt(v, Unit::Volt); };

    if (d.supply.min_V > d.supply.nominal_V)
        out.push_back({"supply.min_V", "the lowest voltage " + V(d.supply.min_V) + " is above the nominal " +
                                           V(d.supply.nominal_V)});
    if (d.supply.nominal_V > d.supply.max_V)
        out.push_back({"supply.max_V", "the highest voltage " + V(d.supply.max_V) + " is below the nominal " +
                                           V(d.supply.nominal_V)});
    if (d.drive.minSupply_V > d.drive.supply_V)
        out.push_back({"drive.minSupply_V", "the drive voltage at the lowest supply " + V(d.drive.minSupply_V) +
                                                " is above the nominal drive voltage " + V(d.drive.supply_V)});

    if (d.dutyProfile.empty())
        out.push_back({"dutyProfile", "the duty profile is empty: add at least one operating point"});
    for (std::size_t i = 0; i < d.dutyProfile.size(); ++i) {
        const Segment& s = d.dutyProfile[i];
        const std::string p = "dutyProfile[" + std::to_string(i) + "]";
        if (s.mode == "currentDuty" && s.duty > d.pwm.maxDuty)
            out.push_back({p + ".duty", "duty " + fmt(s.duty, Unit::None) + " exceeds pwm.maxDuty " +
                                            fmt(d.pwm.maxDuty, Unit::None)});
    }

    const bool synchronous = d.pwm.topology == "synchronousHalfBridge" || d.pwm.topology == "fullBridge";
    if (synchronous && d.pwm.frequency_Hz > 0.0) {
        const double period = 1.0 / d.pwm.frequency_Hz;
        // Two transitions per period, each with its dead time.
        if (2.0 * d.pwm.deadTime_s >= period)
            out.push_back({"pwm.deadTime_s", "dead time " + fmt(d.pwm.deadTime_s, Unit::Second) +
                                                 " leaves no on-time: two dead times per period must be shorter "
                                                 "than the period " +
                                                 fmt(period, Unit::Second)});
    }
    // Conductor pairs cannot overlap (the inductance formulas need d ≥ 2r).
    const auto& lay = d.layout;
    if (lay.commutationLoopInductance_H <= 0.0 && lay.loopLayout == "wirePair" &&
        lay.loopSpacing_m < 2.0 * lay.loopConductorRadius_m)
        out.push_back({"layout.loopSpacing_m", "the loop conductors' centre spacing " + fmt(lay.loopSpacing_m, Unit::Metre) +
                                                   " is less than twice their radius " +
                                                   fmt(lay.loopConductorRadius_m, Unit::Metre) + ": they would overlap"});
    if (d.wiring.batteryCable_mm2 > 0.0) {
        const double radius = std::sqrt(d.wiring.batteryCable_mm2 * 1e-6 / 3.14159265358979323846);
        if (lay.batteryCableSpacing_m < 2.0 * radius)
            out.push_back({"layout.batteryCableSpacing_m",
                           "the battery cables' centre spacing " + fmt(lay.batteryCableSpacing_m, Unit::Metre) +
                               " is less than their diameter " + fmt(2.0 * radius, Unit::Metre) +
                               " (bare copper of wiring.batteryCable_mm2): they would overlap"});
    }
    if (d.pwm.topology == "lowSideChopper" && d.bank.diodeCount < 1)
        out.push_back({"bank.diodeCount", "a low-side chopper needs at least one freewheel diode"});

    if (d.bank.count < 1)
        out.push_back({"bank.count", "the bank needs at least one device"});
    if (d.bank.devices.size() > std::size_t(std::max(d.bank.count, 0)))
        out.push_back({"bank.devices", std::to_string(d.bank.devices.size()) +
                                           " per-device entries for a bank of " + std::to_string(d.bank.count)});

    if (d.motor.kind == "seriesWound") {
        const auto& m = d.motor.magnetisation;
        if (m.size() < 2)
            out.push_back({"motor.magnetisation", "a series-wound motor needs a magnetisation table of at least "
                                                  "two points"});
        for (std::size_t i = 1; i < m.size(); ++i)
            if (!(m[i].current_A > m[i - 1].current_A))
                out.push_back({"motor.magnetisation[" + std::to_string(i) + "].current_A",
                               "currents must ascend: " + fmt(m[i].current_A, Unit::Ampere) + " follows " +
                                   fmt(m[i - 1].current_A, Unit::Ampere)});
        for (std::size_t i = 0; i < m.size(); ++i)
            if (m[i].torqueConstant_NmPerA <= 0.0)
                out.push_back({"motor.magnetisation[" + std::to_string(i) + "].torqueConstant_NmPerA",
                               "the torque constant must be above zero"});
    }

    const SwitchPart& sw = d.bank.device;
    if (sw.kind == "mosfet") {
        const MosfetParams& m = sw.mosfet;
        if (m.qgs2_As > m.qgs_As)
            out.push_back({"bank.device.mosfet.qgs2_As", "Q_gs2 " + fmt(m.qgs2_As, Unit::Coulomb) +
                                                             " exceeds Q_gs " + fmt(m.qgs_As, Unit::Coulomb)});
        if (m.qgs_As + m.qgd_As > m.qg_As)
            out.push_back({"bank.device.mosfet.qg_As", "Q_g " + fmt(m.qg_As, Unit::Coulomb) +
                                                           " is below Q_gs + Q_gd " +
                                                           fmt(m.qgs_As + m.qgd_As, Unit::Coulomb)});
        if (m.plateau_V <= m.vth_V)
            out.push_back({"bank.device.mosfet.plateau_V", "the plateau " + V(m.plateau_V) +
                                                               " must lie above the threshold " + V(m.vth_V)});
        // Every gate charges through some resistance (the driver's output stage, the die's gate
        // mesh): with none at all the edges would take no time and an unbounded current.
        bool resisted = d.drive.driverResistance_ohm > 0.0 || m.rgInternal_ohm > 0.0;
        if (!resisted) {
            resisted = d.bank.gateResistor_ohm > 0.0;
            for (const BankDevice& dev : d.bank.devices)
                resisted = resisted && d.bank.gateResistor_ohm + dev.gateResistorDeviation_ohm > 0.0;
        }
        if (!resisted)
            out.push_back({"drive.driverResistance_ohm",
                           "the gate path of a device has no resistance at all: the driver's output resistance, the "
                           "internal gate resistance and its gate resistor (with its deviation) are all zero"});
        for (std::size_t i = 1; i < m.rdsOnTable.size(); ++i)
            if (!(m.rdsOnTable[i].tj_C > m.rdsOnTable[i - 1].tj_C))
                out.push_back({"bank.device.mosfet.rdsOnTable[" + std::to_string(i) + "].tj_C",
                               "temperatures must ascend"});
    }
    if (sw.tjMax_C <= d.heatsink.ambient_C)
        out.push_back({"bank.device.tjMax_C", "the maximum junction temperature " + fmt(sw.tjMax_C, Unit::Celsius) +
                                                  " is not above the ambient " +
                                                  fmt(d.heatsink.ambient_C, Unit::Celsius)});
    if (d.bank.interface.insulating && d.bank.interface.dielectricStrength_Vperm <= 0.0)
        out.push_back({"bank.interface.dielectricStrength_Vperm",
                       "an insulating interface needs its dielectric strength"});
    return out;
}

std::vector<Problem> checkDesign(const Design& design) {
    nlohmann::json j = design;
    std::vector<Problem> out = validateDesignJson(j);
    auto cross = validateDesign(design);
    out.insert(out.end(), cross.begin(), cross.end());
    return out;
}

std::vector<Problem> convertUnitStrings(nlohmann::json& object, std::string_view prefix) {
    std::vector<Problem> out;
    convertRecursive(object, "", prefix, out);
    return out;
}

namespace {

// The value a field takes when a file omits it: read from a default-constructed design whose
// lists hold one default item each, so that "dutyProfile[].duration_s" has a default too.
std::string defaultOf(const nlohmann::json& defaults, const FieldSpec& f) {
    if (f.type == FieldSpec::Type::List)
        return "empty"; // every list of a default design is empty
    const nlohmann::json* node = &defaults;
    std::string path = f.path;
    std::size_t at = 0;
    while (at <= path.size()) {
        const auto end = path.find('.', at);
        std::string key = path.substr(at, end == std::string::npos ? std::string::npos : end - at);
        const bool item = key.size() > 2 && key.compare(key.size() - 2, 2, "[]") == 0;
        if (item)
            key.resize(key.size() - 2);
        if (!node->is_object() || !node->contains(key))
            return {};
        node = &(*node)[key];
        if (item) {
            if (!node->is_array() || node->empty())
                return f.type == FieldSpec::Type::List ? "empty" : "";
            node = &(*node)[0];
        }
        if (end == std::string::npos)
            break;
        at = end + 1;
    }
    if (node->is_number())
        return f.type == FieldSpec::Type::Integer ? std::to_string(node->get<long long>())
                                                  : units::format(node->get<double>(), f.unit, 4);
    if (node->is_boolean())
        return node->get<bool>() ? "yes" : "no";
    if (node->is_string())
        return node->get<std::string>().empty() ? "(empty)" : node->get<std::string>();
    if (node->is_array())
        return node->empty() ? "empty" : std::to_string(node->size()) + " items";
    return {};
}

nlohmann::json defaultDesignJson() {
    Design d;
    d.dutyProfile.emplace_back();
    d.bank.devices.emplace_back();
    d.motor.magnetisation.emplace_back();
    for (SwitchPart* part : {&d.bank.device}) {
        part->soa.emplace_back();
        part->zthJc.emplace_back();
        part->mosfet.rdsOnTable.emplace_back();
    }
    d.bank.freewheelDiode.zthJc.emplace_back();
    return d;
}

} // namespace

std::string fieldsMarkdown() {
    const nlohmann::json defaults = defaultDesignJson();
    std::ostringstream md;
    md << "| Field | Unit | Allowed | Default | Meaning |\n|---|---|---|---|---|\n";
    for (const auto& f : designFields()) {
        std::string unit(units::symbol(f.unit));
        if (f.type != Type::Number && f.type != Type::Integer)
            unit.clear();
        md << "| `" << f.path << "` | " << markdownCell(unit) << " | " << markdownCell(describeRange(f))
           << " | " << markdownCell(defaultOf(defaults, f)) << " | " << markdownCell(f.label + ". " + f.help)
           << " |\n";
    }
    return md.str();
}

} // namespace amp

//! The unit catalogue: every unit a reading or a formula may name, with its
//! factor to SI.
//!
//! Factors follow NIST SP 811 (2008), App. B.8, computed from the defining
//! constants so that they are exact where the definition is exact
//! (1 in = 0.0254 m, 1 lb = 0.453 592 37 kg, g_n = 9.806 65 m/s²,
//! 1 US gal = 231 in³, 1 hp = 550 ft·lbf/s, Btu_IT = 1055.055 852 62 J).

use super::Dimension;

/// One inch in metres (exact).
pub const INCH: f64 = 0.0254;
/// One foot in metres (exact).
pub const FOOT: f64 = 0.3048;
/// One avoirdupois pound in kilograms (exact).
pub const POUND: f64 = 0.453_592_37;
/// Standard gravity in m/s² (exact).
pub const STANDARD_GRAVITY: f64 = 9.806_65;
/// One pound-force in newtons (exact, derived).
pub const POUND_FORCE: f64 = POUND * STANDARD_GRAVITY;
/// One psi in pascals (exact, derived: 0.45359237·9.80665/0.0254²).
pub const PSI: f64 = POUND_FORCE / (INCH * INCH);
/// One US gallon in m³ (exact: 231 in³).
pub const US_GALLON: f64 = 231.0 * INCH * INCH * INCH;
/// One mechanical horsepower in watts (exact, derived: 550 ft·lbf/s).
pub const HORSEPOWER: f64 = 550.0 * FOOT * POUND_FORCE;
/// One metric horsepower (PS) in watts (exact); not the same unit as [`HORSEPOWER`].
pub const METRIC_HORSEPOWER: f64 = 735.498_75;
/// One International Table Btu in joules (exact).
pub const BTU: f64 = 1055.05585262;
/// One conventional inch of mercury in pascals (13 595.1 kg/m³ · g_n · 0.0254 m).
pub const INCH_OF_MERCURY: f64 = 3386.38864;
/// The standard atmosphere in pascals (exact). Used to turn absolute and
/// vacuum readings into gauge pressure when no barometer reading is given.
pub const STANDARD_ATMOSPHERE: f64 = 101_325.0;
/// Density of water at 60 °F in kg/m³, the reference for specific gravity.
/// Value: 999.0 kg/m³ (computed cross-check of the US orifice constant, ≈ 60 °F water).
pub const WATER_DENSITY_60F: f64 = 999.0;
/// Zero degrees Celsius in kelvin (exact).
pub const ZERO_CELSIUS: f64 = 273.15;

/// How a unit's number maps to the SI value.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Scale {
    /// si = number · factor + offset.
    Linear {
        /// Multiplier to SI.
        factor: f64,
        /// Added after multiplying (temperature points, absolute pressures).
        offset: f64,
    },
    /// Saybolt Universal Seconds: a non-linear viscosity scale (ASTM D2161).
    Saybolt,
}

/// What a unit's zero means.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Reference {
    /// An ordinary amount or difference.
    Plain,
    /// A temperature on a scale (°C, °F): a point, not a difference.
    TemperaturePoint,
    /// An absolute pressure, turned into gauge with the standard atmosphere.
    AbsolutePressure,
    /// A vacuum reading below the atmosphere (inches of mercury vacuum).
    Vacuum,
}

/// A named unit.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Unit {
    /// The symbol printed for this unit.
    pub symbol: &'static str,
    /// Other spellings accepted on input (exact, case-sensitive).
    pub aliases: &'static [&'static str],
    /// The physical dimension.
    pub dimension: Dimension,
    /// How the number maps to SI.
    pub scale: Scale,
    /// What zero means.
    pub reference: Reference,
}

impl Unit {
    const fn linear(
        symbol: &'static str,
        aliases: &'static [&'static str],
        dimension: Dimension,
        factor: f64,
    ) -> Unit {
        Unit {
            symbol,
            aliases,
            dimension,
            scale: Scale::Linear {
                factor,
                offset: 0.0,
            },
            reference: Reference::Plain,
        }
    }

    const fn offset(
        symbol: &'static str,
        aliases: &'static [&'static str],
        dimension: Dimension,
        factor: f64,
        offset: f64,
        reference: Reference,
    ) -> Unit {
        Unit {
            symbol,
            aliases,
            dimension,
            scale: Scale::Linear { factor, offset },
            reference,
        }
    }

    /// The SI value of `number` of this unit.
    pub fn to_si(&self, number: f64) -> f64 {
        match self.scale {
            Scale::Linear { factor, offset } => number * factor + offset,
            Scale::Saybolt => super::saybolt::cst_from_sus(number).map_or(f64::NAN, |c| c * 1e-6),
        }
    }

    /// The number of this unit for an SI value.
    pub fn from_si(&self, si: f64) -> f64 {
        match self.scale {
            Scale::Linear { factor, offset } => (si - offset) / factor,
            Scale::Saybolt => super::saybolt::sus_from_cst(si * 1e6),
        }
    }

    /// The factor of this unit when it stands for a difference (°C and °F
    /// become kelvin and Rankine intervals; absolute and vacuum readings lose
    /// their offset). `None` for non-linear scales.
    pub fn interval_factor(&self) -> Option<f64> {
        match self.scale {
            Scale::Linear { factor, .. } => Some(factor),
            Scale::Saybolt => None,
        }
    }

    /// Every spelling of this unit, the symbol first.
    pub fn spellings(&self) -> impl Iterator<Item = &'static str> {
        std::iter::once(self.symbol).chain(self.aliases.iter().copied())
    }
}

const PER_MIN: f64 = 1.0 / 60.0;
const LITRE: f64 = 1e-3;

/// Every unit known by name. Compound units not listed here (`m^3/s`,
/// `lbf*ft`) are built from these by the parser.
pub static UNITS: &[Unit] = &[
    // Pressure (gauge unless marked absolute).
    Unit::linear("Pa", &[], Dimension::PRESSURE, 1.0),
    Unit::linear("kPa", &["kpa"], Dimension::PRESSURE, 1e3),
    Unit::linear("MPa", &["mpa"], Dimension::PRESSURE, 1e6),
    Unit::linear("GPa", &[], Dimension::PRESSURE, 1e9),
    Unit::linear(
        "bar",
        &["barg", "bar(g)", "Bar", "BAR"],
        Dimension::PRESSURE,
        1e5,
    ),
    Unit::linear("mbar", &[], Dimension::PRESSURE, 100.0),
    Unit::linear(
        "psi",
        &["psig", "PSI", "Psi", "PSIG", "lbf/in^2"],
        Dimension::PRESSURE,
        PSI,
    ),
    Unit::linear("ksi", &[], Dimension::PRESSURE, 1000.0 * PSI),
    Unit::offset(
        "psia",
        &["psi(a)", "psi abs", "PSIA"],
        Dimension::PRESSURE,
        PSI,
        -STANDARD_ATMOSPHERE,
        Reference::AbsolutePressure,
    ),
    Unit::offset(
        "bar abs",
        &["bara", "bar(a)", "bar a"],
        Dimension::PRESSURE,
        1e5,
        -STANDARD_ATMOSPHERE,
        Reference::AbsolutePressure,
    ),
    Unit::offset(
        "kPa abs",
        &["kPa(a)", "kPaa"],
        Dimension::PRESSURE,
        1e3,
        -STANDARD_ATMOSPHERE,
        Reference::AbsolutePressure,
    ),
    Unit::offset(
        "inHg vac",
        &[
            "inHg",
            "inHg vacuum",
            "inHg(vac)",
            "in Hg",
            "inHgV",
            "\"Hg",
            "inhg",
        ],
        Dimension::PRESSURE,
        -INCH_OF_MERCURY,
        0.0,
        Reference::Vacuum,
    ),
    // Flow.
    Unit::linear(
        "L/min",
        &["l/min", "lpm", "LPM", "L/m"],
        Dimension::FLOW,
        LITRE * PER_MIN,
    ),
    Unit::linear(
        "gpm",
        &["GPM", "gal/min", "USgpm"],
        Dimension::FLOW,
        US_GALLON * PER_MIN,
    ),
    Unit::linear(
        "cm³/min",
        &["cc/min", "cm^3/min", "mL/min", "ml/min"],
        Dimension::FLOW,
        1e-6 * PER_MIN,
    ),
    Unit::linear(
        "in³/min",
        &["in^3/min", "cu in/min", "cuin/min"],
        Dimension::FLOW,
        INCH * INCH * INCH * PER_MIN,
    ),
    // Displacement per revolution.
    Unit::linear(
        "cm³/rev",
        &["cc/rev", "cm^3/rev", "cc", "ccm/rev", "mL/rev", "ml/rev"],
        Dimension::VOLUME,
        1e-6,
    ),
    Unit::linear(
        "in³/rev",
        &["in^3/rev", "cu in/rev", "cir", "CIR", "cuin/rev"],
        Dimension::VOLUME,
        INCH * INCH * INCH,
    ),
    // Volume.
    Unit::linear(
        "L",
        &["l", "litre", "liter", "litres", "liters"],
        Dimension::VOLUME,
        LITRE,
    ),
    Unit::linear("mL", &["ml"], Dimension::VOLUME, 1e-6),
    Unit::linear("cm³", &["cm^3"], Dimension::VOLUME, 1e-6),
    Unit::linear(
        "in³",
        &["in^3", "cu in", "cuin"],
        Dimension::VOLUME,
        INCH * INCH * INCH,
    ),
    Unit::linear(
        "gal",
        &["gallon", "gallons", "USgal"],
        Dimension::VOLUME,
        US_GALLON,
    ),
    Unit::linear(
        "rev",
        &["revolution", "revolutions", "r"],
        Dimension::NONE,
        1.0,
    ),
    Unit::linear(
        "rad",
        &["radian", "radians"],
        Dimension::NONE,
        1.0 / (2.0 * std::f64::consts::PI),
    ),
    Unit::linear(
        "deg",
        &["degree", "degrees", "°"],
        Dimension::NONE,
        1.0 / 360.0,
    ),
    // Shaft speed and frequency (revolutions are dimensionless: rpm = 1/60 s⁻¹).
    Unit::linear(
        "rpm",
        &["RPM", "rev/min", "r/min", "1/min"],
        Dimension::FREQUENCY,
        PER_MIN,
    ),
    Unit::linear("rev/s", &["rps"], Dimension::FREQUENCY, 1.0),
    Unit::linear("Hz", &["hz", "cps", "1/s"], Dimension::FREQUENCY, 1.0),
    Unit::linear("kHz", &[], Dimension::FREQUENCY, 1e3),
    // Time.
    Unit::linear(
        "s",
        &["sec", "secs", "second", "seconds"],
        Dimension::TIME,
        1.0,
    ),
    Unit::linear("ms", &[], Dimension::TIME, 1e-3),
    Unit::linear("min", &["mins", "minute", "minutes"], Dimension::TIME, 60.0),
    Unit::linear(
        "h",
        &["hr", "hrs", "hour", "hours"],
        Dimension::TIME,
        3600.0,
    ),
    // Temperature points and differences.
    Unit::offset(
        "°C",
        &["degC", "deg C", "C", "oC", "celsius"],
        Dimension::TEMPERATURE,
        1.0,
        ZERO_CELSIUS,
        Reference::TemperaturePoint,
    ),
    Unit::offset(
        "°F",
        &["degF", "deg F", "F", "oF", "fahrenheit"],
        Dimension::TEMPERATURE,
        5.0 / 9.0,
        459.67 * 5.0 / 9.0,
        Reference::TemperaturePoint,
    ),
    Unit::linear(
        "K",
        &["kelvin", "dC", "delta_degC", "Δ°C", "ΔC"],
        Dimension::TEMPERATURE,
        1.0,
    ),
    Unit::linear(
        "Δ°F",
        &["dF", "delta_degF", "ΔF", "degR", "°R"],
        Dimension::TEMPERATURE,
        5.0 / 9.0,
    ),
    // Kinematic and dynamic viscosity.
    Unit::linear(
        "cSt",
        &["cst", "CST", "mm^2/s", "mm²/s"],
        Dimension::KINEMATIC_VISCOSITY,
        1e-6,
    ),
    Unit::linear("St", &[], Dimension::KINEMATIC_VISCOSITY, 1e-4),
    Unit {
        symbol: "SUS",
        aliases: &["SSU", "sus", "ssu"],
        dimension: Dimension::KINEMATIC_VISCOSITY,
        scale: Scale::Saybolt,
        reference: Reference::Plain,
    },
    Unit::linear(
        "mPa·s",
        &["mPa*s", "mPas", "mPa s"],
        Dimension::DYNAMIC_VISCOSITY,
        1e-3,
    ),
    Unit::linear(
        "cP",
        &["cp", "centipoise"],
        Dimension::DYNAMIC_VISCOSITY,
        1e-3,
    ),
    // Length and area.
    Unit::linear(
        "m",
        &["metre", "meter", "metres", "meters"],
        Dimension::LENGTH,
        1.0,
    ),
    Unit::linear("cm", &[], Dimension::LENGTH, 1e-2),
    Unit::linear("mm", &[], Dimension::LENGTH, 1e-3),
    Unit::linear("µm", &["um", "micron", "microns"], Dimension::LENGTH, 1e-6),
    Unit::linear("in", &["inch", "inches", "\""], Dimension::LENGTH, INCH),
    Unit::linear("ft", &["foot", "feet", "'"], Dimension::LENGTH, FOOT),
    Unit::linear("cm²", &["cm^2"], Dimension::AREA, 1e-4),
    Unit::linear("mm²", &["mm^2"], Dimension::AREA, 1e-6),
    Unit::linear("in²", &["in^2", "sq in"], Dimension::AREA, INCH * INCH),
    // Linear speed.
    Unit::linear("mm/s", &[], Dimension::VELOCITY, 1e-3),
    Unit::linear("m/s", &[], Dimension::VELOCITY, 1.0),
    Unit::linear("in/s", &["in/sec", "ips"], Dimension::VELOCITY, INCH),
    Unit::linear("in/min", &["ipm"], Dimension::VELOCITY, INCH * PER_MIN),
    // Mass, force, torque, inertia.
    Unit::linear("kg", &["kilogram", "kilograms"], Dimension::MASS, 1.0),
    Unit::linear("g", &["gram", "grams"], Dimension::MASS, 1e-3),
    Unit::linear("t", &["tonne", "tonnes"], Dimension::MASS, 1e3),
    Unit::linear(
        "lb",
        &["lbm", "lbs", "pound", "pounds"],
        Dimension::MASS,
        POUND,
    ),
    Unit::linear("N", &["newton", "newtons"], Dimension::FORCE, 1.0),
    Unit::linear("kN", &[], Dimension::FORCE, 1e3),
    Unit::linear("lbf", &["lb-f", "lbsf"], Dimension::FORCE, POUND_FORCE),
    Unit::linear("kgf", &[], Dimension::FORCE, STANDARD_GRAVITY),
    Unit::linear("N·m", &["N*m", "Nm", "N m", "N-m"], Dimension::ENERGY, 1.0),
    Unit::linear(
        "lbf·in",
        &["lbf*in", "lbf-in", "lb-in", "in-lb", "in-lbf", "lb in"],
        Dimension::ENERGY,
        POUND_FORCE * INCH,
    ),
    Unit::linear(
        "lbf·ft",
        &["lbf*ft", "lbf-ft", "lb-ft", "ft-lb", "ft-lbf"],
        Dimension::ENERGY,
        POUND_FORCE * FOOT,
    ),
    Unit::linear(
        "kg·m²",
        &["kg*m^2", "kgm^2", "kg m^2", "kgm2"],
        Dimension::INERTIA,
        1.0,
    ),
    Unit::linear(
        "lb·ft²",
        &["lb*ft^2", "lbft^2", "lb ft^2"],
        Dimension::INERTIA,
        POUND * FOOT * FOOT,
    ),
    Unit::linear("N/mm", &[], Dimension::STIFFNESS, 1e3),
    Unit::linear(
        "lbf/in",
        &["lb/in"],
        Dimension::STIFFNESS,
        POUND_FORCE / INCH,
    ),
    // Energy, power and heat flow.
    Unit::linear("J", &["joule", "joules"], Dimension::ENERGY, 1.0),
    Unit::linear("kJ", &[], Dimension::ENERGY, 1e3),
    Unit::linear("BTU", &["Btu", "btu"], Dimension::ENERGY, BTU),
    Unit::linear("W", &["watt", "watts"], Dimension::POWER, 1.0),
    Unit::linear("kW", &["kw", "KW"], Dimension::POWER, 1e3),
    Unit::linear("hp", &["HP", "bhp"], Dimension::POWER, HORSEPOWER),
    Unit::linear(
        "PS",
        &["hp(M)", "metric hp"],
        Dimension::POWER,
        METRIC_HORSEPOWER,
    ),
    Unit::linear(
        "BTU/h",
        &["Btu/h", "Btu/hr", "BTU/hr", "btu/h", "btu/hr"],
        Dimension::POWER,
        BTU / 3600.0,
    ),
    Unit::linear(
        "BTU/min",
        &["Btu/min", "btu/min"],
        Dimension::POWER,
        BTU / 60.0,
    ),
    // Density and heat capacity.
    Unit::linear("kg/m³", &["kg/m^3", "kg/m3"], Dimension::DENSITY, 1.0),
    Unit::linear(
        "g/cm³",
        &["g/cm^3", "g/cc", "g/mL", "g/ml"],
        Dimension::DENSITY,
        1e3,
    ),
    Unit::linear(
        "lb/ft³",
        &["lb/ft^3", "lbm/ft^3", "lb/ft3"],
        Dimension::DENSITY,
        POUND / (FOOT * FOOT * FOOT),
    ),
    Unit::linear(
        "lb/gal",
        &["lbm/gal"],
        Dimension::DENSITY,
        POUND / US_GALLON,
    ),
    Unit::linear(
        "J/(kg·K)",
        &["J/(kg*K)", "J/kg/K", "J/kgK"],
        Dimension::SPECIFIC_HEAT,
        1.0,
    ),
    Unit::linear(
        "BTU/(lb·°F)",
        &["BTU/(lb*F)", "Btu/lb/F", "BTU/lb/F", "Btu/(lb*F)"],
        Dimension::SPECIFIC_HEAT,
        BTU / (POUND * 5.0 / 9.0),
    ),
    Unit::linear("1/K", &["/K", "per K"], Dimension::PER_TEMPERATURE, 1.0),
    Unit::linear(
        "1/°F",
        &["/F", "1/F", "per F"],
        Dimension::PER_TEMPERATURE,
        9.0 / 5.0,
    ),
    // Plain numbers.
    Unit::linear("%", &["percent", "pct"], Dimension::NONE, 0.01),
    Unit::linear("SG", &["sg", "S.G."], Dimension::NONE, 1.0),
];

/// Look up a unit by its symbol or an alias (exact spelling).
pub fn find(name: &str) -> Option<&'static Unit> {
    UNITS.iter().find(|u| u.spellings().any(|s| s == name))
}

/// Look up a unit by its printed symbol; panics only on a programming error
/// (a symbol missing from [`UNITS`]), which the unit tests rule out.
pub fn by_symbol(symbol: &str) -> &'static Unit {
    UNITS
        .iter()
        .find(|u| u.symbol == symbol)
        .unwrap_or_else(|| panic!("unit `{symbol}` is not in the catalogue; this is a bug"))
}

#[cfg(test)]
mod tests {
    use super::*;

    fn rel(a: f64, b: f64) -> f64 {
        ((a - b) / b).abs()
    }

    #[test]
    fn nist_exact_factors() {
        // NIST SP 811 B.8 (derived exact): 1 psi = 6894.757293168361 Pa
        assert!(rel(PSI, 6894.757293168361) < 1e-12);
        // NIST SP 811 B.8: 1 US gal = 3.785411784 L (exact)
        assert!(rel(US_GALLON / LITRE, 3.785_411_784) < 1e-12);
        // NIST SP 811 B.8 (derived exact): 1 hp = 745.6998715822702 W
        assert!(rel(HORSEPOWER, 745.699_871_582_270_2) < 1e-12);
        // NIST SP 811 B.8: 1 inHg (conventional) = 3386.38864 Pa
        assert!(rel(INCH_OF_MERCURY, 3386.38864) < 1e-12);
        // NIST SP 811 B.8: 1 in³ = 16.387064 cm³ (exact)
        assert!(rel(INCH * INCH * INCH * 1e6, 16.387_064) < 1e-12);
        // NIST SP 811 B.8 (derived exact): 1 lbf = 4.4482216152605 N
        assert!(rel(POUND_FORCE, 4.448_221_615_260_5) < 1e-12);
        // NIST SP 811 B.8 (derived exact): 1 Btu_IT/h = 0.293071070172 W
        assert!(rel(BTU / 3600.0, 0.293_071_070_172) < 1e-9);
        // derived: 1 lbf·in = 0.112984829 N·m
        assert!(rel(POUND_FORCE * INCH, 0.112_984_829) < 1e-9);
    }

    #[test]
    fn every_spelling_is_unique() {
        let mut seen = std::collections::HashSet::new();
        for unit in UNITS {
            for s in unit.spellings() {
                assert!(seen.insert(s), "spelling `{s}` appears twice");
            }
        }
    }

    #[test]
    fn temperature_points() {
        // NIST SP 811 B.8: t_C = (t_F − 32)/1.8; 180 °F = 82.2222 °C
        let f = by_symbol("°F");
        let c = by_symbol("°C");
        assert!((c.from_si(f.to_si(180.0)) - 82.222_222_222).abs() < 1e-6);
        // NIST SP 811 B.8: −40 °F = −40 °C
        assert!((c.from_si(f.to_si(-40.0)) + 40.0).abs() < 1e-9);
    }
}

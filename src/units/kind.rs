//! Kinds of physical quantity a technician reads or a rule computes, with the
//! unit each is printed in for each unit system.

use std::fmt;
use std::str::FromStr;

use super::{Dimension, UnitSystem};

/// A kind of quantity: a dimension plus how it is named, printed and bounded.
///
/// Several kinds share a dimension (shaft speed and frequency; torque and
/// energy; pressure and bulk modulus); the kind decides the printed unit.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, serde::Serialize, serde::Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Kind {
    /// Cross-section area.
    Area,
    /// Mass density (a bare number is read as specific gravity).
    Density,
    /// Displacement of a pump or motor per revolution.
    Displacement,
    /// Dynamic viscosity.
    DynamicViscosity,
    /// Energy.
    Energy,
    /// Thermal expansion coefficient.
    Expansion,
    /// Volume flow.
    Flow,
    /// Force.
    Force,
    /// A fraction printed in percent (efficiency, flow change).
    Fraction,
    /// Oscillation frequency.
    Frequency,
    /// Heat flow (printed in kW or Btu/h).
    Heat,
    /// Moment of inertia.
    Inertia,
    /// Kinematic viscosity.
    KinematicViscosity,
    /// Length, bore, rod diameter, stroke.
    Length,
    /// Mass.
    Mass,
    /// Bulk modulus and other elastic moduli.
    Modulus,
    /// Mechanical or hydraulic power.
    Power,
    /// Gauge pressure, or a pressure difference.
    Pressure,
    /// A plain ratio with no unit.
    Ratio,
    /// Shaft speed.
    ShaftSpeed,
    /// Specific heat capacity.
    SpecificHeat,
    /// Spring rate.
    Stiffness,
    /// A temperature on a scale (a point).
    Temperature,
    /// A temperature difference (a rise or fall).
    TemperatureDifference,
    /// Time.
    Time,
    /// Torque.
    Torque,
    /// Linear speed of a cylinder rod.
    Velocity,
    /// Volume.
    Volume,
}

impl Kind {
    /// Every kind, in name order.
    pub const ALL: &'static [Kind] = &[
        Kind::Area,
        Kind::Density,
        Kind::Displacement,
        Kind::DynamicViscosity,
        Kind::Energy,
        Kind::Expansion,
        Kind::Flow,
        Kind::Force,
        Kind::Fraction,
        Kind::Frequency,
        Kind::Heat,
        Kind::Inertia,
        Kind::KinematicViscosity,
        Kind::Length,
        Kind::Mass,
        Kind::Modulus,
        Kind::Power,
        Kind::Pressure,
        Kind::Ratio,
        Kind::ShaftSpeed,
        Kind::SpecificHeat,
        Kind::Stiffness,
        Kind::Temperature,
        Kind::TemperatureDifference,
        Kind::Time,
        Kind::Torque,
        Kind::Velocity,
        Kind::Volume,
    ];

    /// The kind's name as written in rule files and JSON (kebab-case).
    pub fn name(self) -> &'static str {
        match self {
            Kind::Area => "area",
            Kind::Density => "density",
            Kind::Displacement => "displacement",
            Kind::DynamicViscosity => "dynamic-viscosity",
            Kind::Energy => "energy",
            Kind::Expansion => "expansion",
            Kind::Flow => "flow",
            Kind::Force => "force",
            Kind::Fraction => "fraction",
            Kind::Frequency => "frequency",
            Kind::Heat => "heat",
            Kind::Inertia => "inertia",
            Kind::KinematicViscosity => "kinematic-viscosity",
            Kind::Length => "length",
            Kind::Mass => "mass",
            Kind::Modulus => "modulus",
            Kind::Power => "power",
            Kind::Pressure => "pressure",
            Kind::Ratio => "ratio",
            Kind::ShaftSpeed => "shaft-speed",
            Kind::SpecificHeat => "specific-heat",
            Kind::Stiffness => "stiffness",
            Kind::Temperature => "temperature",
            Kind::TemperatureDifference => "temperature-difference",
            Kind::Time => "time",
            Kind::Torque => "torque",
            Kind::Velocity => "velocity",
            Kind::Volume => "volume",
        }
    }

    /// The physical dimension.
    pub fn dimension(self) -> Dimension {
        match self {
            Kind::Area => Dimension::AREA,
            Kind::Density => Dimension::DENSITY,
            Kind::Displacement | Kind::Volume => Dimension::VOLUME,
            Kind::DynamicViscosity => Dimension::DYNAMIC_VISCOSITY,
            Kind::Energy | Kind::Torque => Dimension::ENERGY,
            Kind::Expansion => Dimension::PER_TEMPERATURE,
            Kind::Flow => Dimension::FLOW,
            Kind::Force => Dimension::FORCE,
            Kind::Fraction | Kind::Ratio => Dimension::NONE,
            Kind::Frequency | Kind::ShaftSpeed => Dimension::FREQUENCY,
            Kind::Heat | Kind::Power => Dimension::POWER,
            Kind::Inertia => Dimension::INERTIA,
            Kind::KinematicViscosity => Dimension::KINEMATIC_VISCOSITY,
            Kind::Length => Dimension::LENGTH,
            Kind::Mass => Dimension::MASS,
            Kind::Modulus | Kind::Pressure => Dimension::PRESSURE,
            Kind::SpecificHeat => Dimension::SPECIFIC_HEAT,
            Kind::Stiffness => Dimension::STIFFNESS,
            Kind::Temperature | Kind::TemperatureDifference => Dimension::TEMPERATURE,
            Kind::Time => Dimension::TIME,
            Kind::Velocity => Dimension::VELOCITY,
        }
    }

    /// The symbol of the unit this kind is printed in.
    pub fn display_unit(self, system: UnitSystem) -> &'static str {
        let metric = system == UnitSystem::Metric;
        let pick = |m: &'static str, us: &'static str| if metric { m } else { us };
        match self {
            Kind::Area => pick("cm²", "in²"),
            Kind::Density => pick("kg/m³", "lb/ft³"),
            Kind::Displacement => pick("cm³/rev", "in³/rev"),
            Kind::DynamicViscosity => pick("mPa·s", "cP"),
            Kind::Energy => pick("kJ", "BTU"),
            Kind::Expansion => pick("1/K", "1/°F"),
            Kind::Flow => pick("L/min", "gpm"),
            Kind::Force => pick("kN", "lbf"),
            Kind::Fraction => "%",
            Kind::Frequency => "Hz",
            Kind::Heat => pick("kW", "BTU/h"),
            Kind::Inertia => pick("kg·m²", "lb·ft²"),
            Kind::KinematicViscosity => "cSt",
            Kind::Length => pick("mm", "in"),
            Kind::Mass => pick("kg", "lb"),
            Kind::Modulus => pick("GPa", "psi"),
            Kind::Power => pick("kW", "hp"),
            Kind::Pressure => pick("bar", "psi"),
            Kind::Ratio => "",
            Kind::ShaftSpeed => "rpm",
            Kind::SpecificHeat => pick("J/(kg·K)", "BTU/(lb·°F)"),
            Kind::Stiffness => pick("N/mm", "lbf/in"),
            Kind::Temperature => pick("°C", "°F"),
            Kind::TemperatureDifference => pick("K", "Δ°F"),
            Kind::Time => "s",
            Kind::Torque => pick("N·m", "lbf·in"),
            Kind::Velocity => pick("mm/s", "in/s"),
            Kind::Volume => pick("L", "in³"),
        }
    }

    /// A few units accepted for this kind, for error messages.
    pub fn example_units(self) -> &'static str {
        match self {
            Kind::Pressure => "psi, bar, kPa, MPa, psia, inHg (vacuum)",
            Kind::Flow => "L/min, gpm, cm³/min",
            Kind::Displacement => "cm³/rev (cc/rev), in³/rev",
            Kind::ShaftSpeed => "rpm",
            Kind::Temperature => "degC, degF",
            Kind::TemperatureDifference => "K, dC, dF",
            Kind::KinematicViscosity => "cSt, SUS",
            Kind::Length => "mm, in",
            Kind::Area => "cm^2, in^2",
            Kind::Power | Kind::Heat => "kW, hp, BTU/h",
            Kind::Frequency => "Hz",
            Kind::Density => "kg/m^3, or a bare specific gravity such as 0.87",
            Kind::Fraction => "%, or a plain fraction such as 0.92",
            _ => self.display_unit(UnitSystem::Metric),
        }
    }

    /// Whether a negative value can be real. Pressures may be negative (a
    /// vacuum) but not below a perfect vacuum, which the parser checks apart;
    /// forces and torques may be negative (an overrunning load).
    pub fn allows_negative(self) -> bool {
        matches!(
            self,
            Kind::Pressure
                | Kind::Force
                | Kind::Torque
                | Kind::Ratio
                | Kind::Energy
                | Kind::Power
                | Kind::Heat
                | Kind::TemperatureDifference
                | Kind::Velocity
                | Kind::Temperature
        )
    }

    /// The kind a dimension is printed as when nothing more is known.
    pub fn for_dimension(dimension: Dimension) -> Option<Kind> {
        let preferred = [
            Kind::Ratio,
            Kind::Pressure,
            Kind::Flow,
            Kind::Volume,
            Kind::ShaftSpeed,
            Kind::Temperature,
            Kind::Torque,
            Kind::Power,
        ];
        preferred
            .iter()
            .chain(Kind::ALL.iter())
            .copied()
            .find(|k| k.dimension() == dimension)
    }
}

impl fmt::Display for Kind {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.name())
    }
}

impl FromStr for Kind {
    type Err = String;

    /// Parse a kind name; the error carries the nearest name as a suggestion.
    fn from_str(s: &str) -> Result<Self, Self::Err> {
        Kind::ALL
            .iter()
            .copied()
            .find(|k| k.name() == s)
            .ok_or_else(|| {
                let names: Vec<&str> = Kind::ALL.iter().map(|k| k.name()).collect();
                match super::suggest(s, names.iter().copied()) {
                    Some(near) => format!("unknown quantity kind `{s}` (did you mean `{near}`?)"),
                    None => format!("unknown quantity kind `{s}`"),
                }
            })
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::units::unit;

    #[test]
    fn every_display_unit_exists_with_the_right_dimension() {
        for &kind in Kind::ALL {
            for system in [UnitSystem::Metric, UnitSystem::Us] {
                let symbol = kind.display_unit(system);
                if symbol.is_empty() {
                    assert!(kind.dimension().is_none());
                    continue;
                }
                let u = unit::by_symbol(symbol);
                assert_eq!(u.dimension, kind.dimension(), "{kind} in {symbol}");
            }
        }
    }

    #[test]
    fn names_round_trip() {
        for &kind in Kind::ALL {
            assert_eq!(kind.name().parse::<Kind>(), Ok(kind));
        }
        assert_eq!(
            "presure".parse::<Kind>(),
            Err("unknown quantity kind `presure` (did you mean `pressure`?)".to_string())
        );
    }
}

//! Physical dimensions as exponent vectors over mass, length, time and
//! temperature.
//!
//! Revolutions are dimensionless here (a displacement is m³ per revolution,
//! a shaft speed is revolutions per second), so displacement × speed is a
//! flow with no hidden factor of 2π. A radian is then 1/(2π) of a revolution.

use std::fmt;

/// Exponents of mass, length, time and temperature.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub struct Dimension {
    /// Exponent of mass (kg).
    pub mass: i8,
    /// Exponent of length (m).
    pub length: i8,
    /// Exponent of time (s).
    pub time: i8,
    /// Exponent of temperature (K).
    pub temperature: i8,
}

impl Dimension {
    /// Build a dimension from its exponents (mass, length, time, temperature).
    pub const fn new(mass: i8, length: i8, time: i8, temperature: i8) -> Self {
        Dimension {
            mass,
            length,
            time,
            temperature,
        }
    }

    /// No dimension: ratios, efficiencies, specific gravity.
    pub const NONE: Dimension = Dimension::new(0, 0, 0, 0);
    /// Length (m).
    pub const LENGTH: Dimension = Dimension::new(0, 1, 0, 0);
    /// Area (m²).
    pub const AREA: Dimension = Dimension::new(0, 2, 0, 0);
    /// Volume, and displacement per revolution (m³).
    pub const VOLUME: Dimension = Dimension::new(0, 3, 0, 0);
    /// Time (s).
    pub const TIME: Dimension = Dimension::new(0, 0, 1, 0);
    /// Frequency and shaft speed (1/s, rev/s).
    pub const FREQUENCY: Dimension = Dimension::new(0, 0, -1, 0);
    /// Linear speed (m/s).
    pub const VELOCITY: Dimension = Dimension::new(0, 1, -1, 0);
    /// Volume flow (m³/s).
    pub const FLOW: Dimension = Dimension::new(0, 3, -1, 0);
    /// Mass (kg).
    pub const MASS: Dimension = Dimension::new(1, 0, 0, 0);
    /// Force (N).
    pub const FORCE: Dimension = Dimension::new(1, 1, -2, 0);
    /// Pressure and bulk modulus (Pa).
    pub const PRESSURE: Dimension = Dimension::new(1, -1, -2, 0);
    /// Energy and torque (J, N·m).
    pub const ENERGY: Dimension = Dimension::new(1, 2, -2, 0);
    /// Power and heat flow (W).
    pub const POWER: Dimension = Dimension::new(1, 2, -3, 0);
    /// Density (kg/m³).
    pub const DENSITY: Dimension = Dimension::new(1, -3, 0, 0);
    /// Kinematic viscosity (m²/s).
    pub const KINEMATIC_VISCOSITY: Dimension = Dimension::new(0, 2, -1, 0);
    /// Dynamic viscosity (Pa·s).
    pub const DYNAMIC_VISCOSITY: Dimension = Dimension::new(1, -1, -1, 0);
    /// Temperature or temperature difference (K).
    pub const TEMPERATURE: Dimension = Dimension::new(0, 0, 0, 1);
    /// Moment of inertia (kg·m²).
    pub const INERTIA: Dimension = Dimension::new(1, 2, 0, 0);
    /// Spring rate (N/m).
    pub const STIFFNESS: Dimension = Dimension::new(1, 0, -2, 0);
    /// Specific heat capacity (J/(kg·K)).
    pub const SPECIFIC_HEAT: Dimension = Dimension::new(0, 2, -2, -1);
    /// Thermal expansion coefficient (1/K).
    pub const PER_TEMPERATURE: Dimension = Dimension::new(0, 0, 0, -1);

    /// The largest power of a base unit that a unit expression may reach:
    /// far beyond any physical quantity, and far from the `i8` bounds.
    pub const MAX_EXPONENT: i8 = 32;

    /// The dimension of a product, or `None` past [`Self::MAX_EXPONENT`].
    pub fn checked_times(self, other: Dimension) -> Option<Dimension> {
        self.checked(other, 1, 1)
    }

    /// The dimension of a quotient, or `None` past [`Self::MAX_EXPONENT`].
    pub fn checked_per(self, other: Dimension) -> Option<Dimension> {
        self.checked(other, 1, -1)
    }

    /// The dimension raised to `n`, or `None` past [`Self::MAX_EXPONENT`].
    pub fn checked_powi(self, n: i8) -> Option<Dimension> {
        self.checked(Dimension::NONE, n, 0)
    }

    /// `a·self + b·other` exponent by exponent, in `i16` so that nothing
    /// wraps, then bounded by [`Self::MAX_EXPONENT`].
    fn checked(self, other: Dimension, a: i8, b: i8) -> Option<Dimension> {
        let limit = i16::from(Self::MAX_EXPONENT);
        let e = |x: i8, y: i8| {
            let v = i16::from(a) * i16::from(x) + i16::from(b) * i16::from(y);
            i8::try_from(v)
                .ok()
                .filter(|_| (-limit..=limit).contains(&v))
        };
        Some(Dimension::new(
            e(self.mass, other.mass)?,
            e(self.length, other.length)?,
            e(self.time, other.time)?,
            e(self.temperature, other.temperature)?,
        ))
    }

    /// The dimension of a product.
    pub fn times(self, other: Dimension) -> Dimension {
        Dimension::new(
            self.mass + other.mass,
            self.length + other.length,
            self.time + other.time,
            self.temperature + other.temperature,
        )
    }

    /// The dimension of a quotient.
    pub fn per(self, other: Dimension) -> Dimension {
        Dimension::new(
            self.mass - other.mass,
            self.length - other.length,
            self.time - other.time,
            self.temperature - other.temperature,
        )
    }

    /// The dimension raised to an integer power.
    pub fn powi(self, n: i8) -> Dimension {
        Dimension::new(
            self.mass * n,
            self.length * n,
            self.time * n,
            self.temperature * n,
        )
    }

    /// The square root, when every exponent is even.
    pub fn sqrt(self) -> Option<Dimension> {
        let even = |e: i8| e % 2 == 0;
        (even(self.mass) && even(self.length) && even(self.time) && even(self.temperature)).then(
            || {
                Dimension::new(
                    self.mass / 2,
                    self.length / 2,
                    self.time / 2,
                    self.temperature / 2,
                )
            },
        )
    }

    /// True for a ratio with no dimension.
    pub fn is_none(self) -> bool {
        self == Dimension::NONE
    }

    /// A plain name such as "pressure" or "flow", or the SI base form.
    pub fn name(self) -> String {
        NAMES
            .iter()
            .find(|(d, _)| *d == self)
            .map(|(_, n)| (*n).to_string())
            .unwrap_or_else(|| self.to_string())
    }
}

const NAMES: &[(Dimension, &str)] = &[
    (Dimension::NONE, "plain number"),
    (Dimension::LENGTH, "length"),
    (Dimension::AREA, "area"),
    (Dimension::VOLUME, "volume"),
    (Dimension::TIME, "time"),
    (Dimension::FREQUENCY, "speed or frequency (per time)"),
    (Dimension::VELOCITY, "linear speed"),
    (Dimension::FLOW, "flow"),
    (Dimension::MASS, "mass"),
    (Dimension::FORCE, "force"),
    (Dimension::PRESSURE, "pressure"),
    (Dimension::ENERGY, "energy or torque"),
    (Dimension::POWER, "power"),
    (Dimension::DENSITY, "density"),
    (Dimension::KINEMATIC_VISCOSITY, "kinematic viscosity"),
    (Dimension::DYNAMIC_VISCOSITY, "dynamic viscosity"),
    (Dimension::TEMPERATURE, "temperature"),
    (Dimension::INERTIA, "moment of inertia"),
    (Dimension::STIFFNESS, "spring rate"),
    (Dimension::SPECIFIC_HEAT, "specific heat"),
    (Dimension::PER_TEMPERATURE, "per temperature"),
];

impl fmt::Display for Dimension {
    /// SI base form, e.g. `kg·m^-1·s^-2`.
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let parts: Vec<String> = [
            ("kg", self.mass),
            ("m", self.length),
            ("s", self.time),
            ("K", self.temperature),
        ]
        .iter()
        .filter(|(_, e)| *e != 0)
        .map(|(s, e)| {
            if *e == 1 {
                (*s).to_string()
            } else {
                format!("{s}^{e}")
            }
        })
        .collect();
        if parts.is_empty() {
            write!(f, "1")
        } else {
            write!(f, "{}", parts.join("·"))
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn displacement_times_speed_is_flow() {
        assert_eq!(
            Dimension::VOLUME.times(Dimension::FREQUENCY),
            Dimension::FLOW
        );
    }

    #[test]
    fn pressure_times_flow_is_power() {
        assert_eq!(Dimension::PRESSURE.times(Dimension::FLOW), Dimension::POWER);
    }

    #[test]
    fn sqrt_of_pressure_over_density_is_velocity() {
        let d = Dimension::PRESSURE.per(Dimension::DENSITY).sqrt();
        assert_eq!(d, Some(Dimension::VELOCITY));
        assert_eq!(Dimension::LENGTH.sqrt(), None);
    }

    #[test]
    fn names() {
        assert_eq!(Dimension::FLOW.name(), "flow");
        assert_eq!(Dimension::new(0, 5, 0, 0).name(), "m^5");
    }
}

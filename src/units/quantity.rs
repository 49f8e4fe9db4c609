//! A value with its dimension, held in SI.

use super::{Dimension, Kind};

/// A physical value in SI units with its dimension.
///
/// Temperatures are affine: a temperature *point* (a reading of 55 °C) is
/// held in kelvin and flagged, so that it is never confused with a
/// temperature *difference* of the same number of kelvin.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Quantity {
    si: f64,
    dimension: Dimension,
    temperature_point: bool,
}

impl Quantity {
    /// A value of `si` SI units of `dimension` (not a temperature point).
    pub fn new(si: f64, dimension: Dimension) -> Self {
        Quantity {
            si,
            dimension,
            temperature_point: false,
        }
    }

    /// A temperature point of `kelvin` K.
    pub fn temperature(kelvin: f64) -> Self {
        Quantity {
            si: kelvin,
            dimension: Dimension::TEMPERATURE,
            temperature_point: true,
        }
    }

    /// A value of a kind, in SI; a [`Kind::Temperature`] value is a point.
    pub fn of(kind: Kind, si: f64) -> Self {
        if kind == Kind::Temperature {
            Quantity::temperature(si)
        } else {
            Quantity::new(si, kind.dimension())
        }
    }

    /// A plain number with no dimension.
    pub fn number(value: f64) -> Self {
        Quantity::new(value, Dimension::NONE)
    }

    /// The value in SI units (kelvin for temperature points).
    pub fn si(&self) -> f64 {
        self.si
    }

    /// The dimension.
    pub fn dimension(&self) -> Dimension {
        self.dimension
    }

    /// True for a temperature point, false for a difference or anything else.
    pub fn is_temperature_point(&self) -> bool {
        self.temperature_point
    }

    /// The same value as a temperature difference (a point measured from 0 K).
    pub fn as_difference(self) -> Self {
        Quantity {
            temperature_point: false,
            ..self
        }
    }

    /// True when this value can stand for `kind`: same dimension, and a
    /// temperature point exactly when the kind is a temperature.
    pub fn fits(&self, kind: Kind) -> bool {
        self.dimension == kind.dimension()
            && (self.temperature_point == (kind == Kind::Temperature)
                || self.dimension != Dimension::TEMPERATURE)
    }
}

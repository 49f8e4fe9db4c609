//! The static type of a formula or sub-formula: true/false, or a quantity
//! of some dimension (a temperature point kept apart from a difference).

use crate::units::{Dimension, Kind, Quantity};

/// What a formula computes, known before it is evaluated.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum ValueType {
    /// A condition: true or false.
    Bool,
    /// A quantity of a dimension; a temperature point when `temperature_point`.
    Quantity {
        /// The dimension.
        dimension: Dimension,
        /// True for a temperature on a scale (not a difference).
        temperature_point: bool,
    },
}

impl ValueType {
    /// A plain number with no dimension.
    pub const NUMBER: ValueType = ValueType::Quantity {
        dimension: Dimension::NONE,
        temperature_point: false,
    };

    /// A quantity of `dimension` that is not a temperature point.
    pub fn quantity(dimension: Dimension) -> Self {
        ValueType::Quantity {
            dimension,
            temperature_point: false,
        }
    }

    /// The type of a value of `kind`.
    pub fn of_kind(kind: Kind) -> Self {
        ValueType::Quantity {
            dimension: kind.dimension(),
            temperature_point: kind == Kind::Temperature,
        }
    }

    /// The type of `q`.
    pub fn of_quantity(q: &Quantity) -> Self {
        ValueType::Quantity {
            dimension: q.dimension(),
            temperature_point: q.is_temperature_point(),
        }
    }

    /// The dimension, for a quantity.
    pub fn dimension(self) -> Option<Dimension> {
        match self {
            ValueType::Bool => None,
            ValueType::Quantity { dimension, .. } => Some(dimension),
        }
    }

    /// True for a temperature point.
    pub fn is_temperature_point(self) -> bool {
        matches!(
            self,
            ValueType::Quantity {
                temperature_point: true,
                ..
            }
        )
    }

    /// The kind a value of this type is printed as when nothing more is
    /// known: a temperature for a point, a temperature difference for any
    /// other temperature, otherwise the usual kind of the dimension.
    pub fn default_kind(self) -> Option<Kind> {
        match self {
            ValueType::Bool => None,
            ValueType::Quantity {
                temperature_point: true,
                ..
            } => Some(Kind::Temperature),
            ValueType::Quantity { dimension, .. } if dimension == Dimension::TEMPERATURE => {
                Some(Kind::TemperatureDifference)
            }
            ValueType::Quantity { dimension, .. } => Kind::for_dimension(dimension),
        }
    }

    /// The type in words with an article, for messages: "a pressure",
    /// "a shaft speed" (when `kind` says so), "a temperature difference".
    pub fn describe(self, kind: Option<Kind>) -> String {
        let kind = kind
            .filter(|k| ValueType::of_kind(*k) == self)
            .or_else(|| self.default_kind());
        let name = match (self, kind) {
            (ValueType::Bool, _) => "true/false value".to_string(),
            (_, Some(Kind::Ratio)) => "plain number".to_string(),
            (_, Some(kind)) => kind.name().replace('-', " "),
            (ValueType::Quantity { dimension, .. }, None) => format!("quantity in {dimension}"),
        };
        let article = if name.starts_with(['a', 'e', 'i', 'o', 'u']) {
            "an"
        } else {
            "a"
        };
        format!("{article} {name}")
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn descriptions() {
        let cases = [
            (ValueType::of_kind(Kind::Pressure), None, "a pressure"),
            (ValueType::of_kind(Kind::ShaftSpeed), None, "a shaft speed"),
            (
                ValueType::of_kind(Kind::Frequency),
                Some(Kind::Frequency),
                "a frequency",
            ),
            (ValueType::of_kind(Kind::Temperature), None, "a temperature"),
            (
                ValueType::quantity(Dimension::TEMPERATURE),
                Some(Kind::Temperature),
                "a temperature difference",
            ),
            (ValueType::NUMBER, None, "a plain number"),
            (ValueType::Bool, None, "a true/false value"),
            (ValueType::of_kind(Kind::Area), None, "an area"),
            (
                ValueType::quantity(Dimension::new(0, 5, 0, 0)),
                None,
                "a quantity in m^5",
            ),
        ];
        for (ty, kind, text) in cases {
            assert_eq!(ty.describe(kind), text);
        }
    }
}

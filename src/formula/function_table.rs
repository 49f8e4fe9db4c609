//! The functions a formula may call: the built-ins, and functions other
//! modules register with a signature (physics formulas on SI values).

use std::collections::BTreeMap;

use super::formula_error::{FormulaError, FormulaErrorKind, Span};
use crate::units::Dimension;

/// The body of a registered function: SI values in, an SI value out, or an
/// explanation of why no value can be computed.
pub type FunctionBody = fn(&[f64]) -> Result<f64, String>;

/// One parameter of a registered function.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Parameter {
    /// The name shown in messages and listings.
    pub name: String,
    /// The dimension an argument must have.
    pub dimension: Dimension,
    /// True when the argument is a temperature on a scale (a point), not a
    /// difference; the body receives it in kelvin.
    pub temperature_point: bool,
}

/// A function registered with its signature.
#[derive(Clone, Debug)]
pub struct Function {
    /// The name formulas call it by (snake_case).
    pub name: String,
    /// One line saying what it computes.
    pub doc: String,
    /// The parameters, in order.
    pub parameters: Vec<Parameter>,
    /// The dimension of the result.
    pub result: Dimension,
    /// The computation, on SI values.
    pub body: FunctionBody,
}

impl Function {
    /// A function `name` with `doc`, `parameters` as (name, dimension)
    /// pairs, a `result` dimension and a `body`.
    pub fn new(
        name: &str,
        doc: &str,
        parameters: &[(&str, Dimension)],
        result: Dimension,
        body: FunctionBody,
    ) -> Self {
        Function {
            name: name.to_string(),
            doc: doc.to_string(),
            parameters: parameters
                .iter()
                .map(|(name, dimension)| Parameter {
                    name: (*name).to_string(),
                    dimension: *dimension,
                    temperature_point: false,
                })
                .collect(),
            result,
            body,
        }
    }

    /// The same function with parameter `index` taking a temperature point.
    pub fn with_temperature_point(mut self, index: usize) -> Self {
        if let Some(p) = self.parameters.get_mut(index) {
            p.temperature_point = true;
        }
        self
    }

    /// The signature in words, e.g. `area_flow(area: area, v: linear speed) -> flow`.
    pub fn signature(&self) -> String {
        let params: Vec<String> = self
            .parameters
            .iter()
            .map(|p| format!("{}: {}", p.name, p.dimension.name()))
            .collect();
        format!(
            "{}({}) -> {}",
            self.name,
            params.join(", "),
            self.result.name()
        )
    }
}

/// A function every formula can call. The built-ins work on any dimension
/// (all arguments share it), which a registered signature cannot express.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Builtin {
    /// `abs(x)`
    Abs,
    /// `clamp(x, lo, hi)`
    Clamp,
    /// `max(a, b, …)`
    Max,
    /// `min(a, b, …)`
    Min,
    /// `sqrt(x)`
    Sqrt,
}

impl Builtin {
    /// Every built-in, in name order.
    pub const ALL: [Builtin; 5] = [
        Builtin::Abs,
        Builtin::Clamp,
        Builtin::Max,
        Builtin::Min,
        Builtin::Sqrt,
    ];

    /// The name formulas call it by.
    pub fn name(self) -> &'static str {
        match self {
            Builtin::Abs => "abs",
            Builtin::Clamp => "clamp",
            Builtin::Max => "max",
            Builtin::Min => "min",
            Builtin::Sqrt => "sqrt",
        }
    }

    /// One line saying what it computes.
    pub fn doc(self) -> &'static str {
        match self {
            Builtin::Abs => "abs(x): the magnitude of x, in x's unit",
            Builtin::Clamp => "clamp(x, lo, hi): x limited to lo..hi (all of one dimension)",
            Builtin::Max => "max(a, b, ...): the largest argument (all of one dimension)",
            Builtin::Min => "min(a, b, ...): the smallest argument (all of one dimension)",
            Builtin::Sqrt => "sqrt(x): the square root; x's dimension must have even powers",
        }
    }

    /// The built-in called `name`, if there is one.
    pub fn from_name(name: &str) -> Option<Builtin> {
        Builtin::ALL.into_iter().find(|b| b.name() == name)
    }
}

/// The registered functions, by name.
#[derive(Clone, Debug, Default)]
pub struct FunctionTable {
    functions: BTreeMap<String, Function>,
}

impl FunctionTable {
    /// A table with no registered functions (the built-ins are always there).
    pub fn new() -> Self {
        FunctionTable::default()
    }

    /// Add `function`; its name must not be a built-in or already registered.
    pub fn register(&mut self, function: Function) -> Result<&mut Self, FormulaError> {
        if Builtin::from_name(&function.name).is_some()
            || self.functions.contains_key(&function.name)
        {
            let kind = FormulaErrorKind::DuplicateFunction {
                name: function.name,
            };
            return Err(FormulaError::new(kind, Span::default()));
        }
        self.functions.insert(function.name.clone(), function);
        Ok(self)
    }

    /// The registered function called `name`.
    pub fn get(&self, name: &str) -> Option<&Function> {
        self.functions.get(name)
    }

    /// The registered functions, in name order.
    pub fn iter(&self) -> impl Iterator<Item = &Function> {
        self.functions.values()
    }

    /// Every name a formula can call: built-ins, then registered functions.
    pub fn names(&self) -> impl Iterator<Item = &str> {
        Builtin::ALL
            .iter()
            .map(|b| b.name())
            .chain(self.functions.keys().map(String::as_str))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn double(args: &[f64]) -> Result<f64, String> {
        Ok(args.first().copied().unwrap_or_default() * 2.0)
    }

    #[test]
    fn registration() {
        let mut table = FunctionTable::new();
        let f = Function::new(
            "double_flow",
            "twice a flow",
            &[("q", Dimension::FLOW)],
            Dimension::FLOW,
            double,
        );
        table.register(f.clone()).unwrap();
        assert_eq!(
            table.register(f).unwrap_err().to_string(),
            "function `double_flow` is already defined"
        );
        let shadow = Function::new("sqrt", "", &[], Dimension::NONE, double);
        assert!(table.register(shadow).is_err());
        assert_eq!(
            table.get("double_flow").unwrap().signature(),
            "double_flow(q: flow) -> flow"
        );
        assert_eq!(
            table.names().collect::<Vec<_>>(),
            ["abs", "clamp", "max", "min", "sqrt", "double_flow"]
        );
    }
}

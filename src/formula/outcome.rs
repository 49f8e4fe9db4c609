//! The result of evaluating with the readings at hand: a value, or the
//! readings that are still needed.

/// What evaluation gave: a value, or the readings that would settle it.
///
/// A missing reading is not an error: the diagnosis uses the list to ask
/// for the readings that would decide a check.
#[derive(Clone, Debug, PartialEq)]
pub enum Outcome<T> {
    /// Every reading needed was there.
    Known(T),
    /// The readings (`name` or `name@point`) still needed, sorted. A reading
    /// that cannot change the result (`a or b` with `b` true) is not listed.
    Missing(Vec<String>),
}

impl<T> Outcome<T> {
    /// The value, if it is known.
    pub fn known(self) -> Option<T> {
        match self {
            Outcome::Known(v) => Some(v),
            Outcome::Missing(_) => None,
        }
    }

    /// Apply `f` to a known value.
    pub fn map<U>(self, f: impl FnOnce(T) -> U) -> Outcome<U> {
        match self {
            Outcome::Known(v) => Outcome::Known(f(v)),
            Outcome::Missing(names) => Outcome::Missing(names),
        }
    }
}

//! Checked fluid-power formulas: pure functions on SI values.

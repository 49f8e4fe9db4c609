//! Integration tests: each module runs the real binary on data the test owns.
mod calc;

mod cases;
mod demo;
mod guide;

//! Integration tests: each module runs the real binary on data the test owns.
mod bad_input;
mod calc;
mod cases;
mod chart;
mod demo;
mod diagnose;
mod faults;
mod guide;
mod harness;
mod machine;
mod report_render;
mod rules;
mod safety;
mod watch;

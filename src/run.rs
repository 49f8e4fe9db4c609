//! Parse the command line, execute, and turn the outcome into an exit code.
//!
//! This is the only place that prints an error; everything below returns
//! typed errors.

use std::ffi::OsString;
use std::process::ExitCode;

use clap::Parser;

use crate::cli::Arguments;
use crate::error::ExitStatus;

/// Run spoolsleuth with these arguments (the first is the program name) and
/// return the exit code. Never panics on user input.
pub fn run<I, T>(args: I) -> ExitCode
where
    I: IntoIterator<Item = T>,
    T: Into<OsString> + Clone,
{
    let arguments = match Arguments::try_parse_from(args) {
        Ok(arguments) => arguments,
        Err(err) => {
            // clap prints help and version to stdout and usage errors to stderr.
            let _ = err.print();
            return if err.use_stderr() {
                ExitStatus::Error.into()
            } else {
                ExitStatus::Success.into()
            };
        }
    };
    match crate::cli::execute(arguments) {
        Ok(status) => status.into(),
        Err(err) if err.is_broken_pipe() => ExitStatus::Success.into(),
        Err(err) => {
            eprintln!("error: {err}");
            err.exit_status().into()
        }
    }
}

//! The command-line layer: clap argument structs and the glue that turns them
//! into library calls. Nothing below this folder imports clap.

mod arguments;
mod cases_arguments;
mod cases_command;

pub use arguments::Arguments;

use crate::error::{Error, ExitStatus};

/// Execute parsed arguments.
pub fn execute(arguments: Arguments) -> Result<ExitStatus, Error> {
    match arguments.command {
        arguments::Command::Cases(cases) => cases_command::execute(cases),
    }
}

//! The command-line layer: clap argument structs and the glue that turns them
//! into library calls. Nothing below this folder imports clap.

mod arguments;
mod calc_arguments;
mod calc_command;
mod calc_report;

pub use arguments::{Arguments, Command};
pub use calc_arguments::CalcArguments;

use crate::error::{Error, ExitStatus};

/// Execute parsed arguments.
pub fn execute(arguments: Arguments) -> Result<ExitStatus, Error> {
    match arguments.command {
        Command::Calc(calc) => calc_command::execute(calc),
    }
}

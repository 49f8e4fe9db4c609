//! The command-line layer: clap argument structs and the glue that turns them
//! into library calls and prints the results. Nothing below this folder
//! imports clap.

mod arguments;
mod context;
mod rules_arguments;
mod rules_command;

pub use arguments::Arguments;

use crate::error::{Error, ExitStatus};
use arguments::Command;
use context::Context;

/// Execute parsed arguments.
pub fn execute(arguments: Arguments) -> Result<ExitStatus, Error> {
    let context = Context::from_arguments(&arguments);
    match arguments.command {
        Command::Rules(args) => rules_command::execute(&context, args.action),
    }
}

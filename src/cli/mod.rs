//! The command-line layer: clap argument structs and the glue that turns them
//! into library calls and prints the results. Nothing below this folder
//! imports clap.

mod arguments;
mod calc_arguments;
mod calc_command;
mod calc_report;
mod cases_arguments;
mod cases_command;
mod chart_arguments;
mod chart_command;
mod context;
mod demo_command;
mod diagnose_arguments;
mod diagnose_command;
mod guide_arguments;
mod guide_command;
mod machine_arguments;
mod machine_command;
mod report_file;
mod rules_arguments;
mod rules_command;

pub use arguments::Arguments;
pub use calc_arguments::CalcArguments;
pub use cases_command::render_results;

use crate::error::{Error, ExitStatus};
use arguments::Command;
use context::Context;

/// Execute parsed arguments.
pub fn execute(arguments: Arguments) -> Result<ExitStatus, Error> {
    let context = Context::from_arguments(&arguments);
    match arguments.command {
        Command::Calc(calc) => calc_command::execute(&context, *calc),
        Command::Cases(cases) => cases_command::execute(&context, *cases),
        Command::Chart(chart) => chart_command::execute(&context, *chart),
        Command::Demo => demo_command::execute(&context),
        Command::Diagnose(args) => diagnose_command::execute(&context, *args),
        Command::Machine(args) => machine_command::execute(&context, args),
        Command::Guide(args) => guide_command::execute(&context, args),
        Command::Rules(args) => rules_command::execute(&context, args.action),
    }
}

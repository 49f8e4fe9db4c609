//! The `spoolsleuth` binary: hands the arguments to the library and exits with its code.

fn main() -> std::process::ExitCode {
    spoolsleuth::run(std::env::args_os())
}

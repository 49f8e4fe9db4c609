//! The one way integration tests start the binary: in a folder the test owns,
//! with none of the user's own settings. Every `SPOOLSLEUTH_*` variable is
//! cleared (so a technician's `SPOOLSLEUTH_UNITS=us` or notes folder never
//! changes what a test sees), no editor can open, colour is off, and the
//! cache folder is inside the test's folder.

use std::path::Path;

use assert_cmd::Command;

/// `spoolsleuth` to run in `dir`, with a clean environment.
pub fn spoolsleuth(dir: &Path) -> Command {
    Command::from_std(process(dir))
}

/// The same as a plain process, for tests that spawn and kill it.
pub fn process(dir: &Path) -> std::process::Command {
    let mut command = clean(std::process::Command::new(env!(
        "CARGO_BIN_EXE_spoolsleuth"
    )));
    command
        .current_dir(dir)
        .env("HOME", dir)
        .env("XDG_CACHE_HOME", dir.join("cache"));
    command
}

/// `spoolsleuth` with a clean environment, for commands that touch no file.
pub fn spoolsleuth_anywhere() -> Command {
    Command::from_std(clean(std::process::Command::new(env!(
        "CARGO_BIN_EXE_spoolsleuth"
    ))))
}

fn clean(mut command: std::process::Command) -> std::process::Command {
    for (name, _) in std::env::vars_os() {
        if name.to_string_lossy().starts_with("SPOOLSLEUTH_") {
            command.env_remove(&name);
        }
    }
    command
        .env_remove("VISUAL")
        .env("EDITOR", "false")
        .env("NO_COLOR", "1");
    command
}

//! Arguments of `spoolsleuth cases` (clap derive structs only).

use std::path::PathBuf;

use clap::{Args, Subcommand};

use crate::notes::NoteDate;

/// Past case notes: add, search, show and summarise.
#[derive(Debug, Args)]
pub struct CasesArguments {
    /// Folder of case notes (default: the built-in demo notes).
    #[arg(
        long,
        global = true,
        env = "SPOOLSLEUTH_CASES",
        value_name = "DIR",
        long_help = "Folder of case notes, one Markdown file per case (see cases/README.md). \
                     Without it, the demo notes built into spoolsleuth are searched (read-only)."
    )]
    pub cases: Option<PathBuf>,
    /// What to do with the notes.
    #[command(subcommand)]
    pub command: CasesCommand,
    /// Folder for the search index (default: a cache folder per notes folder).
    #[arg(
        long,
        global = true,
        env = "SPOOLSLEUTH_INDEX_DIR",
        value_name = "DIR",
        long_help = "Folder for the search index of the notes. The index is derived data: it is kept \
                     current on every use and rebuilt when missing or damaged. Default: a folder in \
                     the user's cache named after the notes folder."
    )]
    pub index_dir: Option<PathBuf>,
}

/// The `cases` subcommands.
#[derive(Debug, Subcommand)]
pub enum CasesCommand {
    /// Add a case note from options, a diagnosis JSON file or an editor.
    #[command(
        long_about = "Add a case note from options, a finished diagnosis (--from-json) or your \
                            $EDITOR (--edit). The note is validated and written under a new id; an \
                            existing note is never overwritten.\n\nExample:\n  spoolsleuth cases \
                            --cases notes add --machine press-4 --title 'Platen close sags' \\\n    \
                            --symptom speed-sags-under-load --cause compensator-sticking \\\n    --fix \
                            'Cleaned the compensator spool' --reading 'supply: 160 bar'"
    )]
    Add(AddArguments),
    /// Search the notes (exit 1 when nothing matches).
    #[command(
        long_about = "Search the notes, best match first. Words may be misspelt; the trade's \
                            synonyms (hunting/oscillating, sags/bogs, runs hot/overheating...) are \
                            understood. Quotes make a phrase, -word excludes, AND/OR combine.\n\n\
                            Exit status: 0 found, 1 nothing found, 2 error.\n\nExample:\n  \
                            spoolsleuth cases search 'platen slows under load' --machine press-4"
    )]
    Search(SearchArguments),
    /// Print one note.
    Show(ShowArguments),
    /// Causes by machine and by symptom, downtime, repeat offenders.
    Stats(StatsArguments),
    /// Keep watch on the notes folder so that searches skip checking every note.
    #[command(
        long_about = "Keep watch on the notes folder (Linux) until Ctrl-C, so that each search \
                            of it asks this watcher which notes changed instead of checking the \
                            size and time of every note file. Worth it from some ten thousand \
                            notes on; without a watcher every search still sees every new, \
                            edited and deleted note, only more slowly.\n\nNotes that are links, \
                            or files with other names, are checked on every search. Folders on \
                            network file systems are refused: changes made from other machines \
                            are not seen there.\n\nExample:\n  spoolsleuth cases --cases ~/shop-notes \
                            watch"
    )]
    Watch(WatchArguments),
}

/// Arguments of `cases watch` (the notes and index folders are the global
/// `--cases` and `--index-dir`).
#[derive(Debug, Args)]
pub struct WatchArguments {}

/// Arguments of `cases add`.
#[derive(Debug, Args)]
pub struct AddArguments {
    /// Cause id found, e.g. compensator-sticking.
    #[arg(long, value_name = "ID")]
    pub cause: Option<String>,
    /// Date of the case (default: today).
    #[arg(long, value_name = "DATE")]
    pub date: Option<String>,
    /// Downtime, e.g. '3.5 h' or '45 min'.
    #[arg(long, value_name = "TIME")]
    pub downtime: Option<String>,
    /// Write the note in $VISUAL or $EDITOR, starting from the other options.
    #[arg(long)]
    pub edit: bool,
    /// What was done.
    #[arg(long, value_name = "TEXT")]
    pub fix: Option<String>,
    /// Start from a finished diagnosis (JSON with machine, complaint, symptoms,
    /// leading_cause, fix, readings); options override its fields.
    #[arg(long, value_name = "FILE")]
    pub from_json: Option<PathBuf>,
    /// Print the new note's id and path as JSON.
    #[arg(long)]
    pub json: bool,
    /// Machine id, e.g. press-4.
    #[arg(long, value_name = "ID")]
    pub machine: Option<String>,
    /// A part used (repeat for more).
    #[arg(long = "part", value_name = "TEXT")]
    pub parts: Vec<String>,
    /// A reading as 'name: value', e.g. 'supply: 1450 psi' (repeat for more).
    #[arg(long = "reading", value_name = "TEXT")]
    pub readings: Vec<String>,
    /// A symptom id (repeat for more).
    #[arg(long = "symptom", value_name = "ID")]
    pub symptoms: Vec<String>,
    /// Technician's initials.
    #[arg(long, value_name = "INITIALS")]
    pub tech: Option<String>,
    /// Free text of the note.
    #[arg(long, value_name = "TEXT")]
    pub text: Option<String>,
    /// One-line complaint.
    #[arg(long, value_name = "TEXT")]
    pub title: Option<String>,
}

/// Arguments of `cases search`.
#[derive(Debug, Args)]
pub struct SearchArguments {
    /// Only notes with this cause id.
    #[arg(long, value_name = "ID")]
    pub cause: Option<String>,
    /// Print JSON (shape in cases/README.md).
    #[arg(long)]
    pub json: bool,
    /// Show at most this many notes.
    #[arg(long, default_value_t = 10, value_name = "N", value_parser = clap::value_parser!(u16).range(1..=1000))]
    pub limit: u16,
    /// Only notes about this machine id.
    #[arg(long, value_name = "ID")]
    pub machine: Option<String>,
    /// What to look for; empty lists the newest notes that pass the filters.
    #[arg(value_name = "QUERY", default_value = "")]
    pub query: String,
    /// Only notes on or after this date (YYYY-MM-DD).
    #[arg(long, value_name = "DATE")]
    pub since: Option<NoteDate>,
    /// Only notes with this symptom id.
    #[arg(long, value_name = "ID")]
    pub symptom: Option<String>,
    /// Only notes on or before this date (YYYY-MM-DD).
    #[arg(long, value_name = "DATE")]
    pub until: Option<NoteDate>,
}

/// Arguments of `cases show`.
#[derive(Debug, Args)]
pub struct ShowArguments {
    /// The note's id (its file name without .md).
    #[arg(value_name = "ID")]
    pub id: String,
    /// Print JSON (shape in cases/README.md).
    #[arg(long)]
    pub json: bool,
}

/// Arguments of `cases stats`.
#[derive(Debug, Args)]
pub struct StatsArguments {
    /// Print JSON (shape in cases/README.md).
    #[arg(long)]
    pub json: bool,
}

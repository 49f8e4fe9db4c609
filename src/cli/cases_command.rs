//! `spoolsleuth cases ...`: turns the parsed arguments into calls on the
//! notes, index and search modules and renders their results as tables,
//! text or JSON. Diagnostics go to stderr, results to stdout.

use std::io::{IsTerminal, Write};
use std::path::PathBuf;
use std::sync::atomic::{AtomicBool, Ordering};
use std::sync::Arc;

use comfy_table::{presets, Cell, ContentArrangement, Table};

use super::cases_arguments::{
    AddArguments, CasesArguments, CasesCommand, SearchArguments, ShowArguments, StatsArguments,
};
use super::context::Context;
use crate::error::{Error, ExitStatus};
use crate::index::{IndexError, IndexLocation, NoteIndex, SyncReport};
use crate::notes::{Downtime, DraftOrigin, Note, NoteDraft, NoteEditor, NotesError, NotesFolder};
use crate::search::{search, CaseStats, CauseCount, HighlightStyle, SearchRequest, SearchResults};
use crate::watch::{FolderWatcher, WatchError};

/// Table width when stdout is not a terminal, so that snippets wrap.
const PIPE_WIDTH: u16 = 120;

/// Run a `cases` subcommand. Matched words are bold exactly when the
/// global colour decision allows colour (`--color`, `NO_COLOR`, a terminal).
pub fn execute(context: &Context, arguments: CasesArguments) -> Result<ExitStatus, Error> {
    let folder = arguments
        .cases
        .map_or(NotesFolder::Embedded, NotesFolder::Disk);
    let index_dir = arguments.index_dir;
    let style = if context.color.enabled() {
        HighlightStyle::Bold
    } else {
        HighlightStyle::Markers
    };
    match arguments.command {
        CasesCommand::Add(add) => add_note(&folder, add),
        CasesCommand::Search(search) => search_notes(folder, index_dir, &search, style),
        CasesCommand::Show(show) => show_note(&folder, &show, style),
        CasesCommand::Stats(stats) => show_stats(folder, index_dir, &stats),
        CasesCommand::Watch(_) => watch_notes(folder, index_dir),
    }
}

/// Bring the index up to date, then keep watch on the notes folder and
/// answer searches until Ctrl-C (or the folder goes away).
fn watch_notes(folder: NotesFolder, index_dir: Option<PathBuf>) -> Result<ExitStatus, Error> {
    let NotesFolder::Disk(notes) = &folder else {
        return Err(WatchError::Embedded.into());
    };
    let location = IndexLocation::resolve(&folder, index_dir.as_deref())?;
    let IndexLocation::Dir(dir) = &location else {
        return Err(WatchError::MemoryIndex.into());
    };
    // Opened first so that the index folder is known to be ours before the
    // watcher puts its files there.
    let (_, report) = NoteIndex::open(folder.clone(), &location)?;
    report_sync(&report);
    let (watcher, started) = FolderWatcher::start(notes, dir)?;
    let stop = Arc::new(AtomicBool::new(false));
    let on_signal = Arc::clone(&stop);
    ctrlc::set_handler(move || on_signal.store(true, Ordering::Relaxed))
        .map_err(|e| Error::Io(std::io::Error::other(format!("cannot catch Ctrl-C: {e}"))))?;
    std::thread::scope(|scope| {
        let running = scope.spawn(|| watcher.run(&stop));
        // Through the watcher now, so its cursor is saved beside the index
        // and the next search asks it.
        let synced = NoteIndex::open(folder.clone(), &location);
        if let Err(error) = synced {
            stop.store(true, Ordering::Relaxed);
            let _ = running.join();
            return Err(error.into());
        }
        let links = match started.linked {
            0 => String::new(),
            1 => "; 1 linked note is checked on every search".to_string(),
            n => format!("; {n} linked notes are checked on every search"),
        };
        eprintln!(
            "watching {} notes in {}{links}\nsearches of these notes ask this watcher instead of checking every note; stop with Ctrl-C",
            started.notes,
            notes.display()
        );
        let result = running.join().unwrap_or_else(|_| {
            Err(WatchError::Io {
                path: started.socket.clone(),
                source: std::io::Error::other("the watcher stopped unexpectedly"),
            })
        });
        result?;
        eprintln!("stopped watching {}", notes.display());
        Ok(ExitStatus::Success)
    })
}

fn add_note(folder: &NotesFolder, add: AddArguments) -> Result<ExitStatus, Error> {
    if folder.is_embedded() {
        return Err(NotesError::EmbeddedReadOnly.into());
    }
    let from_json = match &add.from_json {
        Some(path) => {
            let text = crate::text_file::read_text(path).map_err(|e| NotesError::io(path, e))?;
            NoteDraft::from_json(path, &text)?
        }
        None => NoteDraft::default(),
    };
    let options = NoteDraft {
        cause: add.cause,
        date: add.date,
        downtime: add.downtime,
        fix: add.fix,
        machine: add.machine,
        parts: add.parts,
        readings: add.readings,
        symptoms: add.symptoms,
        technician: add.tech,
        text: add.text,
        title: add.title,
    };
    let draft = from_json.overridden_by(options);
    let note = if add.edit {
        match NoteEditor::from_env().edit(&draft, &mut std::io::stdin().lock())? {
            Some(note) => note,
            None => {
                eprintln!("nothing added: the note was left unchanged");
                return Ok(ExitStatus::Failure);
            }
        }
    } else {
        let origin = add
            .from_json
            .as_deref()
            .map_or(DraftOrigin::Options, DraftOrigin::Json);
        draft.into_note(origin)?
    };
    let (id, path) = folder.add(&note)?;
    let mut out = std::io::stdout().lock();
    if add.json {
        let json = serde_json::json!({ "id": id.as_str(), "path": path.display().to_string(), "schema_version": 1 });
        writeln!(out, "{}", serde_json::to_string_pretty(&json)?)?;
    } else {
        writeln!(out, "added {id}: {}", path.display())?;
    }
    Ok(ExitStatus::Success)
}

fn open_index(folder: NotesFolder, index_dir: Option<PathBuf>) -> Result<NoteIndex, Error> {
    let location = IndexLocation::resolve(&folder, index_dir.as_deref())?;
    let (index, report) = match NoteIndex::open(folder.clone(), &location) {
        Ok(opened) => opened,
        // The index is only derived data: when its folder cannot be written
        // (read-only, full) the notes are still searched, from memory.
        Err(error @ (IndexError::Io { .. } | IndexError::Tantivy { .. })) => {
            eprintln!(
                "warning: cannot keep the search index: {error}; searching the notes without it"
            );
            NoteIndex::open(folder, &IndexLocation::Memory)?
        }
        Err(error) => return Err(error.into()),
    };
    report_sync(&report);
    Ok(index)
}

fn report_sync(report: &SyncReport) {
    if let Some(reason) = report
        .rebuilt
        .as_deref()
        .filter(|r| *r != "there was no index yet")
    {
        eprintln!("note: rebuilt the search index because {reason}");
    }
    for broken in &report.broken {
        eprintln!("warning: {broken} (note skipped)");
    }
}

fn search_notes(
    folder: NotesFolder,
    index_dir: Option<PathBuf>,
    arguments: &SearchArguments,
    style: HighlightStyle,
) -> Result<ExitStatus, Error> {
    if let (Some(since), Some(until)) = (arguments.since, arguments.until) {
        // Swapped dates would read as "nothing found" (exit 1), as if the
        // notes held no such case.
        if since > until {
            return Err(Error::Input {
                option: "--since".into(),
                message: format!("{since} is after --until {until}: no date can be in both"),
            });
        }
    }
    let request = SearchRequest {
        cause: arguments.cause.clone(),
        limit: usize::from(arguments.limit),
        machine: arguments.machine.clone(),
        query: arguments.query.clone(),
        since: arguments.since,
        symptom: arguments.symptom.clone(),
        until: arguments.until,
    };
    // Before the index is opened: a pasted page is refused at once.
    request.check_length()?;
    let mut index = open_index(folder, index_dir)?;
    let results = search(&mut index, &request)?;
    let mut out = std::io::stdout().lock();
    if arguments.json {
        writeln!(out, "{}", serde_json::to_string_pretty(&results.to_json())?)?;
    } else {
        write!(
            out,
            "{}",
            render_results(&results, std::io::stdout().is_terminal(), style)
        )?;
    }
    Ok(if results.hits.is_empty() {
        ExitStatus::Failure
    } else {
        ExitStatus::Success
    })
}

/// The search results as `cases search` prints them: a table, or a table
/// with terminal styling when `terminal`.
pub fn render_results(results: &SearchResults, terminal: bool, style: HighlightStyle) -> String {
    let mut text = String::new();
    if let Some(better) = &results.did_you_mean {
        text.push_str(&format!("did you mean: {better}\n"));
    }
    if results.hits.is_empty() {
        text.push_str("no notes match\n");
        return text;
    }
    let mut table = new_table(terminal);
    table.set_header(["Date", "Machine", "Cause", "Downtime", "Snippet", "ID"]);
    for hit in &results.hits {
        table.add_row([
            hit.note.date_text(),
            hit.note.machine.clone(),
            hit.note.cause.clone(),
            downtime_text(hit.note.downtime),
            hit.snippet.render(style),
            hit.note.id.clone(),
        ]);
    }
    text.push_str(&format!("{table}\n"));
    text.push_str(&format!(
        "{} of {} matching notes\n",
        results.hits.len(),
        results.total
    ));
    text
}

fn new_table(terminal: bool) -> Table {
    let mut table = Table::new();
    table.set_content_arrangement(ContentArrangement::Dynamic);
    if terminal {
        table.load_style(presets::UTF8_FULL_CONDENSED);
    } else {
        table.load_style(presets::ASCII_FULL_CONDENSED);
        table.force_no_tty();
        table.set_width(PIPE_WIDTH);
    }
    table
}

fn downtime_text(downtime: Option<Downtime>) -> String {
    downtime.map_or_else(|| "-".to_string(), |d| d.to_string())
}

fn show_note(
    folder: &NotesFolder,
    arguments: &ShowArguments,
    style: HighlightStyle,
) -> Result<ExitStatus, Error> {
    let (note, path) = folder.find(&arguments.id)?;
    let mut out = std::io::stdout().lock();
    if arguments.json {
        writeln!(
            out,
            "{}",
            serde_json::to_string_pretty(&note.to_json(&path))?
        )?;
    } else {
        let bold = style;
        write!(out, "{}", render_note(&note, &path, bold))?;
    }
    Ok(ExitStatus::Success)
}

fn render_note(note: &Note, path: &std::path::Path, style: HighlightStyle) -> String {
    let title = match style {
        HighlightStyle::Bold => format!("\x1b[1m{}\x1b[0m", note.title),
        HighlightStyle::Markers => note.title.clone(),
    };
    let mut text = format!("{title}\n{}  ({})\n\n", note.id, path.display());
    let mut line = |label: &str, value: &str| {
        for (i, part) in value.lines().enumerate() {
            let label = if i == 0 {
                format!("{label}:")
            } else {
                String::new()
            };
            text.push_str(&format!("{label:<10} {part}\n"));
        }
    };
    line("Date", &note.date.to_string());
    line("Machine", &note.machine);
    line("Symptoms", &note.symptoms.join(", "));
    line("Cause", &note.cause);
    line("Fix", &note.fix);
    if !note.parts.is_empty() {
        line("Parts", &note.parts.join("\n"));
    }
    if let Some(downtime) = note.downtime {
        line("Downtime", &downtime.to_string());
    }
    if !note.readings.is_empty() {
        line(
            "Readings",
            &note
                .readings
                .iter()
                .map(ToString::to_string)
                .collect::<Vec<_>>()
                .join("\n"),
        );
    }
    if let Some(tech) = &note.technician {
        line("Tech", tech);
    }
    let body = note.text.trim();
    if !body.is_empty() {
        text.push('\n');
        text.push_str(body);
        text.push('\n');
    }
    text
}

fn show_stats(
    folder: NotesFolder,
    index_dir: Option<PathBuf>,
    arguments: &StatsArguments,
) -> Result<ExitStatus, Error> {
    let mut index = open_index(folder, index_dir)?;
    let stats = CaseStats::compute(&mut index)?;
    let mut out = std::io::stdout().lock();
    if arguments.json {
        writeln!(out, "{}", serde_json::to_string_pretty(&stats)?)?;
    } else {
        write!(
            out,
            "{}",
            render_stats(&stats, std::io::stdout().is_terminal())
        )?;
    }
    Ok(if stats.notes == 0 {
        ExitStatus::Failure
    } else {
        ExitStatus::Success
    })
}

fn causes_text(causes: &[CauseCount]) -> String {
    causes
        .iter()
        .map(|c| format!("{} ×{}", c.cause, c.count))
        .collect::<Vec<_>>()
        .join(", ")
}

fn render_stats(stats: &CaseStats, terminal: bool) -> String {
    let mut machines = new_table(terminal);
    machines.set_header(["Machine", "Notes", "Downtime", "Causes"]);
    for machine in &stats.machines {
        machines.add_row([
            Cell::new(&machine.machine),
            Cell::new(machine.notes),
            Cell::new(Downtime::from_minutes(machine.downtime_minutes)),
            Cell::new(causes_text(&machine.causes)),
        ]);
    }
    let mut symptoms = new_table(terminal);
    symptoms.set_header(["Symptom", "Notes", "Causes"]);
    for symptom in &stats.symptoms {
        symptoms.add_row([
            Cell::new(&symptom.symptom),
            Cell::new(symptom.notes),
            Cell::new(causes_text(&symptom.causes)),
        ]);
    }
    let mut text = format!(
        "{} notes, {} of downtime in all\n\nCauses by machine\n{machines}\n\nCauses by symptom\n{symptoms}\n",
        stats.notes,
        Downtime::from_minutes(stats.total_downtime_minutes)
    );
    if stats.repeat_offenders.is_empty() {
        text.push_str("\nNo repeat offenders\n");
    } else {
        let mut repeats = new_table(terminal);
        repeats.set_header(["Machine", "Cause", "Times", "First", "Last", "Downtime"]);
        for offender in &stats.repeat_offenders {
            repeats.add_row([
                Cell::new(&offender.machine),
                Cell::new(&offender.cause),
                Cell::new(offender.count),
                Cell::new(&offender.first),
                Cell::new(&offender.last),
                Cell::new(Downtime::from_minutes(offender.downtime_minutes)),
            ]);
        }
        text.push_str(&format!(
            "\nRepeat offenders (same cause, same machine)\n{repeats}\n"
        ));
    }
    text
}

//! `spoolsleuth guide`: drives the walk's state machine from the terminal,
//! piped input or an answers file, saving every accepted answer.

use std::io::{BufRead, IsTerminal, Write};
use std::path::{Path, PathBuf};

use super::context::Context;
use super::guide_arguments::GuideArguments;
use crate::error::{Error, ExitStatus};
use crate::guide::{Guide, GuideSession, Question};
use crate::machine::MachineSet;
use crate::notes::{DraftOrigin, NoteDraft, NotesFolder};
use crate::output;

/// Run the walk.
pub fn execute(context: &Context, arguments: GuideArguments) -> Result<ExitStatus, Error> {
    if let Some(path) = &arguments.report {
        super::report_file::report_kind(path)?;
    }
    let base = context.rule_base()?;
    let machines = MachineSet::load(
        arguments
            .cases
            .as_ref()
            .map(|c| c.join("machines"))
            .as_deref(),
    )?;
    if let Some(id) = arguments.machine.as_deref().filter(|id| *id != "none") {
        // Checked before the first answer is saved to the session.
        machines.get(id)?;
    }
    let mut guide = Guide::new(&base, &machines, context.units_given);
    let session_path = arguments
        .session
        .clone()
        .unwrap_or_else(GuideSession::default_path);
    let mut session = if arguments.resume {
        resume(&mut guide, &session_path)?
    } else {
        GuideSession::new()
    };
    watch_interrupt(&session_path);
    let interactive = arguments.answers.is_none() && std::io::stdin().is_terminal();
    let mut input: Box<dyn BufRead> = match &arguments.answers {
        Some(path) => Box::new(std::io::BufReader::new(std::fs::File::open(path).map_err(
            |e| Error::Input {
                option: "--answers".into(),
                message: format!("{}: {e}", path.display()),
            },
        )?)),
        None => Box::new(std::io::stdin().lock()),
    };
    let mut machine_option = arguments.machine.clone();
    while let Some(question) = guide.question() {
        let option = (question.id == "machine")
            .then(|| machine_option.take())
            .flatten();
        let (answer, from_option) = match option {
            Some(id) => (id, true),
            None => {
                ask(&question, interactive);
                match read_line(&mut input).map_err(|e| input_error(&arguments, e))? {
                    Some(line) => (line, false),
                    None => return Ok(stopped(&session, &session_path)),
                }
            }
        };
        match guide.answer(&answer) {
            // A wrong --machine would otherwise be asked again and take the
            // next line of an answers file, shifting every answer after it.
            Err(message) if from_option => {
                return Err(Error::Input {
                    option: "--machine".into(),
                    message,
                })
            }
            Ok(step) => {
                if !step.lines.is_empty() {
                    output::print(&step.lines.join("\n"))?;
                }
                if step.recorded {
                    session.answers.push(answer.trim().to_string());
                    session.save(&session_path).map_err(session_error)?;
                }
            }
            Err(message) => eprintln!("not accepted: {message}"),
        }
    }
    if let (Some(path), Some(d)) = (&arguments.report, guide.diagnosis()) {
        super::report_file::write_report(path, d, &base)?;
    }
    if let Some(initials) = guide.note_request() {
        save_note(&guide, initials, arguments.cases.as_deref())?;
    }
    let _ = std::fs::remove_file(&session_path);
    Ok(ExitStatus::Success)
}

fn session_error(e: crate::guide::SessionError) -> Error {
    Error::Input {
        option: "--session".into(),
        message: e.to_string(),
    }
}

/// Replay a saved session's answers.
fn resume(guide: &mut Guide<'_>, path: &Path) -> Result<GuideSession, Error> {
    let session = GuideSession::load(path).map_err(session_error)?;
    for (n, answer) in session.answers.iter().enumerate() {
        guide.answer(answer).map_err(|message| Error::Input {
            option: "--resume".into(),
            message: format!(
                "{}: answer {} (`{answer}`) is no longer accepted: {message}",
                path.display(),
                n + 1
            ),
        })?;
    }
    eprintln!(
        "resumed after {} answers from {}",
        session.answers.len(),
        path.display()
    );
    Ok(session)
}

fn ask(question: &Question, interactive: bool) {
    let mut err = std::io::stderr().lock();
    let _ = writeln!(err, "\n{}", question.text);
    let _ = if interactive {
        write!(err, "({}) > ", question.hint)
    } else {
        writeln!(err, "({})", question.hint)
    };
    let _ = err.flush();
}

/// A failure to read an answer, naming the answers file when there is one.
fn input_error(arguments: &GuideArguments, error: std::io::Error) -> Error {
    match &arguments.answers {
        Some(path) => Error::Input {
            option: "--answers".into(),
            message: format!("{}: cannot read: {error}", path.display()),
        },
        None => Error::Input {
            option: "standard input".into(),
            message: format!("cannot read: {error}"),
        },
    }
}

fn read_line(input: &mut dyn BufRead) -> std::io::Result<Option<String>> {
    let mut line = String::new();
    if input.read_line(&mut line)? == 0 {
        return Ok(None);
    }
    Ok(Some(line.trim_end_matches(['\r', '\n']).to_string()))
}

/// The end of input before a conclusion: say where the answers are.
fn stopped(session: &GuideSession, path: &Path) -> ExitStatus {
    eprintln!(
        "input ended before a conclusion: {} answers are saved in {}; continue with `spoolsleuth guide --resume --session {}`",
        session.answers.len(),
        path.display(),
        path.display()
    );
    ExitStatus::Failure
}

/// On Ctrl-C, say where the answers are (every accepted answer is already
/// saved) and leave.
fn watch_interrupt(path: &Path) {
    let path: PathBuf = path.to_path_buf();
    let _ = ctrlc::set_handler(move || {
        eprintln!(
            "\ninterrupted: the answers so far are saved in {}; continue with `spoolsleuth guide --resume --session {}`",
            path.display(),
            path.display()
        );
        std::process::exit(i32::from(ExitStatus::Failure.code()));
    });
}

/// Save the walk as a case note, or print it when there is no folder.
fn save_note(guide: &Guide<'_>, initials: &str, cases: Option<&Path>) -> Result<(), Error> {
    let Some(d) = guide.diagnosis() else {
        return Ok(());
    };
    let leading = d.leading();
    let draft = NoteDraft {
        cause: leading.map(|c| c.cause.clone()),
        date: None,
        downtime: None,
        fix: d.fix.as_ref().map(|f| f.text.clone()),
        machine: Some(
            d.machine
                .as_ref()
                .map_or("unknown-machine".to_string(), |m| m.id.clone()),
        ),
        parts: Vec::new(),
        readings: d
            .readings
            .iter()
            .map(|r| format!("{}: {}", r.name, r.shown))
            .collect(),
        symptoms: d.symptoms.iter().map(|s| s.id.clone()).collect(),
        technician: Some(initials.to_string()),
        text: leading.map(|c| {
            c.evidence
                .iter()
                .filter(|e| e.effect.is_some())
                .map(|e| format!("{}: {}", e.title, e.text))
                .collect::<Vec<_>>()
                .join("\n\n")
        }),
        title: d.complaint.clone(),
    };
    let note = draft.into_note(DraftOrigin::Options)?;
    match cases {
        Some(dir) => {
            let (id, path) = NotesFolder::Disk(dir.to_path_buf()).add(&note)?;
            output::print(&format!("Saved case note {id}: {}", path.display()))?;
        }
        None => {
            eprintln!("no cases folder (--cases DIR or SPOOLSLEUTH_CASES): the note is printed instead of saved");
            output::print(&note.to_markdown())?;
        }
    }
    Ok(())
}

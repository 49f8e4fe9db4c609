//! Writing a note in the user's `$EDITOR`: a template goes to a draft file,
//! the editor opens it, and the result is validated; on an error the user may
//! re-open the draft or give up, and the draft is kept so nothing is lost.

use std::fs;
use std::io::BufRead;
use std::path::Path;
use std::process::Command;

use super::{Note, NoteDraft, NoteId, NotesError, NotesResult};

/// Runs an editor on a draft note until it validates or the user gives up.
#[derive(Debug)]
pub struct NoteEditor {
    /// The editor command line, run through `sh -c` with the file as `$1`.
    editor: String,
}

impl NoteEditor {
    /// The editor from `$VISUAL`, then `$EDITOR`, then `vi`.
    pub fn from_env() -> Self {
        let editor = ["VISUAL", "EDITOR"]
            .iter()
            .find_map(|name| std::env::var(name).ok().filter(|v| !v.trim().is_empty()))
            .unwrap_or_else(|| "vi".to_string());
        NoteEditor { editor }
    }

    /// Let the user write the note. `answers` gives the reply to "edit
    /// again?" after each error (one line each; end of input means no).
    /// Returns `None` when the template came back unchanged.
    pub fn edit(&self, draft: &NoteDraft, answers: &mut dyn BufRead) -> NotesResult<Option<Note>> {
        let template = draft.template();
        let file = tempfile::Builder::new()
            .prefix("spoolsleuth-note-")
            .suffix(".md")
            .tempfile()
            .map_err(|e| NotesError::io(std::env::temp_dir(), e))?;
        let path = file.path().to_path_buf();
        fs::write(&path, &template).map_err(|e| NotesError::io(&path, e))?;
        loop {
            if let Err(error) = self.run(&path) {
                // Keep what the user typed so far.
                let _ = file.keep();
                return Err(error);
            }
            let text = fs::read_to_string(&path).map_err(|e| NotesError::io(&path, e))?;
            if text == template || text.trim().is_empty() {
                return Ok(None);
            }
            match Note::parse(&path, &text) {
                Ok(mut note) => {
                    note.id = NoteId::generate(note.date, &note.machine, &note.title);
                    return Ok(Some(note));
                }
                Err(error) => {
                    eprintln!("error: {error}");
                    eprint!("edit the note again? [Y/n] ");
                    if !wants_again(answers) {
                        let (_, kept) = file.keep().map_err(|e| NotesError::io(&path, e.error))?;
                        return Err(NotesError::EditAborted { draft: kept });
                    }
                }
            }
        }
    }

    fn run(&self, path: &Path) -> NotesResult<()> {
        let status = Command::new("sh")
            .arg("-c")
            .arg(format!("{} \"$1\"", self.editor))
            .arg("spoolsleuth-editor")
            .arg(path)
            .status()
            .map_err(|e| self.failure(e.to_string()))?;
        if status.success() {
            Ok(())
        } else {
            Err(self.failure(format!(
                "it exited with {status}; the draft is kept at {}",
                path.display()
            )))
        }
    }

    fn failure(&self, message: String) -> NotesError {
        NotesError::Editor {
            editor: self.editor.clone(),
            message,
        }
    }
}

fn wants_again(answers: &mut dyn BufRead) -> bool {
    let mut line = String::new();
    match answers.read_line(&mut line) {
        Ok(0) | Err(_) => false,
        Ok(_) => !matches!(
            line.trim().to_ascii_lowercase().as_str(),
            "n" | "no" | "q" | "quit"
        ),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn answers_decide_whether_to_edit_again() {
        assert!(wants_again(&mut "\n".as_bytes()));
        assert!(wants_again(&mut "y\n".as_bytes()));
        assert!(!wants_again(&mut "n\n".as_bytes()));
        assert!(!wants_again(&mut "".as_bytes()));
    }
}

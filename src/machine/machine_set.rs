//! The machines known to this run: the demo plant's profiles compiled into
//! the binary, plus a user's own from their cases folder.

use std::path::Path;

use super::{MachineError, MachineProfile};

/// The demo plant's machine profiles.
static DEMO_MACHINES: include_dir::Dir<'static> =
    include_dir::include_dir!("$CARGO_MANIFEST_DIR/cases/machines");

/// A loaded profile and the file it came from.
#[derive(Clone, Debug)]
pub struct LoadedMachine {
    /// The profile.
    pub profile: MachineProfile,
    /// Where it was read from.
    pub file: String,
}

/// Every machine profile available.
#[derive(Clone, Debug, Default)]
pub struct MachineSet {
    /// Profiles sorted by id.
    pub machines: Vec<LoadedMachine>,
}

impl MachineSet {
    /// The demo profiles plus the `*.yaml` files in `dir` (a user's
    /// `machines/` folder), if given. A user profile with a demo id replaces it.
    pub fn load(dir: Option<&Path>) -> Result<MachineSet, MachineError> {
        let mut set = MachineSet::default();
        for file in DEMO_MACHINES.files() {
            if file.path().extension().is_none_or(|e| e != "yaml") {
                continue;
            }
            let name = format!("cases/machines/{}", file.path().display());
            let text = file.contents_utf8().unwrap_or_default();
            set.add(parse(&name, text)?, name);
        }
        if let Some(dir) = dir.filter(|d| d.is_dir()) {
            let read = |source| MachineError::Read {
                path: dir.display().to_string(),
                source,
            };
            let mut paths: Vec<_> = std::fs::read_dir(dir)
                .map_err(read)?
                .filter_map(Result::ok)
                .map(|e| e.path())
                .filter(|p| p.extension().is_some_and(|e| e == "yaml" || e == "yml"))
                .collect();
            paths.sort();
            for path in paths {
                let name = path.display().to_string();
                let text =
                    crate::text_file::read_text(&path).map_err(|source| MachineError::Read {
                        path: name.clone(),
                        source,
                    })?;
                set.add(parse(&name, &text)?, name);
            }
        }
        set.machines.sort_by(|a, b| a.profile.id.cmp(&b.profile.id));
        Ok(set)
    }

    fn add(&mut self, profile: MachineProfile, file: String) {
        self.machines.retain(|m| m.profile.id != profile.id);
        self.machines.push(LoadedMachine { profile, file });
    }

    /// A machine by id, or an error naming the nearest id.
    pub fn get(&self, id: &str) -> Result<&LoadedMachine, MachineError> {
        self.machines
            .iter()
            .find(|m| m.profile.id == id)
            .ok_or_else(|| MachineError::Unknown {
                id: id.to_string(),
                suggestion: crate::suggest::suggest(
                    id,
                    self.machines.iter().map(|m| m.profile.id.as_str()),
                )
                .map(str::to_string),
            })
    }
}

/// Parse one profile, with YAML errors at their line and column.
pub fn parse(name: &str, text: &str) -> Result<MachineProfile, MachineError> {
    let profile: MachineProfile = serde_yaml::from_str(text).map_err(|e| {
        let at = match e.location() {
            Some(l) => format!("{name}:{}:{}", l.line(), l.column()),
            None => name.to_string(),
        };
        let message = e.to_string();
        let message = message.split(" at line ").next().unwrap_or(&message);
        let message = ["unknown field `", "unknown variant `"]
            .iter()
            .find_map(|marker| crate::suggest::suggest_in_message(message, marker))
            .unwrap_or_else(|| message.to_string());
        MachineError::Invalid { at, message }
    })?;
    if profile.version != 1 {
        return Err(MachineError::Invalid {
            at: name.to_string(),
            message: format!(
                "unsupported profile version {} (expected 1)",
                profile.version
            ),
        });
    }
    let valid_id = !profile.id.is_empty()
        && profile
            .id
            .chars()
            .all(|c| c.is_ascii_lowercase() || c.is_ascii_digit() || c == '-');
    if !valid_id {
        return Err(MachineError::Invalid {
            at: name.to_string(),
            message: format!(
                "machine id `{}` must be lowercase letters, digits and dashes",
                profile.id
            ),
        });
    }
    Ok(profile)
}

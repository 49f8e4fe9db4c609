//! One question of the guided walk.

/// A question to put to the technician.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Question {
    /// A stable id (`complaint`, `reading`, …) for scripts and tests.
    pub id: &'static str,
    /// The question in plain words.
    pub text: String,
    /// What a good answer looks like.
    pub hint: String,
}

impl Question {
    /// A question with its id, text and hint.
    pub fn new(id: &'static str, text: &str, hint: &str) -> Self {
        Question {
            id,
            text: text.to_string(),
            hint: hint.to_string(),
        }
    }
}

//! What a sync of the index with the notes folder did.

/// Counts of what changed, and the notes that could not be indexed.
#[derive(Clone, Debug, Default, PartialEq, Eq)]
pub struct SyncReport {
    /// Notes added to the index.
    pub added: usize,
    /// Notes skipped because they are malformed: `path:line:col: message`.
    pub broken: Vec<String>,
    /// Why the index was rebuilt from scratch, if it was.
    pub rebuilt: Option<String>,
    /// Notes removed from the index (their files are gone).
    pub removed: usize,
    /// Notes re-indexed after an edit.
    pub updated: usize,
}

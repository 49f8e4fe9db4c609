//! What a watcher has seen: a sequence number per changed note name, the
//! point before which it no longer knows, and the notes that are checked on
//! every search because their changes may not be seen.

use std::collections::{BTreeSet, HashMap};

use super::{WatchAnswer, WatchCursor};

/// More changed names than this are not kept: the log forgets them and
/// answers older cursors with "look at every note", which costs no more.
pub const MAX_TRACKED_NAMES: usize = 200_000;
/// An answer listing more names than this becomes "look at every note":
/// reading that many notes costs about what checking all of them does.
pub const MAX_LISTED_NAMES: usize = 20_000;

/// The change log of one watcher run.
#[derive(Clone, Debug)]
pub struct ChangeLog {
    /// Names whose changes may not be seen in the folder (links, files with
    /// several names): reported on every answer.
    always: BTreeSet<String>,
    /// Name → number of its last change.
    changed: HashMap<String, u64>,
    /// This run of the watcher; cursors of other runs know nothing of it.
    epoch: u64,
    /// Cursors older than this cannot be answered from the log.
    floor: u64,
    /// Number of the last change recorded.
    seq: u64,
}

impl ChangeLog {
    /// An empty log for the watcher run `epoch`.
    pub fn new(epoch: u64) -> Self {
        ChangeLog {
            always: BTreeSet::new(),
            changed: HashMap::new(),
            epoch,
            floor: 0,
            seq: 0,
        }
    }

    /// The cursor of everything recorded so far.
    pub fn cursor(&self) -> WatchCursor {
        WatchCursor {
            epoch: self.epoch,
            seq: self.seq,
        }
    }

    /// Note `name` was changed, created or removed.
    pub fn record(&mut self, name: &str) {
        self.seq += 1;
        if self.changed.len() >= MAX_TRACKED_NAMES && !self.changed.contains_key(name) {
            self.forget();
            return;
        }
        self.changed.insert(name.to_string(), self.seq);
    }

    /// Events were lost (the kernel's queue overflowed): no cursor from
    /// before now can be answered from the log.
    pub fn forget(&mut self) {
        self.seq += 1;
        self.floor = self.seq;
        self.changed.clear();
    }

    /// Check `name` on every answer (`true`) or only when it changes.
    pub fn check_always(&mut self, name: &str, always: bool) {
        if always {
            self.always.insert(name.to_string());
        } else {
            self.always.remove(name);
        }
    }

    /// The answer to a search whose index is current up to `cursor`.
    pub fn answer(&self, cursor: Option<WatchCursor>) -> WatchAnswer {
        let known =
            cursor.filter(|c| c.epoch == self.epoch && (self.floor..=self.seq).contains(&c.seq));
        let Some(known) = known else {
            return WatchAnswer::Rescan;
        };
        let mut changed: Vec<String> = self
            .changed
            .iter()
            .filter(|(_, seq)| **seq > known.seq)
            .map(|(name, _)| name.clone())
            .collect();
        if changed.len() + self.always.len() > MAX_LISTED_NAMES {
            return WatchAnswer::Rescan;
        }
        changed.sort();
        WatchAnswer::Names {
            changed,
            linked: self.always.iter().cloned().collect(),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn names(answer: WatchAnswer) -> (Vec<String>, Vec<String>) {
        match answer {
            WatchAnswer::Names { changed, linked } => (changed, linked),
            WatchAnswer::Rescan => panic!("expected names, got a rescan"),
        }
    }

    #[test]
    fn a_cursor_of_this_run_gets_the_names_changed_after_it() {
        let mut log = ChangeLog::new(7);
        log.record("a.md");
        let after_a = log.cursor();
        log.record("b.md");
        log.record("a.md");
        log.record("c.md");
        assert_eq!(names(log.answer(Some(after_a))).0, ["a.md", "b.md", "c.md"]);
        let now = log.cursor();
        assert_eq!(names(log.answer(Some(now))).0, Vec::<String>::new());
        log.record("b.md");
        assert_eq!(names(log.answer(Some(now))).0, ["b.md"]);
    }

    #[test]
    fn an_unknown_cursor_means_looking_at_every_note() {
        let mut log = ChangeLog::new(7);
        log.record("a.md");
        assert_eq!(log.answer(None), WatchAnswer::Rescan);
        let other_run = WatchCursor { epoch: 8, seq: 1 };
        assert_eq!(log.answer(Some(other_run)), WatchAnswer::Rescan);
        let from_the_future = WatchCursor { epoch: 7, seq: 9 };
        assert_eq!(log.answer(Some(from_the_future)), WatchAnswer::Rescan);
    }

    #[test]
    fn lost_events_invalidate_older_cursors_only() {
        let mut log = ChangeLog::new(1);
        log.record("a.md");
        let before = log.cursor();
        log.forget();
        let after = log.cursor();
        assert_eq!(log.answer(Some(before)), WatchAnswer::Rescan);
        log.record("b.md");
        assert_eq!(names(log.answer(Some(after))).0, ["b.md"]);
    }

    #[test]
    fn linked_notes_are_listed_every_time_until_they_are_plain_again() {
        let mut log = ChangeLog::new(1);
        log.check_always("link.md", true);
        let now = log.cursor();
        assert_eq!(
            names(log.answer(Some(now))),
            (vec![], vec!["link.md".to_string()])
        );
        log.check_always("link.md", false);
        assert_eq!(names(log.answer(Some(now))), (vec![], vec![]));
    }

    #[test]
    fn too_many_changes_become_a_rescan() {
        let mut log = ChangeLog::new(1);
        let start = log.cursor();
        for n in 0..=MAX_LISTED_NAMES {
            log.record(&format!("{n}.md"));
        }
        assert_eq!(log.answer(Some(start)), WatchAnswer::Rescan);
        let now = log.cursor();
        assert_eq!(names(log.answer(Some(now))).0.len(), 0);
    }
}

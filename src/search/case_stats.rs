//! Statistics over the whole history: causes by machine and by symptom,
//! total downtime, and repeat offenders (the same cause on the same machine
//! more than once).

use std::collections::BTreeMap;

use serde::Serialize;
use tantivy::collector::DocSetCollector;
use tantivy::query::AllQuery;

use super::{with_recovery, SearchResult, StoredNote};
use crate::index::NoteIndex;

/// A cause and how many cases it explains.
#[derive(Clone, Debug, PartialEq, Eq, Serialize)]
pub struct CauseCount {
    /// Cause id.
    pub cause: String,
    /// Number of cases.
    pub count: usize,
}

impl CauseCount {
    /// Counts most frequent first, ties by id.
    pub fn ranked(counts: BTreeMap<String, usize>) -> Vec<CauseCount> {
        let mut ranked: Vec<CauseCount> = counts
            .into_iter()
            .map(|(cause, count)| CauseCount { cause, count })
            .collect();
        ranked.sort_by(|a, b| b.count.cmp(&a.count).then_with(|| a.cause.cmp(&b.cause)));
        ranked
    }
}

/// One machine's cases.
#[derive(Clone, Debug, PartialEq, Eq, Serialize)]
pub struct MachineStats {
    /// Causes, most frequent first.
    pub causes: Vec<CauseCount>,
    /// Total recorded downtime in minutes.
    pub downtime_minutes: u64,
    /// Machine id.
    pub machine: String,
    /// Number of cases.
    pub notes: usize,
}

/// One symptom's cases.
#[derive(Clone, Debug, PartialEq, Eq, Serialize)]
pub struct SymptomStats {
    /// Causes, most frequent first.
    pub causes: Vec<CauseCount>,
    /// Number of cases with this symptom.
    pub notes: usize,
    /// Symptom id.
    pub symptom: String,
}

/// The same cause on the same machine more than once.
#[derive(Clone, Debug, PartialEq, Eq, Serialize)]
pub struct RepeatOffender {
    /// Cause id.
    pub cause: String,
    /// How many times.
    pub count: usize,
    /// Total downtime of those cases, minutes.
    pub downtime_minutes: u64,
    /// Date of the first case.
    pub first: String,
    /// Ids of the cases, oldest first.
    pub ids: Vec<String>,
    /// Date of the latest case.
    pub last: String,
    /// Machine id.
    pub machine: String,
}

/// Statistics over all notes (`cases stats`; JSON shape in cases/README.md).
#[derive(Clone, Debug, PartialEq, Eq, Serialize)]
pub struct CaseStats {
    /// Per machine, sorted by id.
    pub machines: Vec<MachineStats>,
    /// Number of notes.
    pub notes: usize,
    /// Repeat offenders, most repeated first.
    pub repeat_offenders: Vec<RepeatOffender>,
    /// Shape version of this JSON.
    pub schema_version: u32,
    /// Per symptom, sorted by id.
    pub symptoms: Vec<SymptomStats>,
    /// Total recorded downtime, minutes.
    pub total_downtime_minutes: u64,
}

impl CaseStats {
    /// Compute the statistics from the index.
    pub fn compute(index: &mut NoteIndex) -> SearchResult<CaseStats> {
        with_recovery(index, |index| {
            let searcher = index.searcher();
            let mut notes = Vec::new();
            for address in searcher.search(&AllQuery, &DocSetCollector)? {
                notes.push(StoredNote::load(&searcher, index.schema(), address)?.0);
            }
            Ok(Self::from_notes(notes))
        })
    }

    /// The statistics of these notes.
    pub fn from_notes(mut notes: Vec<StoredNote>) -> CaseStats {
        notes.sort_by(|a, b| (a.date, &a.id).cmp(&(b.date, &b.id)));
        let minutes = |note: &StoredNote| note.downtime.map_or(0, |d| d.minutes());
        let mut machines: BTreeMap<&str, (usize, u64, BTreeMap<String, usize>)> = BTreeMap::new();
        let mut symptoms: BTreeMap<&str, (usize, BTreeMap<String, usize>)> = BTreeMap::new();
        let mut pairs: BTreeMap<(&str, &str), Vec<&StoredNote>> = BTreeMap::new();
        for note in &notes {
            let machine = machines.entry(&note.machine).or_default();
            machine.0 += 1;
            machine.1 += minutes(note);
            *machine.2.entry(note.cause.clone()).or_default() += 1;
            for symptom in &note.symptoms {
                let entry = symptoms.entry(symptom).or_default();
                entry.0 += 1;
                *entry.1.entry(note.cause.clone()).or_default() += 1;
            }
            pairs
                .entry((&note.machine, &note.cause))
                .or_default()
                .push(note);
        }
        let mut repeat_offenders: Vec<RepeatOffender> = pairs
            .into_iter()
            .filter(|(_, cases)| cases.len() > 1)
            .map(|((machine, cause), cases)| RepeatOffender {
                cause: cause.to_string(),
                count: cases.len(),
                downtime_minutes: cases.iter().map(|n| minutes(n)).sum(),
                first: cases[0].date_text(),
                ids: cases.iter().map(|n| n.id.clone()).collect(),
                last: cases[cases.len() - 1].date_text(),
                machine: machine.to_string(),
            })
            .collect();
        repeat_offenders.sort_by(|a, b| {
            b.count
                .cmp(&a.count)
                .then_with(|| (&a.machine, &a.cause).cmp(&(&b.machine, &b.cause)))
        });
        CaseStats {
            machines: machines
                .into_iter()
                .map(|(machine, (count, downtime, causes))| MachineStats {
                    causes: CauseCount::ranked(causes),
                    downtime_minutes: downtime,
                    machine: machine.to_string(),
                    notes: count,
                })
                .collect(),
            notes: notes.len(),
            repeat_offenders,
            schema_version: 1,
            symptoms: symptoms
                .into_iter()
                .map(|(symptom, (count, causes))| SymptomStats {
                    causes: CauseCount::ranked(causes),
                    notes: count,
                    symptom: symptom.to_string(),
                })
                .collect(),
            total_downtime_minutes: notes.iter().map(minutes).sum(),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::notes::Downtime;

    fn note(id: &str, date: &str, machine: &str, cause: &str, minutes: u64) -> StoredNote {
        StoredNote {
            cause: cause.into(),
            date: date.parse().ok(),
            downtime: Some(Downtime::from_minutes(minutes)),
            id: id.into(),
            machine: machine.into(),
            symptoms: vec!["hunting".into()],
            title: String::new(),
        }
    }

    #[test]
    fn finds_repeat_offenders_and_totals() {
        let stats = CaseStats::from_notes(vec![
            note("c", "2024-01-01", "press-4", "air-in-oil", 60),
            note("a", "2020-01-01", "press-4", "air-in-oil", 30),
            note("b", "2021-01-01", "sorter-9", "air-in-oil", 10),
        ]);
        assert_eq!(stats.total_downtime_minutes, 100);
        assert_eq!(stats.repeat_offenders.len(), 1);
        let offender = &stats.repeat_offenders[0];
        assert_eq!(
            (
                offender.count,
                offender.first.as_str(),
                offender.last.as_str()
            ),
            (2, "2020-01-01", "2024-01-01")
        );
        assert_eq!(offender.ids, ["a", "c"]);
        assert_eq!(
            stats.symptoms[0].causes[0],
            CauseCount {
                cause: "air-in-oil".into(),
                count: 3
            }
        );
        assert_eq!(stats.machines[0].downtime_minutes, 90);
    }
}

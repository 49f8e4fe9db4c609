//! A machine's recent history for the diagnosis: over its last N cases, how
//! often each cause was found for each symptom.

use serde::Serialize;
use tantivy::collector::TopDocs;
use tantivy::query::TermQuery;
use tantivy::schema::IndexRecordOption;
use tantivy::{Order, Term};

use super::{with_recovery, CauseCount, SearchResult, StoredNote};
use crate::index::NoteIndex;

/// Causes per symptom over a machine's last cases.
#[derive(Clone, Debug, PartialEq, Eq, Serialize)]
pub struct MachineHistory {
    /// Per symptom (sorted by id), its causes (most frequent first).
    pub by_symptom: Vec<SymptomHistory>,
    /// How many cases were looked at (at most the N asked for).
    pub cases: usize,
    /// The machine id.
    pub machine: String,
}

/// The causes found for one symptom.
#[derive(Clone, Debug, PartialEq, Eq, Serialize)]
pub struct SymptomHistory {
    /// Causes with counts, most frequent first, then by id.
    pub causes: Vec<CauseCount>,
    /// The symptom id.
    pub symptom: String,
}

/// The history of `machine` over its `last` most recent cases.
pub fn machine_history(
    index: &mut NoteIndex,
    machine: &str,
    last: usize,
) -> SearchResult<MachineHistory> {
    with_recovery(index, |index| {
        let searcher = index.searcher();
        let schema = index.schema();
        let query = TermQuery::new(
            Term::from_field_text(schema.machine, machine),
            IndexRecordOption::Basic,
        );
        let newest = searcher.search(
            &query,
            &TopDocs::with_limit(last.max(1)).order_by_fast_field::<u64>("date", Order::Desc),
        )?;
        let mut counts: std::collections::BTreeMap<
            String,
            std::collections::BTreeMap<String, usize>,
        > = Default::default();
        for (_, address) in &newest {
            let (note, _) = StoredNote::load(&searcher, schema, *address)?;
            for symptom in note.symptoms {
                *counts
                    .entry(symptom)
                    .or_default()
                    .entry(note.cause.clone())
                    .or_default() += 1;
            }
        }
        Ok(MachineHistory {
            by_symptom: counts
                .into_iter()
                .map(|(symptom, causes)| SymptomHistory {
                    causes: CauseCount::ranked(causes),
                    symptom,
                })
                .collect(),
            cases: newest.len(),
            machine: machine.to_string(),
        })
    })
}

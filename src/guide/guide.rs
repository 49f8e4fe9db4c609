//! The guided walk as a pure state machine: it asks one question at a time,
//! takes one answer at a time, and says what to show. It does no I/O, so a
//! terminal session, a piped session and a test drive it the same way.

use crate::diagnosis::{CauseStatus, Diagnosis, DiagnosisInput, NextMeasurement};
use crate::machine::{Actuator, MachineProfile, MachineSet};
use crate::rules::{Circuit, Placement, Readings, RuleBase};
use crate::units::UnitSystem;

use super::Question;

/// Where the walk stands.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
enum Stage {
    Complaint,
    ConfirmSymptoms,
    PickSymptoms,
    Machine,
    Circuit,
    Placement,
    Actuator,
    Caution,
    Reading,
    SaveNote,
    Initials,
    Done,
}

/// What an accepted answer led to.
#[derive(Clone, Debug, Default, PartialEq, Eq)]
pub struct Step {
    /// Lines to show, in order.
    pub lines: Vec<String>,
    /// Whether the answer is part of the session (false for `why`).
    pub recorded: bool,
}

impl Step {
    fn recorded(lines: Vec<String>) -> Self {
        Step {
            lines,
            recorded: true,
        }
    }

    fn aside(lines: Vec<String>) -> Self {
        Step {
            lines,
            recorded: false,
        }
    }
}

/// The guided walk.
pub struct Guide<'a> {
    base: &'a RuleBase,
    machines: &'a MachineSet,
    stage: Stage,
    complaint: String,
    symptoms: Vec<String>,
    machine: Option<MachineProfile>,
    circuit: Option<Circuit>,
    placement: Option<Placement>,
    actuator: Option<Actuator>,
    readings: Vec<(String, String)>,
    skip: Vec<String>,
    pending: Option<NextMeasurement>,
    diagnosis: Option<Diagnosis>,
    units: Option<UnitSystem>,
    initials: Option<String>,
    save_note: bool,
}

/// Words that stop the readings and conclude on what is known.
const STOP: &[&str] = &["stop", "done", "conclude"];

impl<'a> Guide<'a> {
    /// A new walk over this rule base and these machines. `units` forces a
    /// unit system; otherwise the machine's own is used (metric without one).
    pub fn new(base: &'a RuleBase, machines: &'a MachineSet, units: Option<UnitSystem>) -> Self {
        Guide {
            base,
            machines,
            stage: Stage::Complaint,
            complaint: String::new(),
            symptoms: Vec::new(),
            machine: None,
            circuit: None,
            placement: None,
            actuator: None,
            readings: Vec::new(),
            skip: Vec::new(),
            pending: None,
            diagnosis: None,
            units,
            initials: None,
            save_note: false,
        }
    }

    /// True once the walk has concluded and the note question is answered.
    pub fn is_done(&self) -> bool {
        self.stage == Stage::Done
    }

    /// The latest diagnosis, once there is one.
    pub fn diagnosis(&self) -> Option<&Diagnosis> {
        self.diagnosis.as_ref()
    }

    /// The technician's initials when a case note should be saved.
    pub fn note_request(&self) -> Option<&str> {
        self.save_note.then_some(self.initials.as_deref()).flatten()
    }

    /// The question to ask now (`None` when done).
    pub fn question(&self) -> Option<Question> {
        let q = match self.stage {
            Stage::Complaint => Question::new(
                "complaint",
                "What is the machine doing wrong? Describe it in your own words.",
                "for example: slows right down when it takes the load",
            ),
            Stage::ConfirmSymptoms => Question::new(
                "symptoms",
                &format!("I read that as: {}. Is that right?", self.symptom_labels()),
                "y to go on, n to pick the symptoms from a list",
            ),
            Stage::PickSymptoms => Question::new(
                "pick-symptoms",
                &format!("Which of these fit? Give the numbers, e.g. 1,3.\n{}", self.symptom_menu()),
                "one or more numbers separated by commas",
            ),
            Stage::Machine => Question::new(
                "machine",
                &format!(
                    "Which machine is it? Give its id, or `none` to describe the circuit instead.\n{}",
                    self.machine_menu()
                ),
                "a machine id such as press-4, or none",
            ),
            Stage::Circuit => Question::new(
                "circuit",
                "What controls the flow? 1 restrictive (2-way) compensated valve, 2 bypass (3-way) compensated valve, 3 plain needle valve, 4 load-sensing pump",
                "a number from 1 to 4",
            ),
            Stage::Placement => Question::new(
                "placement",
                "Where does the valve sit? 1 meter-in (in the line to the actuator), 2 meter-out (in the line from it), 3 bleed-off (in a branch to tank)",
                "a number from 1 to 3",
            ),
            Stage::Actuator => Question::new(
                "actuator",
                "What does it drive? 1 a cylinder, 2 a hydraulic motor",
                "1 or 2",
            ),
            Stage::Caution => {
                let next = self.pending.as_ref()?;
                Question::new(
                    "caution",
                    &self.caution_text(next),
                    "ok once you have read the cautions; why for the reason of this step; skip if you cannot take this reading; stop to conclude now",
                )
            }
            Stage::Reading => {
                let next = self.pending.as_ref()?;
                let kind = self
                    .base
                    .quantity_for_reading(&next.reading)
                    .map(|q| q.kind.example_units())
                    .unwrap_or("");
                Question::new(
                    "reading",
                    &format!("Reading of {} ({}):", next.label.to_lowercase(), next.reading),
                    &format!("a number with its unit ({kind}); skip if you cannot take it; stop to conclude"),
                )
            }
            Stage::SaveNote => Question::new(
                "save-note",
                "Save this call as a case note so the next person finds it?",
                "y or n",
            ),
            Stage::Initials => Question::new("initials", "Your initials for the note:", "two or three letters"),
            Stage::Done => return None,
        };
        Some(q)
    }

    /// Take an answer. `Err` explains why it was not accepted (ask again).
    pub fn answer(&mut self, text: &str) -> Result<Step, String> {
        let text = text.trim();
        if text.eq_ignore_ascii_case("why") {
            return Ok(Step::aside(vec![self.why()]));
        }
        match self.stage {
            Stage::Complaint => self.take_complaint(text),
            Stage::ConfirmSymptoms => match yes_no(text)? {
                true => Ok(Step::recorded(self.after_symptoms())),
                false => {
                    self.stage = Stage::PickSymptoms;
                    Ok(Step::recorded(Vec::new()))
                }
            },
            Stage::PickSymptoms => self.take_symptom_numbers(text),
            Stage::Machine => self.take_machine(text),
            Stage::Circuit => {
                self.circuit = Some(pick(text, &CIRCUIT_MENU)?);
                self.stage = Stage::Placement;
                Ok(Step::recorded(Vec::new()))
            }
            Stage::Placement => {
                self.placement = Some(pick(text, &PLACEMENT_MENU)?);
                self.stage = Stage::Actuator;
                Ok(Step::recorded(Vec::new()))
            }
            Stage::Actuator => {
                self.actuator = Some(pick(text, &[Actuator::Cylinder, Actuator::Motor])?);
                Ok(Step::recorded(self.rediagnose()))
            }
            Stage::Caution => self.take_caution(text),
            Stage::Reading => self.take_reading(text),
            Stage::SaveNote => {
                self.save_note = yes_no(text)?;
                self.stage = if self.save_note {
                    Stage::Initials
                } else {
                    Stage::Done
                };
                Ok(Step::recorded(Vec::new()))
            }
            Stage::Initials => {
                let ok =
                    (1..=4).contains(&text.len()) && text.chars().all(|c| c.is_ascii_alphabetic());
                if !ok {
                    return Err("initials are one to four letters, e.g. JT".into());
                }
                self.initials = Some(text.to_ascii_uppercase());
                self.stage = Stage::Done;
                Ok(Step::recorded(Vec::new()))
            }
            Stage::Done => Err("the walk is finished".into()),
        }
    }

    fn take_complaint(&mut self, text: &str) -> Result<Step, String> {
        if text.is_empty() {
            return Err("tell me what you see or hear, in any words".into());
        }
        self.complaint = text.to_string();
        self.symptoms = self
            .base
            .recognise(text)
            .iter()
            .map(|s| s.entry.id.clone())
            .collect();
        self.stage = if self.symptoms.is_empty() {
            Stage::PickSymptoms
        } else {
            Stage::ConfirmSymptoms
        };
        let line = if self.symptoms.is_empty() {
            "I could not match that to a symptom I know; pick from the list.".to_string()
        } else {
            format!("Recognised: {}", self.symptom_labels())
        };
        Ok(Step::recorded(vec![line]))
    }

    fn take_symptom_numbers(&mut self, text: &str) -> Result<Step, String> {
        let mut picked = Vec::new();
        for part in text.split([',', ' ']).filter(|p| !p.is_empty()) {
            let n: usize = part
                .parse()
                .map_err(|_| format!("`{part}` is not a number from the list"))?;
            let s = self.base.symptoms.get(n.wrapping_sub(1)).ok_or_else(|| {
                format!("{n} is not on the list (1 to {})", self.base.symptoms.len())
            })?;
            if !picked.contains(&s.entry.id) {
                picked.push(s.entry.id.clone());
            }
        }
        if picked.is_empty() {
            return Err("pick at least one number".into());
        }
        self.symptoms = picked;
        Ok(Step::recorded(self.after_symptoms()))
    }

    fn after_symptoms(&mut self) -> Vec<String> {
        self.stage = Stage::Machine;
        Vec::new()
    }

    fn take_machine(&mut self, text: &str) -> Result<Step, String> {
        if text.eq_ignore_ascii_case("none") {
            self.stage = Stage::Circuit;
            return Ok(Step::recorded(Vec::new()));
        }
        let machine = self
            .machines
            .get(text)
            .map_err(|e| e.to_string())?
            .profile
            .clone();
        self.circuit = Some(machine.circuit);
        self.placement = Some(machine.placement);
        self.actuator = Some(machine.actuator);
        let line = format!(
            "{}: {} {} {}, {}",
            machine.id,
            machine.circuit.name(),
            machine.placement.name(),
            machine.actuator.name(),
            machine.name
        );
        self.machine = Some(machine);
        let mut lines = vec![line];
        lines.extend(self.rediagnose());
        Ok(Step::recorded(lines))
    }

    fn take_caution(&mut self, text: &str) -> Result<Step, String> {
        let word = text.to_ascii_lowercase();
        if STOP.contains(&word.as_str()) {
            return Ok(Step::recorded(self.conclude()));
        }
        match word.as_str() {
            "ok" | "y" | "yes" | "read" => {
                self.stage = Stage::Reading;
                Ok(Step::recorded(Vec::new()))
            }
            "skip" => Ok(Step::recorded(self.skip_pending())),
            _ => Err("type ok once you have read the cautions (or why, skip, stop)".into()),
        }
    }

    fn take_reading(&mut self, text: &str) -> Result<Step, String> {
        let word = text.to_ascii_lowercase();
        if STOP.contains(&word.as_str()) {
            return Ok(Step::recorded(self.conclude()));
        }
        if word == "skip" {
            return Ok(Step::recorded(self.skip_pending()));
        }
        let Some(next) = self.pending.clone() else {
            return Err("no reading is asked for".into());
        };
        let mut check = Readings::new();
        check
            .insert_text(self.base, &next.reading, text)
            .map_err(|e| format!("{} — try again, e.g. `140 bar` or `2030 psi`", e.message))?;
        self.readings.push((next.reading.clone(), text.to_string()));
        Ok(Step::recorded(self.rediagnose()))
    }

    fn skip_pending(&mut self) -> Vec<String> {
        if let Some(next) = self.pending.take() {
            self.skip.push(next.reading.clone());
        }
        self.rediagnose()
    }

    fn input(&self) -> Option<DiagnosisInput> {
        let units = self
            .units
            .or(self.machine.as_ref().map(|m| m.units))
            .unwrap_or_default();
        Some(DiagnosisInput {
            actuator: self.actuator,
            circuit: self.circuit?,
            complaint: Some(self.complaint.clone()),
            history: Vec::new(),
            machine: self.machine.clone(),
            placement: self.placement?,
            readings: self.readings.clone(),
            skip: self.skip.clone(),
            symptoms: self.symptoms.clone(),
            units,
        })
    }

    /// Run the diagnosis on what is known, say what changed, and move on to
    /// the next measurement or the conclusion.
    fn rediagnose(&mut self) -> Vec<String> {
        let Some(input) = self.input() else {
            return Vec::new();
        };
        let diagnosis = match Diagnosis::run(self.base, &input) {
            Ok(d) => d,
            Err(e) => return vec![format!("cannot diagnose yet: {e}")],
        };
        let mut lines = changes(self.diagnosis.as_ref(), &diagnosis);
        if self.diagnosis.is_none() || !lines.is_empty() {
            lines.extend(standings(&diagnosis));
        } else {
            lines.push("No cause changed standing on that reading.".into());
        }
        for p in &diagnosis.consistency {
            lines.push(format!("Check the gauges first: {}", p.message));
        }
        let confirmed = diagnosis
            .causes
            .first()
            .is_some_and(|c| c.status == CauseStatus::Confirmed);
        self.pending = diagnosis.next_measurement.clone();
        self.diagnosis = Some(diagnosis);
        if confirmed || self.pending.is_none() {
            lines.extend(self.conclude());
        } else {
            self.stage = Stage::Caution;
        }
        lines
    }

    fn conclude(&mut self) -> Vec<String> {
        self.stage = Stage::SaveNote;
        self.pending = None;
        let Some(d) = &self.diagnosis else {
            return vec!["Not enough is known to conclude.".into()];
        };
        conclusion(d)
    }

    fn why(&self) -> String {
        match (&self.stage, &self.pending) {
            (Stage::Caution | Stage::Reading, Some(next)) => format!("Why this step: {}", next.why),
            (Stage::Complaint, _) => "Why: your words tell me which symptoms to test first.".into(),
            (Stage::Machine, _) => {
                "Why: the machine's nameplate (bore, displacement, settings) goes into every check."
                    .into()
            }
            _ => "Why: each answer narrows down which causes the numbers can still support.".into(),
        }
    }

    fn symptom_labels(&self) -> String {
        self.symptoms
            .iter()
            .map(|id| {
                self.base
                    .symptom_by_id(id)
                    .map_or(id.clone(), |s| s.entry.label.to_lowercase())
            })
            .collect::<Vec<_>>()
            .join("; ")
    }

    fn symptom_menu(&self) -> String {
        self.base
            .symptoms
            .iter()
            .enumerate()
            .map(|(i, s)| format!("  {} {}", i + 1, s.entry.label))
            .collect::<Vec<_>>()
            .join("\n")
    }

    fn machine_menu(&self) -> String {
        self.machines
            .machines
            .iter()
            .map(|m| format!("  {} — {}", m.profile.id, m.profile.name))
            .collect::<Vec<_>>()
            .join("\n")
    }

    fn caution_text(&self, next: &NextMeasurement) -> String {
        let mut text = format!("Next: measure {}", next.label.to_lowercase());
        if let Some(point) = &next.point {
            text.push_str(&format!(" ({point})"));
        }
        text.push_str(&format!(".\nHow: {}", next.how));
        if let Some(i) = &next.instrument {
            text.push_str(&format!("\nInstrument: {i}"));
        }
        for id in &next.cautions {
            if let Some(c) = self.base.cautions.get(id) {
                text.push_str(&format!("\nCAUTION — {}: {}", c.entry.title, c.entry.text));
            }
        }
        text
    }
}

/// Lines saying which causes changed standing.
fn changes(before: Option<&Diagnosis>, after: &Diagnosis) -> Vec<String> {
    let Some(before) = before else {
        return Vec::new();
    };
    after
        .causes
        .iter()
        .filter_map(|c| {
            let old = before.causes.iter().find(|b| b.cause == c.cause)?;
            (old.status != c.status).then(|| {
                format!(
                    "Changed: {} — {} → {}",
                    c.label,
                    old.status.words(),
                    c.status.words()
                )
            })
        })
        .collect()
}

/// The top of the ranking in one line each.
fn standings(d: &Diagnosis) -> Vec<String> {
    let mut lines = vec!["Where the causes stand:".to_string()];
    lines.extend(
        d.causes
            .iter()
            .filter(|c| c.status != CauseStatus::RuledOut)
            .take(4)
            .map(|c| {
                format!(
                    "  {} — {} ({:.0} %)",
                    c.label,
                    c.status.words(),
                    c.score * 100.0
                )
            }),
    );
    lines
}

/// The conclusion: the leading cause with its numbers, the fix, the cautions.
fn conclusion(d: &Diagnosis) -> Vec<String> {
    let mut lines = Vec::new();
    match d.leading() {
        Some(c) => {
            lines.push(format!("Conclusion: {} — {}.", c.label, c.status.words()));
            for e in c.evidence.iter().filter(|e| e.effect.is_some()) {
                lines.push(format!("  {}: {}", e.title, e.text));
            }
        }
        None => lines.push("Conclusion: no cause stands out on these readings.".into()),
    }
    if let Some(fix) = &d.fix {
        lines.push(format!("Fix ({}): {}", fix.label, fix.text));
    }
    for c in &d.cautions {
        lines.push(format!("CAUTION — {}: {}", c.title, c.text));
    }
    lines.push(d.closing.clone());
    lines
}

fn yes_no(text: &str) -> Result<bool, String> {
    match text.to_ascii_lowercase().as_str() {
        "y" | "yes" => Ok(true),
        "n" | "no" => Ok(false),
        _ => Err("answer y or n".into()),
    }
}

/// A choice by its number in the menu or by its name.
fn pick<T: Copy + Named>(text: &str, options: &[T]) -> Result<T, String> {
    if let Ok(n) = text.parse::<usize>() {
        return options
            .get(n.wrapping_sub(1))
            .copied()
            .ok_or_else(|| format!("{n} is not on the list (1 to {})", options.len()));
    }
    options
        .iter()
        .copied()
        .find(|o| o.menu_name().eq_ignore_ascii_case(text))
        .ok_or_else(|| format!("`{text}` is not one of the choices; give its number"))
}

/// Something picked from a menu by name.
trait Named {
    fn menu_name(self) -> &'static str;
}

impl Named for Circuit {
    fn menu_name(self) -> &'static str {
        self.name()
    }
}

impl Named for Placement {
    fn menu_name(self) -> &'static str {
        self.name()
    }
}

impl Named for Actuator {
    fn menu_name(self) -> &'static str {
        self.name()
    }
}

/// The circuit types in the order the guide lists them.
const CIRCUIT_MENU: [Circuit; 4] = [
    Circuit::Restrictive,
    Circuit::Bypass,
    Circuit::Needle,
    Circuit::LoadSensing,
];

/// The placements in the order the guide lists them.
const PLACEMENT_MENU: [Placement; 3] =
    [Placement::MeterIn, Placement::MeterOut, Placement::BleedOff];

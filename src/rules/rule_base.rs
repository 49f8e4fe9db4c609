//! The loaded, checked rule base: every file read, every formula compiled
//! and dimension-checked, every reference resolved.

use std::collections::{BTreeMap, BTreeSet};
use std::io::Read;
use std::path::{Path, PathBuf};
use std::sync::OnceLock;

use regex::{Regex, RegexBuilder};

use super::formulas::{self, Check, Evidence, TypeEnv};
use super::rule_file::{
    Actuator, CauseEntry, CautionEntry, Circuit, DerivedEntry, Placement, PointEntry,
    QuantityEntry, QuantitySource, RuleEntry, RuleFile, SettingEntry, SymptomEntry,
};
use super::source_map::{Position, SourceMap};
use super::RulesError;
use crate::units::{self, Kind, Quantity};

/// The default rule base, compiled into the binary.
static DEFAULT_RULES: include_dir::Dir<'static> =
    include_dir::include_dir!("$CARGO_MANIFEST_DIR/rules");

/// Where an entry came from, and what it replaced.
#[derive(Clone, Debug, Default)]
pub struct Origin {
    /// The file, e.g. `rules/sag.yaml`.
    pub file: String,
    /// The line of its `id:`.
    pub line: usize,
    /// The column of its `id:` value.
    pub column: usize,
    /// The file of the default entry this one replaces, if any.
    pub replaces: Option<String>,
}

impl Origin {
    /// Where its `id:` value starts (`None` when it was not found).
    pub fn position(&self) -> Option<Position> {
        (self.line > 0).then_some(Position {
            line: self.line,
            column: self.column,
        })
    }

    /// `file:line`.
    pub fn at(&self) -> String {
        format!("{}:{}", self.file, self.line)
    }
}

/// A quantity of the vocabulary.
#[derive(Clone, Debug)]
pub struct QuantityDef {
    /// As written.
    pub entry: QuantityEntry,
    /// Its kind.
    pub kind: Kind,
    /// Its plausible range.
    pub range: Option<(Quantity, Quantity)>,
    /// Where it came from.
    pub origin: Origin,
}

/// A threshold.
#[derive(Clone, Debug)]
pub struct SettingDef {
    /// As written.
    pub entry: SettingEntry,
    /// Its kind.
    pub kind: Kind,
    /// Its value.
    pub value: Quantity,
    /// Where it came from.
    pub origin: Origin,
}

/// A named formula.
#[derive(Clone, Debug)]
pub struct DerivedDef {
    /// As written.
    pub entry: DerivedEntry,
    /// Its kind.
    pub kind: Kind,
    /// The compiled formula.
    pub formula: Check,
    /// Where it came from.
    pub origin: Origin,
}

/// A symptom with its compiled phrase patterns.
#[derive(Clone, Debug)]
pub struct SymptomDef {
    /// As written.
    pub entry: SymptomEntry,
    /// Compiled patterns (case-insensitive).
    pub patterns: Vec<Regex>,
    /// Where it came from.
    pub origin: Origin,
}

/// A cause.
#[derive(Clone, Debug)]
pub struct CauseDef {
    /// As written.
    pub entry: CauseEntry,
    /// Where it came from.
    pub origin: Origin,
}

/// A caution.
#[derive(Clone, Debug)]
pub struct CautionDef {
    /// As written.
    pub entry: CautionEntry,
    /// Where it came from.
    pub origin: Origin,
}

/// A rule with its compiled check and evidence.
#[derive(Clone, Debug)]
pub struct RuleDef {
    /// As written.
    pub entry: RuleEntry,
    /// The compiled check (a true/false formula).
    pub check: Check,
    /// The compiled evidence sentence (for a check that holds).
    pub evidence: Evidence,
    /// The compiled sentence for a check that does not hold, if written.
    pub evidence_false: Option<Evidence>,
    /// The actuator its readings belong to, if only one kind has them.
    pub actuator: Option<Actuator>,
    /// Where it came from.
    pub origin: Origin,
}

impl RuleDef {
    /// True when the rule applies to this circuit and placement.
    pub fn applies_to(&self, circuit: Circuit, placement: Placement) -> bool {
        (self.entry.circuits.is_empty() || self.entry.circuits.contains(&circuit))
            && (self.entry.placements.is_empty() || self.entry.placements.contains(&placement))
    }

    /// True when the rule's readings exist on this actuator (or it is unknown).
    pub fn fits_actuator(&self, actuator: Option<Actuator>) -> bool {
        match (self.actuator, actuator) {
            (Some(needed), Some(have)) => needed == have,
            _ => true,
        }
    }
}

/// The whole rule base.
#[derive(Clone, Debug, Default)]
pub struct RuleBase {
    /// Safety cautions by id.
    pub cautions: BTreeMap<String, CautionDef>,
    /// Causes by id.
    pub causes: BTreeMap<String, CauseDef>,
    /// The closing line.
    pub closing: String,
    /// Named formulas, in dependency order.
    pub derived: Vec<DerivedDef>,
    /// Ids defined more than once within one layer (default or user), with
    /// both places; reported by `rules check`.
    pub duplicates: Vec<(String, String, String)>,
    /// Operating points.
    pub points: Vec<PointEntry>,
    /// The vocabulary by id.
    pub quantities: BTreeMap<String, QuantityDef>,
    /// Rules, in file order.
    pub rules: Vec<RuleDef>,
    /// Settings by id.
    pub settings: BTreeMap<String, SettingDef>,
    /// Symptoms, in file order.
    pub symptoms: Vec<SymptomDef>,
    /// The files read, for positions in later messages.
    pub sources: Vec<SourceMap>,
}

/// One file's parsed content with its source.
struct Parsed {
    file: RuleFile,
    source: SourceMap,
    user: bool,
}

impl RuleBase {
    /// Load the default rule base plus the `*.yaml` files of each folder in
    /// `user_dirs` (later entries replace earlier ones with the same id).
    pub fn load(user_dirs: &[PathBuf]) -> Result<RuleBase, RulesError> {
        let mut sources = default_sources();
        for dir in user_dirs {
            sources.extend(read_dir(dir)?.into_iter().map(|s| (s, true)));
        }
        Self::from_sources(sources)
    }

    /// Load only the given sources (`true` marks a user file that may
    /// replace a default entry).
    pub fn from_sources(sources: Vec<(SourceMap, bool)>) -> Result<RuleBase, RulesError> {
        let mut errors = Vec::new();
        let mut parsed = Vec::new();
        for (source, user) in sources {
            match parse_file(&source) {
                Ok(file) => parsed.push(Parsed { file, source, user }),
                Err(e) => errors.push(e),
            }
        }
        if let Some(e) = RulesError::gather(errors) {
            return Err(e);
        }
        let mut base = RuleBase::default();
        base.build(parsed)?;
        Ok(base)
    }

    fn build(&mut self, parsed: Vec<Parsed>) -> Result<(), RulesError> {
        let mut errors = Vec::new();
        let mut layers = Layers::default();
        for p in &parsed {
            layers.collect(p, &mut self.duplicates);
            if let Some(closing) = &p.file.closing {
                self.closing = closing.clone();
            }
        }
        self.sources = parsed.iter().map(|p| p.source.clone()).collect();
        self.points = layers
            .operating_points
            .values()
            .map(|(e, _)| e.clone())
            .collect();
        for (id, (entry, origin)) in layers.quantities {
            match self.quantity(entry, origin.clone()) {
                Ok(def) => {
                    self.quantities.insert(id, def);
                }
                Err(e) => errors.push(e),
            }
        }
        for (id, (entry, origin)) in layers.settings {
            match self.setting(entry, origin.clone()) {
                Ok(def) => {
                    self.settings.insert(id, def);
                }
                Err(e) => errors.push(e),
            }
        }
        for (id, (entry, origin)) in layers.causes {
            self.causes.insert(id, CauseDef { entry, origin });
        }
        for (id, (entry, origin)) in layers.cautions {
            self.cautions.insert(id, CautionDef { entry, origin });
        }
        for (entry, origin) in layers.symptoms.into_values() {
            match self.symptom(entry, origin) {
                Ok(def) => self.symptoms.push(def),
                Err(e) => errors.push(e),
            }
        }
        self.symptoms
            .sort_by(|a, b| (&a.origin.file, a.origin.line).cmp(&(&b.origin.file, b.origin.line)));
        self.compile_derived(layers.derived, &mut errors);
        let mut rules: Vec<(RuleEntry, Origin)> = layers.rules.into_values().collect();
        rules.sort_by(|a, b| (&a.1.file, a.1.line).cmp(&(&b.1.file, b.1.line)));
        for (entry, origin) in rules {
            match self.rule(entry, origin) {
                Ok(def) => self.rules.push(def),
                Err(mut e) => errors.append(&mut e),
            }
        }
        match RulesError::gather(errors) {
            Some(e) => Err(e),
            None => Ok(()),
        }
    }

    /// The source of a file by name.
    pub fn source(&self, file: &str) -> Option<&SourceMap> {
        self.sources.iter().find(|s| s.name == file)
    }

    /// An error at an entry, or at the value of one of its keys.
    fn invalid(&self, origin: &Origin, key: Option<&str>, message: String) -> RulesError {
        invalid_at(&origin.file, self.position(origin, key), message)
    }

    /// Where an entry, or the value of one of its keys, starts.
    fn position(&self, origin: &Origin, key: Option<&str>) -> Option<Position> {
        let entry = origin.position()?;
        match (key, self.source(&origin.file)) {
            (Some(k), Some(s)) => Some(s.key(entry, k)),
            _ => Some(entry),
        }
    }

    fn kind(&self, origin: &Origin, text: &str) -> Result<Kind, RulesError> {
        text.parse::<Kind>()
            .map_err(|message| self.invalid(origin, Some("kind"), message))
    }

    fn quantity(&self, entry: QuantityEntry, origin: Origin) -> Result<QuantityDef, RulesError> {
        let kind = self.kind(&origin, &entry.kind)?;
        if !(1..=5).contains(&entry.effort) {
            return Err(self.invalid(
                &origin,
                Some("effort"),
                format!(
                    "effort must be from 1 (easy) to 5 (hard), found {}",
                    entry.effort
                ),
            ));
        }
        let range = match &entry.range {
            Some([low, high]) => {
                let parse = |t: &str| {
                    units::parse_as(t, kind)
                        .map_err(|e| self.invalid(&origin, Some("range"), e.to_string()))
                };
                Some((parse(low)?, parse(high)?))
            }
            None => None,
        };
        Ok(QuantityDef {
            entry,
            kind,
            range,
            origin,
        })
    }

    fn setting(&self, entry: SettingEntry, origin: Origin) -> Result<SettingDef, RulesError> {
        let kind = self.kind(&origin, &entry.kind)?;
        let value = units::parse_as(&entry.value.0, kind)
            .map_err(|e| self.invalid(&origin, Some("value"), e.to_string()))?;
        if entry.source.trim().is_empty() {
            return Err(self.invalid(
                &origin,
                Some("source"),
                "a setting needs a source: a citation, `common practice` or `from memory`".into(),
            ));
        }
        Ok(SettingDef {
            entry,
            kind,
            value,
            origin,
        })
    }

    fn symptom(&self, entry: SymptomEntry, origin: Origin) -> Result<SymptomDef, RulesError> {
        let mut patterns = Vec::new();
        for phrase in &entry.phrases {
            let regex = RegexBuilder::new(phrase)
                .case_insensitive(true)
                .size_limit(1 << 20)
                .build()
                .map_err(|e| self.phrase_error(&origin, phrase, &e))?;
            patterns.push(regex);
        }
        Ok(SymptomDef {
            entry,
            patterns,
            origin,
        })
    }

    /// A phrase that is not a valid regular expression, located at the
    /// fault inside the phrase when the phrase is written on one line as is.
    fn phrase_error(&self, origin: &Origin, phrase: &str, error: &regex::Error) -> RulesError {
        let (reason, offset) = regex_reason(error);
        let phrases = self.position(origin, Some("phrases"));
        let position = phrases.and_then(|from| {
            let at = self.source(&origin.file)?.find_from(from, phrase)?;
            let shift = offset.filter(|o| *o <= phrase.chars().count()).unwrap_or(0);
            Some(Position {
                line: at.line,
                column: at.column + shift,
            })
        });
        invalid_at(
            &origin.file,
            position.or(phrases),
            format!("bad phrase pattern `{phrase}`: {reason}"),
        )
    }

    /// The compile-time environment: every quantity, setting and derived
    /// quantity compiled so far, with its kind, and the operating points.
    pub fn type_env(&self) -> TypeEnv {
        let mut names: BTreeMap<String, Kind> = BTreeMap::new();
        for (id, q) in &self.quantities {
            names.insert(id.clone(), q.kind);
        }
        for (id, s) in &self.settings {
            names.insert(id.clone(), s.kind);
        }
        for d in &self.derived {
            names.insert(d.entry.id.clone(), d.kind);
        }
        TypeEnv {
            names,
            points: self.points.iter().map(|p| p.id.clone()).collect(),
        }
    }

    /// Compile derived quantities in dependency order: repeatedly compile
    /// those whose names are all known, so a cycle shows up as a set that
    /// never compiles.
    fn compile_derived(
        &mut self,
        derived: BTreeMap<String, (DerivedEntry, Origin)>,
        errors: &mut Vec<RulesError>,
    ) {
        let mut pending: Vec<(DerivedEntry, Origin)> = derived.into_values().collect();
        let all_ids: BTreeSet<String> = pending.iter().map(|(e, _)| e.id.clone()).collect();
        loop {
            let env = self.type_env();
            let before = pending.len();
            let mut waiting = Vec::new();
            for (entry, origin) in pending {
                let refs = formulas::referenced_names(&entry.formula);
                let blocked = refs
                    .iter()
                    .any(|n| all_ids.contains(n) && !env.names.contains_key(n));
                if blocked {
                    waiting.push((entry, origin));
                    continue;
                }
                match self.derived_def(&env, entry, origin) {
                    Ok(def) => self.derived.push(def),
                    Err(e) => errors.push(e),
                }
            }
            pending = waiting;
            if pending.is_empty() || pending.len() == before {
                break;
            }
        }
        self.report_cycles(pending, errors);
    }

    /// Report each cycle among the derived quantities that never compiled,
    /// once, at the formula of its first member in file order, pointing at
    /// the name that closes the loop. A quantity that only depends on a
    /// cycle, or on a quantity with an error of its own, is not reported: it
    /// compiles once that is fixed.
    fn report_cycles(
        &self,
        mut pending: Vec<(DerivedEntry, Origin)>,
        errors: &mut Vec<RulesError>,
    ) {
        pending.sort_by(|a, b| (&a.1.file, a.1.line).cmp(&(&b.1.file, b.1.line)));
        let graph: BTreeMap<&str, Vec<String>> = pending
            .iter()
            .map(|(e, _)| (e.id.as_str(), formulas::referenced_names(&e.formula)))
            .collect();
        let mut reported: BTreeSet<String> = BTreeSet::new();
        for (entry, origin) in &pending {
            let Some(cycle) = cycle_through(&graph, &entry.id) else {
                continue;
            };
            if cycle.iter().any(|id| reported.contains(id)) {
                continue;
            }
            reported.extend(cycle.iter().cloned());
            let next = cycle.get(1).unwrap_or(&entry.id);
            let offset = formulas::name_offset(&entry.formula, next).unwrap_or(0);
            let path = cycle.join(" → ");
            let message = format!("derived quantity `{}` depends on itself: {path}", entry.id);
            errors.push(self.formula_error(origin, "formula", &entry.formula, offset, &message));
        }
    }

    fn derived_def(
        &self,
        env: &TypeEnv,
        entry: DerivedEntry,
        origin: Origin,
    ) -> Result<DerivedDef, RulesError> {
        let kind = self.kind(&origin, &entry.kind)?;
        let formula = self.compile(env, &origin, "formula", &entry.formula)?;
        if let Err(message) = formula.expect_kind(kind) {
            return Err(self.invalid(&origin, Some("formula"), message));
        }
        Ok(DerivedDef {
            entry,
            kind,
            formula,
            origin,
        })
    }

    fn compile(
        &self,
        env: &TypeEnv,
        origin: &Origin,
        key: &str,
        text: &str,
    ) -> Result<Check, RulesError> {
        Check::compile(text, env)
            .map_err(|(offset, message)| self.formula_error(origin, key, text, offset, &message))
    }

    fn formula_error(
        &self,
        origin: &Origin,
        key: &str,
        text: &str,
        offset: usize,
        message: &str,
    ) -> RulesError {
        let position = self.source(&origin.file).and_then(|s| {
            let at = s.key(origin.position()?, key);
            // Step past the quotes when the scalar on the line is the formula.
            let column = match s.scalar_at(at) {
                Some((content, column)) if content.trim() == text.trim() => column,
                _ => at.column,
            };
            Some(Position {
                line: at.line,
                column: column + text[..offset.min(text.len())].chars().count(),
            })
        });
        invalid_at(&origin.file, position, message.to_string())
    }

    fn rule(&self, entry: RuleEntry, origin: Origin) -> Result<RuleDef, Vec<RulesError>> {
        let env = self.type_env();
        let mut errors = Vec::new();
        if !self.causes.contains_key(&entry.cause) {
            let known = self.causes.keys().map(String::as_str);
            errors.push(self.invalid(
                &origin,
                Some("cause"),
                unknown("cause", &entry.cause, known),
            ));
        }
        for symptom in &entry.symptoms {
            if !self.symptoms.iter().any(|s| &s.entry.id == symptom) {
                let known = self.symptoms.iter().map(|s| s.entry.id.as_str());
                errors.push(self.invalid(
                    &origin,
                    Some("symptoms"),
                    unknown("symptom", symptom, known),
                ));
            }
        }
        if !(entry.prior > 0.0 && entry.prior <= 1.0) {
            errors.push(self.invalid(
                &origin,
                Some("prior"),
                format!("prior must be above 0 and at most 1, found {}", entry.prior),
            ));
        }
        let check = match self.compile(&env, &origin, "check", &entry.check) {
            Ok(check) if check.is_condition() => Some(check),
            Ok(check) => {
                errors.push(self.invalid(
                    &origin,
                    Some("check"),
                    format!(
                        "a check must be true or false, found {} (compare it with something)",
                        check.describe()
                    ),
                ));
                None
            }
            Err(e) => {
                errors.push(e);
                None
            }
        };
        let evidence = match Evidence::compile(&entry.evidence, &env) {
            Ok(e) => Some(e),
            Err((offset, message)) => {
                errors.push(self.formula_error(
                    &origin,
                    "evidence",
                    &entry.evidence,
                    offset,
                    &message,
                ));
                None
            }
        };
        let evidence_false = match entry
            .evidence_false
            .as_deref()
            .map(|t| (t, Evidence::compile(t, &env)))
        {
            None => None,
            Some((_, Ok(e))) => Some(e),
            Some((text, Err((offset, message)))) => {
                errors.push(self.formula_error(&origin, "evidence_false", text, offset, &message));
                None
            }
        };
        match (check, evidence) {
            (Some(check), Some(evidence)) if errors.is_empty() => {
                let actuator = self.actuator_of(&check.inputs());
                Ok(RuleDef {
                    entry,
                    check,
                    evidence,
                    evidence_false,
                    actuator,
                    origin,
                })
            }
            _ => Err(errors),
        }
    }

    /// The quantities (without points) a set of names reads, following
    /// derived quantities down to the readings they are computed from.
    pub fn base_inputs(&self, names: &[String]) -> BTreeSet<String> {
        let mut out = BTreeSet::new();
        let mut stack: Vec<String> = names
            .iter()
            .map(|n| n.split('@').next().unwrap_or(n).to_string())
            .collect();
        let mut seen = BTreeSet::new();
        while let Some(name) = stack.pop() {
            if !seen.insert(name.clone()) {
                continue;
            }
            if let Some(d) = self.derived.iter().find(|d| d.entry.id == name) {
                stack.extend(
                    d.formula
                        .inputs()
                        .into_iter()
                        .map(|n| n.split('@').next().unwrap_or(&n).to_string()),
                );
            } else if self.quantities.contains_key(&name) {
                out.insert(name);
            }
        }
        out
    }

    /// The actuator a set of readings belongs to, if any of them exists on
    /// one kind only.
    fn actuator_of(&self, names: &[String]) -> Option<Actuator> {
        self.base_inputs(names)
            .iter()
            .find_map(|n| self.quantities.get(n).and_then(|q| q.entry.actuator))
    }

    /// A rule by id, or an error with the nearest id.
    pub fn rule_by_id(&self, id: &str) -> Result<&RuleDef, RulesError> {
        self.rules
            .iter()
            .find(|r| r.entry.id == id)
            .ok_or_else(|| RulesError::UnknownId {
                what: "rule",
                id: id.to_string(),
                suggestion: crate::suggest::suggest(
                    id,
                    self.rules.iter().map(|r| r.entry.id.as_str()),
                )
                .map(str::to_string),
            })
    }

    /// A symptom by id, or an error with the nearest id.
    pub fn symptom_by_id(&self, id: &str) -> Result<&SymptomDef, RulesError> {
        self.symptoms
            .iter()
            .find(|s| s.entry.id == id)
            .ok_or_else(|| RulesError::UnknownId {
                what: "symptom",
                id: id.to_string(),
                suggestion: crate::suggest::suggest(
                    id,
                    self.symptoms.iter().map(|s| s.entry.id.as_str()),
                )
                .map(str::to_string),
            })
    }

    /// The symptoms whose phrases match a complaint, in rule-base order.
    pub fn recognise(&self, complaint: &str) -> Vec<&SymptomDef> {
        self.symptoms
            .iter()
            .filter(|s| s.patterns.iter().any(|p| p.is_match(complaint)))
            .collect()
    }

    /// A quantity by reading name (`name` or `name@point`), checking the point.
    pub fn quantity_for_reading(&self, name: &str) -> Result<&QuantityDef, String> {
        let (base, point) = match name.split_once('@') {
            Some((b, p)) => (b, Some(p)),
            None => (name, None),
        };
        let q = self
            .quantities
            .get(base)
            .ok_or_else(|| unknown("quantity", base, self.quantities.keys().map(String::as_str)))?;
        if let Some(p) = point {
            if !self.points.iter().any(|x| x.id == p) {
                return Err(unknown(
                    "operating point",
                    p,
                    self.points.iter().map(|x| x.id.as_str()),
                ));
            }
        }
        Ok(q)
    }

    /// Whether a quantity is nameplate data (it then holds at every
    /// operating point).
    pub fn is_nameplate(&self, id: &str) -> bool {
        self.quantities
            .get(id)
            .is_some_and(|q| q.entry.source == QuantitySource::Nameplate)
    }
}

/// The shortest way from `start` back to itself through `graph`, as the
/// list of ids walked (`a`, `b`, `a`), if there is one.
fn cycle_through(graph: &BTreeMap<&str, Vec<String>>, start: &str) -> Option<Vec<String>> {
    let mut paths: Vec<Vec<String>> = vec![vec![start.to_string()]];
    let mut seen: BTreeSet<String> = BTreeSet::new();
    while !paths.is_empty() {
        let mut next_paths = Vec::new();
        for path in paths {
            let last = path.last().map_or(start, String::as_str);
            for name in graph.get(last).into_iter().flatten() {
                if name == start {
                    let mut cycle = path.clone();
                    cycle.push(name.clone());
                    return Some(cycle);
                }
                if graph.contains_key(name.as_str()) && seen.insert(name.clone()) {
                    let mut longer = path.clone();
                    longer.push(name.clone());
                    next_paths.push(longer);
                }
            }
        }
        paths = next_paths;
    }
    None
}

/// `unknown <what> `<id>` (did you mean `<near>`?)`.
pub fn unknown<'a>(what: &str, id: &str, known: impl Iterator<Item = &'a str>) -> String {
    match crate::suggest::suggest(id, known) {
        Some(near) => format!("unknown {what} `{id}` (did you mean `{near}`?)"),
        None => format!("unknown {what} `{id}`"),
    }
}

fn invalid_at(file: &str, position: Option<Position>, message: String) -> RulesError {
    let at = match position {
        Some(p) => format!("{file}:{}:{}", p.line, p.column),
        None => file.to_string(),
    };
    RulesError::Invalid { at, message }
}

/// The reason a pattern failed, and the character offset of the fault in
/// the pattern when the regex crate marks it. Its message reads
/// `regex parse error:`, the pattern indented by four, a `^` line under the
/// fault, and `error: REASON`.
fn regex_reason(error: &regex::Error) -> (String, Option<usize>) {
    let text = error.to_string();
    let lines: Vec<&str> = text.lines().collect();
    let last = lines.last().map_or(text.as_str(), |l| l.trim());
    let reason = last.strip_prefix("error: ").unwrap_or(last).to_string();
    let offset = match lines.as_slice() {
        [_, _, marker, _] => marker.find('^').and_then(|c| c.checked_sub(4)),
        _ => None,
    };
    (reason, offset)
}

/// Entries gathered from every file, the later layer replacing the earlier.
#[derive(Default)]
struct Layers {
    cautions: BTreeMap<String, (CautionEntry, Origin)>,
    causes: BTreeMap<String, (CauseEntry, Origin)>,
    derived: BTreeMap<String, (DerivedEntry, Origin)>,
    operating_points: BTreeMap<String, (PointEntry, Origin)>,
    quantities: BTreeMap<String, (QuantityEntry, Origin)>,
    rules: BTreeMap<String, (RuleEntry, Origin)>,
    settings: BTreeMap<String, (SettingEntry, Origin)>,
    symptoms: BTreeMap<String, (SymptomEntry, Origin)>,
    user_ids: BTreeSet<(String, &'static str)>,
}

macro_rules! merge {
    ($layers:expr, $parsed:expr, $dups:expr, $field:ident, $what:literal) => {
        for (index, entry) in $parsed.file.$field.iter().enumerate() {
            // Two entries of one id in one list are told apart by occurrence.
            let nth = $parsed.file.$field[..index]
                .iter()
                .filter(|e| e.id == entry.id)
                .count();
            let at = $parsed
                .source
                .entry(stringify!($field), &entry.id, nth)
                .unwrap_or_default();
            let mut origin = Origin {
                file: $parsed.source.name.clone(),
                line: at.line,
                column: at.column,
                replaces: None,
            };
            if let Some((_, old)) = $layers.$field.get(&entry.id) {
                let same_layer =
                    !$parsed.user || $layers.user_ids.contains(&(entry.id.clone(), $what));
                if same_layer {
                    $dups.push((
                        format!("{} `{}`", $what, entry.id),
                        old.at(),
                        origin_at(&origin),
                    ));
                } else {
                    origin.replaces = Some(old.at());
                }
            }
            if $parsed.user {
                $layers.user_ids.insert((entry.id.clone(), $what));
            }
            $layers
                .$field
                .insert(entry.id.clone(), (entry.clone(), origin));
        }
    };
}

fn origin_at(o: &Origin) -> String {
    o.at()
}

impl Layers {
    fn collect(&mut self, p: &Parsed, duplicates: &mut Vec<(String, String, String)>) {
        merge!(self, p, duplicates, cautions, "caution");
        merge!(self, p, duplicates, causes, "cause");
        merge!(self, p, duplicates, derived, "derived quantity");
        merge!(self, p, duplicates, operating_points, "operating point");
        merge!(self, p, duplicates, quantities, "quantity");
        merge!(self, p, duplicates, rules, "rule");
        merge!(self, p, duplicates, settings, "setting");
        merge!(self, p, duplicates, symptoms, "symptom");
    }
}

/// Parse one file, reporting YAML errors with their position.
fn parse_file(source: &SourceMap) -> Result<RuleFile, RulesError> {
    if source.text.trim().is_empty() {
        return Err(invalid_at(
            &source.name,
            Some(Position { line: 1, column: 1 }),
            "the file is empty (a rule file starts with `version: 1`)".into(),
        ));
    }
    let file: RuleFile = serde_yaml::from_str(&source.text).map_err(|e| yaml_error(source, e))?;
    if file.version != 1 {
        return Err(invalid_at(
            &source.name,
            source.top_level_key("version"),
            format!(
                "unsupported rule-file version {} (this spoolsleuth reads version 1)",
                file.version
            ),
        ));
    }
    Ok(file)
}

/// A YAML error with its position and a message in our words. A syntax
/// error anywhere in the file is reported before any schema error, because
/// the typed reading stops at the first missing field it meets, which is
/// often only a symptom of a bad indentation further down.
fn yaml_error(source: &SourceMap, typed: serde_yaml::Error) -> RulesError {
    let error = serde_yaml::from_str::<serde_yaml::Value>(&source.text)
        .err()
        .unwrap_or(typed);
    let mut position = error.location().map(|l| Position {
        line: l.line(),
        column: l.column(),
    });
    let text = error.to_string();
    let (problem, context) = split_yaml_message(&text);
    let tab =
        problem.contains("tab character") || position.and_then(|p| source.char_at(p)) == Some('\t');
    let message = match context {
        _ if tab => "found a tab character in the indentation (indent with spaces)".to_string(),
        Some((what, Some(at)))
            if what.contains("quoted scalar") && problem.contains("end of stream") =>
        {
            position = Some(at);
            "quoted text is never closed (add the closing quote)".to_string()
        }
        Some((what, at)) => syntax_message(problem, what, at),
        None => match duplicate_key(problem) {
            Some(key) => {
                let first = position.map(|p| source.key(p, key));
                let second = position.and_then(|p| source.nth_key(p.line, key, 1));
                position = second.or(position);
                let first_line = first.map_or(String::new(), |p| {
                    format!(" (the first is on line {})", p.line)
                });
                format!("{}duplicate key `{key}`{first_line}", path_prefix(problem))
            }
            None => schema_message(problem),
        },
    };
    invalid_at(&source.name, position, message)
}

/// serde_yaml's text is `PROBLEM at line L column C`, optionally followed by
/// `, while CONTEXT` and the context's own `at line L column C`: the
/// problem, and the context with its position when given.
fn split_yaml_message(text: &str) -> (&str, Option<(&str, Option<Position>)>) {
    static PARTS: OnceLock<Regex> = OnceLock::new();
    let parts = PARTS.get_or_init(|| {
        Regex::new(
            r"(?s)^(.*?) at line \d+ column \d+(?:, while (.*?)(?: at line (\d+) column (\d+))?)?$",
        )
        .expect("valid regex")
    });
    let Some(c) = parts.captures(text) else {
        return (text, None);
    };
    let problem = c.get(1).map_or(text, |m| m.as_str());
    let context = c.get(2).map(|what| {
        let at = c.get(3).zip(c.get(4)).and_then(|(line, column)| {
            Some(Position {
                line: line.as_str().parse().ok()?,
                column: column.as_str().parse().ok()?,
            })
        });
        (what.as_str(), at)
    });
    (problem, context)
}

/// A YAML syntax error: the scanner's problem, the structure it was reading
/// and where that structure starts, with a hint for the indentation faults
/// that cause most of them.
fn syntax_message(problem: &str, what: &str, at: Option<Position>) -> String {
    let hint = if problem.contains("did not find expected")
        || problem.contains("not allowed in this context")
    {
        " (check the indentation)"
    } else {
        ""
    };
    let Some(at) = at else {
        return format!("{problem}{hint}");
    };
    let structure = what
        .trim_start_matches("parsing ")
        .trim_start_matches("scanning ")
        .replace("a block collection", "the list")
        .replace("a block mapping", "the mapping")
        .replace("a plain scalar", "the value");
    format!(
        "{problem} in {structure} that starts at {}:{}{hint}",
        at.line, at.column
    )
}

/// The `rules[0].when_true: ` path serde_yaml puts in front of a message.
fn path_prefix(problem: &str) -> &str {
    match problem.find(": ") {
        Some(i) if !problem[..i].contains(' ') => &problem[..i + 2],
        _ => "",
    }
}

/// The key of a "duplicate field `x`" or "duplicate entry with key "x"" message.
fn duplicate_key(problem: &str) -> Option<&str> {
    if let Some(rest) = problem.split("duplicate field `").nth(1) {
        return rest.split('`').next();
    }
    let rest = problem.split("duplicate entry with key \"").nth(1)?;
    rest.split('"').next()
}

/// A schema error in our words: serde's Rust type names replaced by what a
/// rule author writes, and the nearest name for a misspelt key or value.
fn schema_message(problem: &str) -> String {
    static STRUCT: OnceLock<Regex> = OnceLock::new();
    let structs = STRUCT.get_or_init(|| Regex::new(r"struct [A-Za-z]+").expect("valid regex"));
    let text = structs
        .replace_all(problem, "a mapping")
        .replace("expected f64", "expected a number")
        .replace("expected u8", "expected a whole number")
        .replace("expected u32", "expected a whole number")
        .replace("a sequence", "a list")
        .replace("sequence,", "a list,")
        .replace("unknown variant `", "unknown value `");
    let text = crate::suggest::suggest_in_message(&text, "unknown field `").unwrap_or(text);
    let text = crate::suggest::suggest_in_message(&text, "unknown value `").unwrap_or(text);
    if text.contains("missing field `version`") {
        return format!("{text} (a rule file starts with `version: 1`)");
    }
    text
}

/// The default rule files, named `rules/<file>`, sorted by name; each is
/// marked as a default (not a user) file.
pub fn default_sources() -> Vec<(SourceMap, bool)> {
    let mut files: Vec<(SourceMap, bool)> = DEFAULT_RULES
        .files()
        .filter(|f| f.path().extension().is_some_and(|e| e == "yaml"))
        .filter_map(|f| {
            Some((
                SourceMap::new(format!("rules/{}", f.path().display()), f.contents_utf8()?),
                false,
            ))
        })
        .collect();
    files.sort_by(|a, b| a.0.name.cmp(&b.0.name));
    files
}

/// The `*.yaml` files of a user folder, sorted by name.
fn read_dir(dir: &Path) -> Result<Vec<SourceMap>, RulesError> {
    let read_err = |source| RulesError::Read {
        path: dir.display().to_string(),
        source,
    };
    let mut paths: Vec<PathBuf> = std::fs::read_dir(dir)
        .map_err(read_err)?
        .filter_map(Result::ok)
        .map(|e| e.path())
        .filter(|p| p.extension().is_some_and(|e| e == "yaml" || e == "yml"))
        .collect();
    paths.sort();
    paths.iter().map(|path| read_file(path)).collect()
}

/// One user rule file, within the size limit and as UTF-8 text.
fn read_file(path: &Path) -> Result<SourceMap, RulesError> {
    let name = path.display().to_string();
    let read_err = |source| RulesError::Read {
        path: name.clone(),
        source,
    };
    let file = std::fs::File::open(path).map_err(read_err)?;
    // Read one byte past the limit rather than trusting the file's size,
    // which may change between a look and the read.
    let mut bytes = Vec::new();
    file.take(MAX_RULE_FILE_BYTES + 1)
        .read_to_end(&mut bytes)
        .map_err(read_err)?;
    if bytes.len() as u64 > MAX_RULE_FILE_BYTES {
        return Err(RulesError::Invalid {
            at: name,
            message: format!("rule file is larger than the limit of {MAX_RULE_FILE_BYTES} bytes"),
        });
    }
    match String::from_utf8(bytes) {
        Ok(text) => Ok(SourceMap::new(name, text)),
        Err(e) => {
            let valid = e.utf8_error().valid_up_to();
            let bytes = e.into_bytes();
            let before = std::str::from_utf8(&bytes[..valid]).unwrap_or_default();
            let line = before.matches('\n').count() + 1;
            let column = before.rsplit('\n').next().map_or(0, |l| l.chars().count()) + 1;
            Err(invalid_at(
                &name,
                Some(Position { line, column }),
                format!(
                    "the file is not UTF-8 text (byte 0x{:02X} here); save it as UTF-8",
                    bytes[valid]
                ),
            ))
        }
    }
}

/// The largest rule file read (1 MiB): far above any hand-written file.
pub const MAX_RULE_FILE_BYTES: u64 = 1 << 20;

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_default_rule_base_loads_and_every_example_holds() {
        let base = RuleBase::load(&[]).unwrap_or_else(|e| panic!("{e}"));
        assert!(!base.rules.is_empty());
        let results = base.run_examples();
        let failed: Vec<String> = results
            .iter()
            .filter(|r| !r.passed)
            .map(|r| format!("{}: {}: {}", r.rule, r.example, r.detail))
            .collect();
        assert!(failed.is_empty(), "{}", failed.join("\n"));
    }

    fn load_extra(name: &str, text: &str) -> String {
        let mut sources = default_sources();
        sources.push((SourceMap::new(name, text), true));
        match RuleBase::from_sources(sources) {
            Ok(_) => "loaded".to_string(),
            Err(e) => e.to_string(),
        }
    }

    #[test]
    fn errors_name_the_file_line_and_column() {
        let typo = "version: 1\nsettings:\n  - id: x\n    kind: pressure\n    valeu: 3 bar\n    source: from memory\n";
        assert_eq!(
            load_extra("mine/typo.yaml", typo),
            "mine/typo.yaml:5:5: settings[0]: unknown field `valeu` (did you mean `value`?)"
        );
        let dimension = "version: 1\nderived:\n  - id: odd\n    kind: pressure\n    label: Odd\n    formula: supply_pressure + 3 L/min\n";
        let message = load_extra("mine/odd.yaml", dimension);
        assert!(message.starts_with("mine/odd.yaml:6:14: "), "{message}");
        assert!(message.contains("flow"), "{message}");
        let unknown = "version: 1\nderived:\n  - id: odd\n    kind: pressure\n    label: Odd\n    formula: suply_pressure * 2\n";
        assert_eq!(
            load_extra("mine/unknown.yaml", unknown),
            "mine/unknown.yaml:6:14: unknown quantity `suply_pressure` (did you mean `supply_pressure`?)"
        );
    }
}

#[cfg(test)]
mod vocabulary_tests {
    use super::RuleBase;

    /// Case notes validate their symptom and cause ids against lists of
    /// their own; they must name exactly what the built-in rule base does.
    #[test]
    fn the_note_vocabulary_matches_the_rule_base() {
        let base = RuleBase::load(&[]).unwrap();
        let symptoms: Vec<&str> = {
            let mut v: Vec<&str> = base.symptoms.iter().map(|s| s.entry.id.as_str()).collect();
            v.sort_unstable();
            v
        };
        assert_eq!(symptoms, crate::notes::SYMPTOM_IDS);
        let causes: Vec<&str> = base.causes.keys().map(String::as_str).collect();
        assert_eq!(causes, crate::notes::CAUSE_IDS);
    }
}

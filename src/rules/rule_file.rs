//! The shape of one rule-base YAML file, as read by serde.
//!
//! Every struct denies unknown fields so that a misspelt key is reported with
//! its line and column instead of being ignored.

use std::collections::BTreeMap;

use serde::Deserialize;

/// One `rules/*.yaml` file. Every list is optional; a file holds what its
/// concern needs.
#[derive(Debug, Default, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RuleFile {
    /// Schema version; only 1 exists.
    pub version: u32,
    /// Safety cautions.
    #[serde(default)]
    pub cautions: Vec<CautionEntry>,
    /// Causes the rules test.
    #[serde(default)]
    pub causes: Vec<CauseEntry>,
    /// The closing line deferring to local codes and licensed practice.
    #[serde(default)]
    pub closing: Option<String>,
    /// Named formulas.
    #[serde(default)]
    pub derived: Vec<DerivedEntry>,
    /// Operating points a reading may be tagged with.
    #[serde(default)]
    pub operating_points: Vec<PointEntry>,
    /// The measurement vocabulary.
    #[serde(default)]
    pub quantities: Vec<QuantityEntry>,
    /// Symptom → cause checks.
    #[serde(default)]
    pub rules: Vec<RuleEntry>,
    /// Thresholds with their provenance.
    #[serde(default)]
    pub settings: Vec<SettingEntry>,
    /// Complaints and the phrases that recognise them.
    #[serde(default)]
    pub symptoms: Vec<SymptomEntry>,
}

/// Where a quantity's value comes from.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Deserialize, serde::Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum QuantitySource {
    /// Read on a gauge, meter or thermometer.
    Gauge,
    /// Read off a nameplate, drawing or profile.
    Nameplate,
    /// Timed or seen (oscillation frequency, cycle time).
    Observation,
}

/// What drives the load.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Deserialize, serde::Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum Actuator {
    /// A hydraulic cylinder.
    Cylinder,
    /// A hydraulic motor.
    Motor,
}

impl Actuator {
    /// The name as written in files.
    pub fn name(self) -> &'static str {
        match self {
            Actuator::Cylinder => "cylinder",
            Actuator::Motor => "motor",
        }
    }
}

/// A quantity a technician can read or look up.
#[derive(Clone, Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct QuantityEntry {
    /// The actuator the quantity belongs to, when only one kind has it
    /// (a rod speed exists only on a cylinder); rules that read it apply
    /// only to that actuator.
    #[serde(default)]
    pub actuator: Option<Actuator>,
    /// Cautions that go with taking the reading.
    #[serde(default)]
    pub cautions: Vec<String>,
    /// Plain description.
    pub description: String,
    /// How hard the reading is to take, 1 (easy) to 5 (hard).
    #[serde(default = "default_effort")]
    pub effort: u8,
    /// Warn when a reading is near the top of the plausible range.
    #[serde(default)]
    pub full_scale_warning: bool,
    /// snake_case id used in formulas.
    pub id: String,
    /// Instrument to use.
    #[serde(default)]
    pub instrument: Option<String>,
    /// Quantity kind, e.g. `pressure`.
    pub kind: String,
    /// Short label.
    pub label: String,
    /// Where and how to measure it.
    #[serde(default)]
    pub measure: Option<String>,
    /// True if taking the reading means opening a line.
    #[serde(default)]
    pub opens_circuit: bool,
    /// Plausible range `[low, high]` with units.
    #[serde(default)]
    pub range: Option<[String; 2]>,
    /// Gauge, nameplate or observation.
    pub source: QuantitySource,
}

fn default_effort() -> u8 {
    2
}

/// An operating point.
#[derive(Clone, Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct PointEntry {
    /// Name used after `@`.
    pub id: String,
    /// What it means.
    pub label: String,
}

/// A threshold.
#[derive(Clone, Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SettingEntry {
    /// Id used in formulas.
    pub id: String,
    /// Quantity kind.
    pub kind: String,
    /// Why this value.
    #[serde(default)]
    pub note: Option<String>,
    /// Provenance: a citation, `common practice` or `from memory`.
    pub source: String,
    /// The value with its unit.
    pub value: Scalar,
}

/// A named formula.
#[derive(Clone, Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct DerivedEntry {
    /// The formula.
    pub formula: String,
    /// Id used in formulas.
    pub id: String,
    /// Quantity kind of the result.
    pub kind: String,
    /// Short label.
    pub label: String,
    /// Provenance.
    #[serde(default)]
    pub source: Option<String>,
}

/// A symptom.
#[derive(Clone, Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SymptomEntry {
    /// Longer description.
    pub description: String,
    /// kebab-case id.
    pub id: String,
    /// Short label.
    pub label: String,
    /// Regular expressions that recognise the symptom in a complaint.
    #[serde(default)]
    pub phrases: Vec<String>,
}

/// A cause.
#[derive(Clone, Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct CauseEntry {
    /// Cautions that go with the fix.
    #[serde(default)]
    pub cautions: Vec<String>,
    /// Longer description.
    pub description: String,
    /// The fix in plain words.
    pub fix: String,
    /// Hazards the fix exposes people to.
    #[serde(default)]
    pub fix_hazards: Vec<Hazard>,
    /// kebab-case id.
    pub id: String,
    /// Short label.
    pub label: String,
}

/// A hazard that calls for a caution.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Deserialize, serde::Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum Hazard {
    /// Changing a relief, compensator or pump setting.
    ChangesSetting,
    /// Standing near a moving or raised load.
    MovingLoad,
    /// Opening a line or a component.
    OpensCircuit,
}

impl Hazard {
    /// The cautions this hazard requires.
    pub fn required_cautions(self) -> &'static [&'static str] {
        match self {
            Hazard::ChangesSetting => &["gauge-rating"],
            Hazard::MovingLoad => &["gravity-load"],
            Hazard::OpensCircuit => &["lockout", "trapped-pressure"],
        }
    }

    /// The hazard's name as written in rule files.
    pub fn name(self) -> &'static str {
        match self {
            Hazard::ChangesSetting => "changes-setting",
            Hazard::MovingLoad => "moving-load",
            Hazard::OpensCircuit => "opens-circuit",
        }
    }
}

/// A safety caution.
#[derive(Clone, Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct CautionEntry {
    /// kebab-case id.
    pub id: String,
    /// What to do.
    pub text: String,
    /// Short title.
    pub title: String,
}

/// What a check's outcome means for its cause.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Deserialize, serde::Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum Effect {
    /// The cause is shown.
    Confirms,
    /// The cause becomes more likely.
    Supports,
    /// The cause becomes less likely.
    Weakens,
    /// The cause cannot be it.
    RulesOut,
}

impl Effect {
    /// The effect's name as written in rule files.
    pub fn name(self) -> &'static str {
        match self {
            Effect::Confirms => "confirms",
            Effect::Supports => "supports",
            Effect::Weakens => "weakens",
            Effect::RulesOut => "rules-out",
        }
    }
}

/// A circuit type.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Deserialize, serde::Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum Circuit {
    /// Bypass (3-way) compensated flow control.
    Bypass,
    /// Load-sensing pump margin control.
    LoadSensing,
    /// Plain needle valve, not compensated.
    Needle,
    /// Restrictive (2-way) compensated flow control.
    Restrictive,
}

impl Circuit {
    /// Every circuit type.
    pub const ALL: [Circuit; 4] = [
        Circuit::Bypass,
        Circuit::LoadSensing,
        Circuit::Needle,
        Circuit::Restrictive,
    ];

    /// The name as written in files.
    pub fn name(self) -> &'static str {
        match self {
            Circuit::Bypass => "bypass",
            Circuit::LoadSensing => "load-sensing",
            Circuit::Needle => "needle",
            Circuit::Restrictive => "restrictive",
        }
    }
}

/// Where the valve sits.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Deserialize, serde::Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum Placement {
    /// In a branch to tank.
    BleedOff,
    /// In the line to the actuator.
    MeterIn,
    /// In the line from the actuator.
    MeterOut,
}

impl Placement {
    /// Every placement.
    pub const ALL: [Placement; 3] = [Placement::BleedOff, Placement::MeterIn, Placement::MeterOut];

    /// The name as written in files.
    pub fn name(self) -> &'static str {
        match self {
            Placement::BleedOff => "bleed-off",
            Placement::MeterIn => "meter-in",
            Placement::MeterOut => "meter-out",
        }
    }
}

/// A symptom → cause check.
#[derive(Clone, Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RuleEntry {
    /// The cause it tests.
    pub cause: String,
    /// The formula that must hold for the cause.
    pub check: String,
    /// Circuit types it applies to (empty: all).
    #[serde(default)]
    pub circuits: Vec<Circuit>,
    /// Evidence sentence with `{formula}` placeholders, said when the check
    /// holds.
    pub evidence: String,
    /// The sentence said when the check does not hold; without it the
    /// values the check was decided on are shown instead, so a sentence
    /// written for the holding case is never shown as if it were true.
    #[serde(default)]
    pub evidence_false: Option<String>,
    /// Worked examples (at least two).
    #[serde(default)]
    pub examples: Vec<ExampleEntry>,
    /// kebab-case id.
    pub id: String,
    /// Placements it applies to (empty: all).
    #[serde(default)]
    pub placements: Vec<Placement>,
    /// Prior likelihood of the cause for these symptoms, in (0, 1].
    pub prior: f64,
    /// Provenance of the threshold.
    #[serde(default)]
    pub source: Option<String>,
    /// Symptoms it applies to.
    pub symptoms: Vec<String>,
    /// Short title.
    pub title: String,
    /// What a false check means.
    pub when_false: Effect,
    /// What a true check means.
    pub when_true: Effect,
}

/// What an example expects.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Deserialize, serde::Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum Expectation {
    /// The check holds.
    True,
    /// The check does not hold.
    False,
    /// The readings do not settle the check.
    Missing,
}

/// A worked example of a rule.
#[derive(Clone, Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ExampleEntry {
    /// Circuit type for the example (default: the rule's first).
    #[serde(default)]
    pub circuit: Option<Circuit>,
    /// Expected outcome.
    pub expect: Expectation,
    /// What the example shows.
    pub name: String,
    /// Placement for the example (default: the rule's first, or meter-in).
    #[serde(default)]
    pub placement: Option<Placement>,
    /// Readings, `name` or `name@point` → value with unit.
    #[serde(default)]
    pub readings: BTreeMap<String, Scalar>,
}

/// A YAML scalar kept as text (`5 %`, `0.87`, `true`).
#[derive(Clone, Debug, PartialEq)]
pub struct Scalar(pub String);

impl<'de> Deserialize<'de> for Scalar {
    fn deserialize<D: serde::Deserializer<'de>>(deserializer: D) -> Result<Self, D::Error> {
        match serde_yaml::Value::deserialize(deserializer)? {
            serde_yaml::Value::String(s) => Ok(Scalar(s)),
            serde_yaml::Value::Number(n) => Ok(Scalar(n.to_string())),
            serde_yaml::Value::Bool(b) => Ok(Scalar(b.to_string())),
            other => Err(serde::de::Error::custom(format!(
                "expected a value with its unit, e.g. `8 bar`, found {}",
                describe(&other)
            ))),
        }
    }
}

fn describe(v: &serde_yaml::Value) -> &'static str {
    match v {
        serde_yaml::Value::Null => "nothing",
        serde_yaml::Value::Sequence(_) => "a list",
        serde_yaml::Value::Mapping(_) => "a mapping",
        _ => "a tagged value",
    }
}

//! How long a machine was down, written like `3.5 h`, `45 min` or `2 h 15 min`.

use std::fmt;
use std::str::FromStr;

/// Downtime in whole minutes.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, PartialOrd, Ord)]
pub struct Downtime {
    minutes: u64,
}

impl Downtime {
    /// Downtime of this many minutes.
    pub fn from_minutes(minutes: u64) -> Self {
        Downtime { minutes }
    }

    /// The downtime in minutes.
    pub fn minutes(self) -> u64 {
        self.minutes
    }
}

/// Minutes per unit for the units a technician writes.
fn unit_minutes(unit: &str) -> Option<f64> {
    match unit {
        "m" | "min" | "mins" | "minute" | "minutes" => Some(1.0),
        "h" | "hr" | "hrs" | "hour" | "hours" => Some(60.0),
        // A shift is taken as 8 hours, the plant's standard shift.
        "shift" | "shifts" => Some(8.0 * 60.0),
        "d" | "day" | "days" => Some(24.0 * 60.0),
        _ => None,
    }
}

impl FromStr for Downtime {
    type Err = String;

    fn from_str(text: &str) -> Result<Self, String> {
        let lower = text.trim().to_lowercase();
        let mut rest = lower.as_str();
        let mut total = 0.0;
        if rest.is_empty() {
            return Err("downtime is empty (write e.g. '3.5 h' or '45 min')".into());
        }
        while !rest.is_empty() {
            let number_end = rest
                .find(|c: char| !(c.is_ascii_digit() || c == '.'))
                .unwrap_or(rest.len());
            let number: f64 = rest[..number_end].parse().map_err(|_| {
                format!("'{text}' is not a duration (write e.g. '3.5 h' or '45 min')")
            })?;
            rest = rest[number_end..].trim_start();
            let unit_end = rest
                .find(|c: char| !c.is_ascii_alphabetic())
                .unwrap_or(rest.len());
            let unit = &rest[..unit_end];
            let per = unit_minutes(unit).ok_or_else(|| {
                format!("unknown time unit '{unit}' in '{text}' (use min, h, shift or day)")
            })?;
            total += number * per;
            rest = rest[unit_end..].trim_start();
        }
        // Rounded to whole minutes: nobody logs downtime to the second.
        Ok(Downtime {
            minutes: total.round() as u64,
        })
    }
}

impl fmt::Display for Downtime {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match (self.minutes / 60, self.minutes % 60) {
            (0, minutes) => write!(f, "{minutes} min"),
            (hours, 0) => write!(f, "{hours} h"),
            (hours, minutes) => write!(f, "{hours} h {minutes} min"),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[track_caller]
    fn case(text: &str, minutes: u64) {
        assert_eq!(
            text.parse::<Downtime>().unwrap().minutes(),
            minutes,
            "{text}"
        );
    }

    #[test]
    fn parses_the_forms_technicians_write() {
        case("3.5 h", 210);
        case("45 min", 45);
        case("2 h 15 min", 135);
        case("2h15m", 135);
        case("1 shift", 480);
        case("2 days", 2880);
    }

    #[test]
    fn rejects_unknown_units_and_empty_text() {
        assert_eq!(
            "3 weeks".parse::<Downtime>().unwrap_err(),
            "unknown time unit 'weeks' in '3 weeks' (use min, h, shift or day)"
        );
        assert!("".parse::<Downtime>().is_err());
        assert!("h".parse::<Downtime>().is_err());
        assert!("3".parse::<Downtime>().is_err());
    }

    #[test]
    fn prints_hours_and_minutes() {
        assert_eq!(Downtime::from_minutes(135).to_string(), "2 h 15 min");
        assert_eq!(Downtime::from_minutes(45).to_string(), "45 min");
        assert_eq!(Downtime::from_minutes(120).to_string(), "2 h");
    }
}

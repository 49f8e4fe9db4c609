//! A calendar date written `YYYY-MM-DD`, the only date form a note or an
//! option accepts.

use std::fmt;
use std::str::FromStr;
use std::time::{SystemTime, UNIX_EPOCH};

/// A valid calendar date (proleptic Gregorian).
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub struct NoteDate {
    // Declared most significant first: the derived order is the calendar order.
    year: u16,
    month: u8,
    day: u8,
}

impl NoteDate {
    /// A date from its parts, if it exists on the calendar.
    pub fn new(year: u16, month: u8, day: u8) -> Result<Self, String> {
        if !(1..=12).contains(&month) {
            return Err(format!("month {month} is out of range 1-12"));
        }
        let last = days_in_month(year, month);
        if day == 0 || day > last {
            return Err(format!(
                "day {day} is out of range 1-{last} for {year}-{month:02}"
            ));
        }
        Ok(NoteDate { day, month, year })
    }

    /// Today's date in UTC.
    pub fn today() -> Self {
        let seconds = SystemTime::now()
            .duration_since(UNIX_EPOCH)
            .map(|d| d.as_secs())
            .unwrap_or(0);
        Self::from_days_since_epoch(i64::try_from(seconds / 86_400).unwrap_or(0))
    }

    /// The date `days` after 1970-01-01 (civil-from-days).
    fn from_days_since_epoch(days: i64) -> Self {
        let z = days + 719_468;
        let era = z.div_euclid(146_097);
        let doe = z.rem_euclid(146_097);
        let yoe = (doe - doe / 1460 + doe / 36_524 - doe / 146_096) / 365;
        let doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
        let mp = (5 * doy + 2) / 153;
        let day = doy - (153 * mp + 2) / 5 + 1;
        let month = if mp < 10 { mp + 3 } else { mp - 9 };
        let year = yoe + era * 400 + i64::from(month <= 2);
        NoteDate {
            day: u8::try_from(day).unwrap_or(1),
            month: u8::try_from(month).unwrap_or(1),
            year: u16::try_from(year).unwrap_or(1970),
        }
    }

    /// The date as a sortable number `YYYYMMDD`, used by the index.
    pub fn ordinal(self) -> u64 {
        u64::from(self.year) * 10_000 + u64::from(self.month) * 100 + u64::from(self.day)
    }

    /// The date back from [`NoteDate::ordinal`].
    pub fn from_ordinal(ordinal: u64) -> Option<Self> {
        let year = u16::try_from(ordinal / 10_000).ok()?;
        let month = u8::try_from(ordinal / 100 % 100).ok()?;
        let day = u8::try_from(ordinal % 100).ok()?;
        NoteDate::new(year, month, day).ok()
    }
}

fn days_in_month(year: u16, month: u8) -> u8 {
    match month {
        2 if year % 4 == 0 && (year % 100 != 0 || year % 400 == 0) => 29,
        2 => 28,
        4 | 6 | 9 | 11 => 30,
        _ => 31,
    }
}

impl FromStr for NoteDate {
    type Err = String;

    fn from_str(text: &str) -> Result<Self, String> {
        let shape_error = || format!("'{text}' is not a date of the form YYYY-MM-DD");
        let bytes = text.as_bytes();
        let digits_at = |range: std::ops::Range<usize>| bytes[range].iter().all(u8::is_ascii_digit);
        if bytes.len() != 10
            || bytes[4] != b'-'
            || bytes[7] != b'-'
            || !digits_at(0..4)
            || !digits_at(5..7)
            || !digits_at(8..10)
        {
            return Err(shape_error());
        }
        let year = text[0..4].parse().map_err(|_| shape_error())?;
        let month = text[5..7].parse().map_err(|_| shape_error())?;
        let day = text[8..10].parse().map_err(|_| shape_error())?;
        NoteDate::new(year, month, day)
            .map_err(|reason| format!("'{text}' is not a valid date: {reason}"))
    }
}

impl serde::Serialize for NoteDate {
    fn serialize<S: serde::Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        serializer.collect_str(self)
    }
}

impl fmt::Display for NoteDate {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{:04}-{:02}-{:02}", self.year, self.month, self.day)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn parses_and_prints_valid_dates() {
        for text in ["2024-02-29", "2019-01-01", "2026-12-31"] {
            assert_eq!(text.parse::<NoteDate>().unwrap().to_string(), text);
        }
    }

    #[test]
    fn rejects_impossible_dates_with_reasons() {
        assert_eq!(
            "2024-13-01".parse::<NoteDate>().unwrap_err(),
            "'2024-13-01' is not a valid date: month 13 is out of range 1-12"
        );
        assert_eq!(
            "2023-02-29".parse::<NoteDate>().unwrap_err(),
            "'2023-02-29' is not a valid date: day 29 is out of range 1-28 for 2023-02"
        );
        assert_eq!(
            "2024-1-01".parse::<NoteDate>().unwrap_err(),
            "'2024-1-01' is not a date of the form YYYY-MM-DD"
        );
        assert!("yesterday".parse::<NoteDate>().is_err());
        assert!("２０２４-01-01".parse::<NoteDate>().is_err());
    }

    #[test]
    fn ordinal_round_trips_and_sorts() {
        let date: NoteDate = "2021-07-04".parse().unwrap();
        assert!(date < "2022-01-01".parse().unwrap());
        assert!(date > "2021-06-30".parse().unwrap());
        assert_eq!(date.ordinal(), 20_210_704);
        assert_eq!(NoteDate::from_ordinal(date.ordinal()), Some(date));
    }

    #[test]
    fn days_since_epoch_match_known_dates() {
        assert_eq!(NoteDate::from_days_since_epoch(0).to_string(), "1970-01-01");
        assert_eq!(
            NoteDate::from_days_since_epoch(19_782).to_string(),
            "2024-02-29"
        );
    }
}

//! "Did you mean …?" suggestions for misspelt names, units and ids.

/// The candidate nearest to `word`, if one is near enough to be a likely
/// misspelling: a case-insensitive match first, then the smallest
/// Damerau–Levenshtein distance within a third of the word's length (at
/// least 1, at most 4).
pub fn suggest<'a, I>(word: &str, candidates: I) -> Option<&'a str>
where
    I: IntoIterator<Item = &'a str>,
{
    let candidates: Vec<&'a str> = candidates.into_iter().collect();
    if let Some(exact) = candidates
        .iter()
        .find(|c| c.eq_ignore_ascii_case(word) && **c != word)
    {
        return Some(exact);
    }
    let limit = (word.chars().count() / 3).clamp(1, 4);
    let lower = word.to_lowercase();
    let length = lower.chars().count();
    candidates
        .iter()
        .filter_map(|c| {
            let other = c.to_lowercase();
            // The distance is at least the difference in length: far ones go
            // unmeasured, so a long pasted word costs no more than a short one.
            (other.chars().count().abs_diff(length) <= limit)
                .then(|| (strsim::damerau_levenshtein(&lower, &other), *c))
        })
        .filter(|(d, c)| *d <= limit && *c != word)
        // On a tie prefer a candidate with the same letters (a transposition).
        .min_by_key(|(d, c)| (*d, !same_letters(word, c)))
        .map(|(_, c)| c)
}

/// For serde's "unknown field `x`, expected one of `a`, `b`" (or "unknown
/// value"), name the nearest instead of listing them all; `None` when the
/// marker is not in `text` or nothing is near.
pub fn suggest_in_message(text: &str, marker: &str) -> Option<String> {
    let start = text.find(marker)?;
    let (prefix, rest) = text.split_at(start);
    let rest = rest.strip_prefix(marker)?;
    let (name, expected) = rest.split_once('`')?;
    let names: Vec<&str> = expected.split('`').skip(1).step_by(2).collect();
    let near = suggest(name, names.iter().copied())?;
    Some(format!("{prefix}{marker}{name}` (did you mean `{near}`?)"))
}

fn same_letters(a: &str, b: &str) -> bool {
    let sorted = |s: &str| {
        let mut v: Vec<char> = s.to_lowercase().chars().collect();
        v.sort_unstable();
        v
    };
    sorted(a) == sorted(b)
}

#[cfg(test)]
mod tests {
    use super::suggest;

    #[test]
    fn suggestions() {
        let units = ["bar", "psi", "kPa", "MPa", "gpm"];
        assert_eq!(suggest("kPA", units), Some("kPa"));
        assert_eq!(suggest("bra", units), Some("bar"));
        assert_eq!(suggest("psu", units), Some("psi"));
        assert_eq!(suggest("furlong", units), None);
        assert_eq!(suggest("bar", units), None);
    }
}

//! The trade's synonyms, applied at index time by a token filter that emits
//! every word of a group at the position of any member (so a note that says
//! "hunts" is found by "oscillating"), plus the rewriting of multi-word
//! phrases in a query ("drops off" → "sags") that a single token cannot carry.

use std::collections::HashMap;
use std::sync::LazyLock;

use tantivy::tokenizer::{Token, TokenFilter, TokenStream, Tokenizer};

/// One group of words that mean the same symptom on the shop floor.
struct Group {
    /// Words emitted for any member; the first one replaces query phrases.
    emit: &'static [&'static str],
    /// Two-word phrases that trigger the group at index time.
    pairs: &'static [(&'static str, &'static str)],
    /// Multi-word query phrases rewritten to `emit[0]`.
    query_phrases: &'static [&'static str],
    /// Single (lowercase, unstemmed) words that trigger the group.
    words: &'static [&'static str],
}

const GROUPS: &[Group] = &[
    Group {
        emit: &["hunting", "oscillating", "surging", "cycling", "bouncing"],
        pairs: &[],
        query_phrases: &["goes up and down"],
        words: &[
            "bounce",
            "bounced",
            "bounces",
            "bouncing",
            "cycling",
            "hunt",
            "hunted",
            "hunting",
            "hunts",
            "oscillate",
            "oscillated",
            "oscillates",
            "oscillating",
            "oscillation",
            "oscillations",
            "surge",
            "surged",
            "surges",
            "surging",
        ],
    },
    Group {
        emit: &["sags", "bogs", "slows"],
        pairs: &[
            ("drop", "off"),
            ("dropped", "off"),
            ("dropping", "off"),
            ("drops", "off"),
            ("lose", "speed"),
            ("loses", "speed"),
            ("losing", "speed"),
            ("lost", "speed"),
        ],
        query_phrases: &[
            "drop off",
            "dropped off",
            "dropping off",
            "drops off",
            "lose speed",
            "loses speed",
            "losing speed",
            "lost speed",
        ],
        words: &[
            "bog", "bogged", "bogging", "bogs", "sag", "sagged", "sagging", "sags", "slowdown",
            "slowed", "slowing", "slows",
        ],
    },
    Group {
        emit: &["overheating", "hot"],
        pairs: &[
            ("hot", "oil"),
            ("ran", "hot"),
            ("run", "hot"),
            ("running", "hot"),
            ("runs", "hot"),
            ("too", "hot"),
        ],
        query_phrases: &[
            "hot oil",
            "ran hot",
            "run hot",
            "running hot",
            "runs hot",
            "too hot",
        ],
        words: &["overheat", "overheated", "overheating", "overheats"],
    },
    Group {
        emit: &["lunge", "jumps"],
        pairs: &[],
        query_phrases: &[
            "jumps at start",
            "jumps at startup",
            "jumps forward",
            "surges at start",
            "surges at startup",
            "surging at start",
            "surging at startup",
        ],
        words: &[
            "jump", "jumped", "jumping", "jumps", "lunge", "lunged", "lunges", "lunging",
        ],
    },
    Group {
        emit: &["drift", "creep"],
        pairs: &[],
        query_phrases: &[],
        words: &[
            "creep", "creeping", "creeps", "crept", "drift", "drifted", "drifting", "drifts",
        ],
    },
    Group {
        emit: &["runaway", "overrunning"],
        pairs: &[("ran", "away"), ("running", "away"), ("runs", "away")],
        query_phrases: &["ran away", "running away", "runs away"],
        words: &["overrun", "overrunning", "overruns", "runaway"],
    },
];

/// Word → group, and word pair → group.
struct Lookup {
    pairs: HashMap<(&'static str, &'static str), usize>,
    words: HashMap<&'static str, usize>,
}

static LOOKUP: LazyLock<Lookup> = LazyLock::new(|| {
    let mut words = HashMap::new();
    let mut pairs = HashMap::new();
    for (index, group) in GROUPS.iter().enumerate() {
        words.extend(group.words.iter().map(|w| (*w, index)));
        pairs.extend(group.pairs.iter().map(|p| (*p, index)));
    }
    Lookup { pairs, words }
});

/// True for a word the synonym lists know (a member or part of a phrase):
/// such words are never "corrected" as typos.
pub fn is_trade_word(word: &str) -> bool {
    let lookup = &*LOOKUP;
    lookup.words.contains_key(word)
        || lookup.pairs.keys().any(|(a, b)| *a == word || *b == word)
        || GROUPS
            .iter()
            .flat_map(|g| g.query_phrases)
            .any(|p| p.split(' ').any(|w| w == word))
}

/// Rewrite the trade's multi-word phrases in a query (outside quotes) to one
/// word of their group, e.g. `platen drops off` → `platen sags`.
pub fn rewrite_phrases(query: &str) -> String {
    let mut out = String::with_capacity(query.len());
    let mut in_quotes = false;
    let mut rest = query;
    'scan: while let Some(c) = rest.chars().next() {
        if c == '"' {
            in_quotes = !in_quotes;
        }
        let at_word_start = !out.chars().last().is_some_and(char::is_alphanumeric);
        if !in_quotes && at_word_start && c.is_alphabetic() {
            for group in GROUPS {
                for phrase in group.query_phrases {
                    if let Some(len) = phrase_match(rest, phrase) {
                        out.push_str(group.emit[0]);
                        rest = &rest[len..];
                        continue 'scan;
                    }
                }
            }
        }
        out.push(c);
        rest = &rest[c.len_utf8()..];
    }
    out
}

/// Byte length of `phrase` at the start of `text` (case-insensitive, any
/// run of spaces between words, whole words only).
fn phrase_match(text: &str, phrase: &str) -> Option<usize> {
    let mut pos = 0;
    for (i, word) in phrase.split(' ').enumerate() {
        if i > 0 {
            let spaces = text[pos..].len() - text[pos..].trim_start_matches([' ', '\t']).len();
            if spaces == 0 {
                return None;
            }
            pos += spaces;
        }
        let candidate = text.get(pos..pos + word.len())?;
        if !candidate.eq_ignore_ascii_case(word) {
            return None;
        }
        pos += word.len();
    }
    let next = text[pos..].chars().next();
    (!next.is_some_and(char::is_alphanumeric)).then_some(pos)
}

/// Token filter that adds the synonyms of each word at its position.
/// Place it after lowercasing and before stemming.
#[derive(Clone, Copy, Debug, Default)]
pub struct SynonymFilter;

impl TokenFilter for SynonymFilter {
    type Tokenizer<T: Tokenizer> = SynonymTokenizer<T>;

    fn transform<T: Tokenizer>(self, tokenizer: T) -> SynonymTokenizer<T> {
        SynonymTokenizer { inner: tokenizer }
    }
}

/// A tokenizer wrapped by [`SynonymFilter`].
#[derive(Clone, Debug)]
pub struct SynonymTokenizer<T> {
    inner: T,
}

impl<T: Tokenizer> Tokenizer for SynonymTokenizer<T> {
    type TokenStream<'a> = SynonymTokenStream<T::TokenStream<'a>>;

    fn token_stream<'a>(&'a mut self, text: &'a str) -> Self::TokenStream<'a> {
        SynonymTokenStream {
            pending: Vec::new(),
            pending_from: 0,
            previous: String::new(),
            previous_from: 0,
            tail: self.inner.token_stream(text),
        }
    }
}

/// The token stream of [`SynonymTokenizer`].
pub struct SynonymTokenStream<S> {
    /// Synonyms still to emit at the current position.
    pending: Vec<&'static str>,
    /// Start offset for the pending synonyms (earlier for a two-word phrase).
    pending_from: usize,
    previous: String,
    previous_from: usize,
    tail: S,
}

impl<S: TokenStream> SynonymTokenStream<S> {
    fn queue(&mut self) {
        let token = self.tail.token();
        let lookup = &*LOOKUP;
        self.pending.clear();
        self.pending_from = token.offset_from;
        if let Some(&group) = lookup.words.get(token.text.as_str()) {
            let own = token.text.as_str();
            self.pending
                .extend(GROUPS[group].emit.iter().filter(|w| **w != own));
        } else if let Some(&group) = lookup
            .pairs
            .get(&(self.previous.as_str(), token.text.as_str()))
        {
            self.pending.extend(GROUPS[group].emit);
            self.pending_from = self.previous_from;
        }
        self.previous.clear();
        self.previous.push_str(&token.text);
        self.previous_from = token.offset_from;
    }
}

impl<S: TokenStream> TokenStream for SynonymTokenStream<S> {
    fn advance(&mut self) -> bool {
        if let Some(word) = self.pending.pop() {
            let from = self.pending_from;
            let token = self.tail.token_mut();
            token.text.clear();
            token.text.push_str(word);
            token.offset_from = from;
            return true;
        }
        if !self.tail.advance() {
            return false;
        }
        self.queue();
        true
    }

    fn token(&self) -> &Token {
        self.tail.token()
    }

    fn token_mut(&mut self) -> &mut Token {
        self.tail.token_mut()
    }
}

#[cfg(test)]
mod tests {
    use tantivy::tokenizer::{LowerCaser, SimpleTokenizer, TextAnalyzer};

    use super::*;

    fn tokens(text: &str) -> Vec<(String, usize, usize)> {
        let mut analyzer = TextAnalyzer::builder(SimpleTokenizer::default())
            .filter(LowerCaser)
            .filter(SynonymFilter)
            .build();
        let mut stream = analyzer.token_stream(text);
        let mut out = Vec::new();
        stream.process(&mut |t| out.push((t.text.clone(), t.position, t.offset_from)));
        out
    }

    #[test]
    fn emits_group_words_at_the_same_position() {
        let out = tokens("It Hunts badly");
        let at_one: Vec<&str> = out
            .iter()
            .filter(|t| t.1 == 1)
            .map(|t| t.0.as_str())
            .collect();
        assert_eq!(
            at_one,
            [
                "hunts",
                "bouncing",
                "cycling",
                "surging",
                "oscillating",
                "hunting"
            ]
        );
        assert_eq!(out.last().unwrap().0, "badly");
        assert!(out.iter().filter(|t| t.1 == 1).all(|t| t.2 == 3));
    }

    #[test]
    fn two_word_phrases_trigger_on_their_second_word() {
        let out = tokens("speed drops off under load");
        let synonyms: Vec<(&str, usize)> = out
            .iter()
            .filter(|t| t.1 == 2)
            .map(|t| (t.0.as_str(), t.2))
            .collect();
        assert_eq!(
            synonyms,
            [("off", 12), ("slows", 6), ("bogs", 6), ("sags", 6)]
        );
        assert_eq!(tokens("the pump runs quietly").len(), 4);
    }

    #[test]
    fn rewrites_query_phrases_outside_quotes() {
        assert_eq!(
            rewrite_phrases("platen Drops  Off at load"),
            "platen sags at load"
        );
        assert_eq!(
            rewrite_phrases("\"runs hot\" runs hot"),
            "\"runs hot\" overheating"
        );
        assert_eq!(rewrite_phrases("reruns hot"), "reruns hot");
        assert_eq!(
            rewrite_phrases("cylinder surges at startup!"),
            "cylinder lunge!"
        );
        assert_eq!(rewrite_phrases("drops offset"), "drops offset");
    }
}

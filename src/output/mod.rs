//! Writing results: plain text tables, JSON, colour decisions.

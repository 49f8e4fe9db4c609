//! Benchmark of the notes index (run with `cargo bench --bench notes`; the
//! numbers are recorded in tests/benches/RESULTS.md, never asserted in a
//! test). Generates synthetic notes from an invented vocabulary with a fixed
//! seed, then measures a full index build, query latency through the library
//! and through the real binary, the same queries answered by `grep -ril`, the
//! cost of updating one note, and peak memory of a full build.
//!
//! `SPOOLSLEUTH_BENCH_SIZES=10000,100000` (the default) picks the note counts;
//! `SPOOLSLEUTH_BENCH_DIR=DIR` keeps the generated notes and indexes there.

use std::fs;
use std::path::{Path, PathBuf};
use std::process::Command;
use std::time::{Duration, Instant};

use spoolsleuth::cli::render_results;
use spoolsleuth::index::{
    read_manifest_bytes, register_index_analyzers, IndexLocation, ManifestView, NoteIndex,
};
use spoolsleuth::notes::{NotesFolder, CAUSE_IDS, SYMPTOM_IDS};
use spoolsleuth::search::{search, QueryBuilder, SearchRequest};
use spoolsleuth::watch::{ask_watcher, WatchCursor};
use tantivy::collector::{Count, TopDocs};
use tantivy::{Index, ReloadPolicy};

/// Deterministic xorshift64* generator: the same notes on every run.
struct Rng(u64);

impl Rng {
    fn next(&mut self) -> u64 {
        self.0 ^= self.0 >> 12;
        self.0 ^= self.0 << 25;
        self.0 ^= self.0 >> 27;
        self.0.wrapping_mul(0x2545_f491_4f6c_dd1d)
    }

    fn below(&mut self, n: usize) -> usize {
        (self.next() % n as u64) as usize
    }

    /// Skewed towards small indices, like word frequencies in text.
    fn skewed(&mut self, n: usize) -> usize {
        let x = (self.next() >> 11) as f64 / (1u64 << 53) as f64;
        ((x * x * x) * n as f64) as usize
    }
}

const SYLLABLES: &[&str] = &[
    "ka", "lo", "mir", "tes", "vun", "dra", "pel", "sor", "qui", "ban", "fet", "gol", "hu", "zan",
    "rik", "mo", "tal", "ve", "nox", "pra", "sel", "dun", "gri", "ol", "eth", "cas", "bri", "wen",
    "tor", "ul",
];

/// An invented vocabulary of `n` distinct words.
fn vocabulary(rng: &mut Rng, n: usize) -> Vec<String> {
    let mut words = std::collections::BTreeSet::new();
    while words.len() < n {
        let syllables = 2 + rng.below(3);
        let word: String = (0..syllables)
            .map(|_| SYLLABLES[rng.below(SYLLABLES.len())])
            .collect();
        words.insert(word);
    }
    let mut words: Vec<String> = words.into_iter().collect();
    // Shuffle so that frequency rank is unrelated to spelling.
    for i in (1..words.len()).rev() {
        let j = rng.below(i + 1);
        words.swap(i, j);
    }
    words
}

fn sentence(rng: &mut Rng, vocabulary: &[String], words: usize) -> String {
    (0..words)
        .map(|_| vocabulary[rng.skewed(vocabulary.len())].as_str())
        .collect::<Vec<_>>()
        .join(" ")
}

/// Write `count` notes of 100-300 words into `dir`.
fn generate(dir: &Path, count: usize, vocabulary: &[String]) {
    fs::create_dir_all(dir).unwrap();
    let mut rng = Rng(0x5eed_0000 ^ count as u64);
    for i in 0..count {
        let date = format!(
            "{}-{:02}-{:02}",
            2019 + rng.below(8),
            1 + rng.below(12),
            1 + rng.below(28)
        );
        let machine = format!("machine-{}", rng.below(50));
        let words = 100 + rng.below(201);
        let text = format!(
            "---\ndate: {date}\nmachine: {machine}\ntitle: {}\nsymptoms: [{}]\ncause: {}\nfix: {}\ndowntime: {} min\n\
             readings:\n  supply: {} bar\ntech: XX\n---\n\n{}\n",
            sentence(&mut rng, vocabulary, 6),
            SYMPTOM_IDS[rng.below(SYMPTOM_IDS.len())],
            CAUSE_IDS[rng.below(CAUSE_IDS.len())],
            sentence(&mut rng, vocabulary, 12),
            10 + rng.below(600),
            50 + rng.below(150),
            sentence(&mut rng, vocabulary, words - 18),
        );
        fs::write(dir.join(format!("note-{i:06}.md")), text).unwrap();
    }
}

fn percentile(samples: &mut [Duration], p: f64) -> Duration {
    samples.sort();
    let rank = ((samples.len() - 1) as f64 * p).round() as usize;
    samples[rank]
}

fn ms(d: Duration) -> String {
    format!("{:.2} ms", d.as_secs_f64() * 1000.0)
}

/// Peak resident memory (kB) of the binary doing a full build, via `time -v`.
fn peak_memory_of_build(binary: &Path, notes: &Path, index: &Path) -> Option<u64> {
    let output = Command::new("/usr/bin/time")
        .arg("-v")
        .arg(binary)
        .args(["cases", "search", "zzzz", "--cases"])
        .arg(notes)
        .arg("--index-dir")
        .arg(index)
        .output()
        .ok()?;
    let stderr = String::from_utf8_lossy(&output.stderr);
    stderr.lines().find_map(|l| {
        l.trim()
            .strip_prefix("Maximum resident set size (kbytes): ")?
            .parse()
            .ok()
    })
}

fn vm_hwm_kb() -> Option<u64> {
    let status = fs::read_to_string("/proc/self/status").ok()?;
    status.lines().find_map(|l| {
        l.strip_prefix("VmHWM:")?
            .trim()
            .strip_suffix(" kB")?
            .trim()
            .parse()
            .ok()
    })
}

fn run(count: usize, root: &Path, binary: &Path) {
    let mut rng = Rng(42);
    let vocabulary = vocabulary(&mut rng, 20_000);
    let notes = root.join(format!("notes-{count}"));
    let started = Instant::now();
    generate(&notes, count, &vocabulary);
    println!(
        "\n## {count} notes (generated in {:.1} s)",
        started.elapsed().as_secs_f64()
    );

    // Full build through the library.
    let index_dir = root.join(format!("index-{count}"));
    let started = Instant::now();
    let (mut index, report) = NoteIndex::open(
        NotesFolder::Disk(notes.clone()),
        &IndexLocation::Dir(index_dir.clone()),
    )
    .unwrap();
    let build = started.elapsed();
    assert_eq!(report.added, count);
    println!(
        "| full index build (library) | {:.2} s | {:.0} notes/s |",
        build.as_secs_f64(),
        count as f64 / build.as_secs_f64()
    );
    println!(
        "| process VmHWM after build (includes generator) | {} MB | |",
        vm_hwm_kb().unwrap_or(0) / 1024
    );

    // Queries: words of middling frequency, so both tools have work to do.
    let queries: Vec<String> = (0..20).map(|i| vocabulary[50 + i * 37].clone()).collect();
    let mut library = Vec::new();
    for _ in 0..10 {
        for query in &queries {
            let started = Instant::now();
            let results = search(&mut index, &SearchRequest::new(query.clone())).unwrap();
            library.push(started.elapsed());
            assert!(!results.hits.is_empty());
        }
    }
    let library_p50 = percentile(&mut library, 0.5);
    println!(
        "| query via library, p50 / p95 | {} / {} | 10 hits with snippets |",
        ms(library_p50),
        ms(percentile(&mut library, 0.95))
    );
    drop(index);

    let mut cli = cli_searches(binary, &notes, &index_dir, &queries);
    let cli_p50 = percentile(&mut cli, 0.5);
    println!("| query via CLI binary (warm), p50 / p95 | {} / {} | includes checking all {count} files for changes |", ms(cli_p50), ms(percentile(&mut cli, 0.95)));
    breakdown(binary, &notes, &index_dir, &queries);

    let mut grep = Vec::new();
    for query in queries.iter().take(5) {
        for _ in 0..2 {
            let started = Instant::now();
            let output = Command::new("grep")
                .arg("-ril")
                .arg(query)
                .arg(&notes)
                .output()
                .unwrap();
            grep.push(started.elapsed());
            assert!(!output.stdout.is_empty());
        }
    }
    let grep_p50 = percentile(&mut grep, 0.5);
    println!(
        "| grep -ril (warm), p50 | {} | library {:.0}x, CLI {:.1}x faster |",
        ms(grep_p50),
        grep_p50.as_secs_f64() / library_p50.as_secs_f64(),
        grep_p50.as_secs_f64() / cli_p50.as_secs_f64()
    );

    // Update one note among all, through the library (sync on open).
    let mut updates = Vec::new();
    for i in 0..5 {
        let path = notes.join(format!("note-{:06}.md", i * 7919 % count));
        let mut text = fs::read_to_string(&path).unwrap();
        text.push_str(&format!("\nEdited again, pass {i}.\n"));
        fs::write(&path, text).unwrap();
        let started = Instant::now();
        let (_, report) = NoteIndex::open(
            NotesFolder::Disk(notes.clone()),
            &IndexLocation::Dir(index_dir.clone()),
        )
        .unwrap();
        updates.push(started.elapsed());
        assert_eq!(report.updated, 1);
    }
    let update = percentile(&mut updates, 0.5);
    println!(
        "| update one note (open + sync), p50 | {} | {:.0}x cheaper than the full build |",
        ms(update),
        build.as_secs_f64() / update.as_secs_f64()
    );

    watched(binary, &notes, &index_dir, &queries, grep_p50, build);

    let fresh = root.join(format!("index-{count}-cli"));
    if let Some(kb) = peak_memory_of_build(binary, &notes, &fresh) {
        println!(
            "| peak RSS of a full build by the CLI (time -v) | {} MB | |",
            kb / 1024
        );
    }
    let size: u64 = fs::read_dir(&index_dir)
        .unwrap()
        .filter_map(|e| e.ok()?.metadata().ok())
        .map(|m| m.len())
        .sum();
    let text: u64 = fs::read_dir(&notes)
        .unwrap()
        .filter_map(|e| e.ok()?.metadata().ok())
        .map(|m| m.len())
        .sum();
    println!(
        "| notes / index size on disk | {} MB / {} MB | |",
        text / 1_000_000,
        size / 1_000_000
    );
}

/// The same searches and one-note updates with `cases watch` running, so
/// that searches ask the watcher instead of checking every note file.
fn watched(
    binary: &Path,
    notes: &Path,
    index_dir: &Path,
    queries: &[String],
    grep_p50: Duration,
    build: Duration,
) {
    use std::io::{BufRead, BufReader};

    let started = Instant::now();
    let mut watcher = Command::new(binary)
        .args(["cases", "--cases"])
        .arg(notes)
        .arg("--index-dir")
        .arg(index_dir)
        .arg("watch")
        .stderr(std::process::Stdio::piped())
        .spawn()
        .unwrap();
    let mut lines = BufReader::new(watcher.stderr.take().unwrap()).lines();
    loop {
        let line = lines.next().unwrap().unwrap();
        if line.starts_with("searches of these notes ask this watcher") {
            break;
        }
    }
    println!(
        "| watcher start (index check, watch, its first sync) | {} | |",
        ms(started.elapsed())
    );

    let folder = NotesFolder::Disk(notes.to_path_buf());
    let location = IndexLocation::Dir(index_dir.to_path_buf());
    let ask = p50_of(50, || {
        let reply = ask_watcher(notes, index_dir, WatchCursor::load(index_dir));
        assert!(reply.is_some());
    });
    println!(
        "| breakdown with watcher: ask the watcher (connect, marker, answer) | {} | p50 |",
        ms(ask)
    );
    let open = p50_of(20, || {
        NoteIndex::open(folder.clone(), &location).unwrap();
    });
    println!(
        "| breakdown with watcher: whole open with freshness check | {} | p50 |",
        ms(open)
    );

    let mut cli = cli_searches(binary, notes, index_dir, queries);
    let cli_p50 = percentile(&mut cli, 0.5);
    println!(
        "| query via CLI binary with watcher (warm), p50 / p95 | {} / {} | {:.0}x faster than grep |",
        ms(cli_p50),
        ms(percentile(&mut cli, 0.95)),
        grep_p50.as_secs_f64() / cli_p50.as_secs_f64()
    );

    let count = fs::read_dir(notes).unwrap().count();
    let mut updates = Vec::new();
    let mut searches = Vec::new();
    for i in 0..5 {
        let path = notes.join(format!("note-{:06}.md", (i * 7919 + 13) % count));
        let mut text = fs::read_to_string(&path).unwrap();
        text.push_str(&format!("\nEdited with the watcher, pass {i}.\n"));
        fs::write(&path, text).unwrap();
        let started = Instant::now();
        let (_, report) = NoteIndex::open(folder.clone(), &location).unwrap();
        updates.push(started.elapsed());
        assert_eq!(report.updated, 1);
        // And the same through the binary: an edit, then a search.
        let path = notes.join(format!("note-{:06}.md", (i * 7919 + 29) % count));
        let mut text = fs::read_to_string(&path).unwrap();
        text.push_str(&format!("\nEdited before a search, pass {i}.\n"));
        fs::write(&path, text).unwrap();
        searches.push(cli_search(binary, notes, index_dir, &queries[0]));
    }
    let update = percentile(&mut updates, 0.5);
    println!(
        "| update one note with watcher (open + sync), p50 | {} | {:.0}x cheaper than the full build |",
        ms(update),
        build.as_secs_f64() / update.as_secs_f64()
    );
    println!(
        "| CLI search just after a one-note edit, with watcher, p50 | {} | |",
        ms(percentile(&mut searches, 0.5))
    );
    let status = fs::read_to_string(format!("/proc/{}/status", watcher.id())).unwrap_or_default();
    if let Some(hwm) = status.lines().find(|l| l.starts_with("VmHWM:")) {
        println!(
            "| watcher peak RSS | {} MB | |",
            hwm.split_whitespace()
                .nth(1)
                .and_then(|kb| kb.parse::<u64>().ok())
                .unwrap_or(0)
                / 1024
        );
    }
    Command::new("kill")
        .arg("-TERM")
        .arg(watcher.id().to_string())
        .status()
        .unwrap();
    assert!(watcher.wait().unwrap().success());
}

/// The time of one search through the binary, as a user runs it.
fn cli_search(binary: &Path, notes: &Path, index_dir: &Path, query: &str) -> Duration {
    let started = Instant::now();
    let status = Command::new(binary)
        .args(["cases", "search", query, "--cases"])
        .arg(notes)
        .arg("--index-dir")
        .arg(index_dir)
        .stdout(std::process::Stdio::null())
        .status()
        .unwrap();
    let elapsed = started.elapsed();
    assert!(status.success());
    elapsed
}

/// Each query searched three times through the binary.
fn cli_searches(
    binary: &Path,
    notes: &Path,
    index_dir: &Path,
    queries: &[String],
) -> Vec<Duration> {
    queries
        .iter()
        .flat_map(|query| (0..3).map(move |_| cli_search(binary, notes, index_dir, query)))
        .collect()
}

/// p50 of `runs` timings of `job`.
fn p50_of(runs: usize, mut job: impl FnMut()) -> Duration {
    let mut samples: Vec<Duration> = (0..runs)
        .map(|_| {
            let started = Instant::now();
            job();
            started.elapsed()
        })
        .collect();
    percentile(&mut samples, 0.5)
}

/// Where the time of one CLI search goes, phase by phase (each p50, warm),
/// through the same library calls the binary makes.
fn breakdown(binary: &Path, notes: &Path, index_dir: &Path, queries: &[String]) {
    let folder = NotesFolder::Disk(notes.to_path_buf());
    let row = |what: &str, d: Duration| println!("| breakdown: {what} | {} | p50 |", ms(d));
    row(
        "process start + exit (`--version`)",
        p50_of(20, || {
            let status = Command::new(binary).arg("--version").output().unwrap();
            assert!(status.status.success());
        }),
    );
    row(
        "list notes with size and time",
        p50_of(10, || assert!(!folder.scan().unwrap().is_empty())),
    );
    row(
        "read + parse manifest",
        p50_of(10, || {
            let bytes = read_manifest_bytes(index_dir).unwrap();
            assert!(!ManifestView::parse(&bytes).unwrap().notes.is_empty());
        }),
    );
    row(
        "open index (mmap)",
        p50_of(20, || drop(Index::open_in_dir(index_dir).unwrap())),
    );
    let index = Index::open_in_dir(index_dir).unwrap();
    row(
        "register analyzers",
        p50_of(20, || register_index_analyzers(&index)),
    );
    row(
        "open reader",
        p50_of(20, || {
            let reader = index
                .reader_builder()
                .reload_policy(ReloadPolicy::Manual)
                .try_into()
                .unwrap();
            drop::<tantivy::IndexReader>(reader);
        }),
    );
    row(
        "whole open + freshness check (NoteIndex::open)",
        p50_of(10, || {
            let (_, report) =
                NoteIndex::open(folder.clone(), &IndexLocation::Dir(index_dir.to_path_buf()))
                    .unwrap();
            assert_eq!(report.added + report.updated + report.removed, 0);
        }),
    );
    let (mut note_index, _) =
        NoteIndex::open(folder.clone(), &IndexLocation::Dir(index_dir.to_path_buf())).unwrap();
    let mut i = 0;
    row(
        "query alone (parse, typo check, top 10 + count)",
        p50_of(queries.len() * 3, || {
            let searcher = note_index.searcher();
            let request = SearchRequest::new(queries[i % queries.len()].clone());
            i += 1;
            let built = QueryBuilder::new(&searcher, note_index.schema())
                .build(&request)
                .unwrap();
            let (top, _) = searcher
                .search(
                    &built.query,
                    &(TopDocs::with_limit(10).order_by_score(), Count),
                )
                .unwrap();
            assert!(!top.is_empty());
        }),
    );
    row(
        "query + stored notes + snippets (search)",
        p50_of(queries.len() * 3, || {
            let request = SearchRequest::new(queries[i % queries.len()].clone());
            i += 1;
            assert!(!search(&mut note_index, &request).unwrap().hits.is_empty());
        }),
    );
    let results = search(&mut note_index, &SearchRequest::new(queries[0].clone())).unwrap();
    row(
        "table rendering",
        p50_of(20, || {
            assert!(!render_results(
                &results,
                false,
                spoolsleuth::search::HighlightStyle::Markers
            )
            .is_empty())
        }),
    );
}

fn main() {
    // `cargo bench` passes `--bench`; a filter argument is not used here.
    let sizes: Vec<usize> = std::env::var("SPOOLSLEUTH_BENCH_SIZES")
        .unwrap_or_else(|_| "10000,100000".into())
        .split(',')
        .filter_map(|s| s.trim().parse().ok())
        .collect();
    let binary = PathBuf::from(env!("CARGO_BIN_EXE_spoolsleuth"));
    // `SPOOLSLEUTH_BENCH_DIR=DIR` keeps the notes and indexes in DIR for
    // profiling afterwards; by default they go to a temporary folder.
    let temporary = tempfile::tempdir().unwrap();
    let root = std::env::var_os("SPOOLSLEUTH_BENCH_DIR")
        .map_or_else(|| temporary.path().to_path_buf(), PathBuf::from);
    fs::create_dir_all(&root).unwrap();
    assert!(
        fs::read_dir(&root).unwrap().next().is_none(),
        "{}: the benchmark needs an empty folder",
        root.display()
    );
    for count in sizes {
        run(count, &root, &binary);
    }
}

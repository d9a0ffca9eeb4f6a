//! Witness output: the colouring in ramsift's text format, the colour-1 graph in
//! graph6 (two colours only), and the JSON summary of a run.
//!
//! The colouring format (read back by `ramsift-check colouring`):
//!
//! ```text
//! # comment lines
//! ramsift-colouring spec=4,4 order=17
//! . 1 2 …     (row i: colour of edge {i, j} for each j; '.' on the diagonal)
//! ```

use std::io;
use std::path::{Path, PathBuf};

use serde::Serialize;

use ramsift_encoder::atomic_file::{ensure_dir, write_atomically};
use ramsift_encoder::{Colouring, Instance};

use crate::output::graph6::encode_graph6;

/// File names written into an output directory.
pub const COLOURING_FILE: &str = "witness.colouring";
pub const GRAPH6_FILE: &str = "witness-colour1.g6";
pub const SUMMARY_FILE: &str = "summary.json";
/// The keyword that starts a colouring file's header.
pub const COLOURING_MAGIC: &str = "ramsift-colouring";

/// The colouring in ramsift's text format.
pub fn colouring_text(instance: &Instance, colouring: &Colouring, comments: &[String]) -> String {
    let n = colouring.order();
    let mut text = String::new();
    for line in comments {
        text.push_str("# ");
        text.push_str(line);
        text.push('\n');
    }
    text.push_str(&format!(
        "{COLOURING_MAGIC} spec={} order={}\n",
        instance.spec(),
        n
    ));
    for i in 0..n {
        let row: Vec<String> = (0..n)
            .map(|j| {
                if i == j {
                    ".".to_string()
                } else {
                    colouring.colour(i, j).to_string()
                }
            })
            .collect();
        text.push_str(&row.join(" "));
        text.push('\n');
    }
    text
}

/// The graph of colour-1 edges in graph6.
pub fn colour_one_graph6(colouring: &Colouring) -> String {
    encode_graph6(colouring.order(), |i, j| colouring.colour(i, j) == 1)
}

/// The machine-readable account of a `find` run.
#[derive(Clone, Debug, Serialize)]
pub struct FindSummary {
    pub instance: String,
    pub spec: String,
    pub order: usize,
    /// "found", "none" or "unknown".
    pub result: String,
    /// What the result proves, in the literature's notation.
    pub proves: Option<String>,
    pub exit_code: u8,
    pub seconds: f64,
    pub attempts: u64,
    pub threads: usize,
    pub seed: u64,
    /// The search method (`auto`, `sat`, `circulant`, …).
    pub method: String,
    pub solver: String,
    pub found_by: Option<String>,
    pub verified_by_checker: bool,
    pub graph6_colour1: Option<String>,
    /// The colouring found, as matrix rows: entry j of row i is the colour of
    /// edge {i,j} (1..r), 0 on the diagonal.
    pub colouring: Option<Vec<Vec<u8>>>,
    pub files: Vec<PathBuf>,
}

/// A colouring as matrix rows (0 on the diagonal), for JSON output.
pub fn colouring_rows(colouring: &Colouring) -> Vec<Vec<u8>> {
    let n = colouring.order();
    (0..n)
        .map(|i| {
            (0..n)
                .map(|j| if i == j { 0 } else { colouring.colour(i, j) })
                .collect()
        })
        .collect()
}

/// Splits a stream of colouring files (as `enumerate` writes for three or more
/// colours) into one text per colouring; each starts at its header line, and
/// comment lines go with the colouring they precede.
pub fn split_colouring_stream(text: &str) -> Vec<String> {
    let mut parts: Vec<String> = Vec::new();
    let mut current = String::new();
    let mut has_header = false;
    for line in text.lines() {
        if line.trim_start().starts_with(COLOURING_MAGIC) {
            if has_header {
                parts.push(std::mem::take(&mut current));
            }
            has_header = true;
        }
        current.push_str(line);
        current.push('\n');
    }
    if has_header {
        parts.push(current);
    }
    parts
}

/// Writes the witness files (and, when given, the summary) into `dir`.
/// Returns the paths written. Every file is written atomically.
pub fn write_witness_files(
    dir: &Path,
    instance: &Instance,
    colouring: &Colouring,
    comments: &[String],
) -> io::Result<Vec<PathBuf>> {
    ensure_dir(dir)?;
    let mut written = Vec::new();
    let path = dir.join(COLOURING_FILE);
    let text = colouring_text(instance, colouring, comments);
    write_atomically(&path, |w| w.write_all(text.as_bytes()))?;
    written.push(path);
    if instance.colours() == 2 {
        let path = dir.join(GRAPH6_FILE);
        let line = colour_one_graph6(colouring) + "\n";
        write_atomically(&path, |w| w.write_all(line.as_bytes()))?;
        written.push(path);
    }
    Ok(written)
}

/// Writes the summary JSON into `dir`.
pub fn write_summary(dir: &Path, summary: &FindSummary) -> io::Result<PathBuf> {
    ensure_dir(dir)?;
    let path = dir.join(SUMMARY_FILE);
    let json = serde_json::to_string_pretty(summary).map_err(io::Error::other)?;
    write_atomically(&path, |w| {
        w.write_all(json.as_bytes())
            .and_then(|_| w.write_all(b"\n"))
    })?;
    Ok(path)
}

impl FindSummary {
    /// The summary of a finished search (files are added by the caller).
    pub fn of_search(
        instance: &Instance,
        report: &crate::search::portfolio::SearchReport,
        seed: u64,
    ) -> Self {
        use crate::exit_codes;
        use crate::search::portfolio::SearchResult;
        let spec = instance.spec().to_string();
        let n = instance.order();
        let (result, proves, exit_code, found_by, graph6) = match &report.result {
            SearchResult::Found {
                colouring,
                found_by,
            } => (
                "found",
                Some(format!("R({spec}) > {n}")),
                exit_codes::FOUND,
                Some(found_by.clone()),
                (instance.colours() == 2).then(|| colour_one_graph6(colouring)),
            ),
            SearchResult::NoneExists => (
                "none",
                Some(format!(
                    "R({spec}) <= {n} (uncertified: run `ramsift refute` for a proof)"
                )),
                exit_codes::NONE_EXISTS,
                None,
                None,
            ),
            SearchResult::Unknown => ("unknown", None, exit_codes::UNKNOWN, None, None),
        };
        FindSummary {
            instance: instance.to_string(),
            spec,
            order: n,
            result: result.to_string(),
            proves,
            exit_code,
            seconds: report.elapsed.as_secs_f64(),
            attempts: report.attempts,
            threads: report.threads,
            seed,
            method: "sat".to_string(),
            solver: crate::SOLVER_NAME.to_string(),
            found_by,
            verified_by_checker: matches!(report.result, SearchResult::Found { .. }),
            graph6_colour1: graph6,
            colouring: match &report.result {
                SearchResult::Found { colouring, .. } => Some(colouring_rows(colouring)),
                _ => None,
            },
            files: Vec::new(),
        }
    }
}

//! Every `--json` record of the `ramsift` commands, as typed structures in one
//! place. A record is printed as one object with its keys in alphabetical order,
//! plus `result` (a word) and `exit_code` (the process's exit code); see the
//! binary's `print_record`. Numbers are numbers, times are `seconds`, and a
//! colouring is given as matrix rows ([`colouring_rows`]).

use std::path::PathBuf;

use serde::Serialize;

use ramsift_encoder::{Colouring, Instance};

use super::graph6::colour_one_graph6;
use crate::bounds::certified::Certificate;
use crate::exit_codes;
use crate::search::job::{SearchReport, SearchResult};
use crate::shard::plan::Cube;
use crate::structured::ScanVerdict;

/// A colouring as matrix rows: entry j of row i is the colour of edge {i,j}
/// (1..r), 0 on the diagonal.
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

/// What a `find` run established.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum FindResult {
    /// A checked colouring: a lower bound.
    Found,
    /// No colouring exists (uncertified: `refute` gives the proof).
    None,
    /// The families searched (or the colouring extended) have none; nothing is
    /// said about other colourings.
    NoneInFamily,
    /// No answer within the limits.
    Unknown,
}

impl FindResult {
    /// The word in JSON output.
    pub fn word(self) -> &'static str {
        match self {
            FindResult::Found => "found",
            FindResult::None => "none",
            FindResult::NoneInFamily => "none-in-family",
            FindResult::Unknown => "unknown",
        }
    }
}

/// The machine-readable account of a `find` run (also its summary.json).
#[derive(Clone, Debug, Serialize)]
pub struct FindSummary {
    pub instance: String,
    pub spec: String,
    pub order: usize,
    pub result: FindResult,
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
    /// The colouring found, as matrix rows ([`colouring_rows`]).
    pub colouring: Option<Vec<Vec<u8>>>,
    pub files: Vec<PathBuf>,
    /// The command, version, revision, date and machine of the run.
    pub provenance: crate::certify::provenance::Provenance,
}

impl FindSummary {
    /// The summary of a finished search (method, solver and files are set by the caller).
    pub fn of_search(instance: &Instance, report: &SearchReport, seed: u64) -> Self {
        let spec = instance.spec().to_string();
        let n = instance.order();
        let (result, proves, exit_code) = match &report.result {
            SearchResult::Found { .. } => (
                FindResult::Found,
                Some(format!("R({spec}) > {n}")),
                exit_codes::FOUND,
            ),
            SearchResult::NoneExists => (
                FindResult::None,
                Some(format!(
                    "R({spec}) <= {n} (uncertified: run `ramsift refute` for a proof)"
                )),
                exit_codes::NONE_EXISTS,
            ),
            SearchResult::Unknown => (FindResult::Unknown, None, exit_codes::UNKNOWN),
        };
        let found = match &report.result {
            SearchResult::Found {
                colouring,
                found_by,
            } => Some((colouring, found_by)),
            _ => None,
        };
        FindSummary {
            instance: instance.to_string(),
            spec,
            order: n,
            result,
            proves,
            exit_code,
            seconds: report.elapsed.as_secs_f64(),
            attempts: report.attempts,
            threads: report.threads,
            seed,
            method: "sat".to_string(),
            solver: crate::SOLVER_NAME.to_string(),
            found_by: found.map(|(_, by)| by.clone()),
            verified_by_checker: found.is_some(),
            graph6_colour1: found
                .filter(|_| instance.colours() == 2)
                .map(|(c, _)| colour_one_graph6(c)),
            colouring: found.map(|(c, _)| colouring_rows(c)),
            files: Vec::new(),
            provenance: crate::certify::provenance::Provenance::of_this_run(),
        }
    }
}

/// One family at one order of a `scan`.
#[derive(Serialize)]
pub struct ScanFamilyRow {
    pub family: String,
    pub result: ScanVerdict,
    pub orbits: usize,
    pub clauses: usize,
    pub seconds: f64,
    /// How the family describes its colouring (distances, differences).
    pub description: Option<String>,
    /// The colouring found, as matrix rows.
    pub colouring: Option<Vec<Vec<u8>>>,
}

/// One order of a `scan`.
#[derive(Serialize)]
pub struct ScanOrderRow {
    pub order: usize,
    pub result: ScanVerdict,
    pub seconds: f64,
    pub families: Vec<ScanFamilyRow>,
}

/// A `scan` run (also its summary.json).
#[derive(Serialize)]
pub struct ScanSummary {
    pub spec: String,
    pub family: String,
    pub from: usize,
    pub to: usize,
    pub orders: Vec<ScanOrderRow>,
    pub largest_found: Option<usize>,
    pub proves: Option<String>,
    pub seconds: f64,
    pub files: Vec<PathBuf>,
}

/// An `encode` run.
#[derive(Serialize)]
pub struct EncodeRecord {
    pub instance: String,
    pub file: PathBuf,
    pub variables: usize,
    pub clauses: u64,
    pub bytes_uncompressed: u64,
    pub seconds: f64,
}

/// An `enumerate` run.
#[derive(Serialize)]
pub struct EnumerateRecord {
    pub instance: String,
    pub classes: usize,
    pub labelled_models_enumerated: u64,
    pub up_to: &'static str,
    pub symmetry: String,
    pub seconds: f64,
    pub complete: bool,
    pub file: Option<PathBuf>,
    /// Every class's colouring, as matrix rows.
    pub colourings: Vec<Vec<Vec<u8>>>,
}

/// One line of the `bounds` report.
#[derive(Serialize)]
pub struct BoundsRow {
    pub bound: &'static str,
    /// "R > n" or "R <= n".
    pub kind: &'static str,
    /// A number (a decimal string only beyond 2^64); a published range is [lower, upper].
    pub value: Option<serde_json::Value>,
    pub source: String,
}

/// The `bounds` report.
#[derive(Serialize)]
pub struct BoundsRecord {
    pub spec: String,
    pub rows: Vec<BoundsRow>,
    pub certified: Vec<Certificate>,
}

/// One instance of the `demo`.
#[derive(Serialize)]
pub struct DemoRow {
    pub instance: String,
    pub answer: String,
    pub seconds: f64,
    pub checked: String,
    pub meaning: String,
    pub as_expected: bool,
}

/// The `demo`.
#[derive(Serialize)]
pub struct DemoRecord {
    pub rows: Vec<DemoRow>,
}

/// A `draw` run that wrote a figure.
#[derive(Serialize)]
pub struct DrawRecord {
    pub figure: PathBuf,
    pub order: usize,
    pub colours: usize,
    pub title: String,
}

/// A `refute` run that wrote a bundle.
#[derive(Serialize)]
pub struct RefutedRecord {
    pub instance: String,
    pub proves: String,
    pub bundle: PathBuf,
    pub symmetry: Vec<String>,
    pub premises: Vec<String>,
    pub seconds: f64,
    pub proof_bytes: u64,
    pub files: Vec<PathBuf>,
    /// The SHA-256 of manifest.json: the bundle's fingerprint.
    pub manifest_sha256: String,
    /// With minimality: the hooked search's counters.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub search: Option<crate::certify::refute::SearchAccount>,
}

/// A `refute` run that found a colouring instead.
#[derive(Serialize)]
pub struct RefuteFoundRecord {
    pub instance: String,
    pub proves: String,
    pub colouring: Vec<Vec<u8>>,
    pub files: Vec<PathBuf>,
    pub seconds: f64,
}

/// A run that ended without an answer.
#[derive(Serialize)]
pub struct UnknownRecord {
    pub instance: String,
    pub seconds: f64,
}

/// `shard plan`.
#[derive(Serialize)]
pub struct ShardPlanRecord {
    pub instance: String,
    pub plan: PathBuf,
    pub shards: usize,
    pub symmetry: String,
    pub cubes: Vec<Cube>,
}

/// `shard run INDEX`.
#[derive(Serialize)]
pub struct ShardRunRecord {
    pub shard: usize,
    pub witness: Option<PathBuf>,
    pub colouring: Option<Vec<Vec<u8>>>,
}

/// `shard run` of every pending shard on this machine.
#[derive(Serialize)]
pub struct ShardLocalRecord {
    pub ran: usize,
    pub already_done: usize,
    pub threads: usize,
    pub found: Vec<usize>,
    pub witnesses: Vec<PathBuf>,
    pub colourings: Vec<Vec<Vec<u8>>>,
}

/// `shard status`.
#[derive(Serialize)]
pub struct ShardStatusRecord {
    pub shards: usize,
    pub done: usize,
    pub found: Vec<usize>,
    pub damaged: Vec<usize>,
    pub missing: Vec<usize>,
    pub partial: Vec<usize>,
    pub resubmit_array: String,
}

/// `shard merge`.
#[derive(Serialize)]
pub struct ShardMergeRecord {
    pub proves: String,
    pub bundle: PathBuf,
    pub seconds: f64,
    pub trace_bytes: u64,
    pub composed_trace: Option<PathBuf>,
    pub files: Vec<PathBuf>,
    /// The SHA-256 of manifest.json: the bundle's fingerprint.
    pub manifest_sha256: String,
}

/// Any command that failed, under `--json`.
#[derive(Serialize)]
pub struct ErrorRecord {
    pub error: String,
}

//! The search job: what every search function is given. It carries the instance
//! (specification and order) and the symmetry breaking its formula uses, the
//! options the run honours and the counters a caller may show while it runs, so
//! that the order n has one home from the command line to the clause generator.

use std::sync::atomic::{AtomicU64, Ordering};
use std::time::{Duration, Instant};

use thiserror::Error;

use ramsift_encoder::{Colouring, Instance, RamseySpec, SymmetrySet};

use super::attempt::AttemptError;
use super::formula::Formula;

/// How the search is run.
#[derive(Clone, Debug)]
pub struct SearchOptions {
    pub threads: usize,
    pub seed: u64,
    pub timeout: Option<Duration>,
    /// Proof bytes of the first seeded attempt; later ones follow the Luby sequence.
    pub base_budget_bytes: u64,
}

impl Default for SearchOptions {
    fn default() -> Self {
        SearchOptions {
            threads: std::thread::available_parallelism().map_or(1, |n| n.get()),
            seed: 0,
            timeout: None,
            base_budget_bytes: 256 * 1024,
        }
    }
}

/// Counters a caller may show while the search runs.
#[derive(Debug, Default)]
pub struct SearchProgress {
    pub attempts: AtomicU64,
    pub proof_bytes: AtomicU64,
}

/// One search: the question, how to run it, and its counters.
#[derive(Debug)]
pub struct SearchJob {
    pub instance: Instance,
    /// The symmetry breaking of the formula the SAT workers solve.
    pub symmetry: SymmetrySet,
    pub options: SearchOptions,
    pub progress: SearchProgress,
}

impl SearchJob {
    pub fn new(instance: Instance, symmetry: SymmetrySet, options: SearchOptions) -> Self {
        SearchJob {
            instance,
            symmetry,
            options,
            progress: SearchProgress::default(),
        }
    }

    pub fn spec(&self) -> &RamseySpec {
        self.instance.spec()
    }

    pub fn order(&self) -> usize {
        self.instance.order()
    }

    /// Worker threads, at least one.
    pub fn threads(&self) -> usize {
        self.options.threads.max(1)
    }

    /// The end of the run for a search started at `started` (None: no timeout).
    pub fn deadline_from(&self, started: Instant) -> Option<Instant> {
        self.options.timeout.map(|t| started + t)
    }

    /// Checks that `formula` encodes this job's instance with its symmetry breaking.
    pub fn check_formula(&self, formula: &Formula) -> Result<(), SearchError> {
        if formula.instance() == &self.instance && formula.symmetry() == &self.symmetry {
            Ok(())
        } else {
            Err(SearchError::FormulaMismatch {
                job: format!("{} ({})", self.instance, self.symmetry),
                formula: format!("{} ({})", formula.instance(), formula.symmetry()),
            })
        }
    }

    /// The report of a search started at `started` that ended with `result`.
    pub fn report(&self, result: SearchResult, started: Instant) -> SearchReport {
        SearchReport {
            result,
            attempts: self.progress.attempts.load(Ordering::SeqCst),
            elapsed: started.elapsed(),
            threads: self.threads(),
        }
    }

    /// Counts one solver attempt and the proof bytes it wrote.
    pub fn count_attempt(&self, proof_bytes: u64) {
        self.progress.attempts.fetch_add(1, Ordering::Relaxed);
        self.progress
            .proof_bytes
            .fetch_add(proof_bytes, Ordering::Relaxed);
    }
}

/// The answer of a search.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum SearchResult {
    /// A verified colouring; `found_by` says which worker and attempt.
    Found {
        colouring: Colouring,
        found_by: String,
    },
    /// The complete worker proved that no colouring exists.
    NoneExists,
    /// The run ended (timeout) without an answer.
    Unknown,
}

/// The answer and what it cost.
#[derive(Clone, Debug)]
pub struct SearchReport {
    pub result: SearchResult,
    pub attempts: u64,
    pub elapsed: Duration,
    pub threads: usize,
}

#[derive(Debug, Error)]
pub enum SearchError {
    #[error(transparent)]
    Attempt(#[from] AttemptError),
    #[error("internal error: the solver's colouring failed the independent check ({0}); please report this")]
    WitnessRejected(String),
    #[error("the solver backend failed: {0}")]
    Backend(String),
    #[error("cannot start {threads} worker threads: {message}")]
    Threads { threads: usize, message: String },
    #[error("internal error: the search job is {job} but its formula encodes {formula}")]
    FormulaMismatch { job: String, formula: String },
    #[error("extension adds one vertex: a colouring of K_{given} cannot become one of K_{order}")]
    ExtensionOrder { given: usize, order: usize },
    #[error(transparent)]
    Spec(#[from] ramsift_encoder::SpecError),
    #[error(transparent)]
    Encode(#[from] ramsift_encoder::clauses::EncodeError),
    #[error(transparent)]
    Family(#[from] crate::structured::FamilyError),
    #[error("local search handles orders 2 to {max}; {order} is outside")]
    LocalOrder { order: usize, max: usize },
    #[error("with an automorphism, local search runs tabu or focused moves over edge orbits; {rule} is not available")]
    AutomorphismRule { rule: String },
}

//! The parallel search: one complete worker and, on every other thread, seeded workers.
//!
//! * Worker 0 solves the formula as given, with no seed and no budget, until it
//!   answers or the run ends. Its "unsatisfiable" means no colouring exists.
//! * Every other worker loops: draw a seed ([`crate::search::seeding`]) and a random
//!   renaming and clause order, solve under a proof-byte budget that follows the
//!   Luby sequence, and start over when the budget runs out or the seed fails.
//!
//! The first colouring found is verified by the checker's code and reported; all
//! workers are then stopped. Worker w's attempts are drawn from a ChaCha8 stream
//! seeded with (seed, w), so a run with the same `--seed` and `--threads` repeats
//! the same attempts; with one thread the whole run is reproducible.

use std::io;
use std::sync::atomic::{AtomicBool, AtomicU64, Ordering};
use std::sync::{mpsc, Mutex};
use std::time::{Duration, Instant};

use rand::SeedableRng;
use rand_chacha::ChaCha8Rng;
use thiserror::Error;

use ramsift_encoder::{Colouring, RamseySpec};

use crate::certify::witness_check::verify_witness;
use crate::search::attempt::{run_attempt, AttemptError, AttemptOutcome, AttemptPlan};
use crate::search::formula::Formula;
use crate::search::seeding::draw_seed;

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

/// Counters a caller may show while the search runs.
#[derive(Debug, Default)]
pub struct SearchProgress {
    pub attempts: AtomicU64,
    pub proof_bytes: AtomicU64,
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
}

/// The Luby sequence 1, 1, 2, 1, 1, 2, 4, 1, … (index from 1).
pub fn luby(mut index: u64) -> u64 {
    let mut size = 1u64;
    let mut power = 1u64;
    while size < index {
        power *= 2;
        size = 2 * size + 1;
    }
    while size != index {
        size = (size - 1) / 2;
        power /= 2;
        if index > size {
            index -= size;
        }
    }
    power
}

/// The first answer of several workers: the first one kept, and the stop flag
/// raised for the rest.
#[derive(Debug, Default)]
pub(crate) struct FirstAnswer {
    slot: Mutex<Option<Result<SearchResult, SearchError>>>,
    pub stop: AtomicBool,
}

impl FirstAnswer {
    /// Keeps `value` if it is the first, and stops every worker.
    pub fn settle(&self, value: Result<SearchResult, SearchError>) {
        let mut slot = self.slot.lock().expect("answer lock");
        if slot.is_none() {
            *slot = Some(value);
        }
        self.stop.store(true, Ordering::SeqCst);
    }

    /// A worker's outcome: an answer or an error settles, `Ok(None)` does not.
    pub fn offer(&self, outcome: Result<Option<SearchResult>, SearchError>) {
        match outcome {
            Ok(Some(result)) => self.settle(Ok(result)),
            Ok(None) => {}
            Err(e) => self.settle(Err(e)),
        }
    }

    /// The report once every worker has ended (`Unknown` if none answered).
    pub fn into_report(
        self,
        progress: &SearchProgress,
        started: Instant,
        threads: usize,
    ) -> Result<SearchReport, SearchError> {
        let result = self
            .slot
            .into_inner()
            .expect("answer lock")
            .unwrap_or(Ok(SearchResult::Unknown))?;
        Ok(SearchReport {
            result,
            attempts: progress.attempts.load(Ordering::SeqCst),
            elapsed: started.elapsed(),
            threads,
        })
    }
}

/// A rayon pool of `threads` workers (at least one), for every parallel search.
pub(crate) fn worker_pool(threads: usize) -> Result<rayon::ThreadPool, SearchError> {
    let threads = threads.max(1);
    rayon::ThreadPoolBuilder::new()
        .num_threads(threads)
        .build()
        .map_err(|e| SearchError::Threads {
            threads,
            message: e.to_string(),
        })
}

/// Runs the search; `tick` is called about every 100 ms on the calling thread.
pub fn search(
    formula: &Formula,
    spec: &RamseySpec,
    options: &SearchOptions,
    progress: &SearchProgress,
    mut tick: impl FnMut(Duration),
) -> Result<SearchReport, SearchError> {
    let started = Instant::now();
    let deadline = options.timeout.map(|t| started + t);
    let threads = options.threads.max(1);
    let answer = FirstAnswer::default();
    let stop = &answer.stop;

    let pool = worker_pool(threads)?;

    let (done_tx, done_rx) = mpsc::channel::<()>();
    pool.in_place_scope(|scope| {
        for worker in 0..threads {
            let (answer, done_tx) = (&answer, done_tx.clone());
            scope.spawn(move |_| {
                let outcome = if worker == 0 {
                    complete_worker(formula, spec, stop, deadline, progress)
                } else {
                    seeded_worker(formula, spec, options, worker, stop, deadline, progress)
                };
                answer.offer(outcome);
                let _ = done_tx.send(());
            });
        }
        let mut finished = 0;
        while finished < threads {
            match done_rx.recv_timeout(Duration::from_millis(100)) {
                Ok(()) => finished += 1,
                Err(_) => tick(started.elapsed()),
            }
            if deadline.is_some_and(|d| Instant::now() >= d) {
                stop.store(true, Ordering::SeqCst);
            }
        }
    });

    answer.into_report(progress, started, threads)
}

/// Verifies a colouring with the checker before it may be reported.
pub(crate) fn verified(
    spec: &RamseySpec,
    colouring: Colouring,
    found_by: String,
) -> Result<SearchResult, SearchError> {
    let verdict = verify_witness(spec, &colouring);
    if verdict.is_valid() {
        Ok(SearchResult::Found {
            colouring,
            found_by,
        })
    } else {
        Err(SearchError::WitnessRejected(verdict.to_string()))
    }
}

/// Worker 0: the formula as given, no seed, no budget, until it answers or stops.
pub(crate) fn complete_worker(
    formula: &Formula,
    spec: &RamseySpec,
    stop: &AtomicBool,
    deadline: Option<Instant>,
    progress: &SearchProgress,
) -> Result<Option<SearchResult>, SearchError> {
    progress.attempts.fetch_add(1, Ordering::Relaxed);
    let report = run_attempt::<io::Sink>(
        formula,
        &AttemptPlan::default(),
        stop,
        deadline,
        None,
        false,
    )?;
    progress
        .proof_bytes
        .fetch_add(report.proof_bytes, Ordering::Relaxed);
    Ok(match report.outcome {
        AttemptOutcome::Satisfiable(c) => {
            Some(verified(spec, c, "worker 0 (complete, unseeded)".into())?)
        }
        AttemptOutcome::Unsatisfiable => Some(SearchResult::NoneExists),
        AttemptOutcome::Stopped(_) => None,
    })
}

fn seeded_worker(
    formula: &Formula,
    spec: &RamseySpec,
    options: &SearchOptions,
    worker: usize,
    stop: &AtomicBool,
    deadline: Option<Instant>,
    progress: &SearchProgress,
) -> Result<Option<SearchResult>, SearchError> {
    let mut rng = ChaCha8Rng::seed_from_u64(options.seed);
    rng.set_stream(worker as u64);
    let vars = formula.variables();
    for attempt in 1u64.. {
        if stop.load(Ordering::Relaxed)
            || crate::search::interrupt::interrupted()
            || deadline.is_some_and(|d| Instant::now() >= d)
        {
            return Ok(None);
        }
        let seed = draw_seed(vars.order(), vars.colours(), &mut rng);
        let mut plan = AttemptPlan::shuffled(formula, &mut rng);
        plan.units = seed.units(vars);
        plan.budget_bytes = Some(options.base_budget_bytes.saturating_mul(luby(attempt)));
        progress.attempts.fetch_add(1, Ordering::Relaxed);
        let report = run_attempt::<io::Sink>(formula, &plan, stop, deadline, None, false)?;
        progress
            .proof_bytes
            .fetch_add(report.proof_bytes, Ordering::Relaxed);
        if let AttemptOutcome::Satisfiable(c) = report.outcome {
            let by = format!(
                "worker {worker}, attempt {attempt} ({} seed, {} edges fixed)",
                seed.kind,
                seed.fixed.len()
            );
            return Ok(Some(verified(spec, c, by)?));
        }
    }
    Ok(None)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn luby_sequence_start() {
        let first: Vec<u64> = (1..=15).map(luby).collect();
        // Luby, Sinclair & Zuckerman 1993: 1,1,2,1,1,2,4,1,1,2,1,1,2,4,8.
        assert_eq!(first, vec![1, 1, 2, 1, 1, 2, 4, 1, 1, 2, 1, 1, 2, 4, 8]);
    }
}

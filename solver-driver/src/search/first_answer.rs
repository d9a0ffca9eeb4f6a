//! The first answer of parallel workers, whatever the backend: the first one is
//! kept, every colouring is verified by the checker's code before it may be kept,
//! and the stop flag is raised for the rest.

use std::sync::atomic::{AtomicBool, Ordering};
use std::sync::Mutex;
use std::time::Instant;

use ramsift_encoder::{Colouring, RamseySpec};

use super::job::{SearchError, SearchJob, SearchReport, SearchResult};
use crate::certify::witness_check::verify_witness;

/// The first answer of several workers.
#[derive(Debug, Default)]
pub struct FirstAnswer {
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

    /// Whether an answer has been kept or the workers were told to stop.
    pub fn stopped(&self) -> bool {
        self.stop.load(Ordering::SeqCst)
    }

    /// The report once every worker has ended (`Unknown` if none answered).
    pub fn into_report(
        self,
        job: &SearchJob,
        started: Instant,
    ) -> Result<SearchReport, SearchError> {
        let result = self
            .slot
            .into_inner()
            .expect("answer lock")
            .unwrap_or(Ok(SearchResult::Unknown))?;
        Ok(job.report(result, started))
    }
}

/// A rayon pool of `threads` workers (at least one), for every parallel search.
pub fn worker_pool(threads: usize) -> Result<rayon::ThreadPool, SearchError> {
    let threads = threads.max(1);
    rayon::ThreadPoolBuilder::new()
        .num_threads(threads)
        .build()
        .map_err(|e| SearchError::Threads {
            threads,
            message: e.to_string(),
        })
}

/// Verifies a colouring with the checker before it may be reported.
pub fn verified(
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

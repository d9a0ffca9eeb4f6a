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

use std::sync::atomic::{AtomicBool, Ordering};
use std::sync::mpsc;
use std::time::{Duration, Instant};

use rand::SeedableRng;
use rand_chacha::ChaCha8Rng;

use super::attempt::{run_attempt, AttemptOutcome, AttemptPlan};
use super::first_answer::{verified, worker_pool, FirstAnswer};
use super::formula::Formula;
use super::job::{SearchError, SearchJob, SearchReport, SearchResult};
use super::seeding::{draw_seed, seeded_attempt};

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

/// Runs the search; `tick` is called about every 100 ms on the calling thread.
pub fn search(
    job: &SearchJob,
    formula: &Formula,
    mut tick: impl FnMut(Duration),
) -> Result<SearchReport, SearchError> {
    search_until(job, formula, job.deadline_from(Instant::now()), &mut tick)
}

/// [`search`] until `deadline` (None: until an answer).
pub(crate) fn search_until(
    job: &SearchJob,
    formula: &Formula,
    deadline: Option<Instant>,
    tick: &mut impl FnMut(Duration),
) -> Result<SearchReport, SearchError> {
    job.check_formula(formula)?;
    let started = Instant::now();
    let threads = job.threads();
    let answer = FirstAnswer::default();
    let stop = &answer.stop;

    let pool = worker_pool(threads)?;

    let (done_tx, done_rx) = mpsc::channel::<()>();
    pool.in_place_scope(|scope| {
        for worker in 0..threads {
            let (answer, done_tx) = (&answer, done_tx.clone());
            scope.spawn(move |_| {
                let outcome = if worker == 0 {
                    complete_worker(job, formula, stop, deadline)
                } else {
                    seeded_worker(job, formula, worker, stop, deadline)
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

    answer.into_report(job, started)
}

/// Worker 0: the formula as given, no seed, no budget, until it answers or stops.
pub(crate) fn complete_worker(
    job: &SearchJob,
    formula: &Formula,
    stop: &AtomicBool,
    deadline: Option<Instant>,
) -> Result<Option<SearchResult>, SearchError> {
    let report = run_attempt(formula, &AttemptPlan::default(), stop, deadline)?;
    job.count_attempt(report.proof_bytes);
    Ok(match report.outcome {
        AttemptOutcome::Satisfiable(c) => Some(verified(
            job.spec(),
            c,
            "worker 0 (complete, unseeded)".into(),
        )?),
        AttemptOutcome::Unsatisfiable => Some(SearchResult::NoneExists),
        AttemptOutcome::Stopped(_) => None,
    })
}

/// Worker w > 0: random seeds under growing budgets until the run ends.
fn seeded_worker(
    job: &SearchJob,
    formula: &Formula,
    worker: usize,
    stop: &AtomicBool,
    deadline: Option<Instant>,
) -> Result<Option<SearchResult>, SearchError> {
    let mut rng = ChaCha8Rng::seed_from_u64(job.options.seed);
    rng.set_stream(worker as u64);
    for attempt in 1u64.. {
        if super::interrupt::should_stop(stop, deadline) {
            return Ok(None);
        }
        let seed = draw_seed(job.order(), job.instance.colours(), &mut rng);
        let who = format!("worker {worker}, attempt {attempt}");
        if let Some(found) =
            seeded_attempt(job, formula, &seed, &mut rng, attempt, &who, stop, deadline)?
        {
            return Ok(Some(found));
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

//! A scan over orders: for each order in a range, does the family have a colouring?
//! The largest order found gives the family's lower bound in one run.
//!
//! The orders are independent, so they run in parallel on a rayon pool, each under
//! its own time limit; the report lists them in increasing order.

use std::sync::atomic::AtomicBool;
use std::time::{Duration, Instant};

use rayon::prelude::*;

use ramsift_encoder::RamseySpec;

use super::{search_order, FamilyChoice, FamilySearchError, OrderReport};

/// The reports of every order of a scan, in increasing order.
#[derive(Clone, Debug)]
pub struct ScanReport {
    pub orders: Vec<OrderReport>,
    pub elapsed: Duration,
}

impl ScanReport {
    /// The largest order at which a colouring was found.
    pub fn largest_found(&self) -> Option<usize> {
        self.orders
            .iter()
            .filter(|o| o.found().is_some())
            .map(|o| o.order)
            .max()
    }
}

/// Scans `from..=to` with `threads` workers, giving each order `per_order` at most.
pub fn scan(
    choice: &FamilyChoice,
    spec: &RamseySpec,
    from: usize,
    to: usize,
    per_order: Option<Duration>,
    threads: usize,
    mut on_order: impl FnMut(&OrderReport) + Send,
) -> Result<ScanReport, FamilySearchError> {
    let started = Instant::now();
    let stop = AtomicBool::new(false);
    let pool = crate::search::first_answer::worker_pool(threads)?;
    let on_order = std::sync::Mutex::new(&mut on_order);
    let results: Vec<Result<OrderReport, FamilySearchError>> = pool.install(|| {
        (from..=to)
            .into_par_iter()
            .map(|order| {
                let deadline = per_order.map(|t| Instant::now() + t);
                let report = search_order(choice, spec, order, &stop, deadline)?;
                (on_order.lock().expect("callback lock"))(&report);
                Ok(report)
            })
            .collect()
    });
    let orders = results.into_iter().collect::<Result<Vec<_>, _>>()?;
    Ok(ScanReport {
        orders,
        elapsed: started.elapsed(),
    })
}

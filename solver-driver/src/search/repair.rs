//! Repair by SAT: from a near-solution (a colouring with a few monochromatic
//! forbidden copies left, of cliques or of any other forbidden graph), free the
//! edges near the remaining copies and solve for them with every other edge
//! fixed, growing the freed region until a colouring is found or the formula is
//! the full one:
//!
//! * radius 0: the edges of the remaining monochromatic copies;
//! * radius 1: every edge at a vertex of one of them;
//! * radius 2: every edge (the complete search, bounded by the deadline).
//!
//! An unsatisfiable radius says only that no repair within it exists.

use std::sync::atomic::AtomicBool;
use std::time::Instant;

use ramsift_encoder::combinations::for_each_subset;
use ramsift_encoder::{Colouring, RamseySpec};

use crate::local::{LocalState, Pattern, MAX_LOCAL_ORDER};
use crate::search::attempt::AttemptOutcome;
use crate::search::first_answer::verified;
use crate::search::formula::Formula;
use crate::search::job::{SearchError, SearchResult};
use crate::search::seeding::repair_seed;

/// The monochromatic forbidden cliques of `colouring`: (colour, vertices).
pub fn monochromatic_cliques(spec: &RamseySpec, colouring: &Colouring) -> Vec<(usize, Vec<usize>)> {
    let mut found = Vec::new();
    for (index, k) in spec
        .clique_sizes()
        .unwrap_or_default()
        .into_iter()
        .enumerate()
    {
        let colour = index as u8 + 1;
        let _ = for_each_subset::<()>(colouring.order(), k, |s| {
            let mono = s
                .iter()
                .enumerate()
                .all(|(p, &a)| s[p + 1..].iter().all(|&b| colouring.colour(a, b) == colour));
            if mono {
                found.push((colour as usize, s.to_vec()));
            }
            Ok(())
        });
    }
    found
}

/// How a repair ended.
#[derive(Clone, Debug)]
pub enum Repair {
    /// A verified colouring, found at this radius.
    Repaired(SearchResult, usize),
    /// No colouring differs from the near-solution only on the freed edges, at
    /// every radius tried (the last being the full formula: none exists at all).
    None,
    Stopped,
}

/// Repairs `near` (a colouring of K_n, n ≤ 128, for the formula's specification).
pub fn repair(
    formula: &Formula,
    near: &Colouring,
    stop: &AtomicBool,
    deadline: Option<Instant>,
) -> Result<Repair, SearchError> {
    let spec = formula.instance().spec();
    let n = near.order();
    if n > MAX_LOCAL_ORDER {
        return Err(SearchError::LocalOrder {
            order: n,
            max: MAX_LOCAL_ORDER,
        });
    }
    let state = LocalState::new(near, &Pattern::for_spec(spec));
    let bad = state.bad_edges();
    for radius in 0..=2 {
        let seed = repair_seed(near, &bad, radius);
        match seed.solve(formula, stop, deadline)? {
            AttemptOutcome::Satisfiable(colouring) => {
                let freed = n * (n - 1) / 2 - seed.fixed.len();
                let by = format!(
                    "SAT repair of a near-solution with {} monochromatic forbidden copies, radius {radius} ({freed} edges freed)",
                    state.cost()
                );
                return Ok(Repair::Repaired(verified(spec, colouring, by)?, radius));
            }
            AttemptOutcome::Unsatisfiable => continue,
            AttemptOutcome::Stopped(_) => return Ok(Repair::Stopped),
        }
    }
    Ok(Repair::None)
}

//! Repair by SAT: from a near-solution (a colouring with a few monochromatic
//! forbidden copies left, of cliques or of any other forbidden graph), search for
//! a colouring close to it, in two stages:
//!
//! * **copy edges**: free the edges of the remaining monochromatic copies and
//!   solve for them with every other edge fixed (varisat; quick either way);
//! * **anchored**: the whole formula, searched by CDCL anchored at the
//!   near-solution ([`crate::search::anchored`]): every descent starts from it,
//!   so colourings differing from it in a few edges anywhere are met first. This
//!   stage is complete (bounded only by the deadline), so its "unsatisfiable"
//!   means that no colouring exists at all.
//!
//! Freeing every edge at the copies' vertices, the stage between these two
//! before, was dropped: on the published near-solution of Exoo's (4,6;34)
//! construction it spent about a minute to find no repair, while the anchored
//! stage finds one in a fraction of a second (BENCHMARKS.md).

use std::sync::atomic::AtomicBool;
use std::time::Instant;

use ramsift_encoder::combinations::for_each_subset;
use ramsift_encoder::{Colouring, RamseySpec};

use crate::local::{LocalState, Pattern, MAX_LOCAL_ORDER};
use crate::search::anchored::{anchored_search, AnchoredOutcome};
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

/// The stage that found a repair.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum RepairStage {
    /// Only the edges of the remaining monochromatic copies changed.
    CopyEdges,
    /// The whole formula, anchored at the near-solution.
    Anchored,
}

/// How a repair ended.
#[derive(Clone, Debug)]
pub enum Repair {
    /// A verified colouring, found at this stage.
    Repaired(SearchResult, RepairStage),
    /// No colouring of K_n exists at all (the anchored stage refuted the formula).
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
    let copies = state.cost();
    let bad = state.bad_edges();
    match repair_seed(near, &bad).solve(formula, stop, deadline)? {
        AttemptOutcome::Satisfiable(colouring) => {
            let by = format!(
                "SAT repair of a near-solution with {copies} monochromatic forbidden copies, their {} edges freed",
                bad.len()
            );
            return Ok(Repair::Repaired(
                verified(spec, colouring, by)?,
                RepairStage::CopyEdges,
            ));
        }
        AttemptOutcome::Unsatisfiable => {}
        AttemptOutcome::Stopped(_) => return Ok(Repair::Stopped),
    }
    let (outcome, stats) = anchored_search(formula, near, stop, deadline);
    Ok(match outcome {
        AnchoredOutcome::Satisfiable(colouring) => {
            let by = format!(
                "CDCL anchored at a near-solution with {copies} monochromatic forbidden copies ({} conflicts)",
                stats.conflicts
            );
            Repair::Repaired(verified(spec, colouring, by)?, RepairStage::Anchored)
        }
        AnchoredOutcome::Unsatisfiable => Repair::None,
        AnchoredOutcome::Stopped => Repair::Stopped,
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    fn colouring_from_bits(n: usize, bits: u64) -> Colouring {
        let mut k = 0;
        Colouring::from_fn(n, 2, |_, _| {
            k += 1;
            1 + ((bits >> (k - 1)) & 1) as u8
        })
    }

    proptest! {
        #![proptest_config(ProptestConfig::with_cases(48))]

        /// Repair is complete: from any colouring of K8 it finds a (3,4;8)
        /// colouring, which exists, and from any colouring of K9 it answers that
        /// none exists (R(3,4) = 9, Greenwood & Gleason 1955; DS1).
        #[test]
        fn repair_answers_from_any_start(bits in any::<u64>()) {
            let stop = AtomicBool::new(false);
            let spec = RamseySpec::cliques(&[3, 4]).unwrap();
            let near = colouring_from_bits(8, bits);
            match repair(&Formula::of_cliques(&[3, 4], 8), &near, &stop, None).unwrap() {
                Repair::Repaired(SearchResult::Found { colouring, .. }, _) => {
                    prop_assert!(monochromatic_cliques(&spec, &colouring).is_empty());
                }
                other => prop_assert!(false, "not repaired: {:?}", other),
            }
            let near = colouring_from_bits(9, bits.rotate_left(7) ^ bits);
            prop_assert!(matches!(
                repair(&Formula::of_cliques(&[3, 4], 9), &near, &stop, None).unwrap(),
                Repair::None
            ));
        }
    }
}

//! Extension by SAT: given a good colouring of K_{n-1}, add a vertex. The old
//! edges are fixed by unit clauses and the n-1 edges of the new vertex are the
//! only freedom, so the solver answers quickly either way: a colouring of K_n
//! that contains the given one, or a proof that none does (a statement about this
//! colouring only: other colourings of K_n may still exist).

use std::io;
use std::sync::atomic::AtomicBool;
use std::time::Instant;

use ramsift_encoder::edges::edge_index;
use ramsift_encoder::Colouring;

use crate::attempt::{run_attempt, AttemptOutcome, AttemptPlan};
use crate::formula::Formula;
use crate::portfolio::{verified, SearchError, SearchResult};
use crate::seeding::{Seed, SeedKind};
use ramsift_encoder::RamseySpec;

/// What extending a colouring found.
#[derive(Clone, Debug)]
pub enum Extension {
    /// A verified colouring of K_n whose first n-1 vertices carry the given one.
    Extended(SearchResult),
    /// No colouring of K_n extends the given colouring.
    None,
    /// Stopped (deadline or signal) before an answer.
    Stopped,
}

/// Extends `base` (a colouring of K_{n-1}) to K_n, `formula` being the plain
/// formula of `spec` at order n.
pub fn extend(
    formula: &Formula,
    spec: &RamseySpec,
    base: &Colouring,
    stop: &AtomicBool,
    deadline: Option<Instant>,
) -> Result<Extension, SearchError> {
    let n = formula.variables().order();
    if base.order() + 1 != n {
        return Err(SearchError::Backend(format!(
            "extension adds one vertex: a colouring of K_{} cannot become one of K_{n}",
            base.order()
        )));
    }
    let fixed = (0..n - 1)
        .flat_map(|j| (0..j).map(move |i| (i, j)))
        .map(|(i, j)| (edge_index(i, j), base.colour(i, j) as usize))
        .collect();
    let seed = Seed {
        kind: SeedKind::Extension,
        fixed,
    };
    let plan = AttemptPlan {
        units: seed.units(formula.variables()),
        ..AttemptPlan::default()
    };
    let report = run_attempt::<io::Sink>(formula, &plan, stop, deadline, None, false)?;
    Ok(match report.outcome {
        AttemptOutcome::Satisfiable(colouring) => Extension::Extended(verified(
            spec,
            colouring,
            format!(
                "SAT extension of a {} (its {} edges fixed)",
                seed.kind,
                seed.fixed.len()
            ),
        )?),
        AttemptOutcome::Unsatisfiable => Extension::None,
        AttemptOutcome::Stopped(_) => Extension::Stopped,
    })
}

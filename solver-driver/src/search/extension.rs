//! Extension by SAT: given a good colouring of K_{n-1}, add a vertex. The old
//! edges are fixed by unit clauses and the n-1 edges of the new vertex are the
//! only freedom, so the solver answers quickly either way: a colouring of K_n
//! that contains the given one, or a proof that none does (a statement about this
//! colouring only: other colourings of K_n may still exist).

use std::sync::atomic::AtomicBool;
use std::time::Instant;

use ramsift_encoder::Colouring;

use crate::search::attempt::AttemptOutcome;
use crate::search::formula::Formula;
use crate::search::portfolio::{verified, SearchError, SearchResult};
use crate::search::seeding::{Seed, SeedKind};
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
    let seed = Seed::from_colouring(SeedKind::Extension, base, |_, _| true);
    Ok(match seed.solve(formula, stop, deadline)? {
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

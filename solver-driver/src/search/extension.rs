//! Extension by SAT: given a good colouring of K_{n-1}, add a vertex. The old
//! edges are fixed by unit clauses and the n-1 edges of the new vertex are the
//! only freedom, so the solver answers quickly either way: a colouring of K_n
//! that contains the given one, or a proof that none does (a statement about this
//! colouring only: other colourings of K_n may still exist).

use std::sync::atomic::AtomicBool;
use std::time::Instant;

use ramsift_encoder::{Colouring, EncodingLimits, Instance, RamseyEncoding};

use crate::search::attempt::AttemptOutcome;
use crate::search::first_answer::verified;
use crate::search::formula::Formula;
use crate::search::job::{SearchError, SearchResult};
use crate::search::loosening::{extend_loosened, Loosened};
use crate::search::seeding::extension_seed;

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
/// formula of its specification at order n (the formula names both).
pub fn extend(
    formula: &Formula,
    base: &Colouring,
    stop: &AtomicBool,
    deadline: Option<Instant>,
) -> Result<Extension, SearchError> {
    let spec = formula.instance().spec();
    let n = formula.variables().order();
    if base.order() + 1 != n {
        return Err(SearchError::ExtensionOrder {
            given: base.order(),
            order: n,
        });
    }
    let seed = extension_seed(base);
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

/// How a chain of extensions ended.
#[derive(Clone, Debug)]
pub enum Chain {
    /// A verified colouring of the target K_N, grown one vertex at a time.
    Reached {
        colouring: Colouring,
        found_by: String,
    },
    /// The colouring of K_m reached last has no extension to K_(m+1).
    StuckAt(Colouring),
    /// Stopped (deadline or signal) before the end.
    Stopped,
}

/// Extends `base` one vertex at a time, K_m → K_(m+1) → … → K_N, to the order of
/// `target`. A step that finds no extension frees up to `free` old vertices,
/// nearest the obstruction first ([`crate::search::loosening`], its assumptions
/// ordered by `seed`); with `free` 0 every step keeps the colouring reached so
/// far. `admit` is asked about each step's encoding before its formula is built
/// (a memory limit, say) and may refuse it.
pub fn extend_chain<E: From<SearchError>>(
    target: &Instance,
    base: &Colouring,
    free: usize,
    seed: u64,
    stop: &AtomicBool,
    deadline: Option<Instant>,
    mut admit: impl FnMut(&RamseyEncoding) -> Result<(), E>,
) -> Result<Chain, E> {
    let mut current = base.clone();
    let mut found_by = String::new();
    for order in base.order() + 1..=target.order() {
        let step = Instance::new(target.spec().clone(), order).map_err(SearchError::from)?;
        let encoding =
            RamseyEncoding::new(&step, &EncodingLimits::default()).map_err(SearchError::from)?;
        admit(&encoding)?;
        let formula = Formula::from_encoding(&encoding);
        let step = match extend(&formula, &current, stop, deadline)? {
            Extension::None if free > 0 => {
                match extend_loosened(&formula, &current, free, seed, stop, deadline)? {
                    Loosened::Extended { result, .. } => Extension::Extended(result),
                    Loosened::None { .. } => Extension::None,
                    Loosened::Stopped { .. } => Extension::Stopped,
                }
            }
            other => other,
        };
        match step {
            Extension::Extended(SearchResult::Found {
                colouring,
                found_by: by,
            }) => {
                current = colouring;
                found_by = by;
            }
            Extension::Extended(_) | Extension::Stopped => return Ok(Chain::Stopped),
            Extension::None => return Ok(Chain::StuckAt(current)),
        }
    }
    let steps = target.order() - base.order();
    Ok(Chain::Reached {
        colouring: current,
        found_by: format!(
            "{found_by}; {steps} extension step(s) from K_{}",
            base.order()
        ),
    })
}

//! Complete search of the whole formula anchored at a colouring: the hooked CDCL
//! solver ([`ramsift_cdcl`]) tries the colouring's value for every edge first and
//! returns its saved phases to the colouring at every restart, so each descent
//! starts from the given colouring and the clauses it learns steer the next
//! descent around it. From a near-solution this explores the colourings that
//! differ from it in few edges, wherever they are, without fixing any edge: the
//! search stays complete, so "unsatisfiable" means that no colouring exists at all.
//!
//! Saved phases (phase saving, Pipatsrisawat & Darwiche, SAT 2007) usually drift
//! with the search; holding them at one assignment is what makes this a search
//! near that assignment.

use std::sync::atomic::AtomicBool;
use std::time::Instant;

use ramsift_cdcl::{NoHook, Outcome, Solver, SolverStats};
use ramsift_encoder::Colouring;

use crate::minimality::solve::model_colouring;
use crate::search::formula::Formula;
use crate::search::interrupt::stop_requested;

/// How an anchored search ended.
#[derive(Clone, Debug)]
pub enum AnchoredOutcome {
    /// A model of the formula, as a colouring (not yet checked).
    Satisfiable(Colouring),
    /// The formula itself is unsatisfiable.
    Unsatisfiable,
    Stopped,
}

/// Solves the whole `formula` anchored at `anchor` (a colouring of the same K_n
/// in the same number of colours), until an answer, a stop or the deadline.
pub fn anchored_search(
    formula: &Formula,
    anchor: &Colouring,
    stop: &AtomicBool,
    deadline: Option<Instant>,
) -> (AnchoredOutcome, SolverStats) {
    let vars = formula.variables();
    let literals: Vec<i32> = (1..)
        .zip(vars.assignment_of(anchor))
        .map(|(var, value)| if value { var } else { -var })
        .collect();
    let mut solver = Solver::new();
    solver.reserve_variables(formula.variable_count());
    for clause in formula.clauses() {
        if !solver.add_clause(clause) {
            return (AnchoredOutcome::Unsatisfiable, solver.stats().clone());
        }
    }
    solver.anchor(&literals);
    let outcome = match solver.solve(&mut NoHook, &|| stop_requested(stop), deadline) {
        Outcome::Satisfiable => AnchoredOutcome::Satisfiable(model_colouring(&solver, vars)),
        Outcome::Unsatisfiable => AnchoredOutcome::Unsatisfiable,
        Outcome::Interrupted => AnchoredOutcome::Stopped,
    };
    (outcome, solver.stats().clone())
}

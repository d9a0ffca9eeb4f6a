//! One solver run: a fresh varisat instance on a renamed and reordered copy of the
//! formula, with a partial colouring fixed by unit clauses, under [`Limits`].
//!
//! varisat 0.2.2 has no seed or phase setting and is deterministic (saved phases all
//! start false), so workers differ by what they are given: a random renaming of the
//! variables with random polarity flips (which changes the initial phases and the
//! decision order), a random clause order, and the fixed edges. The seed colouring
//! is added as unit clauses rather than as assumptions: it is equivalent for the
//! search, lets the solver simplify with it, and keeps proof output (which is how
//! budgets are enforced, see [`crate::search::interrupt`]) usable.

use std::io::{self, Write};
use std::sync::atomic::{AtomicBool, AtomicU64};
use std::time::{Duration, Instant};

use rand::seq::SliceRandom;
use rand::Rng;
use thiserror::Error;
use varisat::{ExtendFormula, Lit, ProofFormat, Solver};

use ramsift_encoder::Colouring;

use crate::search::formula::Formula;
use crate::search::interrupt::{InterruptSink, Limits, SinkReport, StopReason};

/// A bijection on variables with polarity flips: variable v (1-based) is given to the
/// solver as `target[v-1]`, negated when `flip[v-1]`.
#[derive(Clone, Debug)]
pub struct Renaming {
    target: Vec<u32>,
    flip: Vec<bool>,
}

impl Renaming {
    pub fn random(variables: usize, rng: &mut impl Rng) -> Self {
        let mut target: Vec<u32> = (1..=variables as u32).collect();
        target.shuffle(rng);
        let flip = (0..variables).map(|_| rng.gen_bool(0.5)).collect();
        Renaming { target, flip }
    }

    #[inline]
    fn map(&self, lit: i32) -> Lit {
        let index = lit.unsigned_abs() as usize - 1;
        let positive = (lit > 0) != self.flip[index];
        Lit::from_dimacs(if positive {
            self.target[index] as isize
        } else {
            -(self.target[index] as isize)
        })
    }

    /// The value of original variable `var` given the solver's values.
    fn value(&self, var: usize, solver_value: impl Fn(usize) -> bool) -> bool {
        solver_value(self.target[var - 1] as usize) != self.flip[var - 1]
    }
}

/// What one attempt is given.
#[derive(Clone, Debug, Default)]
pub struct AttemptPlan {
    /// None: variables as in the formula.
    pub renaming: Option<Renaming>,
    /// A permutation of clause indices; None: the formula's order.
    pub clause_order: Option<Vec<u32>>,
    /// DIMACS literals (in the formula's numbering) fixed true.
    pub units: Vec<i32>,
    /// Proof-byte budget; None: until the deadline or a stop.
    pub budget_bytes: Option<u64>,
}

impl AttemptPlan {
    /// A renaming and clause order drawn from `rng`.
    pub fn shuffled(formula: &Formula, rng: &mut impl Rng) -> Self {
        let mut order: Vec<u32> = (0..formula.clause_count() as u32).collect();
        order.shuffle(rng);
        AttemptPlan {
            renaming: Some(Renaming::random(formula.variable_count(), rng)),
            clause_order: Some(order),
            units: Vec::new(),
            budget_bytes: None,
        }
    }
}

/// How an attempt ended.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum AttemptOutcome {
    Satisfiable(Colouring),
    /// Unsatisfiable with the plan's units (so, without units, no colouring exists).
    Unsatisfiable,
    Stopped(StopReason),
}

/// An attempt's outcome and cost.
#[derive(Clone, Debug)]
pub struct AttemptReport {
    pub outcome: AttemptOutcome,
    pub proof_bytes: u64,
    pub elapsed: Duration,
}

#[derive(Debug, Error)]
pub enum AttemptError {
    #[error("writing the proof failed: {0}")]
    Proof(#[source] io::Error),
    #[error("the solver failed: {0}")]
    Solver(String),
}

/// Where an attempt's DRAT proof goes.
pub struct ProofOutput<'a, W: Write> {
    pub writer: W,
    /// Text DRAT instead of binary DRAT.
    pub text: bool,
    /// Incremented with the proof bytes as they are written (for progress lines).
    pub bytes_seen: Option<&'a AtomicU64>,
}

/// Runs one attempt with no proof output.
pub fn run_attempt(
    formula: &Formula,
    plan: &AttemptPlan,
    stop: &AtomicBool,
    deadline: Option<Instant>,
) -> Result<AttemptReport, AttemptError> {
    run_attempt_with_proof::<io::Sink>(formula, plan, stop, deadline, None)
}

/// How many clauses are loaded between two checks of the stop flag and deadline.
const LOAD_CHECK_EVERY: usize = 1 << 16;

/// Runs one attempt; `proof` receives varisat's DRAT. The proof is meaningful for
/// the formula only with no renaming, the formula's clause order free, and no units.
pub fn run_attempt_with_proof<W: Write>(
    formula: &Formula,
    plan: &AttemptPlan,
    stop: &AtomicBool,
    deadline: Option<Instant>,
    proof: Option<ProofOutput<'_, W>>,
) -> Result<AttemptReport, AttemptError> {
    let started = Instant::now();
    let report = SinkReport::default();
    let (writer, text, bytes_seen) = match proof {
        Some(p) => (Some(p.writer), p.text, p.bytes_seen),
        None => (None, false, None),
    };
    let limits = Limits {
        stop,
        deadline,
        budget_bytes: plan.budget_bytes,
        bytes_seen,
    };
    let mut solver = Solver::new();
    let format = if text {
        ProofFormat::Drat
    } else {
        ProofFormat::BinaryDrat
    };
    solver.write_proof(InterruptSink::new(limits, writer, &report), format);
    let outcome = match load(&mut solver, formula, plan, stop, deadline) {
        Some(reason) => AttemptOutcome::Stopped(reason),
        None => {
            let solved = solver.solve();
            let closed = solver.close_proof();
            match (solved, report.reason.get()) {
                (Ok(true), _) => AttemptOutcome::Satisfiable(decode_model(&solver, formula, plan)),
                (Ok(false), _) => {
                    closed.map_err(|e| AttemptError::Solver(e.to_string()))?;
                    AttemptOutcome::Unsatisfiable
                }
                (Err(_), Some(reason)) => AttemptOutcome::Stopped(reason),
                (Err(varisat::solver::SolverError::ProofIoError { cause }), None) => {
                    return Err(AttemptError::Proof(cause))
                }
                (Err(other), None) => return Err(AttemptError::Solver(other.to_string())),
            }
        }
    };
    Ok(AttemptReport {
        outcome,
        proof_bytes: report.bytes.get(),
        elapsed: started.elapsed(),
    })
}

/// Gives the plan's clauses and units to the solver. Loading a large formula takes
/// seconds and varisat only notices the limits once it writes proof steps, so they
/// are checked before and during loading: `Some` when loading was cut short.
pub(crate) fn load(
    solver: &mut Solver,
    formula: &Formula,
    plan: &AttemptPlan,
    stop: &AtomicBool,
    deadline: Option<Instant>,
) -> Option<StopReason> {
    let interrupted = || {
        if crate::search::interrupt::stop_requested(stop) {
            Some(StopReason::Stopped)
        } else {
            deadline
                .is_some_and(|d| Instant::now() >= d)
                .then_some(StopReason::Deadline)
        }
    };
    let mut buffer: Vec<Lit> = Vec::new();
    let mut add = |solver: &mut Solver, clause: &[i32]| {
        buffer.clear();
        match &plan.renaming {
            Some(r) => buffer.extend(clause.iter().map(|&l| r.map(l))),
            None => buffer.extend(clause.iter().map(|&l| Lit::from_dimacs(l as isize))),
        }
        solver.add_clause(&buffer);
    };
    let count = plan
        .clause_order
        .as_ref()
        .map_or(formula.clause_count(), Vec::len);
    for k in 0..count {
        if k % LOAD_CHECK_EVERY == 0 {
            if let Some(reason) = interrupted() {
                return Some(reason);
            }
        }
        let index = plan
            .clause_order
            .as_ref()
            .map_or(k, |order| order[k] as usize);
        add(solver, formula.clause(index));
    }
    for &unit in &plan.units {
        add(solver, &[unit]);
    }
    None
}

/// The colouring of a model, in the formula's numbering.
pub(crate) fn decode_model(solver: &Solver, formula: &Formula, plan: &AttemptPlan) -> Colouring {
    let mut values = vec![false; formula.variable_count() + 1];
    for lit in solver.model().unwrap_or_default() {
        let var = lit.var().to_dimacs() as usize;
        if var < values.len() {
            values[var] = lit.is_positive();
        }
    }
    let solver_value = |v: usize| values[v];
    formula.variables().decode(|var| match &plan.renaming {
        Some(r) => r.value(var, solver_value),
        None => solver_value(var),
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use rand::SeedableRng;
    use rand_chacha::ChaCha8Rng;

    fn run(formula: &Formula, plan: &AttemptPlan) -> AttemptOutcome {
        let stop = AtomicBool::new(false);
        run_attempt(formula, plan, &stop, None).unwrap().outcome
    }

    #[test]
    fn renamed_models_decode_to_valid_colourings() {
        let f = Formula::of_cliques(&[3, 4], 8);
        let mut rng = ChaCha8Rng::seed_from_u64(7);
        for _ in 0..5 {
            let plan = AttemptPlan::shuffled(&f, &mut rng);
            let AttemptOutcome::Satisfiable(colouring) = run(&f, &plan) else {
                panic!("(3,4;8) has colourings");
            };
            let values = f.variables().assignment_of(&colouring);
            assert!(f.clauses().all(|c| c
                .iter()
                .any(|&l| values[l.unsigned_abs() as usize - 1] == (l > 0))));
        }
    }

    #[test]
    fn units_are_respected_and_can_make_it_unsatisfiable() {
        let f = Formula::of_cliques(&[3, 3], 5);
        // Edges {0,1}, {0,2}, {1,2} all colour 1: a triangle, so no model.
        let plan = AttemptPlan {
            units: vec![1, 2, 3],
            ..AttemptPlan::default()
        };
        assert_eq!(run(&f, &plan), AttemptOutcome::Unsatisfiable);
        let plan = AttemptPlan {
            units: vec![1, -2],
            ..AttemptPlan::default()
        };
        let AttemptOutcome::Satisfiable(c) = run(&f, &plan) else {
            panic!()
        };
        assert_eq!((c.colour(0, 1), c.colour(0, 2)), (1, 2));
    }

    #[test]
    fn stop_flag_ends_a_hard_solve() {
        // (4,4;18) without symmetry breaking is far beyond a fraction of a second.
        let f = Formula::of_cliques(&[4, 4], 18);
        let stop = AtomicBool::new(false);
        let deadline = Some(Instant::now() + Duration::from_millis(300));
        let report = run_attempt(&f, &AttemptPlan::default(), &stop, deadline).unwrap();
        assert_eq!(
            report.outcome,
            AttemptOutcome::Stopped(StopReason::Deadline)
        );
        assert!(report.elapsed < Duration::from_secs(5));
    }
}

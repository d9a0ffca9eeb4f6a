//! Enumeration of all colourings up to isomorphism: incremental SAT with blocking
//! clauses over the encoding with lex-leader symmetry breaking (which keeps at least
//! one colouring of every isomorphism class, see `encoder::symmetry`), and
//! [`canonical`] forms to keep one colouring per class.
//!
//! * Every model's colouring is blocked (a clause over the colour variables that
//!   only it violates), so the loop ends when the formula with its blocking clauses
//!   is unsatisfiable: every colouring satisfying the symmetry constraints has then
//!   been seen.
//! * With `swap_colours`, colourings that differ by permuting colours with equal
//!   forbidden graphs are one class, and the colour-swap scheme is added too.
//!
//! The default is the `minimality` scheme instead ([`crate::minimality`]): our
//! solver with the minimality check, exact at complete assignments, so each model
//! is the least member of its class and every class is met exactly once. A
//! model's blocking clause then ends the class; no canonical forms are needed.

pub mod canonical;

use std::collections::HashMap;
use std::sync::atomic::AtomicBool;
use std::time::{Duration, Instant};

use varisat::{ExtendFormula, Lit, Solver};

use ramsift_encoder::{
    Colouring, EncodingLimits, Instance, RamseyEncoding, Scheme, SymmetrySet, VariableMap,
};

use crate::certify::witness_check::verify_witness;
use crate::minimality::hook::{MinimalityHook, DEFAULT_BUDGET};
use crate::minimality::solve::{blocking_clause, loaded_solver, model_colouring};
use crate::search::interrupt::{limited_solver, stop_requested, SinkReport};
use crate::search::job::SearchError;
use canonical::{canonical_form, colour_maps, ColourTable};
use ramsift_cdcl::Outcome;

/// How an enumeration runs.
#[derive(Clone, Debug, Default)]
pub struct EnumerateOptions {
    /// Identify colourings that differ by permuting colours with equal forbidden graphs.
    pub swap_colours: bool,
    pub timeout: Option<Duration>,
    /// Lex-leader constraints with canonical forms (varisat) instead of the
    /// minimality check (our solver).
    pub lex_leader: bool,
}

/// The classes found.
#[derive(Clone, Debug)]
pub struct Enumeration {
    /// One colouring per class, in the order found.
    pub classes: Vec<Colouring>,
    /// Models enumerated (labelled colourings satisfying the symmetry constraints).
    pub models: u64,
    /// False when the time ran out before the enumeration finished.
    pub complete: bool,
    pub elapsed: Duration,
    /// The symmetry schemes used to cut the labelled colourings down.
    pub symmetry: SymmetrySet,
}

/// Gives every clause of the encoding to the solver.
fn load_encoding(solver: &mut Solver<'_>, encoding: &RamseyEncoding) {
    let mut buffer = Vec::new();
    encoding
        .for_each_clause::<()>(|clause| {
            buffer.clear();
            buffer.extend(clause.iter().map(|&l| Lit::from_dimacs(l as isize)));
            solver.add_clause(&buffer);
            Ok(())
        })
        .expect("adding clauses cannot fail");
}

/// The colouring of the solver's model, and a clause that blocks exactly it
/// (some edge must take another colour) added to the solver.
fn take_model(solver: &mut Solver<'_>, vars: &VariableMap) -> Colouring {
    let colour_vars = vars.colour_variable_count();
    let mut values = vec![false; colour_vars + 1];
    for lit in solver.model().unwrap_or_default() {
        let v = lit.var().to_dimacs() as usize;
        if v <= colour_vars {
            values[v] = lit.is_positive();
        }
    }
    let colouring = vars.decode(|v| values[v]);
    let block: Vec<Lit> = blocking_clause(vars, &colouring)
        .into_iter()
        .map(|l| Lit::from_dimacs(l as isize))
        .collect();
    solver.add_clause(&block);
    colouring
}

/// Enumerates the colourings of `instance` up to isomorphism; `progress(models,
/// classes)` is called after each model.
pub fn enumerate(
    instance: &Instance,
    options: &EnumerateOptions,
    stop: &AtomicBool,
    mut progress: impl FnMut(u64, usize),
) -> Result<Enumeration, SearchError> {
    if !options.lex_leader {
        return enumerate_minimal(instance, options, stop, progress);
    }
    let started = Instant::now();
    let deadline = options.timeout.map(|t| started + t);
    let symmetry = SymmetrySet::for_enumeration(options.swap_colours);
    let encoding = RamseyEncoding::with_symmetry(instance, &symmetry, &EncodingLimits::default())?;
    debug_assert!(!symmetry.contains(Scheme::DegreeBounds));
    let vars = *encoding.variables();
    let n = instance.order();

    let report = SinkReport::default();
    let mut solver = limited_solver(stop, deadline, &report);
    load_encoding(&mut solver, &encoding);

    let maps = colour_maps(instance.spec(), options.swap_colours);
    let mut seen: HashMap<Vec<u8>, usize> = HashMap::new();
    let mut classes = Vec::new();
    let mut models = 0u64;
    let mut complete = false;
    loop {
        match solver.solve() {
            Ok(true) => {}
            Ok(false) => {
                complete = true;
                break;
            }
            Err(_) if report.reason.get().is_some() => break,
            Err(e) => return Err(SearchError::Backend(e.to_string())),
        }
        let colouring = take_model(&mut solver, &vars);
        models += 1;
        let table = ColourTable::from_fn(n, |i, j| colouring.colour(i, j));
        let form = canonical_form(&table, &maps);
        if let std::collections::hash_map::Entry::Vacant(slot) = seen.entry(form) {
            let verdict = verify_witness(instance.spec(), &colouring);
            if !verdict.is_valid() {
                return Err(SearchError::WitnessRejected(verdict.to_string()));
            }
            slot.insert(classes.len());
            classes.push(colouring);
        }
        progress(models, classes.len());
    }
    Ok(Enumeration {
        classes,
        models,
        complete,
        elapsed: started.elapsed(),
        symmetry,
    })
}

/// Enumeration with the minimality check: each model is its class's least member.
fn enumerate_minimal(
    instance: &Instance,
    options: &EnumerateOptions,
    stop: &AtomicBool,
    mut progress: impl FnMut(u64, usize),
) -> Result<Enumeration, SearchError> {
    let started = Instant::now();
    let deadline = options.timeout.map(|t| started + t);
    let symmetry = SymmetrySet::of(&[Scheme::Minimality]);
    let encoding = RamseyEncoding::with_symmetry(instance, &symmetry, &EncodingLimits::default())?;
    let vars = *encoding.variables();
    let maps = colour_maps(instance.spec(), options.swap_colours);
    let mut hook = MinimalityHook::new(vars, maps, DEFAULT_BUDGET);
    let mut solver = loaded_solver(&encoding);
    let mut classes = Vec::new();
    let complete = loop {
        match solver.solve(&mut hook, &|| stop_requested(stop), deadline) {
            Outcome::Satisfiable => {}
            Outcome::Unsatisfiable => break true,
            Outcome::Interrupted => break false,
        }
        let colouring = model_colouring(&solver, &vars);
        let verdict = verify_witness(instance.spec(), &colouring);
        if !verdict.is_valid() {
            return Err(SearchError::WitnessRejected(verdict.to_string()));
        }
        solver.add_clause(&blocking_clause(&vars, &colouring));
        classes.push(colouring);
        progress(classes.len() as u64, classes.len());
    };
    Ok(Enumeration {
        models: classes.len() as u64,
        classes,
        complete,
        elapsed: started.elapsed(),
        symmetry,
    })
}
